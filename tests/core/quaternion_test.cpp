// quaternion_test.cpp: quaternion algebra, the 8 quaternion views, the 4x4 real and 2x2
// complex forms.
#include "attiscope/core/quaternion.hpp"

#include <cmath>
#include <complex>
#include <limits>

#include "attiscope/core/euler.hpp"
#include "support/check.hpp"
#include "support/corpus.hpp"

namespace attiscope {
namespace {

using test::kRoundTrip;
using test::kSeed;
using test::kTight;

using Q = Eigen::Quaterniond;

::testing::AssertionResult SameNumbers(const Q& a, const Q& b, double tol) {
  return test::MatrixNear(Eigen::Vector4d(a.w(), a.x(), a.y(), a.z()),
                          Eigen::Vector4d(b.w(), b.x(), b.y(), b.z()), tol);
}

TEST(QuaternionTest, UnitsMultiplyAsHamiltonSaid) {
  // Common practice (references.md T1): i^2 = j^2 = k^2 = ijk = -1, ij = k = -ji, jk = i = -kj,
  // ki = j = -ik.
  const Q one(1, 0, 0, 0), i(0, 1, 0, 0), j(0, 0, 1, 0), k(0, 0, 0, 1), minus_one(-1, 0, 0, 0);
  const auto neg = [](const Q& q) { return Q(-q.coeffs()); };
  EXPECT_TRUE(SameNumbers(hamilton_product(i, i), minus_one, 0.0));
  EXPECT_TRUE(SameNumbers(hamilton_product(j, j), minus_one, 0.0));
  EXPECT_TRUE(SameNumbers(hamilton_product(k, k), minus_one, 0.0));
  EXPECT_TRUE(SameNumbers(hamilton_product(hamilton_product(i, j), k), minus_one, 0.0));
  EXPECT_TRUE(SameNumbers(hamilton_product(i, j), k, 0.0));
  EXPECT_TRUE(SameNumbers(hamilton_product(j, i), neg(k), 0.0));
  EXPECT_TRUE(SameNumbers(hamilton_product(j, k), i, 0.0));
  EXPECT_TRUE(SameNumbers(hamilton_product(k, j), neg(i), 0.0));
  EXPECT_TRUE(SameNumbers(hamilton_product(k, i), j, 0.0));
  EXPECT_TRUE(SameNumbers(hamilton_product(i, k), neg(j), 0.0));
  EXPECT_TRUE(SameNumbers(hamilton_product(one, k), k, 0.0));
}

TEST(QuaternionTest, JplAlgebraFacts) {
  // references.md T8 (also Trawny & Roumeliotis 2005; Sola 2017): i (x)_JPL j = -k and
  // a (x)_JPL b = b (x)_Ham a.
  const Q i(0, 1, 0, 0), j(0, 0, 1, 0), k(0, 0, 0, 1);
  EXPECT_TRUE(SameNumbers(jpl_product(i, j), Q(-k.coeffs()), 0.0));
  std::mt19937 rng(kSeed);
  for (int n = 0; n < 100; ++n) {
    const Q a = test::RandomRotation(rng).stored_quaternion();
    const Q b = test::RandomRotation(rng).stored_quaternion();
    EXPECT_TRUE(SameNumbers(jpl_product(a, b), hamilton_product(b, a), 0.0));
    // C_JPL(q) = R_Ham(q)^T for the same numbers, and C(a (x)_JPL b) = C(a) C(b).
    const auto c_jpl = [](const Q& q) { return Eigen::Matrix3d(q.toRotationMatrix().transpose()); };
    EXPECT_TRUE(test::MatrixNear(c_jpl(jpl_product(a, b)), c_jpl(a) * c_jpl(b), kTight)) << "seed " << kSeed;
  }
}

TEST(QuaternionTest, JplWorldToBodyHasTheHamiltonNumbers) {
  // references.md T8: frame L is G turned +90 deg about z. C^L_G = [[0,1,0],[-1,0,0],[0,0,1]];
  // its JPL quaternion (x,y,z,w) = (0, 0, sqrt2/2, sqrt2/2) has the numbers of the Hamilton
  // quaternion of the active Rz(+90).
  const Rotation g_R_l = elementary_rotation(Axis::Z, M_PI / 2);
  Eigen::Matrix3d c_l_g;
  c_l_g << 0, 1, 0, -1, 0, 0, 0, 0, 1;
  EXPECT_TRUE(test::MatrixNear(g_R_l.matrix().transpose(), c_l_g, kTight));
  const QuatConvention jpl_w2b{QuatLayout::ScalarLast, QuatAlgebra::Jpl, Direction::WorldToBody};
  const auto n = to_quaternion_numbers(g_R_l, jpl_w2b);
  const double h = std::sqrt(0.5);
  EXPECT_TRUE(test::MatrixNear(Eigen::Vector4d(n[0], n[1], n[2], n[3]), Eigen::Vector4d(0, 0, h, h), kTight));
  // And it reads back.
  EXPECT_TRUE(test::RotationNear(from_quaternion_numbers(n, jpl_w2b).value(), g_R_l, kTight));
}

TEST(QuaternionTest, EightViewsAreWhatTheyClaim) {
  // Each view checked from its definition, not from the code's own flip rule:
  // layout permutes storage; Hamilton body-to-world is the rotation; Hamilton world-to-body
  // is its inverse; JPL numbers q have the matrix C(q) = R_Ham(q)^T, so JPL body-to-world
  // numbers are those whose transpose-matrix is world_R_body.
  std::mt19937 rng(kSeed);
  for (int s = 0; s < 200; ++s) {
    const Rotation world_R_body = test::RandomRotation(rng);
    for (const QuatConvention& c : all_quat_conventions()) {
      const auto n = to_quaternion_numbers(world_R_body, c);
      const Q q = c.layout == QuatLayout::ScalarFirst ? Q(n[0], n[1], n[2], n[3]) : Q(n[3], n[0], n[1], n[2]);
      Eigen::Matrix3d m = q.toRotationMatrix();
      if (c.algebra == QuatAlgebra::Jpl) m.transposeInPlace();
      const Eigen::Matrix3d want =
          c.direction == Direction::BodyToWorld ? world_R_body.matrix() : world_R_body.matrix().transpose();
      EXPECT_TRUE(test::MatrixNear(m, want, kTight)) << c.describe() << " seed " << kSeed;
      // Canonical sign in every view.
      EXPECT_GE(q.w(), 0.0) << c.describe();
    }
  }
}

TEST(QuaternionTest, EightViewsRoundTrip) {
  std::mt19937 rng(kSeed);
  std::vector<Rotation> rs;
  for (int n = 0; n < 500; ++n) rs.push_back(test::RandomRotation(rng));
  for (const auto& c : test::EdgeCorpus()) rs.push_back(c.rotation);
  for (const Rotation& r : rs) {
    for (const QuatConvention& c : all_quat_conventions()) {
      QuatCheck check;
      const auto back = from_quaternion_numbers(to_quaternion_numbers(r, c), c, &check);
      ASSERT_TRUE(back.ok()) << c.describe();
      EXPECT_TRUE(test::RotationNear(back.value(), r, kRoundTrip)) << c.describe() << " seed " << kSeed;
      EXPECT_NEAR(check.norm, 1.0, 1e-15);
    }
  }
}

TEST(QuaternionTest, EightConventionsAreDistinct) {
  const auto all = all_quat_conventions();
  for (std::size_t a = 0; a < all.size(); ++a) {
    for (std::size_t b = a + 1; b < all.size(); ++b) EXPECT_FALSE(all[a] == all[b]);
  }
}

TEST(QuaternionTest, ReadingNumbersRejectsNonRotations) {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const double inf = std::numeric_limits<double>::infinity();
  EXPECT_FALSE(from_quaternion_numbers({nan, 0, 0, 1}, {}).ok());
  EXPECT_FALSE(from_quaternion_numbers({1, 0, inf, 0}, {}).ok());
  EXPECT_FALSE(from_quaternion_numbers({0, 0, 0, 0}, {}).ok());
  EXPECT_FALSE(from_quaternion_numbers({1e-12, 0, 0, 0}, {}).ok());
  // Non-unit but valid: accepted, normalised, the norm reported.
  QuatCheck check;
  const auto r = from_quaternion_numbers({0, 0, 2, 2}, {QuatLayout::ScalarLast}, &check);
  ASSERT_TRUE(r.ok());
  EXPECT_NEAR(check.norm, std::sqrt(8.0), kTight);
  // scipy 1.10.1 from_quat([0,0,2,2]) (x,y,z,w) is +90 deg about z (references.md 2.2).
  EXPECT_TRUE(test::RotationNear(r.value(), elementary_rotation(Axis::Z, M_PI / 2), kTight));
  // Huge numbers are a direction too, and the reported norm is right.
  const auto big = from_quaternion_numbers({3e200, 0, 4e200, 0}, {}, &check);
  ASSERT_TRUE(big.ok());
  EXPECT_NEAR(check.norm / 5e200, 1.0, 1e-15);
  EXPECT_TRUE(test::RotationNear(big.value(), Rotation(Q(0.6, 0, 0.8, 0)), kTight));
}

TEST(QuaternionTest, MultiplicationMatrices) {
  // Common practice (references.md T7; also Sola 2017): p (x) q = L(p) q = R(q) p with
  // L(i) = [[0,-1,0,0],[1,0,0,0],[0,0,0,-1],[0,0,1,0]], R(i) = [[0,-1,0,0],[1,0,0,0],[0,0,0,1],[0,0,-1,0]].
  Eigen::Matrix4d li, ri;
  li << 0, -1, 0, 0, 1, 0, 0, 0, 0, 0, 0, -1, 0, 0, 1, 0;
  ri << 0, -1, 0, 0, 1, 0, 0, 0, 0, 0, 0, 1, 0, 0, -1, 0;
  EXPECT_TRUE(test::MatrixNear(left_multiplication_matrix(Q(0, 1, 0, 0)), li, 0.0));
  EXPECT_TRUE(test::MatrixNear(right_multiplication_matrix(Q(0, 1, 0, 0)), ri, 0.0));
  const auto wxyz = [](const Q& q) { return Eigen::Vector4d(q.w(), q.x(), q.y(), q.z()); };
  std::mt19937 rng(kSeed);
  for (int n = 0; n < 100; ++n) {
    const Q p = test::RandomRotation(rng).stored_quaternion();
    const Q q = test::RandomRotation(rng).stored_quaternion();
    const Eigen::Matrix4d lp = left_multiplication_matrix(p), rq = right_multiplication_matrix(q);
    EXPECT_TRUE(test::MatrixNear(lp * wxyz(q), wxyz(hamilton_product(p, q)), kTight));
    EXPECT_TRUE(test::MatrixNear(rq * wxyz(p), wxyz(hamilton_product(p, q)), kTight));
    // L(p) R(q) = R(q) L(p); L(q)^T = L(q*); det L(q) = |q|^4.
    EXPECT_TRUE(test::MatrixNear(lp * rq, rq * lp, kTight));
    EXPECT_TRUE(test::MatrixNear(Eigen::Matrix4d(left_multiplication_matrix(q).transpose()),
                                 left_multiplication_matrix(q.conjugate()), 0.0));
    const Q scaled(2.0 * q.w(), 2.0 * q.x(), 2.0 * q.y(), 2.0 * q.z());
    EXPECT_NEAR(left_multiplication_matrix(scaled).determinant(), 16.0, 1e-12);
    // R(q*) L(q) = blockdiag(1, R(q)): the sandwich q v q*.
    Eigen::Matrix4d sandwich = Eigen::Matrix4d::Zero();
    sandwich(0, 0) = 1.0;
    sandwich.block<3, 3>(1, 1) = q.toRotationMatrix();
    EXPECT_TRUE(test::MatrixNear(right_multiplication_matrix(q.conjugate()) * left_multiplication_matrix(q),
                                 sandwich, kTight));
  }
}

TEST(QuaternionTest, Su2Form) {
  // Common practice (references.md T6): U(i) = [[i,0],[0,-i]], U(j) = [[0,1],[-1,0]],
  // U(k) = [[0,i],[i,0]]; U(1/2,1/2,1/2,1/2) = [[1/2 + i/2, 1/2 + i/2], [-1/2 + i/2, 1/2 - i/2]].
  using C = std::complex<double>;
  const C I(0, 1);
  Eigen::Matrix2cd ui, uj, uk, uh;
  ui << I, 0, 0, -I;
  uj << 0, 1, -1, 0;
  uk << 0, I, I, 0;
  uh << C(0.5, 0.5), C(0.5, 0.5), C(-0.5, 0.5), C(0.5, -0.5);
  EXPECT_LE((su2_matrix(Q(0, 1, 0, 0)) - ui).norm(), 0.0);
  EXPECT_LE((su2_matrix(Q(0, 0, 1, 0)) - uj).norm(), 0.0);
  EXPECT_LE((su2_matrix(Q(0, 0, 0, 1)) - uk).norm(), 0.0);
  EXPECT_LE((su2_matrix(Q(0.5, 0.5, 0.5, 0.5)) - uh).norm(), 0.0);
  std::mt19937 rng(kSeed);
  for (int n = 0; n < 100; ++n) {
    const Q p = test::RandomRotation(rng).stored_quaternion();
    const Q q = test::RandomRotation(rng).stored_quaternion();
    // Homomorphism, unitarity and det U = |q|^2.
    EXPECT_LE((su2_matrix(p) * su2_matrix(q) - su2_matrix(hamilton_product(p, q))).norm(), kTight);
    EXPECT_LE((su2_matrix(q).adjoint() * su2_matrix(q) - Eigen::Matrix2cd::Identity()).norm(), kTight);
    const Q scaled(3.0 * q.w(), 3.0 * q.x(), 3.0 * q.y(), 3.0 * q.z());
    EXPECT_NEAR(std::abs(su2_matrix(scaled).determinant() - C(9.0, 0.0)), 0.0, 1e-12);
  }
}

TEST(QuaternionTest, Su2RejectsOtherMatrices) {
  Eigen::Matrix2cd m;
  m << 1, 1, 1, 1;  // not of the form [[a, b], [-conj b, conj a]]
  EXPECT_FALSE(from_su2_matrix(m).ok());
  m << 0, 0, 0, 0;
  EXPECT_FALSE(from_su2_matrix(m).ok());
  m << std::numeric_limits<double>::quiet_NaN(), 0, 0, 1;
  EXPECT_FALSE(from_su2_matrix(m).ok());
}

}  // namespace
}  // namespace attiscope
