// columns.cpp: column finding in a pose log, and the bulk reader (file mapped into memory,
// std::from_chars straight into the Track's arrays, no per-line allocation).
#include "attiscope/core/columns.hpp"

#include "attiscope/core/convention.hpp"

#include <fcntl.h>
#include <sys/mman.h>
#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <cctype>
#include <charconv>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cstring>
#include <fstream>
#include <optional>
#include <thread>

namespace attiscope {

namespace {

/// Rows whose quaternion norm is within this of 1 count as unit when finding columns (logs
/// often print three or four digits).
constexpr double kColumnUnitNorm = 1e-2;
/// Rows whose 3x3 is this close to orthonormal count when finding matrix columns.
constexpr double kColumnOrthonormal = 1e-3;
/// Degrees to radians.
constexpr double kRadPerDeg = 3.14159265358979323846 / 180.0;
/// Rows of the sample used for statistics.
constexpr std::size_t kSampleRows = 200;
/// Progress and cancel are looked at every this many bytes.
constexpr std::size_t kProgressStep = std::size_t{4} << 20;

std::string lower(std::string_view s) {
  std::string out(s);
  for (char& c : out) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return out;
}

std::string trim(std::string_view s) {
  std::size_t a = 0, b = s.size();
  while (a < b && (s[a] == ' ' || s[a] == '\t' || s[a] == '\r' || s[a] == '"')) ++a;
  while (b > a && (s[b - 1] == ' ' || s[b - 1] == '\t' || s[b - 1] == '\r' || s[b - 1] == '"')) --b;
  return std::string(s.substr(a, b - a));
}

std::vector<std::string_view> split_lines(std::string_view text) {
  std::vector<std::string_view> out;
  std::size_t p = 0;
  while (p < text.size()) {
    std::size_t e = text.find('\n', p);
    if (e == std::string_view::npos) e = text.size();
    std::string_view l = text.substr(p, e - p);
    if (!l.empty() && l.back() == '\r') l.remove_suffix(1);
    out.push_back(l);
    p = e + 1;
  }
  return out;
}

bool blank_or_comment(std::string_view l) {
  std::size_t i = 0;
  while (i < l.size() && (l[i] == ' ' || l[i] == '\t')) ++i;
  return i == l.size() || l[i] == '#';
}

std::vector<std::string_view> split_fields(std::string_view l, char delim) {
  std::vector<std::string_view> out;
  if (delim == ' ') {
    std::size_t i = 0;
    while (i < l.size()) {
      while (i < l.size() && (l[i] == ' ' || l[i] == '\t')) ++i;
      if (i >= l.size()) break;
      std::size_t e = i;
      while (e < l.size() && l[e] != ' ' && l[e] != '\t') ++e;
      out.push_back(l.substr(i, e - i));
      i = e;
    }
    return out;
  }
  std::size_t p = 0;
  while (true) {
    const std::size_t e = l.find(delim, p);
    out.push_back(l.substr(p, (e == std::string_view::npos ? l.size() : e) - p));
    if (e == std::string_view::npos) break;
    p = e + 1;
  }
  return out;
}

/// Exact powers of ten up to 1e22 (the largest exactly representable in a double).
constexpr double kPow10[23] = {1e0,  1e1,  1e2,  1e3,  1e4,  1e5,  1e6,  1e7,  1e8,  1e9,  1e10, 1e11,
                               1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22};

// The common case "[-]digits[.digits]" with at most 15 significant digits, by Clinger's fast
// path (Clinger 1990, "How to Read Floating Point Numbers Accurately", PLDI): the digits as
// an exact integer m < 2^53 and the exact power 10^k, k <= 22, so m / 10^k is one correctly
// rounded IEEE division: the same double as from_chars. Returns false for anything else
// (exponents, more digits, nan, inf), which from_chars then reads.
// Eight ASCII digits at p as a number, or -1 when they are not all digits: the SWAR method
// of Lemire ("Fast numerical parsing", common practice in CSV readers): three multiplies
// instead of eight dependent multiply-adds. Little-endian byte order.
inline std::int64_t eight_digits(const char* p) {
  std::uint64_t v;
  std::memcpy(&v, p, 8);
  if ((((v & 0xF0F0F0F0F0F0F0F0ull) | (((v + 0x0606060606060606ull) & 0xF0F0F0F0F0F0F0F0ull) >> 4)) !=
       0x3333333333333333ull)) {
    return -1;
  }
  v = ((v & 0x0F0F0F0F0F0F0F0Full) * 2561) >> 8;
  v = ((v & 0x00FF00FF00FF00FFull) * 6553601) >> 16;
  return static_cast<std::int64_t>(((v & 0x0000FFFF0000FFFFull) * 42949672960001ull) >> 32);
}

// Reads a number at b (not past e) by the fast path; returns the end of the number, or
// nullptr when the fast path does not apply.
inline const char* fast_number(const char* b, const char* e, double* v) {
  const char* p = b;
  const bool negative = p < e && *p == '-';
  if (negative) ++p;
  std::uint64_t m = 0;
  int digits = 0;
  int fraction = 0;
  const char* start = p;
  while (p < e && static_cast<unsigned>(*p - '0') < 10) {
    m = m * 10 + static_cast<unsigned>(*p - '0');
    ++digits;
    ++p;
  }
  if (p < e && *p == '.') {
    ++p;
    while (e - p >= 8 && digits <= 7) {
      const std::int64_t d8 = eight_digits(p);
      if (d8 < 0) break;
      m = m * 100000000u + static_cast<std::uint64_t>(d8);
      digits += 8;
      fraction += 8;
      p += 8;
    }
    while (p < e && static_cast<unsigned>(*p - '0') < 10) {
      m = m * 10 + static_cast<unsigned>(*p - '0');
      ++digits;
      ++fraction;
      ++p;
    }
  }
  if (digits == 0 || digits > 15 || p == start) return nullptr;
  const double r = static_cast<double>(m) / kPow10[fraction];
  *v = negative ? -r : r;
  return p;
}

bool fast_decimal(const char* b, const char* e, double* v) {
  return fast_number(b, e, v) == e;
}

// from_chars on a field, with spaces around it allowed and a decimal comma when asked.
bool parse_field(const char* b, const char* e, bool decimal_comma, double* v) {
  while (b < e && (*b == ' ' || *b == '\t' || *b == '"')) ++b;
  while (e > b && (e[-1] == ' ' || e[-1] == '\t' || e[-1] == '\r' || e[-1] == '"')) --e;
  if (b < e && *b == '+') ++b;
  if (b == e) return false;
  if (!decimal_comma && fast_decimal(b, e, v)) return true;
  if (decimal_comma) {
    char buf[64];
    const std::size_t n = static_cast<std::size_t>(e - b);
    if (n >= sizeof buf) return false;
    for (std::size_t i = 0; i < n; ++i) buf[i] = b[i] == ',' ? '.' : b[i];
    const auto r = std::from_chars(buf, buf + n, *v);
    return r.ec == std::errc() && r.ptr == buf + n;
  }
  const auto r = std::from_chars(b, e, *v);
  return r.ec == std::errc() && r.ptr == e;
}

bool parse_sv(std::string_view f, bool decimal_comma, double* v) {
  return parse_field(f.data(), f.data() + f.size(), decimal_comma, v);
}

// The name of a header field without its prefixes: "orientation.w" -> "w", "q_w" -> "w".
std::string bare(std::string name) {
  name = lower(trim(name));
  for (char& c : name) {
    if (c == '/' || c == '.' || c == ':' || c == '[' || c == ']' || c == '(' || c == ')') c = '.';
  }
  while (!name.empty() && name.back() == '.') name.pop_back();
  const auto dot = name.rfind('.');
  if (dot != std::string::npos) name = name.substr(dot + 1);
  return name;
}

int quat_slot(const std::string& n) {
  // 0 = w, 1 = x, 2 = y, 3 = z; -1 when not a quaternion name.
  static constexpr const char* kNames[4][6] = {{"w", "qw", "q_w", "quat_w", "orientation_w", "qs"},
                                               {"x", "qx", "q_x", "quat_x", "orientation_x", "qi"},
                                               {"y", "qy", "q_y", "quat_y", "orientation_y", "qj"},
                                               {"z", "qz", "q_z", "quat_z", "orientation_z", "qk"}};
  for (int s = 0; s < 4; ++s) {
    for (const char* k : kNames[s]) {
      if (n == k) return s;
    }
  }
  return -1;
}

bool time_name(const std::string& n, std::string* unit) {
  const bool named = n == "t" || n.find("time") != std::string::npos ||
                     n.find("stamp") != std::string::npos || n.rfind("t_", 0) == 0 || n == "sec" ||
                     n == "secs";
  if (!named) return false;
  *unit = "";
  for (const char* u : {"ns", "us", "ms"}) {
    const std::string s(u);
    if (n.size() > s.size() && n.compare(n.size() - s.size(), s.size(), s) == 0) *unit = s;
  }
  if (unit->empty() && (n.size() > 2 && n.compare(n.size() - 2, 2, "_s") == 0)) *unit = "s";
  return true;
}

// An Euler angle column name split into its base name and the unit its suffix names:
// "roll_deg", "Pitch (deg)", "yaw[rad]", "attitude.heading_rad", "psi" (no unit).
struct AngleName {
  std::string base;
  std::optional<AngleUnit> unit;
};

std::optional<AngleUnit> angle_unit_word(const std::string& w) {
  if (w == "deg" || w == "degs" || w == "degree" || w == "degrees" || w == "\xc2\xb0")
    return AngleUnit::Degrees;
  if (w == "rad" || w == "rads" || w == "radian" || w == "radians") return AngleUnit::Radians;
  return std::nullopt;
}

AngleName angle_name(const std::string& header) {
  AngleName out;
  std::string s = lower(trim(header));
  // A unit in brackets at the end: "pitch (deg)", "yaw[rad]".
  if (!s.empty() && (s.back() == ')' || s.back() == ']')) {
    const char open = s.back() == ')' ? '(' : '[';
    const auto at = s.rfind(open);
    if (at != std::string::npos) {
      out.unit = angle_unit_word(trim(s.substr(at + 1, s.size() - at - 2)));
      if (out.unit) s = trim(s.substr(0, at));
    }
  }
  // A unit after '_', '-' or a space: "roll_deg", "yaw rad".
  if (!out.unit) {
    const auto at = s.find_last_of("_- ");
    if (at != std::string::npos && at > 0) {
      out.unit = angle_unit_word(s.substr(at + 1));
      if (out.unit) s = trim(s.substr(0, at));
    }
  }
  // Prefixes: "attitude.roll", "imu/yaw", "euler:pitch".
  const auto dot = s.find_last_of("./:");
  if (dot != std::string::npos) s = s.substr(dot + 1);
  out.base = s;
  return out;
}

// Text that reads back as exactly v: plain digits for whole numbers below 1e17, an exponent
// beyond, "inf" or "nan" as they are. (A cast to an integer would be undefined behaviour for
// values out of its range.)
std::string number_text(double v) {
  char buf[40];
  std::snprintf(buf, sizeof buf, "%.17g", v);
  return buf;
}

// Time unit from the magnitude of the values (Unix epoch ranges) or of their steps.
void time_unit_from_values(const std::vector<double>& t, ColumnMapping* m) {
  const double first = std::abs(t.front());
  std::vector<double> steps;
  for (std::size_t i = 1; i < t.size(); ++i) steps.push_back(t[i] - t[i - 1]);
  std::sort(steps.begin(), steps.end());
  const double dt = steps.empty() ? 0.0 : steps[steps.size() / 2];
  bool integers = std::all_of(t.begin(), t.end(), [](double v) { return v == std::floor(v); });
  std::string why;
  // Unix time in 2001..2286 is 1e9..1e10 s.
  if (first >= 1e9 && first < 1e10) {
    m->time_unit = "s";
    why = "values near " + number_text(std::floor(first)) + " look like Unix time in seconds";
  } else if (first >= 1e12 && first < 1e13) {
    m->time_unit = "ms";
    why = "values look like Unix time in milliseconds";
  } else if (first >= 1e15 && first < 1e16) {
    m->time_unit = "us";
    why = "values look like Unix time in microseconds";
  } else if (first >= 1e18) {
    m->time_unit = "ns";
    why = "values look like Unix time in nanoseconds";
  } else if (integers && dt >= 1e5) {
    m->time_unit = "ns";
    why = "integer steps of about " + number_text(dt) + " look like nanoseconds";
  } else if (integers && dt >= 100) {
    m->time_unit = "us";
    why = "integer steps of about " + number_text(dt) + " look like microseconds";
  } else if (integers && dt >= 1) {
    m->time_unit = "ms";
    why = "integer steps of about " + number_text(dt) + " look like milliseconds";
  } else {
    m->time_unit = "s";
    why = "steps below one unit look like seconds";
  }
  m->notes.push_back("time unit " + m->time_unit + ": " + why);
}

double unit_of(const std::string& u) {
  if (u == "ms") return 1e-3;
  if (u == "us") return 1e-6;
  if (u == "ns") return 1e-9;
  return 1.0;
}

bool monotonic(const std::vector<std::vector<double>>& rows, std::size_t c) {
  if (rows.size() < 2) return false;
  std::size_t increases = 0;
  for (std::size_t i = 1; i < rows.size(); ++i) {
    if (rows[i][c] < rows[i - 1][c]) return false;
    if (rows[i][c] > rows[i - 1][c]) ++increases;
  }
  return increases * 2 >= rows.size();
}

/// Any sampled angle beyond this magnitude (a full turn in radians) means the angle columns
/// are in degrees: radians past a full turn are rare in a log, degrees past 6.28 common.
constexpr double kDegreesBeyond = 2.0 * 3.14159265358979323846;

// Euler angle columns named in a header: the house convention's own names first, then the
// common names. Sets the form, columns (application order), convention, unit and notes.
bool find_euler_columns(const std::vector<std::string>& header, std::size_t nc,
                        const std::vector<std::vector<double>>& rows, const ColumnPreferences& prefs,
                        ColumnMapping* m) {
  std::vector<AngleName> names;
  for (std::size_t c = 0; c < header.size() && c < nc; ++c) names.push_back(angle_name(header[c]));
  // The columns of three names (application order), or false when one is missing.
  auto columns_of = [&](const std::array<std::string, 3>& want, std::array<int, 3>* out) {
    for (std::size_t k = 0; k < 3; ++k) {
      (*out)[k] = -1;
      for (std::size_t c = 0; c < names.size(); ++c) {
        if (static_cast<int>(c) != m->time_column && names[c].base == want[k]) {
          (*out)[k] = static_cast<int>(c);
          break;
        }
      }
      if ((*out)[k] < 0) return false;
    }
    return true;
  };
  std::array<int, 3> cols{-1, -1, -1};
  std::string why;
  bool found = false;
  const std::array<std::string, 3> house{lower(prefs.euler_names[0]), lower(prefs.euler_names[1]),
                                         lower(prefs.euler_names[2])};
  if (!house[0].empty() && !house[1].empty() && !house[2].empty() && columns_of(house, &cols)) {
    m->euler = prefs.euler;
    why = "Euler angle columns named as the house convention names its angles (" + prefs.euler_names[0] +
          ", " + prefs.euler_names[1] + ", " + prefs.euler_names[2] + "): " + prefs.euler.name();
    found = true;
  }
  // The common names, yaw about z first, then pitch about y, then roll about x: intrinsic
  // ZYX, the usual aerospace reading of roll, pitch and yaw (common practice).
  static constexpr const char* kCommon[3][3] = {
      {"yaw", "pitch", "roll"}, {"psi", "theta", "phi"}, {"heading", "pitch", "bank"}};
  for (const auto& set : kCommon) {
    if (found) break;
    if (columns_of({set[0], set[1], set[2]}, &cols)) {
      m->euler = EulerConvention{{Axis::Z, Axis::Y, Axis::X}, EulerKind::Intrinsic};
      why = std::string("Euler angle columns named ") + set[2] + ", " + set[1] + ", " + set[0] +
            " in the header: " + "read as intrinsic ZYX (" + set[0] + " about z, then " + set[1] +
            " about y, then " + set[2] + " about x), the usual aerospace reading";
      found = true;
    }
  }
  if (!found) return false;
  m->form = TrackForm::Euler;
  for (std::size_t k = 0; k < 3; ++k) m->rotation_columns[k] = cols[k];
  for (std::size_t k = 3; k < 9; ++k) m->rotation_columns[k] = -1;
  m->notes.push_back(why);
  // The unit: from the names' suffixes, else from the numbers, else the house unit.
  std::optional<AngleUnit> named;
  bool disagree = false;
  for (int c : cols) {
    const auto& u = names[static_cast<std::size_t>(c)].unit;
    if (!u) continue;
    if (named && *named != *u) disagree = true;
    if (!named) named = u;
  }
  if (named) {
    m->euler_unit = *named;
    m->notes.push_back("angle unit " + angle_unit_name(*named) + " from the header names");
    if (disagree) {
      m->ambiguous = true;
      m->notes.push_back("the header names give the angles different units: all are read in " +
                         angle_unit_name(*named));
    }
    return true;
  }
  double largest = 0.0;
  for (const auto& r : rows) {
    for (int c : cols) {
      const double v = std::abs(r[static_cast<std::size_t>(c)]);
      if (std::isfinite(v)) largest = std::max(largest, v);
    }
  }
  if (largest > kDegreesBeyond) {
    m->euler_unit = AngleUnit::Degrees;
    m->notes.push_back("angle unit degrees: sampled angles reach " + std::to_string(largest) +
                       ", beyond a full turn in radians");
  } else {
    m->euler_unit = prefs.euler_unit;
    m->ambiguous = true;
    m->notes.push_back(
        "the angles' unit is not in the header and every sampled angle is within 2 pi: "
        "degrees or radians cannot be told apart, the house unit (" +
        angle_unit_name(prefs.euler_unit) + ") decides");
  }
  return true;
}

/// Objects nested deeper than this in a JSON line are refused (a log line is flat or nearly).
constexpr int kMaxJsonDepth = 8;

// One JSON object on one line, walked without building a tree: on_number(key, value) for
// every number, nested keys joined with '.'. Strings, booleans, nulls and arrays are skipped.
// On failure `why` says what was wrong and `p` points at it.
struct JsonLineWalker {
  const char* p;
  const char* e;
  std::string key;
  const char* why = nullptr;

