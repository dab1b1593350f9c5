// mount_report.cpp: a mount check run end to end, as JSON and as text.
#include "attiscope/core/mount_report.hpp"
#include "attiscope/core/report.hpp"

#include <cmath>
#include <cstdio>
#include <sstream>

#include "attiscope/core/compare.hpp"

namespace attiscope {

namespace {

constexpr double kDeg = 180.0 / M_PI;

nlohmann::json vec_json(const Eigen::Vector3d& v) {
  return nlohmann::json::array({v.x(), v.y(), v.z()});
}

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

nlohmann::json turns_json(const std::array<NamedTurn, 3>& turns) {
  nlohmann::json out = nlohmann::json::array();
  for (const NamedTurn& t : turns) {
    out.push_back({{"axis", std::string(1, "xyz"[t.axis])},
                   {"name", t.turn_name},
                   {"angle_deg", t.angle_rad * kDeg},
                   {"sense", t.sense}});
  }
  return out;
}

}  // namespace

Expected<MountResult> run_mount_check(const MountInputs& in) {
  if (in.measured && in.vectors) return Error{"give a measured mount or vector pairs, not both"};
  if (!in.measured && !in.vectors) return Error{"give the measured mount: a value or vector pairs"};
  MountResult r;
  r.names = in.names;
  r.tolerance_rad = in.tolerance_rad;
  r.nominal = in.nominal;
  if (in.nominal) {
    for (const std::string& w : in.nominal->warnings) r.warnings.push_back("nominal: " + w);
  }
  if (in.measured) {
    r.measured = in.measured;
    for (const std::string& w : in.measured->warnings) r.warnings.push_back("measured: " + w);
  } else {
    auto s = solve_mount_from_vectors(*in.vectors, in.names);
    if (!s) return s.error();
    r.solve = s.value();
    for (const VectorPair& p : *in.vectors) r.vector_lines.push_back(p.line);
    for (const std::string& w : r.solve->warnings) r.warnings.push_back(w);
    if (r.solve->vehicle_R_sensor) {
      MountReading m;
      m.vehicle_R_sensor = *r.solve->vehicle_R_sensor;
      m.description = "solved from " + std::to_string(in.vectors->size()) + " vector pairs" +
                      (in.vectors_source.empty() ? "" : " in " + in.vectors_source);
      m.alternatives = inverse_only(m.vehicle_R_sensor,
                                    "the vector columns swapped (vehicle vector first, then sensor vector)");
      r.measured = m;
    }
  }
  if (r.nominal && r.measured) {
    r.check = check_mount(r.nominal->vehicle_R_sensor, r.measured->vehicle_R_sensor, r.tolerance_rad, r.names,
                          r.measured->alternatives);
  }
  return r;
}

nlohmann::json mount_json(const MountResult& r) {
  nlohmann::json j;
  j["vehicle_axes"] = r.names.code();
  j["mount"] = r.measured ? nlohmann::json{{"quaternion", quaternion_json(r.measured->vehicle_R_sensor)},
                                           {"matrix", matrix_json(r.measured->vehicle_R_sensor)},
                                           {"direction", "sensor_to_vehicle"},
                                           {"source", r.measured->description}}
                          : nlohmann::json();
  j["nominal"] = r.nominal ? nlohmann::json{{"quaternion", quaternion_json(r.nominal->vehicle_R_sensor)},
                                            {"matrix", matrix_json(r.nominal->vehicle_R_sensor)},
                                            {"source", r.nominal->description}}
                           : nlohmann::json();
  j["tolerance_deg"] = r.tolerance_rad * kDeg;
  if (r.check) {
    const MountCheck& c = *r.check;
    j["error_deg"] = c.error_rad * kDeg;
    j["error_axis_vehicle"] = vec_json(c.error_axis_vehicle);
    j["error_quaternion_vehicle"] = quaternion_json(c.error_vehicle);
    j["error_words"] = c.error_words;
    j["error_turns"] = turns_json(c.error_turns);
    j["within_tolerance"] = c.within_tolerance;
    j["verdict"] = verdict_name(c.verdict);
    j["verdict_text"] = c.verdict_text;
    nlohmann::json ex = nlohmann::json::array();
    for (const Explanation& e : c.explanations)
      ex.push_back({{"reading", e.label}, {"error_deg", e.error_rad * kDeg}});
    j["explanations"] = ex;
    j["nearest_reorientation_deg"] = c.nearest_reorientation_rad * kDeg;
  } else {
    j["error_deg"] = nullptr;
    j["within_tolerance"] = nullptr;
  }
  if (r.solve) {
    const VectorSolve& s = *r.solve;
    nlohmann::json res = nlohmann::json::array();
    for (double x : s.residuals_rad) res.push_back(x * kDeg);
    j["residuals_deg"] = res;
    j["separation_deg"] = s.observability.separation_rad * kDeg;
    if (s.vehicle_R_sensor) {
      j["solver"] = {{"method", "svd"},
                     {"loss", s.loss},
                     {"davenport_difference_deg", s.davenport_difference_rad * kDeg},
                     {"triad", s.triad ? nlohmann::json{{"quaternion", quaternion_json(*s.triad)},
                                                        {"difference_deg", s.triad_difference_rad * kDeg},
                                                        {"lines", s.triad_lines}}
                                       : nlohmann::json()}};
    }
    j["unobservable"] = r.refused() ? nlohmann::json(s.observability.sentence) : nlohmann::json();
    if (r.refused()) {
      j["free_axis_vehicle"] = vec_json(s.observability.free_axis_vehicle);
      j["free_axis_sensor"] = vec_json(s.observability.free_axis_sensor);
    }
  } else {
    j["residuals_deg"] = nullptr;
    j["unobservable"] = nullptr;
  }
  j["warnings"] = r.warnings;
  j["caution"] = kMountCaution;
  return j;
}

std::string mount_report_text(const MountResult& r, int p, const std::string& date) {
  std::ostringstream out;
  const VehicleAxes& n = r.names;
  out << "mount check   vehicle axes " << n.code() << " (x " << n.direction_word(0) << ", y "
      << n.direction_word(1) << ", z " << n.direction_word(2)
      << "); a mount is vehicle_R_sensor (sensor coordinates -> vehicle coordinates)\n";
  if (!date.empty()) out << "date          " << date << "\n";
  if (r.nominal) {
    out << "nominal       " << quat_text(r.nominal->vehicle_R_sensor, p) << "\n              "
        << r.nominal->description << "\n";
  }
  if (r.measured) {
    out << "measured      " << quat_text(r.measured->vehicle_R_sensor, p) << "\n              "
        << r.measured->description << "\n";
  }
  if (r.solve && r.solve->vehicle_R_sensor) {
    const VectorSolve& s = *r.solve;
    out << "solver        SVD (Markley 1988); q-method differs by "
        << fmt(s.davenport_difference_rad * kDeg, 3) << " degrees";
    if (s.triad) {
      out << "; TRIAD on pairs " << s.triad_lines[0] << " and " << s.triad_lines[1] << " differs by "
          << fmt(s.triad_difference_rad * kDeg, 3) << " degrees";
    }
    out << "\nresiduals    ";
    for (double x : s.residuals_rad) out << " " << fmt(x * kDeg, 3);
    out << " degrees (per pair, in file order)\n";
  }
  if (r.refused()) out << "REFUSED       " << r.solve->observability.sentence << "\n";
  if (r.check) {
    const MountCheck& c = *r.check;
    out << "error         " << c.error_words << "\n";
    if (c.error_rad <= kSmallSplitLimitRad) {
      out << "              split:";
      for (const NamedTurn& t : c.error_turns) {
        out << "  " << t.turn_name << " " << fmt(t.angle_rad * kDeg, 3)
            << (t.sense.empty() ? "" : " (" + t.sense + ")");
      }
      out << " degrees (small-angle split about the vehicle's axes)\n";
    }
    out << "tolerance     " << fmt(r.tolerance_rad * kDeg, p) << " degrees\n";
    out << "result        " << (c.within_tolerance ? "PASS" : "FAIL") << ": " << c.verdict_text << "\n";
    for (std::size_t i = 1; i < c.explanations.size(); ++i) {
      out << "              also explained by " << c.explanations[i].label << " ("
          << fmt(c.explanations[i].error_rad * kDeg, 3) << " degrees)\n";
    }
  } else if (r.measured) {
    out << "result        no nominal mount given: nothing to check against\n";
  }
  for (const std::string& w : r.warnings) out << "warning: " << w << "\n";
  out << "\n" << kMountCaution << "\n";
  return out.str();
}

std::vector<std::string> mount_picture_notes(const MountResult& r, int p, const std::string& date) {
  std::vector<std::string> out;
  if (r.check) {
    const MountCheck& c = *r.check;
    out.push_back(std::string(c.within_tolerance ? "PASS" : "FAIL") + ": error " +
                  fmt(c.error_rad * kDeg, p) + " degrees, tolerance " + fmt(c.tolerance_rad * kDeg, p) +
                  " degrees. " + c.error_words + ".");
    if (!c.within_tolerance) out.push_back(c.verdict_text);
  } else if (r.refused()) {
    out.push_back("NO ANSWER: " + r.solve->observability.sentence);
  }
  if (!date.empty()) out.push_back("Checked " + date + "; inputs and details in the text sheet.");
  return out;
}

}  // namespace attiscope
