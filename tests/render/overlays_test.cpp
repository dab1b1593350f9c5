// overlays_test.cpp: the teaching overlays (faded triads, the highlighted turn and its
// arc) change the picture where they are drawn, and the convention card is a real picture.
#include <gtest/gtest.h>

#include <Eigen/Geometry>
#include <cmath>
#include <memory>

#include "../../render/src/overlays.hpp"
#include "attiscope/render/card.hpp"
#include "attiscope/render/headless.hpp"
#include "attiscope/render/scene_renderer.hpp"

namespace attiscope::render {
namespace {

constexpr double kQuarter = 3.14159265358979323846 / 2.0;

int differing_pixels(const Image& a, const Image& b) {
  int n = 0;
  for (std::size_t i = 0; i + 3 < a.rgba.size(); i += 4) {
    int d = 0;
    for (int k = 0; k < 3; ++k) d += std::abs(int(a.rgba[i + k]) - int(b.rgba[i + k]));
    if (d > 30) ++n;
  }
  return n;
}

TEST(OverlaysTest, ArcRunsFromTheStartFrameThroughTheAngle) {
  TurnHighlight t;
  t.axis_world = Eigen::Vector3d::UnitZ();
  t.shown_rad = kQuarter;
  const auto pts = detail::turn_arc_points(t);
  ASSERT_GE(pts.size(), 2u);
  // Identity start: the body axis most perpendicular to z is x; a positive quarter turn
  // about z takes x to y (right-hand rule).
  EXPECT_NEAR((pts.front() - Eigen::Vector3d(kTurnArcRadius, 0, 0)).norm(), 0.0, 1e-12);
  EXPECT_NEAR((pts.back() - Eigen::Vector3d(0, kTurnArcRadius, 0)).norm(), 0.0, 1e-12);
  for (const auto& p : pts) EXPECT_NEAR(p.norm(), kTurnArcRadius, 1e-12);
}

TEST(OverlaysTest, FadedTriadsAndTurnAppearInThePicture) {
  auto ctx = HeadlessContext::create();
  ASSERT_TRUE(ctx.ok()) << ctx.error().describe();
  auto r = SceneRenderer::create();
  ASSERT_TRUE(r.ok()) << r.error().describe();
  SceneState plain;
  plain.width_px = 320;
  plain.height_px = 240;
  plain.world_R_body = Rotation(Eigen::Quaterniond(Eigen::AngleAxisd(0.6, Eigen::Vector3d::UnitZ())));
  const Image base = r.value()->render_image(plain);

  SceneState faded = plain;
  faded.faded_triads.push_back({Rotation(), 0.35f});
  const Image with_faded = r.value()->render_image(faded);
  EXPECT_GT(differing_pixels(base, with_faded), 100) << "the faded triad at identity did not show";

  SceneState turned = plain;
  TurnHighlight t;
  t.axis_world = Eigen::Vector3d::UnitZ();
  t.angle_rad = 0.6;
  t.shown_rad = 0.6;
  t.label = "yaw +34.4 deg";
  turned.turns.push_back(t);
  const Image with_turn = r.value()->render_image(turned);
  EXPECT_GT(differing_pixels(base, with_turn), 200) << "the turn's axis and arc did not show";
  // Nothing extra drawn: the same picture as before.
  EXPECT_EQ(differing_pixels(base, r.value()->render_image(plain)), 0);
}

TEST(OverlaysTest, ConventionCardIsNotBlank) {
  auto ctx = HeadlessContext::create();
  ASSERT_TRUE(ctx.ok()) << ctx.error().describe();
  HouseConvention c;
  c.euler.names = {"heading", "elevation", "bank"};
  auto img = render_convention_card(c);
  ASSERT_TRUE(img.ok()) << img.error().describe();
  EXPECT_EQ(img.value().width, kCardWidth);
  // The text side has ink: dark pixels right of the scene.
  int ink = 0;
  for (int y = 0; y < img.value().height; ++y)
    for (int x = kCardSceneSide; x < img.value().width; ++x)
      if (img.value().pixel(x, y)[0] < 100) ++ink;
  EXPECT_GT(ink, 2000);
  const auto lines = card_text_lines(c);
  bool names = false;
  for (const auto& l : lines) names = names || l.find("heading") != std::string::npos;
  EXPECT_TRUE(names);
}

}  // namespace
}  // namespace attiscope::render
