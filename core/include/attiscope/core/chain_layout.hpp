// chain_layout.hpp: where each frame of a frame chain (frame_chain.hpp) is drawn in a scene,
// so every frame shows as its own small labelled triad and no two sit on top of each other.
//
// The scene's own axes are one frame of the chain, the display frame (by default the root of
// the tree that holds the selected frame): each mark carries display_R_frame, the frame's
// axes in display coordinates (maps frame coordinates into display ones). Where a triad is
// drawn is a layout, not the lever arm: lever arms are often centimetres, or zero, and would
// stack the triads. The tree is laid out from its root at `anchor`: each generation one
// `spacing` further along `along`, and each extra branch one `spacing` further along
// `across` (a straight chain is a straight row). The true lever-arm position is kept beside
// the drawn one, for a caption or a tooltip.
#pragma once

#include <Eigen/Core>
#include <array>
#include <optional>
#include <string>
#include <vector>

#include "attiscope/core/expected.hpp"
#include "attiscope/core/frame_chain.hpp"
#include "attiscope/core/rotation.hpp"

namespace attiscope {

/// Default distance between neighbouring triads, in scene units (a body is about 2 across).
inline constexpr double kChainSpacing = 0.85;

struct ChainLayoutOptions {
  /// The frame whose axes are the scene's axes; empty: the root of the selected frame's tree
  /// (or of the first frame's tree when nothing is selected).
  std::string display_frame;
  /// The frame drawn highlighted; empty: none.
  std::string selected;
  Eigen::Vector3d anchor = Eigen::Vector3d::Zero();   ///< where the tree's root is drawn
  Eigen::Vector3d along = Eigen::Vector3d::UnitY();   ///< one generation further down the chain
  Eigen::Vector3d across = Eigen::Vector3d::UnitZ();  ///< one branch further aside
  double spacing = kChainSpacing;
};

/// One frame as drawn.
struct ChainFrameMark {
  std::string name;                                  ///< the frame's name, its label in the scene
  std::string parent;                                ///< empty for the tree's root
  int depth = 0;                                     ///< links from the tree's root
  int branch = 0;                                    ///< column of the layout (0 for a straight chain)
  Rotation display_R_frame;                          ///< maps frame coordinates into display coordinates
  Eigen::Vector3d origin = Eigen::Vector3d::Zero();  ///< where its triad is drawn (display coordinates)
  /// The frame's true origin in display coordinates (metres; the lever arms composed; zero
  /// where the chain has none).
  Eigen::Vector3d lever_arm_origin = Eigen::Vector3d::Zero();
  bool selected = false;
  /// The triad's size relative to the default (a vehicle's triad drawn over its model is larger).
  double scale = 1.0;
  /// Labels for the tips of x, y, z; empty strings draw no tip label.
  std::array<std::string, 3> axis_labels{"", "", ""};
};

struct ChainLayout {
  std::string display_frame;
  std::vector<ChainFrameMark> marks;  ///< depth first from the root, children in the order added
  /// Frames of other trees (not connected to the display frame), not drawn.
  std::vector<std::string> unconnected;
};

/// Lays out the tree that holds the display frame. Errors: an empty chain, an unknown
/// display or selected frame, a selected frame in another tree than the display frame, a
/// zero or non-finite spacing or direction.
Expected<ChainLayout> layout_frame_chain(const FrameChain& chain, const ChainLayoutOptions& options = {});

/// The mark of a frame in a layout, or nullptr.
const ChainFrameMark* find_mark(const ChainLayout& layout, const std::string& name);

}  // namespace attiscope
