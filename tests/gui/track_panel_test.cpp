// track_panel_test.cpp: the Track panel driven like a person would (the real window and its
// test scripts): open a generated log, wait for the background load, step the timeline with
// the keyboard, jump to a diagnosis event from the table, pin a reference, edit the column
// mapping, open JSON lines from the path box, zoom and pan a plot, export a clean copy. The
// dumped state is checked against the generated motion (where each fault was injected) and
// against `attiscope track --json` and `--export` on the same file (the same core calls).
#include <gtest/gtest.h>
#include <stb_image.h>

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>

#include <nlohmann/json.hpp>

#include "attiscope/core/columns.hpp"
#include "attiscope/core/track_analysis.hpp"
#include "cli/cli.hpp"
#include "support/check.hpp"
#include "support/track_gen.hpp"
#include "support/window_fixture.hpp"

namespace attiscope::gui {
namespace {

/// Poses put into the document from a log written with 17 digits match the generated ones.
constexpr double kFromLog = 1e-12;

Rotation SampleRotation(const Track& t, std::size_t i) {
  return Rotation(Eigen::Quaterniond(t.qw[i], t.qx[i], t.qy[i], t.qz[i]));
}

class TrackPanelTest : public test::WindowFixture {
 protected:
  TrackPanelTest() : WindowFixture("attiscope_track_panel_", "1600x900") {}

  /// An invented rover run (50 Hz): yaw 150.3 + 10 t deg crosses 180 deg at sample 149 (a
  /// wrap), the quaternion sign flips from sample 400 on, and file line 302 (after sample
  /// 299) is malformed.
  static Track Generated() {
    Track t = test::TrackFromEuler(EulerConvention{}, 600, 0.02, [](double time) {
      return Eigen::Vector3d(150.3 + 10.0 * time, 2.0 * std::sin(time), 1.0);
    });
    test::ScaleSamples(&t, 400, t.size(), -1.0);
    return t;
  }
  static constexpr std::size_t kWrapSample = 149;
  static constexpr std::size_t kFlipSample = 400;
  static constexpr std::size_t kBadLine = 302;

  std::string WriteLog(const Track& t, const std::string& name) const {
    std::ofstream f(path(name));
    f << "t,qw,qx,qy,qz\n";
    for (std::size_t i = 0; i < t.size(); ++i) {
      f << test::FullPrecision(t.time_s[i]) << ',' << test::FullPrecision(t.qw[i]) << ','
        << test::FullPrecision(t.qx[i]) << ',' << test::FullPrecision(t.qy[i]) << ','
        << test::FullPrecision(t.qz[i]) << '\n';
      if (i == 299) f << "5.99,0.5,oops,0.5,0.5\n";
    }
    return path(name);
  }

