// mesh_builder.cpp: mesh primitives (see mesh_builder.hpp).
#include "mesh_builder.hpp"

#include <cmath>

namespace attiscope::render::detail {

namespace {
constexpr double kTwoPi = 6.28318530717958647692;

std::array<float, 3> f3(const Eigen::Vector3d& v) {
  return {static_cast<float>(v.x()), static_cast<float>(v.y()), static_cast<float>(v.z())};
}
}  // namespace

void orthonormal_basis(const Eigen::Vector3d& n, Eigen::Vector3d* u, Eigen::Vector3d* v) {
  const Eigen::Vector3d helper = std::abs(n.x()) < 0.9 ? Eigen::Vector3d::UnitX() : Eigen::Vector3d::UnitY();
  *u = helper.cross(n).normalized();
  *v = n.cross(*u);
}

std::uint32_t MeshBuilder::vertex(const Eigen::Vector3d& p, const Eigen::Vector3d& n, const Color& c) {
  mesh_->vertices.push_back({f3(p), f3(n.normalized()), {c[0], c[1], c[2], c[3]}});
  return static_cast<std::uint32_t>(mesh_->vertices.size() - 1);
}

void MeshBuilder::triangle(std::uint32_t a, std::uint32_t b, std::uint32_t c) {
  mesh_->indices.insert(mesh_->indices.end(), {a, b, c});
}

void MeshBuilder::flat_triangle(const Eigen::Vector3d& a, const Eigen::Vector3d& b, const Eigen::Vector3d& c,
                                const Color& col) {
  const Eigen::Vector3d n = (b - a).cross(c - a);
  if (n.norm() == 0.0) return;
  triangle(vertex(a, n, col), vertex(b, n, col), vertex(c, n, col));
}

void MeshBuilder::flat_quad(const Eigen::Vector3d& a, const Eigen::Vector3d& b, const Eigen::Vector3d& c,
                            const Eigen::Vector3d& d, const Color& col) {
  const Eigen::Vector3d n = (c - a).cross(d - b);
  if (n.norm() == 0.0) return;
  const std::uint32_t i = vertex(a, n, col), j = vertex(b, n, col), k = vertex(c, n, col),
                      l = vertex(d, n, col);
  triangle(i, j, k);
  triangle(i, k, l);
}

void MeshBuilder::box(const Eigen::Vector3d& centre, const Eigen::Vector3d& half,
                      const Eigen::Matrix3d& orient, const std::array<Color, 6>& faces) {
  const Eigen::Vector3d ax = orient.col(0) * half.x(), ay = orient.col(1) * half.y(),
                        az = orient.col(2) * half.z();
  auto face = [&](const Eigen::Vector3d& n, const Eigen::Vector3d& u, const Eigen::Vector3d& v,
                  const Color& col) {
    // Centre of the face n, spanned by u and v with u x v along n.
    const Eigen::Vector3d c = centre + n;
    flat_quad(c - u - v, c + u - v, c + u + v, c - u + v, col);
  };
  face(ax, ay, az, faces[0]);
  face(-ax, az, ay, faces[1]);
  face(ay, az, ax, faces[2]);
  face(-ay, ax, az, faces[3]);
  face(az, ax, ay, faces[4]);
  face(-az, ay, ax, faces[5]);
}

void MeshBuilder::box(const Eigen::Vector3d& centre, const Eigen::Vector3d& half, const Color& col) {
  box(centre, half, Eigen::Matrix3d::Identity(), {col, col, col, col, col, col});
}

void MeshBuilder::cylinder(const Eigen::Vector3d& a, const Eigen::Vector3d& b, double radius, int sides,
                           const Color& col, bool caps) {
  const Eigen::Vector3d axis = (b - a).normalized();
  Eigen::Vector3d u, v;
  orthonormal_basis(axis, &u, &v);
  const std::uint32_t first = static_cast<std::uint32_t>(mesh_->vertices.size());
  for (int i = 0; i <= sides; ++i) {
    const double t = kTwoPi * i / sides;
    const Eigen::Vector3d n = std::cos(t) * u + std::sin(t) * v;
    vertex(a + radius * n, n, col);
    vertex(b + radius * n, n, col);
  }
  for (int i = 0; i < sides; ++i) {
    const std::uint32_t i0 = first + 2 * i;
    triangle(i0, i0 + 2, i0 + 1);
    triangle(i0 + 1, i0 + 2, i0 + 3);
  }
  if (caps) {
    disc(a, -axis, radius, sides, col);
    disc(b, axis, radius, sides, col);
  }
}

void MeshBuilder::cone(const Eigen::Vector3d& base, const Eigen::Vector3d& tip, double radius, int sides,
                       const Color& col) {
  const Eigen::Vector3d axis = (tip - base).normalized();
  const double h = (tip - base).norm();
  Eigen::Vector3d u, v;
  orthonormal_basis(axis, &u, &v);
  for (int i = 0; i < sides; ++i) {
    const double t0 = kTwoPi * i / sides, t1 = kTwoPi * (i + 1) / sides, tm = 0.5 * (t0 + t1);
    const Eigen::Vector3d r0 = std::cos(t0) * u + std::sin(t0) * v;
    const Eigen::Vector3d r1 = std::cos(t1) * u + std::sin(t1) * v;
    const Eigen::Vector3d rm = std::cos(tm) * u + std::sin(tm) * v;
    // Smooth normals of a cone: radial tilted toward the tip by atan(radius / height).
    auto normal = [&](const Eigen::Vector3d& r) { return (h * r + radius * axis).normalized(); };
    triangle(vertex(base + radius * r0, normal(r0), col), vertex(base + radius * r1, normal(r1), col),
             vertex(tip, normal(rm), col));
  }
  disc(base, -axis, radius, sides, col);
}

void MeshBuilder::disc(const Eigen::Vector3d& centre, const Eigen::Vector3d& normal, double radius, int sides,
                       const Color& col) {
  Eigen::Vector3d u, v;
  const Eigen::Vector3d n = normal.normalized();
  orthonormal_basis(n, &u, &v);
  const std::uint32_t c = vertex(centre, n, col);
  const std::uint32_t first = static_cast<std::uint32_t>(mesh_->vertices.size());
  for (int i = 0; i < sides; ++i) {
    const double t = kTwoPi * i / sides;
    vertex(centre + radius * (std::cos(t) * u + std::sin(t) * v), n, col);
  }
  for (int i = 0; i < sides; ++i) triangle(c, first + i, first + (i + 1) % sides);
}

void MeshBuilder::annulus(const Eigen::Vector3d& centre, const Eigen::Vector3d& normal, double inner,
                          double outer, int sides, const Color& col) {
  Eigen::Vector3d u, v;
  const Eigen::Vector3d n = normal.normalized();
  orthonormal_basis(n, &u, &v);
  const std::uint32_t first = static_cast<std::uint32_t>(mesh_->vertices.size());
  for (int i = 0; i < sides; ++i) {
    const double t = kTwoPi * i / sides;
    const Eigen::Vector3d r = std::cos(t) * u + std::sin(t) * v;
    vertex(centre + inner * r, n, col);
    vertex(centre + outer * r, n, col);
  }
  for (int i = 0; i < sides; ++i) {
    const std::uint32_t a = first + 2 * i, b = first + 2 * ((i + 1) % sides);
    triangle(a, a + 1, b + 1);
    triangle(a, b + 1, b);
  }
}

void MeshBuilder::torus(const Eigen::Vector3d& centre, const Eigen::Vector3d& normal, double big_r,
                        double small_r, int segments, int sides, const Color& col) {
  Eigen::Vector3d u, v;
  const Eigen::Vector3d n = normal.normalized();
  orthonormal_basis(n, &u, &v);
  const std::uint32_t first = static_cast<std::uint32_t>(mesh_->vertices.size());
  for (int i = 0; i <= segments; ++i) {
    const double t = kTwoPi * i / segments;
    const Eigen::Vector3d radial = std::cos(t) * u + std::sin(t) * v;
    for (int j = 0; j <= sides; ++j) {
      const double s = kTwoPi * j / sides;
      const Eigen::Vector3d nn = std::cos(s) * radial + std::sin(s) * n;
      vertex(centre + big_r * radial + small_r * nn, nn, col);
    }
  }
  const int row = sides + 1;
  for (int i = 0; i < segments; ++i) {
    for (int j = 0; j < sides; ++j) {
      const std::uint32_t a = first + i * row + j, b = a + row;
      triangle(a, b, a + 1);
      triangle(a + 1, b, b + 1);
    }
  }
}

void MeshBuilder::strip(const Eigen::Vector3d& p, const Eigen::Vector3d& q, double width,
                        const Eigen::Vector3d& normal, const Color& col) {
  const Eigen::Vector3d along = (q - p).normalized();
  const Eigen::Vector3d side = normal.normalized().cross(along) * (width / 2.0);
  flat_quad(p - side, q - side, q + side, p + side, col);
}

}  // namespace attiscope::render::detail
