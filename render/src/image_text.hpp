// image_text.hpp (internal): text drawn on the CPU into an Image with the baked label font
// (font.hpp), alpha-blended; for pictures made of several views and lines of text (the
// convention card, the mount check sheet).
#pragma once

#include <array>
#include <cstdint>
#include <string>
#include <vector>

#include "attiscope/render/image.hpp"
#include "font.hpp"

namespace attiscope::render::detail {

/// Draws one line of printable ASCII with its baseline at y, `px` pixels high, in `ink` (RGB).
void draw_image_text(Image* img, const BakedFont& font, const std::string& text, float x, float y, float px,
                     const std::uint8_t ink[3]);

/// The width of a line as draw_image_text draws it.
float image_text_width(const BakedFont& font, const std::string& text, float px);

/// One glyph of a view's axis label: a screen rectangle (pixels, top-left origin) and its
/// atlas rectangle (texture coordinates), in one colour.
struct LabelQuad {
  float x0, y0, x1, y1;
  float u0, v0, u1, v1;
  std::array<float, 3> color;
};

/// Draws label glyphs into a picture as the renderer's text shader (shaders.hpp,
/// kTextFragment) does on the GPU: a bilinear atlas sample, a halo in `halo` from the
/// largest of 8 samples 2.2 texels around, blended over the picture. Pixel centres inside
/// a rectangle (top and left edges in, bottom and right out, as GL rasterises) are drawn.
void draw_label_quads(Image* img, const BakedFont& font, const std::vector<LabelQuad>& quads,
                      const std::array<float, 3>& halo);

/// Splits text at spaces into lines no wider than `width_px` at `px`.
std::vector<std::string> wrap_to_width(const BakedFont& font, const std::string& text, float px,
                                       float width_px);

}  // namespace attiscope::render::detail
