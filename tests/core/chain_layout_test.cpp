// chain_layout_test.cpp: where the frames of a chain are drawn: one triad per frame, none on
// top of another, each turned by its composed rotation, the lever arms kept beside.
#include "attiscope/core/chain_layout.hpp"

#include <cmath>

#include "attiscope/core/euler.hpp"
#include "support/check.hpp"

namespace attiscope {
namespace {

using test::kSeed;
using test::kTight;

TEST(ChainLayoutTest, StraightChainIsOneRowWithComposedRotations) {
  std::mt19937 rng(kSeed);
  const Rotation world_R_vehicle = test::RandomRotation(rng);
  const Rotation vehicle_R_plate = test::RandomRotation(rng);
  const Rotation plate_R_sensor = test::RandomRotation(rng);
  const Eigen::Vector3d world_p_vehicle(10, -4, 2), vehicle_p_plate(1.2, 0, 0.3),
      plate_p_sensor(0.05, 0.02, 0);
  FrameChain chain;
  ASSERT_TRUE(
      chain.add_link("world", "vehicle", world_R_vehicle, LinkDirection::ChildToParent, world_p_vehicle)
          .ok());
  ASSERT_TRUE(
      chain.add_link("vehicle", "plate", vehicle_R_plate, LinkDirection::ChildToParent, vehicle_p_plate)
          .ok());
  ASSERT_TRUE(
      chain.add_link("plate", "sensor", plate_R_sensor, LinkDirection::ChildToParent, plate_p_sensor).ok());
  ChainLayoutOptions o;
  o.anchor = Eigen::Vector3d(-2, 0, 1);
  o.along = Eigen::Vector3d(0, 2, 0);  // not unit: only its direction counts
  o.spacing = 0.7;
  o.selected = "plate";
  const auto layout = layout_frame_chain(chain, o);
  ASSERT_TRUE(layout.ok()) << layout.error().describe();
  EXPECT_EQ(layout->display_frame, "world");
  ASSERT_EQ(layout->marks.size(), 4u);
  const char* order[] = {"world", "vehicle", "plate", "sensor"};
  for (std::size_t i = 0; i < 4; ++i) {
    const ChainFrameMark& m = layout->marks[i];
    EXPECT_EQ(m.name, order[i]);
    EXPECT_EQ(m.depth, static_cast<int>(i));
    EXPECT_EQ(m.branch, 0);
    EXPECT_EQ(m.parent, i == 0 ? "" : order[i - 1]);
    EXPECT_EQ(m.selected, i == 2);
    // One spacing further along the row per generation.
    EXPECT_TRUE(test::MatrixNear(m.origin, Eigen::Vector3d(-2, 0.7 * static_cast<double>(i), 1), 1e-15));
  }
  // The composed rotations, written out by hand (v_world = world_R_vehicle v_vehicle ...).
  EXPECT_TRUE(test::RotationNear(layout->marks[0].display_R_frame, Rotation::identity(), kTight));
  EXPECT_TRUE(test::RotationNear(layout->marks[1].display_R_frame, world_R_vehicle, kTight));
  EXPECT_TRUE(test::RotationNear(layout->marks[3].display_R_frame,
                                 world_R_vehicle * vehicle_R_plate * plate_R_sensor, kTight));
  // The lever arms composed: the sensor origin in world coordinates.
  const Eigen::Vector3d world_p_sensor =
      world_p_vehicle + world_R_vehicle.apply(vehicle_p_plate + vehicle_R_plate.apply(plate_p_sensor));
  EXPECT_TRUE(test::MatrixNear(layout->marks[3].lever_arm_origin, world_p_sensor, 1e-12));
  EXPECT_TRUE(layout->unconnected.empty());
}

TEST(ChainLayoutTest, BranchesOpenColumnsAndNoTwoTriadsMeet) {
  // vehicle -> {imu, camera -> lens, antenna}: imu keeps the vehicle's column, the camera
  // branch opens column 1, the antenna column 2.
  FrameChain chain;
  const Rotation r = elementary_rotation(Axis::Z, 0.3);
  ASSERT_TRUE(chain.add_link("vehicle", "imu", r).ok());
  ASSERT_TRUE(chain.add_link("vehicle", "camera", r).ok());
  ASSERT_TRUE(chain.add_link("camera", "lens", r).ok());
  ASSERT_TRUE(chain.add_link("vehicle", "antenna", r).ok());
  ASSERT_TRUE(chain.add_frame("tripod").ok());  // a frame of its own tree
  const auto layout = layout_frame_chain(chain);
  ASSERT_TRUE(layout.ok()) << layout.error().describe();
  ASSERT_EQ(layout->marks.size(), 5u);
  EXPECT_EQ(find_mark(*layout, "vehicle")->branch, 0);
  EXPECT_EQ(find_mark(*layout, "imu")->branch, 0);
  EXPECT_EQ(find_mark(*layout, "camera")->branch, 1);
  EXPECT_EQ(find_mark(*layout, "lens")->branch, 1);
  EXPECT_EQ(find_mark(*layout, "antenna")->branch, 2);
  EXPECT_EQ(find_mark(*layout, "lens")->depth, 2);
  EXPECT_EQ(layout->unconnected, std::vector<std::string>{"tripod"});
  EXPECT_EQ(find_mark(*layout, "tripod"), nullptr);
  for (std::size_t i = 0; i < layout->marks.size(); ++i) {
    for (std::size_t j = i + 1; j < layout->marks.size(); ++j) {
      EXPECT_GE((layout->marks[i].origin - layout->marks[j].origin).norm(), kChainSpacing - 1e-12)
          << layout->marks[i].name << " and " << layout->marks[j].name;
    }
  }
  // The lens is turned by both links: two turns of 0.3 rad about z.
  EXPECT_TRUE(test::RotationNear(find_mark(*layout, "lens")->display_R_frame,
                                 elementary_rotation(Axis::Z, 0.6), kTight));
}

TEST(ChainLayoutTest, DisplayFrameInsideTheChain) {
  // Drawn in the vehicle's axes: the vehicle is the identity, the world its inverse; the
  // layout still starts at the root.
  std::mt19937 rng(kSeed + 1);
  const Rotation world_R_vehicle = test::RandomRotation(rng);
  FrameChain chain;
  ASSERT_TRUE(chain.add_link("world", "vehicle", world_R_vehicle).ok());
  ChainLayoutOptions o;
  o.display_frame = "vehicle";
  const auto layout = layout_frame_chain(chain, o);
  ASSERT_TRUE(layout.ok());
  EXPECT_EQ(layout->display_frame, "vehicle");
  EXPECT_TRUE(
      test::RotationNear(find_mark(*layout, "vehicle")->display_R_frame, Rotation::identity(), kTight));
  EXPECT_TRUE(
      test::RotationNear(find_mark(*layout, "world")->display_R_frame, world_R_vehicle.inverse(), kTight));
  EXPECT_EQ(layout->marks.front().name, "world");
}

TEST(ChainLayoutTest, RefusesWhatCannotBeDrawn) {
  FrameChain empty;
  EXPECT_FALSE(layout_frame_chain(empty).ok());
  FrameChain chain;
  ASSERT_TRUE(chain.add_link("vehicle", "imu", Rotation::identity()).ok());
  ASSERT_TRUE(chain.add_frame("tripod").ok());
  ChainLayoutOptions o;
  o.selected = "gps";
  EXPECT_FALSE(layout_frame_chain(chain, o).ok());
  o.selected = "tripod";
  o.display_frame = "vehicle";
  const auto other_tree = layout_frame_chain(chain, o);
  ASSERT_FALSE(other_tree.ok());
  EXPECT_NE(other_tree.error().message.find("tripod"), std::string::npos);
  o = ChainLayoutOptions{};
  o.spacing = 0.0;
  EXPECT_FALSE(layout_frame_chain(chain, o).ok());
  o = ChainLayoutOptions{};
  o.along = Eigen::Vector3d::Zero();
  EXPECT_FALSE(layout_frame_chain(chain, o).ok());
  o = ChainLayoutOptions{};
  o.display_frame = "mast";
  EXPECT_FALSE(layout_frame_chain(chain, o).ok());
}

}  // namespace
}  // namespace attiscope
