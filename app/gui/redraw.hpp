// redraw.hpp: drawing only the parts of the window that changed since the last frame.
//
// On the software renderer most of a frame's cost is rasterising: every glyph, frame and
// button of every panel, each frame, though a turning body changes only the numbers, the
// views and a few marks. Where the window's back buffer keeps its pixels across a swap
// (Mesa's software drivers copy it to the window and keep it), a frame need only repaint
// the cells whose content changed:
//
// - `drawn_triangles` keys each ImGui triangle by what it draws (its vertices, texture,
//   clip rectangle, draw list and the draw callback in force) and boxes the pixels it can
//   touch;
// - `mark_changes` compares two frames' keys as multisets: a triangle that appeared or went
//   away marks the cells under its box dirty (cells of kCellPx square pixels);
// - the 3D views mark the part of their region whose picture changed (the renderer reads
//   its picture back and compares), or all of it when the region moved;
// - `close_damage` grows the dirty cells until every triangle and view that touches them
//   lies wholly inside them, so what is redrawn never spills onto a clean cell (no stencil
//   is needed: on llvmpipe writing and testing one cost more than the drawing it saved);
// - `PartialPainter` fills the dirty cells with the panel colour, the views that touch them
//   draw, and then only the ImGui triangles that touch them, so the clean cells keep last
//   frame's pixels exactly. A view repaints the box of the dirty cells on it.
//
// A full redraw (the first frames, a resize, new fonts, or a driver whose back buffer is not
// known to be kept) repaints every cell. The script step `redraw-check` compares a partial
// frame with a full redraw of the same frame, pixel for pixel.
#pragma once

#include <imgui.h>

#include <cstdint>
#include <vector>

#include "gui/ui.hpp"

namespace attiscope::gui {

/// Side of a damage cell in framebuffer pixels: smaller than the spacing between widgets, so
/// growing the damage over whole triangles does not run from one widget into the next.
inline constexpr int kCellPx = 4;

/// The dirty cells of one frame, over a framebuffer of width x height pixels. Rectangles are
/// FramebufferRect's: pixels, origin bottom-left (glScissor's arguments).
class DamageGrid {
 public:
  /// Starts a frame: every cell clean, or every cell dirty when the size changed.
  void begin(int width, int height);
  void mark_all();
  /// Marks the cells r covers; true when any of them was clean.
  bool mark(const FramebufferRect& r);
  /// Whether any dirty cell overlaps r.
  bool touches(const FramebufferRect& r) const;
  /// The box of the dirty cells within r, cut to r (empty when none).
  FramebufferRect dirty_bounds(const FramebufferRect& r) const;
  /// Cleans the cells that lie wholly inside r.
  void clear_inside(const FramebufferRect& r);
  bool any() const { return dirty_count_ > 0; }
  bool all() const { return dirty_count_ == columns_ * rows_; }
  /// The dirty cells as few rectangles (runs along rows, stacked where rows agree), clipped to
  /// the framebuffer.
  std::vector<FramebufferRect> rects() const;
  /// Pixels in dirty cells (cells at the edges counted whole).
  int dirty_pixels() const { return dirty_count_ * kCellPx * kCellPx; }
  int width() const { return width_; }
  int height() const { return height_; }

