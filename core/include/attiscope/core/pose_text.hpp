// pose_text.hpp: the one place where a person's text becomes a pose, for every command and
// the window alike: an explicit reading (--as) when one is given; otherwise, under a house
// convention, bare 3, 4 or 9 numbers in the house's printed form; otherwise the top reading
// of the ranked paste reader (intake.hpp), with the house filling its tie-break preferences.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "attiscope/core/convention.hpp"
#include "attiscope/core/expected.hpp"
#include "attiscope/core/intake.hpp"
#include "attiscope/core/rotation.hpp"
#include "attiscope/core/text.hpp"

namespace attiscope {

struct PoseTextOptions {
  std::optional<ReadingKind> as;   ///< a forced reading (--as); it always wins
  ExplicitReadingOptions reading;  ///< Euler convention and angle units
  /// The Euler convention (--euler/--intrinsic/--extrinsic) or the unit (--deg/--rad) of
  /// `reading` was given explicitly: it then overrides the house's.
  bool euler_given = false;
  bool unit_given = false;
  /// A house convention: bare 3/4/9 numbers are read in its printed form, and it fills the
  /// paste reader's preferences.
  std::optional<HouseConvention> house;
};

/// The paste reader's preferences under the options: the house's Euler convention, unit,
/// quaternion layout, matrix storage and world up, overridden by what was given explicitly.
IntakePreferences pose_intake_preferences(const PoseTextOptions& options);

/// A pose read from text, with how it was read (so the numbers can be read again another
/// way, as the mount check's classifier does).
struct PoseText {
  Rotation rotation;
  /// An explicit reading that reproduces `rotation` from `explicit_text`: the mount check
  /// reads those numbers again in other ways.
  ReadingKind kind = ReadingKind::QuatWxyz;
  ExplicitReadingOptions options;
  std::string explicit_text;
  std::string reading;  ///< "quat-wxyz", "euler intrinsic ZYX", "quaternion wxyz", "euler ... (house ...)"
  std::vector<std::string> warnings;
  bool house = false;      ///< read in the house's printed form
  bool ambiguous = false;  ///< the paste reader could not decide (said in `warnings`)
};

/// Reads one pose: with `as`, that reading; under a house convention, bare 3 numbers as its
/// printed Euler angles (unless the Euler convention or unit was given explicitly), 4 as
/// its quaternion, 9 as its matrix; otherwise the paste reader's top reading, with an
/// "ambiguous: ..." warning when the text does not decide. Errors name the line and column.
Expected<PoseText> read_pose_text(std::string_view text, const PoseTextOptions& options);

}  // namespace attiscope
