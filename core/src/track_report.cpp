// track_report.cpp: the `track --json` object and the plain-text table of a diagnosis.
#include "attiscope/core/track_report.hpp"

#include <cmath>
#include <cstdio>
#include <sstream>

#include "attiscope/core/atomic_file.hpp"

namespace attiscope {

namespace {

constexpr double kDeg = 180.0 / M_PI;

nlohmann::json finite_or_null(double v) {
  return std::isfinite(v) ? nlohmann::json(v) : nlohmann::json();
}

std::string num(double v, int precision = 6) {
  char buf[40];
  std::snprintf(buf, sizeof buf, "%.*g", precision, v);
  return buf;
}

std::string representation_name(ExportRepresentation r) {
  switch (r) {
    case ExportRepresentation::Quaternion: return "quaternion";
    case ExportRepresentation::Euler: return "euler";
    case ExportRepresentation::Matrix: return "matrix";
  }
  return "unknown";
}

std::string event_detail(const TrackEvent& e) {
  const std::string angle = e.channel == 0 ? "first angle" : "third angle";
  switch (e.kind) {
    case TrackEventKind::SignFlip:
      return "q . q_prev = " + num(e.value, 4) + ": same rotation, opposite sign";
    case TrackEventKind::Wrap: return angle + " wrapped by " + num(e.value * kDeg, 5) + " deg";
    case TrackEventKind::NearLock: return angle + " jumped " + num(e.value * kDeg, 4) + " deg near lock";
    case TrackEventKind::NonUnit:
      return "norm " + num(e.value, 8) + (e.count > 1 ? " (" + std::to_string(e.count) + " samples)" : "");
    case TrackEventKind::TimeBackwards: return "time step " + num(e.value, 6) + " s";
    case TrackEventKind::TimeRepeat: return "same time as the sample before";
    case TrackEventKind::FastMotion:
      return "peak " + num(e.value * kDeg, 5) + " deg/s over " + std::to_string(e.count) + " samples";
  }
  return {};
}

nlohmann::json change_json(const CleanChange& c) {
  nlohmann::json j = {{"sample", c.sample}, {"kind", clean_change_kind_name(c.kind)}, {"count", c.count}};
  if (c.kind == CleanChangeKind::Normalised) j["norm"] = c.value;
  if (c.kind == CleanChangeKind::EulerUnwrapped) {
    j["angle"] = c.channel + 1;
    j["turns_added"] = c.value;
  }
  return j;
}

}  // namespace

Expected<TrackExportSummary> export_clean_track(const Track& track, const TrackExportOptions& options,
                                                const std::string& path, const ExportProgress& progress,
                                                const std::atomic<bool>* cancel) {
  auto cancelled = [cancel] { return cancel != nullptr && cancel->load(std::memory_order_relaxed); };
  const Error cancelled_error{"the export to '" + path +
                              "' was cancelled; the old file (if any) is unchanged"};
  CleanTrack clean = clean_track(track);
  if (cancelled()) return cancelled_error;
  TrackExportSummary summary;
  summary.path = path;
  summary.options = options;
  summary.changes = std::move(clean.changes);
  const std::size_t total = clean.track.size();
  auto saved = write_file_atomically_streamed(path, [&](std::ostream& out) -> Expected<bool> {
    auto written = write_track_csv(out, clean.track, options, &summary.changes, [&](std::size_t rows) {
      if (progress) progress(rows, total);
      return !cancelled();
    });
    if (!written) return written.error();
    return true;
  });
  if (!saved && cancelled()) return cancelled_error;
  if (!saved) return Error{"cannot write '" + path + "': " + saved.error().message};
  return summary;
}

nlohmann::json track_event_json(const Track& track, const TrackEvent& e) {
  nlohmann::json j = {
      {"sample", e.sample}, {"kind", std::string(track_event_kind_name(e.kind))}, {"count", e.count}};
  j["time_s"] = e.sample < track.size() ? finite_or_null(track.time_s[e.sample]) : nlohmann::json();
  switch (e.kind) {
    case TrackEventKind::SignFlip: j["dot"] = e.value; break;
    case TrackEventKind::Wrap:
    case TrackEventKind::NearLock:
      j["angle"] = e.channel + 1;  // 1: first angle, 3: third angle
      j["step_deg"] = e.value * kDeg;
      break;
    case TrackEventKind::NonUnit: j["norm"] = e.value; break;
    case TrackEventKind::TimeBackwards:
    case TrackEventKind::TimeRepeat: j["dt_s"] = e.value; break;
    case TrackEventKind::FastMotion: j["peak_rate_deg_s"] = e.value * kDeg; break;
  }
  return j;
}

nlohmann::json track_json(const Track& track, const TrackDiagnosis& d, const TrackDiagnosisOptions& o,
                          const std::optional<TrackExportSummary>& exported) {
  const TrackSummary& s = d.summary;
  nlohmann::json j;
  j["samples"] = s.samples;
  j["bad_rows"] = nlohmann::json::array();
  for (const BadRow& b : track.bad_rows) j["bad_rows"].push_back({{"line", b.line}, {"reason", b.reason}});
  j["events"] = nlohmann::json::array();
  for (const TrackEvent& e : d.events) j["events"].push_back(track_event_json(track, e));
  j["columns"] = nlohmann::json::array();
  for (const TrackColumn& c : track.columns) j["columns"].push_back({{"name", c.name}, {"role", c.role}});
  j["duration_s"] = s.duration_s ? nlohmann::json(*s.duration_s) : nlohmann::json();
  j["rate_hz"] = s.rate_hz ? nlohmann::json(*s.rate_hz) : nlohmann::json();
  j["reading"] = track.reading;
  j["has_time"] = track.has_time;
  j["time_unit"] = track.has_time ? nlohmann::json(track.time_unit) : nlohmann::json();
  j["euler"] = {{"sequence", o.euler.sequence()}, {"kind", o.euler.kind_name()}};
  nlohmann::json counts = nlohmann::json::object();
  for (int k = 0; k < 7; ++k)
    counts[std::string(track_event_kind_name(static_cast<TrackEventKind>(k)))] = s.counts[k];
  j["counts"] = counts;
  j["near_lock_spans"] = nlohmann::json::array();
  for (const NearLockSpan& sp : s.near_lock_spans) {
    j["near_lock_spans"].push_back({{"first", sp.first},
                                    {"last", sp.last},
                                    {"first_time_s", track.time_s[sp.first]},
                                    {"last_time_s", track.time_s[sp.last]},
                                    {"min_margin_deg", sp.min_margin_rad * kDeg},
                                    {"min_sample", sp.min_sample}});
  }
  j["min_lock_margin_deg"] = finite_or_null(s.min_lock_margin_rad * kDeg);
  j["max_rate_deg_s"] = s.max_rate_rad_s * kDeg;
  j["max_rate_sample"] = s.max_rate_sample;
  j["options"] = {{"rate_limit_deg_s",
                   o.rate_limit_rad_s ? nlohmann::json(*o.rate_limit_rad_s * kDeg) : nlohmann::json()},
                  {"near_lock_margin_deg", o.near_lock_margin_rad * kDeg},
                  {"near_lock_jump_deg", o.near_lock_jump_rad * kDeg},
                  {"unit_tolerance", o.unit_tolerance}};
  if (exported) {
    nlohmann::json c = {{"file", exported->path},
                        {"representation", representation_name(exported->options.representation)},
                        {"header", track_csv_header(exported->options)}};
    c["changes"] = nlohmann::json::array();
    for (const CleanChange& ch : exported->changes) c["changes"].push_back(change_json(ch));
    j["clean"] = c;
  }
  return j;
}

std::string track_table(const Track& track, const TrackDiagnosis& d, const TrackDiagnosisOptions& o,
                        const std::optional<TrackExportSummary>& exported, std::size_t max_rows) {
  const TrackSummary& s = d.summary;
  std::string out;
  auto line = [&out](const std::string& key, const std::string& value) {
    std::string k = key;
    k.resize(14, ' ');
    out += k + value + "\n";
  };
  line("samples",
       std::to_string(s.samples) +
           (track.bad_rows.empty() ? "" : " (" + std::to_string(track.bad_rows.size()) + " bad rows)"));
  std::string cols;
  for (const TrackColumn& c : track.columns) cols += (cols.empty() ? "" : ", ") + c.name + " -> " + c.role;
  line("reading", track.reading + (cols.empty() ? "" : " (" + cols + ")"));
  if (s.duration_s) {
    line("duration", num(*s.duration_s) + " s" + (s.rate_hz ? " at " + num(*s.rate_hz, 5) + " Hz" : ""));
  } else {
    line("duration", "no time column: times are sample numbers");
  }
  line("max rate", num(s.max_rate_rad_s * kDeg, 5) + (track.has_time ? " deg/s" : " deg/sample") +
                       " at sample " + std::to_string(s.max_rate_sample));
  line("lock margin", "min " + num(s.min_lock_margin_rad * kDeg, 5) + " deg in " + o.euler.name() + "; " +
                          std::to_string(s.near_lock_spans.size()) + " span(s) below " +
                          num(o.near_lock_margin_rad * kDeg, 3) + " deg");
  for (const NearLockSpan& sp : s.near_lock_spans) {
    line("", "samples " + std::to_string(sp.first) + "-" + std::to_string(sp.last) + " (t " +
                 num(track.time_s[sp.first]) + " to " + num(track.time_s[sp.last]) + "), min " +
                 num(sp.min_margin_rad * kDeg, 4) + " deg at sample " + std::to_string(sp.min_sample));
  }
  std::string counts;
  for (int k = 0; k < 7; ++k) {
    if (s.counts[k] == 0) continue;
    counts += (counts.empty() ? "" : ", ") + std::to_string(s.counts[k]) + " " +
              std::string(track_event_kind_name(static_cast<TrackEventKind>(k)));
  }
  line("events", std::to_string(d.events.size()) + (counts.empty() ? "" : ": " + counts));
  if (!o.rate_limit_rad_s) line("", "(no --rate-limit given: fast motion not checked)");
  std::size_t shown = 0;
  for (const TrackEvent& e : d.events) {
    if (shown++ == max_rows) {
      out += "  ... " + std::to_string(d.events.size() - max_rows) + " more (--json lists all)\n";
      break;
    }
    std::string sample = std::to_string(e.sample), kind(track_event_kind_name(e.kind)),
                t = num(track.time_s[e.sample]);
    sample.resize(10, ' ');
    kind.resize(16, ' ');
    t.resize(12, ' ');
    out += "  " + sample + t + kind + event_detail(e) + "\n";
  }
  if (!track.bad_rows.empty()) {
    line("bad rows", std::to_string(track.bad_rows.size()) + " (not loaded)");
    shown = 0;
    for (const BadRow& b : track.bad_rows) {
      if (shown++ == max_rows) {
        out += "  ... " + std::to_string(track.bad_rows.size() - max_rows) + " more (--json lists all)\n";
        break;
      }
      out += "  line " + std::to_string(b.line) + ": " + b.reason + "\n";
    }
  }
  if (exported) {
    std::size_t flips = 0, normalised = 0, unwraps = 0;
    for (const CleanChange& c : exported->changes) {
      if (c.kind == CleanChangeKind::SignFlipped) flips += c.count;
      if (c.kind == CleanChangeKind::Normalised) normalised += c.count;
      if (c.kind == CleanChangeKind::EulerUnwrapped) ++unwraps;
    }
    line("clean copy", exported->path + " (" + track_csv_header(exported->options) + ")");
    line("", std::to_string(flips) + " samples negated, " + std::to_string(normalised) + " normalised, " +
                 std::to_string(unwraps) + " Euler unwrap steps; times unchanged");
  }
  return out;
}

}  // namespace attiscope
