// card_values.cpp: each card's numbers, their meaning and their clipboard forms, via core.
#include "gui/card_values.hpp"

#include "attiscope/core/convention.hpp"

#include <cmath>
#include <cstdio>
#include <limits>
#include <sstream>

#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"
#include "attiscope/core/report.hpp"
#include "attiscope/core/representations.hpp"

namespace attiscope::gui {

namespace {

constexpr double kPi = 3.14159265358979323846;
/// Digits that round-trip a double (JSON and code literals).
constexpr int kRoundTripDigits = 17;
/// Relative distance from the exact form below which a typed 2x2 complex or 4x4 real matrix
/// is read as that form (display precision leaves about 1e-7).
constexpr double kAlgebraFormTolerance = 1e-5;

std::array<const char*, 4> quat_labels(QuatLayout l) {
  if (l == QuatLayout::ScalarFirst) return {"w", "x", "y", "z"};
  return {"x", "y", "z", "w"};
}

QuatConvention other_layout(QuatConvention c) {
  c.layout = c.layout == QuatLayout::ScalarFirst ? QuatLayout::ScalarLast : QuatLayout::ScalarFirst;
  return c;
}

std::string join(const std::vector<double>& v, int digits, const char* sep = "  ") {
  std::string out;
  for (std::size_t i = 0; i < v.size(); ++i) {
    if (i) out += sep;
    out += format_number(v[i], digits);
  }
  return out;
}

template <std::size_t N>
std::vector<double> vec(const std::array<double, N>& a) {
  return std::vector<double>(a.begin(), a.end());
}

std::vector<double> vec3(const Eigen::Vector3d& v) {
  return {v.x(), v.y(), v.z()};
}

EulerConvention euler_of(Card c, const DocumentState& s) {
  return c == Card::EulerHouse ? s.convention.house.euler.convention : s.second_euler;
}

std::vector<double> su2_numbers(const Rotation& r) {
  const Eigen::Matrix2cd u = su2_matrix(r.quaternion());
  return {u(0, 0).real(), u(0, 0).imag(), u(0, 1).real(), u(0, 1).imag(),
          u(1, 0).real(), u(1, 0).imag(), u(1, 1).real(), u(1, 1).imag()};
}

std::vector<double> left_right_numbers(const Rotation& r) {
  const Eigen::Quaterniond q = r.quaternion();
  const Eigen::Matrix4d l = left_multiplication_matrix(q);
  const Eigen::Matrix4d rm = right_multiplication_matrix(q);
  std::vector<double> out;
  for (int i = 0; i < 4; ++i)
    for (int k = 0; k < 4; ++k) out.push_back(l(i, k));
  for (int i = 0; i < 4; ++i)
    for (int k = 0; k < 4; ++k) out.push_back(rm(i, k));
  return out;
}

EditCheck from_expected(const Expected<Rotation>& r) {
  EditCheck c;
  if (r) {
    c.rotation = r.value();
  } else {
    c.problem = r.error().describe();
  }
  return c;
}

bool all_finite(const std::vector<double>& v) {
  for (double x : v)
    if (!std::isfinite(x)) return false;
  return true;
}

EditCheck check_matrix_edit(const std::vector<double>& n, const DocumentState& s) {
  std::array<double, 9> a{};
  std::copy(n.begin(), n.end(), a.begin());
  const Eigen::Matrix3d m = matrix_from_numbers(a, MatrixStorage::Rows);
  const MatrixCheck mc = check_matrix(m);
  EditCheck c;
  if (!mc.finite) {
    c.problem = "a number of the matrix is not finite";
    return c;
  }
  if (mc.orthonormality_defect <= kMatrixDefectSilent && mc.determinant > 0.0) {
    return from_expected(from_matrix(m, s.convention.house.matrix.direction));
  }
  char buf[200];
  std::snprintf(buf, sizeof buf, "not a rotation: orthonormality defect |M^T M - I| = %.3g, det = %.6g%s",
                mc.orthonormality_defect, mc.determinant, mc.determinant < 0.0 ? " (a reflection)" : "");
  c.problem = buf;
  auto nearest = from_matrix(nearest_rotation(m), s.convention.house.matrix.direction);
  if (nearest) c.nearest = nearest.value();
  return c;
}

template <class Form, class Reader>
EditCheck check_form_edit(const Form& m, Reader read) {
  auto exact = read(m, kAlgebraFormTolerance);
  if (exact) {
    EditCheck c;
    c.rotation = exact.value();
    return c;
  }
  EditCheck c;
  c.problem = exact.error().describe();
  auto nearest = read(m, std::numeric_limits<double>::infinity());
  if (nearest) c.nearest = nearest.value();
  return c;
}

}  // namespace

std::string format_number(double v, int significant_digits) {
  if (v == 0.0) v = 0.0;  // no "-0"
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", significant_digits, v);
  return buf;
}

double angle_scale(AngleUnit unit) {
  return unit == AngleUnit::Degrees ? 180.0 / kPi : 1.0;
}
const char* unit_name(AngleUnit unit) {
  return unit == AngleUnit::Degrees ? "deg" : "rad";
}

CardView card_view(Card c, const DocumentState& s) {
  const Rotation& r = s.world_R_body;
  const DisplayConvention& dc = s.convention;
  const HouseConvention& hc = dc.house;
  const int p = hc.precision;
  const double k = angle_scale(dc.house.euler.unit);
  const char* u = unit_name(dc.house.euler.unit);
  CardView v;
  switch (c) {
    case Card::Quaternion: {
      v.title = "Quaternion (" + dc.house.quaternion.describe() + ")";
      for (const char* l : quat_labels(dc.house.quaternion.layout)) v.labels.push_back(l);
      v.numbers = vec(to_quaternion_numbers(r, dc.house.quaternion));
      const QuatConvention other = other_layout(dc.house.quaternion);
      v.info.push_back(other.describe() + ":  " + join(vec(to_quaternion_numbers(r, other)), p));
      QuatConvention jpl{QuatLayout::ScalarLast, QuatAlgebra::Jpl, Direction::WorldToBody};
      if (dc.house.quaternion == jpl) jpl = QuatConvention{};  // the house form is JPL: show Hamilton
      v.info.push_back(jpl.describe() + ":  " + join(vec(to_quaternion_numbers(r, jpl)), p));
      break;
    }
    case Card::Matrix: {
      const MatrixConvention rows{dc.house.matrix.direction, MatrixStorage::Rows};
      v.title = std::string("Rotation matrix (") +
                (dc.house.matrix.direction == Direction::BodyToWorld ? "world_R_body: v_world = R v_body"
                                                                     : "body_R_world: v_body = C v_world") +
                ")";
      v.columns = 3;
      for (int i = 0; i < 9; ++i) v.labels.push_back("m" + std::to_string(i / 3) + std::to_string(i % 3));
      v.numbers = vec(to_matrix_numbers(r, rows));
      std::array<double, 9> a{};
      std::copy(v.numbers.begin(), v.numbers.end(), a.begin());
      const MatrixCheck mc = check_matrix(matrix_from_numbers(a, MatrixStorage::Rows));
      v.info.push_back("orthonormality defect " + format_number(mc.orthonormality_defect, 3) +
                       "   determinant " + format_number(mc.determinant, p));
      v.info.push_back("storage: " + dc.house.matrix.describe());
      break;
    }
    case Card::EulerHouse: {
      // The house's numbers: print order, unit and ranges from the convention (core).
      const HouseEulerView hv = house_euler(r, hc);
      const EulerConvention& ec = hc.euler.convention;
      v.title = "Euler angles, house: " + ec.name();
      v.columns = 3;
      for (int i = 0; i < 3; ++i) {
        const std::size_t app = static_cast<std::size_t>(hc.euler.print_order[static_cast<std::size_t>(i)]);
        v.labels.push_back(hv.names[static_cast<std::size_t>(i)] + " (" +
                           std::string(1, axis_letter(ec.axes[app])) + ")");
      }
      v.numbers = vec(hv.values);
      v.info.push_back("lock margin " + format_number(hv.angles.lock_margin_rad * k, p) + " " + u +
                       (hv.angles.at_lock ? "   AT LOCK: third angle set to 0" : ""));
      v.info.push_back("Euler-rate condition number " +
                       format_number(condition_number(euler_rate_matrix(ec, hv.angles.angles_rad)), 4));
      break;
    }
    case Card::EulerSecond: {
      const EulerConvention ec = euler_of(c, s);
      const EulerAngles e = to_euler(r, ec);
      v.title = "Euler angles, second: " + ec.name();
      v.columns = 3;
      for (int i = 0; i < 3; ++i) {
        const std::string axis(1, axis_letter(ec.axes[static_cast<std::size_t>(i)]));
        v.labels.push_back(std::string(1, static_cast<char>('a' + i)) + " (" + axis + ")");
      }
      v.numbers = vec3(e.angles_rad * k);
      v.info.push_back("lock margin " + format_number(e.lock_margin_rad * k, p) + " " + u +
                       (e.at_lock ? "   AT LOCK: third angle set to 0" : ""));
      v.info.push_back("Euler-rate condition number " +
                       format_number(condition_number(euler_rate_matrix(ec, e.angles_rad)), 4));
      break;
    }
    case Card::AxisAngle: {
      const AxisAngle aa = to_axis_angle(r);
      v.title = std::string("Axis-angle (unit axis, angle in ") + u + ")";
      v.labels = {"x", "y", "z", "angle"};
      v.numbers = {aa.axis.x(), aa.axis.y(), aa.axis.z(), aa.angle_rad * k};
      break;
    }
    case Card::RotationVector:
      v.title = "Rotation vector (rad)";
      v.columns = 3;
      v.labels = {"x", "y", "z"};
      v.numbers = vec3(to_rotation_vector(r));
      break;
    case Card::Gibbs: {
      v.title = "Gibbs vector (Rodrigues)";
      v.columns = 3;
      v.labels = {"g1", "g2", "g3"};
      if (const auto g = to_gibbs(r)) {
        v.numbers = vec3(*g);
      } else {
        v.numbers = {0.0, 0.0, 0.0};
        v.editable = false;
        v.info.push_back("infinite: the rotation is 180 degrees");
      }
      break;
    }
    case Card::Mrp: {
      v.title = "Modified Rodrigues parameters";
      v.columns = 3;
      v.labels = {"p1", "p2", "p3"};
      const Eigen::Vector3d m = to_mrp(r);
      v.numbers = vec3(m);
      const auto shadow = mrp_shadow(m);
      v.info.push_back(shadow ? "shadow set:  " + join(vec3(*shadow), p)
                              : "shadow set: infinite at the identity");
      break;
    }
    case Card::Su2:
      v.title = "SU(2): [[w + x i, y + z i], [-y + z i, w - x i]]";
      v.columns = 4;
      v.labels = {"u00 re", "u00 im", "u01 re", "u01 im", "u10 re", "u10 im", "u11 re", "u11 im"};
      v.numbers = su2_numbers(r);
      break;
    case Card::LeftRight:
      v.title = "4x4 real: L(q) left, R(q) right multiplication";
      v.columns = 8;
      for (int h = 0; h < 2; ++h)
        for (int i = 0; i < 16; ++i)
          v.labels.push_back(std::string(h ? "R" : "L") + std::to_string(i / 4) + std::to_string(i % 4));
      {
        // Interleave rows so the grid shows L and R side by side, four columns each.
        const std::vector<double> n = left_right_numbers(r);
        std::vector<double> grid;
        std::vector<std::string> labels;
        for (int i = 0; i < 4; ++i) {
          for (int h = 0; h < 2; ++h)
            for (int kk = 0; kk < 4; ++kk) {
              const std::size_t idx = static_cast<std::size_t>(h * 16 + i * 4 + kk);
              grid.push_back(n[idx]);
              labels.push_back(v.labels[idx]);
            }
        }
        v.numbers = grid;
        v.labels = labels;
      }
      break;
  }
  return v;
}

EditCheck check_card_edit(Card c, const std::vector<double>& n, const DocumentState& s) {
  const DisplayConvention& dc = s.convention;
  const double k = angle_scale(dc.house.euler.unit);
  if (!all_finite(n)) {
    EditCheck e;
    e.problem = "a number is not finite";
    return e;
  }
  switch (c) {
    case Card::Quaternion: {
      QuatCheck qc;
      EditCheck e =
          from_expected(from_quaternion_numbers({n[0], n[1], n[2], n[3]}, dc.house.quaternion, &qc));
      if (e.rotation && std::abs(qc.norm - 1.0) > kUnitNormTolerance)
        e.note = "normalised from |q| = " + format_number(qc.norm, 6);
      return e;
    }
    case Card::Matrix: return check_matrix_edit(n, s);
    case Card::EulerHouse: return from_expected(from_house_euler({n[0], n[1], n[2]}, dc.house));
    case Card::EulerSecond:
      return from_expected(from_euler(euler_of(c, s), Eigen::Vector3d(n[0], n[1], n[2]) / k));
    case Card::AxisAngle: return from_expected(from_axis_angle(Eigen::Vector3d(n[0], n[1], n[2]), n[3] / k));
    case Card::RotationVector: return from_expected(from_rotation_vector(Eigen::Vector3d(n[0], n[1], n[2])));
    case Card::Gibbs: return from_expected(from_gibbs(Eigen::Vector3d(n[0], n[1], n[2])));
    case Card::Mrp: return from_expected(from_mrp(Eigen::Vector3d(n[0], n[1], n[2])));
    case Card::Su2: {
      Eigen::Matrix2cd u;
      u << std::complex<double>(n[0], n[1]), std::complex<double>(n[2], n[3]),
          std::complex<double>(n[4], n[5]), std::complex<double>(n[6], n[7]);
      return check_form_edit(u,
                             [](const Eigen::Matrix2cd& m, double tol) { return from_su2_matrix(m, tol); });
    }
    case Card::LeftRight: {
      // The grid interleaves L and R by rows; the edited half is the one that differs.
      Eigen::Matrix4d l, rm;
      for (int i = 0; i < 4; ++i)
        for (int kk = 0; kk < 4; ++kk) {
          l(i, kk) = n[static_cast<std::size_t>(i * 8 + kk)];
          rm(i, kk) = n[static_cast<std::size_t>(i * 8 + 4 + kk)];
        }
      const Eigen::Quaterniond q = s.world_R_body.quaternion();
      const bool left_edited =
          (l - left_multiplication_matrix(q)).norm() >= (rm - right_multiplication_matrix(q)).norm();
      const MultiplicationSide side = left_edited ? MultiplicationSide::Left : MultiplicationSide::Right;
      return check_form_edit(left_edited ? l : rm, [side](const Eigen::Matrix4d& m, double tol) {
        return from_multiplication_matrix(m, side, tol);
      });
    }
  }
  return EditCheck{};
}

std::string card_plain_text(Card c, const DocumentState& s) {
  const CardView v = card_view(c, s);
  std::ostringstream out;
  out << v.title << "\n";
  for (std::size_t i = 0; i < v.numbers.size(); ++i) {
    out << format_number(v.numbers[i], s.convention.house.precision);
    out << ((i + 1) % static_cast<std::size_t>(v.columns) == 0 || i + 1 == v.numbers.size() ? "\n" : "  ");
  }
  for (const std::string& line : v.info) out << line << "\n";
  return out.str();
}

nlohmann::json card_json(Card c, const DocumentState& s) {
  ReportOptions o;
  o.euler = s.convention.house.euler.convention;
  o.reading = "window";
  const nlohmann::json all = convert_json(s.world_R_body, o);
  auto pick = [&all](std::initializer_list<const char*> keys) {
    nlohmann::json j;
    for (const char* key : keys) j[key] = all.at(key);
    return j;
  };
  switch (c) {
    case Card::Quaternion:
      return pick({"quaternion", "quaternion_xyzw", "quaternion_jpl_world_to_body_xyzw"});
    case Card::Matrix: return pick({"matrix"});
    case Card::EulerHouse: return {{"euler", all.at("euler")}};
    case Card::EulerSecond: return {{"euler", euler_json(to_euler(s.world_R_body, s.second_euler))}};
    case Card::AxisAngle: return pick({"axis_angle"});
    case Card::RotationVector: return pick({"rotation_vector_rad"});
    case Card::Gibbs: return pick({"gibbs"});
    case Card::Mrp: return pick({"mrp", "mrp_shadow"});
    case Card::Su2: return pick({"su2"});
    case Card::LeftRight: return pick({"left_matrix", "right_matrix"});
  }
  return {};
}

std::string card_code_literal(Card c, const DocumentState& s) {
  const CardView v = card_view(c, s);
  const int d = kRoundTripDigits;
  std::string name;
  switch (c) {
    case Card::Quaternion: {
      const Eigen::Quaterniond q = s.world_R_body.quaternion();
      return "// Hamilton, body-to-world (v_world = q v_body q*); Eigen's constructor takes w, x, y, z\n"
             "const Eigen::Quaterniond world_q_body(" +
             join({q.w(), q.x(), q.y(), q.z()}, d, ", ") + ");\n";
    }
    case Card::Matrix: {
      std::string out =
          "// " + v.title + ", row-major\nconst double " +
          (s.convention.house.matrix.direction == Direction::BodyToWorld ? "world_R_body" : "body_R_world") +
          "[3][3] = {\n";
      for (int i = 0; i < 3; ++i) {
        const std::size_t b = static_cast<std::size_t>(3 * i);
        out += "    {" + join({v.numbers[b], v.numbers[b + 1], v.numbers[b + 2]}, d, ", ") + "},\n";
      }
      return out + "};\n";
    }
    case Card::EulerHouse: name = "house_euler"; break;
    case Card::EulerSecond: name = "euler"; break;
    case Card::AxisAngle: name = "axis_angle"; break;
    case Card::RotationVector: name = "rotation_vector_rad"; break;
    case Card::Gibbs: name = "gibbs"; break;
    case Card::Mrp: name = "mrp"; break;
    case Card::Su2: name = "su2_re_im"; break;
    case Card::LeftRight: name = "left_right_rows"; break;
  }
  return "// " + v.title + "\nconst double " + name + "[" + std::to_string(v.numbers.size()) + "] = {" +
         join(v.numbers, d, ", ") + "};\n";
}

}  // namespace attiscope::gui
