// chain_picture_test.cpp: the frame chain in the scene and the mount check sheet's picture.
// Each check is about what the picture shows at places the renderer's own projection gives
// (triad colours near each frame's projected axes, the highlight ring of the selected frame,
// the vehicle and both sensor poses on the sheet), never a golden image.
#include <gtest/gtest.h>

#include <cmath>
#include <memory>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/mount.hpp"
#include "attiscope/render/chain_overlay.hpp"
#include "attiscope/render/headless.hpp"
#include "attiscope/render/mount_picture.hpp"
#include "attiscope/render/scene_renderer.hpp"
#include "support/check.hpp"
#include "support/render_suite.hpp"

namespace attiscope::render {
namespace {

constexpr double kDeg = 3.14159265358979323846 / 180.0;

class ChainPictureTest : public test::RenderSuite {};

Eigen::Vector3d color_at(const Image& img, int x, int y) {
  const std::uint8_t* p = img.pixel(std::clamp(x, 0, img.width - 1), std::clamp(y, 0, img.height - 1));
  return Eigen::Vector3d(p[0], p[1], p[2]) / 255.0;
}

/// A colour where `channel` is clearly above the other two (x red, y green, z blue).
bool dominated_by(const Eigen::Vector3d& c, int channel) {
  constexpr double kMargin = 0.18;
  for (int k = 0; k < 3; ++k) {
    if (k != channel && c[channel] < c[k] + kMargin) return false;
  }
  return true;
}

/// Some pixel within `radius` of `at` matches.
template <class Pred>
bool any_near(const Image& img, const Eigen::Vector2d& at, int radius, Pred pred) {
  for (int dy = -radius; dy <= radius; ++dy) {
    for (int dx = -radius; dx <= radius; ++dx) {
      if (pred(color_at(img, static_cast<int>(at.x()) + dx, static_cast<int>(at.y()) + dy))) return true;
    }
  }
  return false;
}

Eigen::Vector2d pixel_of(const SceneState& st, const Eigen::Vector3d& p) {
  return project_to_pixel(st.camera, st.world, st.width_px, st.height_px, p).pixel;
}

FrameChain demo_chain() {
  // world -> vehicle -> plate -> sensor, each turned a little (invented).
  FrameChain chain;
  EXPECT_TRUE(chain.add_link("world", "vehicle", elementary_rotation(Axis::Z, 25 * kDeg)).ok());
  EXPECT_TRUE(chain.add_link("vehicle", "plate", elementary_rotation(Axis::Y, -20 * kDeg)).ok());
  EXPECT_TRUE(chain.add_link("plate", "sensor", elementary_rotation(Axis::X, 35 * kDeg)).ok());
  return chain;
}

SceneState chain_scene(const std::string& selected) {
  SceneState st;
  st.width_px = 640;
  st.height_px = 480;
  st.show_labels = false;  // the triads alone
  st.world_R_body = elementary_rotation(Axis::Z, 30 * kDeg);
  auto marks = scene_chain_marks(demo_chain(), st.world, selected);
  EXPECT_TRUE(marks.ok());
  st.chain = marks.value();
  st.camera.distance = chain_view_distance(st, 6.2);
  return st;
}

TEST_F(ChainPictureTest, EveryFrameShowsItsTriadColours) {
  const SceneState st = chain_scene("");
  SceneState bare = st;
  bare.chain.clear();
  const Image with = renderer_->render_image(st);
  const Image without = renderer_->render_image(bare);
  ASSERT_EQ(st.chain.size(), 4u);
  for (const ChainFrameMark& m : st.chain) {
    for (int a = 0; a < 3; ++a) {
      // Two thirds of the way along the shaft: the arrow's colour, where there was none.
      const Eigen::Vector3d p = m.origin + (chain_axis_tip(m, a) - m.origin) * 0.6;
      const Eigen::Vector2d px = pixel_of(st, p);
      ASSERT_TRUE(px.x() > 0 && px.y() > 0 && px.x() < st.width_px && px.y() < st.height_px)
          << m.name << " axis " << a << " is off the picture";
      EXPECT_TRUE(any_near(with, px, 3, [&](const Eigen::Vector3d& c) { return dominated_by(c, a); }))
          << m.name << " axis " << a << " at " << px.transpose();
      EXPECT_FALSE(any_near(without, px, 1, [&](const Eigen::Vector3d& c) { return dominated_by(c, a); }))
          << m.name << " axis " << a << " was coloured without the chain";
    }
  }
}

TEST_F(ChainPictureTest, SelectedFrameIsHighlighted) {
  const SceneState plain = chain_scene("");
  const SceneState picked = chain_scene("plate");
  const ChainFrameMark* mark = nullptr;
  for (const ChainFrameMark& m : picked.chain) {
    if (m.name == "plate") mark = &m;
  }
  ASSERT_NE(mark, nullptr);
  ASSERT_TRUE(mark->selected);
  const Image a = renderer_->render_image(plain), b = renderer_->render_image(picked);
  // The ring around the selected origin, in the highlight colour (amber: red and green high,
  // blue low), on the side of the ring toward the world's +x on the ground.
  Eigen::Vector3d e1, e2;
  ground_axes(picked.world, &e1, &e2);
  int found = 0;
  for (int k = 0; k < 8; ++k) {
    const double t = 2.0 * 3.14159265358979323846 * k / 8.0;
    const Eigen::Vector3d up = picked.world.up.normalized();
    const Eigen::Vector3d u = up.unitOrthogonal(), v = up.cross(u);
    const Eigen::Vector3d p = mark->origin + kChainSelectedRingRadius * (std::cos(t) * u + std::sin(t) * v);
    auto amber = [](const Eigen::Vector3d& c) { return c.x() > 0.7 && c.y() > 0.5 && c.z() < 0.45; };
    if (any_near(b, pixel_of(picked, p), 2, amber)) ++found;
    EXPECT_FALSE(any_near(a, pixel_of(plain, p), 0, amber));
  }
  EXPECT_GE(found, 5) << "the highlight ring did not show around the selected frame";
}

TEST_F(ChainPictureTest, ViewsAreNamedByTheVehicle) {
  const VehicleAxes frd = parse_vehicle_axes("FRD").value();
  const WorldFrame world = vehicle_world_frame(frd);
  for (const MountView& v : mount_views()) {
    const Camera c = mount_view_camera(frd, v, Eigen::Vector3d::Zero(), 10.0);
    const Eigen::Vector3d eye = camera_pose(c, world).eye.normalized();
    if (v.name == "from behind") {
      // FRD: aft is -x, up is -z; the eye is behind and a little above.
      EXPECT_LT(eye.x(), -0.9) << eye.transpose();
      EXPECT_LT(eye.z(), 0.0);
    } else if (v.name == "from the left") {
      EXPECT_LT(eye.y(), -0.9) << eye.transpose();
    } else if (v.name == "from above") {
      EXPECT_LT(eye.z(), -0.999) << eye.transpose();
      // The vehicle's forward runs up the screen (smaller pixel y).
      const Eigen::Vector2d centre = project_to_pixel(c, world, 400, 300, Eigen::Vector3d::Zero()).pixel;
      const Eigen::Vector2d ahead = project_to_pixel(c, world, 400, 300, Eigen::Vector3d::UnitX()).pixel;
      EXPECT_LT(ahead.y(), centre.y() - 10);
      EXPECT_NEAR(ahead.x(), centre.x(), 1.0);
      // And its right is screen right.
      const Eigen::Vector2d right = project_to_pixel(c, world, 400, 300, Eigen::Vector3d::UnitY()).pixel;
      EXPECT_GT(right.x(), centre.x() + 10);
    } else {
      EXPECT_GT(eye.x(), 0.3) << v.name;   // ahead
      EXPECT_GT(eye.y(), 0.3) << v.name;   // right
      EXPECT_LT(eye.z(), -0.3) << v.name;  // above
    }
  }
  // A rover written FLU: "from behind" is still behind (-x), above is +z.
  const VehicleAxes flu = parse_vehicle_axes("FLU").value();
  const Camera behind = mount_view_camera(flu, mount_views()[0], Eigen::Vector3d::Zero(), 10.0);
  const Eigen::Vector3d eye = camera_pose(behind, vehicle_world_frame(flu)).eye.normalized();
  EXPECT_LT(eye.x(), -0.9);
  EXPECT_GT(eye.z(), 0.0);
}

TEST_F(ChainPictureTest, SheetShowsVehicleBothMountsAndTheCaution) {
  const VehicleAxes frd = parse_vehicle_axes("FRD").value();
  const Rotation nominal = Rotation::identity();
  const Rotation measured = elementary_rotation(Axis::Y, 25 * kDeg);  // far off, easy to see
  MountPictureOptions o;
  o.notes = {"FAIL: error 25 degrees (a test line)"};
  auto page = render_mount_picture(*renderer_, nominal, measured, frd, o);
  ASSERT_TRUE(page.ok()) << page.error().describe();
  ASSERT_EQ(page->width, kMountPictureWidth);
  ASSERT_EQ(page->height, kMountPictureHeight);
  const std::vector<MountView> views = mount_views();
  for (std::size_t i = 0; i < views.size(); ++i) {
    auto scene = mount_sheet_scene(nominal, measured, frd, o, views[i], false);
    ASSERT_TRUE(scene.ok());
    const Eigen::Vector2d offset(static_cast<double>(i % 2) * kMountViewWidth,
                                 kMountViewsTop + static_cast<double>(i / 2) * kMountViewHeight);
    // The vehicle's forward arrow (red) where the projection puts it, in every view but the
    // one from behind (where it points away from the eye, hidden by the vehicle).
    const ChainFrameMark& vehicle = scene->chain.front();
    if (views[i].name != "from behind") {
      const Eigen::Vector3d p = vehicle.origin + (chain_axis_tip(vehicle, 0) - vehicle.origin) * 0.9;
      EXPECT_TRUE(any_near(*page, pixel_of(*scene, p) + offset, 4,
                           [](const Eigen::Vector3d& c) { return dominated_by(c, 0); }))
          << views[i].name << ": no vehicle x arrow";
    }
    // The vehicle model covers its fuselage ahead of the centre (clear of the sensor and its
    // arrows): the view without the model differs there.
    SceneState no_vehicle = scene.value();
    no_vehicle.props.clear();
    no_vehicle.chain.clear();
    const Image bare = renderer_->render_image(no_vehicle);
    const Eigen::Vector2d hull = pixel_of(*scene, mount_vehicle_centre(frd, o.vehicle_model) +
                                                      Eigen::Vector3d::UnitX() * 0.7 * kMountVehicleHalfSize);
    EXPECT_GT((color_at(*page, static_cast<int>((hull + offset).x()), static_cast<int>((hull + offset).y())) -
               color_at(bare, static_cast<int>(hull.x()), static_cast<int>(hull.y())))
                  .norm(),
              0.05)
        << views[i].name << ": no vehicle ahead of its centre";
    // The measured sensor's z arrow tip (blue) is drawn, in every view but the one from
    // above (where it points down, away from the eye, hidden by the sensor itself).
    const Eigen::Vector3d sz = measured.matrix().col(2) * kBodyTriadLength * 0.8;
    if (views[i].name != "from above") {
      EXPECT_TRUE(any_near(*page, pixel_of(*scene, sz) + offset, 4,
                           [](const Eigen::Vector3d& c) { return dominated_by(c, 2); }))
          << views[i].name << ": no sensor z arrow";
    }
  }
  // The nominal ghost changes the picture: the same sheet with the nominal equal to the
  // measured differs around the sensor.
  auto same = render_mount_picture(*renderer_, measured, measured, frd, o);
  ASSERT_TRUE(same.ok());
  int differ = 0;
  for (std::size_t k = 0; k + 2 < same->rgba.size(); k += 4) {
    int d = 0;
    for (int c = 0; c < 3; ++c) d += std::abs(int(same->rgba[k + c]) - int(page->rgba[k + c]));
    if (d > 40) ++differ;
  }
  EXPECT_GT(differ, 2000) << "the nominal ghost did not show";
  // The caution, in its own ink, in the footer below the views.
  int caution_ink = 0;
  for (int y = kMountViewsTop + 2 * kMountViewHeight; y < page->height; ++y) {
    for (int x = 0; x < page->width; ++x) {
      const std::uint8_t* p = page->pixel(x, y);
      if (p[0] > 110 && p[0] < 190 && p[1] > 40 && p[1] < 110 && p[2] < 50) ++caution_ink;
    }
  }
  EXPECT_GT(caution_ink, 300) << "no caution text on the sheet";
}

TEST_F(ChainPictureTest, SheetDrawsTheChainInTheObliqueView) {
  const VehicleAxes frd = parse_vehicle_axes("FRD").value();
  MountPictureOptions o;
  o.chain = demo_chain();
  o.chain_selected = "sensor";
  const MountView oblique = mount_views()[3];
  auto scene = mount_sheet_scene(Rotation::identity(), Rotation::identity(), frd, o, oblique, true);
  ASSERT_TRUE(scene.ok());
  ASSERT_EQ(scene->chain.size(), 5u);  // the vehicle's own triad, then the chain's four frames
  const Image view = renderer_->render_image(scene.value());
  for (std::size_t i = 1; i < scene->chain.size(); ++i) {
    const ChainFrameMark& m = scene->chain[i];
    const Eigen::Vector2d px = pixel_of(*scene, m.origin + (chain_axis_tip(m, 2) - m.origin) * 0.6);
    EXPECT_TRUE(px.x() > 0 && px.y() > 0 && px.x() < view.width && px.y() < view.height) << m.name;
    EXPECT_TRUE(any_near(view, px, 3, [](const Eigen::Vector3d& c) { return dominated_by(c, 2); }))
        << m.name << " z axis";
  }
  o.chain_selected = "gps";
  EXPECT_FALSE(mount_sheet_scene(Rotation::identity(), Rotation::identity(), frd, o, oblique, true).ok());
}

}  // namespace
}  // namespace attiscope::render
