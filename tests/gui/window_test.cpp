// window_test.cpp: drives the real window (GLFW + Dear ImGui, under Xvfb when there is no
// display) with synthetic mouse and key input from a test script, then reads back the
// state dump the window writes: the document and every card's numbers as drawn.
#include <gtest/gtest.h>
#include <stb_image.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>

#include <Eigen/Geometry>
#include <nlohmann/json.hpp>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"
#include "gui/card_values.hpp"
#include "gui/display_convention.hpp"
#include "gui/gui.hpp"
#include "support/check.hpp"
#include "support/window_fixture.hpp"

namespace attiscope::gui {
namespace {

constexpr double kPi = 3.14159265358979323846;
/// Numbers typed at full precision come back through the card to this.
constexpr double kTyped = 1e-9;

class WindowTest : public test::WindowFixture {
 protected:
  WindowTest() : WindowFixture("attiscope_window_", "1600x900") {}

  static std::vector<double> numbers(const nlohmann::json& d, const char* card) {
    return d["cards"][card]["numbers"].get<std::vector<double>>();
  }
};

TEST_F(WindowTest, EulerEditChangesDocumentAndEveryCard) {
  ASSERT_EQ(run("frames 2\ndump " + path("before.json") +
                "\nclick euler_house.0\ntype 90\nkey enter\nframes 2\ndump " + path("after.json") + "\n"),
            0)
      << err_;
  const auto before = dump("before.json");
  const auto after = dump("after.json");
  // The house convention is intrinsic ZYX, yaw-pitch-roll; only the yaw was typed.
  const std::vector<double> old_angles = numbers(before, "euler_house");
  const EulerConvention zyx{{Axis::Z, Axis::Y, Axis::X}, EulerKind::Intrinsic};
  const Rotation want = from_euler(zyx, Eigen::Vector3d(90.0, old_angles[1], old_angles[2]) * (kPi / 180.0));
  EXPECT_TRUE(test::RotationNear(pose(after), want, kTyped));
  EXPECT_EQ(after["document"]["undo_depth"], 1);
  for (const auto& [card, value] : after["cards"].items()) {
    if (card == "euler_house") continue;
    EXPECT_NE(value["numbers"], before["cards"][card]["numbers"]) << card << " did not follow the edit";
  }
  // Every card shows the document's pose, read back through its own numbers.
  DocumentState s;
  s.world_R_body = pose(after);
  s.convention = DisplayConvention{};
  for (Card c : all_cards()) {
    const std::vector<double> shown = numbers(after, card_key(c).c_str());
    const EditCheck e = check_card_edit(c, shown, s);
    ASSERT_TRUE(e.rotation.has_value()) << card_key(c) << ": " << e.problem;
    EXPECT_TRUE(test::RotationNear(*e.rotation, want, kTyped)) << card_key(c);
  }
}

TEST_F(WindowTest, QuaternionTypedInFollowsInMatrixAndEuler) {
  // Typing q = (0.5, 0.5, 0.5, 0.5), w first: 120 deg about (1,1,1)/sqrt 3, which permutes
  // the axes x -> y -> z -> x: R = [[0,0,1],[1,0,0],[0,1,0]]. Common practice (the cyclic
  // permutation rotation); ZYX intrinsic angles (90, 0, 90) [from memory, checked by R].
  ASSERT_EQ(run("frames 2\n"
                "click quaternion.0\ntype 0.5\nkey tab\nframes 1\ndump " +
                path("mid.json") +
                "\ntype 0.5\nkey tab\nframes 1\n"
                "type 0.5\nkey tab\nframes 1\n"
                "type 0.5\nkey enter\nframes 2\ndump " +
                path("after.json") + "\n"),
            0)
      << err_;
  // Tab keeps the card's draft: nothing is committed or normalised half-way.
  const auto mid = dump("mid.json");
  EXPECT_EQ(mid["document"]["undo_depth"], 0);
  EXPECT_EQ(mid["document"]["edits"]["quaternion"]["numbers"][0], 0.5);
  const auto after = dump("after.json");
  EXPECT_EQ(after["document"]["undo_depth"], 1);
  const std::vector<double> m = numbers(after, "matrix");
  const std::vector<double> want_m = {0, 0, 1, 1, 0, 0, 0, 1, 0};
  for (std::size_t i = 0; i < 9; ++i) EXPECT_NEAR(m[i], want_m[i], kTyped) << "m[" << i << "]";
  const std::vector<double> e = numbers(after, "euler_house");
  EXPECT_NEAR(e[0], 90.0, kTyped);
  EXPECT_NEAR(e[1], 0.0, kTyped);
  EXPECT_NEAR(e[2], 90.0, kTyped);
  const std::vector<double> aa = numbers(after, "axis_angle");
  EXPECT_NEAR(aa[3], 120.0, kTyped);
  EXPECT_NEAR(aa[0], 1.0 / std::sqrt(3.0), kTyped);
}

TEST_F(WindowTest, UndoAndRedoByKeyboard) {
  ASSERT_EQ(
      run("frames 2\ndump " + path("0.json") + "\nclick euler_house.1\ntype 30\nkey enter\nframes 2\ndump " +
          path("1.json") + "\nkey ctrl+z\nframes 2\ndump " + path("2.json") +
          "\nkey ctrl+shift+z\nframes 2\ndump " + path("3.json") + "\n"),
      0)
      << err_;
  const Rotation p0 = pose(dump("0.json")), p1 = pose(dump("1.json"));
  EXPECT_GT(geodesic_angle(p0, p1), 0.1);
  EXPECT_TRUE(test::RotationNear(pose(dump("2.json")), p0, 0.0)) << "undo did not restore the pose";
  EXPECT_EQ(dump("2.json")["cards"], dump("0.json")["cards"]);
  EXPECT_TRUE(test::RotationNear(pose(dump("3.json")), p1, 0.0)) << "redo did not bring the edit back";
}

TEST_F(WindowTest, InvalidMatrixEditLeavesDocumentUnchanged) {
  ASSERT_EQ(
      run("frames 2\ndump " + path("0.json") + "\nclick matrix.0\ntype 0.9\nkey enter\nframes 2\ndump " +
          path("1.json") + "\nclick matrix.accept_nearest\nframes 2\ndump " + path("2.json") + "\n"),
      0)
      << err_;
  const auto d0 = dump("0.json"), d1 = dump("1.json"), d2 = dump("2.json");
  EXPECT_EQ(d1["document"]["quaternion"], d0["document"]["quaternion"]);
  EXPECT_EQ(d1["cards"], d0["cards"]);
  EXPECT_EQ(d1["document"]["undo_depth"], 0);
  const auto& edit = d1["document"]["edits"]["matrix"];
  EXPECT_TRUE(edit["invalid"].get<bool>());
  EXPECT_NE(edit["problem"].get<std::string>().find("orthonormality defect"), std::string::npos);
  // Accepting takes the nearest rotation of the typed matrix (SVD polar factor, core).
  std::array<double, 9> typed{};
  const auto n = edit["numbers"].get<std::vector<double>>();
  std::copy(n.begin(), n.end(), typed.begin());
  EXPECT_DOUBLE_EQ(typed[0], 0.9);
  const Eigen::Matrix3d nearest = nearest_rotation(matrix_from_numbers(typed, MatrixStorage::Rows));
  EXPECT_TRUE(test::MatrixNear(pose(d2).matrix(), nearest, 1e-12));
  EXPECT_TRUE(d2["document"]["edits"].empty());
}

TEST_F(WindowTest, ZeroQuaternionIsShownAndRefused) {
  ASSERT_EQ(run("frames 2\n"
                "click quaternion.0\ntype 0\nkey enter\nframes 1\n"
                "click quaternion.1\ntype 0\nkey enter\nframes 1\n"
                "click quaternion.2\ntype 0\nkey enter\nframes 1\ndump " +
                path("1.json") + "\nclick quaternion.3\ntype 0\nkey enter\nframes 2\ndump " + path("2.json") +
                "\n"),
            0)
      << err_;
  const auto d1 = dump("1.json"), d2 = dump("2.json");
  EXPECT_EQ(d2["document"]["quaternion"], d1["document"]["quaternion"]);
  EXPECT_TRUE(d2["document"]["edits"]["quaternion"]["invalid"].get<bool>());
  EXPECT_FALSE(d2["document"]["edits"]["quaternion"]["has_nearest"].get<bool>());
}

// The selector lists the default, then the demo files of assets/conventions/ sorted by name:
// camera-rig, orchard-rover, survey-aircraft (convention.3).
TEST_F(WindowTest, HouseConventionChangesLabelsAndNumbers) {
  ASSERT_EQ(run("frames 2\ndump " + path("0.json") +
                "\nclick convention\nframes 2\nclick convention.3\nframes 2\ndump " + path("1.json") +
                "\nkey ctrl+z\nframes 2\ndump " + path("2.json") + "\n"),
            0)
      << err_;
  const auto d0 = dump("0.json"), d1 = dump("1.json"), d2 = dump("2.json");
  EXPECT_EQ(d1["document"]["quaternion"], d0["document"]["quaternion"]) << "a view change moved the pose";
  EXPECT_EQ(d1["document"]["convention"], "Survey aircraft (invented demo)");
  EXPECT_EQ(d1["cards"]["quaternion"]["labels"], nlohmann::json({"x", "y", "z", "w"}));
  EXPECT_EQ(d1["cards"]["euler_house"]["labels"][0], "heading (Z)");
  EXPECT_EQ(d1["cards"]["euler_house"]["labels"][2], "bank (X)");
  // Hamilton body-to-world scalar-last: the same four numbers, w moved last (common practice).
  const Eigen::Quaterniond q = pose(d0).quaternion();
  const std::vector<double> shown = numbers(d1, "quaternion");
  const std::vector<double> want = {q.x(), q.y(), q.z(), q.w()};
  for (std::size_t i = 0; i < 4; ++i) EXPECT_NEAR(shown[i], want[i], 1e-15);
  // The DCM world-to-body is the transpose of world_R_body.
  const std::vector<double> m = numbers(d1, "matrix");
  const Eigen::Matrix3d r = pose(d0).matrix();
  for (int i = 0; i < 3; ++i)
    for (int k = 0; k < 3; ++k) EXPECT_NEAR(m[static_cast<std::size_t>(3 * i + k)], r(k, i), 1e-15);
  // Heading of intrinsic Z-Y-X from the matrix, atan2(r10, r00), wrapped to [0, 360) as the
  // file asks (the usual 3-2-1 extraction: common practice, from memory).
  double heading = std::atan2(r(1, 0), r(0, 0)) * 180.0 / kPi;
  if (heading < 0) heading += 360.0;
  EXPECT_NEAR(numbers(d1, "euler_house")[0], heading, 1e-9);
  // Undo brings the default back.
  EXPECT_EQ(d2["document"]["convention"], d0["document"]["convention"]);
  EXPECT_EQ(d2["cards"]["quaternion"]["labels"], d0["cards"]["quaternion"]["labels"]);
  // Settings went to the XDG folder, nothing to the working directory.
  EXPECT_TRUE(std::filesystem::exists(dir_ / "config" / "attiscope" / "settings.json"));
  EXPECT_TRUE(std::filesystem::is_empty(dir_ / "cwd"));
  std::ifstream in(dir_ / "config" / "attiscope" / "settings.json");
  const auto settings = nlohmann::json::parse(in);
  EXPECT_EQ(std::filesystem::path(settings["recent_conventions"][0].get<std::string>()).filename(),
            "survey-aircraft.toml");
}

TEST_F(WindowTest, ScreenshotIsNotBlank) {
  ASSERT_EQ(run("frames 3\nscreenshot " + path("shot.png") + "\n"), 0) << err_;
  int w = 0, h = 0, n = 0;
  unsigned char* px = stbi_load(path("shot.png").c_str(), &w, &h, &n, 3);
  ASSERT_NE(px, nullptr);
  EXPECT_EQ(w, 1600);
  EXPECT_EQ(h, 900);
  std::set<unsigned> colours;
  std::size_t differing = 0;
  const unsigned first = (px[0] << 16) | (px[1] << 8) | px[2];
  for (int i = 0; i < w * h; ++i) {
    const unsigned c = (px[3 * i] << 16) | (px[3 * i + 1] << 8) | px[3 * i + 2];
    colours.insert(c);
    if (c != first) ++differing;
  }
  stbi_image_free(px);
  EXPECT_GT(colours.size(), 50u) << "too few colours: no text or widgets drawn";
  EXPECT_GT(differing, static_cast<std::size_t>(w * h / 20)) << "almost every pixel is the same colour";
}

TEST_F(WindowTest, SurvivesTinyAndHugeWindows) {
  ASSERT_EQ(run("frames 2\nresize 320 240\nframes 3\nscreenshot " + path("small.png") +
                    "\nresize 3840 2160\nframes 3\ndump " + path("big.json") + "\nresize 320 240\nframes 2\n",
                "800x600"),
            0)
      << err_;
  const auto big = dump("big.json");
  EXPECT_EQ(big["framebuffer"], nlohmann::json({3840, 2160}));
  EXPECT_GT(big["scene_viewport"][2].get<int>(), 1000);
  EXPECT_TRUE(std::filesystem::exists(path("small.png")));
}

}  // namespace
}  // namespace attiscope::gui

