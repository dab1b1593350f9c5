// track_analysis.cpp: the diagnosis of a track (events and summary), angular rate, and the
// one conversion of track samples to Euler angles.
#include "attiscope/core/track_analysis.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>

#include "attiscope/core/batch.hpp"
#include "attiscope/core/quaternion.hpp"
#include "track_parallel.hpp"

namespace attiscope {

std::string_view track_event_kind_name(TrackEventKind k) {
  switch (k) {
    case TrackEventKind::SignFlip: return "sign_flip";
    case TrackEventKind::Wrap: return "wrap";
    case TrackEventKind::NearLock: return "near_lock";
    case TrackEventKind::NonUnit: return "non_unit";
    case TrackEventKind::TimeBackwards: return "time_backwards";
    case TrackEventKind::TimeRepeat: return "time_repeat";
    case TrackEventKind::FastMotion: return "fast_motion";
  }
  return "unknown";
}

double quaternion_step_angle(double aw, double ax, double ay, double az, double bw, double bx, double by,
                             double bz) {
  // Relative quaternion r = conj(a) b (Hamilton): r_w = a . b, r_v = aw bv - bw av - av x bv.
  const double rw = aw * bw + ax * bx + ay * by + az * bz;
  const double rx = aw * bx - bw * ax - (ay * bz - az * by);
  const double ry = aw * by - bw * ay - (az * bx - ax * bz);
  const double rz = aw * bz - bw * az - (ax * by - ay * bx);
  // The norms cancel in the ratio; |rw| makes the angle the same for q and -q.
  return 2.0 * std::atan2(std::sqrt(rx * rx + ry * ry + rz * rz), std::abs(rw));
}

void track_euler(const Track& track, std::size_t begin, std::size_t end, const EulerConvention& c, double* a,
                 double* b, double* cc, double* margin) {
  // The batch kernel (batch.hpp) gives to_euler's angles, ranges and lock rule for any norm
  // and either sign, and NaN for a sample that is not a rotation.
  const std::size_t n = end - begin;
  const QuaternionColumns q{{track.qw.data() + begin, n},
                            {track.qx.data() + begin, n},
                            {track.qy.data() + begin, n},
                            {track.qz.data() + begin, n}};
  EulerColumnsOut out;
  out.a1 = {a, n};
  out.a2 = {b, n};
  out.a3 = {cc, n};
  if (margin) out.lock_margin = {margin, n};
  const auto done = quaternions_to_euler(q, c, out);
  assert(done.ok() && "track_euler: the columns of a track have one size and do not overlap");
  (void)done;
}

namespace {

double time_step(const Track& t, std::size_t i) {
  return t.has_time ? t.time_s[i] - t.time_s[i - 1] : 1.0;
}

double step_angle_at(const Track& t, std::size_t i) {
  return quaternion_step_angle(t.qw[i - 1], t.qx[i - 1], t.qy[i - 1], t.qz[i - 1], t.qw[i], t.qx[i], t.qy[i],
                               t.qz[i]);
}

double norm_at(const Track& t, std::size_t i) {
  return std::sqrt(t.qw[i] * t.qw[i] + t.qx[i] * t.qx[i] + t.qy[i] * t.qy[i] + t.qz[i] * t.qz[i]);
}

// Samples per block of the diagnosis: per-sample numbers of a block are computed in
// parallel into reused buffers, then one thread walks the block in order.
constexpr std::size_t kBlock = 1 << 15;

// The sequential part of the diagnosis: state carried from sample to sample.
class Scanner {
 public:
  Scanner(const Track& track, const TrackDiagnosisOptions& o, TrackDiagnosis* out)
      : t_(track), o_(o), out_(out) {}

  // Sample i with its norm, Euler angles, lock margin and step angle from sample i-1 (0 for
  // i == 0).
  void visit(std::size_t i, double norm, const double e[3], double margin, double step) {
    TrackSummary& s = out_->summary;
    // non_unit: runs of samples off the unit sphere.
    const bool off_unit = !(std::abs(norm - 1.0) <= o_.unit_tolerance);
    if (off_unit) {
      if (in_non_unit_) {
        ++events()[non_unit_event_].count;
      } else {
        non_unit_event_ = add(i, TrackEventKind::NonUnit, -1, norm);
      }
    }
    in_non_unit_ = off_unit;

    const bool near = margin < o_.near_lock_margin_rad;
    if (margin < s.min_lock_margin_rad) s.min_lock_margin_rad = margin;
    if (near) {
      if (!near_prev_) {
        s.near_lock_spans.push_back({i, i, margin, i});
        span_has_jump_ = false;
      }
      NearLockSpan& span = s.near_lock_spans.back();
      span.last = i;
      if (margin < span.min_margin_rad) {
        span.min_margin_rad = margin;
        span.min_sample = i;
      }
    }

    if (i > 0) {
      const double dot = t_.qw[i - 1] * t_.qw[i] + t_.qx[i - 1] * t_.qx[i] + t_.qy[i - 1] * t_.qy[i] +
                         t_.qz[i - 1] * t_.qz[i];
      if (dot < 0.0) add(i, TrackEventKind::SignFlip, -1, dot / (norm * norm_prev_));

      const double dt = time_step(t_, i);
      if (t_.has_time) {
        if (dt < 0.0) add(i, TrackEventKind::TimeBackwards, -1, dt);
        if (dt == 0.0) add(i, TrackEventKind::TimeRepeat, -1, dt);
      }
      bool fast = false;
      if (dt > 0.0) {
        const double rate = step / dt;
        if (rate > s.max_rate_rad_s) {
          s.max_rate_rad_s = rate;
          s.max_rate_sample = i;
        }
        fast = o_.rate_limit_rad_s && rate > *o_.rate_limit_rad_s;
        if (fast) {
          if (in_fast_) {
            TrackEvent& ev = events()[fast_event_];
            ++ev.count;
            ev.value = std::max(ev.value, rate);
          } else {
            fast_event_ = add(i, TrackEventKind::FastMotion, -1, rate);
          }
        }
      }
      in_fast_ = fast;

      for (int ch : {0, 2}) {
        const double raw = e[ch] - e_prev_[ch];
        const double wrapped = wrap_pi(raw);
        if ((near || near_prev_) && std::abs(wrapped) > o_.near_lock_jump_rad) {
          // One near_lock event per span: the first jump tells where the plot breaks.
          if (!span_has_jump_) add(i, TrackEventKind::NearLock, ch, wrapped);
          span_has_jump_ = true;
        } else if (std::abs(raw) > M_PI) {
          add(i, TrackEventKind::Wrap, ch, raw);
        }
      }
    }
    near_prev_ = near;
    norm_prev_ = norm;
    for (int k = 0; k < 3; ++k) e_prev_[k] = e[k];
  }

