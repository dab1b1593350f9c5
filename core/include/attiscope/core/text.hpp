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

/// What a piece of a text is, for the paste reader (intake.hpp).
enum class TokenKind {
  Number,     ///< a number (NumberToken), maybe with a unit or an i/j/k suffix
  Word,       ///< a name, a quoted string, a time stamp, a file name: anything else
  Assign,     ///< ':' or '='
  Open,       ///< '[', '{' or '('
  Close,      ///< ']', '}' or ')'
  Comma,      ///< ','
  Semicolon,  ///< ';'
  Newline,    ///< end of a line
};

/// One piece of a text. `number` holds the place (line, column, offset, length) of every
/// token, and the value of a Number.
struct TextToken {
  TokenKind kind = TokenKind::Word;
  NumberToken number;
  std::string_view text;   ///< the token as written (a quoted word without its quotes)
  char imaginary = 0;      ///< 'i', 'j' or 'k' for "0.38k"; 0 otherwise
  bool quoted = false;     ///< a word written in quotes
  bool timestamp = false;  ///< a word that is a date or a clock time ("12:00:01.5", "2026-12-01T...")
  char bracket = 0;        ///< the bracket character of Open and Close
};

struct ScanOptions {
  /// Read "0,5" as 0.5 (a comma between two digits is a decimal comma). For texts whose
  /// fields are split by semicolons or tabs (spreadsheets in many locales).
  bool decimal_comma = false;
};

/// Splits a text into tokens. Never fails: what is not a number is a Word. A unit word after
/// a number ("30 deg") is attached to the number; a lone sign before a number ("- 0.3k") is
/// its sign; a lone '+' between terms is dropped.
std::vector<TextToken> scan_tokens(std::string_view text, const ScanOptions& options = {});

/// True when the text's fields are split by semicolons or tabs and its commas all sit
/// between two digits with at most one comma per field: then the commas are decimal commas.
bool looks_like_decimal_commas(std::string_view text);

/// Finds the numbers in a text. Separators: spaces, tabs, commas, semicolons, brackets,
/// braces, parentheses, newlines. Accepted: sign (including the Unicode minus U+2212 and
/// a leading +), exponents, nan, inf, a unit after the number (deg, degrees, rad, radians,
/// the degree sign). Any other word is an error that names its line and column.
Expected<std::vector<NumberToken>> scan_numbers(std::string_view text, const ScanOptions& options = {});

/// The values of scan_numbers alone; an error carries `field` (which input it was about).
Expected<std::vector<double>> scan_values(std::string_view text, const std::string& field = {});

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
