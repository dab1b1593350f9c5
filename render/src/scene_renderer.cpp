// scene_renderer.cpp: the OpenGL 3.3 core scene renderer (see scene_renderer.hpp).
#include "attiscope/render/scene_renderer.hpp"

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstring>
#include <future>
#include <map>
#include <optional>
#include <string>

#include <Eigen/Geometry>

#include "attiscope/render/gimbal.hpp"
#include "chain_overlay.hpp"
#include "closed_parts.hpp"
#include "edge_strips.hpp"
#include "font.hpp"
#include "gl.hpp"
#include "image_text.hpp"
#include "mesh_builder.hpp"
#include "overlays.hpp"
#include "shaders.hpp"
#include "smooth_tiles.hpp"

namespace attiscope::render {

namespace {

constexpr double kPi = 3.14159265358979323846;
/// Size the label font is baked at, and the label size on screen per pixel of view height.
constexpr float kFontBakePx = 44.0f;
constexpr float kLabelPerViewHeight = 1.0f / 21.0f;
constexpr float kLabelMinPx = 16.0f, kLabelMaxPx = 44.0f;
/// Clear space kept around a label when labels are placed apart, pixels.
constexpr double kLabelAirPx = 4.0;
/// Half-size of the ground grid, in scene units.
constexpr float kGridExtent = 6.0f;
/// Ring tube radius, segments around the ring and around the tube.
constexpr double kRingTube = 0.034;
constexpr int kRingSegments = 56, kRingSides = 6;
/// Translucency of the reference ghost, and how much of its colour is the ghost tint.
constexpr float kGhostAlpha = 0.36f;
constexpr float kGhostTint = 0.55f;
constexpr float kHighlightGlow = 0.45f;
/// Alpha of the scene's pixels no mesh covers: one step below opaque in 8 bits (see
/// kSmoothFragment's kMeshCover).
constexpr float kUncoveredAlpha = 254.0f / 255.0f;
/// Strength of the key light's highlight on the meshes.
constexpr float kSpecular = 0.22f;

Eigen::Matrix4f to_gl(const Eigen::Matrix4d& m) {
  return m.cast<float>();
}

/// A mesh on the GPU. Its closed parts' triangles come first (closed_parts.hpp): those are
/// drawn with back faces culled, which halves their triangles' rasterising and spares the
/// shading of hidden back faces drawn before the front ones; the rest is drawn two-sided.
struct GpuMesh {
  gl::VertexArray vao;
  gl::Buffer vbo, ebo;
  GLsizei count = 0;
  GLsizei closed_count = 0;
  std::size_t triangles = 0;
  /// What it covers on the screen, for the smoothing pass (smooth_tiles.hpp).
  detail::Footprint::Shape shape = detail::Footprint::Shape::Blob;
  Eigen::AlignedBox3d box;                       ///< bounds in its own coordinates
  std::vector<Eigen::AlignedBox3d> part_bounds;  ///< closed_parts.hpp
  double ring_radius = 0.0, tube_radius = 0.0;
  detail::MeshEdges edges;  ///< for the edge strips (edge_strips.hpp)
};

/// A w x h colour texture stored as BGRA: given BGRA data Mesa stores it so, the layout of an
/// X window's back buffer, so the blit of a view into the window is a row copy; from an RGBA
/// texture it is a shaded quad (measured with callgrind: more instructions than the whole
/// view). Clamped at the edges, filtered as asked.
gl::Texture make_bgra_texture(int w, int h, GLint filter) {
  gl::Texture t = gl::make_texture();
  glBindTexture(GL_TEXTURE_2D, t.get());
  glTexImage2D(GL_TEXTURE_2D, 0, GL_RGBA8, w, h, 0, GL_BGRA, GL_UNSIGNED_BYTE, nullptr);
  glTexParameteri(GL_TEXTURE_2D, GL_TEXTURE_MIN_FILTER, filter);
  glTexParameteri(GL_TEXTURE_2D, GL_TEXTURE_MAG_FILTER, filter);
  glTexParameteri(GL_TEXTURE_2D, GL_TEXTURE_WRAP_S, GL_CLAMP_TO_EDGE);
  glTexParameteri(GL_TEXTURE_2D, GL_TEXTURE_WRAP_T, GL_CLAMP_TO_EDGE);
  glBindTexture(GL_TEXTURE_2D, 0);
  return t;
}

GpuMesh upload(const Mesh& mesh) {
  GpuMesh g;
  g.vao = gl::make_vertex_array();
  g.vbo = gl::make_buffer();
  g.ebo = gl::make_buffer();
  glBindVertexArray(g.vao.get());
  glBindBuffer(GL_ARRAY_BUFFER, g.vbo.get());
  glBufferData(GL_ARRAY_BUFFER, static_cast<GLsizeiptr>(mesh.vertices.size() * sizeof(Vertex)),
               mesh.vertices.data(), GL_STATIC_DRAW);
  const detail::ClosedFirst order = detail::closed_parts_first(mesh);
  glBindBuffer(GL_ELEMENT_ARRAY_BUFFER, g.ebo.get());
  glBufferData(GL_ELEMENT_ARRAY_BUFFER, static_cast<GLsizeiptr>(order.indices.size() * sizeof(std::uint32_t)),
               order.indices.data(), GL_STATIC_DRAW);
  glEnableVertexAttribArray(0);
  glVertexAttribPointer(0, 3, GL_FLOAT, GL_FALSE, sizeof(Vertex),
                        reinterpret_cast<const void*>(offsetof(Vertex, position)));
  glEnableVertexAttribArray(1);
  glVertexAttribPointer(1, 3, GL_FLOAT, GL_FALSE, sizeof(Vertex),
                        reinterpret_cast<const void*>(offsetof(Vertex, normal)));
  glEnableVertexAttribArray(2);
  glVertexAttribPointer(2, 4, GL_FLOAT, GL_FALSE, sizeof(Vertex),
                        reinterpret_cast<const void*>(offsetof(Vertex, color)));
  glBindVertexArray(0);
  g.count = static_cast<GLsizei>(order.indices.size());
  g.closed_count = static_cast<GLsizei>(order.closed_count);
  g.part_bounds = order.part_bounds;
  g.edges = detail::find_mesh_edges(mesh, order.indices, order.closed_count);
  for (const Vertex& v : mesh.vertices)
    g.box.extend(Eigen::Vector3d(v.position[0], v.position[1], v.position[2]));
  g.triangles = mesh.triangle_count();
  gl::check("mesh upload");
  return g;
}

/// A colour target with depth, for the scene before the post pass or for export.
struct Target {
  gl::Framebuffer fbo;
  gl::Texture color;
  gl::Renderbuffer depth;
  int width = 0, height = 0;
  int slot = -1;        ///< the prepare() slot it serves (-1: draw())
  std::string picture;  ///< fingerprint of the scene the target holds (empty: none)
  /// The smoothed picture (made on first use).
  gl::Framebuffer smooth_fbo;
  gl::Texture smooth;
  bool smoothed = false;                      ///< `smooth` holds the smoothed `picture`
  std::vector<detail::Footprint> footprints;  ///< of the meshes in `picture`
  /// The tiles of the footprints (smooth_tiles.hpp): outside them `picture` is the ground.
  std::vector<detail::PixelBox> tiles;
  /// What is known of `color` and `smooth` while the camera holds still: the ground picture
  /// (its key) with something else only inside `color_changed` / `smooth_changed`, so
  /// only those need to be put back, not the whole target copied (empty key: not known).
  std::string color_on_ground, smooth_on_ground;
  std::vector<detail::PixelBox> color_changed, smooth_changed;

  void ensure(int w, int h) {
    if (fbo && w == width && h == height) return;
    width = w;
    height = h;
    picture.clear();
    smoothed = false;
    ground_key.clear();
    color_on_ground.clear();
    smooth_on_ground.clear();
    ground_fbo = gl::Framebuffer();
    ground = gl::Texture();
    smooth_fbo = gl::Framebuffer();
    smooth = gl::Texture();
    fbo = gl::make_framebuffer();
    color = make_bgra_texture(w, h, GL_LINEAR);
    depth = gl::make_renderbuffer();
    glBindRenderbuffer(GL_RENDERBUFFER, depth.get());
    glRenderbufferStorage(GL_RENDERBUFFER, GL_DEPTH24_STENCIL8, w, h);
    glBindFramebuffer(GL_FRAMEBUFFER, fbo.get());
    glFramebufferTexture2D(GL_FRAMEBUFFER, GL_COLOR_ATTACHMENT0, GL_TEXTURE_2D, color.get(), 0);
    glFramebufferRenderbuffer(GL_FRAMEBUFFER, GL_DEPTH_STENCIL_ATTACHMENT, GL_RENDERBUFFER, depth.get());
    gl::check("target allocation");
  }

  /// The background with the ground grid, kept while the camera stays (the body turning
  /// does not change it) and copied in instead of a clear and the grid's strips.
  gl::Framebuffer ground_fbo;
  gl::Texture ground;
  std::string ground_key;  ///< fingerprint of what `ground` holds (empty: none)

  void ensure_ground() {
    if (ground_fbo) return;
    ground = make_bgra_texture(width, height, GL_NEAREST);
    ground_fbo = gl::make_framebuffer();
    glBindFramebuffer(GL_FRAMEBUFFER, ground_fbo.get());
    glFramebufferTexture2D(GL_FRAMEBUFFER, GL_COLOR_ATTACHMENT0, GL_TEXTURE_2D, ground.get(), 0);
    gl::check("ground target allocation");
  }

