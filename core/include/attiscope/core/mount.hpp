// mount.hpp: the mount check: a nominal sensor mount (from the drawing) against a measured
// one (a calibration value, or solved from vector pairs in wahba.hpp), with the error said
// in vehicle words and a guess at the cause when it is large.
//
// A mount is vehicle_R_sensor: it maps sensor-frame coordinates into vehicle-frame
// coordinates (v_vehicle = R v_sensor); its columns are the sensor's axes written in the
// vehicle frame.
//
// A visual or numerical check here supplements and never replaces the test procedure's
// calibrated alignment measurement; the test plan, local rules and licensed practice govern
// (kMountCaution, shown wherever a mount check is shown).
#pragma once

#include <Eigen/Core>
#include <array>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "attiscope/core/expected.hpp"
#include "attiscope/core/pose_text.hpp"
#include "attiscope/core/rotation.hpp"
#include "attiscope/core/text.hpp"
#include "attiscope/core/vehicle_axes.hpp"

namespace attiscope {

/// The caution shown with every mount check (panel, command line, check sheet, JSON).
inline constexpr const char* kMountCaution =
    "Caution: this check supplements and never replaces the test procedure's calibrated alignment "
    "measurement. The test plan, local rules and licensed practice govern; do not clear a vehicle for a "
    "test on this result alone.";

/// One of the 24 mounts whose sensor axes lie along vehicle axes.
struct AxisAlignedMount {
  Rotation vehicle_R_sensor;
  /// "sensor x toward vehicle aft, sensor z down" in the vehicle's own words.
  std::string name;
  Eigen::Vector3d sensor_x_in_vehicle = Eigen::Vector3d::UnitX();  ///< a signed vehicle axis
  Eigen::Vector3d sensor_z_in_vehicle = Eigen::Vector3d::UnitZ();
};

/// All 24 axis-aligned mounts (6 directions for sensor x, times 4 for sensor z), identity
/// first, each named in the vehicle's words.
std::vector<AxisAlignedMount> axis_aligned_mounts(const VehicleAxes& names);

/// Reads an axis-aligned mount said in words: two (or three) sensor axes, each followed by a
/// vehicle direction: "sensor x toward vehicle aft, sensor z down", "x aft z down",
/// "x=forward y=left", "-z up", "y toward vehicle +x". Direction words: forward/fwd/front/
/// nose, aft/back/rear/tail, right/starboard, left/port, up/top, down/bottom, or a signed
/// vehicle axis (+x, -y). Errors name the column of the word at fault (a mirror frame, two
/// sensor axes along one line, an unknown word).
Expected<Rotation> parse_axis_aligned_mount(std::string_view text, const VehicleAxes& names);

/// True when the text looks like mount words (it has a letter that is not part of a number
/// or unit); then parse_axis_aligned_mount is the reader to use.
bool looks_like_mount_words(std::string_view text);

/// A nominal mount with small trim turns applied about the vehicle's axes:
/// vehicle_R_sensor = exp([trim]) * base, trim a rotation vector in vehicle axes (radians).
Rotation trimmed_mount(const Rotation& base_vehicle_R_sensor, const Eigen::Vector3d& trim_vehicle_rad);

/// Another way the same numbers (or the same value) could have been meant.
struct AlternativeReading {
  std::string label;  ///< "the inverse (vehicle-to-sensor) direction"
  Rotation vehicle_R_sensor;
};

/// The other readings of a measured mount's text, for the classifier: the inverse direction
/// (also what JPL algebra or a world-to-body habit gives), the transposed matrix, the other
/// quaternion layout, the Euler sequence reversed, intrinsic read as extrinsic, the angles in
/// reverse order, degrees read as radians and back, axis-angle with the angle first; each
/// also with the direction inverted. `entered` is the rotation as read (already turned into
/// vehicle_R_sensor); `inverted` says it was entered vehicle-to-sensor and inverted.
std::vector<AlternativeReading> alternative_readings(std::string_view text, ReadingKind kind,
                                                     const ExplicitReadingOptions& options, bool inverted);

/// The only alternative of a value without numbers to re-read (words, a vector solve):
/// the inverse, labelled.
std::vector<AlternativeReading> inverse_only(const Rotation& vehicle_R_sensor, const std::string& label);

/// A mount read from a person's text (a --nominal or --measured value, a panel field).
struct MountReading {
  Rotation vehicle_R_sensor;
  std::string description;  ///< how it was read: "quat-wxyz, sensor-to-vehicle", "words \"x aft, z down\""
  std::vector<AlternativeReading> alternatives;  ///< other readings, for check_mount
  std::vector<std::string> warnings;
  bool words = false;  ///< read as axis-aligned words
};

/// Reads a mount: axis-aligned words when the text looks like words, otherwise numbers
/// through read_pose_text. `vehicle_to_sensor` says the value was written the other way
/// round (it is inverted). Errors name the line and column of the text.
Expected<MountReading> read_mount_text(std::string_view text, const PoseTextOptions& options,
                                       const VehicleAxes& names, bool vehicle_to_sensor = false);

enum class MountVerdict {
  WithinTolerance,    ///< go, as far as this check goes
  Misaligned,         ///< beyond tolerance, a plain mounting error
  ConventionMistake,  ///< another reading of the measured value matches the nominal
  LikelyAxisMixUp,    ///< near a 90/120/180 degree re-orientation, no reading explains it
};

/// "within tolerance", "misaligned", "convention or direction mistake", "axis mix-up".
std::string verdict_name(MountVerdict v);

/// An alternative reading that would explain the error.
struct Explanation {
  std::string label;
  double error_rad = 0.0;  ///< what the error would be under that reading
};

struct MountCheck {
  Rotation nominal;   ///< vehicle_R_sensor from the drawing
  Rotation measured;  ///< vehicle_R_sensor measured
  /// The error turn written in vehicle axes: measured = error_vehicle * nominal, so
  /// error_vehicle = measured * nominal^-1 turns the nominal sensor onto the measured one.
  Rotation error_vehicle;
  double error_rad = 0.0;
  Eigen::Vector3d error_axis_vehicle = Eigen::Vector3d::UnitX();
  std::string error_words;               ///< "2.1 degrees about the vehicle's pitch axis ..., nose down"
  std::array<NamedTurn, 3> error_turns;  ///< small-angle split about the vehicle's axes
  double tolerance_rad = 0.0;
  bool within_tolerance = false;
  MountVerdict verdict = MountVerdict::WithinTolerance;
  std::string verdict_text;  ///< a sentence for the person
  /// How far the error is from the nearest non-identity axis-aligned re-orientation (one of
  /// the 23 turns that map vehicle axes onto vehicle axes), and that turn's angle.
  double nearest_reorientation_rad = 0.0;
  double reorientation_angle_rad = 0.0;
  std::vector<Explanation> explanations;  ///< best first
};

/// An error this close to a 90, 120 or 180 degree axis re-orientation is "near" it.
inline constexpr double kReorientationWindowRad = 10.0 * 3.14159265358979323846 / 180.0;
/// An alternative explains the error when it brings it within the tolerance, or below this
/// and under a quarter of the error as measured.
inline constexpr double kExplainLimitRad = 5.0 * 3.14159265358979323846 / 180.0;

/// Checks a measured mount against a nominal one. `alternatives` are other readings of the
/// measured value (alternative_readings); pass none when there are none.
MountCheck check_mount(const Rotation& nominal_vehicle_R_sensor, const Rotation& measured_vehicle_R_sensor,
                       double tolerance_rad, const VehicleAxes& names,
                       const std::vector<AlternativeReading>& alternatives = {});

}  // namespace attiscope
