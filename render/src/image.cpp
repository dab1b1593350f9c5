// image.cpp: PNG files: written with libdeflate (level kPngCompressionLevel), read through
// libpng.
#include "attiscope/render/image.hpp"

#include <libdeflate.h>
#include <png.h>

#include <algorithm>
#include <cerrno>
#include <cstdint>
#include <cstdio>
#include <cstring>
#include <memory>
#include <vector>

namespace attiscope::render {

namespace {
struct FileCloser {
  void operator()(std::FILE* f) const {
    if (f) std::fclose(f);
  }
};
using File = std::unique_ptr<std::FILE, FileCloser>;

void put_u32(std::vector<unsigned char>* out, std::uint32_t v) {
  for (int shift = 24; shift >= 0; shift -= 8) out->push_back(static_cast<unsigned char>(v >> shift));
}

/// One PNG chunk: length, type, data, CRC-32 of type and data (PNG specification, 5.3).
void put_chunk(std::vector<unsigned char>* out, const char type[4], const unsigned char* data,
               std::size_t size) {
  put_u32(out, static_cast<std::uint32_t>(size));
  const std::size_t at = out->size();
  out->insert(out->end(), type, type + 4);
  if (size > 0) out->insert(out->end(), data, data + size);
  put_u32(out, libdeflate_crc32(0, &(*out)[at], size + 4));
}

struct CompressorFree {
  void operator()(libdeflate_compressor* c) const { libdeflate_free_compressor(c); }
};

}  // namespace

Expected<bool> write_png(const std::string& path, const Image& image) {
  if (image.width <= 0 || image.height <= 0 ||
      image.rgba.size() != static_cast<std::size_t>(image.width) * image.height * 4) {
    return Error("PNG: the picture is empty");
  }
  // The scanlines: filter byte 0 (none), then R, G, B of each pixel. No row filter: on these
  // flat-shaded pictures it gives the smallest files at level 1 and the fastest encode
  // (measured against up, sub and adaptive filtering).
  const std::size_t row = static_cast<std::size_t>(image.width) * 3 + 1;
  // Buffers left uninitialised (not std::vector's zero fill): the rows are written over
  // anyway, and of the output only the compressed size is ever touched.
  const std::size_t raw_size = row * static_cast<std::size_t>(image.height);
  const std::unique_ptr<unsigned char[]> raw(new unsigned char[raw_size]);
  for (int y = 0; y < image.height; ++y) {
    unsigned char* d = &raw[row * static_cast<std::size_t>(y)];
    const std::uint8_t* src = image.pixel(0, y);
    *d++ = 0;
    for (int x = 0; x < image.width; ++x, src += 4, d += 3) {
      d[0] = src[0];
      d[1] = src[1];
      d[2] = src[2];
    }
  }
  // libdeflate compresses the whole buffer at once: at level 1 about 2.5 times less CPU
  // than zlib's level 1 (which streamed through libpng) and a slightly smaller file.
  std::unique_ptr<libdeflate_compressor, CompressorFree> compressor(
      libdeflate_alloc_compressor(kPngCompressionLevel));
  if (!compressor) return Error("PNG: out of memory");
  std::vector<unsigned char> file = {0x89, 'P', 'N', 'G', '\r', '\n', 0x1a, '\n'};
  std::vector<unsigned char> ihdr;
  put_u32(&ihdr, static_cast<std::uint32_t>(image.width));
  put_u32(&ihdr, static_cast<std::uint32_t>(image.height));
  // 8 bits per channel, colour type 2 (RGB), deflate, the standard filter method, no interlace.
  ihdr.insert(ihdr.end(), {8, 2, 0, 0, 0});
  put_chunk(&file, "IHDR", ihdr.data(), ihdr.size());
  // The zlib stream (RFC 1950) of the scanlines is the one IDAT chunk.
  const std::size_t bound = libdeflate_zlib_compress_bound(compressor.get(), raw_size);
  const std::unique_ptr<unsigned char[]> packed(new unsigned char[bound]);
  const std::size_t size =
      libdeflate_zlib_compress(compressor.get(), raw.get(), raw_size, packed.get(), bound);
  if (size == 0) return Error("PNG: compressing the picture failed");
  file.reserve(file.size() + size + 24);
  put_chunk(&file, "IDAT", packed.get(), size);
  put_chunk(&file, "IEND", nullptr, 0);

  File f(std::fopen(path.c_str(), "wb"));
  if (!f) return Error("'" + path + "': cannot be written: " + std::strerror(errno));
  const bool written = std::fwrite(file.data(), 1, file.size(), f.get()) == file.size();
  const bool closed = std::fclose(f.release()) == 0;
  if (!written || !closed) return Error("'" + path + "': writing the PNG failed: " + std::strerror(errno));
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
