// cmd_read.cpp: `attiscope read [FILE|-]`: the ranked readings of pasted text.
#include <fstream>
#include <iostream>
#include <iterator>

#include "attiscope/core/intake.hpp"
#include "attiscope/core/pose_text.hpp"
#include "cli/cli.hpp"
#include "cli/pose_input.hpp"

namespace attiscope::cli {

namespace {

const char* kReadHelp =
    "usage: attiscope read [FILE|-] [--json] [--convention FILE] [options]\n"
    "\n"
    "Reads pasted text (a file, or standard input for '-' or no argument) and lists every\n"
    "plausible reading of it as a rotation, best first, each with a score in [0, 1], a reason,\n"
    "its warnings, its quaternion (w x y z, Hamilton, body-to-world) and where the body axes\n"
    "point. When the text does not decide between readings it says AMBIGUOUS: pick one with\n"
    "`attiscope convert --as READING`. Several lines holding one pose each are read as a track.\n"
    "--euler, --intrinsic/--extrinsic and --deg/--rad set the house choices that break ties.\n"
    "\n"
    "Examples:\n"
    "  echo 'q: 0.0012 -0.7071 0.0008 0.7071' | attiscope read\n"
    "  attiscope read --json pose.txt\n"
    "\n";

}  // namespace

int run_read(const std::vector<std::string>& args, Streams io) {
  CommonOptions o;
  if (auto err = parse_common(args, {}, &o)) {
    io.err << "attiscope read: " << *err << "\n";
    return kExitBadInput;
  }
  if (o.help) {
    io.out << kReadHelp << common_options_help();
    return kExitOk;
  }
  std::string text;
  if (o.positional.size() == 1 && o.positional[0] != "-") {
    std::ifstream in(o.positional[0], std::ios::binary);
    if (!in) {
      io.err << "attiscope read: cannot open '" << o.positional[0] << "'\n";
      return kExitBadInput;
    }
    text.assign(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>());
  } else if (o.positional.size() > 1) {
    io.err << "attiscope read: give one FILE (or '-' for standard input)\n";
    return kExitBadInput;
  } else {
    text.assign(std::istreambuf_iterator<char>(io.in), std::istreambuf_iterator<char>());
  }
  // The same preferences every command reads with: --convention fills them, --euler and
  // --deg/--rad given explicitly override the house's.
  const IntakePreferences prefs = pose_intake_preferences(pose_options(o));
  auto result = read_pasted(text, prefs);
  if (!result) {
    io.err << "attiscope read: " << result.error().describe() << "\n";
    return kExitBadInput;
  }
  if (o.json) {
    io.out << intake_json(result.value()).dump(2) << "\n";
  } else {
    io.out << intake_table(result.value(), o.precision);
  }
  return kExitOk;
}

}  // namespace attiscope::cli
