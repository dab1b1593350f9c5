// smooth_tiles_test.cpp: the tiles the smoothing pass shades hold every pixel of the meshes
// whose footprints they are laid from (render/src/smooth_tiles.hpp). No GL: the meshes'
// vertices are projected with the renderer's own camera functions.
#include <gtest/gtest.h>

#include <cmath>
#include <vector>

#include "../../render/src/mesh_builder.hpp"
#include "../../render/src/smooth_tiles.hpp"
#include "attiscope/render/camera.hpp"
#include "attiscope/render/frames.hpp"
#include "attiscope/render/mesh.hpp"
#include "support/check.hpp"

namespace attiscope::render {
namespace {

using detail::Footprint;
using detail::PixelBox;

constexpr int kW = 900, kH = 700;

Eigen::AlignedBox3d bounds(const Mesh& m) {
  Eigen::AlignedBox3d b;
  for (const Vertex& v : m.vertices) b.extend(Eigen::Vector3d(v.position[0], v.position[1], v.position[2]));
  return b;
}

bool in_a_box(const std::vector<PixelBox>& boxes, const Eigen::Vector2d& p) {
  for (const PixelBox& b : boxes) {
    if (p.x() >= b.x && p.x() <= b.x + b.width && p.y() >= b.y && p.y() <= b.y + b.height) return true;
  }
  return false;
}

/// The square of half-side `margin` around p lies in the boxes (it is smaller than a tile,
/// so it does when its four corners do).
bool inside(const std::vector<PixelBox>& boxes, const Eigen::Vector2d& p, double margin) {
  for (double dx : {-margin, margin})
    for (double dy : {-margin, margin})
      if (!in_a_box(boxes, p + Eigen::Vector2d(dx, dy))) return false;
  return true;
}

/// Every vertex of `mesh`, placed as `f` says, projects at least kFootprintPadPx - 1 pixels
/// inside the tiles (the smoothing reads one pixel around an edge pixel).
void ExpectCovered(const Camera& cam, const Mesh& mesh, const Footprint& f) {
  const WorldFrame world = WorldFrame::enu();
  const std::vector<PixelBox> tiles = detail::footprint_tiles(cam, world, kW, kH, {f});
  ASSERT_FALSE(tiles.empty());
  long long area = 0;
  for (const PixelBox& b : tiles) area += static_cast<long long>(b.width) * b.height;
  EXPECT_LT(area, static_cast<long long>(kW) * kH);  // not simply everything
  for (const Vertex& v : mesh.vertices) {
    const Eigen::Vector3d p =
        f.offset + f.linear * Eigen::Vector3d(v.position[0], v.position[1], v.position[2]);
    const Projected q = project_to_pixel(cam, world, kW, kH, p);
    ASSERT_TRUE(q.in_front);
    const double edge = detail::kFootprintPadPx;  // the tiles stop at the view's edges
    if (q.pixel.x() < edge || q.pixel.y() < edge || q.pixel.x() > kW - edge || q.pixel.y() > kH - edge)
      continue;
    EXPECT_TRUE(inside(tiles, q.pixel, detail::kFootprintPadPx - 1.0))
        << "vertex at pixel " << q.pixel.transpose() << " outside the tiles";
  }
}

TEST(SmoothTilesTest, RingTiltedTowardTheViewerIsCovered) {
  Mesh ring;
  detail::MeshBuilder b(&ring);
  b.torus(Eigen::Vector3d::Zero(), Eigen::Vector3d::UnitZ(), 2.05, 0.034, 56, 6, detail::rgb(1, 1, 1));
  for (double s : {1.0, -1.0})
    b.cylinder(Eigen::Vector3d(s * 1.99, 0, 0), Eigen::Vector3d(s * 2.12, 0, 0), 0.055, 12,
               detail::rgb(1, 1, 1));
  Footprint f;
  f.shape = Footprint::Shape::Ring;
  f.box = bounds(ring);
  f.ring_radius = 2.05;
  f.tube_radius = 0.034;
  f.linear = Eigen::AngleAxisd(0.7, Eigen::Vector3d(1, 2, 0.5).normalized()).toRotationMatrix();
  Camera cam;
  cam.distance = 5.0;  // near: perspective widens the ring's near side
  cam.elevation_rad = 0.5;
  ExpectCovered(cam, ring, f);
}

TEST(SmoothTilesTest, ArrowAndBoxAreCovered) {
  Mesh arrow;
  detail::MeshBuilder b(&arrow);
  b.cylinder(Eigen::Vector3d::Zero(), Eigen::Vector3d(0, 0, 0.84), 0.022, 12, detail::rgb(1, 1, 1));
  b.cone(Eigen::Vector3d(0, 0, 0.82), Eigen::Vector3d(0, 0, 1.0), 0.062, 16, detail::rgb(1, 1, 1));
  Footprint stick;
  stick.shape = Footprint::Shape::Stick;
  stick.box = bounds(arrow);
  // Placed as draw_arrow does: z along the arrow, x and y scaled by its thickness.
  Eigen::Matrix3d m = Eigen::AngleAxisd(1.1, Eigen::Vector3d(0.3, -1, 0.2).normalized()).toRotationMatrix();
  m.col(0) *= 1.6;
  m.col(1) *= 1.6;
  m.col(2) *= 1.55;
  stick.linear = m;
  stick.offset = Eigen::Vector3d(0.4, -0.2, 0.3);
  Camera cam;
  cam.azimuth_rad = 0.8;
  cam.elevation_rad = 0.4;
  cam.distance = 4.0;
  ExpectCovered(cam, arrow, stick);

  Mesh box;
  detail::MeshBuilder bb(&box);
  bb.box(Eigen::Vector3d::Zero(), Eigen::Vector3d(0.8, 0.5, 0.3), detail::rgb(1, 1, 1));
  Footprint blob;
  blob.box = bounds(box);
  blob.linear = Eigen::AngleAxisd(-0.6, Eigen::Vector3d(1, 1, 1).normalized()).toRotationMatrix();
  ExpectCovered(cam, box, blob);
}

TEST(SmoothTilesTest, BehindTheCameraMeansTheWholeView) {
  Footprint f;
  f.box = Eigen::AlignedBox3d(Eigen::Vector3d::Constant(-0.5), Eigen::Vector3d::Constant(0.5));
  Camera cam;
  cam.distance = 6.0;
  f.offset = camera_pose(cam, WorldFrame::enu()).eye;  // the box holds the eye
  const std::vector<PixelBox> tiles = detail::footprint_tiles(cam, WorldFrame::enu(), kW, kH, {f});
  ASSERT_EQ(tiles.size(), 1u);
  EXPECT_EQ(tiles[0].width, kW);
  EXPECT_EQ(tiles[0].height, kH);
}

TEST(SmoothTilesTest, MergedTilesCoverEachTileOnce) {
  // Two overlapping tile rectangles: their union, each tile once.
  const std::vector<PixelBox> merged =
      detail::merge_tiles({{0, 0, 64, 32}, {32, 16, 64, 32}, {880, 688, 20, 12}}, kW, kH);
  long long area = 0;
  for (const PixelBox& b : merged) area += static_cast<long long>(b.width) * b.height;
  EXPECT_EQ(area, 64 * 32 + 64 * 32 - 32 * 16 + 20 * 12);
  for (const Eigen::Vector2d& p : {Eigen::Vector2d(1, 1), Eigen::Vector2d(95, 47), Eigen::Vector2d(899, 699)})
    EXPECT_TRUE(inside(merged, p, 0.5)) << p.transpose();
  EXPECT_FALSE(inside(merged, Eigen::Vector2d(70, 8), 0.5));
}

}  // namespace
}  // namespace attiscope::render
