// display_convention.hpp: how the window writes a rotation for a team. The one model is
// core's HouseConvention (core/convention.hpp), read from and written to a convention file
// (core/convention_file.hpp); the window adds only where it came from. Every card applies
// it. Views only: the document always holds the canonical Rotation (core/rotation.hpp).
#pragma once

#include <string>
#include <vector>

#include "attiscope/core/convention.hpp"
#include "attiscope/core/expected.hpp"

namespace attiscope::gui {

struct DisplayConvention {
  HouseConvention house;  ///< the one source of truth for every card
  std::string path;       ///< the file it was loaded from or saved to; empty: the default

  bool operator==(const DisplayConvention& o) const;
  bool operator!=(const DisplayConvention& o) const { return !(*this == o); }
};

/// The folder of the shipped assets: $ATTISCOPE_ASSETS when it names a folder, else the
/// first of (beside the executable) ../share/attiscope/assets, ../assets, ../../assets,
/// ../../../assets that holds conventions/, else the source tree's assets/ (build time).
/// Empty when none is found.
std::string assets_dir();

/// The demo convention files in assets/conventions/, sorted by name.
std::vector<std::string> demo_convention_files();

/// Loads a convention file into a DisplayConvention; the error carries line and column.
/// `warnings` receives the unknown-key warnings, one line each.
Expected<DisplayConvention> load_display_convention(const std::string& path,
                                                    std::vector<std::string>* warnings = nullptr);

}  // namespace attiscope::gui
