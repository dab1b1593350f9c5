// batch_kernels.cpp: the loops of the batch conversions, built once per instruction set.
//
// This file alone is compiled with -O3 -fno-math-errno -fno-trapping-math -fopenmp-simd
// -ffp-contract=off -fno-builtin-sin -fno-builtin-cos (core/CMakeLists.txt). None of them
// changes a result: they let GCC call glibc's vector math library (libmvec) from a
// vectorised loop and turn the selects below into blends; -fno-builtin-sin/cos stop GCC
// from merging sin and cos of one angle into a scalar sincos call, which no loop can
// vectorise; -ffp-contract=off forbids fused multiply-adds so that the arithmetic is the
// same as in the single-pose functions. Every branch is written as a select between two
// computed values so that the loops if-convert. sin and cos are declared with GCC's simd
// attribute, as glibc's own header does only under -ffast-math. atan2 is not taken from
// libmvec: the quaternion -> Euler loops inline their own (atan2_poly below), which on
// AVX-512 ran about a quarter faster than three libmvec calls per sample, and on the SSE2
// baseline, where libmvec's 2-wide atan2 gains little, about half again as fast.
#include "batch_kernels.hpp"

#include <algorithm>
#include <cmath>

#if defined(__x86_64__) && defined(__GNUC__) && !defined(__clang__)
#define ATTISCOPE_BATCH_X86 1
extern "C" {
double sin(double) noexcept __attribute__((simd("notinbranch")));
double cos(double) noexcept __attribute__((simd("notinbranch")));
}
#define ATTISCOPE_INLINE inline __attribute__((always_inline))
#else
#define ATTISCOPE_BATCH_X86 0
#define ATTISCOPE_INLINE inline
#endif

