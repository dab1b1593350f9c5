// compare_test.cpp: relative rotations in the body and world frames, the Euler subtraction,
// SLERP paths, and the mean and spread of several poses.
#include "attiscope/core/compare.hpp"

#include <Eigen/Eigenvalues>
#include <cmath>

#include "attiscope/core/euler.hpp"
#include "support/check.hpp"

namespace attiscope {
namespace {

using test::kSeed;
using test::kTight;

constexpr double kDeg = M_PI / 180.0;

Rotation rz(double deg) {
  return elementary_rotation(Axis::Z, deg * kDeg);
}

TEST(CompareTest, BodyAndWorldRelationsHold) {
  std::mt19937 rng(kSeed);
  for (int n = 0; n < 500; ++n) {
    const Rotation a = test::RandomRotation(rng), b = test::RandomRotation(rng);
    const Comparison c = compare_poses(a, b, EulerConvention{});
    // The defining relations of the two differences (header of compare.hpp).
    ASSERT_TRUE(test::RotationNear(a * c.reference_R_current, b, kTight)) << "seed " << kSeed << " n " << n;
    ASSERT_TRUE(test::RotationNear(c.world_delta * a, b, kTight)) << "seed " << kSeed << " n " << n;
    EXPECT_NEAR(c.angle_rad, geodesic_angle(a, b), kTight);
    // One axis, written in two frames: axis_world = world_R_reference axis_body.
    if (c.angle_rad > 1e-6 && c.angle_rad < M_PI - 1e-6) {
      EXPECT_TRUE(test::MatrixNear(c.axis_world, a.apply(c.axis_body), 1e-9)) << "n " << n;
    }
  }
}

TEST(CompareTest, DifferencesAreNotTheSameRotationInGeneral) {
  // 90 degrees about world z, then compare with an extra 10 degrees about body x: in body
  // axes the turn is about x, in world axes about y (the body's x now points along world y).
  const Rotation a = rz(90);
  const Rotation b = a * elementary_rotation(Axis::X, 10 * kDeg);
  const Comparison c = compare_poses(a, b, EulerConvention{});
  EXPECT_TRUE(test::MatrixNear(c.axis_body, Eigen::Vector3d(1, 0, 0), 1e-12));
  EXPECT_TRUE(test::MatrixNear(c.axis_world, Eigen::Vector3d(0, 1, 0), 1e-12));
  EXPECT_NEAR(c.turns_body_rad.x(), 10 * kDeg, 1e-12);
}

TEST(CompareTest, NamedSplitUsesBodyWords) {
  // FRD body, +1 degree about body y: pitch, nose up (right-hand rule; common practice).
  const Rotation a = rz(30);
  const Rotation b = a * elementary_rotation(Axis::Y, 1 * kDeg);
  const Comparison c = compare_poses(a, b, EulerConvention{}, parse_vehicle_axes("FRD").value());
  ASSERT_TRUE(c.named_turns.has_value());
  EXPECT_EQ((*c.named_turns)[1].turn_name, "pitch");
  EXPECT_EQ((*c.named_turns)[1].sense, "nose up");
  EXPECT_NEAR((*c.named_turns)[1].angle_rad, 1 * kDeg, 1e-12);
  EXPECT_TRUE((*c.named_turns)[0].sense.empty());
}

TEST(CompareTest, EulerSubtractionNoteOnlyWhenItDiffers) {
  const EulerConvention zyx{};  // intrinsic ZYX
  // Yaw only: the subtraction is exact, so no note.
  const Comparison yaw_only = compare_poses(rz(10), rz(25), zyx);
  EXPECT_LT(yaw_only.euler.mismatch_rad, 1e-12);
  EXPECT_TRUE(yaw_only.euler.note.empty());
  EXPECT_NEAR(yaw_only.euler.difference_rad(0), 15 * kDeg, 1e-12);
  // Pitched 60 degrees, then a roll and a yaw change: subtraction and rotation differ.
  const Rotation a = from_euler(zyx, Eigen::Vector3d(10, 60, 0) * kDeg);
  const Rotation b = from_euler(zyx, Eigen::Vector3d(20, 60, 5) * kDeg);
  const Comparison c = compare_poses(a, b, zyx);
  EXPECT_GT(c.euler.mismatch_rad, kEulerNoteRad);
  EXPECT_FALSE(c.euler.note.empty());
  // Independent check of the mismatch: the subtraction as a rotation against a^-1 b.
  const Rotation subtracted = from_euler(zyx, c.euler.difference_rad);
  EXPECT_NEAR(c.euler.mismatch_rad, geodesic_angle(subtracted, a.inverse() * b), 1e-12);
}

TEST(CompareTest, SlerpPathMatchesShoemake) {
  // slerp(I, Rz90, 1/3) = Rz30 = (0.9659258262890683, 0, 0, 0.25881904510252074): the
  // constant-rate great arc of Shoemake 1985 (check value from references.md T12, common practice).
  const std::vector<Rotation> path = slerp_path(Rotation::identity(), rz(90), 4);
  ASSERT_EQ(path.size(), 4u);
  EXPECT_TRUE(test::RotationNear(path[0], Rotation::identity(), kTight));
  EXPECT_TRUE(test::RotationNear(path[3], rz(90), kTight));
  const Eigen::Quaterniond q = path[1].quaternion();
  EXPECT_NEAR(q.w(), 0.9659258262890683, 1e-15);
  EXPECT_NEAR(q.z(), 0.25881904510252074, 1e-15);
  // Shortest arc: from I to Rz(270) the path goes through Rz(-45), not Rz(135).
  const std::vector<Rotation> short_way = slerp_path(Rotation::identity(), rz(270), 3);
  EXPECT_TRUE(test::RotationNear(short_way[1], rz(-45), 1e-12));
  EXPECT_EQ(slerp_path(rz(1), rz(2), 1).size(), 1u);
  EXPECT_TRUE(slerp_path(rz(1), rz(2), 0).empty());
}

TEST(CompareTest, MeanOfTwoIsHalfwayAndSignFree) {
  // Markley et al. 2007 mean of I and Rz90 with equal weights is Rz45 =
  // (0.9238795325112867, 0, 0, 0.3826834323650898), unchanged when an input is negated
  // (references.md T12, common practice).
  const auto plain = mean_and_spread({Rotation::identity(), rz(90)});
  const auto negated = mean_and_spread({Rotation::identity(), rz(90).negated()});
  ASSERT_TRUE(plain.ok());
  ASSERT_TRUE(negated.ok());
  EXPECT_NEAR(plain->mean.quaternion().w(), 0.9238795325112867, 1e-15);
  EXPECT_NEAR(plain->mean.quaternion().z(), 0.3826834323650898, 1e-15);
  EXPECT_TRUE(test::RotationNear(negated->mean, plain->mean, kTight));
  EXPECT_NEAR(plain->max_rad, 45 * kDeg, 1e-12);
  EXPECT_NEAR(plain->rms_rad, 45 * kDeg, 1e-12);
  // The negated input is flipped into the mean's hemisphere.
  EXPECT_EQ(plain->flipped + negated->flipped, 1u);
  for (const Eigen::Quaterniond& q : negated->aligned) {
    EXPECT_GE(q.coeffs().dot(negated->mean.stored_quaternion().coeffs()), 0.0);
  }
}

TEST(CompareTest, MeanIsTheTopEigenvectorAndMinimisesChordalCost) {
  // Markley, Cheng, Crassidis, Oshman 2007, "Averaging Quaternions": the mean is the
  // eigenvector of M = sum w_i q_i q_i^T for its largest eigenvalue, and it minimises
  // sum w_i ||A_i - A||_F^2. Checked independently of the library's eigen-solver call.
  std::mt19937 rng(kSeed + 7);
  std::normal_distribution<double> noise(0.0, 0.05);
  std::uniform_real_distribution<double> weight(0.5, 2.0);
  const Rotation centre = test::RandomRotation(rng);
  std::vector<Rotation> poses;
  std::vector<double> weights;
  for (int i = 0; i < 30; ++i) {
    const Rotation r = centre * Rotation(Eigen::Quaterniond(1.0, noise(rng), noise(rng), noise(rng)));
    poses.push_back(i % 3 == 0 ? r.negated() : r);  // mixed hemispheres
    weights.push_back(weight(rng));
  }
  const auto ms = mean_and_spread(poses, weights);
  ASSERT_TRUE(ms.ok());
  Eigen::Matrix4d m = Eigen::Matrix4d::Zero();
  for (std::size_t i = 0; i < poses.size(); ++i) {
    const Eigen::Vector4d q = poses[i].stored_quaternion().coeffs();
    m += weights[i] * q * q.transpose();
  }
  const Eigen::Vector4d q = ms->mean.stored_quaternion().coeffs();
  const double top = Eigen::SelfAdjointEigenSolver<Eigen::Matrix4d>(m).eigenvalues()(3);
  EXPECT_TRUE(test::MatrixNear(m * q, top * q, 1e-10)) << "seed " << kSeed + 7;
  auto cost = [&](const Rotation& a) {
    double c = 0.0;
    for (std::size_t i = 0; i < poses.size(); ++i)
      c += weights[i] * (poses[i].matrix() - a.matrix()).squaredNorm();
    return c;
  };
  for (int k = 0; k < 50; ++k) {
    const Rotation nudged = ms->mean * Rotation(Eigen::Quaterniond(1.0, noise(rng), noise(rng), noise(rng)));
    EXPECT_LE(cost(ms->mean), cost(nudged) + 1e-12);
  }
  // The spread against its definition: geodesic angles from the mean.
  double sum_w = 0.0, sum = 0.0, largest = 0.0;
  for (std::size_t i = 0; i < poses.size(); ++i) {
    const double a = geodesic_angle(ms->mean, poses[i]);
    sum_w += weights[i];
    sum += weights[i] * a * a;
    largest = std::max(largest, a);
  }
  EXPECT_NEAR(ms->rms_rad, std::sqrt(sum / sum_w), 1e-12);
  EXPECT_NEAR(ms->max_rad, largest, 1e-12);
  EXPECT_EQ(ms->flipped > 0, true);
}

TEST(CompareTest, MeanRefusesAmbiguousInput) {
  EXPECT_FALSE(mean_and_spread({}).ok());
  // Two rotations 180 degrees apart: every point of a circle is equally "the mean".
  EXPECT_FALSE(mean_and_spread({Rotation::identity(), elementary_rotation(Axis::X, M_PI)}).ok());
}

}  // namespace
}  // namespace attiscope
