// compare_mount_cli_test.cpp: `attiscope compare` and `attiscope mount`: exit codes, JSON
// keys, and bad input giving code 2 with the place named.
#include <unistd.h>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "attiscope/core/euler.hpp"
#include "cli/cli.hpp"
#include "support/check.hpp"
#include "support/cli_run.hpp"

namespace attiscope::cli {
namespace {

using test::CliRun;
using test::run_cli;

std::string temp_file(const std::string& name, const std::string& text) {
  const std::string path =
      (std::filesystem::temp_directory_path() / ("attiscope_cli_" + std::to_string(::getpid()) + "_" + name))
          .string();
  std::ofstream(path) << text;
  return path;
}

TEST(CompareCliTest, ExitCodesFollowTheTolerance) {
  // 2.5 degrees about z between the two poses.
  const std::vector<std::string> poses = {"--as", "euler", "10 0 0", "12.5 0 0"};
  std::vector<std::string> a = {"compare"};
  a.insert(a.end(), poses.begin(), poses.end());
  EXPECT_EQ(run_cli(a).code, kExitOk);
  auto within = a;
  within.insert(within.end(), {"--tolerance", "3"});
  EXPECT_EQ(run_cli(within).code, kExitOk);
  auto beyond = a;
  beyond.insert(beyond.end(), {"--tolerance", "2"});
  const CliRun r = run_cli(beyond);
  EXPECT_EQ(r.code, kExitCheckFailed);
  EXPECT_NE(r.out.find("BEYOND"), std::string::npos);
}

TEST(CompareCliTest, JsonCarriesBothFramesAndTheEulerNote) {
  const CliRun r = run_cli({"compare", "--json", "--as", "euler", "10 60 0", "20 60 5", "--tolerance", "1",
                            "--body", "FRD", "--path", "3"});
  ASSERT_EQ(r.code, kExitCheckFailed) << r.err;
  const nlohmann::json j = r.json();
  for (const char* key : {"reference", "current", "angle_deg", "body", "world", "euler_difference", "path",
                          "tolerance_deg", "within_tolerance", "warnings"}) {
    EXPECT_TRUE(j.contains(key)) << key;
  }
  // The angle against an independent computation from the two poses.
  const Rotation a = from_euler(EulerConvention{}, Eigen::Vector3d(10, 60, 0) * M_PI / 180);
  const Rotation b = from_euler(EulerConvention{}, Eigen::Vector3d(20, 60, 5) * M_PI / 180);
  EXPECT_NEAR(j["angle_deg"].get<double>(), geodesic_angle(a, b) * 180 / M_PI, 1e-12);
  EXPECT_EQ(j["within_tolerance"], false);
  EXPECT_TRUE(j["euler_difference"]["note"].is_string());
  EXPECT_EQ(j["path"].size(), 3u);
  EXPECT_EQ(j["body"]["named_turns"][1]["name"], "pitch");
  EXPECT_EQ(j["body"]["relation"], "world_R_current = world_R_reference * reference_R_current");
}

TEST(CompareCliTest, BadInputGivesCodeTwoWithThePlace) {
  const CliRun word = run_cli({"compare", "--as", "quat-wxyz", "1 0 0 0", "1 0 zero 0"});
  EXPECT_EQ(word.code, kExitBadInput);
  EXPECT_NE(word.err.find("B (current)"), std::string::npos) << word.err;
  EXPECT_NE(word.err.find("line 1, column 5"), std::string::npos) << word.err;
  EXPECT_EQ(run_cli({"compare", "1 0 0 0"}).code, kExitBadInput);
  EXPECT_EQ(run_cli({"compare", "1 0 0 0", "1 0 0 0", "--tolerance", "-1"}).code, kExitBadInput);
  EXPECT_EQ(run_cli({"compare", "--bogus"}).code, kExitBadInput);
}

TEST(CompareCliTest, MeanOfAFileAndItsErrors) {
  const std::string good =
      temp_file("mean.txt",
                "# repeated readings (invented)\n"
                "1 0 0 0\n"
                "-0.9999619230641713 0 0 -0.008726535498373935\n"  // +1 deg about z, negated
                "0.9999619230641713 0 0 -0.008726535498373935\n");
  const CliRun r = run_cli({"compare", "--mean", good, "--as", "quat-wxyz", "--json", "--tolerance", "1.5"});
  ASSERT_EQ(r.code, kExitOk) << r.err;
  const nlohmann::json j = r.json();
  EXPECT_EQ(j["count"], 3);
  EXPECT_NEAR(j["mean"]["quaternion"]["w"].get<double>(), 1.0, 1e-12);
  EXPECT_NEAR(j["max_deg"].get<double>(), 1.0, 1e-9);
  EXPECT_NEAR(j["rms_deg"].get<double>(), std::sqrt(2.0 / 3.0), 1e-9);
  EXPECT_EQ(j["hemisphere_flips"], 1);
  EXPECT_EQ(j["max_line"].get<int>() == 3 || j["max_line"].get<int>() == 4, true);
  EXPECT_EQ(run_cli({"compare", "--mean", good, "--as", "quat-wxyz", "--tolerance", "0.5"}).code,
            kExitCheckFailed);
  const std::string bad = temp_file("mean_bad.txt", "1 0 0 0\n\n1 0 0 x\n");
  const CliRun b = run_cli({"compare", "--mean", bad, "--as", "quat-wxyz"});
  EXPECT_EQ(b.code, kExitBadInput);
  EXPECT_NE(b.err.find("line 3, column 7"), std::string::npos) << b.err;
  std::filesystem::remove(good);
  std::filesystem::remove(bad);
}

TEST(MountCliTest, NominalAgainstMeasuredExitCodesAndJson) {
  // Nominal "x aft, z down" (FRD) is 180 degrees about z: q = (0, 0, 0, 1). Measured 0.8
  // degrees further about the vehicle's y.
  const double h = 0.4 * M_PI / 180;
  char measured[128];
  // Ry(0.8 deg) (x) Rz(180 deg) = (cos h, 0, sin h, 0) (x) (0, 0, 0, 1) = (0, sin h, 0, cos h):
  std::snprintf(measured, sizeof measured, "%.17g %.17g %.17g %.17g", 0.0, std::sin(h), 0.0, std::cos(h));
  const std::vector<std::string> base = {
      "mount",     "--nominal", "sensor x toward vehicle aft, sensor z down", "--measured", measured, "--as",
      "quat-wxyz", "--json"};
  auto pass = base;
  pass.insert(pass.end(), {"--tolerance", "1"});
  const CliRun p = run_cli(pass);
  ASSERT_EQ(p.code, kExitOk) << p.err;
  const nlohmann::json j = p.json();
  for (const char* key : {"mount", "error_deg", "within_tolerance", "residuals_deg", "unobservable",
                          "warnings", "caution", "verdict", "error_words"}) {
    EXPECT_TRUE(j.contains(key)) << key;
  }
  EXPECT_TRUE(j["mount"]["quaternion"].contains("w"));
  EXPECT_NEAR(j["error_deg"].get<double>(), 0.8, 1e-9);
  EXPECT_EQ(j["within_tolerance"], true);
  EXPECT_TRUE(j["unobservable"].is_null());
  EXPECT_NE(j["caution"].get<std::string>().find("never replaces"), std::string::npos);
  EXPECT_NE(j["error_words"].get<std::string>().find("pitch axis"), std::string::npos) << j["error_words"];
  auto fail = base;
  fail.insert(fail.end(), {"--tolerance", "0.5"});
  const CliRun f = run_cli(fail);
  EXPECT_EQ(f.code, kExitCheckFailed);
  EXPECT_EQ(f.json()["within_tolerance"], false);
  // Plain output carries the caution too.
  const CliRun plain =
      run_cli({"mount", "--nominal", "x aft z down", "--measured", measured, "--as", "quat-wxyz"});
  EXPECT_NE(plain.out.find("never replaces the test procedure's calibrated alignment measurement"),
            std::string::npos);
}

TEST(MountCliTest, SwappedLayoutIsNamed) {
  // A nominal with no symmetry, and the same four numbers written x y z w but read w x y z.
  const CliRun r = run_cli({"mount", "--nominal", "0.9 0.3 0.2 0.1", "--measured", "0.3 0.2 0.1 0.9", "--as",
                            "quat-wxyz", "--json"});
  EXPECT_EQ(r.code, kExitCheckFailed);
  const nlohmann::json j = r.json();
  EXPECT_EQ(j["verdict"], "convention or direction mistake");
  ASSERT_FALSE(j["explanations"].empty());
  EXPECT_EQ(j["explanations"][0]["reading"], "the other quaternion layout (x y z w, scalar last)");
}

TEST(MountCliTest, VectorSolveAndRefusal) {
  // Invented rover: sensor mounted "x aft, z down" (180 degrees about z), three resting
  // gravity readings in different attitudes plus a known forward direction.
  const std::string good = temp_file("vectors.txt",
                                     "# sensor (m/s^2)     vehicle (unit)\n"
                                     "0 0 9.81            0 0 1\n"
                                     "-1.7 0 9.66         0.17364817766693033 0 0.98480775301220802\n"
                                     "-1 0 0              1 0 0  0.5\n");
  const CliRun r = run_cli({"mount", "--vectors", good, "--nominal", "x aft, z down", "--json"});
  ASSERT_EQ(r.code, kExitOk) << r.err << r.out;
  const nlohmann::json j = r.json();
  EXPECT_EQ(j["residuals_deg"].size(), 3u);
  EXPECT_TRUE(j["unobservable"].is_null());
  EXPECT_LT(j["error_deg"].get<double>(), 0.5);
  EXPECT_TRUE(j["solver"]["triad"].is_object());
  // One resting vector: refused, heading named as unobservable.
  const std::string one = temp_file("one.txt", "0 0 9.81  0 0 1\n0 0 9.79  0 0 1\n");
  const CliRun u = run_cli({"mount", "--vectors", one, "--json"});
  EXPECT_EQ(u.code, kExitBadInput);
  EXPECT_TRUE(u.json()["unobservable"].is_string());
  EXPECT_TRUE(u.json()["mount"].is_null());
  EXPECT_NE(u.err.find("lines 1, 2"), std::string::npos) << u.err;
  // A bad vector file: code 2 naming line and column.
  const std::string bad = temp_file("bad.txt", "0 0 1 0 0 1\n1 0 0 0 1 O\n");
  const CliRun b = run_cli({"mount", "--vectors", bad});
  EXPECT_EQ(b.code, kExitBadInput);
  EXPECT_NE(b.err.find("line 2, column 11"), std::string::npos) << b.err;
  for (const std::string& p : {good, one, bad}) std::filesystem::remove(p);
}

TEST(MountCliTest, BadMountTextNamesThePlace) {
  const CliRun words = run_cli({"mount", "--nominal", "x aft, z sideways", "--measured", "1 0 0 0"});
  EXPECT_EQ(words.code, kExitBadInput);
  EXPECT_NE(words.err.find("--nominal: line 1, column 10"), std::string::npos) << words.err;
  const CliRun nums = run_cli({"mount", "--nominal", "1 0 0 0", "--measured", "1 0 0", "--as", "quat-wxyz"});
  EXPECT_EQ(nums.code, kExitBadInput);
  EXPECT_NE(nums.err.find("--measured: line 1"), std::string::npos) << nums.err;
  EXPECT_EQ(run_cli({"mount", "--nominal", "1 0 0 0"}).code, kExitBadInput);
  EXPECT_EQ(run_cli({"mount", "--nominal", "x aft z down", "--measured", "1 0 0 0", "--vehicle", "FRU"}).code,
            kExitBadInput);
}

TEST(MountCliTest, SetupFileSaveAndLoad) {
  const std::string path = (std::filesystem::temp_directory_path() /
                            ("attiscope_cli_" + std::to_string(::getpid()) + "_setup.toml"))
                               .string();
  const CliRun save = run_cli({"mount", "--nominal", "x aft z down", "--trim", "0 0.2 0", "--measured",
                               "0 0 0 1", "--as", "quat-wxyz", "--tolerance", "0.3", "--save", path});
  EXPECT_EQ(save.code, kExitOk) << save.err;
  const CliRun load = run_cli({"mount", "--setup", path, "--json"});
  ASSERT_EQ(load.code, kExitOk) << load.err;
  EXPECT_NEAR(load.json()["error_deg"].get<double>(), 0.2, 1e-9);
  EXPECT_DOUBLE_EQ(load.json()["tolerance_deg"].get<double>(), 0.3);
  std::ofstream(path) << "tolerance_deg = 1\n[nominal]\nquaternion = [1, 0, 0]\n";
  const CliRun bad = run_cli({"mount", "--setup", path});
  EXPECT_EQ(bad.code, kExitBadInput);
  EXPECT_NE(bad.err.find("line 3"), std::string::npos) << bad.err;
  std::filesystem::remove(path);
}

TEST(MountCliTest, ReportsAFrameRelativeToAnother) {
  // An invented camera rig: vehicle -> plate turned 90 degrees about z, plate -> camera
  // entered the other way round (camera_R_plate), 0.2 m along plate x.
  const std::string path = temp_file("rig.toml",
                                     "name = \"camera rig (invented)\"\n"
                                     "[[link]]\nparent = \"vehicle\"\nchild = \"plate\"\n"
                                     "axis_angle_deg = [0, 0, 1, 90]\nlever_arm_m = [1, 0, 0]\n"
                                     "[[link]]\nparent = \"plate\"\nchild = \"camera\"\n"
                                     "axis_angle_deg = [1, 0, 0, -30]\nmaps = \"parent_to_child\"\n");
  const CliRun r = run_cli({"mount", "--setup", path, "--relative", "vehicle camera", "--json"});
  ASSERT_EQ(r.code, kExitOk) << r.err;
  const nlohmann::json j = r.json();
  const Rotation expected =
      elementary_rotation(Axis::Z, M_PI / 2) * elementary_rotation(Axis::X, 30 * M_PI / 180);
  const Rotation got(
      Eigen::Quaterniond(j["quaternion"]["w"].get<double>(), j["quaternion"]["x"].get<double>(),
                         j["quaternion"]["y"].get<double>(), j["quaternion"]["z"].get<double>()));
  EXPECT_TRUE(test::RotationNear(got, expected, 1e-12));
  EXPECT_NEAR(j["translation_m"][0].get<double>(), 1.0, 1e-15);
  const CliRun unknown = run_cli({"mount", "--setup", path, "--relative", "vehicle tripod"});
  EXPECT_EQ(unknown.code, kExitBadInput);
  EXPECT_NE(unknown.err.find("tripod"), std::string::npos);
  std::filesystem::remove(path);
}

TEST(MountCliTest, ListsTheTwentyFourMounts) {
  const CliRun r = run_cli({"mount", "--list-aligned", "--json"});
  ASSERT_EQ(r.code, kExitOk);
  EXPECT_EQ(r.json()["mounts"].size(), 24u);
  EXPECT_EQ(r.json()["vehicle_axes"], "FRD");
}

TEST(MountCliTest, VehicleAxesFollowTheHouseConventionUnlessGiven) {
  const std::string rover = std::string(ATTISCOPE_SOURCE_DIR) + "/assets/conventions/orchard-rover.toml";
  const CliRun house = run_cli({"mount", "--list-aligned", "--json", "--convention", rover});
  ASSERT_EQ(house.code, kExitOk) << house.err;
  EXPECT_EQ(house.json()["vehicle_axes"], "FLU") << "the rover's body frame";
  const CliRun given =
      run_cli({"mount", "--list-aligned", "--json", "--convention", rover, "--vehicle", "FRD"});
  ASSERT_EQ(given.code, kExitOk) << given.err;
  EXPECT_EQ(given.json()["vehicle_axes"], "FRD");
}

}  // namespace
}  // namespace attiscope::cli
