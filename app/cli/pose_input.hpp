// pose_input.hpp: the one place where the command line turns a person's text into a
// rotation. compare and mount read every pose through read_pose_text, so a richer reader
// (the ranked paste reader) replaces the guess here and nowhere else.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "attiscope/core/expected.hpp"
#include "attiscope/core/rotation.hpp"
#include "attiscope/core/text.hpp"
#include "cli/cli.hpp"

namespace attiscope::cli {

/// A pose read from text, with how it was read (so the numbers can be read again another
/// way by the mount check's classifier).
struct PoseText {
  Rotation rotation;
  ReadingKind kind = ReadingKind::QuatWxyz;
  ExplicitReadingOptions options;
  std::string reading;  ///< "quat-wxyz", "euler intrinsic ZYX"
  std::vector<std::string> warnings;
};

/// The explicit-reading options that the shared options (--euler, --deg/--rad) give.
ExplicitReadingOptions reading_options(const CommonOptions& o);

/// Reads one pose: with --as, that reading; without, the reading the count of numbers
/// suggests (3 Euler angles, 4 a quaternion w x y z, 9 a row-major matrix), said in a
/// warning. Errors name the line and column of the text.
Expected<PoseText> read_pose_text(std::string_view text, const CommonOptions& o);

/// Reads a whole file, or standard input for "-". Error when it cannot be read.
Expected<std::string> read_input_file(const std::string& path, std::istream& in);

/// Parses a number option such as --tolerance ("0.5"); error names the option.
Expected<double> parse_number_option(const std::string& name, const std::string& value, bool non_negative);

}  // namespace attiscope::cli
