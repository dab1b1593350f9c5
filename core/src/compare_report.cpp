// compare_report.cpp: comparisons as JSON.
#include "attiscope/core/compare_report.hpp"

#include <cmath>

namespace attiscope {

namespace {

constexpr double kDeg = 180.0 / M_PI;

nlohmann::json vec_json(const Eigen::Vector3d& v) {
  return nlohmann::json::array({v.x(), v.y(), v.z()});
}

}  // namespace

nlohmann::json comparison_json(const Comparison& c) {
  nlohmann::json j;
  j["reference"] = {{"quaternion", quaternion_json(c.world_R_reference)}};
  j["current"] = {{"quaternion", quaternion_json(c.world_R_current)}};
  j["angle_deg"] = c.angle_rad * kDeg;
  nlohmann::json named = nlohmann::json();
  if (c.named_turns) {
    named = nlohmann::json::array();
    for (const NamedTurn& t : *c.named_turns) {
      named.push_back({{"axis", std::string(1, "xyz"[t.axis])},
                       {"name", t.turn_name},
                       {"angle_deg", t.angle_rad * kDeg},
                       {"sense", t.sense}});
    }
  }
  j["body"] = {{"relation", "world_R_current = world_R_reference * reference_R_current"},
               {"quaternion", quaternion_json(c.reference_R_current)},
               {"axis", vec_json(c.axis_body)},
               {"angle_deg", c.angle_rad * kDeg},
               {"turns_deg", vec_json(c.turns_body_rad * kDeg)},
               {"named_turns", named}};
  j["world"] = {{"relation", "world_R_current = world_delta * world_R_reference"},
                {"quaternion", quaternion_json(c.world_delta)},
                {"axis", vec_json(c.axis_world)},
                {"angle_deg", c.angle_rad * kDeg},
                {"turns_deg", vec_json(c.turns_world_rad * kDeg)}};
  const EulerDifference& e = c.euler;
  j["euler_difference"] = {{"sequence", e.convention.sequence()},
                           {"kind", e.convention.kind_name()},
                           {"reference_deg", vec_json(e.reference.angles_rad * kDeg)},
                           {"current_deg", vec_json(e.current.angles_rad * kDeg)},
                           {"difference_deg", vec_json(e.difference_rad * kDeg)},
                           {"mismatch_deg", e.mismatch_rad * kDeg},
                           {"note", e.note.empty() ? nlohmann::json() : nlohmann::json(e.note)}};
  j["warnings"] = c.warnings;
  return j;
}

nlohmann::json mean_spread_json(const MeanSpread& s, const std::vector<int>& lines_in) {
  std::vector<int> lines = lines_in;
  if (lines.empty()) {
    for (std::size_t i = 0; i < s.angles_rad.size(); ++i) lines.push_back(static_cast<int>(i) + 1);
  }
  nlohmann::json j;
  j["count"] = s.angles_rad.size();
  j["mean"] = {{"quaternion", quaternion_json(s.mean)}};
  nlohmann::json aligned = nlohmann::json::array(), angles = nlohmann::json::array();
  for (std::size_t i = 0; i < s.aligned.size(); ++i) {
    const Eigen::Quaterniond& q = s.aligned[i];
    aligned.push_back({{"w", q.w()}, {"x", q.x()}, {"y", q.y()}, {"z", q.z()}});
    angles.push_back(s.angles_rad[i] * kDeg);
  }
  j["aligned_quaternions"] = aligned;
  j["lines"] = lines;
  j["angles_from_mean_deg"] = angles;
  j["max_deg"] = s.max_rad * kDeg;
  j["max_line"] = s.max_index < lines.size() ? lines[s.max_index] : 0;
  j["rms_deg"] = s.rms_rad * kDeg;
  j["hemisphere_flips"] = s.flipped;
  j["method"] = "Markley, Cheng, Crassidis, Oshman 2007: eigenvector of sum q q^T";
  return j;
}

}  // namespace attiscope
