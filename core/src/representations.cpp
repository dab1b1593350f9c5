// representations.cpp: axis-angle, rotation vector, Gibbs vector, MRP.
#include "attiscope/core/representations.hpp"

#include <cmath>

namespace attiscope {

namespace {

Error not_finite(const char* what) {
  return Error{std::string(what) + " has a number that is not finite"};
}

}  // namespace

AxisAngle to_axis_angle(const Rotation& r) {
  const Eigen::Quaterniond q = r.quaternion();  // w >= 0, so the angle is in [0, pi]
  const double s = q.vec().norm();
  AxisAngle out;
  out.angle_rad = 2.0 * std::atan2(s, q.w());
  if (s > 0.0) out.axis = q.vec() / s;  // else: identity, axis left as +x by convention
  return out;
}

Expected<Rotation> from_axis_angle(const Eigen::Vector3d& axis, double angle_rad) {
  if (!axis.allFinite() || !std::isfinite(angle_rad)) return not_finite("the axis-angle");
  const double n = axis.stableNorm();  // no overflow for an axis written as (1e200, 0, 0)
  if (n < kMinAxisNorm) return Error{"the rotation axis is a zero vector: it has no direction"};
  Eigen::Quaterniond q;
  q.w() = std::cos(0.5 * angle_rad);
  q.vec() = axis / n * std::sin(0.5 * angle_rad);
  return Rotation(q);
}

Eigen::Vector3d to_rotation_vector(const Rotation& r) {
  const AxisAngle aa = to_axis_angle(r);
  return aa.axis * aa.angle_rad;
}

Expected<Rotation> from_rotation_vector(const Eigen::Vector3d& v) {
  if (!v.allFinite()) return not_finite("the rotation vector");
  const double t = v.stableNorm();  // no overflow for components such as 1e300
  if (!std::isfinite(t)) return Error{"the rotation vector is too long to be an angle"};
  // sin(t/2)/t by its Taylor series near 0, where the quotient loses digits.
  const double k = t < kSmallAngleRad ? 0.5 - t * t / 48.0 : std::sin(0.5 * t) / t;
  Eigen::Quaterniond q;
  q.w() = std::cos(0.5 * t);
  q.vec() = v * k;
  return Rotation(q);
}

std::optional<Eigen::Vector3d> to_gibbs(const Rotation& r) {
  const Eigen::Quaterniond q = r.quaternion();
  if (q.w() < kGibbsInfiniteW) return std::nullopt;  // 180 degrees: tan(90 deg) is infinite
  return Eigen::Vector3d(q.vec() / q.w());
}

Expected<Rotation> from_gibbs(const Eigen::Vector3d& g) {
  if (!g.allFinite()) return not_finite("the Gibbs vector");
  // q = (1, g) / sqrt(1 + |g|^2)
  return Rotation(Eigen::Quaterniond(1.0, g.x(), g.y(), g.z()));
}

Eigen::Vector3d to_mrp(const Rotation& r) {
  const Eigen::Quaterniond q = r.quaternion();
  return q.vec() / (1.0 + q.w());
}

std::optional<Eigen::Vector3d> mrp_shadow(const Eigen::Vector3d& p) {
  const double n2 = p.squaredNorm();
  if (n2 == 0.0) return std::nullopt;
  return Eigen::Vector3d(-p / n2);
}

Expected<Rotation> from_mrp(const Eigen::Vector3d& p) {
  if (!p.allFinite()) return not_finite("the MRP vector");
  // q = ((1 - |p|^2), 2 p) / (1 + |p|^2)  (Shuster 1993)
  const double n2 = p.squaredNorm();
  const Eigen::Vector3d v = 2.0 * p;
  return Rotation(Eigen::Quaterniond(1.0 - n2, v.x(), v.y(), v.z()));
}

}  // namespace attiscope
