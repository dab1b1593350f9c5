// panel_house.cpp: the House convention panel (every field of core's HouseConvention,
// with the derived sentences as a live preview; load, save, save as, recent files, card
// export) and the lower tab strip that holds it beside the Intake, Teach and Finder.
// Every edit goes through validate_convention and Document::set_convention (undoable).
#include <algorithm>
#include <array>
#include <filesystem>

#include "attiscope/core/convention.hpp"
#include "attiscope/core/convention_card.hpp"
#include "attiscope/core/convention_file.hpp"
#include "gui/display_convention.hpp"
#include "gui/ui.hpp"

#ifdef ATTISCOPE_HAS_RENDER
#include "attiscope/render/card.hpp"
#endif

namespace attiscope::gui {

namespace {

constexpr std::size_t kPathCapacity = 1024;
constexpr std::size_t kNameCapacity = 128;

/// A one-line text box over a std::string (ImGui 1.86 edits a char array). Returns true
/// when the text changed.
bool input_string(const char* label, std::string* text, std::size_t capacity, ImGuiInputTextFlags flags = 0) {
  std::string buffer = *text;
  buffer.resize(capacity, '\0');
  if (ImGui::InputText(label, buffer.data(), buffer.size(), flags)) {
    *text = std::string(buffer.c_str());
    return true;
  }
  return false;
}

/// Applies an edited convention when it passes core's checks; else shows why.
void apply_edit(Ui& ui, const HouseConvention& edited) {
  auto ok = validate_convention(edited);
  if (!ok) {
    ui.house.error = "not applied: " + ok.error().describe();
    return;
  }
  DisplayConvention d = ui.doc.convention();
  d.house = ok.value();
  ui.house.error.clear();
  ui.doc.set_convention(d);
}

bool combo(const char* label, int* index, const std::vector<std::string>& items) {
  bool changed = false;
  const std::string current = *index >= 0 && *index < static_cast<int>(items.size())
                                  ? items[static_cast<std::size_t>(*index)]
                                  : std::string("?");
  if (ImGui::BeginCombo(label, current.c_str())) {
    for (std::size_t i = 0; i < items.size(); ++i) {
      if (ImGui::Selectable(items[i].c_str(), static_cast<int>(i) == *index)) {
        *index = static_cast<int>(i);
        changed = true;
      }
    }
    ImGui::EndCombo();
  }
  return changed;
}

const std::vector<std::string>& direction_words(FrameRole role) {
  static const std::vector<std::string> kWorld = {"east", "west", "north", "south", "up", "down"};
  static const std::vector<std::string> kBody = {"forward", "back", "left", "right", "up", "down"};
  return role == FrameRole::World ? kWorld : kBody;
}

/// One frame's editor: preset, the direction of each axis, the axis names.
void frame_editor(Ui& ui, const char* key, FrameRole role, HouseConvention* c, bool* changed) {
  FrameAxes& f = role == FrameRole::World ? c->world : c->body;
  ImGui::PushID(key);
  const std::vector<std::string> presets = role == FrameRole::World
                                               ? std::vector<std::string>{"ENU", "NED"}
                                               : std::vector<std::string>{"FLU", "FRD", "RDF"};
  const std::string now = frame_preset_name(f, role);
  int index = static_cast<int>(std::find(presets.begin(), presets.end(), now) - presets.begin());
  ImGui::SetNextItemWidth(5.0f * ImGui::GetFontSize());
  std::vector<std::string> shown = presets;
  shown.push_back("custom");
  if (combo(role == FrameRole::World ? "world" : "body", &index, shown) &&
      index < static_cast<int>(presets.size())) {
    auto p = frame_preset(presets[static_cast<std::size_t>(index)], role);
    if (p) {
      f.directions = p.value().directions;
      f.names = p.value().names;
      *changed = true;
    }
  }
  record_widget(ui, std::string("house.") + key);
  const auto& words = direction_words(role);
  for (std::size_t a = 0; a < 3; ++a) {
    ImGui::SameLine();
    ImGui::PushID(static_cast<int>(a));
    int w = static_cast<int>(std::find(words.begin(), words.end(), f.directions[a]) - words.begin());
    ImGui::SetNextItemWidth(5.0f * ImGui::GetFontSize());
    const std::string label = std::string(1, static_cast<char>('x' + a));
    if (combo(label.c_str(), &w, words) && w < static_cast<int>(words.size())) {
      f.directions[a] = words[static_cast<std::size_t>(w)];
      *changed = true;
    }
    ImGui::SameLine();
    ImGui::SetNextItemWidth(3.0f * ImGui::GetFontSize());
    if (input_string("##name", &f.names[a], kNameCapacity, ImGuiInputTextFlags_EnterReturnsTrue))
      *changed = true;
    ImGui::PopID();
  }
  ImGui::PopID();
}

void euler_editor(Ui& ui, HouseConvention* c, bool* changed) {
  HouseEuler& e = c->euler;
  std::vector<std::string> names;
  int index = 0;
  for (std::size_t i = 0; i < all_euler_conventions().size(); ++i) {
    names.push_back(all_euler_conventions()[i].name());
    if (all_euler_conventions()[i] == e.convention) index = static_cast<int>(i);
  }
  ImGui::SetNextItemWidth(12.0f * ImGui::GetFontSize());
  if (combo("sequence and kind", &index, names)) {
    e.convention = all_euler_conventions()[static_cast<std::size_t>(index)];
    *changed = true;
  }
  record_widget(ui, "house.euler");
  ImGui::TextUnformatted("names (application order)");
  for (std::size_t i = 0; i < 3; ++i) {
    ImGui::SameLine();
    ImGui::PushID(static_cast<int>(i));
    ImGui::SetNextItemWidth(5.0f * ImGui::GetFontSize());
    if (input_string("##n", &e.names[i], kNameCapacity, ImGuiInputTextFlags_EnterReturnsTrue))
      *changed = true;
    record_widget(ui, "house.name." + std::to_string(i));
    ImGui::PopID();
  }
  // Print order: the six permutations of the three application indices.
  const std::vector<std::array<int, 3>> perms = {{0, 1, 2}, {0, 2, 1}, {1, 0, 2},
                                                 {1, 2, 0}, {2, 0, 1}, {2, 1, 0}};
  std::vector<std::string> perm_names;
  int perm = 0;
  for (std::size_t i = 0; i < perms.size(); ++i) {
    std::string s;
    for (int k : perms[i]) s += (s.empty() ? "" : ", ") + e.names[static_cast<std::size_t>(k)];
    perm_names.push_back(s);
    if (perms[i] == e.print_order) perm = static_cast<int>(i);
  }
  ImGui::SetNextItemWidth(12.0f * ImGui::GetFontSize());
  if (combo("print order", &perm, perm_names)) {
    e.print_order = perms[static_cast<std::size_t>(perm)];
    *changed = true;
  }
  record_widget(ui, "house.print_order");
  int unit = e.unit == AngleUnit::Degrees ? 0 : 1;
  const bool to_degrees = ImGui::RadioButton("degrees", &unit, 0);
  ImGui::SameLine();
  const bool to_radians = ImGui::RadioButton("radians", &unit, 1);
  if (to_degrees || to_radians) {
    e.unit = unit == 0 ? AngleUnit::Degrees : AngleUnit::Radians;
    *changed = true;
  }
  for (std::size_t i = 0; i < 3; i += 2) {
    ImGui::SameLine();
    bool heading = e.ranges[i] == AngleRange::ZeroTo360;
    const std::string label = e.names[i] + " in [0, 360)";
    if (ImGui::Checkbox(label.c_str(), &heading)) {
      e.ranges[i] = heading ? AngleRange::ZeroTo360 : AngleRange::Standard;
      *changed = true;
    }
    record_widget(ui, "house.range." + std::to_string(i));
  }
}

void layout_editor(Ui& ui, HouseConvention* c, bool* changed) {
  int layout = c->quaternion.layout == QuatLayout::ScalarFirst ? 0 : 1;
  int algebra = c->quaternion.algebra == QuatAlgebra::Hamilton ? 0 : 1;
  int qdir = c->quaternion.direction == Direction::BodyToWorld ? 0 : 1;
  ImGui::SetNextItemWidth(6.0f * ImGui::GetFontSize());
  if (combo("quaternion", &layout, {"w x y z", "x y z w"})) *changed = true;
  record_widget(ui, "house.quat_layout");
  ImGui::SameLine();
  ImGui::SetNextItemWidth(6.0f * ImGui::GetFontSize());
  if (combo("algebra", &algebra, {"Hamilton", "JPL"})) *changed = true;
  ImGui::SameLine();
  ImGui::SetNextItemWidth(8.0f * ImGui::GetFontSize());
  if (combo("maps##q", &qdir, {"body to world", "world to body"})) *changed = true;
  c->quaternion.layout = layout == 0 ? QuatLayout::ScalarFirst : QuatLayout::ScalarLast;
  c->quaternion.algebra = algebra == 0 ? QuatAlgebra::Hamilton : QuatAlgebra::Jpl;
  c->quaternion.direction = qdir == 0 ? Direction::BodyToWorld : Direction::WorldToBody;
  int mdir = c->matrix.direction == Direction::BodyToWorld ? 0 : 1;
  int storage = c->matrix.storage == MatrixStorage::Rows ? 0 : 1;
  ImGui::SetNextItemWidth(8.0f * ImGui::GetFontSize());
  if (combo("matrix maps", &mdir, {"body to world", "world to body"})) *changed = true;
  record_widget(ui, "house.matrix_direction");
  ImGui::SameLine();
  ImGui::SetNextItemWidth(7.0f * ImGui::GetFontSize());
  if (combo("storage", &storage, {"row-major", "column-major"})) *changed = true;
  c->matrix.direction = mdir == 0 ? Direction::BodyToWorld : Direction::WorldToBody;
  c->matrix.storage = storage == 0 ? MatrixStorage::Rows : MatrixStorage::Columns;
  ImGui::SameLine();
  ImGui::SetNextItemWidth(5.0f * ImGui::GetFontSize());
  if (ImGui::InputInt("precision", &c->precision, 1, 1)) *changed = true;
}

void save_to(Ui& ui, const std::string& path) {
  if (path.empty()) {
    ui.house.error = "no file to save to: type a path in the file box";
    return;
  }
  auto saved = save_convention(path, ui.doc.convention().house);
  if (!saved) {
    ui.house.error = path + ": " + saved.error().describe();
    return;
  }
  DisplayConvention d = ui.doc.convention();
  d.path = path;
  ui.doc.set_convention(d);
  ui.house.saved_text = convention_to_toml(d.house);
  ui.house.error.clear();
  ui.house.message = "saved " + path;
  remember_convention(ui.settings, path);
  ui.settings_changed = true;
}

}  // namespace

bool open_convention(Ui& ui, const std::string& path) {
  std::vector<std::string> warnings;
  auto loaded = load_display_convention(path, &warnings);
  if (!loaded) {
    ui.house.error = path + ": " + loaded.error().describe();
    return false;
  }
  ui.doc.set_convention(loaded.value());
  ui.house.error.clear();
  ui.house.warnings = warnings;
  ui.house.saved_text = convention_to_toml(loaded.value().house);
  ui.house.message = "loaded " + path;
  remember_convention(ui.settings, path);
  ui.settings_changed = true;
  return true;
}

void draw_house_panel(Ui& ui) {
  const DisplayConvention& dc = ui.doc.convention();
  const bool unsaved = !ui.house.saved_text.empty()
                           ? convention_to_toml(dc.house) != ui.house.saved_text
                           : !dc.path.empty() || dc.house.name != HouseConvention{}.name;
  ImGui::Text("%s%s", dc.house.name.c_str(), unsaved ? "  (unsaved changes)" : "");
  record_widget(ui, unsaved ? "house.unsaved" : "house.saved");
  if (!dc.path.empty()) {
    ImGui::SameLine();
    ImGui::TextDisabled("%s", dc.path.c_str());
  }
  ImGui::SetNextItemWidth(-12.0f * ImGui::GetFontSize());
  input_string("##file", &ui.house.path_input, kPathCapacity);
  // Enter in the box loads the file (the box keeps its text as it is typed).
  const bool enter = ImGui::IsItemDeactivated() && ImGui::IsKeyPressed(ImGui::GetKeyIndex(ImGuiKey_Enter));
  record_widget(ui, "house.file");
  ImGui::SameLine();
  if (ImGui::Button("Load") || enter) open_convention(ui, ui.house.path_input);
  record_widget(ui, "house.load");
  ImGui::SameLine();
  if (ImGui::Button("Save")) save_to(ui, dc.path.empty() ? ui.house.path_input : dc.path);
  record_widget(ui, "house.save");
  ImGui::SameLine();
  if (ImGui::Button("Save as")) save_to(ui, ui.house.path_input);
  record_widget(ui, "house.save_as");
  if (!ui.house.error.empty()) {
    ImGui::PushStyleColor(ImGuiCol_Text, ImVec4(1.0f, 0.45f, 0.4f, 1.0f));
    ImGui::TextWrapped("%s", ui.house.error.c_str());
    ImGui::PopStyleColor();
    record_widget(ui, "house.error");
  }
  for (const std::string& w : ui.house.warnings) ImGui::TextDisabled("warning: %s", w.c_str());
  if (!ui.house.message.empty()) ImGui::TextDisabled("%s", ui.house.message.c_str());

  HouseConvention edited = dc.house;
  bool changed = false;
  ImGui::SetNextItemWidth(14.0f * ImGui::GetFontSize());
  if (input_string("name", &edited.name, kNameCapacity, ImGuiInputTextFlags_EnterReturnsTrue)) changed = true;
  record_widget(ui, "house.name");
  frame_editor(ui, "world", FrameRole::World, &edited, &changed);
  frame_editor(ui, "body", FrameRole::Body, &edited, &changed);
  euler_editor(ui, &edited, &changed);
  layout_editor(ui, &edited, &changed);
  if (changed) apply_edit(ui, edited);

  ImGui::Separator();
  ImGui::TextUnformatted("What the numbers mean on the model:");
  for (const std::string& s : positive_direction_sentences(dc.house)) ImGui::BulletText("%s", s.c_str());

#ifdef ATTISCOPE_HAS_RENDER
  ImGui::SetNextItemWidth(-12.0f * ImGui::GetFontSize());
  input_string("##card", &ui.house.card_png, kPathCapacity);
  record_widget(ui, "house.card_path");
  ImGui::SameLine();
  if (ImGui::Button("Export card")) {
    const std::string md = std::filesystem::path(ui.house.card_png).replace_extension(".md").string();
    auto written = render::write_convention_card(dc.house, ui.house.card_png, md);
    ui.house.message = written ? "card written: " + written.value() : "";
    ui.house.error = written ? "" : written.error().describe();
  }
  record_widget(ui, "house.export_card");
#endif

  if (!ui.settings.recent_conventions.empty()) {
    ImGui::TextUnformatted("Recent files:");
    for (std::size_t i = 0; i < ui.settings.recent_conventions.size(); ++i) {
      const std::string path = ui.settings.recent_conventions[i];
      if (ImGui::SmallButton((path + "##recent" + std::to_string(i)).c_str())) open_convention(ui, path);
      record_widget(ui, "house.recent." + std::to_string(i));
    }
  }
}

void draw_lower_tabs(Ui& ui) {
  // Where the tabs do not fit their names are cut short (a tooltip shows the whole name);
  // the list button at the left names them all.
  if (!ImGui::BeginTabBar("lower", ImGuiTabBarFlags_TabListPopupButton)) return;
  struct Tab {
    const char* label;
    const char* key;
    void (*draw)(Ui&);
  };
  const Tab tabs[] = {
      {"Intake", "tab.intake", draw_intake},          {"Compare", "tab.compare", draw_compare_panel},
      {"Mount check", "tab.mount", draw_mount_panel}, {"House convention", "tab.house", draw_house_panel},
      {"Teach", "tab.teach", draw_teach_panel},       {"Finder", "tab.finder", draw_finder_panel},
      {"Track", "tab.track", draw_track_panel}};
  for (const Tab& tab : tabs) {
    const bool select = tab.draw == draw_track_panel && ui.track.select_tab;
    if (select) ui.track.select_tab = false;
    const bool open = ImGui::BeginTabItem(tab.label, nullptr,
                                          select ? ImGuiTabItemFlags_SetSelected : ImGuiTabItemFlags_None);
    record_widget(ui, tab.key);
    if (open) {
      ui.lower_tab = tab.label;
      tab.draw(ui);
      ImGui::EndTabItem();
    }
  }
  ImGui::EndTabBar();
}

}  // namespace attiscope::gui
