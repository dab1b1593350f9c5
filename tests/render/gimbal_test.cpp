// gimbal_test.cpp: the ring axes of the Gimbal rings view against core's Euler
// decomposition, lock, the margin colour scale and the 24-convention table. No GL.
#include "attiscope/render/gimbal.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <random>

#include "support/check.hpp"

namespace attiscope::render {
namespace {

using test::kSeed;
using test::MatrixNear;
using test::RandomRotation;

constexpr double kDeg = 3.14159265358979323846 / 180.0;
constexpr double kTol = 1e-12;

// The ring turns multiply to the pose, and the axes are the ones the convention's matrix
// product names (design.md, "Math conventions"): intrinsic R = R_i(a) R_j(b) R_k(c) has
// axes e_i, R_i(a) e_j, R e_k; extrinsic R = R_k(c) R_j(b) R_i(a) has e_k, R_k(c) e_j, R e_i.
TEST(GimbalTest, RingAxesMatchEulerDecomposition) {
  std::mt19937 rng(kSeed);
  for (int n = 0; n < 200; ++n) {
    const Rotation pose = RandomRotation(rng);
    const Eigen::Matrix3d r = pose.matrix();
    for (const EulerConvention& c : all_euler_conventions()) {
      const EulerAngles e = to_euler(pose, c);
      const GimbalRings g = gimbal_rings(e);
      SCOPED_TRACE(c.name() + ", seed " + std::to_string(kSeed) + ", sample " + std::to_string(n));
      EXPECT_TRUE(MatrixNear(g.world_R_inner(), r, 1e-10));
      const Eigen::Vector3d& ang = e.angles_rad;
      Eigen::Vector3d outer, middle, inner;
      if (c.kind == EulerKind::Intrinsic) {
        outer = axis_vector(c.axes[0]);
        middle = elementary_matrix(c.axes[0], ang[0]) * axis_vector(c.axes[1]);
        inner = r * axis_vector(c.axes[2]);
      } else {
        outer = axis_vector(c.axes[2]);
        middle = elementary_matrix(c.axes[2], ang[2]) * axis_vector(c.axes[1]);
        inner = r * axis_vector(c.axes[0]);
      }
      EXPECT_TRUE(MatrixNear(g.rings[0].axis_world, outer, 1e-10));
      EXPECT_TRUE(MatrixNear(g.rings[1].axis_world, middle, 1e-10));
      EXPECT_TRUE(MatrixNear(g.rings[2].axis_world, inner, 1e-10));
      // Each ring's circle contains its own axis.
      for (const GimbalRing& ring : g.rings)
        EXPECT_NEAR(ring.plane_normal_world.dot(ring.axis_world), 0.0, kTol);
    }
  }
}

// The angle between the outer and inner axes is the lock margin: for Tait-Bryan it is the
// angle between e_i and R_j(b) e_k, 90 deg - |b|; for proper Euler between e_i and R_j(b) e_i,
// min(b, 180 deg - b) once folded (derived from the definitions in design.md).
TEST(GimbalTest, OuterInnerAngleIsLockMargin) {
  std::mt19937 rng(kSeed + 1);
  for (int n = 0; n < 100; ++n) {
    const Rotation pose = RandomRotation(rng);
    for (const EulerConvention& c : all_euler_conventions()) {
      const EulerAngles e = to_euler(pose, c);
      EXPECT_NEAR(outer_inner_axis_angle(gimbal_rings(e)), e.lock_margin_rad, 1e-9)
          << c.name() << " sample " << n;
    }
  }
}

TEST(GimbalTest, OuterAndInnerAxesCoincideAtLock) {
  std::mt19937 rng(kSeed + 2);
  std::uniform_real_distribution<double> angle(-170.0, 170.0);
  for (const EulerConvention& c : all_euler_conventions()) {
    const double lock_middle = c.proper() ? 0.0 : 90.0;
    for (int n = 0; n < 20; ++n) {
      const Rotation pose = from_euler(c, Eigen::Vector3d(angle(rng), lock_middle, angle(rng)) * kDeg);
      const EulerAngles e = to_euler(pose, c);
      ASSERT_TRUE(e.at_lock) << c.name();
      const GimbalRings g = gimbal_rings(e);
      EXPECT_LT(outer_inner_axis_angle(g), 1e-7) << c.name();
      EXPECT_TRUE(MatrixNear(g.world_R_inner(), pose.matrix(), 1e-9)) << c.name();
    }
    // One degree away from lock the axes are one degree apart.
    const Rotation near =
        from_euler(c, Eigen::Vector3d(10, lock_middle + (c.proper() ? 1.0 : -1.0), 20) * kDeg);
    EXPECT_NEAR(outer_inner_axis_angle(gimbal_rings(to_euler(near, c))), 1.0 * kDeg, 1e-9) << c.name();
  }
}

TEST(GimbalTest, MarginColourIsContinuousOutsideTheBandAndStepsAtItsEdge) {
  constexpr double kStep = 0.01;
  constexpr float kMaxJump = 0.01f;
  for (double m = kMarginWarningDeg + kStep; m < 90.0; m += kStep) {
    EXPECT_LT((margin_color(m) - margin_color(m + kStep)).norm(), kMaxJump) << m;
  }
  for (double m = 0.0; m + kStep < kMarginWarningDeg; m += kStep) {
    EXPECT_LT((margin_color(m) - margin_color(m + kStep)).norm(), kMaxJump) << m;
  }
  EXPECT_GT((margin_color(kMarginWarningDeg) - margin_color(kMarginWarningDeg + kStep)).norm(), 0.2f);
  // In the band red leads; far from lock it does not.
  EXPECT_GT(margin_color(5.0).x(), margin_color(5.0).y() + 0.3f);
  EXPECT_LT(margin_color(60.0).x(), margin_color(60.0).y());
}

// Intrinsic ZYX (a, b, c) and extrinsic XYZ (c, b, a) are the same matrix product
// R_z(a) R_y(b) R_x(c) (common practice; design.md's definitions), so a pose at pitch 90
// degrees is at lock in both, and not in XZY, whose middle axis is z.
TEST(GimbalTest, MarginTableAtPitchNinety) {
  const EulerConvention zyx{{Axis::Z, Axis::Y, Axis::X}, EulerKind::Intrinsic};
  const Rotation pose = from_euler(zyx, Eigen::Vector3d(30, 90, 0) * kDeg);
  const auto table = margin_table(pose);
  int locked = 0;
  for (const MarginRow& row : table) {
    const EulerAngles e = to_euler(pose, row.convention);
    EXPECT_NEAR(row.margin_deg, e.lock_margin_rad / kDeg, 1e-12);
    EXPECT_EQ(row.in_warning_band, row.margin_deg <= kMarginWarningDeg);
    if (row.at_lock) {
      ++locked;
      EXPECT_FALSE(std::isfinite(row.rate_condition_number) && row.rate_condition_number < 1e6)
          << row.convention.name();
    }
    if (row.convention == zyx) {
      EXPECT_TRUE(row.at_lock);
    }
    if (row.convention == EulerConvention{{Axis::X, Axis::Y, Axis::Z}, EulerKind::Extrinsic}) {
      EXPECT_TRUE(row.at_lock);
    }
    if (row.convention == EulerConvention{{Axis::X, Axis::Z, Axis::Y}, EulerKind::Intrinsic}) {
      EXPECT_FALSE(row.at_lock);
    }
  }
  EXPECT_GE(locked, 2);
}

}  // namespace
}  // namespace attiscope::render
