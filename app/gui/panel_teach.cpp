// panel_teach.cpp: the Teach panel (step-through teaching mode): plays the house
// convention's three elementary turns for the current pose, one at a time, with the
// sentence of each step (core/steps.hpp) in large text. The Scene draws the overlays
// (apply_teaching_overlay).
#include <algorithm>
#include <cmath>

#include "gui/ui.hpp"

namespace attiscope::gui {

void advance_teaching(Ui& ui, double dt_s) {
  TeachState& t = ui.teach;
  if (!t.playing) return;
  t.position = std::min(3.0, t.position + dt_s * std::clamp(t.speed, kTeachMinSpeed, kTeachMaxSpeed));
  if (t.position >= 3.0) t.playing = false;
}

void draw_teach_panel(Ui& ui) {
  TeachState& t = ui.teach;
  if (ImGui::Checkbox("Show on the model", &t.active) && t.active && t.position >= 3.0) t.position = 0.0;
  record_widget(ui, "teach.active");
  ImGui::SameLine();
  if (ImGui::Checkbox("Play the other kind's order", &t.other_kind)) t.position = 0.0;
  record_widget(ui, "teach.other_kind");

  if (ImGui::Button("|<")) {
    t.position = 0.0;
    t.playing = false;
  }
  record_widget(ui, "teach.start");
  ImGui::SameLine();
  if (ImGui::Button("< Step")) {
    t.position = std::max(0.0, std::ceil(t.position) - 1.0);
    t.playing = false;
  }
  record_widget(ui, "teach.back");
  ImGui::SameLine();
  if (ImGui::Button(t.playing ? "Pause" : "Play")) {
    if (!t.playing && t.position >= 3.0) t.position = 0.0;
    t.playing = !t.playing;
    t.active = true;
  }
  record_widget(ui, "teach.play");
  ImGui::SameLine();
  if (ImGui::Button("Step >")) {
    t.position = std::min(3.0, std::floor(t.position) + 1.0);
    t.playing = false;
    t.active = true;
  }
  record_widget(ui, "teach.forward");
  ImGui::SameLine();
  ImGui::SetNextItemWidth(8.0f * ImGui::GetFontSize());
  float speed = static_cast<float>(t.speed);
  if (ImGui::SliderFloat("turns/s", &speed, static_cast<float>(kTeachMinSpeed),
                         static_cast<float>(kTeachMaxSpeed), "%.2f")) {
    t.speed = speed;
  }
  record_widget(ui, "teach.speed");

  const TeachingView v = teaching_view(ui.doc.state(), t);
  ImGui::Text("%s (%s), %s", v.words.name.c_str(), v.steps.convention.name().c_str(),
              t.other_kind ? "the equivalent order of the other kind" : "the house's own order");
  for (int i = 0; i < 3; ++i) {
    const EulerStep& s = v.steps.steps[static_cast<std::size_t>(i)];
    const bool now = i == v.focus;
    if (ui.heading != nullptr && now) ImGui::PushFont(ui.heading);
    if (now) {
      ImGui::TextWrapped("%s", s.sentence.c_str());
    } else {
      ImGui::PushStyleColor(ImGuiCol_Text, ImGui::GetStyle().Colors[ImGuiCol_TextDisabled]);
      ImGui::TextWrapped("%s", s.sentence.c_str());
      ImGui::PopStyleColor();
    }
    if (ui.heading != nullptr && now) ImGui::PopFont();
    record_widget(ui, "teach.sentence." + std::to_string(i));
  }
  if (v.current >= 3) ImGui::TextDisabled("All three turns done: the body is at the pose.");
}

}  // namespace attiscope::gui
