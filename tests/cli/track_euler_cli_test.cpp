// track_euler_cli_test.cpp: `attiscope track` on logs of Euler angles: a roll/pitch/yaw log
// is read (the summary and JSON say the reading and convention), its clean export re-reads
// to the poses computed independently, --as euler --euler forces the reading, and a
// --convention file's own angle names are found.
#include <gtest/gtest.h>

#include <unistd.h>

#include <Eigen/Geometry>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <random>

#include "attiscope/core/columns.hpp"
#include "support/check.hpp"
#include "support/cli_run.hpp"
#include "support/scratch_dir.hpp"
#include "support/track_gen.hpp"

namespace attiscope {
namespace {

namespace fs = std::filesystem;
constexpr double kPi = 3.14159265358979323846;

// A scratch directory per test, removed afterwards.
class TrackEulerCliTest : public test::ScratchDirTest {
 protected:
  TrackEulerCliTest() : ScratchDirTest("attiscope_track_euler_") {}
};

// roll, pitch, yaw in degrees from the fixed seed.
std::vector<Eigen::Vector3d> Angles(std::size_t n) {
  std::mt19937 rng(test::kSeed);
  std::uniform_real_distribution<double> a(-179.0, 179.0), b(-89.0, 89.0);
  std::vector<Eigen::Vector3d> out;
  for (std::size_t i = 0; i < n; ++i) out.emplace_back(a(rng), b(rng), a(rng));
  return out;
}

void WriteLog(const std::string& path, const std::string& header, const std::vector<Eigen::Vector3d>& a) {
  std::ofstream f(path);
  f << header << "\n";
  for (std::size_t i = 0; i < a.size(); ++i)
    f << test::FullPrecision(0.05 * static_cast<double>(i)) << ',' << test::FullPrecision(a[i](0)) << ','
      << test::FullPrecision(a[i](1)) << ',' << test::FullPrecision(a[i](2)) << '\n';
}

// Rz(c) Ry(b) Rx(a) for (roll a, pitch b, yaw c) in degrees: intrinsic ZYX, the common
// aerospace reading (common practice), through Eigen's angle-axis.
Rotation Zyx(const Eigen::Vector3d& rpy_deg) {
  const Eigen::Vector3d r = rpy_deg * kPi / 180.0;
  return Rotation(Eigen::Quaterniond(Eigen::AngleAxisd(r(2), Eigen::Vector3d::UnitZ()) *
                                     Eigen::AngleAxisd(r(1), Eigen::Vector3d::UnitY()) *
                                     Eigen::AngleAxisd(r(0), Eigen::Vector3d::UnitX())));
}

// Reads an exported quaternion CSV (t,qw,qx,qy,qz) back with the project's reader.
Track ReadBack(const std::string& path) {
  auto head = read_file_head(path);
  EXPECT_TRUE(head.ok());
  auto m = find_columns(head.value());
  EXPECT_TRUE(m.ok());
  auto t = read_track_file(path, m.value());
  EXPECT_TRUE(t.ok());
  return t.value();
}

TEST_F(TrackEulerCliTest, RollPitchYawLogIsReadAndExportedToTheSamePoses) {
  const auto a = Angles(300);
  WriteLog(Path("rpy.csv"), "time_s,roll_deg,pitch_deg,yaw_deg", a);
  const test::CliRun r =
      test::run_cli({"track", Path("rpy.csv"), "--json", "--export", Path("clean.csv"), "--no-unwrap"});
  ASSERT_EQ(r.code, 0) << r.err;
  const nlohmann::json j = r.json();
  EXPECT_EQ(j["samples"], 300);
  EXPECT_EQ(j["reading"], "euler intrinsic ZYX, degrees");
  EXPECT_EQ(j["euler_columns"]["sequence"], "ZYX");
  EXPECT_EQ(j["euler_columns"]["kind"], "intrinsic");
  EXPECT_EQ(j["euler_columns"]["unit"], "degrees");
  const Track t = ReadBack(Path("clean.csv"));
  ASSERT_EQ(t.size(), a.size());
  for (std::size_t i = 0; i < a.size(); ++i) {
    EXPECT_TRUE(test::RotationNear(Rotation(Eigen::Quaterniond(t.qw[i], t.qx[i], t.qy[i], t.qz[i])),
                                   Zyx(a[i]), test::kRoundTrip))
        << i;
  }
  // The table says the reading too.
  const test::CliRun table = test::run_cli({"track", Path("rpy.csv")});
  ASSERT_EQ(table.code, 0) << table.err;
  EXPECT_NE(table.out.find("euler intrinsic ZYX, degrees"), std::string::npos) << table.out;
}

TEST_F(TrackEulerCliTest, AsEulerForcesConventionAndUnit) {
  // Angles written in radians without a unit, small enough to leave the unit open.
  std::vector<Eigen::Vector3d> a = Angles(50);
  for (auto& v : a) v *= kPi / 180.0;
  WriteLog(Path("rpy.csv"), "t,roll,pitch,yaw", a);
  // Forced: extrinsic XYZ in radians. Each column keeps its axis: roll about x first, then
  // pitch about y, then yaw about z, all about the fixed axes: R = Rz(yaw) Ry(pitch) Rx(roll),
  // the same matrix as intrinsic ZYX (euler.hpp: extrinsic (a, b, c) is R_k(c) R_j(b) R_i(a)).
  const test::CliRun r =
      test::run_cli({"track", Path("rpy.csv"), "--json", "--as", "euler", "--euler", "XYZ", "--extrinsic",
                     "--rad", "--export", Path("clean.csv"), "--no-unwrap"});
  ASSERT_EQ(r.code, 0) << r.err;
  const nlohmann::json j = r.json();
  EXPECT_EQ(j["reading"], "euler extrinsic XYZ, radians");
  const Track t = ReadBack(Path("clean.csv"));
  ASSERT_EQ(t.size(), a.size());
  for (std::size_t i = 0; i < a.size(); ++i) {
    EXPECT_TRUE(test::RotationNear(Rotation(Eigen::Quaterniond(t.qw[i], t.qx[i], t.qy[i], t.qz[i])),
                                   Zyx(a[i] * 180.0 / kPi), test::kRoundTrip))
        << i;
  }
  // Forced intrinsic XYZ: R = Rx(roll) Ry(pitch) Rz(yaw), a different rotation.
  const test::CliRun x = test::run_cli({"track", Path("rpy.csv"), "--as", "euler", "--euler", "XYZ", "--rad",
                                        "--export", Path("clean_x.csv"), "--no-unwrap"});
  ASSERT_EQ(x.code, 0) << x.err;
  const Track tx = ReadBack(Path("clean_x.csv"));
  ASSERT_EQ(tx.size(), a.size());
  for (std::size_t i = 0; i < a.size(); ++i) {
    const Rotation want(Eigen::Quaterniond(Eigen::AngleAxisd(a[i](0), Eigen::Vector3d::UnitX()) *
                                           Eigen::AngleAxisd(a[i](1), Eigen::Vector3d::UnitY()) *
                                           Eigen::AngleAxisd(a[i](2), Eigen::Vector3d::UnitZ())));
    EXPECT_TRUE(test::RotationNear(Rotation(Eigen::Quaterniond(tx.qw[i], tx.qx[i], tx.qy[i], tx.qz[i])), want,
                                   test::kRoundTrip))
        << i;
  }
  // A quaternion reading does not fit three angle columns.
  const test::CliRun q = test::run_cli({"track", Path("rpy.csv"), "--as", "quat-wxyz"});
  EXPECT_EQ(q.code, 2);
  EXPECT_NE(q.err.find("three Euler angles"), std::string::npos) << q.err;
}

TEST_F(TrackEulerCliTest, ConventionFileAngleNames) {
  // The invented camera-rig convention: intrinsic YXZ named pan, tilt, spin.
  const std::string conv = std::string(ATTISCOPE_SOURCE_DIR) + "/assets/conventions/camera-rig.toml";
  const auto a = Angles(40);  // written as pan, tilt, spin
  WriteLog(Path("rig.csv"), "t,pan,tilt,spin", a);
  const test::CliRun no_house = test::run_cli({"track", Path("rig.csv")});
  EXPECT_EQ(no_house.code, 2) << no_house.out;
  const test::CliRun r = test::run_cli({"track", Path("rig.csv"), "--json", "--convention", conv});
  ASSERT_EQ(r.code, 0) << r.err;
  EXPECT_EQ(r.json()["reading"], "euler intrinsic YXZ, degrees");
}

}  // namespace
}  // namespace attiscope
