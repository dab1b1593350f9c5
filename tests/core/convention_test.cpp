// convention_test.cpp: the house convention model: frames and frame changes against
// published definitions, printed numbers (print order, unit, ranges) and derived sentences.
#include "attiscope/core/convention.hpp"

#include <cmath>

#include "attiscope/core/convention_file.hpp"
#include "support/check.hpp"

namespace attiscope {
namespace {

using test::kSeed;
using test::kTight;

constexpr double kDeg = M_PI / 180.0;

std::string demo(const char* file) {
  return std::string(ATTISCOPE_SOURCE_DIR) + "/assets/conventions/" + file;
}

HouseConvention load_demo(const char* file) {
  auto c = load_convention(demo(file));
  EXPECT_TRUE(c.ok()) << (c ? "" : c.error().describe());
  return c ? c.value().convention : HouseConvention{};
}

Eigen::Matrix3d mat(std::initializer_list<double> rows) {
  Eigen::Matrix3d m;
  auto it = rows.begin();
  for (int i = 0; i < 3; ++i)
    for (int k = 0; k < 3; ++k) m(i, k) = *it++;
  return m;
}

TEST(ConventionTest, NedToEnuIsThePublishedRotation) {
  auto fc = frame_change(world_ned(), body_frd(), world_enu(), body_frd());
  ASSERT_TRUE(fc.ok());
  // references.md T13 (common practice), NED from ISO 1151 [F1] (axes from memory) and
  // ENU from IOGP GN 7-2 [F8]: C_ENU<-NED = [[0,1,0],[1,0,0],[0,0,-1]], det +1, a 180 degree
  // turn about (1,1,0)/sqrt 2 with q = (0, sqrt2/2, sqrt2/2, 0).
  const Eigen::Matrix3d c = fc.value().world_to_R_world_from.matrix();
  EXPECT_TRUE(test::MatrixNear(c, mat({0, 1, 0, 1, 0, 0, 0, 0, -1}), kTight));
  EXPECT_NEAR(c.determinant(), 1.0, kTight);
  EXPECT_TRUE(test::RotationNear(fc.value().world_to_R_world_from,
                                 Rotation(Eigen::Quaterniond(0, M_SQRT1_2, M_SQRT1_2, 0)), kTight));
  // The body is unchanged, so the right factor is the identity.
  EXPECT_TRUE(test::RotationNear(fc.value().body_from_R_body_to, Rotation(), kTight));
}

TEST(ConventionTest, FrdToFluIsThePublishedRotation) {
  auto fc = frame_change(world_ned(), body_frd(), world_ned(), body_flu());
  ASSERT_TRUE(fc.ok());
  // references.md T13; FRD from ISO 1151 [F1] (memory) and IEEE 1278.1 [F6], FLU from
  // ISO 8855 [F3] and ROS REP 103 [F7]: C_FLU<-FRD = diag(1,-1,-1), 180 degrees about x.
  // The right factor is FRD_R_FLU = C_FLU<-FRD^T, the same matrix (it is its own inverse).
  EXPECT_TRUE(
      test::MatrixNear(fc.value().body_from_R_body_to.matrix(), mat({1, 0, 0, 0, -1, 0, 0, 0, -1}), kTight));
  EXPECT_TRUE(
      test::RotationNear(fc.value().body_from_R_body_to, Rotation(Eigen::Quaterniond(0, 1, 0, 0)), kTight));
  EXPECT_TRUE(test::RotationNear(fc.value().world_to_R_world_from, Rotation(), kTight));
}

TEST(ConventionTest, NedFrdAttitudeBecomesEnuFluAttitude) {
  // references.md T13 (common practice): NED/FRD (yaw, pitch, roll) becomes ENU/FLU
  // (90 - yaw, -pitch, roll): (30,10,5) -> (60,-10,5) and (200,-20,40) -> (-110,20,40).
  auto fc = frame_change(world_ned(), body_frd(), world_enu(), body_flu());
  ASSERT_TRUE(fc.ok());
  const EulerConvention zyx;
  const std::array<std::pair<Eigen::Vector3d, Eigen::Vector3d>, 2> cases{{
      {{30, 10, 5}, {60, -10, 5}},
      {{200, -20, 40}, {-110, 20, 40}},
  }};
  for (const auto& [ned, enu] : cases) {
    const Rotation moved = fc.value().apply(from_euler(zyx, ned * kDeg));
    const EulerAngles e = to_euler(moved, zyx);
    EXPECT_TRUE(test::MatrixNear(e.angles_rad / kDeg, enu, 1e-9)) << "NED/FRD " << ned.transpose();
  }
  // Level flight heading north (identity in NED/FRD) is yaw +90 in ENU/FLU (T13).
  EXPECT_TRUE(test::RotationNear(fc.value().apply(Rotation()),
                                 Rotation(Eigen::Quaterniond(M_SQRT1_2, 0, 0, M_SQRT1_2)), kTight));
  // The describe() text shows both factors and the side each is applied on.
  const std::string text = fc.value().describe();
  EXPECT_NE(text.find("pose in ENU/FLU = C_world * (pose in NED/FRD) * C_body"), std::string::npos) << text;
  EXPECT_NE(text.find("on the left"), std::string::npos);
  EXPECT_NE(text.find("on the right"), std::string::npos);
}

TEST(ConventionTest, EpsgExamplePointChangesFromEnuToNed) {
  // IOGP GN 7-2 [F8] worked example via references.md T13: the point at ENU
  // (-189013.869, -128642.040, -4220.171) m is NED (-128642.040, -189013.869, 4220.171).
  auto fc = frame_change(world_enu(), body_flu(), world_ned(), body_flu());
  ASSERT_TRUE(fc.ok());
  const Eigen::Vector3d ned = fc.value().world_to_R_world_from.apply({-189013.869, -128642.040, -4220.171});
  EXPECT_TRUE(test::MatrixNear(ned, Eigen::Vector3d(-128642.040, -189013.869, 4220.171), 1e-6));
}

TEST(ConventionTest, CameraAxesAreRightDownForward) {
  // Camera axes x right, y down, z forward along the optical axis: ROS REP 103 [F7]
  // ("_optical" frames, confirmed) and Hartley & Zisserman, "Multiple View Geometry in
  // Computer Vision", 2nd ed. 2004, ch. 6 (principal axis along Z, image x right and
  // y down: from memory).
  auto flu_R_cam = reference_R_frame(body_camera_rdf(), FrameRole::Body);
  ASSERT_TRUE(flu_R_cam.ok());
  EXPECT_TRUE(test::MatrixNear(flu_R_cam.value(), mat({0, 0, 1, -1, 0, 0, 0, -1, 0}), kTight));
  // A vehicle level facing east (identity in ENU/FLU) carries a camera looking forward:
  // in ENU/RDF the camera's x (right) points south, y (down) down, z (forward) east.
  auto fc = frame_change(world_enu(), body_flu(), world_enu(), body_camera_rdf());
  ASSERT_TRUE(fc.ok());
  const Eigen::Matrix3d world_R_cam = fc.value().apply(Rotation()).matrix();
  EXPECT_TRUE(test::MatrixNear(world_R_cam, mat({0, 0, 1, -1, 0, 0, 0, -1, 0}), kTight));
  EXPECT_TRUE(test::MatrixNear(world_R_cam.col(2), Eigen::Vector3d(1, 0, 0), kTight));
}

TEST(ConventionTest, FrameChangesAreRotationsOnTheCorrectSide) {
  // Property: for random poses, the world change acts on world coordinates and the body
  // change on body coordinates: a body vector mapped into the new world equals the old
  // mapping followed by the world change, for any vector given in the new body frame.
  std::mt19937 rng(kSeed);
  const std::array<FrameAxes, 3> worlds{world_enu(), world_ned(),
                                        FrameAxes{{"south", "up", "west"}, {"a", "b", "c"}}};
  const std::array<FrameAxes, 3> bodies{body_flu(), body_frd(), body_camera_rdf()};
  for (const auto& fw : worlds)
    for (const auto& fb : bodies)
      for (const auto& tw : worlds)
        for (const auto& tb : bodies) {
          auto fc = frame_change(fw, fb, tw, tb);
          ASSERT_TRUE(fc.ok());
          const Eigen::Matrix3d ref_fw = reference_R_frame(fw, FrameRole::World).value();
          const Eigen::Matrix3d ref_tw = reference_R_frame(tw, FrameRole::World).value();
          const Eigen::Matrix3d ref_fb = reference_R_frame(fb, FrameRole::Body).value();
          const Eigen::Matrix3d ref_tb = reference_R_frame(tb, FrameRole::Body).value();
          for (int n = 0; n < 20; ++n) {
            const Rotation pose = test::RandomRotation(rng);
            const Eigen::Vector3d v_tb(0.3, -1.2, 0.7);
            // Same physical vector: into the reference body frame, into the old body frame,
            // through the old pose, into the reference world frame, into the new world frame.
            const Eigen::Vector3d expected =
                ref_tw.transpose() * ref_fw * pose.apply(ref_fb.transpose() * ref_tb * v_tb);
            EXPECT_TRUE(test::MatrixNear(fc.value().apply(pose).apply(v_tb), expected, 1e-12))
                << "seed " << kSeed;
          }
        }
}

TEST(ConventionTest, ReflectionsAreRefusedWithTheReason) {
  // North, east, up is left-handed (north x east = down): no rotation reaches it.
  auto w = reference_R_frame(FrameAxes{{"north", "east", "up"}, {"x", "y", "z"}}, FrameRole::World);
  ASSERT_FALSE(w.ok());
  EXPECT_NE(w.error().message.find("left-handed"), std::string::npos) << w.error().message;
  EXPECT_NE(w.error().message.find("reflection"), std::string::npos);
  EXPECT_NE(w.error().message.find("north x east points down"), std::string::npos) << w.error().message;
  auto b = frame_change(world_enu(), body_flu(), world_enu(),
                        FrameAxes{{"forward", "right", "up"}, {"x", "y", "z"}});
  ASSERT_FALSE(b.ok());
  EXPECT_NE(b.error().message.find("reflection"), std::string::npos);
  auto parallel = reference_R_frame(FrameAxes{{"forward", "back", "up"}, {"x", "y", "z"}}, FrameRole::Body);
  ASSERT_FALSE(parallel.ok());
  EXPECT_NE(parallel.error().message.find("lie on one line"), std::string::npos);
  auto unknown =
      reference_R_frame(FrameAxes{{"forward", "left", "skyward"}, {"x", "y", "z"}}, FrameRole::Body);
  ASSERT_FALSE(unknown.ok());
}

TEST(ConventionTest, HouseEulerUsesPrintOrderUnitAndRanges) {
  HouseConvention c = load_demo("survey-aircraft.toml");
  // Heading -10 degrees is printed in [0, 360) as 350.
  const Rotation r = from_euler(c.euler.convention, Eigen::Vector3d(-10, 20, -30) * kDeg);
  const HouseEulerView v = house_euler(r, c);
  EXPECT_NEAR(v.values[0], 350.0, 1e-9);
  EXPECT_NEAR(v.values[1], 20.0, 1e-9);
  EXPECT_NEAR(v.values[2], -30.0, 1e-9);
  EXPECT_EQ(v.names[0], "heading");
  // The rover prints roll, pitch, yaw.
  HouseConvention rover = load_demo("orchard-rover.toml");
  const HouseEulerView rv = house_euler(r, rover);
  EXPECT_EQ(rv.names, (std::array<std::string, 3>{"roll", "pitch", "yaw"}));
  EXPECT_NEAR(rv.values[0], -30.0, 1e-9);
  EXPECT_NEAR(rv.values[2], -10.0, 1e-9);
  // Radians.
  rover.euler.unit = AngleUnit::Radians;
  EXPECT_NEAR(house_euler(r, rover).values[1], 20.0 * kDeg, 1e-12);
}

TEST(ConventionTest, HouseNumbersRoundTripForEveryChoice) {
  std::mt19937 rng(kSeed);
  HouseConvention c;
  const std::array<std::array<int, 3>, 3> orders{{{0, 1, 2}, {2, 1, 0}, {1, 2, 0}}};
  for (const EulerConvention& e : all_euler_conventions()) {
    for (const auto& order : orders) {
      for (AngleUnit u : {AngleUnit::Degrees, AngleUnit::Radians}) {
        c.euler.convention = e;
        c.euler.print_order = order;
        c.euler.unit = u;
        c.euler.ranges = {AngleRange::ZeroTo360, AngleRange::Standard, AngleRange::ZeroTo360};
        for (int n = 0; n < 20; ++n) {
          const Rotation r = test::RandomRotation(rng);
          const HouseEulerView v = house_euler(r, c);
          for (std::size_t k = 0; k < 3; ++k) {
            if (order[k] != 1) {
              const double full = u == AngleUnit::Degrees ? 360.0 : 2 * M_PI;
              EXPECT_GE(v.values[k], 0.0);
              EXPECT_LT(v.values[k], full);
            }
          }
          auto back = from_house_euler(v.values, c);
          ASSERT_TRUE(back.ok());
          EXPECT_TRUE(test::RotationNear(back.value(), r, 1e-12)) << e.name() << " seed " << kSeed;
        }
      }
    }
  }
  EXPECT_FALSE(from_house_euler({NAN, 0, 0}, c).ok());
}

TEST(ConventionTest, QuaternionAndMatrixViews) {
  const HouseConvention c = load_demo("survey-aircraft.toml");
  // 90 degrees about z (T2): (w, x, y, z) = (sqrt2/2, 0, 0, sqrt2/2); the survey convention
  // writes x y z w, and its matrix world-to-body (the DCM, R transposed), row-major.
  const Rotation r(Eigen::Quaterniond(M_SQRT1_2, 0, 0, M_SQRT1_2));
  const auto q = house_quaternion(r, c);
  EXPECT_EQ(house_quaternion_labels(c)[3], "w");
  EXPECT_NEAR(q[2], M_SQRT1_2, kTight);
  EXPECT_NEAR(q[3], M_SQRT1_2, kTight);
  const auto m = house_matrix(r, c);
  // R = Rz(90) = [[0,-1,0],[1,0,0],[0,0,1]]; R^T row 0 is (0, 1, 0).
  EXPECT_NEAR(m[1], 1.0, kTight);
  EXPECT_NEAR(m[3], -1.0, kTight);
}

TEST(ConventionTest, PositiveDirectionSentencesComeFromTheFrames) {
  // Common practice (ISO 1151 [F1], from memory): in NED/FRD positive pitch raises the
  // nose, positive yaw turns it right, positive roll lowers the right wing.
  const auto survey = positive_direction_sentences(load_demo("survey-aircraft.toml"));
  EXPECT_EQ(survey[0],
            "positive heading turns the nose right: a right-hand turn about the body's down axis (z)");
  EXPECT_EQ(survey[1],
            "positive elevation raises the nose: a right-hand turn about the body's right axis (y)");
  EXPECT_EQ(survey[2],
            "positive bank lowers the right wing: a right-hand turn about the body's forward axis (x)");
  // In FLU the same right-hand rule about the left axis lowers the bow (ROS REP 103 [F7]:
  // right-hand rule; common practice), and yaw about up turns it left.
  const auto rover = positive_direction_sentences(load_demo("orchard-rover.toml"));
  EXPECT_EQ(rover[0], "positive yaw turns the bow left: a right-hand turn about the body's up axis (z)");
  EXPECT_EQ(rover[1], "positive pitch lowers the bow: a right-hand turn about the body's left axis (y)");
  EXPECT_EQ(rover[2],
            "positive roll lowers the right side: a right-hand turn about the body's forward axis (x)");
  const auto cam = positive_direction_sentences(load_demo("camera-rig.toml"));
  EXPECT_EQ(cam[0], "positive pan turns the lens right: a right-hand turn about the body's down axis (y)");
  EXPECT_EQ(cam[1], "positive tilt raises the lens: a right-hand turn about the body's right axis (x)");
  EXPECT_EQ(cam[2],
            "positive spin lowers the right edge of the image: a right-hand turn about the body's forward "
            "axis (z)");
  // Extrinsic: the turn is about the world's axis (which coincides with the body's at the
  // start pose).
  HouseConvention ext = load_demo("survey-aircraft.toml");
  ext.euler.convention.kind = EulerKind::Extrinsic;
  EXPECT_EQ(positive_direction_sentences(ext)[1],
            "positive elevation raises the nose: a right-hand turn about the world's east axis (E)");
}

TEST(ConventionTest, ValidateRefusesBadFields) {
  HouseConvention c;
  c.euler.print_order = {0, 0, 2};
  EXPECT_EQ(validate_convention(c).error().field, "euler.print_order");
  c = HouseConvention{};
  c.euler.ranges[1] = AngleRange::ZeroTo360;
  EXPECT_EQ(validate_convention(c).error().field, "euler.ranges");
  c = HouseConvention{};
  c.euler.names = {"a", "b", "a"};
  EXPECT_EQ(validate_convention(c).error().field, "euler.names");
  c = HouseConvention{};
  c.precision = 0;
  EXPECT_EQ(validate_convention(c).error().field, "precision");
  c = HouseConvention{};
  c.world.directions = {"east", "north", "down"};
  EXPECT_EQ(validate_convention(c).error().field, "world.axes");
  EXPECT_TRUE(validate_convention(HouseConvention{}).ok());
}

}  // namespace
}  // namespace attiscope