  void ensure_smooth() {
    if (smooth_fbo) return;
    smooth = make_bgra_texture(width, height, GL_NEAREST);
    smooth_fbo = gl::make_framebuffer();
    glBindFramebuffer(GL_FRAMEBUFFER, smooth_fbo.get());
    glFramebufferTexture2D(GL_FRAMEBUFFER, GL_COLOR_ATTACHMENT0, GL_TEXTURE_2D, smooth.get(), 0);
    gl::check("smoothing target allocation");
  }
};

/// Uniform locations of the mesh program.
struct MeshUniforms {
  GLint model, normal_matrix, view_proj, eye, up, key, fill, tint, alpha, glow, half, spec;
};

/// Uniform locations of the edge strip program.
struct EdgeUniforms {
  GLint eye, up, key, fill, half, specular;
};

struct TextVertex {
  float x, y, u, v;
  float r, g, b, a;
};

Eigen::Vector3f vec(const std::array<float, 3>& a) {
  return {a[0], a[1], a[2]};
}

/// Columns (u, v, d) with d along `dir`: a frame whose z axis is `dir`.
Eigen::Matrix3d frame_along(const Eigen::Vector3d& dir) {
  Eigen::Vector3d u, v;
  const Eigen::Vector3d d = dir.normalized();
  detail::orthonormal_basis(d, &u, &v);
  Eigen::Matrix3d m;
  m << u, v, d;
  return m;
}

/// One end of a grid segment strip (see kGridVertex).
struct GridVertex {
  float u, v, ou, ov;
  float side, half_width, alpha;
  float kind;
};

/// The ground grid: minor lines every kGridMinor, major every kGridMajor, and the world x and
/// y axes through the world triad's foot (kWorldTriadOffset along both ground axes), each
/// cut into short segments so the fade and the near-plane clip stay smooth.
GpuMesh build_grid() {
  constexpr double kGridMinor = 0.5, kGridMajor = 1.0, kSegment = 3.0;
  // A segment whose two ends have faded below this alpha is left out (it would change no
  // pixel by more than one level in 8 bits, but a software rasteriser still shades it).
  constexpr float kInvisibleAlpha = 0.01f;
  auto faded = [](const Eigen::Vector2d& p, float alpha) {  // kGridVertex's fade, on the CPU
    const double t =
        std::clamp((p.norm() - 0.45 * double(kGridExtent)) / (0.55 * double(kGridExtent)), 0.0, 1.0);
    return alpha * static_cast<float>(1.0 - t * t * (3.0 - 2.0 * t));
  };
  constexpr float kMinorHalf = 0.5f, kMajorHalf = 0.7f, kAxisHalf = 1.2f;
  constexpr float kMinorAlpha = 0.22f, kMajorAlpha = 0.45f, kAxisAlpha = 0.85f;
  std::vector<GridVertex> v;
  auto segment = [&](Eigen::Vector2d a, Eigen::Vector2d b, float half, float alpha, float kind) {
    // The world axes (kind > 0) may be mirrored in the shader: always kept.
    if (kind < 0.5f && std::max(faded(a, alpha), faded(b, alpha)) < kInvisibleAlpha) return;
    const GridVertex a0{float(a.x()), float(a.y()), float(b.x()), float(b.y()), -1.0f, half, alpha, kind};
    const GridVertex a1{float(a.x()), float(a.y()), float(b.x()), float(b.y()), 1.0f, half, alpha, kind};
    // The far end's offset uses the same direction, so its "other" is the near end and its
    // side flips to stay on the same side of the line.
    const GridVertex b0{float(b.x()), float(b.y()), float(a.x()), float(a.y()), 1.0f, half, alpha, kind};
    const GridVertex b1{float(b.x()), float(b.y()), float(a.x()), float(a.y()), -1.0f, half, alpha, kind};
    v.insert(v.end(), {a0, a1, b1, a0, b1, b0});
  };
  auto line = [&](Eigen::Vector2d from, Eigen::Vector2d to, float half, float alpha, float kind) {
    const int n = std::max(1, static_cast<int>(std::ceil((to - from).norm() / kSegment)));
    for (int i = 0; i < n; ++i) {
      segment(from + (to - from) * (double(i) / n), from + (to - from) * (double(i + 1) / n), half, alpha,
              kind);
    }
  };
  const double e = kGridExtent;
  const int steps = static_cast<int>(std::lround(e / kGridMinor));
  const double foot = kWorldTriadOffset;
  for (int i = -steps; i <= steps; ++i) {
    const double c = i * kGridMinor;
    const bool major = std::abs(std::remainder(c, kGridMajor)) < 1e-9;
    const float half = major ? kMajorHalf : kMinorHalf, alpha = major ? kMajorAlpha : kMinorAlpha;
    line({c, -e}, {c, e}, half, alpha, 0.0f);
    line({-e, c}, {e, c}, half, alpha, 0.0f);
  }
  line({foot, foot}, {e, foot}, kAxisHalf, kAxisAlpha, 1.0f);
  line({foot, foot}, {foot, e}, kAxisHalf, kAxisAlpha, 2.0f);
  GpuMesh g;
  g.vao = gl::make_vertex_array();
  g.vbo = gl::make_buffer();
  glBindVertexArray(g.vao.get());
  glBindBuffer(GL_ARRAY_BUFFER, g.vbo.get());
  glBufferData(GL_ARRAY_BUFFER, static_cast<GLsizeiptr>(v.size() * sizeof(GridVertex)), v.data(),
               GL_STATIC_DRAW);
  const GLsizei stride = sizeof(GridVertex);
  glEnableVertexAttribArray(0);
  glVertexAttribPointer(0, 2, GL_FLOAT, GL_FALSE, stride,
                        reinterpret_cast<const void*>(offsetof(GridVertex, u)));
  glEnableVertexAttribArray(1);
  glVertexAttribPointer(1, 2, GL_FLOAT, GL_FALSE, stride,
                        reinterpret_cast<const void*>(offsetof(GridVertex, ou)));
  glEnableVertexAttribArray(2);
  glVertexAttribPointer(2, 3, GL_FLOAT, GL_FALSE, stride,
                        reinterpret_cast<const void*>(offsetof(GridVertex, side)));
  glEnableVertexAttribArray(3);
  glVertexAttribPointer(3, 1, GL_FLOAT, GL_FALSE, stride,
                        reinterpret_cast<const void*>(offsetof(GridVertex, kind)));
  glBindVertexArray(0);
  g.count = static_cast<GLsizei>(v.size());
  g.triangles = v.size() / 3;
  gl::check("grid upload");
  return g;
}

/// Everything of a SceneState that shows in the offscreen scene, as bytes: two states with
/// the same fingerprint (and the same palette and meshes) give the same picture, so a view
/// whose pose, camera, size and overlays did not change is not drawn again.
class Fingerprint {
 public:
  void add(double v) { bytes_.append(reinterpret_cast<const char*>(&v), sizeof v); }
  void add(const std::string& t) {
    add(static_cast<double>(t.size()));
    bytes_ += t;
  }
  void add(const Eigen::Vector3d& v) {
    for (int i = 0; i < 3; ++i) add(v[i]);
  }
  void add(const Rotation& r) {
    const Eigen::Quaterniond q = r.stored_quaternion();
    add(q.w());
    add(q.x());
    add(q.y());
    add(q.z());
  }
  const std::string& bytes() const { return bytes_; }

 private:
  std::string bytes_;
};

std::string scene_fingerprint(const SceneState& st, const Palette& palette,
                              std::uint64_t user_mesh_generation) {
  Fingerprint f;
  f.add(st.world_R_body);
  f.add(st.ghost_world_R_body ? 1.0 : 0.0);
  if (st.ghost_world_R_body) f.add(*st.ghost_world_R_body);
  f.add(static_cast<double>(st.model.kind));
  f.add(st.model.user_mesh ? static_cast<double>(user_mesh_generation) : -1.0);
  const Camera& c = st.camera;
  f.add(c.target);
  for (double v : {c.azimuth_rad, c.elevation_rad, c.distance, c.fov_y_rad, c.near_plane, c.far_plane})
    f.add(v);
  f.add(st.world.name);
  f.add(st.world.up);
  for (const std::string& l : st.world.axis_labels) f.add(l);
  f.add(st.body.name);
  f.add(st.body.front);
  f.add(st.body.top);
  f.add(st.body.right);
  for (const std::string& l : st.body.axis_labels) f.add(l);
  f.add(st.rings ? 1.0 : 0.0);
  if (st.rings) {
    f.add(st.rings->convention.name());
    f.add(st.rings->angles_rad);
    f.add(st.rings->lock_margin_rad);
    f.add(st.rings->at_lock ? 1.0 : 0.0);
  }
  f.add(static_cast<double>(st.highlight));
  for (bool b : {st.show_grid, st.show_world_triad, st.show_body_triad, st.show_labels}) f.add(b ? 1.0 : 0.0);
  f.add(static_cast<double>(st.faded_triads.size()));
  for (const FadedTriad& t : st.faded_triads) {
    f.add(t.world_R_frame);
    f.add(static_cast<double>(t.alpha));
  }
  f.add(static_cast<double>(st.turns.size()));
  for (const TurnHighlight& t : st.turns) {
    f.add(t.axis_world);
    f.add(t.start_world_R_body);
    for (double v : {t.angle_rad, t.shown_rad, t.radius, t.show_axis ? 1.0 : 0.0}) f.add(v);
    f.add(t.label);
  }
  f.add(static_cast<double>(st.chain.size()));
  for (const ChainFrameMark& m : st.chain) {
    f.add(m.name);
    f.add(m.parent);
    f.add(static_cast<double>(m.depth));
    f.add(static_cast<double>(m.branch));
    f.add(m.display_R_frame);
    f.add(m.origin);
    f.add(m.lever_arm_origin);
    f.add(m.selected ? 1.0 : 0.0);
    f.add(m.scale);
    for (const std::string& l : m.axis_labels) f.add(l);
  }
  f.add(static_cast<double>(st.props.size()));
  for (const PlacedModel& m : st.props) {
    f.add(static_cast<double>(m.kind));
    for (int i = 0; i < 9; ++i) f.add(m.world_R_model(i / 3, i % 3));
    f.add(m.offset);
  }
  f.add(static_cast<double>(st.width_px));
  f.add(static_cast<double>(st.height_px));
  for (const auto* colour : {&palette.background, &palette.grid, &palette.axis_x, &palette.axis_y,
                             &palette.axis_z, &palette.ghost, &palette.highlight, &palette.label_outline})
    for (float v : *colour) f.add(static_cast<double>(v));
  return f.bytes();
}
}  // namespace

struct SceneRenderer::State {
  RendererOptions options;
  Palette palette;
  std::vector<std::string> warnings;
  std::size_t triangles = 0;
  bool reused = false;  ///< the last draw showed the kept picture of an unchanged scene

