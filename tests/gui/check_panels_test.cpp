// check_panels_test.cpp: the Compare and Mount check panels driven like a person would
// (clicks and typing through the window's test scripts), read back from the state dump and
// checked against the command line given the same inputs.
#include <gtest/gtest.h>
#include <stb_image.h>

#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>

#include <nlohmann/json.hpp>

#include "attiscope/core/mount.hpp"
#include "cli/cli.hpp"
#include "gui/gui.hpp"
#include "gui/settings.hpp"
#include "support/window_fixture.hpp"

namespace attiscope::gui {
namespace {

/// Two runs of the same core call on the same text agree to rounding.
constexpr double kSameCall = 1e-9;

class CheckPanelsTest : public test::WindowFixture {
 protected:
  CheckPanelsTest() : WindowFixture("attiscope_checks_", "1600x1000") {}

  static nlohmann::json cli_json(const std::vector<std::string>& args, int* code = nullptr) {
    std::ostringstream out, err;
    std::istringstream in;
    const int rc = cli::run(args, {out, err, in});
    if (code) *code = rc;
    return nlohmann::json::parse(out.str());
  }
};

/// Distinct colours and the spread of brightness of a PNG: a blank or one-colour picture has
/// one colour and no spread.
struct PictureStats {
  int width = 0, height = 0;
  std::size_t colours = 0;
  double luma_stddev = 0.0;
};
PictureStats picture_stats(const std::string& file) {
  PictureStats s;
  int n = 0;
  unsigned char* px = stbi_load(file.c_str(), &s.width, &s.height, &n, 3);
  if (!px) return s;
  std::set<unsigned> colours;
  double sum = 0.0, sum2 = 0.0;
  const std::size_t count = static_cast<std::size_t>(s.width) * static_cast<std::size_t>(s.height);
  for (std::size_t i = 0; i < count; ++i) {
    const unsigned char* p = px + 3 * i;
    colours.insert((unsigned{p[0]} << 16) | (unsigned{p[1]} << 8) | p[2]);
    const double y = 0.299 * p[0] + 0.587 * p[1] + 0.114 * p[2];
    sum += y;
    sum2 += y * y;
  }
  stbi_image_free(px);
  s.colours = colours.size();
  const double mean = sum / static_cast<double>(count);
  s.luma_stddev = std::sqrt(std::max(0.0, sum2 / static_cast<double>(count) - mean * mean));
  return s;
}

// The nominal as Euler angles (intrinsic ZYX, degrees: the window's and the command line's
// default reading of three numbers), the measured as a quaternion w x y z.
const char* kNominal = "10 2 -1";
const char* kMeasured = "0.9959 0.0112 0.0236 0.0841";

TEST_F(CheckPanelsTest, TypedMountGivesTheCommandLinesError) {
  ASSERT_EQ(run(std::string("frames 2\nclick tab.mount\nframes 2\nclick mount.nominal\ntype ") + kNominal +
                "\nclick mount.measured\ntype " + kMeasured + "\nframes 3\ndump " + path("mount.json") +
                "\nscreenshot " + path("mount.png") + "\nclick mount.show_in_scene\nframes 2\ndump " +
                path("scene.json") + "\n"),
            0)
      << err_;
  const auto d = dump("mount.json");
  const auto& panel = d["panels"]["mount"];
  ASSERT_TRUE(panel["result"].is_object()) << panel.dump(2);
  int code = 0;
  const auto cli = cli_json({"mount", "--nominal", kNominal, "--measured", kMeasured, "--json"}, &code);
  EXPECT_NEAR(panel["result"]["error_deg"].get<double>(), cli["error_deg"].get<double>(), kSameCall);
  EXPECT_EQ(panel["result"]["within_tolerance"], cli["within_tolerance"]);
  EXPECT_EQ(panel["result"]["verdict"], cli["verdict"]);
  // The error is several degrees, beyond the default 0.5 degree tolerance: a FAIL (exit 1).
  EXPECT_GT(cli["error_deg"].get<double>(), 1.0);
  EXPECT_EQ(code, 1);
  // The caution is drawn with the result, word for word.
  EXPECT_EQ(panel["caution"].get<std::string>(), kMountCaution);
  bool caution_drawn = false;
  for (const auto& w : d["widgets"]) caution_drawn = caution_drawn || w == "mount.caution";
  EXPECT_TRUE(caution_drawn);
  EXPECT_GT(picture_stats(path("mount.png")).colours, 20u);
  // "Show in scene": one undoable edit, measured as the pose, nominal as the reference (ghost).
  const auto scene = dump("scene.json")["document"];
  EXPECT_EQ(scene["undo_depth"].get<int>(), d["document"]["undo_depth"].get<int>() + 1);
  for (const char* k : {"w", "x", "y", "z"}) {
    EXPECT_NEAR(scene["quaternion"][k].get<double>(), cli["mount"]["quaternion"][k].get<double>(), kSameCall)
        << k;
    EXPECT_NEAR(scene["reference_quaternion"][k].get<double>(), cli["nominal"]["quaternion"][k].get<double>(),
                kSameCall)
        << k;
  }
}

TEST_F(CheckPanelsTest, VehicleAxesFollowTheHouseBodyFrameUntilTyped) {
  const std::string rover = std::string(ATTISCOPE_SOURCE_DIR) + "/assets/conventions/orchard-rover.toml";
  ASSERT_EQ(run("frames 2\nclick tab.mount\nframes 2\ndump " + path("house.json") +
                    "\nclick mount.axes\nkey ctrl+a\ntype RDF\nframes 2\ndump " + path("typed.json") +
                    "\nclick mount.axes_house\nframes 2\ndump " + path("back.json") + "\n",
                "", {rover}),
            0)
      << err_;
  // The same rule as `mount --convention FILE` without --vehicle.
  const auto cli = cli_json({"mount", "--list-aligned", "--json", "--convention", rover});
  EXPECT_EQ(dump("house.json")["panels"]["mount"]["vehicle_axes"], cli["vehicle_axes"]);
  EXPECT_EQ(dump("house.json")["panels"]["mount"]["vehicle_axes"], "FLU");
  EXPECT_EQ(dump("typed.json")["panels"]["mount"]["vehicle_axes"], "RDF");
  EXPECT_FALSE(dump("typed.json")["panels"]["mount"]["vehicle_axes_from_house"].get<bool>());
  EXPECT_EQ(dump("back.json")["panels"]["mount"]["vehicle_axes"], "FLU");
}

TEST_F(CheckPanelsTest, VectorBoxErrorNamesLineAndSolvesLikeTheCommandLine) {
  // Two resting directions in sensor and vehicle axes (invented bench pairs): sensor x points
  // along vehicle -y, sensor z along vehicle z.
  ASSERT_EQ(run("frames 2\nclick tab.mount\nframes 2\nclick mount.measured_from_vectors\nframes 2\n"
                "click mount.vectors\ntype 1 0 0 0 -1 0\nkey enter\ntype 0 0 1 0 0 zz\nframes 3\ndump " +
                path("bad.json") + "\nkey backspace\nkey backspace\ntype 1\nframes 3\ndump " +
                path("good.json") + "\n"),
            0)
      << err_;
  const auto bad = dump("bad.json")["panels"]["mount"];
  ASSERT_EQ(bad["problems"].size(), 1u) << bad.dump(2);
  EXPECT_NE(bad["problems"][0].get<std::string>().find("line 2"), std::string::npos) << bad["problems"][0];
  const auto good = dump("good.json")["panels"]["mount"];
  ASSERT_TRUE(good["result"].is_object()) << good.dump(2);
  const std::string file = path("pairs.txt");
  std::ofstream(file) << "1 0 0 0 -1 0\n0 0 1 0 0 1\n";
  const auto cli = cli_json({"mount", "--vectors", file, "--json"});
  for (const char* k : {"w", "x", "y", "z"})
    EXPECT_NEAR(good["result"]["mount"]["quaternion"][k].get<double>(),
                cli["mount"]["quaternion"][k].get<double>(), kSameCall)
        << k;
}

TEST_F(CheckPanelsTest, SetReferenceThenNudgeShowsTheStep) {
  ASSERT_EQ(run("frames 2\nclick tab.compare\nframes 2\nclick euler_house.0\ntype 30\nkey enter\nframes 2\n"
                "click compare.set_reference\nframes 2\nclick nudge.body.+y\nframes 3\ndump " +
                path("compare.json") + "\nscreenshot " + path("compare.png") + "\n"),
            0)
      << err_;
  const auto d = dump("compare.json");
  const auto& c = d["panels"]["compare"]["comparison"];
  ASSERT_TRUE(c.is_object()) << d["panels"].dump(2);
  // A nudge is a turn of the settings' step about one body axis: the compare angle is that
  // step, and the body-frame axis is body +y.
  EXPECT_NEAR(c["angle_deg"].get<double>(), Settings{}.nudge_step_deg, 1e-9);
  EXPECT_NEAR(c["body"]["axis"][1].get<double>(), 1.0, 1e-9);
}

TEST_F(CheckPanelsTest, CheckSheetIsWrittenAndNotBlank) {
  const std::string base = path("sheet");
  ASSERT_EQ(run(std::string("frames 2\nclick tab.mount\nframes 2\nclick mount.nominal\ntype ") + kNominal +
                "\nclick mount.measured\ntype " + kMeasured + "\nclick mount.sheet_base\nkey ctrl+a\ntype " +
                base + "\nframes 2\nclick mount.export\nframes 3\ndump " + path("after.json") + "\n"),
            0)
      << err_;
  const auto panel = dump("after.json")["panels"]["mount"];
  ASSERT_TRUE(std::filesystem::exists(base + ".txt")) << panel["message"];
  std::ifstream in(base + ".txt");
  const std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  EXPECT_NE(text.find(kMountCaution), std::string::npos);
  EXPECT_NE(text.find("FAIL"), std::string::npos);
  ASSERT_TRUE(std::filesystem::exists(base + ".png")) << panel["message"];
  const PictureStats s = picture_stats(base + ".png");
  EXPECT_GT(s.width, 0);
  EXPECT_GT(s.colours, 50u);
  EXPECT_GT(s.luma_stddev, 5.0);
}

TEST_F(CheckPanelsTest, CommandLineSheetPngIsNotBlank) {
  const std::string png = path("cli_sheet.png");
  int code = 0;
  cli_json({"mount", "--nominal", kNominal, "--measured", kMeasured, "--sheet-png", png, "--json"}, &code);
  EXPECT_EQ(code, 1);
  const PictureStats s = picture_stats(png);
  EXPECT_GT(s.colours, 50u);
  EXPECT_GT(s.luma_stddev, 5.0);
}

TEST_F(CheckPanelsTest, SetupChainIsDrawnInTheSceneWithTheSelectedFrame) {
  // The invented demo setup: vehicle -> plate -> imu and vehicle -> camera.
  const std::string setup = std::string(ATTISCOPE_SOURCE_DIR) + "/assets/mounts/survey-aircraft.toml";
  // The chain's inputs sit below the mount inputs: scroll down to them, as a person would.
  ASSERT_EQ(run("frames 2\nclick tab.mount\nframes 2\nscroll mount.trim -30\nframes 2\nclick "
                "mount.setup_path\ntype " +
                setup +
                "\nframes 1\nclick mount.load_setup\nframes 2\nscroll mount.load_setup -30\nframes 2\nclick "
                "mount.frame.camera\nframes 3\ndump " +
                path("chain.json") + "\nscreenshot " + path("chain.png") + "\n"),
            0)
      << err_;
  const auto chain = dump("chain.json")["panels"]["mount"]["chain"];
  EXPECT_EQ(chain["frames"].size(), 4u) << chain.dump(2);
  EXPECT_EQ(chain["selected"], "camera");
  EXPECT_TRUE(chain["shown"].get<bool>());
  ASSERT_EQ(chain["marks"].size(), 4u) << chain.dump(2);
  int selected = 0;
  for (const auto& m : chain["marks"]) selected += m["selected"].get<bool>() ? 1 : 0;
  EXPECT_EQ(selected, 1);
  EXPECT_GT(picture_stats(path("chain.png")).colours, 50u);
}

}  // namespace
}  // namespace attiscope::gui
