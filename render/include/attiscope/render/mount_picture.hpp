// mount_picture.hpp: the picture half of a mount check sheet. The scene's world frame is the
// vehicle frame (its triad labelled with the vehicle's own direction words, up as the
// vehicle's up), the body is the sensor: the measured mount drawn solid and the nominal one
// as the ghost, sensor axes labelled sx, sy, sz. The Mount check panel and
// `attiscope mount --sheet-png` both draw through this.
#pragma once

#include <string>

#include "attiscope/core/expected.hpp"
#include "attiscope/core/rotation.hpp"
#include "attiscope/core/vehicle_axes.hpp"
#include "attiscope/render/scene.hpp"
#include "attiscope/render/scene_renderer.hpp"

namespace attiscope::render {

/// Size of the check-sheet picture in pixels.
inline constexpr int kMountPictureWidth = 900;
inline constexpr int kMountPictureHeight = 700;

/// The vehicle frame as a world frame for drawing: up is the vehicle's up axis, the labels
/// are "x forward"-style words.
WorldFrame vehicle_world_frame(const VehicleAxes& names);

/// The scene of a mount check: world = vehicle, body = sensor at the measured mount (solid),
/// the nominal as the ghost. Both rotations are vehicle_R_sensor.
SceneState mount_scene(const Rotation& nominal_vehicle_R_sensor, const Rotation& measured_vehicle_R_sensor,
                       const VehicleAxes& names);

/// Renders mount_scene with `renderer` (on the current GL context) and writes the PNG.
Expected<bool> write_mount_picture(SceneRenderer& renderer, const std::string& png_path,
                                   const Rotation& nominal_vehicle_R_sensor,
                                   const Rotation& measured_vehicle_R_sensor, const VehicleAxes& names);

}  // namespace attiscope::render
