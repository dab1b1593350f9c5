// cli_run.hpp: runs the command line in-process, as a shell would run `attiscope ARGS` with
// INPUT on standard input, and keeps what it printed and its exit code. For cli_tests only
// (it needs the attiscope_cli library).
#pragma once

#include <nlohmann/json.hpp>
#include <sstream>
#include <string>
#include <vector>

#include "cli/cli.hpp"

namespace attiscope::test {

struct CliRun {
  int code = -1;
  std::string out;
  std::string err;
  // The standard output parsed as JSON (for commands run with --json).
  nlohmann::json json() const { return nlohmann::json::parse(out); }
};

inline CliRun run_cli(const std::vector<std::string>& args, const std::string& input = "") {
  std::ostringstream out, err;
  std::istringstream in(input);
  CliRun r;
  r.code = cli::run(args, cli::Streams{out, err, in});
  r.out = out.str();
  r.err = err.str();
  return r;
}

}  // namespace attiscope::test
