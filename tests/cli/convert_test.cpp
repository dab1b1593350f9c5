// convert_test.cpp: `attiscope convert` as a person meets it: bad input exits 2 with a message
// that names the line and column and prints no rotation; help texts exit 0; good input exits
// 0 with the JSON of design.md; no pose at all says where one goes.
#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <nlohmann/json.hpp>
#include <regex>
#include <sstream>

#include "cli/cli.hpp"
#include "support/cli_run.hpp"

namespace attiscope::cli {
namespace {

using test::CliRun;
using test::run_cli;

TEST(ConvertCliTest, BadInputExitsTwoWithAPlaceAndNoRotation) {
  struct Case {
    std::vector<std::string> args;
    std::string says;
    int line, column;
  };
  const std::vector<Case> cases = {
      {{"convert", "--as", "quat-wxyz", "1 0 nan 0"}, "not finite", 1, 5},
      {{"convert", "--as", "quat-xyzw", "0 0 0 0"}, "zero quaternion", 1, 1},
      {{"convert", "--as", "matrix-rows", "1 0 0; 0 1 0; 0 0 -1"}, "reflection", 1, 1},
      {{"convert", "--as", "matrix-cols", "-1 0 0 0 -1 0 0 0 -1"}, "reflection", 1, 1},
      {{"convert", "--as", "euler", "10 20"}, "needs 3 numbers, got 2", 1, 6},
      {{"convert", "--as", "quat-wxyz", "1 0 0 0 0"}, "needs 4 numbers, got 5", 1, 9},
      {{"convert", "--as", "euler", "10 20 thirty"}, "'thirty' is not a number", 1, 7},
      {{"convert", "--as", "axis-angle", "0 0 0 90"}, "zero vector", 1, 1},
      {{"convert", "1 2 3 4 5"}, "got 5 numbers", 1, 9},
      {{"convert", "1 2"}, "got 2 numbers", 1, 4},
      {{"convert", "--json", "--as", "rotvec", "1 inf 0"}, "not finite", 1, 3},
      {{"convert", "--as", "quat-wxyz", "1e-300 0 0 0"}, "zero quaternion", 1, 1},
      {{"convert", "--as", "quat-wxyz", "1 0 0 1e5000"}, "not finite", 1, 7},
  };
  const std::regex place("line [0-9]+, column [0-9]+");
  for (const Case& c : cases) {
    const CliRun r = run_cli(c.args);
    const std::string what = c.args.back();
    EXPECT_EQ(r.code, kExitBadInput) << what << "\n" << r.err;
    EXPECT_TRUE(r.out.empty()) << what << ": printed\n" << r.out;
    EXPECT_NE(r.err.find(c.says), std::string::npos) << what << ": " << r.err;
    EXPECT_NE(r.err.find("line " + std::to_string(c.line) + ", column " + std::to_string(c.column)),
              std::string::npos)
        << what << ": " << r.err;
    EXPECT_TRUE(std::regex_search(r.err, place)) << r.err;
  }
  // From standard input, on the second line.
  const CliRun r = run_cli({"convert", "--as", "quat-wxyz"}, "0.5 0.5\n0.5 bogus\n");
  EXPECT_EQ(r.code, kExitBadInput);
  EXPECT_TRUE(r.out.empty());
  EXPECT_NE(r.err.find("line 2, column 5"), std::string::npos) << r.err;
}

TEST(ConvertCliTest, BadUsageExitsTwo) {
  for (const std::vector<std::string>& args :
       std::vector<std::vector<std::string>>{{"convert", "--as", "quaternion", "1 0 0 0"},
                                             {"convert", "--euler", "XXY", "1 2 3"},
                                             {"convert", "--bogus", "1 0 0 0"},
                                             {"convert", "--precision", "99", "1 0 0 0"},
                                             {"no-such-command"}}) {
    const CliRun r = run_cli(args);
    EXPECT_EQ(r.code, kExitBadInput) << args[1];
    EXPECT_TRUE(r.out.empty()) << r.out;
    EXPECT_FALSE(r.err.empty());
  }
}

TEST(ConvertCliTest, NoPoseSaysWhereOneGoes) {
  // Nothing as TEXT and nothing (or only white space) on standard input: the message names
  // both places instead of reporting that no numbers were found in an empty text.
  std::vector<std::vector<std::string>> commands = {{"convert"}, {"convert", "-"}};
#ifdef ATTISCOPE_TEST_HAVE_RENDER  // a build without the renderer refuses every picture first
  commands.push_back({"render", "--out", "x.png"});
#endif
  for (const std::string& input : {std::string(), std::string(" \n\t\n")}) {
    for (const std::vector<std::string>& args : commands) {
      const CliRun r = run_cli(args, input);
      EXPECT_EQ(r.code, kExitBadInput) << args[0];
      EXPECT_TRUE(r.out.empty()) << r.out;
      EXPECT_NE(r.err.find("no pose given: pass it as TEXT"), std::string::npos) << r.err;
    }
  }
  EXPECT_FALSE(std::filesystem::exists("x.png"));
}

TEST(ConvertCliTest, HelpExitsZero) {
  for (const std::vector<std::string>& args : std::vector<std::vector<std::string>>{
           {"--help"}, {"help"}, {"convert", "--help"}, {"convert", "-h"}, {"convert", "--json", "--help"}}) {
    const CliRun r = run_cli(args);
    EXPECT_EQ(r.code, kExitOk);
    EXPECT_NE(r.out.find("usage: attiscope"), std::string::npos) << r.out;
    EXPECT_TRUE(r.err.empty());
  }
  EXPECT_NE(run_cli({"convert", "--help"}).out.find("--euler SEQ"), std::string::npos);
}

TEST(ConvertCliTest, GoodInputPrintsTheJsonOfTheDesign) {
  // The issue's own acceptance example: intrinsic ZYX (30, 20, 10) deg; the matrix values are
  // the reference-script ones of references.md section 3, 12 digits.
  const CliRun r = run_cli({"convert", "--json", "--as", "euler", "--euler", "ZYX", "30 20 10"});
  ASSERT_EQ(r.code, kExitOk) << r.err;
  const nlohmann::json j = nlohmann::json::parse(r.out);
  EXPECT_NEAR(j["matrix"][0][0].get<double>(), 0.813797681349, 1e-12);
  EXPECT_NEAR(j["matrix"][0][1].get<double>(), -0.440969610530, 1e-12);
  EXPECT_NEAR(j["matrix"][2][0].get<double>(), -0.342020143326, 1e-12);
  EXPECT_EQ(j["euler"]["sequence"], "ZYX");
  EXPECT_EQ(j["euler"]["kind"], "intrinsic");
  EXPECT_EQ(j["reading"], "euler intrinsic ZYX");
  // A non-unit quaternion is accepted with a warning, and exits 0.
  const CliRun w = run_cli({"convert", "--json", "--as", "quat-wxyz", "2 0 0 0"});
  ASSERT_EQ(w.code, kExitOk);
  EXPECT_NE(nlohmann::json::parse(w.out)["warnings"].dump().find("norm"), std::string::npos);
  // Plain table.
  const CliRun t = run_cli({"convert", "--as", "quat-xyzw", "0 0 0 1"});
  EXPECT_EQ(t.code, kExitOk);
  EXPECT_NE(t.out.find("quaternion"), std::string::npos);
  // Huge but finite numbers are a direction, not a zero or NaN rotation.
  const CliRun big = run_cli({"convert", "--json", "--as", "quat-wxyz", "1e200 0 0 1e200"});
  ASSERT_EQ(big.code, kExitOk) << big.err;
  EXPECT_NEAR(nlohmann::json::parse(big.out)["quaternion"]["z"].get<double>(), std::sqrt(0.5), 1e-15);
}

}  // namespace
}  // namespace attiscope::cli
