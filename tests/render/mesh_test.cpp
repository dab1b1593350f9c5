// mesh_test.cpp: our models, a user's OBJ and STL files (fixtures of our own in
// tests/render/fixtures), normalisation, picking, frames and the camera. No GL.
#include <gtest/gtest.h>

#include <cmath>
#include <limits>

#include "attiscope/render/camera.hpp"
#include "attiscope/render/frames.hpp"
#include "attiscope/render/mesh.hpp"
#include "attiscope/render/scene.hpp"
#include "support/check.hpp"

namespace attiscope::render {
namespace {

using test::MatrixNear;

std::string fixture(const char* name) {
  return std::string(ATTISCOPE_RENDER_FIXTURES) + "/" + name;
}

struct Bounds {
  Eigen::Vector3d lo, hi;
};

Bounds bounds(const Mesh& m) {
  Bounds b{Eigen::Vector3d::Constant(std::numeric_limits<double>::infinity()),
           Eigen::Vector3d::Constant(-std::numeric_limits<double>::infinity())};
  for (const Vertex& v : m.vertices) {
    const Eigen::Vector3d p(v.position[0], v.position[1], v.position[2]);
    b.lo = b.lo.cwiseMin(p);
    b.hi = b.hi.cwiseMax(p);
  }
  return b;
}

void ExpectNormalised(const Mesh& m) {
  const Bounds b = bounds(m);
  EXPECT_TRUE(MatrixNear(b.lo + b.hi, Eigen::Vector3d::Zero(), 1e-6));
  EXPECT_NEAR(0.5 * (b.hi - b.lo).maxCoeff(), 1.0, 1e-6);
}

TEST(MeshTest, ObjTetrahedronLoadsCentredAndScaled) {
  auto m = load_mesh_file(fixture("tetra.obj"));
  ASSERT_TRUE(m.ok()) << m.error().describe();
  EXPECT_EQ(m.value().triangle_count(), 4u);
  ExpectNormalised(m.value());
  // Extents 2 x 4 x 6 scale by 1/3: the x extent becomes 2/3.
  const Bounds b = bounds(m.value());
  EXPECT_NEAR(b.hi.x() - b.lo.x(), 2.0 / 3.0, 1e-6);
}

TEST(MeshTest, ObjQuadsAreTriangulatedAndNegativeIndicesWork) {
  auto m = load_mesh_file(fixture("quad_faces.obj"));
  ASSERT_TRUE(m.ok()) << m.error().describe();
  EXPECT_EQ(m.value().triangle_count(), 12u);
  ExpectNormalised(m.value());
}

TEST(MeshTest, MalformedObjNamesLineAndColumn) {
  auto bad = load_mesh_file(fixture("bad_number.obj"));
  ASSERT_FALSE(bad.ok());
  EXPECT_EQ(bad.error().line, 3);
  EXPECT_EQ(bad.error().column, 5);
  auto index = load_mesh_file(fixture("bad_index.obj"));
  ASSERT_FALSE(index.ok());
  EXPECT_EQ(index.error().line, 5);
  EXPECT_NE(index.error().message.find("vertex 9"), std::string::npos) << index.error().message;
  EXPECT_FALSE(load_mesh_data("# nothing here\n", "obj").ok());
}

TEST(MeshTest, StlAsciiAndBinaryLoad) {
  auto a = load_mesh_file(fixture("wedge_ascii.stl"));
  ASSERT_TRUE(a.ok()) << a.error().describe();
  EXPECT_EQ(a.value().triangle_count(), 2u);
  ExpectNormalised(a.value());
  // The binary header begins with "solid" on purpose: the size rule must still pick binary.
  auto b = load_mesh_file(fixture("rectangle_binary.stl"));
  ASSERT_TRUE(b.ok()) << b.error().describe();
  EXPECT_EQ(b.value().triangle_count(), 2u);
  ExpectNormalised(b.value());
  const Bounds bb = bounds(b.value());
  EXPECT_NEAR(bb.hi.y() - bb.lo.y(), 1.0, 1e-6);  // 4 x 2 rectangle scaled by 1/2
  EXPECT_NEAR(bb.hi.z() - bb.lo.z(), 0.0, 1e-6);
}

TEST(MeshTest, MalformedStlGivesErrors) {
  auto truncated = load_mesh_file(fixture("truncated_binary.stl"));
  ASSERT_FALSE(truncated.ok());
  EXPECT_NE(truncated.error().message.find("promises 2 triangles"), std::string::npos)
      << truncated.error().message;
  auto broken = load_mesh_file(fixture("bad_ascii.stl"));
  ASSERT_FALSE(broken.ok());
  EXPECT_EQ(broken.error().line, 6);  // "endloop" where the third vertex belongs
  EXPECT_FALSE(load_mesh_file(fixture("missing.stl")).ok());
  EXPECT_FALSE(load_mesh_file(fixture("tetra.ply")).ok());
}

TEST(MeshTest, RayHitsTriangleFromEitherSide) {
  auto m = load_mesh_file(fixture("rectangle_binary.stl"));
  ASSERT_TRUE(m.ok());
  const auto down = ray_mesh_hit(m.value(), Eigen::Vector3d(0.2, 0.1, 5.0), -Eigen::Vector3d::UnitZ());
  ASSERT_TRUE(down.has_value());
  EXPECT_NEAR(*down, 5.0, 1e-6);
  EXPECT_TRUE(ray_mesh_hit(m.value(), Eigen::Vector3d(0.2, 0.1, -5.0), Eigen::Vector3d::UnitZ()).has_value());
  EXPECT_FALSE(
      ray_mesh_hit(m.value(), Eigen::Vector3d(3.0, 0.1, 5.0), -Eigen::Vector3d::UnitZ()).has_value());
}

// Body frames (common practice): FLU x front y left z up; FRD x front y right z down;
// camera RDF x right y down z forward along the optical axis.
TEST(FramesTest, ModelsSitInEveryBodyFrame) {
  const ModelInfo& info = model_info(ModelKind::Camera);
  const Eigen::Matrix3d flu = body_R_model(BodyFrame::flu(), info.front, info.top, info.right);
  const Eigen::Matrix3d frd = body_R_model(BodyFrame::frd(), info.front, info.top, info.right);
  const Eigen::Matrix3d rdf = body_R_model(BodyFrame::rdf(), info.front, info.top, info.right);
  EXPECT_TRUE(MatrixNear(flu, Eigen::Matrix3d::Identity(), 1e-15));
  EXPECT_TRUE(MatrixNear(frd * info.top, -Eigen::Vector3d::UnitZ(), 1e-15));
  EXPECT_TRUE(MatrixNear(frd * info.right, Eigen::Vector3d::UnitY(), 1e-15));
  EXPECT_TRUE(MatrixNear(rdf * info.front, Eigen::Vector3d::UnitZ(), 1e-15));  // optical axis
  EXPECT_TRUE(MatrixNear(rdf * info.top, -Eigen::Vector3d::UnitY(), 1e-15));
  for (const Eigen::Matrix3d* m : {&flu, &frd, &rdf}) EXPECT_NEAR(m->determinant(), 1.0, 1e-15);
}

TEST(CameraTest, ProjectionAndRaysAgree) {
  for (const WorldFrame& world : {WorldFrame::enu(), WorldFrame::ned()}) {
    Camera cam = Camera::preset(ViewPreset::Iso);
    const Projected c = project_to_pixel(cam, world, 800, 600, Eigen::Vector3d::Zero());
    EXPECT_TRUE(MatrixNear(c.pixel, Eigen::Vector2d(400, 300), 1e-9));
    const Eigen::Vector3d p(0.3, -0.7, 0.4);
    const Projected pp = project_to_pixel(cam, world, 800, 600, p);
    const Ray ray = pixel_ray(cam, world, 800, 600, pp.pixel);
    const Eigen::Vector3d to_p = p - ray.origin;
    EXPECT_LT(to_p.cross(ray.direction).norm(), 1e-9);  // the ray passes through the point
    // World up is up on the screen in the front view, for both worlds (NED's up is -z).
    cam = Camera::preset(ViewPreset::Front);
    const Projected up = project_to_pixel(cam, world, 800, 600, world.up);
    EXPECT_LT(up.pixel.y(), 300.0 - 10.0) << world.name;
  }
}

TEST(CameraTest, TopViewHasWorldXUpTheScreen) {
  const Camera cam = Camera::preset(ViewPreset::Top);
  const Projected x = project_to_pixel(cam, WorldFrame::enu(), 800, 600, Eigen::Vector3d::UnitX());
  EXPECT_NEAR(x.pixel.x(), 400.0, 1e-9);
  EXPECT_LT(x.pixel.y(), 290.0);
  // Looking down +z from above, world +y (ENU north, the left of +x) is to the left.
  const Projected y = project_to_pixel(cam, WorldFrame::enu(), 800, 600, Eigen::Vector3d::UnitY());
  EXPECT_LT(y.pixel.x(), 390.0);
}

TEST(CameraTest, PresetsParseByName) {
  for (const char* n : {"front", "back", "left", "right", "top", "bottom", "iso", "ISO"}) {
    EXPECT_TRUE(parse_view_preset(n).has_value()) << n;
  }
  EXPECT_FALSE(parse_view_preset("sideways").has_value());
  for (const ModelInfo& m : model_infos()) EXPECT_EQ(parse_model_kind(m.name), m.kind);
}

}  // namespace
}  // namespace attiscope::render
