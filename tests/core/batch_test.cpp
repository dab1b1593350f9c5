// batch_test.cpp: the batch kernels (batch.hpp) on every SIMD path this CPU runs, against
// the single-pose functions (to_euler, from_euler, quaternion_from_rotation_matrix,
// Rotation::matrix), on random rotations and on the edge corpus, in all 24 conventions.
#include "attiscope/core/batch.hpp"

#include <cmath>
#include <limits>
#include <string>
#include <vector>

#include "../../core/src/batch_kernels.hpp"
#include "attiscope/core/matrix.hpp"
#include "support/check.hpp"

namespace attiscope {
namespace {

using test::kBatchAngle;
using test::kBatchAtan2;
using test::kBatchComponent;
using test::kBatchRelative;
using test::kSeed;

/// Away from lock by more than this the angles themselves are compared; closer, the split
/// between the first and third angle is ill-conditioned (an ulp of the quaternion moves
/// them by about 1e-16 / margin), so the rotations they make are compared instead.
constexpr double kAngleComparableMarginRad = 1e-3;

/// A sample count that is not a multiple of any vector width or of the 1024-sample block.
constexpr std::size_t kRandomCount = 4093;

std::vector<BatchPath> paths_to_test() {
  std::vector<BatchPath> out;
  for (BatchPath p : {BatchPath::Auto, BatchPath::Baseline, BatchPath::Avx2, BatchPath::Avx512}) {
    if (batch_path_available(p)) out.push_back(p);
  }
  return out;
}

struct QuatColumns {
  std::vector<double> w, x, y, z;
  explicit QuatColumns(std::size_t n = 0) : w(n), x(n), y(n), z(n) {}
  void push(const Eigen::Quaterniond& q) {
    w.push_back(q.w());
    x.push_back(q.x());
    y.push_back(q.y());
    z.push_back(q.z());
  }
  QuaternionColumns in() const { return {w, x, y, z}; }
  QuaternionColumnsOut out() { return {w, x, y, z}; }
  Eigen::Quaterniond at(std::size_t s) const { return Eigen::Quaterniond(w[s], x[s], y[s], z[s]); }
};

struct AngleColumns {
  std::vector<double> a1, a2, a3, margin;
  explicit AngleColumns(std::size_t n = 0) : a1(n), a2(n), a3(n), margin(n) {}
  EulerColumnsOut out() { return {a1, a2, a3, margin}; }
  EulerColumns in() const { return {a1, a2, a3}; }
  Eigen::Vector3d at(std::size_t s) const { return Eigen::Vector3d(a1[s], a2[s], a3[s]); }
};

/// The edge corpus of one convention: identity, q and -q, 1e-9 rad turns, exactly 180
/// degrees about each axis and a skew axis, negative w, and rotations at lock, inside the
/// lock threshold (1e-8 degrees), just outside it and further out, on both sides.
std::vector<Rotation> edge_corpus(const EulerConvention& c) {
  std::vector<Rotation> out;
  out.push_back(Rotation::identity());
  out.push_back(Rotation::identity().negated());
  for (Axis a : {Axis::X, Axis::Y, Axis::Z}) {
    out.push_back(elementary_rotation(a, 1e-9));
    out.push_back(elementary_rotation(a, -1e-9));
    out.push_back(elementary_rotation(a, M_PI));
    out.push_back(elementary_rotation(a, M_PI).negated());
  }
  out.push_back(Rotation(Eigen::Quaterniond(0.0, 1.0, 1.0, 1.0)));        // 180 deg, skew axis
  out.push_back(Rotation(Eigen::Quaterniond(-0.3, 0.5, -0.7, 0.2)));      // negative w
  out.push_back(Rotation(Eigen::Quaterniond(1.0, 1e-9, -2e-9, 0.5e-9)));  // tiny skew turn
  const double lock = c.proper() ? 0.0 : 0.5 * M_PI;
  const double deg = M_PI / 180.0;
  const double offsets[] = {
      0.0,        1e-8 * deg, 0.5 * kLockMarginRad, 1.5 * kLockMarginRad, 2.5 * kLockMarginRad, 1e-5 * deg,
      1e-3 * deg, 0.1 * deg};
  for (double side : {1.0, -1.0}) {
    for (double off : offsets) {
      // Tait-Bryan: the middle angle at +/-90 deg minus the offset; proper: at 0 and 180 deg.
      const double mid = c.proper() ? (side > 0 ? off : M_PI - off) : side * (lock - off);
      out.push_back(from_euler(c, Eigen::Vector3d(0.7, mid, -1.9)));
      out.push_back(from_euler(c, Eigen::Vector3d(-3.0, mid, 2.4)));
      out.push_back(from_euler(c, Eigen::Vector3d(M_PI, mid, M_PI)));
    }
  }
  return out;
}

/// Compares batch Euler angles of sample s with to_euler of the same quaternion.
::testing::AssertionResult EulerMatches(const QuatColumns& q, const AngleColumns& got, std::size_t s,
                                        const EulerConvention& c) {
  const Rotation r(q.at(s));
  const EulerAngles want = to_euler(r, c);
  const Eigen::Vector3d angles = got.at(s);
  // The message is built only for a failure: the random test compares 400k samples.
  const auto why = [&] {
    std::ostringstream m;
    m.precision(17);
    m << c.name() << " sample " << s << " q = (" << q.w[s] << ", " << q.x[s] << ", " << q.y[s] << ", "
      << q.z[s] << "): batch " << angles.transpose() << " margin " << got.margin[s] << ", to_euler "
      << want.angles_rad.transpose() << " margin " << want.lock_margin_rad << "\n";
    return m.str();
  };
  if (want.lock_margin_rad < 1.9 * kLockMarginRad) {
    // At and next to lock the batch hands the sample to to_euler: the same numbers.
    if (angles == want.angles_rad && got.margin[s] == want.lock_margin_rad)
      return ::testing::AssertionSuccess();
    return ::testing::AssertionFailure() << why() << "  expected the to_euler numbers exactly";
  }
  if (std::abs(got.margin[s] - want.lock_margin_rad) > kBatchAngle ||
      std::abs(angles(1) - want.angles_rad(1)) > kBatchAngle) {
    return ::testing::AssertionFailure() << why() << "  middle angle or margin differ";
  }
  if (want.lock_margin_rad > kAngleComparableMarginRad) {
    for (int a = 0; a < 3; ++a) {
      // First and third angles next to +/-180 deg may land on either side: compare modulo a turn.
      if (std::abs(wrap_pi(angles(a) - want.angles_rad(a))) > kBatchAngle) {
        return ::testing::AssertionFailure() << why() << "  angle " << a + 1 << " differs";
      }
    }
  }
  // Ranges of the design: first and third in (-pi, pi].
  if (!(angles(0) > -M_PI && angles(0) <= M_PI && angles(2) > -M_PI && angles(2) <= M_PI)) {
    return ::testing::AssertionFailure() << why() << "  first or third angle out of (-pi, pi]";
  }
  ::testing::AssertionResult same = test::RotationNear(from_euler(c, angles), r, kBatchAngle);
  if (!same) same << "\n" << why();
  return same;
}

TEST(BatchTest, PathsReportAndAutoIsTheWidest) {
  EXPECT_TRUE(batch_path_available(BatchPath::Baseline));
  EXPECT_TRUE(batch_path_available(batch_path_auto()));
  EXPECT_NE(batch_path_auto(), BatchPath::Auto);
  if (batch_path_available(BatchPath::Avx512)) {
    EXPECT_EQ(batch_path_auto(), BatchPath::Avx512);
  }
  EXPECT_STREQ(batch_path_name(BatchPath::Avx2), "avx2");
}

TEST(BatchTest, QuaternionToEulerMatchesScalarRandom) {
  for (BatchPath path : paths_to_test()) {
    std::mt19937 rng(kSeed);
    for (const EulerConvention& c : all_euler_conventions()) {
      QuatColumns q;
      for (std::size_t s = 0; s < kRandomCount; ++s) q.push(test::RandomRotation(rng).stored_quaternion());
      AngleColumns got(kRandomCount);
      const Expected<std::size_t> n = quaternions_to_euler(q.in(), c, got.out(), path);
      ASSERT_TRUE(n.ok()) << n.error().describe();
      ASSERT_EQ(n.value(), kRandomCount);
      for (std::size_t s = 0; s < kRandomCount; ++s) {
        ASSERT_TRUE(EulerMatches(q, got, s, c)) << "path " << batch_path_name(path) << " seed " << kSeed;
      }
    }
  }
}

TEST(BatchTest, QuaternionToEulerMatchesScalarOnEdgeCorpus) {
  for (BatchPath path : paths_to_test()) {
    for (const EulerConvention& c : all_euler_conventions()) {
      QuatColumns q;
      for (const Rotation& r : edge_corpus(c)) q.push(r.stored_quaternion());
      AngleColumns got(q.w.size());
      ASSERT_TRUE(quaternions_to_euler(q.in(), c, got.out(), path).ok());
      for (std::size_t s = 0; s < q.w.size(); ++s) {
        EXPECT_TRUE(EulerMatches(q, got, s, c)) << "path " << batch_path_name(path);
      }
    }
  }
}

/// The instruction sets whose kernels this CPU can run, as the internal table names them.
std::vector<std::pair<BatchPath, batch_detail::Isa>> isas_to_test() {
  std::vector<std::pair<BatchPath, batch_detail::Isa>> out{
      {BatchPath::Baseline, batch_detail::Isa::Baseline}};
  if (batch_path_available(BatchPath::Avx2)) out.emplace_back(BatchPath::Avx2, batch_detail::Isa::Avx2);
  if (batch_path_available(BatchPath::Avx512)) out.emplace_back(BatchPath::Avx512, batch_detail::Isa::Avx512);
  return out;
}

TEST(BatchTest, KernelAtan2MatchesLibm) {
  // The quaternion -> Euler loops use their own atan2 (a polynomial after Cody & Waite's
  // range reduction). Against glibc's std::atan2 (correctly rounded in practice) over random
  // operands of every size and sign, the octant edges, zeros of both signs and infinities.
  std::mt19937 rng(kSeed);
  std::uniform_real_distribution<double> unit(-1.0, 1.0);
  std::uniform_real_distribution<double> exponent(-300.0, 300.0);
  std::vector<double> y, x;
  for (int s = 0; s < 200000; ++s) {
    y.push_back(unit(rng));
    x.push_back(unit(rng));
  }
  for (int s = 0; s < 50000; ++s) {
    y.push_back(std::copysign(std::pow(10.0, exponent(rng)), unit(rng)));
    x.push_back(std::copysign(std::pow(10.0, exponent(rng)), unit(rng)));
  }
  // Ratios at the reduction points tan(pi/8) and 1, and either side of them.
  for (double ratio : {std::tan(M_PI / 8.0), 1.0, 1.0 / std::tan(M_PI / 8.0)}) {
    for (double off : {-1e-15, -1e-9, 0.0, 1e-9, 1e-15}) {
      for (double sy : {1.0, -1.0}) {
        for (double sx : {1.0, -1.0}) {
          y.push_back(sy * ratio * (1.0 + off));
          x.push_back(sx);
        }
      }
    }
  }
  const double inf = std::numeric_limits<double>::infinity();
  for (double a : {0.0, -0.0, 1.0, -1.0, 1e-310, inf, -inf}) {
    for (double b : {0.0, -0.0, 1.0, -1.0, 1e-310, inf, -inf}) {
      if (std::isinf(a) && std::isinf(b)) continue;  // not needed by the kernels
      y.push_back(a);
      x.push_back(b);
    }
  }
  for (const auto& [path, isa] : isas_to_test()) {
    std::vector<double> got(y.size());
    batch_detail::kernels(isa).atan2_columns(y.size(), y.data(), x.data(), got.data());
    double worst = 0.0;
    for (std::size_t s = 0; s < y.size(); ++s) {
      const double want = std::atan2(y[s], x[s]);
      const double err = std::abs(got[s] - want);
      worst = std::max(worst, err);
      ASSERT_LE(err, kBatchAtan2) << "atan2(" << y[s] << ", " << x[s] << ") path " << batch_path_name(path)
                                  << " seed " << kSeed;
      // Signed zeros and the sign of pi as std::atan2.
      ASSERT_EQ(std::signbit(got[s]), std::signbit(want)) << "atan2(" << y[s] << ", " << x[s] << ")";
    }
    RecordProperty(std::string("worst_") + batch_path_name(path), std::to_string(worst));
  }
}

TEST(BatchTest, MiddleAngleKeepsRelativePrecisionNearLevelAndLock) {
  // Tait-Bryan middle angles from the exact form of to_euler (no t2 - pi/2, which leaves an
  // absolute error of about 2e-16 rad): a 1e-12 rad pitch keeps all its digits, and next to
  // +/-90 degrees the margin is that of to_euler.
  for (const EulerConvention& c : all_euler_conventions()) {
    if (c.proper()) continue;
    std::vector<double> middles;
    for (double mid : {1e-3, 1e-6, 1e-9, 1e-12, 1e-15, 1e-200}) {
      for (double side : {1.0, -1.0}) middles.push_back(side * mid);
    }
    // Beside lock: just outside the redo band (2 x the lock threshold) and a little further.
    for (double off : {2.5 * kLockMarginRad, 1e-7, 1e-5}) {
      for (double side : {1.0, -1.0}) middles.push_back(side * (0.5 * M_PI - off));
    }
    // A turn about the middle axis alone (q_i = q_k = 0: the inputs carry no rounding that
    // cancels), then one with first and third angles, whose quaternion components are
    // rounded to about 1e-16 each: w q_j - q_i q_k then cancels to about that absolute size.
    for (const auto& [outer, floor] : {std::pair<double, double>{0.0, 0.0}, {0.4, 1e-16}}) {
      QuatColumns q;
      for (double mid : middles)
        q.push(from_euler(c, Eigen::Vector3d(outer, mid, -5.5 * outer)).stored_quaternion());
      for (const auto& [path, isa] : isas_to_test()) {
        AngleColumns got(q.w.size());
        ASSERT_TRUE(quaternions_to_euler(q.in(), c, got.out(), path).ok());
        for (std::size_t s = 0; s < q.w.size(); ++s) {
          const EulerAngles want = to_euler(Rotation(q.at(s)), c);
          const double tol = kBatchRelative * std::abs(want.angles_rad(1)) + floor;
          EXPECT_LE(std::abs(got.a2[s] - want.angles_rad(1)), tol)
              << c.name() << " middle " << middles[s] << " outer " << outer << " path "
              << batch_path_name(path);
          EXPECT_LE(std::abs(got.margin[s] - want.lock_margin_rad), kBatchAtan2)
              << c.name() << " middle " << middles[s] << " outer " << outer << " path "
              << batch_path_name(path);
          EXPECT_EQ(want.at_lock, got.margin[s] < kLockMarginRad);
        }
      }
    }
  }
}

TEST(BatchTest, QuaternionToEulerIgnoresScaleAndSign) {
  // The formula is a ratio of quaternion components: any non-zero scale, either sign.
  std::mt19937 rng(kSeed);
  const EulerConvention zyx = parse_euler_sequence("ZYX", EulerKind::Intrinsic).value();
  QuatColumns unit, scaled;
  for (int s = 0; s < 64; ++s) {
    const Eigen::Quaterniond q = test::RandomRotation(rng).stored_quaternion();
    const double scale = s % 3 == 0 ? -3.7 : (s % 3 == 1 ? 1e-100 : 2e90);
    unit.push(q);
    scaled.push(Eigen::Quaterniond(scale * q.w(), scale * q.x(), scale * q.y(), scale * q.z()));
  }
  AngleColumns a(unit.w.size()), b(unit.w.size());
  ASSERT_TRUE(quaternions_to_euler(unit.in(), zyx, a.out()).ok());
  ASSERT_TRUE(quaternions_to_euler(scaled.in(), zyx, b.out()).ok());
  for (std::size_t s = 0; s < a.a1.size(); ++s) {
    EXPECT_TRUE(test::RotationNear(from_euler(zyx, a.at(s)), from_euler(zyx, b.at(s)), kBatchAngle)) << s;
  }
}

TEST(BatchTest, QuaternionToEulerGivesNaNForUnusableQuaternions) {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const double inf = std::numeric_limits<double>::infinity();
  QuatColumns q;
  q.push(Eigen::Quaterniond(0.0, 0.0, 0.0, 0.0));
  q.push(Eigen::Quaterniond(nan, 0.0, 0.0, 0.0));
  q.push(Eigen::Quaterniond(1.0, inf, 0.0, 0.0));
  q.push(Eigen::Quaterniond(inf, inf, inf, inf));
  q.push(Eigen::Quaterniond(1e-200, 0.0, 0.0, 0.0));  // squared norm underflows
  q.push(Eigen::Quaterniond(1.0, 0.0, 0.0, 0.0));     // a good one among them
  for (BatchPath path : paths_to_test()) {
    for (const EulerConvention& c : all_euler_conventions()) {
      AngleColumns got(q.w.size());
      ASSERT_TRUE(quaternions_to_euler(q.in(), c, got.out(), path).ok());
      for (std::size_t s = 0; s + 1 < q.w.size(); ++s) {
        EXPECT_TRUE(std::isnan(got.a1[s]) && std::isnan(got.a2[s]) && std::isnan(got.a3[s]) &&
                    std::isnan(got.margin[s]))
            << c.name() << " sample " << s << " path " << batch_path_name(path);
      }
      EXPECT_TRUE(EulerMatches(q, got, q.w.size() - 1, c));
    }
  }
}

TEST(BatchTest, QuaternionToEulerWithoutMarginColumn) {
  std::mt19937 rng(kSeed);
  const EulerConvention zxz = parse_euler_sequence("ZXZ", EulerKind::Extrinsic).value();
  QuatColumns q;
  for (const Rotation& r : edge_corpus(zxz)) q.push(r.stored_quaternion());
  for (int s = 0; s < 3000; ++s) q.push(test::RandomRotation(rng).stored_quaternion());
  AngleColumns with(q.w.size()), without(q.w.size());
  ASSERT_TRUE(quaternions_to_euler(q.in(), zxz, with.out()).ok());
  ASSERT_TRUE(
      quaternions_to_euler(q.in(), zxz, EulerColumnsOut{without.a1, without.a2, without.a3, {}}).ok());
  EXPECT_EQ(with.a1, without.a1);
  EXPECT_EQ(with.a2, without.a2);
  EXPECT_EQ(with.a3, without.a3);
}

TEST(BatchTest, RejectsMismatchedAndOverlappingColumns) {
  QuatColumns q(10);
  q.w.assign(10, 1.0);
  AngleColumns out(10);
  const EulerConvention c;
  EXPECT_TRUE(quaternions_to_euler(q.in(), c, out.out()).ok());
  AngleColumns short_out(9);
  EXPECT_FALSE(quaternions_to_euler(q.in(), c, short_out.out()).ok());
  QuatColumns ragged(10);
  ragged.z.resize(11);
  EXPECT_FALSE(quaternions_to_euler(ragged.in(), c, out.out()).ok());
  // An output that is an input column.
  EXPECT_FALSE(quaternions_to_euler(q.in(), c, EulerColumnsOut{q.w, out.a2, out.a3, {}}).ok());
  // Two outputs in one array.
  EXPECT_FALSE(quaternions_to_euler(q.in(), c, EulerColumnsOut{out.a1, out.a1, out.a3, {}}).ok());
  QuatColumns empty;
  AngleColumns none;
  const Expected<std::size_t> zero = quaternions_to_euler(empty.in(), c, none.out());
  ASSERT_TRUE(zero.ok());
  EXPECT_EQ(zero.value(), 0u);
  for (BatchPath p : {BatchPath::Avx2, BatchPath::Avx512}) {
    EXPECT_EQ(quaternions_to_euler(q.in(), c, out.out(), p).ok(), batch_path_available(p));
  }
}

TEST(BatchTest, EulerToQuaternionMatchesScalar) {
  for (BatchPath path : paths_to_test()) {
    std::mt19937 rng(kSeed);
    // Any finite angles are accepted, not only those in range.
    std::uniform_real_distribution<double> angle(-7.0, 7.0);
    for (const EulerConvention& c : all_euler_conventions()) {
      AngleColumns in;
      for (std::size_t s = 0; s < kRandomCount; ++s) {
        in.a1.push_back(angle(rng));
        in.a2.push_back(angle(rng));
        in.a3.push_back(angle(rng));
      }
      for (const Rotation& r : edge_corpus(c)) {
        const Eigen::Vector3d e = to_euler(r, c).angles_rad;
        in.a1.push_back(e(0));
        in.a2.push_back(e(1));
        in.a3.push_back(e(2));
      }
      QuatColumns got(in.a1.size());
      ASSERT_TRUE(euler_to_quaternions(c, in.in(), got.out(), path).ok());
      for (std::size_t s = 0; s < in.a1.size(); ++s) {
        // from_euler keeps the sign of its product; so does the batch.
        const Eigen::Quaterniond want = from_euler(c, in.at(s)).stored_quaternion();
        ASSERT_TRUE(test::MatrixNear(got.at(s).coeffs(), want.coeffs(), kBatchComponent))
            << c.name() << " sample " << s << " path " << batch_path_name(path) << " seed " << kSeed;
      }
    }
  }
}

TEST(BatchTest, MatrixToQuaternionMatchesScalar) {
  for (BatchPath path : paths_to_test()) {
    std::mt19937 rng(kSeed);
    std::vector<Eigen::Matrix3d> mats;
    for (std::size_t s = 0; s < kRandomCount; ++s) mats.push_back(test::RandomRotation(rng).matrix());
    // Every pivot, including ties at 180 degrees (w = 0: the canonical sign decides).
    for (const Rotation& r : edge_corpus(EulerConvention{})) mats.push_back(r.matrix());
    mats.push_back(Eigen::Vector3d(1.0, -1.0, -1.0).asDiagonal().toDenseMatrix());
    mats.push_back(Eigen::Vector3d(-1.0, 1.0, -1.0).asDiagonal().toDenseMatrix());
    mats.push_back(Eigen::Vector3d(-1.0, -1.0, 1.0).asDiagonal().toDenseMatrix());
    std::vector<std::vector<double>> cols(9, std::vector<double>(mats.size()));
    for (std::size_t s = 0; s < mats.size(); ++s) {
      for (int e = 0; e < 9; ++e) cols[static_cast<std::size_t>(e)][s] = mats[s](e / 3, e % 3);
    }
    MatrixColumns in;
    for (std::size_t e = 0; e < 9; ++e)
      in.r[e / 3][e % 3] = Span<const double>(cols[e].data(), cols[e].size());
    QuatColumns got(mats.size());
    ASSERT_TRUE(matrices_to_quaternions(in, got.out(), path).ok());
    for (std::size_t s = 0; s < mats.size(); ++s) {
      const Eigen::Quaterniond want = quaternion_from_rotation_matrix(mats[s]);
      ASSERT_TRUE(test::MatrixNear(got.at(s).coeffs(), want.coeffs(), kBatchComponent))
          << "sample " << s << " path " << batch_path_name(path) << " seed " << kSeed;
    }
  }
}

TEST(BatchTest, QuaternionToMatrixMatchesScalar) {
  for (BatchPath path : paths_to_test()) {
    std::mt19937 rng(kSeed);
    QuatColumns q;
    for (std::size_t s = 0; s < kRandomCount; ++s) q.push(test::RandomRotation(rng).stored_quaternion());
    for (const Rotation& r : edge_corpus(EulerConvention{})) q.push(r.stored_quaternion());
    std::vector<std::vector<double>> cols(9, std::vector<double>(q.w.size()));
    MatrixColumnsOut out;
    for (std::size_t e = 0; e < 9; ++e) out.r[e / 3][e % 3] = cols[e];
    ASSERT_TRUE(quaternions_to_matrices(q.in(), out, path).ok());
    for (std::size_t s = 0; s < q.w.size(); ++s) {
      Eigen::Matrix3d got;
      for (int e = 0; e < 9; ++e) got(e / 3, e % 3) = cols[static_cast<std::size_t>(e)][s];
      ASSERT_TRUE(test::MatrixNear(got, Rotation(q.at(s)).matrix(), kBatchComponent))
          << "sample " << s << " path " << batch_path_name(path) << " seed " << kSeed;
    }
  }
}

}  // namespace
}  // namespace attiscope
