// vehicle_axes_test.cpp: vehicle axis names, and turns said in vehicle words.
#include "attiscope/core/vehicle_axes.hpp"

#include <cmath>
#include <map>

#include "attiscope/core/convention.hpp"

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

TEST(VehicleAxesTest, HouseBodyFramesComeFromTheVehicleTable) {
  // The FLU reference written out by hand: x forward, y left, z up (common practice; ISO 8855).
  const std::map<char, Eigen::Vector3d> flu{{'F', {1, 0, 0}},  {'B', {-1, 0, 0}}, {'L', {0, 1, 0}},
                                            {'R', {0, -1, 0}}, {'U', {0, 0, 1}},  {'D', {0, 0, -1}}};
  int right_handed = 0;
  for (const auto& [a, va] : flu) {
    for (const auto& [b, vb] : flu) {
      for (const auto& [c, vc] : flu) {
        const std::string code{a, b, c};
        const auto v = parse_vehicle_axes(code);
        const bool proper = std::abs(va.cross(vb).dot(vc) - 1.0) < 1e-12;
        ASSERT_EQ(v.ok(), proper) << code;
        if (!proper) continue;
        ++right_handed;
        const FrameAxes body = body_frame_axes(v.value());
        const auto back = body_vehicle_axes(body);
        ASSERT_TRUE(back.ok()) << code << ": " << back.error().describe();
        EXPECT_EQ(back.value().code(), code);
        const auto m = reference_R_frame(body, FrameRole::Body);
        ASSERT_TRUE(m.ok()) << code;
        EXPECT_TRUE(test::MatrixNear(m.value().col(0), va, 0.0)) << code;
        EXPECT_TRUE(test::MatrixNear(m.value().col(1), vb, 0.0)) << code;
        EXPECT_TRUE(test::MatrixNear(m.value().col(2), vc, 0.0)) << code;
      }
    }
  }
  // The proper rotations of a cube onto itself: 24 (common practice).
  EXPECT_EQ(right_handed, 24);
  // The named presets are the vehicle codes, in the convention file's words.
  EXPECT_EQ(body_frd().directions, (std::array<std::string, 3>{"forward", "right", "down"}));
  EXPECT_EQ(body_flu().directions, (std::array<std::string, 3>{"forward", "left", "up"}));
  EXPECT_EQ(body_camera_rdf().directions, (std::array<std::string, 3>{"right", "down", "forward"}));
  EXPECT_EQ(body_vehicle_axes(body_frd()).value().code(), "FRD");
  // A file says "back", a sentence "aft": one direction.
  EXPECT_EQ(parse_convention_word("Back"), BodyDirection::Aft);
  EXPECT_EQ(direction_word(BodyDirection::Aft), "aft");
  EXPECT_FALSE(parse_convention_word("aft").has_value());
  EXPECT_FALSE(body_vehicle_axes(FrameAxes{{"forward", "sideways", "down"}, {"x", "y", "z"}}).ok());
  EXPECT_FALSE(body_vehicle_axes(FrameAxes{{"forward", "left", "down"}, {"x", "y", "z"}}).ok());  // mirror
}

TEST(VehicleAxesTest, MountChecksNameTurnsInTheHouseBodyFrame) {
  EXPECT_EQ(default_vehicle_axes(nullptr).code(), "FRD") << "no house file: FRD";
  HouseConvention c;
  c.body = body_camera_rdf();
  EXPECT_EQ(default_vehicle_axes(&c).code(), "RDF");
  c.body = body_flu();
  EXPECT_EQ(default_vehicle_axes(&c).code(), "FLU");
  // A body written in words that are not vehicle directions falls back to FRD.
  c.body = FrameAxes{{"starboard", "aft", "up"}, {"x", "y", "z"}};
  EXPECT_EQ(default_vehicle_axes(&c).code(), "FRD");
}

TEST(VehicleAxesTest, HouseSentencesAgreeWithVehicleTurnSenses) {
  // Common practice (ISO 1151, from memory): in FRD a positive turn about y raises the nose,
  // about z turns it right. The house sentence and the vehicle words say the same.
  HouseConvention c;
  c.world = world_ned();
  c.body = body_frd();
  const auto sentences = positive_direction_sentences(c);  // ZYX: yaw about z, pitch about y
  const VehicleAxes frd = body_vehicle_axes(c.body).value();
  EXPECT_EQ(frd.turn_sense(1, 1.0), "nose up");
  EXPECT_NE(sentences[1].find("raises the nose"), std::string::npos) << sentences[1];
  EXPECT_EQ(frd.turn_sense(2, 1.0), "nose right");
  EXPECT_NE(sentences[0].find("turns the nose right"), std::string::npos) << sentences[0];
}

}  // namespace
}  // namespace attiscope
