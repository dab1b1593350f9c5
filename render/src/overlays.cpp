// overlays.cpp: the step-through teaching overlays. The turn's arc lies in the plane
// normal to the turn's axis, at kTurnArcRadius from the body's origin, starting at the
// start frame's body axis that is most nearly perpendicular to the turn axis.
#include "overlays.hpp"

#include <algorithm>
#include <cmath>

#include <Eigen/Geometry>

namespace attiscope::render::detail {

namespace {

/// Arc segments per radian: smooth at the window's sizes, cheap on a software rasteriser.
constexpr double kArcSegmentsPerRad = 12.0;
constexpr double kArcRodRadius = 0.022;
constexpr double kAxisRodRadius = 0.03;
constexpr double kFadedTriadThickness = 0.55;
/// Turns smaller than this draw no arc (nothing to show).
constexpr double kMinArcRad = 1e-6;

}  // namespace

std::vector<Eigen::Vector3d> turn_arc_points(const TurnHighlight& turn) {
  std::vector<Eigen::Vector3d> pts;
  const Eigen::Vector3d axis = turn.axis_world.normalized();
  const Eigen::Matrix3d start = turn.start_world_R_body.matrix();
  int best = 0;
  for (int k = 1; k < 3; ++k) {
    if (std::abs(start.col(k).dot(axis)) < std::abs(start.col(best).dot(axis))) best = k;
  }
  Eigen::Vector3d r0 = start.col(best) - start.col(best).dot(axis) * axis;
  if (r0.norm() < 1e-9) return pts;
  r0 = r0.normalized() * turn.radius;
  const double shown = turn.shown_rad;
  const int n = std::max(2, static_cast<int>(std::ceil(std::abs(shown) * kArcSegmentsPerRad)) + 1);
  for (int i = 0; i < n; ++i) {
    const double t = shown * static_cast<double>(i) / static_cast<double>(n - 1);
    pts.push_back(Eigen::AngleAxisd(t, axis) * r0);
  }
  return pts;
}

void draw_overlays(const SceneState& st, const OverlayPainter& paint, const Eigen::Vector3f& background,
                   const Eigen::Vector3f axis_colors[3], const Eigen::Vector3f& highlight) {
  for (const FadedTriad& f : st.faded_triads) {
    const float a = std::clamp(f.alpha, 0.0f, 1.0f);
    const Eigen::Matrix3d r = f.world_R_frame.matrix();
    for (int k = 0; k < 3; ++k) {
      const Eigen::Vector3f c = axis_colors[k] * a + background * (1.0f - a);
      paint.arrow(Eigen::Vector3d::Zero(), r.col(k), kBodyTriadLength * 0.92, kFadedTriadThickness, c);
    }
  }
  for (const TurnHighlight& t : st.turns) {
    const Eigen::Vector3d axis = t.axis_world.normalized();
    if (t.show_axis) {
      paint.rod(-axis * kTurnAxisHalfLength, axis * kTurnAxisHalfLength, kAxisRodRadius, highlight * 0.85f);
      paint.arrow(axis * (kTurnAxisHalfLength - 0.05), axis, 0.3, 1.5, highlight * 0.85f);
    }
    if (std::abs(t.shown_rad) < kMinArcRad) continue;
    const std::vector<Eigen::Vector3d> pts = turn_arc_points(t);
    for (std::size_t i = 0; i + 1 < pts.size(); ++i) paint.rod(pts[i], pts[i + 1], kArcRodRadius, highlight);
    if (pts.size() >= 2) {
      // The arrowhead points the way the turn goes: +angle is counter-clockwise seen from
      // the axis tip (right-hand rule).
      const Eigen::Vector3d tangent = (t.shown_rad > 0 ? 1.0 : -1.0) * axis.cross(pts.back()).normalized();
      paint.arrow(pts.back() - tangent * 0.12, tangent, 0.26, 1.3, highlight);
    }
  }
}

void overlay_labels(const SceneState& st,
                    const std::function<void(const Eigen::Vector3d& base, const Eigen::Vector3d& tip,
                                             const std::string& text)>& place) {
  for (const TurnHighlight& t : st.turns) {
    if (t.label.empty()) continue;
    const std::vector<Eigen::Vector3d> pts = turn_arc_points(t);
    if (pts.empty()) {
      place(Eigen::Vector3d::Zero(), t.axis_world.normalized() * kTurnAxisHalfLength, t.label);
    } else {
      place(Eigen::Vector3d::Zero(), pts.back() * 1.12, t.label);
    }
  }
}

}  // namespace attiscope::render::detail
