// settings.cpp: settings load/save, one table of keys.
#include "gui/settings.hpp"

#include <algorithm>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <functional>
#include <sstream>

#include <nlohmann/json.hpp>

namespace attiscope::gui {

namespace {

constexpr const char* kSettingsFile = "settings.json";

/// One row per saved key: how to write it and how to read it back.
struct Key {
  const char* name;
  std::function<nlohmann::json(const Settings&)> get;
  std::function<void(Settings&, const nlohmann::json&)> set;
};

const std::vector<Key>& keys() {
  static const std::vector<Key> kKeys = {
      {"ui_scale", [](const Settings& s) { return nlohmann::json(s.ui_scale); },
       [](Settings& s, const nlohmann::json& j) { s.ui_scale = std::clamp(j.get<float>(), 0.5f, 4.0f); }},
      {"use_content_scale", [](const Settings& s) { return nlohmann::json(s.use_content_scale); },
       [](Settings& s, const nlohmann::json& j) { s.use_content_scale = j.get<bool>(); }},
      {"window_width", [](const Settings& s) { return nlohmann::json(s.window_width); },
       [](Settings& s, const nlohmann::json& j) { s.window_width = std::clamp(j.get<int>(), 320, 16384); }},
      {"window_height", [](const Settings& s) { return nlohmann::json(s.window_height); },
       [](Settings& s, const nlohmann::json& j) { s.window_height = std::clamp(j.get<int>(), 240, 16384); }},
      {"convention_path", [](const Settings& s) { return nlohmann::json(s.convention_path); },
       [](Settings& s, const nlohmann::json& j) { s.convention_path = j.get<std::string>(); }},
      {"recent_conventions", [](const Settings& s) { return nlohmann::json(s.recent_conventions); },
       [](Settings& s, const nlohmann::json& j) {
         s.recent_conventions.clear();
         for (const auto& p : j) {
           if (s.recent_conventions.size() < kMaxRecentConventions)
             s.recent_conventions.push_back(p.get<std::string>());
         }
       }},
      {"nudge_step_deg", [](const Settings& s) { return nlohmann::json(s.nudge_step_deg); },
       [](Settings& s, const nlohmann::json& j) {
         s.nudge_step_deg = std::clamp(j.get<double>(), 0.001, 90.0);
       }},
      {"show_scene", [](const Settings& s) { return nlohmann::json(s.show_scene); },
       [](Settings& s, const nlohmann::json& j) { s.show_scene = j.get<bool>(); }},
      {"show_gimbal", [](const Settings& s) { return nlohmann::json(s.show_gimbal); },
       [](Settings& s, const nlohmann::json& j) { s.show_gimbal = j.get<bool>(); }},
  };
  return kKeys;
}

std::string settings_text(const Settings& s) {
  nlohmann::json j = nlohmann::json::object();
  for (const Key& k : keys()) j[k.name] = k.get(s);
  return j.dump(2) + "\n";
}

}  // namespace

void remember_convention(Settings& s, const std::string& path) {
  auto& r = s.recent_conventions;
  r.erase(std::remove(r.begin(), r.end(), path), r.end());
  r.insert(r.begin(), path);
  if (r.size() > kMaxRecentConventions) r.resize(kMaxRecentConventions);
  s.convention_path = path;
}

std::optional<std::string> config_dir() {
  const char* xdg = std::getenv("XDG_CONFIG_HOME");
  if (xdg && *xdg) return std::string(xdg) + "/attiscope";
  const char* home = std::getenv("HOME");
  if (home && *home) return std::string(home) + "/.config/attiscope";
  return std::nullopt;
}

Settings load_settings(const std::string& dir, std::string* warning) {
  Settings s;
  if (dir.empty()) return s;
  std::ifstream in(dir + "/" + kSettingsFile);
  if (!in) return s;
  std::stringstream buf;
  buf << in.rdbuf();
  const nlohmann::json j = nlohmann::json::parse(buf.str(), nullptr, false);
  if (!j.is_object()) {
    if (warning) *warning = "settings file is not a JSON object; using defaults";
    return s;
  }
  for (const Key& k : keys()) {
    auto it = j.find(k.name);
    if (it == j.end()) continue;
    try {
      k.set(s, *it);
    } catch (const nlohmann::json::exception&) {
      if (warning)
        *warning = std::string("settings key '") + k.name + "' has the wrong type; using its default";
    }
  }
  return s;
}

bool write_file_atomically(const std::string& path, const std::string& text) {
  std::error_code ec;
  const std::filesystem::path p(path);
  if (p.has_parent_path()) std::filesystem::create_directories(p.parent_path(), ec);
  const std::string tmp = path + ".tmp";
  {
    std::ofstream out(tmp, std::ios::binary | std::ios::trunc);
    if (!out) return false;
    out << text;
    out.flush();
    if (!out) {
      out.close();
      std::remove(tmp.c_str());
      return false;
    }
  }
  if (std::rename(tmp.c_str(), path.c_str()) != 0) {
    std::remove(tmp.c_str());
    return false;
  }
  return true;
}

void SettingsStore::changed(const Settings& s, double now_s) {
  pending_ = s;
  dirty_ = true;
  changed_at_s_ = now_s;
}

bool SettingsStore::save_if_due(double now_s) {
  if (!dirty_ || now_s - changed_at_s_ < kSaveDelayS) return false;
  return flush();
}

bool SettingsStore::flush() {
  if (!dirty_ || dir_.empty()) return false;
  dirty_ = false;
  return write_file_atomically(dir_ + "/" + kSettingsFile, settings_text(pending_));
}

double SettingsStore::seconds_until_due(double now_s) const {
  if (!dirty_) return -1.0;
  return std::max(0.0, kSaveDelayS - (now_s - changed_at_s_));
}

}  // namespace attiscope::gui
