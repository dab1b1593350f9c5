// mesh_builder.hpp (internal): primitives for building meshes in code: boxes, cylinders,
// cones, discs, tori and flat decals, each appended with its own colour and normals.
#pragma once

#include <Eigen/Core>
#include <Eigen/Geometry>

#include "attiscope/render/mesh.hpp"

namespace attiscope::render::detail {

using Color = Eigen::Vector4f;

inline Color rgb(float r, float g, float b, float a = 1.0f) {
  return {r, g, b, a};
}

class MeshBuilder {
 public:
  explicit MeshBuilder(Mesh* mesh) : mesh_(mesh) {}

  /// A vertex; returns its index.
  std::uint32_t vertex(const Eigen::Vector3d& p, const Eigen::Vector3d& n, const Color& c);
  void triangle(std::uint32_t a, std::uint32_t b, std::uint32_t c);
  /// Flat triangle / quad, counter-clockwise seen from the side the normal points to.
  void flat_triangle(const Eigen::Vector3d& a, const Eigen::Vector3d& b, const Eigen::Vector3d& c,
                     const Color& col);
  void flat_quad(const Eigen::Vector3d& a, const Eigen::Vector3d& b, const Eigen::Vector3d& c,
                 const Eigen::Vector3d& d, const Color& col);
  /// A box with its axes along the columns of `orient`; face colours in the order
  /// +x, -x, +y, -y, +z, -z.
  void box(const Eigen::Vector3d& centre, const Eigen::Vector3d& half, const Eigen::Matrix3d& orient,
           const std::array<Color, 6>& faces);
  void box(const Eigen::Vector3d& centre, const Eigen::Vector3d& half, const Color& col);
  /// A cylinder from a to b (smooth sides, flat caps when `caps`).
  void cylinder(const Eigen::Vector3d& a, const Eigen::Vector3d& b, double radius, int sides,
                const Color& col, bool caps = true);
  /// A cone with its base disc at `base` and its point at `tip`.
  void cone(const Eigen::Vector3d& base, const Eigen::Vector3d& tip, double radius, int sides,
            const Color& col);
  /// A flat disc facing `normal`.
  void disc(const Eigen::Vector3d& centre, const Eigen::Vector3d& normal, double radius, int sides,
            const Color& col);
  /// A flat annulus facing `normal`.
  void annulus(const Eigen::Vector3d& centre, const Eigen::Vector3d& normal, double inner, double outer,
               int sides, const Color& col);
  /// A torus around `normal` through `centre`: circle radius R, tube radius r.
  void torus(const Eigen::Vector3d& centre, const Eigen::Vector3d& normal, double big_r, double small_r,
             int segments, int sides, const Color& col);
  /// A flat strip (decal) from p to q of the given width, lying in the plane with `normal`.
  void strip(const Eigen::Vector3d& p, const Eigen::Vector3d& q, double width, const Eigen::Vector3d& normal,
             const Color& col);

 private:
  Mesh* mesh_;
};

/// Two unit vectors completing n to a right-handed orthonormal basis (u, v, n).
void orthonormal_basis(const Eigen::Vector3d& n, Eigen::Vector3d* u, Eigen::Vector3d* v);

}  // namespace attiscope::render::detail
