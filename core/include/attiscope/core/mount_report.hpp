// mount_report.hpp: one mount check from its inputs to what is shown: the result the
// Mount check panel draws, the `mount --json` object and the plain-text report (the text
// half of the check sheet). The command line and the window both call these.
//
// A mount is vehicle_R_sensor (maps sensor-frame coordinates into vehicle-frame ones).
// Every rendering carries kMountCaution: a check here supplements and never replaces the
// test procedure's calibrated alignment measurement; the test plan, local rules and licensed
// practice govern.
#pragma once

#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <vector>

#include "attiscope/core/expected.hpp"
#include "attiscope/core/mount.hpp"
#include "attiscope/core/vehicle_axes.hpp"
#include "attiscope/core/wahba.hpp"

namespace attiscope {

struct MountInputs {
  VehicleAxes names;
  double tolerance_rad = 0.5 * 3.14159265358979323846 / 180.0;
  std::optional<MountReading> nominal;
  /// The measured mount: a reading, or vector pairs to solve (give one of the two).
  std::optional<MountReading> measured;
  std::optional<std::vector<VectorPair>> vectors;
  std::string vectors_source;  ///< where the pairs came from, for the description ("bench.txt")
};

struct MountResult {
  VehicleAxes names;
  double tolerance_rad = 0.0;
  std::optional<MountReading> nominal;
  std::optional<MountReading> measured;  ///< filled from the solve when solved from vectors
  std::optional<VectorSolve> solve;
  std::vector<int> vector_lines;  ///< the lines of the pairs used
  std::optional<MountCheck> check;
  std::vector<std::string> warnings;

  /// The vectors could not fix the rotation: no measured mount.
  bool refused() const { return solve && !solve->vehicle_R_sensor; }
  /// A nominal and a measured mount were compared and the error is beyond tolerance.
  bool failed() const { return check && !check->within_tolerance; }
};

/// Runs the check: solves from vectors when given (refusal included), then compares with
/// the nominal when there is one. Errors: neither or both measured inputs, an empty or
/// unusable vector list.
Expected<MountResult> run_mount_check(const MountInputs& inputs);

/// The `mount --json` object (design.md "Command line"): mount, error_deg,
/// within_tolerance, residuals_deg, unobservable, warnings, caution, and more.
nlohmann::json mount_json(const MountResult& r);

/// The plain-text report; `date`, when given, is printed as the date of the check (the
/// check sheet's text). Ends with the caution.
std::string mount_report_text(const MountResult& r, int precision = 6, const std::string& date = {});

/// The few lines a check-sheet picture prints under its views: the verdict with the error and
/// the tolerance, the error in vehicle words, and the date when given.
std::vector<std::string> mount_picture_notes(const MountResult& r, int precision = 4,
                                             const std::string& date = {});

}  // namespace attiscope
