// pose_text.hpp: the one place where a person's text becomes a pose for compare and the
// mount check (command line and window alike). Today it is the explicit reading (--as) or a
// guess by the count of numbers; the ranked paste reader replaces the guess here and
// nowhere else.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "attiscope/core/expected.hpp"
#include "attiscope/core/rotation.hpp"
#include "attiscope/core/text.hpp"

namespace attiscope {

struct PoseTextOptions {
  std::optional<ReadingKind> as;   ///< a forced reading; none: guess by the count of numbers
  ExplicitReadingOptions reading;  ///< Euler convention and angle units
};

/// A pose read from text, with how it was read (so the numbers can be read again another
/// way, as the mount check's classifier does).
struct PoseText {
  Rotation rotation;
  ReadingKind kind = ReadingKind::QuatWxyz;
  ExplicitReadingOptions options;
  std::string reading;  ///< "quat-wxyz", "euler intrinsic ZYX"
  std::vector<std::string> warnings;
};

/// Reads one pose: with `as`, that reading; without, the reading the count of numbers
/// suggests (3 Euler angles, 4 a quaternion w x y z, 9 a row-major matrix), said in a
/// warning. Errors name the line and column of the text.
Expected<PoseText> read_pose_text(std::string_view text, const PoseTextOptions& options);

}  // namespace attiscope
