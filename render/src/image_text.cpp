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
