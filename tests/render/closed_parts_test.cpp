// closed_parts_test.cpp: which parts of a mesh are closed and outward, so the renderer may
// cull their back faces (render/src/closed_parts.hpp). No GL.
#include <gtest/gtest.h>

#include <algorithm>
#include <vector>

#include "../../render/src/closed_parts.hpp"
#include "../../render/src/mesh_builder.hpp"
#include "attiscope/render/mesh.hpp"

namespace attiscope::render {
namespace {

using detail::closed_parts_first;

/// A unit box whose six faces have their own vertices (as our flat-shaded models have).
Mesh box_mesh() {
  Mesh m;
  detail::MeshBuilder b(&m);
  b.box(Eigen::Vector3d::Zero(), Eigen::Vector3d::Constant(0.5), detail::rgb(1, 1, 1));
  return m;
}

/// The triangles of `indices` as sorted triples (to compare sets of triangles).
std::vector<std::vector<std::uint32_t>> triangles(const std::vector<std::uint32_t>& indices) {
  std::vector<std::vector<std::uint32_t>> t;
  for (std::size_t i = 0; i + 2 < indices.size(); i += 3)
    t.push_back({indices[i], indices[i + 1], indices[i + 2]});
  std::sort(t.begin(), t.end());
  return t;
}

TEST(ClosedPartsTest, BoxWithOwnFaceVerticesIsClosed) {
  const Mesh m = box_mesh();
  const detail::ClosedFirst c = closed_parts_first(m);
  EXPECT_EQ(c.closed_count, m.indices.size());
  EXPECT_EQ(triangles(c.indices), triangles(m.indices));
}

TEST(ClosedPartsTest, InsideOutBoxIsNotClosed) {
  // Watertight and consistently wound, but its signed volume is negative (divergence
  // theorem: a surface wound outward encloses a positive volume; common practice).
  Mesh m = box_mesh();
  for (std::size_t i = 0; i < m.indices.size(); i += 3) std::swap(m.indices[i + 1], m.indices[i + 2]);
  EXPECT_EQ(closed_parts_first(m).closed_count, 0u);
}

TEST(ClosedPartsTest, BoxWithAMissingFaceIsNotClosed) {
  Mesh m = box_mesh();
  m.indices.resize(m.indices.size() - 6);  // the last face's two triangles
  EXPECT_EQ(closed_parts_first(m).closed_count, 0u);
}

TEST(ClosedPartsTest, MixedWindingIsNotClosed) {
  Mesh m = box_mesh();
  std::swap(m.indices[1], m.indices[2]);  // one triangle turned over
  EXPECT_EQ(closed_parts_first(m).closed_count, 0u);
}

TEST(ClosedPartsTest, DecalStaysTwoSidedAndTheBoxIsCulled) {
  Mesh m;
  detail::MeshBuilder b(&m);
  b.strip(Eigen::Vector3d(-0.3, 0, 0.51), Eigen::Vector3d(0.3, 0, 0.51), 0.1, Eigen::Vector3d::UnitZ(),
          detail::rgb(1, 0, 0));
  const std::size_t strip_indices = m.indices.size();
  b.box(Eigen::Vector3d::Zero(), Eigen::Vector3d::Constant(0.5), detail::rgb(1, 1, 1));
  b.torus(Eigen::Vector3d(2, 0, 0), Eigen::Vector3d::UnitZ(), 0.8, 0.05, 12, 5, detail::rgb(0, 0, 1));
  const detail::ClosedFirst c = closed_parts_first(m);
  EXPECT_EQ(c.closed_count, m.indices.size() - strip_indices);
  EXPECT_EQ(triangles(c.indices), triangles(m.indices));  // every triangle kept, once
  // The two-sided rest is the strip.
  const std::vector<std::uint32_t> rest(c.indices.begin() + static_cast<std::ptrdiff_t>(c.closed_count),
                                        c.indices.end());
  EXPECT_EQ(triangles(rest), triangles({m.indices.begin(), m.indices.begin() + 6}));
}

TEST(ClosedPartsTest, OurRingArrowAndRodPrimitivesAreClosed) {
  Mesh m;
  detail::MeshBuilder b(&m);
  b.cylinder(Eigen::Vector3d::Zero(), Eigen::Vector3d(0, 0, 0.84), 0.022, 12, detail::rgb(1, 1, 1));
  b.cone(Eigen::Vector3d(0, 0, 0.82), Eigen::Vector3d(0, 0, 1.0), 0.062, 16, detail::rgb(1, 1, 1));
  b.torus(Eigen::Vector3d::Zero(), Eigen::Vector3d::UnitZ(), 2.05, 0.034, 56, 6, detail::rgb(1, 1, 1));
  EXPECT_EQ(closed_parts_first(m).closed_count, m.indices.size());
}

}  // namespace
}  // namespace attiscope::render
