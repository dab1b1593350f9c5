// euler_columns_test.cpp: logs whose rotation is three Euler angle columns. Generated logs of
// known poses written as roll, pitch, yaw (degrees and radians, CSV and JSON lines) are found
// and re-read to the poses computed independently, as the product of Eigen's own angle-axis
// rotations (not attiscope's from_euler); the unit comes from the header or the numbers; a
// house convention's own angle names are found; bad rows are named by line.
#include <gtest/gtest.h>

#include <Eigen/Geometry>
#include <cmath>
#include <cstdio>
#include <random>
#include <string>
#include <vector>

#include "attiscope/core/columns.hpp"
#include "attiscope/core/convention_file.hpp"
#include "attiscope/core/intake.hpp"
#include "support/check.hpp"
#include "support/track_gen.hpp"

namespace attiscope {
namespace {

constexpr double kPi = 3.14159265358979323846;

struct Pose {
  double roll, pitch, yaw;  // radians
};

// Known poses: a few at the edges (zero, a half turn of yaw, pitch near +/-90 degrees,
// negative angles) and random ones from the fixed seed.
std::vector<Pose> Poses() {
  std::vector<Pose> p = {{0, 0, 0},           {0.1, -0.2, 0.3},    {-1.0, 0.5, kPi},
                         {0.0, 1.5707, -2.5}, {3.0, -1.5707, 1.0}, {-3.1, 0.01, -0.01}};
  std::mt19937 rng(test::kSeed);
  std::uniform_real_distribution<double> a(-kPi, kPi), b(-kPi / 2, kPi / 2);
  for (int i = 0; i < 40; ++i) p.push_back({a(rng), b(rng), a(rng)});
  return p;
}

// world_R_body for roll, pitch, yaw: yaw about z, then pitch about the turned y, then roll
// about the twice-turned x, R = Rz(yaw) Ry(pitch) Rx(roll) (intrinsic ZYX, the common
// aerospace reading: common practice). Built with Eigen::AngleAxisd, independent of
// attiscope's half-angle product.
Rotation Expected321(const Pose& p) {
  const Eigen::Matrix3d r = (Eigen::AngleAxisd(p.yaw, Eigen::Vector3d::UnitZ()) *
                             Eigen::AngleAxisd(p.pitch, Eigen::Vector3d::UnitY()) *
                             Eigen::AngleAxisd(p.roll, Eigen::Vector3d::UnitX()))
                                .toRotationMatrix();
  return Rotation(Eigen::Quaterniond(r));
}

// "t,<roll>,<pitch>,<yaw>" rows with the given header names, in degrees or radians.
std::string Csv(const std::vector<Pose>& poses, const std::string& header, bool degrees) {
  const double k = degrees ? 180.0 / kPi : 1.0;
  std::string s = header + "\n";
  for (std::size_t i = 0; i < poses.size(); ++i) {
    s += test::FullPrecision(0.01 * static_cast<double>(i)) + "," + test::FullPrecision(poses[i].roll * k) +
         "," + test::FullPrecision(poses[i].pitch * k) + "," + test::FullPrecision(poses[i].yaw * k) + "\n";
  }
  return s;
}

Track ReadAll(const std::string& text, const ColumnMapping& m) {
  auto t = read_track_text(text, m);
  EXPECT_TRUE(t.ok());
  return t.value();
}

void ExpectPoses(const Track& t, const std::vector<Pose>& poses) {
  ASSERT_EQ(t.size(), poses.size());
  for (std::size_t i = 0; i < poses.size(); ++i) {
    const Rotation got(Eigen::Quaterniond(t.qw[i], t.qx[i], t.qy[i], t.qz[i]));
    EXPECT_TRUE(test::RotationNear(got, Expected321(poses[i]), test::kRoundTrip))
        << "sample " << i << " (seed " << test::kSeed << ")";
  }
}

TEST(EulerColumnsTest, RollPitchYawDegreesNamedUnit) {
  const auto poses = Poses();
  const std::string text = Csv(poses, "t,roll_deg,pitch_deg,yaw_deg", true);
  auto m = find_columns(text);
  ASSERT_TRUE(m.ok()) << m.error().describe();
  EXPECT_EQ(m.value().form, TrackForm::Euler);
  EXPECT_EQ(m.value().euler, (EulerConvention{{Axis::Z, Axis::Y, Axis::X}, EulerKind::Intrinsic}));
  EXPECT_EQ(m.value().euler_unit, AngleUnit::Degrees);
  EXPECT_FALSE(m.value().ambiguous);
  // Application order: yaw (column 4), pitch (3), roll (2).
  EXPECT_EQ(m.value().rotation_columns[0], 3);
  EXPECT_EQ(m.value().rotation_columns[1], 2);
  EXPECT_EQ(m.value().rotation_columns[2], 1);
  EXPECT_EQ(m.value().time_column, 0);
  const Track t = ReadAll(text, m.value());
  EXPECT_EQ(t.reading, "euler intrinsic ZYX, degrees");
  ExpectPoses(t, poses);
}

TEST(EulerColumnsTest, RadiansAndBracketSuffixes) {
  const auto poses = Poses();
  for (const std::string header : {"time,roll_rad,pitch_rad,yaw_rad", "time,Roll [rad],Pitch [rad],Yaw [rad]",
                                   "time,phi(rad),theta(rad),psi(rad)", "time,bank,pitch,heading"}) {
    const std::string text = Csv(poses, header, false);
    auto m = find_columns(text);
    ASSERT_TRUE(m.ok()) << header << ": " << m.error().describe();
    EXPECT_EQ(m.value().form, TrackForm::Euler) << header;
    ColumnMapping mapping = m.value();
    if (header == "time,bank,pitch,heading") {
      // No unit in the names and every angle within 2 pi: the house unit (degrees by
      // default) decides and the mapping says it is ambiguous.
      EXPECT_TRUE(mapping.ambiguous);
      EXPECT_EQ(mapping.euler_unit, AngleUnit::Degrees);
      mapping.euler_unit = AngleUnit::Radians;
    } else {
      EXPECT_EQ(mapping.euler_unit, AngleUnit::Radians) << header;
      EXPECT_FALSE(mapping.ambiguous) << header;
    }
    ExpectPoses(ReadAll(text, mapping), poses);
  }
}

TEST(EulerColumnsTest, UnitFromTheNumbers) {
  const auto poses = Poses();  // some angles are beyond 2 pi in degrees
  const std::string text = Csv(poses, "t,roll,pitch,yaw", true);
  auto m = find_columns(text);
  ASSERT_TRUE(m.ok());
  EXPECT_EQ(m.value().euler_unit, AngleUnit::Degrees);
  EXPECT_FALSE(m.value().ambiguous);
  ExpectPoses(ReadAll(text, m.value()), poses);
  // Small angles: within 2 pi either way, the house unit decides and says so.
  const std::vector<Pose> small = {{0.01, 0.02, 0.03}, {0.02, 0.03, 0.04}, {-0.5, 0.1, 1.0}};
  ColumnPreferences prefs;
  prefs.euler_unit = AngleUnit::Radians;
  auto s = find_columns(Csv(small, "t,roll,pitch,yaw", false), prefs);
  ASSERT_TRUE(s.ok());
  EXPECT_EQ(s.value().euler_unit, AngleUnit::Radians);
  EXPECT_TRUE(s.value().ambiguous);
  bool said = false;
  for (const std::string& n : s.value().notes) said = said || n.find("house unit") != std::string::npos;
  EXPECT_TRUE(said);
  ExpectPoses(ReadAll(Csv(small, "t,roll,pitch,yaw", false), s.value()), small);
}

TEST(EulerColumnsTest, HouseNamedAngles) {
  // The invented camera-rig convention names its intrinsic YXZ angles pan, tilt, spin.
  auto house = load_convention(std::string(ATTISCOPE_SOURCE_DIR) + "/assets/conventions/camera-rig.toml");
  ASSERT_TRUE(house.ok()) << house.error().describe();
  const HouseEuler& he = house.value().convention.euler;
  ASSERT_EQ(he.names[0], "pan");
  ColumnPreferences prefs;
  prefs.euler = he.convention;
  prefs.euler_unit = he.unit;
  prefs.euler_names = he.names;
  // Columns in another order than applied, with a unit suffix on one.
  std::string text = "stamp,spin,Tilt_deg,pan\n";
  std::mt19937 rng(test::kSeed + 1);
  std::uniform_real_distribution<double> a(-170.0, 170.0), b(-80.0, 80.0);
  std::vector<Eigen::Vector3d> angles_deg;  // pan, tilt, spin
  for (int i = 0; i < 30; ++i) {
    const Eigen::Vector3d v(a(rng), b(rng), a(rng));
    angles_deg.push_back(v);
    text += std::to_string(i) + "," + test::FullPrecision(v(2)) + "," + test::FullPrecision(v(1)) + "," +
            test::FullPrecision(v(0)) + "\n";
  }
  auto m = find_columns(text, prefs);
  ASSERT_TRUE(m.ok()) << m.error().describe();
  EXPECT_EQ(m.value().form, TrackForm::Euler);
  EXPECT_EQ(m.value().euler, he.convention);
  EXPECT_EQ(m.value().euler_unit, AngleUnit::Degrees);
  const Track t = ReadAll(text, m.value());
  ASSERT_EQ(t.size(), angles_deg.size());
  for (std::size_t i = 0; i < angles_deg.size(); ++i) {
    // Intrinsic YXZ: R = Ry(pan) Rx(tilt) Rz(spin) (euler.hpp's definition of intrinsic,
    // built with Eigen's angle-axis).
    const Eigen::Vector3d r = angles_deg[i] * kPi / 180.0;
    const Eigen::Matrix3d expect = (Eigen::AngleAxisd(r(0), Eigen::Vector3d::UnitY()) *
                                    Eigen::AngleAxisd(r(1), Eigen::Vector3d::UnitX()) *
                                    Eigen::AngleAxisd(r(2), Eigen::Vector3d::UnitZ()))
                                       .toRotationMatrix();
    const Rotation got(Eigen::Quaterniond(t.qw[i], t.qx[i], t.qy[i], t.qz[i]));
    EXPECT_TRUE(test::RotationNear(got, Rotation(Eigen::Quaterniond(expect)), test::kRoundTrip)) << i;
  }
  // Without the house names the same log has no rotation columns.
  EXPECT_FALSE(find_columns(text).ok());
}

TEST(EulerColumnsTest, BadRowsNamedWithLineNumbers) {
  std::string text = "t,roll_deg,pitch_deg,yaw_deg\n";
  text += "0,1,2,3\n";       // line 2
  text += "0.1,nan,2,3\n";   // line 3: not finite
  text += "0.2,1,x,3\n";     // line 4: not a number
  text += "0.3,1,2\n";       // line 5: short
  text += "0.4,1,2,inf\n";   // line 6: not finite
  text += "0.5,10,20,30\n";  // line 7
  ColumnMapping m;
  {
    auto f = find_columns(text);
    ASSERT_TRUE(f.ok()) << f.error().describe();
    m = f.value();
  }
  const Track t = ReadAll(text, m);
  EXPECT_EQ(t.size(), 2u);
  ASSERT_EQ(t.bad_rows.size(), 4u);
  EXPECT_EQ(t.bad_rows[0].line, 3u);
  EXPECT_NE(t.bad_rows[0].reason.find("Euler angle is NaN or infinite"), std::string::npos);
  EXPECT_EQ(t.bad_rows[1].line, 4u);
  EXPECT_EQ(t.bad_rows[2].line, 5u);
  EXPECT_EQ(t.bad_rows[3].line, 6u);
  EXPECT_NE(t.bad_rows[3].reason.find("Euler angle"), std::string::npos);
  const Pose p{10 * kPi / 180, 20 * kPi / 180, 30 * kPi / 180};
  EXPECT_TRUE(test::RotationNear(Rotation(Eigen::Quaterniond(t.qw[1], t.qx[1], t.qy[1], t.qz[1])),
                                 Expected321(p), test::kRoundTrip));
}

TEST(EulerColumnsTest, JsonLines) {
  const auto poses = Poses();
  std::string text;
  for (std::size_t i = 0; i < poses.size(); ++i) {
    // Keys nested and in another order on odd lines.
    if (i % 2 == 0) {
      text += "{\"t\": " + test::FullPrecision(0.1 * static_cast<double>(i)) +
              ", \"attitude\": {\"roll_rad\": " + test::FullPrecision(poses[i].roll) +
              ", \"pitch_rad\": " + test::FullPrecision(poses[i].pitch) +
              ", \"yaw_rad\": " + test::FullPrecision(poses[i].yaw) + "}}\n";
    } else {
      text += "{\"attitude\": {\"yaw_rad\": " + test::FullPrecision(poses[i].yaw) +
              ", \"roll_rad\": " + test::FullPrecision(poses[i].roll) +
              ", \"pitch_rad\": " + test::FullPrecision(poses[i].pitch) +
              "}, \"t\": " + test::FullPrecision(0.1 * static_cast<double>(i)) + "}\n";
    }
  }
  text += "{\"t\": 99, \"attitude\": {\"roll_rad\": 1, \"pitch_rad\": 2}}\n";
  auto m = find_columns(text);
  ASSERT_TRUE(m.ok()) << m.error().describe();
  EXPECT_TRUE(m.value().json_lines);
  EXPECT_EQ(m.value().form, TrackForm::Euler);
  EXPECT_EQ(m.value().euler_unit, AngleUnit::Radians);
  Track t = ReadAll(text, m.value());
  ASSERT_EQ(t.bad_rows.size(), 1u);
  EXPECT_EQ(t.bad_rows[0].line, poses.size() + 1);
  EXPECT_NE(t.bad_rows[0].reason.find("yaw_rad"), std::string::npos);
  ExpectPoses(t, poses);
}

TEST(EulerColumnsTest, TwoThreadReadIsTheSameAsOnePass) {
  // A log well beyond the reader's 4 MB threshold for parts, and its first rows alone: the
  // samples of the long read must match the one-pass read of each block bit for bit.
  const auto poses = Poses();
  std::string block;
  for (const Pose& p : poses) {
    block += test::FullPrecision(p.roll * 180 / kPi) + "," + test::FullPrecision(p.pitch * 180 / kPi) + "," +
             test::FullPrecision(p.yaw * 180 / kPi) + "\n";
  }
  block += "1,2,nan\n";
  std::string text = "roll_deg,pitch_deg,yaw_deg\n";
  const std::size_t blocks = (std::size_t{9} << 20) / block.size() + 1;
  for (std::size_t b = 0; b < blocks; ++b) text += block;
  auto m = find_columns(text.substr(0, 64 * 1024));
  ASSERT_TRUE(m.ok());
  const Track whole = ReadAll(text, m.value());
  const Track one = ReadAll("roll_deg,pitch_deg,yaw_deg\n" + block, m.value());
  ASSERT_EQ(whole.size(), blocks * poses.size());
  ASSERT_EQ(whole.bad_rows.size(), blocks);
  for (std::size_t b = 0; b < blocks; ++b) {
    ASSERT_EQ(whole.bad_rows[b].line, 2 + (b + 1) * (poses.size() + 1) - 1) << "block " << b;
    for (std::size_t i = 0; i < poses.size(); ++i) {
      const std::size_t k = b * poses.size() + i;
      ASSERT_EQ(whole.qw[k], one.qw[i]);
      ASSERT_EQ(whole.qx[k], one.qx[i]);
      ASSERT_EQ(whole.qy[k], one.qy[i]);
      ASSERT_EQ(whole.qz[k], one.qz[i]);
      ASSERT_EQ(whole.time_s[k], static_cast<double>(k));
    }
  }
}

TEST(EulerColumnsTest, IntakeGivesAnEulerReading) {
  const auto poses = Poses();
  const std::string text = Csv(poses, "t,roll_deg,pitch_deg,yaw_deg", true);
  auto r = read_pasted(text);
  ASSERT_TRUE(r.ok()) << r.error().describe();
  ASSERT_FALSE(r.value().readings.empty());
  const Reading& first = r.value().readings.front();
  EXPECT_EQ(first.kind, IntakeKind::Euler);
  EXPECT_EQ(first.as, ReadingKind::Euler);
  EXPECT_EQ(first.euler, (EulerConvention{{Axis::Z, Axis::Y, Axis::X}, EulerKind::Intrinsic}));
  EXPECT_EQ(first.unit, AngleUnit::Degrees);
  EXPECT_TRUE(test::RotationNear(first.rotation, Expected321(poses[0]), test::kRoundTrip));
}

TEST(EulerColumnsTest, FormNumbers) {
  EXPECT_EQ(track_form_numbers(TrackForm::Euler), 3u);
  EXPECT_EQ(track_form_numbers(TrackForm::QuatXyzw), 4u);
  EXPECT_EQ(track_form_numbers(TrackForm::MatrixCols), 9u);
  EXPECT_EQ(parse_reading_kind(track_form_name(TrackForm::Euler)), ReadingKind::Euler);
}

}  // namespace
}  // namespace attiscope
