// redraw_test.cpp: the window repaints only what changed (gui/redraw.hpp). The damage grid
// and the triangle comparison are checked on their own; then the real window, driven through
// edits, popups, a spin, a drag, tab changes, a resize and a scrubbed log, must give after
// every step the same pixels as a full redraw of the same frame (the `redraw-check` step).
#include <gtest/gtest.h>

#include <cmath>
#include <cstdint>
#include <fstream>
#include <random>
#include <set>
#include <tuple>
#include <utility>

#include "gui/redraw.hpp"
#include "support/window_fixture.hpp"

namespace attiscope::gui {
namespace {

/// The dirty cells of a grid, as (column, row) pairs, read through touches().
std::set<std::pair<int, int>> dirty_cells(const DamageGrid& g) {
  std::set<std::pair<int, int>> cells;
  for (int y = 0; y < g.height(); y += kCellPx)
    for (int x = 0; x < g.width(); x += kCellPx)
      if (g.touches({x, y, 1, 1})) cells.insert({x / kCellPx, y / kCellPx});
  return cells;
}

TEST(DamageGridTest, MarksTheCellsARectangleCovers) {
  DamageGrid g;
  g.begin(100, 60);  // a new size: everything dirty
  EXPECT_TRUE(g.all());
  g.begin(100, 60);
  EXPECT_FALSE(g.any());
  EXPECT_TRUE(g.mark({5, 9, 6, 2}));   // x 5..10, y 9..10: cells x 1..2, y 2
  EXPECT_FALSE(g.mark({6, 9, 2, 1}));  // already dirty
  EXPECT_EQ(dirty_cells(g), (std::set<std::pair<int, int>>{{1, 2}, {2, 2}}));
  EXPECT_TRUE(g.touches({0, 0, 5, 10}));   // reaches pixel (4, 9): cell (1, 2)
  EXPECT_FALSE(g.touches({0, 0, 4, 60}));  // column of cells 0 only
  EXPECT_EQ(g.dirty_pixels(), 2 * kCellPx * kCellPx);
  const FramebufferRect b = g.dirty_bounds({0, 0, 100, 60});
  EXPECT_EQ(std::tie(b.x, b.y, b.width, b.height), std::make_tuple(4, 8, 8, 4));
  // Cut to the rectangle asked about.
  const FramebufferRect c = g.dirty_bounds({6, 0, 100, 60});
  EXPECT_EQ(std::tie(c.x, c.width), std::make_tuple(6, 6));
  g.clear_inside({0, 0, 9, 60});  // holds cell column 1 (x 4..7) whole, not column 2
  EXPECT_EQ(dirty_cells(g), (std::set<std::pair<int, int>>{{2, 2}}));
}

TEST(DamageGridTest, RectanglesCoverExactlyTheDirtyCells) {
  DamageGrid g;
  g.begin(203, 97);  // not a whole number of cells: the last ones are cut
  g.begin(203, 97);
  const FramebufferRect marks[] = {{0, 0, 30, 9}, {20, 4, 50, 30}, {150, 60, 60, 40}, {101, 50, 2, 2}};
  for (const FramebufferRect& r : marks) g.mark(r);
  DamageGrid again;
  again.begin(203, 97);
  again.begin(203, 97);
  int area = 0;
  for (const FramebufferRect& r : g.rects()) {
    EXPECT_GE(r.x, 0);
    EXPECT_GE(r.y, 0);
    EXPECT_LE(r.x + r.width, 203);
    EXPECT_LE(r.y + r.height, 97);
    EXPECT_TRUE(again.mark(r)) << "rectangles overlap";
    area += r.width * r.height;
  }
  EXPECT_EQ(dirty_cells(again), dirty_cells(g));
  EXPECT_LE(area, g.dirty_pixels());
  // Across a 64-cell word boundary (cells 63 and 64).
  DamageGrid wide;
  wide.begin(1000, 8);
  wide.begin(1000, 8);
  wide.mark({63 * kCellPx, 0, 2 * kCellPx, 1});
  EXPECT_EQ(dirty_cells(wide), (std::set<std::pair<int, int>>{{63, 0}, {64, 0}}));
  ASSERT_EQ(wide.rects().size(), 1u);
}

DrawnTriangle tri(std::uint64_t key, FramebufferRect box) {
  return DrawnTriangle{key, box};
}

TEST(DamageGridTest, OnlyTrianglesThatChangedMarkCells) {
  DamageGrid g;
  g.begin(64, 64);
  g.begin(64, 64);
  const std::vector<DrawnTriangle> before = {tri(1, {0, 0, 4, 4}), tri(2, {8, 8, 4, 4}), tri(2, {8, 8, 4, 4}),
                                             tri(3, {20, 20, 4, 4})};
  // The same triangles in another order, one of the two equal ones gone, key 3 moved.
  const std::vector<DrawnTriangle> now = {tri(2, {8, 8, 4, 4}), tri(1, {0, 0, 4, 4}), tri(4, {40, 40, 4, 4})};
  std::vector<DrawnTriangle> sorted_before, sorted_now;
  sort_for_comparison(before, &sorted_before);
  sort_for_comparison(now, &sorted_now);
  mark_changes(sorted_before, sorted_now, g);
  EXPECT_FALSE(g.touches({0, 0, 4, 4}));
  EXPECT_TRUE(g.touches({8, 8, 4, 4}));    // one copy of key 2 went away
  EXPECT_TRUE(g.touches({20, 20, 4, 4}));  // gone
  EXPECT_TRUE(g.touches({40, 40, 4, 4}));  // new
  DamageGrid same;
  same.begin(64, 64);
  same.begin(64, 64);
  mark_changes(sorted_before, sorted_before, same);
  EXPECT_FALSE(same.any());
}

TEST(DamageGridTest, ClosingGrowsOverWholeTrianglesAndViewBoxes) {
  DamageGrid g;
  g.begin(200, 100);
  g.begin(200, 100);
  g.mark({10, 10, 4, 4});
  // A long bar under the changed glyph, a glyph on the bar's far end, one apart from both.
  const std::vector<DrawnTriangle> tris = {tri(1, {0, 8, 120, 12}), tri(2, {110, 10, 6, 6}),
                                           tri(3, {160, 60, 8, 8})};
  const std::vector<FramebufferRect> views = {{100, 40, 80, 50}};
  close_damage(g, tris, views);
  EXPECT_EQ(g.dirty_bounds({0, 0, 200, 40}).width, 120);  // the bar, whole
  EXPECT_FALSE(g.touches({160, 60, 8, 8}));               // untouched
  // A view touched at one corner repaints the box of its dirty cells.
  g.mark({176, 86, 4, 4});
  g.mark({100, 40, 4, 4});
  close_damage(g, tris, views);
  const FramebufferRect v = g.dirty_bounds(views[0]);
  EXPECT_EQ(std::tie(v.x, v.y, v.width, v.height), std::make_tuple(100, 40, 80, 50));
  EXPECT_TRUE(g.touches({160, 60, 8, 8}));  // inside the view's box now, so drawn again
}

/// The closing as first written: every triangle and region looked at in every pass.
void close_damage_by_full_passes(DamageGrid& grid, const std::vector<DrawnTriangle>& triangles,
                                 const std::vector<FramebufferRect>& regions) {
  for (bool grew = true; grew && !grid.all();) {
    grew = false;
    for (const FramebufferRect& r : regions)
      if (grid.touches(r)) grew = grid.mark(grid.dirty_bounds(r)) || grew;
    for (const DrawnTriangle& t : triangles)
      if (!t.box.empty() && grid.touches(t.box)) grew = grid.mark(t.box) || grew;
  }
}

TEST(DamageGridTest, ClosingLooksOnlyWhereItGrewAndEndsTheSame) {
  // Random glyph-sized and long boxes, in chains across bands of rows, a few views: the
  // closing that revisits only the bands where cells were marked ends with the same cells.
  std::mt19937 random(20261202);
  for (int round = 0; round < 200; ++round) {
    const int w = 320, h = 240;
    std::uniform_int_distribution<int> x(0, w - 1), y(0, h - 1), small(1, 12), large(1, 160);
    std::vector<DrawnTriangle> tris;
    const int count = 20 + round % 80;
    for (int k = 0; k < count; ++k) {
      const bool long_one = k % 9 == 0;
      tris.push_back(
          tri(static_cast<std::uint64_t>(k), {x(random), y(random), long_one ? large(random) : small(random),
                                              long_one && k % 2 ? large(random) : small(random)}));
    }
    tris.push_back(tri(999, {5, 5, 0, 7}));  // empty: never marks
    std::vector<FramebufferRect> views;
    if (round % 3 == 0) views.push_back({x(random) / 2, y(random) / 2, 60, 40});
    DamageGrid banded, full;
    banded.begin(w, h);
    banded.begin(w, h);
    full.begin(w, h);
    full.begin(w, h);
    for (int k = 0; k < 1 + round % 4; ++k) {
      const FramebufferRect seed{x(random), y(random), small(random), small(random)};
      banded.mark(seed);
      full.mark(seed);
    }
    close_damage(banded, tris, views);
    close_damage_by_full_passes(full, tris, views);
    ASSERT_EQ(dirty_cells(banded), dirty_cells(full)) << "round " << round;
  }
}

void opaque_test_callback(const ImDrawList*, const ImDrawCmd*) {}

TEST(DamageGridTest, OpaqueQuadsAreTheImagesAfterTheOpaqueCallback) {
  ImGuiContext* context = ImGui::CreateContext();
  {
    ImDrawList list(ImGui::GetDrawListSharedData());
    list._ResetForNewFrame();
    list.PushClipRect(ImVec2(0, 0), ImVec2(200, 100));
    const auto texture = reinterpret_cast<ImTextureID>(static_cast<std::uintptr_t>(7));
    list.AddImage(texture, ImVec2(5, 5), ImVec2(50, 50));  // blended: not opaque
    list.AddCallback(opaque_test_callback, nullptr);
    list.AddImage(texture, ImVec2(10.5f, 20), ImVec2(60, 90));  // opaque, two tiles in one command
    list.AddImage(texture, ImVec2(60, 20), ImVec2(110.5f, 90));
    list.AddCallback(ImDrawCallback_ResetRenderState, nullptr);
    list.AddCallback(opaque_test_callback, nullptr);
    list.AddImageQuad(texture, ImVec2(120, 10), ImVec2(190, 20), ImVec2(180, 80), ImVec2(110, 70));  // turned
    list.PushClipRect(ImVec2(150.5f, 0), ImVec2(200, 60.5f));
    list.AddImage(texture, ImVec2(140, 40), ImVec2(199, 99));  // cut by its clip rectangle
    list.PopClipRect();
    ImDrawList* lists[] = {&list};
    ImDrawData data;
    data.Valid = true;
    data.CmdLists = lists;
    data.CmdListsCount = 1;
    data.DisplayPos = ImVec2(0, 0);
    data.DisplaySize = ImVec2(200, 100);
    data.FramebufferScale = ImVec2(1, 1);
    std::vector<FramebufferRect> quads;
    opaque_quads(data, opaque_test_callback, 200, 100, &quads);
    ASSERT_EQ(quads.size(), 3u);
    // Rows are counted from the bottom (100 - 90 = 10). x 10.5..60: the centres 11.5..59.5.
    EXPECT_EQ(std::tie(quads[0].x, quads[0].y, quads[0].width, quads[0].height),
              std::make_tuple(11, 10, 49, 70));
    EXPECT_EQ(std::tie(quads[1].x, quads[1].y, quads[1].width, quads[1].height),
              std::make_tuple(60, 10, 50, 70));
    // The scissor ImGui sets for x 150.5..200, y 0..60.5: x from 150, 49 wide; y 39 (100 -
    // 60.5, rounded down) from the bottom, 60 high: top-down rows 1..61, cut by the quad to
    // 40..61 (its top at 40), framebuffer rows from the bottom 39..60.
    EXPECT_EQ(std::tie(quads[2].x, quads[2].y, quads[2].width, quads[2].height),
              std::make_tuple(150, 39, 49, 21));
    opaque_quads(data, nullptr, 200, 100, &quads);
    EXPECT_TRUE(quads.empty());
  }
  ImGui::DestroyContext(context);
}

class RedrawWindowTest : public test::WindowFixture {
 protected:
  RedrawWindowTest() : WindowFixture("attiscope_redraw_", "1280x800") {}
};

TEST_F(RedrawWindowTest, PartialFramesMatchFullRedraws) {
  // A short log of our own (invented): a turn about z at 30 deg/s, 0.1 s apart.
  {
    std::ofstream log(path("turn.csv"));
    log << "t,qw,qx,qy,qz\n";
    for (int i = 0; i < 60; ++i) {
      const double half = 0.5 * (30.0 * 0.1 * i) * 3.14159265358979323846 / 180.0;
      log << 0.1 * i << "," << std::cos(half) << ",0,0," << std::sin(half) << "\n";
    }
  }
  const std::string script =
      "frames 3\nredraw-check\n"
      "click quaternion.0\ntype 0.7\nkey tab\nframes 2\nredraw-check\n"
      "key escape\nframes 2\nredraw-check\n"
      "click spin\nframes 4\nredraw-check\nclick spin\nframes 3\nredraw-check\n"
      "click scene.model\nframes 2\nredraw-check\nkey escape\nframes 2\nredraw-check\n"
      "click scene.view.top\nframes 2\nredraw-check\n"
      "drag scene.region 60 20 right\nframes 2\nredraw-check\n"
      "click unit.rad\nframes 2\nredraw-check\n"
      "key ctrl+z\nframes 2\nredraw-check\n"
      "click tab.mount\nframes 2\nredraw-check\n"
      "click tab.track\nwait 30\nframes 2\nredraw-check\n"
      "drag track.slider 80 0\nframes 2\nredraw-check\ndump " +
      path("after_scrub.json") +
      "\n"
      "key right\nframes 2\nredraw-check\n"
      "resize 1000 700\nframes 6\nredraw-check\nclick quaternion.1\ntype 0.2\nkey enter\nframes "
      "2\nredraw-check\n"
      "dump " +
      path("state.json") + "\n";
  ASSERT_EQ(run(script, "", {path("turn.csv")}), 0) << err_;
  const nlohmann::json d = dump("state.json");
  // On Mesa's software renderer (the machine the tests run on under Xvfb) the frames are
  // partial, so the checks above compared something.
  const std::string renderer =
      d["views"]["renderer"].is_string() ? d["views"]["renderer"].get<std::string>() : "";
  EXPECT_EQ(d["redraw"], "partial") << "renderer: " << renderer;
  // The scrub moved the body in consecutive frames (drawn without smoothing); once it held
  // still the views were smoothed again.
  const nlohmann::json scrubbed = dump("after_scrub.json");
  EXPECT_NE(scrubbed["track"], nlohmann::json());
  EXPECT_EQ(scrubbed["views"]["smoothed"], true);
}

}  // namespace
}  // namespace attiscope::gui
