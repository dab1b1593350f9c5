// views.cpp: the hook between the window and render/. Without render/ in the build the
// regions stay empty (the window's clear colour): nothing is drawn that is not real.
//
// Integration: build with render/ (CMake defines ATTISCOPE_HAS_RENDER when the target
// attiscope_render exists), keep a SceneRenderer here, and in views_draw call it with
// ui.scene_viewport / ui.gimbal_viewport as glViewport + glScissor rectangles and
// ui.doc.pose() as world_R_body.
//
// For now the Scene shows the pose and the Teach panel's overlays only (the scene state is
// built in scene_state_of; the Scene panel's own work replaces that function and keeps the
// apply_teaching_overlay call).
#include "gui/views.hpp"

#ifdef ATTISCOPE_HAS_RENDER
#include <GLFW/glfw3.h>

#include <memory>

#include "attiscope/render/scene_renderer.hpp"
#include "gui/teaching.hpp"
#endif

namespace attiscope::gui {

#ifdef ATTISCOPE_HAS_RENDER
namespace {

/// The window's one renderer, alive between views_init and views_shutdown (the GL context's life).
std::unique_ptr<render::SceneRenderer>& scene_renderer() {
  static std::unique_ptr<render::SceneRenderer> renderer;
  return renderer;
}

render::SceneState scene_state_of(const Ui& ui) {
  render::SceneState s;
  s.world_R_body = ui.doc.pose();
  apply_teaching_overlay(ui, &s);
  return s;
}

}  // namespace

void views_init() {
  auto r = render::SceneRenderer::create();
  if (r) scene_renderer() = std::move(r.value());
}
void views_shutdown() {
  scene_renderer().reset();
}
void views_draw(const Ui& ui) {
  auto& renderer = scene_renderer();
  if (!renderer || ui.scene_viewport.empty()) return;
  GLint viewport[4] = {0, 0, 0, 0};
  glGetIntegerv(GL_VIEWPORT, viewport);  // the window set it to the whole framebuffer
  const FramebufferRect& v = ui.scene_viewport;
  render::Region region{v.x, viewport[3] - (v.y + v.height), v.width, v.height, viewport[3]};
  renderer->draw(scene_state_of(ui), region);
}
#else
void views_init() {}
void views_shutdown() {}
void views_draw(const Ui& ui) {
  (void)ui;
}
#endif

}  // namespace attiscope::gui
