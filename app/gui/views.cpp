// views.cpp: the hook between the window and render/. Without render/ in the build the
// regions stay empty (the window's clear colour): nothing is drawn that is not real.
//
// Integration: build with render/ (CMake defines ATTISCOPE_HAS_RENDER when the target
// attiscope_render exists), keep a SceneRenderer here, and in views_draw call it with
// ui.scene_viewport / ui.gimbal_viewport as glViewport + glScissor rectangles and
// ui.doc.pose() as world_R_body.
#include "gui/views.hpp"

namespace attiscope::gui {

void views_init() {}
void views_shutdown() {}
void views_draw(const Ui& ui) {
  (void)ui;
}

}  // namespace attiscope::gui
