// chain_overlay.hpp (internal): the frame-chain marks of a SceneState turned into the
// renderer's drawing calls (see attiscope/render/chain_overlay.hpp for what is drawn).
#pragma once

#include <Eigen/Core>
#include <functional>
#include <string>

#include "attiscope/render/chain_overlay.hpp"
#include "overlays.hpp"

namespace attiscope::render::detail {

/// Draws every chain mark: link rods, triads, the selected frame's ring.
void draw_chain(const SceneState& st, const OverlayPainter& paint, const Eigen::Vector3f axis_colors[3],
                const Eigen::Vector3f& highlight);

/// The chain's text: frame names below their origins (`selected` true for the highlighted
/// one) and the marks' axis labels at their tips (`axis` 0..2, else -1).
void chain_labels(const SceneState& st,
                  const std::function<void(const Eigen::Vector3d& base, const Eigen::Vector3d& tip,
                                           const std::string& text, bool selected, int axis)>& place);

}  // namespace attiscope::render::detail
