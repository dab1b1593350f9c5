// cmd_convert.cpp: `attiscope convert [TEXT]`: read one pose, print every representation.
#include <cmath>
#include <iostream>

#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"

#include "attiscope/core/house_report.hpp"
#include "attiscope/core/intake.hpp"
#include "attiscope/core/report.hpp"
#include "cli/cli.hpp"

namespace attiscope::cli {

namespace {

const char* kConvertHelp =
    "usage: attiscope convert [TEXT] [--as READING] [options]\n"
    "\n"
    "Reads one pose from TEXT (or standard input) and prints it in every representation:\n"
    "quaternion, matrix (world_R_body: v_world = R v_body), axis-angle, rotation vector,\n"
    "Gibbs vector, MRP, Euler angles in the chosen convention and in all 24, algebra forms.\n"
    "\n"
    "Examples:\n"
    "  attiscope convert --as quat-wxyz \"0.9239 0 0 0.3827\"\n"
    "  attiscope convert --as euler --euler ZYX --extrinsic --rad \"0.5 0.1 -0.2\"\n"
    "  attiscope convert --json --as matrix-rows \"0 -1 0; 1 0 0; 0 0 1\"\n"
    "  attiscope convert --convention assets/conventions/survey-aircraft.toml \"30 10 5\"\n"
    "\n"
    "With --convention FILE the output adds the house's view (JSON key \"house\"): its Euler\n"
    "angles by name in its print order, unit and ranges, its quaternion and matrix layouts,\n"
    "and a sentence per turn. Without --as, numbers are read in the house's convention:\n"
    "three as the house's printed Euler angles (unless --euler or --deg/--rad is given),\n"
    "four as its quaternion layout, algebra and direction, nine as its matrix.\n"
    "\n";

}  // namespace

// Without --as and with a house convention: 3 numbers are the house's printed Euler angles
// (unless --euler/--intrinsic/--extrinsic or --deg/--rad asks for another reading), 4 its
// quaternion, 9 its matrix. Other counts are an error that says what was expected.
Expected<Rotation> read_in_house(const std::string& text, const HouseConvention& c, const CommonOptions& o,
                                 std::string* reading, std::vector<std::string>* warnings) {
  auto numbers = scan_numbers(text);
  if (!numbers) return numbers.error();
  const auto& t = numbers.value();
  for (const NumberToken& n : t) {
    if (!std::isfinite(n.value)) return Error{"this number is not finite", n.line, n.column};
  }
  if (t.size() == 3) {
    HouseConvention h = c;
    if (o.euler_given) {
      h.euler.convention = o.euler;
      h.euler.print_order = {0, 1, 2};
    }
    if (o.unit_given) h.euler.unit = o.unit;
    *reading = "euler " + h.euler.convention.name() + " (house " + c.name + ", printed as " +
               h.euler.names[static_cast<std::size_t>(h.euler.print_order[0])] + ", " +
               h.euler.names[static_cast<std::size_t>(h.euler.print_order[1])] + ", " +
               h.euler.names[static_cast<std::size_t>(h.euler.print_order[2])] + ")";
    return from_house_euler({t[0].value, t[1].value, t[2].value}, h);
  }
  if (t.size() == 4) {
    *reading = "quaternion (house " + c.name + ": " + c.quaternion.describe() + ")";
    QuatCheck check;
    auto r = from_quaternion_numbers({t[0].value, t[1].value, t[2].value, t[3].value}, c.quaternion, &check);
    if (r && std::abs(check.norm - 1.0) > kUnitNormTolerance) {
      warnings->push_back("the quaternion's norm is " + std::to_string(check.norm) +
                          ", not 1: it was normalised");
    }
    return r;
  }
  if (t.size() == 9) {
    *reading = "matrix (house " + c.name + ": " + c.matrix.describe() + ")";
    std::array<double, 9> m{};
    for (std::size_t i = 0; i < 9; ++i) m[i] = t[i].value;
    MatrixCheck check;
    auto r = from_matrix(matrix_from_numbers(m, c.matrix.storage), c.matrix.direction, &check);
    if (r && check.orthonormality_defect > kMatrixDefectSilent) {
      warnings->push_back("the matrix is not exactly orthonormal (defect " +
                          std::to_string(check.orthonormality_defect) + "): the nearest rotation was used");
    }
    return r;
  }
  if (t.size() > 9) return Error{"too many numbers for one pose", t[9].line, t[9].column};
  return Error{
      "got " + std::to_string(t.size()) +
      " numbers; a pose is 3 (Euler angles), 4 (quaternion) or 9 (matrix) numbers, or say which with --as"};
}

int run_convert(const std::vector<std::string>& args, Streams io) {
  CommonOptions o;
  if (auto err = parse_common(args, {}, &o)) {
    io.err << "attiscope convert: " << *err << "\n";
    return kExitBadInput;
  }
  if (o.help) {
    io.out << kConvertHelp << common_options_help();
    return kExitOk;
  }
  const std::string text = input_text(o, io.in);
  ReportOptions report;
  report.euler = o.euler;
  report.unit = o.unit;
  report.precision = o.precision;
  for (const std::string& w : o.convention_warnings) io.err << "attiscope convert: warning: " << w << "\n";
  std::optional<ReadingKind> kind = o.as;
  std::optional<Rotation> house_read;
  if (!kind && o.convention) {
    auto read = read_in_house(text, *o.convention, o, &report.reading, &report.warnings);
    if (!read) {
      io.err << "attiscope convert: " << read.error().describe() << "\n";
      return kExitBadInput;
    }
    house_read = read.value();
  }
  if (house_read) {
    // Read above in the house convention.
  } else if (!kind) {
    // Without --as: the top reading of the paste reader, with a warning when the text did
    // not decide between readings.
    IntakePreferences prefs;
    prefs.euler = o.euler;
    if (o.unit_given) prefs.unit = o.unit;
    auto result = read_pasted(text, prefs);
    if (!result) {
      io.err << "attiscope convert: " << result.error().describe() << "\n";
      return kExitBadInput;
    }
    const IntakeResult& r = result.value();
    const Reading& top = r.readings.front();
    report.reading = intake_kind_name(top.kind) + (top.layout.empty() ? "" : " " + top.layout);
    if (r.track) {
      report.warnings.push_back("the text is a track of " + std::to_string(r.track_rows) +
                                " rows: this is its first pose (see attiscope track)");
    }
    if (r.ambiguous) {
      std::string others;
      for (std::size_t i = 1; i < r.readings.size() && i < 4; ++i) {
        others +=
            (others.empty() ? "" : ", ") + intake_kind_name(r.readings[i].kind) + " " + r.readings[i].layout;
      }
      report.warnings.push_back("ambiguous: the text was read as " + report.reading + " (" + top.why +
                                "), but it could also be " + others +
                                "; say which with --as (see attiscope read)");
    }
    for (const std::string& w : top.warnings) report.warnings.push_back(w);
    if (top.translation) {
      report.warnings.push_back("the translation (" + std::to_string(top.translation->x()) + ", " +
                                std::to_string(top.translation->y()) + ", " +
                                std::to_string(top.translation->z()) +
                                ") is not part of the rotation and is not shown below");
    }
    if (o.json) {
      io.out << convert_json(top.rotation, report).dump(2) << "\n";
    } else {
      io.out << convert_table(top.rotation, report);
    }
    return kExitOk;
  }
  if (house_read) {
    if (o.json) {
      nlohmann::json j = convert_json(*house_read, report);
      j["house"] = house_json(*house_read, *o.convention);
      io.out << j.dump(2) << "\n";
    } else {
      io.out << convert_table(*house_read, report) << house_table(*house_read, *o.convention);
    }
    return kExitOk;
  }
  ExplicitReadingOptions ro;
  ro.euler = o.euler;
  ro.unit = o.unit;
  ro.rotvec_unit = o.unit_given ? o.unit : AngleUnit::Radians;
  auto reading = read_explicit(text, *kind, ro);
  if (!reading) {
    io.err << "attiscope convert: " << reading.error().describe() << "\n";
    return kExitBadInput;
  }
  report.reading = reading_kind_name(*kind);
  if (*kind == ReadingKind::Euler) report.reading += " " + o.euler.name();
  for (const std::string& w : reading.value().warnings) report.warnings.push_back(w);
  const Rotation& pose = reading.value().rotation;
  if (o.json) {
    nlohmann::json j = convert_json(pose, report);
    if (o.convention) j["house"] = house_json(pose, *o.convention);
    io.out << j.dump(2) << "\n";
  } else {
    io.out << convert_table(pose, report);
    if (o.convention) io.out << house_table(pose, *o.convention);
  }
  return kExitOk;
}

}  // namespace attiscope::cli
