// rotation.cpp: the canonical rotation type, geodesic angle, SLERP and the quaternion mean.
#include "attiscope/core/rotation.hpp"

#include <Eigen/Eigenvalues>
#include <cmath>
#include <string>

namespace attiscope {

namespace {
// Above this norm the plain sum of squares keeps full precision (its square, 1e-300, is
// still a normal double).
constexpr double kDirectNormMin = 1e-150;
}  // namespace

Eigen::Quaterniond canonical_sign(const Eigen::Quaterniond& q) {
  // w > 0 decides; at w == 0 (a 180-degree turn) the first non-zero of x, y, z is made
  // positive so that the printed form is unique.
  // Adding +0.0 turns a -0.0 component into +0.0, so no "-0" is ever printed.
  const double lead[4] = {q.w(), q.x(), q.y(), q.z()};
  for (double c : lead) {
    if (c > 0.0) return Eigen::Quaterniond(Eigen::Vector4d(q.coeffs().array() + 0.0));
    if (c < 0.0) return Eigen::Quaterniond(Eigen::Vector4d(-q.coeffs().array() + 0.0));
  }
  return q;
}

Rotation::Rotation(const Eigen::Quaterniond& hamilton_wxyz) : q_(hamilton_wxyz) {
  const double n = q_.norm();
  if (std::isfinite(n) && n >= kDirectNormMin) {
    q_.coeffs() /= n;
    return;
  }
  // The squared norm overflowed (1e200 squared is infinite) or lost its digits to underflow
  // (1e-200 squared is 0): scale by the largest magnitude first. Any finite, non-zero four
  // numbers name a direction in 4D.
  const double scale = q_.coeffs().cwiseAbs().maxCoeff();
  assert(std::isfinite(scale) && scale > 0.0 && "Rotation built from a zero or non-finite quaternion");
  q_.coeffs() /= scale;
  q_.coeffs() /= q_.norm();
}

Rotation Rotation::operator*(const Rotation& rhs) const {
  Eigen::Quaterniond p = q_ * rhs.q_;
  // Renormalise: products of unit quaternions drift by about 1 ulp each.
  p.coeffs() /= p.norm();
  return Rotation(p, Unchecked{});
}

double geodesic_angle(const Rotation& a, const Rotation& b) {
  const Eigen::Quaterniond d = a.stored_quaternion().conjugate() * b.stored_quaternion();
  // 2 atan2(|v|, |w|) rather than 2 acos(|w|): acos loses half the digits near 0.
  return 2.0 * std::atan2(d.vec().norm(), std::abs(d.w()));
}

Rotation slerp(const Rotation& a, const Rotation& b, double t) {
  Eigen::Quaterniond d = a.stored_quaternion().conjugate() * b.stored_quaternion();
  if (d.w() < 0.0) d.coeffs() = -d.coeffs();  // shortest arc
  const double s = d.vec().norm();
  const double half = std::atan2(s, d.w());  // half the relative angle, in [0, pi/2]
  Eigen::Quaterniond step;
  if (s < 1e-300) {
    step = Eigen::Quaterniond::Identity();
  } else {
    const double h = t * half;
    step.w() = std::cos(h);
    step.vec() = d.vec() * (std::sin(h) / s);
  }
  return a * Rotation(step);
}

Expected<Rotation> mean_rotation(const std::vector<Rotation>& rotations, const std::vector<double>& weights) {
  if (rotations.empty()) return Error{"no rotations to average"};
  if (!weights.empty() && weights.size() != rotations.size()) {
    return Error{"got " + std::to_string(weights.size()) + " weights for " +
                 std::to_string(rotations.size()) + " rotations"};
  }
  Eigen::Matrix4d m = Eigen::Matrix4d::Zero();
  double total = 0.0;
  for (std::size_t i = 0; i < rotations.size(); ++i) {
    const double w = weights.empty() ? 1.0 : weights[i];
    if (!std::isfinite(w) || w < 0.0) {
      return Error{"weight " + std::to_string(i + 1) + " is negative or not a number"};
    }
    const Eigen::Vector4d q = rotations[i].stored_quaternion().coeffs();
    m += w * q * q.transpose();
    total += w;
  }
  if (total <= 0.0) return Error{"all weights are zero"};
  Eigen::SelfAdjointEigenSolver<Eigen::Matrix4d> eig(m / total);
  const Eigen::Vector4d values = eig.eigenvalues();  // ascending
  // A repeated top eigenvalue means a whole circle of rotations are equally "average".
  if (values(3) - values(2) < 1e-12) {
    return Error{
        "the mean is not unique: the rotations are spread too evenly (for example two "
        "rotations 180 degrees apart)"};
  }
  const Eigen::Vector4d v = eig.eigenvectors().col(3);
  Eigen::Quaterniond q;
  q.coeffs() = v;  // Eigen stores (x, y, z, w), the same slots as coeffs() above
  return Rotation(q);
}

}  // namespace attiscope
