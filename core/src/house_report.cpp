// house_report.cpp: the house convention's view of one pose, as JSON and as table lines.
#include "attiscope/core/house_report.hpp"

#include <cstdio>
#include <sstream>

#include "attiscope/core/finder.hpp"
#include "attiscope/core/steps.hpp"

namespace attiscope {

namespace {

constexpr double kDegPerRad = 180.0 / 3.14159265358979323846;

std::string num(double v, int precision) {
  if (v == 0.0) v = 0.0;  // no "-0"
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", precision, v);
  return buf;
}

std::string frames(const HouseConvention& c) {
  return frame_preset_name(c.world, FrameRole::World) + "/" + frame_preset_name(c.body, FrameRole::Body);
}

}  // namespace

nlohmann::json house_json(const Rotation& r, const HouseConvention& c) {
  const HouseEulerView e = house_euler(r, c);
  nlohmann::json j;
  j["name"] = c.name;
  j["world_frame"] = frame_preset_name(c.world, FrameRole::World);
  j["world_axes"] = c.world.directions;
  j["body_frame"] = frame_preset_name(c.body, FrameRole::Body);
  j["body_axes"] = c.body.directions;
  j["euler"] = {{"sequence", c.euler.convention.sequence()},
                {"kind", c.euler.convention.kind_name()},
                {"names", e.names},
                {"values", e.values},
                {"unit", angle_unit_name(c.euler.unit)},
                {"applied_names", c.euler.names},
                {"lock_margin_deg", e.angles.lock_margin_rad * kDegPerRad},
                {"at_lock", e.angles.at_lock}};
  j["quaternion"] = {{"layout", quaternion_layout_key(c.quaternion.layout)},
                     {"algebra", algebra_key(c.quaternion.algebra)},
                     {"direction", direction_key(c.quaternion.direction)},
                     {"labels", house_quaternion_labels(c)},
                     {"numbers", house_quaternion(r, c)}};
  j["matrix"] = {{"direction", direction_key(c.matrix.direction)},
                 {"storage", storage_key(c.matrix.storage)},
                 {"numbers", house_matrix(r, c)}};
  j["positive_directions"] = positive_direction_sentences(c);
  nlohmann::json steps = nlohmann::json::array();
  for (const EulerStep& s : euler_steps(r, c).steps) steps.push_back(s.sentence);
  j["steps"] = steps;
  return j;
}

std::string house_table(const Rotation& r, const HouseConvention& c) {
  const int p = c.precision;
  const HouseEulerView e = house_euler(r, c);
  const char* unit = c.euler.unit == AngleUnit::Degrees ? "deg" : "rad";
  std::ostringstream s;
  s << "house                " << c.name << " (" << frames(c) << ", " << c.euler.convention.name() << ")\n";
  s << "house euler          ";
  for (std::size_t k = 0; k < 3; ++k) s << (k ? "  " : "") << e.names[k] << " " << num(e.values[k], p);
  s << " " << unit << (e.angles.at_lock ? "  AT LOCK" : "") << "\n";
  const auto labels = house_quaternion_labels(c);
  const auto q = house_quaternion(r, c);
  s << "house quaternion     (" << labels[0] << " " << labels[1] << " " << labels[2] << " " << labels[3]
    << ", " << algebra_key(c.quaternion.algebra) << ", " << direction_key(c.quaternion.direction) << ")";
  for (double v : q) s << " " << num(v, p);
  s << "\n";
  const auto m = house_matrix(r, c);
  s << "house matrix         (" << direction_key(c.matrix.direction) << ", " << storage_key(c.matrix.storage)
    << ")";
  for (double v : m) s << " " << num(v, p);
  s << "\n";
  return s.str();
}

}  // namespace attiscope
