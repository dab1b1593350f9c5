// report_test.cpp: the `convert --json` object and the plain table: keys of design.md, values
// that agree with the core, and numbers that round-trip.
#include "attiscope/core/report.hpp"

#include <cmath>

#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"
#include "attiscope/core/representations.hpp"
#include "support/check.hpp"

namespace attiscope {
namespace {

using test::kSeed;
using test::kTight;

ReportOptions Zyx() {
  ReportOptions o;
  o.euler = parse_euler_sequence("ZYX", EulerKind::Intrinsic).value();
  return o;
}

TEST(ReportTest, HasTheKeysOfTheDesign) {
  const nlohmann::json j = convert_json(elementary_rotation(Axis::Y, 0.3), Zyx());
  for (const char* key : {"reading", "quaternion", "matrix", "axis_angle", "rotation_vector_rad", "gibbs",
                          "mrp", "euler", "euler_all", "warnings"}) {
    EXPECT_TRUE(j.contains(key)) << key;
  }
  for (const char* key : {"w", "x", "y", "z"}) EXPECT_TRUE(j["quaternion"].contains(key));
  for (const char* key : {"sequence", "kind", "angles_deg", "lock_margin_deg", "at_lock"}) {
    EXPECT_TRUE(j["euler"].contains(key)) << key;
  }
  EXPECT_TRUE(j["axis_angle"].contains("axis"));
  EXPECT_TRUE(j["axis_angle"].contains("angle_deg"));
  ASSERT_EQ(j["euler_all"].size(), 24u);
  ASSERT_EQ(j["matrix"].size(), 3u);
  EXPECT_EQ(j["matrix"][0].size(), 3u);
  EXPECT_TRUE(j["warnings"].is_array());
}

TEST(ReportTest, ValuesAgreeWithTheCoreAndRoundTrip) {
  std::mt19937 rng(kSeed);
  for (int n = 0; n < 50; ++n) {
    const Rotation r = test::RandomRotation(rng);
    // Through text, as a reader of the JSON gets it: 17 significant digits round-trip exactly.
    const nlohmann::json j = nlohmann::json::parse(convert_json(r, Zyx()).dump());
    const Eigen::Quaterniond q = r.quaternion();
    EXPECT_EQ(j["quaternion"]["w"].get<double>(), q.w());
    EXPECT_EQ(j["quaternion"]["x"].get<double>(), q.x());
    EXPECT_EQ(j["quaternion"]["y"].get<double>(), q.y());
    EXPECT_EQ(j["quaternion"]["z"].get<double>(), q.z());
    EXPECT_GE(j["quaternion"]["w"].get<double>(), 0.0);
    Eigen::Matrix3d m;
    for (int k = 0; k < 9; ++k) m(k / 3, k % 3) = j["matrix"][k / 3][k % 3].get<double>();
    EXPECT_TRUE(test::MatrixNear(m, r.matrix(), 0.0));
    const Eigen::Vector3d rv(j["rotation_vector_rad"][0].get<double>(),
                             j["rotation_vector_rad"][1].get<double>(),
                             j["rotation_vector_rad"][2].get<double>());
    EXPECT_TRUE(test::RotationNear(from_rotation_vector(rv).value(), r, 1e-12)) << "seed " << kSeed;
    const Eigen::Vector3d p(j["mrp"][0].get<double>(), j["mrp"][1].get<double>(), j["mrp"][2].get<double>());
    EXPECT_TRUE(test::RotationNear(from_mrp(p).value(), r, 1e-12));
    const Eigen::Vector3d axis(j["axis_angle"]["axis"][0].get<double>(),
                               j["axis_angle"]["axis"][1].get<double>(),
                               j["axis_angle"]["axis"][2].get<double>());
    EXPECT_TRUE(test::RotationNear(
        from_axis_angle(axis, j["axis_angle"]["angle_deg"].get<double>() * M_PI / 180).value(), r, 1e-12));
    // Every one of the 24 Euler objects reproduces the rotation, in degrees.
    for (const nlohmann::json& e : j["euler_all"]) {
      const EulerConvention c =
          parse_euler_sequence(e["sequence"].get<std::string>(),
                               e["kind"] == "intrinsic" ? EulerKind::Intrinsic : EulerKind::Extrinsic)
              .value();
      const Eigen::Vector3d a(e["angles_deg"][0].get<double>(), e["angles_deg"][1].get<double>(),
                              e["angles_deg"][2].get<double>());
      EXPECT_TRUE(test::RotationNear(from_euler(c, a * M_PI / 180), r, 1e-12)) << c.name();
    }
    // The JPL world-to-body scalar-last view has the Hamilton numbers (references.md T8).
    const auto jpl = j["quaternion_jpl_world_to_body_xyzw"];
    EXPECT_EQ(jpl[3].get<double>(), q.w());
    EXPECT_EQ(jpl[0].get<double>(), q.x());
  }
}

TEST(ReportTest, SayWhatIsSpecial) {
  // 180 degrees: Gibbs is null and a warning says why; the MRP has unit norm.
  const nlohmann::json half = convert_json(Rotation(Eigen::Quaterniond(0, 0, 0, 1)), Zyx());
  EXPECT_TRUE(half["gibbs"].is_null());
  EXPECT_NEAR(half["mrp"][2].get<double>(), 1.0, kTight);
  ASSERT_FALSE(half["warnings"].empty());
  EXPECT_NE(half["warnings"][0].get<std::string>().find("Gibbs"), std::string::npos);
  // At lock in the chosen convention: at_lock, the third angle 0, a warning, an infinite
  // rate condition number written as null (JSON has no infinity).
  const ReportOptions o = Zyx();
  const nlohmann::json lock = convert_json(from_euler(o.euler, Eigen::Vector3d(0.5, M_PI / 2, 0.2)), o);
  EXPECT_TRUE(lock["euler"]["at_lock"].get<bool>());
  EXPECT_EQ(lock["euler"]["angles_deg"][2].get<double>(), 0.0);
  EXPECT_NEAR(lock["euler"]["angles_deg"][0].get<double>(), (0.5 - 0.2) * 180 / M_PI, 1e-9);
  bool said = false;
  for (const auto& w : lock["warnings"])
    said = said || w.get<std::string>().find("lock") != std::string::npos;
  EXPECT_TRUE(said);
  EXPECT_NEAR(lock["euler"]["lock_margin_deg"].get<double>(), 0.0, 1e-12);
  // Identity: the MRP shadow is infinite (null), Gibbs is zero.
  const nlohmann::json id = convert_json(Rotation::identity(), Zyx());
  EXPECT_TRUE(id["mrp_shadow"].is_null());
  EXPECT_EQ(id["gibbs"][0].get<double>(), 0.0);
  // Warnings given by the caller come first.
  ReportOptions w = Zyx();
  w.warnings = {"from the reader"};
  EXPECT_EQ(convert_json(Rotation::identity(), w)["warnings"][0], "from the reader");
}

TEST(ReportTest, TableNamesEveryRepresentation) {
  const std::string t = convert_table(elementary_rotation(Axis::X, 0.4), Zyx());
  for (const char* word : {"quaternion", "matrix", "axis", "Gibbs", "MRP", "ZYX"}) {
    EXPECT_NE(t.find(word), std::string::npos) << word << "\n" << t;
  }
  EXPECT_EQ(t.find("nan"), std::string::npos);
}

}  // namespace
}  // namespace attiscope
