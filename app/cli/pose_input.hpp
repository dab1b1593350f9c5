// pose_input.hpp: the command line's side of reading poses and files: the shared options
// turned into core's PoseTextOptions (core/pose_text.hpp holds the one text -> pose
// function), files or standard input, and number options.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "attiscope/core/expected.hpp"
#include "attiscope/core/pose_text.hpp"
#include "attiscope/core/rotation.hpp"
#include "attiscope/core/text.hpp"
#include "cli/cli.hpp"

namespace attiscope::cli {

/// The pose-reading options that the shared options (--as, --euler, --deg/--rad,
/// --convention) give, for core's read_pose_text.
PoseTextOptions pose_options(const CommonOptions& o);

/// Reads a whole file, or standard input for "-". Error when it cannot be read.
Expected<std::string> read_input_file(const std::string& path, std::istream& in);

/// Writes a text file (temporary file, then rename). Error when it cannot be written.
Expected<bool> write_text_file(const std::string& path, const std::string& text);

/// The current date and time in UTC, "2026-12-01 20:35 UTC", for check sheets.
std::string utc_date_time();

/// Parses a number option such as --tolerance ("0.5"); error names the option.
Expected<double> parse_number_option(const std::string& name, const std::string& value, bool non_negative);

}  // namespace attiscope::cli
