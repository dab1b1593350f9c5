// closed_parts.hpp (internal): which triangles of a mesh belong to closed, outward-wound
// parts, whose back faces can never show and so need not be rasterised.
#pragma once

#include <array>
#include <cstddef>
#include <cstdint>
#include <vector>

#include <Eigen/Geometry>

#include "attiscope/render/mesh.hpp"

namespace attiscope::render::detail {

/// The mesh's triangle indices reordered so that the triangles of its closed parts come
/// first, and how many indices those take. A part is a set of triangles joined through
/// shared corners (positions equal to within kWeldTolerance, so faces with their own
/// vertices still join); it is closed when every edge is met once in each direction (so it
/// is watertight and consistently wound) and outward when its signed volume is positive.
/// Anything else (a decal, an open shell, a part wound inside out) stays in the rest, which
/// is drawn two-sided.
struct ClosedFirst {
  std::vector<std::uint32_t> indices;
  std::size_t closed_count = 0;  ///< indices[0, closed_count) are closed parts
  /// The bounds of each part (closed or not), or of the whole mesh alone when it has more
  /// than kMaxPartBounds parts: tighter on the screen than one box around, say, an X frame.
  std::vector<Eigen::AlignedBox3d> part_bounds;
};
ClosedFirst closed_parts_first(const Mesh& mesh);

inline constexpr std::size_t kMaxPartBounds = 48;

/// Corners closer than this (in model units, per axis) are taken as one.
inline constexpr double kWeldTolerance = 1e-5;

/// A corner's place on the grid of kWeldTolerance: corners with the same key are welded.
using WeldKey = std::array<long long, 3>;
WeldKey weld_key(const std::array<float, 3>& position);
struct WeldKeyHash {
  std::size_t operator()(const WeldKey& k) const;
};

}  // namespace attiscope::render::detail
