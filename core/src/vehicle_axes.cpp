// vehicle_axes.cpp: vehicle axis names and turns said in words.
#include "attiscope/core/vehicle_axes.hpp"

#include <Eigen/Geometry>
#include <Eigen/LU>
#include <cassert>
#include <cctype>
#include <cmath>
#include <cstdio>

namespace attiscope {

namespace {

constexpr double kDeg = 180.0 / M_PI;

// The one table of body directions: letter, sentence word, convention-file word, and the
// unit vector in the FLU reference (x forward, y left, z up; common practice, ISO 8855).
struct DirectionRow {
  BodyDirection direction;
  char letter;
  const char* word;
  const char* convention_word;
  double x, y, z;
};
constexpr DirectionRow kDirections[] = {
    {BodyDirection::Forward, 'F', "forward", "forward", 1, 0, 0},
    {BodyDirection::Aft, 'B', "aft", "back", -1, 0, 0},
    {BodyDirection::Left, 'L', "left", "left", 0, 1, 0},
    {BodyDirection::Right, 'R', "right", "right", 0, -1, 0},
    {BodyDirection::Up, 'U', "up", "up", 0, 0, 1},
    {BodyDirection::Down, 'D', "down", "down", 0, 0, -1},
};

constexpr std::array<BodyDirection, 6> kAllDirections{BodyDirection::Forward, BodyDirection::Aft,
                                                      BodyDirection::Left,    BodyDirection::Right,
                                                      BodyDirection::Up,      BodyDirection::Down};

const DirectionRow& row_of(BodyDirection d) {
  for (const DirectionRow& r : kDirections) {
    if (r.direction == d) return r;
  }
  return kDirections[0];  // cannot happen: the table names every direction
}

// Directions as vectors in a forward-right-down space (the FLU vector with y and z flipped),
// in which the turn senses below are worked out.
Eigen::Vector3d frd_vector(BodyDirection d) {
  const Eigen::Vector3d flu = flu_vector(d);
  return Eigen::Vector3d(flu.x(), -flu.y(), -flu.z());
}

BodyDirection direction_of_frd(const Eigen::Vector3d& v) {
  int i = 0;
  v.cwiseAbs().maxCoeff(&i);
  const bool pos = v(i) > 0;
  if (i == 0) return pos ? BodyDirection::Forward : BodyDirection::Aft;
  if (i == 1) return pos ? BodyDirection::Right : BodyDirection::Left;
  return pos ? BodyDirection::Down : BodyDirection::Up;
}

char letter(BodyDirection d) {
  return row_of(d).letter;
}

std::string fmt(double v, int precision) {
  if (v == 0.0) v = 0.0;
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", precision, v);
  return buf;
}

const char* kAxisLetters[3] = {"x", "y", "z"};

}  // namespace

std::string direction_word(BodyDirection d) {
  return row_of(d).word;
}

const std::array<BodyDirection, 6>& body_directions() {
  return kAllDirections;
}

std::string convention_word(BodyDirection d) {
  return row_of(d).convention_word;
}

std::optional<BodyDirection> parse_convention_word(std::string_view word) {
  std::string w(word);
  for (char& ch : w) ch = static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
  for (const DirectionRow& r : kDirections) {
    if (w == r.convention_word) return r.direction;
  }
  return std::nullopt;
}

char direction_letter(BodyDirection d) {
  return row_of(d).letter;
}

Eigen::Vector3d flu_vector(BodyDirection d) {
  const DirectionRow& r = row_of(d);
  return Eigen::Vector3d(r.x, r.y, r.z);
}

std::optional<BodyDirection> direction_of_flu(const Eigen::Vector3d& unit, double tolerance) {
  for (const DirectionRow& r : kDirections) {
    if ((unit - Eigen::Vector3d(r.x, r.y, r.z)).norm() < tolerance) return r.direction;
  }
  return std::nullopt;
}

std::string VehicleAxes::code() const {
  return std::string{letter(axes[0]), letter(axes[1]), letter(axes[2])};
}

std::string VehicleAxes::direction_word(int axis, bool positive) const {
  const Eigen::Vector3d v = frd_vector(axes[static_cast<std::size_t>(axis)]) * (positive ? 1.0 : -1.0);
  return attiscope::direction_word(direction_of_frd(v));
}

std::string VehicleAxes::turn_name(int axis) const {
  const Eigen::Vector3d v = frd_vector(axes[static_cast<std::size_t>(axis)]).cwiseAbs();
  if (v.x() > 0.5) return "roll";
  if (v.y() > 0.5) return "pitch";
  return "yaw";
}

std::string VehicleAxes::axis_label(int axis) const {
  return std::string(kAxisLetters[axis]) + ", " + direction_word(axis, true);
}

std::string VehicleAxes::turn_sense(int axis, double sign) const {
  if (sign == 0.0) return "";
  // The turn's axis in forward-right-down space; its telltale is the nose for pitch and
  // yaw, the right side for roll. The telltale moves along axis x telltale.
  const Eigen::Vector3d a = frd_vector(axes[static_cast<std::size_t>(axis)]) * (sign > 0 ? 1.0 : -1.0);
  const bool roll = std::abs(a.x()) > 0.5;
  const Eigen::Vector3d telltale = roll ? Eigen::Vector3d(0, 1, 0) : Eigen::Vector3d(1, 0, 0);
  const Eigen::Vector3d moves = a.cross(telltale);
  return std::string(roll ? "right side " : "nose ") + attiscope::direction_word(direction_of_frd(moves));
}

std::string VehicleAxes::word_for(const Eigen::Vector3d& signed_axis) const {
  int i = 0;
  signed_axis.cwiseAbs().maxCoeff(&i);
  return direction_word(i, signed_axis(i) > 0);
}

std::pair<int, double> VehicleAxes::axis_of(BodyDirection d) const {
  const Eigen::Vector3d want = frd_vector(d);
  for (int i = 0; i < 3; ++i) {
    const double dot = frd_vector(axes[static_cast<std::size_t>(i)]).dot(want);
    if (std::abs(dot) > 0.5) return {i, dot > 0 ? 1.0 : -1.0};
  }
  assert(false && "a right-handed VehicleAxes names every line");
  return {0, 1.0};
}

Expected<VehicleAxes> parse_vehicle_axes(std::string_view code) {
  if (code.size() != 3) {
    return Error{
        "a vehicle frame is three letters from F B R L U D, one per axis x y z (e.g. FRD, FLU), got '" +
        std::string(code) + "'"};
  }
  VehicleAxes out;
  Eigen::Matrix3d m;
  for (std::size_t i = 0; i < 3; ++i) {
    const char c = static_cast<char>(std::toupper(static_cast<unsigned char>(code[i])));
    switch (c) {
      case 'F': out.axes[i] = BodyDirection::Forward; break;
      case 'B':
      case 'A': out.axes[i] = BodyDirection::Aft; break;
      case 'R': out.axes[i] = BodyDirection::Right; break;
      case 'L': out.axes[i] = BodyDirection::Left; break;
      case 'U': out.axes[i] = BodyDirection::Up; break;
      case 'D': out.axes[i] = BodyDirection::Down; break;
      default:
        return Error{std::string("'") + code[i] +
                         "' is not a direction; use F B R L U D (forward, aft, right, left, up, down)",
                     1, static_cast<int>(i) + 1};
    }
    m.col(static_cast<Eigen::Index>(i)) = frd_vector(out.axes[i]);
  }
  const double det = m.determinant();
  if (std::abs(det) < 0.5) return Error{"two letters of '" + std::string(code) + "' name the same line"};
  if (det < 0) {
    return Error{"'" + std::string(code) +
                 "' is a left-handed frame (a mirror image); swap two letters or flip one"};
  }
  return out;
}

std::array<NamedTurn, 3> small_angle_split(const VehicleAxes& names, const Eigen::Vector3d& rotvec_rad) {
  std::array<NamedTurn, 3> out;
  for (int i = 0; i < 3; ++i) {
    NamedTurn& t = out[static_cast<std::size_t>(i)];
    t.axis = i;
    t.turn_name = names.turn_name(i);
    t.angle_rad = rotvec_rad(i);
    t.sense = std::abs(t.angle_rad) > kNoTurnRad ? names.turn_sense(i, t.angle_rad) : "";
  }
  return out;
}

std::string describe_turn(const VehicleAxes& names, const Eigen::Vector3d& axis_vehicle, double angle_rad,
                          int precision) {
  if (std::abs(angle_rad) <= kNoTurnRad || axis_vehicle.norm() == 0.0) return "no turn (0 degrees)";
  Eigen::Vector3d a = axis_vehicle.normalized();
  if (angle_rad < 0) {
    a = -a;
    angle_rad = -angle_rad;
  }
  int i = 0;
  a.cwiseAbs().maxCoeff(&i);
  const double off_axis = std::acos(std::min(1.0, std::abs(a(i))));
  const double sign = a(i) > 0 ? 1.0 : -1.0;
  const std::string amount = fmt(angle_rad * kDeg, precision) + " degrees";
  if (off_axis <= kNamedAxisWindowRad) {
    std::string s = amount + " about the vehicle's " + names.turn_name(i) + " axis (" + names.axis_label(i) +
                    "), " + names.turn_sense(i, sign);
    if (off_axis > 1e-9) s += " (the axis is " + fmt(off_axis * kDeg, 2) + " degrees off the vehicle axis)";
    return s;
  }
  return amount + " about the vehicle axis (" + fmt(a.x(), precision) + ", " + fmt(a.y(), precision) + ", " +
         fmt(a.z(), precision) + ") in (x " + names.direction_word(0) + ", y " + names.direction_word(1) +
         ", z " + names.direction_word(2) + "), mostly " + names.turn_name(i) + ", " +
         names.turn_sense(i, sign);
}

}  // namespace attiscope
