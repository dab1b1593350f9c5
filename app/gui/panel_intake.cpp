// panel_intake.cpp: the Intake panel: the paste box, and below it every reading core's paste
// reader (core/intake.hpp) finds in the text, best first, each with its score, reason,
// warnings, quaternion, where the body axes point (in words and as a small triad) and a
// button that loads it into the document. Ctrl+V outside a text field pastes here.
#include <algorithm>
#include <array>
#include <cmath>
#include <sstream>

#include "attiscope/core/intake.hpp"
#include "attiscope/core/pose_text.hpp"
#include "gui/ui.hpp"

namespace attiscope::gui {

namespace {

constexpr std::size_t kIntakeCapacity = 1 << 16;
/// Side of the body-axes picture beside each reading, in points at scale 1.
constexpr float kTriadSize = 64.0f;

// Colours of the panel (the axis colours are the trade's common practice: x red, y green,
// z blue).
constexpr ImU32 kAxisX = IM_COL32(230, 80, 70, 255);
constexpr ImU32 kAxisY = IM_COL32(90, 200, 90, 255);
constexpr ImU32 kAxisZ = IM_COL32(80, 140, 245, 255);
const ImVec4 kWarning(1.0f, 0.72f, 0.25f, 1.0f);
const ImVec4 kErrorText(1.0f, 0.42f, 0.40f, 1.0f);
const ImVec4 kAmbiguousBg(0.55f, 0.38f, 0.05f, 1.0f);
const ImVec4 kTrackBg(0.12f, 0.32f, 0.48f, 1.0f);

/// What the text is read against, from the house convention. The one place that reads the
/// window's convention for the intake.
IntakePreferences intake_preferences(const DisplayConvention& house) {
  // The same preferences the command line's --convention gives the paste reader.
  PoseTextOptions options;
  options.house = house.house;
  return pose_intake_preferences(options);
}

/// A fixed oblique view of the world axes: world x toward the viewer and down-left, y to
/// the right, z up. Screen y grows downwards.
ImVec2 project(const Eigen::Vector3d& v, ImVec2 centre, float radius) {
  const float sx = static_cast<float>(-0.50 * v.x() + 0.92 * v.y());
  const float sy = static_cast<float>(0.38 * v.x() + 0.20 * v.y() - 0.95 * v.z());
  return ImVec2(centre.x + radius * sx, centre.y + radius * sy);
}

/// Toward the viewer, for drawing the nearer axes last.
double depth(const Eigen::Vector3d& v) {
  return 0.8 * v.x() - 0.3 * v.y() + 0.3 * v.z();
}

/// The body's axes as a small triad over faint world axes.
void draw_triad(Ui& ui, const Rotation& world_R_body) {
  const float side = kTriadSize * ui.scale;
  const ImVec2 origin = ImGui::GetCursorScreenPos();
  ImGui::Dummy(ImVec2(side, side));
  ImDrawList* dl = ImGui::GetWindowDrawList();
  const ImVec2 c(origin.x + side * 0.5f, origin.y + side * 0.52f);
  const float r = side * 0.40f;
  dl->AddRectFilled(origin, ImVec2(origin.x + side, origin.y + side), IM_COL32(20, 23, 30, 255), 4.0f);
  const ImU32 faint = IM_COL32(120, 125, 135, 110);
  for (int i = 0; i < 3; ++i) {
    const Eigen::Vector3d e = Eigen::Vector3d::Unit(i);
    dl->AddLine(project(-e, c, r), project(e, c, r), faint, 1.0f);
  }
  const Eigen::Matrix3d world_M_body = world_R_body.matrix();
  const std::array<ImU32, 3> colours{kAxisX, kAxisY, kAxisZ};
  std::array<int, 3> order{0, 1, 2};
  std::sort(order.begin(), order.end(),
            [&](int a, int b) { return depth(world_M_body.col(a)) < depth(world_M_body.col(b)); });
  const char* names[] = {"x", "y", "z"};
  for (int i : order) {
    const ImVec2 tip = project(world_M_body.col(i), c, r);
    dl->AddLine(c, tip, colours[i], 2.5f * ui.scale);
    dl->AddCircleFilled(tip, 2.5f * ui.scale, colours[i]);
    dl->AddText(ImVec2(tip.x + 2.0f, tip.y - ImGui::GetFontSize() * 0.5f), colours[i], names[i]);
  }
}

/// The score as a bar with its number on it.
void draw_score(Ui& ui, double score) {
  const float s = static_cast<float>(std::clamp(score, 0.0, 1.0));
  const ImVec4 colour =
      s >= 0.75f ? ImVec4(0.25f, 0.62f, 0.35f, 1.0f)
                 : (s >= 0.4f ? ImVec4(0.70f, 0.58f, 0.20f, 1.0f) : ImVec4(0.60f, 0.30f, 0.28f, 1.0f));
  ImGui::PushStyleColor(ImGuiCol_PlotHistogram, colour);
  char label[16];
  std::snprintf(label, sizeof label, "%.2f", score);
  ImGui::ProgressBar(s, ImVec2(90.0f * ui.scale, 0.0f), label);
  ImGui::PopStyleColor();
}

/// A coloured strip that wraps its text (ImGui 1.86 children do not size to text, so this
/// draws the rectangle behind a wrapped group).
void strip(const ImVec4& bg, const std::string& text) {
  ImDrawList* dl = ImGui::GetWindowDrawList();
  dl->ChannelsSplit(2);
  dl->ChannelsSetCurrent(1);
  const ImVec2 pad = ImGui::GetStyle().FramePadding;
  ImGui::SetCursorPosY(ImGui::GetCursorPosY() + pad.y);
  ImGui::Indent(pad.x);
  ImGui::BeginGroup();
  ImGui::PushTextWrapPos(ImGui::GetContentRegionMax().x - pad.x);
  ImGui::TextUnformatted(text.c_str());
  ImGui::PopTextWrapPos();
  ImGui::EndGroup();
  ImGui::Unindent(pad.x);
  const ImVec2 a = ImGui::GetItemRectMin();
  const ImVec2 b = ImGui::GetItemRectMax();
  dl->ChannelsSetCurrent(0);
  dl->AddRectFilled(ImVec2(a.x - pad.x, a.y - pad.y),
                    ImVec2(ImGui::GetWindowPos().x + ImGui::GetContentRegionMax().x, b.y + pad.y),
                    ImGui::GetColorU32(bg), 3.0f);
  dl->ChannelsMerge();
  ImGui::SetCursorPosY(ImGui::GetCursorPosY() + pad.y);
}

/// The error, with the offending line of the text and a caret under the column.
void show_error(Ui& ui, const std::string& text, const Error& e, nlohmann::json& listing) {
  listing["error"] = {{"message", e.message}, {"line", e.line}, {"column", e.column}};
  ImGui::PushStyleColor(ImGuiCol_Text, kErrorText);
  ImGui::TextUnformatted("Not a rotation");
  ImGui::PopStyleColor();
  ImGui::PushTextWrapPos(0.0f);
  ImGui::TextUnformatted(e.describe().c_str());
  ImGui::PopTextWrapPos();
  if (e.line <= 0) return;
  std::istringstream in(text);
  std::string line;
  for (int i = 0; i < e.line && std::getline(in, line); ++i) {
  }
  std::replace(line.begin(), line.end(), '\t', ' ');
  const int col = std::max(1, e.column);
  const std::string caret = std::string(static_cast<std::size_t>(col - 1), ' ') + "^";
  if (ui.mono) ImGui::PushFont(ui.mono);
  ImGui::TextDisabled("%4d |", e.line);
  ImGui::SameLine();
  ImGui::TextUnformatted(line.c_str());
  ImGui::TextDisabled("     |");
  ImGui::SameLine();
  ImGui::PushStyleColor(ImGuiCol_Text, kErrorText);
  ImGui::TextUnformatted(caret.c_str());
  ImGui::PopStyleColor();
  if (ui.mono) ImGui::PopFont();
  listing["error"]["marked_line"] = line;
}

std::string title_of(const Reading& r) {
  std::string t = intake_kind_name(r.kind);
  if (!r.layout.empty()) t += " (" + r.layout + ")";
  return t;
}

void show_reading(Ui& ui, const Reading& r, std::size_t index, nlohmann::json& listing) {
  const Eigen::Quaterniond& q = r.rotation.quaternion();
  nlohmann::json item = {{"kind", intake_kind_name(r.kind)},
                         {"layout", r.layout},
                         {"score", r.score},
                         {"quaternion", {{"w", q.w()}, {"x", q.x()}, {"y", q.y()}, {"z", q.z()}}},
                         {"warnings", r.warnings}};
  ImGui::PushID(static_cast<int>(index));
  ImGui::Separator();
  // Left: the triad. Right: the words.
  ImGui::BeginGroup();
  draw_triad(ui, r.rotation);
  ImGui::EndGroup();
  ImGui::SameLine();
  ImGui::BeginGroup();
  draw_score(ui, r.score);
  ImGui::SameLine();
  const std::string load = "Load this reading##" + std::to_string(index);
  if (ImGui::SmallButton(load.c_str())) {
    ui.doc.set_pose(r.rotation, "intake: " + title_of(r));
    ui.status = "loaded " + title_of(r) + " from the intake";
  }
  record_widget(ui, "intake.load." + std::to_string(index));
  if (ImGui::IsItemHovered()) ImGui::SetTooltip("Set the pose to this reading (Ctrl+Z undoes it)");
  if (ui.heading) ImGui::PushFont(ui.heading);
  ImGui::PushTextWrapPos(0.0f);
  ImGui::Text("%zu. %s", index + 1, title_of(r).c_str());
  ImGui::PopTextWrapPos();
  if (ui.heading) ImGui::PopFont();
  ImGui::PushTextWrapPos(0.0f);
  ImGui::TextUnformatted(r.why.c_str());
  ImGui::PopTextWrapPos();
  for (const std::string& w : r.warnings) {
    ImGui::PushStyleColor(ImGuiCol_Text, kWarning);
    ImGui::PushTextWrapPos(0.0f);
    ImGui::Text("! %s", w.c_str());
    ImGui::PopTextWrapPos();
    ImGui::PopStyleColor();
  }
  if (ui.mono) ImGui::PushFont(ui.mono);
  ImGui::Text("w %+.6f  x %+.6f", q.w(), q.x());
  ImGui::Text("y %+.6f  z %+.6f", q.y(), q.z());
  if (r.translation) {
    const Eigen::Vector3d& t = *r.translation;
    ImGui::Text("t  x %+.6g  y %+.6g  z %+.6g", t.x(), t.y(), t.z());
    item["translation"] = {t.x(), t.y(), t.z()};
  }
  if (ui.mono) ImGui::PopFont();
  ImGui::PushTextWrapPos(0.0f);
  ImGui::TextDisabled("%s", r.body_axes.c_str());
  ImGui::PopTextWrapPos();
  if (r.as) ImGui::TextDisabled("command line: attiscope read --as %s", reading_kind_name(*r.as).c_str());
  ImGui::EndGroup();
  ImGui::PopID();
  listing["readings"].push_back(item);
}

void list_readings(Ui& ui, const std::string& text) {
  nlohmann::json listing = {{"readings", nlohmann::json::array()}};
  if (text.find_first_not_of(" \t\r\n") == std::string::npos) {
    // Wrapped to the panel, so a narrow tools window shows the whole hint.
    ImGui::PushStyleColor(ImGuiCol_Text, ImGui::GetStyle().Colors[ImGuiCol_TextDisabled]);
    ImGui::TextWrapped(
        "Paste a pose (Ctrl+V): a quaternion, a matrix, a transform, angles, labelled fields, JSON or a "
        "log of many poses.");
    ImGui::PopStyleColor();
    ui.intake_listing = listing;
    return;
  }
  const IntakePreferences preferences = intake_preferences(ui.doc.convention());
  Ui::IntakeReading& cached = ui.intake_reading;
  if (!cached.result || cached.text != text || !(cached.preferences == preferences)) {
    cached.result = read_pasted(text, preferences);
    cached.text = text;
    cached.preferences = preferences;
  }
  const Expected<IntakeResult>& result = *cached.result;
  ImGui::BeginChild("##readings", ImVec2(0.0f, 0.0f), false);
  if (!result) {
    show_error(ui, text, result.error(), listing);
    ImGui::EndChild();
    ui.intake_listing = listing;
    return;
  }
  const IntakeResult& res = result.value();
  listing["ambiguous"] = res.ambiguous;
  listing["shape"] = res.shape;
  if (res.track) {
    const std::size_t columns = res.track->column_count;
    std::ostringstream s;
    s << "TRACK: " << res.track_rows << " poses, " << columns << " columns";
    if (res.track->time_column >= 0) s << " (time in column " << res.track->time_column + 1 << ")";
    s << ". The Track panel opens it; below, the first pose.";
    strip(kTrackBg, s.str());
    listing["track"] = {{"rows", res.track_rows}, {"columns", columns}};
  }
  if (res.ambiguous) {
    strip(kAmbiguousBg,
          "AMBIGUOUS: the text does not decide; the house convention ordered the readings. "
          "Check what your source meant before you load one.");
  }
  ImGui::TextDisabled("%s: %zu reading%s, best first", res.shape.c_str(), res.readings.size(),
                      res.readings.size() == 1 ? "" : "s");
  for (const std::string& n : res.notes) ImGui::TextDisabled("note: %s", n.c_str());
  for (std::size_t i = 0; i < res.readings.size(); ++i) show_reading(ui, res.readings[i], i, listing);
  ImGui::EndChild();
  ui.intake_listing = listing;
}

}  // namespace

void draw_intake(Ui& ui) {
  if (ui.focus_intake) {
    ImGui::SetKeyboardFocusHere();
    ui.focus_intake = false;
  }
  // A fixed buffer: ImGui 1.86 edits a char array. The text lives in Ui; the buffer follows
  // it when something else (Ctrl+V outside a field, a script) changed it.
  std::string& buffer = ui.intake_buffer;
  if (buffer.size() != kIntakeCapacity || ui.intake_text != buffer.c_str()) {
    buffer = ui.intake_text;
    buffer.resize(kIntakeCapacity, '\0');
  }
  const float h = std::max(3.0f * ImGui::GetFontSize(), ImGui::GetContentRegionAvail().y * 0.14f);
  if (ui.mono) ImGui::PushFont(ui.mono);
  if (ImGui::InputTextMultiline("##paste", buffer.data(), buffer.size(), ImVec2(-1.0f, h))) {
    ui.intake_text = std::string(buffer.c_str());
  }
  if (ui.mono) ImGui::PopFont();
  record_widget(ui, "intake.text");
  list_readings(ui, ui.intake_text);
}

}  // namespace attiscope::gui
