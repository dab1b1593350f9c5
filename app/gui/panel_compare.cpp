// panel_compare.cpp: the Compare panel: the document's reference pose against its current
// pose (core's compare_poses), a SLERP slider that previews poses on the shortest path
// between them without changing the document until "Apply", and a box of several poses whose
// mean and spread core's mean_and_spread gives. Copy as text or as the `compare --json` JSON.
#include <cmath>
#include <cstdio>
#include <sstream>

#include "attiscope/core/compare.hpp"
#include "attiscope/core/compare_report.hpp"
#include "attiscope/core/pose_text.hpp"
#include "attiscope/core/representations.hpp"
#include "attiscope/core/vehicle_axes.hpp"
#include "gui/text_field.hpp"
#include "gui/ui.hpp"

namespace attiscope::gui {

namespace {

constexpr double kDegPerRad = 180.0 / 3.14159265358979323846;
constexpr std::size_t kCompareTextCapacity = 1 << 14;

std::string num(double v, int digits) {
  char b[64];
  std::snprintf(b, sizeof b, "%.*g", digits, std::abs(v) < 1e-12 ? 0.0 : v);
  return b;
}
std::string vec(const Eigen::Vector3d& v, int digits) {
  return "(" + num(v.x(), digits) + ", " + num(v.y(), digits) + ", " + num(v.z(), digits) + ")";
}

PoseTextOptions reading_options(const Ui& ui) {
  PoseTextOptions o;
  // As the command line's --convention: bare numbers are read in the house's printed form.
  o.house = ui.doc.convention().house;
  o.reading.euler = o.house->euler.convention;
  o.reading.unit = o.house->euler.unit;
  return o;
}

/// The lines the panel shows, also what "Copy text" copies.
std::vector<std::string> comparison_lines(const Comparison& c, const DisplayConvention& conv,
                                          const std::string& body_code) {
  const int p = conv.house.precision;
  std::vector<std::string> out;
  out.push_back("angle " + num(c.angle_rad * kDegPerRad, p) + " deg");
  const auto qb = c.reference_R_current.quaternion();
  out.push_back("body frame (reference_R_current, world_R_current = world_R_reference * it):");
  out.push_back("  q (w x y z) " + num(qb.w(), p) + " " + num(qb.x(), p) + " " + num(qb.y(), p) + " " +
                num(qb.z(), p));
  out.push_back("  axis in reference body axes " + vec(c.axis_body, p));
  const auto qw = c.world_delta.quaternion();
  out.push_back("world frame (world_delta, world_R_current = it * world_R_reference):");
  out.push_back("  q (w x y z) " + num(qw.w(), p) + " " + num(qw.x(), p) + " " + num(qw.y(), p) + " " +
                num(qw.z(), p));
  out.push_back("  axis in world axes " + vec(c.axis_world, p));
  if (c.named_turns) {
    std::string split = "small-angle split about the body's axes (" + body_code + "):";
    for (const NamedTurn& t : *c.named_turns)
      split += " " + t.turn_name + " " + num(t.angle_rad * kDegPerRad, p) + " deg" +
               (t.sense.empty() ? "" : " (" + t.sense + ")") + ";";
    out.push_back(split);
  } else {
    out.push_back("small-angle split about body x, y, z: " + vec(c.turns_body_rad * kDegPerRad, p) + " deg");
  }
  out.push_back("Euler difference, " + c.euler.convention.name() + ", " + c.euler.convention.kind_name() +
                ": " + vec(c.euler.difference_rad * kDegPerRad, p) + " deg");
  if (!c.euler.note.empty()) out.push_back("  note: " + c.euler.note);
  for (const std::string& w : c.warnings) out.push_back("warning: " + w);
  return out;
}

void reference_controls(Ui& ui) {
  ComparePanelState& st = ui.compare;
  if (ImGui::SmallButton("Set reference = current"))
    ui.doc.set_reference(ui.doc.pose(), "reference = current");
  record_widget(ui, "compare.set_reference");
  ImGui::SameLine();
  if (ImGui::SmallButton("Swap")) {
    ui.doc.set_pose_and_reference(ui.doc.state().world_R_reference, ui.doc.pose(),
                                  "swap reference and current");
  }
  record_widget(ui, "compare.swap");
  ImGui::SetNextItemWidth(-8.0f * ImGui::GetFontSize());
  text_field("##reference_text", st.reference_text, kCompareTextCapacity, false);
  record_widget(ui, "compare.reference_text");
  ImGui::SameLine();
  if (ImGui::SmallButton("Load reference")) {
    const auto pose = read_pose_text(st.reference_text, reading_options(ui));
    if (pose) {
      st.reference_error.clear();
      ui.doc.set_reference(pose.value().rotation, "reference from text (" + pose.value().reading + ")");
    } else {
      st.reference_error = pose.error().describe();
    }
  }
  record_widget(ui, "compare.load_reference");
  if (!st.reference_error.empty())
    ImGui::TextColored(ImVec4(1.0f, 0.45f, 0.4f, 1.0f), "%s", st.reference_error.c_str());
}

void slerp_controls(Ui& ui, const Comparison& c) {
  ComparePanelState& st = ui.compare;
  ImGui::SetNextItemWidth(-10.0f * ImGui::GetFontSize());
  if (ImGui::SliderFloat("##slerp", &st.slerp_t, 0.0f, 1.0f, "SLERP t = %.3f")) st.previewing = true;
  record_widget(ui, "compare.slerp");
  // SLERP (Shoemake 1985) at fraction t: the reference turned by t times the body-frame
  // difference's rotation vector (angle in [0, pi], so the shortest path), as slerp_path does.
  const auto part = from_rotation_vector(c.turns_body_rad * static_cast<double>(st.slerp_t));
  const Rotation preview = part ? c.world_R_reference * part.value() : c.world_R_reference;
  ImGui::SameLine();
  if (ImGui::SmallButton("Apply")) {
    ui.doc.set_pose(preview, "SLERP t = " + num(st.slerp_t, 4));
    st.previewing = false;
    st.slerp_t = 0.0f;
  }
  record_widget(ui, "compare.apply");
  ImGui::SameLine();
  if (ImGui::SmallButton("End preview")) st.previewing = false;
  record_widget(ui, "compare.end_preview");
  if (st.previewing) {
    ui.shown_pose = preview;
    ImGui::TextDisabled(
        "Scene shows the preview (ghost: the reference); the document is unchanged until Apply.");
  }
  ui.panel_state["compare"]["slerp_t"] = st.slerp_t;
  ui.panel_state["compare"]["previewing"] = st.previewing;
  if (st.previewing) ui.panel_state["compare"]["preview"] = quaternion_json(preview);
}

void mean_box(Ui& ui) {
  ComparePanelState& st = ui.compare;
  ImGui::TextUnformatted("Several poses, one per line (repeated measurements):");
  text_field("##poses", st.poses_text, kCompareTextCapacity, true,
             ImVec2(-1.0f, 4.0f * ImGui::GetTextLineHeightWithSpacing()));
  record_widget(ui, "compare.poses");
  std::vector<Rotation> poses;
  std::vector<int> lines;
  std::istringstream in(st.poses_text);
  std::string line;
  int n = 0;
  std::string problem;
  while (std::getline(in, line)) {
    ++n;
    if (line.find_first_not_of(" \t\r") == std::string::npos || line[line.find_first_not_of(" \t\r")] == '#')
      continue;
    const auto pose = read_pose_text(line, reading_options(ui));
    if (!pose) {
      problem = "line " + std::to_string(n) + ": " + pose.error().describe();
      break;
    }
    poses.push_back(pose.value().rotation);
    lines.push_back(n);
  }
  if (!problem.empty()) {
    ImGui::TextColored(ImVec4(1.0f, 0.45f, 0.4f, 1.0f), "%s", problem.c_str());
    ui.panel_state["compare"]["mean_error"] = problem;
    return;
  }
  if (poses.empty()) return;
  const auto ms = mean_and_spread(poses);
  if (!ms) {
    ImGui::TextWrapped("%s", ms.error().describe().c_str());
    return;
  }
  const MeanSpread& m = ms.value();
  const int p = ui.doc.convention().house.precision;
  const auto q = m.mean.quaternion();
  ImGui::Text("%zu poses; mean q (w x y z) %s %s %s %s", poses.size(), num(q.w(), p).c_str(),
              num(q.x(), p).c_str(), num(q.y(), p).c_str(), num(q.z(), p).c_str());
  ImGui::Text("spread: largest %s deg (line %d), RMS %s deg; %zu sign flips aligned",
              num(m.max_rad * kDegPerRad, p).c_str(), lines[m.max_index],
              num(m.rms_rad * kDegPerRad, p).c_str(), m.flipped);
  const nlohmann::json j = mean_spread_json(m, lines);
  if (ImGui::SmallButton("Use mean as current"))
    ui.doc.set_pose(m.mean, "mean of " + std::to_string(poses.size()));
  record_widget(ui, "compare.use_mean");
  ImGui::SameLine();
  if (ImGui::SmallButton("Copy mean JSON")) {
    ImGui::SetClipboardText(j.dump(2).c_str());
    ui.status = "copied the mean and spread as JSON";
  }
  record_widget(ui, "compare.copy_mean");
  ui.panel_state["compare"]["mean"] = j;
}

}  // namespace

void draw_compare_panel(Ui& ui) {
  reference_controls(ui);
  const auto body = parse_vehicle_axes(frame_preset_name(ui.doc.convention().house.body, FrameRole::Body));
  const std::optional<VehicleAxes> names = body ? std::optional<VehicleAxes>(body.value()) : std::nullopt;
  const Comparison c = compare_poses(ui.doc.state().world_R_reference, ui.doc.pose(),
                                     ui.doc.convention().house.euler.convention, names);
  const std::vector<std::string> lines = comparison_lines(
      c, ui.doc.convention(), frame_preset_name(ui.doc.convention().house.body, FrameRole::Body));
  ImGui::Separator();
  if (ui.mono) ImGui::PushFont(ui.mono);
  for (const std::string& l : lines) {
    if (l.rfind("  note:", 0) == 0 || l.rfind("warning:", 0) == 0)
      ImGui::TextColored(ImVec4(1.0f, 0.8f, 0.35f, 1.0f), "%s", l.c_str());
    else
      ImGui::TextWrapped("%s", l.c_str());
  }
  if (ui.mono) ImGui::PopFont();
  std::string text;
  for (const std::string& l : lines) text += l + "\n";
  const nlohmann::json j = comparison_json(c);
  if (ImGui::SmallButton("Copy text")) {
    ImGui::SetClipboardText(text.c_str());
    ui.status = "copied the comparison as text";
  }
  record_widget(ui, "compare.copy_text");
  ImGui::SameLine();
  if (ImGui::SmallButton("Copy JSON")) {
    ImGui::SetClipboardText(j.dump(2).c_str());
    ui.status = "copied the comparison as JSON";
  }
  record_widget(ui, "compare.copy_json");
  ui.panel_state["compare"]["comparison"] = j;
  ui.panel_state["compare"]["text"] = text;
  ImGui::Separator();
  slerp_controls(ui, c);
  ImGui::Separator();
  mean_box(ui);
}

}  // namespace attiscope::gui
