// panel_gimbal.cpp: the Gimbal rings panel: the rings' convention (the house Euler
// convention, or any of the 24), the lock margin and the Euler-rate condition number of the
// pose in it (from core: to_euler, euler_rate_matrix, condition_number), a warning near
// lock, the rings view, and the margin of the pose in all 24 conventions (render's
// margin_table), coloured on the lock-margin scale; clicking a cell picks that convention.
// The rings view's region is reported in ui.gimbal_viewport; views.cpp draws the rings
// straight into it before ImGui draws.
#include <algorithm>
#include <cmath>
#include <cstdio>

#include "gui/ui.hpp"
#include "gui/views.hpp"

#ifdef ATTISCOPE_HAS_RENDER
#include "attiscope/core/euler.hpp"
#include "attiscope/render/gimbal.hpp"
#endif

namespace attiscope::gui {

namespace {

void report_region(Ui& ui, ImVec2 size) {
  const ImVec2 min = ImGui::GetCursorScreenPos();
  size.x = std::max(1.0f, size.x);
  size.y = std::max(1.0f, size.y);
  ui.gimbal_viewport = to_framebuffer_rect(min, ImVec2(min.x + size.x, min.y + size.y));
  ImGui::Dummy(size);
  record_widget(ui, "gimbal.region");
}

#ifdef ATTISCOPE_HAS_RENDER

constexpr double kDegPerRad = 180.0 / 3.14159265358979323846;

ImVec4 to_imgui(const Eigen::Vector3f& c, float a = 1.0f) {
  return ImVec4(c.x(), c.y(), c.z(), a);
}

void convention_combo(Ui& ui, ViewState& v) {
  const EulerConvention current = rings_convention(ui);
  const std::string house = "house: " + ui.doc.convention().house.euler.convention.name();
  const std::string preview = v.rings_convention ? current.name() : house;
  ImGui::SetNextItemWidth(std::min(ImGui::GetContentRegionAvail().x, 13.0f * ImGui::GetFontSize()));
  if (ImGui::BeginCombo("##rings_convention", preview.c_str())) {
    if (ImGui::Selectable(house.c_str(), !v.rings_convention)) v.rings_convention.reset();
    record_widget(ui, "gimbal.convention.house");
    for (const EulerConvention& c : all_euler_conventions()) {
      if (ImGui::Selectable(c.name().c_str(), v.rings_convention && *v.rings_convention == c))
        v.rings_convention = c;
      record_widget(ui, "gimbal.convention." + c.sequence() + "." + c.kind_name());
    }
    ImGui::EndCombo();
  }
  record_widget(ui, "gimbal.convention");
  if (ImGui::IsItemHovered()) ImGui::SetTooltip("the Euler convention the rings are set in");
}

/// The margin of the pose in all 24 conventions: one row per sequence, intrinsic and
/// extrinsic side by side.
void margin_table_view(Ui& ui, ViewState& v) {
  const auto rows = render::margin_table(ui.doc.pose());
  const EulerConvention current = rings_convention(ui);
  const float em = ImGui::GetFontSize();
  const float cell_w = 3.4f * em;
  ImGui::PushFont(ui.mono);
  ImGui::PushStyleVar(ImGuiStyleVar_ItemSpacing, ImVec2(ImGui::GetStyle().ItemSpacing.x, 0.15f * em));
  ImGui::TextDisabled("    intrinsic extrinsic");
  for (std::size_t i = 0; i < 12; ++i) {
    ImGui::TextUnformatted(rows[i].convention.sequence().c_str());
    for (std::size_t k = 0; k < 2; ++k) {
      const render::MarginRow& row = rows[i + 12 * k];
      ImGui::SameLine();
      ImGui::ColorButton(
          ("##swatch" + std::to_string(i + 12 * k)).c_str(), to_imgui(render::margin_color(row.margin_deg)),
          ImGuiColorEditFlags_NoTooltip | ImGuiColorEditFlags_NoDragDrop, ImVec2(0.7f * em, 0.7f * em));
      ImGui::SameLine(0.0f, 0.3f * em);
      char label[48];
      std::snprintf(label, sizeof label, "%5.1f%s##m%zu", row.margin_deg, row.in_warning_band ? "!" : " ",
                    i + 12 * k);
      if (row.in_warning_band) ImGui::PushStyleColor(ImGuiCol_Text, ImVec4(1.0f, 0.55f, 0.45f, 1.0f));
      if (ImGui::Selectable(label, row.convention == current, 0, ImVec2(cell_w, 0.0f)))
        v.rings_convention = row.convention;
      if (row.in_warning_band) ImGui::PopStyleColor();
      record_widget(ui, "gimbal.table." + row.convention.sequence() + "." + row.convention.kind_name());
      if (ImGui::IsItemHovered())
        ImGui::SetTooltip("%s: lock margin %.2f deg, Euler-rate condition %.3g",
                          row.convention.name().c_str(), row.margin_deg, row.rate_condition_number);
    }
  }
  ImGui::PopStyleVar();
  ImGui::PopFont();
}

#endif

}  // namespace

void draw_gimbal_panel(Ui& ui) {
#ifdef ATTISCOPE_HAS_RENDER
  ViewState& v = view_state(ui);
  convention_combo(ui, v);
  const EulerConvention c = rings_convention(ui);
  const EulerAngles e = to_euler(ui.doc.pose(), c);
  const double margin_deg = e.lock_margin_rad * kDegPerRad;
  const double cond = condition_number(euler_rate_matrix(c, e.angles_rad));
  v.shown_margin_deg = margin_deg;
  v.shown_condition_number = cond;
  ImGui::ColorButton("##margin_swatch", to_imgui(render::margin_color(margin_deg)),
                     ImGuiColorEditFlags_NoTooltip | ImGuiColorEditFlags_NoDragDrop);
  ImGui::SameLine();
  ImGui::PushFont(ui.mono);
  char numbers[96];
  if (std::isfinite(cond))
    std::snprintf(numbers, sizeof numbers, "lock margin %.2f deg   rate cond %.3g", margin_deg, cond);
  else
    std::snprintf(numbers, sizeof numbers, "lock margin %.2f deg   rate cond inf", margin_deg);
  ImGui::TextUnformatted(numbers);
  ImGui::PopFont();
  record_widget(ui, "gimbal.numbers");
  if (ImGui::IsItemHovered())
    ImGui::SetTooltip(
        "lock margin: how far the middle angle is from gimbal lock in %s\n"
        "cond: condition number of the Euler-rate matrix (body rates from angle rates);\n"
        "it grows without bound as the margin goes to zero",
        c.name().c_str());
  if (e.at_lock || margin_deg <= render::kMarginWarningDeg) {
    ImGui::PushStyleColor(ImGuiCol_Text, ImVec4(1.0f, 0.50f, 0.42f, 1.0f));
    ImGui::TextWrapped(e.at_lock ? "AT GIMBAL LOCK in %s: outer and inner axes coincide; the third angle is "
                                   "set to 0 and the first carries the free turn."
                                 : "NEAR GIMBAL LOCK in %s: outer and inner rings almost align; angle "
                                   "rates grow without bound. Pick a safer convention in the table.",
                       c.name().c_str());
    ImGui::PopStyleColor();
    record_widget(ui, "gimbal.warning");
  }
  // Rings on the left, the 24-convention table on the right (beside it when there is room).
  const float em = ImGui::GetFontSize();
  const ImVec2 avail = ImGui::GetContentRegionAvail();
  const ImGuiStyle& style = ImGui::GetStyle();
  ImGui::PushFont(ui.mono);
  const float seq_w = ImGui::CalcTextSize("XYZ").x;
  ImGui::PopFont();
  const float table_w = seq_w + 2.0f * (3.4f * em + 0.7f * em + 0.3f * em + style.ItemSpacing.x) +
                        style.ScrollbarSize + style.ItemSpacing.x;
  if (avail.x > table_w + 8.0f * em) {
    report_region(ui, ImVec2(avail.x - table_w - ImGui::GetStyle().ItemSpacing.x, avail.y));
    ImGui::SameLine();
    ImGui::BeginChild("margin_table", ImVec2(table_w, avail.y), false, ImGuiWindowFlags_NoBackground);
    margin_table_view(ui, v);
    ImGui::EndChild();
  } else {
    report_region(ui, ImVec2(avail.x, std::max(avail.y * 0.6f, 1.0f)));
    ImGui::BeginChild("margin_table", ImVec2(avail.x, 0.0f), false, ImGuiWindowFlags_NoBackground);
    margin_table_view(ui, v);
    ImGui::EndChild();
  }
#else
  report_region(ui, ImGui::GetContentRegionAvail());
#endif
}

}  // namespace attiscope::gui
