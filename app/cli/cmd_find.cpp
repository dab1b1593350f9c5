// cmd_find.cpp: `attiscope find A B` (the conventions under which two texts are one
// rotation) and `attiscope find --gravity FILE` (the reading of logged orientations under
// which resting accelerometer vectors point steadily up).
#include <cmath>
#include <cstdio>
#include <iostream>
#include <nlohmann/json.hpp>

#include "attiscope/core/atomic_file.hpp"
#include "attiscope/core/finder.hpp"
#include "cli/cli.hpp"

namespace attiscope::cli {

namespace {

constexpr double kDegPerRad = 180.0 / 3.14159265358979323846;
/// Rows of the gravity ranking the table shows (JSON has them all).
constexpr std::size_t kGravityRowsShown = 10;

const char* kFindHelp =
    "usage: attiscope find A B [--within DEG] [--json] [options]\n"
    "       attiscope find --gravity FILE [--accel-points up|down] [--convention FILE] [--json]\n"
    "\n"
    "A and B are two texts that should be the same rotation: an Euler triple (3 numbers) and\n"
    "a quaternion (4) or a matrix (9); a quaternion and a matrix; or q1 and q2 (8 numbers)\n"
    "and a library's product q1*q2 (4). Every combination of Euler sequence, kind, unit and\n"
    "print order, quaternion layout, algebra and direction, and matrix direction and storage\n"
    "under which they agree is listed, best first, with the residual angle. Ties are real:\n"
    "some combinations always give the same numbers.\n"
    "\n"
    "--gravity FILE: one resting sample per line, \"ax ay az\" then the pose logged at the same\n"
    "moment (3, 4 or 9 numbers). Ranks the readings of the poses under which the rotated\n"
    "accelerometer vector points steadily up in the world (ENU unless --convention says\n"
    "otherwise; --accel-points down for a sensor that reports gravity itself).\n"
    "\n"
    "  --within DEG   list interpretations with a residual up to DEG (default 0.5)\n"
    "  --convention FILE  among tied interpretations, the house's own comes first\n"
    "\n"
    "Exit codes: 0 at least one interpretation agrees, 1 none does, 2 bad input.\n"
    "\n"
    "Examples:\n"
    "  attiscope find \"10 20 30\" \"0.2393 0.1893 0.0381 0.9515\"\n"
    "  attiscope find --gravity assets/logs/resting-imu-demo.txt\n"
    "  attiscope find --json \"0 0 0.7071 0.7071  0.7071 0 0 0.7071\" \"0.5 0.5 0.5 0.5\"\n"
    "\n";

std::string fmt(double v) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.6g", v);
  return buf;
}

nlohmann::json interpretation_json(const Interpretation& i, const std::string& mode) {
  nlohmann::json j;
  j["euler"] = i.euler ? nlohmann::json{{"sequence", i.euler->sequence()}, {"kind", i.euler->kind_name()}}
                       : nlohmann::json();
  j["unit"] =
      i.unit ? nlohmann::json(*i.unit == AngleUnit::Degrees ? "degrees" : "radians") : nlohmann::json();
  if (i.print_order) {
    // The k-th number as written is angle print_order[k] + 1 of the sequence.
    const auto& p = *i.print_order;
    j["print_order"] = {p[0] + 1, p[1] + 1, p[2] + 1};
  } else {
    j["print_order"] = nullptr;
  }
  j["quaternion_layout"] =
      i.quaternion ? nlohmann::json(quaternion_layout_key(i.quaternion->layout)) : nlohmann::json();
  j["algebra"] = i.quaternion ? nlohmann::json(algebra_key(i.quaternion->algebra)) : nlohmann::json();
  if (mode == "product") {
    j["direction"] = nullptr;
  } else if (i.quaternion) {
    j["direction"] = direction_key(i.quaternion->direction);
  } else if (i.matrix) {
    j["direction"] = direction_key(i.matrix->direction);
  } else {
    j["direction"] = nullptr;
  }
  j["matrix_storage"] = i.matrix ? nlohmann::json(storage_key(i.matrix->storage)) : nlohmann::json();
  j["matrix_direction"] = i.matrix ? nlohmann::json(direction_key(i.matrix->direction)) : nlohmann::json();
  j["description"] = i.describe();
  return j;
}

int run_gravity(const CommonOptions& o, Streams io) {
  const std::string path = *o.last("--gravity");
  auto text = read_whole_file(path);
  if (!text) {
    io.err << "attiscope find: " << text.error().describe() << "\n";
    return kExitBadInput;
  }
  auto samples = parse_gravity_log(text.value());
  if (!samples) {
    io.err << "attiscope find: " << path << ": " << samples.error().describe() << "\n";
    return kExitBadInput;
  }
  Eigen::Vector3d up_world(0, 0, 1);  // ENU, the tool's default world
  if (o.convention) {
    auto m = reference_R_frame(o.convention->world, FrameRole::World);
    if (m) up_world = m.value().transpose() * Eigen::Vector3d(0, 0, 1);
  }
  const std::string points = o.last("--accel-points").value_or("up");
  if (points != "up" && points != "down") {
    io.err << "attiscope find: --accel-points takes up or down\n";
    return kExitBadInput;
  }
  const Eigen::Vector3d expected = points == "up" ? up_world : Eigen::Vector3d(-up_world);
  auto result = gravity_test(samples.value(), expected, o.convention);
  if (!result) {
    io.err << "attiscope find: " << path << ": " << result.error().describe() << "\n";
    return kExitBadInput;
  }
  const auto& ranked = result.value().ranked;
  if (o.json) {
    nlohmann::json j;
    j["samples"] = samples.value().size();
    j["expected_world"] = {expected.x(), expected.y(), expected.z()};
    j["ranked"] = nlohmann::json::array();
    for (const GravityMatch& m : ranked) {
      nlohmann::json r = interpretation_json(m.interpretation, "gravity");
      r["worst_deg"] = m.worst_deg;
      r["spread_deg"] = m.spread_deg;
      r["tilt_deg"] = m.tilt_deg;
      j["ranked"].push_back(r);
    }
    j["notes"] = result.value().notes;
    io.out << j.dump(2) << "\n";
  } else {
    io.out << samples.value().size() << " resting samples; the accelerometer should point " << points
           << " in the world (" << fmt(expected.x()) << ", " << fmt(expected.y()) << ", " << fmt(expected.z())
           << ")\n";
    io.out << "rank  worst_deg   spread_deg  tilt_deg    reading of the poses\n";
    for (std::size_t k = 0; k < std::min(kGravityRowsShown, ranked.size()); ++k) {
      const GravityMatch& m = ranked[k];
      std::string row = std::to_string(k + 1);
      row.resize(6, ' ');
      for (double v : {m.worst_deg, m.spread_deg, m.tilt_deg}) {
        std::string n = fmt(v);
        n.resize(12, ' ');
        row += n;
      }
      io.out << row << m.interpretation.describe() << "\n";
    }
    for (const std::string& n : result.value().notes) io.out << "note: " << n << "\n";
  }
  return kExitOk;
}

}  // namespace

