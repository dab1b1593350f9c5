// views.cpp: the hook between the window and render/: the Ui's one SceneRenderer on the
// window's GL context draws the Scene and the Gimbal rings straight into their regions, and makes the
// Scene panel's PNG export (render_image + write_png, as `attiscope render` does). Without
// render/ in the build the regions stay empty (the window's clear colour): nothing is drawn
// that is not real.
#include "gui/views.hpp"

#include "gui/chain_view.hpp"
#include "gui/teaching.hpp"

#ifdef ATTISCOPE_HAS_RENDER
#include <imgui.h>

#include <cmath>
#include <filesystem>
#include <memory>

#include "attiscope/render/scene_renderer.hpp"
#endif

namespace attiscope::gui {

#ifdef ATTISCOPE_HAS_RENDER

namespace {

constexpr double kDegPerRad = 180.0 / 3.14159265358979323846;

render::Region region_of(const FramebufferRect& r, int framebuffer_height) {
  // FramebufferRect has GL's bottom-left origin; Region has a top-left one.
  return render::Region{r.x, framebuffer_height - r.y - r.height, r.width, r.height, framebuffer_height};
}

void run_export(Ui& ui) {
  Views& views = *ui.views;
  ViewState& v = views.state;
  const ExportRequest req = *v.export_request;
  v.export_request.reset();
  v.export_failed = true;
  if (!views.renderer) {
    v.export_message = "no renderer: " + views.init_error;
    return;
  }
  render::SceneState st = scene_state(ui, req.width, req.height);
  views.renderer->set_antialiasing(render::Antialiasing::Edges);
  const render::Image image = views.renderer->render_image(st);
  auto written = render::write_png(req.path, image);
  if (!written) {
    v.export_message = written.error().describe();
    return;
  }
  v.export_failed = false;
  v.export_message =
      "wrote " + req.path + " (" + std::to_string(req.width) + "x" + std::to_string(req.height) + ")";
}

}  // namespace

Views::Views() {
  state.camera.distance = kSceneViewDistance;
}
Views::~Views() = default;

ViewState& view_state(Ui& ui) {
  return ui.views->state;
}
const ViewState& view_state(const Ui& ui) {
  return ui.views->state;
}

EulerConvention rings_convention(const Ui& ui) {
  return view_state(ui).rings_convention.value_or(ui.doc.convention().house.euler.convention);
}

render::SceneState scene_state(const Ui& ui, int width_px, int height_px) {
  const ViewState& v = view_state(ui);
  render::SceneState st;
  st.world_R_body = ui.shown_pose.value_or(ui.doc.pose());  // a Compare preview shows without committing
  if (v.show_ghost) st.ghost_world_R_body = ui.doc.state().world_R_reference;
  st.model = v.model;
  st.camera = v.camera;
  const HouseConvention& house = ui.doc.convention().house;
  st.world = render::parse_world_frame(frame_preset_name(house.world, FrameRole::World))
                 .value_or(render::WorldFrame::enu());
  st.body = render::parse_body_frame(frame_preset_name(house.body, FrameRole::Body))
                .value_or(render::BodyFrame::flu());
  st.width_px = width_px;
  st.height_px = height_px;
  return st;
}

const render::Mesh* scene_mesh(const Ui& ui) {
  const Views& views = *ui.views;
  return views.renderer ? &views.renderer->mesh(views.state.model) : nullptr;
}

void views_init(Ui& ui) {
  Views& views = *ui.views;
  views.init_error.clear();
  auto r = render::SceneRenderer::create();
  if (r) {
    views.renderer = std::move(r.value());
  } else {
    views.init_error = r.error().describe();
  }
}

void views_shutdown(Ui& ui) {
  ui.views->renderer.reset();
}

std::vector<FramebufferRect> views_plan(Ui& ui, DamageGrid& damage, bool compare) {
  Views& views = *ui.views;
  ViewState& v = views.state;
  render::SceneRenderer* renderer = views.renderer.get();
  std::vector<FramebufferRect> regions;
  for (Views::Shown& sh : views.shown) sh.planned = false;
  if (!renderer) return regions;
  if (v.pending_user_mesh) {
    renderer->set_user_mesh(*v.pending_user_mesh);
    v.pending_user_mesh.reset();
  }
  if (v.export_request) run_export(ui);
  // While something moves, draw without the smoothing pass (it costs on llvmpipe and a moving
  // picture does not need it); the settled frame after the motion is smoothed.
  // A pose that changed this frame and the last (a scrub, a play, a teaching step, a
  // drag) is moving too; a single change (a typed number, a nudge) is smoothed at once.
  const Eigen::Quaterniond pose = ui.shown_pose.value_or(ui.doc.pose()).quaternion();
  const bool pose_changed = pose.coeffs() != views.last_pose.coeffs();
  const bool moving = v.drag != DragMode::None || ui.spinning || (pose_changed && views.pose_changed_before);
  views.pose_changed_before = pose_changed;
  views.last_pose = pose;
  renderer->set_antialiasing(moving ? render::Antialiasing::None : render::Antialiasing::Edges);
  v.smoothed = !moving;
  auto plan = [&](int slot, const FramebufferRect& rect, const render::SceneState& st) {
    Views::Shown& sh = views.shown[slot];
    const FramebufferRect was = sh.shown_rect;
    const bool moved =
        was.x != rect.x || was.y != rect.y || was.width != rect.width || was.height != rect.height;
    // Where the view was and is no more, its picture must be painted over.
    if (moved) damage.mark(was);
    if (rect.empty()) {
      sh.shown_rect = {};  // gone from the window: shown whole when it comes back
      return;
    }
    sh.planned = true;
    sh.rect = rect;
    regions.push_back(rect);
    const render::RegionPart part = renderer->prepare(st, rect.width, rect.height, slot, compare);
    if (moved) {
      damage.mark(rect);
    } else if (!part.empty()) {
      damage.mark({rect.x + part.x, rect.y + part.y, part.width, part.height});
    }
  };
  {
    render::SceneState st = scene_state(ui, ui.scene_viewport.width, ui.scene_viewport.height);
    apply_teaching_overlay(ui, &st);
    apply_chain_overlay(ui, &st);
    plan(0, ui.scene_viewport, st);
  }
  {
    render::SceneState st = scene_state(ui, ui.gimbal_viewport.width, ui.gimbal_viewport.height);
    st.ghost_world_R_body.reset();
    st.camera.target = Eigen::Vector3d::Zero();
    st.camera.distance = kRingsViewDistance;
    st.rings = to_euler(ui.doc.pose(), rings_convention(ui));
    st.show_world_triad = false;
    st.show_grid = false;
    plan(1, ui.gimbal_viewport, st);
  }
  return regions;
}

void views_draw(Ui& ui, const DamageGrid& damage) {
  Views& views = *ui.views;
  render::SceneRenderer* renderer = views.renderer.get();
  if (!renderer) return;
  const ImGuiIO& io = ImGui::GetIO();
  const int fb_h = static_cast<int>(std::lround(io.DisplaySize.y * io.DisplayFramebufferScale.y));
  for (int slot = 0; slot < 2; ++slot) {
    Views::Shown& sh = views.shown[slot];
    if (!sh.planned) continue;
    const FramebufferRect dirty = damage.dirty_bounds(sh.rect);
    if (dirty.empty()) continue;
    renderer->present(slot, region_of(sh.rect, fb_h),
                      {dirty.x - sh.rect.x, dirty.y - sh.rect.y, dirty.width, dirty.height});
    sh.shown_rect = sh.rect;
  }
}

nlohmann::json views_dump(const Ui& ui) {
  const ViewState& v = view_state(ui);
  nlohmann::json j;
  j["camera"] = {{"azimuth_deg", v.camera.azimuth_rad * kDegPerRad},
                 {"elevation_deg", v.camera.elevation_rad * kDegPerRad},
                 {"distance", v.camera.distance},
                 {"target", {v.camera.target.x(), v.camera.target.y(), v.camera.target.z()}}};
  j["model"] = v.model.user_mesh ? v.user_mesh_name : render::model_info(v.model.kind).name;
  j["ghost"] = v.show_ghost;
  j["smoothed"] = v.smoothed;
  const EulerConvention c = rings_convention(ui);
  j["rings"] = {
      {"sequence", c.sequence()},
      {"kind", c.kind_name()},
      {"margin_deg", v.shown_margin_deg},
      {"condition_number", std::isfinite(v.shown_condition_number) ? nlohmann::json(v.shown_condition_number)
                                                                   : nlohmann::json("inf")}};
  j["export"] = {{"message", v.export_message}, {"failed", v.export_failed}};
  j["renderer"] = ui.views->renderer ? "ok" : ui.views->init_error;
  return j;
}

#else

Views::Views() = default;
Views::~Views() = default;
void views_init(Ui& ui) {
  (void)ui;
}
void views_shutdown(Ui& ui) {
  (void)ui;
}
std::vector<FramebufferRect> views_plan(Ui& ui, DamageGrid& damage, bool compare) {
  (void)ui;
  (void)damage;
  (void)compare;
  return {};
}
void views_draw(Ui& ui, const DamageGrid& damage) {
  (void)ui;
  (void)damage;
}
nlohmann::json views_dump(const Ui& ui) {
  (void)ui;
  return nullptr;
}

#endif

}  // namespace attiscope::gui
