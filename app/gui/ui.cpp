// ui.cpp: helpers every panel shares.
#include "gui/ui.hpp"

#include <algorithm>
#include <cmath>

#include "gui/views.hpp"

namespace attiscope::gui {

Ui::Ui(Document& document, Settings& window_settings)
    : doc(document), settings(window_settings), views(std::make_unique<Views>()) {}
Ui::~Ui() = default;

void record_widget(Ui& ui, const std::string& name) {
  const ImVec2 a = ImGui::GetItemRectMin();
  const ImVec2 b = ImGui::GetItemRectMax();
  ui.widgets[name] = ImVec4(a.x, a.y, b.x, b.y);
}

FramebufferRect to_framebuffer_rect(ImVec2 min, ImVec2 max) {
  const ImGuiIO& io = ImGui::GetIO();
  const float sx = io.DisplayFramebufferScale.x;
  const float sy = io.DisplayFramebufferScale.y;
  const float fb_h = io.DisplaySize.y * sy;
  FramebufferRect r;
  r.x = static_cast<int>(std::lround(min.x * sx));
  r.width = std::max(0, static_cast<int>(std::lround((max.x - min.x) * sx)));
  r.height = std::max(0, static_cast<int>(std::lround((max.y - min.y) * sy)));
  r.y = static_cast<int>(std::lround(fb_h - max.y * sy));  // GL's origin is bottom-left
  return r;
}

}  // namespace attiscope::gui
