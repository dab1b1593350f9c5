// cmd_convention.cpp: `attiscope convention [FILE]`: check a house convention file, show
// what it means (frames, sentences), play a pose step by step, change frames, and write a
// commented file.
#include <iostream>
#include <nlohmann/json.hpp>

#include "attiscope/core/convention_card.hpp"
#include "attiscope/core/convention_file.hpp"
#include "attiscope/core/finder.hpp"
#include "attiscope/core/house_report.hpp"
#include "attiscope/core/pose_text.hpp"
#include "attiscope/core/steps.hpp"
#include "cli/cli.hpp"
#include "cli/pose_input.hpp"

namespace attiscope::cli {

namespace {

// A pose for --steps and --pose: read in the convention being shown (core's read_pose_text).
Expected<Rotation> read_house_pose(const std::string& text, const HouseConvention& c,
                                   const CommonOptions& o) {
  PoseTextOptions p = pose_options(o);
  p.house = c;
  auto pose = read_pose_text(text, p);
  if (!pose) return pose.error();
  return pose.value().rotation;
}

const char* kConventionHelp =
    "usage: attiscope convention [FILE] [--steps TEXT] [--to FILE2 [--pose TEXT]] [--write OUT] [--json]\n"
    "\n"
    "Checks a house convention file (unknown keys are warnings, errors name the line and\n"
    "column) and shows what it means: frames, Euler sequence and names, print order,\n"
    "ranges, quaternion and matrix layouts, and the positive direction of each angle.\n"
    "Without FILE: the tool's default convention.\n"
    "\n"
    "  --steps TEXT   play a pose (read in the house convention) one elementary turn at a\n"
    "                 time, and again in the equivalent order of the other kind\n"
    "  --to FILE2     the change from FILE's frames to FILE2's, as the rotations it is;\n"
    "                 with --pose TEXT, that pose in FILE2's convention\n"
    "  --write OUT    write the convention as a commented file (atomic: the old OUT survives\n"
    "                 a failed save)\n"
    "  --card-md OUT  write the convention card as a Markdown page (atomic)\n"
    "\n"
    "Example:\n"
    "  attiscope convention assets/conventions/survey-aircraft.toml --steps \"30 10 5\"\n"
    "\n";

std::string frames(const HouseConvention& c) {
  return frame_preset_name(c.world, FrameRole::World) + " (" + c.world.directions[0] + ", " +
         c.world.directions[1] + ", " + c.world.directions[2] + ") / " +
         frame_preset_name(c.body, FrameRole::Body) + " (" + c.body.directions[0] + ", " +
         c.body.directions[1] + ", " + c.body.directions[2] + ")";
}

}  // namespace

int run_convention(const std::vector<std::string>& args, Streams io) {
  CommonOptions o;
  if (auto err = parse_common(
          args, {{"--steps", true}, {"--to", true}, {"--pose", true}, {"--write", true}, {"--card-md", true}},
          &o)) {
    io.err << "attiscope convention: " << *err << "\n";
    return kExitBadInput;
  }
  if (o.help) {
    io.out << kConventionHelp << common_options_help();
    return kExitOk;
  }
  HouseConvention c = o.convention.value_or(HouseConvention{});
  std::vector<std::string> warnings = o.convention_warnings;
  if (o.positional.size() > 1) {
    io.err << "attiscope convention: give one convention file\n";
    return kExitBadInput;
  }
  if (o.positional.size() == 1) {
    auto loaded = load_convention(o.positional[0]);
    if (!loaded) {
      io.err << "attiscope convention: " << o.positional[0] << ": " << loaded.error().describe() << "\n";
      return kExitBadInput;
    }
    c = loaded.value().convention;
    for (const Error& w : loaded.value().warnings) warnings.push_back(o.positional[0] + ": " + w.describe());
  }
  for (const std::string& w : warnings) io.err << "attiscope convention: warning: " << w << "\n";
  nlohmann::json j;
  j["name"] = c.name;
  j["description"] = c.description;
  j["frames"] = frames(c);
  j["positive_directions"] = positive_direction_sentences(c);
  j["warnings"] = warnings;
  std::string text;
  text += "name          " + c.name + "\n";
  text += "description   " + c.description + "\n";
  text += "frames        " + frames(c) + "\n";
  text += "euler         " + c.euler.convention.name() + ", angles " + c.euler.names[0] + ", " +
          c.euler.names[1] + ", " + c.euler.names[2] + " (as applied), printed as " +
          c.euler.names[static_cast<std::size_t>(c.euler.print_order[0])] + ", " +
          c.euler.names[static_cast<std::size_t>(c.euler.print_order[1])] + ", " +
          c.euler.names[static_cast<std::size_t>(c.euler.print_order[2])] + ", in " +
          angle_unit_name(c.euler.unit) + ", ranges ";
  for (std::size_t i = 0; i < 3; ++i) {
    text += (i ? " " : "") + range_text(c.euler.ranges[i], static_cast<int>(i), c.euler.convention);
  }
  text += "\nquaternion    " + c.quaternion.describe() + "\nmatrix        " + c.matrix.describe() + "\n";
  for (const std::string& s : positive_direction_sentences(c)) text += "              " + s + "\n";

  if (auto pose_text = o.last("--steps")) {
    auto pose = read_house_pose(*pose_text, c, o);
    if (!pose) {
      io.err << "attiscope convention: --steps: " << pose.error().describe() << "\n";
      return kExitBadInput;
    }
    const EulerSteps steps = euler_steps(pose.value(), c);
    const auto other = equivalent_other_kind(steps.convention, steps.angles_rad);
    const EulerSteps other_steps = euler_steps_for(other.first, other.second, with_other_kind(c));
    j["steps"] = nlohmann::json::array();
    j["steps_other_kind"] = nlohmann::json::array();
    text += "\nsteps (" + steps.convention.name() + "):\n";
    for (const EulerStep& s : steps.steps) {
      j["steps"].push_back(s.sentence);
      text += "  " + s.sentence + "\n";
    }
    text += "the same pose as " + other.first.name() + ":\n";
    for (const EulerStep& s : other_steps.steps) {
      j["steps_other_kind"].push_back(s.sentence);
      text += "  " + s.sentence + "\n";
    }
    j["house"] = house_json(pose.value(), c);
  }

  if (auto to_path = o.last("--to")) {
    auto to = load_convention(*to_path);
    if (!to) {
      io.err << "attiscope convention: --to " << *to_path << ": " << to.error().describe() << "\n";
      return kExitBadInput;
    }
    const HouseConvention& t = to.value().convention;
    auto change = frame_change(c.world, c.body, t.world, t.body);
    if (!change) {
      io.err << "attiscope convention: " << change.error().describe() << "\n";
      return kExitBadInput;
    }
    const FrameChange& fc = change.value();
    text += "\n" + fc.describe();
    const Eigen::Quaterniond qw = fc.world_to_R_world_from.quaternion(),
                             qb = fc.body_from_R_body_to.quaternion();
    j["frame_change"] = {{"from", fc.from_name},
                         {"to", fc.to_name},
                         {"world_left", {{"w", qw.w()}, {"x", qw.x()}, {"y", qw.y()}, {"z", qw.z()}}},
                         {"body_right", {{"w", qb.w()}, {"x", qb.x()}, {"y", qb.y()}, {"z", qb.z()}}},
                         {"text", fc.describe()}};
    if (auto pose_text = o.last("--pose")) {
      auto pose = read_house_pose(*pose_text, c, o);
      if (!pose) {
        io.err << "attiscope convention: --pose: " << pose.error().describe() << "\n";
        return kExitBadInput;
      }
      const Rotation moved = fc.apply(pose.value());
      j["pose_from"] = house_json(pose.value(), c);
      j["pose_to"] = house_json(moved, t);
      text += "\nthe pose in " + c.name + ":\n" + house_table(pose.value(), c);
      text += "the same pose in " + t.name + ":\n" + house_table(moved, t);
    }
  }

  if (auto out = o.last("--write")) {
    auto saved = save_convention(*out, c);
    if (!saved) {
      io.err << "attiscope convention: " << saved.error().describe() << "\n";
      return kExitBadInput;
    }
    text += "\nwrote " + *out + "\n";
    j["written"] = *out;
  }
  if (auto out = o.last("--card-md")) {
    auto saved = write_file_atomically(*out, convention_card_markdown(c));
    if (!saved) {
      io.err << "attiscope convention: " << saved.error().describe() << "\n";
      return kExitBadInput;
    }
    text += "\nwrote " + *out + "\n";
    j["card_markdown"] = *out;
  }
  if (o.json) {
    io.out << j.dump(2) << "\n";
  } else {
    io.out << text;
  }
  return kExitOk;
}

}  // namespace attiscope::cli
