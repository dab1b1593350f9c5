// pose_input.cpp: text -> rotation for the command line.
#include "cli/pose_input.hpp"

#include <cmath>
#include <cstdio>
#include <ctime>
#include <fstream>
#include <iterator>
#include <sstream>

namespace attiscope::cli {

PoseTextOptions pose_options(const CommonOptions& o) {
  PoseTextOptions p;
  p.as = o.as;
  p.reading.euler = o.euler;
  p.reading.unit = o.unit;
  p.reading.rotvec_unit = o.unit_given ? o.unit : AngleUnit::Radians;
  p.euler_given = o.euler_given;
  p.unit_given = o.unit_given;
  p.house = o.convention;
  return p;
}

Expected<std::string> read_input_file(const std::string& path, std::istream& in) {
  if (path == "-") return std::string(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>());
  std::ifstream f(path, std::ios::binary);
  if (!f) return Error{"cannot read '" + path + "'"};
  std::ostringstream s;
  s << f.rdbuf();
  return s.str();
}

Expected<bool> write_text_file(const std::string& path, const std::string& text) {
  const std::string temp = path + ".saving";
  {
    std::ofstream f(temp, std::ios::binary | std::ios::trunc);
    if (!f) return Error{"cannot write '" + temp + "'"};
    f << text;
    f.flush();
    if (!f) {
      std::remove(temp.c_str());
      return Error{"writing '" + temp + "' failed"};
    }
  }
  if (std::rename(temp.c_str(), path.c_str()) != 0) {
    std::remove(temp.c_str());
    return Error{"cannot replace '" + path + "'"};
  }
  return true;
}

std::string utc_date_time() {
  const std::time_t now = std::time(nullptr);
  std::tm utc{};
  gmtime_r(&now, &utc);
  char buf[64];
  std::strftime(buf, sizeof buf, "%Y-%m-%d %H:%M UTC", &utc);
  return buf;
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
