// redraw.cpp: the damage grid, the triangle keys and the partial painter (see redraw.hpp).
#define GL_GLEXT_PROTOTYPES 1
#include "gui/redraw.hpp"

#include <GL/gl.h>
#include <GL/glext.h>
#include <imgui_impl_opengl3.h>
#include <imgui_internal.h>  // ImGui::GetDrawListSharedData, for lists built outside a frame

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <limits>
#include <string>
#include <utility>
#include <vector>

namespace attiscope::gui {

// --- DamageGrid ---------------------------------------------------------------------------

void DamageGrid::begin(int width, int height) {
  const bool resized = width != width_ || height != height_;
  width_ = std::max(0, width);
  height_ = std::max(0, height);
  columns_ = (width_ + kCellPx - 1) / kCellPx;
  rows_ = (height_ + kCellPx - 1) / kCellPx;
  words_ = (columns_ + 63) / 64;
  bits_.assign(static_cast<std::size_t>(words_) * static_cast<std::size_t>(rows_), 0);
  dirty_count_ = 0;
  if (resized) mark_all();
}

void DamageGrid::mark_all() {
  mark({0, 0, width_, height_});
}

namespace {

/// The mask of bits [b0, b1] (inclusive) within a 64-bit word.
std::uint64_t bit_range(int b0, int b1) {
  const std::uint64_t high = b1 >= 63 ? ~std::uint64_t{0} : (std::uint64_t{1} << (b1 + 1)) - 1;
  return high & ~((std::uint64_t{1} << b0) - 1);
}

}  // namespace

template <typename F>
bool DamageGrid::for_rows(const FramebufferRect& r, F&& f) const {
  if (r.empty() || r.x + r.width <= 0 || r.y + r.height <= 0 || r.x >= width_ || r.y >= height_) return false;
  const int c0 = std::max(0, r.x / kCellPx);
  const int r0 = std::max(0, r.y / kCellPx);
  const int c1 = std::min(columns_ - 1, (r.x + r.width - 1) / kCellPx);
  const int r1 = std::min(rows_ - 1, (r.y + r.height - 1) / kCellPx);
  const int w0 = c0 / 64, w1 = c1 / 64;
  for (int row = r0; row <= r1; ++row) {
    const std::size_t base = static_cast<std::size_t>(row) * static_cast<std::size_t>(words_);
    for (int w = w0; w <= w1; ++w) {
      const std::uint64_t mask = bit_range(w == w0 ? c0 % 64 : 0, w == w1 ? c1 % 64 : 63);
      if (!f(base + static_cast<std::size_t>(w), mask)) return true;
    }
  }
  return true;
}

bool DamageGrid::mark(const FramebufferRect& r) {
  const int before = dirty_count_;
  for_rows(r, [this](std::size_t word, std::uint64_t mask) {
    dirty_count_ += __builtin_popcountll(mask & ~bits_[word]);
    bits_[word] |= mask;
    return true;
  });
  return dirty_count_ != before;
}

bool DamageGrid::touches(const FramebufferRect& r) const {
  if (dirty_count_ == 0) return false;
  bool found = false;
  for_rows(r, [&](std::size_t word, std::uint64_t mask) {
    found = (bits_[word] & mask) != 0;
    return !found;  // stop at the first dirty cell
  });
  return found;
}

FramebufferRect DamageGrid::dirty_bounds(const FramebufferRect& r) const {
  int c0 = columns_, c1 = -1, r0 = rows_, r1 = -1;
  for_rows(r, [&](std::size_t word, std::uint64_t mask) {
    std::uint64_t hit = bits_[word] & mask;
    if (hit == 0) return true;
    const int row = static_cast<int>(word / static_cast<std::size_t>(words_));
    const int base = static_cast<int>(word % static_cast<std::size_t>(words_)) * 64;
    c0 = std::min(c0, base + __builtin_ctzll(hit));
    c1 = std::max(c1, base + 63 - __builtin_clzll(hit));
    r0 = std::min(r0, row);
    r1 = std::max(r1, row);
    return true;
  });
  if (c1 < c0) return {};
  const int x0 = std::max(r.x, c0 * kCellPx), y0 = std::max(r.y, r0 * kCellPx);
  const int x1 = std::min(r.x + r.width, (c1 + 1) * kCellPx),
            y1 = std::min(r.y + r.height, (r1 + 1) * kCellPx);
  return {x0, y0, x1 - x0, y1 - y0};
}

void DamageGrid::clear_inside(const FramebufferRect& r) {
  // The cells wholly inside r: r shrunk to whole cells.
  const int x0 = (std::max(0, r.x) + kCellPx - 1) / kCellPx * kCellPx;
  const int y0 = (std::max(0, r.y) + kCellPx - 1) / kCellPx * kCellPx;
  const int x1 = std::min(r.x + r.width, width_) / kCellPx * kCellPx;
  const int y1 = std::min(r.y + r.height, height_) / kCellPx * kCellPx;
  if (x1 <= x0 || y1 <= y0) return;
  for_rows({x0, y0, x1 - x0, y1 - y0}, [this](std::size_t word, std::uint64_t mask) {
    dirty_count_ -= __builtin_popcountll(mask & bits_[word]);
    bits_[word] &= ~mask;
    return true;
  });
}

std::vector<FramebufferRect> DamageGrid::rects() const {
  struct Open {
    int c0, c1, r0;
  };
  std::vector<FramebufferRect> out;
  std::vector<Open> open, next;
  auto emit = [&](const Open& o, int r_end) {
    const int x = o.c0 * kCellPx, y = o.r0 * kCellPx;
    out.push_back({x, y, std::min((o.c1 + 1) * kCellPx, width_) - x, std::min(r_end * kCellPx, height_) - y});
  };
  auto dirty = [this](int row, int c) {
    const std::uint64_t w = bits_[static_cast<std::size_t>(row) * static_cast<std::size_t>(words_) +
                                  static_cast<std::size_t>(c / 64)];
    return ((w >> (c % 64)) & 1u) != 0;
  };
  for (int row = 0; row <= rows_; ++row) {
    next.clear();
    std::size_t k = 0;  // open runs are in column order, like this row's runs
    for (int c = 0; row < rows_ && c < columns_;) {
      if (!dirty(row, c)) {
        ++c;
        continue;
      }
      const int c0 = c;
      while (c < columns_ && dirty(row, c)) ++c;
      const int c1 = c - 1;
      while (k < open.size() && open[k].c0 < c0) emit(open[k++], row);
      if (k < open.size() && open[k].c0 == c0 && open[k].c1 == c1) {
        next.push_back(open[k++]);  // the same run as the row below: the rectangle grows
      } else {
        next.push_back({c0, c1, row});
      }
    }
    while (k < open.size()) emit(open[k++], row);
    open.swap(next);
  }
  return out;
}

// --- Triangle keys ------------------------------------------------------------------------

namespace {

std::uint64_t mix(std::uint64_t h, std::uint64_t v) {
  h ^= v;
  h *= 0x9E3779B97F4A7C15ULL;
  return h ^ (h >> 29);
}

std::uint64_t bits(float f) {
  std::uint32_t u = 0;
  std::memcpy(&u, &f, sizeof u);
  return u;
}

std::uint64_t vertex_key(std::uint64_t h, const ImDrawVert& v) {
  h = mix(h, bits(v.pos.x) | (bits(v.pos.y) << 32));
  h = mix(h, bits(v.uv.x) | (bits(v.uv.y) << 32));
  return mix(h, v.col);
}

std::uint64_t finish(std::uint64_t h) {
  h ^= h >> 33;
  h *= 0xFF51AFD7ED558CCDULL;
  h ^= h >> 33;
  h *= 0xC4CEB9FE1A85EC53ULL;
  return h ^ (h >> 33);
}

}  // namespace

void drawn_triangles(const ImDrawData& data, int framebuffer_height, std::vector<DrawnTriangle>* out) {
  out->clear();
  out->reserve(static_cast<std::size_t>(data.TotalIdxCount / 3));
  const ImVec2 off = data.DisplayPos, scale = data.FramebufferScale;
  for (int l = 0; l < data.CmdListsCount; ++l) {
    const ImDrawList& list = *data.CmdLists[l];
    std::uint64_t state = mix(0x51ED270B27A1C3F5ULL, static_cast<std::uint64_t>(l));
    for (const ImDrawCmd& cmd : list.CmdBuffer) {
      if (cmd.UserCallback != nullptr) {
        // A callback changes how what follows is drawn (blending, a picture's generation).
        state = mix(state, reinterpret_cast<std::uintptr_t>(cmd.UserCallback));
        state = mix(state, reinterpret_cast<std::uintptr_t>(cmd.UserCallbackData));
        continue;
      }
      std::uint64_t base = mix(state, reinterpret_cast<std::uintptr_t>(cmd.TextureId));
      base = mix(base, bits(cmd.ClipRect.x) | (bits(cmd.ClipRect.y) << 32));
      base = mix(base, bits(cmd.ClipRect.z) | (bits(cmd.ClipRect.w) << 32));
      // The clip rectangle in pixels, top-left origin, widened to whole pixels.
      const float cx0 = std::floor((cmd.ClipRect.x - off.x) * scale.x);
      const float cy0 = std::floor((cmd.ClipRect.y - off.y) * scale.y);
      const float cx1 = std::ceil((cmd.ClipRect.z - off.x) * scale.x);
      const float cy1 = std::ceil((cmd.ClipRect.w - off.y) * scale.y);
      const ImDrawIdx* idx = list.IdxBuffer.Data + cmd.IdxOffset;
      const ImDrawVert* vtx = list.VtxBuffer.Data + cmd.VtxOffset;
      for (unsigned t = 0; t + 2 < cmd.ElemCount; t += 3) {
        const ImDrawVert& a = vtx[idx[t]];
        const ImDrawVert& b = vtx[idx[t + 1]];
        const ImDrawVert& c = vtx[idx[t + 2]];
        DrawnTriangle d;
        d.key = finish(vertex_key(vertex_key(vertex_key(base, a), b), c));
        const float x0 = std::max(cx0, std::floor((std::min({a.pos.x, b.pos.x, c.pos.x}) - off.x) * scale.x));
        const float y0 = std::max(cy0, std::floor((std::min({a.pos.y, b.pos.y, c.pos.y}) - off.y) * scale.y));
        const float x1 = std::min(cx1, std::ceil((std::max({a.pos.x, b.pos.x, c.pos.x}) - off.x) * scale.x));
        const float y1 = std::min(cy1, std::ceil((std::max({a.pos.y, b.pos.y, c.pos.y}) - off.y) * scale.y));
        if (x1 > x0 && y1 > y0) {
          // To GL's bottom-left origin.
          d.box = {static_cast<int>(x0), framebuffer_height - static_cast<int>(y1), static_cast<int>(x1 - x0),
                   static_cast<int>(y1 - y0)};
        }
        out->push_back(d);
      }
    }
  }
}

void sort_for_comparison(const std::vector<DrawnTriangle>& triangles, std::vector<DrawnTriangle>* out) {
  out->clear();
  for (const DrawnTriangle& t : triangles)
    if (!t.box.empty()) out->push_back(t);
  std::sort(out->begin(), out->end(),
            [](const DrawnTriangle& a, const DrawnTriangle& b) { return a.key < b.key; });
}

void mark_changes(const std::vector<DrawnTriangle>& before, const std::vector<DrawnTriangle>& now,
                  DamageGrid& grid) {
  std::size_t i = 0, j = 0;
  while (i < before.size() || j < now.size()) {
    if (j == now.size() || (i < before.size() && before[i].key < now[j].key)) {
      grid.mark(before[i++].box);  // gone: its pixels must be repainted without it
    } else if (i == before.size() || now[j].key < before[i].key) {
      grid.mark(now[j++].box);  // new
    } else {
      ++i;
      ++j;
    }
  }
}

void opaque_quads(const ImDrawData& data, ImDrawCallback opaque, int framebuffer_width,
                  int framebuffer_height, std::vector<FramebufferRect>* out) {
  out->clear();
  if (opaque == nullptr) return;
  const ImVec2 off = data.DisplayPos, scale = data.FramebufferScale;
  for (int l = 0; l < data.CmdListsCount; ++l) {
    const ImDrawList& list = *data.CmdLists[l];
    bool in_opaque = false;
    for (const ImDrawCmd& cmd : list.CmdBuffer) {
      if (cmd.UserCallback != nullptr) {
        in_opaque = cmd.UserCallback == opaque;
        continue;
      }
      if (!in_opaque) continue;
      // The scissor box ImGui_ImplOpenGL3 (1.86) sets for this command, as it rounds it,
      // turned to a top-left origin and cut to the framebuffer.
      const float cx0 = (cmd.ClipRect.x - off.x) * scale.x, cy0 = (cmd.ClipRect.y - off.y) * scale.y;
      const float cx1 = (cmd.ClipRect.z - off.x) * scale.x, cy1 = (cmd.ClipRect.w - off.y) * scale.y;
      if (cx1 <= cx0 || cy1 <= cy0) continue;
      const int scissor_x = static_cast<int>(cx0);
      const int scissor_y =
          static_cast<int>(static_cast<float>(framebuffer_height) - cy1);  // from the bottom
      const int sx0 = std::max(0, scissor_x);
      const int sx1 = std::min(framebuffer_width, scissor_x + static_cast<int>(cx1 - cx0));
      const int sy0 = std::max(0, framebuffer_height - (scissor_y + static_cast<int>(cy1 - cy0)));
      const int sy1 = std::min(framebuffer_height, framebuffer_height - scissor_y);
      const ImDrawIdx* idx = list.IdxBuffer.Data + cmd.IdxOffset;
      const ImDrawVert* vtx = list.VtxBuffer.Data + cmd.VtxOffset;
      for (unsigned q = 0; q + 6 <= cmd.ElemCount; q += 6) {  // the quads, two triangles each
        const ImDrawIdx* quad = idx + q;
        float x0 = vtx[quad[0]].pos.x, x1 = x0, y0 = vtx[quad[0]].pos.y, y1 = y0;
        for (int k = 1; k < 6; ++k) {
          x0 = std::min(x0, vtx[quad[k]].pos.x);
          x1 = std::max(x1, vtx[quad[k]].pos.x);
          y0 = std::min(y0, vtx[quad[k]].pos.y);
          y1 = std::max(y1, vtx[quad[k]].pos.y);
        }
        // Axis-aligned: every corner at the box's edges, and the two triangles' areas adding
        // up to the box's.
        bool corners = true;
        for (int k = 0; k < 6; ++k) {
          const ImVec2 p = vtx[quad[k]].pos;
          corners = corners && (p.x == x0 || p.x == x1) && (p.y == y0 || p.y == y1);
        }
        double area = 0.0;
        for (int k = 0; k < 6; k += 3) {
          const ImVec2 a = vtx[quad[k]].pos, b = vtx[quad[k + 1]].pos, c = vtx[quad[k + 2]].pos;
          area += std::abs(static_cast<double>((b.x - a.x) * (c.y - a.y) - (c.x - a.x) * (b.y - a.y))) * 0.5;
        }
        const double box_area = static_cast<double>(x1 - x0) * static_cast<double>(y1 - y0);
        if (!corners || std::abs(area - box_area) > 1e-3 * std::max(1.0, box_area)) continue;
        // The pixels whose centres lie inside the quad (rounded inwards), within the scissor.
        const int px0 = std::max(sx0, static_cast<int>(std::ceil((x0 - off.x) * scale.x)));
        const int py0 = std::max(sy0, static_cast<int>(std::ceil((y0 - off.y) * scale.y)));
        const int px1 = std::min(sx1, static_cast<int>(std::floor((x1 - off.x) * scale.x)));
        const int py1 = std::min(sy1, static_cast<int>(std::floor((y1 - off.y) * scale.y)));
        if (px1 <= px0 || py1 <= py0) continue;
        out->push_back({px0, framebuffer_height - py1, px1 - px0, py1 - py0});
      }
    }
  }
}

void close_damage(DamageGrid& grid, const std::vector<DrawnTriangle>& triangles,
                  const std::vector<FramebufferRect>& regions) {
  // Each pass adds what touches the damage; it ends when a pass adds nothing (at most every
  // cell, so it ends). A pass looks only at the triangles in the bands of rows that hold
  // dirty cells (the first pass) or where the pass before marked some (a later one): no
  // other triangle can touch a new dirty cell.
  constexpr int kBandPx = 8 * kCellPx;
  const int bands = std::max(1, (grid.height() + kBandPx - 1) / kBandPx);
  const auto band_range = [&](const FramebufferRect& r) {
    const int first = std::clamp(r.y / kBandPx, 0, bands - 1);
    const int last = std::clamp((r.y + r.height - 1) / kBandPx, 0, bands - 1);
    return std::make_pair(first, last);
  };
  std::vector<std::vector<std::uint32_t>> in_band(static_cast<std::size_t>(bands));
  for (std::size_t i = 0; i < triangles.size(); ++i) {
    if (triangles[i].box.empty()) continue;
    const auto [first, last] = band_range(triangles[i].box);
    for (int b = first; b <= last; ++b)
      in_band[static_cast<std::size_t>(b)].push_back(static_cast<std::uint32_t>(i));
  }
  // The last pass that looked at each triangle; kInside once it lies wholly in the damage.
  constexpr int kInside = std::numeric_limits<int>::max();
  std::vector<int> seen(triangles.size(), -1);
  // The first pass: the bands that hold a dirty cell.
  std::vector<char> grew_in(static_cast<std::size_t>(bands), 0), grows_in(static_cast<std::size_t>(bands), 0);
  for (int b = 0; b < bands; ++b)
    grew_in[static_cast<std::size_t>(b)] = grid.touches({0, b * kBandPx, grid.width(), kBandPx}) ? 1 : 0;
  const auto mark = [&](const FramebufferRect& r) {
    if (!grid.mark(r)) return false;
    const auto [first, last] = band_range(r);
    for (int b = first; b <= last; ++b) grows_in[static_cast<std::size_t>(b)] = 1;
    return true;
  };
  for (int pass = 0; !grid.all(); ++pass) {
    bool grew = false;
    for (const FramebufferRect& r : regions)
      if (grid.touches(r)) grew = mark(grid.dirty_bounds(r)) || grew;
    for (int b = 0; b < bands; ++b) {
      if (!grew_in[static_cast<std::size_t>(b)]) continue;
      for (const std::uint32_t i : in_band[static_cast<std::size_t>(b)]) {
        if (seen[i] >= pass) continue;
        seen[i] = pass;
        if (!grid.touches(triangles[i].box)) continue;
        seen[i] = kInside;
        grew = mark(triangles[i].box) || grew;
      }
    }
    if (!grew) break;
    grew_in.swap(grows_in);
    std::fill(grows_in.begin(), grows_in.end(), 0);
  }
}

// --- PartialPainter -----------------------------------------------------------------------

namespace {

constexpr const char* kFillVertex = R"(#version 330 core
layout(location = 0) in vec2 pixel;
uniform vec2 size;
void main() { gl_Position = vec4(pixel / size * 2.0 - 1.0, 0.0, 1.0); }
)";

constexpr const char* kFillFragment = R"(#version 330 core
uniform vec4 colour;
out vec4 result;
void main() { result = colour; }
)";

