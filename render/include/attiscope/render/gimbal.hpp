// gimbal.hpp: the math of the Gimbal rings view (no GL): where the three rings and their
// axes are for a pose in an Euler convention, the lock-margin colour scale, and the margin
// table over all 24 conventions.
//
// Intrinsic (a, b, c), R = R_i(a) R_j(b) R_k(c): the outer ring turns by a about the world
// axis i, the middle ring (carried by the outer) by b about its axis j, the inner ring
// (carried by the middle, holding the body) by c about its axis k. So
//   outer axis  = e_i,  middle axis = R_i(a) e_j,  inner axis = R_i(a) R_j(b) e_k = R e_k.
// Extrinsic (a, b, c), R = R_k(c) R_j(b) R_i(a), is the intrinsic sequence k, j, i with
// angles (c, b, a): the outer ring is the *last* turn, about the fixed world axis k.
// At lock (Tait-Bryan b = +/-90 degrees, proper Euler b = 0 or 180) R_j(b) takes the inner
// axis onto the outer one: the outer and inner axes coincide and one freedom is lost.
#pragma once

#include <Eigen/Core>
#include <array>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/rotation.hpp"

namespace attiscope::render {

/// One ring of the gimbal.
struct GimbalRing {
  Eigen::Matrix3d world_R_ring;        ///< the ring's frame: product of the turns up to this ring
  Eigen::Vector3d axis_world;          ///< unit axis the ring turns about, in world coordinates
  Eigen::Vector3d plane_normal_world;  ///< normal of the ring's circle (the circle contains its axis)
  Axis axis;                           ///< which elementary axis (i, j or k of the sequence)
  double angle_rad;                    ///< the turn this ring makes
  int sequence_index;                  ///< 0, 1, 2: position of this turn in application order
};

/// Outer, middle, inner.
struct GimbalRings {
  std::array<GimbalRing, 3> rings;
  double lock_margin_rad = 0.0;
  bool at_lock = false;
  /// The product of the three ring turns: equals world_R_body of the pose.
  Eigen::Matrix3d world_R_inner() const { return rings[2].world_R_ring; }
};

/// Rings for Euler angles (from core's to_euler, or typed by a person).
GimbalRings gimbal_rings(const EulerAngles& euler);

/// Angle in radians between the outer and inner ring axes, folded into [0, 90] degrees
/// (0 means the axes coincide, up to direction).
double outer_inner_axis_angle(const GimbalRings& rings);

/// Lock margins (degrees) at and below this are in the warning band.
inline constexpr double kMarginWarningDeg = 10.0;
/// Lock margins up to this fade from the safe colour to the warning colour.
inline constexpr double kMarginCautionDeg = 30.0;

/// RGB colour of a lock margin on the continuous scale: the safe teal from
/// kMarginCautionDeg up, blending through yellow to amber down to kMarginWarningDeg, then
/// (a clear step: the warning band) red deepening to lock.
Eigen::Vector3f margin_color(double margin_deg);

/// One row of the 24-convention margin table.
struct MarginRow {
  EulerConvention convention;
  double margin_deg = 0.0;
  double rate_condition_number = 0.0;  ///< of the Euler-rate matrix; +inf at lock
  bool at_lock = false;
  bool in_warning_band = false;
};

/// The margin of a pose in all 24 conventions, in core's order (all_euler_conventions()).
std::array<MarginRow, 24> margin_table(const Rotation& world_R_body);

}  // namespace attiscope::render