namespace attiscope::batch_detail {
namespace {

constexpr double kPi = M_PI;
constexpr double kTwoPi = 2.0 * M_PI;
constexpr double kHalfPi = 0.5 * M_PI;

/// wrap_pi of euler.cpp for |t| <= 3 pi, where remainder(t, 2 pi) subtracts at most one
/// 2 pi: (-pi, pi], with -pi mapped to pi. Both subtractions are exact (Sterbenz).
ATTISCOPE_INLINE double wrap_one_turn(double t) {
  t = t - (t > kPi ? kTwoPi : 0.0);
  return t + (t <= -kPi ? kTwoPi : 0.0);
}

/// tan(pi/8): above it the argument of the polynomial is reduced through pi/4.
constexpr double kTanPiOver8 = 0.41421356237309503;
constexpr double kQuarterPi = 0.25 * M_PI;

/// atan(z) = z + z^3 P(z^2) for |z| <= tan(pi/8): P interpolates (atan(z) - z) / z^3 at the
/// 11 Chebyshev nodes of s = z^2 in [0, tan^2(pi/8)] (computed with 50-digit arithmetic);
/// the relative error of the whole atan is about 1.0 x 2^-53 over that range.
constexpr double kAtanP[11] = {-0.3333333333333333,  0.1999999999999552,   -0.14285714284666542,
                               0.11111111015256361,  -0.09090904578123903, 0.07692183190826087,
                               -0.06664511447381948, 0.0585814891280221,   -0.0508544973794026,
                               0.03923165829558719,  -0.01917688711906226};

/// atan2 in plain arithmetic, so that it inlines into a vectorised loop (no call, nothing
/// spilled around one) on every instruction set. The range reduction of Cody & Waite
/// ("Software Manual for the Elementary Functions", 1980) and Cephes' atan: fold (y, x) into
/// the first octant, t = min / max, and past tan(pi/8) take atan(t) = pi/4 + atan((t - 1) /
/// (t + 1)), computed as one division (num - den) / (num + den). Quadrant and sign as
/// std::atan2, including signed zeros. Within 3e-16 rad of std::atan2 (tests/core).
ATTISCOPE_INLINE double atan2_poly(double y, double x) {
  const double ax = std::fabs(x);
  const double ay = std::fabs(y);
  const bool steep = ay > ax;
  const double num = steep ? ax : ay;  // num <= den
  const double den = steep ? ay : ax;
  const bool reduce = num > kTanPiOver8 * den;
  const double top = reduce ? num - den : num;
  const double bottom = reduce ? num + den : den;
  const double z = bottom > 0.0 ? top / bottom : 0.0;  // atan2(0, 0) = 0 as std::atan2
  const double s = z * z;
  // Horner, written out: a loop here would stop the outer loop from vectorising.
  double poly = kAtanP[10] * s + kAtanP[9];
  poly = poly * s + kAtanP[8];
  poly = poly * s + kAtanP[7];
  poly = poly * s + kAtanP[6];
  poly = poly * s + kAtanP[5];
  poly = poly * s + kAtanP[4];
  poly = poly * s + kAtanP[3];
  poly = poly * s + kAtanP[2];
  poly = poly * s + kAtanP[1];
  poly = poly * s + kAtanP[0];
  double r = z + z * (s * poly);
  r = reduce ? r + kQuarterPi : r;                // atan(num / den), [0, pi/4]
  r = steep ? kHalfPi - r : r;                    // atan(ay / ax), [0, pi/2]
  r = std::copysign(1.0, x) < 0.0 ? kPi - r : r;  // [0, pi]; x = -0 counts as negative
  return std::copysign(r, y);
}

/// Samples per stage of the quaternion -> Euler loop. The atan2 operands of one stage
/// (six arrays, 12 KB) stay in the first-level cache from one stage to the next.
constexpr std::size_t kStage = 256;

/// Norms squared inside this range go through the SIMD formula; the products n1 n2 below
/// neither overflow nor lose digits to underflow there (they only underflow within 1e-50 rad
/// of lock, where batch.cpp redoes the sample). Outside it the sample is flagged (margin -1)
/// and batch.cpp hands it to to_euler, which normalises first.
constexpr double kSafeNorm2Low = 1e-100;
constexpr double kSafeNorm2High = 1e100;

// Quaternion -> Euler: Bernardes & Viollet 2022, as in to_euler (euler.cpp).
// Three loops per stage: (1) the operands of the three atan2, (2) one atan2 loop over all
// of them (3 x 256 values, the vector units busy with one short body), (3) the angles, the
// ranges and the lock margin.
template <bool Proper>
ATTISCOPE_INLINE std::size_t quat_to_euler_body(const QuatToEulerArgs& p) {
  alignas(64) double ys[3 * kStage];
  alignas(64) double xs[3 * kStage];
  alignas(64) double angle[3 * kStage];
  const double sign = p.sign;
  const double redo_below = p.redo_below;
  std::size_t redo = 0;
  for (std::size_t start = 0; start < p.n; start += kStage) {
    const std::size_t len = std::min(kStage, p.n - start);
    const double* w = p.w + start;
    const double* vi = p.qi + start;
    const double* vj = p.qj + start;
    const double* vk = p.qk + start;
    double* out1 = p.out1 + start;
    double* out2 = p.out2 + start;
    double* out3 = p.out3 + start;
    double* margin = p.margin + start;
    // ys/xs hold atan2(b, a) for s in [0, len), atan2(d, c) in [len, 2 len) and the middle
    // angle in [2 len, 3 len): one contiguous run for stage (2).
    double* y_sum = ys;
    double* x_sum = xs;
    double* y_diff = ys + len;
    double* x_diff = xs + len;
    double* y_mid = ys + 2 * len;
    double* x_mid = xs + 2 * len;
#pragma omp simd
    for (std::size_t s = 0; s < len; ++s) {
      const double qw = w[s];
      const double qi = vi[s];
      const double qj = vj[s];
      const double qk = vk[s] * sign;
      // Proper: (a, b, c, d) = (w, qi, qj, qk). Tait-Bryan: the quaternion turned by 45
      // degrees about the j axis, which makes the sequence proper.
      const double a = Proper ? qw : qw - qj;
      const double b = Proper ? qi : qi + qk;
      const double c = Proper ? qj : qj + qw;
      const double d = Proper ? qk : qk - qi;
      y_sum[s] = b;
      x_sum[s] = a;
      y_diff[s] = d;
      x_diff[s] = c;
      const double n1 = a * a + b * b;
      const double n2 = c * c + d * d;
      const double root = std::sqrt(n1 * n2);  // |ab| |cd|
      if constexpr (Proper) {
        // t2 = 2 atan2(|cd|, |ab|) as in to_euler, with one square root:
        // |cd| / |ab| = root / n1 = n2 / root, the larger of n1, n2 as divisor.
        const bool n1_larger = n1 >= n2;
        y_mid[s] = n1_larger ? root : n2;
        x_mid[s] = n1_larger ? n1 : root;
      } else {
        // The exact form of to_euler: t2 = atan2(2 (w q_j - sign q_i q_k), |ab| |cd|), no
        // subtraction of pi/2 (full relative precision for small middle angles). Both
        // operands scale with the squared norm, so a non-unit quaternion gives the same t2.
        y_mid[s] = 2.0 * (qw * qj - qi * qk);
        x_mid[s] = root;
      }
      // Zero, NaN, Inf or a norm outside the safe range: flagged for batch.cpp.
      const double norm2 = qw * qw + qi * qi + qj * qj + qk * qk;
      const bool usable = norm2 >= kSafeNorm2Low && norm2 <= kSafeNorm2High;
      margin[s] = usable ? 0.0 : -1.0;
    }
    const std::size_t len3 = 3 * len;
#pragma omp simd
    for (std::size_t s = 0; s < len3; ++s) angle[s] = atan2_poly(ys[s], xs[s]);
    const double* half_sum = angle;
    const double* half_diff = angle + len;
    const double* mid = angle + 2 * len;
#pragma omp simd reduction(+ : redo)
    for (std::size_t s = 0; s < len; ++s) {
      const double t1 = half_sum[s] - half_diff[s];
      double t3 = half_sum[s] + half_diff[s];
      double t2;
      double m;
      if constexpr (Proper) {
        t2 = 2.0 * mid[s];                    // [0, pi]
        m = (kPi - t2 < t2) ? kPi - t2 : t2;  // std::min(t2, pi - t2), as lock_margin
      } else {
        t3 *= sign;
        t2 = mid[s];  // [-pi/2, pi/2]
        m = kHalfPi - std::fabs(t2);
      }
      out1[s] = wrap_one_turn(t1);
      out2[s] = t2;
      out3[s] = wrap_one_turn(t3);
      const double flagged = margin[s] < 0.0 ? -1.0 : m;
      margin[s] = flagged;
      redo += flagged >= redo_below ? 0u : 1u;  // NaN counts too
    }
  }
  return redo;
}

// Euler -> quaternion: the product of three half-angle quaternions (as from_euler).
// In the right-handed frame (e_i, e_j, e_k') with e_k' = sign e_k:
//   Tait-Bryan  q = (c1 + s1 i)(c2 + s2 j)(c3 + s3' k'), s3' = sign s3;
//   proper      q = (c1 + s1 i)(c2 + s2 j)(c3 + s3 i).
// With A = c1 c2, B = s1 c2, C = c1 s2, D = s1 s2 (the first two factors), expanding the
// third by i j = k', j k' = i, k' i = j gives the components below.
template <bool Proper>
ATTISCOPE_INLINE void euler_to_quat_body(const EulerToQuatArgs& p) {
  const std::size_t n = p.n;
  const double* va = p.a;
  const double* vb = p.b;
  const double* vc = p.c;
  const double sign = p.sign;
  double* ow = p.outw;
  double* oi = p.outi;
  double* oj = p.outj;
  double* ok = p.outk;
#pragma omp simd
  for (std::size_t s = 0; s < n; ++s) {
    const double h1 = 0.5 * va[s];
    const double h2 = 0.5 * vb[s];
    const double h3 = 0.5 * vc[s];
    const double c1 = std::cos(h1);
    const double s1 = std::sin(h1);
    const double c2 = std::cos(h2);
    const double s2 = std::sin(h2);
    const double c3 = std::cos(h3);
    const double s3 = Proper ? std::sin(h3) : sign * std::sin(h3);
    const double ca = c1 * c2;
    const double cb = s1 * c2;
    const double cc = c1 * s2;
    const double cd = s1 * s2;
    double qw, qi, qj, qk;
    if constexpr (Proper) {
      qw = ca * c3 - cb * s3;
      qi = ca * s3 + cb * c3;
      qj = cc * c3 + cd * s3;
      qk = cd * c3 - cc * s3;
    } else {
      qw = ca * c3 - cd * s3;
      qi = cb * c3 + cc * s3;
      qj = cc * c3 - cb * s3;
      qk = ca * s3 + cd * c3;
    }
    ow[s] = qw;
    oi[s] = qi;
    oj[s] = qj;
    ok[s] = sign * qk;
  }
}

// Matrix -> quaternion: Shepperd 1978, as quaternion_from_rotation_matrix (matrix.cpp):
// the pivot is the first largest of tr R, R00, R11, R22, so the divisor is >= 1/2.
ATTISCOPE_INLINE void matrix_to_quat_body(const MatrixQuatArgs& p) {
  const std::size_t n = p.n;
  const double* m00 = p.r[0];
  const double* m01 = p.r[1];
  const double* m02 = p.r[2];
  const double* m10 = p.r[3];
  const double* m11 = p.r[4];
  const double* m12 = p.r[5];
  const double* m20 = p.r[6];
  const double* m21 = p.r[7];
  const double* m22 = p.r[8];
  double* ow = p.w;
  double* ox = p.x;
  double* oy = p.y;
  double* oz = p.z;
#pragma omp simd
  for (std::size_t s = 0; s < n; ++s) {
    const double r00 = m00[s], r01 = m01[s], r02 = m02[s];
    const double r10 = m10[s], r11 = m11[s], r12 = m12[s];
    const double r20 = m20[s], r21 = m21[s], r22 = m22[s];
    const double tr = r00 + r11 + r22;
    // The pivot as a double (0 = w, 1 = x, 2 = y, 3 = z), so that every mask below has
    // the width of the data and the loop vectorises.
    const double best1 = r00 > tr ? r00 : tr;
    const double best2 = r11 > best1 ? r11 : best1;
    const double pivot = r22 > best2 ? 3.0 : (r11 > best1 ? 2.0 : (r00 > tr ? 1.0 : 0.0));
    const bool p0 = pivot == 0.0;
    const bool p1 = pivot == 1.0;
    const bool p2 = pivot == 2.0;
    const bool p3 = pivot == 3.0;
    const double pivot_diag = p3 ? r22 : (p2 ? r11 : r00);
    const double four_q2 = p0 ? 1.0 + tr : 1.0 + 2.0 * pivot_diag - tr;
    const double d0 = r21 - r12;
    const double d1 = r02 - r20;
    const double d2 = r10 - r01;
    const double u01 = r01 + r10;
    const double u02 = r02 + r20;
    const double u12 = r12 + r21;
    const double nw = p1 ? d0 : (p2 ? d1 : d2);
    const double nx = p0 ? d0 : (p2 ? u01 : u02);
    const double ny = p0 ? d1 : (p1 ? u01 : u12);
    const double nz = p0 ? d2 : (p1 ? u02 : u12);
    // Shepperd's quaternion times 4 q_p: the pivot component 4 q_p^2, the others 4 q_p q_i
    // (the sums and differences above). Normalising that vector gives the quaternion of
    // quaternion_from_rotation_matrix, which divides by 4 q_p and then normalises, to an
    // ulp: one square root and one division instead of two of each.
    double qw = p0 ? four_q2 : nw;
    double qx = p1 ? four_q2 : nx;
    double qy = p2 ? four_q2 : ny;
    double qz = p3 ? four_q2 : nz;
    const double inv_norm = 1.0 / std::sqrt(qx * qx + qy * qy + qz * qz + qw * qw);
    qw *= inv_norm;
    qx *= inv_norm;
    qy *= inv_norm;
    qz *= inv_norm;
    // canonical_sign (rotation.cpp): w > 0, else the first non-zero of x, y, z positive.
    const double sx =
        qx > 0.0 ? 1.0 : (qx < 0.0 ? -1.0 : (qy > 0.0 ? 1.0 : (qy < 0.0 ? -1.0 : (qz < 0.0 ? -1.0 : 1.0))));
    const double sg = qw > 0.0 ? 1.0 : (qw < 0.0 ? -1.0 : sx);
    ow[s] = sg * qw;
    ox[s] = sg * qx;
    oy[s] = sg * qy;
    oz[s] = sg * qz;
  }
}

// Quaternion -> matrix: the expansion Eigen's Quaternion::toRotationMatrix uses.
ATTISCOPE_INLINE void quat_to_matrix_body(const QuatMatrixArgs& p) {
  const std::size_t n = p.n;
  const double* vw = p.w;
  const double* vx = p.x;
  const double* vy = p.y;
  const double* vz = p.z;
  double* m00 = p.r[0];
  double* m01 = p.r[1];
  double* m02 = p.r[2];
  double* m10 = p.r[3];
  double* m11 = p.r[4];
  double* m12 = p.r[5];
  double* m20 = p.r[6];
  double* m21 = p.r[7];
  double* m22 = p.r[8];
#pragma omp simd
  for (std::size_t s = 0; s < n; ++s) {
    const double w = vw[s], x = vx[s], y = vy[s], z = vz[s];
    const double tx = 2.0 * x, ty = 2.0 * y, tz = 2.0 * z;
    const double twx = tx * w, twy = ty * w, twz = tz * w;
    const double txx = tx * x, txy = ty * x, txz = tz * x;
    const double tyy = ty * y, tyz = tz * y, tzz = tz * z;
    m00[s] = 1.0 - (tyy + tzz);
    m01[s] = txy - twz;
    m02[s] = txz + twy;
    m10[s] = txy + twz;
    m11[s] = 1.0 - (txx + tzz);
    m12[s] = tyz - twx;
    m20[s] = txz - twy;
    m21[s] = tyz + twx;
    m22[s] = 1.0 - (txx + tyy);
  }
}

}  // namespace

// One set of entry points per instruction set. The bodies are inlined into each, so GCC
// vectorises them for that set and calls the matching libmvec variant.
#define ATTISCOPE_DEFINE_KERNELS(NAME, TARGET)                                               \
  namespace NAME {                                                                           \
  TARGET std::size_t q2e_tb(const QuatToEulerArgs& p) {                                      \
    return quat_to_euler_body<false>(p);                                                     \
  }                                                                                          \
  TARGET std::size_t q2e_proper(const QuatToEulerArgs& p) {                                  \
    return quat_to_euler_body<true>(p);                                                      \
  }                                                                                          \
  TARGET void e2q_tb(const EulerToQuatArgs& p) {                                             \
    euler_to_quat_body<false>(p);                                                            \
  }                                                                                          \
  TARGET void e2q_proper(const EulerToQuatArgs& p) {                                         \
    euler_to_quat_body<true>(p);                                                             \
  }                                                                                          \
  TARGET void m2q(const MatrixQuatArgs& p) {                                                 \
    matrix_to_quat_body(p);                                                                  \
  }                                                                                          \
  TARGET void q2m(const QuatMatrixArgs& p) {                                                 \
    quat_to_matrix_body(p);                                                                  \
  }                                                                                          \
  TARGET void atan2s(std::size_t n, const double* y, const double* x, double* out) {         \
    _Pragma("omp simd") for (std::size_t s = 0; s < n; ++s) out[s] = atan2_poly(y[s], x[s]); \
  }                                                                                          \
  KernelTable table() {                                                                      \
    return KernelTable{&q2e_tb, &q2e_proper, &e2q_tb, &e2q_proper, &m2q, &q2m, &atan2s};     \
  }                                                                                          \
  }

ATTISCOPE_DEFINE_KERNELS(baseline, )
#if ATTISCOPE_BATCH_X86
ATTISCOPE_DEFINE_KERNELS(avx2, __attribute__((target("avx2"))))
ATTISCOPE_DEFINE_KERNELS(avx512, __attribute__((target("avx512f"))))
#endif

bool isa_built(Isa isa) {
  return isa == Isa::Baseline || ATTISCOPE_BATCH_X86;
}

KernelTable kernels(Isa isa) {
#if ATTISCOPE_BATCH_X86
  if (isa == Isa::Avx512) return avx512::table();
  if (isa == Isa::Avx2) return avx2::table();
#endif
  (void)isa;
  return baseline::table();
}

}  // namespace attiscope::batch_detail
