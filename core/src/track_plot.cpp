// track_plot.cpp: plot series of a track, their min/max pyramids and pixel-column envelopes.
#include "attiscope/core/track_plot.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <thread>

#include "attiscope/core/track_analysis.hpp"
#include "track_parallel.hpp"

namespace attiscope {

namespace {

constexpr double kDeg = 180.0 / M_PI;
constexpr double kTurn = 2.0 * M_PI;
constexpr float kInf = std::numeric_limits<float>::infinity();
// Samples converted per call of track_euler (four double buffers on the stack: 64 KB).
constexpr std::size_t kChunk = 2048;
// Part boundaries are multiples of this, so each part owns whole pyramid blocks.
constexpr std::size_t kPartAlign = kPyramidBase * 16;

template <class T>
void scan_min_max(const T* v, std::size_t a, std::size_t b, float* mn, float* mx) {
  float lo = *mn, hi = *mx;
  for (std::size_t i = a; i < b; ++i) {
    const float x = static_cast<float>(v[i]);
    // NaN fails both comparisons and is skipped.
    if (x < lo) lo = x;
    if (x > hi) hi = x;
  }
  *mn = lo;
  *mx = hi;
}

// Level 0 of a pyramid for the full blocks in [block_begin, block_end).
template <class T>
void build_level0(const T* v, std::size_t block_begin, std::size_t block_end, MinMaxPyramid* p) {
  for (std::size_t k = block_begin; k < block_end; ++k) {
    float lo = kInf, hi = -kInf;
    scan_min_max(v, k * kPyramidBase, (k + 1) * kPyramidBase, &lo, &hi);
    p->min[0][k] = lo;
    p->max[0][k] = hi;
  }
}

void size_pyramid(std::size_t n, MinMaxPyramid* p) {
  p->samples = n;
  std::size_t levels = 0;
  for (std::size_t size = kPyramidBase; n / size >= 1; size *= 2) ++levels;
  p->min.resize(levels);
  p->max.resize(levels);
  std::size_t size = kPyramidBase;
  for (std::size_t l = 0; l < levels; ++l, size *= 2) {
    p->min[l].resize(n / size);
    p->max[l].resize(n / size);
  }
}

void build_upper_levels(MinMaxPyramid* p) {
  for (std::size_t l = 1; l < p->min.size(); ++l) {
    for (std::size_t k = 0; k < p->min[l].size(); ++k) {
      p->min[l][k] = std::min(p->min[l - 1][2 * k], p->min[l - 1][2 * k + 1]);
      p->max[l][k] = std::max(p->max[l - 1][2 * k], p->max[l - 1][2 * k + 1]);
    }
  }
}

template <class T>
void pyramid_range(const T* v, const MinMaxPyramid& p, std::size_t a, std::size_t b, float* mn, float* mx) {
  *mn = kInf;
  *mx = -kInf;
  while (a < b) {
    if (a % kPyramidBase != 0 || b - a < kPyramidBase || p.min.empty()) {
      const std::size_t next = (a / kPyramidBase + 1) * kPyramidBase;
      const std::size_t stop = (b - a < kPyramidBase || p.min.empty()) ? b : std::min(b, next);
      scan_min_max(v, a, stop, mn, mx);
      a = stop;
      continue;
    }
    // a is block-aligned: take the largest whole block that starts at a and ends by b.
    std::size_t level = 0, size = kPyramidBase;
    while (level + 1 < p.min.size() && a % (2 * size) == 0 && a + 2 * size <= b) {
      ++level;
      size *= 2;
    }
    const std::size_t k = a / size;
    if (k >= p.min[level].size()) {  // the tail of the track, shorter than a block
      scan_min_max(v, a, b, mn, mx);
      return;
    }
    *mn = std::min(*mn, p.min[level][k]);
    *mx = std::max(*mx, p.max[level][k]);
    a += size;
  }
}

// What one part of the track found while unwrapping, to join the parts afterwards.
struct PartUnwrap {
  bool have[2] = {false, false};
  double first_raw[2] = {0.0, 0.0}, last_raw[2] = {0.0, 0.0}, offset[2] = {0.0, 0.0};
  double add_deg[2] = {0.0, 0.0};  // set by the join: whole turns this part must add
};

void convert_part(const Track& t, const EulerConvention& c, AngleMode mode, std::size_t begin,
                  std::size_t end, TrackPlotData* d, PartUnwrap* st) {
  double buf[4][kChunk];
  for (std::size_t i0 = begin; i0 < end; i0 += kChunk) {
    const std::size_t len = std::min(kChunk, end - i0);
    track_euler(t, i0, i0 + len, c, buf[0], buf[1], buf[2], buf[3]);
    float* mid = d->euler_deg[1].data() + i0;
    float* margin = d->lock_margin_deg.data() + i0;
    for (std::size_t k = 0; k < len; ++k) {
      mid[k] = static_cast<float>(buf[1][k] * kDeg);
      margin[k] = static_cast<float>(buf[3][k] * kDeg);
    }
    for (int s = 0; s < 2; ++s) {
      const double* v = buf[s == 0 ? 0 : 2];
      float* out = d->euler_deg[s == 0 ? 0 : 2].data() + i0;
      switch (mode) {
        case AngleMode::Wrapped:
          for (std::size_t k = 0; k < len; ++k) out[k] = static_cast<float>(v[k] * kDeg);
          break;
        case AngleMode::ZeroTo360:
          for (std::size_t k = 0; k < len; ++k)
            out[k] = static_cast<float>((v[k] < 0.0 ? v[k] + kTurn : v[k]) * kDeg);
          break;
        case AngleMode::Unwrapped:
          // The same rule as unwrap_euler (track_clean.hpp), carried across chunks.
          for (std::size_t k = 0; k < len; ++k) {
            const double x = v[k];
            if (std::isfinite(x)) {
              if (st->have[s]) {
                const double step = x - st->last_raw[s];
                if (std::abs(step) > M_PI) st->offset[s] -= std::round(step / kTurn) * kTurn;
              } else {
                st->have[s] = true;
                st->first_raw[s] = x;
              }
              st->last_raw[s] = x;
            }
            out[k] = static_cast<float>((x + st->offset[s]) * kDeg);
          }
          break;
      }
    }
  }
}

void resize_series(std::size_t n, TrackPlotData* d) {
  for (auto& e : d->euler_deg) e.resize(n);
  d->lock_margin_deg.resize(n);
}

template <class Fn>
auto with_channel(const Track& t, const TrackPlotData& d, PlotChannel ch, Fn&& fn) {
  switch (ch) {
    case PlotChannel::Qw: return fn(t.qw.data());
    case PlotChannel::Qx: return fn(t.qx.data());
    case PlotChannel::Qy: return fn(t.qy.data());
    case PlotChannel::Qz: return fn(t.qz.data());
    case PlotChannel::Euler1: return fn(d.euler_deg[0].data());
    case PlotChannel::Euler2: return fn(d.euler_deg[1].data());
    case PlotChannel::Euler3: return fn(d.euler_deg[2].data());
    case PlotChannel::LockMargin: return fn(d.lock_margin_deg.data());
    case PlotChannel::AngularRate: break;
  }
  return fn(d.rate_deg_s.data());
}

}  // namespace

std::size_t MinMaxPyramid::bytes() const {
  std::size_t b = 0;
  for (const auto& l : min) b += l.capacity() * sizeof(float);
  for (const auto& l : max) b += l.capacity() * sizeof(float);
  return b;
}

std::size_t TrackPlotData::bytes() const {
  std::size_t b = 0;
  for (const auto& e : euler_deg) b += e.capacity() * sizeof(float);
  b += lock_margin_deg.capacity() * sizeof(float) + rate_deg_s.capacity() * sizeof(float);
  for (const auto& p : pyramid) b += p.bytes();
  return b + sorted_time_s.capacity() * sizeof(double);
}

void set_plot_convention(const Track& track, const EulerConvention& c, AngleMode mode, unsigned threads,
                         TrackPlotData* d) {
  const std::size_t n = track.size();
  d->convention = c;
  d->mode = mode;
  resize_series(n, d);
  constexpr int kConvChannels[4] = {4, 5, 6, 7};  // Euler1..3, LockMargin
  for (int ch : kConvChannels) size_pyramid(n, &d->pyramid[ch]);

  // Phase 1 (parallel): convert and unwrap each part on its own. The same parts are used
  // by phase 2, so they are cut here rather than by detail::parallel_ranges.
  std::vector<PartUnwrap> parts;
  std::vector<std::pair<std::size_t, std::size_t>> ranges;
  const std::size_t nparts =
      std::max<std::size_t>(1, std::min<std::size_t>(threads, n / detail::kMinSamplesPerThread));
  for (std::size_t p = 0; p < nparts; ++p) {
    const std::size_t b = p == 0 ? 0 : std::min(n, (n * p / nparts) / kPartAlign * kPartAlign);
    const std::size_t e = p + 1 == nparts ? n : std::min(n, (n * (p + 1) / nparts) / kPartAlign * kPartAlign);
    ranges.emplace_back(b, e);
  }
  parts.resize(nparts);
  auto run_parts = [&](auto&& fn) {
    std::vector<std::thread> workers;
    for (std::size_t p = 1; p < nparts; ++p) workers.emplace_back([&fn, p] { fn(p); });
    fn(std::size_t{0});
    for (auto& w : workers) w.join();
  };
  run_parts(
      [&](std::size_t p) { convert_part(track, c, mode, ranges[p].first, ranges[p].second, d, &parts[p]); });

  // Join (sequential, per part): the whole turns each later part must add.
  if (mode == AngleMode::Unwrapped) {
    for (int s = 0; s < 2; ++s) {
      bool have = false;
      double last_raw = 0.0, offset = 0.0;  // global offset at the end of the parts so far
      for (PartUnwrap& pu : parts) {
        if (!pu.have[s]) continue;
        double add = 0.0;
        if (have) {
          const double step = pu.first_raw[s] - last_raw;
          add = offset + (std::abs(step) > M_PI ? -std::round(step / kTurn) * kTurn : 0.0);
        }
        pu.add_deg[s] = add * kDeg;
        offset = add + pu.offset[s];
        last_raw = pu.last_raw[s];
        have = true;
      }
    }
  }

  // Phase 2 (parallel): apply the join, then level 0 of the pyramids of each part.
  run_parts([&](std::size_t p) {
    const auto [b, e] = ranges[p];
    for (int s = 0; s < 2; ++s) {
      const float add = static_cast<float>(parts[p].add_deg[s]);
      if (add == 0.0f) continue;
      float* v = d->euler_deg[s == 0 ? 0 : 2].data();
      for (std::size_t i = b; i < e; ++i) v[i] += add;
    }
    const std::size_t kb = b / kPyramidBase;
    for (int ch : kConvChannels) {
      MinMaxPyramid* pyr = &d->pyramid[ch];
      const std::size_t ke = std::min(pyr->min.empty() ? 0 : pyr->min[0].size(), e / kPyramidBase);
      if (pyr->min.empty()) continue;
      with_channel(track, *d, static_cast<PlotChannel>(ch), [&](const auto* v) {
        build_level0(v, kb, ke, pyr);
        return 0;
      });
    }
  });
  for (int ch : kConvChannels) build_upper_levels(&d->pyramid[ch]);
}

void build_track_plot(const Track& track, const EulerConvention& c, AngleMode mode, unsigned threads,
                      TrackPlotData* d) {
  const std::size_t n = track.size();
  d->rate_deg_s.assign(n, std::numeric_limits<float>::quiet_NaN());
  detail::parallel_ranges(n, threads, kPyramidBase, [&](std::size_t b, std::size_t e) {
    for (std::size_t i = std::max<std::size_t>(b, 1); i < e; ++i) {
      const double dt = track.has_time ? track.time_s[i] - track.time_s[i - 1] : 1.0;
      if (!(dt > 0.0)) continue;
      const double step =
          quaternion_step_angle(track.qw[i - 1], track.qx[i - 1], track.qy[i - 1], track.qz[i - 1],
                                track.qw[i], track.qx[i], track.qy[i], track.qz[i]);
      d->rate_deg_s[i] = static_cast<float>(step / dt * kDeg);
    }
  });
  if (n >= 2) d->rate_deg_s[0] = d->rate_deg_s[1];
  constexpr int kFixedChannels[5] = {0, 1, 2, 3, 8};  // Qw..Qz, AngularRate
  for (int ch : kFixedChannels) {
    MinMaxPyramid* p = &d->pyramid[ch];
    size_pyramid(n, p);
    if (p->min.empty()) continue;
    with_channel(track, *d, static_cast<PlotChannel>(ch), [&](const auto* v) {
      build_level0(v, 0, p->min[0].size(), p);
      return 0;
    });
    build_upper_levels(p);
  }
  d->sorted_time_s.clear();
  if (!std::is_sorted(track.time_s.begin(), track.time_s.end())) {
    d->sorted_time_s.resize(n);
    double m = -std::numeric_limits<double>::infinity();
    for (std::size_t i = 0; i < n; ++i) {
      if (track.time_s[i] > m) m = track.time_s[i];  // NaN times keep the running maximum
      d->sorted_time_s[i] = m;
    }
  }
  d->sorted_time_s.shrink_to_fit();
  set_plot_convention(track, c, mode, threads, d);
}

double plot_value(const Track& track, const TrackPlotData& data, PlotChannel ch, std::size_t i) {
  if (i >= track.size()) return std::numeric_limits<double>::quiet_NaN();
  return with_channel(track, data, ch, [i](const auto* v) { return static_cast<double>(v[i]); });
}

void channel_range(const Track& track, const TrackPlotData& data, PlotChannel ch, std::size_t begin,
                   std::size_t end, float* min, float* max) {
  end = std::min(end, track.size());
  const MinMaxPyramid& p = data.pyramid[static_cast<int>(ch)];
  with_channel(track, data, ch, [&](const auto* v) {
    pyramid_range(v, p, begin, std::max(begin, end), min, max);
    return 0;
  });
}

std::size_t sample_at_or_after(const Track& track, const TrackPlotData& data, double t) {
  const std::vector<double>& time = data.sorted_time_s.empty() ? track.time_s : data.sorted_time_s;
  return static_cast<std::size_t>(std::lower_bound(time.begin(), time.end(), t) - time.begin());
}

PlotEnvelope plot_envelope(const Track& track, const TrackPlotData& data, PlotChannel ch, double t0,
                           double t1, std::size_t columns) {
  PlotEnvelope env;
  env.t0 = t0;
  env.t1 = t1;
  const std::size_t n = track.size();
  if (n == 0 || columns == 0 || !(t1 > t0)) return env;
  const std::size_t i0 = sample_at_or_after(track, data, t0);
  const std::size_t i1 = sample_at_or_after(track, data, t1);
  if (i1 - i0 <= 2 * columns) {
    env.points = true;
    env.first = i0 > 0 ? i0 - 1 : 0;
    env.last = std::min(n - 1, i1);
    return env;
  }
  const float nan = std::numeric_limits<float>::quiet_NaN();
  env.min.assign(columns, nan);
  env.max.assign(columns, nan);
  const double w = (t1 - t0) / static_cast<double>(columns);
  std::size_t a = i0;
  for (std::size_t col = 0; col < columns; ++col) {
    const std::size_t b =
        col + 1 == columns ? i1 : sample_at_or_after(track, data, t0 + static_cast<double>(col + 1) * w);
    if (b > a) {
      float lo, hi;
      channel_range(track, data, ch, a, b, &lo, &hi);
      if (lo <= hi) {
        env.min[col] = lo;
        env.max[col] = hi;
      }
    }
    a = std::max(a, b);
  }
  return env;
}

}  // namespace attiscope
