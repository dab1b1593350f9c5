// track_report.hpp: what `attiscope track` prints about a pose log, as the `track --json`
// object (design.md) and as a readable table. The Track panel's copy-as-JSON uses the same
// function.
//
// JSON keys others rely on: samples, bad_rows [{line, reason}], events [{sample, kind}],
// columns, duration_s. More keys: reading, has_time, time_unit, rate_hz, euler, counts,
// near_lock_spans, min_lock_margin_deg, max_rate_deg_s, max_rate_sample, options, and
// "clean" when a clean copy was exported. Angles in degrees; numbers round-trip (17 digits).
#pragma once

#include <atomic>
#include <functional>

#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <vector>

#include "attiscope/core/expected.hpp"
#include "attiscope/core/track.hpp"
#include "attiscope/core/track_analysis.hpp"
#include "attiscope/core/track_clean.hpp"

namespace attiscope {

/// What was exported, for the report.
struct TrackExportSummary {
  std::string path;
  TrackExportOptions options;
  std::vector<CleanChange> changes;  ///< clean_track's, then the Euler unwrap's
};

/// Rows written so far and the track's rows, while an export runs.
using ExportProgress = std::function<void(std::size_t done, std::size_t total)>;

/// Exports the clean copy of a track (clean_track) as CSV (write_track_csv) to `path`,
/// streamed to a temporary file beside it and renamed at the end (atomic_file.hpp: a
/// failure or a cancel leaves an old file whole; the CSV is never held in memory). The
/// command line's --export and the Track panel's Export both call this. `progress` is
/// called every block of rows; setting `cancel` stops the export. Error: the file cannot be
/// written (the message names it), or the export was cancelled.
Expected<TrackExportSummary> export_clean_track(const Track& track, const TrackExportOptions& options,
                                                const std::string& path, const ExportProgress& progress = {},
                                                const std::atomic<bool>* cancel = nullptr);

/// One event as JSON: {"sample", "kind", "count", "time_s"} and a kind-specific detail
/// ("dot", "angle" and "step_deg", "norm", "dt_s", "peak_rate_deg_s").
nlohmann::json track_event_json(const Track& track, const TrackEvent& e);

/// The `track --json` object.
nlohmann::json track_json(const Track& track, const TrackDiagnosis& d, const TrackDiagnosisOptions& o,
                          const std::optional<TrackExportSummary>& exported = std::nullopt);

/// The same content as text. At most `max_rows` events and bad rows are listed (the count
/// of the rest is said); the JSON always lists all.
std::string track_table(const Track& track, const TrackDiagnosis& d, const TrackDiagnosisOptions& o,
                        const std::optional<TrackExportSummary>& exported = std::nullopt,
                        std::size_t max_rows = 40);

}  // namespace attiscope
