// overlays.hpp (internal): the teaching overlays of a SceneState (faded triads, the
// highlighted turn axis and its arc), turned into simple drawing calls the scene renderer
// carries out with its own meshes.
#pragma once

#include <Eigen/Core>
#include <functional>
#include <string>

#include "attiscope/render/scene.hpp"

namespace attiscope::render::detail {

struct OverlayPainter {
  /// An arrow from `from` along unit `dir`, `length` long, `thickness` times the triad's.
  std::function<void(const Eigen::Vector3d& from, const Eigen::Vector3d& dir, double length, double thickness,
                     const Eigen::Vector3f& color)>
      arrow;
  /// A thin rod from `a` to `b`, `radius` thick.
  std::function<void(const Eigen::Vector3d& a, const Eigen::Vector3d& b, double radius,
                     const Eigen::Vector3f& color)>
      rod;
};

/// Draws the overlays; `background` and `axis_colors` fade the triads, `highlight` is the
/// turn's colour.
void draw_overlays(const SceneState& st, const OverlayPainter& paint, const Eigen::Vector3f& background,
                   const Eigen::Vector3f axis_colors[3], const Eigen::Vector3f& highlight);

/// The overlay's text: the turn's label at the arc's end. `place(base, tip, text)` writes it.
void overlay_labels(const SceneState& st,
                    const std::function<void(const Eigen::Vector3d& base, const Eigen::Vector3d& tip,
                                             const std::string& text)>& place);

/// Points of the turn's arc (world), from the start direction through shown_rad.
std::vector<Eigen::Vector3d> turn_arc_points(const TurnHighlight& turn);

}  // namespace attiscope::render::detail
