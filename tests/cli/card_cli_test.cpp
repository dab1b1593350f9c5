// card_cli_test.cpp: `attiscope card` writes a picture with content and the Markdown page;
// bad inputs exit 2 with the reason (and the line and column for a malformed file).
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>

#include "cli/cli.hpp"
#include "support/cli_run.hpp"

#ifdef ATTISCOPE_TEST_HAVE_RENDER
#include "attiscope/render/image.hpp"
#endif

namespace attiscope::cli {
namespace {

using test::CliRun;
using test::run_cli;

std::string asset(const char* file) {
  return std::string(ATTISCOPE_SOURCE_DIR) + "/assets/conventions/" + file;
}

std::filesystem::path temp_dir(const char* name) {
  const auto d = std::filesystem::temp_directory_path() / name;
  std::filesystem::remove_all(d);
  std::filesystem::create_directories(d);
  return d;
}

TEST(CardCliTest, BadInputsExitTwo) {
  const auto d = temp_dir("attiscope_card_bad");
  EXPECT_EQ(run_cli({"card", "--out", (d / "a.png").string()}).code, 2) << "no --convention";
  EXPECT_EQ(run_cli({"card", "--convention", asset("survey-aircraft.toml")}).code, 2) << "no --out";
  std::ofstream(d / "bad.toml") << "# broken\nname = \"Broken\n";
  const auto bad =
      run_cli({"card", "--convention", (d / "bad.toml").string(), "--out", (d / "b.png").string()});
  EXPECT_EQ(bad.code, 2);
  EXPECT_NE(bad.err.find("line 2"), std::string::npos) << bad.err;
  EXPECT_FALSE(std::filesystem::exists(d / "b.png"));
  std::filesystem::remove_all(d);
}

#ifdef ATTISCOPE_TEST_HAVE_RENDER
TEST(CardCliTest, WritesANonBlankPngAndTheMarkdown) {
  const auto d = temp_dir("attiscope_card_ok");
  const auto r = run_cli({"card", "--convention", asset("survey-aircraft.toml"), "--out",
                          (d / "card.png").string(), "--md", (d / "card.md").string()});
  ASSERT_EQ(r.code, 0) << r.err;
  auto img = render::read_png((d / "card.png").string());
  ASSERT_TRUE(img.ok()) << img.error().describe();
  std::set<std::uint32_t> colours;
  for (std::size_t i = 0; i + 3 < img.value().rgba.size(); i += 4 * 7) {
    colours.insert(img.value().rgba[i] << 16 | img.value().rgba[i + 1] << 8 | img.value().rgba[i + 2]);
  }
  EXPECT_GT(colours.size(), 50u) << "the card looks blank";
  std::ifstream md(d / "card.md");
  std::stringstream text;
  text << md.rdbuf();
  EXPECT_NE(text.str().find("Survey aircraft"), std::string::npos);
  EXPECT_NE(text.str().find("heading"), std::string::npos);
  // An output folder that does not exist is bad input, not a crash.
  EXPECT_EQ(run_cli({"card", "--convention", asset("survey-aircraft.toml"), "--out",
                     (d / "missing" / "x.png").string()})
                .code,
            2);
  std::filesystem::remove_all(d);
}
#endif

}  // namespace
}  // namespace attiscope::cli
