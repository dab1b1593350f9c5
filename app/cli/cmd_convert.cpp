// cmd_convert.cpp: `attiscope convert [TEXT]`: read one pose, print every representation.
#include <iostream>

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
    "\n";

// Without --as: the reading the number count suggests, said in a warning. The paste reader
// (`attiscope read`) ranks every reading of a text.
std::optional<ReadingKind> reading_by_count(std::size_t n) {
  switch (n) {
    case 3: return ReadingKind::Euler;
    case 4: return ReadingKind::QuatWxyz;
    case 9: return ReadingKind::MatrixRows;
    default: return std::nullopt;
  }
}

}  // namespace

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
  std::optional<ReadingKind> kind = o.as;
  if (!kind) {
    auto numbers = scan_numbers(text);
    if (!numbers) {
      io.err << "attiscope convert: " << numbers.error().describe() << "\n";
      return kExitBadInput;
    }
    const std::vector<NumberToken>& found = numbers.value();
    kind = reading_by_count(found.size());
    if (!kind) {
      // Point at the first number beyond the largest usual shape below the count, or at the
      // end of the text when there are too few for any shape.
      std::size_t shape = 0;
      for (std::size_t s : {3, 4, 9}) {
        if (s < found.size()) shape = s;
      }
      Error e{"got " + std::to_string(found.size()) +
              " numbers; a pose is 3 (Euler angles), 4 (quaternion) or 9 (matrix) numbers, or say "
              "which with --as"};
      if (shape > 0) {
        e.line = found[shape].line;
        e.column = found[shape].column;
        e.message += " (number " + std::to_string(shape + 1) + " is here)";
      } else {
        e.line = 1;
        e.column = 1;
        for (std::size_t i = 0; i < text.size(); ++i) {
          const auto ch = static_cast<unsigned char>(text[i]);
          if (ch == '\n') {
            ++e.line;
            e.column = 1;
          } else if ((ch & 0xC0) != 0x80) {
            ++e.column;
          }
        }
      }
      io.err << "attiscope convert: " << e.describe() << "\n";
      return kExitBadInput;
    }
    report.warnings.push_back("no --as given: " + std::to_string(numbers.value().size()) +
                              " numbers were read as " + reading_kind_name(*kind) +
                              "; other readings are possible (see attiscope read)");
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
  if (o.json) {
    io.out << convert_json(reading.value().rotation, report).dump(2) << "\n";
  } else {
    io.out << convert_table(reading.value().rotation, report);
  }
  return kExitOk;
}

}  // namespace attiscope::cli
