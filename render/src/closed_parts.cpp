// closed_parts.cpp: closed parts of a mesh (see closed_parts.hpp).
#include "closed_parts.hpp"

#include <array>
#include <cmath>
#include <map>
#include <numeric>
#include <unordered_map>
#include <utility>

#include <Eigen/Geometry>

namespace attiscope::render::detail {

namespace {

/// Union-find over welded corners.
struct Parts {
  std::vector<std::uint32_t> parent;
  std::uint32_t find(std::uint32_t a) {
    while (parent[a] != a) a = parent[a] = parent[parent[a]];
    return a;
  }
  void join(std::uint32_t a, std::uint32_t b) { parent[find(a)] = find(b); }
};

}  // namespace

WeldKey weld_key(const std::array<float, 3>& position) {
  WeldKey k;
  for (int a = 0; a < 3; ++a) k[a] = std::llround(static_cast<double>(position[a]) / kWeldTolerance);
  return k;
}

std::size_t WeldKeyHash::operator()(const WeldKey& k) const {
  std::size_t h = 1469598103934665603ull;  // FNV-1a's offset basis and prime
  for (long long v : k) h = (h ^ static_cast<std::size_t>(v)) * 1099511628211ull;
  return h;
}

ClosedFirst closed_parts_first(const Mesh& mesh) {
  ClosedFirst out;
  const std::size_t n_tri = mesh.indices.size() / 3;
  // Weld corners: one id per position (on a grid of kWeldTolerance).
  std::unordered_map<WeldKey, std::uint32_t, WeldKeyHash> ids;
  std::vector<std::uint32_t> corner(mesh.vertices.size());
  for (std::size_t i = 0; i < mesh.vertices.size(); ++i)
    corner[i] = ids.emplace(weld_key(mesh.vertices[i].position), static_cast<std::uint32_t>(ids.size()))
                    .first->second;
  Parts parts;
  parts.parent.resize(ids.size());
  std::iota(parts.parent.begin(), parts.parent.end(), 0u);
  auto c = [&](std::size_t t, int k) { return corner[mesh.indices[3 * t + k]]; };
  for (std::size_t t = 0; t < n_tri; ++t) {
    parts.join(c(t, 0), c(t, 1));
    parts.join(c(t, 1), c(t, 2));
  }
  // Per part: each undirected edge's balance of directions (+1 one way, -1 the other) and
  // the signed volume (sum of the tetrahedra from the origin, six times over).
  std::map<std::pair<std::uint32_t, std::uint32_t>, int> balance;
  std::unordered_map<std::uint32_t, double> volume;
  for (std::size_t t = 0; t < n_tri; ++t) {
    const std::uint32_t a = c(t, 0), b = c(t, 1), d = c(t, 2);
    if (a == b || b == d || d == a) continue;  // degenerate: adds no edge
    for (auto [p, q] : {std::pair{a, b}, std::pair{b, d}, std::pair{d, a}})
      balance[{std::min(p, q), std::max(p, q)}] += p < q ? 1 : -1;
    auto pos = [&](int k) {
      const auto& v = mesh.vertices[mesh.indices[3 * t + k]].position;
      return Eigen::Vector3d(v[0], v[1], v[2]);
    };
    volume[parts.find(a)] += pos(0).dot(pos(1).cross(pos(2)));
  }
  std::unordered_map<std::uint32_t, bool> closed;
  for (const auto& [part, v] : volume) closed[part] = v > 0.0;
  for (const auto& [edge, sum] : balance)
    if (sum != 0) closed[parts.find(edge.first)] = false;
  out.indices.reserve(mesh.indices.size());
  std::vector<std::uint32_t> rest;
  for (std::size_t t = 0; t < n_tri; ++t) {
    auto it = closed.find(parts.find(c(t, 0)));
    std::vector<std::uint32_t>& to = it != closed.end() && it->second ? out.indices : rest;
    to.insert(to.end(), mesh.indices.begin() + 3 * t, mesh.indices.begin() + 3 * t + 3);
  }
  out.closed_count = out.indices.size();
  std::unordered_map<std::uint32_t, Eigen::AlignedBox3d> boxes;
  for (std::size_t i = 0; i < mesh.indices.size(); ++i) {
    const auto& v = mesh.vertices[mesh.indices[i]].position;
    boxes[parts.find(corner[mesh.indices[i]])].extend(Eigen::Vector3d(v[0], v[1], v[2]));
    if (boxes.size() > kMaxPartBounds) break;
  }
  if (boxes.size() > kMaxPartBounds) {
    Eigen::AlignedBox3d all;
    for (std::uint32_t i : mesh.indices) {
      const auto& v = mesh.vertices[i].position;
      all.extend(Eigen::Vector3d(v[0], v[1], v[2]));
    }
    out.part_bounds = {all};
  } else {
    for (const auto& [part, box] : boxes) out.part_bounds.push_back(box);
  }
  out.indices.insert(out.indices.end(), rest.begin(), rest.end());
  return out;
}

}  // namespace attiscope::render::detail
