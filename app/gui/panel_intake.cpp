// panel_intake.cpp: the Intake panel: the paste box, and below it what the text can be
// read as. Ctrl+V outside a text field pastes here.
#include <algorithm>

#include "attiscope/core/text.hpp"
#include "gui/ui.hpp"

namespace attiscope::gui {

namespace {

constexpr std::size_t kIntakeCapacity = 1 << 16;

// The one place where the readings of the pasted text are listed. Today: the numbers core
// finds in it (or the error, with line and column) and the explicit readings of core's
// read_explicit, each a button that loads it. The ranked paste reader (core/intake.hpp)
// replaces the body of this function: list its readings best first, each with score and
// reason, and load the chosen one through ui.doc.set_pose.
void list_readings(Ui& ui, const std::string& text) {
  if (text.find_first_not_of(" \t\r\n") == std::string::npos) {
    ImGui::TextDisabled("Paste a pose (Ctrl+V): numbers, a matrix, labelled fields.");
    return;
  }
  const auto numbers = scan_numbers(text);
  if (!numbers) {
    ImGui::TextWrapped("%s", numbers.error().describe().c_str());
    return;
  }
  ImGui::Text("%zu numbers. Read as:", numbers.value().size());
  ExplicitReadingOptions options;
  options.euler = ui.doc.convention().house.euler.convention;
  options.unit = ui.doc.convention().house.euler.unit;
  const ReadingKind kinds[] = {ReadingKind::QuatWxyz,   ReadingKind::QuatXyzw, ReadingKind::MatrixRows,
                               ReadingKind::MatrixCols, ReadingKind::Euler,    ReadingKind::AxisAngle,
                               ReadingKind::RotVec};
  for (ReadingKind kind : kinds) {
    const auto reading = read_explicit(text, kind, options);
    if (!reading) continue;
    const std::string name = reading_kind_name(kind);
    if (ImGui::SmallButton(("Load as " + name).c_str()))
      ui.doc.set_pose(reading.value().rotation, "intake " + name);
    record_widget(ui, "intake." + name);
    for (const std::string& w : reading.value().warnings) {
      ImGui::SameLine();
      ImGui::TextDisabled("%s", w.c_str());
    }
  }
}

}  // namespace

void draw_intake(Ui& ui) {
  if (ui.intake_text.capacity() < kIntakeCapacity) ui.intake_text.reserve(kIntakeCapacity);
  if (ui.focus_intake) {
    ImGui::SetKeyboardFocusHere();
    ui.focus_intake = false;
  }
  // A fixed buffer: ImGui 1.86 edits a char array; the text lives in Ui between frames.
  std::string buffer = ui.intake_text;
  buffer.resize(kIntakeCapacity, '\0');
  const float h = std::max(3.0f * ImGui::GetFontSize(), ImGui::GetContentRegionAvail().y * 0.35f);
  if (ImGui::InputTextMultiline("##paste", buffer.data(), buffer.size(), ImVec2(-1.0f, h))) {
    ui.intake_text = std::string(buffer.c_str());
  }
  record_widget(ui, "intake.text");
  list_readings(ui, ui.intake_text);
}

}  // namespace attiscope::gui
