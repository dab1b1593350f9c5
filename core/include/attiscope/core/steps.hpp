// steps.hpp: a pose taken apart into the convention's three elementary turns, for the
// step-through teaching mode: each turn's axis (in world and in body terms), its angle,
// the frame after it (the partial product), and a sentence in the team's words.
//
// Intrinsic (a, b, c): R = R_i(a) R_j(b) R_k(c); the frame after step n is the product of
// the first n factors taken left to right, and step n turns about the body's current axis.
// Extrinsic (a, b, c): R = R_k(c) R_j(b) R_i(a); the frame after step n is the product of
// the first n turns taken right to left, and step n turns about a fixed world axis.
// The same pose in the other kind: intrinsic i-j-k (a, b, c) = extrinsic k-j-i (c, b, a).
#pragma once

#include <Eigen/Core>
#include <array>
#include <string>

#include "attiscope/core/convention.hpp"
#include "attiscope/core/euler.hpp"
#include "attiscope/core/rotation.hpp"

namespace attiscope {

/// One elementary turn of a sequence.
struct EulerStep {
  int index = 0;                ///< 0, 1, 2 in application order
  Axis axis = Axis::X;          ///< the coordinate axis letter of the turn
  double angle_rad = 0.0;       ///< signed, as in the Euler triple
  std::string angle_name;       ///< the house's name ("pitch")
  Eigen::Vector3d axis_world;   ///< the turn's axis in world coordinates
  Eigen::Vector3d axis_body;    ///< the same axis in the body's coordinates at the step's start
  bool about_body_axis = true;  ///< intrinsic: the body's current axis; extrinsic: the world's
  Rotation before;              ///< world_R_body before the turn
  Rotation after;               ///< world_R_body after the turn (the partial product)
  std::string sentence;  ///< "Step 2 of 3 — pitch +10 degrees about the body's right axis: the nose rises"
};

/// The three steps of a pose in a convention (angles from house_euler, application order).
struct EulerSteps {
  EulerConvention convention;
  Eigen::Vector3d angles_rad = Eigen::Vector3d::Zero();  ///< application order
  std::array<EulerStep, 3> steps;
};

/// The steps that build world_R_body in the house's Euler convention, with sentences in
/// the house's words (angle names, axis directions, front and right names, unit).
EulerSteps euler_steps(const Rotation& world_R_body, const HouseConvention& c);

/// The steps of given angles (application order, radians) in the house's words; the
/// convention's sequence and kind may differ from the house's (to play the other kind).
EulerSteps euler_steps_for(const EulerConvention& convention, const Eigen::Vector3d& angles_rad,
                           const HouseConvention& c);

/// The same pose in the other kind: intrinsic i-j-k (a, b, c) is extrinsic k-j-i (c, b, a)
/// and back; angles in application order.
std::pair<EulerConvention, Eigen::Vector3d> equivalent_other_kind(const EulerConvention& convention,
                                                                  const Eigen::Vector3d& angles_rad);

/// Names the angles of the other-kind convention: the names of the house's angles taken
/// in reverse (the third turn of one is the first of the other).
HouseConvention with_other_kind(const HouseConvention& c);

}  // namespace attiscope
