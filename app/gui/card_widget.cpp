// card_widget.cpp: one Readouts card: its numbers as editable fields, its read-only lines,
// its copy buttons, and the defect and nearest rotation of an invalid edit.
#include <algorithm>
#include <cstdio>

#include "gui/card_values.hpp"
#include "gui/ui.hpp"

namespace attiscope::gui {

namespace {

const ImVec4 kProblemColour{0.98f, 0.55f, 0.38f, 1.0f};

// The second convention's chooser: all 24 conventions.
void second_convention_combo(Ui& ui) {
  const EulerConvention current = ui.doc.state().second_euler;
  ImGui::SetNextItemWidth(14.0f * ImGui::GetFontSize());
  if (ImGui::BeginCombo("convention", current.name().c_str())) {
    for (const EulerConvention& c : all_euler_conventions()) {
      if (ImGui::Selectable(c.name().c_str(), c == current)) ui.doc.set_second_euler(c);
    }
    ImGui::EndCombo();
  }
  record_widget(ui, "euler_second.convention");
}

// A read-only line "label:  numbers": the numbers go on the next line when the whole does
// not fit, so a number is never broken at its decimal point.
void info_line(const std::string& line) {
  const auto split = line.find(":  ");
  if (split == std::string::npos || ImGui::CalcTextSize(line.c_str()).x <= ImGui::GetContentRegionAvail().x) {
    ImGui::TextDisabled("%s", line.c_str());
    return;
  }
  ImGui::TextDisabled("%s", line.substr(0, split + 1).c_str());
  ImGui::TextDisabled("  %s", line.substr(split + 3).c_str());
}

bool shows_labels(Card c) {
  return c != Card::Matrix && c != Card::Su2 && c != Card::LeftRight;
}

void copy_buttons(Ui& ui, Card card) {
  const DocumentState& s = ui.doc.state();
  const std::string key = card_key(card);
  if (ImGui::SmallButton("Copy text")) {
    ImGui::SetClipboardText(card_plain_text(card, s).c_str());
    ui.status = "copied " + key + " as text";
  }
  record_widget(ui, key + ".copy_text");
  ImGui::SameLine();
  if (ImGui::SmallButton("JSON")) {
    ImGui::SetClipboardText(card_json(card, s).dump(2).c_str());
    ui.status = "copied " + key + " as JSON";
  }
  record_widget(ui, key + ".copy_json");
  ImGui::SameLine();
  if (ImGui::SmallButton("C++")) {
    ImGui::SetClipboardText(card_code_literal(card, s).c_str());
    ui.status = "copied " + key + " as a C++ literal";
  }
  record_widget(ui, key + ".copy_code");
}

}  // namespace

void draw_card(Ui& ui, Card card) {
  Document& doc = ui.doc;
  const DocumentState& s = doc.state();
  const CardView view = card_view(card, s);
  const std::string key = card_key(card);
  ImGui::PushID(key.c_str());
  if (ui.heading) ImGui::PushFont(ui.heading);
  const bool open = ImGui::CollapsingHeader(view.title.c_str(), ImGuiTreeNodeFlags_DefaultOpen);
  if (ui.heading) ImGui::PopFont();
  record_widget(ui, key + ".header");
  if (!open) {
    ImGui::PopID();
    return;
  }
  copy_buttons(ui, card);
  if (card == Card::EulerSecond) {
    ImGui::SameLine();
    second_convention_combo(ui);
  }

  const CardEdit* edit = doc.edit(card);
  std::vector<double> shown = edit ? edit->numbers : view.numbers;
  const bool labels = shows_labels(card);
  const float spacing = ImGui::GetStyle().ItemSpacing.x;
  const int cols = view.columns;
  float label_w = 0.0f;  // the widest label, so every field of the card gets the same width
  if (labels) {
    if (ui.mono) ImGui::PushFont(ui.mono);
    for (const std::string& l : view.labels) label_w = std::max(label_w, ImGui::CalcTextSize(l.c_str()).x);
    if (ui.mono) ImGui::PopFont();
    label_w += spacing;
  }
  const float field_w =
      std::max(1.0f, (ImGui::GetContentRegionAvail().x - static_cast<float>(cols - 1) * spacing) /
                             static_cast<float>(cols) -
                         label_w);
  char format[16];
  std::snprintf(format, sizeof format, "%%.%dg", s.convention.house.precision);
  bool any_active = false;
  if (ui.mono) ImGui::PushFont(ui.mono);
  if (!view.editable) ImGui::BeginDisabled();
  for (std::size_t i = 0; i < shown.size(); ++i) {
    if (i % static_cast<std::size_t>(cols) != 0) ImGui::SameLine();
    if (labels) {
      ImGui::AlignTextToFramePadding();
      ImGui::TextUnformatted(view.labels[i].c_str());
      ImGui::SameLine(0.0f, 0.0f);
      ImGui::Dummy(ImVec2(label_w - spacing - ImGui::CalcTextSize(view.labels[i].c_str()).x, 1.0f));
      ImGui::SameLine(0.0f, spacing);
    }
    ImGui::SetNextItemWidth(field_w);
    double value = shown[i];
    const std::string id = "##" + std::to_string(i);
    if (ImGui::InputDouble(id.c_str(), &value, 0.0, 0.0, format,
                           ImGuiInputTextFlags_AutoSelectAll | ImGuiInputTextFlags_CharsScientific)) {
      shown[i] = value;
      doc.draft(card, shown);
    }
    any_active = any_active || ImGui::IsItemActive();
    if (!labels && ImGui::IsItemHovered()) ImGui::SetTooltip("%s", view.labels[i].c_str());
    record_widget(ui, key + "." + std::to_string(i));
  }
  if (!view.editable) ImGui::EndDisabled();
  if (ui.mono) ImGui::PopFont();

  // A card's typed numbers are one edit: Tab moves between its fields and keeps the draft
  // (so a quaternion can be typed number by number before it is normalised); Enter, or
  // leaving the card's fields any other way, commits the draft.
  const ImGuiIO& io = ImGui::GetIO();
  const bool tabbing = ImGui::IsKeyPressed(io.KeyMap[ImGuiKey_Tab], false);
  const CardEdit* e = doc.edit(card);
  if (e && !e->invalid && !any_active && !tabbing) {
    const std::vector<double> typed = e->numbers;
    if (typed != view.numbers) {
      const EditCheck check = check_card_edit(card, typed, s);
      if (!check.note.empty()) ui.status = key + ": " + check.note;
      doc.commit(card, typed, check);
    } else {
      doc.discard_edit(card);
    }
  } else if (e && e->invalid && !any_active && !tabbing && e->numbers != e->check_numbers) {
    // Further typing into an invalid card: check the new numbers.
    const std::vector<double> typed = e->numbers;
    doc.commit(card, typed, check_card_edit(card, typed, s));
  }

  edit = doc.edit(card);
  // The read-only lines describe the document's pose; while an invalid edit is shown they
  // would contradict the typed numbers, so the edit's defect takes their place.
  if (!(edit && edit->invalid)) {
    for (const std::string& line : view.info) info_line(line);
  }
  if (edit && edit->invalid) {
    ImGui::PushStyleColor(ImGuiCol_Text, kProblemColour);
    ImGui::TextWrapped("%s", edit->check.problem.c_str());
    ImGui::PopStyleColor();
    ImGui::TextWrapped("The document is unchanged until you choose:");
    if (edit->check.nearest) {
      ImGui::TextDisabled(
          "nearest rotation: %s deg from the current pose",
          format_number(
              geodesic_angle(s.world_R_body, *edit->check.nearest) * angle_scale(AngleUnit::Degrees), 4)
              .c_str());
      if (ImGui::Button("Use nearest rotation")) doc.accept_nearest(card);
      record_widget(ui, key + ".accept_nearest");
      ImGui::SameLine();
    }
    if (ImGui::Button("Discard edit")) doc.discard_edit(card);
    record_widget(ui, key + ".discard");
  }
  ImGui::Spacing();
  ImGui::PopID();
}

}  // namespace attiscope::gui
