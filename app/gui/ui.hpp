// ui.hpp: what every panel gets each frame: the document, the settings, the window's
// transient state (the intake text, the regions left for the 3D views) and the fonts.
// Panels are functions `void draw_NAME(Ui&)`, one file each; they read the document, draw,
// and turn edits into document commands. They call core for every number they show.
#pragma once

#include <map>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include <imgui.h>

#include "attiscope/core/finder.hpp"
#include "attiscope/core/intake.hpp"
#include "gui/check_state.hpp"
#include "gui/document.hpp"
#include "gui/settings.hpp"
#include "gui/teaching.hpp"
#include "gui/track_state.hpp"

namespace attiscope::gui {

/// A rectangle of the window's framebuffer in pixels, origin bottom-left (what glViewport
/// and glScissor take). Empty (w or h 0) when the region is hidden.
struct FramebufferRect {
  int x = 0;
  int y = 0;
  int width = 0;
  int height = 0;
  bool empty() const { return width <= 0 || height <= 0; }
};

/// The House convention panel's transient state (not undoable: the convention itself is).
struct HousePanelState {
  std::string path_input;             ///< the "file" box: load from / save as
  std::string error;                  ///< the last load or save error, with line and column
  std::vector<std::string> warnings;  ///< unknown keys of the last load
  std::string saved_text;             ///< the file text at the last load or save (unsaved marker)
  std::string card_png;               ///< the card export's PNG path
  std::string message;                ///< the last save or export result
};

/// The Finder panel's boxes and last results.
struct FinderPanelState {
  std::string a, b;
  bool dirty = false;
  std::string error;
  std::optional<FinderResult> result;
  std::string gravity_path;
  std::string gravity_error;
  std::optional<GravityResult> gravity;
};

struct Views;  // gui/views.hpp: the 3D views and their renderer

struct Ui {
  Ui(Document& document, Settings& window_settings);
  ~Ui();
  Ui(const Ui&) = delete;
  Ui& operator=(const Ui&) = delete;
  Document& doc;
  Settings& settings;
  bool settings_changed = false;     ///< a panel changed a setting this frame
  ImFont* mono = nullptr;            ///< numbers
  ImFont* heading = nullptr;         ///< card titles
  float scale = 1.0f;                ///< content scale x UI scale
  std::string intake_text;           ///< the Intake paste box
  std::string lower_tab = "Intake";  ///< the open tab of the lower-right tools window
  bool focus_intake = false;         ///< Ctrl+V was pressed outside a text field
  bool spinning = false;             ///< the body turns continuously (toolbar toggle)
  bool rebuild_fonts = false;        ///< the UI scale changed
  bool partial_redraw = false;       ///< frames repaint only what changed (redraw.hpp)
  FramebufferRect scene_viewport;    ///< where the Scene's 3D view goes
  FramebufferRect gimbal_viewport;   ///< where the Gimbal rings go
  std::string status;                ///< one line at the foot of the toolbar ("copied ...")
  /// Screen rectangles of named widgets this frame ("quaternion.0", "undo"...), so test
  /// scripts can click them like a person would.
  std::map<std::string, ImVec4> widgets;
  /// What the Intake panel lists this frame (readings as shown, or the error), for dumps.
  nlohmann::json intake_listing;
  /// The paste box's edit buffer (ImGui 1.86 edits a fixed char array), kept between frames.
  std::string intake_buffer;
  /// The last reading of the paste box and what it was read against: the text is read again
  /// only when it or the house preferences change, not every frame.
  struct IntakeReading {
    std::string text;
    IntakePreferences preferences;
    std::optional<Expected<IntakeResult>> result;
  } intake_reading;
  HousePanelState house;
  TeachState teach;
  FinderPanelState finder;
  ComparePanelState compare;  ///< the Compare panel's inputs
  MountPanelState mount;      ///< the Mount check panel's inputs
  TrackPanelState track;      ///< the Track panel's log, job, timeline and view
  /// A pose shown instead of the document's without committing it (the Compare panel's
  /// SLERP slider). The Scene draws shown_pose.value_or(doc.pose()), with the document's
  /// reference as the ghost. Cleared when the preview ends.
  std::optional<Rotation> shown_pose;
  /// What the Compare and Mount check panels show this frame, for test dumps ("panels").
  nlohmann::json panel_state = nlohmann::json::object();
  /// The Scene and Gimbal rings views (never null).
  std::unique_ptr<Views> views;
};

/// Records the last ImGui item under a test name.
void record_widget(Ui& ui, const std::string& name);

/// Converts a region of the ImGui display (points, origin top-left) into framebuffer pixels.
FramebufferRect to_framebuffer_rect(ImVec2 min, ImVec2 max);

void draw_toolbar(Ui& ui);
void draw_readouts(Ui& ui);
void draw_card(Ui& ui, Card card);
void draw_intake(Ui& ui);
void draw_scene_panel(Ui& ui);
void draw_gimbal_panel(Ui& ui);
/// The lower right region: Intake, House convention, Teach and Finder as tabs.
void draw_lower_tabs(Ui& ui);
void draw_house_panel(Ui& ui);
void draw_teach_panel(Ui& ui);
void draw_finder_panel(Ui& ui);

/// Loads a convention file into the document (one undo step) and the recent files; on an
/// error the document is unchanged and ui.house.error names the line and column.
bool open_convention(Ui& ui, const std::string& path);
/// Advances the teaching mode's play position by dt seconds.
void advance_teaching(Ui& ui, double dt_s);
void draw_compare_panel(Ui& ui);
void draw_mount_panel(Ui& ui);
void draw_track_panel(Ui& ui);

/// Starts loading a pose log into the Track panel on a background thread (the columns are
/// found from the file's head first). False, with ui.track.error set, when the file cannot be
/// read or no rotation columns are found.
bool open_track(Ui& ui, const std::string& path);
/// Each frame: takes a finished job's results, advances playback by dt seconds.
void update_track(Ui& ui, double dt_s);
/// A job is running (the window keeps drawing to show its progress).
bool track_job_running(const Ui& ui);
/// Playing or loading: the window wakes on a timer.
bool track_animating(const Ui& ui);
/// Moves the timeline by `delta` samples (the pose follows through the document).
void step_track(Ui& ui, long delta);
/// Cancels a running job and waits for it (before the window closes).
void shutdown_track(Ui& ui);
/// The panel's state for test dumps.
nlohmann::json track_dump(const Ui& ui);

/// Keyboard shortcuts of the whole window (undo, redo, nudges, Ctrl+V to the intake).
void handle_shortcuts(Ui& ui);

/// The window's look: palette and spacing, at a scale.
void apply_theme(float scale);

}  // namespace attiscope::gui
