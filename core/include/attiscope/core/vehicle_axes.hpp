// vehicle_axes.hpp: the named axes of a vehicle (or any body), and turns said in its words.
//
// A body frame is named by three letters, one per axis x, y, z, from F (forward), B (aft),
// R (right), L (left), U (up), D (down): "FRD" (x forward, y right, z down), "FLU", or the
// camera habit "RDF" (x right, y down, z forward). The frame must be right-handed.
// A turn about the forward/aft axis is a roll, about right/left a pitch, about up/down a
// yaw. The sense of a turn is said by what it does to the nose (pitch, yaw) or to the right
// side (roll): a positive turn about FRD's y puts the nose up (right-hand rule).
//
// This header is the one source of a body's direction words and vectors: a house
// convention's body frame (convention.hpp, "forward", "back", ... against the FLU reference)
// reads its words and vectors from the table behind BodyDirection, and converts to and from
// VehicleAxes (body_frame_axes / body_vehicle_axes there).
#pragma once

#include <Eigen/Core>
#include <array>
#include <optional>
#include <string>
#include <string_view>

#include "attiscope/core/expected.hpp"

namespace attiscope {

enum class BodyDirection { Forward, Aft, Right, Left, Up, Down };

/// "forward", "aft", "right", "left", "up", "down".
std::string direction_word(BodyDirection d);

/// The six directions in the order a house convention lists them: forward, back, left,
/// right, up, down.
const std::array<BodyDirection, 6>& body_directions();
/// The word a house convention file writes for a direction: "forward", "back", "left",
/// "right", "up", "down" (the file says "back" where a sentence says "aft").
std::string convention_word(BodyDirection d);
/// A house convention file's word (case-insensitive), or nullopt.
std::optional<BodyDirection> parse_convention_word(std::string_view word);
/// The letter of a direction in a vehicle code: F B R L U D.
char direction_letter(BodyDirection d);
/// The direction as a unit vector of the FLU reference (x forward, y left, z up), the
/// reference a house convention writes its body frame against.
Eigen::Vector3d flu_vector(BodyDirection d);
/// The direction of a unit FLU vector along one of the six directions, or nullopt.
std::optional<BodyDirection> direction_of_flu(const Eigen::Vector3d& unit, double tolerance = 1e-6);

/// Where a vehicle's x, y and z axes point, in words.
struct VehicleAxes {
  std::array<BodyDirection, 3> axes{BodyDirection::Forward, BodyDirection::Right, BodyDirection::Down};

  /// "FRD".
  std::string code() const;
  /// The word for the +axis (positive) or -axis direction: FRD axis 0 -> "forward"/"aft".
  std::string direction_word(int axis, bool positive = true) const;
  /// "roll", "pitch" or "yaw" for axis 0, 1, 2.
  std::string turn_name(int axis) const;
  /// "x, forward".
  std::string axis_label(int axis) const;
  /// The sense of a turn of the given sign about an axis: "nose up", "right side down".
  std::string turn_sense(int axis, double sign) const;
  /// The direction of a signed unit vector along an axis (e.g. -y), in words: "left".
  std::string word_for(const Eigen::Vector3d& signed_axis) const;
  /// The vehicle axis (index and sign) named by a direction, e.g. Down -> (2, +1) in FRD.
  std::pair<int, double> axis_of(BodyDirection d) const;
};

/// Parses "FRD", "flu", "RDF"... Error when a letter is not one of F B R L U D, two letters
/// name the same line, or the frame is left-handed (a mirror image).
Expected<VehicleAxes> parse_vehicle_axes(std::string_view code);

/// A turn about a vehicle axis, named.
struct NamedTurn {
  int axis = 0;            ///< 0, 1, 2 for the vehicle's x, y, z
  std::string turn_name;   ///< "pitch"
  double angle_rad = 0.0;  ///< signed, right-hand rule about +axis
  std::string sense;       ///< "nose down" (empty for a zero turn)
};

/// The small-angle split of a rotation vector written in vehicle axes: the turn about each
/// axis. Exact only in the limit of small angles (the components of a rotation vector are
/// not a sequence of turns); good to second order in the angle.
std::array<NamedTurn, 3> small_angle_split(const VehicleAxes& names, const Eigen::Vector3d& rotvec_rad);

/// An axis within this angle of a vehicle axis is said to be "about the vehicle's pitch axis".
inline constexpr double kNamedAxisWindowRad = 10.0 * 3.14159265358979323846 / 180.0;
/// Turns smaller than this are "no turn".
inline constexpr double kNoTurnRad = 1e-12;

/// One sentence for a turn about an axis written in vehicle coordinates:
/// "2.1 degrees about the vehicle's pitch axis (y, right), nose down"; an axis far from
/// every vehicle axis is given as a vector with the largest share named.
std::string describe_turn(const VehicleAxes& names, const Eigen::Vector3d& axis_vehicle, double angle_rad,
                          int precision = 3);

}  // namespace attiscope