  static nlohmann::json Cli(const std::vector<std::string>& args) {
    std::ostringstream out, err;
    std::istringstream in;
    EXPECT_EQ(cli::run(args, {out, err, in}), 0) << err.str();
    return out.str().empty() || out.str()[0] != '{' ? nlohmann::json() : nlohmann::json::parse(out.str());
  }
};

TEST_F(TrackPanelTest, OpenStepJumpToAnEventAndPinAReference) {
  const Track t = Generated();
  const std::string log = WriteLog(t, "rover.csv");
  const std::string script = "frames 2\nwait\nframes 2\ndump " + path("0.json") +
                             "\nkey period\nframes 1\nkey period\nframes 2\ndump " + path("1.json") +
                             "\nkey comma\nframes 2\ndump " + path("2.json") +
                             "\nclick track.tab.events\nframes 2\nclick track.event.1\nframes 2\ndump " +
                             path("3.json") + "\nclick track.pin\nframes 2\ndump " + path("4.json") + "\n";
  ASSERT_EQ(run(script, "", {log}), 0) << err_;
  const auto d0 = dump("0.json"), d1 = dump("1.json"), d2 = dump("2.json"), d3 = dump("3.json"),
             d4 = dump("4.json");
  ASSERT_FALSE(d0["track"]["loading"].get<bool>());
  ASSERT_TRUE(d0["track"].contains("report")) << d0["track"].dump(2);
  const auto& report = d0["track"]["report"];
  EXPECT_EQ(report["samples"], t.size());
  ASSERT_EQ(report["bad_rows"].size(), 1u) << report["bad_rows"].dump();
  EXPECT_EQ(report["bad_rows"][0]["line"], kBadLine);
  // The panel's diagnosis is the command line's on the same file (same core call, same
  // default convention, intrinsic ZYX), and it finds what was injected and nothing else.
  const nlohmann::json cli = Cli({"track", log, "--json"});
  EXPECT_EQ(report["events"], cli["events"]);
  ASSERT_EQ(report["events"].size(), 2u) << report["events"].dump();
  EXPECT_EQ(report["events"][0]["sample"], kWrapSample);
  EXPECT_EQ(report["events"][0]["kind"], "wrap");
  EXPECT_EQ(report["events"][1]["sample"], kFlipSample);
  EXPECT_EQ(report["events"][1]["kind"], "sign_flip");
  EXPECT_TRUE(d0["track"]["tab_open"].get<bool>()) << "opening a log brings the Track tab forward";

  // Opening puts sample 0 into the document; '.' twice is sample 2, ',' once back to 1.
  EXPECT_EQ(d0["track"]["sample"], 0);
  EXPECT_TRUE(test::RotationNear(test::WindowFixture::pose(d0), SampleRotation(t, 0), kFromLog));
  EXPECT_EQ(d1["track"]["sample"], 2);
  EXPECT_TRUE(test::RotationNear(pose(d1), SampleRotation(t, 2), kFromLog));
  EXPECT_NE(d1["cards"]["euler_house"]["numbers"], d0["cards"]["euler_house"]["numbers"])
      << "the readouts did not follow the timeline";
  EXPECT_EQ(d2["track"]["sample"], 1);
  EXPECT_TRUE(test::RotationNear(pose(d2), SampleRotation(t, 1), kFromLog));

  // The second event row is the sign flip: the timeline jumps there, the pose is the same
  // rotation as the sample before (only the sign changed) moved on by one step.
  EXPECT_EQ(d3["track"]["sample"], kFlipSample);
  EXPECT_TRUE(test::RotationNear(pose(d3), SampleRotation(t, kFlipSample), kFromLog));
  EXPECT_NEAR(d3["track"]["time_s"].get<double>(), 0.02 * kFlipSample, 1e-12);

  // Pin: the reference is the sample's rotation, one undoable step named after it.
  EXPECT_TRUE(test::RotationNear(reference(d4), SampleRotation(t, kFlipSample), kFromLog));
  EXPECT_TRUE(test::RotationNear(pose(d4), pose(d3), 0.0));
  const auto history = d4["document"]["history"].get<std::vector<std::string>>();
  ASSERT_FALSE(history.empty());
  EXPECT_EQ(history.back(), "reference = track sample " + std::to_string(kFlipSample));
}

TEST_F(TrackPanelTest, ColumnEditRereadsScalarLast) {
  // Every number positive: the data cannot tell which end holds the scalar, and neither can
  // the header; the house layout (scalar first) decides until the person says otherwise.
  Track t = test::TrackFromEuler(EulerConvention{}, 200, 0.01,
                                 [](double time) { return Eigen::Vector3d(30.0 + 5.0 * time, 20.0, 25.0); });
  std::ofstream f(path("rig.csv"));
  f << "stamp_ms,a,b,c,d\n";
  for (std::size_t i = 0; i < t.size(); ++i) {
    ASSERT_GT(std::min({t.qw[i], t.qx[i], t.qy[i], t.qz[i]}), 0.0) << "sample " << i;
    // Written scalar last.
    f << test::FullPrecision(t.time_s[i] * 1e3) << ',' << test::FullPrecision(t.qx[i]) << ','
      << test::FullPrecision(t.qy[i]) << ',' << test::FullPrecision(t.qz[i]) << ','
      << test::FullPrecision(t.qw[i]) << '\n';
  }
  f.close();
  ASSERT_EQ(run("frames 2\nwait\nframes 2\ndump " + path("0.json") +
                    "\nclick track.tab.columns\nframes 2\nclick track.scalar_last\nframes 2\nwait\nframes 2\n"
                    "key period\nframes 2\ndump " +
                    path("1.json") + "\n",
                "", {path("rig.csv")}),
            0)
      << err_;
  const auto d0 = dump("0.json"), d1 = dump("1.json");
  EXPECT_EQ(d0["track"]["mapping"]["columns"][1]["role"], "quaternion w") << d0["track"]["mapping"].dump(2);
  EXPECT_EQ(d0["track"]["mapping"]["time_unit"], "ms");
  EXPECT_EQ(d1["track"]["mapping"]["columns"][4]["role"], "quaternion w") << d1["track"]["mapping"].dump(2);
  EXPECT_EQ(d1["track"]["mapping"]["columns"][1]["role"], "quaternion x");
  EXPECT_EQ(d1["track"]["sample"], 1);
  EXPECT_NEAR(d1["track"]["time_s"].get<double>(), 0.01, 1e-15) << "milliseconds not scaled";
  EXPECT_TRUE(test::RotationNear(pose(d1), SampleRotation(t, 1), kFromLog));
}

TEST_F(TrackPanelTest, HouseNamedAnglesOpenFromTheCommandLine) {
  // An invented camera-rig log in the rig's own angle names (assets/conventions/camera-rig.toml:
  // pan, tilt, spin, intrinsic YXZ, degrees).
  std::ofstream f(path("rig.csv"));
  f << "t,pan,tilt,spin\n";
  for (int i = 0; i < 50; ++i) f << 0.1 * i << ',' << 2.0 * i << ',' << -0.5 * i << ",3\n";
  f.close();
  // With the default house convention its columns are not found: the window does not open.
  EXPECT_EQ(run("frames 1\n", "", {path("rig.csv")}), 2);
  EXPECT_NE(err_.find("rig.csv"), std::string::npos) << err_;
  // Given after the rig's convention, it opens, read in that convention.
  const std::string rig = std::string(ATTISCOPE_SOURCE_DIR) + "/assets/conventions/camera-rig.toml";
  ASSERT_EQ(run("wait\nframes 2\ndump " + path("0.json") + "\n", "", {rig, path("rig.csv")}), 0) << err_;
  const auto d = dump("0.json");
  EXPECT_EQ(d["track"]["report"]["samples"], 50);
  // The first sample is pan 0, tilt 0, spin 3 degrees: a turn of 3 degrees about the body's z.
  const EulerConvention yxz{{Axis::Y, Axis::X, Axis::Z}, EulerKind::Intrinsic};
  constexpr double kDegree = 3.14159265358979323846 / 180.0;
  EXPECT_TRUE(test::RotationNear(pose(d), from_euler(yxz, Eigen::Vector3d(0.0, 0.0, 3.0) * kDegree), 1e-9));
}

TEST_F(TrackPanelTest, JsonLinesFromThePathBox) {
  const Track t = Generated();
  std::ofstream f(path("rover.jsonl"));
  for (std::size_t i = 0; i < t.size(); ++i) {
    f << "{\"t\": " << test::FullPrecision(t.time_s[i]) << ", \"q\": {\"w\": " << test::FullPrecision(t.qw[i])
      << ", \"x\": " << test::FullPrecision(t.qx[i]) << ", \"y\": " << test::FullPrecision(t.qy[i])
      << ", \"z\": " << test::FullPrecision(t.qz[i]) << "}}\n";
    if (i == 10) f << "{\"t\": 0.21, \"q\": {\"w\": 1, \"x\": 0}}\n";  // line 12: no y, z
  }
  f.close();
  ASSERT_EQ(run("frames 2\nclick tab.track\nframes 2\nclick track.path\ntype " + path("rover.jsonl") +
                "\nclick track.open\nframes 2\nwait\nframes 2\nkey period\nframes 2\ndump " + path("0.json") +
                "\n"),
            0)
      << err_;
  const auto d = dump("0.json");
  EXPECT_TRUE(d["track"]["mapping"]["json_lines"].get<bool>());
  EXPECT_EQ(d["track"]["report"]["samples"], t.size());
  ASSERT_EQ(d["track"]["report"]["bad_rows"].size(), 1u);
  EXPECT_EQ(d["track"]["report"]["bad_rows"][0]["line"], 12);
  EXPECT_EQ(d["track"]["report"]["events"].size(), 2u);
  EXPECT_TRUE(test::RotationNear(pose(d), SampleRotation(t, 1), kFromLog));
}

TEST_F(TrackPanelTest, WheelZoomsAndDragPansThePlots) {
  const std::string log = WriteLog(Generated(), "rover.csv");
  const std::string shot = path("track.png");
  ASSERT_EQ(run("frames 2\nwait\nframes 2\ndump " + path("0.json") +
                    "\nscroll track.plot.euler 3\nframes 2\ndump " + path("1.json") +
                    "\ndrag track.plot.euler 200 0\nframes 2\ndump " + path("2.json") + "\nscreenshot " +
                    shot + "\n",
                "", {log}),
            0)
      << err_;
  const auto v0 = dump("0.json")["track"]["view"], v1 = dump("1.json")["track"]["view"],
             v2 = dump("2.json")["track"]["view"];
  const double span0 = v0[1].get<double>() - v0[0].get<double>();
  const double span1 = v1[1].get<double>() - v1[0].get<double>();
  EXPECT_NEAR(span0, 0.02 * 599, 1e-9) << "the whole track at first";
  EXPECT_NEAR(span1, span0 * std::pow(0.8, 3), 1e-9) << "three notches in";
  EXPECT_NEAR(v2[1].get<double>() - v2[0].get<double>(), span1, 1e-9) << "a pan keeps the zoom";
  EXPECT_LT(v2[0].get<double>(), v1[0].get<double>()) << "dragging right shows earlier times";
  if (const char* keep = std::getenv("ATTISCOPE_KEEP_SCREENSHOTS"))
    std::filesystem::copy_file(shot, std::filesystem::path(keep) / "track_panel.png",
                               std::filesystem::copy_options::overwrite_existing);
}

/// The columns (window x, whole pixels) inside `rect` (x0, y0, x1, y1) where two screenshots
/// of the same size differ; empty when either cannot be read.
std::vector<int> DifferingColumns(const std::string& a_png, const std::string& b_png,
                                  const nlohmann::json& rect) {
  int wa = 0, ha = 0, wb = 0, hb = 0, n = 0;
  unsigned char* a = stbi_load(a_png.c_str(), &wa, &ha, &n, 3);
  unsigned char* b = stbi_load(b_png.c_str(), &wb, &hb, &n, 3);
  std::vector<int> out;
  if (a && b && wa == wb && ha == hb) {
    const int x0 = std::max(0, static_cast<int>(rect[0].get<double>()));
    const int y0 = std::max(0, static_cast<int>(rect[1].get<double>()));
    const int x1 = std::min(wa, static_cast<int>(rect[2].get<double>()));
    const int y1 = std::min(ha, static_cast<int>(rect[3].get<double>()));
    for (int x = x0; x < x1; ++x) {
      for (int y = y0; y < y1; ++y) {
        const std::size_t i =
            3 * (static_cast<std::size_t>(y) * static_cast<std::size_t>(wa) + static_cast<std::size_t>(x));
        if (a[i] != b[i] || a[i + 1] != b[i + 1] || a[i + 2] != b[i + 2]) {
          out.push_back(x);
          break;
        }
      }
    }
  }
  if (a) stbi_image_free(a);
  if (b) stbi_image_free(b);
  return out;
}

TEST_F(TrackPanelTest, ScrubMovesOnlyTheCursorAndZoomRedrawsTheCurves) {
  // The plotted curves are a picture painted once per view: stepping the timeline must
  // change a plot only where the cursor was and is now, paint no picture, and a zoom must
  // paint the curves anew (no stale picture).
  const Track t = Generated();
  const std::string log = WriteLog(t, "rover.csv");
  std::string steps;
  for (int k = 0; k < 20; ++k) steps += "key period\nframes 1\n";
  ASSERT_EQ(run("frames 2\nwait\nframes 2\ndump " + path("0.json") + "\nscreenshot " + path("0.png") + "\n" +
                    steps + "frames 1\ndump " + path("1.json") + "\nscreenshot " + path("1.png") +
                    "\nscroll track.plot.euler 3\nframes 2\ndump " + path("2.json") + "\nscreenshot " +
                    path("2.png") + "\n",
                "", {log}),
            0)
      << err_;
  const auto d0 = dump("0.json")["track"], d1 = dump("1.json")["track"], d2 = dump("2.json")["track"];
  ASSERT_TRUE(d0["pictures"].get<bool>()) << "the plots fell back to drawing straight";
  ASSERT_TRUE(d0["plots"].contains("euler")) << d0["plots"].dump();
  EXPECT_EQ(d1["sample"].get<std::size_t>(), d0["sample"].get<std::size_t>() + 20);
  EXPECT_GT(d0["picture_paints"].get<std::size_t>(), 0u);
  EXPECT_EQ(d1["picture_paints"], d0["picture_paints"]) << "a scrub painted a plot picture";
  EXPECT_GT(d2["picture_paints"].get<std::size_t>(), d1["picture_paints"].get<std::size_t>())
      << "a zoom did not paint the curves anew";
  // Where the cursor is drawn: the sample's time in the view, across the plot's width.
  const auto rect = d0["plots"]["euler"];
  const double x0 = rect[0].get<double>(), w = rect[2].get<double>() - x0;
  const double v0 = d0["view"][0].get<double>(), v1 = d0["view"][1].get<double>();
  auto cursor_x = [&](const nlohmann::json& d) {
    return x0 + (d["time_s"].get<double>() - v0) / (v1 - v0) * w;
  };
  const double xa = cursor_x(d0), xb = cursor_x(d1);
  ASSERT_GT(std::abs(xb - xa), 8.0) << "the step should move the cursor visibly";
  const std::vector<int> scrubbed = DifferingColumns(path("0.png"), path("1.png"), rect);
  EXPECT_FALSE(scrubbed.empty()) << "the cursor did not move on the plot";
  for (int x : scrubbed)
    EXPECT_TRUE(std::abs(x - xa) <= 2.0 || std::abs(x - xb) <= 2.0)
        << "column " << x << " changed; the cursor went from " << xa << " to " << xb;
  // Three notches in: the Euler curves are drawn anew across most of the plot.
  const std::vector<int> zoomed = DifferingColumns(path("1.png"), path("2.png"), rect);
  EXPECT_GT(static_cast<double>(zoomed.size()), 0.5 * w) << "the zoomed plot looks like the old one";
}

TEST_F(TrackPanelTest, ExportWritesTheCommandLinesCleanCopy) {
  const Track t = Generated();
  const std::string log = WriteLog(t, "rover.csv");
  const std::string gui_out = path("gui.csv"), cli_out = path("cli.csv");
  ASSERT_EQ(run("frames 2\nwait\nframes 2\nclick track.tab.export\nframes 2\nclick track.export_path\nkey "
                "ctrl+a\ntype " +
                    gui_out + "\nframes 1\nclick track.export\nwait\nframes 2\ndump " + path("0.json") + "\n",
                "", {log}),
            0)
      << err_;
  const auto d = dump("0.json");
  EXPECT_NE(d["track"]["export_message"].get<std::string>().find("wrote"), std::string::npos)
      << d["track"]["export_message"];
  EXPECT_GT(d["track"]["export_changes"].get<int>(), 0) << "the sign flip was not listed as a change";
  Cli({"track", log, "--export", cli_out});
  std::ifstream a(gui_out), b(cli_out);
  std::stringstream sa, sb;
  sa << a.rdbuf();
  sb << b.rdbuf();
  ASSERT_FALSE(sa.str().empty());
  EXPECT_EQ(sa.str(), sb.str()) << "the panel and the command line wrote different files";
  // Re-read through the intake's reader: the same rotations, no sign flips left.
  auto head = read_file_head(gui_out);
  ASSERT_TRUE(head);
  auto m = find_columns(head.value());
  ASSERT_TRUE(m) << m.error().describe();
  auto back = read_track_file(gui_out, m.value());
  ASSERT_TRUE(back);
  ASSERT_EQ(back.value().size(), t.size());
  for (std::size_t i = 0; i < t.size(); ++i) {
    ASSERT_TRUE(test::RotationNear(SampleRotation(back.value(), i), SampleRotation(t, i), kFromLog)) << i;
    if (i > 0) {
      const Track& r = back.value();
      ASSERT_GE(r.qw[i] * r.qw[i - 1] + r.qx[i] * r.qx[i - 1] + r.qy[i] * r.qy[i - 1] + r.qz[i] * r.qz[i - 1],
                0.0)
          << "sign flip left at " << i;
    }
  }
}

}  // namespace
}  // namespace attiscope::gui
