// font.hpp (internal): a small baked bitmap font for the axis labels (stb_truetype over
// a DejaVu face from Debian's fonts-dejavu-core), printable ASCII only.
#pragma once

#include <array>
#include <cstdint>
#include <string>
#include <vector>

namespace attiscope::render::detail {

/// One glyph's place in the atlas and its metrics, in atlas pixels.
struct Glyph {
  float x0, y0, x1, y1;  ///< atlas rectangle
  float xoff, yoff;      ///< offset of the rectangle from the pen (y down)
  float advance;
};

struct BakedFont {
  int width = 0, height = 0;           ///< atlas size
  float pixel_height = 0.0f;           ///< size the glyphs were baked at
  std::vector<std::uint8_t> coverage;  ///< one byte per atlas pixel
  std::array<Glyph, 95> glyphs{};      ///< ' ' .. '~'
};

/// Bakes the first font found of the usual DejaVu paths (or $ATTISCOPE_FONT). Empty
/// coverage when none can be read; `problem` then says why.
BakedFont bake_label_font(float pixel_height, std::string* problem);

}  // namespace attiscope::render::detail
