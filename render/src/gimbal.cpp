// gimbal.cpp: ring frames and axes from Euler angles, the margin colour scale, the table.
#include "attiscope/render/gimbal.hpp"

#include <algorithm>
#include <cmath>

namespace attiscope::render {

namespace {

constexpr double kPi = 3.14159265358979323846;
constexpr double kRadToDeg = 180.0 / kPi;

// The axis of {X, Y, Z} that is neither a nor b (a != b).
Axis third_axis(Axis a, Axis b) {
  return static_cast<Axis>(3 - static_cast<int>(a) - static_cast<int>(b));
}

Eigen::Vector3f mix(const Eigen::Vector3f& a, const Eigen::Vector3f& b, double t) {
  const float s = static_cast<float>(std::clamp(t, 0.0, 1.0));
  return a * (1.0f - s) + b * s;
}

}  // namespace

GimbalRings gimbal_rings(const EulerAngles& euler) {
  const EulerConvention& c = euler.convention;
  // Turns from the outside in: intrinsic in application order; extrinsic reversed.
  std::array<int, 3> order{0, 1, 2};
  if (c.kind == EulerKind::Extrinsic) order = {2, 1, 0};
  GimbalRings out;
  Eigen::Matrix3d world_R_ring = Eigen::Matrix3d::Identity();
  std::array<Axis, 3> axes{};
  for (int r = 0; r < 3; ++r) {
    const int s = order[r];
    axes[r] = c.axes[s];
  }
  for (int r = 0; r < 3; ++r) {
    const int s = order[r];
    GimbalRing& ring = out.rings[r];
    ring.axis = axes[r];
    ring.angle_rad = euler.angles_rad[s];
    ring.sequence_index = s;
    // The axis is fixed in the carrying frame (the previous ring), so take it before the turn.
    ring.axis_world = world_R_ring * axis_vector(ring.axis);
    world_R_ring = world_R_ring * elementary_matrix(ring.axis, ring.angle_rad);
    ring.world_R_ring = world_R_ring;
    // The circle contains this ring's axis and the pivots of the ring it carries (the next
    // axis); the inner ring carries the body and its circle is normal to the middle axis.
    Axis normal_axis;
    if (r < 2) {
      normal_axis = third_axis(axes[r], axes[r + 1]);
    } else {
      normal_axis = axes[1];
    }
    ring.plane_normal_world = world_R_ring * axis_vector(normal_axis);
  }
  out.lock_margin_rad = euler.lock_margin_rad;
  out.at_lock = euler.at_lock;
  return out;
}

double outer_inner_axis_angle(const GimbalRings& rings) {
  const Eigen::Vector3d& a = rings.rings[0].axis_world;
  const Eigen::Vector3d& b = rings.rings[2].axis_world;
  // atan2 of sine and |cosine|: accurate near 0 and folded so opposite axes count as one line.
  return std::atan2(a.cross(b).norm(), std::abs(a.dot(b)));
}

Eigen::Vector3f margin_color(double margin_deg) {
  // Safe: a calm teal; then through yellow to amber at the band's edge; in the band, red
  // deepening toward lock. The step from amber to red marks the band's edge.
  const Eigen::Vector3f safe(0.13f, 0.60f, 0.66f);
  const Eigen::Vector3f yellow(0.90f, 0.78f, 0.18f);
  const Eigen::Vector3f amber(0.96f, 0.55f, 0.10f);
  const Eigen::Vector3f warning(0.90f, 0.20f, 0.15f);
  const Eigen::Vector3f locked(0.66f, 0.04f, 0.12f);
  if (!(margin_deg == margin_deg)) return locked;  // NaN
  const double mid = 0.5 * (kMarginWarningDeg + kMarginCautionDeg);
  if (margin_deg >= kMarginCautionDeg) return safe;
  if (margin_deg >= mid) return mix(yellow, safe, (margin_deg - mid) / (kMarginCautionDeg - mid));
  if (margin_deg > kMarginWarningDeg)
    return mix(amber, yellow, (margin_deg - kMarginWarningDeg) / (mid - kMarginWarningDeg));
  return mix(locked, warning, margin_deg / kMarginWarningDeg);
}

std::array<MarginRow, 24> margin_table(const Rotation& world_R_body) {
  std::array<MarginRow, 24> rows;
  const auto& conventions = all_euler_conventions();
  for (std::size_t i = 0; i < conventions.size(); ++i) {
    const EulerAngles e = to_euler(world_R_body, conventions[i]);
    MarginRow& row = rows[i];
    row.convention = conventions[i];
    row.margin_deg = e.lock_margin_rad * kRadToDeg;
    row.at_lock = e.at_lock;
    row.rate_condition_number = condition_number(euler_rate_matrix(conventions[i], e.angles_rad));
    row.in_warning_band = row.margin_deg <= kMarginWarningDeg;
  }
  return rows;
}

}  // namespace attiscope::render
