// arcball.cpp: Shoemake's arcball (see arcball.hpp).
#include "attiscope/core/arcball.hpp"

#include <cmath>

namespace attiscope {

namespace {
/// Below this |from x to| the two sphere points are equal or opposite.
constexpr double kSamePointTolerance = 1e-15;
}  // namespace

Eigen::Vector3d arcball_point(const ArcballSphere& sphere, const Eigen::Vector2d& pixel) {
  const double r = sphere.radius_px > 0.0 ? sphere.radius_px : 1.0;
  // Screen y grows downward; view y grows upward.
  const double x = (pixel.x() - sphere.centre_px.x()) / r;
  const double y = (sphere.centre_px.y() - pixel.y()) / r;
  const double rr = x * x + y * y;
  if (rr > 1.0) {
    const double s = 1.0 / std::sqrt(rr);
    return {x * s, y * s, 0.0};
  }
  return {x, y, std::sqrt(1.0 - rr)};
}

Rotation arcball_rotation(const Eigen::Vector3d& from_view, const Eigen::Vector3d& to_view) {
  const Eigen::Vector3d a = from_view.normalized();
  const Eigen::Vector3d b = to_view.normalized();
  const Eigen::Vector3d v = a.cross(b);
  const double w = a.dot(b);
  // Equal points give q = (1, 0); opposite points (only on the outline) give q = (-1, 0),
  // a full 360-degree turn of the object: both are the identity rotation.
  if (v.norm() < kSamePointTolerance) return Rotation::identity();
  return Rotation(Eigen::Quaterniond(w, v.x(), v.y(), v.z()));
}

Rotation arcball_world_turn(const Rotation& view_turn, const Eigen::Matrix3d& world_R_view) {
  const Eigen::Quaterniond world_q_view(world_R_view);
  const Rotation world_rot_view(world_q_view);
  return world_rot_view * view_turn * world_rot_view.inverse();
}

ArcballDrag ArcballDrag::begin(const ArcballSphere& sphere, const Eigen::Vector2d& pixel,
                               const Rotation& world_R_body) {
  ArcballDrag d;
  d.sphere = sphere;
  d.start_view = arcball_point(sphere, pixel);
  d.world_R_body_at_start = world_R_body;
  return d;
}

Rotation ArcballDrag::pose_at(const Eigen::Vector2d& pixel, const Eigen::Matrix3d& world_R_view) const {
  const Rotation view_turn = arcball_rotation(start_view, arcball_point(sphere, pixel));
  return arcball_world_turn(view_turn, world_R_view) * world_R_body_at_start;
}

}  // namespace attiscope
