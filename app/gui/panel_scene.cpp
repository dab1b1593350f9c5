// panel_scene.cpp: the Scene panel. It leaves its client region empty and reports it, in
// framebuffer pixels, in ui.scene_viewport; before ImGui draws, the window draws the 3D
// view straight into that viewport (no offscreen copy, no ImGui::Image).
#include <algorithm>

#include "gui/ui.hpp"

namespace attiscope::gui {

void draw_scene_panel(Ui& ui) {
  const ImVec2 min = ImGui::GetCursorScreenPos();
  const ImVec2 avail = ImGui::GetContentRegionAvail();
  const ImVec2 max(min.x + std::max(0.0f, avail.x), min.y + std::max(0.0f, avail.y));
  ui.scene_viewport = to_framebuffer_rect(min, max);
  ImGui::Dummy(ImVec2(std::max(1.0f, avail.x), std::max(1.0f, avail.y)));
  record_widget(ui, "scene.region");
}

}  // namespace attiscope::gui
