// read_test.cpp: `attiscope read` and `attiscope convert` without --as: every error class
// exits 2 and names the line and column; the JSON keys of design.md are there.
#include <cmath>
#include <nlohmann/json.hpp>
#include <sstream>

#include "cli/cli.hpp"
#include "support/check.hpp"
#include "support/cli_run.hpp"

namespace attiscope::cli {
namespace {

using test::CliRun;
using test::run_cli;

TEST(ReadCommandTest, EveryErrorClassExitsTwoAndNamesThePlace) {
  struct Case {
    const char* text;
    const char* place;
    const char* words;
  };
  const Case cases[] = {
      {"1 0 0\n0 1 0\n0 0 -1", "line 1, column 1",
       "this is a reflection, not a rotation: an odd number of axes was flipped"},
      {"w=0 x=0 y=0 z=0", "line 1, column 3", "zero quaternion"},
      {"0.5 0.5\n0.5 nan", "line 2, column 5", "NaN"},
      {"0.5 0.5 inf 0.5", "line 1, column 9", "infinite"},
      {"1 2 3 4 5 6 7", "line 1, column 13", "got 7 numbers"},
      {"1 2 3\n4 5 6\n7 8 8", "line 1, column 1", "not a rotation matrix"},
      {"no numbers here", "line 1, column 16", "no numbers"},
  };
  for (const Case& c : cases) {
    for (const char* cmd : {"read", "convert"}) {
      const CliRun r = run_cli({cmd}, c.text);
      EXPECT_EQ(r.code, kExitBadInput) << cmd << " " << c.text;
      EXPECT_NE(r.err.find(c.place), std::string::npos) << cmd << ": " << r.err;
      EXPECT_NE(r.err.find(c.words), std::string::npos) << cmd << ": " << r.err;
    }
  }
}

TEST(ReadCommandTest, JsonKeysOfTheDesign) {
  const CliRun r = run_cli({"read", "--json"}, "qx=0 qy=0 qz=0.3826834323650898 qw=0.9238795325112867");
  ASSERT_EQ(r.code, kExitOk) << r.err;
  const auto j = nlohmann::json::parse(r.out);
  ASSERT_FALSE(j.at("readings").empty());
  const auto& top = j["readings"][0];
  for (const char* key : {"kind", "layout", "score", "why", "quaternion", "warnings", "body_axes"}) {
    EXPECT_TRUE(top.contains(key)) << key;
  }
  // 45 degrees about z (common practice: w = cos 22.5, z = sin 22.5).
  EXPECT_NEAR(top["quaternion"]["w"].get<double>(), std::cos(M_PI / 8), 1e-12);
  EXPECT_NEAR(top["quaternion"]["z"].get<double>(), std::sin(M_PI / 8), 1e-12);
  EXPECT_EQ(j["ambiguous"], false);
}

TEST(ReadCommandTest, ConvertWarnsWhenAmbiguous) {
  const CliRun r = run_cli({"convert", "--json"}, "0.9238795325112867 0 0 0.3826834323650898");
  ASSERT_EQ(r.code, kExitOk) << r.err;
  const auto j = nlohmann::json::parse(r.out);
  bool warned = false;
  for (const auto& w : j["warnings"]) warned |= w.get<std::string>().find("ambiguous") != std::string::npos;
  EXPECT_TRUE(warned) << r.out;
  const CliRun labelled = run_cli({"convert", "--json"}, "w=0.9238795325112867 x=0 y=0 z=0.3826834323650898");
  const auto k = nlohmann::json::parse(labelled.out);
  for (const auto& w : k["warnings"]) EXPECT_EQ(w.get<std::string>().find("ambiguous"), std::string::npos);
}

}  // namespace
}  // namespace attiscope::cli
