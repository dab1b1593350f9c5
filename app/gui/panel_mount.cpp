// panel_mount.cpp: the Mount check panel. Nominal mount (text in any representation or mount
// words, or one of the 24 axis-aligned mounts, plus trim turns), measured mount (text in
// either direction, or vector pairs solved by core's Wahba solvers), tolerance and vehicle
// axes; core's run_mount_check gives the result the panel shows, and the same mount_json and
// mount_report_text the command line prints. The caution stays in a strip below the result
// that never scrolls away.
#include <cmath>
#include <cstdio>
#include <ctime>

#include "attiscope/core/atomic_file.hpp"
#include "attiscope/core/chain_layout.hpp"
#include "attiscope/core/mount.hpp"
#include "attiscope/core/mount_report.hpp"
#include "attiscope/core/mount_setup.hpp"
#include "attiscope/core/wahba.hpp"
#include "gui/chain_view.hpp"
#include "gui/text_field.hpp"
#include "gui/ui.hpp"

#ifdef ATTISCOPE_HAS_RENDER
#include "attiscope/render/chain_overlay.hpp"
#include "attiscope/render/mount_picture.hpp"
#include "gui/views.hpp"
#endif

namespace attiscope::gui {

namespace {

constexpr double kDegPerRad = 180.0 / 3.14159265358979323846;
constexpr std::size_t kMountTextCapacity = 1 << 14;
const ImVec4 kPassColour(0.35f, 0.85f, 0.45f, 1.0f);
const ImVec4 kFailColour(1.0f, 0.35f, 0.3f, 1.0f);
const ImVec4 kProblemColour(1.0f, 0.45f, 0.4f, 1.0f);
const ImVec4 kCautionColour(1.0f, 0.8f, 0.35f, 1.0f);
/// The pass/fail word is drawn this many times the text size.
constexpr float kVerdictScale = 2.0f;

std::string num(double v, int digits) {
  char b[64];
  std::snprintf(b, sizeof b, "%.*g", digits, std::abs(v) < 1e-12 ? 0.0 : v);
  return b;
}

std::string utc_now() {
  const std::time_t t = std::time(nullptr);
  std::tm tm{};
  gmtime_r(&t, &tm);
  char b[40];
  std::strftime(b, sizeof b, "%Y-%m-%d %H:%M:%S UTC", &tm);
  return b;
}

/// The inputs as typed, turned into core's MountInputs; errors name the field and place.
struct Gathered {
  std::optional<VehicleAxes> names;
  std::vector<std::string> problems;
  std::optional<MountInputs> inputs;
};

Gathered gather(const Ui& ui) {
  const MountPanelState& st = ui.mount;
  Gathered g;
  const auto axes = parse_vehicle_axes(st.axes_code);
  if (!axes) {
    g.problems.push_back("vehicle axes: " + axes.error().describe());
    return g;
  }
  g.names = axes.value();
  MountInputs in;
  in.names = axes.value();
  in.tolerance_rad = static_cast<double>(st.tolerance_deg) / kDegPerRad;
  PoseTextOptions options;
  options.reading.euler = ui.doc.convention().house.euler.convention;
  options.reading.unit = ui.doc.convention().house.euler.unit;

  // The nominal mount.
  if (st.nominal_from_list) {
    const std::vector<AxisAlignedMount> all = axis_aligned_mounts(in.names);
    const AxisAlignedMount& m = all[static_cast<std::size_t>(std::clamp(st.aligned_index, 0, 23))];
    in.nominal = MountReading{m.vehicle_R_sensor, "axis-aligned \"" + m.name + "\"", {}, {}, true};
  } else if (st.nominal_text.find_first_not_of(" \t\r\n") != std::string::npos) {
    auto m = read_mount_text(st.nominal_text, options, in.names, false);
    if (m)
      in.nominal = m.value();
    else
      g.problems.push_back("nominal: " + m.error().describe());
  }
  const Eigen::Vector3d trim_deg(st.trim_deg[0], st.trim_deg[1], st.trim_deg[2]);
  if (in.nominal && trim_deg.norm() > 0.0) {
    in.nominal->vehicle_R_sensor = trimmed_mount(in.nominal->vehicle_R_sensor, trim_deg / kDegPerRad);
    in.nominal->description += ", trimmed by (" + num(trim_deg(0), 6) + ", " + num(trim_deg(1), 6) + ", " +
                               num(trim_deg(2), 6) + ") degrees about vehicle x, y, z";
  }

  // The measured mount.
  if (st.use_vectors) {
    auto pairs = parse_vector_pairs(st.vectors_text);
    if (pairs) {
      in.vectors = pairs.value();
      in.vectors_source = "the vector box";
    } else {
      g.problems.push_back("vector box: " + pairs.error().describe());
    }
  } else if (st.measured_text.find_first_not_of(" \t\r\n") != std::string::npos) {
    auto m = read_mount_text(st.measured_text, options, in.names, st.measured_vehicle_to_sensor);
    if (m)
      in.measured = m.value();
    else
      g.problems.push_back("measured: " + m.error().describe());
  }
  if (g.problems.empty() && (in.measured || in.vectors)) g.inputs = in;
  return g;
}

void nominal_inputs(Ui& ui, const VehicleAxes& names) {
  MountPanelState& st = ui.mount;
  ImGui::TextUnformatted("Nominal mount (the drawing), vehicle_R_sensor:");
  if (ImGui::RadioButton("text", !st.nominal_from_list)) st.nominal_from_list = false;
  record_widget(ui, "mount.nominal_as_text");
  ImGui::SameLine();
  if (ImGui::RadioButton("axis-aligned", st.nominal_from_list)) st.nominal_from_list = true;
  record_widget(ui, "mount.nominal_from_list");
  if (st.nominal_from_list) {
    const std::vector<AxisAlignedMount> all = axis_aligned_mounts(names);
    st.aligned_index = std::clamp(st.aligned_index, 0, static_cast<int>(all.size()) - 1);
    ImGui::SetNextItemWidth(-1.0f);
    if (ImGui::BeginCombo("##aligned", all[static_cast<std::size_t>(st.aligned_index)].name.c_str())) {
      for (int i = 0; i < static_cast<int>(all.size()); ++i) {
        if (ImGui::Selectable(all[static_cast<std::size_t>(i)].name.c_str(), i == st.aligned_index))
          st.aligned_index = i;
      }
      ImGui::EndCombo();
    }
    record_widget(ui, "mount.aligned");
  } else {
    ImGui::SetNextItemWidth(-1.0f);
    text_field("##nominal", st.nominal_text, kMountTextCapacity, false);
    record_widget(ui, "mount.nominal");
  }
  ImGui::SetNextItemWidth(-8.0f * ImGui::GetFontSize());
  ImGui::InputFloat3("trim deg (vehicle x y z)", st.trim_deg.data(), "%.3f");
  record_widget(ui, "mount.trim");
}

void measured_inputs(Ui& ui) {
  MountPanelState& st = ui.mount;
  ImGui::TextUnformatted("Measured mount:");
  if (ImGui::RadioButton("reading", !st.use_vectors)) st.use_vectors = false;
  record_widget(ui, "mount.measured_as_text");
  ImGui::SameLine();
  if (ImGui::RadioButton("vector pairs", st.use_vectors)) st.use_vectors = true;
  record_widget(ui, "mount.measured_from_vectors");
  if (st.use_vectors) {
    ImGui::SameLine();
    ImGui::TextDisabled("a line: sx sy sz vx vy vz [w]");
    text_field("##vectors", st.vectors_text, kMountTextCapacity, true,
               ImVec2(-1.0f, 3.0f * ImGui::GetTextLineHeightWithSpacing()));
    record_widget(ui, "mount.vectors");
  } else {
    ImGui::SetNextItemWidth(-1.0f);
    text_field("##measured", st.measured_text, kMountTextCapacity, false);
    record_widget(ui, "mount.measured");
    ImGui::Checkbox("written vehicle-to-sensor", &st.measured_vehicle_to_sensor);
    record_widget(ui, "mount.measured_inverse");
  }
}

void settings_inputs(Ui& ui) {
  MountPanelState& st = ui.mount;
  ImGui::SetNextItemWidth(8.0f * ImGui::GetFontSize());
  ImGui::InputFloat("tolerance deg", &st.tolerance_deg, 0.1f, 1.0f, "%.3f");
  if (st.tolerance_deg < 0.0f) st.tolerance_deg = 0.0f;
  record_widget(ui, "mount.tolerance");
  ImGui::SameLine();
  ImGui::AlignTextToFramePadding();
  ImGui::TextUnformatted("vehicle axes");
  ImGui::SameLine();
  ImGui::SetNextItemWidth(4.0f * ImGui::GetFontSize());
  if (st.axes_from_house) {
    const DisplayConvention& dc = ui.doc.convention();
    st.axes_code = default_vehicle_axes(dc.path.empty() ? nullptr : &dc.house).code();
  }
  if (text_field("##vehicle_axes", st.axes_code, 16, false)) st.axes_from_house = false;
  record_widget(ui, "mount.axes");
  if (!st.axes_from_house) {
    ImGui::SameLine();
    if (ImGui::SmallButton("house")) st.axes_from_house = true;
    record_widget(ui, "mount.axes_house");
    if (ImGui::IsItemHovered())
      ImGui::SetTooltip("Name the vehicle axes as the house convention's body frame");
  } else if (ImGui::IsItemHovered()) {
    ImGui::SetTooltip("From the house convention's body frame (FRD when no house file is loaded)");
  }
}

/// Loads a mount setup's frame chain, vehicle axes and tolerance into the panel; on an error
/// the panel keeps what it had and says why (line and column).
void load_setup(Ui& ui) {
  MountPanelState& st = ui.mount;
  std::vector<std::string> warnings;
  auto setup = load_mount_setup(st.setup_path, &warnings);
  if (!setup) {
    st.chain_message = st.setup_path + ": " + setup.error().describe();
    return;
  }
  st.chain = setup->chain;
  st.axes_code = setup->vehicle_axes.code();
  st.axes_from_house = false;
  st.tolerance_deg = static_cast<float>(setup->tolerance_deg);
  st.selected_frame = st.chain.frames().empty() ? "" : st.chain.frames().back();
  st.chain_message = "loaded " + std::to_string(st.chain.frames().size()) + " frames from " + st.setup_path;
  for (const std::string& w : warnings) st.chain_message += "; warning: " + w;
#ifdef ATTISCOPE_HAS_RENDER
  // Frame the body and the chain once, so every frame is in view (the person may zoom in).
  render::SceneState probe =
      scene_state(ui, std::max(ui.scene_viewport.width, 1), std::max(ui.scene_viewport.height, 1));
  apply_chain_overlay(ui, &probe);
  view_state(ui).camera = render::chain_framing(probe, kSceneViewDistance);
#endif
}

/// The frame chain: load a setup file, pick a frame (highlighted in the Scene), read its pose
/// relative to its parent and to the chain's root.
void chain_inputs(Ui& ui) {
  MountPanelState& st = ui.mount;
  ImGui::TextUnformatted("Frame chain (from a mount setup file):");
  ImGui::SetNextItemWidth(-5.0f * ImGui::GetFontSize());
  text_field("##setup_path", st.setup_path, 1024, false);
  record_widget(ui, "mount.setup_path");
  ImGui::SameLine();
  if (ImGui::SmallButton("Load setup")) load_setup(ui);
  record_widget(ui, "mount.load_setup");
  if (!st.chain_message.empty()) ImGui::TextWrapped("%s", st.chain_message.c_str());
  if (st.chain.frames().empty()) return;
  ImGui::Checkbox("show every frame in the scene", &st.show_chain);
  record_widget(ui, "mount.show_chain");
  const auto layout = layout_frame_chain(st.chain);
  if (!layout) return;
  for (const ChainFrameMark& m : layout->marks) {
    ImGui::Indent(static_cast<float>(1 + m.depth) * ImGui::GetFontSize());
    if (ImGui::Selectable(m.name.c_str(), m.name == st.selected_frame)) st.selected_frame = m.name;
    ImGui::Unindent(static_cast<float>(1 + m.depth) * ImGui::GetFontSize());
    record_widget(ui, "mount.frame." + m.name);
  }
  for (const std::string& f : layout->unconnected) ImGui::TextDisabled("  %s (not linked)", f.c_str());
  if (!st.chain.has_frame(st.selected_frame)) return;
  const int p = ui.doc.convention().house.precision;
  auto show = [&](const std::string& a) {
    auto t = st.chain.relative(a, st.selected_frame);
    if (!t) return;
    const auto q = t->rotation.quaternion();
    ImGui::TextWrapped("%s_R_%s  q (w x y z) %s %s %s %s;  origin (%s, %s, %s) m", a.c_str(),
                       st.selected_frame.c_str(), num(q.w(), p).c_str(), num(q.x(), p).c_str(),
                       num(q.y(), p).c_str(), num(q.z(), p).c_str(), num(t->translation.x(), p).c_str(),
                       num(t->translation.y(), p).c_str(), num(t->translation.z(), p).c_str());
  };
  if (auto parent = st.chain.parent_of(st.selected_frame)) show(*parent);
  const std::string root = st.chain.path_from_root(st.selected_frame).front();
  if (root != st.selected_frame && root != st.chain.parent_of(st.selected_frame).value_or("")) show(root);
}

/// Writes BASE.txt (mount_report_text with the date) and, with the renderer, BASE.png.
std::string export_sheet(const MountResult& r, const MountPanelState& st, const std::string& base) {
  (void)st;  // only the picture uses it
  std::string said;
  const Expected<bool> written = write_file_atomically(base + ".txt", mount_report_text(r, 6, utc_now()));
  said = written.ok() ? "wrote " + base + ".txt" : written.error().describe();
#ifdef ATTISCOPE_HAS_RENDER
  if (r.nominal && r.measured) {
    auto renderer = render::SceneRenderer::create();
    if (!renderer) return said + "; no picture: " + renderer.error().describe();
    render::MountPictureOptions picture;
    if (!st.chain.frames().empty()) picture.chain = st.chain;
    if (st.chain.has_frame(st.selected_frame)) picture.chain_selected = st.selected_frame;
    picture.notes = mount_picture_notes(r, 4, utc_now());
    const auto png =
        render::write_mount_picture(*renderer.value(), base + ".png", r.nominal->vehicle_R_sensor,
                                    r.measured->vehicle_R_sensor, r.names, picture);
    said += png ? " and " + base + ".png" : "; no picture: " + png.error().describe();
  } else {
    said += "; no picture: it needs both a nominal and a measured mount";
  }
#else
  said += "; no picture: this build has no renderer";
#endif
  return said;
}

void draw_result(Ui& ui, const MountResult& r) {
  const int p = ui.doc.convention().house.precision;
  if (r.refused()) {
    ImGui::TextColored(kFailColour, "NO ANSWER");
    ImGui::TextWrapped("The vectors do not fix the rotation: %s", r.solve->observability.sentence.c_str());
  } else if (r.check) {
    const MountCheck& c = *r.check;
    if (ui.heading) ImGui::PushFont(ui.heading);
    ImGui::SetWindowFontScale(kVerdictScale);
    ImGui::TextColored(c.within_tolerance ? kPassColour : kFailColour, "%s",
                       c.within_tolerance ? "PASS" : "FAIL");
    ImGui::SetWindowFontScale(1.0f);
    if (ui.heading) ImGui::PopFont();
    record_widget(ui, "mount.verdict");
    ImGui::Text("error %s deg (tolerance %s deg)", num(c.error_rad * kDegPerRad, p).c_str(),
                num(c.tolerance_rad * kDegPerRad, p).c_str());
    ImGui::TextWrapped("%s", c.error_words.c_str());
    ImGui::TextWrapped("%s: %s", verdict_name(c.verdict).c_str(), c.verdict_text.c_str());
    for (const Explanation& e : c.explanations)
      ImGui::BulletText("%s would leave %s deg", e.label.c_str(), num(e.error_rad * kDegPerRad, p).c_str());
    std::string split = "small-angle split:";
    for (const NamedTurn& t : c.error_turns)
      split += " " + t.turn_name + " " + num(t.angle_rad * kDegPerRad, p) +
               (t.sense.empty() ? "" : " " + t.sense) + ";";
    ImGui::TextWrapped("%s", split.c_str());
  } else if (r.measured) {
    ImGui::TextWrapped("No nominal mount: the measured mount alone (nothing to pass or fail).");
  }
  if (r.measured) {
    const auto q = r.measured->vehicle_R_sensor.quaternion();
    ImGui::TextWrapped("measured q (w x y z) %s %s %s %s  [%s]", num(q.w(), p).c_str(), num(q.x(), p).c_str(),
                       num(q.y(), p).c_str(), num(q.z(), p).c_str(), r.measured->description.c_str());
  }
  if (r.solve) {
    for (std::size_t i = 0; i < r.solve->residuals_rad.size(); ++i) {
      const int line = i < r.vector_lines.size() ? r.vector_lines[i] : static_cast<int>(i) + 1;
      ImGui::Text("residual, line %d: %s deg", line, num(r.solve->residuals_rad[i] * kDegPerRad, p).c_str());
    }
  }
  for (const std::string& w : r.warnings) ImGui::TextColored(kCautionColour, "warning: %s", w.c_str());
}

}  // namespace

void draw_mount_panel(Ui& ui) {
  MountPanelState& st = ui.mount;
  const Gathered g = gather(ui);
  std::optional<MountResult> result;
  std::vector<std::string> problems = g.problems;
  if (g.inputs) {
    auto r = run_mount_check(*g.inputs);
    if (r)
      result = r.value();
    else
      problems.push_back((g.inputs->vectors ? "vector box: " : "") + r.error().describe());
  }

  // Two columns above a caution strip that never scrolls away.
  const ImVec2 avail = ImGui::GetContentRegionAvail();
  const float caution_h = 3.2f * ImGui::GetTextLineHeightWithSpacing() + ImGui::GetFrameHeightWithSpacing();
  const float columns_h = std::max(4.0f * ImGui::GetFrameHeightWithSpacing(), avail.y - caution_h);
  const float left_w = std::floor(avail.x * 0.5f);
  ImGui::BeginChild("##mount_inputs", ImVec2(left_w, columns_h), false);
  nominal_inputs(ui, g.names.value_or(VehicleAxes{}));
  ImGui::Separator();
  measured_inputs(ui);
  ImGui::Separator();
  settings_inputs(ui);
  ImGui::Separator();
  chain_inputs(ui);
  ImGui::EndChild();

  ImGui::SameLine();
  ImGui::BeginChild("##mount_result", ImVec2(0.0f, columns_h), true);
  for (const std::string& problem : problems) ImGui::TextColored(kProblemColour, "%s", problem.c_str());
  if (result)
    draw_result(ui, *result);
  else if (problems.empty())
    ImGui::TextDisabled("Give a measured mount (a reading or vector pairs) to check.");
  ImGui::EndChild();
  record_widget(ui, "mount.result");

  // The actions, in a row that does not scroll.
  if (ImGui::SmallButton("Show in scene") && result && result->measured) {
    // One undoable edit: the measured mount as the pose (solid), the nominal as the ghost.
    ui.doc.set_pose_and_reference(
        result->measured->vehicle_R_sensor,
        result->nominal ? result->nominal->vehicle_R_sensor : result->measured->vehicle_R_sensor,
        "mount check in scene");
  }
  record_widget(ui, "mount.show_in_scene");
  ImGui::SameLine();
  ImGui::SetNextItemWidth(8.0f * ImGui::GetFontSize());
  text_field("##sheet", st.sheet_base, 1024, false);
  record_widget(ui, "mount.sheet_base");
  ImGui::SameLine();
  if (ImGui::SmallButton("Export check sheet")) {
    st.message = result ? export_sheet(*result, st, st.sheet_base) : "nothing to export: no result";
    ui.status = st.message;
  }
  record_widget(ui, "mount.export");
  if (result) {
    ImGui::SameLine();
    if (ImGui::SmallButton("Copy text")) {
      ImGui::SetClipboardText(mount_report_text(*result, ui.doc.convention().house.precision).c_str());
      ui.status = "copied the mount check as text";
    }
    record_widget(ui, "mount.copy_text");
    ImGui::SameLine();
    if (ImGui::SmallButton("Copy JSON")) {
      ImGui::SetClipboardText(mount_json(*result).dump(2).c_str());
      ui.status = "copied the mount check as JSON";
    }
    record_widget(ui, "mount.copy_json");
  }
  if (!st.message.empty()) {
    ImGui::SameLine();
    ImGui::TextUnformatted(st.message.c_str());
  }

  ImGui::PushStyleColor(ImGuiCol_Text, kCautionColour);
  ImGui::TextWrapped("%s", kMountCaution);
  ImGui::PopStyleColor();
  record_widget(ui, "mount.caution");

  nlohmann::json& j = ui.panel_state["mount"];
  j["caution"] = kMountCaution;
  j["problems"] = problems;
  j["message"] = st.message;
  j["vehicle_axes"] = st.axes_code;
  j["vehicle_axes_from_house"] = st.axes_from_house;
  j["result"] = result ? mount_json(*result) : nlohmann::json();
  j["chain"] = chain_view_dump(ui);
}

}  // namespace attiscope::gui
