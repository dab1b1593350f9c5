// quaternion.cpp: quaternion algebra, the quaternion views of a rotation, the 4x4 real and
// 2x2 complex forms.
#include "attiscope/core/quaternion.hpp"

#include <algorithm>
#include <cmath>
#include <complex>
#include <cstdio>

namespace attiscope {

std::string QuatConvention::describe() const {
  std::string s = layout == QuatLayout::ScalarFirst ? "w x y z" : "x y z w";
  s += algebra == QuatAlgebra::Hamilton ? ", Hamilton" : ", JPL";
  s += direction == Direction::BodyToWorld ? ", body-to-world" : ", world-to-body";
  return s;
}

std::array<QuatConvention, 8> all_quat_conventions() {
  std::array<QuatConvention, 8> out{};
  std::size_t n = 0;
  for (QuatLayout l : {QuatLayout::ScalarFirst, QuatLayout::ScalarLast}) {
    for (QuatAlgebra a : {QuatAlgebra::Hamilton, QuatAlgebra::Jpl}) {
      for (Direction d : {Direction::BodyToWorld, Direction::WorldToBody}) {
        out[n++] = QuatConvention{l, a, d};
      }
    }
  }
  return out;
}

Eigen::Quaterniond hamilton_product(const Eigen::Quaterniond& a, const Eigen::Quaterniond& b) {
  return a * b;  // Eigen's product is Hamilton's (i j = k)
}

Eigen::Quaterniond jpl_product(const Eigen::Quaterniond& a, const Eigen::Quaterniond& b) {
  return b * a;
}

namespace {

// True when the numbers, read in Hamilton algebra, are those of body_R_world rather than
// world_R_body. A JPL quaternion's matrix is the transpose of the Hamilton matrix of the
// same numbers, so JPL flips the direction once more.
bool numbers_are_inverse(const QuatConvention& c) {
  const bool w2b = c.direction == Direction::WorldToBody;
  const bool jpl = c.algebra == QuatAlgebra::Jpl;
  return w2b != jpl;
}

}  // namespace

std::array<double, 4> to_quaternion_numbers(const Rotation& world_R_body, const QuatConvention& c) {
  Eigen::Quaterniond q = world_R_body.quaternion();
  if (numbers_are_inverse(c)) q = canonical_sign(q.conjugate());
  if (c.layout == QuatLayout::ScalarFirst) return {q.w(), q.x(), q.y(), q.z()};
  return {q.x(), q.y(), q.z(), q.w()};
}

Expected<Rotation> from_quaternion_numbers(const std::array<double, 4>& numbers, const QuatConvention& c,
                                           QuatCheck* check) {
  for (std::size_t i = 0; i < 4; ++i) {
    if (!std::isfinite(numbers[i])) {
      Error e{"quaternion component " + std::to_string(i + 1) + " is not a finite number"};
      return e;
    }
  }
  Eigen::Quaterniond q = c.layout == QuatLayout::ScalarFirst
                             ? Eigen::Quaterniond(numbers[0], numbers[1], numbers[2], numbers[3])
                             : Eigen::Quaterniond(numbers[3], numbers[0], numbers[1], numbers[2]);
  // stableNorm: 1e200 squared would overflow to infinity and report a wrong norm.
  const double norm = q.coeffs().stableNorm();
  if (check) check->norm = norm;
  if (!(norm >= kMinQuaternionNorm)) {
    char buf[48];
    std::snprintf(buf, sizeof buf, "%.3g", norm);
    return Error{"this is a zero quaternion (norm " + std::string(buf) + "): it describes no rotation"};
  }
  if (numbers_are_inverse(c)) q = q.conjugate();
  return Rotation(q);
}

Eigen::Matrix4d left_multiplication_matrix(const Eigen::Quaterniond& p) {
  const double w = p.w(), x = p.x(), y = p.y(), z = p.z();
  Eigen::Matrix4d l;
  l << w, -x, -y, -z,  //
      x, w, -z, y,     //
      y, z, w, -x,     //
      z, -y, x, w;
  return l;
}

Eigen::Matrix4d right_multiplication_matrix(const Eigen::Quaterniond& q) {
  const double w = q.w(), x = q.x(), y = q.y(), z = q.z();
  Eigen::Matrix4d r;
  r << w, -x, -y, -z,  //
      x, w, z, -y,     //
      y, -z, w, x,     //
      z, y, -x, w;
  return r;
}

Eigen::Matrix2cd su2_matrix(const Eigen::Quaterniond& q) {
  using C = std::complex<double>;
  Eigen::Matrix2cd u;
  u << C(q.w(), q.x()), C(q.y(), q.z()),  //
      C(-q.y(), q.z()), C(q.w(), -q.x());
  return u;
}

Expected<Rotation> from_su2_matrix(const Eigen::Matrix2cd& u, double tolerance) {
  // U = [[w + x i, y + z i], [-y + z i, w - x i]]: read each number twice, check they agree.
  const double w = 0.5 * (u(0, 0).real() + u(1, 1).real());
  const double x = 0.5 * (u(0, 0).imag() - u(1, 1).imag());
  const double y = 0.5 * (u(0, 1).real() - u(1, 0).real());
  const double z = 0.5 * (u(0, 1).imag() + u(1, 0).imag());
  const Eigen::Matrix2cd back = su2_matrix(Eigen::Quaterniond(w, x, y, z));
  if (!u.allFinite()) return Error{"the complex matrix has a number that is not finite"};
  if ((back - u).norm() > tolerance * std::max(1.0, u.norm())) {
    return Error{"this 2x2 complex matrix is not of the form [[w + x i, y + z i], [-y + z i, w - x i]]"};
  }
  return from_quaternion_numbers({w, x, y, z}, QuatConvention{});
}

Expected<Rotation> from_multiplication_matrix(const Eigen::Matrix4d& m, MultiplicationSide side,
                                              double tolerance) {
  if (!m.allFinite()) return Error{"the 4x4 matrix has a number that is not finite"};
  Eigen::Vector4d p;
  for (int i = 0; i < 4; ++i) {
    Eigen::Vector4d e = Eigen::Vector4d::Zero();
    e(i) = 1.0;
    const Eigen::Quaterniond ei(e(0), e(1), e(2), e(3));
    const Eigen::Matrix4d basis =
        side == MultiplicationSide::Left ? left_multiplication_matrix(ei) : right_multiplication_matrix(ei);
    p(i) = (basis.transpose() * m).trace() / 4.0;
  }
  const Eigen::Quaterniond q(p(0), p(1), p(2), p(3));
  const Eigen::Matrix4d back =
      side == MultiplicationSide::Left ? left_multiplication_matrix(q) : right_multiplication_matrix(q);
  if ((back - m).norm() > tolerance * std::max(1.0, m.norm())) {
    return Error{side == MultiplicationSide::Left
                     ? "this 4x4 matrix is not a left-multiplication matrix L(q) of a quaternion"
                     : "this 4x4 matrix is not a right-multiplication matrix R(q) of a quaternion"};
  }
  return from_quaternion_numbers({p(0), p(1), p(2), p(3)}, QuatConvention{});
}

}  // namespace attiscope
