// multiplication_matrix_test.cpp: from_multiplication_matrix, the inverse of the 4x4 real
// left/right multiplication matrices (core/quaternion.hpp).
#include <gtest/gtest.h>

#include <limits>

#include "attiscope/core/quaternion.hpp"
#include "support/check.hpp"

namespace attiscope {
namespace {

TEST(MultiplicationMatrixTest, RoundTripsBothSides) {
  std::mt19937 rng(test::kSeed);
  for (int i = 0; i < 200; ++i) {
    const Rotation r = test::RandomRotation(rng);
    const Eigen::Quaterniond q = r.quaternion();
    for (MultiplicationSide side : {MultiplicationSide::Left, MultiplicationSide::Right}) {
      const Eigen::Matrix4d m =
          side == MultiplicationSide::Left ? left_multiplication_matrix(q) : right_multiplication_matrix(q);
      const auto back = from_multiplication_matrix(m, side);
      ASSERT_TRUE(back.ok()) << "seed " << test::kSeed << " i " << i << ": " << back.error().describe();
      EXPECT_TRUE(test::RotationNear(back.value(), r, test::kRoundTrip))
          << "seed " << test::kSeed << " i " << i;
    }
  }
}

TEST(MultiplicationMatrixTest, LeftMatrixActsAsHamiltonProduct) {
  // L(p) q = p (x) q by definition (quaternion.hpp); the inverse must return p.
  const Eigen::Quaterniond p = Eigen::Quaterniond(0.3, -0.5, 0.7, 0.1).normalized();
  const Eigen::Quaterniond q = Eigen::Quaterniond(-0.2, 0.4, 0.1, 0.9).normalized();
  const Eigen::Matrix4d l = left_multiplication_matrix(p);
  const Eigen::Vector4d lq = l * Eigen::Vector4d(q.w(), q.x(), q.y(), q.z());
  const Eigen::Quaterniond pq = hamilton_product(p, q);
  EXPECT_TRUE(test::MatrixNear(lq, Eigen::Vector4d(pq.w(), pq.x(), pq.y(), pq.z()), test::kTight));
  const auto back = from_multiplication_matrix(l, MultiplicationSide::Left);
  ASSERT_TRUE(back.ok());
  EXPECT_TRUE(test::RotationNear(back.value(), Rotation(p), test::kTight));
}

TEST(MultiplicationMatrixTest, BrokenFormIsRefusedUnlessNearestIsAsked) {
  Eigen::Matrix4d m = left_multiplication_matrix(Eigen::Quaterniond(0.5, 0.5, 0.5, 0.5));
  m(0, 1) += 0.3;  // no longer of the form L(q)
  EXPECT_FALSE(from_multiplication_matrix(m, MultiplicationSide::Left).ok());
  const auto nearest =
      from_multiplication_matrix(m, MultiplicationSide::Left, std::numeric_limits<double>::infinity());
  ASSERT_TRUE(nearest.ok());
  // The projection changes the quaternion only by the averaged perturbation: x -= 0.3 / 4.
  const Eigen::Quaterniond want = Eigen::Quaterniond(0.5, 0.5 - 0.075, 0.5, 0.5).normalized();
  EXPECT_TRUE(test::RotationNear(nearest.value(), Rotation(want), test::kTight));
  EXPECT_FALSE(from_multiplication_matrix(Eigen::Matrix4d::Zero(), MultiplicationSide::Right,
                                          std::numeric_limits<double>::infinity())
                   .ok());
}

}  // namespace
}  // namespace attiscope
