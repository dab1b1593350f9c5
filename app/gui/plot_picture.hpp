// plot_picture.hpp: an offscreen picture of a part of the window that seldom changes (the
// Track panel's plotted curves): an ImDrawList painted once into a GL texture of its pixel
// size and shown each frame as one opaque quad. Frames that change only what lies on top of
// it (the cursor while scrubbing, the hover read-out) then do not rasterise the thousands of
// triangles of the curves again: llvmpipe pays per triangle and per blended pixel.
//
// GL: every call needs the window's GL context current (the panels are drawn with it) and
// the ImGui OpenGL3 backend initialised; release() before the context goes.
#pragma once

#include <imgui.h>

namespace attiscope::gui {

class PlotPicture {
 public:
  PlotPicture() = default;
  PlotPicture(const PlotPicture&) = delete;
  PlotPicture& operator=(const PlotPicture&) = delete;

  /// An empty list to paint into, in screen coordinates, clipped to min..max, drawn with the
  /// font atlas and the given list's flags (anti-aliasing as in the window).
  static void begin_content(ImDrawList* content, const ImDrawList& like, ImVec2 min, ImVec2 max);
  /// Paints `content` (covering min..max in screen coordinates) into the picture at `scale`
  /// pixels per point. False when GL cannot make the picture (then draw straight instead).
  bool paint(ImDrawList* content, ImVec2 min, ImVec2 max, ImVec2 scale);
  /// Adds the picture to `dl` at min..max (whole pixels) as opaque quads (no blending: the
  /// picture already holds its background), one per tile of kTilePx on the framebuffer.
  void show(ImDrawList* dl, ImVec2 min, ImVec2 max) const;
  /// Frees the texture and framebuffer.
  void release();
  /// The draw callback show() puts before its quad: what follows it until the next callback
  /// is drawn without blending, so covers what lies under it (redraw.hpp skips filling there).
  static ImDrawCallback opaque_callback();
  /// Side of the tiles show() draws, framebuffer pixels: whole damage cells (redraw.hpp).
  static constexpr int kTilePx = 32;

 private:
  bool ensure_size(int width, int height);
  unsigned texture_ = 0;
  unsigned framebuffer_ = 0;
  int width_ = 0, height_ = 0;
  unsigned generation_ = 0;  ///< paints so far
};

}  // namespace attiscope::gui
