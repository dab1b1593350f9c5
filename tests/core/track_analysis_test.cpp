// Tests of track_analysis.hpp: generated tracks with known injected faults; the diagnosis
// must find each at the right sample and nothing else.
//
// The expected samples are derived from the generating motion (the angle functions of
// time), not from the diagnosis: where the generated yaw crosses an odd multiple of 180
// degrees, where the generated pitch passes 90, where a fault was injected.
#include "attiscope/core/track_analysis.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <sstream>
#include <vector>

#include "support/check.hpp"
#include "support/track_gen.hpp"

namespace attiscope {
namespace {

using test::kDegToRad;

EulerConvention Convention(const char* seq, EulerKind kind = EulerKind::Intrinsic) {
  return parse_euler_sequence(seq, kind).value();
}

struct Expected_ {
  std::size_t sample;
  TrackEventKind kind;
};

std::string Describe(const std::vector<TrackEvent>& events) {
  std::ostringstream s;
  for (const TrackEvent& e : events) {
    s << "  " << e.sample << " " << track_event_kind_name(e.kind) << " (channel " << e.channel << ", count "
      << e.count << ", value " << e.value << ")\n";
  }
  return s.str();
}

// The events must be exactly `expected` (sample and kind), in order.
::testing::AssertionResult EventsAre(const std::vector<TrackEvent>& events, std::vector<Expected_> expected) {
  std::sort(expected.begin(), expected.end(), [](const Expected_& a, const Expected_& b) {
    return a.sample != b.sample ? a.sample < b.sample : static_cast<int>(a.kind) < static_cast<int>(b.kind);
  });
  bool same = events.size() == expected.size();
  for (std::size_t i = 0; same && i < events.size(); ++i) {
    same = events[i].sample == expected[i].sample && events[i].kind == expected[i].kind;
  }
  if (same) return ::testing::AssertionSuccess();
  std::ostringstream s;
  s << "found:\n" << Describe(events) << "expected:\n";
  for (const Expected_& e : expected) s << "  " << e.sample << " " << track_event_kind_name(e.kind) << "\n";
  return ::testing::AssertionFailure() << s.str();
}

// Samples where a generated angle (degrees, unwrapped) crosses an odd multiple of 180: the
// first sample after each crossing. Derived from the generator, not from the diagnosis.
std::vector<std::size_t> CrossingsOf180(const std::function<double(double)>& angle_deg, const Track& t) {
  std::vector<std::size_t> out;
  for (std::size_t i = 1; i < t.size(); ++i) {
    const double a = std::floor((angle_deg(t.time_s[i - 1]) + 180.0) / 360.0);
    const double b = std::floor((angle_deg(t.time_s[i]) + 180.0) / 360.0);
    if (a != b) out.push_back(i);
  }
  return out;
}

// A rover on gentle ground: yaw swinging +/-60 degrees, small pitch and roll.
Track GentleRover(std::size_t n) {
  return test::TrackFromEuler(Convention("ZYX"), n, 0.01, [](double t) {
    return Eigen::Vector3d(60.0 * std::sin(0.2 * t), 8.0 * std::sin(0.7 * t + 0.3), 5.0 * std::sin(1.1 * t));
  });
}

TEST(TrackAnalysisTest, SmoothTrackHasNoEventsAndTheRightSummary) {
  const Track t = GentleRover(3000);
  TrackDiagnosisOptions o;
  o.euler = Convention("ZYX");
  o.rate_limit_rad_s = 200.0 * kDegToRad;
  const TrackDiagnosis d = diagnose_track(t, o);
  EXPECT_TRUE(EventsAre(d.events, {}));
  EXPECT_EQ(d.summary.samples, 3000u);
  ASSERT_TRUE(d.summary.duration_s);
  EXPECT_NEAR(*d.summary.duration_s, 29.99, 1e-9);
  ASSERT_TRUE(d.summary.rate_hz);
  EXPECT_NEAR(*d.summary.rate_hz, 100.0, 1e-6);
  EXPECT_TRUE(d.summary.near_lock_spans.empty());
  // Pitch stays within 8 degrees: the lock margin in ZYX stays above 82 degrees.
  EXPECT_GT(d.summary.min_lock_margin_rad, 81.9 * kDegToRad);
}

TEST(TrackAnalysisTest, SignFlipsFoundAtInjectedSamples) {
  Track t = GentleRover(2000);
  test::ScaleSamples(&t, 500, t.size(), -1.0);  // from 500 on: one flip at 500
  test::ScaleSamples(&t, 1200, 1300, -1.0);     // back and forth: flips at 1200 and 1300
  test::ScaleSamples(&t, 1700, 1701, -1.0);     // one sample: flips at 1700 and 1701
  TrackDiagnosisOptions o;
  const TrackDiagnosis d = diagnose_track(t, o);
  EXPECT_TRUE(EventsAre(d.events, {{500, TrackEventKind::SignFlip},
                                   {1200, TrackEventKind::SignFlip},
                                   {1300, TrackEventKind::SignFlip},
                                   {1700, TrackEventKind::SignFlip},
                                   {1701, TrackEventKind::SignFlip}}));
  for (const TrackEvent& e : d.events) EXPECT_NEAR(e.value, -1.0, 1e-3) << "sample " << e.sample;
}

TEST(TrackAnalysisTest, WrapsFoundWhereTheGeneratedYawCrosses180) {
  auto yaw = [](double t) { return 31.1 + 25.0 * t; };  // crosses 180 at t = 5.956, 540 at 20.356
  const Track t = test::TrackFromEuler(Convention("ZYX"), 3000, 0.01, [&](double time) {
    return Eigen::Vector3d(yaw(time), 4.0 * std::sin(time), 3.0 * std::cos(0.5 * time));
  });
  const std::vector<std::size_t> crossings = CrossingsOf180(yaw, t);
  ASSERT_EQ(crossings.size(), 2u);
  EXPECT_EQ(crossings[0], 596u);  // 31.1 + 25 * 5.96 = 180.1: the first sample past 180
  std::vector<Expected_> expected;
  for (std::size_t i : crossings) expected.push_back({i, TrackEventKind::Wrap});

  TrackDiagnosisOptions o;
  o.euler = Convention("ZYX");
  const TrackDiagnosis d = diagnose_track(t, o);
  ASSERT_TRUE(EventsAre(d.events, expected));
  for (const TrackEvent& e : d.events) {
    EXPECT_EQ(e.channel, 0);
    EXPECT_NEAR(e.value, -2.0 * M_PI, 0.01);  // +180 -> -180: the display dropped a turn
  }

  // Extrinsic XYZ lists the same turns in the opposite order (design.md: intrinsic (a, b, c)
  // about (i, j, k) is extrinsic (c, b, a) about (k, j, i)): the yaw is its third angle.
  o.euler = Convention("XYZ", EulerKind::Extrinsic);
  const TrackDiagnosis dx = diagnose_track(t, o);
  ASSERT_TRUE(EventsAre(dx.events, expected));
  for (const TrackEvent& e : dx.events) EXPECT_EQ(e.channel, 2);
}

// Pose R = R_z(30) R_y(theta) R_x(10) with theta rising through 90 degrees: past the pole,
// intrinsic ZYX reads pitch 180 - theta, yaw 30 - 180 and roll 10 - 180, so yaw and roll
// jump by 180 degrees at the first sample past the pole while the body turns smoothly.
TEST(TrackAnalysisTest, LockPassageFoundOnceWithItsSpan) {
  auto theta = [](double t) { return 40.0 + 7.0 * t; };  // 90 at t = 7.142857...
  const Track t = test::TrackFromEuler(Convention("ZYX"), 2000, 0.01,
                                       [&](double time) { return Eigen::Vector3d(30.0, theta(time), 10.0); });
  std::size_t past_pole = 0;
  while (theta(t.time_s[past_pole]) <= 90.0) ++past_pole;
  EXPECT_EQ(past_pole, 715u);

  TrackDiagnosisOptions o;
  o.euler = Convention("ZYX");
  o.rate_limit_rad_s = 20.0 * kDegToRad;  // the body turns at 7 deg/s: no fast motion
  const TrackDiagnosis d = diagnose_track(t, o);
  ASSERT_TRUE(EventsAre(d.events, {{past_pole, TrackEventKind::NearLock}}));
  // The span: samples whose margin |90 - theta| is below 5 degrees.
  ASSERT_EQ(d.summary.near_lock_spans.size(), 1u);
  const NearLockSpan& span = d.summary.near_lock_spans[0];
  std::size_t first = 0, last = 0;
  for (std::size_t i = 0; i < t.size(); ++i) {
    if (std::abs(90.0 - theta(t.time_s[i])) < 5.0) {
      if (first == 0) first = i;
      last = i;
    }
  }
  EXPECT_EQ(span.first, first);
  EXPECT_EQ(span.last, last);
  EXPECT_EQ(span.min_sample, past_pole - 1);  // theta 89.98 at 714, 90.05 at 715
  EXPECT_NEAR(span.min_margin_rad, 0.02 * kDegToRad, 1e-6);
  EXPECT_NEAR(d.summary.max_rate_rad_s, 7.0 * kDegToRad, 1e-9);

  // In intrinsic XYZ the same motion is nowhere near lock: no events, no spans.
  o.euler = Convention("XYZ");
  const TrackDiagnosis dx = diagnose_track(t, o);
  EXPECT_TRUE(dx.summary.near_lock_spans.empty());
  for (const TrackEvent& e : dx.events) EXPECT_NE(e.kind, TrackEventKind::NearLock);
}

TEST(TrackAnalysisTest, NonUnitSamplesFoundAsRuns) {
  Track t = GentleRover(1500);
  test::ScaleSamples(&t, 700, 701, 1.02);
  test::ScaleSamples(&t, 900, 903, 0.97);
  test::ScaleSamples(&t, 1100, 1101, 1.0 + 1e-4);  // within the default tolerance: unit
  TrackDiagnosisOptions o;
  const TrackDiagnosis d = diagnose_track(t, o);
  ASSERT_TRUE(EventsAre(d.events, {{700, TrackEventKind::NonUnit}, {900, TrackEventKind::NonUnit}}));
  EXPECT_EQ(d.events[0].count, 1u);
  EXPECT_NEAR(d.events[0].value, 1.02, 1e-12);
  EXPECT_EQ(d.events[1].count, 3u);
  EXPECT_NEAR(d.events[1].value, 0.97, 1e-12);

  o.unit_tolerance = 1e-5;  // a stricter tolerance finds the small one too
  const TrackDiagnosis strict = diagnose_track(t, o);
  EXPECT_TRUE(EventsAre(
      strict.events,
      {{700, TrackEventKind::NonUnit}, {900, TrackEventKind::NonUnit}, {1100, TrackEventKind::NonUnit}}));
}

TEST(TrackAnalysisTest, TimeFaultsFound) {
  Track t = GentleRover(1500);
  t.time_s[400] = t.time_s[399];          // repeated
  t.time_s[800] = t.time_s[799] - 0.003;  // backwards
  t.time_s[1200] = t.time_s[1199];        // repeated twice in a row
  t.time_s[1201] = t.time_s[1199];
  TrackDiagnosisOptions o;
  o.rate_limit_rad_s = 200.0 * kDegToRad;
  const TrackDiagnosis d = diagnose_track(t, o);
  EXPECT_TRUE(EventsAre(d.events, {{400, TrackEventKind::TimeRepeat},
                                   {800, TrackEventKind::TimeBackwards},
                                   {1200, TrackEventKind::TimeRepeat},
                                   {1201, TrackEventKind::TimeRepeat}}));

  // Without a time column the times are sample indices: no time faults are possible.
  t.has_time = false;
  for (std::size_t i = 0; i < t.size(); ++i) t.time_s[i] = static_cast<double>(i);
  EXPECT_TRUE(EventsAre(diagnose_track(t, o).events, {}));
  EXPECT_FALSE(diagnose_track(t, o).summary.duration_s);
}

TEST(TrackAnalysisTest, FastMotionFoundAsOneRunWithItsPeak) {
  // Yaw at 5 deg/s, and 300 deg/s over the 50 steps into samples 1000..1049.
  const double dt = 0.01;
  std::vector<double> yaw(1500);
  yaw[0] = -100.0;
  for (std::size_t i = 1; i < yaw.size(); ++i)
    yaw[i] = yaw[i - 1] + ((i >= 1000 && i < 1050) ? 300.0 : 5.0) * dt;
  const Track t = test::TrackFromEuler(Convention("ZYX"), yaw.size(), dt, [&](double time) {
    return Eigen::Vector3d(yaw[static_cast<std::size_t>(std::lround(time / dt))], 2.0, 1.0);
  });
  TrackDiagnosisOptions o;
  o.rate_limit_rad_s = 100.0 * kDegToRad;
  const TrackDiagnosis d = diagnose_track(t, o);
  ASSERT_TRUE(EventsAre(d.events, {{1000, TrackEventKind::FastMotion}}));
  EXPECT_EQ(d.events[0].count, 50u);
  // A yaw turn about the world vertical at fixed pitch and roll is a rotation at the yaw rate.
  EXPECT_NEAR(d.events[0].value, 300.0 * kDegToRad, 1e-9);
  EXPECT_EQ(d.summary.counts[static_cast<int>(TrackEventKind::FastMotion)], 1u);

  o.rate_limit_rad_s.reset();  // no limit given: no fast_motion events
  EXPECT_TRUE(EventsAre(diagnose_track(t, o).events, {}));
}

// Everything at once, at separated samples, in a survey-aircraft-like motion: two yaw
// wraps, a pass over the pole, a sign flip, a non-unit sample and two time faults.
TEST(TrackAnalysisTest, AllFaultsTogetherEachFoundAndNothingElse) {
  auto yaw = [](double t) { return 100.3 + 20.0 * std::min(t, 26.0); };      // wraps at t = 3.985, 21.985
  auto theta = [](double t) { return t < 20.0 ? 0.0 : 10.0 * (t - 20.0); };  // pole at t = 29
  Track t = test::TrackFromEuler(Convention("ZYX"), 2000, 0.02,
                                 [&](double time) { return Eigen::Vector3d(yaw(time), theta(time), 10.0); });
  // Wrap samples of the generated yaw, all before the pitch gets near the pole.
  std::vector<std::size_t> wraps = CrossingsOf180(yaw, t);
  ASSERT_EQ(wraps.size(), 2u);
  std::size_t past_pole = 0;
  while (theta(t.time_s[past_pole]) <= 90.0) ++past_pole;

  test::ScaleSamples(&t, 300, t.size(), -1.0);
  test::ScaleSamples(&t, 1700, 1701, 1.01);
  t.time_s[600] = t.time_s[599];
  t.time_s[1150] = t.time_s[1149] - 0.01;

  TrackDiagnosisOptions o;
  o.euler = Convention("321");
  o.rate_limit_rad_s = 100.0 * kDegToRad;
  for (unsigned threads : {1u, 2u}) {
    o.threads = threads;
    const TrackDiagnosis d = diagnose_track(t, o);
    EXPECT_TRUE(EventsAre(d.events, {{wraps[0], TrackEventKind::Wrap},
                                     {wraps[1], TrackEventKind::Wrap},
                                     {past_pole, TrackEventKind::NearLock},
                                     {300, TrackEventKind::SignFlip},
                                     {1700, TrackEventKind::NonUnit},
                                     {600, TrackEventKind::TimeRepeat},
                                     {1150, TrackEventKind::TimeBackwards}}))
        << "threads " << threads;
  }
}

// The diagnosis cuts a long track into blocks and threads; runs and spans that cross a
// block boundary (32768 samples) must come out whole.
TEST(TrackAnalysisTest, RunsAcrossBlockBoundariesStayWhole) {
  Track t = test::RandomWalkTrack(100000, 100.0, test::kSeed, 0.3);
  test::ScaleSamples(&t, 32760, 32780, 1.05);
  TrackDiagnosisOptions o;
  o.unit_tolerance = 1e-3;
  const TrackDiagnosis d = diagnose_track(t, o);
  std::size_t runs = 0;
  for (const TrackEvent& e : d.events) {
    if (e.kind != TrackEventKind::NonUnit) continue;
    ++runs;
    EXPECT_EQ(e.sample, 32760u) << "seed " << test::kSeed;
    EXPECT_EQ(e.count, 20u) << "seed " << test::kSeed;
  }
  EXPECT_EQ(runs, 1u) << "seed " << test::kSeed;
}

TEST(TrackAnalysisTest, StepAngleAccurateForTinyAndHalfTurnSteps) {
  // 2 atan2(|v|, |w|) of the relative quaternion keeps full relative precision at tiny
  // angles, where acos(a . b) would return 0 (common practice in attitude software).
  for (double angle : {1e-12, 1e-8, 1e-3, 1.0, M_PI - 1e-9}) {
    const Eigen::Quaterniond a(Eigen::AngleAxisd(0.3, Eigen::Vector3d(1, 2, 3).normalized()));
    const Eigen::Quaterniond b =
        a * Eigen::Quaterniond(Eigen::AngleAxisd(angle, Eigen::Vector3d(0, 1, 1).normalized()));
    const double got =
        quaternion_step_angle(a.w(), a.x(), a.y(), a.z(), -2.0 * b.w(), -2.0 * b.x(), -2.0 * b.y(),
                              -2.0 * b.z());  // any norm, any sign
    EXPECT_NEAR(got, angle, 1e-15 + 1e-12 * angle) << "angle " << angle;
  }
}

TEST(TrackAnalysisTest, AngularRateOfAConstantTurn) {
  std::mt19937 rng(test::kSeed);
  const Eigen::Vector3d axis = test::RandomRotation(rng).apply(Eigen::Vector3d::UnitX());
  const double omega = 0.7;  // rad/s
  Track t;
  t.has_time = true;
  for (int i = 0; i < 200; ++i) {
    const double time = 0.013 * i;
    test::PushSample(&t, time, Eigen::Quaterniond(Eigen::AngleAxisd(omega * time, axis)));
  }
  const std::vector<double> rate = angular_rate(t);
  ASSERT_EQ(rate.size(), t.size());
  for (std::size_t i = 0; i < rate.size(); ++i)
    EXPECT_NEAR(rate[i], omega, 1e-9) << "sample " << i << " seed " << test::kSeed;
}

}  // namespace
}  // namespace attiscope
