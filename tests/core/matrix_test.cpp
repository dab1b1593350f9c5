// matrix_test.cpp: matrix checks, nearest rotation, Shepperd's matrix -> quaternion, and
// the matrix views (direction x storage).
#include "attiscope/core/matrix.hpp"

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

TEST(MatrixTest, ShepperdBranchCases) {
  // Branch coverage suggested by references.md 1.3 [M2] (Shepperd 1978) and [M1] (Klumpp
  // 1976: a method must work at exactly 180 degrees): identity, 180 deg about x, y, z and
  // (1,1,0)/sqrt2, 179.999 deg about (1,2,3), 1e-9 rad. The matrix is built from the
  // axis-angle (Rodrigues) formula R = I + sin t [u]x + (1 - cos t) [u]x^2, independent of
  // the quaternion code.
  const auto rodrigues = [](const Eigen::Vector3d& axis, double t) {
    const Eigen::Vector3d u = axis.normalized();
    Eigen::Matrix3d k;
    k << 0, -u.z(), u.y(), u.z(), 0, -u.x(), -u.y(), u.x(), 0;
    return Eigen::Matrix3d(Eigen::Matrix3d::Identity() + std::sin(t) * k + (1.0 - std::cos(t)) * k * k);
  };
  const std::vector<std::pair<Eigen::Vector3d, double>> cases = {
      {Eigen::Vector3d::UnitX(), 0.0},        {Eigen::Vector3d::UnitX(), M_PI},
      {Eigen::Vector3d::UnitY(), M_PI},       {Eigen::Vector3d::UnitZ(), M_PI},
      {Eigen::Vector3d(1, 1, 0), M_PI},       {Eigen::Vector3d(1, 2, 3), 179.999 * M_PI / 180},
      {Eigen::Vector3d(1, 2, 3), 1e-9},       {Eigen::Vector3d(-3, 1, 0.5), 2.5},
      {Eigen::Vector3d(0.2, -1, 0.1), -M_PI}, {Eigen::Vector3d(0, 0, 1), M_PI - 1e-9}};
  for (const auto& [axis, t] : cases) {
    const Eigen::Matrix3d m = rodrigues(axis, t);
    const Eigen::Quaterniond q = quaternion_from_rotation_matrix(m);
    EXPECT_NEAR(q.norm(), 1.0, 1e-15);
    EXPECT_GE(q.w(), 0.0);
    EXPECT_TRUE(test::MatrixNear(q.toRotationMatrix(), m, kTight))
        << "axis " << axis.transpose() << " angle " << t;
    EXPECT_NEAR(geodesic_angle(Rotation(q), test::AxisTurn(axis, t)), 0.0, kTight) << "angle " << t;
  }
  // The exact 180-degree case about x is (0, 1, 0, 0) (references.md T2).
  Eigen::Matrix3d flip_x = Eigen::Vector3d(1, -1, -1).asDiagonal();
  EXPECT_TRUE(
      test::MatrixNear(quaternion_from_rotation_matrix(flip_x).coeffs(), Eigen::Vector4d(1, 0, 0, 0), 0.0));
}

TEST(MatrixTest, SmallAnglesKeepTheirDigits) {
  // A 1e-9 rad turn: the quaternion's vector part must carry the angle to full relative
  // precision (the trace branch divides by 4w ~ 4).
  const Eigen::Vector3d axis = Eigen::Vector3d(1, -2, 3).normalized();
  for (double t : {1e-6, 1e-9, 1e-12}) {
    const Rotation r = test::AxisTurn(axis, t);
    const Eigen::Quaterniond q = quaternion_from_rotation_matrix(r.matrix());
    EXPECT_NEAR(2.0 * q.vec().norm() / t, 1.0, 1e-6)
        << "angle " << t;  // matrix entries are O(1): absolute 1e-16
    EXPECT_NEAR(geodesic_angle(Rotation(q), r), 0.0, 1e-15);
  }
}

TEST(MatrixTest, ViewsRoundTripBothDirectionsAndStorages) {
  std::mt19937 rng(kSeed);
  std::vector<Rotation> rs;
  for (int n = 0; n < 500; ++n) rs.push_back(test::RandomRotation(rng));
  for (const auto& c : test::EdgeCorpus()) rs.push_back(c.rotation);
  for (const Rotation& r : rs) {
    for (Direction d : {Direction::BodyToWorld, Direction::WorldToBody}) {
      for (MatrixStorage s : {MatrixStorage::Rows, MatrixStorage::Columns}) {
        const MatrixConvention mc{d, s};
        const auto n = to_matrix_numbers(r, mc);
        // Storage from its definition: rows list m(0,0) m(0,1) ...; columns list m(0,0) m(1,0) ...
        const Eigen::Matrix3d written = d == Direction::BodyToWorld ? r.matrix() : r.matrix().transpose();
        EXPECT_EQ(n[1], s == MatrixStorage::Rows ? written(0, 1) : written(1, 0));
        EXPECT_EQ(n[5], s == MatrixStorage::Rows ? written(1, 2) : written(2, 1));
        const Eigen::Matrix3d m = matrix_from_numbers(n, s);
        EXPECT_TRUE(test::MatrixNear(m, written, 0.0));
        const auto back = from_matrix(m, d);
        ASSERT_TRUE(back.ok()) << mc.describe();
        EXPECT_TRUE(test::RotationNear(back.value(), r, kRoundTrip)) << mc.describe() << " seed " << kSeed;
      }
    }
  }
}

