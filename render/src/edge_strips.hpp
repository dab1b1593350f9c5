// edge_strips.hpp (internal): the scene's antialiasing. The rasteriser leaves a stair step
// wherever a mesh's colour jumps: along its outline against what lies behind it, along a
// crease or a colour change between two of its faces, along the border of an open part or
// a decal. Each such edge on the screen gets a strip one pixel wide on the side away from
// the face whose colour it carries (drawn as a one-pixel line half a pixel out), shaded
// like that face and blended with a coverage that falls from 1 at the edge to 0 a pixel
// out: the edge shows smooth, half a pixel further out. The strips hold only the edges'
// pixels, where a post pass over the picture shades every pixel near a mesh (on a software
// rasteriser each shaded pixel costs).
#pragma once

#include <array>
#include <cstdint>
#include <vector>

#include <Eigen/Core>

#include "attiscope/render/mesh.hpp"

namespace attiscope::render::detail {

/// The edges of a mesh, found once: its triangles with corners welded (closed_parts.hpp's
/// kWeldTolerance, so faces with their own vertices still join) and each edge with the one
/// or two triangles on it.
struct MeshEdges {
  static constexpr std::uint32_t kNoFace = 0xffffffffu;
  struct Edge {
    std::uint32_t a, b;     ///< corners
    std::uint32_t face[2];  ///< triangles; face[1] == kNoFace on a border
    bool smooth;            ///< both triangles have the same normal and colour at both ends
  };
  /// Shading of one triangle's corner, as its mesh vertex has it.
  struct CornerShade {
    Eigen::Vector3f normal;
    Eigen::Vector4f color;
  };
  std::vector<Eigen::Vector3f> corners;             ///< welded positions, mesh coordinates
  std::vector<std::array<std::uint32_t, 3>> faces;  ///< corners of each triangle
  std::vector<std::array<CornerShade, 3>> shades;   ///< per triangle corner
  std::size_t closed_faces = 0;                     ///< faces [0, closed_faces) are drawn one-sided
  std::vector<Edge> edges;
  std::vector<std::array<std::uint32_t, 3>> face_edges;  ///< the edges of each triangle

  /// The shading of `face` at its corner `corner`.
  const CornerShade& shade(std::uint32_t face, std::uint32_t corner) const {
    const auto& f = faces[face];
    return shades[face][corner == f[0] ? 0 : (corner == f[1] ? 1 : 2)];
  }
};

/// The edges of `mesh` drawn with `indices` (triangles), whose first `closed_count` indices
/// are drawn with back faces culled (closed_parts.hpp). An edge met by more than two
/// triangles is taken as a border of each.
MeshEdges find_mesh_edges(const Mesh& mesh, const std::vector<std::uint32_t>& indices,
                          std::size_t closed_count);

/// One vertex of an edge strip, as kEdgeVertex reads it.
struct EdgeVertex {
  float ndc[3];     ///< normalised device coordinates
  float world[3];   ///< the point of the edge, world (the view direction of the shading)
  float normal[3];  ///< the carrying face's normal there, world
  float color[4];   ///< its colour (tint applied) and the mesh's alpha
  float glow[4];    ///< the mesh's highlight glow: rgb, amount
  /// The edge in window pixels: unit normal pointing out, and its offset (a pixel p lies
  /// edge[0..1] . p - edge[2] pixels out).
  float edge[3];
};

/// How a mesh is drawn this frame.
struct EdgePlacement {
  Eigen::Matrix4f view_proj;  ///< world -> clip
  Eigen::Matrix3d linear;     ///< mesh -> world
  Eigen::Vector3d offset;
  Eigen::Vector3d eye;               ///< the camera's position, world
  int width = 1, height = 1;         ///< target, pixels
  Eigen::Vector4f tint{0, 0, 0, 0};  ///< rgb, and how much it replaces the vertex colour
  float alpha = 1.0f;
  Eigen::Vector4f glow{0, 0, 0, 0};
  /// Only outlines and borders (a translucent mesh, where a strip over its own faces would
  /// blend it twice).
  bool outline_only = false;
};

/// An outline's carrying face covering less than this on the screen, square pixels, is a
/// sliver seen edge-on (on a dense mesh with a normal per face): its line takes the colour
/// of the first face inward that covers a pixel, found in at most kSliverSteps steps
/// across neighbouring faces, as that is the colour the pixels inside the outline show.
inline constexpr float kSliverPx2 = 1.0f;
inline constexpr int kSliverSteps = 4;

/// Pulled towards the eye by this much in normalised device depth, so a strip lying on the
/// faces behind its edge passes the depth test (about 7 mm at the Scene view's distance).
inline constexpr float kEdgeDepthBias = 2e-5f;

/// Appends the strips of the edges of a mesh that show with `placement`: two vertices (a
/// line, GL_LINES) an edge. Edges with a corner outside the near or far plane are left out.
void append_edge_strips(const MeshEdges& edges, const EdgePlacement& placement, std::vector<EdgeVertex>* out);

}  // namespace attiscope::render::detail
