// batch.hpp: whole-track conversions over structure-of-arrays columns (one array per
// quaternion component, angle or matrix entry), for the track tools and the benchmarks.
//
// The single-pose functions (to_euler, from_euler, quaternion_from_rotation_matrix,
// Rotation::matrix) stay the reference: each batch kernel uses the same formula, the same
// ranges and the same lock rule, and the tests compare every path against them. On x86-64
// the kernels run a SIMD path chosen at run time (SSE2 baseline, AVX2, AVX-512) that calls
// glibc's vector math library; a SIMD result may differ from the single-pose one by a few
// units in the last place (the tests hold it to 1e-14 rad). The build never assumes the
// CPU: the same binary runs everywhere and picks its path when called.
//
// Conventions are those of rotation.hpp and euler.hpp: quaternions are Hamilton, scalar
// first, world_R_body; Euler angles are in radians, in application order.
#pragma once

#include <array>
#include <cstddef>
#include <utility>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/expected.hpp"

namespace attiscope {

/// A run of `size` values at `data` (C++17 has no std::span). Build it from a pointer and a
/// count, or from any container with data() and size() (std::vector).
template <class T>
struct Span {
  T* data = nullptr;
  std::size_t size = 0;

  Span() = default;
  Span(T* data_, std::size_t size_) : data(data_), size(size_) {}
  template <class Container, class = decltype(std::declval<Container&>().data())>
  Span(Container& c) : data(c.data()), size(c.size()) {}  // NOLINT: implicit on purpose

  bool empty() const { return size == 0; }
};

/// Quaternion columns to read: sample n is (w[n], x[n], y[n], z[n]).
struct QuaternionColumns {
  Span<const double> w, x, y, z;
};
/// Quaternion columns to write.
struct QuaternionColumnsOut {
  Span<double> w, x, y, z;
};

/// Euler angle columns to read (radians, application order).
struct EulerColumns {
  Span<const double> a1, a2, a3;
};
/// Euler angle columns to write (radians, application order). `lock_margin` is optional:
/// leave it empty when it is not wanted. A sample is at lock when its margin is below
/// kLockMarginRad (then a3 is 0, as to_euler does).
struct EulerColumnsOut {
  Span<double> a1, a2, a3;
  Span<double> lock_margin;
};

/// Rotation matrix columns to read: r[row][col][n] is entry (row, col) of matrix n.
struct MatrixColumns {
  std::array<std::array<Span<const double>, 3>, 3> r;
};
/// Rotation matrix columns to write.
struct MatrixColumnsOut {
  std::array<std::array<Span<double>, 3>, 3> r;
};

/// Which code path a batch call runs.
enum class BatchPath {
  Auto,      ///< the widest path this CPU can run
  Baseline,  ///< the build's own instruction set (SSE2 on x86-64); the only path elsewhere
  Avx2,      ///< x86-64 with AVX2
  Avx512,    ///< x86-64 with AVX-512F
};

/// Whether this CPU (and this build) can run a path. Auto and Baseline always can.
bool batch_path_available(BatchPath path);
/// The path Auto resolves to on this CPU.
BatchPath batch_path_auto();
/// "auto", "baseline", "avx2", "avx512".
const char* batch_path_name(BatchPath path);

/// Euler angles of every quaternion in a convention: for each sample the result of
/// to_euler(Rotation(q), c) (same formula, ranges and lock rule), up to a few ulp.
/// The quaternions need not be unit (the formula is scale free) and may have either sign.
/// A quaternion with a NaN or infinite component or a squared norm outside the normal
/// double range (zero, for one) gives NaN angles and a NaN margin.
/// Error when a column's size differs from the others, an output overlaps an input, or the
/// path is not available; nothing is written then. The value is the number of samples.
Expected<std::size_t> quaternions_to_euler(const QuaternionColumns& world_q_body, const EulerConvention& c,
                                           const EulerColumnsOut& out, BatchPath path = BatchPath::Auto);

/// Quaternions of Euler angles in a convention: for each sample from_euler(c, angles) as a
/// product of half-angle quaternions (the same sign as from_euler; not canonicalised).
Expected<std::size_t> euler_to_quaternions(const EulerConvention& c, const EulerColumns& angles,
                                           const QuaternionColumnsOut& out, BatchPath path = BatchPath::Auto);

/// Unit quaternions of exact rotation matrices by Shepperd's method, with the pivot, the
/// normalisation and the canonical sign of quaternion_from_rotation_matrix. The matrices
/// must already be rotations (use from_matrix to check and repair one matrix from a person).
Expected<std::size_t> matrices_to_quaternions(const MatrixColumns& world_R_body,
                                              const QuaternionColumnsOut& out,
                                              BatchPath path = BatchPath::Auto);

/// Rotation matrices of unit quaternions: the entries of Rotation(q).matrix().
Expected<std::size_t> quaternions_to_matrices(const QuaternionColumns& world_q_body,
                                              const MatrixColumnsOut& out, BatchPath path = BatchPath::Auto);

}  // namespace attiscope