unsigned compile(GLenum kind, const char* source) {
  const GLuint s = glCreateShader(kind);
  glShaderSource(s, 1, &source, nullptr);
  glCompileShader(s);
  GLint ok = 0;
  glGetShaderiv(s, GL_COMPILE_STATUS, &ok);
  if (!ok) {
    glDeleteShader(s);
    return 0;
  }
  return s;
}

/// The rows the probe compares: a quarter, half and three quarters up the framebuffer.
constexpr int kProbeRows = 3;

void read_probe_rows(int width, int height, std::vector<unsigned char>* out) {
  out->assign(static_cast<std::size_t>(width) * 4 * kProbeRows, 0);
  glPixelStorei(GL_PACK_ALIGNMENT, 1);
  glReadBuffer(GL_BACK);
  for (int k = 0; k < kProbeRows; ++k) {
    glReadPixels(0, height * (k + 1) / (kProbeRows + 1), width, 1, GL_RGBA, GL_UNSIGNED_BYTE,
                 out->data() + static_cast<std::size_t>(k) * static_cast<std::size_t>(width) * 4);
  }
}

}  // namespace

PartialPainter::~PartialPainter() {
  release();
}

bool PartialPainter::driver_keeps_back_buffer() {
  const auto* renderer = reinterpret_cast<const char*>(glGetString(GL_RENDERER));
  const std::string name = renderer ? renderer : "";
  // Mesa's software drivers keep the back buffer and copy it to the window on a swap.
  return name.find("llvmpipe") != std::string::npos || name.find("softpipe") != std::string::npos;
}

