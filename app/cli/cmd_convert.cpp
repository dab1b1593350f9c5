// cmd_convert.cpp: `attiscope convert [TEXT]`: read one pose, print every representation.
#include <iostream>

#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"

#include "attiscope/core/house_report.hpp"
#include "attiscope/core/pose_text.hpp"
#include "attiscope/core/report.hpp"
#include "cli/cli.hpp"
#include "cli/pose_input.hpp"

namespace attiscope::cli {

namespace {

const char* kConvertHelp =
    "usage: attiscope convert [TEXT] [--as READING] [options]\n"
    "\n"
    "Reads one pose from TEXT (or standard input) and prints it in every representation:\n"
    "quaternion, matrix (world_R_body: v_world = R v_body), axis-angle, rotation vector,\n"
    "Gibbs vector, MRP, Euler angles in the chosen convention and in all 24, algebra forms.\n"
    "\n"
    "Examples:\n"
    "  attiscope convert --as quat-wxyz \"0.9239 0 0 0.3827\"\n"
    "  attiscope convert --as euler --euler ZYX --extrinsic --rad \"0.5 0.1 -0.2\"\n"
    "  attiscope convert --json --as matrix-rows \"0 -1 0; 1 0 0; 0 0 1\"\n"
    "  attiscope convert --convention assets/conventions/survey-aircraft.toml \"30 10 5\"\n"
    "\n"
    "With --convention FILE the output adds the house's view (JSON key \"house\"): its Euler\n"
    "angles by name in its print order, unit and ranges, its quaternion and matrix layouts,\n"
    "and a sentence per turn. Without --as, numbers are read in the house's convention:\n"
    "three as the house's printed Euler angles (unless --euler or --deg/--rad is given),\n"
    "four as its quaternion layout, algebra and direction, nine as its matrix.\n"
    "\n";

}  // namespace

int run_convert(const std::vector<std::string>& args, Streams io) {
  CommonOptions o;
  if (auto err = parse_common(args, {}, &o)) {
    io.err << "attiscope convert: " << *err << "\n";
    return kExitBadInput;
  }
  if (o.help) {
    io.out << kConvertHelp << common_options_help();
    return kExitOk;
  }
  const std::string text = input_text(o, io.in);
  if (auto missing = no_pose_given(text)) {
    io.err << "attiscope convert: " << *missing << "\n";
    return kExitBadInput;
  }
  ReportOptions report;
  report.euler = o.euler;
  report.unit = o.unit;
  report.precision = o.precision;
  for (const std::string& w : o.convention_warnings) io.err << "attiscope convert: warning: " << w << "\n";
  // The one text -> pose reading (core/pose_text.hpp): --as, else bare numbers in the
  // house's printed form under --convention, else the paste reader's top reading.
  auto read = read_pose_text(text, pose_options(o));
  if (!read) {
    io.err << "attiscope convert: " << read.error().describe() << "\n";
    return kExitBadInput;
  }
  const PoseText& pose_text = read.value();
  report.reading = pose_text.reading;
  for (const std::string& w : pose_text.warnings) report.warnings.push_back(w);
  const Rotation& pose = pose_text.rotation;
  if (o.json) {
    nlohmann::json j = convert_json(pose, report);
    if (o.convention) j["house"] = house_json(pose, *o.convention);
    io.out << j.dump(2) << "\n";
  } else {
    io.out << convert_table(pose, report);
    if (o.convention) io.out << house_table(pose, *o.convention);
  }
  return kExitOk;
}

}  // namespace attiscope::cli
