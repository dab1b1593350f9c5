// Tests of track_plot.hpp: the series in each angle mode agree with single-pose to_euler,
// the threaded computation equals the single-threaded one, envelopes equal a brute-force
// min/max per pixel column, and the memory held stays within 100 bytes a sample.
#include "attiscope/core/track_plot.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <random>

#include "attiscope/core/track_analysis.hpp"
#include "attiscope/core/track_clean.hpp"
#include "support/check.hpp"
#include "support/track_gen.hpp"

namespace attiscope {
namespace {

constexpr double kDeg = 180.0 / M_PI;
// Series are float: a few float ulps of 360 degrees (float eps 1.2e-7 x 360 = 4e-5).
constexpr double kFloatDeg = 1e-4;

double Mod360(double x) {
  double r = std::fmod(x, 360.0);
  if (r < 0) r += 360.0;
  return r;
}

// Angular distance on the circle, degrees.
double CircleDiff(double a, double b) {
  const double d = Mod360(a - b);
  return std::min(d, 360.0 - d);
}

TEST(TrackPlotTest, SeriesAgreeWithToEulerInEveryMode) {
  const Track t = test::RandomWalkTrack(40000, 100.0, test::kSeed, 2.0);
  const EulerConvention c = parse_euler_sequence("YXY", EulerKind::Extrinsic).value();
  for (AngleMode mode : {AngleMode::Wrapped, AngleMode::ZeroTo360, AngleMode::Unwrapped}) {
    TrackPlotData d;
    build_track_plot(t, c, mode, 2, &d);
    ASSERT_EQ(d.euler_deg[0].size(), t.size());
    for (std::size_t i = 0; i < t.size(); ++i) {
      const EulerAngles e = to_euler(Rotation(Eigen::Quaterniond(t.qw[i], t.qx[i], t.qy[i], t.qz[i])), c);
      const double a = e.angles_rad(0) * kDeg, b = e.angles_rad(1) * kDeg, cc = e.angles_rad(2) * kDeg;
      ASSERT_NEAR(d.euler_deg[1][i], b, kFloatDeg) << i;
      ASSERT_NEAR(d.lock_margin_deg[i], e.lock_margin_rad * kDeg, kFloatDeg) << i;
      switch (mode) {
        case AngleMode::Wrapped:
          ASSERT_NEAR(d.euler_deg[0][i], a, kFloatDeg) << i;
          ASSERT_NEAR(d.euler_deg[2][i], cc, kFloatDeg) << i;
          break;
        case AngleMode::ZeroTo360:
          ASSERT_GE(d.euler_deg[0][i], 0.0f);
          ASSERT_LT(d.euler_deg[0][i], 360.0f);
          ASSERT_LT(CircleDiff(d.euler_deg[0][i], a), kFloatDeg) << i;
          ASSERT_LT(CircleDiff(d.euler_deg[2][i], cc), kFloatDeg) << i;
          break;
        case AngleMode::Unwrapped:
          // Same angle on the circle, and continuous: no step beyond half a turn.
          ASSERT_LT(CircleDiff(d.euler_deg[0][i], a), 1e-2) << i;
          ASSERT_LT(CircleDiff(d.euler_deg[2][i], cc), 1e-2) << i;
          if (i > 0) {
            ASSERT_LE(std::abs(d.euler_deg[0][i] - d.euler_deg[0][i - 1]), 180.0f) << i;
            ASSERT_LE(std::abs(d.euler_deg[2][i] - d.euler_deg[2][i - 1]), 180.0f) << i;
          }
          break;
      }
    }
  }
}

TEST(TrackPlotTest, TwoThreadsAgreeWithOneAndWithTheExactUnwrap) {
  // Long enough for two parts; the tumbling motion wraps across the part boundary.
  const Track t = test::RandomWalkTrack(100000, 100.0, test::kSeed + 1, 3.0);
  const EulerConvention c = parse_euler_sequence("ZYX", EulerKind::Intrinsic).value();
  TrackPlotData one, two;
  build_track_plot(t, c, AngleMode::Unwrapped, 1, &one);
  build_track_plot(t, c, AngleMode::Unwrapped, 2, &two);
  // The exact unwrap in double (track_clean.hpp's unwrap_euler on track_euler's angles).
  std::vector<double> a(t.size()), b(t.size()), cc(t.size());
  track_euler(t, 0, t.size(), c, a.data(), b.data(), cc.data());
  unwrap_euler(a, cc, nullptr);
  const std::vector<double>* exact[3] = {&a, &b, &cc};
  for (int k = 0; k < 3; ++k) {
    double largest = 0.0;
    for (double v : *exact[k]) largest = std::max(largest, std::abs(v * kDeg));
    // Float series: within a few float ulps of the largest value of the channel.
    const double tol = 4.0 * 1.2e-7 * largest + 1e-5;
    for (std::size_t i = 0; i < t.size(); ++i) {
      const double want = (*exact[k])[i] * kDeg;
      ASSERT_NEAR(one.euler_deg[k][i], want, tol)
          << "channel " << k << " sample " << i << " seed " << test::kSeed + 1;
      ASSERT_NEAR(two.euler_deg[k][i], want, tol)
          << "channel " << k << " sample " << i << " seed " << test::kSeed + 1;
    }
  }
  EXPECT_EQ(one.lock_margin_deg, two.lock_margin_deg);
}

TEST(TrackPlotTest, EnvelopeEqualsBruteForceMinMaxPerColumn) {
  std::mt19937 rng(test::kSeed);
  Track t = test::RandomWalkTrack(200000, 100.0, test::kSeed, 1.0);
  t.time_s[150000] = t.time_s[149999] - 0.5;  // a backwards time: columns still well defined
  TrackPlotData d;
  build_track_plot(t, parse_euler_sequence("XYZ", EulerKind::Intrinsic).value(), AngleMode::Unwrapped, 2, &d);
  EXPECT_FALSE(d.sorted_time_s.empty());
  std::uniform_real_distribution<double> u(0.0, 2000.0);
  for (int trial = 0; trial < 20; ++trial) {
    double t0 = u(rng), t1 = u(rng);
    if (t0 > t1) std::swap(t0, t1);
    if (trial == 0) {
      t0 = -1.0;
      t1 = 2001.0;  // the whole track
    }
    std::size_t columns = 1 + static_cast<std::size_t>(u(rng));
    if (trial == 1) {
      t0 = -1.0;
      t1 = 2001.0;
      columns = 100;  // 2000 samples a column: boundaries snapped to pyramid blocks
    }
    for (int ch = 0; ch < kPlotChannelCount; ++ch) {
      const PlotEnvelope env = plot_envelope(t, d, static_cast<PlotChannel>(ch), t0, t1, columns);
      const std::size_t i0 = sample_at_or_after(t, d, t0), i1 = sample_at_or_after(t, d, t1);
      if (env.points) {
        EXPECT_LE(i1 - i0, 2 * columns);
        continue;
      }
      ASSERT_EQ(env.min.size(), columns);
      ASSERT_EQ(env.column_begin.size(), columns + 1);
      EXPECT_EQ(env.column_begin.front(), i0);
      EXPECT_EQ(env.column_begin.back(), i1);
      const double w = (t1 - t0) / static_cast<double>(columns);
      for (std::size_t col = 0; col < columns; ++col) {
        const std::size_t a = env.column_begin[col], b = env.column_begin[col + 1];
        // Each boundary is the first sample of its column's time, or within half a pyramid
        // block of it when columns hold many samples.
        if (col > 0) {
          const std::size_t exact = sample_at_or_after(t, d, t0 + static_cast<double>(col) * w);
          const std::size_t slack = (i1 - i0) / columns >= kEnvelopeSnapSamples ? kPyramidBase / 2 : 0;
          ASSERT_LE(std::max(a, exact) - std::min(a, exact), slack) << "trial " << trial << " column " << col;
        }
        float lo = INFINITY, hi = -INFINITY;
        for (std::size_t i = a; i < b; ++i) {
          const float v = static_cast<float>(plot_value(t, d, static_cast<PlotChannel>(ch), i));
          if (v < lo) lo = v;
          if (v > hi) hi = v;
        }
        if (lo > hi) {
          ASSERT_TRUE(std::isnan(env.min[col]))
              << "trial " << trial << " channel " << ch << " column " << col;
        } else {
          ASSERT_EQ(env.min[col], lo) << "trial " << trial << " channel " << ch << " column " << col;
          ASSERT_EQ(env.max[col], hi) << "trial " << trial << " channel " << ch << " column " << col;
        }
      }
    }
  }
}

TEST(TrackPlotTest, ZoomedInWindowGivesSamplesToDraw) {
  const Track t = test::RandomWalkTrack(10000, 100.0, test::kSeed, 1.0);
  TrackPlotData d;
  build_track_plot(t, EulerConvention{}, AngleMode::Wrapped, 1, &d);
  const PlotEnvelope env = plot_envelope(t, d, PlotChannel::Qw, 10.005, 10.5, 800);
  ASSERT_TRUE(env.points);
  EXPECT_EQ(env.first, 1000u);  // one sample before the window (t = 10.00)
  EXPECT_EQ(env.last, 1050u);   // the first sample at or after its end
}

TEST(TrackPlotTest, HoldsUnder100BytesPerSample) {
  const std::size_t n = 300000;
  const Track t = test::RandomWalkTrack(n, 100.0, test::kSeed, 1.0);
  TrackPlotData d;
  build_track_plot(t, EulerConvention{}, AngleMode::Unwrapped, 2, &d);
  const std::size_t track_bytes = 5 * t.time_s.capacity() * sizeof(double);
  const double per_sample = static_cast<double>(track_bytes + d.bytes()) / static_cast<double>(n);
  EXPECT_LT(per_sample, 100.0);
  EXPECT_GT(per_sample, 40.0);  // the track alone is 40: the plot data is counted
}

}  // namespace
}  // namespace attiscope
