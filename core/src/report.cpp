// report.cpp: the convert report, as JSON and as a table.
#include "attiscope/core/report.hpp"

#include <cmath>
#include <cstdio>
#include <sstream>

#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"
#include "attiscope/core/representations.hpp"

namespace attiscope {

namespace {

constexpr double kDeg = 180.0 / M_PI;

nlohmann::json vec_json(const Eigen::Vector3d& v) {
  return nlohmann::json::array({v.x(), v.y(), v.z()});
}

nlohmann::json quat_json(const Eigen::Quaterniond& q) {
  return {{"w", q.w()}, {"x", q.x()}, {"y", q.y()}, {"z", q.z()}};
}

// JSON has no infinity: an infinite condition number is written as null.
nlohmann::json finite_or_null(double v) {
  return std::isfinite(v) ? nlohmann::json(v) : nlohmann::json();
}

std::string num(double v, int precision) {
  if (v == 0.0) v = 0.0;  // no "-0"
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", precision, v);
  return buf;
}

std::string row(const std::vector<double>& v, int precision) {
  std::string s;
  for (double x : v) {
    std::string n = num(x, precision);
    s += std::string(n.size() < 12 ? 12 - n.size() : 1, ' ') + n;
  }
  return s;
}

}  // namespace

nlohmann::json quaternion_json(const Rotation& r) {
  return quat_json(r.quaternion());
}

nlohmann::json matrix_json(const Rotation& r) {
  const Eigen::Matrix3d m = r.matrix();
  nlohmann::json rows = nlohmann::json::array();
  for (int i = 0; i < 3; ++i) rows.push_back({m(i, 0), m(i, 1), m(i, 2)});
  return rows;
}

nlohmann::json euler_json(const EulerAngles& e) {
  const Eigen::Matrix3d rate = euler_rate_matrix(e.convention, e.angles_rad);
  return {{"sequence", e.convention.sequence()},
          {"kind", e.convention.kind_name()},
          {"angles_deg", vec_json(e.angles_rad * kDeg)},
          {"lock_margin_deg", e.lock_margin_rad * kDeg},
          {"at_lock", e.at_lock},
          {"rate_condition_number", finite_or_null(condition_number(rate))}};
}

nlohmann::json convert_json(const Rotation& r, const ReportOptions& o) {
  const Eigen::Quaterniond q = r.quaternion();
  const Eigen::Matrix3d m = r.matrix();
  const AxisAngle aa = to_axis_angle(r);
  const auto gibbs = to_gibbs(r);
  const Eigen::Vector3d mrp = to_mrp(r);
  const auto shadow = mrp_shadow(mrp);

  nlohmann::json j;
  j["reading"] = o.reading;
  j["quaternion"] = quat_json(q);
  j["quaternion_xyzw"] = nlohmann::json::array({q.x(), q.y(), q.z(), q.w()});
  const auto jpl =
      to_quaternion_numbers(r, {QuatLayout::ScalarLast, QuatAlgebra::Jpl, Direction::WorldToBody});
  j["quaternion_jpl_world_to_body_xyzw"] = jpl;
  j["matrix"] = nlohmann::json::array();
  for (int i = 0; i < 3; ++i) j["matrix"].push_back(nlohmann::json::array({m(i, 0), m(i, 1), m(i, 2)}));
  j["axis_angle"] = {{"axis", vec_json(aa.axis)}, {"angle_deg", aa.angle_rad * kDeg}};
  j["rotation_vector_rad"] = vec_json(to_rotation_vector(r));
  j["gibbs"] = gibbs ? vec_json(*gibbs) : nlohmann::json();
  j["mrp"] = vec_json(mrp);
  j["mrp_shadow"] = shadow ? vec_json(*shadow) : nlohmann::json();
  const EulerAngles e = to_euler(r, o.euler);
  j["euler"] = euler_json(e);
  j["euler_all"] = nlohmann::json::array();
  for (const EulerConvention& c : all_euler_conventions())
    j["euler_all"].push_back(euler_json(to_euler(r, c)));
  const Eigen::Matrix2cd u = su2_matrix(q);
  j["su2"] = nlohmann::json::array();
  for (int i = 0; i < 2; ++i) {
    nlohmann::json rowj = nlohmann::json::array();
    for (int k = 0; k < 2; ++k) rowj.push_back({{"re", u(i, k).real()}, {"im", u(i, k).imag()}});
    j["su2"].push_back(rowj);
  }
  auto mat4 = [](const Eigen::Matrix4d& a) {
    nlohmann::json out = nlohmann::json::array();
    for (int i = 0; i < 4; ++i) out.push_back({a(i, 0), a(i, 1), a(i, 2), a(i, 3)});
    return out;
  };
  j["left_matrix"] = mat4(left_multiplication_matrix(q));
  j["right_matrix"] = mat4(right_multiplication_matrix(q));
  std::vector<std::string> warnings = o.warnings;
  if (!gibbs) warnings.push_back("the rotation is 180 degrees: its Gibbs vector is infinite");
  if (e.at_lock) {
    warnings.push_back("the pose is at gimbal lock in " + o.euler.name() +
                       ": the third angle is set to 0 and the first carries the whole free turn");
  }
  j["warnings"] = warnings;
  return j;
}

std::string convert_table(const Rotation& r, const ReportOptions& o) {
  const int p = o.precision;
  const bool deg = o.unit == AngleUnit::Degrees;
  const double ang = deg ? kDeg : 1.0;
  const char* u = deg ? "deg" : "rad";
  const Eigen::Quaterniond q = r.quaternion();
  const Eigen::Matrix3d m = r.matrix();
  const AxisAngle aa = to_axis_angle(r);
  std::ostringstream s;
  s << "reading              " << o.reading << "\n";
  s << "quaternion (w x y z) " << row({q.w(), q.x(), q.y(), q.z()}, p) << "\n";
  s << "quaternion (x y z w) " << row({q.x(), q.y(), q.z(), q.w()}, p) << "\n";
  s << "matrix world_R_body  " << row({m(0, 0), m(0, 1), m(0, 2)}, p) << "\n";
  s << "                     " << row({m(1, 0), m(1, 1), m(1, 2)}, p) << "\n";
  s << "                     " << row({m(2, 0), m(2, 1), m(2, 2)}, p) << "\n";
  s << "axis-angle           " << row({aa.axis.x(), aa.axis.y(), aa.axis.z(), aa.angle_rad * ang}, p) << " "
    << u << "\n";
  const Eigen::Vector3d rv = to_rotation_vector(r);
  s << "rotation vector rad  " << row({rv.x(), rv.y(), rv.z()}, p) << "\n";
  if (const auto g = to_gibbs(r)) {
    s << "Gibbs vector         " << row({g->x(), g->y(), g->z()}, p) << "\n";
  } else {
    s << "Gibbs vector         infinite (180 degree turn)\n";
  }
  const Eigen::Vector3d mrp = to_mrp(r);
  s << "MRP                  " << row({mrp.x(), mrp.y(), mrp.z()}, p) << "\n";
  const EulerAngles e = to_euler(r, o.euler);
  const Eigen::Vector3d a = e.angles_rad * ang;
  std::string label = "euler " + o.euler.name();
  label.resize(21, ' ');
  s << label << row({a.x(), a.y(), a.z()}, p) << " " << u << "\n";
  s << "lock margin          " << row({e.lock_margin_rad * ang}, p) << " " << u
    << (e.at_lock ? "  AT LOCK: third angle set to 0" : "") << "\n";
  s << "Euler-rate condition " << row({condition_number(euler_rate_matrix(o.euler, e.angles_rad))}, p)
    << "\n";
  std::vector<std::string> warnings = o.warnings;
  for (const std::string& w : warnings) s << "warning: " << w << "\n";
  return s.str();
}

}  // namespace attiscope
