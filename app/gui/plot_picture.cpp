// plot_picture.cpp: the offscreen picture of plotted curves (see plot_picture.hpp): a GL
// texture with its framebuffer, painted with the ImGui OpenGL3 backend itself (so the
// picture looks exactly as if drawn in the window), shown through a blend-off draw callback.
#define GL_GLEXT_PROTOTYPES 1
#include "gui/plot_picture.hpp"

#include <GL/gl.h>
#include <GL/glext.h>
#include <imgui_impl_opengl3.h>

#include <algorithm>
#include <cmath>
#include <cstdint>

#include "gui/redraw.hpp"

namespace attiscope::gui {

namespace {

static_assert(PlotPicture::kTilePx % kCellPx == 0, "tiles of whole damage cells");

ImTextureID as_texture_id(unsigned texture) {
  return reinterpret_cast<ImTextureID>(static_cast<std::uintptr_t>(texture));
}

void disable_blending(const ImDrawList*, const ImDrawCmd*) {
  glDisable(GL_BLEND);
}

}  // namespace

void PlotPicture::begin_content(ImDrawList* content, const ImDrawList& like, ImVec2 min, ImVec2 max) {
  content->_ResetForNewFrame();
  content->Flags = like.Flags;
  content->PushTextureID(ImGui::GetIO().Fonts->TexID);
  content->PushClipRect(min, max, false);
}

bool PlotPicture::ensure_size(int width, int height) {
  if (framebuffer_ != 0 && width == width_ && height == height_) return true;
  if (texture_ == 0) glGenTextures(1, &texture_);
  if (framebuffer_ == 0) glGenFramebuffers(1, &framebuffer_);
  GLint previous_texture = 0, previous_framebuffer = 0;
  glGetIntegerv(GL_TEXTURE_BINDING_2D, &previous_texture);
  glGetIntegerv(GL_FRAMEBUFFER_BINDING, &previous_framebuffer);
  glBindTexture(GL_TEXTURE_2D, texture_);
  glTexImage2D(GL_TEXTURE_2D, 0, GL_RGBA8, width, height, 0, GL_RGBA, GL_UNSIGNED_BYTE, nullptr);
  // Shown at one texel per pixel: nearest sampling is exact and the cheapest on llvmpipe.
  glTexParameteri(GL_TEXTURE_2D, GL_TEXTURE_MIN_FILTER, GL_NEAREST);
  glTexParameteri(GL_TEXTURE_2D, GL_TEXTURE_MAG_FILTER, GL_NEAREST);
  glTexParameteri(GL_TEXTURE_2D, GL_TEXTURE_WRAP_S, GL_CLAMP_TO_EDGE);
  glTexParameteri(GL_TEXTURE_2D, GL_TEXTURE_WRAP_T, GL_CLAMP_TO_EDGE);
  glBindFramebuffer(GL_FRAMEBUFFER, framebuffer_);
  glFramebufferTexture2D(GL_FRAMEBUFFER, GL_COLOR_ATTACHMENT0, GL_TEXTURE_2D, texture_, 0);
  const bool complete = glCheckFramebufferStatus(GL_FRAMEBUFFER) == GL_FRAMEBUFFER_COMPLETE;
  glBindFramebuffer(GL_FRAMEBUFFER, static_cast<GLuint>(previous_framebuffer));
  glBindTexture(GL_TEXTURE_2D, static_cast<GLuint>(previous_texture));
  if (!complete) {
    release();
    return false;
  }
  width_ = width;
  height_ = height;
  return true;
}

bool PlotPicture::paint(ImDrawList* content, ImVec2 min, ImVec2 max, ImVec2 scale) {
  // The backend's own rounding of the target size.
  const int width = static_cast<int>((max.x - min.x) * scale.x);
  const int height = static_cast<int>((max.y - min.y) * scale.y);
  if (width <= 0 || height <= 0 || !ensure_size(width, height)) return false;
  content->_PopUnusedDrawCmd();
  ImDrawList* lists[] = {content};
  ImDrawData data;
  data.Valid = true;
  data.CmdLists = lists;
  data.CmdListsCount = 1;
  data.TotalVtxCount = content->VtxBuffer.Size;
  data.TotalIdxCount = content->IdxBuffer.Size;
  data.DisplayPos = min;
  data.DisplaySize = ImVec2(max.x - min.x, max.y - min.y);
  data.FramebufferScale = scale;
  GLint previous_framebuffer = 0;
  glGetIntegerv(GL_FRAMEBUFFER_BINDING, &previous_framebuffer);
  glBindFramebuffer(GL_FRAMEBUFFER, framebuffer_);
  ImGui_ImplOpenGL3_RenderDrawData(&data);  // sets and restores the viewport and blending
  glBindFramebuffer(GL_FRAMEBUFFER, static_cast<GLuint>(previous_framebuffer));
  ++generation_;
  return true;
}

void PlotPicture::show(ImDrawList* dl, ImVec2 min, ImVec2 max) const {
  if (width_ <= 0 || height_ <= 0 || max.x <= min.x || max.y <= min.y) return;
  // The generation rides on the callback, so a window that repaints only what changed sees
  // a new picture under the same texture as a change (redraw.hpp keys the callbacks).
  dl->AddCallback(disable_blending, reinterpret_cast<void*>(static_cast<std::uintptr_t>(generation_)));
  // In tiles on a fixed grid of the framebuffer, so a partial frame that must repaint a line
  // drawn over the picture (the cursor) repaints only the tiles under it: a triangle touching
  // a dirty cell is drawn whole (redraw.hpp), and the grid's lines fall on cell edges, so a
  // tile does not drag its neighbours in. GL's rows run bottom-up: the picture's top is the
  // texture's last row.
  const ImGuiViewport& viewport = *ImGui::GetMainViewport();
  const ImVec2 scale = ImGui::GetIO().DisplayFramebufferScale;
  const int framebuffer_height = static_cast<int>(std::lround(viewport.Size.y * scale.y));
  const int px0 = static_cast<int>(std::lround((min.x - viewport.Pos.x) * scale.x));
  const int py0 = static_cast<int>(std::lround((min.y - viewport.Pos.y) * scale.y));
  const int px1 = px0 + width_, py1 = py0 + height_;
  const auto point = [&](int x, int y) {
    return ImVec2(viewport.Pos.x + static_cast<float>(x) / scale.x,
                  viewport.Pos.y + static_cast<float>(y) / scale.y);
  };
  // Tiles' edges: columns at whole tiles from the framebuffer's left, rows at whole tiles from
  // its bottom (the damage grid's origin), wherever the picture lies.
  const auto floor_div = [](int a, int b) { return a / b - (a % b != 0 && (a < 0) != (b < 0) ? 1 : 0); };
  for (int ty0 = py0; ty0 < py1;) {
    const int ty1 =
        std::min(py1, framebuffer_height - floor_div(framebuffer_height - ty0 - 1, kTilePx) * kTilePx);
    for (int tx0 = px0; tx0 < px1;) {
      const int tx1 = std::min(px1, (floor_div(tx0, kTilePx) + 1) * kTilePx);
      const ImVec2 uv0(static_cast<float>(tx0 - px0) / static_cast<float>(width_),
                       1.0f - static_cast<float>(ty0 - py0) / static_cast<float>(height_));
      const ImVec2 uv1(static_cast<float>(tx1 - px0) / static_cast<float>(width_),
                       1.0f - static_cast<float>(ty1 - py0) / static_cast<float>(height_));
      dl->AddImage(as_texture_id(texture_), point(tx0, ty0), point(tx1, ty1), uv0, uv1);
      tx0 = tx1;
    }
    ty0 = ty1;
  }
  dl->AddCallback(ImDrawCallback_ResetRenderState, nullptr);
}

ImDrawCallback PlotPicture::opaque_callback() {
  return disable_blending;
}

void PlotPicture::release() {
  if (framebuffer_ != 0) glDeleteFramebuffers(1, &framebuffer_);
  if (texture_ != 0) glDeleteTextures(1, &texture_);
  framebuffer_ = texture_ = 0;
  width_ = height_ = 0;
}

}  // namespace attiscope::gui
