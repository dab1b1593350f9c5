// pose_input.cpp: text -> rotation for the command line.
#include "cli/pose_input.hpp"

#include <cmath>
#include <fstream>
#include <iterator>
#include <sstream>

namespace attiscope::cli {

ExplicitReadingOptions reading_options(const CommonOptions& o) {
  ExplicitReadingOptions ro;
  ro.euler = o.euler;
  ro.unit = o.unit;
  ro.rotvec_unit = o.unit_given ? o.unit : AngleUnit::Radians;
  return ro;
}

Expected<PoseText> read_pose_text(std::string_view text, const CommonOptions& o) {
  PoseText out;
  out.options = reading_options(o);
  if (o.as) {
    out.kind = *o.as;
  } else {
    auto numbers = scan_numbers(text);
    if (!numbers) return numbers.error();
    const std::size_t n = numbers.value().size();
    if (n == 3) {
      out.kind = ReadingKind::Euler;
    } else if (n == 4) {
      out.kind = ReadingKind::QuatWxyz;
    } else if (n == 9) {
      out.kind = ReadingKind::MatrixRows;
    } else {
      return Error{
          "got " + std::to_string(n) +
              " numbers; a pose is 3 (Euler angles), 4 (quaternion) or 9 (matrix) numbers, or say which "
              "with --as",
          1, 1};
    }
    out.warnings.push_back("no --as given: " + std::to_string(n) + " numbers were read as " +
                           reading_kind_name(out.kind));
  }
  auto r = read_explicit(text, out.kind, out.options);
  if (!r) return r.error();
  out.rotation = r.value().rotation;
  out.reading = reading_kind_name(out.kind);
  if (out.kind == ReadingKind::Euler) out.reading += " " + o.euler.name();
  for (const std::string& w : r.value().warnings) out.warnings.push_back(w);
  return out;
}

Expected<std::string> read_input_file(const std::string& path, std::istream& in) {
  if (path == "-") return std::string(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>());
  std::ifstream f(path, std::ios::binary);
  if (!f) return Error{"cannot read '" + path + "'"};
  std::ostringstream s;
  s << f.rdbuf();
  return s.str();
}

Expected<double> parse_number_option(const std::string& name, const std::string& value, bool non_negative) {
  std::istringstream s(value);
  double v = 0.0;
  char rest = 0;
  if (!(s >> v) || (s >> rest) || !std::isfinite(v) || (non_negative && v < 0)) {
    return Error{name + " needs a " + (non_negative ? "non-negative " : "") + "number, got '" + value + "'"};
  }
  return v;
}

}  // namespace attiscope::cli