TEST(MatrixTest, ChecksOfValidity) {
  const MatrixCheck ok = check_matrix(elementary_matrix(Axis::Y, 0.7));
  EXPECT_TRUE(ok.finite);
  EXPECT_NEAR(ok.determinant, 1.0, kTight);
  EXPECT_LT(ok.orthonormality_defect, 1e-15);
  EXPECT_LT(ok.correction_deg, 1e-12);
  // A reflection is refused with the reason.
  Eigen::Matrix3d reflection = Eigen::Vector3d(1, 1, -1).asDiagonal();
  const auto r = from_matrix(reflection);
  ASSERT_FALSE(r.ok());
  EXPECT_NE(r.error().message.find("reflection"), std::string::npos) << r.error().message;
  // Not finite.
  Eigen::Matrix3d bad = Eigen::Matrix3d::Identity();
  bad(1, 2) = std::numeric_limits<double>::quiet_NaN();
  EXPECT_FALSE(check_matrix(bad).finite);
  EXPECT_FALSE(from_matrix(bad).ok());
  // Far from a rotation: refused; a little off: accepted through the nearest rotation.
  EXPECT_FALSE(from_matrix(2.0 * Eigen::Matrix3d::Identity()).ok());
  EXPECT_FALSE(from_matrix(Eigen::Matrix3d::Zero()).ok());
  Eigen::Matrix3d scaled = elementary_matrix(Axis::Z, 0.4);
  scaled.col(0) *= 1.001;
  MatrixCheck check;
  const auto near = from_matrix(scaled, Direction::BodyToWorld, &check);
  ASSERT_TRUE(near.ok());
  EXPECT_GT(check.orthonormality_defect, kMatrixDefectSilent);
  EXPECT_TRUE(test::RotationNear(near.value(), elementary_rotation(Axis::Z, 0.4), 1e-12));
}

TEST(MatrixTest, NearestRotationIsTheSvdProjection) {
  // Higham 1986 / Markley 1988: R = U diag(1, 1, det(U V^T)) V^T. Properties that identify it:
  // an orthonormal result with det +1, the fixed point of exact rotations, and for a noisy
  // rotation it is closer in Frobenius norm than the noise-free rotation itself.
  std::mt19937 rng(kSeed);
  std::normal_distribution<double> noise(0.0, 1e-3);
  for (int n = 0; n < 200; ++n) {
    const Eigen::Matrix3d r = test::RandomRotation(rng).matrix();
    EXPECT_TRUE(test::MatrixNear(nearest_rotation(r), r, kTight));
    Eigen::Matrix3d m = r;
    for (int k = 0; k < 9; ++k) m(k / 3, k % 3) += noise(rng);
    const Eigen::Matrix3d p = nearest_rotation(m);
    EXPECT_TRUE(test::MatrixNear(p.transpose() * p, Eigen::Matrix3d::Identity(), kTight));
    EXPECT_NEAR(p.determinant(), 1.0, kTight);
    EXPECT_LE((p - m).norm(), (r - m).norm() + 1e-15) << "seed " << kSeed;
    // Small symmetric perturbations of p never do better (first-order optimality).
    for (Axis a : {Axis::X, Axis::Y, Axis::Z}) {
      for (double e : {1e-5, -1e-5}) {
        EXPECT_LE((p - m).norm(), (p * elementary_matrix(a, e) - m).norm() + 1e-15);
      }
    }
  }
  // A reflection has no unique nearest rotation in general, but the result is a rotation.
  const Eigen::Matrix3d refl = Eigen::Vector3d(1, 1, -1).asDiagonal();
  EXPECT_NEAR(nearest_rotation(refl).determinant(), 1.0, kTight);
}

TEST(MatrixTest, NedEnuAndFrdFlu) {
  // Common practice (references.md T13): C_ENU<-NED = [[0,1,0],[1,0,0],[0,0,-1]] is a proper
  // rotation, 180 deg about (1,1,0)/sqrt2, q = (0, sqrt2/2, sqrt2/2, 0); C_FLU<-FRD = diag(1,-1,-1),
  // q = (0, 1, 0, 0).
  Eigen::Matrix3d enu_ned;
  enu_ned << 0, 1, 0, 1, 0, 0, 0, 0, -1;
  const auto r = from_matrix(enu_ned);
  ASSERT_TRUE(r.ok());
  const double h = std::sqrt(0.5);
  EXPECT_TRUE(test::MatrixNear(r.value().quaternion().coeffs(), Eigen::Vector4d(h, h, 0, 0), kTight));
  EXPECT_TRUE(test::MatrixNear(enu_ned * enu_ned, Eigen::Matrix3d::Identity(), 0.0));
  const auto f = from_matrix(Eigen::Vector3d(1, -1, -1).asDiagonal().toDenseMatrix());
  ASSERT_TRUE(f.ok());
  EXPECT_TRUE(test::MatrixNear(f.value().quaternion().coeffs(), Eigen::Vector4d(1, 0, 0, 0), kTight));
  // Level flight heading north (identity in NED/FRD) is yaw +90 in ENU/FLU:
  // enu_R_flu = C_ENU<-NED * I * C_FRD<-FLU, q = (sqrt2/2, 0, 0, sqrt2/2).
  const Rotation enu_R_flu = r.value() * f.value().inverse();
  EXPECT_TRUE(test::RotationNear(enu_R_flu, elementary_rotation(Axis::Z, M_PI / 2), kTight));
}

}  // namespace
}  // namespace attiscope
