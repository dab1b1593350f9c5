// batch.cpp: the checked entry points of batch.hpp: column checks, the choice of path, and
// the samples at lock, which are handed to the single-pose to_euler.
#include "attiscope/core/batch.hpp"

#include <algorithm>
#include <cfloat>
#include <cmath>
#include <cstdint>
#include <limits>
#include <string>

#include "batch_kernels.hpp"

namespace attiscope {
namespace {

using batch_detail::Isa;

/// Samples processed per kernel call in quaternions_to_euler, so that the lock scan reads
/// margins still in the first-level cache.
constexpr std::size_t kEulerBlock = 1024;

/// Samples whose SIMD lock margin is below this are redone by to_euler. It is twice the
/// lock threshold, so that the lock decision, and the angles at lock, are exactly those of
/// the single-pose path even when the SIMD margin differs from it in the last place.
constexpr double kRedoMarginRad = 2.0 * kLockMarginRad;

bool cpu_supports(BatchPath path) {
#if defined(__x86_64__) && defined(__GNUC__)
  if (path == BatchPath::Avx2) return __builtin_cpu_supports("avx2");
  if (path == BatchPath::Avx512) return __builtin_cpu_supports("avx512f");
#endif
  return path == BatchPath::Auto || path == BatchPath::Baseline;
}

Isa isa_of(BatchPath path) {
  if (path == BatchPath::Avx512) return Isa::Avx512;
  if (path == BatchPath::Avx2) return Isa::Avx2;
  return Isa::Baseline;
}

Expected<batch_detail::KernelTable> kernels_for(BatchPath path) {
  if (path == BatchPath::Auto) path = batch_path_auto();
  if (!batch_path_available(path)) {
    return Error{std::string("the batch path '") + batch_path_name(path) +
                 "' is not available on this CPU or build"};
  }
  return batch_detail::kernels(isa_of(path));
}

/// A column as a byte range, to check that outputs overlap nothing.
struct Range {
  std::uintptr_t begin = 0;
  std::uintptr_t end = 0;
  template <class T>
  explicit Range(Span<T> s)
      : begin(reinterpret_cast<std::uintptr_t>(s.data)), end(begin + s.size * sizeof(double)) {}
  bool overlaps(const Range& o) const { return begin < o.end && o.begin < end; }
};

/// Checks sizes, null columns and overlaps: every input and output column has n values and
/// no output overlaps an input or another output.
template <std::size_t NI, std::size_t NO>
Expected<std::size_t> check_columns(const std::array<Span<const double>, NI>& in,
                                    const std::array<Span<double>, NO>& out, const char* what) {
  const std::size_t n = in[0].size;
  for (const auto& c : in) {
    if (c.size != n) return Error{std::string(what) + ": the input columns differ in length"};
    if (c.size > 0 && c.data == nullptr) return Error{std::string(what) + ": an input column has no data"};
  }
  for (std::size_t a = 0; a < NO; ++a) {
    if (out[a].size != n) {
      return Error{std::string(what) + ": an output column holds " + std::to_string(out[a].size) +
                   " values for " + std::to_string(n) + " samples"};
    }
    if (n > 0 && out[a].data == nullptr) return Error{std::string(what) + ": an output column has no data"};
    for (const auto& c : in) {
      if (Range(out[a]).overlaps(Range(c))) {
        return Error{std::string(what) + ": an output column overlaps an input column"};
      }
    }
    for (std::size_t b = 0; b < a; ++b) {
      if (Range(out[a]).overlaps(Range(out[b]))) {
        return Error{std::string(what) + ": two output columns overlap"};
      }
    }
  }
  return n;
}

/// Parity of the axis permutation (i, j, k): +1 for XYZ, YZX, ZXY; -1 otherwise.
double parity(int i, int j, int k) {
  return static_cast<double>((i - j) * (j - k) * (k - i) / 2);
}

}  // namespace

bool batch_path_available(BatchPath path) {
  if (path == BatchPath::Auto || path == BatchPath::Baseline) return true;
  return batch_detail::isa_built(isa_of(path)) && cpu_supports(path);
}

BatchPath batch_path_auto() {
  if (batch_path_available(BatchPath::Avx512)) return BatchPath::Avx512;
  if (batch_path_available(BatchPath::Avx2)) return BatchPath::Avx2;
  return BatchPath::Baseline;
}

const char* batch_path_name(BatchPath path) {
  switch (path) {
    case BatchPath::Auto: return "auto";
    case BatchPath::Baseline: return "baseline";
    case BatchPath::Avx2: return "avx2";
    case BatchPath::Avx512: return "avx512";
  }
  return "?";
}

Expected<std::size_t> quaternions_to_euler(const QuaternionColumns& world_q_body, const EulerConvention& c,
                                           const EulerColumnsOut& out, BatchPath path) {
  const bool want_margin = !out.lock_margin.empty();
  Expected<std::size_t> checked =
      want_margin ? check_columns<4, 4>({world_q_body.w, world_q_body.x, world_q_body.y, world_q_body.z},
                                        {out.a1, out.a2, out.a3, out.lock_margin}, "quaternions to Euler")
                  : check_columns<4, 3>({world_q_body.w, world_q_body.x, world_q_body.y, world_q_body.z},
                                        {out.a1, out.a2, out.a3}, "quaternions to Euler");
  if (!checked) return checked;
  const Expected<batch_detail::KernelTable> table = kernels_for(path);
  if (!table) return table.error();
  const std::size_t n = checked.value();

  // The reduction of to_euler: intrinsic (a, b, c) about (i, j, k) is extrinsic (c, b, a)
  // about (k, j, i); a proper sequence takes k as the remaining axis.
  const bool intrinsic = c.kind == EulerKind::Intrinsic;
  const std::array<Axis, 3> ext = intrinsic ? std::array<Axis, 3>{c.axes[2], c.axes[1], c.axes[0]} : c.axes;
  const int i = static_cast<int>(ext[0]);
  const int j = static_cast<int>(ext[1]);
  const bool proper = ext[0] == ext[2];
  const int k = proper ? 3 - i - j : static_cast<int>(ext[2]);
  const double* vec[3] = {world_q_body.x.data, world_q_body.y.data, world_q_body.z.data};
  double* first = intrinsic ? out.a3.data : out.a1.data;  // receives t1
  double* third = intrinsic ? out.a1.data : out.a3.data;  // receives t3
  const auto kernel = proper ? table->quat_to_euler_proper : table->quat_to_euler_tait_bryan;

  std::array<double, kEulerBlock> margin_buffer;
  for (std::size_t start = 0; start < n; start += kEulerBlock) {
    const std::size_t len = std::min(kEulerBlock, n - start);
    double* margin = want_margin ? out.lock_margin.data + start : margin_buffer.data();
    batch_detail::QuatToEulerArgs args;
    args.n = len;
    args.w = world_q_body.w.data + start;
    args.qi = vec[i] + start;
    args.qj = vec[j] + start;
    args.qk = vec[k] + start;
    args.sign = parity(i, j, k);
    args.out1 = first + start;
    args.out2 = out.a2.data + start;
    args.out3 = third + start;
    args.margin = margin;
    args.redo_below = kRedoMarginRad;
    if (kernel(args) == 0) continue;  // no sample at or next to lock, none unusable
    for (std::size_t s = 0; s < len; ++s) {
      if (margin[s] >= kRedoMarginRad) continue;  // also catches NaN
      // At or next to lock, or not a usable quaternion: the single-pose path decides.
      const std::size_t at = start + s;
      const Eigen::Quaterniond q(world_q_body.w.data[at], world_q_body.x.data[at], world_q_body.y.data[at],
                                 world_q_body.z.data[at]);
      const double norm2 = q.squaredNorm();
      if (!(norm2 >= DBL_MIN && norm2 <= DBL_MAX)) {
        const double nan = std::numeric_limits<double>::quiet_NaN();
        out.a1.data[at] = nan;
        out.a2.data[at] = nan;
        out.a3.data[at] = nan;
        margin[s] = nan;
        continue;
      }
      const EulerAngles e = to_euler(Rotation(q), c);
      out.a1.data[at] = e.angles_rad(0);
      out.a2.data[at] = e.angles_rad(1);
      out.a3.data[at] = e.angles_rad(2);
      margin[s] = e.lock_margin_rad;
    }
  }
  return n;
}

Expected<std::size_t> euler_to_quaternions(const EulerConvention& c, const EulerColumns& angles,
                                           const QuaternionColumnsOut& out, BatchPath path) {
  Expected<std::size_t> checked = check_columns<3, 4>({angles.a1, angles.a2, angles.a3},
                                                      {out.w, out.x, out.y, out.z}, "Euler to quaternions");
  if (!checked) return checked;
  const Expected<batch_detail::KernelTable> table = kernels_for(path);
  if (!table) return table.error();

  // Extrinsic (a1, a2, a3) about (i, j, k) is R_k(a3) R_j(a2) R_i(a1): the intrinsic
  // product about (k, j, i) with the angles (a3, a2, a1).
  const bool intrinsic = c.kind == EulerKind::Intrinsic;
  const std::array<Axis, 3> seq = intrinsic ? c.axes : std::array<Axis, 3>{c.axes[2], c.axes[1], c.axes[0]};
  const int i = static_cast<int>(seq[0]);
  const int j = static_cast<int>(seq[1]);
  const bool proper = seq[0] == seq[2];
  const int k = proper ? 3 - i - j : static_cast<int>(seq[2]);
  double* vec[3] = {out.x.data, out.y.data, out.z.data};
  batch_detail::EulerToQuatArgs args;
  args.n = checked.value();
  args.a = intrinsic ? angles.a1.data : angles.a3.data;
  args.b = angles.a2.data;
  args.c = intrinsic ? angles.a3.data : angles.a1.data;
  args.sign = parity(i, j, k);
  args.outw = out.w.data;
  args.outi = vec[i];
  args.outj = vec[j];
  args.outk = vec[k];
  (proper ? table->euler_to_quat_proper : table->euler_to_quat_tait_bryan)(args);
  return checked;
}

Expected<std::size_t> matrices_to_quaternions(const MatrixColumns& world_R_body,
                                              const QuaternionColumnsOut& out, BatchPath path) {
  const auto& r = world_R_body.r;
  Expected<std::size_t> checked =
      check_columns<9, 4>({r[0][0], r[0][1], r[0][2], r[1][0], r[1][1], r[1][2], r[2][0], r[2][1], r[2][2]},
                          {out.w, out.x, out.y, out.z}, "matrices to quaternions");
  if (!checked) return checked;
  const Expected<batch_detail::KernelTable> table = kernels_for(path);
  if (!table) return table.error();
  batch_detail::MatrixQuatArgs args;
  args.n = checked.value();
  for (int e = 0; e < 9; ++e)
    args.r[e] = r[static_cast<std::size_t>(e / 3)][static_cast<std::size_t>(e % 3)].data;
  args.w = out.w.data;
  args.x = out.x.data;
  args.y = out.y.data;
  args.z = out.z.data;
  table->matrix_to_quat(args);
  return checked;
}

Expected<std::size_t> quaternions_to_matrices(const QuaternionColumns& world_q_body,
                                              const MatrixColumnsOut& out, BatchPath path) {
  const auto& r = out.r;
  Expected<std::size_t> checked =
      check_columns<4, 9>({world_q_body.w, world_q_body.x, world_q_body.y, world_q_body.z},
                          {r[0][0], r[0][1], r[0][2], r[1][0], r[1][1], r[1][2], r[2][0], r[2][1], r[2][2]},
                          "quaternions to matrices");
  if (!checked) return checked;
  const Expected<batch_detail::KernelTable> table = kernels_for(path);
  if (!table) return table.error();
  batch_detail::QuatMatrixArgs args;
  args.n = checked.value();
  args.w = world_q_body.w.data;
  args.x = world_q_body.x.data;
  args.y = world_q_body.y.data;
  args.z = world_q_body.z.data;
  for (int e = 0; e < 9; ++e)
    args.r[e] = r[static_cast<std::size_t>(e / 3)][static_cast<std::size_t>(e % 3)].data;
  table->quat_to_matrix(args);
  return checked;
}

}  // namespace attiscope
