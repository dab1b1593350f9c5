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

bool is_space(unsigned char c) {
  return c == ' ' || c == '\t' || c == '\r';
}

// Characters that end a word.
bool is_separator(unsigned char c) {
  return is_space(c) || c == '\n' || c == ',' || c == ';' || c == '[' || c == ']' || c == '(' || c == ')' ||
         c == '{' || c == '}' || c == ':' || c == '=' || c == '"' || c == '\'';
}

bool is_digit(char c) {
  return c >= '0' && c <= '9';
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

// from_chars leaves its value untouched when the number is out of range, so "1e5000" would
// read as 0. strtod says which way: +/-HUGE_VAL (infinite, refused later as not finite) on
// overflow, 0 or a subnormal on underflow.
double out_of_range_value(const char* begin, const char* end) {
  const std::string digits(begin, end);
  return std::strtod(digits.c_str(), nullptr);
}

// The longest number that from_chars reads at the start of s, with a decimal comma read as
// a point when asked. Returns the characters used, 0 when there is no number.
std::size_t read_decimal(std::string_view s, bool decimal_comma, double* value) {
  if (!decimal_comma) {
    const auto r = std::from_chars(s.data(), s.data() + s.size(), *value);
    if (r.ec != std::errc() && r.ec != std::errc::result_out_of_range) return 0;
    if (r.ec == std::errc::result_out_of_range) *value = out_of_range_value(s.data(), r.ptr);
    return static_cast<std::size_t>(r.ptr - s.data());
  }
  char buf[128];
  std::size_t n = 0;
  for (; n < s.size() && n < sizeof buf; ++n) {
    const char c = s[n];
    if (c == ',' && n > 0 && is_digit(s[n - 1]) && n + 1 < s.size() && is_digit(s[n + 1])) {
      buf[n] = '.';
    } else if (is_digit(c) || c == '.' || c == 'e' || c == 'E' || c == '+' || c == '-') {
      buf[n] = c;
    } else {
      break;
    }
  }
  const auto r = std::from_chars(buf, buf + n, *value);
  if (r.ec != std::errc() && r.ec != std::errc::result_out_of_range) return 0;
  if (r.ec == std::errc::result_out_of_range) *value = out_of_range_value(buf, r.ptr);
  return static_cast<std::size_t>(r.ptr - buf);
}

// Parses a number at the start of w: [sign] (digits | nan | inf | infinity). Returns the
// length of the number part, 0 when w does not start with a number.
std::size_t parse_number(std::string_view w, bool decimal_comma, double* value) {
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
  if (rest.empty() || !(is_digit(rest[0]) || (rest[0] == '.' && rest.size() > 1 && is_digit(rest[1])))) {
    return 0;
  }
  double v = 0.0;
  const std::size_t n = read_decimal(rest, decimal_comma, &v);
  if (n == 0) return 0;
  *value = sign * v;
  return i + n;
}

// Length of a date or clock time at the start of s ("12:00:01.25", "2026-12-01T08:00:00Z",
// "2026-12-01"), 0 when there is none.
std::size_t timestamp_length(std::string_view s) {
  auto digits = [&](std::size_t p) {
    std::size_t q = p;
    while (q < s.size() && is_digit(s[q])) ++q;
    return q - p;
  };
  const std::size_t d0 = digits(0);
  if (d0 == 0) return 0;
  std::size_t p = d0;
  bool clock = false;
  if (d0 == 4 && p < s.size() && s[p] == '-' && digits(p + 1) == 2 && p + 3 < s.size() && s[p + 3] == '-' &&
      digits(p + 4) == 2) {
    p += 6;  // a date
    if (p < s.size() && (s[p] == 'T' || s[p] == '_') && digits(p + 1) > 0) {
      ++p;
      p += digits(p);
    } else {
      return p;
    }
  } else if (!(d0 <= 2 && p < s.size() && s[p] == ':' && digits(p + 1) == 2)) {
    return 0;
  }
  while (p < s.size() && s[p] == ':' && digits(p + 1) > 0) {
    clock = true;
    p += 1 + digits(p + 1);
  }
  if (!clock) return 0;
  if (p < s.size() && s[p] == '.' && digits(p + 1) > 0) p += 1 + digits(p + 1);
  while (p < s.size() && (s[p] == 'Z' || s[p] == '+' || s[p] == '-' || s[p] == ':' || is_digit(s[p]))) ++p;
  return p;
}

}  // namespace

