// intake_panel_test.cpp: the window's Intake panel, driven like a person would: put text on
// the clipboard, press Ctrl+V, read what the panel lists, click a reading's Load button.
// The panel is checked against the command line's `attiscope read --json` of the same text
// (the same core call, so the panel must neither drop, reorder nor rescore readings) and
// against the numbers pasted.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>

#include <nlohmann/json.hpp>

#include "cli/cli.hpp"
#include "gui/gui.hpp"
#include "support/check.hpp"
#include "support/window_fixture.hpp"

namespace attiscope::gui {
namespace {

/// Quaternions loaded from a reading come back through the document to this.
constexpr double kLoaded = 1e-9;

class IntakePanelTest : public test::WindowFixture {
 protected:
  IntakePanelTest() : WindowFixture("attiscope_intake_", "1280x800") {}

  /// `attiscope read --json` of text, through the command line's own entry point.
  static nlohmann::json read_json(const std::string& text, int* rc) {
    std::istringstream in(text);
    std::ostringstream out, err;
    *rc = cli::run_read({"--json"}, {out, err, in});
    return *rc == 0 ? nlohmann::json::parse(out.str()) : nlohmann::json();
  }

  /// Paste text with Ctrl+V, as a person would, and dump.
  std::string paste(const std::string& text, const std::string& dump_name) const {
    return "frames 2\nclipboard " + text + "\nkey ctrl+v\nframes 3\ndump " + path(dump_name) + "\n";
  }
};

TEST_F(IntakePanelTest, PastedQuaternionListsTheCommandLinesReadingsInOrder) {
  const std::string text = "q: 0.0012 -0.7071 0.0008 0.7071";
  ASSERT_EQ(run(paste(text, "0.json") + "quit\n"), 0) << err_;
  int rc = 0;
  const nlohmann::json cli = read_json(text, &rc);
  ASSERT_EQ(rc, 0);
  const nlohmann::json shown = dump("0.json")["intake"];
  ASSERT_TRUE(shown.contains("readings")) << shown.dump(2);
  ASSERT_EQ(shown["readings"].size(), cli["readings"].size()) << shown.dump(2);
  ASSERT_GE(shown["readings"].size(), 2u) << "an unlabelled-order quaternion has more than one reading";
  EXPECT_EQ(shown["ambiguous"], cli["ambiguous"]);
  for (std::size_t i = 0; i < cli["readings"].size(); ++i) {
    const auto& a = shown["readings"][i];
    const auto& b = cli["readings"][i];
    EXPECT_EQ(a["kind"], b["kind"]) << "reading " << i;
    EXPECT_EQ(a["layout"], b["layout"]) << "reading " << i;
    EXPECT_NEAR(a["score"].get<double>(), b["score"].get<double>(), 1e-12) << "reading " << i;
    for (const char* c : {"w", "x", "y", "z"})
      EXPECT_NEAR(a["quaternion"][c].get<double>(), b["quaternion"][c].get<double>(), 1e-12)
          << "reading " << i;
  }
  for (std::size_t i = 1; i < shown["readings"].size(); ++i)
    EXPECT_GE(shown["readings"][i - 1]["score"].get<double>(), shown["readings"][i]["score"].get<double>())
        << "not best first at " << i;
}

TEST_F(IntakePanelTest, LoadingTheTopReadingSetsThePoseAsOneUndoableEdit) {
  const std::string text = "q: 0.0012 -0.7071 0.0008 0.7071";
  ASSERT_EQ(run(paste(text, "0.json") + "click intake.load.0\nframes 2\ndump " + path("1.json") +
                "\nkey ctrl+z\nframes 2\ndump " + path("2.json") + "\nquit\n"),
            0)
      << err_;
  const auto d0 = dump("0.json"), d1 = dump("1.json"), d2 = dump("2.json");
  const auto& top = d0["intake"]["readings"][0]["quaternion"];
  const Rotation expected(Eigen::Quaterniond(top["w"], top["x"], top["y"], top["z"]));
  EXPECT_TRUE(test::RotationNear(pose(d1), expected, kLoaded));
  // The numbers pasted, normalised, read scalar first or scalar last: an independent check
  // that the loaded pose is the text's own numbers in one of the two layouts.
  const Eigen::Vector4d pasted(0.0012, -0.7071, 0.0008, 0.7071);
  const Eigen::Vector4d u = pasted / pasted.norm();
  const Rotation wxyz(Eigen::Quaterniond(u[0], u[1], u[2], u[3]));
  const Rotation xyzw(Eigen::Quaterniond(u[3], u[0], u[1], u[2]));
  EXPECT_TRUE(test::RotationNear(pose(d1), wxyz, kLoaded) || test::RotationNear(pose(d1), xyzw, kLoaded));
  EXPECT_EQ(d1["document"]["history"].size(), d0["document"]["history"].size() + 1);
  EXPECT_TRUE(test::RotationNear(pose(d2), pose(d0), 0.0)) << "undo did not restore the pose";
}

TEST_F(IntakePanelTest, ReflectionShowsTheErrorAndLeavesTheDocument) {
  // A mirror in z: determinant -1 (a reflection, not a rotation; common practice).
  ASSERT_EQ(
      run("frames 2\ndump " + path("0.json") + "\n" + paste("1 0 0; 0 1 0; 0 0 -1", "1.json") + "quit\n"), 0)
      << err_;
  const auto d0 = dump("0.json"), d = dump("1.json");
  int rc = 0;
  read_json("1 0 0; 0 1 0; 0 0 -1", &rc);
  EXPECT_EQ(rc, 2) << "the command line reads the same text as bad input";
  ASSERT_TRUE(d["intake"].contains("error")) << d["intake"].dump(2);
  EXPECT_NE(d["intake"]["error"]["message"].get<std::string>().find("reflection"), std::string::npos);
  EXPECT_GT(d["intake"]["error"]["line"].get<int>(), 0) << "the error names no place";
  EXPECT_EQ(d["intake"]["readings"].size(), 0u);
  EXPECT_EQ(d["widgets"].dump().find("intake.load"), std::string::npos) << "a Load button for an error";
  EXPECT_TRUE(test::RotationNear(pose(d), pose(d0), 0.0)) << "the pose moved";
  EXPECT_EQ(d["document"]["history"], d0["document"]["history"]);
}

TEST_F(IntakePanelTest, ScreenshotWithReadings) {
  const std::string shot = path("intake.png");
  ASSERT_EQ(run(paste("q: 0.0012 -0.7071 0.0008 0.7071", "0.json") + "screenshot " + shot + "\nquit\n"), 0)
      << err_;
  EXPECT_GT(std::filesystem::file_size(shot), 10000u);
  if (const char* keep = std::getenv("ATTISCOPE_KEEP_SCREENSHOTS"))
    std::filesystem::copy_file(shot, std::filesystem::path(keep) / "intake_panel.png",
                               std::filesystem::copy_options::overwrite_existing);
}

}  // namespace
}  // namespace attiscope::gui