 private:
  /// Visits each row of the cells r covers with the bit masks of its words; false when r
  /// covers no cell.
  template <typename F>
  bool for_rows(const FramebufferRect& r, F&& f) const;
  int width_ = 0, height_ = 0;
  int columns_ = 0, rows_ = 0, words_ = 0;  ///< words_: 64-cell words per row
  int dirty_count_ = 0;
  std::vector<std::uint64_t> bits_;  ///< one bit per cell, rows from the bottom
};

/// One ImGui triangle: what it draws, and the framebuffer pixels it can touch (its box, widened
/// to whole pixels and cut to its clip rectangle).
struct DrawnTriangle {
  std::uint64_t key = 0;
  FramebufferRect box;
};

/// The frame's triangles in draw order, into `out` (those that can touch no pixel are kept
/// with `box` empty, so indices match the draw data's triangles).
void drawn_triangles(const ImDrawData& data, int framebuffer_height, std::vector<DrawnTriangle>* out);

/// The triangles that touch pixels, sorted by key, into `out`: the form mark_changes compares.
void sort_for_comparison(const std::vector<DrawnTriangle>& triangles, std::vector<DrawnTriangle>* out);

/// Marks in `grid` the boxes of triangles in one frame and not the other: both sorted by
/// sort_for_comparison, compared as multisets (equal keys pair up whatever their order).
void mark_changes(const std::vector<DrawnTriangle>& before, const std::vector<DrawnTriangle>& now,
                  DamageGrid& grid);

/// The pixels wholly covered by opaque quads: axis-aligned rectangles (two triangles each, as
/// ImDrawList::AddImage makes) drawn after the callback `opaque` and before the next one,
/// which draws without blending. Each is the pixels whose centres the quad holds (rounded
/// inwards), cut to the scissor box ImGui's OpenGL3 backend sets for its clip rectangle.
void opaque_quads(const ImDrawData& data, ImDrawCallback opaque, int framebuffer_width,
                  int framebuffer_height, std::vector<FramebufferRect>* out);

/// Grows the dirty cells until each triangle that touches them lies inside them, and the
/// dirty part of each region (a view, which repaints the box of its dirty cells) is a box.
void close_damage(DamageGrid& grid, const std::vector<DrawnTriangle>& triangles,
                  const std::vector<FramebufferRect>& regions);

/// The GL side: a kept back buffer's dirty cells filled and redrawn. Needs the window's GL
/// context current; release() before it goes.
class PartialPainter {
 public:
  PartialPainter() = default;
  PartialPainter(const PartialPainter&) = delete;
  PartialPainter& operator=(const PartialPainter&) = delete;
  ~PartialPainter();

  /// Whether the driver is one whose back buffer is known to be kept across a swap (Mesa's
  /// software renderers): the precondition of partial frames. The kept pixels themselves are
  /// checked by probe_before_swap/probe_after_swap.
  static bool driver_keeps_back_buffer();

  /// Partial frames on or off (off: every frame is a full redraw, the window's classic path).
  void set_allowed(bool allowed) { allowed_ = allowed; }
  bool partial() const { return allowed_ && kept_; }
  /// Next frame repaints everything (new fonts, a changed texture).
  void invalidate() { invalidated_ = true; }
  /// The callback before quads drawn opaque (opaque_quads): the fill skips the cells they
  /// cover, which they paint whole.
  void set_opaque_callback(ImDrawCallback callback) { opaque_callback_ = callback; }

  /// Plans the frame from ImGui's draw data: the grid holds the cells that changed.
  void plan(const ImDrawData& data, int framebuffer_width, int framebuffer_height);
  /// After the views have marked their changes: grows the damage over whole triangles and
  /// over the views' regions (`close_damage`).
  void close(const std::vector<FramebufferRect>& view_regions);
  DamageGrid& grid() { return grid_; }
  const DamageGrid& grid() const { return grid_; }

  /// Fills the dirty cells with `colour`.
  void paint_background(const ImVec4& colour);
  /// Draws the ImGui triangles over dirty cells (all of them on a full frame).
  void draw_imgui(const ImDrawData& data);
  /// Keeps this frame's triangles as the next frame's "before".
  void end_frame();

  /// The check that the back buffer keeps its pixels: a few rows read before the first full
  /// frame's swap and again after it; partial frames start when they agree.
  void probe_before_swap();
  void probe_after_swap();

  /// Framebuffer statistics of the last planned frame, for the benchmark.
  int last_dirty_pixels() const { return last_dirty_pixels_; }
  /// Of those, the pixels filled with the panel colour (not under a view or an opaque quad).
  int last_filled_pixels() const { return last_filled_pixels_; }

  void release();

 private:
  bool ensure_gl();
  bool allowed_ = true;
  bool kept_ = false;  ///< the probe found the back buffer kept
  bool probed_ = false;
  bool probe_pending_ = false;
  bool invalidated_ = true;
  bool full_ = true;  ///< this frame repaints everything
  static constexpr int kFullFramesAfterResize = 3;
  int full_frames_left_ = 0;
  int last_dirty_pixels_ = 0, last_filled_pixels_ = 0;
  DamageGrid grid_;
  std::vector<DrawnTriangle> now_;                         ///< this frame's, in draw order
  std::vector<DrawnTriangle> sorted_before_, sorted_now_;  ///< sorted for comparison
  std::vector<FramebufferRect> view_regions_;
  ImDrawCallback opaque_callback_ = nullptr;
  std::vector<FramebufferRect> opaque_;  ///< this frame's opaque_quads
  std::vector<ImDrawList*> filtered_;
  std::vector<unsigned char> probe_;
  unsigned program_ = 0, vao_ = 0, vbo_ = 0;
  int size_uniform_ = -1, colour_uniform_ = -1;
};

}  // namespace attiscope::gui