bool PartialPainter::ensure_gl() {
  if (program_ != 0) return true;
  const unsigned vs = compile(GL_VERTEX_SHADER, kFillVertex);
  const unsigned fs = compile(GL_FRAGMENT_SHADER, kFillFragment);
  if (vs == 0 || fs == 0) return false;
  program_ = glCreateProgram();
  glAttachShader(program_, vs);
  glAttachShader(program_, fs);
  glLinkProgram(program_);
  glDeleteShader(vs);
  glDeleteShader(fs);
  GLint ok = 0;
  glGetProgramiv(program_, GL_LINK_STATUS, &ok);
  if (!ok) {
    glDeleteProgram(program_);
    program_ = 0;
    return false;
  }
  size_uniform_ = glGetUniformLocation(program_, "size");
  colour_uniform_ = glGetUniformLocation(program_, "colour");
  glGenVertexArrays(1, &vao_);
  glGenBuffers(1, &vbo_);
  glBindVertexArray(vao_);
  glBindBuffer(GL_ARRAY_BUFFER, vbo_);
  glEnableVertexAttribArray(0);
  glVertexAttribPointer(0, 2, GL_FLOAT, GL_FALSE, 2 * sizeof(float), nullptr);
  glBindVertexArray(0);
  return true;
}

void PartialPainter::plan(const ImDrawData& data, int framebuffer_width, int framebuffer_height) {
  if (framebuffer_width != grid_.width() || framebuffer_height != grid_.height()) {
    // The driver makes a new back buffer of the new size when it notices, which may be a
    // frame or two after the size is reported: repaint whole until it has settled.
    full_frames_left_ = kFullFramesAfterResize;
  }
  grid_.begin(framebuffer_width, framebuffer_height);
  drawn_triangles(data, framebuffer_height, &now_);
  sort_for_comparison(now_, &sorted_now_);
  opaque_quads(data, opaque_callback_, framebuffer_width, framebuffer_height, &opaque_);
  full_ = !partial() || invalidated_ || full_frames_left_ > 0 || grid_.all();
  invalidated_ = false;
  full_frames_left_ = std::max(0, full_frames_left_ - 1);
  if (full_) {
    grid_.mark_all();
  } else {
    mark_changes(sorted_before_, sorted_now_, grid_);
  }
}

