// image_text.cpp: CPU text into an Image (see image_text.hpp).
#include "image_text.hpp"

#include <algorithm>
#include <cmath>

namespace attiscope::render::detail {

void draw_image_text(Image* img, const BakedFont& font, const std::string& text, float x, float y, float px,
                     const std::uint8_t ink[3]) {
  if (font.coverage.empty()) return;
  const float s = px / font.pixel_height;
  float pen = x;
  for (char ch : text) {
    if (ch < 32 || ch >= 127) continue;
    const Glyph& g = font.glyphs[static_cast<std::size_t>(ch - 32)];
    const int w = static_cast<int>(std::ceil((g.x1 - g.x0) * s)),
              h = static_cast<int>(std::ceil((g.y1 - g.y0) * s));
    for (int j = 0; j < h; ++j) {
      for (int i = 0; i < w; ++i) {
        const int tx = static_cast<int>(pen + g.xoff * s) + i, ty = static_cast<int>(y + g.yoff * s) + j;
        if (tx < 0 || ty < 0 || tx >= img->width || ty >= img->height) continue;
        const int ax = std::min(font.width - 1, static_cast<int>(g.x0 + (static_cast<float>(i) + 0.5f) / s));
        const int ay = std::min(font.height - 1, static_cast<int>(g.y0 + (static_cast<float>(j) + 0.5f) / s));
        const float a = font.coverage[static_cast<std::size_t>(ay) * static_cast<std::size_t>(font.width) +
                                      static_cast<std::size_t>(ax)] /
                        255.0f;
        std::uint8_t* p = &img->rgba[(static_cast<std::size_t>(ty) * static_cast<std::size_t>(img->width) +
                                      static_cast<std::size_t>(tx)) *
                                     4];
        for (int k = 0; k < 3; ++k) p[k] = static_cast<std::uint8_t>(p[k] * (1.0f - a) + ink[k] * a);
      }
    }
    pen += g.advance * s;
  }
}

namespace {

/// The atlas sampled as GL_LINEAR with GL_CLAMP_TO_EDGE samples an R8 texture (OpenGL 3.3
/// core specification, 3.8.8), coverage in 0..1.
float sample_atlas(const BakedFont& font, float u, float v) {
  const float x = u * static_cast<float>(font.width) - 0.5f, y = v * static_cast<float>(font.height) - 0.5f;
  const float fx0 = std::floor(x), fy0 = std::floor(y);
  const float ax = x - fx0, ay = y - fy0;
  const int x0 = static_cast<int>(fx0), y0 = static_cast<int>(fy0);
  auto at = [&](int tx, int ty) {
    tx = std::clamp(tx, 0, font.width - 1);
    ty = std::clamp(ty, 0, font.height - 1);
    return static_cast<float>(
        font.coverage[static_cast<std::size_t>(ty) * static_cast<std::size_t>(font.width) +
                      static_cast<std::size_t>(tx)]);
  };
  const float top = at(x0, y0) + (at(x0 + 1, y0) - at(x0, y0)) * ax;
  const float bottom = at(x0, y0 + 1) + (at(x0 + 1, y0 + 1) - at(x0, y0 + 1)) * ax;
  return (top + (bottom - top) * ay) / 255.0f;
}

/// The first pixel whose centre is at or past `edge`, the edge snapped to the 1/256 pixel
/// grid llvmpipe rasterises on (its 8 bits of subpixel precision).
int first_pixel(float edge) {
  constexpr float kSubpixels = 256.0f;
  return static_cast<int>(std::ceil(std::round(edge * kSubpixels) / kSubpixels - 0.5f));
}

}  // namespace

void draw_label_quads(Image* img, const BakedFont& font, const std::vector<LabelQuad>& quads,
                      const std::array<float, 3>& halo) {
  if (font.coverage.empty()) return;
  // The halo's 8 directions, as the shader computes them (t = i * 0.785398).
  std::array<float, 8> dx{}, dy{};
  for (int i = 0; i < 8; ++i) {
    const float t = static_cast<float>(i) * 0.785398f;
    dx[static_cast<std::size_t>(i)] = std::cos(t) * 2.2f / static_cast<float>(font.width);
    dy[static_cast<std::size_t>(i)] = std::sin(t) * 2.2f / static_cast<float>(font.height);
  }
  for (const LabelQuad& q : quads) {
    if (!(q.x1 > q.x0) || !(q.y1 > q.y0)) continue;
    const int i0 = std::max(0, first_pixel(q.x0)), i1 = std::min(img->width, first_pixel(q.x1));
    const int j0 = std::max(0, first_pixel(q.y0)), j1 = std::min(img->height, first_pixel(q.y1));
    const float du = (q.u1 - q.u0) / (q.x1 - q.x0), dv = (q.v1 - q.v0) / (q.y1 - q.y0);
    for (int j = j0; j < j1; ++j) {
      const float v = q.v0 + (static_cast<float>(j) + 0.5f - q.y0) * dv;
      for (int i = i0; i < i1; ++i) {
        const float u = q.u0 + (static_cast<float>(i) + 0.5f - q.x0) * du;
        const float a = sample_atlas(font, u, v);
        float h = 0.0f;
        for (std::size_t k = 0; k < 8; ++k) h = std::max(h, sample_atlas(font, u + dx[k], v + dy[k]));
        const float alpha = std::max(a, h * 0.85f);
        if (alpha < 0.01f) continue;
        const float m = a / std::max(alpha, 1e-3f);
        std::uint8_t* p = &img->rgba[(static_cast<std::size_t>(j) * static_cast<std::size_t>(img->width) +
                                      static_cast<std::size_t>(i)) *
                                     4];
        for (std::size_t c = 0; c < 3; ++c) {
          const float src = halo[c] + (q.color[c] - halo[c]) * m;
          const float out = src * alpha + (static_cast<float>(p[c]) / 255.0f) * (1.0f - alpha);
          p[c] = static_cast<std::uint8_t>(std::lround(std::clamp(out, 0.0f, 1.0f) * 255.0f));
        }
      }
    }
  }
}

float image_text_width(const BakedFont& font, const std::string& text, float px) {
  if (font.coverage.empty()) return 0.0f;
  const float s = px / font.pixel_height;
  float w = 0.0f;
  for (char ch : text) {
    if (ch >= 32 && ch < 127) w += font.glyphs[static_cast<std::size_t>(ch - 32)].advance * s;
  }
  return w;
}

std::vector<std::string> wrap_to_width(const BakedFont& font, const std::string& text, float px,
                                       float width_px) {
  std::vector<std::string> lines;
  std::string line;
  std::size_t start = 0;
  while (start < text.size()) {
    std::size_t end = text.find(' ', start);
    if (end == std::string::npos) end = text.size();
    const std::string word = text.substr(start, end - start);
    const std::string joined = line.empty() ? word : line + " " + word;
    if (!line.empty() && image_text_width(font, joined, px) > width_px) {
      lines.push_back(line);
      line = word;
    } else {
      line = joined;
    }
    start = end + 1;
  }
  if (!line.empty()) lines.push_back(line);
  return lines;
}

}  // namespace attiscope::render::detail
