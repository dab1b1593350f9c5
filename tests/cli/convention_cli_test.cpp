// convention_cli_test.cpp: --convention on the shared options, the "house" object of
// convert --json, `attiscope find` and `attiscope convention`.
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "cli/cli.hpp"
#include "support/check.hpp"
#include "support/cli_run.hpp"

namespace attiscope::cli {
namespace {

using test::CliRun;
using test::run_cli;

std::string asset(const char* file) {
  return std::string(ATTISCOPE_SOURCE_DIR) + "/assets/conventions/" + file;
}
std::string fixture(const char* file) {
  return std::string(ATTISCOPE_SOURCE_DIR) + "/tests/core/fixtures/conventions/" + file;
}

TEST(ConventionCliTest, ConvertAddsTheHouseObject) {
  const auto r = run_cli({"convert", "--json", "--convention", asset("survey-aircraft.toml"), "30 20 10"});
  ASSERT_EQ(r.code, kExitOk) << r.err;
  const auto j = nlohmann::json::parse(r.out);
  // The design's keys are unchanged.
  for (const char* key : {"reading", "quaternion", "matrix", "axis_angle", "rotation_vector_rad", "gibbs",
                          "mrp", "euler", "euler_all", "warnings"}) {
    EXPECT_TRUE(j.contains(key)) << key;
  }
  // The three numbers were read as the house's heading, elevation, bank (intrinsic ZYX):
  // ZYX(30, 20, 10) degrees from references.md (extra check values, a reference script).
  const double expected[3][3] = {{0.813797681349, -0.440969610530, 0.378522306370},
                                 {0.469846310393, 0.882564119259, 0.018028311236},
                                 {-0.342020143326, 0.163175911167, 0.925416578398}};
  for (int i = 0; i < 3; ++i)
    for (int k = 0; k < 3; ++k) EXPECT_NEAR(j["matrix"][i][k].get<double>(), expected[i][k], 1e-11);
  const auto& h = j["house"];
  EXPECT_EQ(h["name"], "Survey aircraft (invented demo)");
  EXPECT_EQ(h["euler"]["names"], nlohmann::json({"heading", "elevation", "bank"}));
  EXPECT_NEAR(h["euler"]["values"][0].get<double>(), 30.0, 1e-9);
  EXPECT_NEAR(h["euler"]["values"][2].get<double>(), 10.0, 1e-9);
  EXPECT_EQ(h["quaternion"]["layout"], "xyzw");
  EXPECT_EQ(h["matrix"]["direction"], "world_to_body");
  // World-to-body row-major: the first three numbers are the first column of R.
  EXPECT_NEAR(h["matrix"]["numbers"][1].get<double>(), expected[1][0], 1e-11);
  EXPECT_EQ(h["steps"][1],
            "Step 2 of 3 \u2014 elevation +20 degrees about the body's right axis: the nose rises");
}

TEST(ConventionCliTest, ConvertTableShowsHouseNamesInPrintOrder) {
  // The rover prints roll, pitch, yaw: "5 -10 60" is roll 5, pitch -10, yaw 60.
  const auto r = run_cli({"convert", "--convention", asset("orchard-rover.toml"), "5 -10 60"});
  ASSERT_EQ(r.code, kExitOk) << r.err;
  EXPECT_NE(r.out.find("house euler          roll 5  pitch -10  yaw 60 deg"), std::string::npos) << r.out;
  // The design's own Euler line still uses --euler (default intrinsic ZYX): yaw 60 first.
  EXPECT_NE(r.out.find("euler intrinsic ZYX            60         -10           5 deg"), std::string::npos)
      << r.out;
}

TEST(ConventionCliTest, BadConventionFileExitsTwoWithLineAndColumn) {
  const auto r = run_cli({"convert", "--convention", fixture("bad-type.toml"), "1 0 0 0"});
  EXPECT_EQ(r.code, kExitBadInput);
  EXPECT_NE(r.err.find("line 3, column 12"), std::string::npos) << r.err;
  const auto w = run_cli({"convert", "--convention", fixture("warn-unknown-keys.toml"), "1 0 0 0"});
  EXPECT_EQ(w.code, kExitOk) << w.err;
  EXPECT_NE(w.err.find("warning"), std::string::npos);
  EXPECT_NE(w.err.find("line 5, column 1: unknown key 'euler.sequnce'"), std::string::npos) << w.err;
}

TEST(ConventionCliTest, FindJsonHasTheDesignKeys) {
  // ZYX (10, 20, 30) degrees as a Hamilton quaternion in x y z w order, from the tool's
  // own convert (the finder must name the layout).
  const auto c = run_cli({"convert", "--json", "--as", "euler", "10 20 30"});
  ASSERT_EQ(c.code, kExitOk);
  const auto q = nlohmann::json::parse(c.out)["quaternion_xyzw"];
  std::ostringstream quat;
  quat.precision(17);
  for (const auto& v : q) quat << v.get<double>() << " ";
  const auto r = run_cli({"find", "--json", "10 20 30", quat.str()});
  ASSERT_EQ(r.code, kExitOk) << r.err;
  const auto j = nlohmann::json::parse(r.out);
  ASSERT_FALSE(j["matches"].empty());
  const auto& m = j["matches"][0];
  for (const char* key :
       {"euler", "unit", "quaternion_layout", "algebra", "direction", "matrix_storage", "residual_deg"}) {
    EXPECT_TRUE(m.contains(key)) << key;
  }
  EXPECT_EQ(m["quaternion_layout"], "xyzw");
  EXPECT_TRUE(m["matrix_storage"].is_null());
  EXPECT_LT(m["residual_deg"].get<double>(), 1e-9);
  bool zyx_found = false;
  for (const auto& x : j["matches"]) {
    if (x["residual_deg"].get<double>() > 1e-9) break;
    if (x["euler"]["sequence"] == "ZYX" && x["euler"]["kind"] == "intrinsic" && x["algebra"] == "hamilton" &&
        x["direction"] == "body_to_world" && x["unit"] == "degrees") {
      zyx_found = true;
    }
  }
  EXPECT_TRUE(zyx_found) << r.out;
}

TEST(ConventionCliTest, FindExitCodes) {
  EXPECT_EQ(run_cli({"find", "1 2", "1 0 0 0"}).code, kExitBadInput);
  EXPECT_EQ(run_cli({"find", "1 2 3"}).code, kExitBadInput);
  const auto bad = run_cli({"find", "1 2 x", "1 0 0 0"});
  EXPECT_EQ(bad.code, kExitBadInput);
  EXPECT_NE(bad.err.find("A: line 1, column 5"), std::string::npos) << bad.err;
  // A rotation of 180 degrees about x never equals the identity: no match, exit 1.
  const auto none = run_cli({"find", "0 0 0", "0 1 0 0", "--within", "0.1"});
  EXPECT_EQ(none.code, kExitCheckFailed) << none.out << none.err;
  EXPECT_NE(none.out.find("no interpretation agrees"), std::string::npos);
}

TEST(ConventionCliTest, FindGravityRanksTheLogLayout) {
  // An invented log: the accelerometer reads +9.81 along the world's up at rest, poses are
  // tilts about x and y written as x y z w quaternions (Hamilton, body-to-world).
  const std::string path = (std::filesystem::temp_directory_path() / "attiscope-gravity-test.txt").string();
  {
    std::ofstream f(path);
    f << "# ax ay az qx qy qz qw (invented demo data)\n";
    const double angles[][2] = {{0.0, 0.0}, {0.5, 0.0}, {0.0, -0.6}, {0.4, 0.3}};
    for (const auto& a : angles) {
      const Rotation r = from_euler(EulerConvention{}, Eigen::Vector3d(0.2, a[1], a[0]));
      const Eigen::Vector3d g = r.inverse().apply(Eigen::Vector3d(0, 0, 9.81));
      const Eigen::Quaterniond q = r.quaternion();
      f.precision(12);
      f << g.x() << " " << g.y() << " " << g.z() << " " << q.x() << " " << q.y() << " " << q.z() << " "
        << q.w() << "\n";
    }
  }
  const auto r = run_cli({"find", "--gravity", path, "--json"});
  std::remove(path.c_str());
  ASSERT_EQ(r.code, kExitOk) << r.err;
  const auto j = nlohmann::json::parse(r.out);
  EXPECT_EQ(j["samples"], 4);
  EXPECT_EQ(j["ranked"][0]["quaternion_layout"], "xyzw");
  EXPECT_LT(j["ranked"][0]["worst_deg"].get<double>(), 1e-6);
}

TEST(ConventionCliTest, ConventionStepsAndFrameChange) {
  const auto s = run_cli({"convention", asset("survey-aircraft.toml"), "--steps", "30 10 5"});
  ASSERT_EQ(s.code, kExitOk) << s.err;
  EXPECT_NE(
      s.out.find("Step 1 of 3 \u2014 heading +30 degrees about the body's down axis: the nose turns right"),
      std::string::npos)
      << s.out;
  EXPECT_NE(s.out.find("the same pose as extrinsic XYZ:"), std::string::npos);
  // references.md T13: NED/FRD (30, 10, 5) is ENU/FLU (60, -10, 5); the rover prints roll,
  // pitch, yaw.
  const auto t = run_cli({"convention", asset("survey-aircraft.toml"), "--to", asset("orchard-rover.toml"),
                          "--pose", "30 10 5", "--json"});
  ASSERT_EQ(t.code, kExitOk) << t.err;
  const auto j = nlohmann::json::parse(t.out);
  const auto v = j["pose_to"]["euler"]["values"];
  EXPECT_NEAR(v[0].get<double>(), 5.0, 1e-9);
  EXPECT_NEAR(v[1].get<double>(), -10.0, 1e-9);
  EXPECT_NEAR(v[2].get<double>(), 60.0, 1e-9);
  EXPECT_EQ(j["frame_change"]["from"], "NED/FRD");
  const auto bad = run_cli({"convention", fixture("bad-left-handed.toml")});
  EXPECT_EQ(bad.code, kExitBadInput);
  EXPECT_NE(bad.err.find("line 4, column 8"), std::string::npos) << bad.err;
}

TEST(ConventionCliTest, ConventionWriteMakesALoadableFile) {
  const std::string path = (std::filesystem::temp_directory_path() / "attiscope-written-house.toml").string();
  std::remove(path.c_str());
  const auto w = run_cli({"convention", asset("camera-rig.toml"), "--write", path});
  ASSERT_EQ(w.code, kExitOk) << w.err;
  const auto again = run_cli({"convention", path, "--json"});
  std::remove(path.c_str());
  ASSERT_EQ(again.code, kExitOk) << again.err;
  EXPECT_EQ(nlohmann::json::parse(again.out)["name"], "Inspection camera rig (invented demo)");
}

}  // namespace
}  // namespace attiscope::cli
