// rotation_test.cpp: the canonical rotation type: sign rule, composition, inverse, geodesic
// angle, SLERP, the quaternion mean, and round trips between every pair of representations
// (all of which go through Rotation) over random rotations and the edge-case corpus.
#include "attiscope/core/rotation.hpp"

#include <cmath>
#include <functional>
#include <limits>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"
#include "attiscope/core/representations.hpp"
#include "support/check.hpp"
#include "support/corpus.hpp"

namespace attiscope {
namespace {

using test::kRoundTrip;
using test::kSeed;
using test::kTight;

Rotation Quat(double w, double x, double y, double z) {
  return Rotation(Eigen::Quaterniond(w, x, y, z));
}

// One representation: writes a rotation in it and reads it back. `ok` is false when the
// representation cannot hold this rotation (Gibbs at 180 degrees, the MRP shadow at the
// identity); `slack` is the loss the representation's own rule allows (the Euler lock rule).
struct Codec {
  std::string name;
  std::function<bool(const Rotation&, Rotation*, double* slack)> round_trip;
};

std::vector<Codec> AllCodecs() {
  std::vector<Codec> out;
  for (const QuatConvention& qc : all_quat_conventions()) {
    out.push_back({"quaternion " + qc.describe(), [qc](const Rotation& r, Rotation* back, double*) {
                     *back = from_quaternion_numbers(to_quaternion_numbers(r, qc), qc).value();
                     return true;
                   }});
  }
  for (Direction d : {Direction::BodyToWorld, Direction::WorldToBody}) {
    for (MatrixStorage s : {MatrixStorage::Rows, MatrixStorage::Columns}) {
      const MatrixConvention mc{d, s};
      out.push_back({"matrix " + mc.describe(), [mc](const Rotation& r, Rotation* back, double*) {
                       const Eigen::Matrix3d m = matrix_from_numbers(to_matrix_numbers(r, mc), mc.storage);
                       *back = from_matrix(m, mc.direction).value();
                       return true;
                     }});
    }
  }
  for (const EulerConvention& c : all_euler_conventions()) {
    out.push_back({"euler " + c.name(), [c](const Rotation& r, Rotation* back, double* slack) {
                     const EulerAngles e = to_euler(r, c);
                     // The lock rule drops the third angle inside kLockMarginRad of lock; the
                     // rotation it leaves out is at most about 2 x margin (the third turn's
                     // axis is within the margin of the first axis).
                     if (e.at_lock) *slack = 2.0 * e.lock_margin_rad;
                     *back = from_euler(c, e.angles_rad);
                     return true;
                   }});
  }
  out.push_back({"axis-angle", [](const Rotation& r, Rotation* back, double*) {
                   const AxisAngle aa = to_axis_angle(r);
                   *back = from_axis_angle(aa.axis, aa.angle_rad).value();
                   return true;
                 }});
  out.push_back({"rotation vector", [](const Rotation& r, Rotation* back, double*) {
                   *back = from_rotation_vector(to_rotation_vector(r)).value();
                   return true;
                 }});
  out.push_back({"gibbs", [](const Rotation& r, Rotation* back, double*) {
                   const auto g = to_gibbs(r);
                   if (!g) return false;
                   *back = from_gibbs(*g).value();
                   return true;
                 }});
  out.push_back({"mrp", [](const Rotation& r, Rotation* back, double*) {
                   *back = from_mrp(to_mrp(r)).value();
                   return true;
                 }});
  out.push_back({"mrp shadow", [](const Rotation& r, Rotation* back, double*) {
                   const auto s = mrp_shadow(to_mrp(r));
                   if (!s) return false;
                   *back = from_mrp(*s).value();
                   return true;
                 }});
  out.push_back({"su2", [](const Rotation& r, Rotation* back, double*) {
                   *back = from_su2_matrix(su2_matrix(r.quaternion())).value();
                   return true;
                 }});
  // L(p) 1 = p and R(q) 1 = q: the first column of each 4x4 form holds the quaternion.
  out.push_back({"4x4 left", [](const Rotation& r, Rotation* back, double*) {
                   const Eigen::Vector4d c = left_multiplication_matrix(r.quaternion()).col(0);
                   *back = from_quaternion_numbers({c(0), c(1), c(2), c(3)}, QuatConvention{}).value();
                   return true;
                 }});
  out.push_back({"4x4 right", [](const Rotation& r, Rotation* back, double*) {
                   const Eigen::Vector4d c = right_multiplication_matrix(r.quaternion()).col(0);
                   *back = from_quaternion_numbers({c(0), c(1), c(2), c(3)}, QuatConvention{}).value();
                   return true;
                 }});
  return out;
}

void CheckAllPairs(const Rotation& r, const std::string& what) {
  const std::vector<Codec> codecs = AllCodecs();
  for (const Codec& a : codecs) {
    Rotation via_a;
    double slack_a = 0.0;
    if (!a.round_trip(r, &via_a, &slack_a)) continue;
    ASSERT_TRUE(test::RotationNear(via_a, r, kRoundTrip + slack_a)) << what << ": " << a.name;
    for (const Codec& b : codecs) {
      Rotation via_b;
      double slack_b = 0.0;
      if (!b.round_trip(via_a, &via_b, &slack_b)) continue;
      ASSERT_TRUE(test::RotationNear(via_b, r, kRoundTrip + slack_a + slack_b))
          << what << ": " << a.name << " then " << b.name;
    }
  }
}

TEST(RotationTest, RoundTripEveryPairRandom) {
  std::mt19937 rng(kSeed);
  for (int n = 0; n < 100; ++n) {
    CheckAllPairs(test::RandomRotation(rng),
                  "random sample " + std::to_string(n) + " seed " + std::to_string(kSeed));
  }
}

TEST(RotationTest, RoundTripEveryPairEdgeCorpus) {
  for (const test::NamedRotation& c : test::EdgeCorpus()) CheckAllPairs(c.rotation, c.name);
}

TEST(RotationTest, LockSlackIsOnlyUsedAtLock) {
  // The slack above must not hide real errors: away from lock no codec may use it.
  std::mt19937 rng(kSeed);
  for (const Codec& c : AllCodecs()) {
    for (int n = 0; n < 50; ++n) {
      Rotation back;
      double slack = 0.0;
      const Rotation r = test::RandomRotation(rng);
      c.round_trip(r, &back, &slack);
      EXPECT_LE(slack, 2.0 * kLockMarginRad) << c.name;
    }
  }
}

TEST(RotationTest, CanonicalSign) {
  // q and -q are one rotation; the printed one has w >= 0, and at w == 0 the first non-zero
  // of x, y, z positive (design.md, "Math conventions").
  EXPECT_EQ(Quat(-0.5, 0.5, -0.5, 0.5).quaternion().coeffs(), Eigen::Vector4d(-0.5, 0.5, -0.5, 0.5));
  EXPECT_GT(Quat(-0.5, 0.5, -0.5, 0.5).quaternion().w(), 0.0);
  EXPECT_EQ(Quat(0.0, 0.0, -1.0, 0.0).quaternion().y(), 1.0);
  EXPECT_EQ(Quat(0.0, 0.0, 0.0, -1.0).quaternion().z(), 1.0);
  EXPECT_DOUBLE_EQ(Quat(0.0, -0.6, 0.8, 0.0).quaternion().x(), 0.6);
  // No negative zero in the printed form.
  EXPECT_FALSE(std::signbit(Quat(-0.0, 1.0, 0.0, -0.0).quaternion().w()));
  EXPECT_FALSE(std::signbit(Quat(-0.0, 1.0, 0.0, -0.0).quaternion().z()));
  EXPECT_FALSE(std::signbit(Quat(0.0, -1.0, 0.0, 0.0).quaternion().w()));
  // The stored sign is kept for tracks.
  EXPECT_LT(Quat(-1.0, 0.0, 0.0, 0.0).stored_quaternion().w(), 0.0);
  EXPECT_EQ(Quat(-1.0, 0.0, 0.0, 0.0).quaternion().w(), 1.0);
}

TEST(RotationTest, DoubleCover) {
  // Common practice (references.md T3): R(q) = R(-q); 360 degrees about z is q = (-1,0,0,0), R = I.
  const Rotation q = Quat(0.5, 0.5, 0.5, 0.5);
  EXPECT_TRUE(test::MatrixNear(q.matrix(), q.negated().matrix(), 0.0));
  Eigen::Matrix3d cyclic;
  cyclic << 0, 0, 1, 1, 0, 0, 0, 1, 0;
  EXPECT_TRUE(test::MatrixNear(q.matrix(), cyclic, kTight));
  EXPECT_TRUE(test::RotationNear(q, q.negated(), 0.0));
  const Rotation full = test::AxisTurn(Eigen::Vector3d::UnitZ(), 2.0 * M_PI);
  EXPECT_NEAR(full.stored_quaternion().w(), -1.0, kTight);
  EXPECT_TRUE(test::MatrixNear(full.matrix(), Eigen::Matrix3d::Identity(), kTight));
}

TEST(RotationTest, OrderOfTurnsMatters) {
  // Common practice (references.md T4): 90 deg about x then 90 deg about y (fixed axes) is
  // Ry(90) Rx(90) = [[0,1,0],[0,0,-1],[-1,0,0]] = (1/2, 1/2, 1/2, -1/2); the other order is
  // Rx(90) Ry(90) = [[0,0,1],[1,0,0],[0,1,0]] = (1/2, 1/2, 1/2, 1/2).
  const Rotation rx = elementary_rotation(Axis::X, M_PI / 2);
  const Rotation ry = elementary_rotation(Axis::Y, M_PI / 2);
  Eigen::Matrix3d x_then_y, y_then_x;
  x_then_y << 0, 1, 0, 0, 0, -1, -1, 0, 0;
  y_then_x << 0, 0, 1, 1, 0, 0, 0, 1, 0;
  EXPECT_TRUE(test::MatrixNear((ry * rx).matrix(), x_then_y, kTight));
  EXPECT_TRUE(test::MatrixNear((rx * ry).matrix(), y_then_x, kTight));
  EXPECT_TRUE(test::RotationNear(ry * rx, Quat(0.5, 0.5, 0.5, -0.5), kTight));
  EXPECT_TRUE(test::RotationNear(rx * ry, Quat(0.5, 0.5, 0.5, 0.5), kTight));
  EXPECT_GT(geodesic_angle(ry * rx, rx * ry), 1.0);
  // Applied to x: (0, 0, -1) and (0, 1, 0).
  EXPECT_TRUE(test::MatrixNear((ry * rx).apply(Eigen::Vector3d::UnitX()), Eigen::Vector3d(0, 0, -1), kTight));
  EXPECT_TRUE(test::MatrixNear((rx * ry).apply(Eigen::Vector3d::UnitX()), Eigen::Vector3d(0, 1, 0), kTight));
}

TEST(RotationTest, CompositionAndInverseMatchMatrices) {
  std::mt19937 rng(kSeed);
  for (int n = 0; n < 500; ++n) {
    const Rotation a = test::RandomRotation(rng);
    const Rotation b = test::RandomRotation(rng);
    EXPECT_TRUE(test::MatrixNear((a * b).matrix(), a.matrix() * b.matrix(), kTight)) << "seed " << kSeed;
    EXPECT_TRUE(test::MatrixNear(a.inverse().matrix(), a.matrix().transpose(), kTight));
    EXPECT_TRUE(test::RotationNear(a * a.inverse(), Rotation::identity(), kTight));
    const Eigen::Vector3d v(0.3, -1.2, 2.5);
    EXPECT_TRUE(test::MatrixNear(a.apply(v), a.matrix() * v, kTight));
    EXPECT_NEAR(a.stored_quaternion().norm(), 1.0, 1e-15);
  }
}

TEST(RotationTest, ActiveRotationOfAVector) {
  // Common practice (references.md T9): +30 deg about z turns (1,0,0) into (cos30, sin30, 0);
  // the same vector seen from a frame turned +30 deg (passive) is (cos30, -sin30, 0).
  const Rotation r = elementary_rotation(Axis::Z, M_PI / 6);
  EXPECT_TRUE(test::MatrixNear(r.apply(Eigen::Vector3d::UnitX()), Eigen::Vector3d(0.8660254037844386, 0.5, 0),
                               kTight));
  EXPECT_TRUE(test::MatrixNear(r.matrix().transpose() * Eigen::Vector3d::UnitX(),
                               Eigen::Vector3d(0.8660254037844386, -0.5, 0), kTight));
}

TEST(RotationTest, GeodesicAngle) {
  // Common practice (references.md T11): the angle between I and Rz(90) is pi/2.
  EXPECT_NEAR(geodesic_angle(Rotation::identity(), elementary_rotation(Axis::Z, M_PI / 2)), M_PI / 2, kTight);
  // references.md T11 (Huynh 2009, definitions from memory there): arccos|q1 . q2| is half
  // the geodesic angle, pi/4 here; at 180 degrees it is pi/2, the largest.
  const Rotation rz90 = elementary_rotation(Axis::Z, M_PI / 2);
  EXPECT_NEAR(std::acos(std::abs(rz90.quaternion().dot(Rotation::identity().quaternion()))), M_PI / 4,
              kTight);
  EXPECT_NEAR((Rotation::identity().matrix() - rz90.matrix()).norm(), 2.0, kTight);  // 2 sqrt2 sin(t/2)
  // Sign-blind, symmetric, and accurate at the ends of its range, where acos would not be.
  const Rotation a = Quat(0.2, -0.4, 0.1, 0.8);
  EXPECT_EQ(geodesic_angle(a, a.negated()), 0.0);
  const Eigen::Vector3d axis = Eigen::Vector3d(1.0, -2.0, 3.0).normalized();
  for (double t : {1e-12, 1e-9, 1e-6, 0.3, 2.0, M_PI - 1e-6, M_PI - 1e-9}) {
    const Rotation b = a * test::AxisTurn(axis, t);
    EXPECT_NEAR(geodesic_angle(a, b), t, 1e-15 + 4e-16 * t) << "angle " << t;
    EXPECT_NEAR(geodesic_angle(b, a), t, 1e-15 + 4e-16 * t) << "angle " << t;
  }
  // 180 degrees is the largest, and the same either way round.
  EXPECT_NEAR(geodesic_angle(Rotation::identity(), Quat(0.0, 0.0, 0.0, 1.0)), M_PI, 0.0);
}

TEST(RotationTest, SlerpValues) {
  // Common practice (references.md T12): slerp(I, Rz90, 1/3) = Rz30 =
  // (0.9659258262890683, 0, 0, 0.25881904510252074) (Shoemake 1985).
  const Rotation rz90 = elementary_rotation(Axis::Z, M_PI / 2);
  EXPECT_TRUE(test::RotationNear(slerp(Rotation::identity(), rz90, 1.0 / 3.0),
                                 Quat(0.9659258262890683, 0, 0, 0.25881904510252074), kTight));
  // Short path whatever the stored signs.
  EXPECT_TRUE(test::RotationNear(slerp(Rotation::identity(), rz90.negated(), 0.5),
                                 elementary_rotation(Axis::Z, M_PI / 4), kTight));
  // 270 degrees about z is -90: the middle is -45 (as scipy's Slerp, references.md 2.2).
  EXPECT_TRUE(test::RotationNear(slerp(Rotation::identity(), elementary_rotation(Axis::Z, 1.5 * M_PI), 0.5),
                                 elementary_rotation(Axis::Z, -M_PI / 4), kTight));
}

TEST(RotationTest, SlerpProperties) {
  std::mt19937 rng(kSeed);
  for (int n = 0; n < 200; ++n) {
    const Rotation a = test::RandomRotation(rng);
    const Rotation b = test::RandomRotation(rng);
    const double total = geodesic_angle(a, b);
    EXPECT_TRUE(test::RotationNear(slerp(a, b, 0.0), a, kTight));
    EXPECT_TRUE(test::RotationNear(slerp(a, b, 1.0), b, kTight)) << "seed " << kSeed << " sample " << n;
    for (double t : {0.25, 0.5, 0.9}) {
      // Constant rate along the great arc: the angle from a grows linearly with t.
      const Rotation m = slerp(a, b, t);
      EXPECT_NEAR(geodesic_angle(a, m), t * total, 1e-12);
      EXPECT_NEAR(geodesic_angle(m, b), (1.0 - t) * total, 1e-12);
    }
    // Tiny arcs do not lose digits: the midpoint is half-way to within the rounding of
    // unit quaternions (about 1e-16 absolute), not the 1e-8 an acos would leave.
    const Rotation c = a * test::AxisTurn(Eigen::Vector3d(0.0, 1.0, 1.0), 1e-10);
    const double tiny = geodesic_angle(a, c);
    EXPECT_NEAR(geodesic_angle(a, slerp(a, c, 0.5)), 0.5 * tiny, 1e-15);
    EXPECT_NEAR(geodesic_angle(slerp(a, c, 0.5), c), 0.5 * tiny, 1e-15);
  }
}

TEST(RotationTest, MarkleyMean) {
  // Common practice (references.md T12): the mean of I and Rz90 with equal weights is Rz45 =
  // (0.9238795325112867, 0, 0, 0.3826834323650898), whatever the input signs (Markley et al. 2007).
  const Rotation rz90 = elementary_rotation(Axis::Z, M_PI / 2);
  const Rotation rz45(Eigen::Quaterniond(0.9238795325112867, 0, 0, 0.3826834323650898));
  EXPECT_TRUE(test::RotationNear(mean_rotation({Rotation::identity(), rz90}).value(), rz45, kTight));
  EXPECT_TRUE(
      test::RotationNear(mean_rotation({Rotation::identity().negated(), rz90}).value(), rz45, kTight));
  EXPECT_TRUE(
      test::RotationNear(mean_rotation({Rotation::identity(), rz90.negated()}).value(), rz45, kTight));
  // Weights: 3:1 towards I. For two rotations about one axis the chordal mean lies on the
  // arc at the eigenvector of [[w1 + w2 c^2, w2 c s], [w2 c s, w2 s^2]] (c, s of 45 deg),
  // whose angle is half of atan2(w2 sin 90, w1 + w2 cos 90) = atan2(1, 3)/2 on the
  // half-angle circle (derived by hand for this test).
  const double half = 0.5 * std::atan2(1.0, 3.0);
  EXPECT_TRUE(test::RotationNear(mean_rotation({Rotation::identity(), rz90}, {3.0, 1.0}).value(),
                                 elementary_rotation(Axis::Z, 2.0 * half), kTight));
  // Sign-invariant over random sets.
  std::mt19937 rng(kSeed);
  std::vector<Rotation> set, flipped;
  const Rotation centre = test::RandomRotation(rng);
  std::normal_distribution<double> noise(0.0, 0.2);
  for (int n = 0; n < 20; ++n) {
    const Rotation r = centre * Rotation(Eigen::Quaterniond(1.0, noise(rng), noise(rng), noise(rng)));
    set.push_back(r);
    flipped.push_back(n % 3 == 0 ? r.negated() : r);
  }
  EXPECT_TRUE(test::RotationNear(mean_rotation(set).value(), mean_rotation(flipped).value(), kTight));
  // One rotation is its own mean.
  EXPECT_TRUE(test::RotationNear(mean_rotation({centre}).value(), centre, kTight));
}

TEST(RotationTest, MeanErrors) {
  EXPECT_FALSE(mean_rotation({}).ok());
  const Rotation r = elementary_rotation(Axis::X, 0.3);
  EXPECT_FALSE(mean_rotation({r, r}, {1.0}).ok());
  EXPECT_FALSE(mean_rotation({r, r}, {1.0, -1.0}).ok());
  EXPECT_FALSE(mean_rotation({r, r}, {0.0, 0.0}).ok());
  EXPECT_FALSE(mean_rotation({r, r}, {1.0, std::numeric_limits<double>::quiet_NaN()}).ok());
  // Two rotations 180 degrees apart: a whole circle of means.
  EXPECT_FALSE(mean_rotation({Rotation::identity(), Quat(0.0, 1.0, 0.0, 0.0)}).ok());
}

TEST(RotationTest, NormalisesQuaternionsOfAnyScale) {
  // Four numbers of any finite size name a direction in 4D; the norm must not overflow.
  EXPECT_TRUE(
      test::RotationNear(Quat(1e200, 0.0, 0.0, 1e200), elementary_rotation(Axis::Z, M_PI / 2), kTight));
  EXPECT_TRUE(
      test::RotationNear(Quat(1.5e308, 1.5e308, 0.0, 0.0), elementary_rotation(Axis::X, M_PI / 2), kTight));
  EXPECT_TRUE(
      test::RotationNear(Quat(1e-200, 0.0, 1e-200, 0.0), elementary_rotation(Axis::Y, M_PI / 2), kTight));
}

}  // namespace
}  // namespace attiscope
