// edge_strips.cpp: edge strips of the scene's antialiasing (see edge_strips.hpp).
#include "edge_strips.hpp"

#include <algorithm>
#include <cmath>
#include <unordered_map>

#include "closed_parts.hpp"

namespace attiscope::render::detail {

namespace {

bool same_shade(const MeshEdges::CornerShade& p, const MeshEdges::CornerShade& q) {
  constexpr float kSameNormal = 0.9999f, kSameColor = 1e-4f;
  const float np = p.normal.norm(), nq = q.normal.norm();
  if (np <= 0.0f || nq <= 0.0f || p.normal.dot(q.normal) < kSameNormal * np * nq) return false;
  return (p.color - q.color).cwiseAbs().maxCoeff() <= kSameColor;
}

float cross2(const Eigen::Vector2f& u, const Eigen::Vector2f& v) {
  return u.x() * v.y() - u.y() * v.x();
}

}  // namespace

MeshEdges find_mesh_edges(const Mesh& mesh, const std::vector<std::uint32_t>& indices,
                          std::size_t closed_count) {
  MeshEdges out;
  std::unordered_map<WeldKey, std::uint32_t, WeldKeyHash> ids;
  std::vector<std::uint32_t> corner_of(mesh.vertices.size(), MeshEdges::kNoFace);
  auto corner = [&](std::uint32_t v) {
    if (corner_of[v] != MeshEdges::kNoFace) return corner_of[v];
    const auto& p = mesh.vertices[v].position;
    auto [it, added] = ids.emplace(weld_key(p), static_cast<std::uint32_t>(out.corners.size()));
    if (added) out.corners.emplace_back(p[0], p[1], p[2]);
    return corner_of[v] = it->second;
  };
  // Each undirected edge (smaller corner first) with the faces on it.
  std::unordered_map<std::uint64_t, std::size_t> edge_at;
  std::vector<std::uint8_t> met;  // faces met on the edge first found at each index
  for (std::size_t i = 0; i + 2 < indices.size(); i += 3) {
    std::array<std::uint32_t, 3> f;
    std::array<MeshEdges::CornerShade, 3> sh;
    for (int k = 0; k < 3; ++k) {
      const Vertex& v = mesh.vertices[indices[i + k]];
      f[k] = corner(indices[i + k]);
      sh[k] = {Eigen::Vector3f(v.normal[0], v.normal[1], v.normal[2]),
               Eigen::Vector4f(v.color[0], v.color[1], v.color[2], v.color[3])};
    }
    if (f[0] == f[1] || f[1] == f[2] || f[2] == f[0]) continue;  // degenerate: no edges
    const auto face = static_cast<std::uint32_t>(out.faces.size());
    if (i < closed_count) out.closed_faces = face + 1;
    out.faces.push_back(f);
    out.shades.push_back(sh);
    std::array<std::uint32_t, 3>& fe = out.face_edges.emplace_back();
    for (int k = 0; k < 3; ++k) {
      const std::uint32_t a = std::min(f[k], f[(k + 1) % 3]), b = std::max(f[k], f[(k + 1) % 3]);
      const std::uint64_t key = (static_cast<std::uint64_t>(a) << 32) | b;
      auto [it, added] = edge_at.emplace(key, out.edges.size());
      if (added) {
        fe[k] = static_cast<std::uint32_t>(out.edges.size());
        out.edges.push_back({a, b, {face, MeshEdges::kNoFace}, false});
        met.push_back(1);
        continue;
      }
      const std::size_t first = it->second;
      if (met[first] == 1) {
        fe[k] = static_cast<std::uint32_t>(first);
        out.edges[first].face[1] = face;
        met[first] = 2;
        continue;
      }
      // A third triangle or more on the edge: a border of each.
      if (met[first] == 2) {
        const std::uint32_t second = out.edges[first].face[1];
        for (std::uint32_t& e : out.face_edges[second])
          if (e == first) e = static_cast<std::uint32_t>(out.edges.size());
        out.edges.push_back({a, b, {second, MeshEdges::kNoFace}, false});
        met.push_back(0);
        out.edges[first].face[1] = MeshEdges::kNoFace;
        met[first] = 3;
      }
      fe[k] = static_cast<std::uint32_t>(out.edges.size());
      out.edges.push_back({a, b, {face, MeshEdges::kNoFace}, false});
      met.push_back(0);
    }
  }
  // An edge is smooth when both faces shade its two ends alike.
  for (MeshEdges::Edge& e : out.edges) {
    if (e.face[1] == MeshEdges::kNoFace) continue;
    e.smooth = same_shade(out.shade(e.face[0], e.a), out.shade(e.face[1], e.a)) &&
               same_shade(out.shade(e.face[0], e.b), out.shade(e.face[1], e.b));
  }
  return out;
}

void append_edge_strips(const MeshEdges& edges, const EdgePlacement& p, std::vector<EdgeVertex>* out) {
  const std::size_t n = edges.corners.size();
  if (n == 0) return;
  Eigen::Matrix4f model = Eigen::Matrix4f::Identity();
  model.topLeftCorner<3, 3>() = p.linear.cast<float>();
  model.topRightCorner<3, 1>() = p.offset.cast<float>();
  const Eigen::Matrix4f mvp = p.view_proj * model;
  const Eigen::Matrix3f normal_matrix = p.linear.inverse().transpose().cast<float>();
  const bool mirrored = p.linear.determinant() < 0.0;
  const float half_w = 0.5f * static_cast<float>(p.width), half_h = 0.5f * static_cast<float>(p.height);
  // Corners on the screen: GL window pixels (origin bottom-left) and depth; `ok` when
  // between the near and far planes.
  std::vector<Eigen::Vector3f> screen(n);
  std::vector<std::uint8_t> ok(n);
  for (std::size_t i = 0; i < n; ++i) {
    const Eigen::Vector4f c = mvp * edges.corners[i].homogeneous();
    ok[i] = c.w() > 1e-6f && c.z() >= -c.w() && c.z() <= c.w();
    if (!ok[i]) continue;
    const float iw = 1.0f / c.w();
    screen[i] = {(c.x() * iw + 1.0f) * half_w, (c.y() * iw + 1.0f) * half_h, c.z() * iw};
  }
  auto at = [&](std::uint32_t c) { return Eigen::Vector2f(screen[c].x(), screen[c].y()); };
  // Faces: 1 front, -1 back (as the rasteriser's culling sees them), 0 not all in front;
  // and the square pixels each covers.
  std::vector<std::int8_t> facing(edges.faces.size());
  std::vector<float> area(edges.faces.size());
  for (std::size_t f = 0; f < edges.faces.size(); ++f) {
    const auto& c = edges.faces[f];
    if (!ok[c[0]] || !ok[c[1]] || !ok[c[2]]) continue;
    const float twice = cross2(at(c[1]) - at(c[0]), at(c[2]) - at(c[0]));
    facing[f] = (twice > 0.0f) != mirrored ? 1 : -1;
    area[f] = 0.5f * std::abs(twice);
  }
  auto visible = [&](std::uint32_t f) {
    return f != MeshEdges::kNoFace && facing[f] != 0 && (f >= edges.closed_faces || facing[f] > 0);
  };
  // Which side of the edge a face lies on (the sign of its third corner).
  auto side = [&](std::uint32_t face, const MeshEdges::Edge& e) {
    const auto& f = edges.faces[face];
    const std::uint32_t third =
        f[0] != e.a && f[0] != e.b ? f[0] : (f[1] != e.a && f[1] != e.b ? f[1] : f[2]);
    return cross2(at(e.b) - at(e.a), at(third) - at(e.a)) >= 0.0f ? 1.0f : -1.0f;
  };
  auto world = [&](std::uint32_t c) -> Eigen::Vector3f {
    return (p.linear * edges.corners[c].cast<double>() + p.offset).cast<float>();
  };
  // How squarely a face looks at the eye at corner c.
  auto squareness = [&](std::uint32_t face, std::uint32_t c) {
    const Eigen::Vector3f nrm = (normal_matrix * edges.shade(face, c).normal).normalized();
    const Eigen::Vector3f to_eye = (p.eye.cast<float>() - world(c)).normalized();
    return std::abs(nrm.dot(to_eye));
  };
  // The face whose colour shows just inside an outline carried by `carrier` on edge `from`
  // (kSliverPx2).
  auto inside_face = [&](std::uint32_t carrier, std::uint32_t from) {
    std::uint32_t f = carrier;
    for (int step = 0; step < kSliverSteps && area[f] < kSliverPx2; ++step) {
      std::uint32_t best = MeshEdges::kNoFace, via = from;
      for (std::uint32_t ei : edges.face_edges[f]) {
        if (ei == from) continue;
        const MeshEdges::Edge& across = edges.edges[ei];
        const std::uint32_t g = across.face[0] == f ? across.face[1] : across.face[0];
        if (visible(g) && (best == MeshEdges::kNoFace || area[g] > area[best])) {
          best = g;
          via = ei;
        }
      }
      if (best == MeshEdges::kNoFace) break;
      f = best;
      from = via;
    }
    return f;
  };
  for (std::uint32_t ei = 0; ei < edges.edges.size(); ++ei) {
    const MeshEdges::Edge& e = edges.edges[ei];
    if (!ok[e.a] || !ok[e.b]) continue;
    const bool v0 = visible(e.face[0]), v1 = visible(e.face[1]);
    if (!v0 && !v1) continue;
    std::uint32_t carrier = v0 ? e.face[0] : e.face[1];
    std::uint32_t shown = carrier;  // whose shading the line takes
    if (v0 && v1 && side(e.face[0], e) != side(e.face[1], e)) {
      // Faces on both sides: a crease or a change of colour, unless the shading runs on.
      if (e.smooth || p.outline_only) continue;
      // The squarer face carries its colour over the one seen more edge-on.
      if (squareness(e.face[1], e.a) > squareness(e.face[0], e.a)) carrier = shown = e.face[1];
    } else {
      // One face shows (an outline, a border) or both lie on one side (a fold).
      shown = inside_face(carrier, ei);
    }
    const Eigen::Vector2f pa = at(e.a), pb = at(e.b);
    const Eigen::Vector2f d = pb - pa;
    const float length = d.norm();
    if (length < 1e-4f) continue;
    const Eigen::Vector2f outward = Eigen::Vector2f(-d.y(), d.x()) * (-side(carrier, e) / length);
    // A one-pixel line half a pixel out, over the pixels just outside the edge.
    const float c = outward.dot(pa);
    // The shading at a corner of the edge: the carrier's own there, or the mean over the
    // corners of the face shown inside.
    MeshEdges::CornerShade inside{Eigen::Vector3f::Zero(), Eigen::Vector4f::Zero()};
    if (shown != carrier) {
      for (const MeshEdges::CornerShade& corner_shade : edges.shades[shown]) {
        inside.normal += corner_shade.normal;
        inside.color += corner_shade.color / 3.0f;
      }
    }
    auto vertex = [&](std::uint32_t corner, const Eigen::Vector2f& px) {
      const MeshEdges::CornerShade& s = shown == carrier ? edges.shade(carrier, corner) : inside;
      const Eigen::Vector3f base = s.color.head<3>() * (1.0f - p.tint.w()) + p.tint.head<3>() * p.tint.w();
      const Eigen::Vector3f w = world(corner), nrm = normal_matrix * s.normal;
      EdgeVertex v{};
      v.ndc[0] = px.x() / half_w - 1.0f;
      v.ndc[1] = px.y() / half_h - 1.0f;
      v.ndc[2] = std::max(-1.0f, screen[corner].z() - kEdgeDepthBias);
      for (int k = 0; k < 3; ++k) {
        v.world[k] = w[k];
        v.normal[k] = nrm[k];
        v.color[k] = base[k];
      }
      v.color[3] = p.alpha;
      for (int k = 0; k < 4; ++k) v.glow[k] = p.glow[k];
      v.edge[0] = outward.x();
      v.edge[1] = outward.y();
      v.edge[2] = c;
      return v;
    };
    out->push_back(vertex(e.a, pa + 0.5f * outward));
    out->push_back(vertex(e.b, pb + 0.5f * outward));
  }
}

}  // namespace attiscope::render::detail
