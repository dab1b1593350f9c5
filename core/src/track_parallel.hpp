// track_parallel.hpp (private to core/src): split a range of samples over a few threads.
// Each call starts its threads and joins them before it returns: no pool, no global state.
#pragma once

#include <algorithm>
#include <cstddef>
#include <thread>
#include <vector>

namespace attiscope::detail {

/// Below this many samples a second thread costs more than it saves.
inline constexpr std::size_t kMinSamplesPerThread = 16384;

/// Runs fn(begin, end) over [0, n) cut into up to `threads` contiguous parts whose
/// boundaries are multiples of `align`; the calling thread takes the first part.
template <class Fn>
void parallel_ranges(std::size_t n, unsigned threads, std::size_t align, Fn&& fn) {
  std::size_t parts = std::max<std::size_t>(1, std::min<std::size_t>(threads, n / kMinSamplesPerThread));
  if (parts <= 1) {
    fn(std::size_t{0}, n);
    return;
  }
  std::vector<std::size_t> cut(parts + 1, n);
  cut[0] = 0;
  for (std::size_t p = 1; p < parts; ++p) cut[p] = std::min(n, (n * p / parts) / align * align);
  std::vector<std::thread> workers;
  workers.reserve(parts - 1);
  for (std::size_t p = 1; p < parts; ++p) workers.emplace_back([&fn, &cut, p] { fn(cut[p], cut[p + 1]); });
  fn(cut[0], cut[1]);
  for (std::thread& w : workers) w.join();
}

}  // namespace attiscope::detail
