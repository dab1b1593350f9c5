// text_test.cpp: numbers found in a person's text with their places, and the explicit
// readings (--as ...) of such numbers as a rotation.
#include "attiscope/core/text.hpp"

#include <cmath>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/quaternion.hpp"
#include "support/check.hpp"

namespace attiscope {
namespace {

using test::kTight;

ExplicitReadingOptions Options() {
  return ExplicitReadingOptions{};
}

TEST(TextTest, ScansNumbersWithPlaces) {
  const auto r = scan_numbers(
      "  1.5, -2e-3;\n[+4 \xE2\x88\x92"
      "0.25]");
  ASSERT_TRUE(r.ok()) << r.error().describe();
  const auto& t = r.value();
  ASSERT_EQ(t.size(), 4u);
  EXPECT_EQ(t[0].value, 1.5);
  EXPECT_EQ(t[0].line, 1);
  EXPECT_EQ(t[0].column, 3);
  EXPECT_EQ(t[1].value, -2e-3);
  EXPECT_EQ(t[1].column, 8);
  EXPECT_EQ(t[2].value, 4.0);
  EXPECT_EQ(t[2].line, 2);
  EXPECT_EQ(t[2].column, 2);
  // The Unicode minus sign U+2212 counts as one column.
  EXPECT_EQ(t[3].value, -0.25);
  EXPECT_EQ(t[3].column, 5);
}

TEST(TextTest, ScansUnits) {
  const auto r = scan_numbers("30deg 0.5 rad 45\xC2\xB0 7 degrees 1radian");
  ASSERT_TRUE(r.ok()) << r.error().describe();
  const auto& t = r.value();
  ASSERT_EQ(t.size(), 5u);
  EXPECT_EQ(t[0].unit, AngleUnit::Degrees);
  EXPECT_EQ(t[1].unit, AngleUnit::Radians);
  EXPECT_EQ(t[2].unit, AngleUnit::Degrees);
  EXPECT_EQ(t[3].unit, AngleUnit::Degrees);
  EXPECT_EQ(t[4].unit, AngleUnit::Radians);
}

TEST(TextTest, NanAndInfAreNumbersThatReadingsRefuse) {
  const auto r = scan_numbers("nan -inf Infinity");
  ASSERT_TRUE(r.ok());
  EXPECT_TRUE(std::isnan(r.value()[0].value));
  EXPECT_TRUE(std::isinf(r.value()[1].value) && r.value()[1].value < 0);
  EXPECT_TRUE(std::isinf(r.value()[2].value));
  const auto q = read_explicit("1 0 nan 0", ReadingKind::QuatWxyz, Options());
  ASSERT_FALSE(q.ok());
  EXPECT_EQ(q.error().line, 1);
  EXPECT_EQ(q.error().column, 5);
}

TEST(TextTest, OutOfRangeNumbersAreNotZero) {
  // A number beyond the double range is infinite (and a reading refuses it with its place),
  // never silently 0; one below the range is 0 or subnormal.
  const auto r = scan_numbers("1e5000 -1e400 1e-400 2.5e-320");
  ASSERT_TRUE(r.ok());
  EXPECT_TRUE(std::isinf(r.value()[0].value) && r.value()[0].value > 0);
  EXPECT_TRUE(std::isinf(r.value()[1].value) && r.value()[1].value < 0);
  EXPECT_EQ(r.value()[2].value, 0.0);
  EXPECT_GT(r.value()[3].value, 0.0);
  EXPECT_LT(r.value()[3].value, 1e-319);
  const auto q = read_explicit("1e5000 0 0 1", ReadingKind::QuatWxyz, Options());
  ASSERT_FALSE(q.ok());
  EXPECT_EQ(q.error().column, 1);
}

TEST(TextTest, UnknownWordsNameTheirPlace) {
  for (const auto& [text, line, column] : std::vector<std::tuple<std::string, int, int>>{
           {"1 2 foo", 1, 5}, {"1 2\n  3x", 2, 3}, {"deg 1", 1, 1}, {"1.2.3", 1, 1}, {"information", 1, 1}}) {
    const auto r = scan_numbers(text);
    ASSERT_FALSE(r.ok()) << text;
    EXPECT_EQ(r.error().line, line) << text;
    EXPECT_EQ(r.error().column, column) << text;
    EXPECT_NE(
        r.error().describe().find("line " + std::to_string(line) + ", column " + std::to_string(column)),
        std::string::npos);
  }
}

TEST(TextTest, ReadingKindNames) {
  for (const char* name :
       {"quat-wxyz", "quat-xyzw", "matrix-rows", "matrix-cols", "euler", "axis-angle", "rotvec"}) {
    const auto k = parse_reading_kind(name);
    ASSERT_TRUE(k.has_value()) << name;
    EXPECT_EQ(reading_kind_name(*k), name);
    EXPECT_NE(reading_kind_list().find(name), std::string::npos);
  }
  EXPECT_FALSE(parse_reading_kind("quaternion").has_value());
}

TEST(TextTest, ExplicitReadings) {
  // scipy 1.10.1 layout check (references.md 2.2): x y z w (0, 0, sin45, cos45) is +90 about z.
  const Rotation rz90 = elementary_rotation(Axis::Z, M_PI / 2);
  const double h = std::sqrt(0.5);
  const std::string hs = std::to_string(h);
  EXPECT_TRUE(test::RotationNear(
      read_explicit("0 0 " + hs + " " + hs, ReadingKind::QuatXyzw, Options()).value().rotation, rz90, 1e-6));
  EXPECT_TRUE(test::RotationNear(
      read_explicit(hs + " 0 0 " + hs, ReadingKind::QuatWxyz, Options()).value().rotation, rz90, 1e-6));
  EXPECT_TRUE(test::RotationNear(
      read_explicit("0 -1 0; 1 0 0; 0 0 1", ReadingKind::MatrixRows, Options()).value().rotation, rz90,
      kTight));
  EXPECT_TRUE(test::RotationNear(
      read_explicit("0 1 0  -1 0 0  0 0 1", ReadingKind::MatrixCols, Options()).value().rotation, rz90,
      kTight));
  EXPECT_TRUE(test::RotationNear(
      read_explicit("0 0 2 90", ReadingKind::AxisAngle, Options()).value().rotation, rz90, kTight));
  EXPECT_TRUE(test::RotationNear(
      read_explicit("0 0 1.5707963267948966", ReadingKind::RotVec, Options()).value().rotation, rz90,
      kTight));
  // Euler in the chosen convention, unit per token winning over the default.
  ExplicitReadingOptions o;
  o.euler = parse_euler_sequence("ZYX", EulerKind::Extrinsic).value();
  o.unit = AngleUnit::Radians;
  const Rotation e = read_explicit("0.5 30deg -0.2", ReadingKind::Euler, o).value().rotation;
  EXPECT_TRUE(test::RotationNear(e, from_euler(o.euler, Eigen::Vector3d(0.5, M_PI / 6, -0.2)), kTight));
  // A rotvec written in degrees by its tokens.
  EXPECT_TRUE(test::RotationNear(read_explicit("0 0 90deg", ReadingKind::RotVec, Options()).value().rotation,
                                 rz90, kTight));
}

TEST(TextTest, ExplicitReadingWarnings) {
  const auto q = read_explicit("2 0 0 0", ReadingKind::QuatWxyz, Options());
  ASSERT_TRUE(q.ok());
  ASSERT_EQ(q.value().warnings.size(), 1u);
  EXPECT_NE(q.value().warnings[0].find("norm"), std::string::npos);
  const auto m = read_explicit("1.001 0 0 0 1 0 0 0 1", ReadingKind::MatrixRows, Options());
  ASSERT_TRUE(m.ok());
  ASSERT_EQ(m.value().warnings.size(), 1u);
  EXPECT_NE(m.value().warnings[0].find("nearest rotation"), std::string::npos);
  EXPECT_TRUE(read_explicit("1 0 0 0", ReadingKind::QuatWxyz, Options()).value().warnings.empty());
}

TEST(TextTest, ExplicitReadingErrorsHavePlaces) {
  struct Case {
    std::string text;
    ReadingKind kind;
    int line, column;
    std::string says;
  };
  const std::vector<Case> cases = {
      {"0 0 0 0", ReadingKind::QuatWxyz, 1, 1, "zero quaternion"},
      {"1 0 0\n0 1 0\n0 0 -1", ReadingKind::MatrixRows, 1, 1, "reflection"},
      {"1 2", ReadingKind::Euler, 1, 4, "needs 3 numbers, got 2"},
      {"1 2 3\n4", ReadingKind::Euler, 2, 1, "got 4"},
      {"1 2 3 4 5 6 7 8", ReadingKind::MatrixCols, 1, 16, "needs 9 numbers, got 8"},
      {"0 0 0 30", ReadingKind::AxisAngle, 1, 1, "zero vector"},
      {"1 0 0 inf", ReadingKind::QuatXyzw, 1, 7, "not finite"},
      {"2 0 0 0 2 0 0 0 2", ReadingKind::MatrixRows, 1, 1, "not a rotation"},
  };
  for (const Case& c : cases) {
    const auto r = read_explicit(c.text, c.kind, Options());
    ASSERT_FALSE(r.ok()) << c.text;
    EXPECT_EQ(r.error().line, c.line) << c.text << ": " << r.error().describe();
    EXPECT_EQ(r.error().column, c.column) << c.text << ": " << r.error().describe();
    EXPECT_NE(r.error().message.find(c.says), std::string::npos) << r.error().message;
  }
}

}  // namespace
}  // namespace attiscope
