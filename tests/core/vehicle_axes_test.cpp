// vehicle_axes_test.cpp: vehicle axis names, and turns said in vehicle words.
#include "attiscope/core/vehicle_axes.hpp"

#include <cmath>

#include "support/check.hpp"

namespace attiscope {
namespace {

constexpr double kDeg = M_PI / 180.0;

TEST(VehicleAxesTest, ParsesRightHandedCodesOnly) {
  EXPECT_EQ(parse_vehicle_axes("frd").value().code(), "FRD");
  EXPECT_EQ(parse_vehicle_axes("FLU").value().code(), "FLU");
  EXPECT_EQ(parse_vehicle_axes("RDF").value().code(), "RDF");  // camera habit
  EXPECT_FALSE(parse_vehicle_axes("FRU").ok());                // mirror image
  EXPECT_FALSE(parse_vehicle_axes("FFD").ok());                // one line twice
  const auto bad = parse_vehicle_axes("FXD");
  ASSERT_FALSE(bad.ok());
  EXPECT_EQ(bad.error().column, 2);
  EXPECT_FALSE(parse_vehicle_axes("FR").ok());
}

TEST(VehicleAxesTest, TurnSensesFollowTheRightHandRule) {
  // Common practice (right-hand rule): in FRD, +pitch (about y, right) is nose up, +yaw
  // (about z, down) is nose right, +roll (about x) puts the right side down. In FLU, y
  // points left and z up, so +pitch is nose down and +yaw nose left; +roll is the same.
  const VehicleAxes frd = parse_vehicle_axes("FRD").value();
  const VehicleAxes flu = parse_vehicle_axes("FLU").value();
  EXPECT_EQ(frd.turn_sense(1, +1), "nose up");
  EXPECT_EQ(frd.turn_sense(1, -1), "nose down");
  EXPECT_EQ(frd.turn_sense(2, +1), "nose right");
  EXPECT_EQ(frd.turn_sense(0, +1), "right side down");
  EXPECT_EQ(flu.turn_sense(1, +1), "nose down");
  EXPECT_EQ(flu.turn_sense(2, +1), "nose left");
  EXPECT_EQ(flu.turn_sense(0, +1), "right side down");
  EXPECT_EQ(frd.turn_name(0), "roll");
  EXPECT_EQ(frd.turn_name(1), "pitch");
  EXPECT_EQ(frd.turn_name(2), "yaw");
  // Camera RDF: z is forward (roll), x right (pitch), y down (yaw).
  const VehicleAxes rdf = parse_vehicle_axes("RDF").value();
  EXPECT_EQ(rdf.turn_name(2), "roll");
  EXPECT_EQ(rdf.turn_name(0), "pitch");
  EXPECT_EQ(rdf.turn_sense(0, +1), "nose up");
}

TEST(VehicleAxesTest, DescribesATurnInVehicleWords) {
  const VehicleAxes frd = parse_vehicle_axes("FRD").value();
  EXPECT_EQ(describe_turn(frd, Eigen::Vector3d(0, -1, 0), 2.1 * kDeg, 2),
            "2.1 degrees about the vehicle's pitch axis (y, right), nose down");
  // The same turn written with a positive angle about +y and a negative angle.
  EXPECT_EQ(describe_turn(frd, Eigen::Vector3d(0, 1, 0), -2.1 * kDeg, 2),
            "2.1 degrees about the vehicle's pitch axis (y, right), nose down");
  const std::string off = describe_turn(frd, Eigen::Vector3d(1, 1, 0), 3 * kDeg);
  EXPECT_NE(off.find("about the vehicle axis (0.707, 0.707, 0)"), std::string::npos) << off;
  EXPECT_EQ(describe_turn(frd, Eigen::Vector3d(1, 0, 0), 0.0), "no turn (0 degrees)");
}

TEST(VehicleAxesTest, AxisOfDirection) {
  const VehicleAxes flu = parse_vehicle_axes("FLU").value();
  EXPECT_EQ(flu.axis_of(BodyDirection::Down), std::make_pair(2, -1.0));
  EXPECT_EQ(flu.axis_of(BodyDirection::Right), std::make_pair(1, -1.0));
  EXPECT_EQ(flu.word_for(Eigen::Vector3d(0, -1, 0)), "right");
}

}  // namespace
}  // namespace attiscope