  gl::Program mesh_program, grid_program, smooth_program, text_program, edge_program;
  MeshUniforms mu{};
  EdgeUniforms eu{};
  /// The edge strips of the meshes drawn since the last draw_edges (edge_strips.hpp).
  gl::VertexArray edge_vao;
  gl::Buffer edge_vbo;
  std::vector<detail::EdgeVertex> edge_vertices;
  /// Whether draw_mesh collects edge strips, and only outlines (a translucent mesh).
  bool collect_edges = false, outline_edges = false;
  /// The smoothing pass's tile rectangles, as triangles in pixels.
  gl::VertexArray tile_vao;
  gl::Buffer tile_vbo;
  std::vector<float> tile_vertices;
  /// Where draw_mesh records what it drew (the target being drawn), or null.
  std::vector<detail::Footprint>* footprints = nullptr;
  GpuMesh grid, arrow, rod;
  std::array<GpuMesh, 3> rings;
  std::map<ModelKind, GpuMesh> models;
  std::map<ModelKind, Mesh> cpu_models;
  Mesh user_cpu;
  GpuMesh user_gpu;
  std::uint64_t user_mesh_generation = 0;  ///< counts set_user_mesh calls
  /// Offscreen targets of the views drawn lately, one per size (the window's Scene and Gimbal
  /// views, an export), most recent first.
  std::vector<std::unique_ptr<Target>> view_targets;
  Target export_target;
  Target& view_target(int w, int h, int slot = -1) {
    constexpr std::size_t kKeptTargets = 4;
    auto it = std::find_if(view_targets.begin(), view_targets.end(), [&](const std::unique_ptr<Target>& t) {
      return t->width == w && t->height == h && t->slot == slot;
    });
    if (it == view_targets.end()) {
      if (view_targets.size() >= kKeptTargets) view_targets.pop_back();
      view_targets.insert(view_targets.begin(), std::make_unique<Target>());
      view_targets.front()->ensure(w, h);
      view_targets.front()->slot = slot;
    } else {
      std::rotate(view_targets.begin(), it, it + 1);
    }
    return *view_targets.front();
  }

  /// What each prepare() slot showed last: its picture read back, its labels, and where
  /// present() finds the picture.
  struct Slot {
    int width = 0, height = 0;
    std::string shown;  ///< fingerprint and smoothing of `pixels`
    std::vector<std::uint32_t> pixels, scratch;
    std::vector<TextVertex> labels;
    GLuint picture_fbo = 0;
  };
  std::map<int, Slot> slots;

  /// Makes (or keeps) the picture of `state` in `t`; returns the framebuffer holding it.
  GLuint make_picture(const SceneState& state, Target& t, int w, int h);

  detail::BakedFont font;
  bool font_tried = false;
  /// Why the font could not be baked (declared before font_job, which writes it until the
  /// job is gone).
  std::string font_problem;
  /// The font baked on another thread from create() on (it reads and rasterises a font
  /// file, independent of GL), so it is ready when the first labels are placed.
  std::future<detail::BakedFont> font_job;
  gl::Texture atlas;
  gl::VertexArray text_vao;
  gl::Buffer text_vbo;
  std::vector<TextVertex> text_vertices;
  /// Set by render_image: the labels go into the read-back picture on the CPU (the same
  /// blend as the text shader), so a one-off picture compiles no text shader variant.
  bool labels_on_cpu = false;

  // Per-frame camera values, and the lights (world directions; half: the key light's half
  // vector with the view axis).
  Eigen::Matrix4f view_proj;
  Eigen::Vector3d eye;
  Eigen::Vector3f light_up, light_key, light_fill, light_half;
  int view_w = 1, view_h = 1;

  const GpuMesh& model_gpu(const ModelChoice& choice) {
    if (choice.user_mesh && user_gpu.count > 0) return user_gpu;
    auto it = models.find(choice.kind);
    if (it == models.end()) it = models.emplace(choice.kind, upload(cpu_model(choice.kind))).first;
    return it->second;
  }
  std::map<ModelKind, Eigen::AlignedBox3d> model_boxes;
  Eigen::AlignedBox3d user_box;
  Eigen::AlignedBox3d model_box(const ModelChoice& choice) {
    if (choice.user_mesh && !user_cpu.indices.empty()) return user_box;
    auto it = model_boxes.find(choice.kind);
    if (it == model_boxes.end()) it = model_boxes.emplace(choice.kind, bounds(cpu_model(choice.kind))).first;
    return it->second;
  }
  static Eigen::AlignedBox3d bounds(const Mesh& m) {
    Eigen::AlignedBox3d b;
    for (const Vertex& v : m.vertices)
      b.extend(Eigen::Vector3f(v.position[0], v.position[1], v.position[2]).cast<double>());
    return b;
  }
  const Mesh& cpu_model(ModelKind kind) {
    auto it = cpu_models.find(kind);
    if (it == cpu_models.end()) it = cpu_models.emplace(kind, build_model(kind)).first;
    return it->second;
  }

  void ensure_font() {
    if (font_tried) return;
    font_tried = true;
    font = font_job.valid() ? font_job.get() : detail::bake_label_font(kFontBakePx, &font_problem);
    if (font.coverage.empty()) {
      warnings.push_back(font_problem);
      return;
    }
    atlas = gl::make_texture();
    glBindTexture(GL_TEXTURE_2D, atlas.get());
    glPixelStorei(GL_UNPACK_ALIGNMENT, 1);
    glTexImage2D(GL_TEXTURE_2D, 0, GL_R8, font.width, font.height, 0, GL_RED, GL_UNSIGNED_BYTE,
                 font.coverage.data());
    glTexParameteri(GL_TEXTURE_2D, GL_TEXTURE_MIN_FILTER, GL_LINEAR);
    glTexParameteri(GL_TEXTURE_2D, GL_TEXTURE_MAG_FILTER, GL_LINEAR);
    glTexParameteri(GL_TEXTURE_2D, GL_TEXTURE_WRAP_S, GL_CLAMP_TO_EDGE);
    glTexParameteri(GL_TEXTURE_2D, GL_TEXTURE_WRAP_T, GL_CLAMP_TO_EDGE);
    glBindTexture(GL_TEXTURE_2D, 0);
    text_vao = gl::make_vertex_array();
    text_vbo = gl::make_buffer();
    glBindVertexArray(text_vao.get());
    glBindBuffer(GL_ARRAY_BUFFER, text_vbo.get());
    glEnableVertexAttribArray(0);
    glVertexAttribPointer(0, 2, GL_FLOAT, GL_FALSE, sizeof(TextVertex), reinterpret_cast<const void*>(0));
    glEnableVertexAttribArray(1);
    glVertexAttribPointer(1, 2, GL_FLOAT, GL_FALSE, sizeof(TextVertex),
                          reinterpret_cast<const void*>(offsetof(TextVertex, u)));
    glEnableVertexAttribArray(2);
    glVertexAttribPointer(2, 4, GL_FLOAT, GL_FALSE, sizeof(TextVertex),
                          reinterpret_cast<const void*>(offsetof(TextVertex, r)));
    glBindVertexArray(0);
    gl::check("font atlas");
  }

  /// Compiles the edge strip program and makes its vertex array (once).
  Expected<bool> ensure_edge_program() {
    if (edge_program) return true;
    auto p = gl::make_program("edge", detail::with_shading(detail::kEdgeVertex),
                              detail::with_shading(detail::kEdgeFragment));
    if (!p) return p.error();
    edge_program = std::move(p.value());
    const GLuint ep = edge_program.get();
    eu = {glGetUniformLocation(ep, "u_eye"),  glGetUniformLocation(ep, "u_up"),
          glGetUniformLocation(ep, "u_key"),  glGetUniformLocation(ep, "u_fill"),
          glGetUniformLocation(ep, "u_half"), glGetUniformLocation(ep, "u_specular")};
    edge_vao = gl::make_vertex_array();
    edge_vbo = gl::make_buffer();
    glBindVertexArray(edge_vao.get());
    glBindBuffer(GL_ARRAY_BUFFER, edge_vbo.get());
    const GLsizei stride = sizeof(detail::EdgeVertex);
    auto attribute = [&](GLuint at, GLint size, std::size_t offset) {
      glEnableVertexAttribArray(at);
      glVertexAttribPointer(at, size, GL_FLOAT, GL_FALSE, stride, reinterpret_cast<const void*>(offset));
    };
    attribute(0, 3, offsetof(detail::EdgeVertex, ndc));
    attribute(1, 3, offsetof(detail::EdgeVertex, world));
    attribute(2, 3, offsetof(detail::EdgeVertex, normal));
    attribute(3, 4, offsetof(detail::EdgeVertex, color));
    attribute(4, 4, offsetof(detail::EdgeVertex, glow));
    attribute(5, 3, offsetof(detail::EdgeVertex, edge));
    glBindVertexArray(0);
    gl::check("edge program");
    return true;
  }

