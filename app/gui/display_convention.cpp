// display_convention.cpp: finding the shipped demo conventions and loading a file.
#include "gui/display_convention.hpp"

#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <system_error>

#include "attiscope/core/convention_file.hpp"

namespace attiscope::gui {

namespace fs = std::filesystem;

bool DisplayConvention::operator==(const DisplayConvention& o) const {
  // The file text names every field, so equal text is an equal convention.
  return path == o.path && convention_to_toml(house) == convention_to_toml(o.house);
}

namespace {

bool has_conventions(const fs::path& dir) {
  std::error_code ec;
  return fs::is_directory(dir / "conventions", ec);
}

}  // namespace

std::string assets_dir() {
  std::error_code ec;
  if (const char* env = std::getenv("ATTISCOPE_ASSETS"); env != nullptr && *env != '\0') {
    if (fs::is_directory(env, ec)) return fs::path(env).lexically_normal().string();
  }
  const fs::path exe = fs::read_symlink("/proc/self/exe", ec);
  if (!ec) {
    const fs::path bin = exe.parent_path();
    for (const char* rel : {"../share/attiscope/assets", "../assets", "../../assets", "../../../assets"}) {
      const fs::path candidate = (bin / rel).lexically_normal();
      if (has_conventions(candidate)) return candidate.string();
    }
  }
#ifdef ATTISCOPE_SOURCE_ASSETS_DIR
  if (has_conventions(ATTISCOPE_SOURCE_ASSETS_DIR)) return ATTISCOPE_SOURCE_ASSETS_DIR;
#endif
  return "";
}

std::vector<std::string> demo_convention_files() {
  std::vector<std::string> out;
  const std::string dir = assets_dir();
  if (dir.empty()) return out;
  std::error_code ec;
  for (const auto& entry : fs::directory_iterator(fs::path(dir) / "conventions", ec)) {
    if (entry.path().extension() == ".toml") out.push_back(entry.path().string());
  }
  std::sort(out.begin(), out.end());
  return out;
}

Expected<DisplayConvention> load_display_convention(const std::string& path,
                                                    std::vector<std::string>* warnings) {
  auto loaded = load_convention(path);
  if (!loaded) return loaded.error();
  if (warnings != nullptr) {
    for (const Error& w : loaded.value().warnings) warnings->push_back(w.describe());
  }
  DisplayConvention d;
  d.house = loaded.value().convention;
  d.path = path;
  return d;
}

}  // namespace attiscope::gui