 private:
  std::vector<TrackEvent>& events() { return out_->events; }
  std::size_t add(std::size_t i, TrackEventKind k, int channel, double value) {
    TrackEvent ev;
    ev.sample = i;
    ev.kind = k;
    ev.channel = channel;
    ev.value = value;
    events().push_back(ev);
    return events().size() - 1;
  }

  const Track& t_;
  const TrackDiagnosisOptions& o_;
  TrackDiagnosis* out_;
  bool in_non_unit_ = false, in_fast_ = false, near_prev_ = false, span_has_jump_ = false;
  std::size_t non_unit_event_ = 0, fast_event_ = 0;
  double norm_prev_ = 1.0;
  double e_prev_[3] = {0.0, 0.0, 0.0};
};

// 1 / median positive time step, from at most kMedianSamples steps spread over the track.
std::optional<double> median_rate(const Track& t) {
  constexpr std::size_t kMedianSamples = 1 << 16;
  const std::size_t n = t.size();
  if (!t.has_time || n < 2) return std::nullopt;
  const std::size_t stride = std::max<std::size_t>(1, (n - 1) / kMedianSamples);
  std::vector<double> dts;
  for (std::size_t i = 1; i < n; i += stride) {
    const double dt = t.time_s[i] - t.time_s[i - 1];
    if (dt > 0.0) dts.push_back(dt);
  }
  if (dts.empty()) return std::nullopt;
  auto mid = dts.begin() + static_cast<std::ptrdiff_t>(dts.size() / 2);
  std::nth_element(dts.begin(), mid, dts.end());
  return 1.0 / *mid;
}

}  // namespace

TrackDiagnosis diagnose_track(const Track& track, const TrackDiagnosisOptions& options) {
  TrackDiagnosis out;
  const std::size_t n = track.size();
  TrackSummary& s = out.summary;
  s.samples = n;
  if (track.has_time && n > 0) s.duration_s = track.time_s[n - 1] - track.time_s[0];
  s.rate_hz = median_rate(track);

  Scanner scanner(track, options, &out);
  std::vector<double> ea(kBlock), eb(kBlock), ec(kBlock), em(kBlock), norm(kBlock), step(kBlock);
  for (std::size_t block = 0; block < n; block += kBlock) {
    const std::size_t len = std::min(kBlock, n - block);
    detail::parallel_ranges(len, options.threads, 64, [&](std::size_t b, std::size_t e) {
      track_euler(track, block + b, block + e, options.euler, ea.data() + b, eb.data() + b, ec.data() + b,
                  em.data() + b);
      for (std::size_t k = b; k < e; ++k) {
        const std::size_t i = block + k;
        norm[k] = norm_at(track, i);
        step[k] = i > 0 ? step_angle_at(track, i) : 0.0;
      }
    });
    for (std::size_t k = 0; k < len; ++k) {
      const double e[3] = {ea[k], eb[k], ec[k]};
      scanner.visit(block + k, norm[k], e, em[k], step[k]);
    }
  }
  std::stable_sort(out.events.begin(), out.events.end(), [](const TrackEvent& a, const TrackEvent& b) {
    if (a.sample != b.sample) return a.sample < b.sample;
    return static_cast<int>(a.kind) < static_cast<int>(b.kind);
  });
  for (const TrackEvent& e : out.events) ++s.counts[static_cast<int>(e.kind)];
  return out;
}

std::vector<double> angular_rate(const Track& track) {
  const std::size_t n = track.size();
  std::vector<double> rate(n, std::numeric_limits<double>::quiet_NaN());
  detail::parallel_ranges(n, 2, 64, [&](std::size_t b, std::size_t e) {
    for (std::size_t i = std::max<std::size_t>(b, 1); i < e; ++i) {
      const double dt = time_step(track, i);
      if (dt > 0.0) rate[i] = step_angle_at(track, i) / dt;
    }
  });
  if (n >= 2) rate[0] = rate[1];
  return rate;
}

}  // namespace attiscope
