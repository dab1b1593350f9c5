// image.cpp: PNG files through libpng (zlib level kPngCompressionLevel).
#include "attiscope/render/image.hpp"

#include <png.h>

#include <cstdio>
#include <cstring>
#include <memory>

namespace attiscope::render {

namespace {
struct FileCloser {
  void operator()(std::FILE* f) const {
    if (f) std::fclose(f);
  }
};
using File = std::unique_ptr<std::FILE, FileCloser>;
}  // namespace

Expected<bool> write_png(const std::string& path, const Image& image) {
  if (image.width <= 0 || image.height <= 0 ||
      image.rgba.size() != static_cast<std::size_t>(image.width) * image.height * 4) {
    return Error("PNG: the picture is empty");
  }
  File f(std::fopen(path.c_str(), "wb"));
  if (!f) return Error("'" + path + "': cannot be written: " + std::strerror(errno));
  png_structp png = png_create_write_struct(PNG_LIBPNG_VER_STRING, nullptr, nullptr, nullptr);
  png_infop info = png ? png_create_info_struct(png) : nullptr;
  if (!png || !info) {
    png_destroy_write_struct(&png, &info);
    return Error("PNG: out of memory");
  }
  if (setjmp(png_jmpbuf(png))) {
    png_destroy_write_struct(&png, &info);
    return Error("'" + path + "': writing the PNG failed");
  }
  png_init_io(png, f.get());
  png_set_compression_level(png, kPngCompressionLevel);
  // No row filter: on these flat-shaded pictures it gives the smallest files at level 1 and
  // the fastest encode (measured against up, sub and adaptive filtering).
  png_set_filter(png, PNG_FILTER_TYPE_BASE, PNG_FILTER_NONE);
  png_set_IHDR(png, info, static_cast<png_uint_32>(image.width), static_cast<png_uint_32>(image.height), 8,
               PNG_COLOR_TYPE_RGB, PNG_INTERLACE_NONE, PNG_COMPRESSION_TYPE_DEFAULT, PNG_FILTER_TYPE_DEFAULT);
  png_write_info(png, info);
  png_set_filler(png, 0, PNG_FILLER_AFTER);  // rows are RGBA in memory; the file gets RGB
  for (int y = 0; y < image.height; ++y) {
    png_write_row(png, const_cast<png_bytep>(image.pixel(0, y)));
  }
  png_write_end(png, nullptr);
  png_destroy_write_struct(&png, &info);
  return true;
}

Expected<Image> read_png(const std::string& path) {
  File f(std::fopen(path.c_str(), "rb"));
  if (!f) return Error("'" + path + "': cannot be opened");
  png_structp png = png_create_read_struct(PNG_LIBPNG_VER_STRING, nullptr, nullptr, nullptr);
  png_infop info = png ? png_create_info_struct(png) : nullptr;
  if (!png || !info) {
    png_destroy_read_struct(&png, &info, nullptr);
    return Error("PNG: out of memory");
  }
  Image img;
  if (setjmp(png_jmpbuf(png))) {
    png_destroy_read_struct(&png, &info, nullptr);
    return Error("'" + path + "': not a readable PNG");
  }
  png_init_io(png, f.get());
  png_read_info(png, info);
  const auto color = png_get_color_type(png, info);
  if (png_get_bit_depth(png, info) != 8 || (color != PNG_COLOR_TYPE_RGB && color != PNG_COLOR_TYPE_RGBA)) {
    png_destroy_read_struct(&png, &info, nullptr);
    return Error("'" + path + "': only 8-bit RGB or RGBA PNG files are read");
  }
  if (color == PNG_COLOR_TYPE_RGB) png_set_filler(png, 0xff, PNG_FILLER_AFTER);
  png_read_update_info(png, info);
  img.width = static_cast<int>(png_get_image_width(png, info));
  img.height = static_cast<int>(png_get_image_height(png, info));
  img.rgba.resize(static_cast<std::size_t>(img.width) * img.height * 4);
  for (int y = 0; y < img.height; ++y)
    png_read_row(png, &img.rgba[static_cast<std::size_t>(y) * img.width * 4], nullptr);
  png_read_end(png, nullptr);
  png_destroy_read_struct(&png, &info, nullptr);
  return img;
}

}  // namespace attiscope::render
