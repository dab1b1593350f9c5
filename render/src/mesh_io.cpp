// mesh_io.cpp: a user's model from OBJ (tinyobjloader) or STL (our own reader, ASCII and
// binary), normalisation, and the ray-triangle test behind picking.
#include <tiny_obj_loader.h>

#include <algorithm>
#include <cctype>
#include <charconv>
#include <cmath>
#include <cstring>
#include <fstream>
#include <iterator>
#include <limits>
#include <sstream>

#include "attiscope/render/mesh.hpp"
#include "mesh_builder.hpp"

namespace attiscope::render {

namespace {

/// The colour of a user's model (no materials are read).
const detail::Color kUserModelColor = detail::rgb(0.78f, 0.80f, 0.84f);
/// Size of a binary STL header and of one triangle record.
constexpr std::size_t kStlHeaderBytes = 80;
constexpr std::size_t kStlTriangleBytes = 50;
/// Largest model accepted, in triangles (the software renderer draws every one each frame).
constexpr std::size_t kMaxTriangles = 2'000'000;
/// Parallel rays and triangles (|det| below this) do not hit.
constexpr double kRayEpsilon = 1e-12;

std::string lower(std::string_view s) {
  std::string out(s);
  std::transform(out.begin(), out.end(), out.begin(), [](unsigned char c) { return std::tolower(c); });
  return out;
}

bool finite3(const Eigen::Vector3d& v) {
  return std::isfinite(v.x()) && std::isfinite(v.y()) && std::isfinite(v.z());
}

void add_face(Mesh* mesh, const Eigen::Vector3d& a, const Eigen::Vector3d& b, const Eigen::Vector3d& c) {
  detail::MeshBuilder builder(mesh);
  Eigen::Vector3d n = (b - a).cross(c - a);
  if (n.norm() == 0.0) n = Eigen::Vector3d::UnitZ();  // degenerate: keep it, it draws as nothing
  builder.triangle(builder.vertex(a, n, kUserModelColor), builder.vertex(b, n, kUserModelColor),
                   builder.vertex(c, n, kUserModelColor));
}

// --- OBJ ---------------------------------------------------------------------------------

// tinyobjloader reads leniently (a bad number becomes 0); check the lines it uses first, so
// a malformed file is an error that names its line and column.
std::optional<Error> check_obj_text(std::string_view text) {
  std::size_t vertices = 0;
  int line_no = 0;
  std::size_t pos = 0;
  while (pos <= text.size()) {
    const std::size_t end = std::min(text.find('\n', pos), text.size());
    std::string_view line = text.substr(pos, end - pos);
    ++line_no;
    pos = end + 1;
    if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
    std::size_t i = 0;
    auto skip_space = [&] {
      while (i < line.size() && (line[i] == ' ' || line[i] == '\t')) ++i;
    };
    skip_space();
    if (i >= line.size() || line[i] == '#') {
      if (end == text.size()) break;
      continue;
    }
    const std::size_t kw_start = i;
    while (i < line.size() && line[i] != ' ' && line[i] != '\t') ++i;
    const std::string_view kw = line.substr(kw_start, i - kw_start);
    auto column = [&](std::size_t at) { return static_cast<int>(at) + 1; };
    if (kw == "v") {
      for (int k = 0; k < 3; ++k) {
        skip_space();
        const std::size_t start = i;
        double value = 0.0;
        const auto res = std::from_chars(line.data() + i, line.data() + line.size(), value);
        if (res.ec != std::errc() || !std::isfinite(value)) {
          return Error("a vertex needs three finite numbers (v X Y Z)", line_no, column(start));
        }
        i = static_cast<std::size_t>(res.ptr - line.data());
      }
      ++vertices;
    } else if (kw == "f") {
      int corners = 0;
      for (;;) {
        skip_space();
        if (i >= line.size()) break;
        const std::size_t start = i;
        long index = 0;
        const auto res = std::from_chars(line.data() + i, line.data() + line.size(), index);
        if (res.ec != std::errc())
          return Error("a face corner must start with a vertex number", line_no, column(start));
        const long resolved = index < 0 ? static_cast<long>(vertices) + index + 1 : index;
        if (index == 0 || resolved < 1 || resolved > static_cast<long>(vertices)) {
          return Error("face refers to vertex " + std::to_string(index) + ", but only " +
                           std::to_string(vertices) + " vertices are defined above it",
                       line_no, column(start));
        }
        i = static_cast<std::size_t>(res.ptr - line.data());
        while (i < line.size() && line[i] != ' ' && line[i] != '\t') ++i;  // "/vt/vn" part
        ++corners;
      }
      if (corners < 3) return Error("a face needs at least three corners", line_no, column(kw_start));
    }
    if (end == text.size()) break;
  }
  return std::nullopt;
}

Expected<Mesh> load_obj(std::string_view data) {
  if (auto err = check_obj_text(data)) return *err;
  tinyobj::ObjReaderConfig config;
  config.triangulate = true;
  config.vertex_color = false;
  tinyobj::ObjReader reader;
  if (!reader.ParseFromString(std::string(data), std::string(), config)) {
    return Error("OBJ: " + (reader.Error().empty() ? std::string("could not be read") : reader.Error()));
  }
  const tinyobj::attrib_t& attrib = reader.GetAttrib();
  Mesh mesh;
  auto position = [&](int index) {
    const std::size_t k = static_cast<std::size_t>(index) * 3;
    return Eigen::Vector3d(attrib.vertices[k], attrib.vertices[k + 1], attrib.vertices[k + 2]);
  };
  for (const tinyobj::shape_t& shape : reader.GetShapes()) {
    const auto& idx = shape.mesh.indices;
    for (std::size_t i = 0; i + 2 < idx.size(); i += 3) {
      const int a = idx[i].vertex_index, b = idx[i + 1].vertex_index, c = idx[i + 2].vertex_index;
      const int n = static_cast<int>(attrib.vertices.size() / 3);
      if (a < 0 || b < 0 || c < 0 || a >= n || b >= n || c >= n)
        return Error("OBJ: a face refers to a missing vertex");
      add_face(&mesh, position(a), position(b), position(c));
    }
  }
  if (mesh.indices.empty()) return Error("OBJ: the file has no faces (lines starting with 'f')");
  return mesh;
}

// --- STL ---------------------------------------------------------------------------------

std::uint32_t read_u32(const unsigned char* p) {
  return static_cast<std::uint32_t>(p[0]) | static_cast<std::uint32_t>(p[1]) << 8 |
         static_cast<std::uint32_t>(p[2]) << 16 | static_cast<std::uint32_t>(p[3]) << 24;
}

float read_f32(const unsigned char* p) {
  const std::uint32_t bits = read_u32(p);
  float f;
  std::memcpy(&f, &bits, sizeof f);
  return f;
}

Expected<Mesh> load_stl_binary(std::string_view data) {
  if (data.size() < kStlHeaderBytes + 4) return Error("STL: the file is too short for a binary STL header");
  const auto* bytes = reinterpret_cast<const unsigned char*>(data.data());
  const std::uint32_t count = read_u32(bytes + kStlHeaderBytes);
  const std::size_t expected = kStlHeaderBytes + 4 + static_cast<std::size_t>(count) * kStlTriangleBytes;
  if (count == 0) return Error("STL: the binary file says it holds no triangles");
  if (count > kMaxTriangles)
    return Error("STL: " + std::to_string(count) + " triangles is more than attiscope draws");
  if (data.size() < expected) {
    return Error("STL: the binary header promises " + std::to_string(count) + " triangles (" +
                 std::to_string(expected) + " bytes) but the file has " + std::to_string(data.size()) +
                 " bytes");
  }
  Mesh mesh;
  mesh.vertices.reserve(static_cast<std::size_t>(count) * 3);
  for (std::uint32_t t = 0; t < count; ++t) {
    const unsigned char* rec = bytes + kStlHeaderBytes + 4 + static_cast<std::size_t>(t) * kStlTriangleBytes;
    Eigen::Vector3d v[3];
    for (int k = 0; k < 3; ++k) {
      const unsigned char* p = rec + 12 + 12 * k;
      v[k] = Eigen::Vector3d(read_f32(p), read_f32(p + 4), read_f32(p + 8));
      if (!finite3(v[k]))
        return Error("STL: triangle " + std::to_string(t + 1) + " has a coordinate that is not finite");
    }
    add_face(&mesh, v[0], v[1], v[2]);
  }
  return mesh;
}

Expected<Mesh> load_stl_ascii(std::string_view data) {
  // Tokens with their line numbers: solid NAME, then facets of
  // "facet normal nx ny nz / outer loop / vertex x y z (x3) / endloop / endfacet", endsolid.
  Mesh mesh;
  int line = 1;
  std::size_t i = 0;
  auto next = [&](int* token_line) -> std::string_view {
    while (i < data.size() && std::isspace(static_cast<unsigned char>(data[i]))) {
      if (data[i] == '\n') ++line;
      ++i;
    }
    const std::size_t start = i;
    while (i < data.size() && !std::isspace(static_cast<unsigned char>(data[i]))) ++i;
    *token_line = line;
    return data.substr(start, i - start);
  };
  int tl = 0;
  if (lower(next(&tl)) != "solid") return Error("STL: an ASCII STL starts with 'solid'", 1, 1);
  // The rest of the first line is the name.
  while (i < data.size() && data[i] != '\n') ++i;
  auto expect = [&](const char* word) -> std::optional<Error> {
    int l = 0;
    const std::string_view t = next(&l);
    if (lower(t) != word) {
      return Error("STL: expected '" + std::string(word) + "', found '" +
                       std::string(t.empty() ? "end of file" : t) + "'",
                   l, 0);
    }
    return std::nullopt;
  };
  auto number = [&](double* out) -> std::optional<Error> {
    int l = 0;
    const std::string_view t = next(&l);
    const auto res = std::from_chars(t.data(), t.data() + t.size(), *out);
    if (t.empty() || res.ec != std::errc() || res.ptr != t.data() + t.size() || !std::isfinite(*out)) {
      return Error("STL: expected a number, found '" + std::string(t.empty() ? "end of file" : t) + "'", l,
                   0);
    }
    return std::nullopt;
  };
  for (;;) {
    int l = 0;
    const std::string word = lower(next(&l));
    if (word == "endsolid") break;
    if (word != "facet") {
      return Error("STL: expected 'facet' or 'endsolid', found '" +
                       (word.empty() ? std::string("end of file") : word) + "'",
                   l, 0);
    }
    if (auto e = expect("normal")) return *e;
    double ignored = 0.0;
    for (int k = 0; k < 3; ++k) {
      if (auto e = number(&ignored)) return *e;
    }
    if (auto e = expect("outer")) return *e;
    if (auto e = expect("loop")) return *e;
    Eigen::Vector3d v[3];
    for (int k = 0; k < 3; ++k) {
      if (auto e = expect("vertex")) return *e;
      for (int c = 0; c < 3; ++c) {
        if (auto e = number(&v[k][c])) return *e;
      }
    }
    if (auto e = expect("endloop")) return *e;
    if (auto e = expect("endfacet")) return *e;
    add_face(&mesh, v[0], v[1], v[2]);
    if (mesh.triangle_count() > kMaxTriangles) return Error("STL: more triangles than attiscope draws");
  }
  if (mesh.indices.empty()) return Error("STL: the file has no facets");
  return mesh;
}

Expected<Mesh> load_stl(std::string_view data) {
  // A binary STL may also begin with "solid" in its header; the size rule decides: a
  // binary file is exactly 84 + 50 n bytes for the n its header gives.
  if (data.size() >= kStlHeaderBytes + 4) {
    const std::uint32_t count =
        read_u32(reinterpret_cast<const unsigned char*>(data.data()) + kStlHeaderBytes);
    if (data.size() == kStlHeaderBytes + 4 + static_cast<std::size_t>(count) * kStlTriangleBytes) {
      return load_stl_binary(data);
    }
  }
  // Otherwise text that starts with "solid" is ASCII; anything holding a NUL byte is a
  // (damaged) binary file, whose header check gives the clearer message.
  std::size_t s = 0;
  while (s < data.size() && std::isspace(static_cast<unsigned char>(data[s]))) ++s;
  const bool text = data.find('\0') == std::string_view::npos;
  if (text && lower(data.substr(s, 5)) == "solid") return load_stl_ascii(data);
  return load_stl_binary(data);
}

}  // namespace

void normalise_mesh(Mesh* mesh, double half_size) {
  if (mesh->vertices.empty()) return;
  Eigen::Vector3d lo = Eigen::Vector3d::Constant(std::numeric_limits<double>::infinity());
  Eigen::Vector3d hi = -lo;
  for (const Vertex& v : mesh->vertices) {
    const Eigen::Vector3d p(v.position[0], v.position[1], v.position[2]);
    lo = lo.cwiseMin(p);
    hi = hi.cwiseMax(p);
  }
  const Eigen::Vector3d centre = 0.5 * (lo + hi);
  const double extent = 0.5 * (hi - lo).maxCoeff();
  const double scale = extent > 0.0 ? half_size / extent : 1.0;
  for (Vertex& v : mesh->vertices) {
    for (int k = 0; k < 3; ++k)
      v.position[k] = static_cast<float>((static_cast<double>(v.position[k]) - centre[k]) * scale);
  }
}

Expected<Mesh> load_mesh_data(std::string_view data, std::string_view kind) {
  const std::string k = lower(kind);
  Expected<Mesh> mesh = k == "obj"   ? load_obj(data)
                        : k == "stl" ? load_stl(data)
                                     : Expected<Mesh>(Error("a model file must be .obj or .stl"));
  if (!mesh) return mesh;
  normalise_mesh(&mesh.value());
  return mesh;
}

Expected<Mesh> load_mesh_file(const std::string& path) {
  const std::size_t dot = path.rfind('.');
  const std::string ext = dot == std::string::npos ? std::string() : lower(path.substr(dot + 1));
  if (ext != "obj" && ext != "stl") {
    return Error("'" + path + "': a model file must end in .obj or .stl");
  }
  std::ifstream in(path, std::ios::binary);
  if (!in) return Error("'" + path + "': cannot be opened");
  const std::string data((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  auto mesh = load_mesh_data(data, ext);
  if (!mesh) {
    Error e = mesh.error();
    e.field = path;
    return e;
  }
  return mesh;
}

std::optional<double> ray_mesh_hit(const Mesh& mesh, const Eigen::Vector3d& origin,
                                   const Eigen::Vector3d& direction) {
  std::optional<double> best;
  auto pos = [&](std::uint32_t i) {
    const auto& p = mesh.vertices[i].position;
    return Eigen::Vector3d(p[0], p[1], p[2]);
  };
  for (std::size_t t = 0; t + 2 < mesh.indices.size(); t += 3) {
    const Eigen::Vector3d v0 = pos(mesh.indices[t]), v1 = pos(mesh.indices[t + 1]),
                          v2 = pos(mesh.indices[t + 2]);
    const Eigen::Vector3d e1 = v1 - v0, e2 = v2 - v0;
    const Eigen::Vector3d p = direction.cross(e2);
    const double det = e1.dot(p);
    if (std::abs(det) < kRayEpsilon) continue;
    const double inv = 1.0 / det;
    const Eigen::Vector3d s = origin - v0;
    const double u = s.dot(p) * inv;
    if (u < 0.0 || u > 1.0) continue;
    const Eigen::Vector3d q = s.cross(e1);
    const double v = direction.dot(q) * inv;
    if (v < 0.0 || u + v > 1.0) continue;
    const double dist = e2.dot(q) * inv;
    if (dist > 0.0 && (!best || dist < *best)) best = dist;
  }
  return best;
}

}  // namespace attiscope::render
