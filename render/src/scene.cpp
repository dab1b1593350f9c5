// scene.cpp: the scene's geometry that the window needs without GL (axis tips, picking).
#include "attiscope/render/scene.hpp"

namespace attiscope::render {

Eigen::Vector3d ground_centre(const SceneState& state) {
  return -(state.rings ? kGroundDepthRings : kGroundDepth) * state.world.up.normalized();
}

void ground_axes(const WorldFrame& world, Eigen::Vector3d* e1, Eigen::Vector3d* e2) {
  const Eigen::Vector3d up = world.up.normalized();
  Eigen::Vector3d f = Eigen::Vector3d::UnitX() - up * up.x();
  if (f.norm() < 1e-9) f = Eigen::Vector3d::UnitY() - up * up.y();
  *e1 = f.normalized();
  *e2 = up.cross(*e1);
}

Eigen::Vector3d world_triad_origin(const SceneState& state) {
  Eigen::Vector3d e1, e2;
  ground_axes(state.world, &e1, &e2);
  return ground_centre(state) + kWorldTriadOffset * (e1 + e2);
}

Eigen::Vector3d body_axis_tip(const SceneState& state, int axis) {
  return state.world_R_body.matrix().col(axis) * kBodyTriadLength;
}

Eigen::Vector3d world_axis_tip(const SceneState& state, int axis) {
  return world_triad_origin(state) + Eigen::Vector3d::Unit(axis) * kWorldTriadLength;
}

Eigen::Matrix3d world_R_model(const SceneState& state) {
  if (state.model.user_mesh) return state.world_R_body.matrix();
  const ModelInfo& info = model_info(state.model.kind);
  return state.world_R_body.matrix() * body_R_model(state.body, info.front, info.top, info.right);
}

std::optional<Eigen::Vector3d> pick_body(const SceneState& state, const Mesh& mesh,
                                         const Eigen::Vector2d& pixel) {
  const Ray ray = pixel_ray(state.camera, state.world, state.width_px, state.height_px, pixel);
  const Eigen::Matrix3d model_R_world = world_R_model(state).transpose();
  const auto t = ray_mesh_hit(mesh, model_R_world * ray.origin, model_R_world * ray.direction);
  if (!t) return std::nullopt;
  return ray.origin + *t * ray.direction;
}

}  // namespace attiscope::render
