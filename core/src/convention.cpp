// convention.cpp: the house convention model: frames, printed numbers, derived sentences
// and frame changes.
#include "attiscope/core/convention.hpp"

#include <cctype>
#include <cmath>
#include <cstdio>
#include <sstream>

#include "attiscope/core/representations.hpp"

namespace attiscope {

namespace {

constexpr double kPi = 3.14159265358979323846;
constexpr double kDegPerRad = 180.0 / kPi;
/// Two unit axes count as parallel when their cross product is below this.
constexpr double kParallelTolerance = 1e-9;

struct DirectionWord {
  const char* word;
  double x, y, z;
};

// World reference ENU: x east, y north, z up (common practice; ROS REP 103 [F7]).
constexpr DirectionWord kWorldWords[] = {
    {"east", 1, 0, 0},   {"west", -1, 0, 0}, {"north", 0, 1, 0},
    {"south", 0, -1, 0}, {"up", 0, 0, 1},    {"down", 0, 0, -1},
};
// Body reference FLU: x forward, y left, z up (common practice; ISO 8855 [F3]). The body's
// words and vectors come from vehicle_axes.hpp's one table of body directions.

std::string lower(std::string_view s) {
  std::string out(s);
  for (char& ch : out) ch = static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
  return out;
}

std::string word_list(FrameRole role) {
  std::string out;
  if (role == FrameRole::Body) {
    for (BodyDirection d : body_directions()) out += (out.empty() ? "" : ", ") + convention_word(d);
    return out;
  }
  for (const DirectionWord& w : kWorldWords) {
    if (!out.empty()) out += ", ";
    out += w.word;
  }
  return out;
}

std::string fmt(double v, int precision) {
  if (v == 0.0) v = 0.0;
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", precision, v);
  return buf;
}

}  // namespace

FrameAxes world_enu() {
  return {{"east", "north", "up"}, {"E", "N", "U"}};
}
FrameAxes world_ned() {
  return {{"north", "east", "down"}, {"N", "E", "D"}};
}
FrameAxes body_frame_axes(const VehicleAxes& v) {
  FrameAxes f;
  for (std::size_t i = 0; i < 3; ++i) f.directions[i] = convention_word(v.axes[i]);
  return f;
}

Expected<VehicleAxes> body_vehicle_axes(const FrameAxes& body) {
  VehicleAxes v;
  for (std::size_t i = 0; i < 3; ++i) {
    const auto d = parse_convention_word(body.directions[i]);
    if (!d) {
      return Error{"body axis " + std::string(1, static_cast<char>('x' + i)) + " ('" + body.directions[i] +
                   "') is not one of " + word_list(FrameRole::Body)};
    }
    v.axes[i] = *d;
  }
  return parse_vehicle_axes(v.code());  // refuses two axes on one line and a left-handed frame
}

VehicleAxes default_vehicle_axes(const HouseConvention* house) {
  if (house) {
    if (auto v = body_vehicle_axes(house->body)) return v.value();
  }
  return VehicleAxes{};
}

FrameAxes body_flu() {
  return body_frame_axes(VehicleAxes{{BodyDirection::Forward, BodyDirection::Left, BodyDirection::Up}});
}
FrameAxes body_frd() {
  return body_frame_axes(VehicleAxes{{BodyDirection::Forward, BodyDirection::Right, BodyDirection::Down}});
}
FrameAxes body_camera_rdf() {
  return body_frame_axes(VehicleAxes{{BodyDirection::Right, BodyDirection::Down, BodyDirection::Forward}});
}

std::string frame_preset_name(const FrameAxes& f, FrameRole role) {
  if (role == FrameRole::World) {
    if (f.directions == world_enu().directions) return "ENU";
    if (f.directions == world_ned().directions) return "NED";
  } else {
    if (f.directions == body_flu().directions) return "FLU";
    if (f.directions == body_frd().directions) return "FRD";
    if (f.directions == body_camera_rdf().directions) return "RDF";
  }
  return "custom";
}

Expected<FrameAxes> frame_preset(std::string_view name, FrameRole role) {
  const std::string n = lower(name);
  if (role == FrameRole::World) {
    if (n == "enu") return world_enu();
    if (n == "ned") return world_ned();
    return Error{"unknown world frame '" + std::string(name) + "': use ENU, NED or custom"};
  }
  if (n == "flu") return body_flu();
  if (n == "frd") return body_frd();
  if (n == "rdf" || n == "camera") return body_camera_rdf();
  return Error{"unknown body frame '" + std::string(name) + "': use FLU, FRD, RDF (camera) or custom"};
}

Expected<Eigen::Vector3d> direction_vector(std::string_view word, FrameRole role) {
  const std::string w = lower(word);
  if (role == FrameRole::Body) {
    if (const auto d = parse_convention_word(w)) return flu_vector(*d);
  } else {
    for (const DirectionWord& d : kWorldWords) {
      if (w == d.word) return Eigen::Vector3d(d.x, d.y, d.z);
    }
  }
  return Error{"'" + std::string(word) + "' is not a " + (role == FrameRole::World ? "world" : "body") +
               " direction: use one of " + word_list(role)};
}

std::string direction_word(const Eigen::Vector3d& unit_axis, FrameRole role) {
  if (role == FrameRole::Body) {
    const auto d = direction_of_flu(unit_axis);
    return d ? convention_word(*d) : "";
  }
  for (const DirectionWord& d : kWorldWords) {
    if ((unit_axis - Eigen::Vector3d(d.x, d.y, d.z)).norm() < 1e-6) return d.word;
  }
  return "";
}

Expected<Eigen::Matrix3d> reference_R_frame(const FrameAxes& f, FrameRole role) {
  Eigen::Matrix3d m;
  for (int k = 0; k < 3; ++k) {
    auto v = direction_vector(f.directions[static_cast<std::size_t>(k)], role);
    if (!v) return v.error();
    m.col(k) = v.value();
  }
  const char* letters = "xyz";
  for (int a = 0; a < 3; ++a) {
    for (int b = a + 1; b < 3; ++b) {
      if (m.col(a).cross(m.col(b)).norm() < kParallelTolerance) {
        return Error{std::string("axes ") + letters[a] + " (" + f.directions[static_cast<std::size_t>(a)] +
                     ") and " + letters[b] + " (" + f.directions[static_cast<std::size_t>(b)] +
                     ") lie on one line: three axes must point along three different lines"};
      }
    }
  }
  if (m.determinant() < 0.0) {
    const Eigen::Vector3d xy = m.col(0).cross(m.col(1));
    return Error{"x = " + f.directions[0] + ", y = " + f.directions[1] + ", z = " + f.directions[2] +
                 " is a left-handed frame: " + f.directions[0] + " x " + f.directions[1] + " points " +
                 direction_word(xy, role) + ", not " + f.directions[2] +
                 ". Turning the reference frame onto it would need a reflection (determinant -1), "
                 "which no rotation can do; flip one axis to make it right-handed"};
  }
  return m;
}

double wrap_to_range(double angle_rad, AngleRange range) {
  if (range == AngleRange::ZeroTo360) {
    double a = std::fmod(angle_rad, 2.0 * kPi);
    if (a < 0.0) a += 2.0 * kPi;
    if (a >= 2.0 * kPi) a = 0.0;
    return a;
  }
  return wrap_pi(angle_rad);
}

std::string angle_unit_name(AngleUnit u) {
  return u == AngleUnit::Degrees ? "degrees" : "radians";
}

std::string range_text(AngleRange r, int index, const EulerConvention& c) {
  if (r == AngleRange::ZeroTo360) return "[0, 360)";
  if (index == 1) return c.proper() ? "[0, 180]" : "[-90, 90]";
  return "(-180, 180]";
}

Expected<HouseConvention> validate_convention(const HouseConvention& c) {
  if (auto w = reference_R_frame(c.world, FrameRole::World); !w) {
    return Error{w.error().message, 0, 0, "world.axes"};
  }
  if (auto b = reference_R_frame(c.body, FrameRole::Body); !b) {
    return Error{b.error().message, 0, 0, "body.axes"};
  }
  for (std::size_t i = 0; i < 3; ++i) {
    if (c.euler.names[i].empty()) return Error{"an angle name is empty", 0, 0, "euler.names"};
    for (std::size_t k = i + 1; k < 3; ++k) {
      if (c.euler.names[i] == c.euler.names[k]) {
        return Error{"the angle name '" + c.euler.names[i] + "' is used twice", 0, 0, "euler.names"};
      }
    }
  }
  std::array<bool, 3> seen{false, false, false};
  for (int p : c.euler.print_order) {
    if (p < 0 || p > 2 || seen[static_cast<std::size_t>(p)]) {
      return Error{"the print order must list each angle exactly once", 0, 0, "euler.print_order"};
    }
    seen[static_cast<std::size_t>(p)] = true;
  }
  if (c.euler.ranges[1] != AngleRange::Standard) {
    return Error{"the middle angle keeps its own range (" +
                     range_text(AngleRange::Standard, 1, c.euler.convention) +
                     "): a [0, 360) range would make two angle sets for one pose",
                 0, 0, "euler.ranges"};
  }
  if (c.precision < 1 || c.precision > 17) {
    return Error{"precision must be a whole number from 1 to 17", 0, 0, "precision"};
  }
  return c;
}

HouseEulerView house_euler(const Rotation& world_R_body, const HouseConvention& c) {
  HouseEulerView v;
  v.angles = to_euler(world_R_body, c.euler.convention);
  const double scale = c.euler.unit == AngleUnit::Degrees ? kDegPerRad : 1.0;
  for (std::size_t k = 0; k < 3; ++k) {
    const auto i = static_cast<std::size_t>(c.euler.print_order[k]);
    const double a =
        i == 1 ? v.angles.angles_rad[1]
               : wrap_to_range(v.angles.angles_rad[static_cast<Eigen::Index>(i)], c.euler.ranges[i]);
    v.values[k] = a * scale;
    v.names[k] = c.euler.names[i];
  }
  return v;
}

Expected<Rotation> from_house_euler(const std::array<double, 3>& printed, const HouseConvention& c) {
  Eigen::Vector3d applied;
  const double scale = c.euler.unit == AngleUnit::Degrees ? 1.0 / kDegPerRad : 1.0;
  for (std::size_t k = 0; k < 3; ++k) {
    if (!std::isfinite(printed[k])) {
      return Error{c.euler.names[static_cast<std::size_t>(c.euler.print_order[k])] +
                   " is not a finite number"};
    }
    applied[c.euler.print_order[k]] = printed[k] * scale;
  }
  return from_euler(c.euler.convention, applied);
}

std::array<double, 4> house_quaternion(const Rotation& world_R_body, const HouseConvention& c) {
  return to_quaternion_numbers(world_R_body, c.quaternion);
}

std::array<std::string, 4> house_quaternion_labels(const HouseConvention& c) {
  if (c.quaternion.layout == QuatLayout::ScalarFirst) return {"w", "x", "y", "z"};
  return {"x", "y", "z", "w"};
}

std::array<double, 9> house_matrix(const Rotation& world_R_body, const HouseConvention& c) {
  return to_matrix_numbers(world_R_body, c.matrix);
}

std::array<std::string, 3> positive_direction_sentences(const HouseConvention& c) {
  std::array<std::string, 3> out;
  auto body = reference_R_frame(c.body, FrameRole::Body);
  auto world = reference_R_frame(c.world, FrameRole::World);
  if (!body || !world) return out;  // validate_convention reports the reason
  const Eigen::Vector3d forward(1, 0, 0), right(0, -1, 0);
  for (std::size_t n = 0; n < 3; ++n) {
    const int axis = static_cast<int>(c.euler.convention.axes[n]);
    // At the start pose (identity) the world's axis k and the body's axis k coincide, so
    // a turn about either is a turn about the body direction of axis k.
    const Eigen::Vector3d turn_axis = body.value().col(axis);
    const bool about_front = turn_axis.cross(forward).norm() < kParallelTolerance;
    const Eigen::Vector3d feature = about_front ? right : forward;
    const std::string feature_name = about_front ? c.right_name : c.front_name;
    const std::string moves = direction_word(turn_axis.cross(feature), FrameRole::Body);
    std::string phrase;
    if (moves == "up") phrase = "raises the " + feature_name;
    if (moves == "down") phrase = "lowers the " + feature_name;
    if (moves == "left" || moves == "right") phrase = "turns the " + feature_name + " " + moves;
    if (moves == "forward" || moves == "back") phrase = "swings the " + feature_name + " " + moves;
    const bool intrinsic = c.euler.convention.kind == EulerKind::Intrinsic;
    const std::string axis_text = intrinsic
                                      ? "the body's " + c.body.directions[static_cast<std::size_t>(axis)] +
                                            " axis (" + c.body.names[static_cast<std::size_t>(axis)] + ")"
                                      : "the world's " + c.world.directions[static_cast<std::size_t>(axis)] +
                                            " axis (" + c.world.names[static_cast<std::size_t>(axis)] + ")";
    out[n] = "positive " + c.euler.names[n] + " " + phrase + ": a right-hand turn about " + axis_text;
  }
  return out;
}

Rotation FrameChange::apply(const Rotation& from_world_R_body) const {
  return world_to_R_world_from * from_world_R_body * body_from_R_body_to;
}

std::string FrameChange::describe() const {
  auto turn = [](const Rotation& r) {
    const AxisAngle aa = to_axis_angle(r);
    if (aa.angle_rad < 1e-12) return std::string("the identity");
    return fmt(aa.angle_rad * kDegPerRad, 6) + " degree turn about (" + fmt(aa.axis.x(), 6) + ", " +
           fmt(aa.axis.y(), 6) + ", " + fmt(aa.axis.z(), 6) + ")";
  };
  auto matrix = [](const Rotation& r) {
    const Eigen::Matrix3d m = r.matrix();
    std::string s = "[";
    for (int i = 0; i < 3; ++i) {
      s += i ? ", [" : "[";
      for (int k = 0; k < 3; ++k) s += (k ? ", " : "") + fmt(std::abs(m(i, k)) < 1e-15 ? 0.0 : m(i, k), 6);
      s += "]";
    }
    return s + "]";
  };
  std::ostringstream s;
  s << "pose in " << to_name << " = C_world * (pose in " << from_name << ") * C_body\n";
  s << "C_world = " << matrix(world_to_R_world_from) << ", a " << turn(world_to_R_world_from)
    << ", on the left: it re-expresses world coordinates\n";
  s << "C_body  = " << matrix(body_from_R_body_to) << ", a " << turn(body_from_R_body_to)
    << ", on the right: it re-expresses body coordinates\n";
  return s.str();
}

Expected<FrameChange> frame_change(const FrameAxes& from_world, const FrameAxes& from_body,
                                   const FrameAxes& to_world, const FrameAxes& to_body) {
  auto fw = reference_R_frame(from_world, FrameRole::World);
  if (!fw) return fw.error();
  auto fb = reference_R_frame(from_body, FrameRole::Body);
  if (!fb) return fb.error();
  auto tw = reference_R_frame(to_world, FrameRole::World);
  if (!tw) return tw.error();
  auto tb = reference_R_frame(to_body, FrameRole::Body);
  if (!tb) return tb.error();
  FrameChange fc;
  fc.from_name =
      frame_preset_name(from_world, FrameRole::World) + "/" + frame_preset_name(from_body, FrameRole::Body);
  fc.to_name =
      frame_preset_name(to_world, FrameRole::World) + "/" + frame_preset_name(to_body, FrameRole::Body);
  // to_R_from = (ref_R_to)^T ref_R_from; both are exact signed permutations.
  const Eigen::Matrix3d world_to_from = tw.value().transpose() * fw.value();
  const Eigen::Matrix3d body_from_to = fb.value().transpose() * tb.value();
  fc.world_to_R_world_from = Rotation(quaternion_from_rotation_matrix(world_to_from));
  fc.body_from_R_body_to = Rotation(quaternion_from_rotation_matrix(body_from_to));
  return fc;
}

}  // namespace attiscope