void PartialPainter::close(const std::vector<FramebufferRect>& view_regions) {
  view_regions_ = view_regions;
  if (!full_) close_damage(grid_, now_, view_regions);
}

void PartialPainter::paint_background(const ImVec4& colour) {
  const int w = grid_.width(), h = grid_.height();
  glViewport(0, 0, w, h);
  glDisable(GL_SCISSOR_TEST);
  if (!full_ && !ensure_gl()) {  // no fill shader: this frame repaints everything
    full_ = true;
    grid_.mark_all();
  }
  if (full_ || grid_.all()) {
    full_ = true;
    glClearColor(colour.x, colour.y, colour.z, 1.0f);
    glClear(GL_COLOR_BUFFER_BIT);
    last_dirty_pixels_ = last_filled_pixels_ = w * h;
    return;
  }
  last_dirty_pixels_ = last_filled_pixels_ = 0;
  if (!grid_.any()) return;
  // A view copies in the box of its dirty cells, which holds every dirty cell inside it, and
  // an opaque quad over dirty cells is drawn whole (close()) and paints every pixel it
  // covers: no fill there.
  DamageGrid fill = grid_;
  for (const FramebufferRect& v : view_regions_) fill.clear_inside(v);
  for (const FramebufferRect& q : opaque_) fill.clear_inside(q);
  const std::vector<FramebufferRect> rects = fill.rects();
  std::vector<float> corners;
  corners.reserve(rects.size() * 12);
  for (const FramebufferRect& r : rects) {
    const auto x0 = static_cast<float>(r.x), y0 = static_cast<float>(r.y);
    const auto x1 = static_cast<float>(r.x + r.width), y1 = static_cast<float>(r.y + r.height);
    corners.insert(corners.end(), {x0, y0, x1, y0, x1, y1, x0, y0, x1, y1, x0, y1});
  }
  last_dirty_pixels_ = grid_.dirty_pixels();
  last_filled_pixels_ = fill.dirty_pixels();
  glDisable(GL_BLEND);
  glDisable(GL_DEPTH_TEST);
  glDisable(GL_STENCIL_TEST);
  glDisable(GL_CULL_FACE);
  glColorMask(GL_TRUE, GL_TRUE, GL_TRUE, GL_TRUE);
  glUseProgram(program_);
  glUniform2f(size_uniform_, static_cast<float>(w), static_cast<float>(h));
  glUniform4f(colour_uniform_, colour.x, colour.y, colour.z, 1.0f);
  glBindVertexArray(vao_);
  glBindBuffer(GL_ARRAY_BUFFER, vbo_);
  glBufferData(GL_ARRAY_BUFFER, static_cast<GLsizeiptr>(corners.size() * sizeof(float)), corners.data(),
               GL_STREAM_DRAW);
  glDrawArrays(GL_TRIANGLES, 0, static_cast<GLsizei>(corners.size() / 2));
  glBindVertexArray(0);
  glUseProgram(0);
}

