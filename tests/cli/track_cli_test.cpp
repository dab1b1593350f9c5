// Tests of `attiscope track`: a log file with malformed rows in the middle is counted and
// named and the rest loads; the JSON carries the design's keys and the events the generated
// motion implies; the exported clean copy re-reads (through the intake's reader) to the same
// rotations with no sign flips; the invented demo logs give the events their README lists.
#include <gtest/gtest.h>

#include <unistd.h>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "attiscope/core/columns.hpp"
#include "attiscope/core/track_analysis.hpp"
#include "support/check.hpp"
#include "support/cli_run.hpp"
#include "support/scratch_dir.hpp"
#include "support/track_gen.hpp"

namespace attiscope {
namespace {

namespace fs = std::filesystem;

test::CliRun RunTrack(const std::vector<std::string>& args) {
  std::vector<std::string> full = {"track"};
  full.insert(full.end(), args.begin(), args.end());
  return test::run_cli(full);
}

// A scratch directory per test, removed afterwards.
class TrackCliTest : public test::ScratchDirTest {
 protected:
  TrackCliTest() : ScratchDirTest("attiscope_track_cli_") {}
};

// Writes t as "t,qw,qx,qy,qz" rows; `extra` lines are inserted after the given sample
// index. Returns the 1-based file line of each inserted line.
std::vector<std::size_t> WriteCsv(const std::string& path, const Track& t,
                                  const std::vector<std::pair<std::size_t, std::string>>& extra = {}) {
  std::ofstream f(path);
  f << "t,qw,qx,qy,qz\n";
  std::size_t line = 1;
  std::vector<std::size_t> lines;
  for (std::size_t i = 0; i < t.size(); ++i) {
    f << test::FullPrecision(t.time_s[i]) << ',' << test::FullPrecision(t.qw[i]) << ','
      << test::FullPrecision(t.qx[i]) << ',' << test::FullPrecision(t.qy[i]) << ','
      << test::FullPrecision(t.qz[i]) << '\n';
    ++line;
    for (const auto& [after, text] : extra) {
      if (after == i) {
        f << text << '\n';
        lines.push_back(++line);
      }
    }
  }
  return lines;
}

Track Rover(std::size_t n) {
  return test::TrackFromEuler(EulerConvention{}, n, 0.02, [](double t) {
    return Eigen::Vector3d(100.3 + 3.0 * t, 3.0 * std::sin(0.8 * t), 2.0 * std::sin(1.3 * t));
  });
}

TEST_F(TrackCliTest, MalformedRowsInTheMiddleAreCountedAndNamedAndTheRestLoads) {
  const Track t = Rover(1000);  // yaw 100.3 -> 160.24: no wrap
  const std::vector<std::size_t> bad = WriteCsv(Path("log.csv"), t,
                                                {{100, "2.01,0.5,0.5"},     // too few fields
                                                 {500, "10.01,abc,0,0,1"},  // not a number
                                                 {700, "14.01,0,0,0,0"}});  // zero quaternion
  const test::CliRun r = RunTrack({Path("log.csv"), "--json"});
  ASSERT_EQ(r.code, 0) << r.err;
  const nlohmann::json j = nlohmann::json::parse(r.out);
  EXPECT_EQ(j["samples"], 1000);
  ASSERT_EQ(j["bad_rows"].size(), 3u) << j["bad_rows"].dump();
  for (std::size_t k = 0; k < 3; ++k) {
    EXPECT_EQ(j["bad_rows"][k]["line"], bad[k]);
    EXPECT_FALSE(j["bad_rows"][k]["reason"].get<std::string>().empty());
  }
  EXPECT_TRUE(j["events"].empty()) << j["events"].dump();
  EXPECT_NEAR(j["duration_s"].get<double>(), 19.98, 1e-12);
  ASSERT_EQ(j["columns"].size(), 5u);
  EXPECT_EQ(j["reading"], "quat-wxyz");
}

TEST_F(TrackCliTest, EventsFromAFileAtTheGeneratedSamples) {
  Track t = test::TrackFromEuler(EulerConvention{}, 1500, 0.02, [](double time) {
    return Eigen::Vector3d(150.3 + 10.0 * time, 2.0, 1.0);  // 180.1 first at t = 2.98: sample 149
  });
  test::ScaleSamples(&t, 800, t.size(), -1.0);
  test::ScaleSamples(&t, 1200, 1201, 1.05);
  t.time_s[1300] = t.time_s[1299];
  WriteCsv(Path("log.csv"), t, {{400, "oops"}});  // a bad row does not shift sample numbers
  const test::CliRun r = RunTrack({Path("log.csv"), "--json", "--euler", "321", "--rate-limit", "50"});
  ASSERT_EQ(r.code, 0) << r.err;
  const nlohmann::json j = nlohmann::json::parse(r.out);
  std::vector<std::pair<std::size_t, std::string>> got;
  for (const auto& e : j["events"])
    got.emplace_back(e["sample"].get<std::size_t>(), e["kind"].get<std::string>());
  // 150.3 + 10 t crosses 180 at t = 2.97 (sample 149) and 540 at t = 38.97 (sample 1949 >
  // 1499: not in the log).
  const std::vector<std::pair<std::size_t, std::string>> want = {
      {149, "wrap"}, {800, "sign_flip"}, {1200, "non_unit"}, {1300, "time_repeat"}};
  EXPECT_EQ(got, want) << j["events"].dump();
  EXPECT_EQ(j["bad_rows"].size(), 1u);
}

TEST_F(TrackCliTest, ExportedCleanCopyRereadsToTheSameRotationsWithoutSignFlips) {
  Track t = test::RandomWalkTrack(5000, 100.0, test::kSeed, 1.5);
  test::ScaleSamples(&t, 1000, 3000, -1.0);
  test::ScaleSamples(&t, 4000, 4001, 0.95);
  WriteCsv(Path("log.csv"), t);
  for (const std::vector<std::string>& how : {std::vector<std::string>{"--export-as", "quaternion"},
                                              {"--export-as", "quaternion", "--export-layout", "xyzw"},
                                              {"--export-as", "matrix"},
                                              {"--export-as", "matrix", "--export-storage", "columns"}}) {
    std::vector<std::string> args = {Path("log.csv"), "--json", "--export", Path("clean.csv")};
    args.insert(args.end(), how.begin(), how.end());
    const test::CliRun r = RunTrack(args);
    ASSERT_EQ(r.code, 0) << r.err;
    const nlohmann::json j = nlohmann::json::parse(r.out);
    ASSERT_TRUE(j.contains("clean"));
    // Read back with the project's log reader, columns found from the header.
    auto head = read_file_head(Path("clean.csv"));
    ASSERT_TRUE(head.ok());
    auto mapping = find_columns(head.value());
    ASSERT_TRUE(mapping.ok()) << mapping.error().describe();
    auto back = read_track_file(Path("clean.csv"), mapping.value());
    ASSERT_TRUE(back.ok()) << back.error().describe();
    const Track& c = back.value();
    ASSERT_EQ(c.size(), t.size()) << how[1];
    EXPECT_TRUE(c.bad_rows.empty());
    for (std::size_t i = 0; i < t.size(); ++i) {
      ASSERT_EQ(c.time_s[i], t.time_s[i]) << i;
      const Rotation a(Eigen::Quaterniond(t.qw[i], t.qx[i], t.qy[i], t.qz[i]));
      const Rotation b(Eigen::Quaterniond(c.qw[i], c.qx[i], c.qy[i], c.qz[i]));
      ASSERT_TRUE(test::RotationNear(a, b, test::kRoundTrip)) << how[1] << " sample " << i;
    }
    if (how[1] == "quaternion") {
      TrackDiagnosisOptions o;
      for (const TrackEvent& e : diagnose_track(c, o).events) {
        EXPECT_NE(e.kind, TrackEventKind::SignFlip) << "sample " << e.sample;
        EXPECT_NE(e.kind, TrackEventKind::NonUnit) << "sample " << e.sample;
      }
    }
  }
}

TEST_F(TrackCliTest, JsonLinesLogGivesTheSameEventsAndNamesItsBadLines) {
  Track t = Rover(600);
  test::ScaleSamples(&t, 300, t.size(), -1.0);  // a sign flip at sample 300
  std::ofstream f(Path("log.jsonl"));
  for (std::size_t i = 0; i < t.size(); ++i) {
    f << "{\"time_s\": " << test::FullPrecision(t.time_s[i])
      << ", \"q\": {\"w\": " << test::FullPrecision(t.qw[i]) << ", \"x\": " << test::FullPrecision(t.qx[i])
      << ", \"y\": " << test::FullPrecision(t.qy[i]) << ", \"z\": " << test::FullPrecision(t.qz[i])
      << "}, \"mode\": \"auto\"}\n";
    if (i == 100) f << "{\"time_s\": 2.01, \"q\": {\"w\": 1}\n";  // file line 102: cut short
  }
  f.close();
  const test::CliRun r = RunTrack({Path("log.jsonl"), "--json"});
  ASSERT_EQ(r.code, 0) << r.err;
  const nlohmann::json j = nlohmann::json::parse(r.out);
  EXPECT_EQ(j["samples"], 600);
  ASSERT_EQ(j["bad_rows"].size(), 1u) << j["bad_rows"].dump();
  EXPECT_EQ(j["bad_rows"][0]["line"], 102);
  ASSERT_EQ(j["events"].size(), 1u) << j["events"].dump();
  EXPECT_EQ(j["events"][0]["sample"], 300);
  EXPECT_EQ(j["events"][0]["kind"], "sign_flip");
}

TEST_F(TrackCliTest, BadUsageAndMissingFilesExitWith2) {
  EXPECT_EQ(RunTrack({}).code, 2);
  EXPECT_EQ(RunTrack({Path("none.csv")}).code, 2);
  WriteCsv(Path("log.csv"), Rover(100));
  const test::CliRun r = RunTrack({Path("log.csv"), "--rate-limit", "fast"});
  EXPECT_EQ(r.code, 2);
  EXPECT_NE(r.err.find("--rate-limit needs a positive number"), std::string::npos) << r.err;
  EXPECT_EQ(RunTrack({Path("log.csv"), "--export-as", "gibbs", "--export", Path("x.csv")}).code, 2);
  EXPECT_EQ(RunTrack({Path("log.csv"), "--help"}).code, 0);
}

// The invented demo logs (assets/logs/README.md says what they hold).
std::string DemoLog(const char* name) {
  return std::string(ATTISCOPE_SOURCE_DIR) + "/assets/logs/" + name;
}

TEST(TrackDemoLogTest, RoverYardRunGivesTheListedEvents) {
  const test::CliRun r = RunTrack({DemoLog("rover_yard_run.csv"), "--json", "--rate-limit", "90"});
  ASSERT_EQ(r.code, 0) << r.err;
  const nlohmann::json j = nlohmann::json::parse(r.out);
  EXPECT_EQ(j["samples"], 4000);
  ASSERT_EQ(j["bad_rows"].size(), 2u);
  EXPECT_EQ(j["bad_rows"][0]["line"], 1504);
  EXPECT_EQ(j["bad_rows"][1]["line"], 3505);
  std::vector<std::pair<std::size_t, std::string>> got;
  for (const auto& e : j["events"])
    got.emplace_back(e["sample"].get<std::size_t>(), e["kind"].get<std::string>());
  // Derived from the script's motion (scripts/make_demo_logs.py), by hand:
  // - yaw 150.3 + 1.4 t passes 180 at t = 21.214: the first sample after is t = 21.22 (1061);
  // - the kerb, roll 12 sin(pi (t - 30) / 0.2) for 30 <= t < 30.2, turns 12 (sin(pi/5) - 0) =
  //   3.7 deg in the step to 30.02 (185 deg/s), 2.65 deg to 30.06 (132 deg/s) and 1.7 deg to
  //   30.08 (85 deg/s, below the limit): a run from sample 1501 on its rising side, and the
  //   mirror run from 1508 (t = 30.16) on its falling side;
  // - the injected sign flip (2250), non-unit packet (2600) and repeated time stamp (3000).
  const std::vector<std::pair<std::size_t, std::string>> want = {
      {1061, "wrap"},      {1501, "fast_motion"}, {1508, "fast_motion"},
      {2250, "sign_flip"}, {2600, "non_unit"},    {3000, "time_repeat"}};
  EXPECT_EQ(got, want) << j["events"].dump();
}

TEST(TrackDemoLogTest, CameraDollyJsonLinesGivesTheListedEvents) {
  const test::CliRun r = RunTrack({DemoLog("camera_dolly_pan.jsonl"), "--json", "--rate-limit", "60"});
  ASSERT_EQ(r.code, 0) << r.err;
  const nlohmann::json j = nlohmann::json::parse(r.out);
  EXPECT_EQ(j["samples"], 360);
  ASSERT_EQ(j["bad_rows"].size(), 1u);
  EXPECT_EQ(j["bad_rows"][0]["line"], 203);  // comment line, then sample i on line i + 2
  std::vector<std::pair<std::size_t, std::string>> got;
  for (const auto& e : j["events"])
    got.emplace_back(e["sample"].get<std::size_t>(), e["kind"].get<std::string>());
  // Derived from the script's motion (scripts/make_demo_logs.py), by hand:
  // - the joint: roll 4 deg for the one frame at t = 5 s (sample 150), about 120 deg/s up and
  //   down again: one run of two samples from 150 (the pan itself turns under 20 deg/s);
  // - yaw 40 + 200 (t / 12)^1.2 passes 180 at t = 12 * 0.7^(1/1.2) = 8.916 s, first sample
  //   after it 268 (t = 8.933); the pose written from the wrapped yaw flips the sign there.
  const std::vector<std::pair<std::size_t, std::string>> want = {
      {150, "fast_motion"}, {268, "sign_flip"}, {268, "wrap"}};
  EXPECT_EQ(got, want) << j["events"].dump();
}

TEST(TrackDemoLogTest, GimbalSweepIsNearLockInZyxOnly) {
  const test::CliRun r = RunTrack({DemoLog("gimbal_tilt_sweep.csv"), "--json", "--euler", "ZYX"});
  ASSERT_EQ(r.code, 0) << r.err;
  const nlohmann::json j = nlohmann::json::parse(r.out);
  // Scalar-last columns: the fifth column holds w.
  ASSERT_EQ(j["columns"].size(), 5u);
  EXPECT_EQ(j["columns"][4]["name"], "qw");
  EXPECT_EQ(j["columns"][4]["role"], "quaternion w");
  ASSERT_EQ(j["events"].size(), 1u) << j["events"].dump();
  EXPECT_EQ(j["events"][0]["sample"], 1000);  // 60 + 3 t + 0.0015 passes 90 at t = 9.9995
  EXPECT_EQ(j["events"][0]["kind"], "near_lock");
  ASSERT_EQ(j["near_lock_spans"].size(), 1u);
  const test::CliRun x = RunTrack({DemoLog("gimbal_tilt_sweep.csv"), "--json", "--euler", "XYZ"});
  const nlohmann::json jx = nlohmann::json::parse(x.out);
  EXPECT_TRUE(jx["events"].empty()) << jx["events"].dump();
  EXPECT_TRUE(jx["near_lock_spans"].empty());
}

}  // namespace
}  // namespace attiscope
