// mount.cpp: axis-aligned mounts in words, other readings of a measured value, the check.
#include "attiscope/core/mount.hpp"

#include <Eigen/Geometry>
#include <algorithm>
#include <cassert>
#include <cctype>
#include <cmath>
#include <cstdio>

#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"
#include "attiscope/core/representations.hpp"

namespace attiscope {

namespace {

constexpr double kDeg = 180.0 / M_PI;

std::string fmt(double v, int precision = 3) {
  if (v == 0.0) v = 0.0;
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", precision, v);
  return buf;
}

Rotation from_columns(const Eigen::Vector3d& x, const Eigen::Vector3d& y, const Eigen::Vector3d& z) {
  Eigen::Matrix3d m;
  m.col(0) = x;
  m.col(1) = y;
  m.col(2) = z;
  return Rotation(Eigen::Quaterniond(quaternion_from_rotation_matrix(m)));
}

std::array<Eigen::Vector3d, 6> signed_axes() {
  return {Eigen::Vector3d(1, 0, 0),  Eigen::Vector3d(-1, 0, 0), Eigen::Vector3d(0, 1, 0),
          Eigen::Vector3d(0, -1, 0), Eigen::Vector3d(0, 0, 1),  Eigen::Vector3d(0, 0, -1)};
}

struct Word {
  std::string text;  // lower case
  int column = 1;
};

std::vector<Word> split_words(std::string_view text) {
  std::vector<Word> out;
  int column = 0;
  Word cur;
  auto flush = [&]() {
    if (!cur.text.empty()) out.push_back(cur);
    cur = Word{};
  };
  for (std::size_t i = 0; i < text.size(); ++i) {
    const auto ch = static_cast<unsigned char>(text[i]);
    if ((ch & 0xC0) != 0x80) ++column;
    if (std::isspace(ch) || ch == ',' || ch == ';' || ch == '=' || ch == ':' || ch == '(' || ch == ')') {
      flush();
      continue;
    }
    if (cur.text.empty()) cur.column = column;
    cur.text += static_cast<char>(std::tolower(ch));
  }
  flush();
  return out;
}

std::optional<BodyDirection> direction_from_word(const std::string& w) {
  struct Entry {
    const char* word;
    BodyDirection direction;
  };
  constexpr Entry kWords[] = {{"forward", BodyDirection::Forward}, {"forwards", BodyDirection::Forward},
                              {"fwd", BodyDirection::Forward},     {"front", BodyDirection::Forward},
                              {"nose", BodyDirection::Forward},    {"ahead", BodyDirection::Forward},
                              {"aft", BodyDirection::Aft},         {"back", BodyDirection::Aft},
                              {"backward", BodyDirection::Aft},    {"backwards", BodyDirection::Aft},
                              {"rear", BodyDirection::Aft},        {"tail", BodyDirection::Aft},
                              {"right", BodyDirection::Right},     {"starboard", BodyDirection::Right},
                              {"left", BodyDirection::Left},       {"port", BodyDirection::Left},
                              {"up", BodyDirection::Up},           {"upward", BodyDirection::Up},
                              {"upwards", BodyDirection::Up},      {"top", BodyDirection::Up},
                              {"down", BodyDirection::Down},       {"downward", BodyDirection::Down},
                              {"downwards", BodyDirection::Down},  {"bottom", BodyDirection::Down}};
  for (const Entry& e : kWords) {
    if (w == e.word) return e.direction;
  }
  return std::nullopt;
}

// "x", "+y", "-z" -> (axis, sign).
std::optional<std::pair<int, double>> axis_token(const std::string& w) {
  std::string s = w;
  double sign = 1.0;
  if (!s.empty() && (s[0] == '+' || s[0] == '-')) {
    sign = s[0] == '-' ? -1.0 : 1.0;
    s = s.substr(1);
  }
  if (s == "x") return std::make_pair(0, sign);
  if (s == "y") return std::make_pair(1, sign);
  if (s == "z") return std::make_pair(2, sign);
  return std::nullopt;
}

bool is_filler(const std::string& w) {
  constexpr const char* kFiller[] = {"sensor",   "sensor's", "toward", "towards", "to",        "points",
                                     "pointing", "point",    "along",  "vehicle", "vehicle's", "is",
                                     "the",      "axis",     "and",    "faces",   "facing",    "->",
                                     "mount",    "mounted",  "with"};
  for (const char* f : kFiller) {
    if (w == f) return true;
  }
  return false;
}

// The numbers of a text and an angle reader honouring each number's own unit.
double angle_of(const NumberToken& t, AngleUnit fallback) {
  return t.unit.value_or(fallback) == AngleUnit::Degrees ? t.value / kDeg : t.value;
}

AngleUnit other_unit(AngleUnit u) {
  return u == AngleUnit::Degrees ? AngleUnit::Radians : AngleUnit::Degrees;
}

std::string unit_word(AngleUnit u) {
  return u == AngleUnit::Degrees ? "degrees" : "radians";
}

}  // namespace

std::vector<AxisAlignedMount> axis_aligned_mounts(const VehicleAxes& names) {
  std::vector<AxisAlignedMount> out;
  for (const Eigen::Vector3d& x : signed_axes()) {
    for (const Eigen::Vector3d& z : signed_axes()) {
      if (std::abs(x.dot(z)) > 0.5) continue;
      AxisAlignedMount m;
      m.sensor_x_in_vehicle = x;
      m.sensor_z_in_vehicle = z;
      m.vehicle_R_sensor = from_columns(x, z.cross(x), z);
      m.name = "sensor x toward vehicle " + names.word_for(x) + ", sensor z " + names.word_for(z);
      out.push_back(m);
    }
  }
  const auto identity = std::find_if(out.begin(), out.end(), [](const AxisAlignedMount& m) {
    return m.sensor_x_in_vehicle.x() > 0.5 && m.sensor_z_in_vehicle.z() > 0.5;
  });
  std::rotate(out.begin(), identity, identity + 1);
  return out;
}

bool looks_like_mount_words(std::string_view text) {
  for (const Word& w : split_words(text)) {
    if (axis_token(w.text) || direction_from_word(w.text) || is_filler(w.text)) return true;
  }
  return false;
}

Expected<Rotation> parse_axis_aligned_mount(std::string_view text, const VehicleAxes& names) {
  const std::vector<Word> words = split_words(text);
  std::array<std::optional<Eigen::Vector3d>, 3> sensor_axes;
  std::array<int, 3> columns{0, 0, 0};
  std::optional<std::pair<int, double>> pending;
  int pending_column = 0;
  auto assign = [&](const Eigen::Vector3d& dir, int column) -> std::optional<Error> {
    const int axis = pending->first;
    if (sensor_axes[static_cast<std::size_t>(axis)]) {
      return Error{std::string("sensor ") + "xyz"[axis] + " is given twice", 1, column};
    }
    const Eigen::Vector3d d = dir * pending->second;
    for (int other = 0; other < 3; ++other) {
      const auto& o = sensor_axes[static_cast<std::size_t>(other)];
      if (o && std::abs(o->dot(d)) > 0.5) {
        return Error{std::string("sensor ") + "xyz"[axis] + " and sensor " + "xyz"[other] +
                         " would lie along the same vehicle line",
                     1, column};
      }
    }
    sensor_axes[static_cast<std::size_t>(axis)] = d;
    columns[static_cast<std::size_t>(axis)] = pending_column;
    pending.reset();
    return std::nullopt;
  };
  for (const Word& w : words) {
    if (is_filler(w.text)) continue;
    if (const auto ax = axis_token(w.text)) {
      if (!pending) {
        pending = ax;
        pending_column = w.column;
        continue;
      }
      Eigen::Vector3d dir = Eigen::Vector3d::Zero();
      dir(ax->first) = ax->second;
      if (auto e = assign(dir, w.column)) return *e;
      continue;
    }
    if (const auto d = direction_from_word(w.text)) {
      if (!pending)
        return Error{"which sensor axis points " + w.text + "? Write e.g. \"x " + w.text + "\"", 1, w.column};
      const auto [axis, sign] = names.axis_of(*d);
      Eigen::Vector3d dir = Eigen::Vector3d::Zero();
      dir(axis) = sign;
      if (auto e = assign(dir, w.column)) return *e;
      continue;
    }
    return Error{"'" + w.text +
                     "' is not part of a mount description; write sensor axes and vehicle directions, e.g. "
                     "\"sensor x toward vehicle aft, sensor z down\"",
                 1, w.column};
  }
  if (pending) {
    return Error{std::string("sensor ") + "xyz"[pending->first] + " has no direction", 1, pending_column};
  }
  int given = 0;
  for (const auto& a : sensor_axes) given += a ? 1 : 0;
  if (given < 2) {
    return Error{
        "name two sensor axes and where each points, e.g. \"sensor x toward vehicle aft, sensor z down\""};
  }
  // The missing axis by the right-hand rule (x = y cross z, y = z cross x, z = x cross y).
  std::array<Eigen::Vector3d, 3> full;
  for (int k = 0; k < 3; ++k) {
    const int i = (k + 1) % 3, j = (k + 2) % 3;
    const auto& a = sensor_axes[static_cast<std::size_t>(i)];
    const auto& b = sensor_axes[static_cast<std::size_t>(j)];
    if (a && b) full[static_cast<std::size_t>(k)] = a->cross(*b);
  }
  if (given == 3) {
    // All three given: they must make a right-handed frame. The last one written is blamed.
    const Eigen::Vector3d& x = *sensor_axes[0];
    if (x.dot(sensor_axes[1]->cross(*sensor_axes[2])) < 0) {
      int last = 0;
      for (int k = 1; k < 3; ++k) {
        if (columns[static_cast<std::size_t>(k)] > columns[static_cast<std::size_t>(last)]) last = k;
      }
      return Error{std::string("these three directions make a left-handed (mirror) sensor frame: sensor ") +
                       "xyz"[last] + " would have to point the other way",
                   1, columns[static_cast<std::size_t>(last)]};
    }
  }
  for (int k = 0; k < 3; ++k) {
    if (sensor_axes[static_cast<std::size_t>(k)])
      full[static_cast<std::size_t>(k)] = *sensor_axes[static_cast<std::size_t>(k)];
  }
  return from_columns(full[0], full[1], full[2]);
}

Rotation trimmed_mount(const Rotation& base, const Eigen::Vector3d& trim_vehicle_rad) {
  auto trim = from_rotation_vector(trim_vehicle_rad);
  assert(trim.ok() && "finite trim angles");
  return trim.value() * base;
}

std::vector<AlternativeReading> inverse_only(const Rotation& vehicle_R_sensor, const std::string& label) {
  return {AlternativeReading{label, vehicle_R_sensor.inverse()}};
}

std::vector<AlternativeReading> alternative_readings(std::string_view text, ReadingKind kind,
                                                     const ExplicitReadingOptions& options, bool inverted) {
  std::vector<AlternativeReading> out;
  auto scanned = scan_numbers(text);
  if (!scanned) return out;
  const std::vector<NumberToken>& t = scanned.value();
  const std::string other_way = inverted ? "sensor-to-vehicle" : "vehicle-to-sensor";
  const std::string direction =
      other_way + " instead of " + (inverted ? "vehicle-to-sensor" : "sensor-to-vehicle");
  // `as_read` is the reading of the numbers before any inversion was applied.
  auto add = [&](const std::string& label, const Rotation& as_read, bool with_inverse = true) {
    out.push_back({label, inverted ? as_read.inverse() : as_read});
    if (with_inverse) out.push_back({label + ", and " + direction, inverted ? as_read : as_read.inverse()});
  };
  auto entered = read_explicit(text, kind, options);
  if (!entered) return out;
  const Rotation x = entered.value().rotation;
  switch (kind) {
    case ReadingKind::QuatWxyz:
    case ReadingKind::QuatXyzw: {
      out.push_back({"the other direction (" + direction +
                         "; a JPL-algebra quaternion read as Hamilton gives the same)",
                     inverted ? x : x.inverse()});
      const ReadingKind other = kind == ReadingKind::QuatWxyz ? ReadingKind::QuatXyzw : ReadingKind::QuatWxyz;
      auto r = read_explicit(text, other, options);
      if (r) {
        add(std::string("the other quaternion layout (") +
                (other == ReadingKind::QuatXyzw ? "x y z w, scalar last" : "w x y z, scalar first") + ")",
            r.value().rotation);
      }
      break;
    }
    case ReadingKind::MatrixRows:
    case ReadingKind::MatrixCols:
      out.push_back({"the transpose (rows read as columns, or the matrix is " + other_way + ")",
                     inverted ? x : x.inverse()});
      break;
    case ReadingKind::Euler: {
      if (t.size() != 3) break;
      out.push_back({"the other direction (" + direction + ")", inverted ? x : x.inverse()});
      const EulerConvention c = options.euler;
      auto angles = [&](AngleUnit u, bool reversed) {
        Eigen::Vector3d a(angle_of(t[0], u), angle_of(t[1], u), angle_of(t[2], u));
        if (reversed) a = Eigen::Vector3d(a(2), a(1), a(0));
        return a;
      };
      EulerConvention kind_swapped = c;
      kind_swapped.kind = c.kind == EulerKind::Intrinsic ? EulerKind::Extrinsic : EulerKind::Intrinsic;
      add("the angles as " + kind_swapped.name() + " instead of " + c.name(),
          from_euler(kind_swapped, angles(options.unit, false)));
      EulerConvention seq_reversed = c;
      std::reverse(seq_reversed.axes.begin(), seq_reversed.axes.end());
      if (seq_reversed != c) {
        add("the sequence reversed (" + seq_reversed.name() + " instead of " + c.name() + ")",
            from_euler(seq_reversed, angles(options.unit, false)));
      }
      add("the angles listed in reverse order (" + c.name() + ")", from_euler(c, angles(options.unit, true)));
      add("the sequence and the angle order both reversed (" + seq_reversed.name() + ")",
          from_euler(seq_reversed, angles(options.unit, true)));
      add("the angles in " + unit_word(other_unit(options.unit)) + ", not " + unit_word(options.unit),
          from_euler(c, angles(other_unit(options.unit), false)));
      break;
    }
    case ReadingKind::AxisAngle: {
      if (t.size() != 4) break;
      out.push_back({"the other direction (" + direction + ")", inverted ? x : x.inverse()});
      auto first =
          from_axis_angle(Eigen::Vector3d(t[1].value, t[2].value, t[3].value), angle_of(t[0], options.unit));
      if (first) add("the angle first (angle x y z)", first.value());
      auto units = from_axis_angle(Eigen::Vector3d(t[0].value, t[1].value, t[2].value),
                                   angle_of(t[3], other_unit(options.unit)));
      if (units) add("the angle in " + unit_word(other_unit(options.unit)), units.value());
      break;
    }
    case ReadingKind::RotVec: {
      if (t.size() != 3) break;
      out.push_back({"the other direction (" + direction + ")", inverted ? x : x.inverse()});
      const AngleUnit u = other_unit(options.rotvec_unit);
      auto r = from_rotation_vector(Eigen::Vector3d(angle_of(t[0], u), angle_of(t[1], u), angle_of(t[2], u)));
      if (r) add("the rotation vector in " + unit_word(u), r.value());
      break;
    }
  }
  return out;
}

Expected<MountReading> read_mount_text(std::string_view text, const PoseTextOptions& options,
                                       const VehicleAxes& names, bool vehicle_to_sensor) {
  MountReading m;
  if (looks_like_mount_words(text)) {
    auto r = parse_axis_aligned_mount(text, names);
    if (!r) return r.error();
    m.words = true;
    m.vehicle_R_sensor = vehicle_to_sensor ? r.value().inverse() : r.value();
    m.description =
        "words \"" + std::string(text) + "\"" + (vehicle_to_sensor ? ", vehicle-to-sensor (inverted)" : "");
    m.alternatives = inverse_only(m.vehicle_R_sensor,
                                  "the other direction (the words describe the vehicle in sensor axes)");
    return m;
  }
  auto pose = read_pose_text(text, options);
  if (!pose) return pose.error();
  m.vehicle_R_sensor = vehicle_to_sensor ? pose.value().rotation.inverse() : pose.value().rotation;
  m.description =
      pose.value().reading + (vehicle_to_sensor ? ", vehicle-to-sensor (inverted)" : ", sensor-to-vehicle");
  m.alternatives = alternative_readings(pose.value().explicit_text, pose.value().kind, pose.value().options,
                                        vehicle_to_sensor);
  m.warnings = pose.value().warnings;
  return m;
}

std::string verdict_name(MountVerdict v) {
  switch (v) {
    case MountVerdict::WithinTolerance: return "within tolerance";
    case MountVerdict::Misaligned: return "misaligned";
    case MountVerdict::ConventionMistake: return "convention or direction mistake";
    case MountVerdict::LikelyAxisMixUp: return "axis mix-up";
  }
  return "?";
}

MountCheck check_mount(const Rotation& nominal, const Rotation& measured, double tolerance_rad,
                       const VehicleAxes& names, const std::vector<AlternativeReading>& alternatives) {
  MountCheck c;
  c.nominal = nominal;
  c.measured = measured;
  c.error_vehicle = measured * nominal.inverse();
  const AxisAngle aa = to_axis_angle(c.error_vehicle);
  c.error_rad = aa.angle_rad;
  c.error_axis_vehicle = aa.axis;
  c.error_words = describe_turn(names, aa.axis, aa.angle_rad);
  c.error_turns = small_angle_split(names, to_rotation_vector(c.error_vehicle));
  c.tolerance_rad = tolerance_rad;
  c.within_tolerance = c.error_rad <= tolerance_rad;

  // The nearest of the 23 non-identity turns that map axes onto axes, either in vehicle
  // axes (error_vehicle) or in sensor axes (nominal^-1 measured).
  const Rotation error_sensor = nominal.inverse() * measured;
  c.nearest_reorientation_rad = M_PI;
  for (const AxisAlignedMount& g : axis_aligned_mounts(names)) {
    const double g_angle = geodesic_angle(Rotation::identity(), g.vehicle_R_sensor);
    if (g_angle < 1e-9) continue;
    const double d = std::min(geodesic_angle(c.error_vehicle, g.vehicle_R_sensor),
                              geodesic_angle(error_sensor, g.vehicle_R_sensor));
    if (d < c.nearest_reorientation_rad) {
      c.nearest_reorientation_rad = d;
      c.reorientation_angle_rad = g_angle;
    }
  }

  const std::string against =
      fmt(c.error_rad * kDeg) + " degrees against a tolerance of " + fmt(tolerance_rad * kDeg) + " degrees";
  if (c.within_tolerance) {
    c.verdict = MountVerdict::WithinTolerance;
    c.verdict_text = "within tolerance: " + against + ".";
    return c;
  }
  for (const AlternativeReading& alt : alternatives) {
    const double e = geodesic_angle(alt.vehicle_R_sensor, nominal);
    if (e <= tolerance_rad || (e <= kExplainLimitRad && e < 0.25 * c.error_rad)) {
      c.explanations.push_back({alt.label, e});
    }
  }
  std::stable_sort(c.explanations.begin(), c.explanations.end(),
                   [](const Explanation& a, const Explanation& b) { return a.error_rad < b.error_rad; });
  if (!c.explanations.empty()) {
    c.verdict = MountVerdict::ConventionMistake;
    c.verdict_text = "beyond tolerance (" + against +
                     "), most likely a convention or direction mistake, not a mounting error: read as " +
                     c.explanations.front().label + ", the measured value is " +
                     fmt(c.explanations.front().error_rad * kDeg) + " degrees from the nominal.";
  } else if (c.nearest_reorientation_rad <= kReorientationWindowRad) {
    c.verdict = MountVerdict::LikelyAxisMixUp;
    c.verdict_text =
        "beyond tolerance (" + against + "); the error is within " + fmt(c.nearest_reorientation_rad * kDeg) +
        " degrees of a " + fmt(c.reorientation_angle_rad * kDeg) +
        "-degree re-orientation of the axes: most likely a convention or direction mistake (a sensor "
        "axis named, signed or ordered wrongly), not a mounting error. No re-reading of the measured "
        "value explains it: check the axis names on the drawing and the sensor's data sheet.";
  } else {
    c.verdict = MountVerdict::Misaligned;
    c.verdict_text = "misaligned: " + against + ".";
  }
  return c;
}

}  // namespace attiscope
