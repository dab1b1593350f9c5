// chain_cli_test.cpp: the frame chain on pictures (`render --chain`, `mount --sheet-png` with
// a setup's chain) and the check sheet's picture options: exit codes and the places named.
#include <unistd.h>
#include <filesystem>
#include <fstream>

#include "cli/cli.hpp"
#include "support/check.hpp"
#include "support/cli_run.hpp"

#ifdef ATTISCOPE_TEST_HAVE_RENDER
#include "attiscope/render/image.hpp"
#include "attiscope/render/mount_picture.hpp"
#endif

namespace attiscope::cli {
namespace {

using test::CliRun;
using test::run_cli;

std::string temp_path(const std::string& name) {
  return (std::filesystem::temp_directory_path() /
          ("attiscope_chain_" + std::to_string(::getpid()) + "_" + name))
      .string();
}

const std::string kDemoSetup = std::string(ATTISCOPE_SOURCE_DIR) + "/assets/mounts/survey-aircraft.toml";

TEST(ChainCliTest, RenderOptionsNeedAChainAndKnownFrames) {
  const std::string png = temp_path("nochain.png");
  const CliRun lone = run_cli({"render", "--as", "euler", "10 0 0", "--select", "imu", "--out", png});
  EXPECT_EQ(lone.code, kExitBadInput);
#ifndef ATTISCOPE_TEST_HAVE_RENDER
  // A build without the renderer refuses every picture and says why.
  EXPECT_NE(lone.err.find("no renderer"), std::string::npos) << lone.err;
#else
  EXPECT_NE(lone.err.find("--chain"), std::string::npos) << lone.err;
  const CliRun unknown =
      run_cli({"render", "--as", "euler", "10 0 0", "--chain", kDemoSetup, "--select", "gps", "--out", png});
  EXPECT_EQ(unknown.code, kExitBadInput);
  EXPECT_NE(unknown.err.find("gps"), std::string::npos) << unknown.err;
  // A malformed setup: the error names the line.
  const std::string bad = temp_path("bad.toml");
  std::ofstream(bad) << "name = \"x\"\n[[link]]\nparent = \"vehicle\"\nchild = \n";
  const CliRun malformed = run_cli({"render", "--as", "euler", "10 0 0", "--chain", bad, "--out", png});
  EXPECT_EQ(malformed.code, kExitBadInput);
  EXPECT_NE(malformed.err.find("line 4"), std::string::npos) << malformed.err;
  std::filesystem::remove(bad);
  // A setup with no frames has no chain to draw.
  const std::string empty = temp_path("empty.toml");
  std::ofstream(empty) << "name = \"no frames\"\n";
  const CliRun no_frames = run_cli({"render", "--as", "euler", "10 0 0", "--chain", empty, "--out", png});
  EXPECT_EQ(no_frames.code, kExitBadInput);
  EXPECT_NE(no_frames.err.find("no frames"), std::string::npos) << no_frames.err;
  std::filesystem::remove(empty);
#endif
}

TEST(ChainCliTest, PictureOptionsWithoutAPictureAreRefused) {
  // --select, --vehicle-model and --sensor-names shape only the sheet's picture: without
  // --sheet-png they would be silently ignored, so the command refuses them.
  for (const std::vector<std::string>& extra : std::vector<std::vector<std::string>>{
           {"--select", "imu"}, {"--vehicle-model", "rover"}, {"--sensor-names", "X Y Z"}}) {
    std::vector<std::string> args = {"mount", "--setup", kDemoSetup};
    args.insert(args.end(), extra.begin(), extra.end());
    const CliRun r = run_cli(args);
    EXPECT_EQ(r.code, kExitBadInput) << extra[0];
    EXPECT_NE(r.err.find(extra[0]), std::string::npos) << r.err;
    EXPECT_NE(r.err.find("--sheet-png"), std::string::npos) << r.err;
    EXPECT_TRUE(r.out.empty()) << r.out;
  }
}

#ifdef ATTISCOPE_TEST_HAVE_RENDER
TEST(ChainCliTest, RenderDrawsTheChain) {
  const std::string plain = temp_path("plain.png"), chained = temp_path("chained.png");
  ASSERT_EQ(run_cli({"render", "--as", "euler", "30 10 0", "--size", "480x360", "--out", plain}).code,
            kExitOk);
  const CliRun r = run_cli({"render", "--as", "euler", "30 10 0", "--size", "480x360", "--chain", kDemoSetup,
                            "--select", "imu", "--out", chained});
  ASSERT_EQ(r.code, kExitOk) << r.err;
  const auto a = render::read_png(plain), b = render::read_png(chained);
  ASSERT_TRUE(a.ok() && b.ok());
  EXPECT_EQ(b->width, 480);
  int differ = 0;
  for (std::size_t i = 0; i + 2 < a->rgba.size(); i += 4) {
    int d = 0;
    for (int k = 0; k < 3; ++k) d += std::abs(int(a->rgba[i + k]) - int(b->rgba[i + k]));
    if (d > 60) ++differ;
  }
  EXPECT_GT(differ, 500) << "the chain's triads did not change the picture";
  std::filesystem::remove(plain);
  std::filesystem::remove(chained);
}

TEST(ChainCliTest, SheetPictureFromTheDemoSetup) {
  // The demo's measured mount is 0.8 degrees off against 0.5: the check fails (exit 1) and
  // still writes the picture for the record.
  const std::string png = temp_path("sheet.png");
  const CliRun r = run_cli({"mount", "--setup", kDemoSetup, "--sheet-png", png, "--select", "imu",
                            "--vehicle-model", "aircraft", "--sensor-names", "X Y Z"});
  EXPECT_EQ(r.code, kExitCheckFailed) << r.err;
  const auto img = render::read_png(png);
  ASSERT_TRUE(img.ok()) << img.error().describe();
  EXPECT_EQ(img->width, render::kMountPictureWidth);
  EXPECT_EQ(img->height, render::kMountPictureHeight);
  std::filesystem::remove(png);
}

TEST(ChainCliTest, SheetPictureOptionsAreChecked) {
  const std::string png = temp_path("sheet_bad.png");
  const std::vector<std::string> base = {"mount", "--setup", kDemoSetup, "--sheet-png", png};
  auto with = [&](std::vector<std::string> extra) {
    std::vector<std::string> a = base;
    a.insert(a.end(), extra.begin(), extra.end());
    return run_cli(a);
  };
  const CliRun names = with({"--sensor-names", "X Y"});
  EXPECT_EQ(names.code, kExitBadInput);
  EXPECT_NE(names.err.find("three names"), std::string::npos) << names.err;
  const CliRun model = with({"--vehicle-model", "zeppelin"});
  EXPECT_EQ(model.code, kExitBadInput);
  EXPECT_NE(model.err.find("zeppelin"), std::string::npos) << model.err;
  const CliRun frame = with({"--select", "gps"});
  EXPECT_EQ(frame.code, kExitBadInput);
  EXPECT_NE(frame.err.find("gps"), std::string::npos) << frame.err;
  EXPECT_FALSE(std::filesystem::exists(png));
}
#endif

}  // namespace
}  // namespace attiscope::cli
