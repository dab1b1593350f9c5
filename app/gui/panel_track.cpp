// panel_track.cpp: the Track panel: a whole pose log, loaded on a background thread (with
// progress and cancel), its column mapping shown and editable, a timeline that moves the
// document's pose (so the scene and every readout follow), plots against time drawn from
// core's min/max envelopes (painted once per view into a picture, plot_picture.hpp, so a scrub
// redraws only the cursor), the diagnosis as a table that jumps to the sample, the rows that
// failed to parse, and the clean export. Every number comes from core: read_track_file,
// build_track_plot, plot_envelopes, diagnose_track, export_clean_track (the same calls as
// `attiscope track`).
#include <GLFW/glfw3.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <utility>

#include "attiscope/core/track_report.hpp"
#include "gui/text_field.hpp"
#include "gui/ui.hpp"

namespace attiscope::gui {

namespace {

constexpr std::size_t kPathCapacity = 1024;
/// Worker threads for the plot data and the diagnosis (the machine has two cores).
constexpr unsigned kAnalysisThreads = 2;
/// Playback speeds offered (track seconds per second).
constexpr float kSpeeds[] = {0.1f, 0.25f, 0.5f, 1.0f, 2.0f, 4.0f, 10.0f, 100.0f};
/// Mouse-wheel zoom per notch.
constexpr double kZoomPerNotch = 0.8;
/// A plot press that moved less than this (points) is a click (jump), not a pan.
constexpr float kClickSlop = 3.0f;
/// Plot heights (points) below which a plot is not worth drawing.
constexpr float kMinPlotHeight = 36.0f;
constexpr double kDegPerRad = 180.0 / 3.14159265358979323846;

const char* stage_name(int s) {
  switch (static_cast<TrackJobStage>(s)) {
    case TrackJobStage::Reading: return "reading";
    case TrackJobStage::Plotting: return "plotting";
    case TrackJobStage::Diagnosing: return "diagnosing";
    case TrackJobStage::Exporting: return "exporting";
  }
  return "";
}

std::string num(double v, int digits = 6) {
  char b[48];
  std::snprintf(b, sizeof b, "%.*g", digits, v);
  return b;
}

EulerConvention plot_convention(const Ui& ui) {
  const TrackPanelState& st = ui.track;
  if (st.convention_index >= 0 && st.convention_index < 24)
    return all_euler_conventions()[static_cast<std::size_t>(st.convention_index)];
  return ui.doc.convention().house.euler.convention;
}

TrackDiagnosisOptions diagnosis_options(const Ui& ui) {
  TrackDiagnosisOptions o;
  o.euler = plot_convention(ui);
  if (ui.track.rate_limit_deg_s > 0.0) o.rate_limit_rad_s = ui.track.rate_limit_deg_s / kDegPerRad;
  o.threads = kAnalysisThreads;
  return o;
}

/// Starts the job's thread; `work` fills the job (it runs off the window thread).
template <class F>
void start_job(TrackPanelState& st, std::unique_ptr<TrackJob> job, F work) {
  TrackJob* j = job.get();
  st.job = std::move(job);
  j->thread = std::thread([j, work = std::move(work)]() mutable {
    work(*j);
    j->finished.store(true, std::memory_order_release);
    glfwPostEmptyEvent();  // wake the window (it may be waiting for events)
  });
}

/// A load: the file with the current mapping, then the plot data and the diagnosis.
void start_load(Ui& ui) {
  TrackPanelState& st = ui.track;
  auto job = std::make_unique<TrackJob>();
  job->reads_file = true;
  const std::string path = st.path;
  const ColumnMapping mapping = *st.mapping;
  const EulerConvention c = plot_convention(ui);
  const AngleMode mode = st.mode;
  const TrackDiagnosisOptions options = diagnosis_options(ui);
  start_job(st, std::move(job), [path, mapping, c, mode, options](TrackJob& j) {
    auto read = read_track_file(
        path, mapping,
        [&j](std::size_t done, std::size_t total) {
          j.done.store(done, std::memory_order_relaxed);
          j.total.store(total, std::memory_order_relaxed);
        },
        &j.cancel);
    if (!read) {
      j.error = read.error();
      return;
    }
    auto track = std::make_shared<Track>(std::move(read.value()));
    if (j.cancel.load()) {
      j.error = Error{"reading the log was cancelled"};
      return;
    }
    j.stage.store(static_cast<int>(TrackJobStage::Plotting));
    j.plot = std::make_unique<TrackPlotData>();
    build_track_plot(*track, c, mode, kAnalysisThreads, j.plot.get());
    if (j.cancel.load()) {
      j.error = Error{"reading the log was cancelled"};
      return;
    }
    j.stage.store(static_cast<int>(TrackJobStage::Diagnosing));
    j.diagnosis = diagnose_track(*track, options);
    j.track = std::move(track);
  });
}

/// A re-analysis of the loaded track: new plot data (convention, angle mode) and diagnosis.
void start_reanalyse(Ui& ui) {
  TrackPanelState& st = ui.track;
  if (!st.track) return;
  if (st.job) {
    st.reanalyse_pending = true;
    return;
  }
  st.reanalyse_pending = false;
  auto job = std::make_unique<TrackJob>();
  job->stage.store(static_cast<int>(TrackJobStage::Plotting));
  std::shared_ptr<const Track> track = st.track;
  const EulerConvention c = plot_convention(ui);
  const AngleMode mode = st.mode;
  const bool replot = !st.plot || st.plot->convention != c || st.plot->mode != mode;
  const TrackDiagnosisOptions options = diagnosis_options(ui);
  start_job(st, std::move(job), [track, c, mode, replot, options](TrackJob& j) {
    if (replot) {
      j.plot = std::make_unique<TrackPlotData>();
      build_track_plot(*track, c, mode, kAnalysisThreads, j.plot.get());
    }
    j.stage.store(static_cast<int>(TrackJobStage::Diagnosing));
    j.diagnosis = diagnose_track(*track, options);
    j.track = track;
  });
}

/// An export of the clean copy, streamed to the file (atomically) off the window thread,
/// with the same progress bar and cancel as a load.
void start_export(Ui& ui) {
  TrackPanelState& st = ui.track;
  if (!st.track || st.job) return;
  auto job = std::make_unique<TrackJob>();
  job->exports = true;
  job->stage.store(static_cast<int>(TrackJobStage::Exporting));
  job->total.store(st.track->size());
  std::shared_ptr<const Track> track = st.track;
  const TrackExportOptions options = st.export_options;
  const std::string path = st.export_path;
  st.export_changes.clear();
  st.export_message = "exporting to " + path;
  start_job(st, std::move(job), [track, options, path](TrackJob& j) {
    auto r = export_clean_track(
        *track, options, path,
        [&j](std::size_t done, std::size_t total) {
          j.done.store(done, std::memory_order_relaxed);
          j.total.store(total, std::memory_order_relaxed);
        },
        &j.cancel);
    if (!r) {
      j.error = r.error();
      return;
    }
    j.exported = std::move(r.value());
  });
}

Rotation sample_rotation(const Track& t, std::size_t i) {
  return Rotation(Eigen::Quaterniond(t.qw[i], t.qx[i], t.qy[i], t.qz[i]));
}

double first_time(const Ui& ui) {
  const TrackPanelState& st = ui.track;
  return st.track && st.track->size() ? st.track->time_s.front() : 0.0;
}
double last_time(const Ui& ui) {
  const TrackPanelState& st = ui.track;
  if (!st.track || st.track->size() == 0) return 0.0;
  if (st.plot && !st.plot->sorted_time_s.empty()) return st.plot->sorted_time_s.back();
  return st.track->time_s.back();
}

/// Puts sample i into the document (one undo step for a run of timeline moves).
void show_sample(Ui& ui, std::size_t i) {
  TrackPanelState& st = ui.track;
  if (!st.track || st.track->size() == 0) return;
  i = std::min(i, st.track->size() - 1);
  st.sample = i;
  st.play_time_s = st.track->time_s[i];
  if (!ui.doc.in_motion()) ui.doc.begin_motion("track timeline");
  ui.doc.move_pose(sample_rotation(*st.track, i));
}

/// Keeps the plot view inside the track's time range.
void clamp_view(Ui& ui) {
  TrackPanelState& st = ui.track;
  const double a = first_time(ui), b = last_time(ui);
  if (!(b > a)) {
    st.view_t0 = a;
    st.view_t1 = a + 1.0;
    return;
  }
  if (!(st.view_t1 > st.view_t0)) {
    st.view_t0 = a;
    st.view_t1 = b;
  }
  const double span = std::min(b - a, st.view_t1 - st.view_t0);
  st.view_t0 = std::clamp(st.view_t0, a, b - span);
  st.view_t1 = st.view_t0 + span;
}

void take_finished_job(Ui& ui) {
  TrackPanelState& st = ui.track;
  if (!st.job || !st.job->finished.load(std::memory_order_acquire)) return;
  std::unique_ptr<TrackJob> job = std::move(st.job);
  job->thread.join();
  if (job->exports) {
    if (job->exported) {
      st.export_changes = std::move(job->exported->changes);
      st.export_message = "wrote " + job->exported->path + ": " + std::to_string(st.track->size()) +
                          " samples, " + std::to_string(st.export_changes.size()) + " changes";
    } else {
      st.export_changes.clear();
      st.export_message = job->error ? job->error->describe() : std::string();
    }
    if (st.reanalyse_pending) start_reanalyse(ui);
    return;
  }
  if (job->error) {
    st.error = job->error->describe();
    st.message = job->cancel.load() ? "cancelled: the track shown (if any) is the one loaded before" : "";
    if (job->cancel.load()) st.error.clear();
  } else {
    const bool fresh = job->reads_file;
    st.track = std::move(job->track);
    if (job->plot) {
      st.plot = std::move(job->plot);
      ++st.plot_generation;
    }
    if (job->diagnosis) {
      st.diagnosis = std::move(*job->diagnosis);
      ++st.diagnosis_generation;
    }
    st.error.clear();
    if (fresh) {
      st.message = "loaded " + std::to_string(st.track->size()) + " samples, " +
                   std::to_string(st.track->bad_rows.size()) + " rows not read";
      st.view_t0 = st.view_t1 = 0.0;
      st.playing = false;
      clamp_view(ui);
      if (st.track->size()) show_sample(ui, 0);
    }
  }
  if (st.reanalyse_pending) start_reanalyse(ui);
}

// ---- plots ----

struct PlotSpec {
  const char* key;    ///< widget name suffix
  const char* title;  ///< shown in the plot's corner
  std::vector<PlotChannel> channels;
  std::vector<const char*> names;
  std::vector<ImU32> colours;
  bool fixed = false;  ///< fixed vertical range [lo, hi]
  float lo = 0.0f, hi = 0.0f;
  bool lock_shading = false;
};

std::vector<PlotSpec> plot_specs(const Ui& ui) {
  const TrackPanelState& st = ui.track;
  // x red, y green, z blue (the trade's habit); w and the single channels in the accent.
  const ImU32 w_col = IM_COL32(228, 232, 238, 255), x_col = IM_COL32(230, 80, 70, 255),
              y_col = IM_COL32(90, 200, 90, 255), z_col = IM_COL32(80, 140, 240, 255),
              accent = IM_COL32(232, 163, 61, 255);
  std::vector<PlotSpec> out;
  if (st.show_plot[0])
    out.push_back({"quaternion",
                   "quaternion (as read)",
                   {PlotChannel::Qw, PlotChannel::Qx, PlotChannel::Qy, PlotChannel::Qz},
                   {"w", "x", "y", "z"},
                   {w_col, x_col, y_col, z_col},
                   true,
                   -1.05f,
                   1.05f,
                   false});
  if (st.show_plot[1]) {
    // Each angle in the colour of the axis it turns about.
    const EulerConvention c = plot_convention(ui);
    const ImU32 axis_col[3] = {x_col, y_col, z_col};
    PlotSpec e{"euler",
               "",
               {PlotChannel::Euler1, PlotChannel::Euler2, PlotChannel::Euler3},
               {},
               {axis_col[static_cast<int>(c.axes[0])], axis_col[static_cast<int>(c.axes[1])],
                axis_col[static_cast<int>(c.axes[2])]},
               false,
               0.0f,
               0.0f,
               true};
    static const char* kAxisNames[3][3] = {{"1st (X)", "2nd (X)", "3rd (X)"},
                                           {"1st (Y)", "2nd (Y)", "3rd (Y)"},
                                           {"1st (Z)", "2nd (Z)", "3rd (Z)"}};
    e.names = {kAxisNames[static_cast<int>(c.axes[0])][0], kAxisNames[static_cast<int>(c.axes[1])][1],
               kAxisNames[static_cast<int>(c.axes[2])][2]};
    if (st.mode == AngleMode::Wrapped) {
      e.fixed = true;
      e.lo = -185.0f;
      e.hi = 185.0f;
    } else if (st.mode == AngleMode::ZeroTo360) {
      e.fixed = true;
      e.lo = -95.0f;  // the middle angle stays in [-90, 90]
      e.hi = 365.0f;
    }
    out.push_back(e);
  }
  if (st.show_plot[2])
    out.push_back({"lock_margin",
                   "lock margin (deg)",
                   {PlotChannel::LockMargin},
                   {"margin"},
                   {accent},
                   true,
                   0.0f,
                   92.0f,
                   true});
  if (st.show_plot[3])
    out.push_back(
        {"rate", "angular rate (deg/s)", {PlotChannel::AngularRate}, {"rate"}, {accent}, false, 0, 0, false});
  return out;
}

/// Width (points) of one envelope column: two points halve the triangles llvmpipe sets up
/// for a dense trace and still show every spike.
constexpr float kColumnPx = 2.0f;
/// A pixel column whose (joined) bar is at most this tall is drawn as part of a line.
constexpr float kThinBarPx = 2.0f;
/// Line points within this distance (pixels) of the simplified line are dropped.
constexpr float kLineTolerancePx = 0.5f;
/// A simplified line keeps at least one point in this many (bounds the checks per point).
constexpr std::size_t kMaxDroppedRun = 48;

/// Drops the points of a polyline that lie within kLineTolerancePx of the line from the last
/// kept point to the next candidate (each dropped point is checked against every candidate).
void simplify_line(std::vector<ImVec2>* points) {
  std::vector<ImVec2>& p = *points;
  if (p.size() < 3) return;
  std::size_t kept = 0;  // index in p of the last point written out
  std::size_t out = 1;
  for (std::size_t i = 2; i < p.size(); ++i) {
    const ImVec2 a = p[kept], b = p[i];
    const float dx = b.x - a.x, dy = b.y - a.y;
    const float len = std::max(1e-6f, std::sqrt(dx * dx + dy * dy));
    bool fits = i - kept <= kMaxDroppedRun;
    for (std::size_t j = kept + 1; fits && j < i; ++j) {
      const float d = std::abs((p[j].x - a.x) * dy - (p[j].y - a.y) * dx) / len;
      if (d > kLineTolerancePx) fits = false;
    }
    if (!fits) {
      kept = i - 1;
      p[out++] = p[kept];
    }
  }
  p[out++] = p.back();
  p.resize(out);
}

float y_of(float v, float lo, float hi, float top, float bottom) {
  return bottom - (v - lo) / (hi - lo) * (bottom - top);
}

/// The part of a plot that a scrub leaves alone: background, spans near lock, zero line and
/// the channels' traces for the view t0..t1 (the envelopes' own), drawn into `dl` for p0..p1
/// with the vertical range lo..hi.
void draw_curves(ImDrawList* dl, const TrackPanelState& st, const PlotSpec& spec, const PlotEnvelope* env,
                 double t0, double t1, ImVec2 p0, ImVec2 p1, float lo, float hi) {
  const Track& track = *st.track;
  const TrackPlotData& plot = *st.plot;
  const double span = t1 - t0;
  const double width_d = static_cast<double>(p1.x - p0.x);
  auto x_at = [&](double t) { return p0.x + static_cast<float>((t - t0) / span * width_d); };
  dl->AddRectFilled(p0, p1, IM_COL32(20, 24, 32, 255));
  // Spans near lock, shaded across the plot.
  if (spec.lock_shading) {
    for (const NearLockSpan& s : st.diagnosis.summary.near_lock_spans) {
      const double a = track.time_s[s.first], b = track.time_s[std::min(s.last + 1, track.size() - 1)];
      if (b < t0 || a > t1) continue;
      dl->AddRectFilled(ImVec2(std::max(p0.x, x_at(a)), p0.y),
                        ImVec2(std::min(p1.x, std::max(x_at(b), x_at(a) + 1)), p1.y),
                        IM_COL32(200, 70, 60, 60));
    }
  }
  if (lo < 0.0f && hi > 0.0f) {
    // One whole pixel row (a 1-pixel anti-aliased line on a half-pixel boundary can drop out).
    const float yz = std::floor(y_of(0.0f, lo, hi, p0.y, p1.y));
    dl->AddRectFilled(ImVec2(p0.x, yz), ImVec2(p1.x, yz + 1.0f), IM_COL32(80, 90, 110, 255));
  }
  std::vector<ImVec2> thin;  // the current run of thin columns, as points
  for (std::size_t k = 0; k < spec.channels.size(); ++k) {
    const PlotEnvelope& e = env[k];
    const ImU32 col = spec.colours[k % spec.colours.size()];
    if (e.points) {
      ImVec2 prev;
      bool have_prev = false;
      for (std::size_t i = e.first; i <= e.last && i < track.size(); ++i) {
        const double v = plot_value(track, plot, spec.channels[k], i);
        if (!std::isfinite(v)) {
          have_prev = false;
          continue;
        }
        const ImVec2 p(x_at(track.time_s[i]), y_of(static_cast<float>(v), lo, hi, p0.y, p1.y));
        if (have_prev) dl->AddLine(prev, p, col, 1.5f);
        prev = p;
        have_prev = true;
      }
      continue;
    }
    // One bar per pixel column from min to max, joined to the neighbour so the trace is whole;
    // where the bars are thin (a smooth stretch) a simplified line instead, so a calm trace
    // costs a few segments rather than a quad per pixel (llvmpipe pays per triangle).
    float prev_lo = NAN, prev_hi = NAN;
    thin.clear();
    auto flush = [&] {
      if (thin.size() >= 2) {
        simplify_line(&thin);
        dl->AddPolyline(thin.data(), static_cast<int>(thin.size()), col, ImDrawFlags_None, 1.5f);
      } else if (thin.size() == 1) {
        dl->AddRectFilled(ImVec2(thin[0].x - 0.5f, thin[0].y - 0.75f),
                          ImVec2(thin[0].x + 0.5f, thin[0].y + 0.75f), col);
      }
      thin.clear();
    };
    for (std::size_t c = 0; c < e.min.size(); ++c) {
      float a = e.min[c], b = e.max[c];
      if (!std::isfinite(a) || !std::isfinite(b)) {
        prev_lo = prev_hi = NAN;
        flush();
        continue;
      }
      if (std::isfinite(prev_lo)) {
        a = std::min(a, prev_hi);
        b = std::max(b, prev_lo);
      }
      prev_lo = e.min[c];
      prev_hi = e.max[c];
      const float x = p0.x + kColumnPx * static_cast<float>(c);
      const float ya = y_of(a, lo, hi, p0.y, p1.y), yb = y_of(b, lo, hi, p0.y, p1.y);
      if (ya - yb <= kThinBarPx) {
        thin.push_back(ImVec2(x + 0.5f * kColumnPx, y_of(0.5f * (e.min[c] + e.max[c]), lo, hi, p0.y, p1.y)));
        continue;
      }
      flush();
      dl->AddRectFilled(ImVec2(x, yb), ImVec2(x + kColumnPx, std::max(ya, yb + 1.0f)), col);
    }
    flush();
  }
}

/// Draws one plot from its channels' envelopes (computed for the view st.view_t0..t1 at one
/// column per point of the plot's width); wheel and drag change the view for the next frame.
void draw_plot(Ui& ui, const PlotSpec& spec, std::size_t slot, const std::string& title, float height,
               const PlotEnvelope* env) {
  TrackPanelState& st = ui.track;
  const Track& track = *st.track;
  const TrackPlotData& plot = *st.plot;
  ImDrawList* dl = ImGui::GetWindowDrawList();
  const ImVec2 p0 = ImGui::GetCursorScreenPos();
  const float width = std::max(16.0f, ImGui::GetContentRegionAvail().x);
  const double width_d = static_cast<double>(width);
  const ImVec2 size(width, height);
  ImGui::InvisibleButton(spec.key, size);
  record_widget(ui, std::string("track.plot.") + spec.key);
  const bool hovered = ImGui::IsItemHovered();
  const ImGuiIO& io = ImGui::GetIO();
  const ImVec2 p1(p0.x + size.x, p0.y + size.y);
  const double t0 = st.view_t0, t1 = st.view_t1;
  const double span = t1 - t0;
  auto t_at = [&](float x) { return t0 + (static_cast<double>(x - p0.x) / width_d) * span; };
  auto x_at = [&](double t) { return p0.x + static_cast<float>((t - t0) / span * width_d); };
  // Zoom about the mouse, pan by dragging, click to jump.
  if (hovered && io.MouseWheel != 0.0f) {
    const double tm = t_at(io.MousePos.x);
    const double f = std::pow(kZoomPerNotch, static_cast<double>(io.MouseWheel));
    const double min_span =
        track.size() > 1 ? 4.0 * (last_time(ui) - first_time(ui)) / static_cast<double>(track.size()) : 1.0;
    const double new_span = std::max(min_span, span * f);
    st.view_t0 = tm - (tm - t0) * (new_span / span);
    st.view_t1 = st.view_t0 + new_span;
    clamp_view(ui);
  }
  if (ImGui::IsItemActive() && ImGui::IsMouseDragging(ImGuiMouseButton_Left, kClickSlop)) {
    const double dt = -static_cast<double>(io.MouseDelta.x) / width_d * span;
    st.view_t0 += dt;
    st.view_t1 += dt;
    clamp_view(ui);
  }
  if (ImGui::IsItemDeactivated()) {
    const ImVec2 d = ImVec2(io.MousePos.x - io.MouseClickedPos[0].x, io.MousePos.y - io.MouseClickedPos[0].y);
    if (std::abs(d.x) < kClickSlop && std::abs(d.y) < kClickSlop) {
      std::size_t i = sample_at_or_after(track, plot, t_at(io.MousePos.x));
      show_sample(ui, std::min(i, track.size() - 1));
      st.playing = false;
    }
  }
  float lo = spec.lo, hi = spec.hi;
  if (!spec.fixed) {
    lo = INFINITY;
    hi = -INFINITY;
    for (std::size_t k = 0; k < spec.channels.size(); ++k) {
      const PlotEnvelope& e = env[k];
      if (e.points) {
        for (std::size_t i = e.first; i <= e.last && i < track.size(); ++i) {
          for (PlotChannel ch : spec.channels) {
            const double v = plot_value(track, plot, ch, i);
            if (std::isfinite(v)) {
              lo = std::min(lo, static_cast<float>(v));
              hi = std::max(hi, static_cast<float>(v));
            }
          }
        }
        break;  // every channel's points were seen
      }
      for (std::size_t c = 0; c < e.min.size(); ++c) {
        if (std::isfinite(e.min[c])) lo = std::min(lo, e.min[c]);
        if (std::isfinite(e.max[c])) hi = std::max(hi, e.max[c]);
      }
    }
    if (!(hi >= lo)) lo = 0.0f, hi = 1.0f;
    const float pad = std::max(1e-3f, 0.05f * (hi - lo));
    lo = lo >= 0.0f ? std::max(0.0f, lo - pad) : lo - pad;  // a rate never goes below zero
    hi += pad;
  }
  // The curves come from the plot's picture, painted again only when what it shows changes.
  TrackPlotPicture* pic = slot < st.pictures.size() && !st.pictures_failed ? &st.pictures[slot] : nullptr;
  // The picture covers the whole pixels the plot touches, so its pixels are the window's
  // (a plot's edges need not fall on pixel boundaries); the clip rect keeps it to the plot.
  const ImVec2 scale = io.DisplayFramebufferScale;
  const ImVec2 box0(std::floor(p0.x * scale.x) / scale.x, std::floor(p0.y * scale.y) / scale.y);
  const ImVec2 box1(std::ceil(p1.x * scale.x) / scale.x, std::ceil(p1.y * scale.y) / scale.y);
  if (pic) {
    TrackPlotPictureKey key;
    key.plot_generation = st.plot_generation;
    key.diagnosis_generation = st.diagnosis_generation;
    key.t0 = t0;
    key.t1 = t1;
    key.x0 = p0.x;
    key.y0 = p0.y;
    key.x1 = p1.x;
    key.y1 = p1.y;
    key.lo = lo;
    key.hi = hi;
    key.scale_x = io.DisplayFramebufferScale.x;
    key.scale_y = io.DisplayFramebufferScale.y;
    if (!pic->painted || !(pic->key == key)) {
      ImDrawList content(ImGui::GetDrawListSharedData());
      PlotPicture::begin_content(&content, *dl, p0, p1);
      draw_curves(&content, st, spec, env, t0, t1, p0, p1, lo, hi);
      pic->painted = pic->picture.paint(&content, box0, box1, io.DisplayFramebufferScale);
      ++st.picture_paints;
      pic->key = key;
      if (!pic->painted) {
        st.pictures_failed = true;
        pic = nullptr;
      }
    }
  }
  dl->PushClipRect(p0, p1, true);
  if (pic) {
    pic->picture.show(dl, box0, box1);
  } else {
    draw_curves(dl, st, spec, env, t0, t1, p0, p1, lo, hi);
  }
  // The current sample.
  if (st.sample < track.size()) {
    const float xc = x_at(track.time_s[st.sample]);
    dl->AddLine(ImVec2(xc, p0.y), ImVec2(xc, p1.y), IM_COL32(232, 163, 61, 200), 1.0f);
  }
  dl->AddText(ImVec2(p0.x + 4, p0.y + 2), IM_COL32(200, 205, 215, 255), title.c_str());
  if (spec.channels.size() > 1) {  // a legend: each channel's name in its colour
    float x = p0.x + 4 + ImGui::CalcTextSize(title.c_str()).x + 12;
    for (std::size_t k = 0; k < spec.names.size(); ++k) {
      dl->AddText(ImVec2(x, p0.y + 2), spec.colours[k % spec.colours.size()], spec.names[k]);
      x += ImGui::CalcTextSize(spec.names[k]).x + 10;
    }
  }
  const std::string top = num(hi, 4), bottom = num(lo, 4);
  dl->AddText(ImVec2(p1.x - ImGui::CalcTextSize(top.c_str()).x - 4, p0.y + 2), IM_COL32(150, 155, 165, 255),
              top.c_str());
  dl->AddText(ImVec2(p1.x - ImGui::CalcTextSize(bottom.c_str()).x - 4, p1.y - ImGui::GetTextLineHeight() - 2),
              IM_COL32(150, 155, 165, 255), bottom.c_str());
  dl->PopClipRect();
  // Hover read-out: time, sample and each channel's value there.
  if (hovered && !ImGui::IsItemActive()) {
    dl->AddLine(ImVec2(io.MousePos.x, p0.y), ImVec2(io.MousePos.x, p1.y), IM_COL32(255, 255, 255, 90));
    const std::size_t i = std::min(sample_at_or_after(track, plot, t_at(io.MousePos.x)), track.size() - 1);
    std::string tip = "t " + num(track.time_s[i], 8) + " s  (sample " + std::to_string(i) + ")";
    for (std::size_t k = 0; k < spec.channels.size(); ++k)
      tip += "\n" + std::string(spec.names[k]) + "  " + num(plot_value(track, plot, spec.channels[k], i), 7);
    ImGui::SetTooltip("%s", tip.c_str());
  }
}

/// The plot's place in TrackPanelState::pictures (its kind, as in show_plot).
std::size_t picture_slot(const PlotSpec& spec) {
  static const char* const kKeys[] = {"quaternion", "euler", "lock_margin", "rate"};
  for (std::size_t k = 0; k < 4; ++k)
    if (std::string(spec.key) == kKeys[k]) return k;
  return 4;
}

void draw_plots(Ui& ui) {
  TrackPanelState& st = ui.track;
  const auto& all = all_euler_conventions();
  const std::string house = "house (" + ui.doc.convention().house.euler.convention.name() + ")";
  const EulerConvention c = plot_convention(ui);
  ImGui::SetNextItemWidth(190.0f * ui.scale);
  if (ImGui::BeginCombo("##convention", st.convention_index < 0 ? house.c_str() : c.name().c_str())) {
    if (ImGui::Selectable(house.c_str(), st.convention_index < 0)) {
      st.convention_index = -1;
      start_reanalyse(ui);
    }
    for (int k = 0; k < 24; ++k) {
      if (ImGui::Selectable(all[static_cast<std::size_t>(k)].name().c_str(), st.convention_index == k)) {
        st.convention_index = k;
        start_reanalyse(ui);
      }
    }
    ImGui::EndCombo();
  }
  record_widget(ui, "track.convention");
  ImGui::SameLine();
  static const char* kModes[] = {"wrapped", "0-360", "unwrapped"};
  int mode = static_cast<int>(st.mode);
  ImGui::SetNextItemWidth(110.0f * ui.scale);
  if (ImGui::Combo("##mode", &mode, kModes, 3)) {
    st.mode = static_cast<AngleMode>(mode);
    start_reanalyse(ui);
  }
  record_widget(ui, "track.angle_mode");
  static const char* kShow[] = {"q", "Euler", "margin", "rate"};
  for (int k = 0; k < 4; ++k) {
    ImGui::SameLine();
    ImGui::Checkbox(kShow[k], &st.show_plot[k]);
    record_widget(ui, std::string("track.show.") + kShow[k]);
  }
  ImGui::SameLine();
  if (ImGui::SmallButton("Whole track")) st.view_t0 = st.view_t1 = 0.0;
  record_widget(ui, "track.zoom_all");
  clamp_view(ui);
  if (!st.plot) return;
  const std::vector<PlotSpec> specs = plot_specs(ui);
  if (specs.empty()) return;
  const float gap = ImGui::GetStyle().ItemSpacing.y;
  const float avail = ImGui::GetContentRegionAvail().y - ImGui::GetTextLineHeightWithSpacing();
  const float h = std::max(kMinPlotHeight, (avail - gap * static_cast<float>(specs.size() - 1)) /
                                               static_cast<float>(specs.size()));
  // The envelopes of every shown channel, computed once per change of view, width or plot
  // data (scrubbing and playing leave them as they are).
  std::vector<PlotChannel> channels;
  std::vector<std::size_t> first_channel;
  for (const PlotSpec& s : specs) {
    first_channel.push_back(channels.size());
    channels.insert(channels.end(), s.channels.begin(), s.channels.end());
  }
  const auto columns =
      static_cast<std::size_t>(std::max(16.0f, ImGui::GetContentRegionAvail().x / kColumnPx));
  TrackPlotCache& cache = st.plot_cache;
  if (cache.generation != st.plot_generation || cache.t0 != st.view_t0 || cache.t1 != st.view_t1 ||
      cache.columns != columns || cache.channels != channels) {
    cache.envelopes = plot_envelopes(*st.track, *st.plot, channels, st.view_t0, st.view_t1, columns);
    cache.generation = st.plot_generation;
    cache.t0 = st.view_t0;
    cache.t1 = st.view_t1;
    cache.columns = columns;
    cache.channels = channels;
  }
  const std::string unit_note = st.mode == AngleMode::Wrapped     ? "wrapped"
                                : st.mode == AngleMode::ZeroTo360 ? "0-360"
                                                                  : "unwrapped";
  for (std::size_t k = 0; k < specs.size(); ++k) {
    const PlotSpec& s = specs[k];
    std::string title = s.title;
    if (std::string(s.key) == "euler") title = "Euler " + c.name() + " (deg, " + unit_note + ")";
    draw_plot(ui, s, picture_slot(s), title, h, cache.envelopes.data() + first_channel[k]);
  }
  ImGui::TextDisabled("view %s .. %s s; wheel zooms, drag pans, click jumps; red: near lock",
                      num(st.view_t0, 7).c_str(), num(st.view_t1, 7).c_str());
}

// ---- tables ----

std::string event_what(const Track& track, const TrackEvent& e) {
  const nlohmann::json j = track_event_json(track, e);
  std::string out;
  for (const auto& [k, v] : j.items()) {
    if (k == "sample" || k == "kind" || k == "time_s") continue;
    if (k == "count" && v.is_number() && v.get<double>() <= 1.0) continue;
    out += (out.empty() ? "" : ", ") + k + " " + (v.is_number() ? num(v.get<double>(), 5) : v.dump());
  }
  return out;
}

void draw_events(Ui& ui) {
  TrackPanelState& st = ui.track;
  const Track& track = *st.track;
  float limit = static_cast<float>(st.rate_limit_deg_s);
  ImGui::SetNextItemWidth(120.0f * ui.scale);
  ImGui::InputFloat("rate limit (deg/s, 0: none)", &limit, 0.0f, 0.0f, "%.1f");
  record_widget(ui, "track.rate_limit");
  if (ImGui::IsItemDeactivatedAfterEdit()) {
    st.rate_limit_deg_s = std::max(0.0, static_cast<double>(limit));
    start_reanalyse(ui);
  }
  const TrackSummary& s = st.diagnosis.summary;
  ImGui::Text("%zu events; min lock margin %s deg; max rate %s deg/s at sample %zu",
              st.diagnosis.events.size(), num(s.min_lock_margin_rad * kDegPerRad, 4).c_str(),
              num(s.max_rate_rad_s * kDegPerRad, 4).c_str(), s.max_rate_sample);
  if (!ImGui::BeginTable("events", 4,
                         ImGuiTableFlags_RowBg | ImGuiTableFlags_ScrollY | ImGuiTableFlags_BordersInnerV |
                             ImGuiTableFlags_Resizable))
    return;
  ImGui::TableSetupScrollFreeze(0, 1);
  ImGui::TableSetupColumn("kind");
  ImGui::TableSetupColumn("sample");
  ImGui::TableSetupColumn("time (s)");
  ImGui::TableSetupColumn("what", ImGuiTableColumnFlags_WidthStretch);
  ImGui::TableHeadersRow();
  ImGuiListClipper clip;
  clip.Begin(static_cast<int>(st.diagnosis.events.size()));
  while (clip.Step()) {
    for (int r = clip.DisplayStart; r < clip.DisplayEnd; ++r) {
      const TrackEvent& e = st.diagnosis.events[static_cast<std::size_t>(r)];
      ImGui::TableNextRow();
      ImGui::TableNextColumn();
      ImGui::PushID(r);
      const std::string kind(track_event_kind_name(e.kind));
      if (ImGui::Selectable(kind.c_str(), st.sample == e.sample, ImGuiSelectableFlags_SpanAllColumns)) {
        show_sample(ui, e.sample);
        st.playing = false;
        // Centre the plot view on the event, keeping its zoom.
        const double half = 0.5 * (st.view_t1 - st.view_t0);
        const double t = track.time_s[std::min(e.sample, track.size() - 1)];
        st.view_t0 = t - half;
        st.view_t1 = t + half;
        clamp_view(ui);
      }
      // The row's name for scripts is its first cell (the row's middle is a column border).
      const ImVec2 a = ImGui::GetItemRectMin(), b = ImGui::GetItemRectMax();
      ui.widgets["track.event." + std::to_string(r)] =
          ImVec4(a.x, a.y, std::min(b.x, a.x + 60.0f * ui.scale), b.y);
      ImGui::PopID();
      ImGui::TableNextColumn();
      ImGui::Text("%zu", e.sample);
      ImGui::TableNextColumn();
      ImGui::TextUnformatted(num(track.time_s[std::min(e.sample, track.size() - 1)], 8).c_str());
      ImGui::TableNextColumn();
      ImGui::TextUnformatted(event_what(track, e).c_str());
    }
  }
  ImGui::EndTable();
}

void draw_bad_rows(Ui& ui) {
  const Track& track = *ui.track.track;
  ImGui::Text("%zu rows could not be read (the rest loaded); %zu blank or comment lines",
              track.bad_rows.size(), track.skipped_lines);
  if (track.bad_rows.empty()) return;
  if (!ImGui::BeginTable("bad_rows", 2, ImGuiTableFlags_RowBg | ImGuiTableFlags_ScrollY)) return;
  ImGui::TableSetupScrollFreeze(0, 1);
  ImGui::TableSetupColumn("line", ImGuiTableColumnFlags_WidthFixed, 80.0f * ui.scale);
  ImGui::TableSetupColumn("why", ImGuiTableColumnFlags_WidthStretch);
  ImGui::TableHeadersRow();
  ImGuiListClipper clip;
  clip.Begin(static_cast<int>(track.bad_rows.size()));
  while (clip.Step()) {
    for (int r = clip.DisplayStart; r < clip.DisplayEnd; ++r) {
      const BadRow& b = track.bad_rows[static_cast<std::size_t>(r)];
      ImGui::TableNextRow();
      ImGui::TableNextColumn();
      ImGui::Text("%zu", b.line);
      ImGui::TableNextColumn();
      ImGui::TextUnformatted(b.reason.c_str());
    }
  }
  ImGui::EndTable();
}

/// A column chooser over the mapping's columns; -1 is "none" when allow_none.
bool column_combo(const char* id, const ColumnMapping& m, int* column, bool allow_none) {
  const std::string shown = *column >= 0 && static_cast<std::size_t>(*column) < m.columns.size()
                                ? m.columns[static_cast<std::size_t>(*column)].name
                                : std::string("none");
  bool changed = false;
  if (ImGui::BeginCombo(id, shown.c_str())) {
    if (allow_none && ImGui::Selectable("none (sample index)", *column < 0)) {
      *column = -1;
      changed = true;
    }
    for (std::size_t c = 0; c < m.columns.size(); ++c) {
      if (ImGui::Selectable(m.columns[c].name.c_str(), *column == static_cast<int>(c))) {
        *column = static_cast<int>(c);
        changed = true;
      }
    }
    ImGui::EndCombo();
  }
  return changed;
}

void draw_columns(Ui& ui) {
  TrackPanelState& st = ui.track;
  if (!st.mapping) return;
  ColumnMapping m = *st.mapping;
  bool changed = false;
  ImGui::Text("%s; %zu columns", m.json_lines ? "JSON lines" : "delimited text", m.columns.size());
  const float w = 150.0f * ui.scale;
  ImGui::SetNextItemWidth(w);
  changed |= column_combo("time column", m, &m.time_column, true);
  record_widget(ui, "track.time_column");
  ImGui::SameLine();
  static const char* kUnits[] = {"s", "ms", "us", "ns"};
  int unit = 0;
  for (int k = 0; k < 4; ++k)
    if (m.time_unit == kUnits[k]) unit = k;
  ImGui::SetNextItemWidth(70.0f * ui.scale);
  if (ImGui::Combo("unit", &unit, kUnits, 4)) {
    m.time_unit = kUnits[unit];
    changed = true;
  }
  record_widget(ui, "track.time_unit");
  static const char* kForms[] = {"quaternion", "matrix, row-major", "matrix, column-major", "Euler angles"};
  int form = m.form == TrackForm::MatrixRows   ? 1
             : m.form == TrackForm::MatrixCols ? 2
             : m.form == TrackForm::Euler      ? 3
                                               : 0;
  ImGui::SetNextItemWidth(w);
  if (ImGui::Combo("rotation written as", &form, kForms, 4)) {
    const std::size_t was = track_form_numbers(m.form);
    m.form = form == 0   ? TrackForm::QuatWxyz
             : form == 1 ? TrackForm::MatrixRows
             : form == 2 ? TrackForm::MatrixCols
                         : TrackForm::Euler;
    if (was != track_form_numbers(m.form)) {
      // A new shape: adjacent columns from the first rotation column.
      const int start = std::max(0, m.rotation_columns[0]);
      for (int k = 0; k < 9; ++k) m.rotation_columns[static_cast<std::size_t>(k)] = start + k;
    }
    changed = true;
  }
  record_widget(ui, "track.form");
  if (form == 0) {
    static const char* kSlots[] = {"w (scalar)", "x", "y", "z"};
    if (ImGui::SmallButton("scalar first (w x y z)")) {
      const int s = *std::min_element(m.rotation_columns.begin(), m.rotation_columns.begin() + 4);
      m.rotation_columns = {s, s + 1, s + 2, s + 3};
      changed = true;
    }
    record_widget(ui, "track.scalar_first");
    ImGui::SameLine();
    if (ImGui::SmallButton("scalar last (x y z w)")) {
      const int s = *std::min_element(m.rotation_columns.begin(), m.rotation_columns.begin() + 4);
      m.rotation_columns = {s + 3, s, s + 1, s + 2};
      changed = true;
    }
    record_widget(ui, "track.scalar_last");
    for (int k = 0; k < 4; ++k) {
      ImGui::SetNextItemWidth(w);
      changed |= column_combo(kSlots[k], m, &m.rotation_columns[static_cast<std::size_t>(k)], false);
      record_widget(ui, std::string("track.quat_column.") + std::to_string(k));
      if (k % 2 == 0) ImGui::SameLine();
    }
  } else if (form == 3) {
    // The convention of the three angle columns (in application order) and their unit.
    ImGui::SetNextItemWidth(w);
    if (ImGui::BeginCombo("convention", m.euler.name().c_str())) {
      for (const EulerConvention& c : all_euler_conventions()) {
        if (ImGui::Selectable(c.name().c_str(), c == m.euler)) {
          m.euler = c;
          changed = true;
        }
      }
      ImGui::EndCombo();
    }
    record_widget(ui, "track.euler_convention");
    ImGui::SameLine();
    static const char* kAngleUnits[] = {"degrees", "radians"};
    int angle_unit = m.euler_unit == AngleUnit::Radians ? 1 : 0;
    ImGui::SetNextItemWidth(90.0f * ui.scale);
    if (ImGui::Combo("angle unit", &angle_unit, kAngleUnits, 2)) {
      m.euler_unit = angle_unit == 1 ? AngleUnit::Radians : AngleUnit::Degrees;
      changed = true;
    }
    record_widget(ui, "track.euler_unit");
    for (int k = 0; k < 3; ++k) {
      const std::string label = "angle " + std::to_string(k + 1) + " (about " +
                                axis_letter(m.euler.axes[static_cast<std::size_t>(k)]) + ")";
      ImGui::SetNextItemWidth(w);
      changed |= column_combo(label.c_str(), m, &m.rotation_columns[static_cast<std::size_t>(k)], false);
      record_widget(ui, std::string("track.euler_column.") + std::to_string(k));
      if (k < 2) ImGui::SameLine();
    }
  } else {
    int first = m.rotation_columns[0];
    ImGui::SetNextItemWidth(w);
    if (column_combo("first of nine columns", m, &first, false)) {
      for (int k = 0; k < 9; ++k) m.rotation_columns[static_cast<std::size_t>(k)] = first + k;
      changed = true;
    }
  }
  if (changed) {
    bool ok = true;
    const std::size_t used = track_form_numbers(m.form);
    for (std::size_t k = 0; k < used; ++k)
      if (m.rotation_columns[k] < 0 || static_cast<std::size_t>(m.rotation_columns[k]) >= m.columns.size())
        ok = false;
    if (!ok) {
      st.error = "not applied: the rotation needs " + std::to_string(used) + " columns inside the log's " +
                 std::to_string(m.columns.size());
    } else {
      assign_column_roles(&m);
      m.notes.push_back("edited in the Track panel");
      st.mapping = m;
      if (!st.job) start_load(ui);
    }
  }
  if (ImGui::BeginTable("columns", 2, ImGuiTableFlags_RowBg | ImGuiTableFlags_BordersInnerV)) {
    ImGui::TableSetupColumn("column");
    ImGui::TableSetupColumn("read as");
    ImGui::TableHeadersRow();
    for (const TrackColumn& c : st.mapping->columns) {
      ImGui::TableNextRow();
      ImGui::TableNextColumn();
      ImGui::TextUnformatted(c.name.c_str());
      ImGui::TableNextColumn();
      ImGui::TextUnformatted(c.role.c_str());
    }
    ImGui::EndTable();
  }
  for (const std::string& n : st.mapping->notes) ImGui::BulletText("%s", n.c_str());
  if (st.mapping->ambiguous)
    ImGui::TextColored(ImVec4(0.91f, 0.64f, 0.24f, 1.0f), "ambiguous: check the reading");
}

void draw_export(Ui& ui) {
  TrackPanelState& st = ui.track;
  TrackExportOptions& o = st.export_options;
  o.euler = plot_convention(ui);
  static const char* kReps[] = {"quaternion", "Euler angles", "matrix"};
  int rep = static_cast<int>(o.representation);
  ImGui::SetNextItemWidth(140.0f * ui.scale);
  if (ImGui::Combo("as", &rep, kReps, 3)) o.representation = static_cast<ExportRepresentation>(rep);
  record_widget(ui, "track.export_as");
  ImGui::SameLine();
  bool to_world = o.quaternion.direction == Direction::WorldToBody;
  if (ImGui::Checkbox("world-to-body", &to_world)) {
    o.quaternion.direction = to_world ? Direction::WorldToBody : Direction::BodyToWorld;
    o.matrix.direction = o.quaternion.direction;
  }
  if (o.representation == ExportRepresentation::Quaternion) {
    bool last = o.quaternion.layout == QuatLayout::ScalarLast;
    ImGui::SameLine();
    if (ImGui::Checkbox("scalar last", &last))
      o.quaternion.layout = last ? QuatLayout::ScalarLast : QuatLayout::ScalarFirst;
    bool jpl = o.quaternion.algebra == QuatAlgebra::Jpl;
    ImGui::SameLine();
    if (ImGui::Checkbox("JPL", &jpl)) o.quaternion.algebra = jpl ? QuatAlgebra::Jpl : QuatAlgebra::Hamilton;
  } else if (o.representation == ExportRepresentation::Euler) {
    ImGui::SameLine();
    bool rad = o.unit == AngleUnit::Radians;
    if (ImGui::Checkbox("radians", &rad)) o.unit = rad ? AngleUnit::Radians : AngleUnit::Degrees;
    ImGui::SameLine();
    ImGui::Checkbox("unwrap", &o.unwrap);
    ImGui::TextDisabled("Euler convention: %s (the plots' choice)", o.euler.name().c_str());
  } else {
    bool cols = o.matrix.storage == MatrixStorage::Columns;
    ImGui::SameLine();
    if (ImGui::Checkbox("column-major", &cols))
      o.matrix.storage = cols ? MatrixStorage::Columns : MatrixStorage::Rows;
  }
  ImGui::TextDisabled("header: %s", track_csv_header(o).c_str());
  if (st.export_path.empty() && !st.path.empty()) st.export_path = st.path + ".clean.csv";
  ImGui::SetNextItemWidth(std::max(100.0f, ImGui::GetContentRegionAvail().x - 90.0f * ui.scale));
  text_field("##export_path", st.export_path, kPathCapacity, false);
  record_widget(ui, "track.export_path");
  ImGui::SameLine();
  const bool busy = st.job != nullptr;  // one job at a time: a load, a re-analysis or an export
  if (busy) ImGui::BeginDisabled();
  if (ImGui::Button("Export")) start_export(ui);
  if (busy) ImGui::EndDisabled();
  record_widget(ui, "track.export");
  ImGui::TextWrapped(
      "Clean copy: normalised, sign-continuous%s; times and samples unchanged.",
      o.representation == ExportRepresentation::Euler && o.unwrap ? ", Euler angles unwrapped" : "");
  if (!st.export_message.empty()) ImGui::TextWrapped("%s", st.export_message.c_str());
  if (st.export_changes.empty()) return;
  if (!ImGui::BeginTable("changes", 4, ImGuiTableFlags_RowBg | ImGuiTableFlags_ScrollY)) return;
  ImGui::TableSetupScrollFreeze(0, 1);
  ImGui::TableSetupColumn("change");
  ImGui::TableSetupColumn("sample");
  ImGui::TableSetupColumn("count");
  ImGui::TableSetupColumn("value", ImGuiTableColumnFlags_WidthStretch);
  ImGui::TableHeadersRow();
  ImGuiListClipper clip;
  clip.Begin(static_cast<int>(st.export_changes.size()));
  while (clip.Step()) {
    for (int r = clip.DisplayStart; r < clip.DisplayEnd; ++r) {
      const CleanChange& c = st.export_changes[static_cast<std::size_t>(r)];
      ImGui::TableNextRow();
      ImGui::TableNextColumn();
      ImGui::TextUnformatted(clean_change_kind_name(c.kind).c_str());
      ImGui::TableNextColumn();
      ImGui::Text("%zu", c.sample);
      ImGui::TableNextColumn();
      ImGui::Text("%zu", c.count);
      ImGui::TableNextColumn();
      const std::string value =
          (c.channel >= 0 ? "angle " + std::to_string(c.channel + 1) + ": " : std::string()) +
          num(c.value, 6);
      ImGui::TextUnformatted(value.c_str());
    }
  }
  ImGui::EndTable();
}

void draw_timeline(Ui& ui) {
  TrackPanelState& st = ui.track;
  const Track& track = *st.track;
  if (ImGui::Button(st.playing ? "Pause" : "Play")) {
    st.playing = !st.playing;
    if (st.playing && st.sample + 1 >= track.size()) show_sample(ui, 0);
  }
  record_widget(ui, "track.play");
  ImGui::SameLine();
  ImGui::SetNextItemWidth(70.0f * ui.scale);
  if (ImGui::BeginCombo("##speed", (num(st.speed, 3) + "x").c_str())) {
    for (float s : kSpeeds)
      if (ImGui::Selectable((num(s, 3) + "x").c_str(), s == st.speed)) st.speed = s;
    ImGui::EndCombo();
  }
  record_widget(ui, "track.speed");
  ImGui::SameLine();
  if (ImGui::ArrowButton("##back", ImGuiDir_Left)) step_track(ui, -1);
  record_widget(ui, "track.step_back");
  ImGui::SameLine();
  if (ImGui::ArrowButton("##forward", ImGuiDir_Right)) step_track(ui, 1);
  record_widget(ui, "track.step_forward");
  ImGui::SameLine();
  int i = static_cast<int>(st.sample);
  const int last = static_cast<int>(std::max<std::size_t>(track.size(), 1) - 1);
  ImGui::SetNextItemWidth(std::max(80.0f, ImGui::GetContentRegionAvail().x - 150.0f * ui.scale));
  const std::string label = "t " + num(track.time_s[st.sample], 7) + " s  #%d";
  if (ImGui::SliderInt("##timeline", &i, 0, last, label.c_str(), ImGuiSliderFlags_AlwaysClamp)) {
    show_sample(ui, static_cast<std::size_t>(i));
    st.playing = false;
  }
  record_widget(ui, "track.slider");
  ImGui::SameLine();
  if (ImGui::Button("Pin as reference")) {
    ui.doc.set_reference(sample_rotation(track, st.sample),
                         "reference = track sample " + std::to_string(st.sample));
  }
  record_widget(ui, "track.pin");
  // Left/Right step one sample while this panel has the keyboard (',' and '.' anywhere).
  const ImGuiIO& io = ImGui::GetIO();
  if (!io.WantTextInput && ImGui::IsWindowFocused(ImGuiFocusedFlags_RootAndChildWindows)) {
    if (ImGui::IsKeyPressed(GLFW_KEY_LEFT)) step_track(ui, -1);
    if (ImGui::IsKeyPressed(GLFW_KEY_RIGHT)) step_track(ui, 1);
  }
}

void draw_open_row(Ui& ui) {
  TrackPanelState& st = ui.track;
  ImGui::SetNextItemWidth(std::max(100.0f, ImGui::GetContentRegionAvail().x - 80.0f * ui.scale));
  text_field("##track_path", st.path_input, kPathCapacity, false);
  record_widget(ui, "track.path");
  ImGui::SameLine();
  if (ImGui::Button("Open") && !st.path_input.empty()) open_track(ui, st.path_input);
  record_widget(ui, "track.open");
  if (st.job) {
    const std::size_t total = st.job->total.load(std::memory_order_relaxed);
    const std::size_t done = st.job->done.load(std::memory_order_relaxed);
    const int stage = st.job->stage.load();
    const bool counted = stage == static_cast<int>(TrackJobStage::Reading) ||
                         stage == static_cast<int>(TrackJobStage::Exporting);
    const float frac = !counted ? 1.0f : total ? static_cast<float>(done) / static_cast<float>(total) : 0.0f;
    const std::string what =
        std::string(stage_name(stage)) + " " + num(100.0 * static_cast<double>(frac), 3) + "%";
    ImGui::ProgressBar(frac,
                       ImVec2(std::max(60.0f, ImGui::GetContentRegionAvail().x - 80.0f * ui.scale), 0.0f),
                       what.c_str());
    record_widget(ui, "track.progress");
    ImGui::SameLine();
    if (ImGui::Button("Cancel")) st.job->cancel.store(true);
    record_widget(ui, "track.cancel");
  }
  if (!st.error.empty()) ImGui::TextColored(ImVec4(0.95f, 0.45f, 0.4f, 1.0f), "%s", st.error.c_str());
  if (st.track) {
    const Track& t = *st.track;
    const TrackSummary& s = st.diagnosis.summary;
    std::string line = std::to_string(t.size()) + " samples, " + t.reading;
    if (s.duration_s) line += ", " + num(*s.duration_s, 6) + " s";
    if (s.rate_hz) line += ", " + num(*s.rate_hz, 5) + " Hz";
    if (!t.has_time) line += ", no time column (sample index)";
    line += ", " + std::to_string(t.bad_rows.size()) + " rows not read";
    ImGui::TextUnformatted(line.c_str());
  } else if (!st.message.empty()) {
    ImGui::TextUnformatted(st.message.c_str());
  } else if (!st.job) {
    ImGui::TextWrapped(
        "Open a pose log (CSV, TSV, space-separated or JSON lines), drop one on the window, or "
        "give one on the command line: attiscope gui LOG.");
  }
}

}  // namespace

TrackJob::~TrackJob() {
  cancel.store(true);
  if (thread.joinable()) thread.join();
}

bool open_track(Ui& ui, const std::string& path) {
  TrackPanelState& st = ui.track;
  st.select_tab = true;
  st.path_input = path;
  if (st.job) {
    st.job->cancel.store(true);
    st.job.reset();  // waits for it
  }
  auto head = read_file_head(path);
  if (!head) {
    st.error = head.error().describe();
    return false;
  }
  auto found = find_columns(head.value(), column_preferences(ui.doc.convention().house));
  if (!found) {
    st.error = path + ": " + found.error().describe();
    return false;
  }
  st.error.clear();
  st.message.clear();
  st.path = path;
  st.mapping = found.value();
  st.export_path.clear();
  st.export_changes.clear();
  st.export_message.clear();
  start_load(ui);
  return true;
}

void update_track(Ui& ui, double dt_s) {
  TrackPanelState& st = ui.track;
  take_finished_job(ui);
  st.tab_open_last = st.tab_open;
  st.tab_open = false;
  if (!st.playing || !st.track || st.track->size() == 0 || !st.plot) return;
  st.play_time_s += dt_s * static_cast<double>(st.speed);
  std::size_t i = sample_at_or_after(*st.track, *st.plot, st.play_time_s);
  if (i >= st.track->size()) {
    i = st.track->size() - 1;
    st.playing = false;
  }
  const double t = st.play_time_s;
  if (i != st.sample) show_sample(ui, i);
  st.play_time_s = st.playing ? t : st.track->time_s[i];
  // Keep the play head in the plot view.
  const double span = st.view_t1 - st.view_t0;
  const double ti = st.track->time_s[i];
  if (span > 0.0 && (ti > st.view_t1 || ti < st.view_t0)) {
    st.view_t0 = ti - 0.1 * span;
    st.view_t1 = st.view_t0 + span;
    clamp_view(ui);
  }
}

bool track_job_running(const Ui& ui) {
  return ui.track.job != nullptr;
}

bool track_animating(const Ui& ui) {
  return ui.track.playing || ui.track.job != nullptr;
}

void step_track(Ui& ui, long delta) {
  TrackPanelState& st = ui.track;
  if (!st.track || st.track->size() == 0) return;
  st.playing = false;
  const long n = static_cast<long>(st.track->size());
  const long i = std::clamp(static_cast<long>(st.sample) + delta, 0L, n - 1);
  show_sample(ui, static_cast<std::size_t>(i));
}

void shutdown_track(Ui& ui) {
  ui.track.job.reset();
  for (TrackPlotPicture& p : ui.track.pictures) {
    p.picture.release();
    p.painted = false;
  }
}

void draw_track_panel(Ui& ui) {
  TrackPanelState& st = ui.track;
  st.tab_open = true;
  draw_open_row(ui);
  if (!st.track || !st.plot) return;
  draw_timeline(ui);
  if (!ImGui::BeginTabBar("track_tabs")) return;
  struct Tab {
    const char* label;
    const char* key;
    TrackTab tab;
  };
  const Tab tabs[] = {{"Plots", "track.tab.plots", TrackTab::Plots},
                      {"Events", "track.tab.events", TrackTab::Events},
                      {"Columns", "track.tab.columns", TrackTab::Columns},
                      {"Bad rows", "track.tab.bad_rows", TrackTab::BadRows},
                      {"Export", "track.tab.export", TrackTab::Export}};
  for (const Tab& t : tabs) {
    std::string label = t.label;
    if (t.tab == TrackTab::Events) label += " (" + std::to_string(st.diagnosis.events.size()) + ")";
    if (t.tab == TrackTab::BadRows) label += " (" + std::to_string(st.track->bad_rows.size()) + ")";
    label += std::string("###") + t.key;
    const bool open = ImGui::BeginTabItem(label.c_str());
    record_widget(ui, t.key);
    if (!open) continue;
    st.tab = t.tab;
    switch (t.tab) {
      case TrackTab::Plots: draw_plots(ui); break;
      case TrackTab::Events: draw_events(ui); break;
      case TrackTab::Columns: draw_columns(ui); break;
      case TrackTab::BadRows: draw_bad_rows(ui); break;
      case TrackTab::Export: draw_export(ui); break;
    }
    ImGui::EndTabItem();
  }
  ImGui::EndTabBar();
}

nlohmann::json track_dump(const Ui& ui) {
  const TrackPanelState& st = ui.track;
  nlohmann::json j;
  j["path"] = st.path;
  j["loading"] = st.job != nullptr;
  j["error"] = st.error;
  j["message"] = st.message;
  j["sample"] = st.sample;
  j["playing"] = st.playing;
  j["speed"] = st.speed;
  j["view"] = {st.view_t0, st.view_t1};
  j["convention"] = plot_convention(ui).name();
  j["angle_mode"] = st.mode == AngleMode::Wrapped     ? "wrapped"
                    : st.mode == AngleMode::ZeroTo360 ? "0-360"
                                                      : "unwrapped";
  j["tab_open"] = st.tab_open_last;
  if (st.mapping) {
    nlohmann::json cols = nlohmann::json::array();
    for (const TrackColumn& c : st.mapping->columns) cols.push_back({{"name", c.name}, {"role", c.role}});
    j["mapping"] = {{"columns", cols},
                    {"json_lines", st.mapping->json_lines},
                    {"time_column", st.mapping->time_column},
                    {"time_unit", st.mapping->time_unit},
                    {"form", track_form_name(st.mapping->form)}};
  }
  if (st.track) {
    const Track& t = *st.track;
    j["report"] = track_json(t, st.diagnosis, diagnosis_options(ui));
    if (st.sample < t.size()) {
      j["time_s"] = t.time_s[st.sample];
      j["sample_quaternion"] = {t.qw[st.sample], t.qx[st.sample], t.qy[st.sample], t.qz[st.sample]};
    }
  }
  // Where each shown plot is (x0, y0, x1, y1 in points) and how often a picture was painted.
  nlohmann::json plots = nlohmann::json::object();
  for (const auto& [name, r] : ui.widgets) {
    const std::string prefix = "track.plot.";
    if (name.compare(0, prefix.size(), prefix) == 0) plots[name.substr(prefix.size())] = {r.x, r.y, r.z, r.w};
  }
  j["plots"] = plots;
  j["picture_paints"] = st.picture_paints;
  j["pictures"] = !st.pictures_failed;
  j["export_message"] = st.export_message;
  j["export_changes"] = st.export_changes.size();
  return j;
}

}  // namespace attiscope::gui
