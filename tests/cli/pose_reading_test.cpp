// pose_reading_test.cpp: every command reads a person's text the same way (core's
// read_pose_text): a house convention changes bare numbers identically in convert, compare
// and mount; an ambiguous text gets the same top reading and warning everywhere; --as wins.
#include <unistd.h>
#include <Eigen/Geometry>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "attiscope/core/rotation.hpp"
#include "cli/cli.hpp"
#include "support/check.hpp"
#include "support/cli_run.hpp"

namespace attiscope::cli {
namespace {

using test::CliRun;
using test::run_cli;

// An invented house: ZYX intrinsic yaw-pitch-roll printed as roll, pitch, yaw, in degrees,
// quaternions written x y z w. Frames stay ENU/FLU so the poses need no frame change.
std::string house_file() {
  const std::string path = (std::filesystem::temp_directory_path() /
                            ("attiscope_pose_reading_" + std::to_string(::getpid()) + ".toml"))
                               .string();
  std::ofstream(path) << "name = \"Test house (invented)\"\n"
                         "[euler]\nsequence = \"ZYX\"\nkind = \"intrinsic\"\n"
                         "names = [\"yaw\", \"pitch\", \"roll\"]\n"
                         "print_order = [\"roll\", \"pitch\", \"yaw\"]\nunit = \"degrees\"\n"
                         "[quaternion]\nlayout = \"xyzw\"\n";
  return path;
}

Rotation quat_of(const nlohmann::json& q) {
  return Rotation(Eigen::Quaterniond(q["w"].get<double>(), q["x"].get<double>(), q["y"].get<double>(),
                                     q["z"].get<double>()));
}

std::string xyzw_text(const Rotation& r) {
  const Eigen::Quaterniond q = r.quaternion();
  char buf[160];
  std::snprintf(buf, sizeof buf, "%.17g %.17g %.17g %.17g", q.x(), q.y(), q.z(), q.w());
  return buf;
}

double deg(double d) {
  return d * M_PI / 180.0;
}

// Intrinsic ZYX yaw, pitch, roll: R = Rz(yaw) Ry(pitch) Rx(roll) (common practice; the same
// as python3-scipy Rotation.from_euler("ZYX", [yaw, pitch, roll], degrees=True)).
Rotation yaw_pitch_roll(double yaw, double pitch, double roll) {
  const Eigen::Quaterniond q = Eigen::AngleAxisd(deg(yaw), Eigen::Vector3d::UnitZ()) *
                               Eigen::AngleAxisd(deg(pitch), Eigen::Vector3d::UnitY()) *
                               Eigen::AngleAxisd(deg(roll), Eigen::Vector3d::UnitX());
  return Rotation(q);
}

constexpr double kSame = 1e-9;

bool has_warning(const nlohmann::json& warnings, const std::string& text) {
  for (const auto& w : warnings) {
    if (w.get<std::string>() == text) return true;
  }
  return false;
}

TEST(PoseReadingTest, HouseConventionReadsBareNumbersTheSameInEveryCommand) {
  const std::string house = house_file();
  // Printed roll, pitch, yaw = 30, 10, 5: yaw 5, pitch 10, roll 30.
  const Rotation expected = yaw_pitch_roll(5, 10, 30);
  const std::string same_as_xyzw = xyzw_text(expected);  // the house writes x y z w

  const CliRun convert = run_cli({"convert", "--json", "--convention", house, "30 10 5"});
  ASSERT_EQ(convert.code, kExitOk) << convert.err;
  EXPECT_TRUE(test::RotationNear(quat_of(convert.json()["quaternion"]), expected, kSame)) << convert.out;

  const CliRun compare = run_cli({"compare", "--json", "--convention", house, "30 10 5", same_as_xyzw});
  ASSERT_EQ(compare.code, kExitOk) << compare.err;
  EXPECT_TRUE(test::RotationNear(quat_of(compare.json()["reference"]["quaternion"]), expected, kSame));
  EXPECT_NEAR(compare.json()["angle_deg"].get<double>(), 0.0, 1e-7);

  const CliRun mount = run_cli({"mount", "--json", "--convention", house, "--nominal", "30 10 5",
                                "--measured", same_as_xyzw, "--tolerance", "0.01"});
  ASSERT_EQ(mount.code, kExitOk) << mount.err << mount.out;
  EXPECT_TRUE(test::RotationNear(quat_of(mount.json()["nominal"]["quaternion"]), expected, kSame));
  EXPECT_NEAR(mount.json()["error_deg"].get<double>(), 0.0, 1e-7);

  // Without the house the same numbers are not read as printed roll, pitch, yaw.
  const CliRun plain = run_cli({"convert", "--json", "30 10 5"});
  ASSERT_EQ(plain.code, kExitOk) << plain.err;
  EXPECT_FALSE(test::RotationNear(quat_of(plain.json()["quaternion"]), expected, deg(1)));
  std::filesystem::remove(house);
}

TEST(PoseReadingTest, AmbiguousTextHasTheSameTopReadingAndWarningInEveryCommand) {
  // Four unlabelled numbers: w x y z or x y z w (the text does not say).
  const std::string text = "0.9238795325112867 0 0 0.3826834323650898";
  const CliRun convert = run_cli({"convert", "--json", text});
  ASSERT_EQ(convert.code, kExitOk) << convert.err;
  std::string warning;
  const nlohmann::json convert_json = convert.json();
  for (const auto& w : convert_json["warnings"]) {
    if (w.get<std::string>().rfind("ambiguous: ", 0) == 0) warning = w.get<std::string>();
  }
  ASSERT_FALSE(warning.empty()) << convert.out;
  const Rotation top = quat_of(convert.json()["quaternion"]);

  const CliRun read = run_cli({"read", "--json"}, text);
  ASSERT_EQ(read.code, kExitOk) << read.err;
  EXPECT_EQ(read.json()["ambiguous"], true);
  EXPECT_TRUE(test::RotationNear(quat_of(read.json()["readings"][0]["quaternion"]), top, kSame));

  const CliRun compare = run_cli({"compare", "--json", text, text});
  ASSERT_EQ(compare.code, kExitOk) << compare.err;
  EXPECT_TRUE(test::RotationNear(quat_of(compare.json()["reference"]["quaternion"]), top, kSame));
  EXPECT_TRUE(has_warning(compare.json()["warnings"], "A (reference): " + warning)) << compare.out;

  const CliRun mount =
      run_cli({"mount", "--json", "--nominal", text, "--measured", text, "--tolerance", "1"});
  ASSERT_EQ(mount.code, kExitOk) << mount.err;
  EXPECT_TRUE(test::RotationNear(quat_of(mount.json()["nominal"]["quaternion"]), top, kSame));
  EXPECT_TRUE(has_warning(mount.json()["warnings"], "nominal: " + warning)) << mount.out;
}

TEST(PoseReadingTest, AsAlwaysWins) {
  const std::string house = house_file();
  // 45 degrees about z written w x y z (common practice: w = cos 22.5, z = sin 22.5); the
  // house's own layout (x y z w) would read it as about 135 degrees about x.
  const std::string text = "0.9238795325112867 0 0 0.3826834323650898";
  const Rotation about_z(Eigen::Quaterniond(Eigen::AngleAxisd(M_PI / 4, Eigen::Vector3d::UnitZ())));
  for (bool with_house : {false, true}) {
    std::vector<std::string> extra = {"--as", "quat-wxyz"};
    if (with_house) extra.insert(extra.end(), {"--convention", house});
    auto with = [&](std::vector<std::string> a) {
      a.insert(a.end(), extra.begin(), extra.end());
      return run_cli(a);
    };
    const CliRun convert = with({"convert", "--json", text});
    ASSERT_EQ(convert.code, kExitOk) << convert.err;
    const nlohmann::json converted = convert.json();
    EXPECT_TRUE(test::RotationNear(quat_of(converted["quaternion"]), about_z, kSame));
    for (const auto& w : converted["warnings"])
      EXPECT_EQ(w.get<std::string>().find("ambiguous"), std::string::npos);
    const CliRun compare = with({"compare", "--json", text, text});
    ASSERT_EQ(compare.code, kExitOk) << compare.err;
    EXPECT_TRUE(test::RotationNear(quat_of(compare.json()["reference"]["quaternion"]), about_z, kSame));
    const CliRun mount = with({"mount", "--json", "--nominal", text, "--measured", text, "--tolerance", "1"});
    ASSERT_EQ(mount.code, kExitOk) << mount.err;
    EXPECT_TRUE(test::RotationNear(quat_of(mount.json()["nominal"]["quaternion"]), about_z, kSame));
  }
  std::filesystem::remove(house);
}

TEST(PoseReadingTest, ReadAppliesTheHousePreferences) {
  const std::string house = house_file();
  // Four unlabelled numbers: the house's quaternion layout (x y z w) breaks the tie.
  const std::string text = "0.5 -0.5 0.5 0.5";
  const CliRun plain = run_cli({"read", "--json"}, text);
  ASSERT_EQ(plain.code, kExitOk) << plain.err;
  EXPECT_EQ(plain.json()["readings"][0]["layout"], "wxyz");
  const CliRun housed = run_cli({"read", "--json", "--convention", house}, text);
  ASSERT_EQ(housed.code, kExitOk) << housed.err;
  EXPECT_EQ(housed.json()["readings"][0]["layout"], "xyzw");
  EXPECT_GT(housed.json()["readings"].size(), 1u);  // every reading is still listed
  std::filesystem::remove(house);
}

}  // namespace
}  // namespace attiscope::cli
