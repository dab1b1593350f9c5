// panel_finder.cpp: the Finder panel: two paste boxes, the interpretations under which
// they are one rotation (core/finder.hpp) ranked by residual, "apply as house convention"
// for a match; and the gravity test of a resting accelerometer log given by path.
#include <algorithm>
#include <cstdio>
#include <fstream>
#include <sstream>

#include "attiscope/core/finder.hpp"
#include "attiscope/core/text.hpp"
#include "gui/ui.hpp"

namespace attiscope::gui {

namespace {

constexpr std::size_t kBoxCapacity = 2048;
constexpr double kDegPerRad = 180.0 / 3.14159265358979323846;

bool text_box(const char* label, std::string* text, float height) {
  std::string buffer = *text;
  buffer.resize(kBoxCapacity, '\0');
  if (ImGui::InputTextMultiline(label, buffer.data(), buffer.size(), ImVec2(-1.0f, height))) {
    *text = std::string(buffer.c_str());
    return true;
  }
  return false;
}

/// The house convention with the interpretation's choices taken over (what it does not
/// say stays as it was).
HouseConvention with_interpretation(HouseConvention c, const Interpretation& i) {
  if (i.euler) c.euler.convention = *i.euler;
  if (i.unit) c.euler.unit = *i.unit;
  if (i.print_order) c.euler.print_order = *i.print_order;
  if (i.quaternion) c.quaternion = *i.quaternion;
  if (i.matrix) c.matrix = *i.matrix;
  return c;
}

}  // namespace

void draw_finder_panel(Ui& ui) {
  FinderPanelState& f = ui.finder;
  const float h = 2.6f * ImGui::GetFontSize();
  ImGui::TextUnformatted("A (what one program printed)");
  if (text_box("##a", &f.a, h)) f.dirty = true;
  record_widget(ui, "finder.a");
  ImGui::TextUnformatted("B (the same rotation from another)");
  if (text_box("##b", &f.b, h)) f.dirty = true;
  record_widget(ui, "finder.b");
  if (f.dirty) {
    f.dirty = false;
    f.error.clear();
    f.result.reset();
    auto a = scan_values(f.a, "A");
    auto b = scan_values(f.b, "B");
    if (!a || !b) {
      f.error = (!a ? a.error() : b.error()).describe();
    } else if (!a.value().empty() && !b.value().empty()) {
      FinderOptions o;
      o.house = ui.doc.convention().house;  // the house breaks ties
      auto r = find_conventions(a.value(), b.value(), o);
      if (r) {
        f.result = r.value();
      } else {
        f.error = r.error().describe();
      }
    }
  }
  if (!f.error.empty()) ImGui::TextColored(ImVec4(1.0f, 0.45f, 0.4f, 1.0f), "%s", f.error.c_str());
  if (f.result) {
    const FinderResult& r = *f.result;
    const auto& rows = r.matches.empty() ? r.nearest : r.matches;
    ImGui::Text("%s: %s", r.mode.c_str(),
                r.matches.empty() ? "no interpretation agrees; the closest" : "interpretations that agree");
    for (std::size_t k = 0; k < rows.size(); ++k) {
      ImGui::Text("%zu. %.4g deg  %s", k + 1, rows[k].residual_rad * kDegPerRad,
                  rows[k].interpretation.describe().c_str());
      if (!r.matches.empty()) {
        ImGui::SameLine();
        if (ImGui::SmallButton(("apply as house convention##" + std::to_string(k)).c_str())) {
          DisplayConvention d = ui.doc.convention();
          d.house = with_interpretation(d.house, rows[k].interpretation);
          auto ok = validate_convention(d.house);
          if (ok) ui.doc.set_convention(d);
        }
        record_widget(ui, "finder.apply." + std::to_string(k));
      }
    }
    for (const std::string& n : r.notes) ImGui::TextDisabled("note: %s", n.c_str());
  }

  ImGui::Separator();
  ImGui::TextUnformatted("Gravity test: a log of resting samples, \"ax ay az\" then the pose");
  std::string path = f.gravity_path;
  path.resize(kBoxCapacity, '\0');
  ImGui::SetNextItemWidth(-8.0f * ImGui::GetFontSize());
  if (ImGui::InputText("##gravity", path.data(), path.size())) f.gravity_path = std::string(path.c_str());
  record_widget(ui, "finder.gravity_path");
  ImGui::SameLine();
  if (ImGui::Button("Run test")) {
    f.gravity_error.clear();
    f.gravity.reset();
    std::ifstream in(f.gravity_path);
    if (!in) {
      f.gravity_error = "cannot read " + f.gravity_path;
    } else {
      std::stringstream text;
      text << in.rdbuf();
      auto samples = parse_gravity_log(text.str());
      if (!samples) {
        f.gravity_error = f.gravity_path + ": " + samples.error().describe();
      } else {
        // An accelerometer at rest reads the reaction to gravity: it points up (common practice).
        // Up in the house's world frame: ENU's +z written in the house world axes.
        const HouseConvention& house = ui.doc.convention().house;
        Eigen::Vector3d up_world(0, 0, 1);
        if (auto m = reference_R_frame(house.world, FrameRole::World))
          up_world = m.value().transpose() * up_world;
        auto r = gravity_test(samples.value(), up_world, house);
        if (r) {
          f.gravity = r.value();
        } else {
          f.gravity_error = r.error().describe();
        }
      }
    }
  }
  record_widget(ui, "finder.gravity_run");
  if (!f.gravity_error.empty())
    ImGui::TextColored(ImVec4(1.0f, 0.45f, 0.4f, 1.0f), "%s", f.gravity_error.c_str());
  if (f.gravity) {
    const std::size_t shown = std::min<std::size_t>(f.gravity->ranked.size(), 8);
    for (std::size_t k = 0; k < shown; ++k) {
      const GravityMatch& m = f.gravity->ranked[k];
      ImGui::Text("%zu. worst %.3g deg, spread %.3g deg  %s", k + 1, m.worst_deg, m.spread_deg,
                  m.interpretation.describe().c_str());
    }
    for (const std::string& n : f.gravity->notes) ImGui::TextDisabled("note: %s", n.c_str());
  }
}

}  // namespace attiscope::gui
