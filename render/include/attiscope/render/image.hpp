// image.hpp: an RGBA8 picture in memory and its PNG file (written with libdeflate at level 1: fast).
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "attiscope/core/expected.hpp"

namespace attiscope::render {

/// Rows top to bottom, 4 bytes per pixel (R, G, B, A), no padding.
struct Image {
  int width = 0;
  int height = 0;
  std::vector<std::uint8_t> rgba;

  const std::uint8_t* pixel(int x, int y) const {
    return &rgba[(static_cast<std::size_t>(y) * width + x) * 4];
  }
};

/// Deflate level for write_png (libdeflate): 1 is several times faster than the default for
/// a few percent larger files.
inline constexpr int kPngCompressionLevel = 1;

/// Writes an 8-bit RGB PNG (alpha dropped: the pictures are opaque). Error with the reason
/// when the file cannot be written.
Expected<bool> write_png(const std::string& path, const Image& image);

/// Reads an 8-bit RGB or RGBA PNG (for tests and tools). Error when it is not one.
Expected<Image> read_png(const std::string& path);

}  // namespace attiscope::render
