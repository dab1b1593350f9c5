// text.hpp: numbers found in a person's text, each with its place, and the explicit
// readings ("--as quat-wxyz ...") of such numbers as a rotation.
//
// The full paste reader (ranked readings of any text) is intake.hpp; this is the layer it
// and the command line share.
#pragma once

#include <Eigen/Core>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/expected.hpp"
#include "attiscope/core/rotation.hpp"

namespace attiscope {

enum class AngleUnit { Degrees, Radians };

/// A number in a text: value and place (1-based line and column in characters, byte
/// offset and length), and the unit written right after it, if any ("30deg", "1.2 rad", "45°").
struct NumberToken {
  double value = 0.0;
  std::optional<AngleUnit> unit;
  int line = 1;
  int column = 1;
  std::size_t offset = 0;
  std::size_t length = 0;
};

/// Finds the numbers in a text. Separators: spaces, tabs, commas, semicolons, brackets,
/// braces, parentheses, newlines. Accepted: sign (including the Unicode minus U+2212 and
/// a leading +), exponents, nan, inf, a unit after the number (deg, degrees, rad, radians,
/// the degree sign). Any other word is an error that names its line and column.
Expected<std::vector<NumberToken>> scan_numbers(std::string_view text);

/// The explicit readings of the command line's --as option.
enum class ReadingKind {
  QuatWxyz,    ///< quat-wxyz
  QuatXyzw,    ///< quat-xyzw
  MatrixRows,  ///< matrix-rows: nine numbers, row-major, body-to-world
  MatrixCols,  ///< matrix-cols: nine numbers, column-major, body-to-world
  Euler,       ///< euler: three angles in application order
  AxisAngle,   ///< axis-angle: x y z angle
  RotVec,      ///< rotvec: three numbers, radians unless --deg was asked for explicitly
};

/// "quat-wxyz" -> ReadingKind. nullopt for an unknown name.
std::optional<ReadingKind> parse_reading_kind(std::string_view name);
/// ReadingKind -> "quat-wxyz".
std::string reading_kind_name(ReadingKind k);
/// Every reading name, for help texts and error messages.
std::string reading_kind_list();

struct ExplicitReadingOptions {
  EulerConvention euler;
  AngleUnit unit = AngleUnit::Degrees;  ///< for Euler angles and the axis-angle angle
  AngleUnit rotvec_unit = AngleUnit::Radians;
};

/// What an explicit reading found besides the rotation.
struct ExplicitReading {
  Rotation rotation;
  std::vector<std::string> warnings;
};

/// Reads the numbers of a text in one explicit reading. Errors name the line and column of
/// the text they are about (the wrong count of numbers names the first surplus number, or
/// the end of the text).
Expected<ExplicitReading> read_explicit(std::string_view text, ReadingKind kind,
                                        const ExplicitReadingOptions& options);

}  // namespace attiscope
