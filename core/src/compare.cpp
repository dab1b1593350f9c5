// compare.cpp: relative rotations in two frames, the Euler subtraction, SLERP paths, mean
// and spread.
#include "attiscope/core/compare.hpp"

#include <cmath>
#include <cstdio>

namespace attiscope {

namespace {

constexpr double kDeg = 180.0 / M_PI;

std::string fmt(double v, int precision = 3) {
  if (v == 0.0) v = 0.0;
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", precision, v);
  return buf;
}

EulerDifference euler_difference(const Rotation& world_R_reference, const Rotation& world_R_current,
                                 const Rotation& reference_R_current, const EulerConvention& c) {
  EulerDifference d;
  d.convention = c;
  d.reference = to_euler(world_R_reference, c);
  d.current = to_euler(world_R_current, c);
  for (int i = 0; i < 3; ++i)
    d.difference_rad(i) = wrap_pi(d.current.angles_rad(i) - d.reference.angles_rad(i));
  const Rotation as_rotation = from_euler(c, d.difference_rad);
  d.mismatch_rad = geodesic_angle(as_rotation, reference_R_current);
  const double real = geodesic_angle(Rotation::identity(), reference_R_current);
  d.size_mismatch_rad = d.difference_rad.norm() - real;
  if (d.mismatch_rad > kEulerNoteRad) {
    d.note = "the " + c.name() + " angles subtracted one by one (" + fmt(d.difference_rad(0) * kDeg) + ", " +
             fmt(d.difference_rad(1) * kDeg) + ", " + fmt(d.difference_rad(2) * kDeg) +
             " degrees) are not the rotation between the poses: taken as Euler angles they are " +
             fmt(d.mismatch_rad * kDeg) + " degrees away from it, and their size (" +
             fmt(d.difference_rad.norm() * kDeg) + " degrees) against the real " + fmt(real * kDeg) +
             " degrees. Euler angles do not subtract; use the body-frame or world-frame difference.";
    if (d.reference.lock_margin_rad < kSmallSplitLimitRad ||
        d.current.lock_margin_rad < kSmallSplitLimitRad) {
      d.note += " A pose is within " + fmt(kSmallSplitLimitRad * kDeg) +
                " degrees of gimbal lock in this convention, where the first and third angles jump.";
    }
  }
  return d;
}

}  // namespace

Comparison compare_poses(const Rotation& world_R_reference, const Rotation& world_R_current,
                         const EulerConvention& convention, const std::optional<VehicleAxes>& body_names) {
  Comparison c;
  c.world_R_reference = world_R_reference;
  c.world_R_current = world_R_current;
  c.reference_R_current = world_R_reference.inverse() * world_R_current;
  c.world_delta = world_R_current * world_R_reference.inverse();
  const AxisAngle body = to_axis_angle(c.reference_R_current);
  c.angle_rad = body.angle_rad;
  c.axis_body = body.axis;
  // The same axis written in world axes; taken from the world delta itself so the two
  // readouts are independent computations (they agree to rounding).
  const AxisAngle world = to_axis_angle(c.world_delta);
  c.axis_world = world.axis;
  c.turns_body_rad = to_rotation_vector(c.reference_R_current);
  c.turns_world_rad = to_rotation_vector(c.world_delta);
  if (body_names) c.named_turns = small_angle_split(*body_names, c.turns_body_rad);
  if (c.angle_rad > kSmallSplitLimitRad) {
    c.warnings.push_back(
        "the angle is " + fmt(c.angle_rad * kDeg) +
        " degrees: the per-axis split (rotation vector components) is not a sequence of turns "
        "at this size; use the axis and angle");
  }
  c.euler = euler_difference(world_R_reference, world_R_current, c.reference_R_current, convention);
  return c;
}

std::vector<Rotation> slerp_path(const Rotation& a, const Rotation& b, int count) {
  std::vector<Rotation> out;
  if (count <= 0) return out;
  if (count == 1) return {a};
  out.reserve(static_cast<std::size_t>(count));
  for (int i = 0; i < count; ++i) {
    out.push_back(slerp(a, b, static_cast<double>(i) / static_cast<double>(count - 1)));
  }
  return out;
}

Expected<MeanSpread> mean_and_spread(const std::vector<Rotation>& poses, const std::vector<double>& weights) {
  auto mean = mean_rotation(poses, weights);
  if (!mean) return mean.error();
  MeanSpread s;
  s.mean = mean.value();
  // The mean's sign follows the first pose, so "flipped" counts the poses whose sign is
  // opposite to the first one's (a sign-continuous log has none).
  if (s.mean.stored_quaternion().coeffs().dot(poses.front().stored_quaternion().coeffs()) < 0) {
    s.mean = s.mean.negated();
  }
  const Eigen::Quaterniond m = s.mean.stored_quaternion();
  double sum_w = 0.0, sum_w_sq = 0.0;
  for (std::size_t i = 0; i < poses.size(); ++i) {
    Eigen::Quaterniond q = poses[i].stored_quaternion();
    if (q.coeffs().dot(m.coeffs()) < 0) {
      q.coeffs() = -q.coeffs();
      ++s.flipped;
    }
    s.aligned.push_back(q);
    const double angle = geodesic_angle(s.mean, poses[i]);
    s.angles_rad.push_back(angle);
    if (angle > s.max_rad) {
      s.max_rad = angle;
      s.max_index = i;
    }
    const double w = weights.empty() ? 1.0 : weights[i];
    sum_w += w;
    sum_w_sq += w * angle * angle;
  }
  s.rms_rad = sum_w > 0 ? std::sqrt(sum_w_sq / sum_w) : 0.0;
  return s;
}

}  // namespace attiscope
