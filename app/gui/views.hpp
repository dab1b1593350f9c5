// views.hpp: the 3D views of the window (Scene and Gimbal rings), rendered offscreen by
// render/ and copied into their regions of the window's framebuffer (where their picture
// changed) after the frame's fill and before ImGui draws the panels (whose popups then stay
// on top). A view sets its own viewport, scissor and depth state; the ImGui backend sets
// all of its own GL state each frame, so a view need not restore any.
//
// The views' own state (camera, model, ghost toggle, the rings' convention, a drag in
// progress, a pending export) is window state, not document state: it is not undone and
// holds no rotation of its own. The pose always comes from the document. All of it, and the
// renderer, live in one Views object that the Ui owns (ui.views).
#pragma once

#include <memory>

#include <nlohmann/json.hpp>

#include "gui/redraw.hpp"
#include "gui/ui.hpp"

#ifdef ATTISCOPE_HAS_RENDER
#include <optional>
#include <string>

#include "attiscope/core/arcball.hpp"
#include "attiscope/render/scene.hpp"
#endif

namespace attiscope::render {
class SceneRenderer;
}

namespace attiscope::gui {

/// Creates the renderer (the GL context must be current; the window does it after its first
/// frame) / drops it before the context goes. The views' state exists from the Ui's start.
void views_init(Ui& ui);
void views_shutdown(Ui& ui);
/// Plans this frame's views (after the panels are laid out): makes a pending PNG export,
/// renders each view's picture offscreen, marks in `damage` the part of each region whose
/// picture changed (all of it when the view moved or came back), and returns the regions of
/// the views shown this frame. Without `compare` (a frame that repaints everything) each
/// view's region is marked whole and its picture is not read back.
std::vector<FramebufferRect> views_plan(Ui& ui, DamageGrid& damage, bool compare);
/// Shows the Scene in ui.scene_viewport and the rings in ui.gimbal_viewport
/// (FramebufferRect: framebuffer pixels, origin bottom-left, the arguments of glViewport):
/// in each, the box of the dirty cells of `damage` on it.
void views_draw(Ui& ui, const DamageGrid& damage);
/// What the views show, for test dumps (null without render/).
nlohmann::json views_dump(const Ui& ui);

#ifdef ATTISCOPE_HAS_RENDER

/// Camera distance that frames the body alone, and the body inside the gimbal rings (the
/// same framing as `attiscope render`).
inline constexpr double kSceneViewDistance = 6.2;
inline constexpr double kRingsViewDistance = 10.5;

enum class DragMode { None, Body, Orbit, Pan };

/// A PNG export asked for by the Scene panel, made by views_draw (it needs the GL context
/// between frames).
struct ExportRequest {
  std::string path;
  int width = 1024;
  int height = 768;
};

struct ViewState {
  render::Camera camera = render::Camera::preset(render::ViewPreset::Iso);
  /// The demo pose is a survey aircraft's, so the window starts on the aircraft model.
  render::ModelChoice model{render::ModelKind::Aircraft, false};
  std::string user_mesh_name;  ///< file name of the loaded OBJ/STL, when there is one
  bool show_ghost = false;
  /// The rings' convention; nullopt follows the house convention's Euler convention.
  std::optional<EulerConvention> rings_convention;
  DragMode drag = DragMode::None;
  ArcballDrag arcball;
  Eigen::Vector2d drag_last_px = Eigen::Vector2d::Zero();
  bool drag_moved = false;  ///< the body drag has started its document edit
  std::optional<ExportRequest> export_request;
  std::string export_message;  ///< result of the last export
  bool export_failed = false;
  std::optional<render::Mesh> pending_user_mesh;  ///< loaded, not yet handed to the renderer
  // What the Gimbal panel showed last (for dumps and tests).
  double shown_margin_deg = 0.0;
  double shown_condition_number = 0.0;
  bool smoothed = true;  ///< this frame's views have the smoothing pass (off while moving)
};

/// The Scene panel's text fields (window state).
struct SceneFields {
  char mesh_path[512] = "";
  std::string mesh_error;
  char export_path[512] = "";
  int export_w = 1024;
  int export_h = 768;
  bool confirm_overwrite = false;
};

#endif

/// The window's 3D views: their state, the Scene panel's fields and the one renderer on the
/// window's GL context (alive between views_init and views_shutdown). Owned by the Ui.
struct Views {
  Views();
  ~Views();
  Views(const Views&) = delete;
  Views& operator=(const Views&) = delete;
#ifdef ATTISCOPE_HAS_RENDER
  ViewState state;
  SceneFields fields;
  std::unique_ptr<render::SceneRenderer> renderer;
  std::string init_error;  ///< why there is no renderer
  /// This frame's plan and what the window shows, per view (0 the Scene, 1 the rings; the
  /// renderer's prepare() slots).
  struct Shown {
    bool planned = false;
    FramebufferRect rect;        ///< this frame's region
    FramebufferRect shown_rect;  ///< where the window shows the view's last picture (empty: nowhere)
  };
  Shown shown[2];
  /// The pose the views showed last frame, and whether it had changed from the one before.
  Eigen::Quaterniond last_pose = Eigen::Quaterniond::Identity();
  bool pose_changed_before = false;
#endif
};

#ifdef ATTISCOPE_HAS_RENDER
/// The views' state.
ViewState& view_state(Ui& ui);
const ViewState& view_state(const Ui& ui);
/// The Scene as drawn this frame: pose and reference from the document, frames from its
/// house convention, and the view state. width/height: the scene region in pixels.
render::SceneState scene_state(const Ui& ui, int width_px, int height_px);
/// The rings' convention: the view's choice, else the house convention's.
EulerConvention rings_convention(const Ui& ui);
/// The CPU mesh drawn for the current model (for picking); nullptr before views_init.
const render::Mesh* scene_mesh(const Ui& ui);

#endif

}  // namespace attiscope::gui
