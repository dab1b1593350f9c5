// matrix.cpp: matrix checks, nearest rotation, Shepperd's matrix -> quaternion, views.
#include "attiscope/core/matrix.hpp"

#include <Eigen/SVD>
#include <algorithm>
#include <cmath>
#include <cstdio>

namespace attiscope {

std::string MatrixConvention::describe() const {
  std::string s = direction == Direction::BodyToWorld ? "body-to-world" : "world-to-body";
  s += storage == MatrixStorage::Rows ? ", row-major" : ", column-major";
  return s;
}

Eigen::Matrix3d nearest_rotation(const Eigen::Matrix3d& m) {
  Eigen::JacobiSVD<Eigen::Matrix3d> svd(m, Eigen::ComputeFullU | Eigen::ComputeFullV);
  const Eigen::Matrix3d u = svd.matrixU();
  const Eigen::Matrix3d v = svd.matrixV();
  Eigen::Vector3d d(1.0, 1.0, (u * v.transpose()).determinant() < 0.0 ? -1.0 : 1.0);
  return u * d.asDiagonal() * v.transpose();
}

MatrixCheck check_matrix(const Eigen::Matrix3d& m) {
  MatrixCheck c;
  c.finite = m.allFinite();
  if (!c.finite) return c;
  c.orthonormality_defect = (m.transpose() * m - Eigen::Matrix3d::Identity()).norm();
  c.determinant = m.determinant();
  const Eigen::Matrix3d r = nearest_rotation(m);
  double worst = 0.0;
  for (int j = 0; j < 3; ++j) {
    const Eigen::Vector3d a = m.col(j);
    const Eigen::Vector3d b = r.col(j);
    const double n = a.norm();
    if (n == 0.0) {
      worst = 180.0;
      continue;
    }
    worst = std::max(worst, std::atan2(a.cross(b).norm(), a.dot(b)) * 180.0 / M_PI);
  }
  c.correction_deg = worst;
  return c;
}

Eigen::Quaterniond quaternion_from_rotation_matrix(const Eigen::Matrix3d& r) {
  // Shepperd (1978): 4 q_p^2 for the pivot p is one of 1 + tr R, 1 + 2 R_ii - tr R; take the
  // largest so the division below is by a number >= 1/2.
  const double tr = r.trace();
  const double cand[4] = {tr, r(0, 0), r(1, 1), r(2, 2)};
  const int p = static_cast<int>(std::max_element(cand, cand + 4) - cand);
  double w, x, y, z;
  switch (p) {
    case 0: {
      const double s = 2.0 * std::sqrt(1.0 + tr);  // 4 w
      w = 0.25 * s;
      x = (r(2, 1) - r(1, 2)) / s;
      y = (r(0, 2) - r(2, 0)) / s;
      z = (r(1, 0) - r(0, 1)) / s;
      break;
    }
    case 1: {
      const double s = 2.0 * std::sqrt(1.0 + 2.0 * r(0, 0) - tr);  // 4 x
      x = 0.25 * s;
      w = (r(2, 1) - r(1, 2)) / s;
      y = (r(0, 1) + r(1, 0)) / s;
      z = (r(0, 2) + r(2, 0)) / s;
      break;
    }
    case 2: {
      const double s = 2.0 * std::sqrt(1.0 + 2.0 * r(1, 1) - tr);  // 4 y
      y = 0.25 * s;
      w = (r(0, 2) - r(2, 0)) / s;
      x = (r(0, 1) + r(1, 0)) / s;
      z = (r(1, 2) + r(2, 1)) / s;
      break;
    }
    default: {
      const double s = 2.0 * std::sqrt(1.0 + 2.0 * r(2, 2) - tr);  // 4 z
      z = 0.25 * s;
      w = (r(1, 0) - r(0, 1)) / s;
      x = (r(0, 2) + r(2, 0)) / s;
      y = (r(1, 2) + r(2, 1)) / s;
      break;
    }
  }
  Eigen::Quaterniond q(w, x, y, z);
  q.coeffs() /= q.norm();
  return canonical_sign(q);
}

Expected<Rotation> from_matrix(const Eigen::Matrix3d& m, Direction direction, MatrixCheck* check) {
  const MatrixCheck c = check_matrix(m);
  if (check) *check = c;
  if (!c.finite) return Error{"the matrix has a number that is not finite (NaN or Inf)"};
  if (c.determinant < 0.0) {
    return Error{
        "this is a reflection, not a rotation: an odd number of axes was flipped "
        "(determinant " +
        std::to_string(c.determinant) + ")"};
  }
  if (c.orthonormality_defect > kMatrixDefectMax) {
    char buf[160];
    std::snprintf(buf, sizeof buf,
                  "this is not a rotation matrix: its orthonormality defect ||M^T M - I|| is %.3g "
                  "(at most %.3g is accepted)",
                  c.orthonormality_defect, kMatrixDefectMax);
    return Error{buf};
  }
  const Eigen::Matrix3d r = c.orthonormality_defect > kMatrixDefectSilent ? nearest_rotation(m) : m;
  Rotation rot(quaternion_from_rotation_matrix(r));
  return direction == Direction::BodyToWorld ? rot : rot.inverse();
}

Eigen::Matrix3d matrix_from_numbers(const std::array<double, 9>& n, MatrixStorage storage) {
  Eigen::Matrix3d m;
  for (int i = 0; i < 3; ++i) {
    for (int j = 0; j < 3; ++j) {
      m(i, j) = storage == MatrixStorage::Rows ? n[static_cast<std::size_t>(3 * i + j)]
                                               : n[static_cast<std::size_t>(3 * j + i)];
    }
  }
  return m;
}

std::array<double, 9> to_matrix_numbers(const Rotation& world_R_body, const MatrixConvention& c) {
  const Eigen::Matrix3d m =
      c.direction == Direction::BodyToWorld ? world_R_body.matrix() : world_R_body.matrix().transpose();
  std::array<double, 9> out{};
  for (int i = 0; i < 3; ++i) {
    for (int j = 0; j < 3; ++j) {
      out[static_cast<std::size_t>(3 * i + j)] = c.storage == MatrixStorage::Rows ? m(i, j) : m(j, i);
    }
  }
  return out;
}

}  // namespace attiscope
