// track_analysis.hpp: what is wrong (or remarkable) in a pose log: every discontinuity
// found and labelled, and a summary (count, rate, duration, spans near lock).
//
// A track holds world_R_body quaternions (Hamilton, scalar first) with the sign they had in
// the file (track.hpp). An event names the 0-based index of the first sample after the
// discontinuity, so "sign_flip at 120" means samples 119 and 120 have opposite signs.
//
// Event kinds (design.md, `track --json`):
//   sign_flip       q[i-1] . q[i] < 0: all four numbers changed sign, the rotation did not
//   wrap            the first or third Euler angle crossed +/-180 (a display jump of ~360)
//   near_lock       a jump of the first or third Euler angle while the middle one is close
//                   to lock (one event per near-lock span, at its first jump)
//   non_unit        | |q| - 1 | beyond the tolerance (one event per run of such samples)
//   time_backwards  t[i] < t[i-1]
//   time_repeat     t[i] == t[i-1]
//   fast_motion     angular rate beyond the limit the user set (one event per run)
#pragma once

#include <cstddef>
#include <limits>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/track.hpp"

namespace attiscope {

enum class TrackEventKind { SignFlip, Wrap, NearLock, NonUnit, TimeBackwards, TimeRepeat, FastMotion };

/// "sign_flip", "wrap", "near_lock", "non_unit", "time_backwards", "time_repeat", "fast_motion".
std::string_view track_event_kind_name(TrackEventKind k);

/// One discontinuity of a track.
struct TrackEvent {
  std::size_t sample = 0;  ///< 0-based index of the first sample after the discontinuity
  TrackEventKind kind = TrackEventKind::SignFlip;
  std::size_t count = 1;  ///< consecutive samples covered (runs of non_unit / fast_motion)
  int channel = -1;       ///< wrap and near_lock: Euler angle 0 (first) or 2 (third); else -1
  /// What was measured: sign_flip the quaternion dot product; wrap the raw step (rad);
  /// near_lock the Euler step (rad); non_unit the norm (first sample of the run); time_* the
  /// time step (s); fast_motion the peak rate (rad/s) of the run.
  double value = 0.0;
};

/// A run of samples whose lock margin is below the near-lock threshold.
struct NearLockSpan {
  std::size_t first = 0;  ///< first sample of the span
  std::size_t last = 0;   ///< last sample of the span (inclusive)
  double min_margin_rad = 0.0;
  std::size_t min_sample = 0;  ///< where the margin is smallest
};

/// Defaults of the diagnosis, each a named choice (common practice, not a standard).
/// Near lock: a lock margin below 5 degrees amplifies Euler rates at least 1/sin(5 deg) = 11x.
inline constexpr double kNearLockMarginRad = 5.0 * 3.14159265358979323846 / 180.0;
/// An Euler step (after removing whole turns) beyond 10 degrees near lock is a jump.
inline constexpr double kNearLockJumpRad = 10.0 * 3.14159265358979323846 / 180.0;
/// Norms within 1e-3 of 1 are unit: a log printed with 4 decimals has norm errors near 1e-4.
inline constexpr double kTrackUnitTolerance = 1e-3;

struct TrackDiagnosisOptions {
  EulerConvention euler;  ///< convention of the wrap and near-lock checks
  /// fast_motion when the angular rate exceeds this (rad/s); none: no fast_motion events.
  std::optional<double> rate_limit_rad_s;
  double near_lock_margin_rad = kNearLockMarginRad;
  double near_lock_jump_rad = kNearLockJumpRad;
  double unit_tolerance = kTrackUnitTolerance;
  unsigned threads = 2;  ///< worker threads for the Euler conversion (1: the calling thread)
};

struct TrackSummary {
  std::size_t samples = 0;
  std::optional<double> duration_s;  ///< last time minus first; none without a time column
  std::optional<double> rate_hz;     ///< 1 / median positive time step; none without time
  double max_rate_rad_s = 0.0;       ///< largest angular rate between consecutive samples
  std::size_t max_rate_sample = 0;
  std::size_t counts[7] = {};  ///< events per TrackEventKind
  std::vector<NearLockSpan> near_lock_spans;
  double min_lock_margin_rad = std::numeric_limits<double>::infinity();
};

struct TrackDiagnosis {
  std::vector<TrackEvent> events;  ///< by sample, then kind
  TrackSummary summary;
};

/// Diagnoses a track. Pure: the same track and options give the same events.
TrackDiagnosis diagnose_track(const Track& track, const TrackDiagnosisOptions& options);

/// Geodesic angle (rad, [0, pi]) between two quaternions of any norm and any sign:
/// 2 atan2(|v|, |w|) of the relative quaternion conj(a) b, accurate near 0 and near pi.
double quaternion_step_angle(double aw, double ax, double ay, double az, double bw, double bx, double by,
                             double bz);

/// Angular rate per sample (rad/s): rate[i] = step angle(q[i-1], q[i]) / (t[i] - t[i-1]) for
/// i >= 1; rate[0] = rate[1]. NaN where the time step is not positive. Without a time column
/// the step is one sample (rad per sample).
std::vector<double> angular_rate(const Track& track);

/// Euler angles of samples [begin, end) of a track (any norm), written to a, b, c (radians,
/// application order, the ranges and lock rule of euler.hpp), and the lock margin (rad) when
/// `margin` is given; NaN for a sample that is not a rotation. The one place a track is
/// converted to Euler angles: the diagnosis, the plots and the export all call it.
void track_euler(const Track& track, std::size_t begin, std::size_t end, const EulerConvention& c, double* a,
                 double* b, double* cc, double* margin = nullptr);

}  // namespace attiscope
