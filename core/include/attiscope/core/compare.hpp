// compare.hpp: two poses side by side, and the mean and spread of several.
//
// Poses are world_R_body (v_world = R v_body). Between a reference pose and a current one
// there are two relative rotations, and they are not the same rotation in general:
//   body frame:  world_R_current = world_R_reference * reference_R_current
//                (reference_R_current: the turn written in the reference body's axes)
//   world frame: world_R_current = world_delta * world_R_reference
//                (world_delta = world_R_current * world_R_reference^-1: the turn written in
//                world axes)
// Both have the same angle; their axes are the same direction written in two frames
// (axis_world = world_R_reference * axis_body).
#pragma once

#include <Eigen/Core>
#include <array>
#include <optional>
#include <string>
#include <vector>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/expected.hpp"
#include "attiscope/core/representations.hpp"
#include "attiscope/core/rotation.hpp"
#include "attiscope/core/vehicle_axes.hpp"

namespace attiscope {

/// Euler angles of the two poses subtracted one by one, and how far that is from the truth.
struct EulerDifference {
  EulerConvention convention;
  EulerAngles reference;
  EulerAngles current;
  /// current - reference, each wrapped into (-pi, pi]: what a person subtracting the printed
  /// angles gets.
  Eigen::Vector3d difference_rad = Eigen::Vector3d::Zero();
  /// from_euler(difference) compared with the real body-frame difference reference_R_current,
  /// as a geodesic angle. Euler angles do not subtract: this is zero only in special cases
  /// (a turn about one axis only, or tiny angles to first order).
  double mismatch_rad = 0.0;
  /// |difference angle| - |real angle|: how much bigger or smaller the subtracted angles
  /// make the error look, in radians (norm of the difference vector minus the real angle).
  double size_mismatch_rad = 0.0;
  /// Empty when the subtraction agrees with the real difference to kEulerNoteRad; otherwise a
  /// sentence saying how and why it differs.
  std::string note;
};

/// An Euler subtraction further than this from the real difference gets a note.
inline constexpr double kEulerNoteRad = 0.01 * 3.14159265358979323846 / 180.0;

/// Everything compare says about a reference pose and a current one.
struct Comparison {
  Rotation world_R_reference;
  Rotation world_R_current;
  /// Body frame: world_R_current = world_R_reference * reference_R_current.
  Rotation reference_R_current;
  /// World frame: world_R_current = world_delta * world_R_reference.
  Rotation world_delta;
  double angle_rad = 0.0;                                    ///< geodesic, in [0, pi]
  Eigen::Vector3d axis_body = Eigen::Vector3d::UnitX();      ///< in reference body axes
  Eigen::Vector3d axis_world = Eigen::Vector3d::UnitX();     ///< in world axes
  Eigen::Vector3d turns_body_rad = Eigen::Vector3d::Zero();  ///< rotation vector, body axes
  Eigen::Vector3d turns_world_rad = Eigen::Vector3d::Zero();
  /// The body turns named (roll/pitch/yaw...) when body axis names were given.
  std::optional<std::array<NamedTurn, 3>> named_turns;
  EulerDifference euler;
  std::vector<std::string> warnings;
};

/// Turns above this are no longer "small" for the per-axis split: a warning says so.
inline constexpr double kSmallSplitLimitRad = 10.0 * 3.14159265358979323846 / 180.0;

/// Compares two poses (both world_R_body). `convention` is the one of the Euler
/// subtraction; `body_names`, when given, names the body axes for the per-axis split.
Comparison compare_poses(const Rotation& world_R_reference, const Rotation& world_R_current,
                         const EulerConvention& convention,
                         const std::optional<VehicleAxes>& body_names = {});

/// `count` poses along the shortest path from a to b (SLERP, Shoemake 1985), both ends
/// included: t = 0, 1/(count-1), ..., 1. count < 2 gives {a} (count 1) or {} (count 0).
std::vector<Rotation> slerp_path(const Rotation& a, const Rotation& b, int count);

/// The mean of several poses and how far they spread about it.
struct MeanSpread {
  Rotation mean;  ///< stored with the sign nearer the first pose's quaternion
  /// Each input quaternion with its sign chosen so that its dot product with the mean's
  /// quaternion is >= 0 (all in the mean's hemisphere), in input order.
  std::vector<Eigen::Quaterniond> aligned;
  std::vector<double> angles_rad;  ///< geodesic angle of each pose from the mean
  double max_rad = 0.0;            ///< the largest of angles_rad
  std::size_t max_index = 0;       ///< which pose that is (0-based)
  double rms_rad = 0.0;            ///< sqrt(sum w_i angle_i^2 / sum w_i)
  std::size_t flipped = 0;         ///< how many inputs were in the other hemisphere (sign flipped)
};

/// Mean by Markley, Cheng, Crassidis, Oshman 2007 ("Averaging Quaternions", JGCD 30(4)):
/// the eigenvector of M = sum w_i q_i q_i^T for its largest eigenvalue, which minimises the
/// weighted sum of squared chordal (Frobenius) distances between attitude matrices. Errors as
/// mean_rotation's.
Expected<MeanSpread> mean_and_spread(const std::vector<Rotation>& poses,
                                     const std::vector<double>& weights = {});

}  // namespace attiscope
