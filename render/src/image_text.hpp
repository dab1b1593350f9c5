// image_text.hpp (internal): text drawn on the CPU into an Image with the baked label font
// (font.hpp), alpha-blended; for pictures made of several views and lines of text (the
// convention card, the mount check sheet).
#pragma once

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

/// Splits text at spaces into lines no wider than `width_px` at `px`.
std::vector<std::string> wrap_to_width(const BakedFont& font, const std::string& text, float px,
                                       float width_px);

}  // namespace attiscope::render::detail
