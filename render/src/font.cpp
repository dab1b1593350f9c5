// font.cpp: bakes the label font with stb_truetype (Debian's libstb-dev).
#define STB_TRUETYPE_IMPLEMENTATION
#define STBTT_STATIC
#include "font.hpp"

#include <stb/stb_truetype.h>

#include <cstdlib>
#include <fstream>
#include <iterator>

namespace attiscope::render::detail {

namespace {
/// Debian's fonts-dejavu-core paths, bold first (labels read better bold on a projector).
const char* const kFontPaths[] = {
    "/usr/share/fonts/truetype/dejavu/DejaVuSans-Bold.ttf",
    "/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf",
};
constexpr int kAtlasSize = 512;
}  // namespace

BakedFont bake_label_font(float pixel_height, std::string* problem) {
  BakedFont font;
  std::vector<std::string> paths;
  if (const char* env = std::getenv("ATTISCOPE_FONT")) paths.emplace_back(env);
  for (const char* p : kFontPaths) paths.emplace_back(p);
  std::vector<unsigned char> ttf;
  for (const std::string& p : paths) {
    std::ifstream in(p, std::ios::binary);
    if (!in) continue;
    ttf.assign(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>());
    if (!ttf.empty()) break;
  }
  if (ttf.empty()) {
    if (problem)
      *problem =
          "no label font found (install fonts-dejavu-core or set ATTISCOPE_FONT): labels are not drawn";
    return font;
  }
  font.width = font.height = kAtlasSize;
  font.pixel_height = pixel_height;
  font.coverage.assign(static_cast<std::size_t>(kAtlasSize) * kAtlasSize, 0);
  stbtt_bakedchar baked[95];
  const int rows = stbtt_BakeFontBitmap(ttf.data(), 0, pixel_height, font.coverage.data(), kAtlasSize,
                                        kAtlasSize, 32, 95, baked);
  if (rows == 0) {
    if (problem) *problem = "the label font could not be read: labels are not drawn";
    font.coverage.clear();
    return font;
  }
  for (int i = 0; i < 95; ++i) {
    const stbtt_bakedchar& b = baked[i];
    font.glyphs[i] = {float(b.x0), float(b.y0), float(b.x1), float(b.y1), b.xoff, b.yoff, b.xadvance};
  }
  return font;
}

}  // namespace attiscope::render::detail
