// smooth_tiles.hpp (internal): where on the screen the smoothing pass has to look. Every
// mesh the scene pass draws leaves a footprint (its bounds, a stick or a ring, placed as it
// was drawn); the footprints are laid on a grid of small tiles, and the touched tiles, merged
// into rectangles, are all the smoothing pass shades. On a software rasteriser every shaded
// pixel costs, and one box around the body and the rings holds mostly empty background.
#pragma once

#include <optional>
#include <vector>

#include <Eigen/Geometry>

#include "attiscope/render/camera.hpp"

namespace attiscope::render::detail {

/// What one drawn mesh may cover.
struct Footprint {
  enum class Shape {
    Blob,   ///< anywhere inside its bounds
    Stick,  ///< a rod along its own z axis (an arrow, a rod): a capsule from its bounds
    Ring,   ///< a tube of tube_radius around the circle of ring_radius in its own xy plane,
            ///< with pivots where it crosses its own x axis, out to its bounds (a gimbal ring)
  };
  Shape shape = Shape::Blob;
  Eigen::AlignedBox3d box;  ///< the mesh's bounds in its own coordinates
  /// Blob: the bounds of its parts, if known (each is taken instead of `box`); must outlive
  /// the footprint.
  const std::vector<Eigen::AlignedBox3d>* parts = nullptr;
  double ring_radius = 0.0, tube_radius = 0.0;
  Eigen::Matrix3d linear = Eigen::Matrix3d::Identity();  ///< mesh -> world, as drawn
  Eigen::Vector3d offset = Eigen::Vector3d::Zero();
};

/// A pixel rectangle, top-left origin.
struct PixelBox {
  int x, y, width, height;
};

/// Side of a tile, pixels (a multiple of the rasteriser's 4x4 blocks).
inline constexpr int kSmoothTilePx = 8;
/// Pixels a footprint is widened by: the smoothing reads and blends one pixel beyond an
/// edge, and projected bounds are rounded.
inline constexpr double kFootprintPadPx = 2.0;

/// The tiles of a w x h view the footprints may touch, merged into rectangles (each row's
/// runs, joined with the same run in the rows below), clipped to the view. The whole view
/// when a footprint reaches behind the camera; empty when none is on screen.
std::vector<PixelBox> footprint_tiles(const Camera& camera, const WorldFrame& world, int w, int h,
                                      const std::vector<Footprint>& footprints);

/// The tiles of a w x h view that any of `boxes` (tile rectangles of footprint_tiles)
/// covers, merged into rectangles as footprint_tiles does: each tile once.
std::vector<PixelBox> merge_tiles(const std::vector<PixelBox>& boxes, int w, int h);

/// The smallest rectangle holding all of `boxes` (none when there are none).
std::optional<PixelBox> bounds_of(const std::vector<PixelBox>& boxes);

}  // namespace attiscope::render::detail
