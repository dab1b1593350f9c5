// representations_test.cpp: axis-angle, rotation vector, Gibbs vector, MRP and its shadow.
#include "attiscope/core/representations.hpp"

#include <cmath>
#include <limits>

#include "attiscope/core/euler.hpp"
#include "support/check.hpp"
#include "support/corpus.hpp"

namespace attiscope {
namespace {

using test::kRoundTrip;
using test::kSeed;
using test::kTight;

const Eigen::Vector3d kOnes = Eigen::Vector3d::Ones();

TEST(RepresentationsTest, AxisAngleValues) {
  // Common practice (references.md T2): 90 deg about z -> (sqrt2/2, 0, 0, sqrt2/2);
  // 120 deg about (1,1,1)/sqrt3 -> (1/2, 1/2, 1/2, 1/2); 180 deg about x -> (0, 1, 0, 0).
  const double h = std::sqrt(0.5);
  EXPECT_TRUE(
      test::MatrixNear(from_axis_angle(Eigen::Vector3d::UnitZ(), M_PI / 2).value().quaternion().coeffs(),
                       Eigen::Vector4d(0, 0, h, h), kTight));
  EXPECT_TRUE(test::MatrixNear(from_axis_angle(kOnes, 2 * M_PI / 3).value().quaternion().coeffs(),
                               Eigen::Vector4d(0.5, 0.5, 0.5, 0.5), kTight));
  EXPECT_TRUE(test::MatrixNear(from_axis_angle(Eigen::Vector3d::UnitX(), M_PI).value().quaternion().coeffs(),
                               Eigen::Vector4d(1, 0, 0, 0), kTight));
  const AxisAngle aa = to_axis_angle(Rotation(Eigen::Quaterniond(0.5, 0.5, 0.5, 0.5)));
  EXPECT_NEAR(aa.angle_rad, 2 * M_PI / 3, kTight);
  EXPECT_TRUE(test::MatrixNear(aa.axis, kOnes.normalized(), kTight));
  // Identity: angle 0, axis +x by the header's convention.
  const AxisAngle id = to_axis_angle(Rotation::identity());
  EXPECT_EQ(id.angle_rad, 0.0);
  EXPECT_EQ(id.axis, Eigen::Vector3d::UnitX());
  // 270 deg is -90 deg: the angle comes back in [0, pi] with the axis flipped.
  const AxisAngle back = to_axis_angle(from_axis_angle(Eigen::Vector3d::UnitZ(), 1.5 * M_PI).value());
  EXPECT_NEAR(back.angle_rad, M_PI / 2, kTight);
  EXPECT_TRUE(test::MatrixNear(back.axis, Eigen::Vector3d(0, 0, -1), kTight));
}

TEST(RepresentationsTest, AxisAngleAccurateAtTheEnds) {
  // 2 atan2(|v|, w) keeps full relative precision for tiny angles and is exact at 180 deg.
  const Eigen::Vector3d u = Eigen::Vector3d(1, -2, 3).normalized();
  for (double t : {1e-15, 1e-12, 1e-9, 1e-6}) {
    const AxisAngle aa = to_axis_angle(test::AxisTurn(u, t));
    EXPECT_NEAR(aa.angle_rad / t, 1.0, 1e-15 / t + 1e-12) << "angle " << t;
    EXPECT_TRUE(test::MatrixNear(aa.axis, u, 1e-6)) << "angle " << t;
  }
  const AxisAngle half = to_axis_angle(Rotation(Eigen::Quaterniond(0.0, u.x(), u.y(), u.z())));
  EXPECT_EQ(half.angle_rad, M_PI);
  EXPECT_TRUE(test::MatrixNear(half.axis, u, kTight));
  const AxisAngle near_half = to_axis_angle(test::AxisTurn(u, M_PI - 1e-9));
  EXPECT_NEAR(near_half.angle_rad, M_PI - 1e-9, 1e-15);
}

TEST(RepresentationsTest, AxisAngleErrors) {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  EXPECT_FALSE(from_axis_angle(Eigen::Vector3d::Zero(), 1.0).ok());
  EXPECT_FALSE(from_axis_angle(Eigen::Vector3d(nan, 0, 1), 1.0).ok());
  EXPECT_FALSE(from_axis_angle(Eigen::Vector3d::UnitZ(), nan).ok());
  // An axis of any finite length is a direction.
  EXPECT_TRUE(test::RotationNear(from_axis_angle(Eigen::Vector3d(0, 0, 1e200), M_PI / 2).value(),
                                 elementary_rotation(Axis::Z, M_PI / 2), kTight));
}

TEST(RepresentationsTest, RotationVector) {
  // Common practice (references.md T10): 90 deg about z is (0, 0, pi/2); scipy 1.10.1
  // as_rotvec reduces 270 deg about z to (0, 0, -pi/2) (references.md 2.2).
  EXPECT_TRUE(test::MatrixNear(to_rotation_vector(elementary_rotation(Axis::Z, M_PI / 2)),
                               Eigen::Vector3d(0, 0, M_PI / 2), kTight));
  EXPECT_TRUE(test::MatrixNear(to_rotation_vector(elementary_rotation(Axis::Z, 1.5 * M_PI)),
                               Eigen::Vector3d(0, 0, -M_PI / 2), kTight));
  std::mt19937 rng(kSeed);
  for (int n = 0; n < 1000; ++n) {
    const Rotation r = test::RandomRotation(rng);
    const Eigen::Vector3d v = to_rotation_vector(r);
    EXPECT_LE(v.norm(), M_PI + 1e-15);
    EXPECT_TRUE(test::RotationNear(from_rotation_vector(v).value(), r, kRoundTrip)) << "seed " << kSeed;
  }
  // The exp map on both sides of the small-angle switch, against the exact half-angle form.
  const Eigen::Vector3d u = Eigen::Vector3d(2, 1, -2) / 3.0;
  for (double t : {1e-12, 1e-8, 0.99 * kSmallAngleRad, 1.01 * kSmallAngleRad, 1e-3}) {
    const Eigen::Quaterniond q = from_rotation_vector(u * t).value().stored_quaternion();
    EXPECT_NEAR(q.vec().norm() / std::sin(0.5 * t), 1.0, 1e-15) << "angle " << t;
    EXPECT_NEAR(q.w(), std::cos(0.5 * t), 2.5e-16);
  }
  EXPECT_FALSE(from_rotation_vector(Eigen::Vector3d(0, std::numeric_limits<double>::infinity(), 0)).ok());
  // Huge finite vectors: a turn about the vector's direction by the angle modulo 2 pi (libm
  // reduces 5e299 exactly), never a NaN or zero quaternion.
  const auto huge = from_rotation_vector(Eigen::Vector3d(1e300, 0, 0));
  ASSERT_TRUE(huge.ok());
  const Eigen::Quaterniond hq = huge.value().stored_quaternion();
  EXPECT_TRUE(hq.coeffs().allFinite());
  EXPECT_NEAR(hq.norm(), 1.0, 1e-15);
  EXPECT_EQ(hq.y(), 0.0);
  EXPECT_EQ(hq.z(), 0.0);
  EXPECT_NEAR(std::abs(hq.w()), std::abs(std::cos(0.5e300)), 1e-15);
}

TEST(RepresentationsTest, GibbsValues) {
  // Common practice (references.md T10; also Shuster 1993): 90 deg about z: g = (0, 0, 1);
  // 120 deg about (1,1,1)/sqrt3: g = (1, 1, 1); 180 deg: infinite.
  EXPECT_TRUE(test::MatrixNear(to_gibbs(elementary_rotation(Axis::Z, M_PI / 2)).value(),
                               Eigen::Vector3d(0, 0, 1), kTight));
  EXPECT_TRUE(
      test::MatrixNear(to_gibbs(Rotation(Eigen::Quaterniond(0.5, 0.5, 0.5, 0.5))).value(), kOnes, kTight));
  EXPECT_FALSE(to_gibbs(Rotation(Eigen::Quaterniond(0, 0, 0, 1))).has_value());
  EXPECT_TRUE(to_gibbs(test::AxisTurn(Eigen::Vector3d::UnitY(), M_PI - 1e-9)).has_value());
  // Composition (references.md T10, Shuster 1993 in the active order): for R(g1) R(g2),
  // g = (g1 + g2 + g1 x g2) / (1 - g1 . g2); 90 deg about x then 90 deg about y (fixed axes)
  // is R(g_y) R(g_x) with g = (1, 1, -1), and R(g_x) R(g_y) has g = (1, 1, 1).
  const Eigen::Vector3d gx(1, 0, 0), gy(0, 1, 0);
  const auto compose = [](const Eigen::Vector3d& a, const Eigen::Vector3d& b) {
    return Eigen::Vector3d((a + b + a.cross(b)) / (1.0 - a.dot(b)));
  };
  EXPECT_TRUE(test::MatrixNear(compose(gx, gy), kOnes, 0.0));
  EXPECT_TRUE(test::RotationNear(from_gibbs(gx).value() * from_gibbs(gy).value(),
                                 from_gibbs(compose(gx, gy)).value(), kTight));
  EXPECT_TRUE(test::RotationNear(from_gibbs(gy).value() * from_gibbs(gx).value(),
                                 from_gibbs(compose(gy, gx)).value(), kTight));
  // Cayley form R = (I - [g]x)^-1 (I + [g]x).
  std::mt19937 rng(kSeed);
  for (int n = 0; n < 100; ++n) {
    const Rotation r = test::RandomRotation(rng);
    const auto g = to_gibbs(r);
    ASSERT_TRUE(g.has_value());
    Eigen::Matrix3d k;
    k << 0, -g->z(), g->y(), g->z(), 0, -g->x(), -g->y(), g->x(), 0;
    const Eigen::Matrix3d i = Eigen::Matrix3d::Identity();
    EXPECT_TRUE(test::MatrixNear(Eigen::Matrix3d((i - k).inverse() * (i + k)), r.matrix(),
                                 1e-9 * (1 + g->squaredNorm())))
        << "seed " << kSeed;
    EXPECT_TRUE(test::RotationNear(from_gibbs(*g).value(), r, kRoundTrip));
  }
  EXPECT_FALSE(from_gibbs(Eigen::Vector3d(0, std::numeric_limits<double>::quiet_NaN(), 0)).ok());
  // Near 180 deg the Gibbs vector is huge, yet reads back to the same rotation.
  const Rotation almost = test::AxisTurn(Eigen::Vector3d(1, 2, 2), M_PI - 1e-9);
  EXPECT_TRUE(test::RotationNear(from_gibbs(to_gibbs(almost).value()).value(), almost, kTight));
  EXPECT_TRUE(test::RotationNear(from_gibbs(Eigen::Vector3d(1e200, 0, 0)).value(),
                                 Rotation(Eigen::Quaterniond(0, 1, 0, 0)), kTight));
}

TEST(RepresentationsTest, MrpValuesAndShadow) {
  // Common practice (references.md T10; Shuster 1993 pp. 475-476; scipy 1.10.1 as_mrp, 2.2):
  // 90 deg about z: p = (0, 0, sqrt2 - 1) = (0, 0, 0.41421356237309515); 120 deg about
  // (1,1,1)/sqrt3: p = (1/3, 1/3, 1/3), shadow -p/|p|^2 = (-1, -1, -1); 180 deg about z:
  // (0, 0, 1); 270 deg about z: (0, 0, -(sqrt2 - 1)).
  EXPECT_TRUE(test::MatrixNear(to_mrp(elementary_rotation(Axis::Z, M_PI / 2)),
                               Eigen::Vector3d(0, 0, 0.41421356237309515), kTight));
  const Rotation r120(Eigen::Quaterniond(0.5, 0.5, 0.5, 0.5));
  EXPECT_TRUE(test::MatrixNear(to_mrp(r120), kOnes / 3.0, kTight));
  EXPECT_TRUE(test::MatrixNear(mrp_shadow(to_mrp(r120)).value(), -kOnes, kTight));
  EXPECT_TRUE(test::RotationNear(from_mrp(-kOnes).value(), r120, kTight));
  EXPECT_TRUE(
      test::MatrixNear(to_mrp(Rotation(Eigen::Quaterniond(0, 0, 0, 1))), Eigen::Vector3d(0, 0, 1), kTight));
  EXPECT_TRUE(test::MatrixNear(to_mrp(elementary_rotation(Axis::Z, 1.5 * M_PI)),
                               Eigen::Vector3d(0, 0, -0.41421356237309515), kTight));
  EXPECT_FALSE(mrp_shadow(Eigen::Vector3d::Zero()).has_value());
  std::mt19937 rng(kSeed);
  for (int n = 0; n < 1000; ++n) {
    const Rotation r = test::RandomRotation(rng);
    const Eigen::Vector3d p = to_mrp(r);
    EXPECT_LE(p.norm(), 1.0 + 1e-15);
    // p = u tan(t/4).
    const AxisAngle aa = to_axis_angle(r);
    EXPECT_TRUE(test::MatrixNear(p, aa.axis * std::tan(0.25 * aa.angle_rad), kTight)) << "seed " << kSeed;
    EXPECT_TRUE(test::RotationNear(from_mrp(p).value(), r, kRoundTrip));
    const Eigen::Vector3d s = mrp_shadow(p).value();
    EXPECT_GE(s.norm(), 1.0 - 1e-15);
    EXPECT_TRUE(test::RotationNear(from_mrp(s).value(), r, kRoundTrip));
  }
  EXPECT_FALSE(from_mrp(Eigen::Vector3d(std::numeric_limits<double>::infinity(), 0, 0)).ok());
}

TEST(RepresentationsTest, EdgeCorpus) {
  for (const test::NamedRotation& c : test::EdgeCorpus()) {
    const Rotation& r = c.rotation;
    EXPECT_TRUE(test::RotationNear(from_rotation_vector(to_rotation_vector(r)).value(), r, kRoundTrip))
        << c.name;
    const AxisAngle aa = to_axis_angle(r);
    EXPECT_TRUE(test::RotationNear(from_axis_angle(aa.axis, aa.angle_rad).value(), r, kRoundTrip)) << c.name;
    EXPECT_TRUE(test::RotationNear(from_mrp(to_mrp(r)).value(), r, kRoundTrip)) << c.name;
    if (const auto g = to_gibbs(r)) {
      EXPECT_TRUE(test::RotationNear(from_gibbs(*g).value(), r, kRoundTrip)) << c.name;
    } else {
      EXPECT_LT(std::abs(r.stored_quaternion().w()), kGibbsInfiniteW) << c.name;
    }
  }
}

}  // namespace
}  // namespace attiscope
