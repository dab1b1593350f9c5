// text.cpp: number scanning with places, and the explicit readings of the command line.
#include "attiscope/core/text.hpp"

#include <cctype>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <limits>
#include <string>

#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"
#include "attiscope/core/representations.hpp"

namespace attiscope {

namespace {

// Walks a UTF-8 text keeping the 1-based line and column (in characters) of a position.
struct Cursor {
  std::string_view text;
  std::size_t pos = 0;
  int line = 1;
  int column = 1;

  bool done() const { return pos >= text.size(); }
  bool starts_with(std::string_view s) const { return text.substr(pos, s.size()) == s; }
  void advance(std::size_t n) {
    for (std::size_t k = 0; k < n && pos < text.size(); ++k, ++pos) {
      const auto c = static_cast<unsigned char>(text[pos]);
      if (c == '\n') {
        ++line;
        column = 1;
      } else if ((c & 0xC0) != 0x80) {  // count lead bytes only
        ++column;
      }
    }
  }
};

constexpr std::string_view kUnicodeMinus = "\xE2\x88\x92";  // U+2212
constexpr std::string_view kDegreeSign = "\xC2\xB0";        // U+00B0

bool is_separator(unsigned char c) {
  return c == ' ' || c == '\t' || c == '\r' || c == '\n' || c == ',' || c == ';' || c == '[' || c == ']' ||
         c == '(' || c == ')' || c == '{' || c == '}';
}

bool word_is(std::string_view word, std::string_view lower) {
  if (word.size() != lower.size()) return false;
  for (std::size_t i = 0; i < word.size(); ++i) {
    if (std::tolower(static_cast<unsigned char>(word[i])) != lower[i]) return false;
  }
  return true;
}

std::optional<AngleUnit> unit_word(std::string_view w) {
  if (w == kDegreeSign || word_is(w, "deg") || word_is(w, "degrees") || word_is(w, "degree")) {
    return AngleUnit::Degrees;
  }
  if (word_is(w, "rad") || word_is(w, "radians") || word_is(w, "radian")) return AngleUnit::Radians;
  return std::nullopt;
}

// Reads one word (up to a separator) at the cursor.
std::string_view word_at(const Cursor& c) {
  std::size_t end = c.pos;
  while (end < c.text.size() && !is_separator(static_cast<unsigned char>(c.text[end]))) ++end;
  return c.text.substr(c.pos, end - c.pos);
}

// Parses a number word: [sign] (digits | nan | inf | infinity), then an optional unit.
// Returns the length of the number part, 0 when the word does not start with a number.
std::size_t parse_number(std::string_view w, double* value) {
  std::size_t i = 0;
  double sign = 1.0;
  if (w.substr(0, kUnicodeMinus.size()) == kUnicodeMinus) {
    sign = -1.0;
    i = kUnicodeMinus.size();
  } else if (!w.empty() && (w[0] == '-' || w[0] == '+')) {
    sign = w[0] == '-' ? -1.0 : 1.0;
    i = 1;
  }
  const std::string_view rest = w.substr(i);
  for (std::string_view special : {"infinity", "inf", "nan"}) {
    if (rest.size() >= special.size() && word_is(rest.substr(0, special.size()), special)) {
      *value = special == "nan" ? std::nan("") : sign * std::numeric_limits<double>::infinity();
      return i + special.size();
    }
  }
  if (rest.empty() || !(std::isdigit(static_cast<unsigned char>(rest[0])) || rest[0] == '.')) return 0;
  double v = 0.0;
  const auto r = std::from_chars(rest.data(), rest.data() + rest.size(), v);
  if (r.ec != std::errc() && r.ec != std::errc::result_out_of_range) return 0;
  if (r.ec == std::errc::result_out_of_range) {
    // from_chars leaves v untouched when the number is out of range, so "1e5000" would read
    // as 0. strtod says which way: +/-HUGE_VAL (infinite, refused later as not finite) on
    // overflow, 0 or a subnormal on underflow.
    const std::string digits(rest.data(), r.ptr);
    v = std::strtod(digits.c_str(), nullptr);
  }
  *value = sign * v;
  return i + static_cast<std::size_t>(r.ptr - rest.data());
}

}  // namespace

Expected<std::vector<NumberToken>> scan_numbers(std::string_view text) {
  std::vector<NumberToken> out;
  Cursor c{text};
  while (!c.done()) {
    if (is_separator(static_cast<unsigned char>(text[c.pos]))) {
      c.advance(1);
      continue;
    }
    const std::string_view w = word_at(c);
    NumberToken t;
    t.line = c.line;
    t.column = c.column;
    t.offset = c.pos;
    const std::size_t n = parse_number(w, &t.value);
    if (n == 0) {
      if (!out.empty() && !out.back().unit && unit_word(w)) {  // "30 deg"
        out.back().unit = unit_word(w);
        c.advance(w.size());
        continue;
      }
      return Error{"'" + std::string(w) + "' is not a number", t.line, t.column};
    }
    if (n < w.size()) {  // "30deg", "45°"
      const auto u = unit_word(w.substr(n));
      if (!u) return Error{"'" + std::string(w) + "' is not a number", t.line, t.column};
      t.unit = u;
    }
    t.length = n;
    out.push_back(t);
    c.advance(w.size());
  }
  return out;
}

std::optional<ReadingKind> parse_reading_kind(std::string_view name) {
  for (ReadingKind k :
       {ReadingKind::QuatWxyz, ReadingKind::QuatXyzw, ReadingKind::MatrixRows, ReadingKind::MatrixCols,
        ReadingKind::Euler, ReadingKind::AxisAngle, ReadingKind::RotVec}) {
    if (reading_kind_name(k) == name) return k;
  }
  return std::nullopt;
}

std::string reading_kind_name(ReadingKind k) {
  switch (k) {
    case ReadingKind::QuatWxyz: return "quat-wxyz";
    case ReadingKind::QuatXyzw: return "quat-xyzw";
    case ReadingKind::MatrixRows: return "matrix-rows";
    case ReadingKind::MatrixCols: return "matrix-cols";
    case ReadingKind::Euler: return "euler";
    case ReadingKind::AxisAngle: return "axis-angle";
    case ReadingKind::RotVec: return "rotvec";
  }
  return "?";
}

std::string reading_kind_list() {
  return "quat-wxyz, quat-xyzw, matrix-rows, matrix-cols, euler, axis-angle, rotvec";
}

namespace {

std::size_t expected_count(ReadingKind k) {
  switch (k) {
    case ReadingKind::QuatWxyz:
    case ReadingKind::QuatXyzw:
    case ReadingKind::AxisAngle: return 4;
    case ReadingKind::MatrixRows:
    case ReadingKind::MatrixCols: return 9;
    case ReadingKind::Euler:
    case ReadingKind::RotVec: return 3;
  }
  return 0;
}

// Converts an angle token to radians: its own unit wins over the default one.
double to_radians(const NumberToken& t, AngleUnit fallback) {
  const AngleUnit u = t.unit.value_or(fallback);
  return u == AngleUnit::Degrees ? t.value * M_PI / 180.0 : t.value;
}

// Place of the end of a text, for "too few numbers" errors.
Error at_end(std::string_view text, std::string message) {
  int line = 1, column = 1;
  for (std::size_t i = 0; i < text.size(); ++i) {
    const auto ch = static_cast<unsigned char>(text[i]);
    if (ch == '\n') {
      ++line;
      column = 1;
    } else if ((ch & 0xC0) != 0x80) {
      ++column;
    }
  }
  return Error{std::move(message), line, column};
}

// A number with `digits` significant digits, for messages.
std::string fmt(int digits, double a) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", digits, a);
  return buf;
}

}  // namespace

