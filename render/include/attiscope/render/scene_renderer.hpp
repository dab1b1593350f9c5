// scene_renderer.hpp: draws a SceneState with OpenGL 3.3 core: lit, depth-tested body,
// ground grid, world and body triads with letter labels, a translucent reference ghost and
// the gimbal rings; antialiased by one-pixel strips blended along the meshes' outlines,
// creases and borders (edge_strips.hpp), or by a post pass (FXAA-style) when asked.
//
// Needs a current OpenGL 3.3 core context (the window's, or a HeadlessContext) for its whole
// life; create, use and destroy it on that context's thread. It never includes ImGui.
//
// Two targets:
//  - draw(): into a region of the framebuffer bound now (the window's). The scene is drawn
//    into an offscreen target of the region's size (one whole-buffer clear, which llvmpipe
//    does at memory speed, where a scissored clear or a background quad is shaded pixel by
//    pixel), with the edge strips drawn after the meshes (or smoothed offscreen by the post
//    pass, only over the tiles the drawn meshes' footprints touch),
//    copied into the region by a blit (no blending, unlike an ImGui::Image quad; into an X
//    window, whose rows run top-down, llvmpipe still shades it, about 4 ns a pixel) and
//    labelled in place. Closed meshes are drawn with back faces culled. While the camera
//    holds still, only the tiles the last picture's meshes covered are put back from the
//    kept ground picture.
//    An unchanged scene is neither drawn nor smoothed again (RendererOptions::reuse_unchanged).
//    prepare() + present() split draw() for a window that repaints only what changed: the
//    picture is read back and compared, and only the part that changed is copied in;
//  - render_image(): the same into its own export target, read back.
#pragma once

#include <array>
#include <memory>
#include <string>
#include <vector>

#include "attiscope/core/expected.hpp"
#include "attiscope/render/image.hpp"
#include "attiscope/render/mesh.hpp"
#include "attiscope/render/scene.hpp"

namespace attiscope::render {

/// A region of the bound framebuffer, top-left origin (as a window toolkit gives it).
struct Region {
  int x = 0;
  int y = 0;
  int width = 0;
  int height = 0;
  int framebuffer_height = 0;  ///< to flip to OpenGL's bottom-left origin
};

/// A rectangle of a region's pixels, origin bottom-left (glScissor's arguments).
struct RegionPart {
  int x = 0;
  int y = 0;
  int width = 0;
  int height = 0;
  bool empty() const { return width <= 0 || height <= 0; }
};

enum class Antialiasing {
  None,   ///< straight into the target
  Post,   ///< draw into an internal target, then an edge-aware smoothing pass
  Edges,  ///< blended one-pixel strips along the meshes' edges (edge_strips.hpp; default)
};

struct RendererOptions {
  Antialiasing antialiasing = Antialiasing::Edges;
  /// Keep each view's offscreen scene (and any smoothed copy) and show it again when the next
  /// draw of that size has the same pose, camera, overlays and palette (only the labels are
  /// redone).
  bool reuse_unchanged = true;
};

/// RGB palette of the scene (deliberately ours; readable on a projector).
struct Palette {
  std::array<float, 3> background{0.925f, 0.930f, 0.940f};
  std::array<float, 3> grid{0.50f, 0.54f, 0.60f};
  std::array<float, 3> axis_x{0.86f, 0.16f, 0.13f};
  std::array<float, 3> axis_y{0.16f, 0.62f, 0.22f};
  std::array<float, 3> axis_z{0.15f, 0.35f, 0.85f};
  std::array<float, 3> ghost{0.35f, 0.45f, 0.62f};
  std::array<float, 3> highlight{1.0f, 0.78f, 0.25f};
  std::array<float, 3> label_outline{1.0f, 1.0f, 1.0f};
};

class SceneRenderer {
 public:
  /// Compiles the shaders and uploads our models. Error (with the GL log) when a shader
  /// does not compile: the context is not OpenGL 3.3 core.
  static Expected<std::unique_ptr<SceneRenderer>> create(const RendererOptions& options = {});
  ~SceneRenderer();
  SceneRenderer(const SceneRenderer&) = delete;
  SceneRenderer& operator=(const SceneRenderer&) = delete;

  /// Draws into a region of the framebuffer bound now. state.width_px/height_px are ignored
  /// (the region's size is used). Leaves the framebuffer binding as it was, and viewport,
  /// scissor, depth test, blending, culling, program and vertex array in GL's defaults
  /// (disabled / 0), restoring the viewport to the region.
  void draw(const SceneState& state, const Region& region);
  /// draw() in two steps, for a window that repaints only what changed. prepare() makes the
  /// picture draw() would show for `state` in a region of width x height pixels, offscreen,
  /// for view `slot` (0, 1, ...: each keeps its own target and last picture), and returns the
  /// part of the region that differs from the slot's last prepared picture and labels (all
  /// of it the first time or at a new size). present() then copies `part` of that picture
  /// into `region` of the framebuffer bound now and draws the labels, clipped to `part`.
  /// Contract: between two prepares of a slot, present at least the part returned (the
  /// window then shows the last prepared picture everywhere in the region). With `compare`
  /// false nothing is read back (a readback stalls a GPU) and the part is the whole region.
  RegionPart prepare(const SceneState& state, int width, int height, int slot, bool compare = true);
  void present(int slot, const Region& region, const RegionPart& part);

  /// Renders into the renderer's offscreen target of state.width_px x state.height_px and
  /// reads it back.
  Image render_image(const SceneState& state);

  /// Changes the antialiasing of later draws (the window draws without it while a view moves).
  void set_antialiasing(Antialiasing antialiasing);

  /// The mesh drawn for SceneState::model.user_mesh; replaces any earlier one.
  void set_user_mesh(const Mesh& mesh);
  /// The CPU mesh of a model choice (for pick_body).
  const Mesh& mesh(const ModelChoice& choice) const;

  Palette& palette();
  /// Things that went wrong without stopping the picture (no label font found, ...).
  const std::vector<std::string>& warnings() const;
  /// Triangles drawn by the last draw()/render_image() (0 when it reused a kept scene).
  std::size_t last_triangle_count() const;
  /// Did the last draw()/render_image() show the kept scene of an unchanged state?
  bool last_draw_reused() const;

 private:
  SceneRenderer();
  struct State;
  std::unique_ptr<State> state_;
};

}  // namespace attiscope::render
