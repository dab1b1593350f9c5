// convention_file.hpp: the house convention as a TOML file a team commits.
//
// The file the tool writes has a sentence of explanation on every key, and every key may
// be left out (it takes the default of HouseConvention). Unknown keys are warnings with
// their line and column; a malformed file (bad TOML, a wrong type, a value outside the
// allowed words, a left-handed frame) is an error with line and column. Saving is atomic
// (atomic_file.hpp): a failed save never loses the old file.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "attiscope/core/atomic_file.hpp"
#include "attiscope/core/convention.hpp"
#include "attiscope/core/expected.hpp"

namespace attiscope {

/// A convention read from a file, with the warnings (unknown keys) found on the way.
struct LoadedConvention {
  HouseConvention convention;
  std::vector<Error> warnings;  ///< each with line and column
};

/// Reads a convention from TOML text. `source_name` is used in messages only.
Expected<LoadedConvention> parse_convention(std::string_view toml_text, const std::string& source_name = "");
/// Reads a convention file.
Expected<LoadedConvention> load_convention(const std::string& path);

/// The TOML text of a convention, with a comment sentence on every key.
std::string convention_to_toml(const HouseConvention& c);

/// Saves a convention atomically (temporary file in the same folder, then rename).
/// Error when the convention is not valid or the save fails; the old file survives both.
Expected<bool> save_convention(const std::string& path, const HouseConvention& c,
                               const BeforeRenameHook& before_rename = {});

}  // namespace attiscope
