// convention.hpp: a team's house convention: what its world and body axes mean, which
// Euler sequence it uses and how it prints the three numbers, and how it writes
// quaternions and matrices. Every choice is a *view* of the one canonical rotation
// (rotation.hpp): a Rotation holds world_R_body in the house's own world and body axes,
// v_world = R v_body.
//
// Frames are described against two fixed reference frames: the world reference is ENU
// (x east, y north, z up) and the body reference is FLU (x forward, y left, z up). A house
// frame lists, for each of its x, y, z axes, the reference direction it points along
// ("north", "down", "right", ...). Changing frame is a rotation applied on the correct side
// of the pose (world change on the left, body change on the right), never a swap of
// numbers; a set of directions that would make a left-handed frame is refused.
#pragma once

#include <Eigen/Core>
#include <array>
#include <string>
#include <string_view>
#include <vector>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/expected.hpp"
#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"
#include "attiscope/core/rotation.hpp"
#include "attiscope/core/text.hpp"
#include "attiscope/core/vehicle_axes.hpp"

namespace attiscope {

/// Whether a frame is a world frame (reference ENU) or a body frame (reference FLU).
/// Directions are written as words: world "east" "west" "north" "south" "up" "down"; body
/// "forward" "back" "left" "right" "up" "down".
enum class FrameRole { World, Body };

/// A right-handed frame given by the reference direction of each of its axes, with the
/// names a team calls its axes by ("N", "E", "D" or "x", "y", "z").
struct FrameAxes {
  std::array<std::string, 3> directions;  ///< x, y, z: words such as "north", "forward"
  std::array<std::string, 3> names{"x", "y", "z"};
  bool operator==(const FrameAxes& o) const { return directions == o.directions && names == o.names; }
};

/// The world frames with their own names: ENU, NED (and "custom" for any other).
FrameAxes world_enu();
FrameAxes world_ned();
/// The body frames with their own names: FLU, FRD, camera right-down-forward ("RDF").
FrameAxes body_flu();
FrameAxes body_frd();
FrameAxes body_camera_rdf();

/// A body frame from vehicle axes (names x, y, z), in the convention file's words: FRD gives
/// {"forward", "right", "down"}. The body words and vectors are vehicle_axes.hpp's.
FrameAxes body_frame_axes(const VehicleAxes& v);
/// The vehicle axes of a house body frame (the Mount check takes the house's body as the
/// vehicle's). Error when an axis is not a body word, or the frame is not right-handed.
Expected<VehicleAxes> body_vehicle_axes(const FrameAxes& body);
struct HouseConvention;
/// The vehicle axes a mount check names its turns with when none are given: the body frame
/// of a loaded house convention (null: none loaded), or FRD when there is none or its body
/// is not written in vehicle words.
VehicleAxes default_vehicle_axes(const HouseConvention* house);

/// "ENU", "NED" (world) or "FLU", "FRD", "RDF" (body) when the directions are one of the
/// named frames, else "custom".
std::string frame_preset_name(const FrameAxes& f, FrameRole role);
/// The named frame by its preset name (case-insensitive), or an error listing the names.
Expected<FrameAxes> frame_preset(std::string_view name, FrameRole role);

/// Unit vector of a direction word in the reference frame (ENU for the world, FLU for the
/// body). Error for an unknown word.
Expected<Eigen::Vector3d> direction_vector(std::string_view word, FrameRole role);
/// The word of a reference unit axis (+-x, +-y, +-z), the inverse of direction_vector.
std::string direction_word(const Eigen::Vector3d& unit_axis, FrameRole role);

/// reference_R_frame: its columns are the frame's x, y, z axes written in the reference
/// frame. Error (with the reason) when two axes are parallel or the frame is left-handed:
/// such a frame differs from the reference by a reflection, which no rotation can express.
Expected<Eigen::Matrix3d> reference_R_frame(const FrameAxes& f, FrameRole role);

/// Range of the first or third Euler angle.
enum class AngleRange {
  Standard,   ///< (-180, 180] for the first and third angle; the middle angle's own range
  ZeroTo360,  ///< [0, 360): a heading or an azimuth (first or third angle only)
};

/// The Euler part of a house convention.
struct HouseEuler {
  EulerConvention convention;                                ///< sequence and kind
  std::array<std::string, 3> names{"yaw", "pitch", "roll"};  ///< in application order
  /// print_order[k] is the application index (0, 1, 2) of the k-th printed number:
  /// {2, 1, 0} prints yaw-pitch-roll as roll, pitch, yaw.
  std::array<int, 3> print_order{0, 1, 2};
  AngleUnit unit = AngleUnit::Degrees;
  std::array<AngleRange, 3> ranges{AngleRange::Standard, AngleRange::Standard, AngleRange::Standard};
};

/// A team's house convention. Every field has a default (the tool's own conventions).
struct HouseConvention {
  std::string name = "attiscope default";
  std::string description = "The tool's built-in conventions.";
  FrameAxes world = world_enu();
  FrameAxes body = body_flu();
  /// What the team calls the body's front point and right side in sentences.
  std::string front_name = "nose";
  std::string right_name = "right side";
  HouseEuler euler;
  QuatConvention quaternion;
  MatrixConvention matrix;
  int precision = 6;  ///< significant digits on screen, 1..17
};

/// Every check a loaded or edited convention must pass (names unique, print order a
/// permutation, a 0..360 range only on a first or third angle, frames right-handed,
/// precision in 1..17). The error's `field` names the offending field ("euler.ranges").
Expected<HouseConvention> validate_convention(const HouseConvention& c);

/// The three numbers a house prints for a pose: Euler angles in print order, in the
/// house's unit and ranges, with the names in the same order.
struct HouseEulerView {
  std::array<double, 3> values{};  ///< print order, house unit
  std::array<std::string, 3> names;
  EulerAngles angles;  ///< the same angles in application order, radians, standard ranges
};

HouseEulerView house_euler(const Rotation& world_R_body, const HouseConvention& c);
/// The inverse: three printed numbers (print order, house unit; any finite values) ->
/// world_R_body. Error when a number is not finite.
Expected<Rotation> from_house_euler(const std::array<double, 3>& printed, const HouseConvention& c);

/// The quaternion numbers in the house's layout, algebra and direction (storage order).
std::array<double, 4> house_quaternion(const Rotation& world_R_body, const HouseConvention& c);
/// Letters of the quaternion layout: {"w","x","y","z"} or {"x","y","z","w"}.
std::array<std::string, 4> house_quaternion_labels(const HouseConvention& c);
/// The matrix numbers in the house's direction and storage (nine, storage order).
std::array<double, 9> house_matrix(const Rotation& world_R_body, const HouseConvention& c);

/// Wraps an angle (radians) into a range: Standard (-pi, pi], ZeroTo360 [0, 2 pi).
double wrap_to_range(double angle_rad, AngleRange range);

/// One positive-direction sentence per Euler angle (application order), derived from the
/// frames: the axis each angle turns about, as a body direction at the start pose, and
/// which way the front point (or the right side, for a turn about the front) moves.
/// Example for NED/FRD ZYX: "positive pitch raises the nose".
std::array<std::string, 3> positive_direction_sentences(const HouseConvention& c);

/// A change of frames between two conventions: pose_to = to_R_from_world * pose_from *
/// from_R_to_body. The world change multiplies on the left (it re-expresses world
/// coordinates), the body change on the right (it re-expresses body coordinates).
struct FrameChange {
  std::string from_name;           ///< "NED/FRD"
  std::string to_name;             ///< "ENU/FLU"
  Rotation world_to_R_world_from;  ///< left factor
  Rotation body_from_R_body_to;    ///< right factor
  /// Two or three lines that show the change as the rotations it is, with their matrices.
  std::string describe() const;
  /// Applies the change to a pose written in the `from` frames.
  Rotation apply(const Rotation& from_world_R_body) const;
};

/// The frame change from one convention's frames to another's. Error (with the reason)
/// when either convention's frames are not right-handed.
Expected<FrameChange> frame_change(const FrameAxes& from_world, const FrameAxes& from_body,
                                   const FrameAxes& to_world, const FrameAxes& to_body);

/// The names of a unit and a kind as a convention file writes them.
std::string angle_unit_name(AngleUnit u);                                   ///< "degrees" / "radians"
std::string range_text(AngleRange r, int index, const EulerConvention& c);  ///< "[0, 360)"

}  // namespace attiscope