  void ws() {
    while (p < e && (*p == ' ' || *p == '\t' || *p == '\r')) ++p;
  }
  bool fail(const char* w) {
    why = w;
    return false;
  }
  bool string(std::string* out) {  // at the opening quote
    ++p;
    while (p < e && *p != '"') {
      if (*p == '\\' && ++p >= e) break;
      if (out) out->push_back(*p);
      ++p;
    }
    if (p >= e) return fail("a string is not closed");
    ++p;
    return true;
  }
  bool skip_array() {
    int depth = 0;
    do {
      if (*p == '"') {
        if (!string(nullptr)) return false;
        continue;
      }
      if (*p == '[' || *p == '{') ++depth;
      if (*p == ']' || *p == '}') --depth;
      ++p;
    } while (p < e && depth > 0);
    return depth == 0 ? true : fail("an array is not closed");
  }
  template <class F>
  bool value(F& on_number, int depth) {
    ws();
    if (p >= e) return fail("a value is missing");
    if (*p == '{') return object(on_number, depth + 1);
    if (*p == '"') return string(nullptr);
    if (*p == '[') return skip_array();
    for (const char* word : {"true", "false", "null"}) {
      const std::size_t n = std::strlen(word);
      if (static_cast<std::size_t>(e - p) >= n && std::memcmp(p, word, n) == 0) {
        p += n;
        return true;
      }
    }
    double v = 0.0;
    const auto r = std::from_chars(p, e, v);
    if (r.ec != std::errc() || r.ptr == p) return fail("a value is not a number, string, object or array");
    p = r.ptr;
    on_number(std::string_view(key), v);
    return true;
  }
  template <class F>
  bool object(F& on_number, int depth) {  // at the opening brace
    if (depth > kMaxJsonDepth) return fail("objects nested too deep");
    ++p;
    ws();
    if (p < e && *p == '}') {
      ++p;
      return true;
    }
    const std::size_t prefix = key.size();
    for (;;) {
      ws();
      if (p >= e || *p != '"') return fail("expected a key in double quotes");
      key.resize(prefix);
      if (prefix > 0) key.push_back('.');
      if (!string(&key)) return false;
      ws();
      if (p >= e || *p != ':') return fail("expected ':' after the key");
      ++p;
      if (!value(on_number, depth)) return false;
      key.resize(prefix);
      ws();
      if (p < e && *p == ',') {
        ++p;
        continue;
      }
      if (p < e && *p == '}') {
        ++p;
        return true;
      }
      return fail("expected ',' or '}'");
    }
  }
};

/// Walks the JSON object of line [b, e). Returns 0 when it is one whole object, else the
/// 1-based column of the trouble with `why` set.
template <class F>
std::size_t walk_json_line(const char* b, const char* e, F&& on_number, const char** why) {
  JsonLineWalker w{b, e, {}, nullptr};
  w.ws();
  if (w.p >= e || *w.p != '{') {
    *why = "the line is not a JSON object";
  } else if (w.object(on_number, 1)) {
    w.ws();
    if (w.p == e) return 0;
    *why = "text after the end of the object";
  } else {
    *why = w.why;
  }
  return static_cast<std::size_t>(w.p - b) + 1;
}

bool json_line(std::string_view l) {
  const std::string t = trim(l);
  return !t.empty() && t[0] == '{';
}

}  // namespace

namespace {

// Column finding for JSON lines: the keys of the first object are the header, the numbers
// of the next lines the sample rows, and the CSV column finding decides the rest.
Expected<ColumnMapping> find_json_columns(const std::vector<std::string_view>& lines, std::size_t first,
                                          const ColumnPreferences& prefs) {
  std::vector<std::string> keys;
  const char* why = nullptr;
  {
    const std::string_view l = lines[first];
    const std::size_t col = walk_json_line(
        l.data(), l.data() + l.size(),
        [&](std::string_view k, double) {
          if (std::find(keys.begin(), keys.end(), k) == keys.end()) keys.emplace_back(k);
        },
        &why);
    if (col != 0) return Error{why, static_cast<int>(first + 1), static_cast<int>(col)};
  }
  if (keys.empty()) return Error{"the first JSON object holds no numbers", static_cast<int>(first + 1), 1};
  // The same keys as a CSV text: a header and up to kSampleRows rows of numbers.
  std::string csv;
  for (std::size_t k = 0; k < keys.size(); ++k) {
    std::string name = keys[k];
    std::replace(name.begin(), name.end(), ',', '_');
    csv += (k ? "," : "") + name;
  }
  csv += '\n';
  std::size_t rows = 0;
  std::vector<double> values(keys.size());
  for (std::size_t i = first; i < lines.size() && rows < kSampleRows; ++i) {
    if (blank_or_comment(lines[i])) continue;
    std::vector<bool> seen(keys.size(), false);
    const std::string_view l = lines[i];
    const std::size_t col = walk_json_line(
        l.data(), l.data() + l.size(),
        [&](std::string_view k, double v) {
          const auto it = std::find(keys.begin(), keys.end(), k);
          if (it == keys.end()) return;
          const auto c = static_cast<std::size_t>(it - keys.begin());
          values[c] = v;
          seen[c] = true;
        },
        &why);
    if (col != 0 || std::find(seen.begin(), seen.end(), false) != seen.end()) continue;
    for (std::size_t k = 0; k < keys.size(); ++k) csv += (k ? "," : "") + number_text(values[k]);
    csv += '\n';
    ++rows;
  }
  auto found = find_columns(csv, prefs);
  if (!found) {
    Error e = found.error();
    e.line = static_cast<int>(first + 1);
    e.column = 1;
    return e;
  }
  ColumnMapping m = found.value();
  m.json_lines = true;
  m.json_keys = keys;
  m.header_lines = 0;  // no header line: leading comments count as skipped lines
  m.notes.insert(m.notes.begin(), "one JSON object per line: the keys of line " + std::to_string(first + 1) +
                                      " are the column names");
  return m;
}

}  // namespace

std::string track_form_name(TrackForm f) {
  switch (f) {
    case TrackForm::QuatWxyz: return "quat-wxyz";
    case TrackForm::QuatXyzw: return "quat-xyzw";
    case TrackForm::MatrixRows: return "matrix-rows";
    case TrackForm::MatrixCols: return "matrix-cols";
    case TrackForm::Euler: return "euler";
  }
  return "?";
}

std::size_t track_form_numbers(TrackForm f) {
  switch (f) {
    case TrackForm::QuatWxyz:
    case TrackForm::QuatXyzw: return 4;
    case TrackForm::MatrixRows:
    case TrackForm::MatrixCols: return 9;
    case TrackForm::Euler: return 3;
  }
  return 4;
}

std::string track_reading_text(const ColumnMapping& m) {
  if (m.form != TrackForm::Euler) return track_form_name(m.form);
  return "euler " + m.euler.name() + ", " + angle_unit_name(m.euler_unit);
}

double time_unit_seconds(std::string_view unit) {
  return unit_of(std::string(unit));
}

void assign_column_roles(ColumnMapping* m) {
  for (TrackColumn& c : m->columns) c.role = "ignored";
  m->time_scale = time_unit_seconds(m->time_unit);
  if (m->time_column >= 0 && static_cast<std::size_t>(m->time_column) < m->columns.size())
    m->columns[static_cast<std::size_t>(m->time_column)].role = "time (" + m->time_unit + ")";
  static constexpr const char* kQuatRoles[4] = {"quaternion w", "quaternion x", "quaternion y",
                                                "quaternion z"};
  const std::size_t used = track_form_numbers(m->form);
  const char* unit = m->euler_unit == AngleUnit::Degrees ? "deg" : "rad";
  for (std::size_t k = 0; k < used; ++k) {
    const int col = m->rotation_columns[k];
    if (col < 0 || static_cast<std::size_t>(col) >= m->columns.size()) continue;
    const auto c = static_cast<std::size_t>(col);
    if (used == 3) {
      m->columns[c].role = "euler " + std::to_string(k + 1) + " of " + m->euler.name() + ", about " +
                           axis_letter(m->euler.axes[k]) + " (" + unit + ")";
    } else if (used == 4) {
      m->columns[c].role = kQuatRoles[k];
    } else {
      const std::size_t i = m->form == TrackForm::MatrixRows ? k / 3 : k % 3;
      const std::size_t j = m->form == TrackForm::MatrixRows ? k % 3 : k / 3;
      m->columns[c].role = "matrix r" + std::to_string(i + 1) + std::to_string(j + 1);
    }
  }
}

ColumnPreferences column_preferences(const HouseConvention& house) {
  ColumnPreferences prefs;
  prefs.quat_layout = house.quaternion.layout;
  prefs.matrix_storage = house.matrix.storage;
  prefs.euler = house.euler.convention;
  prefs.euler_unit = house.euler.unit;
  prefs.euler_names = house.euler.names;
  return prefs;
}

Expected<ColumnMapping> find_columns(std::string_view sample, const ColumnPreferences& prefs) {
  ColumnMapping m;
  const std::vector<std::string_view> lines = split_lines(sample);
  std::size_t first = 0;
  while (first < lines.size() && blank_or_comment(lines[first])) ++first;
  if (first >= lines.size()) return Error{"the log has no data lines", 1, 1};
  if (json_line(lines[first])) return find_json_columns(lines, first, prefs);
  // Delimiter from the first non-comment line.
  const std::string_view l0 = lines[first];
  if (l0.find('\t') != std::string_view::npos) {
    m.delimiter = '\t';
  } else if (l0.find(';') != std::string_view::npos) {
    m.delimiter = ';';
  } else if (l0.find(',') != std::string_view::npos) {
    m.delimiter = ',';
  } else {
    m.delimiter = ' ';
  }
  if (m.delimiter == ';' || m.delimiter == '\t') {
    // Decimal commas: a data field like "0,5".
    const std::string_view probe = first + 1 < lines.size() ? lines[first + 1] : l0;
    for (std::string_view f : split_fields(probe, m.delimiter)) {
      double v;
      if (f.find(',') != std::string_view::npos && parse_sv(f, true, &v)) m.decimal_comma = true;
    }
  }
  // Header: the first line has a field that is not a number.
  std::vector<std::string> header;
  {
    bool is_header = false;
    for (std::string_view f : split_fields(l0, m.delimiter)) {
      double v;
      if (!parse_sv(f, m.decimal_comma, &v)) is_header = true;
    }
    if (is_header) {
      for (std::string_view f : split_fields(l0, m.delimiter)) header.push_back(trim(f));
      m.header_lines = first + 1;
    } else {
      m.header_lines = first;
    }
  }
  // Sample rows.
  std::vector<std::vector<double>> rows;
  for (std::size_t i = m.header_lines; i < lines.size() && rows.size() < kSampleRows; ++i) {
    if (blank_or_comment(lines[i])) continue;
    const auto fields = split_fields(lines[i], m.delimiter);
    std::vector<double> r;
    bool ok = true;
    for (std::string_view f : fields) {
      double v;
      if (!parse_sv(f, m.decimal_comma, &v)) {
        ok = false;
        break;
      }
      r.push_back(v);
    }
    if (!ok) continue;
    if (m.column_count == 0) m.column_count = r.size();
    if (r.size() == m.column_count) rows.push_back(std::move(r));
  }
  if (rows.empty())
    return Error{"no line of the log is all numbers", static_cast<int>(m.header_lines + 1), 1};
  const std::size_t nc = m.column_count;
  m.columns.resize(nc);
  for (std::size_t c = 0; c < nc; ++c) {
    m.columns[c].name =
        c < header.size() && !header[c].empty() ? header[c] : "column " + std::to_string(c + 1);
    m.columns[c].role = "ignored";
  }
  bool found = false;
  std::string time_unit_named;
  // 1. Header names.
  if (!header.empty()) {
    std::array<int, 4> q{-1, -1, -1, -1};
    std::array<int, 5> qn{-1, -1, -1, -1, -1};  // q0..q4
    std::array<int, 9> r{-1, -1, -1, -1, -1, -1, -1, -1, -1};
    for (std::size_t c = 0; c < header.size() && c < nc; ++c) {
      const std::string b = bare(header[c]);
      std::string u;
      if (m.time_column < 0 && time_name(b, &u)) {
        m.time_column = static_cast<int>(c);
        time_unit_named = u;
        continue;
      }
      const int s = quat_slot(b);
      if (s >= 0 && q[static_cast<std::size_t>(s)] < 0) q[static_cast<std::size_t>(s)] = static_cast<int>(c);
      if (b.size() == 2 && b[0] == 'q' && b[1] >= '0' && b[1] <= '4')
        qn[static_cast<std::size_t>(b[1] - '0')] = static_cast<int>(c);
      if (b.size() == 3 && (b[0] == 'r' || b[0] == 'm') && std::isdigit(static_cast<unsigned char>(b[1])) &&
          std::isdigit(static_cast<unsigned char>(b[2]))) {
        int i = b[1] - '0', j = b[2] - '0';
        if (b[1] >= '1' && b[2] >= '1' && b[1] <= '3' && b[2] <= '3') {
          --i;
          --j;
        }
        if (i >= 0 && i < 3 && j >= 0 && j < 3) r[static_cast<std::size_t>(3 * i + j)] = static_cast<int>(c);
      }
    }
    if (std::all_of(q.begin(), q.end(), [](int v) { return v >= 0; })) {
      m.form = TrackForm::QuatWxyz;
      for (int s = 0; s < 4; ++s)
        m.rotation_columns[static_cast<std::size_t>(s)] = q[static_cast<std::size_t>(s)];
      m.notes.push_back("quaternion columns named in the header");
      found = true;
    } else if (qn[0] >= 0 && qn[1] >= 0 && qn[2] >= 0 && qn[3] >= 0 && qn[4] < 0) {
      m.form = TrackForm::QuatWxyz;
      for (int s = 0; s < 4; ++s)
        m.rotation_columns[static_cast<std::size_t>(s)] = qn[static_cast<std::size_t>(s)];
      m.notes.push_back("header q0..q3: q0 is the scalar");
      found = true;
    } else if (qn[1] >= 0 && qn[2] >= 0 && qn[3] >= 0 && qn[4] >= 0) {
      // q1..q4: q4 the scalar (spacecraft practice) unless the house stores scalar first.
      const bool last = true;
      m.form = TrackForm::QuatWxyz;
      m.rotation_columns[0] = last ? qn[4] : qn[1];
      m.rotation_columns[1] = last ? qn[1] : qn[2];
      m.rotation_columns[2] = last ? qn[2] : qn[3];
      m.rotation_columns[3] = last ? qn[3] : qn[4];
      m.notes.push_back(
          "header q1..q4 read with q4 as the scalar; q1 as the scalar is the other usual meaning");
      m.ambiguous = true;
      found = true;
    } else if (std::all_of(r.begin(), r.end(), [](int v) { return v >= 0; })) {
      m.form = TrackForm::MatrixRows;
      m.rotation_columns = r;
      m.notes.push_back("matrix element columns named in the header (r11..r33: row, column)");
      found = true;
    }
    if (!found) found = find_euler_columns(header, nc, rows, prefs, &m);
  }
  // 2. Statistics: four adjacent unit-norm columns, or nine orthonormal ones.
  if (!found) {
    for (std::size_t c = 0; c + 4 <= nc && !found; ++c) {
      bool unit = true;
      for (const auto& r : rows) {
        const double n =
            std::sqrt(r[c] * r[c] + r[c + 1] * r[c + 1] + r[c + 2] * r[c + 2] + r[c + 3] * r[c + 3]);
        if (std::abs(n - 1.0) > kColumnUnitNorm) unit = false;
      }
      if (!unit) continue;
      // Which end is the scalar: a canonicalised log keeps the scalar >= 0.
      bool first_nonneg = true, last_nonneg = true;
      for (const auto& r : rows) {
        if (r[c] < 0) first_nonneg = false;
        if (r[c + 3] < 0) last_nonneg = false;
      }
      bool scalar_first = prefs.quat_layout == QuatLayout::ScalarFirst;
      if (first_nonneg != last_nonneg) {
        scalar_first = first_nonneg;
        m.notes.push_back(std::string("the ") + (scalar_first ? "first" : "last") +
                          " of the four columns is never negative: read as the scalar");
      } else {
        m.ambiguous = true;
        m.notes.push_back(
            "the data do not show which end of the four columns holds the scalar: the house layout (" +
            std::string(scalar_first ? "scalar first" : "scalar last") + ") decides");
      }
      m.form = TrackForm::QuatWxyz;
      const int ci = static_cast<int>(c);
      if (scalar_first) {
        m.rotation_columns = {ci, ci + 1, ci + 2, ci + 3};
      } else {
        m.rotation_columns = {ci + 3, ci, ci + 1, ci + 2};
      }
      m.notes.push_back("columns " + std::to_string(c + 1) + ".." + std::to_string(c + 4) +
                        " have unit norm on every sampled row: a quaternion");
      found = true;
    }
    for (std::size_t c = 0; c + 9 <= nc && !found; ++c) {
      bool ortho = true;
      for (const auto& r : rows) {
        Eigen::Matrix3d a;
        for (int i = 0; i < 3; ++i) {
          for (int j = 0; j < 3; ++j) a(i, j) = r[c + static_cast<std::size_t>(3 * i + j)];
        }
        if ((a.transpose() * a - Eigen::Matrix3d::Identity()).norm() > kColumnOrthonormal ||
            a.determinant() < 0) {
          ortho = false;
        }
      }
      if (!ortho) continue;
      m.form = prefs.matrix_storage == MatrixStorage::Rows ? TrackForm::MatrixRows : TrackForm::MatrixCols;
      for (int k = 0; k < 9; ++k) m.rotation_columns[static_cast<std::size_t>(k)] = static_cast<int>(c) + k;
      m.ambiguous = true;
      m.notes.push_back(
          "columns " + std::to_string(c + 1) + ".." + std::to_string(c + 9) +
          " are orthonormal on every sampled row: a matrix; rows or columns cannot be told apart "
          "(each is the other's inverse), the house storage decides");
      found = true;
    }
  }
  if (!found) {
    return Error{
        "no rotation columns found: no header names them (quaternion, matrix or Euler angle names such as "
        "roll, pitch, yaw) and no four adjacent columns have unit norm (nor nine an orthonormal matrix)",
        static_cast<int>(m.header_lines + 1), 1};
  }
  const std::size_t used = track_form_numbers(m.form);
  auto is_rotation = [&](std::size_t c) {
    for (std::size_t k = 0; k < used; ++k) {
      if (m.rotation_columns[k] == static_cast<int>(c)) return true;
    }
    return false;
  };
  if (m.time_column < 0) {
    for (std::size_t c = 0; c < nc; ++c) {
      if (!is_rotation(c) && monotonic(rows, c)) {
        m.time_column = static_cast<int>(c);
        m.notes.push_back("column " + std::to_string(c + 1) + " never decreases: read as time");
        break;
      }
    }
  }
  if (m.time_column >= 0) {
    if (!time_unit_named.empty()) {
      m.time_unit = time_unit_named;
      m.notes.push_back("time unit " + m.time_unit + " from the header name");
    } else {
      std::vector<double> t;
      for (const auto& r : rows) t.push_back(r[static_cast<std::size_t>(m.time_column)]);
      time_unit_from_values(t, &m);
    }
  }
  assign_column_roles(&m);
  return m;
}

namespace {

// The quaternion of one row's Euler angles (values 1..3, application order, the mapping's
// unit) through from_euler (euler.hpp). Out of line so that push_row's quaternion path stays
// as small as before in the row loop.
[[gnu::noinline]] bool euler_row(const ColumnMapping& m, const double* values, double* w, double* x,
                                 double* y, double* z, std::string* reason) {
  const double scale = m.euler_unit == AngleUnit::Degrees ? kRadPerDeg : 1.0;
  const Eigen::Vector3d a(values[1] * scale, values[2] * scale, values[3] * scale);
  if (!a.allFinite()) {
    *reason = "an Euler angle is NaN or infinite";
    return false;
  }
  const Eigen::Quaterniond q = from_euler(m.euler, a).stored_quaternion();
  *w = q.w();
  *x = q.x();
  *y = q.y();
  *z = q.z();
  return true;
}

// Appends the sample of one row whose numbers are in values (slot 0 the time, 1.. the
// rotation numbers in storage order) to the track; false and the reason when the row is not
// a rotation (a NaN, a zero quaternion, a matrix that is not a rotation, a non-finite angle).
// Euler angles become the quaternion of from_euler (euler.hpp) in the mapping's convention.
inline bool push_row(const ColumnMapping& m, bool quat, const double* values, Track* track,
                     std::string* reason) {
  double w, x, y, z;
  if (quat) {
    w = values[1];
    x = values[2];
    y = values[3];
    z = values[4];
    const double n2 = w * w + x * x + y * y + z * z;
    if (!std::isfinite(n2)) {
      *reason = "a quaternion number is NaN or infinite";
      return false;
    }
    if (n2 < kMinQuaternionNorm * kMinQuaternionNorm) {
      *reason = "zero quaternion";
      return false;
    }
  } else if (m.form == TrackForm::Euler) {
    if (!euler_row(m, values, &w, &x, &y, &z, reason)) return false;
  } else {
    std::array<double, 9> n{};
    for (int k = 0; k < 9; ++k) n[static_cast<std::size_t>(k)] = values[k + 1];
    const Eigen::Matrix3d a = matrix_from_numbers(
        n, m.form == TrackForm::MatrixRows ? MatrixStorage::Rows : MatrixStorage::Columns);
    auto r = from_matrix(a);
    if (!r) {
      *reason = r.error().message;
      return false;
    }
    const Eigen::Quaterniond q = r.value().stored_quaternion();
    w = q.w();
    x = q.x();
    y = q.y();
    z = q.z();
  }
  const double t = m.time_column >= 0 ? values[0] * m.time_scale : static_cast<double>(track->qw.size());
  track->time_s.push_back(t);
  track->qw.push_back(w);
  track->qx.push_back(x);
  track->qy.push_back(y);
  track->qz.push_back(z);
  return true;
}

// read_track_text for JSON lines: each line's numbers are found by key (in any order).
Expected<Track> read_json_lines(std::string_view text, const ColumnMapping& m, const ReadProgress& progress,
                                const std::atomic<bool>* cancel, Track track) {
  const bool quat = m.form == TrackForm::QuatWxyz || m.form == TrackForm::QuatXyzw;
  const std::size_t used = track_form_numbers(m.form);
  const std::size_t nk = m.json_keys.size();
  std::vector<int> slot_of(nk, -1);  // per key: -1 ignored, 0 time, 1.. rotation numbers
  if (m.time_column >= 0 && static_cast<std::size_t>(m.time_column) < nk)
    slot_of[static_cast<std::size_t>(m.time_column)] = 0;
  for (std::size_t k = 0; k < used; ++k) {
    const int c = m.rotation_columns[k];
    if (c >= 0 && static_cast<std::size_t>(c) < nk)
      slot_of[static_cast<std::size_t>(c)] = static_cast<int>(k) + 1;
  }
  unsigned needed = 0;  // bit per slot
  for (int s : slot_of)
    if (s >= 0) needed |= 1u << s;
  const char* const begin = text.data();
  const char* const end = begin + text.size();
  const char* p = begin;
  std::size_t line = 0;
  std::size_t next_report = kProgressStep;
  double values[10] = {};
  while (p < end) {
    ++line;
    const char* nl = static_cast<const char*>(std::memchr(p, '\n', static_cast<std::size_t>(end - p)));
    const char* le = nl ? nl : end;
    const char* next = nl ? nl + 1 : end;
    if (le > p && le[-1] == '\r') --le;
    if (line <= m.header_lines) {
      p = next;
      continue;
    }
    if (static_cast<std::size_t>(p - begin) >= next_report) {
      next_report += kProgressStep;
      if (cancel && cancel->load(std::memory_order_relaxed)) return Error{"reading the log was cancelled"};
      if (progress) progress(static_cast<std::size_t>(p - begin), text.size());
    }
    if (blank_or_comment(std::string_view(p, static_cast<std::size_t>(le - p)))) {
      if (!(le == p && next == end)) ++track.skipped_lines;
      p = next;
      continue;
    }
    unsigned seen = 0;
    std::size_t hint = 0;  // keys usually come in the first line's order
    const char* why = nullptr;
    const std::size_t col = walk_json_line(
        p, le,
        [&](std::string_view k, double v) {
          std::size_t c = hint < nk && m.json_keys[hint] == k ? hint : nk;
          for (std::size_t i = 0; c == nk && i < nk; ++i)
            if (m.json_keys[i] == k) c = i;
          if (c == nk) return;
          hint = c + 1;
          const int slot = slot_of[c];
          if (slot < 0) return;
          values[slot] = v;
          seen |= 1u << slot;
        },
        &why);
    std::string reason;
    bool bad = false;
    if (col != 0) {
      bad = true;
      reason = std::string(why) + " (column " + std::to_string(col) + ")";
    } else if ((seen & needed) != needed) {
      bad = true;
      for (std::size_t c = 0; c < nk; ++c) {
        if (slot_of[c] >= 0 && !(seen & (1u << slot_of[c]))) {
          reason = "no number under key '" + m.json_keys[c] + "'";
          break;
        }
      }
    } else {
      bad = !push_row(m, quat, values, &track, &reason);
    }
    if (bad) track.bad_rows.push_back({line, reason});
    p = next;
  }
  if (progress) progress(text.size(), text.size());
  return track;
}

/// Below this many bytes of rows a log is read on one thread (a thread costs more).
constexpr std::size_t kParallelMinBytes = std::size_t{4} << 20;
/// The most threads a read uses: the parts are memory-bound, more than two gain little.
constexpr unsigned kMaxReadThreads = 2;

/// What every part of a read shares: the mapping worked out into slots, progress, cancel.
struct RowReader {
  const ColumnMapping& m;
  std::vector<int> slot_of;  ///< per column: -1 ignored, 0 time, 1.. rotation numbers
  bool quat = true;
  const char* text_end = nullptr;  ///< end of the whole text (a part may end before it)
  std::size_t text_size = 0;
  const ReadProgress* progress = nullptr;
  const std::atomic<bool>* cancel = nullptr;
  std::atomic<std::size_t> others_done{0};  ///< bytes done by the parts that do not report