void PartialPainter::draw_imgui(const ImDrawData& data) {
  if (full_) {
    ImGui_ImplOpenGL3_RenderDrawData(const_cast<ImDrawData*>(&data));
    return;
  }
  if (!grid_.any()) return;
  // Copies of the lists holding only the triangles over dirty cells (which lie wholly inside
  // them: close()).
  while (static_cast<int>(filtered_.size()) < data.CmdListsCount)
    filtered_.push_back(IM_NEW(ImDrawList)(ImGui::GetDrawListSharedData()));
  std::size_t t = 0;  // index into now_, in draw order
  for (int l = 0; l < data.CmdListsCount; ++l) {
    const ImDrawList& src = *data.CmdLists[l];
    ImDrawList& dst = *filtered_[static_cast<std::size_t>(l)];
    dst.CmdBuffer.resize(0);
    dst.IdxBuffer.resize(0);
    dst.VtxBuffer = src.VtxBuffer;
    dst.Flags = src.Flags;
    for (const ImDrawCmd& cmd : src.CmdBuffer) {
      if (cmd.UserCallback != nullptr) {
        dst.CmdBuffer.push_back(cmd);
        continue;
      }
      ImDrawCmd out = cmd;
      out.IdxOffset = static_cast<unsigned>(dst.IdxBuffer.Size);
      const ImDrawIdx* idx = src.IdxBuffer.Data + cmd.IdxOffset;
      for (unsigned k = 0; k + 2 < cmd.ElemCount; k += 3, ++t) {
        if (!grid_.touches(now_[t].box)) continue;
        dst.IdxBuffer.push_back(idx[k]);
        dst.IdxBuffer.push_back(idx[k + 1]);
        dst.IdxBuffer.push_back(idx[k + 2]);
      }
      out.ElemCount = static_cast<unsigned>(dst.IdxBuffer.Size) - out.IdxOffset;
      if (out.ElemCount > 0) dst.CmdBuffer.push_back(out);
    }
  }
  ImDrawData partial = data;
  partial.CmdLists = filtered_.data();
  partial.TotalIdxCount = 0;
  for (int l = 0; l < data.CmdListsCount; ++l)
    partial.TotalIdxCount += filtered_[static_cast<std::size_t>(l)]->IdxBuffer.Size;
  ImGui_ImplOpenGL3_RenderDrawData(&partial);
}

void PartialPainter::end_frame() {
  sorted_before_.swap(sorted_now_);
}

void PartialPainter::probe_before_swap() {
  probe_pending_ = false;
  if (!allowed_ || kept_ || probed_ || !full_) return;
  probed_ = true;  // once: a driver that does not keep the buffer is not asked every frame
  if (!driver_keeps_back_buffer()) return;
  read_probe_rows(grid_.width(), grid_.height(), &probe_);
  probe_pending_ = true;
}

void PartialPainter::probe_after_swap() {
  if (!probe_pending_) return;
  probe_pending_ = false;
  std::vector<unsigned char> after;
  read_probe_rows(grid_.width(), grid_.height(), &after);
  kept_ = after == probe_;
}

void PartialPainter::release() {
  if (program_ != 0) glDeleteProgram(program_);
  if (vbo_ != 0) glDeleteBuffers(1, &vbo_);
  if (vao_ != 0) glDeleteVertexArrays(1, &vao_);
  program_ = vao_ = vbo_ = 0;
  for (ImDrawList* l : filtered_) IM_DELETE(l);
  filtered_.clear();
  kept_ = probed_ = false;
  invalidated_ = true;
}

}  // namespace attiscope::gui
