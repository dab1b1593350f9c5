// views_test.cpp: the Scene and Gimbal rings views in the real window (under Xvfb when there
// is no display), driven by test scripts with synthetic mouse input: a drag on the body is
// one undoable document edit about the axis the arcball promises, the preset views and the
// mouse move the camera and never the document, the Scene shows the body, and the rings
// panel's numbers are core's for the pose.
#include <gtest/gtest.h>
#include <stb_image.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>

#include <nlohmann/json.hpp>

#include "attiscope/core/euler.hpp"
#include "gui/gui.hpp"
#include "support/check.hpp"
#include "support/window_fixture.hpp"

namespace attiscope::gui {
namespace {

constexpr double kPi = 3.14159265358979323846;
constexpr double kDegPerRad = 180.0 / kPi;

class ViewsTest : public test::WindowFixture {
 protected:
  ViewsTest() : WindowFixture("attiscope_views_", "1280x800") {}

  /// The view's up direction in the world, for the default ENU world: the camera's
  /// direction toward the viewer is cos(e)(cos(a) x + sin(a) y) + sin(e) z, screen right is
  /// its azimuth derivative, and up = back x right (camera.hpp's definitions).
  static Eigen::Vector3d view_up(const nlohmann::json& d) {
    const double a = d["views"]["camera"]["azimuth_deg"].get<double>() / kDegPerRad;
    const double e = d["views"]["camera"]["elevation_deg"].get<double>() / kDegPerRad;
    const Eigen::Vector3d back(std::cos(e) * std::cos(a), std::cos(e) * std::sin(a), std::sin(e));
    const Eigen::Vector3d right(-std::sin(a), std::cos(a), 0.0);
    return back.cross(right).normalized();
  }
};

TEST_F(ViewsTest, DragOnBodyIsOneUndoableTurnAboutTheViewUpAxis) {
  ASSERT_EQ(run("frames 3\ndump " + path("0.json") + "\ndrag scene.region 60 0\nframes 2\ndump " +
                path("1.json") + "\nkey ctrl+z\nframes 2\ndump " + path("2.json") + "\n"),
            0)
      << err_;
  const auto d0 = dump("0.json"), d1 = dump("1.json"), d2 = dump("2.json");
  const Rotation p0 = pose(d0), p1 = pose(d1);
  EXPECT_GT(geodesic_angle(p0, p1), 5.0 / kDegPerRad) << "the drag did not turn the body";
  EXPECT_EQ(d1["document"]["undo_depth"].get<int>(), d0["document"]["undo_depth"].get<int>() + 1)
      << "a drag must be exactly one undo step";
  // Shoemake's arcball: a horizontal drag through the sphere's centre turns about the
  // screen's up axis, by a positive angle when dragging to the right (the near side moves
  // right). The turn is composed on the left of the pose, in world coordinates.
  const Eigen::AngleAxisd turn((p1 * p0.inverse()).quaternion());
  EXPECT_GT(turn.axis().dot(view_up(d0)) * std::copysign(1.0, turn.angle()), 0.99)
      << "turn axis " << turn.axis().transpose() << " angle " << turn.angle();
  // Every readout follows: the house Euler card shows core's angles of the new pose.
  const EulerConvention zyx{{Axis::Z, Axis::Y, Axis::X}, EulerKind::Intrinsic};
  const EulerAngles e1 = to_euler(p1, zyx);
  const auto shown = d1["cards"]["euler_house"]["numbers"].get<std::vector<double>>();
  for (int i = 0; i < 3; ++i) EXPECT_NEAR(shown[i], e1.angles_rad[i] * kDegPerRad, 1e-9) << i;
  // The camera did not move, and undo brings the pose back exactly.
  EXPECT_EQ(d1["views"]["camera"], d0["views"]["camera"]);
  EXPECT_TRUE(test::RotationNear(pose(d2), p0, 0.0));
}

TEST_F(ViewsTest, PresetsAndMouseMoveTheCameraNotTheDocument) {
  ASSERT_EQ(run("frames 3\ndump " + path("0.json") + "\nclick scene.view.top\nframes 2\ndump " +
                path("top.json") + "\nscroll scene.region 0\nkey 1\nframes 2\ndump " + path("front.json") +
                "\ndrag scene.region 80 0 right\nframes 2\ndump " + path("orbit.json") +
                "\nscroll scene.region 3\nframes 2\ndump " + path("zoom.json") + "\n"),
            0)
      << err_;
  const auto d0 = dump("0.json"), top = dump("top.json"), front = dump("front.json");
  const auto orbit = dump("orbit.json"), zoom = dump("zoom.json");
  // camera.hpp: "top" looks down from world up; "front" looks from the world's +x axis.
  EXPECT_NEAR(top["views"]["camera"]["elevation_deg"].get<double>(), 90.0, 1e-9);
  EXPECT_NEAR(front["views"]["camera"]["elevation_deg"].get<double>(), 0.0, 1e-9);
  EXPECT_NEAR(front["views"]["camera"]["azimuth_deg"].get<double>(), 0.0, 1e-9);
  EXPECT_GT(std::abs(orbit["views"]["camera"]["azimuth_deg"].get<double>()), 10.0)
      << "right drag did not orbit";
  EXPECT_LT(zoom["views"]["camera"]["distance"].get<double>(),
            orbit["views"]["camera"]["distance"].get<double>());
  for (const auto* d : {&top, &front, &orbit, &zoom}) {
    EXPECT_EQ((*d)["document"]["quaternion"], d0["document"]["quaternion"]);
    EXPECT_EQ((*d)["document"]["undo_depth"], d0["document"]["undo_depth"]);
  }
}

TEST_F(ViewsTest, SceneScreenshotShowsTheBody) {
  // The window starts on the aircraft (the demo pose is a survey aircraft's); the box,
  // seen from the front, fills the centre of the view.
  ASSERT_EQ(run("frames 3\ndump " + path("start.json") +
                "\nclick scene.model\nframes 2\nclick scene.model.box\nframes 2\nclick scene.view.front\n"
                "frames 3\ndump " +
                path("d.json") + "\nscreenshot " + path("shot.png") + "\n"),
            0)
      << err_;
  EXPECT_EQ(dump("start.json")["views"]["model"], "aircraft");
  const auto d = dump("d.json");
  EXPECT_EQ(d["views"]["model"], "box");
  int w = 0, h = 0, n = 0;
  unsigned char* px = stbi_load(path("shot.png").c_str(), &w, &h, &n, 3);
  ASSERT_NE(px, nullptr);
  const auto r = d["scene_viewport"].get<std::vector<int>>();  // x, y (bottom-left origin), w, h
  ASSERT_GT(r[2], 100);
  ASSERT_GT(r[3], 100);
  auto at = [&](int x, int y_top) { return px + 3 * (static_cast<std::size_t>(y_top) * w + x); };
  const int top = h - r[1] - r[3];
  // The background is the colour of the region's corner; the body sits at the centre.
  const unsigned char* bg = at(r[0] + 2, top + r[3] - 3);
  auto differs = [&](const unsigned char* p) {
    return std::abs(p[0] - bg[0]) + std::abs(p[1] - bg[1]) + std::abs(p[2] - bg[2]) > 60;
  };
  int centre_hits = 0;
  for (int dy = -4; dy <= 4; ++dy)
    for (int dx = -4; dx <= 4; ++dx) centre_hits += differs(at(r[0] + r[2] / 2 + dx, top + r[3] / 2 + dy));
  EXPECT_EQ(centre_hits, 81) << "the centre of the Scene is background: no body drawn";
  long body = 0;
  for (int y = top; y < top + r[3]; ++y)
    for (int x = r[0]; x < r[0] + r[2]; ++x) body += differs(at(x, y));
  EXPECT_GT(static_cast<double>(body) / (static_cast<double>(r[2]) * r[3]), 0.05);
  stbi_image_free(px);
}

TEST_F(ViewsTest, RingsNumbersAreCoresAndTableRowsPickTheConvention) {
  ASSERT_EQ(
      run("frames 3\ndump " + path("house.json") + "\nclick gimbal.table.ZXZ.intrinsic\nframes 2\ndump " +
          path("zxz.json") + "\nclick euler_house.1\ntype 88\nkey enter\nframes 2\nclick " +
          "gimbal.table.ZYX.intrinsic\nframes 2\ndump " + path("lock.json") + "\n"),
      0)
      << err_;
  auto check = [](const nlohmann::json& d, const EulerConvention& c) {
    const EulerAngles e = to_euler(pose(d), c);
    EXPECT_EQ(d["views"]["rings"]["sequence"], c.sequence());
    EXPECT_EQ(d["views"]["rings"]["kind"], c.kind_name());
    EXPECT_NEAR(d["views"]["rings"]["margin_deg"].get<double>(), e.lock_margin_rad * kDegPerRad, 1e-12);
    EXPECT_NEAR(d["views"]["rings"]["condition_number"].get<double>(),
                condition_number(euler_rate_matrix(c, e.angles_rad)), 1e-9);
  };
  const auto house = dump("house.json"), zxz = dump("zxz.json"), lock = dump("lock.json");
  check(house, EulerConvention{{Axis::Z, Axis::Y, Axis::X}, EulerKind::Intrinsic});
  check(zxz, EulerConvention{{Axis::Z, Axis::X, Axis::Z}, EulerKind::Intrinsic});
  check(lock, EulerConvention{{Axis::Z, Axis::Y, Axis::X}, EulerKind::Intrinsic});
  // Pitch 88 deg in intrinsic ZYX is 2 deg from lock (Tait-Bryan margin 90 - |pitch|,
  // common practice): the warning shows; the demo pose (pitch 4 deg) has none.
  EXPECT_NEAR(lock["views"]["rings"]["margin_deg"].get<double>(), 2.0, 1e-9);
  EXPECT_TRUE(has_widget(lock, "gimbal.warning"));
  EXPECT_FALSE(has_widget(house, "gimbal.warning"));
}

TEST_F(ViewsTest, ExportWritesThePictureAndNeverOverwritesSilently) {
  std::filesystem::create_directories(dir_ / "pictures");
  setenv("XDG_PICTURES_DIR", path("pictures").c_str(), 1);
  ASSERT_EQ(run("frames 3\nclick scene.export\nframes 2\nclick scene.export_save\nframes 3\ndump " +
                path("1.json") + "\nclick scene.export_save\nframes 2\ndump " + path("2.json") + "\n"),
            0)
      << err_;
  unsetenv("XDG_PICTURES_DIR");
  std::vector<std::filesystem::path> files;
  for (const auto& f : std::filesystem::directory_iterator(dir_ / "pictures")) files.push_back(f.path());
  ASSERT_EQ(files.size(), 1u) << "the export did not write one picture in the pictures folder";
  EXPECT_EQ(files[0].extension(), ".png");
  int w = 0, h = 0, n = 0;
  unsigned char* px = stbi_load(files[0].c_str(), &w, &h, &n, 3);
  ASSERT_NE(px, nullptr);
  EXPECT_EQ(w, 1024);
  EXPECT_EQ(h, 768);
  stbi_image_free(px);
  const auto d1 = dump("1.json"), d2 = dump("2.json");
  EXPECT_FALSE(d1["views"]["export"]["failed"].get<bool>()) << d1["views"]["export"]["message"];
  // The same name again: the popup says the file exists and Save waits for "overwrite it".
  EXPECT_TRUE(has_widget(d2, "scene.export_overwrite"));
  EXPECT_TRUE(std::filesystem::is_empty(dir_ / "cwd")) << "the export wrote into the working folder";
}

}  // namespace
}  // namespace attiscope::gui
