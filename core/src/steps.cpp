// steps.cpp: elementary turns, partial products and the sentence of each step.
#include "attiscope/core/steps.hpp"

#include <cmath>
#include <cstdio>

namespace attiscope {

namespace {

constexpr double kPi = 3.14159265358979323846;
/// A turn's effect is said in body words when its direction is this close to a body axis.
constexpr double kAlignedTolerance = 1e-9;
/// Turns smaller than this (radians) are "no turn": the rounding left by extracting the
/// angles of a pose built with an exact zero.
constexpr double kNegligibleTurnRad = 1e-12;

std::string angle_text(double angle_rad, const HouseConvention& c) {
  const bool deg = c.euler.unit == AngleUnit::Degrees;
  if (std::abs(angle_rad) < kNegligibleTurnRad) angle_rad = 0.0;
  const double v = deg ? angle_rad * 180.0 / kPi : angle_rad;
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", c.precision, std::abs(v));
  std::string magnitude = buf;
  const bool zero = magnitude == "0";
  return std::string(!zero && v < 0.0 ? "-" : "+") + magnitude + (deg ? " degrees" : " radians");
}

// What the turn does to the body, in the body's own words when the motion is along a body
// axis ("the nose rises"), else in world words ("the nose moves mostly north").
std::string effect(const EulerStep& s, const HouseConvention& c, const Eigen::Matrix3d& flu_R_body,
                   const Eigen::Matrix3d& enu_R_world, const std::string& angle_printed) {
  if (std::abs(s.angle_rad) < kNegligibleTurnRad || angle_printed.rfind("+0 ", 0) == 0) return "no turn";
  const Eigen::Vector3d forward(1, 0, 0), right(0, -1, 0);
  const Eigen::Vector3d axis_flu = flu_R_body * s.axis_body;
  const bool about_front = axis_flu.cross(forward).norm() < kAlignedTolerance;
  const Eigen::Vector3d feature = about_front ? right : forward;
  const std::string name = about_front ? c.right_name : c.front_name;
  Eigen::Vector3d motion = axis_flu.cross(feature);
  if (s.angle_rad < 0.0) motion = -motion;
  motion.normalize();
  for (int k = 0; k < 3; ++k) {
    Eigen::Vector3d unit = Eigen::Vector3d::Zero();
    unit[k] = motion[k] > 0 ? 1.0 : -1.0;
    if ((motion - unit).norm() < kAlignedTolerance) {
      const std::string w = direction_word(unit, FrameRole::Body);
      if (w == "up") return "the " + name + " rises";
      if (w == "down") return "the " + name + " drops";
      if (w == "left" || w == "right") return "the " + name + " turns " + w;
      return "the " + name + " swings " + w;
    }
  }
  const Eigen::Vector3d motion_enu = enu_R_world * (s.before.matrix() * (flu_R_body.transpose() * motion));
  Eigen::Index k = 0;
  motion_enu.cwiseAbs().maxCoeff(&k);
  Eigen::Vector3d unit = Eigen::Vector3d::Zero();
  unit[k] = motion_enu[k] > 0 ? 1.0 : -1.0;
  return "the " + name + " moves mostly " + direction_word(unit, FrameRole::World);
}

}  // namespace

std::pair<EulerConvention, Eigen::Vector3d> equivalent_other_kind(const EulerConvention& convention,
                                                                  const Eigen::Vector3d& angles_rad) {
  EulerConvention other;
  other.axes = {convention.axes[2], convention.axes[1], convention.axes[0]};
  other.kind = convention.kind == EulerKind::Intrinsic ? EulerKind::Extrinsic : EulerKind::Intrinsic;
  return {other, Eigen::Vector3d(angles_rad[2], angles_rad[1], angles_rad[0])};
}

HouseConvention with_other_kind(const HouseConvention& c) {
  HouseConvention o = c;
  o.euler.convention = equivalent_other_kind(c.euler.convention, Eigen::Vector3d::Zero()).first;
  for (std::size_t i = 0; i < 3; ++i) {
    o.euler.names[i] = c.euler.names[2 - i];
    o.euler.ranges[i] = c.euler.ranges[2 - i];
    o.euler.print_order[i] = 2 - c.euler.print_order[i];
  }
  return o;
}

EulerSteps euler_steps_for(const EulerConvention& convention, const Eigen::Vector3d& angles_rad,
                           const HouseConvention& c) {
  EulerSteps out;
  out.convention = convention;
  out.angles_rad = angles_rad;
  const auto flu_R_body = reference_R_frame(c.body, FrameRole::Body);
  const auto enu_R_world = reference_R_frame(c.world, FrameRole::World);
  const Eigen::Matrix3d body_m = flu_R_body ? flu_R_body.value() : Eigen::Matrix3d::Identity();
  const Eigen::Matrix3d world_m = enu_R_world ? enu_R_world.value() : Eigen::Matrix3d::Identity();
  const bool intrinsic = convention.kind == EulerKind::Intrinsic;
  Rotation frame;  // world_R_body so far
  for (std::size_t n = 0; n < 3; ++n) {
    EulerStep& s = out.steps[n];
    s.index = static_cast<int>(n);
    s.axis = convention.axes[n];
    s.angle_rad = angles_rad[static_cast<Eigen::Index>(n)];
    s.angle_name = c.euler.names[n];
    s.about_body_axis = intrinsic;
    s.before = frame;
    const Rotation turn = elementary_rotation(s.axis, s.angle_rad);
    const Eigen::Vector3d e = axis_vector(s.axis);
    if (intrinsic) {
      // The body's current axis: a turn on the right of the product so far.
      s.axis_body = e;
      s.axis_world = frame.apply(e);
      frame = frame * turn;
    } else {
      // A fixed world axis: a turn on the left of the product so far.
      s.axis_world = e;
      s.axis_body = frame.inverse().apply(e);
      frame = turn * frame;
    }
    s.after = frame;
    const std::string angle = angle_text(s.angle_rad, c);
    const std::size_t k = static_cast<std::size_t>(s.axis);
    const std::string about = intrinsic ? "the body's " + c.body.directions[k] + " axis"
                                        : "the world's " + c.world.directions[k] + " axis";
    s.sentence = "Step " + std::to_string(n + 1) + " of 3 \u2014 " + s.angle_name + " " + angle + " about " +
                 about + ": " + effect(s, c, body_m, world_m, angle);
  }
  return out;
}

EulerSteps euler_steps(const Rotation& world_R_body, const HouseConvention& c) {
  const EulerAngles e = to_euler(world_R_body, c.euler.convention);
  Eigen::Vector3d angles = e.angles_rad;
  // The house's ranges: a heading in [0, 360) is played as +350, not -10 (the same frame).
  angles[0] = wrap_to_range(angles[0], c.euler.ranges[0]);
  angles[2] = wrap_to_range(angles[2], c.euler.ranges[2]);
  return euler_steps_for(c.euler.convention, angles, c);
}

}  // namespace attiscope