  void draw_mesh(const GpuMesh& m, const Eigen::Matrix3d& linear, const Eigen::Vector3d& offset,
                 const Eigen::Vector4f& tint, float alpha, const Eigen::Vector4f& glow) {
    Eigen::Matrix4f model = Eigen::Matrix4f::Identity();
    model.topLeftCorner<3, 3>() = linear.cast<float>();
    model.topRightCorner<3, 1>() = offset.cast<float>();
    const Eigen::Matrix3f normal = linear.inverse().transpose().cast<float>();
    glUniformMatrix4fv(mu.model, 1, GL_FALSE, model.data());
    glUniformMatrix3fv(mu.normal_matrix, 1, GL_FALSE, normal.data());
    glUniform4fv(mu.tint, 1, tint.data());
    glUniform1f(mu.alpha, alpha);
    glUniform4fv(mu.glow, 1, glow.data());
    glUniform1f(mu.spec, kSpecular * (1.0f - 0.5f * glow.w()));  // a glow mutes the highlight
    if (footprints)
      footprints->push_back({m.shape, m.box, &m.part_bounds, m.ring_radius, m.tube_radius, linear, offset});
    if (collect_edges) {
      detail::EdgePlacement place;
      place.view_proj = view_proj;
      place.linear = linear;
      place.offset = offset;
      place.eye = eye;
      place.width = view_w;
      place.height = view_h;
      place.tint = tint;
      place.alpha = alpha;
      place.glow = glow;
      place.outline_only = outline_edges;
      detail::append_edge_strips(m.edges, place, &edge_vertices);
    }
    glBindVertexArray(m.vao.get());
    if (m.closed_count > 0) {
      glEnable(GL_CULL_FACE);
      // A mirroring placement turns the winding over.
      glFrontFace(linear.determinant() < 0.0 ? GL_CW : GL_CCW);
      glDrawElements(GL_TRIANGLES, m.closed_count, GL_UNSIGNED_INT, nullptr);
      glFrontFace(GL_CCW);
      glDisable(GL_CULL_FACE);
    }
    if (m.count > m.closed_count) {
      glDrawElements(
          GL_TRIANGLES, m.count - m.closed_count, GL_UNSIGNED_INT,
          reinterpret_cast<const void*>(static_cast<std::size_t>(m.closed_count) * sizeof(std::uint32_t)));
    }
    triangles += m.triangles;
  }

  void draw_arrow(const Eigen::Vector3d& from, const Eigen::Vector3d& dir, double length, double thickness,
                  const Eigen::Vector3f& color, const Eigen::Vector4f& glow) {
    Eigen::Matrix3d f = frame_along(dir);
    f.col(0) *= thickness;
    f.col(1) *= thickness;
    f.col(2) *= length;
    draw_mesh(arrow, f, from, Eigen::Vector4f(color.x(), color.y(), color.z(), 1.0f), 1.0f, glow);
  }

  /// The width in pixels of a label drawn `size` pixels high.
  float label_width(const std::string& text, float size) const {
    const float s = size / font.pixel_height;
    float width = 0.0f;
    for (char ch : text) {
      if (ch >= 32 && ch < 127) width += font.glyphs[ch - 32].advance * s;
    }
    return width;
  }

  /// The pixels a label centred on `at_px` covers (with its halo and a little air).
  Eigen::AlignedBox2d label_box(const std::string& text, const Eigen::Vector2d& at_px, float size) const {
    const Eigen::Vector2d half(0.5 * static_cast<double>(label_width(text, size)) + kLabelAirPx,
                               0.42 * static_cast<double>(size) + kLabelAirPx);
    return Eigen::AlignedBox2d(at_px - half, at_px + half);
  }

  void add_label(const std::string& text, const Eigen::Vector2d& at_px, const Eigen::Vector3f& color,
                 float size) {
    if (font.coverage.empty()) return;
    const float s = size / font.pixel_height;
    // Centre the text on the point.
    float pen_x = static_cast<float>(at_px.x()) - 0.5f * label_width(text, size);
    const float pen_y = static_cast<float>(at_px.y()) + 0.36f * size;
    const float iw = 1.0f / static_cast<float>(font.width), ih = 1.0f / static_cast<float>(font.height);
    for (char ch : text) {
      if (ch < 32 || ch >= 127) continue;
      const detail::Glyph& g = font.glyphs[ch - 32];
      const float x0 = pen_x + g.xoff * s, y0 = pen_y + g.yoff * s;
      const float x1 = x0 + (g.x1 - g.x0) * s, y1 = y0 + (g.y1 - g.y0) * s;
      const float u0 = g.x0 * iw, v0 = g.y0 * ih, u1 = g.x1 * iw, v1 = g.y1 * ih;
      const TextVertex a{x0, y0, u0, v0, color.x(), color.y(), color.z(), 1.0f};
      const TextVertex b{x1, y0, u1, v0, color.x(), color.y(), color.z(), 1.0f};
      const TextVertex c{x1, y1, u1, v1, color.x(), color.y(), color.z(), 1.0f};
      const TextVertex d{x0, y1, u0, v1, color.x(), color.y(), color.z(), 1.0f};
      text_vertices.insert(text_vertices.end(), {a, b, c, a, c, d});
      pen_x += g.advance * s;
    }
  }

