// steps_test.cpp: the step-through data: sentences in the team's words for the three demo
// conventions, word for word, and each step's frame against the core's partial products.
#include "attiscope/core/steps.hpp"

#include <cmath>

#include "attiscope/core/convention_file.hpp"
#include "support/check.hpp"

namespace attiscope {
namespace {

using test::kSeed;

constexpr double kDeg = M_PI / 180.0;

HouseConvention load_demo(const char* file) {
  auto c = load_convention(std::string(ATTISCOPE_SOURCE_DIR) + "/assets/conventions/" + file);
  EXPECT_TRUE(c.ok()) << (c ? "" : c.error().describe());
  return c ? c.value().convention : HouseConvention{};
}

std::array<std::string, 3> sentences(const EulerSteps& s) {
  return {s.steps[0].sentence, s.steps[1].sentence, s.steps[2].sentence};
}

// A pose given as the house's printed numbers.
Rotation printed(const HouseConvention& c, std::array<double, 3> v) {
  return from_house_euler(v, c).value();
}

TEST(StepsTest, SurveyAircraftSentences) {
  // NED/FRD, intrinsic ZYX heading-elevation-bank (invented demo). The expected words
  // follow from FRD and the right-hand rule (common practice: ISO 1151 [F1], memory).
  const HouseConvention c = load_demo("survey-aircraft.toml");
  EXPECT_EQ(sentences(euler_steps(printed(c, {30, 10, 5}), c)),
            (std::array<std::string, 3>{
                "Step 1 of 3 \u2014 heading +30 degrees about the body's down axis: the nose turns right",
                "Step 2 of 3 \u2014 elevation +10 degrees about the body's right axis: the nose rises",
                "Step 3 of 3 \u2014 bank +5 degrees about the body's forward axis: the right wing drops"}));
  // Heading -160 is played in the house range [0, 360) as +200.
  EXPECT_EQ(sentences(euler_steps(printed(c, {-160, -20, -40}), c)),
            (std::array<std::string, 3>{
                "Step 1 of 3 \u2014 heading +200 degrees about the body's down axis: the nose turns right",
                "Step 2 of 3 \u2014 elevation -20 degrees about the body's right axis: the nose drops",
                "Step 3 of 3 \u2014 bank -40 degrees about the body's forward axis: the right wing rises"}));
  // The same pose in the other kind: extrinsic XYZ (bank, elevation, heading) about the
  // world's north, east and down axes. After the bank the east axis is no longer a body
  // axis, so the effect is said in world words.
  const EulerSteps s = euler_steps(printed(c, {30, 10, 5}), c);
  const auto other = equivalent_other_kind(s.convention, s.angles_rad);
  EXPECT_EQ(other.first.name(), "extrinsic XYZ");
  EXPECT_EQ(
      sentences(euler_steps_for(other.first, other.second, with_other_kind(c))),
      (std::array<std::string, 3>{
          "Step 1 of 3 \u2014 bank +5 degrees about the world's north axis: the right wing drops",
          "Step 2 of 3 \u2014 elevation +10 degrees about the world's east axis: the nose moves mostly up",
          "Step 3 of 3 \u2014 heading +30 degrees about the world's down axis: the nose moves mostly east"}));
}

TEST(StepsTest, OrchardRoverSentences) {
  // ENU/FLU, intrinsic ZYX, printed roll, pitch, yaw (invented demo). In FLU positive
  // pitch (about the left axis) lowers the bow (right-hand rule; ROS REP 103 [F7]).
  const HouseConvention c = load_demo("orchard-rover.toml");
  EXPECT_EQ(sentences(euler_steps(printed(c, {5, -10, 60}), c)),
            (std::array<std::string, 3>{
                "Step 1 of 3 \u2014 yaw +60 degrees about the body's up axis: the bow turns left",
                "Step 2 of 3 \u2014 pitch -10 degrees about the body's left axis: the bow rises",
                "Step 3 of 3 \u2014 roll +5 degrees about the body's forward axis: the right side drops"}));
  EXPECT_EQ(
      sentences(euler_steps(printed(c, {-12.5, 3, -90}), c)),
      (std::array<std::string, 3>{
          "Step 1 of 3 \u2014 yaw -90 degrees about the body's up axis: the bow turns right",
          "Step 2 of 3 \u2014 pitch +3 degrees about the body's left axis: the bow drops",
          "Step 3 of 3 \u2014 roll -12.5 degrees about the body's forward axis: the right side rises"}));
}

TEST(StepsTest, CameraRigSentences) {
  // Camera axes right-down-forward, intrinsic YXZ pan-tilt-spin (invented demo).
  const HouseConvention c = load_demo("camera-rig.toml");
  EXPECT_EQ(sentences(euler_steps(printed(c, {20, -15, 0}), c)),
            (std::array<std::string, 3>{
                "Step 1 of 3 \u2014 pan +20 degrees about the body's down axis: the lens turns right",
                "Step 2 of 3 \u2014 tilt -15 degrees about the body's right axis: the lens drops",
                "Step 3 of 3 \u2014 spin +0 degrees about the body's forward axis: no turn"}));
  EXPECT_EQ(sentences(euler_steps(printed(c, {-45, 30, 7.25}), c)),
            (std::array<std::string, 3>{
                "Step 1 of 3 \u2014 pan -45 degrees about the body's down axis: the lens turns left",
                "Step 2 of 3 \u2014 tilt +30 degrees about the body's right axis: the lens rises",
                "Step 3 of 3 \u2014 spin +7.25 degrees about the body's forward axis: the right edge of the "
                "image drops"}));
}

TEST(StepsTest, EachStepFrameIsThePartialProduct) {
  std::mt19937 rng(kSeed);
  std::uniform_real_distribution<double> angle(-M_PI, M_PI);
  HouseConvention c;
  for (const EulerConvention& e : all_euler_conventions()) {
    for (int n = 0; n < 50; ++n) {
      const Eigen::Vector3d a(angle(rng), angle(rng), angle(rng));
      const EulerSteps s = euler_steps_for(e, a, c);
      // Partial products built here from Eigen's own axis-angle matrices.
      const Eigen::Matrix3d m0 = elementary_matrix(e.axes[0], a[0]);
      const Eigen::Matrix3d m1 = elementary_matrix(e.axes[1], a[1]);
      const Eigen::Matrix3d m2 = elementary_matrix(e.axes[2], a[2]);
      std::array<Eigen::Matrix3d, 3> partial;
      if (e.kind == EulerKind::Intrinsic) {
        partial = {m0, m0 * m1, m0 * m1 * m2};
      } else {
        partial = {m0, m1 * m0, m2 * m1 * m0};
      }
      for (std::size_t k = 0; k < 3; ++k) {
        EXPECT_TRUE(test::MatrixNear(s.steps[k].after.matrix(), partial[k], 1e-12))
            << e.name() << " step " << k;
        if (k > 0) {
          EXPECT_TRUE(test::RotationNear(s.steps[k].before, s.steps[k - 1].after, 1e-15));
        }
        // The turn's axis: the body's current axis (intrinsic) or the world's (extrinsic),
        // the same line written in both frames.
        EXPECT_TRUE(
            test::MatrixNear(s.steps[k].before.apply(s.steps[k].axis_body), s.steps[k].axis_world, 1e-12));
        const Eigen::Vector3d e_k = axis_vector(e.axes[k]);
        EXPECT_TRUE(test::MatrixNear(
            e.kind == EulerKind::Intrinsic ? s.steps[k].axis_body : s.steps[k].axis_world, e_k, 0.0));
      }
      EXPECT_TRUE(test::RotationNear(s.steps[2].after, from_euler(e, a), 1e-12))
          << e.name() << " seed " << kSeed;
    }
  }
}

TEST(StepsTest, OtherKindReachesTheSamePose) {
  // Intrinsic i-j-k (a, b, c) = extrinsic k-j-i (c, b, a): R_i(a) R_j(b) R_k(c) read right
  // to left (design.md, "Math conventions"; common practice).
  std::mt19937 rng(kSeed);
  std::uniform_real_distribution<double> angle(-M_PI, M_PI);
  const HouseConvention c;
  for (const EulerConvention& e : all_euler_conventions()) {
    const Eigen::Vector3d a(angle(rng), angle(rng), angle(rng));
    const auto other = equivalent_other_kind(e, a);
    EXPECT_NE(other.first.kind, e.kind);
    EXPECT_TRUE(test::RotationNear(from_euler(other.first, other.second), from_euler(e, a), 1e-12))
        << e.name();
    EXPECT_TRUE(
        test::RotationNear(euler_steps_for(other.first, other.second, with_other_kind(c)).steps[2].after,
                           from_euler(e, a), 1e-12));
    const auto back = equivalent_other_kind(other.first, other.second);
    EXPECT_EQ(back.first, e);
  }
  const HouseConvention o = with_other_kind(c);
  EXPECT_EQ(o.euler.names, (std::array<std::string, 3>{"roll", "pitch", "yaw"}));
  EXPECT_EQ(o.euler.print_order, (std::array<int, 3>{2, 1, 0}));
}

}  // namespace
}  // namespace attiscope
