// camera.hpp: the orbit camera of the Scene and Gimbal rings views, and the pixel math the
// window needs without GL: view and projection matrices, world point -> pixel, pixel -> ray.
//
// The camera orbits a target point. Azimuth and elevation are measured in the world frame:
// elevation from the ground plane toward world up, azimuth from the world's +x axis
// (projected on the ground) toward the world's "left" (up x (+x)). Pixels have their origin
// at the top left of the view, x right, y down, pixel centres at half-integers.
#pragma once

#include <Eigen/Core>
#include <optional>
#include <string>
#include <string_view>

#include "attiscope/render/frames.hpp"

namespace attiscope::render {

/// Preset views, named in the world frame's terms: "front" looks from the world's +x axis
/// back at the body (world up is screen up), "top" from world up with the world +x axis
/// pointing up the screen, "bottom" from below with +x up, "iso" from front-right-above.
enum class ViewPreset { Front, Back, Left, Right, Top, Bottom, Iso };

/// "front" ... "iso" (case-insensitive). nullopt otherwise.
std::optional<ViewPreset> parse_view_preset(std::string_view name);
std::string view_preset_name(ViewPreset v);
/// "front, back, left, right, top, bottom, iso".
std::string view_preset_list();

struct Camera {
  Eigen::Vector3d target = Eigen::Vector3d::Zero();  ///< world point the camera orbits
  double azimuth_rad = 0.0;
  double elevation_rad = 0.0;  ///< clamped to [-90, 90] degrees
  double distance = 6.0;       ///< from target, in scene units (a body is about 2 across)
  double fov_y_rad = 0.6;      ///< vertical field of view
  double near_plane = 0.1;
  double far_plane = 100.0;

  /// A camera at a preset view.
  static Camera preset(ViewPreset v);
  /// Orbit by a drag: dx, dy in radians of azimuth and elevation.
  void orbit(double d_azimuth_rad, double d_elevation_rad);
  /// Zoom: multiply the distance (clamped to a sensible range).
  void zoom(double factor);
  /// Pan: move the target by dx, dy in pixels of a view of the given height.
  void pan(const WorldFrame& world, double dx_px, double dy_px, int view_height_px);
};

/// Where the camera is and how it is turned, in the world.
struct CameraPose {
  Eigen::Vector3d eye;
  Eigen::Matrix3d world_R_view;  ///< columns: screen right, screen up, toward the viewer
};

CameraPose camera_pose(const Camera& camera, const WorldFrame& world);

/// 4x4 view matrix (world -> view coordinates, OpenGL convention: the camera looks down -z).
Eigen::Matrix4d view_matrix(const Camera& camera, const WorldFrame& world);
/// 4x4 perspective projection (OpenGL clip space) for a view of width x height pixels.
Eigen::Matrix4d projection_matrix(const Camera& camera, int width_px, int height_px);

/// A world point on the screen: pixel (top-left origin) and whether it is in front of the camera.
struct Projected {
  Eigen::Vector2d pixel = Eigen::Vector2d::Zero();
  double depth = 0.0;  ///< NDC depth in [-1, 1] when visible
  bool in_front = false;
};

Projected project_to_pixel(const Camera& camera, const WorldFrame& world, int width_px, int height_px,
                           const Eigen::Vector3d& world_point);

/// A ray in world coordinates: origin + t * direction (unit), t >= 0.
struct Ray {
  Eigen::Vector3d origin;
  Eigen::Vector3d direction;
};

/// The ray through a pixel (top-left origin) of a width x height view.
Ray pixel_ray(const Camera& camera, const WorldFrame& world, int width_px, int height_px,
              const Eigen::Vector2d& pixel);

}  // namespace attiscope::render
