// chain_overlay.hpp: a frame chain drawn in a scene: one small triad per frame (x red, y
// green, z blue) at the place core/chain_layout.hpp gives it, a thin rod from each frame to
// its parent, the frame's name below its origin, and the selected frame highlighted (longer,
// thicker arrows, a ring around its origin, its name in the highlight colour). The marks live
// in SceneState::chain; the renderer draws them with its own meshes (src/chain_overlay.cpp).
#pragma once

#include <Eigen/Core>
#include <vector>

#include "attiscope/core/chain_layout.hpp"
#include "attiscope/core/expected.hpp"
#include "attiscope/core/frame_chain.hpp"
#include "attiscope/render/scene.hpp"

namespace attiscope::render {

/// Length of a chain triad's arrows, and how much longer the selected one is.
inline constexpr double kChainTriadLength = 0.5;
inline constexpr double kChainSelectedScale = 1.3;
/// Radius of the ring drawn around the selected frame's origin.
inline constexpr double kChainSelectedRingRadius = 0.2;

/// World position of the tip of a mark's axis (0 x, 1 y, 2 z) as drawn.
Eigen::Vector3d chain_axis_tip(const ChainFrameMark& mark, int axis);

/// Where a chain goes in the Scene: a row behind the body as the iso view sees it, a little
/// above the body's centre, running across that view's screen (branches stack upward);
/// scene_chain_marks centres the row. Fill in `selected` and `display_frame`.
ChainLayoutOptions scene_chain_options(const WorldFrame& world);

/// The chain's marks for the Scene (scene_chain_options, the row centred), drawn in `display_frame` (empty:
/// the root), `selected` highlighted with its axes lettered x, y, z. Errors as layout_frame_chain.
Expected<std::vector<ChainFrameMark>> scene_chain_marks(const FrameChain& chain, const WorldFrame& world,
                                                        const std::string& selected,
                                                        const std::string& display_frame = "");

/// A camera distance from the scene's target that keeps the body (with its triad) and every
/// chain mark in view, at least `minimum`.
double chain_view_distance(const SceneState& state, double minimum);

/// The scene's camera turned to frame the body and the chain together: the target halfway
/// between the body and the chain's centre, the distance from chain_view_distance.
Camera chain_framing(const SceneState& state, double minimum);

/// Every point the chain's drawing reaches (origins and tips), for framing and bounds.
std::vector<Eigen::Vector3d> chain_points(const SceneState& state);

}  // namespace attiscope::render
