// convention_card_test.cpp: the Markdown convention card says what the convention says.
#include "attiscope/core/convention_card.hpp"

#include "attiscope/core/convention_file.hpp"
#include "support/check.hpp"

namespace attiscope {
namespace {

bool has(const std::string& text, const std::string& part) {
  return text.find(part) != std::string::npos;
}

TEST(ConventionCardTest, SurveyAircraftCard) {
  auto c = load_convention(std::string(ATTISCOPE_SOURCE_DIR) + "/assets/conventions/survey-aircraft.toml");
  ASSERT_TRUE(c.ok());
  const std::string md = convention_card_markdown(c.value().convention);
  EXPECT_TRUE(has(md, "# Survey aircraft (invented demo)"));
  EXPECT_TRUE(has(md, "| z | D | down |")) << md;
  EXPECT_TRUE(has(md, "| y | y | right |"));
  // Intrinsic: R = R_i(a) R_j(b) R_k(c) (design.md, "Math conventions").
  EXPECT_TRUE(has(md, "R = R_Z(heading) R_Y(elevation) R_X(bank), each turn about the body's current axis"));
  EXPECT_TRUE(has(md, "| 1 | heading | body down (z) | [0, 360) |"));
  for (const std::string& s : positive_direction_sentences(c.value().convention))
    EXPECT_TRUE(has(md, "- " + s));
  EXPECT_TRUE(has(md, "(x, y, z, w), Hamilton algebra"));
  EXPECT_TRUE(has(md, "body_R_world (the direction cosine matrix from world to body)"));
}

TEST(ConventionCardTest, ExtrinsicCardWritesTheFixedAxisProduct) {
  HouseConvention c;
  c.euler.convention = parse_euler_sequence("XYZ", EulerKind::Extrinsic).value();
  c.euler.names = {"roll", "pitch", "yaw"};
  const std::string md = convention_card_markdown(c);
  // Extrinsic: R = R_k(c) R_j(b) R_i(a) (design.md, "Math conventions").
  EXPECT_TRUE(has(md, "R = R_Z(yaw) R_Y(pitch) R_X(roll), each turn about a fixed world axis")) << md;
  EXPECT_TRUE(has(md, "| 1 | roll | world east (E) |"));
}

}  // namespace
}  // namespace attiscope
