// shortcuts.cpp: the window's keyboard shortcuts. Text fields keep their own keys: while
// one is active, Ctrl+Z undoes typing in it and Ctrl+V pastes into it.
#include <GLFW/glfw3.h>

#include "gui/ui.hpp"

namespace attiscope::gui {

namespace {
constexpr double kRadPerDeg = 3.14159265358979323846 / 180.0;
}

void handle_shortcuts(Ui& ui) {
  const ImGuiIO& io = ImGui::GetIO();
  if (io.WantTextInput) return;
  Document& doc = ui.doc;
  if (io.KeyCtrl) {
    if (ImGui::IsKeyPressed(GLFW_KEY_Z, false)) io.KeyShift ? doc.redo() : doc.undo();
    if (ImGui::IsKeyPressed(GLFW_KEY_Y, false)) doc.redo();
    if (ImGui::IsKeyPressed(GLFW_KEY_V, false)) {
      const char* clip = ImGui::GetClipboardText();
      ui.intake_text = clip ? clip : "";
      ui.focus_intake = true;
    }
    return;
  }
  // ',' and '.' step the Track panel's timeline one sample (Left/Right too, in the panel).
  if (ImGui::IsKeyPressed(GLFW_KEY_COMMA)) step_track(ui, -1);
  if (ImGui::IsKeyPressed(GLFW_KEY_PERIOD)) step_track(ui, 1);
  const double step = ui.settings.nudge_step_deg * kRadPerDeg * (io.KeyShift ? -1.0 : 1.0);
  const bool body = !io.KeyAlt;
  if (ImGui::IsKeyPressed(GLFW_KEY_X)) doc.nudge(Axis::X, step, body);
  if (ImGui::IsKeyPressed(GLFW_KEY_Y)) doc.nudge(Axis::Y, step, body);
  if (ImGui::IsKeyPressed(GLFW_KEY_Z)) doc.nudge(Axis::Z, step, body);
}

}  // namespace attiscope::gui
