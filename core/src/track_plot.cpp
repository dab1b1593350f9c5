// track_plot.cpp: plot series of a track, their min/max pyramids and pixel-column envelopes.
#include "attiscope/core/track_plot.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <thread>

#include "attiscope/core/track_analysis.hpp"
#include "track_parallel.hpp"

namespace attiscope {

namespace {

constexpr double kDeg = 180.0 / M_PI;
constexpr double kTurn = 2.0 * M_PI;
constexpr float kInf = std::numeric_limits<float>::infinity();
constexpr std::size_t kPyramidShift = 6;  // kPyramidBase == 1 << kPyramidShift
static_assert(kPyramidBase == std::size_t{1} << kPyramidShift, "kPyramidBase is a power of two");
// Samples converted per call of track_euler (four double buffers on the stack: 64 KB).
constexpr std::size_t kChunk = 2048;
// Part boundaries are multiples of this, so each part owns whole pyramid blocks.
constexpr std::size_t kPartAlign = kPyramidBase * 16;

template <class T>
void scan_min_max(const T* v, std::size_t a, std::size_t b, float* mn, float* mx) {
  // Eight independent lanes, each `x < lo ? x : lo`, so the compiler can use packed min/max
  // without reordering anything; NaN fails both comparisons and is skipped.
  constexpr std::size_t kLanes = 8;
  float lo[kLanes], hi[kLanes];
  for (std::size_t k = 0; k < kLanes; ++k) {
    lo[k] = *mn;
    hi[k] = *mx;
  }
  std::size_t i = a;
  for (; i + kLanes <= b; i += kLanes) {
    for (std::size_t k = 0; k < kLanes; ++k) {
      const float x = static_cast<float>(v[i + k]);
      lo[k] = x < lo[k] ? x : lo[k];
      hi[k] = x > hi[k] ? x : hi[k];
    }
  }
  for (; i < b; ++i) {
    const float x = static_cast<float>(v[i]);
    lo[0] = x < lo[0] ? x : lo[0];
    hi[0] = x > hi[0] ? x : hi[0];
  }
  for (std::size_t k = 0; k < kLanes; ++k) {
    *mn = lo[k] < *mn ? lo[k] : *mn;
    *mx = hi[k] > *mx ? hi[k] : *mx;
  }
}

// Level 0 of a pyramid for the full blocks in [block_begin, block_end).
template <class T>
void build_level0(const T* v, std::size_t block_begin, std::size_t block_end, MinMaxPyramid* p) {
  for (std::size_t k = block_begin; k < block_end; ++k) {
    float lo = kInf, hi = -kInf;
    scan_min_max(v, k * kPyramidBase, (k + 1) * kPyramidBase, &lo, &hi);
    p->level[0][2 * k] = lo;
    p->level[0][2 * k + 1] = hi;
  }
}

void size_pyramid(std::size_t n, MinMaxPyramid* p) {
  p->samples = n;
  std::size_t levels = 0;
  for (std::size_t size = kPyramidBase; n / size >= 1; size *= 2) ++levels;
  p->level.resize(levels);
  std::size_t size = kPyramidBase;
  for (std::size_t l = 0; l < levels; ++l, size *= 2) {
    p->level[l].resize(2 * (n / size));
  }
}

void build_upper_levels(MinMaxPyramid* p) {
  for (std::size_t l = 1; l < p->levels(); ++l) {
    const std::vector<float>& below = p->level[l - 1];
    std::vector<float>& here = p->level[l];
    for (std::size_t k = 0; k < p->blocks(l); ++k) {
      here[2 * k] = std::min(below[4 * k], below[4 * k + 2]);
      here[2 * k + 1] = std::max(below[4 * k + 1], below[4 * k + 3]);
    }
  }
}

template <class T>
void pyramid_range(const T* v, const MinMaxPyramid& p, std::size_t a, std::size_t b, float* mn, float* mx) {
  *mn = kInf;
  *mx = -kInf;
  while (a < b) {
    if (a % kPyramidBase != 0 || b - a < kPyramidBase || p.empty()) {
      const std::size_t next = (a / kPyramidBase + 1) * kPyramidBase;
      const std::size_t stop = (b - a < kPyramidBase || p.empty()) ? b : std::min(b, next);
      scan_min_max(v, a, stop, mn, mx);
      a = stop;
      continue;
    }
    // a is block-aligned: take the largest whole block that starts at a and ends by b.
    // Block sizes are powers of two: masks and shifts, no division.
    std::size_t level = 0, size = kPyramidBase, shift = kPyramidShift;
    while (level + 1 < p.levels() && (a & (2 * size - 1)) == 0 && a + 2 * size <= b) {
      ++level;
      size *= 2;
      ++shift;
    }
    const std::size_t k = a >> shift;
    if (k >= p.blocks(level)) {  // the tail of the track, shorter than a block
      scan_min_max(v, a, b, mn, mx);
      return;
    }
    *mn = std::min(*mn, p.level[level][2 * k]);
    *mx = std::max(*mx, p.level[level][2 * k + 1]);
    a += size;
  }
}

// What one part of the track found while unwrapping, to join the parts afterwards.
struct PartUnwrap {
  bool have[2] = {false, false};
  double first_raw[2] = {0.0, 0.0}, last_raw[2] = {0.0, 0.0};
  std::int64_t turns[2] = {0, 0};  // whole turns added at the end of the part
  double add_deg[2] = {0.0, 0.0};  // set by the join: whole turns this part must add
};

// The unwrap of one chunk of a channel (the rule of unwrap_euler in track_clean.hpp),
// carried across chunks in `st`. Angles come wrapped into (-pi, pi], so a step beyond pi is
// exactly one turn: the turn counts are blends, their running sum an integer add.
void unwrap_chunk(const double* v, std::size_t len, int s, float* out, PartUnwrap* st) {
  // v * 0 is NaN for NaN and infinity; four lanes so the check vectorises.
  double lanes[4] = {0.0, 0.0, 0.0, 0.0};
  std::size_t k4 = 0;
  for (; k4 + 4 <= len; k4 += 4) {
    for (std::size_t l = 0; l < 4; ++l) lanes[l] += v[k4 + l] * 0.0;
  }
  for (; k4 < len; ++k4) lanes[0] += v[k4] * 0.0;
  const bool finite = lanes[0] + lanes[1] + lanes[2] + lanes[3] == 0.0;
  if (!finite || len == 0) {
    // A sample that is not a rotation: step over it as unwrap_euler does.
    for (std::size_t k = 0; k < len; ++k) {
      const double x = v[k];
      if (std::isfinite(x)) {
        if (st->have[s]) {
          const double step = x - st->last_raw[s];
          if (std::abs(step) > M_PI) st->turns[s] -= static_cast<std::int64_t>(std::round(step / kTurn));
        } else {
          st->have[s] = true;
          st->first_raw[s] = x;
        }
        st->last_raw[s] = x;
      }
      out[k] = static_cast<float>((x + static_cast<double>(st->turns[s]) * kTurn) * kDeg);
    }
    return;
  }
  if (!st->have[s]) {
    st->have[s] = true;
    st->first_raw[s] = v[0];
    st->last_raw[s] = v[0];
  }
  std::int32_t jump[kChunk];
  const double first_step = v[0] - st->last_raw[s];
  jump[0] = first_step > M_PI ? -1 : (first_step < -M_PI ? 1 : 0);
  const double* next = v + 1;
  std::int32_t* jump_next = jump + 1;
  for (std::size_t k = 0; k + 1 < len; ++k) {
    const double step = next[k] - v[k];
    jump_next[k] = static_cast<std::int32_t>(step < -M_PI) - static_cast<std::int32_t>(step > M_PI);
  }
  // Running sum of the turns within the chunk (int32: one cycle an add), then the angles.
  std::int32_t acc = 0;
  for (std::size_t k = 0; k < len; ++k) {
    acc += jump[k];
    jump[k] = acc;
  }
  const double base = static_cast<double>(st->turns[s]) * kTurn;
  for (std::size_t k = 0; k < len; ++k) {
    out[k] = static_cast<float>((v[k] + (base + static_cast<double>(jump[k]) * kTurn)) * kDeg);
  }
  st->turns[s] += acc;
  st->last_raw[s] = v[len - 1];
}

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
        case AngleMode::Unwrapped: unwrap_chunk(v, len, s, out, st); break;
      }
    }
    // Level 0 of the four pyramids for the whole blocks of this chunk, while it is in cache
    // (chunks start on block boundaries: parts are cut at multiples of kPartAlign).
    const std::size_t kb = i0 / kPyramidBase;
    for (int ch = 4; ch < 8; ++ch) {
      MinMaxPyramid* p = &d->pyramid[ch];
      if (p->empty()) continue;
      const std::size_t ke = std::min(p->blocks(0), (i0 + len) / kPyramidBase);
      const float* v = ch == 7 ? d->lock_margin_deg.data() : d->euler_deg[ch - 4].data();
      build_level0(v, kb, ke, p);
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
  for (const auto& l : level) b += l.capacity() * sizeof(float);
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
        offset = add + static_cast<double>(pu.turns[s]) * kTurn;
        last_raw = pu.last_raw[s];
        have = true;
      }
    }
  }

  // Phase 2 (parallel, unwrapped mode only): shift each later part by the whole turns the
  // join found, values and level-0 entries alike (float rounding is monotonic, so the
  // shifted min and max are the min and max of the shifted values).
  if (mode == AngleMode::Unwrapped && nparts > 1) {
    run_parts([&](std::size_t p) {
      const auto [b, e] = ranges[p];
      for (int s = 0; s < 2; ++s) {
        const float add = static_cast<float>(parts[p].add_deg[s]);
        if (add == 0.0f) continue;
        const int k = s == 0 ? 0 : 2;
        float* v = d->euler_deg[k].data();
        for (std::size_t i = b; i < e; ++i) v[i] += add;
        MinMaxPyramid* pyr = &d->pyramid[4 + k];
        if (pyr->empty()) continue;
        const std::size_t ke = std::min(pyr->blocks(0), e / kPyramidBase);
        for (std::size_t j = b / kPyramidBase; j < ke; ++j) {
          pyr->level[0][2 * j] += add;
          pyr->level[0][2 * j + 1] += add;
        }
      }
    });
  }
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
    if (p->empty()) continue;
    with_channel(track, *d, static_cast<PlotChannel>(ch), [&](const auto* v) {
      build_level0(v, 0, p->blocks(0), p);
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

std::vector<std::size_t> envelope_columns(const Track& track, const TrackPlotData& data, double t0, double t1,
                                          std::size_t columns) {
  std::vector<std::size_t> begin(columns + 1);
  if (columns == 0) return begin;
  begin[0] = sample_at_or_after(track, data, t0);
  begin[columns] = std::max(begin[0], sample_at_or_after(track, data, t1));
  const bool snap = (begin[columns] - begin[0]) / columns >= kEnvelopeSnapSamples;
  const double w = (t1 - t0) / static_cast<double>(columns);
  for (std::size_t col = 1; col < columns; ++col) {
    std::size_t b = sample_at_or_after(track, data, t0 + static_cast<double>(col) * w);
    if (snap) b = (b + kPyramidBase / 2) / kPyramidBase * kPyramidBase;
    begin[col] = std::min(begin[columns], std::max(begin[col - 1], b));
  }
  return begin;
}

std::vector<PlotEnvelope> plot_envelopes(const Track& track, const TrackPlotData& data,
                                         const std::vector<PlotChannel>& channels, double t0, double t1,
                                         std::size_t columns) {
  std::vector<PlotEnvelope> out(channels.size());
  for (PlotEnvelope& env : out) {
    env.t0 = t0;
    env.t1 = t1;
  }
  const std::size_t n = track.size();
  if (n == 0 || columns == 0 || !(t1 > t0)) return out;
  const std::vector<std::size_t> begin = envelope_columns(track, data, t0, t1, columns);
  const std::size_t i0 = begin.front(), i1 = begin.back();
  const float nan = std::numeric_limits<float>::quiet_NaN();
  for (std::size_t c = 0; c < channels.size(); ++c) {
    PlotEnvelope& env = out[c];
    env.first = i0 > 0 ? i0 - 1 : 0;
    env.last = n > 0 ? std::min(n - 1, i1) : 0;
    if (i1 - i0 <= 2 * columns) {
      env.points = true;
      continue;
    }
    env.column_begin = begin;
    env.min.assign(columns, nan);
    env.max.assign(columns, nan);
    for (std::size_t col = 0; col < columns; ++col) {
      if (begin[col + 1] <= begin[col]) continue;
      float lo, hi;
      channel_range(track, data, channels[c], begin[col], begin[col + 1], &lo, &hi);
      if (lo <= hi) {
        env.min[col] = lo;
        env.max[col] = hi;
      }
    }
  }
  return out;
}

PlotEnvelope plot_envelope(const Track& track, const TrackPlotData& data, PlotChannel ch, double t0,
                           double t1, std::size_t columns) {
  return plot_envelopes(track, data, {ch}, t0, t1, columns).front();
}

}  // namespace attiscope
