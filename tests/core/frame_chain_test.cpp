// frame_chain_test.cpp: named frames, links entered either way round, lever arms, and the
// mount setup file (TOML) that keeps them.
#include "attiscope/core/frame_chain.hpp"

#include <unistd.h>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/mount.hpp"
#include "attiscope/core/mount_setup.hpp"
#include "support/check.hpp"

namespace attiscope {
namespace {

using test::kSeed;
using test::kTight;

constexpr double kDeg = M_PI / 180.0;

TEST(FrameChainTest, ComposesWorldVehiclePlateSensor) {
  std::mt19937 rng(kSeed);
  const Rotation world_R_vehicle = test::RandomRotation(rng);
  const Rotation vehicle_R_plate = test::RandomRotation(rng);
  const Rotation plate_R_sensor = test::RandomRotation(rng);
  FrameChain chain;
  ASSERT_TRUE(chain.add_link("world", "vehicle", world_R_vehicle).ok());
  // Entered the other way round: the value given is plate_R_vehicle.
  ASSERT_TRUE(
      chain.add_link("vehicle", "plate", vehicle_R_plate.inverse(), LinkDirection::ParentToChild).ok());
  ASSERT_TRUE(chain.add_link("plate", "sensor", plate_R_sensor).ok());
  const auto world_T_sensor = chain.relative("world", "sensor");
  ASSERT_TRUE(world_T_sensor.ok());
  EXPECT_TRUE(test::RotationNear(world_T_sensor->rotation, world_R_vehicle * vehicle_R_plate * plate_R_sensor,
                                 kTight));
  const auto sensor_T_world = chain.relative("sensor", "world");
  EXPECT_TRUE(test::RotationNear(sensor_T_world->rotation, world_T_sensor->rotation.inverse(), kTight));
  const auto vehicle_T_sensor = chain.relative("vehicle", "sensor");
  EXPECT_TRUE(test::RotationNear(vehicle_T_sensor->rotation, vehicle_R_plate * plate_R_sensor, kTight));
  EXPECT_TRUE(test::RotationNear(chain.relative("plate", "plate")->rotation, Rotation::identity(), kTight));
  EXPECT_EQ(chain.path_from_root("sensor"),
            (std::vector<std::string>{"world", "vehicle", "plate", "sensor"}));
}

TEST(FrameChainTest, LeverArmsMovePoints) {
  // vehicle -> sensor: sensor 1.2 m forward and 0.3 m down of the vehicle origin (FRD),
  // turned 90 degrees about z. A point 1 m along sensor x is at (1.2, 1, 0.3) in vehicle axes.
  FrameChain chain;
  const Rotation vehicle_R_sensor = elementary_rotation(Axis::Z, 90 * kDeg);
  ASSERT_TRUE(chain
                  .add_link("vehicle", "sensor", vehicle_R_sensor, LinkDirection::ChildToParent,
                            Eigen::Vector3d(1.2, 0, 0.3))
                  .ok());
  const auto t = chain.relative("vehicle", "sensor");
  EXPECT_TRUE(test::MatrixNear(t->apply(Eigen::Vector3d(1, 0, 0)), Eigen::Vector3d(1.2, 1, 0.3), 1e-15));
  const auto back = chain.relative("sensor", "vehicle");
  EXPECT_TRUE(test::MatrixNear(back->apply(Eigen::Vector3d(1.2, 1, 0.3)), Eigen::Vector3d(1, 0, 0), 1e-15));
  // Entered as sensor_T_vehicle, the same link.
  FrameChain other;
  const FrameTransform sensor_T_vehicle = t.value().inverse();
  ASSERT_TRUE(other
                  .add_link("vehicle", "sensor", sensor_T_vehicle.rotation, LinkDirection::ParentToChild,
                            sensor_T_vehicle.translation)
                  .ok());
  EXPECT_TRUE(test::MatrixNear(other.relative("vehicle", "sensor")->translation, Eigen::Vector3d(1.2, 0, 0.3),
                               1e-15));
}

TEST(FrameChainTest, RefusesLoopsSecondParentsAndStrangers) {
  FrameChain chain;
  ASSERT_TRUE(chain.add_link("world", "vehicle", Rotation()).ok());
  ASSERT_TRUE(chain.add_link("vehicle", "sensor", Rotation()).ok());
  EXPECT_FALSE(chain.add_link("sensor", "world", Rotation()).ok());  // loop
  EXPECT_FALSE(chain.add_link("world", "sensor", Rotation()).ok());  // second parent
  EXPECT_FALSE(chain.add_link("world", "world", Rotation()).ok());
  ASSERT_TRUE(chain.add_frame("bench").ok());
  EXPECT_FALSE(chain.add_frame("bench").ok());
  EXPECT_FALSE(chain.relative("bench", "sensor").ok());  // not linked
  EXPECT_FALSE(chain.relative("nowhere", "sensor").ok());
}

std::string temp_path(const std::string& name) {
  return (std::filesystem::temp_directory_path() /
          ("attiscope_test_" + std::to_string(::getpid()) + "_" + name))
      .string();
}

TEST(MountSetupTest, SavesAndLoadsRoundTrip) {
  std::mt19937 rng(kSeed + 3);
  MountSetup s;
  s.name = "survey aircraft IMU \"A\" (invented)";
  s.vehicle_axes = parse_vehicle_axes("FLU").value();
  s.tolerance_deg = 0.25;
  s.nominal_words = "x aft, z down";
  s.trim_deg = Eigen::Vector3d(0.1, -0.2, 0.3);
  s.nominal = Rotation();  // the file keeps the words and trim; the value is read from them
  s.measured = test::RandomRotation(rng);
  s.measured_note = "bench calibration";
  ASSERT_TRUE(s.chain.add_link("world", "vehicle", test::RandomRotation(rng)).ok());
  ASSERT_TRUE(s.chain
                  .add_link("vehicle", "sensor", test::RandomRotation(rng), LinkDirection::ChildToParent,
                            Eigen::Vector3d(0.5, -0.25, 1e-3))
                  .ok());
  const std::string path = temp_path("setup.toml");
  ASSERT_TRUE(save_mount_setup(path, s).ok());
  // No temporary file is left beside the target (atomic_file.hpp names them ".NAME.tmp-*").
  const std::string temp_prefix = "." + std::filesystem::path(path).filename().string() + ".tmp-";
  for (const auto& entry : std::filesystem::directory_iterator(std::filesystem::path(path).parent_path())) {
    EXPECT_NE(entry.path().filename().string().rfind(temp_prefix, 0), 0u) << entry.path();
  }
  std::vector<std::string> warnings;
  const auto back = load_mount_setup(path, &warnings);
  ASSERT_TRUE(back.ok()) << back.error().describe();
  EXPECT_TRUE(warnings.empty());
  EXPECT_EQ(back->name, s.name);
  EXPECT_EQ(back->vehicle_axes.code(), "FLU");
  EXPECT_DOUBLE_EQ(back->tolerance_deg, 0.25);
  EXPECT_EQ(back->nominal_words, s.nominal_words);
  ASSERT_TRUE(back->nominal.has_value());
  const Rotation expected_nominal =
      trimmed_mount(parse_axis_aligned_mount("x aft, z down", s.vehicle_axes).value(), s.trim_deg * kDeg);
  EXPECT_TRUE(test::RotationNear(*back->nominal, expected_nominal, 1e-15));
  EXPECT_TRUE(test::RotationNear(*back->measured, *s.measured, 1e-15));
  EXPECT_EQ(back->measured_note, "bench calibration");
  const auto a = s.chain.relative("world", "sensor"), b = back->chain.relative("world", "sensor");
  EXPECT_TRUE(test::RotationNear(b->rotation, a->rotation, 1e-15));
  EXPECT_TRUE(test::MatrixNear(b->translation, a->translation, 1e-15));
  std::filesystem::remove(path);
}

TEST(MountSetupTest, ReadsEveryRepresentationAndDirection) {
  const auto s = parse_mount_setup(
      "vehicle_axes = \"FRD\"\n"
      "[nominal]\n"
      "euler_deg = [90, 0, 0]\n"
      "euler = \"ZYX\"\n"
      "[measured]\n"
      "axis_angle_deg = [0, 0, 1, -90]\n"
      "direction = \"vehicle_to_sensor\"\n"
      "[[link]]\n"
      "parent = \"vehicle\"\nchild = \"plate\"\n"
      "matrix = [[0, -1, 0], [1, 0, 0], [0, 0, 1]]\n"
      "[[link]]\n"
      "parent = \"plate\"\nchild = \"sensor\"\n"
      "rotvec_rad = [0, 0, 1.5707963267948966]\n"
      "maps = \"parent_to_child\"\n");
  ASSERT_TRUE(s.ok()) << s.error().describe();
  const Rotation rz90 = elementary_rotation(Axis::Z, 90 * kDeg);
  EXPECT_TRUE(test::RotationNear(*s->nominal, rz90, 1e-15));
  EXPECT_TRUE(test::RotationNear(*s->measured, rz90, 1e-15));  // -90 written vehicle-to-sensor
  EXPECT_TRUE(test::RotationNear(s->chain.relative("vehicle", "sensor")->rotation, Rotation(), 1e-15));
}

TEST(MountSetupTest, MalformedFilesNameLineAndColumn) {
  const auto syntax = parse_mount_setup("name = \"rover\"\ntolerance_deg = = 1\n");
  ASSERT_FALSE(syntax.ok());
  EXPECT_EQ(syntax.error().line, 2);
  EXPECT_GT(syntax.error().column, 0);
  const auto short_q = parse_mount_setup("[measured]\n\nquaternion = [1, 0, 0]\n");
  ASSERT_FALSE(short_q.ok());
  EXPECT_EQ(short_q.error().line, 3);
  const auto two = parse_mount_setup("[nominal]\nquaternion = [1, 0, 0, 0]\nrotvec_rad = [0, 0, 0]\n");
  ASSERT_FALSE(two.ok());
  EXPECT_EQ(two.error().line == 2 || two.error().line == 3, true);
  const auto words = parse_mount_setup("[nominal]\nwords = \"x aft y aft\"\n");
  ASSERT_FALSE(words.ok());
  EXPECT_EQ(words.error().line, 2);
  const auto axes = parse_mount_setup("vehicle_axes = \"FRU\"\n");
  ASSERT_FALSE(axes.ok());
  EXPECT_EQ(axes.error().line, 1);
  std::vector<std::string> warnings;
  const auto unknown = parse_mount_setup("name = \"x\"\ncolour = \"red\"\n", &warnings);
  ASSERT_TRUE(unknown.ok());
  ASSERT_EQ(warnings.size(), 1u);
  EXPECT_NE(warnings[0].find("line 2"), std::string::npos);
}

TEST(MountSetupTest, FailedSaveKeepsTheOldFile) {
  const std::string path = temp_path("keep.toml");
  { std::ofstream(path) << "name = \"old\"\n"; }
  MountSetup s;
  s.name = "new";
  // A crash between writing the temporary file and the rename (the hook abandons the save).
  std::string abandoned;
  EXPECT_FALSE(save_mount_setup(path, s, [&](const std::string& temp) {
                 abandoned = temp;
                 return false;
               }).ok());
  EXPECT_EQ(load_mount_setup(path)->name, "old");
  EXPECT_FALSE(abandoned.empty());
  EXPECT_FALSE(std::filesystem::exists(abandoned));
  ASSERT_TRUE(save_mount_setup(path, s).ok());
  EXPECT_EQ(load_mount_setup(path)->name, "new");
  std::filesystem::remove(path);
}

}  // namespace
}  // namespace attiscope
