// views.hpp: the 3D views of the window (Scene and Gimbal rings), drawn by render/ straight
// into their regions of the window's framebuffer after the frame's clear and before ImGui
// draws the panels (whose popups then stay on top). A view sets its own viewport, scissor
// and depth state and clears its region if it wants another colour; the ImGui backend sets
// all of its own GL state each frame, so a view need not restore any.
#pragma once

#include "gui/ui.hpp"

namespace attiscope::gui {

/// Called once the GL context exists / before it goes.
void views_init();
void views_shutdown();
/// Draws the Scene into ui.scene_viewport and the rings into ui.gimbal_viewport
/// (FramebufferRect: framebuffer pixels, origin bottom-left, the arguments of glViewport).
void views_draw(const Ui& ui);

}  // namespace attiscope::gui