Expected<ExplicitReading> read_explicit(std::string_view text, ReadingKind kind,
                                        const ExplicitReadingOptions& options) {
  auto scanned = scan_numbers(text);
  if (!scanned) return scanned.error();
  const std::vector<NumberToken>& t = scanned.value();
  const std::size_t want = expected_count(kind);
  const std::string shape = reading_kind_name(kind) + " needs " + std::to_string(want) + " numbers";
  if (t.size() < want) {
    return at_end(text, shape + ", got " + std::to_string(t.size()));
  }
  if (t.size() > want) {
    const NumberToken& extra = t[want];
    return Error{shape + ", got " + std::to_string(t.size()) + " (the first surplus number is here)",
                 extra.line, extra.column};
  }
  for (const NumberToken& n : t) {
    if (!std::isfinite(n.value)) return Error{"this number is not finite", n.line, n.column};
  }
  ExplicitReading out;
  auto fail = [&](const Error& e) -> Expected<ExplicitReading> {
    Error placed = e;
    placed.line = t.front().line;
    placed.column = t.front().column;
    return placed;
  };
  switch (kind) {
    case ReadingKind::QuatWxyz:
    case ReadingKind::QuatXyzw: {
      QuatConvention qc;
      qc.layout = kind == ReadingKind::QuatWxyz ? QuatLayout::ScalarFirst : QuatLayout::ScalarLast;
      QuatCheck check;
      auto r = from_quaternion_numbers({t[0].value, t[1].value, t[2].value, t[3].value}, qc, &check);
      if (!r) return fail(r.error());
      if (std::abs(check.norm - 1.0) > kUnitNormTolerance) {
        out.warnings.push_back("the quaternion's norm is " + fmt(9, check.norm) +
                               ", not 1: it was normalised");
      }
      out.rotation = r.value();
      break;
    }
    case ReadingKind::MatrixRows:
    case ReadingKind::MatrixCols: {
      std::array<double, 9> n{};
      for (std::size_t i = 0; i < 9; ++i) n[i] = t[i].value;
      const Eigen::Matrix3d m = matrix_from_numbers(
          n, kind == ReadingKind::MatrixRows ? MatrixStorage::Rows : MatrixStorage::Columns);
      MatrixCheck check;
      auto r = from_matrix(m, Direction::BodyToWorld, &check);
      if (!r) return fail(r.error());
      if (check.orthonormality_defect > kMatrixDefectSilent) {
        out.warnings.push_back("the matrix is not exactly orthonormal (defect " +
                               fmt(3, check.orthonormality_defect) +
                               "): the nearest rotation was used, which moves an axis by up to " +
                               fmt(3, check.correction_deg) + " degrees");
      }
      out.rotation = r.value();
      break;
    }
    case ReadingKind::Euler: {
      const Eigen::Vector3d a(to_radians(t[0], options.unit), to_radians(t[1], options.unit),
                              to_radians(t[2], options.unit));
      out.rotation = from_euler(options.euler, a);
      break;
    }
    case ReadingKind::AxisAngle: {
      auto r = from_axis_angle(Eigen::Vector3d(t[0].value, t[1].value, t[2].value),
                               to_radians(t[3], options.unit));
      if (!r) return fail(r.error());
      const double n = Eigen::Vector3d(t[0].value, t[1].value, t[2].value).norm();
      if (std::abs(n - 1.0) > 1e-6) {
        out.warnings.push_back("the axis has length " + fmt(9, n) + ", not 1: it was normalised");
      }
      out.rotation = r.value();
      break;
    }
    case ReadingKind::RotVec: {
      Eigen::Vector3d v(to_radians(t[0], options.rotvec_unit), to_radians(t[1], options.rotvec_unit),
                        to_radians(t[2], options.rotvec_unit));
      auto r = from_rotation_vector(v);
      if (!r) return fail(r.error());
      out.rotation = r.value();
      break;
    }
  }
  return out;
}

}  // namespace attiscope
