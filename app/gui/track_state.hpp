// track_state.hpp: the Track panel's state: the loaded log, its plot data and diagnosis
// (computed by core), the background job that reads or re-analyses it, the timeline and the
// plot view. The log itself is not undoable (it is a file); the poses it puts in the
// document are.
//
// Threads: a job runs on its own std::thread and touches only its TrackJob (atomic progress
// and cancel flag, results written before `finished` is set). The window thread polls
// `finished` each frame and only then reads the results; it never blocks on the job.
#pragma once

#include <array>
#include <atomic>
#include <cstddef>
#include <memory>
#include <optional>
#include <string>
#include <thread>
#include <vector>

#include "attiscope/core/columns.hpp"
#include "attiscope/core/expected.hpp"
#include "attiscope/core/track.hpp"
#include "attiscope/core/track_analysis.hpp"
#include "attiscope/core/track_clean.hpp"
#include "attiscope/core/track_plot.hpp"
#include "attiscope/core/track_report.hpp"
#include "gui/plot_picture.hpp"

namespace attiscope::gui {

/// What a background job is doing (shown beside the progress bar).
enum class TrackJobStage : int { Reading = 0, Plotting = 1, Diagnosing = 2, Exporting = 3 };

struct TrackJob {
  // Shared with the thread.
  std::atomic<bool> cancel{false};
  std::atomic<bool> finished{false};
  std::atomic<int> stage{0};
  std::atomic<std::size_t> done{0};
  std::atomic<std::size_t> total{0};
  // Written by the thread before `finished`, read by the window thread after it.
  bool reads_file = false;  ///< a load (else a re-analysis of the current track, or an export)
  bool exports = false;     ///< an export of the clean copy (export_clean_track)
  std::optional<TrackExportSummary> exported;
  std::optional<Error> error;
  std::shared_ptr<const Track> track;
  std::unique_ptr<TrackPlotData> plot;  ///< null when the plot data did not change
  std::optional<TrackDiagnosis> diagnosis;
  std::thread thread;

  TrackJob() = default;
  TrackJob(const TrackJob&) = delete;
  TrackJob& operator=(const TrackJob&) = delete;
  /// Cancels and waits: a job never outlives its state.
  ~TrackJob();
};

/// The plots' envelopes of the last frame, and what they were computed for.
struct TrackPlotCache {
  std::size_t generation = 0;  ///< TrackPanelState::plot_generation they came from
  double t0 = 0.0, t1 = 0.0;
  std::size_t columns = 0;
  std::vector<PlotChannel> channels;
  std::vector<PlotEnvelope> envelopes;  ///< one per channel, in `channels` order
};

/// What a plot's picture shows: it is painted again only when one of these changes (data,
/// diagnosis, view, place, size, vertical range or pixel scale), never for a scrub.
struct TrackPlotPictureKey {
  std::size_t plot_generation = 0, diagnosis_generation = 0;
  double t0 = 0.0, t1 = 0.0;
  float x0 = 0.0f, y0 = 0.0f, x1 = 0.0f, y1 = 0.0f;
  float lo = 0.0f, hi = 0.0f;
  float scale_x = 0.0f, scale_y = 0.0f;
  bool operator==(const TrackPlotPictureKey& o) const {
    return plot_generation == o.plot_generation && diagnosis_generation == o.diagnosis_generation &&
           t0 == o.t0 && t1 == o.t1 && x0 == o.x0 && y0 == o.y0 && x1 == o.x1 && y1 == o.y1 && lo == o.lo &&
           hi == o.hi && scale_x == o.scale_x && scale_y == o.scale_y;
  }
};

/// One plot's curves as a picture (background, spans near lock, zero line, traces); the
/// cursor, labels and hover read-out are drawn live on top of it.
struct TrackPlotPicture {
  PlotPicture picture;
  TrackPlotPictureKey key;
  bool painted = false;
};

/// The Track panel's inner tabs.
enum class TrackTab { Plots, Events, Columns, BadRows, Export };

struct TrackPanelState {
  std::string path_input;                ///< the path box
  std::string path;                      ///< the log loaded (or being loaded)
  std::optional<ColumnMapping> mapping;  ///< found from the file's head, or edited
  std::string error;                     ///< the last open or read error, with its place
  std::string message;                   ///< the last result line ("loaded ...", "cancelled")

  std::shared_ptr<const Track> track;
  std::unique_ptr<TrackPlotData> plot;
  std::size_t plot_generation = 1;  ///< counts replacements of `plot`
  TrackPlotCache plot_cache;
  TrackDiagnosis diagnosis;
  std::size_t diagnosis_generation = 1;  ///< counts replacements of `diagnosis`
  /// The plots' pictures, one per kind of plot (quaternion, Euler, lock margin, rate).
  std::array<TrackPlotPicture, 4> pictures;
  bool pictures_failed = false;    ///< GL could not make a picture: the plots draw straight
  std::size_t picture_paints = 0;  ///< pictures painted so far (a scrub paints none)
  std::unique_ptr<TrackJob> job;
  bool reanalyse_pending = false;  ///< a change came while a job ran: re-analyse after it

  // Analysis choices.
  int convention_index = -1;  ///< into all_euler_conventions(); -1: the house convention
  AngleMode mode = AngleMode::Wrapped;
  double rate_limit_deg_s = 0.0;  ///< 0: no fast_motion events

  // Timeline.
  std::size_t sample = 0;
  bool playing = false;
  float speed = 1.0f;        ///< track seconds per wall-clock second
  double play_time_s = 0.0;  ///< track time of the play head (between samples)

  // Plot view (track seconds); t1 <= t0: the whole track.
  double view_t0 = 0.0, view_t1 = 0.0;
  bool show_plot[4] = {true, true, true, true};  ///< quaternion, Euler, lock margin, rate
  TrackTab tab = TrackTab::Plots;
  bool select_tab = false;     ///< bring the Track tab to the front next frame
  bool tab_open = false;       ///< the Track tab was drawn this frame (the window widens it)
  bool tab_open_last = false;  ///< ... last frame

  // Export.
  std::string export_path;
  TrackExportOptions export_options;
  std::vector<CleanChange> export_changes;
  std::string export_message;

  TrackPanelState() = default;
  TrackPanelState(const TrackPanelState&) = delete;
  TrackPanelState& operator=(const TrackPanelState&) = delete;
};

}  // namespace attiscope::gui
