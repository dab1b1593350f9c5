// track_read_bench.cpp: reading a pose log as a track, whole (file to rotations in memory):
// column finding on the head of the file, then the mapped bulk reader. Prints bytes/s.
// bytes_per_second is per wall-clock second (UseRealTime); the CPU column is the process's.
// The file is ATTISCOPE_TRACK_FILE when set (bench/track_read_vs_pandas.py sets it), else a
// 60 MB, one-million-line invented `t,qw,qx,qy,qz` log written to the temporary folder.
#include <benchmark/benchmark.h>

#include <charconv>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <random>
#include <string>

#include "attiscope/core/columns.hpp"

namespace {

std::string track_file() {
  if (const char* f = std::getenv("ATTISCOPE_TRACK_FILE")) return f;
  const std::string path = (std::filesystem::temp_directory_path() / "attiscope_track_bench.csv").string();
  std::ifstream probe(path);
  if (probe.good()) return path;
  // An invented slow tumble sampled at 1 kHz, nine significant digits per number.
  std::ofstream out(path);
  out << "t,qw,qx,qy,qz\n";
  std::mt19937 rng(20261201);
  std::normal_distribution<double> n(0.0, 1.0);
  char line[160];
  for (int i = 0; i < 1000000; ++i) {
    double q[4] = {n(rng), n(rng), n(rng), n(rng)};
    const double s = std::sqrt(q[0] * q[0] + q[1] * q[1] + q[2] * q[2] + q[3] * q[3]);
    std::snprintf(line, sizeof line, "%.3f,%.9f,%.9f,%.9f,%.9f\n", i * 0.001, q[0] / s, q[1] / s, q[2] / s,
                  q[3] / s);
    out << line;
  }
  return path;
}

void BM_ReadTrackFile(benchmark::State& state) {
  const std::string path = track_file();
  auto head = attiscope::read_file_head(path);
  auto mapping = attiscope::find_columns(head.value());
  if (!mapping) {
    state.SkipWithError(mapping.error().describe().c_str());
    return;
  }
  std::size_t bytes = 0;
  std::size_t rows = 0;
  for (auto _ : state) {
    auto track = attiscope::read_track_file(path, mapping.value());
    benchmark::DoNotOptimize(track);
    rows = track.value().size();
    std::ifstream f(path, std::ios::ate | std::ios::binary);
    bytes = static_cast<std::size_t>(f.tellg());
  }
  state.SetBytesProcessed(static_cast<std::int64_t>(bytes * state.iterations()));
  state.counters["rows"] = static_cast<double>(rows);
}
// Wall-clock time (a long file is read on two threads) and the CPU time of the whole
// process (both threads), so that the CPU column is not flattered by the second thread.
BENCHMARK(BM_ReadTrackFile)
    ->Unit(benchmark::kMillisecond)
    ->MinTime(2.0)
    ->UseRealTime()
    ->MeasureProcessCPUTime();

// The parsing limit for comparison: std::from_chars over every field of the same file,
// already in memory, into a running sum (no columns, no checks, no arrays).
void BM_FromCharsOnly(benchmark::State& state) {
  std::ifstream in(track_file(), std::ios::binary);
  const std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  const char* const begin = text.data() + text.find('\n') + 1;
  const char* const end = text.data() + text.size();
  for (auto _ : state) {
    double sum = 0.0;
    const char* p = begin;
    while (p < end) {
      double v = 0.0;
      const auto r = std::from_chars(p, end, v);
      sum += v;
      p = r.ptr + 1;  // past ',' or '\n'
    }
    benchmark::DoNotOptimize(sum);
  }
  state.SetBytesProcessed(static_cast<std::int64_t>(text.size()) * state.iterations());
}
BENCHMARK(BM_FromCharsOnly)->Unit(benchmark::kMillisecond)->MinTime(2.0);

}  // namespace

BENCHMARK_MAIN();