namespace attiscope::gui {
namespace {

std::string demo_file(const char* name) {
  const std::string dir = assets_dir();
  return dir.empty() ? std::string() : dir + "/conventions/" + name;
}

Rotation quat_of(const nlohmann::json& wxyz) {
  return Rotation(Eigen::Quaterniond(wxyz[0], wxyz[1], wxyz[2], wxyz[3]));
}

TEST_F(WindowTest, ConventionFileOnTheCommandLineIsLoaded) {
  const std::string f = demo_file("camera-rig.toml");
  ASSERT_FALSE(f.empty()) << "assets/conventions/ not found";
  ASSERT_EQ(run("frames 2\ndump " + path("0.json") + "\n", "1600x900", {f}), 0) << err_;
  const auto d = dump("0.json");
  EXPECT_EQ(d["document"]["convention_path"], f);
  EXPECT_EQ(d["cards"]["euler_house"]["labels"][0], "pan (Y)");
}

TEST_F(WindowTest, BadFilesOnTheCommandLineExitTwo) {
  std::ofstream(path("broken.toml")) << "# a broken file\nname = \"Broken\n";
  EXPECT_EQ(run("frames 1\n", "1600x900", {path("broken.toml")}), 2);
  EXPECT_NE(err_.find("line 2"), std::string::npos) << err_;
  // A log with a header and no data: no rotation columns can be found; the message names
  // the file and the line.
  std::ofstream(path("flight.csv")) << "t,qw,qx,qy,qz\n";
  EXPECT_EQ(run("frames 1\n", "1600x900", {path("flight.csv")}), 2);
  EXPECT_NE(err_.find("flight.csv"), std::string::npos) << err_;
  EXPECT_NE(err_.find("line 2"), std::string::npos) << err_;
  EXPECT_EQ(run("frames 1\n", "1600x900", {path("missing.csv")}), 2);
  EXPECT_NE(err_.find("missing.csv"), std::string::npos) << err_;
}

TEST_F(WindowTest, MalformedFileShowsItsErrorAndKeepsTheDocument) {
  // The wrong type is on line 3, column 12 (the value of kind).
  std::ofstream(path("bad.toml")) << "# a convention with a wrong type\n[euler]\nsequence = 12\n";
  ASSERT_EQ(run("frames 2\ndump " + path("0.json") + "\nclick tab.house\nframes 2\nclick house.file\ntype " +
                path("bad.toml") + "\nkey enter\nframes 3\ndump " + path("1.json") + "\n"),
            0)
      << err_;
  const auto d0 = dump("0.json"), d1 = dump("1.json");
  EXPECT_EQ(d1["document"]["convention"], d0["document"]["convention"]);
  EXPECT_EQ(d1["document"]["undo_depth"], d0["document"]["undo_depth"]);
  EXPECT_EQ(d1["cards"], d0["cards"]);
  const std::string e = d1["house"]["error"];
  EXPECT_NE(e.find("line 3, column"), std::string::npos) << e;
  EXPECT_NE(std::find(d1["widgets"].begin(), d1["widgets"].end(), "house.error"), d1["widgets"].end());
}

TEST_F(WindowTest, HousePanelEditIsUndoableAndSaveAsWritesTheFile) {
  const std::string f = demo_file("survey-aircraft.toml");
  ASSERT_FALSE(f.empty());
  ASSERT_EQ(
      run("frames 2\nclick tab.house\nframes 2\nclick house.name.0\nkey ctrl+a\ntype psi\nkey enter\nframes "
          "3\ndump " +
              path("1.json") + "\nclick house.file\nkey ctrl+a\ntype " + path("saved.toml") +
              "\nframes 1\nclick house.save_as\nframes 3\nkey ctrl+z\nframes 1\nkey ctrl+z\nframes 2\ndump " +
              path("2.json") + "\n",
          "1600x900", {f}),
      0)
      << err_;
  const auto d1 = dump("1.json");
  EXPECT_EQ(d1["cards"]["euler_house"]["labels"][0], "psi (Z)");
  std::ifstream saved(path("saved.toml"));
  std::stringstream text;
  text << saved.rdbuf();
  EXPECT_NE(text.str().find("\"psi\""), std::string::npos) << "Save as did not write the edited names";
  auto back = load_display_convention(path("saved.toml"));
  ASSERT_TRUE(back.ok()) << back.error().describe();
  EXPECT_EQ(back.value().house.euler.names[0], "psi");
  const auto d2 = dump("2.json");  // undo of the save's path change, then of the edit
  EXPECT_EQ(d2["cards"]["euler_house"]["labels"][0], "heading (Z)");
}

// The frames the Teach panel steps through are the partial products of the convention's
// matrix product (design.md, "Math conventions"): intrinsic Z-Y-X (a, b, c) is
// R = Rz(a) Ry(b) Rx(c), built left to right; extrinsic X-Y-Z (c, b, a) is the same R built
// right to left, Rz(a) (Ry(b) (Rx(c))). Elementary turns from Eigen's AngleAxis.
TEST_F(WindowTest, TeachStepsAreThePartialProducts) {
  std::string script =
      "frames 2\nclick tab.teach\nframes 2\nclick teach.start\nframes 2\ndump " + path("s0.json") + "\n";
  for (int i = 1; i <= 3; ++i) {
    script += "click teach.forward\nframes 2\ndump " + path("s" + std::to_string(i) + ".json") + "\n";
  }
  script += "click teach.other_kind\nframes 2\n";
  for (int i = 1; i <= 3; ++i) {
    script += "click teach.forward\nframes 2\ndump " + path("o" + std::to_string(i) + ".json") + "\n";
  }
  ASSERT_EQ(run(script), 0) << err_;
  const auto s0 = dump("s0.json");
  const Rotation pose_now = pose(s0);
  const Eigen::Matrix3d r = pose_now.matrix();
  // Z-Y-X angles of the pose (the usual extraction: common practice, from memory).
  const double a = std::atan2(r(1, 0), r(0, 0));
  const double b = std::asin(-r(2, 0));
  const double c = std::atan2(r(2, 1), r(2, 2));
  using AA = Eigen::AngleAxisd;
  const Eigen::Quaterniond z(AA(a, Eigen::Vector3d::UnitZ())), y(AA(b, Eigen::Vector3d::UnitY())),
      x(AA(c, Eigen::Vector3d::UnitX()));
  const Rotation intrinsic[3] = {Rotation(z), Rotation(z * y), Rotation(z * y * x)};
  const Rotation extrinsic[3] = {Rotation(x), Rotation(y * x), Rotation(z * y * x)};
  EXPECT_TRUE(test::RotationNear(quat_of(s0["teach"]["shown"]), Rotation(), 1e-12)) << "step 0 is the start";
  for (int i = 0; i < 3; ++i) {
    const auto d = dump("s" + std::to_string(i + 1) + ".json");
    EXPECT_EQ(d["teach"]["convention"], "intrinsic ZYX");
    EXPECT_TRUE(test::RotationNear(quat_of(d["teach"]["shown"]), intrinsic[i], 1e-9))
        << "intrinsic step " << i;
    const auto o = dump("o" + std::to_string(i + 1) + ".json");
    EXPECT_EQ(o["teach"]["convention"], "extrinsic XYZ");
    EXPECT_TRUE(test::RotationNear(quat_of(o["teach"]["shown"]), extrinsic[i], 1e-9))
        << "extrinsic step " << i;
  }
  EXPECT_TRUE(test::RotationNear(intrinsic[2], pose_now, 1e-9));
  const std::string sentence = dump("s2.json")["teach"]["sentence"];
  EXPECT_NE(sentence.find("Step 2 of 3"), std::string::npos) << sentence;
  EXPECT_NE(sentence.find("pitch"), std::string::npos) << sentence;
}

}  // namespace
}  // namespace attiscope::gui
