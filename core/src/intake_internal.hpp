// intake_internal.hpp: what the two halves of the paste reader share: intake.cpp finds the
// structure of a text (labels, sections, loose numbers), intake_shapes.cpp turns a list of
// numbers of a known or guessed shape into scored readings.
#pragma once

#include <string>
#include <vector>

#include "attiscope/core/intake.hpp"

namespace attiscope::intake_detail {

/// Labels that decide a reading put it at this score.
inline constexpr double kScoreDecided = 0.97;
/// Two readings closer than this in score (and with different rotations) are ambiguous.
inline constexpr double kAmbiguityGap = 0.15;
/// The house preference adds this to a reading that matches it (a tie-breaker only).
inline constexpr double kHouseBonus = 0.05;

/// What the text says about the kind of numbers, from a name written before them.
enum class Hint { None, Quaternion, Matrix, Transform, Euler, EulerRpy, EulerYpr, RotationVector, AxisAngle };

/// How the numbers were laid out in the text.
struct Layout {
  int lines = 1;            ///< lines holding the numbers
  int groups = 0;           ///< innermost bracket groups or ';'-separated rows holding them
  int per_group = 0;        ///< numbers per group when every group has the same count, else 0
  bool row_breaks = false;  ///< ';' between rows (a matrix literal)
};

/// Readings of an unlabelled list of numbers. Readings that fail a validity check are left
/// out and their error kept in *first_error (when none is set yet).
std::vector<Reading> shape_readings(const std::vector<NumberToken>& numbers, Hint hint, const Layout& layout,
                                    const IntakePreferences& preferences, std::optional<Error>* first_error);

/// The four numbers (w, x, y, z) as a quaternion reading. Error for a zero quaternion or a
/// number that is not finite, placed at `place`.
Expected<Reading> quaternion_reading(const std::array<double, 4>& wxyz, const NumberToken& place);

/// Euler readings of three angles in application order under `convention`.
Reading euler_reading(const EulerConvention& convention, const Eigen::Vector3d& angles, AngleUnit unit);

/// Decides the unit of angles without a unit word: degrees when a magnitude is beyond 2 pi,
/// or all are round multiples of 15; returns the confidence in [0.5, 1] of the guess.
struct UnitGuess {
  AngleUnit unit = AngleUnit::Degrees;
  double confidence = 0.5;
  bool written = false;  ///< a unit word decided it
  std::string why;
};
UnitGuess guess_angle_unit(const std::vector<NumberToken>& angles, AngleUnit house);

/// Fills body_axes, clamps the score, sorts best first and sets `ambiguous`.
void finish_readings(std::vector<Reading>* readings, const IntakePreferences& preferences, bool* ambiguous);

/// A number with `digits` significant digits.
std::string fmt(double v, int digits = 6);

}  // namespace attiscope::intake_detail
