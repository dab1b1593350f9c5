// cmd_compare.cpp: `attiscope compare A B` (two poses) and `attiscope compare --mean FILE`
// (several poses: mean and spread).
#include <cmath>
#include <cstdio>
#include <nlohmann/json.hpp>
#include <ostream>

#include "attiscope/core/compare.hpp"
#include "attiscope/core/compare_report.hpp"
#include "cli/cli.hpp"
#include "cli/pose_input.hpp"

namespace attiscope::cli {

namespace {

constexpr double kDeg = 180.0 / M_PI;

const char* kCompareHelp =
    "usage: attiscope compare A B [--tolerance DEG] [--body CODE] [--path N] [options]\n"
    "       attiscope compare --mean FILE [--tolerance DEG] [options]\n"
    "\n"
    "Compares a reference pose A with a current pose B (both world_R_body, v_world = R v_body):\n"
    "  body frame   world_R_B = world_R_A * A_R_B     the turn written in A's body axes\n"
    "  world frame  world_R_B = world_delta * world_R_A  the turn written in world axes\n"
    "with the angle and axis of each, the small-angle split into turns about the body axes, and\n"
    "the Euler angles subtracted one by one (with a note when that is not the real difference).\n"
    "With --mean, FILE (or - for standard input) holds one pose per line; prints their mean\n"
    "(Markley et al. 2007, hemispheres aligned) and the spread (largest and RMS angle from it).\n"
    "\n"
    "Options:\n"
    "  --tolerance DEG  exit 1 when the angle (or, with --mean, the largest spread) is beyond DEG\n"
    "  --body CODE      name the body axes for the split: FRD, FLU, RDF... (x y z letters)\n"
    "  --path N         also print N poses along the shortest path from A to B (SLERP)\n"
    "  --mean FILE      mean and spread of the poses in FILE ('#' starts a comment)\n"
    "\n"
    "Each pose is read as convert reads it: with --as; else, under --convention, bare 3/4/9\n"
    "numbers in the house's printed form; else the paste reader's top reading (a warning says\n"
    "when the text is ambiguous; see attiscope read). Exit codes: 0 within tolerance (or none\n"
    "given), 1 beyond it, 2 bad input.\n"
    "\n"
    "Examples:\n"
    "  attiscope compare --as euler \"30 5 2\" \"31 4.5 2.2\" --tolerance 1\n"
    "  attiscope compare --json --as quat-wxyz \"1 0 0 0\" \"0.9990482 0 0.0436194 0\"\n"
    "  attiscope compare --mean readings.txt --as quat-wxyz --tolerance 0.5\n"
    "\n";

std::string fmt(double v, int precision) {
  if (v == 0.0) v = 0.0;
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", precision, v);
  return buf;
}

std::string quat_text(const Rotation& r, int p) {
  const Eigen::Quaterniond q = r.quaternion();
  return "w " + fmt(q.w(), p) + "  x " + fmt(q.x(), p) + "  y " + fmt(q.y(), p) + "  z " + fmt(q.z(), p);
}

std::string vec_text(const Eigen::Vector3d& v, int p) {
  return "(" + fmt(v.x(), p) + ", " + fmt(v.y(), p) + ", " + fmt(v.z(), p) + ")";
}

std::string angles_text(const Eigen::Vector3d& a_rad, int p) {
  return fmt(a_rad(0) * kDeg, p) + "  " + fmt(a_rad(1) * kDeg, p) + "  " + fmt(a_rad(2) * kDeg, p);
}

int bad(Streams io, const std::string& message) {
  io.err << "attiscope compare: " << message << "\n";
  return kExitBadInput;
}

int run_mean(const CommonOptions& o, const std::optional<double>& tolerance_deg, Streams io) {
  const std::string path = *o.last("--mean");
  auto text = read_input_file(path, io.in);
  if (!text) return bad(io, text.error().describe());
  std::vector<Rotation> poses;
  std::vector<int> lines;
  std::vector<std::string> warnings;
  const std::string& t = text.value();
  std::size_t start = 0;
  int line_no = 0;
  while (start < t.size()) {
    const std::size_t end = std::min(t.find('\n', start), t.size());
    ++line_no;
    std::string line = t.substr(start, end - start);
    start = end + 1;
    const std::size_t hash = line.find('#');
    if (hash != std::string::npos) line = line.substr(0, hash);
    if (line.find_first_not_of(" \t\r") == std::string::npos) continue;
    auto pose = read_pose_text(line, pose_options(o));
    if (!pose) {
      Error e = pose.error();
      e.line = line_no;
      if (e.column == 0) e.column = 1;
      return bad(io, path + ": " + e.describe());
    }
    for (const std::string& w : pose.value().warnings) {
      if (poses.empty() || w.rfind("no reading given", 0) != 0)
        warnings.push_back("line " + std::to_string(line_no) + ": " + w);
    }
    poses.push_back(pose.value().rotation);
    lines.push_back(line_no);
  }
  if (poses.empty()) return bad(io, path + ": no poses (one pose per line)");
  auto ms = mean_and_spread(poses);
  if (!ms) return bad(io, path + ": " + ms.error().describe());
  const MeanSpread& s = ms.value();
  const bool within = !tolerance_deg || s.max_rad * kDeg <= *tolerance_deg;
  if (o.json) {
    nlohmann::json j = mean_spread_json(s, lines);
    j["tolerance_deg"] = tolerance_deg ? nlohmann::json(*tolerance_deg) : nlohmann::json();
    j["within_tolerance"] = tolerance_deg ? nlohmann::json(within) : nlohmann::json();
    j["warnings"] = warnings;
    io.out << j.dump(2) << "\n";
  } else {
    const int p = o.precision;
    io.out << "poses        " << poses.size() << " (from " << path << ")\n";
    io.out << "mean         " << quat_text(s.mean, p) << "   (Markley et al. 2007; world_R_body)\n";
    io.out << "spread       largest " << fmt(s.max_rad * kDeg, p) << " degrees (line " << lines[s.max_index]
           << "), RMS " << fmt(s.rms_rad * kDeg, p) << " degrees from the mean\n";
    if (s.flipped > 0) {
      io.out << "hemispheres  " << s.flipped
             << " quaternion(s) had the opposite sign (the same rotation); aligned\n";
    }
    if (tolerance_deg) {
      io.out << "tolerance    " << fmt(*tolerance_deg, p)
             << " degrees: " << (within ? "within" : "BEYOND (largest spread)") << "\n";
    }
    for (const std::string& w : warnings) io.out << "warning: " << w << "\n";
  }
  return within ? kExitOk : kExitCheckFailed;
}

}  // namespace

int run_compare(const std::vector<std::string>& args, Streams io) {
  CommonOptions o;
  if (auto err = parse_common(
          args, {{"--tolerance", true}, {"--body", true}, {"--path", true}, {"--mean", true}}, &o)) {
    return bad(io, *err);
  }
  if (o.help) {
    io.out << kCompareHelp << common_options_help();
    return kExitOk;
  }
  std::optional<double> tolerance_deg;
  if (auto t = o.last("--tolerance")) {
    auto v = parse_number_option("--tolerance", *t, true);
    if (!v) return bad(io, v.error().describe());
    tolerance_deg = v.value();
  }
  if (o.has("--mean")) {
    if (!o.positional.empty()) return bad(io, "--mean reads its poses from FILE; give no other poses");
    return run_mean(o, tolerance_deg, io);
  }
  if (o.positional.size() != 2) {
    return bad(io, "compare needs two poses, A and B (got " + std::to_string(o.positional.size()) +
                       "); quote each one, e.g. compare \"1 0 0 0\" \"0.7071 0 0 0.7071\"");
  }
  std::optional<VehicleAxes> body;
  if (auto code = o.last("--body")) {
    auto b = parse_vehicle_axes(*code);
    if (!b) return bad(io, "--body: " + b.error().message);
    body = b.value();
  }
  int path_count = 0;
  if (auto n = o.last("--path")) {
    auto v = parse_number_option("--path", *n, true);
    if (!v || v.value() != std::floor(v.value()) || v.value() < 2 || v.value() > 100000) {
      return bad(io, "--path needs a whole number of poses from 2 to 100000");
    }
    path_count = static_cast<int>(v.value());
  }
  std::vector<std::string> warnings;
  std::array<Rotation, 2> poses;
  for (std::size_t i = 0; i < 2; ++i) {
    auto pose = read_pose_text(o.positional[i], pose_options(o));
    const char* which = i == 0 ? "A (reference)" : "B (current)";
    if (!pose) return bad(io, std::string(which) + ": " + pose.error().describe());
    poses[i] = pose.value().rotation;
    for (const std::string& w : pose.value().warnings) warnings.push_back(std::string(which) + ": " + w);
  }
  const Comparison c = compare_poses(poses[0], poses[1], o.euler, body);
  for (const std::string& w : c.warnings) warnings.push_back(w);
  const bool within = !tolerance_deg || c.angle_rad * kDeg <= *tolerance_deg;
  const std::vector<Rotation> path = slerp_path(poses[0], poses[1], path_count);
  if (o.json) {
    nlohmann::json j = comparison_json(c);
    if (path_count > 0) {
      nlohmann::json p = nlohmann::json::array();
      for (const Rotation& r : path) p.push_back(quaternion_json(r));
      j["path"] = p;
    }
    j["tolerance_deg"] = tolerance_deg ? nlohmann::json(*tolerance_deg) : nlohmann::json();
    j["within_tolerance"] = tolerance_deg ? nlohmann::json(within) : nlohmann::json();
    j["warnings"] = warnings;
    io.out << j.dump(2) << "\n";
  } else {
    const int p = o.precision;
    io.out << "reference A   " << quat_text(c.world_R_reference, p) << "\n";
    io.out << "current B     " << quat_text(c.world_R_current, p) << "\n";
    io.out << "angle         " << fmt(c.angle_rad * kDeg, p) << " degrees\n";
    io.out << "body frame    world_R_B = world_R_A * A_R_B (the turn in A's body axes)\n";
    io.out << "  A_R_B       " << quat_text(c.reference_R_current, p) << "\n";
    io.out << "  axis        " << vec_text(c.axis_body, p) << " in A's body axes\n";
    io.out << "  turns       x " << fmt(c.turns_body_rad(0) * kDeg, p) << "  y "
           << fmt(c.turns_body_rad(1) * kDeg, p) << "  z " << fmt(c.turns_body_rad(2) * kDeg, p)
           << " degrees (small-angle split)\n";
    if (c.named_turns) {
      for (const NamedTurn& t : *c.named_turns) {
        io.out << "              " << t.turn_name << " " << fmt(t.angle_rad * kDeg, p) << " degrees"
               << (t.sense.empty() ? "" : " (" + t.sense + ")") << "\n";
      }
    }
    io.out << "world frame   world_R_B = world_delta * world_R_A (the turn in world axes)\n";
    io.out << "  world_delta " << quat_text(c.world_delta, p) << "\n";
    io.out << "  axis        " << vec_text(c.axis_world, p) << " in world axes\n";
    io.out << "euler         " << c.euler.convention.name() << ", degrees\n";
    io.out << "  A           " << angles_text(c.euler.reference.angles_rad, p) << "\n";
    io.out << "  B           " << angles_text(c.euler.current.angles_rad, p) << "\n";
    io.out << "  B - A       " << angles_text(c.euler.difference_rad, p) << "\n";
    if (!c.euler.note.empty()) io.out << "  note: " << c.euler.note << "\n";
    if (path_count > 0) {
      io.out << "path (SLERP, shortest arc)\n";
      for (std::size_t i = 0; i < path.size(); ++i) {
        io.out << "  t=" << fmt(static_cast<double>(i) / static_cast<double>(path.size() - 1), 4) << "  "
               << quat_text(path[i], p) << "\n";
      }
    }
    if (tolerance_deg) {
      io.out << "tolerance     " << fmt(*tolerance_deg, p) << " degrees: " << (within ? "within" : "BEYOND")
             << "\n";
    }
    for (const std::string& w : warnings) io.out << "warning: " << w << "\n";
  }
  return within ? kExitOk : kExitCheckFailed;
}

}  // namespace attiscope::cli
