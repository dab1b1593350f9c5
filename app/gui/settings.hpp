// settings.hpp: the window's settings (not part of the document: no undo, kept between
// runs), their defaults, and where and how they are saved: the user's XDG config folder
// ($XDG_CONFIG_HOME/attiscope, else ~/.config/attiscope), never the working directory;
// debounced, and written atomically (a temporary file, then rename).
#pragma once

#include <optional>
#include <string>
#include <vector>

namespace attiscope::gui {

struct Settings {
  float ui_scale = 1.0f;          ///< on top of the monitor's content scale (HiDPI)
  bool use_content_scale = true;  ///< follow the monitor's content scale
  int window_width = 1280;        ///< last window size, in screen coordinates
  int window_height = 800;
  std::string convention_path;                  ///< the house convention file chosen last ("": default)
  std::vector<std::string> recent_conventions;  ///< convention files opened or saved, newest first
  double nudge_step_deg = 5.0;                  ///< keyboard nudge step
  bool show_scene = true;
  bool show_gimbal = true;
};

/// Puts `path` first in the recent convention files (no duplicates, at most kMaxRecent).
void remember_convention(Settings& s, const std::string& path);
inline constexpr std::size_t kMaxRecentConventions = 8;

/// The config folder: $XDG_CONFIG_HOME/attiscope, else $HOME/.config/attiscope; nullopt
/// when neither variable is set (then nothing is saved).
std::optional<std::string> config_dir();

/// Reads settings.json from `dir`; defaults for what is missing or malformed. `warning`
/// receives a sentence when the file existed but could not be read.
Settings load_settings(const std::string& dir, std::string* warning = nullptr);

/// Writes `text` to `path` atomically (path.tmp, then rename), creating the folder.
/// Returns false (and leaves the old file) when it cannot.
bool write_file_atomically(const std::string& path, const std::string& text);

/// Saves settings a short while after the last change, so dragging a slider writes once.
class SettingsStore {
 public:
  /// `dir` empty: nothing is ever written.
  explicit SettingsStore(std::string dir) : dir_(std::move(dir)) {}
  /// Call when the settings changed; `now_s` is a monotonic clock in seconds.
  void changed(const Settings& s, double now_s);
  /// Writes when the last change is older than the delay; returns true when it wrote.
  bool save_if_due(double now_s);
  /// Writes now if anything is unsaved (on exit).
  bool flush();
  /// Seconds until a pending save is due, or a negative number when none is pending.
  double seconds_until_due(double now_s) const;
  const std::string& dir() const { return dir_; }
  static constexpr double kSaveDelayS = 1.0;

 private:
  std::string dir_;
  Settings pending_;
  bool dirty_ = false;
  double changed_at_s_ = 0.0;
};

}  // namespace attiscope::gui
