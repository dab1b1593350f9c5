// panel_toolbar.cpp: the strip above the panels: house convention, unit, precision,
// undo/redo, reset, nudges, the spin toggle and the UI scale.
#include <algorithm>
#include <cmath>
#include <filesystem>

#include "attiscope/core/convention.hpp"
#include "gui/card_values.hpp"
#include "gui/display_convention.hpp"
#include "gui/ui.hpp"

namespace attiscope::gui {

namespace {

constexpr double kRadPerDeg = 3.14159265358979323846 / 180.0;

/// The house convention selector: the default, the demo files in assets/conventions/ and
/// the recent files. Loading any other file by path is in the House convention panel.
void convention_selector(Ui& ui) {
  const DisplayConvention& current = ui.doc.convention();
  ImGui::SetNextItemWidth(17.0f * ImGui::GetFontSize());
  if (ImGui::BeginCombo("House", current.house.name.c_str())) {
    int index = 0;
    if (ImGui::Selectable("attiscope default (ENU/FLU, Hamilton w x y z, ZYX)", current.path.empty())) {
      ui.doc.set_convention(DisplayConvention{});
      ui.settings.convention_path.clear();
      ui.settings_changed = true;
    }
    record_widget(ui, "convention." + std::to_string(index++));
    std::vector<std::string> files = demo_convention_files();
    for (const std::string& r : ui.settings.recent_conventions) {
      if (std::find(files.begin(), files.end(), r) == files.end()) files.push_back(r);
    }
    for (const std::string& f : files) {
      const std::string label = std::filesystem::path(f).filename().string() + "##" + f;
      if (ImGui::Selectable(label.c_str(), f == current.path)) open_convention(ui, f);
      if (ImGui::IsItemHovered()) ImGui::SetTooltip("%s", f.c_str());
      record_widget(ui, "convention." + std::to_string(index++));
    }
    ImGui::EndCombo();
  }
  record_widget(ui, "convention");
  if (ImGui::IsItemHovered()) {
    ImGui::SetTooltip("world %s, body %s\n%s\nmatrix %s",
                      frame_preset_name(current.house.world, FrameRole::World).c_str(),
                      frame_preset_name(current.house.body, FrameRole::Body).c_str(),
                      current.house.quaternion.describe().c_str(), current.house.matrix.describe().c_str());
  }
}

void nudge_buttons(Ui& ui) {
  const double step = ui.settings.nudge_step_deg * kRadPerDeg;
  const Axis axes[3] = {Axis::X, Axis::Y, Axis::Z};
  const char* names[3] = {"x", "y", "z"};
  for (int frame = 0; frame < 2; ++frame) {
    const bool body = frame == 0;
    ImGui::TextUnformatted(body ? "Turn about body" : "world");
    for (int a = 0; a < 3; ++a) {
      for (int sign = 1; sign >= -1; sign -= 2) {
        ImGui::SameLine();
        const std::string label = std::string(sign > 0 ? "+" : "-") + names[a] + (body ? "##b" : "##w");
        if (ImGui::SmallButton(label.c_str())) ui.doc.nudge(axes[a], sign * step, body);
        record_widget(
            ui, std::string("nudge.") + (body ? "body." : "world.") + (sign > 0 ? "+" : "-") + names[a]);
      }
    }
    ImGui::SameLine();
  }
  ImGui::SetNextItemWidth(5.0f * ImGui::GetFontSize());
  double step_deg = ui.settings.nudge_step_deg;
  if (ImGui::InputDouble("step deg", &step_deg, 0.0, 0.0, "%.3g")) {
    if (std::isfinite(step_deg) && step_deg > 0.0 && step_deg <= 90.0) {
      ui.settings.nudge_step_deg = step_deg;
      ui.settings_changed = true;
    }
  }
}

}  // namespace

void draw_toolbar(Ui& ui) {
  Document& doc = ui.doc;
  convention_selector(ui);
  ImGui::SameLine();
  int unit = doc.convention().house.euler.unit == AngleUnit::Degrees ? 0 : 1;
  if (ImGui::RadioButton("deg", &unit, 0)) doc.set_unit(AngleUnit::Degrees);
  record_widget(ui, "unit.deg");
  ImGui::SameLine();
  if (ImGui::RadioButton("rad", &unit, 1)) doc.set_unit(AngleUnit::Radians);
  record_widget(ui, "unit.rad");
  ImGui::SameLine();
  int digits = doc.convention().house.precision;
  ImGui::SetNextItemWidth(6.0f * ImGui::GetFontSize());
  if (ImGui::InputInt("digits", &digits, 1, 1)) doc.set_precision(digits);
  record_widget(ui, "precision");
  ImGui::SameLine();
  if (!doc.can_undo()) ImGui::BeginDisabled();
  if (ImGui::Button("Undo")) doc.undo();
  if (!doc.can_undo()) ImGui::EndDisabled();
  record_widget(ui, "undo");
  ImGui::SameLine();
  if (!doc.can_redo()) ImGui::BeginDisabled();
  if (ImGui::Button("Redo")) doc.redo();
  if (!doc.can_redo()) ImGui::EndDisabled();
  record_widget(ui, "redo");
  ImGui::SameLine();
  if (ImGui::Button("Identity")) doc.reset_to_identity();
  record_widget(ui, "reset");
  ImGui::SameLine();
  if (ImGui::Checkbox("Spin", &ui.spinning) && !ui.spinning) doc.end_motion();
  record_widget(ui, "spin");
  ImGui::SameLine();
  ImGui::SetNextItemWidth(7.0f * ImGui::GetFontSize());
  float scale = ui.settings.ui_scale;
  ImGui::SliderFloat("UI scale", &scale, 0.75f, 3.0f, "%.2f");
  if (ImGui::IsItemDeactivatedAfterEdit()) {
    ui.settings.ui_scale = scale;
    ui.settings_changed = true;
    ui.rebuild_fonts = true;
  }
  record_widget(ui, "ui_scale");

  nudge_buttons(ui);
  ImGui::SameLine();
  ImGui::TextDisabled("(keys)");
  if (ImGui::IsItemHovered()) {
    ImGui::SetTooltip(
        "x, y, z: turn the body by the step about its own axis\n"
        "Shift+x/y/z: turn back; Alt: about the world's axis\n"
        "Ctrl+Z undo, Ctrl+Shift+Z (or Ctrl+Y) redo\n"
        "Ctrl+V outside a field: paste into the Intake\n"
        "Tab moves between a card's numbers; Enter applies them");
  }
  if (!ui.status.empty()) {
    ImGui::SameLine();
    ImGui::TextUnformatted(ui.status.c_str());
  }
}

}  // namespace attiscope::gui
