// edge_strips_test.cpp: the edges the antialiasing strips follow (render/src/edge_strips.hpp).
// No GL: the strips are placed on the CPU. The counts of a cube's edges and faces are
// elementary geometry (12 edges, 6 square faces of 2 triangles each, so 6 diagonals);
// the outline of a cube seen along a body diagonal is a regular hexagon (common practice in
// engineering drawing: the isometric view).
#include <gtest/gtest.h>

#include <cmath>
#include <set>
#include <vector>

#include "../../render/src/closed_parts.hpp"
#include "../../render/src/edge_strips.hpp"
#include "../../render/src/mesh_builder.hpp"
#include "attiscope/render/camera.hpp"
#include "attiscope/render/frames.hpp"
#include "attiscope/render/mesh.hpp"

namespace attiscope::render {
namespace {

using detail::EdgePlacement;
using detail::EdgeVertex;
using detail::MeshEdges;

Mesh cube(bool same_colour) {
  Mesh m;
  detail::MeshBuilder b(&m);
  std::array<detail::Color, 6> faces;
  for (int i = 0; i < 6; ++i)
    faces[i] = same_colour
                   ? detail::rgb(0.5f, 0.5f, 0.5f)
                   : detail::rgb(0.1f * static_cast<float>(i), 0.5f, 1.0f - 0.1f * static_cast<float>(i));
  b.box(Eigen::Vector3d::Zero(), Eigen::Vector3d::Constant(0.5), Eigen::Matrix3d::Identity(), faces);
  return m;
}

/// Does a strip start at the cube's corner nearest an eye out along (1, 1, 1)?
bool touches_near_corner(const std::vector<EdgeVertex>& out) {
  for (const EdgeVertex& v : out)
    if (Eigen::Vector3f(v.world[0], v.world[1], v.world[2]).isApprox(Eigen::Vector3f::Constant(0.5f)))
      return true;
  return false;
}

MeshEdges edges_of(const Mesh& m) {
  const detail::ClosedFirst order = detail::closed_parts_first(m);
  return detail::find_mesh_edges(m, order.indices, order.closed_count);
}

TEST(EdgeStrips, CubeHasTwelveCreasesAndSixSmoothDiagonals) {
  const Mesh m = cube(true);
  const MeshEdges e = edges_of(m);
  EXPECT_EQ(e.corners.size(), 8u);  // the faces' own vertices welded
  EXPECT_EQ(e.faces.size(), 12u);
  EXPECT_EQ(e.closed_faces, 12u);
  ASSERT_EQ(e.edges.size(), 18u);
  int creases = 0, smooth = 0;
  for (const MeshEdges::Edge& edge : e.edges) {
    EXPECT_NE(edge.face[1], MeshEdges::kNoFace);  // closed: two faces on every edge
    (edge.smooth ? smooth : creases)++;
  }
  EXPECT_EQ(creases, 12);
  EXPECT_EQ(smooth, 6);
}

TEST(EdgeStrips, OpenStripHasBordersOnly) {
  Mesh m;
  detail::MeshBuilder b(&m);
  b.strip(Eigen::Vector3d(0, 0, 0), Eigen::Vector3d(1, 0, 0), 0.1, Eigen::Vector3d::UnitZ(),
          detail::rgb(1, 1, 1));
  const MeshEdges e = edges_of(m);
  EXPECT_EQ(e.closed_faces, 0u);
  int borders = 0;
  for (const MeshEdges::Edge& edge : e.edges) borders += edge.face[1] == MeshEdges::kNoFace;
  EXPECT_EQ(borders, 4);  // the rectangle's sides; its diagonal joins its two triangles
}

/// The cube seen along (1, 1, 1) from `distance`, in a 400 x 400 target, through the
/// renderer's own orbit camera (ENU world: azimuth 45 degrees, elevation atan(1 / sqrt 2)).
EdgePlacement iso_placement(double distance) {
  Camera camera;
  camera.azimuth_rad = std::atan2(1.0, 1.0);
  camera.elevation_rad = std::atan(1.0 / std::sqrt(2.0));
  camera.distance = distance;
  camera.fov_y_rad = 20.0 * M_PI / 180.0;
  const WorldFrame world = WorldFrame::enu();
  EdgePlacement p;
  p.view_proj = (projection_matrix(camera, 400, 400) * view_matrix(camera, world)).cast<float>();
  p.linear = Eigen::Matrix3d::Identity();
  p.offset = Eigen::Vector3d::Zero();
  p.eye = camera_pose(camera, world).eye;
  p.width = 400;
  p.height = 400;
  return p;
}

TEST(EdgeStrips, CubeAlongItsDiagonalShowsAHexagonOutlineAndThreeCreases) {
  // Seen along (1, 1, 1) three faces show; the outline is the six edges between a shown
  // face and a hidden one, and the three edges where the shown faces meet are creases.
  const MeshEdges e = edges_of(cube(false));
  std::vector<EdgeVertex> out;
  EdgePlacement p = iso_placement(8.0);
  detail::append_edge_strips(e, p, &out);
  ASSERT_EQ(out.size() % 2, 0u);
  EXPECT_EQ(out.size() / 2, 9u);
  // Every strip lies beside its edge: half a pixel out along the edge's outward normal.
  const Eigen::Vector2f centre(200.0f, 200.0f);
  int outward_from_centre = 0;
  for (std::size_t i = 0; i < out.size(); i += 2) {
    const Eigen::Vector2f n(out[i].edge[0], out[i].edge[1]);
    EXPECT_NEAR(n.norm(), 1.0f, 1e-5f);
    for (std::size_t k = i; k < i + 2; ++k) {
      const Eigen::Vector2f px((out[k].ndc[0] + 1.0f) * 200.0f, (out[k].ndc[1] + 1.0f) * 200.0f);
      EXPECT_NEAR(n.dot(px) - out[k].edge[2], 0.5f, 1e-3f);
    }
    const Eigen::Vector2f mid((out[i].ndc[0] + out[i + 1].ndc[0] + 2.0f) * 100.0f,
                              (out[i].ndc[1] + out[i + 1].ndc[1] + 2.0f) * 100.0f);
    outward_from_centre += n.dot(mid - centre) > 0.0f;
  }
  // The six outline strips point away from the middle of the picture.
  EXPECT_GE(outward_from_centre, 6);

  // Outlines only (a translucent mesh): the creases go.
  out.clear();
  p.outline_only = true;
  detail::append_edge_strips(e, p, &out);
  EXPECT_EQ(out.size() / 2, 6u);

  // One colour all over: the creases still differ in normal, so they stay.
  out.clear();
  p.outline_only = false;
  detail::append_edge_strips(edges_of(cube(true)), p, &out);
  EXPECT_EQ(out.size() / 2, 9u);
}

TEST(EdgeStrips, MirroredPlacementShowsTheFacesTowardTheEye) {
  // A mirroring placement turns every face's winding over: taken as drawn, the three faces
  // away from the eye would look shown, and their creases meet at the far corner.
  const MeshEdges e = edges_of(cube(false));
  EdgePlacement p = iso_placement(8.0);
  p.linear = Eigen::Vector3d(1.0, 1.0, -1.0).asDiagonal();
  std::vector<EdgeVertex> out;
  detail::append_edge_strips(e, p, &out);
  EXPECT_EQ(out.size() / 2, 9u);
  EXPECT_TRUE(touches_near_corner(out));
}

TEST(EdgeStrips, CornerInFrontOfTheNearPlaneLeavesItsEdgesOut) {
  // The near corner (0.5, 0.5, 0.5) is 0.866 from the centre; an eye 0.9 out along the
  // diagonal has it 0.034 away, inside the near plane (0.1), so no strip may start there.
  const MeshEdges e = edges_of(cube(false));
  std::vector<EdgeVertex> far_out, near_out;
  detail::append_edge_strips(e, iso_placement(8.0), &far_out);
  EXPECT_TRUE(touches_near_corner(far_out));  // the three creases meet there
  detail::append_edge_strips(e, iso_placement(0.9), &near_out);
  EXPECT_FALSE(touches_near_corner(near_out));
}

}  // namespace
}  // namespace attiscope::render
