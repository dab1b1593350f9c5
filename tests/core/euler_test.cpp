// euler_test.cpp: the 24 Euler conventions: round trips, ranges, lock rule, rate matrix.
#include "attiscope/core/euler.hpp"

#include <cmath>
#include <fstream>
#include <nlohmann/json.hpp>

#include "attiscope/core/matrix.hpp"
#include "support/check.hpp"
#include "support/corpus.hpp"

namespace attiscope {
namespace {

using test::kRoundTrip;
using test::kSeed;
using test::kTight;

constexpr double kDeg = M_PI / 180.0;

Eigen::Vector3d Deg(double a, double b, double c) {
  return Eigen::Vector3d(a, b, c) * kDeg;
}

// The matrix of a convention from its definition (design.md): intrinsic R_i(a) R_j(b) R_k(c),
// extrinsic R_k(c) R_j(b) R_i(a), with the elementary matrices written out by hand here.
Eigen::Matrix3d ElementaryByHand(Axis axis, double t) {
  const double c = std::cos(t), s = std::sin(t);
  Eigen::Matrix3d m;
  switch (axis) {
    case Axis::X: m << 1, 0, 0, 0, c, -s, 0, s, c; break;
    case Axis::Y: m << c, 0, s, 0, 1, 0, -s, 0, c; break;
    case Axis::Z: m << c, -s, 0, s, c, 0, 0, 0, 1; break;
  }
  return m;
}

Eigen::Matrix3d ProductByHand(const EulerConvention& c, const Eigen::Vector3d& a) {
  const Eigen::Matrix3d r1 = ElementaryByHand(c.axes[0], a(0));
  const Eigen::Matrix3d r2 = ElementaryByHand(c.axes[1], a(1));
  const Eigen::Matrix3d r3 = ElementaryByHand(c.axes[2], a(2));
  return c.kind == EulerKind::Intrinsic ? Eigen::Matrix3d(r1 * r2 * r3) : Eigen::Matrix3d(r3 * r2 * r1);
}

EulerConvention Conv(const char* seq, EulerKind kind = EulerKind::Intrinsic) {
  return parse_euler_sequence(seq, kind).value();
}

TEST(EulerTest, RoundTripAllConventionsRandom) {
  std::mt19937 rng(kSeed);
  for (const EulerConvention& c : all_euler_conventions()) {
    for (int n = 0; n < 2000; ++n) {
      const Rotation r = test::RandomRotation(rng);
      const EulerAngles e = to_euler(r, c);
      ASSERT_TRUE(test::RotationNear(from_euler(c, e.angles_rad), r, kRoundTrip))
          << c.name() << " sample " << n << " seed " << kSeed;
      // Ranges of the design: first and third in (-pi, pi]; middle per kind of sequence.
      EXPECT_GT(e.angles_rad(0), -M_PI);
      EXPECT_LE(e.angles_rad(0), M_PI);
      EXPECT_GT(e.angles_rad(2), -M_PI);
      EXPECT_LE(e.angles_rad(2), M_PI);
      if (c.proper()) {
        EXPECT_GE(e.angles_rad(1), 0.0);
        EXPECT_LE(e.angles_rad(1), M_PI);
      } else {
        EXPECT_LE(std::abs(e.angles_rad(1)), M_PI / 2);
      }
    }
  }
}

TEST(EulerTest, ParsesNumeralsAndLetters) {
  EXPECT_EQ(parse_euler_sequence("321", EulerKind::Intrinsic).value().sequence(), "ZYX");
  EXPECT_EQ(parse_euler_sequence("3-1-3", EulerKind::Intrinsic).value().sequence(), "ZXZ");
  EXPECT_EQ(parse_euler_sequence("xyz", EulerKind::Extrinsic).value().name(), "extrinsic XYZ");
  EXPECT_FALSE(parse_euler_sequence("XXY", EulerKind::Intrinsic).ok());
  EXPECT_FALSE(parse_euler_sequence("XY", EulerKind::Intrinsic).ok());
  EXPECT_FALSE(parse_euler_sequence("XYW", EulerKind::Intrinsic).ok());
}

TEST(EulerTest, FromEulerIsTheProductOfItsDefinition) {
  std::mt19937 rng(kSeed);
  std::uniform_real_distribution<double> angle(-M_PI, M_PI);
  for (const EulerConvention& c : all_euler_conventions()) {
    for (int n = 0; n < 200; ++n) {
      const Eigen::Vector3d a(angle(rng), angle(rng), angle(rng));
      EXPECT_TRUE(test::MatrixNear(from_euler(c, a).matrix(), ProductByHand(c, a), kTight))
          << c.name() << " seed " << kSeed;
    }
  }
}

TEST(EulerTest, IntrinsicIsExtrinsicReversed) {
  // Common practice (references.md 2.2): intrinsic ZYX (a, b, c) == extrinsic XYZ (c, b, a).
  std::mt19937 rng(kSeed);
  std::uniform_real_distribution<double> angle(-M_PI, M_PI);
  for (int s = 0; s < 12; ++s) {
    const EulerConvention in = all_euler_conventions()[static_cast<std::size_t>(s)];
    EulerConvention ex = in;
    ex.kind = EulerKind::Extrinsic;
    ex.axes = {in.axes[2], in.axes[1], in.axes[0]};
    for (int n = 0; n < 50; ++n) {
      const Eigen::Vector3d a(angle(rng), angle(rng), angle(rng));
      EXPECT_TRUE(
          test::RotationNear(from_euler(in, a), from_euler(ex, Eigen::Vector3d(a(2), a(1), a(0))), kTight));
    }
  }
}

TEST(EulerTest, AerospaceZyxWorkedValue) {
  // references.md section 3 (reference-script value, 12 digits): intrinsic ZYX (30, 20, 10) deg =
  // [[0.813797681349, -0.440969610530, 0.378522306370],
  //  [0.469846310393,  0.882564119259, 0.018028311236],
  //  [-0.342020143326, 0.163175911167, 0.925416578398]].
  Eigen::Matrix3d want;
  want << 0.813797681349, -0.440969610530, 0.378522306370, 0.469846310393, 0.882564119259, 0.018028311236,
      -0.342020143326, 0.163175911167, 0.925416578398;
  EXPECT_TRUE(test::MatrixNear(from_euler(Conv("ZYX"), Deg(30, 20, 10)).matrix(), want, 1e-12));
  const EulerAngles e = to_euler(from_euler(Conv("ZYX"), Deg(30, 20, 10)), Conv("321"));
  EXPECT_TRUE(test::MatrixNear(e.angles_rad, Deg(30, 20, 10), kTight));
  EXPECT_FALSE(e.at_lock);
  EXPECT_NEAR(e.lock_margin_rad, 70 * kDeg, kTight);
}

TEST(EulerTest, AnglesComeBackInRangeAwayFromLock) {
  // Angles inside the ranges and away from lock are recovered exactly (not just the rotation).
  std::mt19937 rng(kSeed);
  std::uniform_real_distribution<double> outer(-M_PI + 1e-6, M_PI);
  for (const EulerConvention& c : all_euler_conventions()) {
    std::uniform_real_distribution<double> middle(c.proper() ? 0.01 : -M_PI / 2 + 0.01,
                                                  c.proper() ? M_PI - 0.01 : M_PI / 2 - 0.01);
    for (int n = 0; n < 300; ++n) {
      const Eigen::Vector3d a(outer(rng), middle(rng), outer(rng));
      const EulerAngles e = to_euler(from_euler(c, a), c);
      // Conditioning: near lock the outer angles move by ~eps / margin.
      EXPECT_TRUE(test::MatrixNear(e.angles_rad, a, 1e-12 / std::max(1e-2, lock_margin(c, a(1)))))
          << c.name() << " seed " << kSeed << " sample " << n;
    }
  }
}

TEST(EulerTest, LockRuleInEveryConvention) {
  // design.md: below a margin of 1e-6 deg the pose is at lock; the third angle is 0 and the
  // first carries the free turn. Exactly at lock the matrix still matches to rounding; at
  // 1e-8 deg from lock the dropped third turn costs at most about 2 x margin (its axis is
  // within the margin of the first axis), which the tolerance says.
  for (const EulerConvention& c : all_euler_conventions()) {
    for (double mid : test::LockMiddles(c)) {
      for (double off : {0.0, 1e-8 * kDeg, 5e-7 * kDeg}) {
        for (double third : {-0.3, 0.0, 1.2, M_PI}) {
          const double b = mid > 0.0 ? mid - off : mid + off;
          const Rotation r = from_euler(c, Eigen::Vector3d(0.5, b, third));
          const EulerAngles e = to_euler(r, c);
          EXPECT_TRUE(e.at_lock) << c.name() << " mid " << mid << " off " << off;
          EXPECT_EQ(e.angles_rad(2), 0.0) << c.name();
          EXPECT_LT(e.lock_margin_rad, kLockMarginRad);
          EXPECT_NEAR(e.lock_margin_rad, off, 1e-15) << c.name();
          EXPECT_NEAR(e.angles_rad(1), b, 1e-15) << c.name();
          EXPECT_TRUE(test::RotationNear(from_euler(c, e.angles_rad), r, 1e-15 + 2.0 * off))
              << c.name() << " mid " << mid << " off " << off << " third " << third;
          EXPECT_GT(e.angles_rad(0), -M_PI);
          EXPECT_LE(e.angles_rad(0), M_PI);
        }
      }
    }
  }
}

TEST(EulerTest, JustOutsideLockKeepsAllThreeAngles) {
  // At 2e-6 deg from lock the pose is not at lock: the round trip is exact to 1e-12.
  for (const EulerConvention& c : all_euler_conventions()) {
    for (double mid : test::LockMiddles(c)) {
      const double b = mid > 0.0 ? mid - 2e-6 * kDeg : mid + 2e-6 * kDeg;
      const Rotation r = from_euler(c, Eigen::Vector3d(0.5, b, -0.3));
      const EulerAngles e = to_euler(r, c);
      EXPECT_FALSE(e.at_lock) << c.name();
      EXPECT_TRUE(test::RotationNear(from_euler(c, e.angles_rad), r, kRoundTrip)) << c.name();
    }
  }
}

TEST(EulerTest, LockEquivalences) {
  // Common practice (references.md T5; scipy 1.10.1 gives the same third-angle-zero answers,
  // references.md 2.2): ZYX at pitch +90 depends on yaw - roll: (30,90,10) = (20,90,0) =
  // (50,90,30); at -90 on yaw + roll: (30,-90,10) = (40,-90,0). ZXZ at 0: a1 + a3, (30,0,10)
  // = (40,0,0); at 180: a1 - a3, (30,180,10) = (20,180,0).
  const EulerConvention zyx = Conv("ZYX"), zxz = Conv("ZXZ");
  EXPECT_TRUE(test::RotationNear(from_euler(zyx, Deg(30, 90, 10)), from_euler(zyx, Deg(20, 90, 0)), kTight));
  EXPECT_TRUE(test::RotationNear(from_euler(zyx, Deg(30, 90, 10)), from_euler(zyx, Deg(50, 90, 30)), kTight));
  EXPECT_TRUE(
      test::RotationNear(from_euler(zyx, Deg(30, -90, 10)), from_euler(zyx, Deg(40, -90, 0)), kTight));
  EXPECT_TRUE(test::RotationNear(from_euler(zxz, Deg(30, 0, 10)), from_euler(zxz, Deg(40, 0, 0)), kTight));
  EXPECT_TRUE(
      test::RotationNear(from_euler(zxz, Deg(30, 180, 10)), from_euler(zxz, Deg(20, 180, 0)), kTight));
  struct Case {
    EulerConvention c;
    Eigen::Vector3d in, out;
  };
  const Case cases[] = {{zyx, Deg(30, 90, 10), Deg(20, 90, 0)},
                        {zyx, Deg(30, -90, 10), Deg(40, -90, 0)},
                        {zxz, Deg(30, 0, 10), Deg(40, 0, 0)},
                        {zxz, Deg(30, 180, 10), Deg(20, 180, 0)}};
  for (const Case& k : cases) {
    const EulerAngles e = to_euler(from_euler(k.c, k.in), k.c);
    EXPECT_TRUE(e.at_lock);
    EXPECT_TRUE(test::MatrixNear(e.angles_rad, k.out, 1e-12))
        << k.c.name() << " " << (k.in / kDeg).transpose();
  }
}

TEST(EulerTest, EdgeCorpusRoundTrips) {
  for (const test::NamedRotation& n : test::EdgeCorpus()) {
    for (const EulerConvention& c : all_euler_conventions()) {
      const EulerAngles e = to_euler(n.rotation, c);
      const double slack = e.at_lock ? 2.0 * e.lock_margin_rad : 0.0;
      EXPECT_TRUE(test::RotationNear(from_euler(c, e.angles_rad), n.rotation, kRoundTrip + slack))
          << n.name << " in " << c.name();
      EXPECT_TRUE(e.angles_rad.allFinite()) << n.name;
    }
  }
}

TEST(EulerTest, RateMatrixZyxClosedForm) {
  // references.md T5 (also Stevens & Lewis [S12]; Wertz Table E-2 [S5]; from memory there,
  // checked by a reference script): rows p, q, r, columns yaw, pitch, roll rates:
  // E = [[-sin t, 0, 1], [cos t sin f, cos f, 0], [cos t cos f, -sin f, 0]], det E = -cos t,
  // det E(30 deg, 20 deg) = -0.8660254037844386, E(0, 0) = [[0,0,1],[0,1,0],[1,0,0]].
  const EulerConvention zyx = Conv("ZYX");
  const double t = 30 * kDeg, f = 20 * kDeg;
  Eigen::Matrix3d want;
  want << -std::sin(t), 0, 1, std::cos(t) * std::sin(f), std::cos(f), 0, std::cos(t) * std::cos(f),
      -std::sin(f), 0;
  const Eigen::Matrix3d e = euler_rate_matrix(zyx, Eigen::Vector3d(0.7, t, f));
  EXPECT_TRUE(test::MatrixNear(e, want, kTight));
  EXPECT_NEAR(e.determinant(), -0.8660254037844386, kTight);
  Eigen::Matrix3d e00;
  e00 << 0, 0, 1, 0, 1, 0, 1, 0, 0;
  EXPECT_TRUE(test::MatrixNear(euler_rate_matrix(zyx, Eigen::Vector3d::Zero()), e00, kTight));
  EXPECT_NEAR(euler_rate_matrix(zyx, Eigen::Vector3d(0.3, M_PI / 2, -1.0)).determinant(), 0.0, kTight);
}

TEST(EulerTest, RateMatrixMatchesFiniteDifferencesAndDeterminant) {
  // Definition: omega_body = vee(R^T dR/dt). Checked by central differences of from_euler
  // (step 1e-6, error O(h^2)); det E = +/-cos b (Tait-Bryan) or +/-sin b (proper)
  // (references.md 2.5: sympy derivation over all 12 sequences).
  std::mt19937 rng(kSeed);
  std::uniform_real_distribution<double> angle(-M_PI, M_PI);
  const double h = 1e-6;
  for (const EulerConvention& c : all_euler_conventions()) {
    for (int n = 0; n < 20; ++n) {
      const Eigen::Vector3d a(angle(rng), angle(rng), angle(rng));
      const Eigen::Matrix3d e = euler_rate_matrix(c, a);
      const Eigen::Matrix3d r = from_euler(c, a).matrix();
      for (int k = 0; k < 3; ++k) {
        Eigen::Vector3d d = Eigen::Vector3d::Zero();
        d(k) = h;
        const Eigen::Matrix3d dr = (from_euler(c, a + d).matrix() - from_euler(c, a - d).matrix()) / (2 * h);
        const Eigen::Matrix3d w = r.transpose() * dr;
        EXPECT_TRUE(
            test::MatrixNear(Eigen::Vector3d(w(2, 1), w(0, 2), w(1, 0)), Eigen::Vector3d(e.col(k)), 1e-8))
            << c.name() << " column " << k << " seed " << kSeed;
      }
      const double want = c.proper() ? std::sin(a(1)) : std::cos(a(1));
      EXPECT_NEAR(std::abs(e.determinant()), std::abs(want), kTight) << c.name();
      // Condition number: finite away from lock, growing without bound at it.
      EXPECT_TRUE(std::isfinite(condition_number(e)));
    }
    const double lock_b = c.proper() ? 0.0 : M_PI / 2;
    EXPECT_GT(condition_number(euler_rate_matrix(c, Eigen::Vector3d(0.2, lock_b, 0.4))), 1e15) << c.name();
  }
  EXPECT_NEAR(condition_number(Eigen::Matrix3d::Identity()), 1.0, kTight);
  EXPECT_TRUE(std::isinf(condition_number(Eigen::Matrix3d::Zero())));
}

TEST(EulerTest, LockMarginDefinition) {
  // design.md: Tait-Bryan 90 - |b|, proper min(b, 180 - b).
  EXPECT_NEAR(lock_margin(Conv("ZYX"), 80 * kDeg), 10 * kDeg, kTight);
  EXPECT_NEAR(lock_margin(Conv("ZYX"), -85 * kDeg), 5 * kDeg, kTight);
  EXPECT_NEAR(lock_margin(Conv("ZXZ"), 170 * kDeg), 10 * kDeg, kTight);
  EXPECT_NEAR(lock_margin(Conv("ZXZ"), 3 * kDeg), 3 * kDeg, kTight);
}

TEST(EulerTest, WrapPi) {
  EXPECT_DOUBLE_EQ(wrap_pi(M_PI), M_PI);
  EXPECT_DOUBLE_EQ(wrap_pi(-M_PI), M_PI);
  EXPECT_NEAR(wrap_pi(3 * M_PI / 2), -M_PI / 2, kTight);
  EXPECT_NEAR(wrap_pi(-7.0), -7.0 + 2 * M_PI, kTight);
  EXPECT_EQ(wrap_pi(0.25), 0.25);
}

TEST(EulerTest, TinyTurnsKeepRelativePrecision) {
  // A 1e-9 rad turn: to first order every Tait-Bryan sequence gives the rotation vector's
  // components in its axis order (the second-order terms are ~1e-18), so the angles must be
  // right to far better than their own size, not just to 1e-12 absolute.
  const Eigen::Vector3d u = Eigen::Vector3d(1, -2, 3).normalized();
  for (double t : {1e-9, -1e-12}) {
    const Eigen::Vector3d v = u * t;
    const Rotation r = test::AxisTurn(u, t);
    for (const EulerConvention& c : all_euler_conventions()) {
      if (c.proper()) continue;  // a tiny turn is at lock in a proper sequence
      const EulerAngles e = to_euler(r, c);
      for (int k = 0; k < 3; ++k) {
        EXPECT_NEAR(e.angles_rad(k), v(static_cast<int>(c.axes[static_cast<std::size_t>(k)])), 1e-17)
            << c.name() << " angle " << k << " turn " << t;
      }
    }
  }
}

TEST(EulerTest, NedFrdToEnuFlu) {
  // Common practice (references.md T13 and pitfall 8): an attitude given in NED/FRD as
  // intrinsic ZYX (yaw, pitch, roll) is (90 - yaw, -pitch, roll) in ENU/FLU when both frames
  // are switched: (30, 10, 5) -> (60, -10, 5), (200, -20, 40) -> (-110, 20, 40).
  Eigen::Matrix3d enu_R_ned;
  enu_R_ned << 0, 1, 0, 1, 0, 0, 0, 0, -1;
  const Eigen::Matrix3d frd_R_flu = Eigen::Vector3d(1, -1, -1).asDiagonal();
  const EulerConvention zyx = Conv("ZYX");
  const std::pair<Eigen::Vector3d, Eigen::Vector3d> cases[] = {{Deg(30, 10, 5), Deg(60, -10, 5)},
                                                               {Deg(200, -20, 40), Deg(-110, 20, 40)}};
  for (const auto& [ned, enu] : cases) {
    const Eigen::Matrix3d ned_R_frd = from_euler(zyx, ned).matrix();
    const Rotation enu_R_flu = from_matrix(Eigen::Matrix3d(enu_R_ned * ned_R_frd * frd_R_flu)).value();
    EXPECT_TRUE(test::MatrixNear(to_euler(enu_R_flu, zyx).angles_rad, enu, kTight))
        << (ned / kDeg).transpose();
  }
}

TEST(EulerTest, SympyFixtureMatrices) {
  // Source: tests/core/fixtures/euler24.json, written by tests/reference/gen_euler_fixtures.py:
  // sympy 1.11 exact products of active elementary rotations, 25 significant digits, for the
  // 12 sequences x 2 kinds x several triples (lock cases included).
  std::ifstream in(ATTISCOPE_TEST_FIXTURES "/euler24.json");
  ASSERT_TRUE(in.good()) << "cannot open the fixture " ATTISCOPE_TEST_FIXTURES "/euler24.json";
  const nlohmann::json j = nlohmann::json::parse(in);
  ASSERT_GE(j.at("cases").size(), 24u * 6u);
  int at_lock = 0;
  for (const nlohmann::json& k : j.at("cases")) {
    const EulerConvention c =
        Conv(k.at("sequence").get<std::string>().c_str(),
             k.at("kind").get<std::string>() == "intrinsic" ? EulerKind::Intrinsic : EulerKind::Extrinsic);
    Eigen::Vector3d a;
    for (int i = 0; i < 3; ++i)
      a(i) = std::stod(k.at("angles_deg")[static_cast<std::size_t>(i)].get<std::string>()) * kDeg;
    Eigen::Matrix3d want;
    Eigen::Quaterniond want_q;
    for (int i = 0; i < 9; ++i) {
      want(i / 3, i % 3) =
          std::stod(k.at("matrix")[static_cast<std::size_t>(i / 3)][static_cast<std::size_t>(i % 3)]
                        .get<std::string>());
    }
    const auto& qj = k.at("quaternion_wxyz");
    want_q = Eigen::Quaterniond(std::stod(qj[0].get<std::string>()), std::stod(qj[1].get<std::string>()),
                                std::stod(qj[2].get<std::string>()), std::stod(qj[3].get<std::string>()));
    const std::string what = c.name() + " (" + k.at("angles_deg")[0].get<std::string>() + ", " +
                             k.at("angles_deg")[1].get<std::string>() + ", " +
                             k.at("angles_deg")[2].get<std::string>() + ") deg";
    const Rotation r = from_euler(c, a);
    EXPECT_TRUE(test::MatrixNear(r.matrix(), want, 1e-15)) << what;
    EXPECT_TRUE(test::RotationNear(r, Rotation(want_q), 1e-15)) << what;
    // The matrix of the fixture read back as a rotation, then as Euler angles, gives it again.
    const Rotation from_fixture = from_matrix(want).value();
    const EulerAngles e = to_euler(from_fixture, c);
    EXPECT_TRUE(test::MatrixNear(from_euler(c, e.angles_rad).matrix(), want, 1e-15)) << what;
    if (k.at("at_lock").get<bool>()) {
      ++at_lock;
      EXPECT_TRUE(e.at_lock) << what;
      EXPECT_EQ(e.angles_rad(2), 0.0) << what;
    } else {
      EXPECT_FALSE(e.at_lock) << what;
    }
  }
  EXPECT_GE(at_lock, 24 * 2);
}

}  // namespace
}  // namespace attiscope
