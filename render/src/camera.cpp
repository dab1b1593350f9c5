// camera.cpp: orbit camera, preset views, projection and pixel rays.
#include "attiscope/render/camera.hpp"

#include <Eigen/Geometry>
#include <algorithm>
#include <cctype>
#include <cmath>
#include <string>

namespace attiscope::render {

namespace {

constexpr double kPi = 3.14159265358979323846;
constexpr double kDeg = kPi / 180.0;
/// Elevation of the iso view, and its azimuth (front-right).
constexpr double kIsoElevationDeg = 28.0;
constexpr double kIsoAzimuthDeg = -38.0;
constexpr double kMinDistance = 2.5;
constexpr double kMaxDistance = 40.0;

struct PresetRow {
  ViewPreset view;
  const char* name;
  double azimuth_deg;
  double elevation_deg;
};

constexpr PresetRow kPresets[] = {
    {ViewPreset::Front, "front", 0.0, 0.0},
    {ViewPreset::Back, "back", 180.0, 0.0},
    {ViewPreset::Left, "left", 90.0, 0.0},
    {ViewPreset::Right, "right", -90.0, 0.0},
    {ViewPreset::Top, "top", 180.0, 90.0},
    {ViewPreset::Bottom, "bottom", 0.0, -90.0},
    {ViewPreset::Iso, "iso", kIsoAzimuthDeg, kIsoElevationDeg},
};

// The world's ground basis: forward (world +x on the ground), left (up x forward), up.
struct GroundBasis {
  Eigen::Vector3d forward, left, up;
};

GroundBasis ground_basis(const WorldFrame& world) {
  GroundBasis g;
  g.up = world.up.normalized();
  Eigen::Vector3d f = Eigen::Vector3d::UnitX() - g.up * g.up.x();
  if (f.norm() < 1e-9) f = Eigen::Vector3d::UnitY() - g.up * g.up.y();
  g.forward = f.normalized();
  g.left = g.up.cross(g.forward);
  return g;
}

}  // namespace

std::optional<ViewPreset> parse_view_preset(std::string_view name) {
  std::string n(name);
  std::transform(n.begin(), n.end(), n.begin(), [](unsigned char c) { return std::tolower(c); });
  for (const PresetRow& p : kPresets) {
    if (n == p.name) return p.view;
  }
  return std::nullopt;
}

std::string view_preset_name(ViewPreset v) {
  for (const PresetRow& p : kPresets) {
    if (p.view == v) return p.name;
  }
  return "iso";
}

std::string view_preset_list() {
  std::string out;
  for (const PresetRow& p : kPresets) {
    if (!out.empty()) out += ", ";
    out += p.name;
  }
  return out;
}

Camera Camera::preset(ViewPreset v) {
  Camera c;
  for (const PresetRow& p : kPresets) {
    if (p.view == v) {
      c.azimuth_rad = p.azimuth_deg * kDeg;
      c.elevation_rad = p.elevation_deg * kDeg;
    }
  }
  return c;
}

void Camera::orbit(double d_azimuth_rad, double d_elevation_rad) {
  azimuth_rad = std::remainder(azimuth_rad + d_azimuth_rad, 2.0 * kPi);
  elevation_rad = std::clamp(elevation_rad + d_elevation_rad, -kPi / 2.0, kPi / 2.0);
}

void Camera::zoom(double factor) {
  if (factor > 0.0 && std::isfinite(factor))
    distance = std::clamp(distance * factor, kMinDistance, kMaxDistance);
}

void Camera::pan(const WorldFrame& world, double dx_px, double dy_px, int view_height_px) {
  const CameraPose pose = camera_pose(*this, world);
  const double units_per_px = 2.0 * distance * std::tan(fov_y_rad / 2.0) / std::max(view_height_px, 1);
  target += (-dx_px * pose.world_R_view.col(0) + dy_px * pose.world_R_view.col(1)) * units_per_px;
}

CameraPose camera_pose(const Camera& camera, const WorldFrame& world) {
  const GroundBasis g = ground_basis(world);
  const double ca = std::cos(camera.azimuth_rad), sa = std::sin(camera.azimuth_rad);
  const double ce = std::cos(camera.elevation_rad), se = std::sin(camera.elevation_rad);
  // Toward the viewer; screen right is the azimuth derivative of that direction (defined
  // at every elevation, so the top and bottom views keep the world's +x as screen up/down).
  const Eigen::Vector3d back = ce * (ca * g.forward + sa * g.left) + se * g.up;
  const Eigen::Vector3d right = -sa * g.forward + ca * g.left;
  const Eigen::Vector3d up = back.cross(right);
  CameraPose pose;
  pose.eye = camera.target + camera.distance * back;
  pose.world_R_view << right.normalized(), up.normalized(), back.normalized();
  return pose;
}

Eigen::Matrix4d view_matrix(const Camera& camera, const WorldFrame& world) {
  const CameraPose pose = camera_pose(camera, world);
  Eigen::Matrix4d v = Eigen::Matrix4d::Identity();
  v.topLeftCorner<3, 3>() = pose.world_R_view.transpose();
  v.topRightCorner<3, 1>() = -pose.world_R_view.transpose() * pose.eye;
  return v;
}

Eigen::Matrix4d projection_matrix(const Camera& camera, int width_px, int height_px) {
  const double aspect = static_cast<double>(std::max(width_px, 1)) / std::max(height_px, 1);
  const double f = 1.0 / std::tan(camera.fov_y_rad / 2.0);
  const double n = camera.near_plane, fa = camera.far_plane;
  Eigen::Matrix4d p = Eigen::Matrix4d::Zero();
  p(0, 0) = f / aspect;
  p(1, 1) = f;
  p(2, 2) = (fa + n) / (n - fa);
  p(2, 3) = 2.0 * fa * n / (n - fa);
  p(3, 2) = -1.0;
  return p;
}

Projected project_to_pixel(const Camera& camera, const WorldFrame& world, int width_px, int height_px,
                           const Eigen::Vector3d& world_point) {
  const Eigen::Vector4d clip =
      projection_matrix(camera, width_px, height_px) * view_matrix(camera, world) * world_point.homogeneous();
  Projected out;
  out.in_front = clip.w() > 0.0;
  if (!out.in_front) return out;
  const Eigen::Vector3d ndc = clip.head<3>() / clip.w();
  out.pixel = {(ndc.x() + 1.0) * 0.5 * width_px, (1.0 - ndc.y()) * 0.5 * height_px};
  out.depth = ndc.z();
  return out;
}

Ray pixel_ray(const Camera& camera, const WorldFrame& world, int width_px, int height_px,
              const Eigen::Vector2d& pixel) {
  const CameraPose pose = camera_pose(camera, world);
  const double aspect = static_cast<double>(std::max(width_px, 1)) / std::max(height_px, 1);
  const double t = std::tan(camera.fov_y_rad / 2.0);
  const double nx = 2.0 * pixel.x() / std::max(width_px, 1) - 1.0;
  const double ny = 1.0 - 2.0 * pixel.y() / std::max(height_px, 1);
  const Eigen::Vector3d dir_view(nx * t * aspect, ny * t, -1.0);
  return {pose.eye, (pose.world_R_view * dir_view).normalized()};
}

}  // namespace attiscope::render
