// track_bench.cpp: figures for the track tools (a benchmark, not a test): what a convention
// switch in the Track panel costs on a 1e6-sample track, what the envelopes cost on a
// 1e7-sample track, the diagnosis, the CSV export, and the memory held per sample.
//
// Usage: track_bench [SAMPLES (default 1000000)] [BIG_SAMPLES (default 10000000)]
// Prints medians over repeated runs. Shared machines drift: compare figures of one run.
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <fstream>
#include <functional>
#include <random>
#include <sstream>
#include <thread>
#include <vector>

#include "attiscope/core/track_analysis.hpp"
#include "attiscope/core/track_clean.hpp"
#include "attiscope/core/track_plot.hpp"
#include "support/track_gen.hpp"

namespace {

using Clock = std::chrono::steady_clock;
constexpr std::uint32_t kBenchSeed = 20261201;

// CPU time of the whole process (all threads), ms.
double process_cpu_ms() {
  timespec ts{};
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &ts);
  return static_cast<double>(ts.tv_sec) * 1e3 + static_cast<double>(ts.tv_nsec) * 1e-6;
}

// Medians of wall time and of process CPU time: on a shared machine wall time includes
// waiting for a core, CPU time does not.
struct Timing {
  double wall = 0.0, cpu = 0.0;
};

Timing timing(int reps, const std::function<void()>& fn) {
  std::vector<std::pair<double, double>> ms;
  for (int r = 0; r < reps; ++r) {
    const double c0 = process_cpu_ms();
    const auto t0 = Clock::now();
    fn();
    ms.emplace_back(std::chrono::duration<double, std::milli>(Clock::now() - t0).count(),
                    process_cpu_ms() - c0);
  }
  std::sort(ms.begin(), ms.end());
  std::vector<double> cpu;
  for (const auto& m : ms) cpu.push_back(m.second);
  std::sort(cpu.begin(), cpu.end());
  return {ms[ms.size() / 2].first, cpu[cpu.size() / 2]};
}

double median_ms(int reps, const std::function<void()>& fn) {
  return timing(reps, fn).wall;
}

const char* mode_name(attiscope::AngleMode m) {
  switch (m) {
    case attiscope::AngleMode::Wrapped: return "wrapped";
    case attiscope::AngleMode::ZeroTo360: return "0-360";
    case attiscope::AngleMode::Unwrapped: return "unwrapped";
  }
  return "?";
}

}  // namespace