bool looks_like_decimal_commas(std::string_view text) {
  bool split_by_semicolon_or_tab = false;
  for (char c : text) {
    if (c == ';' || c == '\t') split_by_semicolon_or_tab = true;
  }
  if (!split_by_semicolon_or_tab) return false;
  bool any = false;
  int commas_in_field = 0;
  for (std::size_t i = 0; i < text.size(); ++i) {
    const char c = text[i];
    if (c == ',') {
      if (i == 0 || i + 1 >= text.size() || !is_digit(text[i - 1]) || !is_digit(text[i + 1])) return false;
      if (++commas_in_field > 1) return false;
      any = true;
    } else if (c == ';' || c == '\t' || c == ' ' || c == '\n' || c == '[' || c == ']') {
      commas_in_field = 0;
    }
  }
  return any;
}

std::vector<TextToken> scan_tokens(std::string_view text, const ScanOptions& options) {
  std::vector<TextToken> out;
  Cursor c{text};
  auto start_token = [&](TokenKind kind) {
    TextToken t;
    t.kind = kind;
    t.number.line = c.line;
    t.number.column = c.column;
    t.number.offset = c.pos;
    return t;
  };
  auto finish = [&](TextToken t, std::size_t length) {
    t.number.length = length;
    t.text = text.substr(t.number.offset, length);
    c.advance(length);
    out.push_back(t);
  };
  while (!c.done()) {
    const auto ch = static_cast<unsigned char>(text[c.pos]);
    if (is_space(ch)) {
      c.advance(1);
      continue;
    }
    switch (ch) {
      case '\n': finish(start_token(TokenKind::Newline), 1); continue;
      case ',': finish(start_token(TokenKind::Comma), 1); continue;
      case ';': finish(start_token(TokenKind::Semicolon), 1); continue;
      case ':':
      case '=': finish(start_token(TokenKind::Assign), 1); continue;
      case '[':
      case '{':
      case '(': {
        TextToken t = start_token(TokenKind::Open);
        t.bracket = static_cast<char>(ch);
        finish(t, 1);
        continue;
      }
      case ']':
      case '}':
      case ')': {
        TextToken t = start_token(TokenKind::Close);
        t.bracket = static_cast<char>(ch);
        finish(t, 1);
        continue;
      }
      case '"':
      case '\'': {
        TextToken t = start_token(TokenKind::Word);
        const std::size_t close = text.find(static_cast<char>(ch), c.pos + 1);
        const std::size_t nl = text.find('\n', c.pos + 1);
        const std::size_t end =
            (close == std::string_view::npos || (nl != std::string_view::npos && nl < close))
                ? std::min(nl, text.size())
                : close + 1;
        t.quoted = true;
        t.number.length = end - c.pos;
        const std::size_t inner_end = close == end - 1 ? end - 1 : end;
        t.text = text.substr(c.pos + 1, inner_end - c.pos - 1);
        c.advance(end - c.pos);
        out.push_back(t);
        continue;
      }
      default: break;
    }
    // A word: up to a separator. The Unicode minus and a lone sign before a number belong
    // to that number.
    std::size_t end = c.pos;
    while (end < text.size() && !is_separator(static_cast<unsigned char>(text[end]))) {
      if (options.decimal_comma && end + 1 < text.size() && text[end + 1] == ',' && is_digit(text[end]) &&
          end + 2 < text.size() && is_digit(text[end + 2])) {
        end += 2;
        continue;
      }
      ++end;
    }
    std::string_view w = text.substr(c.pos, end - c.pos);
    if (options.decimal_comma) {
      // In decimal-comma mode a comma between digits stays inside the word.
      while (end + 1 < text.size() && text[end] == ',' && end > c.pos && is_digit(text[end - 1]) &&
             is_digit(text[end + 1])) {
        ++end;
        while (end < text.size() && !is_separator(static_cast<unsigned char>(text[end]))) ++end;
      }
      w = text.substr(c.pos, end - c.pos);
    }
    const bool lone_sign = w == "-" || w == "+" || w == kUnicodeMinus;
    if (lone_sign) {
      // "- 0.38k": look past the spaces for a number.
      std::size_t p = end;
      while (p < text.size() && is_space(static_cast<unsigned char>(text[p]))) ++p;
      double v = 0.0;
      const std::size_t n = p < text.size() ? parse_number(text.substr(p), options.decimal_comma, &v) : 0;
      if (n > 0) {
        std::size_t q = p;
        while (q < text.size() && !is_separator(static_cast<unsigned char>(text[q]))) ++q;
        // Re-read the number with its sign glued on.
        TextToken t = start_token(TokenKind::Number);
        t.number.value = w == "+" ? v : -v;
        const std::string_view rest = text.substr(p + n, q - p - n);
        if (!rest.empty()) {
          if (auto u = unit_word(rest)) {
            t.number.unit = u;
          } else if (rest.size() == 1 && (rest[0] == 'i' || rest[0] == 'j' || rest[0] == 'k')) {
            t.imaginary = rest[0];
          } else {
            q = p + n;  // the rest becomes its own word
          }
        }
        finish(t, q - c.pos);
        continue;
      }
      if (w == "+") {  // "a + b": a plus between terms
        c.advance(1);
        continue;
      }
    }
    if (!w.empty() && is_digit(w[0])) {
      // A clock time runs through ':' separators: take it whole.
      const std::size_t ts = timestamp_length(text.substr(c.pos));
      if (ts > 0 &&
          (c.pos + ts == text.size() || is_separator(static_cast<unsigned char>(text[c.pos + ts])))) {
        TextToken t = start_token(TokenKind::Word);
        t.timestamp = true;
        finish(t, ts);
        continue;
      }
    }
    double v = 0.0;
    const std::size_t n = parse_number(w, options.decimal_comma, &v);
    if (n > 0) {
      TextToken t = start_token(TokenKind::Number);
      t.number.value = v;
      const std::string_view rest = w.substr(n);
      bool number = true;
      if (!rest.empty()) {
        if (auto u = unit_word(rest)) {
          t.number.unit = u;
        } else if (rest.size() == 1 && (rest[0] == 'i' || rest[0] == 'j' || rest[0] == 'k')) {
          t.imaginary = rest[0];
        } else {
          number = false;  // "1st", "0x1F", "3.png": a word
        }
      }
      if (number) {
        finish(t, w.size());
        continue;
      }
    }
    if (!out.empty() && out.back().kind == TokenKind::Number && !out.back().number.unit &&
        !out.back().imaginary && out.back().number.line == c.line) {
      if (auto u = unit_word(w)) {  // "30 deg"
        out.back().number.unit = u;
        c.advance(w.size());
        continue;
      }
    }
    // "q[0]" stays one word.
    std::size_t len = w.size();
    if (c.pos + len < text.size() && text[c.pos + len] == '[') {
      std::size_t p = c.pos + len + 1;
      while (p < text.size() && is_digit(text[p])) ++p;
      if (p > c.pos + len + 1 && p < text.size() && text[p] == ']') len = p + 1 - c.pos;
    }
    finish(start_token(TokenKind::Word), len);
  }
  return out;
}

Expected<std::vector<NumberToken>> scan_numbers(std::string_view text, const ScanOptions& options) {
  std::vector<NumberToken> out;
  for (const TextToken& t : scan_tokens(text, options)) {
    switch (t.kind) {
      case TokenKind::Number:
        if (t.imaginary) {
          return Error{"'" + std::string(t.text) + "' is a quaternion term, not a plain number",
                       t.number.line, t.number.column};
        }
        out.push_back(t.number);
        break;
      case TokenKind::Word:
      case TokenKind::Assign:
        return Error{"'" + std::string(t.text) + "' is not a number", t.number.line, t.number.column};
      default: break;
    }
  }
  return out;
}

Expected<std::vector<double>> scan_values(std::string_view text, const std::string& field) {
  auto tokens = scan_numbers(text);
  if (!tokens) {
    Error e = tokens.error();
    e.field = field;
    return e;
  }
  std::vector<double> out;
  out.reserve(tokens.value().size());
  for (const NumberToken& t : tokens.value()) out.push_back(t.value);
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
