// frames.hpp: how the world and body frames are named and oriented, for drawing.
//
// A pose is world_R_body (v_world = R v_body). The world frame decides which way is up on
// the screen (ENU: +z up; NED: -z up, i.e. +z down); the body frame decides how a model,
// built with its own front/top/right, sits in body coordinates (FLU, FRD, camera
// right-down-forward, or three named axes).
#pragma once

#include <Eigen/Core>
#include <Eigen/Geometry>
#include <array>
#include <optional>
#include <string>
#include <string_view>

namespace attiscope::render {

/// The world frame as the scene needs it: the up direction and the axis labels.
struct WorldFrame {
  std::string name = "ENU";
  Eigen::Vector3d up = Eigen::Vector3d::UnitZ();          ///< world coordinates
  std::array<std::string, 3> axis_labels{"E", "N", "U"};  ///< drawn at the triad tips

  static WorldFrame enu();  ///< x east, y north, z up
  static WorldFrame ned();  ///< x north, y east, z down
  static WorldFrame xyz();  ///< z up, labels X Y Z
};

/// The body frame: where front, top and right point in body coordinates.
struct BodyFrame {
  std::string name = "FLU";
  Eigen::Vector3d front = Eigen::Vector3d::UnitX();
  Eigen::Vector3d top = Eigen::Vector3d::UnitZ();
  Eigen::Vector3d right = -Eigen::Vector3d::UnitY();
  std::array<std::string, 3> axis_labels{"x", "y", "z"};

  static BodyFrame flu();  ///< x front, y left, z up (ROS REP 103 habit)
  static BodyFrame frd();  ///< x front, y right, z down (aerospace habit)
  static BodyFrame rdf();  ///< camera: x right, y down, z forward (optical axis)
};

/// "ENU", "NED", "XYZ" (case-insensitive). nullopt otherwise.
std::optional<WorldFrame> parse_world_frame(std::string_view name);
/// "FLU", "FRD", "RDF" (also "camera"), case-insensitive. nullopt otherwise.
std::optional<BodyFrame> parse_body_frame(std::string_view name);

/// body_R_model: places a model built with its own front/top/right (model coordinates) in
/// a body frame, so model front lands on body front, and so on. Both triples must be
/// orthonormal with top = right x front (as in every frame above); the result is then a
/// proper rotation.
Eigen::Matrix3d body_R_model(const BodyFrame& body, const Eigen::Vector3d& model_front,
                             const Eigen::Vector3d& model_top, const Eigen::Vector3d& model_right);

}  // namespace attiscope::render
