// pose_text.cpp: text -> pose for every command and the window.
#include "attiscope/core/pose_text.hpp"

#include <cmath>
#include <cstdio>

#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"

namespace attiscope {

namespace {

/// Geodesic angle (radians) within which an explicit re-reading counts as the same pose.
constexpr double kReproduceTolerance = 1e-9;

// Enough digits to read the same double back (17 significant digits).
std::string exact_numbers(const double* values, std::size_t count) {
  std::string out;
  char buf[40];
  for (std::size_t i = 0; i < count; ++i) {
    std::snprintf(buf, sizeof buf, "%.17g", values[i]);
    out += (i ? " " : "") + std::string(buf);
  }
  return out;
}

std::string canonical_quat_text(const Rotation& r) {
  const Eigen::Quaterniond q = r.quaternion();
  const double v[4] = {q.w(), q.x(), q.y(), q.z()};
  return exact_numbers(v, 4);
}

// The explicit reading that reproduces a rotation: its canonical w x y z.
void set_canonical(PoseText* out) {
  out->kind = ReadingKind::QuatWxyz;
  out->explicit_text = canonical_quat_text(out->rotation);
}

// Bare numbers in the house's printed form (3 Euler angles, 4 quaternion, 9 matrix).
Expected<PoseText> read_in_house(const std::vector<NumberToken>& t, const HouseConvention& c,
                                 const PoseTextOptions& o) {
  PoseText out;
  out.house = true;
  out.options = o.reading;
  for (const NumberToken& n : t) {
    if (!std::isfinite(n.value)) return Error{"this number is not finite", n.line, n.column};
  }
  if (t.size() == 3) {
    HouseConvention h = c;
    if (o.euler_given) {
      h.euler.convention = o.reading.euler;
      h.euler.print_order = {0, 1, 2};
    }
    if (o.unit_given) h.euler.unit = o.reading.unit;
    const auto& p = h.euler.print_order;
    out.reading = "euler " + h.euler.convention.name() + " (house " + c.name + ", printed as " +
                  h.euler.names[static_cast<std::size_t>(p[0])] + ", " +
                  h.euler.names[static_cast<std::size_t>(p[1])] + ", " +
                  h.euler.names[static_cast<std::size_t>(p[2])] + ")";
    auto r = from_house_euler({t[0].value, t[1].value, t[2].value}, h);
    if (!r) return r.error();
    out.rotation = r.value();
    // The same angles in application order, for the mount check's other readings.
    double applied[3] = {};
    for (std::size_t k = 0; k < 3; ++k) applied[static_cast<std::size_t>(p[k])] = t[k].value;
    out.kind = ReadingKind::Euler;
    out.options.euler = h.euler.convention;
    out.options.unit = h.euler.unit;
    out.explicit_text = exact_numbers(applied, 3);
    return out;
  }
  if (t.size() == 4) {
    out.reading = "quaternion (house " + c.name + ": " + c.quaternion.describe() + ")";
    QuatCheck check;
    auto r = from_quaternion_numbers({t[0].value, t[1].value, t[2].value, t[3].value}, c.quaternion, &check);
    if (!r) return r.error();
    if (std::abs(check.norm - 1.0) > kUnitNormTolerance) {
      out.warnings.push_back("the quaternion's norm is " + std::to_string(check.norm) +
                             ", not 1: it was normalised");
    }
    out.rotation = r.value();
    set_canonical(&out);
    return out;
  }
  if (t.size() == 9) {
    out.reading = "matrix (house " + c.name + ": " + c.matrix.describe() + ")";
    std::array<double, 9> m{};
    for (std::size_t i = 0; i < 9; ++i) m[i] = t[i].value;
    MatrixCheck check;
    auto r = from_matrix(matrix_from_numbers(m, c.matrix.storage), c.matrix.direction, &check);
    if (!r) return r.error();
    if (check.orthonormality_defect > kMatrixDefectSilent) {
      out.warnings.push_back("the matrix is not exactly orthonormal (defect " +
                             std::to_string(check.orthonormality_defect) +
                             "): the nearest rotation was used");
    }
    out.rotation = r.value();
    set_canonical(&out);
    return out;
  }
  return Error{"not a house form"};
}

Expected<PoseText> read_explicitly(std::string_view text, ReadingKind kind, const PoseTextOptions& o) {
  PoseText out;
  out.kind = kind;
  out.options = o.reading;
  out.explicit_text = std::string(text);
  auto r = read_explicit(text, kind, out.options);
  if (!r) return r.error();
  out.rotation = r.value().rotation;
  out.reading = reading_kind_name(kind);
  if (kind == ReadingKind::Euler) out.reading += " " + out.options.euler.name();
  out.warnings = r.value().warnings;
  return out;
}

std::string reading_name(const Reading& r) {
  return intake_kind_name(r.kind) + (r.layout.empty() ? "" : " " + r.layout);
}

}  // namespace

IntakePreferences pose_intake_preferences(const PoseTextOptions& o) {
  IntakePreferences p;
  p.euler = o.reading.euler;
  if (o.house) {
    const HouseConvention& h = *o.house;
    if (!o.euler_given) p.euler = h.euler.convention;
    p.unit = h.euler.unit;
    p.quat_layout = h.quaternion.layout;
    p.matrix_storage = h.matrix.storage;
    // The reference up (+z of ENU) written in the house's world axes (-z for NED).
    auto reference_R_world = reference_R_frame(h.world, FrameRole::World);
    if (reference_R_world) p.world_up = reference_R_world.value().transpose() * Eigen::Vector3d::UnitZ();
  }
  if (o.unit_given) p.unit = o.reading.unit;
  return p;
}

Expected<PoseText> read_pose_text(std::string_view text, const PoseTextOptions& o) {
  if (o.as) return read_explicitly(text, *o.as, o);
  if (o.house) {
    auto numbers = scan_numbers(text);
    if (numbers) {
      const std::size_t n = numbers.value().size();
      if (n == 3 || n == 4 || n == 9) return read_in_house(numbers.value(), *o.house, o);
    }
  }
  auto result = read_pasted(text, pose_intake_preferences(o));
  if (!result) return result.error();
  const IntakeResult& r = result.value();
  const Reading& top = r.readings.front();
  PoseText out;
  out.rotation = top.rotation;
  out.reading = reading_name(top);
  out.ambiguous = r.ambiguous;
  if (r.track) {
    out.warnings.push_back("the text is a track of " + std::to_string(r.track_rows) +
                           " rows: this is its first pose (see attiscope track)");
  }
  if (r.ambiguous) {
    std::string others;
    for (std::size_t i = 1; i < r.readings.size() && i < 4; ++i) {
      others += (others.empty() ? "" : ", ") + reading_name(r.readings[i]);
    }
    out.warnings.push_back("ambiguous: the text was read as " + out.reading + " (" + top.why +
                           "), but it could also be " + others +
                           "; say which with --as (see attiscope read)");
  }
  for (const std::string& w : top.warnings) out.warnings.push_back(w);
  if (top.translation) {
    out.warnings.push_back("the translation (" + std::to_string(top.translation->x()) + ", " +
                           std::to_string(top.translation->y()) + ", " +
                           std::to_string(top.translation->z()) +
                           ") is not part of the rotation and is not shown below");
  }
  // What reproduces it explicitly: the numbers as written when they are bare and the reading
  // has an --as form, else the rotation's canonical w x y z.
  out.options = o.reading;
  out.options.euler = top.euler;
  out.options.unit = top.unit;
  if (top.kind == IntakeKind::RotationVector) out.options.rotvec_unit = top.unit;
  auto bare = scan_numbers(text);
  if (top.as && bare && !r.track) {
    auto again = read_explicit(text, *top.as, out.options);
    if (again && geodesic_angle(again.value().rotation, top.rotation) < kReproduceTolerance) {
      out.kind = *top.as;
      out.explicit_text = std::string(text);
      return out;
    }
  }
  set_canonical(&out);
  return out;
}

}  // namespace attiscope
