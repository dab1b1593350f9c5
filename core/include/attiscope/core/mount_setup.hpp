// mount_setup.hpp: the mount setup file (TOML): the vehicle's axis names, the tolerance, the
// nominal and measured mounts and the frame chain, so a check can be repeated and filed.
//
// Every rotation in the file is a table with exactly one of: quaternion = [w, x, y, z]
// (Hamilton, scalar first), matrix = [[r0], [r1], [r2]] (rows), euler_deg = [a, b, c] with
// euler = "ZYX" and kind = "intrinsic"/"extrinsic", axis_angle_deg = [x, y, z, angle],
// rotvec_rad = [x, y, z], or (for the nominal mount) words = "sensor x toward vehicle aft,
// sensor z down" with an optional trim_deg = [about x, about y, about z] in vehicle axes.
// Mounts are vehicle_R_sensor unless direction = "vehicle_to_sensor"; links are
// parent_R_child unless maps = "parent_to_child". Unknown keys are warnings; malformed files
// are errors with line and column. Saving writes a temporary file and renames it, so the old
// file is never lost half-written.
#pragma once

#include <Eigen/Core>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "attiscope/core/atomic_file.hpp"
#include "attiscope/core/expected.hpp"
#include "attiscope/core/frame_chain.hpp"
#include "attiscope/core/rotation.hpp"
#include "attiscope/core/vehicle_axes.hpp"

namespace attiscope {

struct MountSetup {
  std::string name;
  VehicleAxes vehicle_axes;  ///< how the vehicle's x, y, z are named (default FRD)
  double tolerance_deg = 0.5;
  std::optional<Rotation> nominal;                     ///< vehicle_R_sensor from the drawing (trim included)
  std::string nominal_words;                           ///< the axis-aligned words, when it was given so
  Eigen::Vector3d trim_deg = Eigen::Vector3d::Zero();  ///< with nominal_words: trim about vehicle axes
  std::optional<Rotation> measured;                    ///< vehicle_R_sensor measured
  std::string measured_note;                           ///< where the measured value came from
  FrameChain chain;
};

/// The default tolerance of a new setup, degrees.
inline constexpr double kDefaultMountToleranceDeg = 0.5;

/// Reads a mount setup from TOML text. Errors name the line and column; unknown keys are
/// appended to `warnings` (with their line) when it is given.
Expected<MountSetup> parse_mount_setup(std::string_view text, std::vector<std::string>* warnings = nullptr);

/// Reads a mount setup file (errors also for a file that cannot be read).
Expected<MountSetup> load_mount_setup(const std::string& path, std::vector<std::string>* warnings = nullptr);

/// The TOML text of a setup, with a comment line explaining each field; numbers round-trip.
std::string mount_setup_toml(const MountSetup& setup);

/// Writes the setup atomically through write_file_atomically (atomic_file.hpp): a temporary
/// file beside the target, flushed, then a rename. `before_rename` is atomic_file.hpp's test
/// hook (a simulated crash between write and rename).
Expected<bool> save_mount_setup(const std::string& path, const MountSetup& setup,
                                const BeforeRenameHook& before_rename = {});

}  // namespace attiscope
