// panel_scene.cpp: the Scene panel: a row of controls (model, reference ghost, preset
// views, PNG export) above the 3D view. The view's region is reported, in framebuffer
// pixels, in ui.scene_viewport; before ImGui draws, views.cpp draws the scene straight
// into that viewport (no offscreen copy, no ImGui::Image).
//
// Mouse: a left drag that starts on the body turns it with the arcball (one undoable
// document edit per drag); a left drag off the body, or a right drag, orbits the camera; a
// middle drag (or Shift + right drag) pans; the wheel zooms. Keys 1-7 (with the pointer
// over the view) pick the preset views front, back, left, right, top, bottom, iso.
#include <GLFW/glfw3.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdlib>
#include <ctime>
#include <filesystem>

#include "gui/ui.hpp"
#include "gui/views.hpp"

#ifdef ATTISCOPE_HAS_RENDER
#include "attiscope/render/camera.hpp"
#include "attiscope/render/mesh.hpp"
#endif

namespace attiscope::gui {

#ifdef ATTISCOPE_HAS_RENDER

namespace {

/// Camera orbit per pixel of drag.
constexpr double kOrbitRadPerPx = 0.008;
/// Zoom factor per wheel notch.
constexpr double kZoomPerNotch = 0.9;
/// The arcball's sphere, as a multiple of the body's drawn radius (1 scene unit): a little
/// larger than the body, so a drag that starts on it starts inside the sphere.
constexpr double kArcballRadiusScale = 1.25;

const render::ViewPreset kPresets[] = {render::ViewPreset::Front, render::ViewPreset::Back,
                                       render::ViewPreset::Left,  render::ViewPreset::Right,
                                       render::ViewPreset::Top,   render::ViewPreset::Bottom,
                                       render::ViewPreset::Iso};

void set_preset(ViewState& v, render::ViewPreset p) {
  v.camera = render::Camera::preset(p);
  v.camera.distance = kSceneViewDistance;
}

/// The default export path: the user's pictures folder (XDG_PICTURES_DIR, else ~/Pictures)
/// when it exists, else the current folder, with a timestamped name.
std::string default_export_path() {
  namespace fs = std::filesystem;
  std::string dir;
  std::error_code ec;
  if (const char* p = std::getenv("XDG_PICTURES_DIR"); p && *p && fs::is_directory(p, ec)) {
    dir = p;
  } else if (const char* h = std::getenv("HOME"); h && *h && fs::is_directory(fs::path(h) / "Pictures", ec)) {
    dir = (fs::path(h) / "Pictures").string();
  }
  const std::time_t now = std::time(nullptr);
  std::tm tm{};
  localtime_r(&now, &tm);
  char name[64];
  std::strftime(name, sizeof name, "attiscope-%Y%m%d-%H%M%S.png", &tm);
  return dir.empty() ? std::string(name) : (fs::path(dir) / name).string();
}

void model_controls(Ui& ui, ViewState& v, SceneFields& fields) {
  const std::string current = v.model.user_mesh ? v.user_mesh_name : render::model_info(v.model.kind).name;
  ImGui::SetNextItemWidth(8.5f * ImGui::GetFontSize());
  bool open_load = false;
  if (ImGui::BeginCombo("##model", current.c_str())) {
    for (const auto& m : render::model_infos()) {
      if (ImGui::Selectable(m.name, !v.model.user_mesh && v.model.kind == m.kind)) {
        v.model.kind = m.kind;
        v.model.user_mesh = false;
      }
      record_widget(ui, std::string("scene.model.") + m.name);
      if (ImGui::IsItemHovered()) ImGui::SetTooltip("%s", m.summary);
    }
    if (!v.user_mesh_name.empty() && ImGui::Selectable(v.user_mesh_name.c_str(), v.model.user_mesh))
      v.model.user_mesh = true;
    ImGui::Separator();
    if (ImGui::Selectable("load OBJ/STL...")) open_load = true;
    record_widget(ui, "scene.model.load");
    ImGui::EndCombo();
  }
  record_widget(ui, "scene.model");
  if (ImGui::IsItemHovered()) ImGui::SetTooltip("body model");
  if (open_load) ImGui::OpenPopup("load_mesh");
  if (ImGui::BeginPopup("load_mesh")) {
    ImGui::TextUnformatted("OBJ or STL file (written in body coordinates):");
    ImGui::SetNextItemWidth(24.0f * ImGui::GetFontSize());
    const bool enter = ImGui::InputText("##mesh_path", fields.mesh_path, sizeof fields.mesh_path,
                                        ImGuiInputTextFlags_EnterReturnsTrue);
    record_widget(ui, "scene.mesh_path");
    ImGui::SameLine();
    if (ImGui::Button("Load") || enter) {
      auto mesh = render::load_mesh_file(fields.mesh_path);
      if (mesh) {
        v.pending_user_mesh = std::move(mesh.value());
        v.user_mesh_name = std::filesystem::path(fields.mesh_path).filename().string();
        v.model.user_mesh = true;
        fields.mesh_error.clear();
        ImGui::CloseCurrentPopup();
      } else {
        fields.mesh_error = mesh.error().describe();
      }
    }
    record_widget(ui, "scene.mesh_load");
    if (!fields.mesh_error.empty())
      ImGui::TextColored(ImVec4(1.0f, 0.45f, 0.40f, 1.0f), "%s", fields.mesh_error.c_str());
    ImGui::EndPopup();
  }
}

void export_popup(Ui& ui, ViewState& v, SceneFields& fields) {
  if (ImGui::Button("Export PNG...")) {
    std::snprintf(fields.export_path, sizeof fields.export_path, "%s", default_export_path().c_str());
    fields.confirm_overwrite = false;
    ImGui::OpenPopup("export_png");
  }
  record_widget(ui, "scene.export");
  if (!ImGui::BeginPopup("export_png")) return;
  ImGui::TextUnformatted("Export the Scene as a PNG (the picture `attiscope render` makes)");
  ImGui::SetNextItemWidth(26.0f * ImGui::GetFontSize());
  if (ImGui::InputText("path", fields.export_path, sizeof fields.export_path))
    fields.confirm_overwrite = false;
  record_widget(ui, "scene.export_path");
  ImGui::SetNextItemWidth(6.0f * ImGui::GetFontSize());
  ImGui::InputInt("width", &fields.export_w, 0, 0);
  ImGui::SameLine();
  ImGui::SetNextItemWidth(6.0f * ImGui::GetFontSize());
  ImGui::InputInt("height", &fields.export_h, 0, 0);
  fields.export_w = std::clamp(fields.export_w, 16, 8192);
  fields.export_h = std::clamp(fields.export_h, 16, 8192);
  std::error_code ec;
  const bool exists = std::filesystem::exists(fields.export_path, ec);
  const bool empty = fields.export_path[0] == '\0';
  if (exists) {
    ImGui::TextColored(ImVec4(0.95f, 0.70f, 0.30f, 1.0f), "That file exists.");
    ImGui::SameLine();
    ImGui::Checkbox("overwrite it", &fields.confirm_overwrite);
    record_widget(ui, "scene.export_overwrite");
  }
  const bool can_save = !empty && (!exists || fields.confirm_overwrite);
  if (!can_save) ImGui::BeginDisabled();
  if (ImGui::Button("Save")) {
    v.export_request = ExportRequest{fields.export_path, fields.export_w, fields.export_h};
    v.export_message = "exporting...";
    fields.confirm_overwrite = false;
  }
  if (!can_save) ImGui::EndDisabled();
  record_widget(ui, "scene.export_save");
  ImGui::SameLine();
  if (ImGui::Button("Close")) ImGui::CloseCurrentPopup();
  if (!v.export_message.empty()) {
    if (v.export_failed)
      ImGui::TextColored(ImVec4(1.0f, 0.45f, 0.40f, 1.0f), "%s", v.export_message.c_str());
    else
      ImGui::TextDisabled("%s", v.export_message.c_str());
  }
  ImGui::EndPopup();
}

/// Puts the next item on this line when `width` more fits, else on a new line.
void same_line_if_fits(float width, float gap = -1.0f) {
  const ImGuiStyle& st = ImGui::GetStyle();
  const float spacing = gap < 0.0f ? st.ItemSpacing.x : gap;
  const float right = ImGui::GetWindowPos().x + ImGui::GetWindowContentRegionMax().x;
  if (ImGui::GetItemRectMax().x + spacing + width <= right) ImGui::SameLine(0.0f, spacing);
}

float small_button_width(const char* label) {
  return ImGui::CalcTextSize(label, nullptr, true).x + 2.0f * ImGui::GetStyle().FramePadding.x;
}

void view_controls(Ui& ui, ViewState& v, SceneFields& fields) {
  ImGui::SameLine();
  ImGui::Checkbox("Reference", &v.show_ghost);
  record_widget(ui, "scene.ghost");
  if (ImGui::IsItemHovered()) ImGui::SetTooltip("draw the reference pose as a translucent ghost");
  ImGui::SameLine();
  if (ImGui::SmallButton("= current")) ui.doc.set_reference(ui.doc.pose(), "set reference = current");
  record_widget(ui, "scene.set_reference");
  if (ImGui::IsItemHovered()) ImGui::SetTooltip("set the reference pose to the current pose (undoable)");
  for (std::size_t i = 0; i < std::size(kPresets); ++i) {
    const std::string name = render::view_preset_name(kPresets[i]);
    same_line_if_fits(small_button_width(name.c_str()), i == 0 ? ImGui::GetFontSize() : -1.0f);
    if (ImGui::SmallButton(name.c_str())) set_preset(v, kPresets[i]);
    record_widget(ui, "scene.view." + name);
    if (ImGui::IsItemHovered()) ImGui::SetTooltip("view from the world's %s (key %zu)", name.c_str(), i + 1);
  }
  same_line_if_fits(small_button_width("Export PNG...") + ImGui::GetStyle().FramePadding.x,
                    ImGui::GetFontSize());
  export_popup(ui, v, fields);
}

Eigen::Vector2d pixel_in(const ImVec2& region_min) {
  const ImGuiIO& io = ImGui::GetIO();
  return Eigen::Vector2d((io.MousePos.x - region_min.x) * io.DisplayFramebufferScale.x,
                         (io.MousePos.y - region_min.y) * io.DisplayFramebufferScale.y);
}

/// Mouse input on the view region (the invisible button just drawn).
void view_input(Ui& ui, ViewState& v, const ImVec2& region_min) {
  const ImGuiIO& io = ImGui::GetIO();
  const FramebufferRect& r = ui.scene_viewport;
  if (r.empty()) return;
  const Eigen::Vector2d px = pixel_in(region_min);
  if (ImGui::IsItemActivated()) {
    const render::SceneState st = scene_state(ui, r.width, r.height);
    const render::Mesh* mesh = scene_mesh(ui);
    if (ImGui::IsMouseClicked(ImGuiMouseButton_Left) && mesh && render::pick_body(st, *mesh, px)) {
      // The arcball sphere: centred on the body's projected centre, about the body's size.
      const Eigen::Vector3d centre = Eigen::Vector3d::Zero();
      const render::CameraPose cam = render::camera_pose(st.camera, st.world);
      const auto c = render::project_to_pixel(st.camera, st.world, r.width, r.height, centre);
      const auto e =
          render::project_to_pixel(st.camera, st.world, r.width, r.height, centre + cam.world_R_view.col(1));
      ArcballSphere sphere;
      sphere.centre_px = c.pixel;
      sphere.radius_px = std::max(8.0, kArcballRadiusScale * (e.pixel - c.pixel).norm());
      v.arcball = ArcballDrag::begin(sphere, px, ui.doc.pose());
      v.drag = DragMode::Body;
      v.drag_moved = false;
      if (ui.spinning) {
        ui.spinning = false;
        ui.doc.end_motion();
      }
    } else if (ImGui::IsMouseClicked(ImGuiMouseButton_Middle) ||
               (ImGui::IsMouseClicked(ImGuiMouseButton_Right) && io.KeyShift)) {
      v.drag = DragMode::Pan;
    } else {
      v.drag = DragMode::Orbit;
    }
    v.drag_last_px = px;
  }
  if (v.drag != DragMode::None && ImGui::IsItemActive()) {
    const Eigen::Vector2d d = px - v.drag_last_px;
    if (v.drag == DragMode::Body && d.squaredNorm() > 0.0) {
      if (!v.drag_moved) ui.doc.begin_motion("turn by dragging the body");
      v.drag_moved = true;
      const render::CameraPose cam = render::camera_pose(v.camera, scene_state(ui, r.width, r.height).world);
      ui.doc.move_pose(v.arcball.pose_at(px, cam.world_R_view));
      v.drag_last_px = px;
    } else if (v.drag == DragMode::Orbit) {
      v.camera.orbit(-kOrbitRadPerPx * d.x(), kOrbitRadPerPx * d.y());
      v.drag_last_px = px;
    } else if (v.drag == DragMode::Pan) {
      v.camera.pan(scene_state(ui, r.width, r.height).world, d.x(), d.y(), r.height);
      v.drag_last_px = px;
    }
  } else if (v.drag != DragMode::None) {
    if (v.drag == DragMode::Body && v.drag_moved) ui.doc.end_motion();
    v.drag = DragMode::None;
  }
  if (ImGui::IsItemHovered() && io.MouseWheel != 0.0f) v.camera.zoom(std::pow(kZoomPerNotch, io.MouseWheel));
  if ((ImGui::IsItemHovered() || ImGui::IsItemActive()) && !io.WantTextInput && !io.KeyCtrl) {
    for (std::size_t i = 0; i < std::size(kPresets); ++i)
      if (ImGui::IsKeyPressed(GLFW_KEY_1 + static_cast<int>(i), false)) set_preset(v, kPresets[i]);
  }
}

}  // namespace

void draw_scene_panel(Ui& ui) {
  ViewState& v = view_state(ui);
  SceneFields& fields = ui.views->fields;
  model_controls(ui, v, fields);
  view_controls(ui, v, fields);
  if (!fields.mesh_error.empty()) {
    ImGui::TextColored(ImVec4(1.0f, 0.45f, 0.40f, 1.0f), "Model not loaded: %s", fields.mesh_error.c_str());
    ImGui::SameLine();
    if (ImGui::SmallButton("dismiss")) fields.mesh_error.clear();
  }
  const ImVec2 min = ImGui::GetCursorScreenPos();
  const ImVec2 avail = ImGui::GetContentRegionAvail();
  const ImVec2 max(min.x + std::max(0.0f, avail.x), min.y + std::max(0.0f, avail.y));
  ui.scene_viewport = to_framebuffer_rect(min, max);
  ImGui::InvisibleButton("##scene_view", ImVec2(std::max(1.0f, avail.x), std::max(1.0f, avail.y)),
                         ImGuiButtonFlags_MouseButtonLeft | ImGuiButtonFlags_MouseButtonRight |
                             ImGuiButtonFlags_MouseButtonMiddle);
  record_widget(ui, "scene.region");
  view_input(ui, v, min);
}

#else

void draw_scene_panel(Ui& ui) {
  const ImVec2 min = ImGui::GetCursorScreenPos();
  const ImVec2 avail = ImGui::GetContentRegionAvail();
  const ImVec2 max(min.x + std::max(0.0f, avail.x), min.y + std::max(0.0f, avail.y));
  ui.scene_viewport = to_framebuffer_rect(min, max);
  ImGui::Dummy(ImVec2(std::max(1.0f, avail.x), std::max(1.0f, avail.y)));
  record_widget(ui, "scene.region");
}

#endif

}  // namespace attiscope::gui