int run_find(const std::vector<std::string>& args, Streams io) {
  CommonOptions o;
  if (auto err =
          parse_common(args, {{"--within", true}, {"--gravity", true}, {"--accel-points", true}}, &o)) {
    io.err << "attiscope find: " << *err << "\n";
    return kExitBadInput;
  }
  if (o.help) {
    io.out << kFindHelp << common_options_help();
    return kExitOk;
  }
  for (const std::string& w : o.convention_warnings) io.err << "attiscope find: warning: " << w << "\n";
  if (o.has("--gravity")) return run_gravity(o, io);
  if (o.positional.size() != 2) {
    io.err << "attiscope find: give two texts A and B (quote each), e.g. attiscope find \"10 20 30\" \"1 0 0 "
              "0\"\n";
    return kExitBadInput;
  }
  FinderOptions fo;
  fo.house = o.convention;  // the house breaks ties
  if (auto w = o.last("--within")) {
    char* end = nullptr;
    const double deg = std::strtod(w->c_str(), &end);
    if (end == w->c_str() || *end != '\0' || !(deg >= 0.0) || !std::isfinite(deg)) {
      io.err << "attiscope find: --within needs a number of degrees, not '" << *w << "'\n";
      return kExitBadInput;
    }
    fo.within_rad = deg / kDegPerRad;
  }
  auto a = scan_values(o.positional[0], "A");
  auto b = scan_values(o.positional[1], "B");
  for (const auto* x : {&a, &b}) {
    if (!*x) {
      io.err << "attiscope find: " << x->error().describe() << "\n";
      return kExitBadInput;
    }
  }
  auto result = find_conventions(a.value(), b.value(), fo);
  if (!result) {
    io.err << "attiscope find: " << result.error().describe() << "\n";
    return kExitBadInput;
  }
  const FinderResult& r = result.value();
  if (o.json) {
    nlohmann::json j;
    j["mode"] = r.mode;
    for (const char* key : {"matches", "nearest"}) {
      j[key] = nlohmann::json::array();
      for (const FinderMatch& m : std::string(key) == "matches" ? r.matches : r.nearest) {
        nlohmann::json mj = interpretation_json(m.interpretation, r.mode);
        mj["residual_deg"] = m.residual_rad * kDegPerRad;
        j[key].push_back(mj);
      }
    }
    j["notes"] = r.notes;
    io.out << j.dump(2) << "\n";
  } else {
    io.out << "mode: " << r.mode << "\n";
    if (r.matches.empty()) {
      io.out << "no interpretation agrees within " << fmt(fo.within_rad * kDegPerRad)
             << " degrees; the closest:\n";
    }
    io.out << "rank  residual_deg  interpretation\n";
    const auto& rows = r.matches.empty() ? r.nearest : r.matches;
    for (std::size_t k = 0; k < rows.size(); ++k) {
      std::string row = std::to_string(k + 1);
      row.resize(6, ' ');
      std::string res = fmt(rows[k].residual_rad * kDegPerRad);
      res.resize(14, ' ');
      io.out << row << res << rows[k].interpretation.describe() << "\n";
    }
    for (const std::string& n : r.notes) io.out << "note: " << n << "\n";
  }
  return r.matches.empty() ? kExitCheckFailed : kExitOk;
}

}  // namespace attiscope::cli
