// scene.hpp: what the Scene and Gimbal rings views show (no GL). The window fills a
// SceneState from its document every frame; `attiscope render` fills one from its options.
#pragma once

#include <Eigen/Core>
#include <optional>
#include <string>
#include <vector>

#include "attiscope/core/chain_layout.hpp"
#include "attiscope/core/euler.hpp"
#include "attiscope/core/rotation.hpp"
#include "attiscope/render/camera.hpp"
#include "attiscope/render/frames.hpp"
#include "attiscope/render/mesh.hpp"

namespace attiscope::render {

/// Which part of the picture to emphasise (the window's hover feedback).
enum class Highlight { None, Body, Ghost, OuterRing, MiddleRing, InnerRing };

/// Which body mesh to draw: one of ours, or the user mesh handed to the renderer.
struct ModelChoice {
  ModelKind kind = ModelKind::Box;
  bool user_mesh = false;  ///< draw SceneRenderer::set_user_mesh's mesh instead
};

/// A frame left behind by the teaching mode: a triad drawn faded (alpha 0..1 blends its
/// colours toward the background), at the body's origin.
struct FadedTriad {
  Rotation world_R_frame;
  float alpha = 0.35f;
};

/// The elementary turn the teaching mode is playing: its axis (world coordinates, through
/// the body's origin) drawn highlighted, and an arc from the start frame through `shown_rad`
/// of `angle_rad`, with the angle written beside it.
struct TurnHighlight {
  Eigen::Vector3d axis_world = Eigen::Vector3d::UnitZ();
  Rotation start_world_R_body;
  double angle_rad = 0.0;  ///< the whole turn, signed
  double shown_rad = 0.0;  ///< how much of it is drawn so far (same sign)
  std::string label;       ///< written at the arc's end ("pitch +10 deg")
  double radius = 1.25;    ///< of the arc (kTurnArcRadius by default)
  bool show_axis = true;   ///< draw the highlighted axis rod
};

/// An extra model drawn solid beside the body (the vehicle under a mount check's sensor).
struct PlacedModel {
  ModelKind kind = ModelKind::Box;
  Eigen::Matrix3d world_R_model = Eigen::Matrix3d::Identity();  ///< may carry a uniform scale
  Eigen::Vector3d offset = Eigen::Vector3d::Zero();             ///< world position of the model's origin
};

struct SceneState {
  Rotation world_R_body;                       ///< the pose drawn: v_world = R v_body
  std::optional<Rotation> ghost_world_R_body;  ///< a reference pose, drawn translucent
  ModelChoice model;
  Camera camera = Camera::preset(ViewPreset::Iso);
  WorldFrame world = WorldFrame::enu();
  BodyFrame body = BodyFrame::flu();
  /// Gimbal rings: Euler angles of world_R_body in the chosen convention (core's to_euler).
  /// Absent: no rings.
  std::optional<EulerAngles> rings;
  Highlight highlight = Highlight::None;
  bool show_grid = true;
  bool show_world_triad = true;
  bool show_body_triad = true;
  bool show_labels = true;
  /// Teaching overlays (render/src/overlays.cpp); empty: nothing extra is drawn.
  std::vector<FadedTriad> faded_triads;
  std::vector<TurnHighlight> turns;
  /// The frames of a frame chain, each a small labelled triad (render/chain_overlay.hpp,
  /// laid out by core/chain_layout.hpp); the marks' display frame is this scene's world.
  std::vector<ChainFrameMark> chain;
  /// Extra solid models (drawn with the body, without its triad).
  std::vector<PlacedModel> props;
  int width_px = 900;
  int height_px = 700;
};

/// World-space length of the body triad's axes and of the world triad's.
inline constexpr double kBodyTriadLength = 1.55;
inline constexpr double kWorldTriadLength = 0.9;
/// How far below the body (along world down) the ground grid sits, without and with rings.
inline constexpr double kGroundDepth = 1.35;
inline constexpr double kGroundDepthRings = 2.6;
/// Where the world triad stands on the ground: this far along the world's +x axis and
/// along its left (up x +x), so the body does not hide it in the usual views.
inline constexpr double kWorldTriadOffset = 1.1;
/// Radii of the outer, middle and inner gimbal rings (the body fits inside radius 1).
inline constexpr double kRingRadius[3] = {2.05, 1.78, 1.51};

/// Radius of the teaching arc and half-length of the highlighted turn axis.
inline constexpr double kTurnArcRadius = 1.25;
inline constexpr double kTurnAxisHalfLength = 2.1;

/// World position of the tip of body axis `axis` (0 x, 1 y, 2 z) as drawn.
Eigen::Vector3d body_axis_tip(const SceneState& state, int axis);
/// World position of the tip of world axis `axis`, as drawn (at the ground, below the body).
Eigen::Vector3d world_axis_tip(const SceneState& state, int axis);
/// World position of the world triad's origin (on the ground, in front and to the left).
Eigen::Vector3d world_triad_origin(const SceneState& state);
/// The point of the ground right below the body, and the ground's two in-plane directions
/// (world +x projected on the ground, and up x that).
Eigen::Vector3d ground_centre(const SceneState& state);
void ground_axes(const WorldFrame& world, Eigen::Vector3d* e1, Eigen::Vector3d* e2);

/// The mesh-to-world matrix of the body: world_R_body * body_R_model for one of our models
/// (placed by state.body), world_R_body alone for a user mesh (written in body coordinates).
Eigen::Matrix3d world_R_model(const SceneState& state);

/// Is the pixel (top-left origin, in a width_px x height_px view) on the body? `mesh` is the
/// mesh drawn (build_model(state.model.kind), or the user mesh). Returns the world hit point.
std::optional<Eigen::Vector3d> pick_body(const SceneState& state, const Mesh& mesh,
                                         const Eigen::Vector2d& pixel);

}  // namespace attiscope::render
