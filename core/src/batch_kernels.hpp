// batch_kernels.hpp: the SIMD loops behind batch.hpp, one table of them per instruction
// set. Internal to core: batch.cpp checks the columns, picks the table and repairs the
// samples at lock; batch_kernels.cpp (compiled with its own flags) holds the loops.
#pragma once

#include <cstddef>

namespace attiscope::batch_detail {

/// Quaternion -> Euler for one convention, reduced to the extrinsic form of Bernardes &
/// Viollet 2022 (see to_euler): qi, qj, qk are the columns of the extrinsic axes i, j, k
/// (k = the third axis for proper sequences), sign the parity of (i, j, k); out1 and out3
/// receive t1 and t3 (swapped by the caller for intrinsic conventions). margin gets the
/// lock margin, or -1 for a quaternion that is not finite or whose squared norm is outside
/// the range the SIMD formula handles (1e-100 to 1e100). The kernel returns how many
/// margins are below redo_below (the samples the caller must redo).
struct QuatToEulerArgs {
  std::size_t n = 0;
  const double* w = nullptr;
  const double* qi = nullptr;
  const double* qj = nullptr;
  const double* qk = nullptr;
  double sign = 1.0;
  double* out1 = nullptr;
  double* out2 = nullptr;
  double* out3 = nullptr;
  double* margin = nullptr;
  double redo_below = 0.0;
};

/// Euler -> quaternion as the intrinsic product q = q_i(A) q_j(B) q_m(C) (m = k for
/// Tait-Bryan, m = i for proper), computed in the right-handed frame (e_i, e_j, sign e_k):
/// outi, outj, outk receive the components along e_i, e_j, e_k.
struct EulerToQuatArgs {
  std::size_t n = 0;
  const double* a = nullptr;
  const double* b = nullptr;
  const double* c = nullptr;
  double sign = 1.0;
  double* outw = nullptr;
  double* outi = nullptr;
  double* outj = nullptr;
  double* outk = nullptr;
};

/// Matrix <-> quaternion; r[3 * row + col] is the column of entry (row, col).
struct MatrixQuatArgs {
  std::size_t n = 0;
  const double* r[9] = {};
  double* w = nullptr;
  double* x = nullptr;
  double* y = nullptr;
  double* z = nullptr;
};
struct QuatMatrixArgs {
  std::size_t n = 0;
  const double* w = nullptr;
  const double* x = nullptr;
  const double* y = nullptr;
  const double* z = nullptr;
  double* r[9] = {};
};

struct KernelTable {
  std::size_t (*quat_to_euler_tait_bryan)(const QuatToEulerArgs&);
  std::size_t (*quat_to_euler_proper)(const QuatToEulerArgs&);
  void (*euler_to_quat_tait_bryan)(const EulerToQuatArgs&);
  void (*euler_to_quat_proper)(const EulerToQuatArgs&);
  void (*matrix_to_quat)(const MatrixQuatArgs&);
  void (*quat_to_matrix)(const QuatMatrixArgs&);
  /// The atan2 of the quaternion -> Euler loops over columns, for the tests.
  void (*atan2_columns)(std::size_t n, const double* y, const double* x, double* out);
};

enum class Isa { Baseline, Avx2, Avx512 };

/// Whether the loops for an instruction set were built into this binary.
bool isa_built(Isa isa);
/// The loops for an instruction set (Baseline when that set was not built).
KernelTable kernels(Isa isa);

}  // namespace attiscope::batch_detail
