// mount_picture.hpp: the picture half of a mount check sheet. The scene's world frame is the
// vehicle frame (up is the vehicle's up). The vehicle model sits below, its triad labelled
// with the vehicle's own direction words; the sensor model is drawn enlarged above its mount
// point: the measured mount solid with its axes labelled with the sensor's own names, the
// nominal mount as the ghost with faded axes. The sheet shows four views named by the
// vehicle ("from behind", "from the left", "from above", "from ahead, right and above"),
// a title, a legend, optional result lines, the frame chain when one is given, and the
// mount-check caution. The Mount check panel and `attiscope mount --sheet-png` both draw
// through this.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <vector>

#include "attiscope/core/expected.hpp"
#include "attiscope/core/frame_chain.hpp"
#include "attiscope/core/rotation.hpp"
#include "attiscope/core/vehicle_axes.hpp"
#include "attiscope/render/image.hpp"
#include "attiscope/render/mesh.hpp"
#include "attiscope/render/scene.hpp"
#include "attiscope/render/scene_renderer.hpp"

namespace attiscope::render {

/// Size of the check-sheet picture in pixels, and of each of its four views.
inline constexpr int kMountPictureWidth = 1200;
inline constexpr int kMountPictureHeight = 1060;
inline constexpr int kMountViewWidth = 600;
inline constexpr int kMountViewHeight = 400;
/// Where the views start (below the title and legend).
inline constexpr int kMountViewsTop = 96;
/// The vehicle model's half-size in scene units (the sensor's is 1), and the gap between
/// the vehicle's top and the sensor's centre.
inline constexpr double kMountVehicleHalfSize = 2.4;
inline constexpr double kMountSensorLift = 1.35;

/// Everything a mount picture can show besides the two mounts.
struct MountPictureOptions {
  ModelKind vehicle_model = ModelKind::Aircraft;
  /// The names printed at the sensor's x, y, z arrows (the sensor's own names).
  std::array<std::string, 3> sensor_axis_names{"sx", "sy", "sz"};
  /// A frame chain to draw beside the vehicle (in the "ahead, right and above" view), the
  /// frame to draw it in (empty: its root) and the frame to highlight.
  std::optional<FrameChain> chain;
  std::string chain_display_frame;
  std::string chain_selected;
  /// Lines printed under the title (the result: "error 2.1 deg, tolerance 0.5 deg: FAIL").
  std::vector<std::string> notes;
};

/// One view of the sheet: its name and where the eye is, in vehicle words.
struct MountView {
  std::string name;                   ///< "from behind"
  std::array<BodyDirection, 2> from;  ///< the eye lies along the sum of these (twice the same for one)
  double elevation_deg = 0.0;         ///< above the vehicle's ground plane
};

/// The four views of the sheet, in their order (left to right, top to bottom).
std::vector<MountView> mount_views();

/// The vehicle frame as a world frame for drawing: up is the vehicle's up axis, the labels
/// are "x forward"-style words.
WorldFrame vehicle_world_frame(const VehicleAxes& names);

/// The direction of a vehicle direction in vehicle coordinates (FRD's forward is +x).
Eigen::Vector3d vehicle_direction(const VehicleAxes& names, BodyDirection d);

/// A camera looking at `target` from a view (a top view has the vehicle's forward up the
/// screen).
Camera mount_view_camera(const VehicleAxes& names, const MountView& view, const Eigen::Vector3d& target,
                         double distance);

/// The scene of a mount check: world = vehicle, body = sensor at the measured mount (solid),
/// the nominal as the ghost. Both rotations are vehicle_R_sensor. The one-view scene (the
/// sensor alone, iso) of earlier sheets; the sheet itself uses mount_sheet_scene.
SceneState mount_scene(const Rotation& nominal_vehicle_R_sensor, const Rotation& measured_vehicle_R_sensor,
                       const VehicleAxes& names);

/// The scene of one view of the sheet: the sensor (measured solid, nominal ghost) at the
/// origin above the vehicle model, the vehicle's triad at its centre, and the chain when
/// `with_chain` and options carry one. Error when the chain cannot be laid out.
Expected<SceneState> mount_sheet_scene(const Rotation& nominal_vehicle_R_sensor,
                                       const Rotation& measured_vehicle_R_sensor, const VehicleAxes& names,
                                       const MountPictureOptions& options, const MountView& view,
                                       bool with_chain);

/// Where the vehicle model's centre is in a sheet scene (world coordinates).
Eigen::Vector3d mount_vehicle_centre(const VehicleAxes& names, ModelKind vehicle_model);

/// Renders the sheet picture with `renderer` (on the current GL context).
Expected<Image> render_mount_picture(SceneRenderer& renderer, const Rotation& nominal_vehicle_R_sensor,
                                     const Rotation& measured_vehicle_R_sensor, const VehicleAxes& names,
                                     const MountPictureOptions& options = {});

/// Renders the sheet picture and writes the PNG.
Expected<bool> write_mount_picture(SceneRenderer& renderer, const std::string& png_path,
                                   const Rotation& nominal_vehicle_R_sensor,
                                   const Rotation& measured_vehicle_R_sensor, const VehicleAxes& names,
                                   const MountPictureOptions& options = {});

}  // namespace attiscope::render