  /// Draws the scene into `t` (its framebuffer bound, viewport set).
  void render_scene(const SceneState& st, Target& t);
  /// Draws the edge strips collected since the last call (blended, depth-tested, no depth
  /// writes) and forgets them.
  void draw_edges();
  /// Makes t.smooth: the scene of `t` with its edges smoothed.
  void smooth_scene(Target& t);
  void collect_labels(const SceneState& st, int w, int h);
  void draw_labels(int w, int h);
};

SceneRenderer::SceneRenderer() : state_(std::make_unique<State>()) {}
SceneRenderer::~SceneRenderer() = default;

Expected<std::unique_ptr<SceneRenderer>> SceneRenderer::create(const RendererOptions& options) {
  std::unique_ptr<SceneRenderer> r(new SceneRenderer());
  State& s = *r->state_;
  s.options = options;
  s.font_job =
      std::async(std::launch::async, [&s] { return detail::bake_label_font(kFontBakePx, &s.font_problem); });
  auto mesh_p = gl::make_program("mesh", detail::with_shading(detail::kMeshVertex),
                                 detail::with_shading(detail::kMeshFragment));
  if (!mesh_p) return mesh_p.error();
  auto grid_p = gl::make_program("grid", detail::kGridVertex, detail::kGridFragment);
  if (!grid_p) return grid_p.error();
  auto smooth_p = gl::make_program("smooth", detail::kTileVertex, detail::kSmoothFragment);
  if (!smooth_p) return smooth_p.error();
  s.mesh_program = std::move(mesh_p.value());
  s.grid_program = std::move(grid_p.value());
  s.smooth_program = std::move(smooth_p.value());
  const GLuint mp = s.mesh_program.get();
  s.mu = {glGetUniformLocation(mp, "u_model"),     glGetUniformLocation(mp, "u_normal_matrix"),
          glGetUniformLocation(mp, "u_view_proj"), glGetUniformLocation(mp, "u_eye"),
          glGetUniformLocation(mp, "u_up"),        glGetUniformLocation(mp, "u_key"),
          glGetUniformLocation(mp, "u_fill"),      glGetUniformLocation(mp, "u_tint"),
          glGetUniformLocation(mp, "u_alpha"),     glGetUniformLocation(mp, "u_glow"),
          glGetUniformLocation(mp, "u_half"),      glGetUniformLocation(mp, "u_spec")};
  if (options.antialiasing == Antialiasing::Edges) {
    if (auto edge = s.ensure_edge_program(); !edge.ok()) return edge.error();
  }
  s.tile_vao = gl::make_vertex_array();
  s.tile_vbo = gl::make_buffer();
  glBindVertexArray(s.tile_vao.get());
  glBindBuffer(GL_ARRAY_BUFFER, s.tile_vbo.get());
  glEnableVertexAttribArray(0);
  glVertexAttribPointer(0, 2, GL_FLOAT, GL_FALSE, 2 * sizeof(float), nullptr);
  glBindVertexArray(0);

  // Unit arrow along +z: shaft to 0.84, cone to 1 (radii scale with the arrow's thickness).
  Mesh arrow;
  detail::MeshBuilder ab(&arrow);
  const detail::Color white = detail::rgb(1, 1, 1);
  ab.cylinder(Eigen::Vector3d::Zero(), Eigen::Vector3d(0, 0, 0.84), 0.022, 12, white);
  ab.cone(Eigen::Vector3d(0, 0, 0.82), Eigen::Vector3d(0, 0, 1.0), 0.062, 16, white);
  s.arrow = upload(arrow);
  s.arrow.shape = detail::Footprint::Shape::Stick;
  Mesh rod;
  detail::MeshBuilder rb(&rod);
  rb.cylinder(Eigen::Vector3d(0, 0, -1), Eigen::Vector3d(0, 0, 1), 1.0, 10, white);
  s.rod = upload(rod);
  s.rod.shape = detail::Footprint::Shape::Stick;
  for (int i = 0; i < 3; ++i) {
    Mesh ring;
    detail::MeshBuilder b(&ring);
    b.torus(Eigen::Vector3d::Zero(), Eigen::Vector3d::UnitZ(), kRingRadius[i], kRingTube, kRingSegments,
            kRingSides, white);
    // Pivot studs where the ring meets its own axis (model x).
    for (double sgn : {1.0, -1.0}) {
      b.cylinder(Eigen::Vector3d(sgn * (kRingRadius[i] - 0.06), 0, 0),
                 Eigen::Vector3d(sgn * (kRingRadius[i] + 0.07), 0, 0), 0.055, 12, white);
    }
    s.rings[i] = upload(ring);
    s.rings[i].shape = detail::Footprint::Shape::Ring;
    s.rings[i].ring_radius = kRingRadius[i];
    s.rings[i].tube_radius = kRingTube;
  }
  s.grid = build_grid();
  gl::check("renderer creation");
  return r;
}

void SceneRenderer::State::render_scene(const SceneState& st, Target& t) {
  const int w = t.width, h = t.height;
  view_w = w;
  view_h = h;
  const WorldFrame& world = st.world;
  const CameraPose pose = camera_pose(st.camera, world);
  eye = pose.eye;
  view_proj = to_gl(projection_matrix(st.camera, w, h) * view_matrix(st.camera, world));
  const Eigen::Vector3d up = world.up.normalized();
  t.footprints.clear();
  footprints = &t.footprints;

  // Background: a plain clear of the whole offscreen target. llvmpipe fills a whole buffer's
  // colour, depth and stencil together at memory speed (about 0.5 ms for 900x700 here),
  // while a scissored clear of a region, or a background quad, is shaded pixel by pixel
  // (3-5 ms); so a view is drawn offscreen and copied into its region.
  glDisable(GL_SCISSOR_TEST);
  glDisable(GL_DEPTH_TEST);
  glDisable(GL_BLEND);
  glDepthMask(GL_TRUE);
  glStencilMask(0xFF);
  glClearDepth(1.0);
  glClearStencil(0);
  // Alpha marks what the meshes (and the ghost) cover: 1 there, kUncoveredAlpha elsewhere
  // (the grid keeps it), so the smoothing pass leaves the grid's lines alone. Both show as
  // opaque when a view lands in a window whose alpha a desktop composites.
  glClearColor(palette.background[0], palette.background[1], palette.background[2], kUncoveredAlpha);
  // The ground grid: blended, no depth writes, so the triads and the body stay crisp over it.
  auto draw_grid = [&] {
    glEnable(GL_BLEND);
    glBlendFuncSeparate(GL_SRC_ALPHA, GL_ONE_MINUS_SRC_ALPHA, GL_ZERO, GL_ONE);
    glDepthMask(GL_FALSE);
    const GLuint gp = grid_program.get();
    glUseProgram(gp);
    Eigen::Vector3d e1, e2;
    ground_axes(world, &e1, &e2);
    const Eigen::Vector3f o = ground_centre(st).cast<float>(), e1f = e1.cast<float>(), e2f = e2.cast<float>();
    glUniform3fv(glGetUniformLocation(gp, "u_origin"), 1, o.data());
    glUniform3fv(glGetUniformLocation(gp, "u_e1"), 1, e1f.data());
    glUniform3fv(glGetUniformLocation(gp, "u_e2"), 1, e2f.data());
    glUniformMatrix4fv(glGetUniformLocation(gp, "u_view_proj"), 1, GL_FALSE, view_proj.data());
    glUniform2f(glGetUniformLocation(gp, "u_viewport"), static_cast<float>(w), static_cast<float>(h));
    glUniform3fv(glGetUniformLocation(gp, "u_color"), 1, palette.grid.data());
    glUniform3fv(glGetUniformLocation(gp, "u_x_color"), 1, palette.axis_x.data());
    glUniform3fv(glGetUniformLocation(gp, "u_y_color"), 1, palette.axis_y.data());
    glUniform1f(glGetUniformLocation(gp, "u_extent"), kGridExtent);
    glUniform1f(glGetUniformLocation(gp, "u_foot"), static_cast<float>(kWorldTriadOffset));
    glUniform1f(glGetUniformLocation(gp, "u_y_flip"), e2.y() < 0.0 ? 1.0f : 0.0f);
    glBindVertexArray(grid.vao.get());
    glDrawArrays(GL_TRIANGLES, 0, grid.count);
    triangles += grid.triangles;
    glDepthMask(GL_TRUE);
    glDisable(GL_BLEND);
  };
  // Seen from above, everything drawn stands on or over the ground, so the grid can go
  // first, into the view's kept ground picture (drawn again only when the camera, size or
  // palette change); seen from below it is drawn after the meshes, over what it hides.
  const bool ground_first = st.show_grid && (eye - ground_centre(st)).dot(up) > 0.0;
  if (ground_first) {
    Fingerprint key;
    const Camera& c = st.camera;
    key.add(c.target);
    for (double v : {c.azimuth_rad, c.elevation_rad, c.distance, c.fov_y_rad, c.near_plane, c.far_plane})
      key.add(v);
    key.add(world.up);
    key.add(ground_centre(st));
    key.add(static_cast<double>(w));
    key.add(static_cast<double>(h));
    for (const auto* colour : {&palette.background, &palette.grid, &palette.axis_x, &palette.axis_y})
      for (float v : *colour) key.add(static_cast<double>(v));
    if (t.ground_key != key.bytes()) {
      t.ensure_ground();
      glBindFramebuffer(GL_FRAMEBUFFER, t.ground_fbo.get());
      glClear(GL_COLOR_BUFFER_BIT);
      draw_grid();
      t.ground_key = key.bytes();
    } else {
      triangles += grid.triangles;
    }
    // The ground picture in: only where the last scene put meshes when it lay on the same
    // ground (the bounds of its tiles, one row copy), else all of it.
    glBindFramebuffer(GL_READ_FRAMEBUFFER, t.ground_fbo.get());
    glBindFramebuffer(GL_DRAW_FRAMEBUFFER, t.fbo.get());
    if (t.color_on_ground == t.ground_key) {
      if (const std::optional<detail::PixelBox> b = detail::bounds_of(t.color_changed)) {
        const int y0 = h - b->y - b->height;
        glBlitFramebuffer(b->x, y0, b->x + b->width, y0 + b->height, b->x, y0, b->x + b->width,
                          y0 + b->height, GL_COLOR_BUFFER_BIT, GL_NEAREST);
      }
    } else {
      glBlitFramebuffer(0, 0, w, h, 0, 0, w, h, GL_COLOR_BUFFER_BIT, GL_NEAREST);
    }
    glBindFramebuffer(GL_FRAMEBUFFER, t.fbo.get());
    glClear(GL_DEPTH_BUFFER_BIT | GL_STENCIL_BUFFER_BIT);
  } else {
    glClear(GL_COLOR_BUFFER_BIT | GL_DEPTH_BUFFER_BIT | GL_STENCIL_BUFFER_BIT);
  }

  const Eigen::Vector3d ground = world_triad_origin(st);
  glEnable(GL_DEPTH_TEST);
  glDepthFunc(GL_LEQUAL);

  // Opaque meshes.
  glUseProgram(mesh_program.get());
  glUniformMatrix4fv(mu.view_proj, 1, GL_FALSE, view_proj.data());
  const Eigen::Vector3f eyef = eye.cast<float>();
  glUniform3fv(mu.eye, 1, eyef.data());
  light_up = up.cast<float>();
  light_key = (pose.world_R_view * Eigen::Vector3d(-0.38, 0.62, 0.68).normalized()).cast<float>();
  light_fill = (pose.world_R_view * Eigen::Vector3d(0.7, -0.25, 0.45).normalized()).cast<float>();
  light_half = (light_key + pose.world_R_view.col(2).cast<float>()).normalized();
  glUniform3fv(mu.up, 1, light_up.data());
  glUniform3fv(mu.key, 1, light_key.data());
  glUniform3fv(mu.fill, 1, light_fill.data());
  glUniform3fv(mu.half, 1, light_half.data());
  // Edge strips of every mesh drawn with colour (edge_strips.hpp).
  collect_edges = options.antialiasing == Antialiasing::Edges && static_cast<bool>(edge_program);
  outline_edges = false;
  edge_vertices.clear();
  const Eigen::Vector4f no_tint(0, 0, 0, 0), no_glow(0, 0, 0, 0);
  const Eigen::Vector3f hl = vec(palette.highlight);
  const Eigen::Vector4f glow(hl.x(), hl.y(), hl.z(), kHighlightGlow);
  const Eigen::Vector3f axis_colors[3] = {vec(palette.axis_x), vec(palette.axis_y), vec(palette.axis_z)};

  if (st.show_world_triad) {
    for (int a = 0; a < 3; ++a) {
      draw_arrow(ground, Eigen::Vector3d::Unit(a), kWorldTriadLength, 1.0, axis_colors[a], no_glow);
    }
  }
  const GpuMesh& body = model_gpu(st.model);
  const Eigen::Matrix3d world_R_mesh = world_R_model(st);
  draw_mesh(body, world_R_mesh, Eigen::Vector3d::Zero(), no_tint, 1.0f,
            st.highlight == Highlight::Body ? glow : no_glow);
  if (st.show_body_triad) {
    const Eigen::Matrix3d r = st.world_R_body.matrix();
    for (int a = 0; a < 3; ++a)
      draw_arrow(Eigen::Vector3d::Zero(), r.col(a), kBodyTriadLength, 1.0, axis_colors[a], no_glow);
  }
  for (const PlacedModel& p : st.props) {  // extra solid models (a mount check's vehicle)
    draw_mesh(model_gpu(ModelChoice{p.kind, false}), p.world_R_model, p.offset, no_tint, 1.0f, no_glow);
  }
  // Teaching overlays (overlays.cpp) and the frame chain (chain_overlay.cpp).
  if (!st.faded_triads.empty() || !st.turns.empty() || !st.chain.empty()) {
    detail::OverlayPainter paint;
    paint.arrow = [&](const Eigen::Vector3d& from, const Eigen::Vector3d& dir, double length,
                      double thickness, const Eigen::Vector3f& color) {
      draw_arrow(from, dir, length, thickness, color, no_glow);
    };
    paint.rod = [&](const Eigen::Vector3d& a, const Eigen::Vector3d& b, double radius,
                    const Eigen::Vector3f& color) {
      Eigen::Matrix3d m = frame_along(b - a);
      m.col(0) *= radius;
      m.col(1) *= radius;
      // The rod mesh runs from z = -1 to 1: centre it between a and b, half the length each way.
      m.col(2) *= 0.5 * (b - a).norm();
      draw_mesh(rod, m, 0.5 * (a + b), Eigen::Vector4f(color.x(), color.y(), color.z(), 1.0f), 1.0f, no_glow);
    };
    detail::draw_overlays(st, paint, vec(palette.background), axis_colors, hl);
    detail::draw_chain(st, paint, axis_colors, hl);
  }
  if (st.rings) {
    const GimbalRings g = gimbal_rings(*st.rings);
    const Eigen::Vector3f base = margin_color(g.lock_margin_rad * 180.0 / kPi);
    const float shade[3] = {0.80f, 1.0f, 1.16f};
    const Highlight ring_hl[3] = {Highlight::OuterRing, Highlight::MiddleRing, Highlight::InnerRing};
    for (int i = 0; i < 3; ++i) {
      const GimbalRing& ring = g.rings[i];
      const Eigen::Vector3f c = (base * shade[i]).cwiseMin(1.0f);
      // Ring frame: x along the ring's axis, z along its circle's normal.
      Eigen::Matrix3d m;
      const Eigen::Vector3d x = ring.axis_world.normalized();
      const Eigen::Vector3d z = ring.plane_normal_world.normalized();
      m << x, z.cross(x), z;
      const Eigen::Vector4f glow_i = st.highlight == ring_hl[i] ? glow : no_glow;
      draw_mesh(rings[i], m, Eigen::Vector3d::Zero(), Eigen::Vector4f(c.x(), c.y(), c.z(), 1.0f), 1.0f,
                glow_i);
      // The ring's axis: a thin rod through the pivots, an arrowhead at its positive end.
      const double reach = kRingRadius[i] + 0.32 + 0.18 * i;
      const Eigen::Vector3f dark = c * 0.72f;
      Eigen::Matrix3d rod_m = frame_along(x);
      rod_m.col(0) *= 0.014;
      rod_m.col(1) *= 0.014;
      rod_m.col(2) *= reach;
      draw_mesh(rod, rod_m, Eigen::Vector3d::Zero(), Eigen::Vector4f(dark.x(), dark.y(), dark.z(), 1.0f),
                1.0f, glow_i);
      draw_arrow(x * (reach - 0.2), x, 0.34, 1.6, dark, glow_i);
    }
  }
  gl::check("opaque pass");
  draw_edges();

  if (st.show_grid && !ground_first) draw_grid();

  // Reference ghost: a depth-only pass first, so only its nearest surface is blended (a
  // clean single layer instead of overlapping translucent shells).
  if (st.ghost_world_R_body) {
    SceneState gs = st;
    gs.world_R_body = *st.ghost_world_R_body;
    const Eigen::Matrix3d ghost_R_mesh = world_R_model(gs);
    const Eigen::Vector3f gc = vec(palette.ghost);
    glUseProgram(mesh_program.get());
    glColorMask(GL_FALSE, GL_FALSE, GL_FALSE, GL_FALSE);
    const bool collecting = collect_edges;
    collect_edges = false;
    draw_mesh(body, ghost_R_mesh, Eigen::Vector3d::Zero(), no_tint, 1.0f, no_glow);
    collect_edges = collecting;
    outline_edges = true;
    glColorMask(GL_TRUE, GL_TRUE, GL_TRUE, GL_TRUE);
    glEnable(GL_BLEND);
    glBlendFuncSeparate(GL_SRC_ALPHA, GL_ONE_MINUS_SRC_ALPHA, GL_ONE, GL_ONE);  // alpha: covered
    glDepthMask(GL_FALSE);
    draw_mesh(body, ghost_R_mesh, Eigen::Vector3d::Zero(),
              Eigen::Vector4f(gc.x(), gc.y(), gc.z(), kGhostTint), kGhostAlpha,
              st.highlight == Highlight::Ghost ? glow : no_glow);
    draw_edges();
    glDepthMask(GL_TRUE);
    glDisable(GL_BLEND);
  }
  collect_edges = false;
  glDisable(GL_DEPTH_TEST);
  footprints = nullptr;
  t.tiles = detail::footprint_tiles(st.camera, st.world, w, h, t.footprints);
  if (ground_first) {
    t.color_on_ground = t.ground_key;
    t.color_changed = t.tiles;
  } else {
    t.color_on_ground.clear();
  }
  gl::check("scene pass");
}

void SceneRenderer::State::collect_labels(const SceneState& st, int w, int h) {
  text_vertices.clear();
  if (!st.show_labels) return;
  ensure_font();
  if (font.coverage.empty()) return;
  const Eigen::Vector3f axis_colors[3] = {vec(palette.axis_x) * 0.85f, vec(palette.axis_y) * 0.8f,
                                          vec(palette.axis_z) * 0.85f};
  // A label sits just beyond its tip, pushed outward on the screen from the arrow's base.
  // Where that spot is taken by a label placed earlier, it moves further out or turns
  // aside, so names never print over each other (the first free spot wins).
  const float size = std::clamp(static_cast<float>(h) * kLabelPerViewHeight, kLabelMinPx, kLabelMaxPx);
  std::vector<Eigen::AlignedBox2d> taken;
  auto place = [&](const Eigen::Vector3d& base, const Eigen::Vector3d& tip, const std::string& text,
                   const Eigen::Vector3f& color) {
    const Projected pt = project_to_pixel(st.camera, st.world, w, h, tip);
    const Projected pb = project_to_pixel(st.camera, st.world, w, h, base);
    if (!pt.in_front) return;
    Eigen::Vector2d d = pt.pixel - (pb.in_front ? pb.pixel : pt.pixel);
    d = d.norm() > 1e-6 ? d.normalized() : Eigen::Vector2d(0, -1);
    static constexpr double kReach[] = {0.75, 1.5, 2.4};                       // label sizes out from the tip
    static constexpr double kTurn[] = {0.0, 0.7, -0.7, 1.4, -1.4, 2.2, -2.2};  // radians from d
    Eigen::Vector2d at = pt.pixel + d * (static_cast<double>(size) * kReach[0]);
    bool found = false;
    for (double reach : kReach) {
      for (double turn : kTurn) {
        const Eigen::Vector2d c =
            pt.pixel + Eigen::Rotation2Dd(turn) * d * (static_cast<double>(size) * reach);
        const Eigen::AlignedBox2d box = label_box(text, c, size);
        const bool free = std::none_of(taken.begin(), taken.end(),
                                       [&](const Eigen::AlignedBox2d& t) { return t.intersects(box); });
        if (free) {
          at = c;
          found = true;
          break;
        }
      }
      if (found) break;
    }
    taken.push_back(label_box(text, at, size));
    add_label(text, at, color, size);
  };
  if (st.show_world_triad) {
    const Eigen::Vector3d o = world_triad_origin(st);
    for (int a = 0; a < 3; ++a) place(o, world_axis_tip(st, a), st.world.axis_labels[a], axis_colors[a]);
  }
  if (st.show_body_triad) {
    for (int a = 0; a < 3; ++a)
      place(Eigen::Vector3d::Zero(), body_axis_tip(st, a), st.body.axis_labels[a], axis_colors[a]);
  }
  detail::overlay_labels(
      st, [&](const Eigen::Vector3d& base, const Eigen::Vector3d& tip, const std::string& text) {
        place(base, tip, text, vec(palette.highlight) * 0.6f);
      });
  detail::chain_labels(st, [&](const Eigen::Vector3d& base, const Eigen::Vector3d& tip,
                               const std::string& text, bool selected, int axis) {
    const Eigen::Vector3f ink(0.16f, 0.18f, 0.24f);
    place(base, tip, text, axis >= 0 ? axis_colors[axis] : (selected ? vec(palette.highlight) * 0.62f : ink));
  });
  if (st.rings) {
    const GimbalRings g = gimbal_rings(*st.rings);
    const Eigen::Vector3f base = margin_color(g.lock_margin_rad * 180.0 / kPi) * 0.7f;
    for (int i = 0; i < 3; ++i) {
      const double reach = kRingRadius[i] + 0.32 + 0.18 * i + 0.14;
      const std::string name =
          std::string(1, axis_letter(g.rings[i].axis)) + std::to_string(g.rings[i].sequence_index + 1);
      place(Eigen::Vector3d::Zero(), g.rings[i].axis_world.normalized() * reach, name, base);
    }
  }
}

void SceneRenderer::State::draw_labels(int w, int h) {
  if (text_vertices.empty()) return;
  if (!text_program) {  // compiled on the first labels drawn on the GPU
    auto text_p = gl::make_program("text", detail::kTextVertex, detail::kTextFragment);
    if (!text_p) {
      warnings.push_back(text_p.error().message);
      text_vertices.clear();
      return;
    }
    text_program = std::move(text_p.value());
  }
  glEnable(GL_BLEND);
  glBlendFunc(GL_SRC_ALPHA, GL_ONE_MINUS_SRC_ALPHA);
  const GLuint tp = text_program.get();
  glUseProgram(tp);
  glUniform2f(glGetUniformLocation(tp, "u_size"), static_cast<float>(w), static_cast<float>(h));
  glUniform2f(glGetUniformLocation(tp, "u_texel"), 1.0f / static_cast<float>(font.width),
              1.0f / static_cast<float>(font.height));
  glUniform3fv(glGetUniformLocation(tp, "u_halo"), 1, palette.label_outline.data());
  glUniform1i(glGetUniformLocation(tp, "u_atlas"), 0);
  glActiveTexture(GL_TEXTURE0);
  glBindTexture(GL_TEXTURE_2D, atlas.get());
  glBindVertexArray(text_vao.get());
  glBindBuffer(GL_ARRAY_BUFFER, text_vbo.get());
  glBufferData(GL_ARRAY_BUFFER, static_cast<GLsizeiptr>(text_vertices.size() * sizeof(TextVertex)),
               text_vertices.data(), GL_STREAM_DRAW);
  glDrawArrays(GL_TRIANGLES, 0, static_cast<GLsizei>(text_vertices.size()));
  glBindTexture(GL_TEXTURE_2D, 0);
  glDisable(GL_BLEND);
  gl::check("labels");
}

void SceneRenderer::State::draw_edges() {
  if (edge_vertices.empty()) return;
  const GLuint ep = edge_program.get();
  glUseProgram(ep);
  const Eigen::Vector3f eyef = eye.cast<float>();
  glUniform3fv(eu.eye, 1, eyef.data());
  glUniform3fv(eu.up, 1, light_up.data());
  glUniform3fv(eu.key, 1, light_key.data());
  glUniform3fv(eu.fill, 1, light_fill.data());
  glUniform3fv(eu.half, 1, light_half.data());
  glUniform1f(eu.specular, kSpecular);
  // Over what is drawn, keeping the target's alpha; tested against the depth the meshes
  // wrote, not writing it (strips overlap where edges meet).
  glEnable(GL_BLEND);
  glBlendFuncSeparate(GL_SRC_ALPHA, GL_ONE_MINUS_SRC_ALPHA, GL_ZERO, GL_ONE);
  glDepthMask(GL_FALSE);
  glBindVertexArray(edge_vao.get());
  glBindBuffer(GL_ARRAY_BUFFER, edge_vbo.get());
  glBufferData(GL_ARRAY_BUFFER, static_cast<GLsizeiptr>(edge_vertices.size() * sizeof(detail::EdgeVertex)),
               edge_vertices.data(), GL_STREAM_DRAW);
  glDrawArrays(GL_LINES, 0, static_cast<GLsizei>(edge_vertices.size()));
  glDepthMask(GL_TRUE);
  glDisable(GL_BLEND);
  edge_vertices.clear();
  gl::check("edge strips");
}

void SceneRenderer::State::smooth_scene(Target& t) {
  const int w = t.width, h = t.height;
  t.ensure_smooth();
  t.smoothed = true;
  // Smooth only the tiles the meshes' footprints touch: the background and the grid are
  // smooth already (the grid's lines are antialiased analytically), and on a software
  // rasteriser every post-processed pixel costs. Outside the tiles the smoothed picture is
  // the scene: when both lie on the same ground picture, the pass also goes over the tiles
  // the last smoothed picture changed (leaving the scene's pixels there, the ground), else
  // the smoothed picture starts as a copy of the scene (rows, no shading).
  std::vector<detail::PixelBox> boxes = t.tiles;
  if (!t.color_on_ground.empty() && t.smooth_on_ground == t.color_on_ground) {
    boxes.insert(boxes.end(), t.smooth_changed.begin(), t.smooth_changed.end());
    boxes = detail::merge_tiles(boxes, w, h);
  } else {
    glBindFramebuffer(GL_READ_FRAMEBUFFER, t.fbo.get());
    glBindFramebuffer(GL_DRAW_FRAMEBUFFER, t.smooth_fbo.get());
    glDisable(GL_SCISSOR_TEST);
    glBlitFramebuffer(0, 0, w, h, 0, 0, w, h, GL_COLOR_BUFFER_BIT, GL_NEAREST);
  }
  t.smooth_on_ground = t.color_on_ground;
  t.smooth_changed = t.tiles;
  if (boxes.empty()) return;
  tile_vertices.clear();
  for (const detail::PixelBox& box : boxes) {  // two triangles a box, GL's bottom-left origin
    const float x0 = static_cast<float>(box.x), x1 = static_cast<float>(box.x + box.width);
    const float y0 = static_cast<float>(h - box.y - box.height), y1 = static_cast<float>(h - box.y);
    tile_vertices.insert(tile_vertices.end(), {x0, y0, x1, y0, x1, y1, x0, y0, x1, y1, x0, y1});
  }
  glBindVertexArray(tile_vao.get());
  glBindBuffer(GL_ARRAY_BUFFER, tile_vbo.get());
  glBufferData(GL_ARRAY_BUFFER, static_cast<GLsizeiptr>(tile_vertices.size() * sizeof(float)),
               tile_vertices.data(), GL_STREAM_DRAW);
  glViewport(0, 0, w, h);
  glDisable(GL_DEPTH_TEST);
  glDisable(GL_BLEND);
  glActiveTexture(GL_TEXTURE0);
  glBindTexture(GL_TEXTURE_2D, t.color.get());
  glBindFramebuffer(GL_FRAMEBUFFER, t.smooth_fbo.get());
  const GLuint sp = smooth_program.get();
  glUseProgram(sp);
  glUniform1i(glGetUniformLocation(sp, "u_scene"), 0);
  glUniform2f(glGetUniformLocation(sp, "u_size"), static_cast<float>(w), static_cast<float>(h));
  glUniform2f(glGetUniformLocation(sp, "u_texel"), 1.0f / static_cast<float>(w),
              1.0f / static_cast<float>(h));
  glDrawArrays(GL_TRIANGLES, 0, static_cast<GLsizei>(tile_vertices.size() / 2));
  glBindTexture(GL_TEXTURE_2D, 0);
  gl::check("smoothing pass");
}

void SceneRenderer::draw(const SceneState& state, const Region& region) {
  State& s = *state_;
  if (region.width <= 0 || region.height <= 0) return;
  s.triangles = 0;
  GLint prev_draw = 0, prev_read = 0;
  glGetIntegerv(GL_DRAW_FRAMEBUFFER_BINDING, &prev_draw);
  glGetIntegerv(GL_READ_FRAMEBUFFER_BINDING, &prev_read);
  const auto dest = static_cast<GLuint>(prev_draw);
  const int w = region.width, h = region.height;
  const int gl_x = region.x, gl_y = region.framebuffer_height - region.y - region.height;
  s.collect_labels(state, w, h);

  // The scene, offscreen at the region's size; kept from the last draw of this size when
  // nothing in it changed.
  const GLuint shown = s.make_picture(state, s.view_target(w, h), w, h);

  // Into the region: a straight copy (no shading, so llvmpipe copies rows), then the labels
  // on top (unsmoothed).
  glBindFramebuffer(GL_READ_FRAMEBUFFER, shown);
  glBindFramebuffer(GL_DRAW_FRAMEBUFFER, dest);
  glDisable(GL_SCISSOR_TEST);
  glBlitFramebuffer(0, 0, w, h, gl_x, gl_y, gl_x + w, gl_y + h, GL_COLOR_BUFFER_BIT, GL_NEAREST);
  glViewport(gl_x, gl_y, w, h);
  glEnable(GL_SCISSOR_TEST);
  glScissor(gl_x, gl_y, w, h);
  glDisable(GL_DEPTH_TEST);
  if (!s.labels_on_cpu) s.draw_labels(w, h);
  // Leave GL as the caller's drawing expects it.
  glDisable(GL_SCISSOR_TEST);
  glDisable(GL_DEPTH_TEST);
  glDisable(GL_BLEND);
  glDepthMask(GL_TRUE);
  glUseProgram(0);
  glBindVertexArray(0);
  glBindFramebuffer(GL_DRAW_FRAMEBUFFER, dest);
  glBindFramebuffer(GL_READ_FRAMEBUFFER, static_cast<GLuint>(prev_read));
  gl::check("draw");
}

GLuint SceneRenderer::State::make_picture(const SceneState& state, Target& t, int w, int h) {
  SceneState sized = state;
  sized.width_px = w;
  sized.height_px = h;
  std::string picture = scene_fingerprint(sized, palette, user_mesh_generation);
  if (options.antialiasing == Antialiasing::Edges) picture += "|edges";  // drawn into the scene
  reused = options.reuse_unchanged && t.picture == picture;
  if (!reused) {
    glBindFramebuffer(GL_FRAMEBUFFER, t.fbo.get());
    glViewport(0, 0, w, h);
    render_scene(state, t);
    t.picture = std::move(picture);
    t.smoothed = false;
  }
  if (options.antialiasing != Antialiasing::Post) return t.fbo.get();
  if (!t.smoothed) smooth_scene(t);
  return t.smooth_fbo.get();
}

namespace {

/// The box (origin bottom-left, widened by a pixel) of the label glyphs of `a` not in `b`.
Eigen::AlignedBox2f changed_glyphs(const std::vector<TextVertex>& a, const std::vector<TextVertex>& b,
                                   int h) {
  Eigen::AlignedBox2f box;
  auto same = [](const TextVertex* p, const TextVertex* q) {
    return std::memcmp(p, q, 6 * sizeof(TextVertex)) == 0;
  };
  for (std::size_t i = 0; i + 6 <= a.size(); i += 6) {
    bool found = false;
    for (std::size_t j = 0; j + 6 <= b.size() && !found; j += 6) found = same(&a[i], &b[j]);
    if (found) continue;
    for (std::size_t k = i; k < i + 6; ++k)
      box.extend(Eigen::Vector2f(a[k].x, static_cast<float>(h) - a[k].y));
  }
  if (!box.isEmpty()) {
    box.min() -= Eigen::Vector2f::Constant(1.0f);
    box.max() += Eigen::Vector2f::Constant(1.0f);
  }
  return box;
}

}  // namespace

RegionPart SceneRenderer::prepare(const SceneState& state, int width, int height, int slot, bool compare) {
  State& s = *state_;
  if (width <= 0 || height <= 0) return {};
  s.triangles = 0;
  GLint prev_draw = 0, prev_read = 0;
  glGetIntegerv(GL_DRAW_FRAMEBUFFER_BINDING, &prev_draw);
  glGetIntegerv(GL_READ_FRAMEBUFFER_BINDING, &prev_read);
  const int w = width, h = height;
  s.collect_labels(state, w, h);
  Target& t = s.view_target(w, h, slot);
  State::Slot& m = s.slots[slot];
  m.picture_fbo = s.make_picture(state, t, w, h);
  const std::string shown =
      t.picture + (s.options.antialiasing == Antialiasing::Post ? "|smoothed" : "|plain");
  // The changed pixels as a box [min, max) of region pixels, origin bottom-left. Without a
  // comparison (or at a new size) all of them.
  Eigen::AlignedBox2i changed;
  const bool fresh = !compare || m.width != w || m.height != h;
  if (fresh) {
    changed.extend(Eigen::Vector2i(0, 0));
    changed.extend(Eigen::Vector2i(w, h));
  }
  if (compare && (fresh || shown != m.shown)) {
    // Read the picture back (a row copy) and box the pixels that differ from the last one.
    std::vector<std::uint32_t>& now = m.scratch;  // kept, so a frame allocates nothing
    now.resize(static_cast<std::size_t>(w) * static_cast<std::size_t>(h));
    glBindFramebuffer(GL_READ_FRAMEBUFFER, m.picture_fbo);
    glPixelStorei(GL_PACK_ALIGNMENT, 4);
    glReadPixels(0, 0, w, h, GL_BGRA, GL_UNSIGNED_BYTE, now.data());
    for (int y = 0; y < h && !fresh; ++y) {
      const std::uint32_t* a = now.data() + static_cast<std::size_t>(y) * static_cast<std::size_t>(w);
      const std::uint32_t* b = m.pixels.data() + static_cast<std::size_t>(y) * static_cast<std::size_t>(w);
      if (std::memcmp(a, b, static_cast<std::size_t>(w) * sizeof(std::uint32_t)) == 0) continue;
      int l = 0, r = w - 1;
      while (a[l] == b[l]) ++l;
      while (a[r] == b[r]) --r;
      changed.extend(Eigen::Vector2i(l, y));
      changed.extend(Eigen::Vector2i(r + 1, y + 1));
    }
    m.pixels.swap(now);
  }
  if (!fresh) {
    // Labels that moved or changed: their old and new places.
    Eigen::AlignedBox2f box = changed_glyphs(s.text_vertices, m.labels, h);
    box.extend(changed_glyphs(m.labels, s.text_vertices, h));
    if (!box.isEmpty()) {
      changed.extend(Eigen::Vector2i(static_cast<int>(std::floor(box.min().x())),
                                     static_cast<int>(std::floor(box.min().y()))));
      changed.extend(Eigen::Vector2i(static_cast<int>(std::ceil(box.max().x())),
                                     static_cast<int>(std::ceil(box.max().y()))));
    }
  }
  // Without a readback the next comparing prepare starts afresh.
  m.width = compare ? w : 0;
  m.height = compare ? h : 0;
  m.shown = shown;
  m.labels = s.text_vertices;
  glBindFramebuffer(GL_DRAW_FRAMEBUFFER, static_cast<GLuint>(prev_draw));
  glBindFramebuffer(GL_READ_FRAMEBUFFER, static_cast<GLuint>(prev_read));
  gl::check("prepare");
  if (changed.isEmpty()) return {};
  changed = changed.intersection(Eigen::AlignedBox2i(Eigen::Vector2i(0, 0), Eigen::Vector2i(w, h)));
  if (changed.isEmpty()) return {};
  return {changed.min().x(), changed.min().y(), changed.max().x() - changed.min().x(),
          changed.max().y() - changed.min().y()};
}

void SceneRenderer::present(int slot, const Region& region, const RegionPart& part) {
  State& s = *state_;
  auto found = s.slots.find(slot);
  if (found == s.slots.end() || part.empty() || region.width <= 0 || region.height <= 0) return;
  State::Slot& m = found->second;
  GLint prev_draw = 0, prev_read = 0;
  glGetIntegerv(GL_DRAW_FRAMEBUFFER_BINDING, &prev_draw);
  glGetIntegerv(GL_READ_FRAMEBUFFER_BINDING, &prev_read);
  const int w = region.width, h = region.height;
  const int gl_x = region.x, gl_y = region.framebuffer_height - region.y - region.height;
  const int x0 = std::max(0, part.x), y0 = std::max(0, part.y);
  const int x1 = std::min(w, part.x + part.width), y1 = std::min(h, part.y + part.height);
  if (x1 <= x0 || y1 <= y0) return;
  glBindFramebuffer(GL_READ_FRAMEBUFFER, m.picture_fbo);
  glBindFramebuffer(GL_DRAW_FRAMEBUFFER, static_cast<GLuint>(prev_draw));
  glDisable(GL_SCISSOR_TEST);
  glBlitFramebuffer(x0, y0, x1, y1, gl_x + x0, gl_y + y0, gl_x + x1, gl_y + y1, GL_COLOR_BUFFER_BIT,
                    GL_NEAREST);
  glViewport(gl_x, gl_y, w, h);
  glEnable(GL_SCISSOR_TEST);
  glScissor(gl_x + x0, gl_y + y0, x1 - x0, y1 - y0);
  glDisable(GL_DEPTH_TEST);
  s.text_vertices = m.labels;
  s.draw_labels(w, h);
  glDisable(GL_SCISSOR_TEST);
  glDisable(GL_BLEND);
  glDepthMask(GL_TRUE);
  glUseProgram(0);
  glBindVertexArray(0);
  glBindFramebuffer(GL_DRAW_FRAMEBUFFER, static_cast<GLuint>(prev_draw));
  glBindFramebuffer(GL_READ_FRAMEBUFFER, static_cast<GLuint>(prev_read));
  gl::check("present");
}

Image SceneRenderer::render_image(const SceneState& state) {
  State& s = *state_;
  const int w = std::max(state.width_px, 1), h = std::max(state.height_px, 1);
  s.export_target.ensure(w, h);
  GLint prev = 0;
  glGetIntegerv(GL_FRAMEBUFFER_BINDING, &prev);
  glBindFramebuffer(GL_FRAMEBUFFER, s.export_target.fbo.get());
  s.labels_on_cpu = true;
  draw(state, Region{0, 0, w, h, h});
  s.labels_on_cpu = false;
  glBindFramebuffer(GL_READ_FRAMEBUFFER, s.export_target.fbo.get());
  Image img;
  img.width = w;
  img.height = h;
  img.rgba.resize(static_cast<std::size_t>(w) * h * 4);
  glPixelStorei(GL_PACK_ALIGNMENT, 1);
  glReadPixels(0, 0, w, h, GL_RGBA, GL_UNSIGNED_BYTE, img.rgba.data());
  // The picture is opaque (blending leaves partial alpha where the grid was drawn).
  for (std::size_t i = 3; i < img.rgba.size(); i += 4) img.rgba[i] = 255;
  // GL rows run bottom to top; images run top to bottom.
  const std::size_t row = static_cast<std::size_t>(w) * 4;
  std::vector<std::uint8_t> tmp(row);
  for (int y = 0; y < h / 2; ++y) {
    std::uint8_t* a = &img.rgba[static_cast<std::size_t>(y) * row];
    std::uint8_t* b = &img.rgba[static_cast<std::size_t>(h - 1 - y) * row];
    std::copy(a, a + row, tmp.data());
    std::copy(b, b + row, a);
    std::copy(tmp.data(), tmp.data() + row, b);
  }
  glBindFramebuffer(GL_FRAMEBUFFER, static_cast<GLuint>(prev));
  gl::check("read back");
  if (!s.text_vertices.empty()) {
    // Six vertices a glyph (add_label): a = (x0, y0, u0, v0), c = (x1, y1, u1, v1).
    std::vector<detail::LabelQuad> quads;
    for (std::size_t i = 0; i + 5 < s.text_vertices.size(); i += 6) {
      const TextVertex& a = s.text_vertices[i];
      const TextVertex& c = s.text_vertices[i + 2];
      quads.push_back({a.x, a.y, c.x, c.y, a.u, a.v, c.u, c.v, {a.r, a.g, a.b}});
    }
    detail::draw_label_quads(&img, s.font, quads, s.palette.label_outline);
  }
  return img;
}

void SceneRenderer::set_antialiasing(Antialiasing antialiasing) {
  State& s = *state_;
  s.options.antialiasing = antialiasing;
  if (antialiasing != Antialiasing::Edges) return;
  if (auto edge = s.ensure_edge_program(); !edge.ok()) s.warnings.push_back(edge.error().message);
}

void SceneRenderer::set_user_mesh(const Mesh& mesh) {
  ++state_->user_mesh_generation;
  state_->user_cpu = mesh;
  state_->user_box = State::bounds(mesh);
  state_->user_gpu = upload(mesh);
}

const Mesh& SceneRenderer::mesh(const ModelChoice& choice) const {
  if (choice.user_mesh && !state_->user_cpu.indices.empty()) return state_->user_cpu;
  return state_->cpu_model(choice.kind);
}

Palette& SceneRenderer::palette() {
  return state_->palette;
}
const std::vector<std::string>& SceneRenderer::warnings() const {
  return state_->warnings;
}
std::size_t SceneRenderer::last_triangle_count() const {
  return state_->triangles;
}
bool SceneRenderer::last_draw_reused() const {
  return state_->reused;
}

}  // namespace attiscope::render