  RowReader(const ColumnMapping& mapping, std::string_view text, const ReadProgress* p,
            const std::atomic<bool>* c)
      : m(mapping),
        slot_of(mapping.column_count, -1),
        text_end(text.data() + text.size()),
        text_size(text.size()),
        progress(p),
        cancel(c) {
    quat = m.form == TrackForm::QuatWxyz || m.form == TrackForm::QuatXyzw;
    const std::size_t used = track_form_numbers(m.form);
    if (m.time_column >= 0 && static_cast<std::size_t>(m.time_column) < m.column_count) {
      slot_of[static_cast<std::size_t>(m.time_column)] = 0;
    }
    for (std::size_t k = 0; k < used; ++k) {
      const int col = m.rotation_columns[k];
      if (col >= 0 && static_cast<std::size_t>(col) < m.column_count)
        slot_of[static_cast<std::size_t>(col)] = static_cast<int>(k) + 1;
    }
  }
};

/// One part of a read: the whole lines in [begin, end), the first of them line number 1 of
/// the part (the caller shifts bad_rows of later parts). Samples, bad rows and skipped
/// lines go to `track`; `lines` receives the number of lines. The reporting part calls
/// progress with the bytes of every part; the others add theirs to others_done. Returns
/// false when cancelled.
bool read_rows(RowReader& r, const char* const begin, const char* const end, bool reports, Track& track,
               std::size_t& lines) {
  const ColumnMapping& m = r.m;
  const std::vector<int>& slot_of = r.slot_of;
  const bool quat = r.quat;
  const char* p = begin;
  std::size_t line = 0;
  std::size_t next_report = kProgressStep;
  std::size_t reported = 0;  // bytes of this part already added to others_done
  double values[10];
  const char delim = m.delimiter;
  while (p < end) {
    ++line;
    const char* nl = static_cast<const char*>(std::memchr(p, '\n', static_cast<std::size_t>(end - p)));
    const char* le = nl ? nl : end;
    const char* next = nl ? nl + 1 : end;
    if (le > p && le[-1] == '\r') --le;
    if (static_cast<std::size_t>(p - begin) >= next_report) {
      next_report += kProgressStep;
      if (r.cancel && r.cancel->load(std::memory_order_relaxed)) return false;
      const auto done = static_cast<std::size_t>(p - begin);
      if (reports) {
        if (*r.progress) (*r.progress)(done + r.others_done.load(std::memory_order_relaxed), r.text_size);
      } else {
        r.others_done.fetch_add(done - reported, std::memory_order_relaxed);
        reported = done;
      }
    }
    // Blank and comment lines.
    {
      const char* q = p;
      while (q < le && (*q == ' ' || *q == '\t')) ++q;
      if (q == le || *q == '#') {
        if (!(q == le && next == r.text_end && le == p)) ++track.skipped_lines;
        p = next;
        continue;
      }
    }
    std::size_t field = 0;
    const char* f = p;
    bool bad = false;
    std::string reason;
    while (true) {
      const char* fe;
      if (delim == ' ') {
        while (f < le && (*f == ' ' || *f == '\t')) ++f;
        if (f == le) break;
        fe = f;
        while (fe < le && *fe != ' ' && *fe != '\t') ++fe;
      } else {
        // The fast path: a plain number that ends at the delimiter or the line end.
        if (field < m.column_count && !m.decimal_comma) {
          const int slot = slot_of[field];
          if (slot >= 0) {
            const char* ne = fast_number(f, le, &values[slot]);
            if (ne && (ne == le || *ne == delim)) {
              ++field;
              if (ne >= le) break;
              f = ne + 1;
              continue;
            }
          }
        }
        fe = static_cast<const char*>(std::memchr(f, delim, static_cast<std::size_t>(le - f)));
        if (!fe) fe = le;
      }
      if (field < m.column_count) {
        const int slot = slot_of[field];
        if (slot >= 0 && !parse_field(f, fe, m.decimal_comma, &values[slot])) {
          bad = true;
          reason = "field " + std::to_string(field + 1) + " is not a number: '" +
                   std::string(f, static_cast<std::size_t>(std::min<std::ptrdiff_t>(fe - f, 40))) + "'";
          break;
        }
      }
      ++field;
      if (fe >= le) break;
      f = fe + 1;
    }
    if (!bad && field != m.column_count) {
      bad = true;
      reason = "expected " + std::to_string(m.column_count) + " fields, found " + std::to_string(field);
    }
    // Without a time column push_row numbers the part's own samples; the caller shifts
    // later parts.
    if (!bad && !push_row(m, quat, values, &track, &reason)) bad = true;
    if (bad) track.bad_rows.push_back({line, reason});
    p = next;
  }
  if (!reports)
    r.others_done.fetch_add(static_cast<std::size_t>(end - begin) - reported, std::memory_order_relaxed);
  lines = line;
  return true;
}

/// Reserves the sample arrays for about `bytes` of rows like the first one at p.
void reserve_rows(Track& track, const char* p, const char* end) {
  const void* nl = std::memchr(p, '\n', static_cast<std::size_t>(end - p));
  const auto bytes = static_cast<std::size_t>(end - p);
  const std::size_t first_len = nl ? static_cast<std::size_t>(static_cast<const char*>(nl) - p) + 1 : bytes;
  const std::size_t estimate = bytes / std::max<std::size_t>(first_len, 8) + 16;
  track.time_s.reserve(estimate);
  track.qw.reserve(estimate);
  track.qx.reserve(estimate);
  track.qy.reserve(estimate);
  track.qz.reserve(estimate);
}

/// Where to cut [begin, end) into `parts` runs of whole lines: parts + 1 pointers.
std::vector<const char*> cut_at_lines(const char* begin, const char* end, unsigned parts) {
  std::vector<const char*> cut{begin};
  const auto bytes = static_cast<std::size_t>(end - begin);
  for (unsigned k = 1; k < parts; ++k) {
    const char* at = begin + bytes * k / parts;
    if (at < cut.back()) at = cut.back();
    const void* nl = std::memchr(at, '\n', static_cast<std::size_t>(end - at));
    cut.push_back(nl ? static_cast<const char*>(nl) + 1 : end);
  }
  cut.push_back(end);
  return cut;
}

/// Appends a later part to the track: its samples (sample-index times shifted by the
/// samples before it), its bad rows (line numbers shifted by the lines before it).
void append_part(Track& track, Track&& part, std::size_t lines_before) {
  const std::size_t samples_before = track.qw.size();
  if (!track.has_time) {
    for (double& t : part.time_s) t += static_cast<double>(samples_before);  // exact below 2^53
  }
  track.time_s.insert(track.time_s.end(), part.time_s.begin(), part.time_s.end());
  track.qw.insert(track.qw.end(), part.qw.begin(), part.qw.end());
  track.qx.insert(track.qx.end(), part.qx.begin(), part.qx.end());
  track.qy.insert(track.qy.end(), part.qy.begin(), part.qy.end());
  track.qz.insert(track.qz.end(), part.qz.begin(), part.qz.end());
  for (BadRow& b : part.bad_rows) {
    b.line += lines_before;
    track.bad_rows.push_back(std::move(b));
  }
  track.skipped_lines += part.skipped_lines;
}

}  // namespace

Expected<Track> read_track_text(std::string_view text, const ColumnMapping& m, const ReadProgress& progress,
                                const std::atomic<bool>* cancel) {
  Track track;
  track.columns = m.columns;
  track.reading = track_reading_text(m);
  track.has_time = m.time_column >= 0;
  track.time_unit = track.has_time ? m.time_unit : "";
  if (m.json_lines) return read_json_lines(text, m, progress, cancel, std::move(track));
  const char* const begin = text.data();
  const char* const end = begin + text.size();
  // The header lines, which are not data.
  const char* rows = begin;
  std::size_t header_lines = 0;
  while (rows < end && header_lines < m.header_lines) {
    const void* nl = std::memchr(rows, '\n', static_cast<std::size_t>(end - rows));
    rows = nl ? static_cast<const char*>(nl) + 1 : end;
    ++header_lines;
  }
  RowReader reader(m, text, &progress, cancel);
  // A long log is cut at line boundaries into parts read on their own threads, then joined
  // in file order: the same samples, bad rows and line numbers as one pass.
  const unsigned hardware = std::max(1u, std::thread::hardware_concurrency());
  const unsigned parts =
      static_cast<std::size_t>(end - rows) >= kParallelMinBytes ? std::min(kMaxReadThreads, hardware) : 1u;
  const std::vector<const char*> cut = cut_at_lines(rows, end, parts);
  std::vector<Track> later(parts - 1);
  std::vector<std::size_t> lines(parts, 0);
  std::vector<char> finished(parts, 0);
  std::vector<std::thread> workers;
  for (unsigned k = 1; k < parts; ++k) {
    workers.emplace_back([&, k] {
      reserve_rows(later[k - 1], cut[k], cut[k + 1]);
      finished[k] = read_rows(reader, cut[k], cut[k + 1], false, later[k - 1], lines[k]) ? 1 : 0;
    });
  }
  reserve_rows(track, cut[0], parts > 1 ? end : cut[1]);  // room for every part's samples
  finished[0] = read_rows(reader, cut[0], cut[1], true, track, lines[0]) ? 1 : 0;
  for (std::thread& t : workers) t.join();
  if (std::find(finished.begin(), finished.end(), 0) != finished.end())
    return Error{"reading the log was cancelled"};
  std::size_t lines_before = header_lines + lines[0];
  for (auto& b : track.bad_rows) b.line += header_lines;
  for (unsigned k = 1; k < parts; ++k) {
    append_part(track, std::move(later[k - 1]), lines_before);
    lines_before += lines[k];
  }
  if (progress) progress(text.size(), text.size());
  return track;
}

Expected<Track> read_track_file(const std::string& path, const ColumnMapping& mapping,
                                const ReadProgress& progress, const std::atomic<bool>* cancel) {
  const int fd = ::open(path.c_str(), O_RDONLY);
  if (fd < 0) return Error{"cannot open '" + path + "': " + std::strerror(errno)};
  struct stat st {};
  if (::fstat(fd, &st) != 0) {
    ::close(fd);
    return Error{"cannot read '" + path + "': " + std::strerror(errno)};
  }
  const auto size = static_cast<std::size_t>(st.st_size);
  if (size == 0) {
    ::close(fd);
    return read_track_text({}, mapping, progress, cancel);
  }
  void* data = ::mmap(nullptr, size, PROT_READ, MAP_PRIVATE, fd, 0);
  ::close(fd);
  if (data == MAP_FAILED) return Error{"cannot map '" + path + "' into memory: " + std::strerror(errno)};
  ::madvise(data, size, MADV_SEQUENTIAL);
  auto track =
      read_track_text(std::string_view(static_cast<const char*>(data), size), mapping, progress, cancel);
  ::munmap(data, size);
  return track;
}

Expected<std::string> read_file_head(const std::string& path, std::size_t max_bytes) {
  std::ifstream in(path, std::ios::binary);
  if (!in) return Error{"cannot open '" + path + "'"};
  std::string s(max_bytes, '\0');
  in.read(&s[0], static_cast<std::streamsize>(max_bytes));
  s.resize(static_cast<std::size_t>(in.gcount()));
  if (s.size() == max_bytes) {
    const auto nl = s.rfind('\n');
    if (nl != std::string::npos) s.resize(nl + 1);
  }
  return s;
}

}  // namespace attiscope
