// batch_bench.cpp: the batch conversions of batch.hpp over 1e6 random rotations, per
// convention and per SIMD path, beside the single-pose functions they must agree with.
// items_per_second is conversions per second on one thread.
//
//   build/bench/batch_bench                          all of them
//   build/bench/batch_bench --benchmark_filter=euler  a subset (a regular expression)
#include <benchmark/benchmark.h>

#include <cstdint>
#include <random>
#include <string>
#include <vector>

#include "attiscope/core/batch.hpp"
#include "attiscope/core/matrix.hpp"

namespace attiscope {
namespace {

constexpr std::size_t kCount = 1000000;
constexpr std::uint32_t kBenchSeed = 20261201;

/// 1e6 uniformly distributed (Haar) rotations: normalised 4D Gaussian quaternions, with
/// their Euler angles (intrinsic ZYX) and matrices, in columns.
struct Data {
  std::vector<double> w, x, y, z;
  std::vector<double> a1, a2, a3;
  std::vector<std::vector<double>> m;
  Data() : w(kCount), x(kCount), y(kCount), z(kCount), a1(kCount), a2(kCount), a3(kCount), m(9) {
    std::mt19937 rng(kBenchSeed);
    std::normal_distribution<double> n(0.0, 1.0);
    for (auto& col : m) col.resize(kCount);
    const EulerConvention zyx;
    for (std::size_t s = 0; s < kCount; ++s) {
      const Rotation r(Eigen::Quaterniond(n(rng), n(rng), n(rng), n(rng)));
      const Eigen::Quaterniond& q = r.stored_quaternion();
      w[s] = q.w();
      x[s] = q.x();
      y[s] = q.y();
      z[s] = q.z();
      const Eigen::Vector3d e = to_euler(r, zyx).angles_rad;
      a1[s] = e(0);
      a2[s] = e(1);
      a3[s] = e(2);
      const Eigen::Matrix3d mat = r.matrix();
      for (int k = 0; k < 9; ++k) m[static_cast<std::size_t>(k)][s] = mat(k / 3, k % 3);
    }
  }
  QuaternionColumns quaternions() const { return {w, x, y, z}; }
  MatrixColumns matrices() const {
    MatrixColumns c;
    for (std::size_t k = 0; k < 9; ++k) c.r[k / 3][k % 3] = Span<const double>(m[k].data(), kCount);
    return c;
  }
};

const Data& data() {
  // Built once, then only read: the benchmarks share one set of inputs.
  static const Data d;
  return d;
}

void report(benchmark::State& state, std::size_t per_iteration) {
  state.SetItemsProcessed(static_cast<std::int64_t>(state.iterations()) *
                          static_cast<std::int64_t>(per_iteration));
}

void quat_to_euler(benchmark::State& state, EulerConvention c, BatchPath path, bool margin) {
  const Data& d = data();
  std::vector<double> a1(kCount), a2(kCount), a3(kCount), lm(margin ? kCount : 0);
  for (auto _ : state) {
    const Expected<std::size_t> n = quaternions_to_euler(d.quaternions(), c, {a1, a2, a3, lm}, path);
    if (!n) state.SkipWithError(n.error().message.c_str());
    benchmark::DoNotOptimize(a1.data());
    benchmark::ClobberMemory();
  }
  report(state, kCount);
}

void euler_to_quat(benchmark::State& state, EulerConvention c, BatchPath path) {
  const Data& d = data();
  std::vector<double> w(kCount), x(kCount), y(kCount), z(kCount);
  for (auto _ : state) {
    const Expected<std::size_t> n = euler_to_quaternions(c, {d.a1, d.a2, d.a3}, {w, x, y, z}, path);
    if (!n) state.SkipWithError(n.error().message.c_str());
    benchmark::DoNotOptimize(w.data());
    benchmark::ClobberMemory();
  }
  report(state, kCount);
}

void matrix_to_quat(benchmark::State& state, BatchPath path) {
  const Data& d = data();
  std::vector<double> w(kCount), x(kCount), y(kCount), z(kCount);
  const MatrixColumns in = d.matrices();
  for (auto _ : state) {
    const Expected<std::size_t> n = matrices_to_quaternions(in, {w, x, y, z}, path);
    if (!n) state.SkipWithError(n.error().message.c_str());
    benchmark::DoNotOptimize(w.data());
    benchmark::ClobberMemory();
  }
  report(state, kCount);
}

void quat_to_matrix(benchmark::State& state, BatchPath path) {
  const Data& d = data();
  std::vector<std::vector<double>> m(9, std::vector<double>(kCount));
  MatrixColumnsOut out;
  for (std::size_t k = 0; k < 9; ++k) out.r[k / 3][k % 3] = m[k];
  for (auto _ : state) {
    const Expected<std::size_t> n = quaternions_to_matrices(d.quaternions(), out, path);
    if (!n) state.SkipWithError(n.error().message.c_str());
    benchmark::DoNotOptimize(m[0].data());
    benchmark::ClobberMemory();
  }
  report(state, kCount);
}

// The single-pose functions over the same data, for the ratio the SIMD paths buy.
void scalar_quat_to_euler(benchmark::State& state, EulerConvention c) {
  const Data& d = data();
  std::vector<double> a1(kCount), a2(kCount), a3(kCount);
  for (auto _ : state) {
    for (std::size_t s = 0; s < kCount; ++s) {
      const EulerAngles e = to_euler(Rotation(Eigen::Quaterniond(d.w[s], d.x[s], d.y[s], d.z[s])), c);
      a1[s] = e.angles_rad(0);
      a2[s] = e.angles_rad(1);
      a3[s] = e.angles_rad(2);
    }
    benchmark::DoNotOptimize(a1.data());
    benchmark::ClobberMemory();
  }
  report(state, kCount);
}

void scalar_euler_to_quat(benchmark::State& state, EulerConvention c) {
  const Data& d = data();
  std::vector<double> w(kCount);
  for (auto _ : state) {
    for (std::size_t s = 0; s < kCount; ++s) {
      w[s] = from_euler(c, Eigen::Vector3d(d.a1[s], d.a2[s], d.a3[s])).stored_quaternion().w();
    }
    benchmark::DoNotOptimize(w.data());
    benchmark::ClobberMemory();
  }
  report(state, kCount);
}

void scalar_matrix_to_quat(benchmark::State& state) {
  const Data& d = data();
  std::vector<double> w(kCount);
  for (auto _ : state) {
    for (std::size_t s = 0; s < kCount; ++s) {
      Eigen::Matrix3d r;
      for (int k = 0; k < 9; ++k) r(k / 3, k % 3) = d.m[static_cast<std::size_t>(k)][s];
      w[s] = quaternion_from_rotation_matrix(r).w();
    }
    benchmark::DoNotOptimize(w.data());
    benchmark::ClobberMemory();
  }
  report(state, kCount);
}

std::string kind_tag(const EulerConvention& c) {
  return c.kind == EulerKind::Intrinsic ? "intrinsic" : "extrinsic";
}

void register_all() {
  const EulerConvention zyx;
  // Names: work/detail/path. compare_scipy.py reads them.
  for (const EulerConvention& c : all_euler_conventions()) {
    benchmark::RegisterBenchmark(("quat_to_euler/" + kind_tag(c) + "_" + c.sequence() + "/auto").c_str(),
                                 quat_to_euler, c, BatchPath::Auto, false);
  }
  benchmark::RegisterBenchmark("quat_to_euler/intrinsic_ZYX_with_margin/auto", quat_to_euler, zyx,
                               BatchPath::Auto, true);
  for (BatchPath p : {BatchPath::Baseline, BatchPath::Avx2, BatchPath::Avx512}) {
    if (!batch_path_available(p)) continue;
    const std::string tag = batch_path_name(p);
    benchmark::RegisterBenchmark(("quat_to_euler/intrinsic_ZYX/" + tag).c_str(), quat_to_euler, zyx, p,
                                 false);
    benchmark::RegisterBenchmark(("euler_to_quat/intrinsic_ZYX/" + tag).c_str(), euler_to_quat, zyx, p);
    benchmark::RegisterBenchmark(("matrix_to_quat/shepperd/" + tag).c_str(), matrix_to_quat, p);
    benchmark::RegisterBenchmark(("quat_to_matrix/eigen_expansion/" + tag).c_str(), quat_to_matrix, p);
  }
  const EulerConvention zxz = parse_euler_sequence("ZXZ", EulerKind::Extrinsic).value();
  benchmark::RegisterBenchmark("euler_to_quat/intrinsic_ZYX/auto", euler_to_quat, zyx, BatchPath::Auto);
  benchmark::RegisterBenchmark("euler_to_quat/extrinsic_ZXZ/auto", euler_to_quat, zxz, BatchPath::Auto);
  benchmark::RegisterBenchmark("matrix_to_quat/shepperd/auto", matrix_to_quat, BatchPath::Auto);
  benchmark::RegisterBenchmark("quat_to_matrix/eigen_expansion/auto", quat_to_matrix, BatchPath::Auto);
  benchmark::RegisterBenchmark("quat_to_euler/intrinsic_ZYX/single_pose", scalar_quat_to_euler, zyx);
  benchmark::RegisterBenchmark("euler_to_quat/intrinsic_ZYX/single_pose", scalar_euler_to_quat, zyx);
  benchmark::RegisterBenchmark("matrix_to_quat/shepperd/single_pose", scalar_matrix_to_quat);
}

}  // namespace
}  // namespace attiscope

int main(int argc, char** argv) {
  attiscope::register_all();
  benchmark::Initialize(&argc, argv);
  if (benchmark::ReportUnrecognizedArguments(argc, argv)) return 1;
  benchmark::AddCustomContext("attiscope_batch_path_auto",
                              attiscope::batch_path_name(attiscope::batch_path_auto()));
  benchmark::RunSpecifiedBenchmarks();
  benchmark::Shutdown();
  return 0;
}