int main(int argc, char** argv) {
  using namespace attiscope;
  const std::size_t n = argc > 1 ? std::strtoull(argv[1], nullptr, 10) : 1000000;
  const std::size_t big = argc > 2 ? std::strtoull(argv[2], nullptr, 10) : 10000000;
  const unsigned hw = std::max(1u, std::thread::hardware_concurrency());
  std::printf("track_bench: %zu-sample track (tumbling random walk, 100 Hz), %u hardware threads\n", n, hw);

  const Track t = test::RandomWalkTrack(n, 100.0, kBenchSeed, 1.0);
  const auto& all = all_euler_conventions();
  const std::size_t columns = 1600;

  TrackPlotData d;
  std::printf("  build_track_plot (rate, all pyramids, Euler): %.2f ms median (2 threads)\n",
              median_ms(5, [&] { build_track_plot(t, all[5], AngleMode::Wrapped, 2, &d); }));
  // The track by size (40 bytes a sample): the generator's push_back leaves spare capacity
  // that a reader sized from the file does not.
  const double track_bytes = 5.0 * static_cast<double>(t.time_s.size() * sizeof(double));
  std::printf("  memory held: track %.1f + plot data %.1f = %.1f bytes per sample\n",
              track_bytes / static_cast<double>(n), static_cast<double>(d.bytes()) / static_cast<double>(n),
              (track_bytes + static_cast<double>(d.bytes())) / static_cast<double>(n));

  const std::vector<PlotChannel> switched = {PlotChannel::Euler1, PlotChannel::Euler2, PlotChannel::Euler3,
                                             PlotChannel::LockMargin, PlotChannel::AngularRate};
  // A convention switch: recompute Euler series, lock margin, their pyramids, and the
  // envelopes of the seven plotted channels over the whole track at 1600 columns.
  for (unsigned threads : {1u, 2u}) {
    for (AngleMode mode : {AngleMode::Wrapped, AngleMode::ZeroTo360, AngleMode::Unwrapped}) {
      std::size_t k = 0;
      const Timing ms = timing(24, [&] {
        set_plot_convention(t, all[k++ % 24], mode, threads, &d);
        const auto envs = plot_envelopes(t, d, switched, -1.0, 1e9, columns);
        if (envs[0].min.empty()) std::abort();
      });
      std::printf(
          "  convention switch + envelopes, %s, %u thread(s): %.2f ms wall, %.2f ms CPU (medians, 24 "
          "conventions)\n",
          mode_name(mode), threads, ms.wall, ms.cpu);
    }
  }
  {
    std::vector<double> a(n), b(n), c(n), m(n);
    const Timing ms =
        timing(9, [&] { track_euler(t, 0, n, all[5], a.data(), b.data(), c.data(), m.data()); });
    std::printf("  track_euler alone (1 thread, intrinsic ZYX, with margin): %.2f ms wall, %.2f ms CPU\n",
                ms.wall, ms.cpu);
  }

  TrackDiagnosisOptions o;
  o.rate_limit_rad_s = 3.0;
  for (unsigned threads : {1u, 2u}) {
    o.threads = threads;
    const Timing ms = timing(5, [&] { diagnose_track(t, o); });
    std::printf("  diagnose_track, %u thread(s): %.2f ms wall, %.2f ms CPU\n", threads, ms.wall, ms.cpu);
  }
  CleanTrack clean;
  std::printf("  clean_track: %.2f ms\n", median_ms(5, [&] { clean = clean_track(t); }));
  for (ExportRepresentation r : {ExportRepresentation::Quaternion, ExportRepresentation::Euler}) {
    std::size_t bytes = 0;
    TrackExportOptions eo;
    eo.representation = r;
    const double ms = median_ms(3, [&] {
      std::ostringstream out;
      write_track_csv(out, clean.track, eo);
      bytes = out.str().size();
    });
    std::printf("  write_track_csv %s: %.1f ms, %.0f MB/s (%.1f MB)\n",
                r == ExportRepresentation::Quaternion ? "quaternion" : "Euler", ms,
                static_cast<double>(bytes) / ms / 1e3, static_cast<double>(bytes) / 1e6);
  }

  if (big > 0) {
    std::printf("track_bench: %zu-sample track for the envelopes\n", big);
    const Track tb = test::RandomWalkTrack(big, 100.0, kBenchSeed + 7, 1.0);
    TrackPlotData db;
    const double build_ms = median_ms(1, [&] { build_track_plot(tb, all[5], AngleMode::Unwrapped, 2, &db); });
    std::printf(
        "  build_track_plot: %.1f ms; memory held %.1f bytes per sample\n", build_ms,
        (5.0 * static_cast<double>(tb.time_s.size() * sizeof(double)) + static_cast<double>(db.bytes())) /
            static_cast<double>(big));
    std::mt19937 rng(7);
    const double span = tb.time_s.back();
    std::uniform_real_distribution<double> u(0.0, 1.0);
    std::vector<PlotChannel> channels;
    for (int ch = 0; ch < kPlotChannelCount; ++ch) channels.push_back(static_cast<PlotChannel>(ch));
    const double whole = median_ms(21, [&] { plot_envelopes(tb, db, channels, 0.0, span, columns); });
    const double zoomed = median_ms(201, [&] {
      const double w = span * std::pow(10.0, -4.0 * u(rng));  // from the whole track to 1e-4 of it
      const double t0 = (span - w) * u(rng);
      plot_envelopes(tb, db, channels, t0, t0 + w, columns);
    });
    std::printf(
        "  envelopes of all 9 channels at %zu columns: whole track %.3f ms, random zoom/pan %.3f ms median\n",
        columns, whole, zoomed);
  }
  return 0;
}
