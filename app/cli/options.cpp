// options.cpp: the options every subcommand shares.
#include <cctype>
#include <iterator>
#include <sstream>

#include "attiscope/core/convention_file.hpp"
#include "cli/cli.hpp"

namespace attiscope::cli {

std::string common_options_help() {
  return "Shared options:\n"
         "  --euler SEQ        Euler sequence: XYZ ... ZYZ, or numerals such as 321 (default ZYX)\n"
         "  --intrinsic        turns about the body's current axes (default)\n"
         "  --extrinsic        turns about the fixed world axes\n"
         "  --deg / --rad      angle unit of input and output (default degrees)\n"
         "  --as READING       force a reading: " +
         reading_kind_list() +
         "\n"
         "  --convention FILE  a house convention file\n"
         "  --precision N      significant digits in tables (default 6)\n"
         "  --json             print JSON instead of a table\n"
         "  --help             this text\n";
}

std::optional<std::string> CommonOptions::last(const std::string& name) const {
  const auto it = extra.find(name);
  if (it == extra.end() || it->second.empty()) return std::nullopt;
  return it->second.back();
}

std::optional<std::string> parse_common(const std::vector<std::string>& args,
                                        const std::vector<OptionSpec>& extra, CommonOptions* o) {
  std::string sequence = "ZYX";
  EulerKind kind = EulerKind::Intrinsic;
  bool options_done = false;
  for (std::size_t i = 0; i < args.size(); ++i) {
    const std::string& a = args[i];
    auto value = [&]() -> std::optional<std::string> {
      if (i + 1 >= args.size()) return std::nullopt;
      return args[++i];
    };
    // A number such as -0.5 or a text such as "-0.5 0 0 1" is input, not an option.
    const bool looks_numeric = a.size() >= 2 && a[0] == '-' &&
                               (std::isdigit(static_cast<unsigned char>(a[1])) || a[1] == '.' || a[1] == ' ');
    if (options_done || a == "-" || a.empty() || a[0] != '-' || looks_numeric) {
      o->positional.push_back(a);
      continue;
    }
    const OptionSpec* own = nullptr;
    for (const OptionSpec& spec : extra) {
      if (spec.name == a) own = &spec;
    }
    if (own) {
      if (own->takes_value) {
        auto v = value();
        if (!v) return a + " needs a value (see --help)";
        o->extra[a].push_back(*v);
      } else {
        o->extra[a].push_back("");
      }
      continue;
    }
    if (a == "--") {
      options_done = true;
    } else if (a == "--euler") {
      auto v = value();
      if (!v) return "--euler needs a sequence such as ZYX or 321";
      sequence = *v;
      o->euler_given = true;
    } else if (a == "--intrinsic") {
      kind = EulerKind::Intrinsic;
      o->euler_given = true;
    } else if (a == "--extrinsic") {
      kind = EulerKind::Extrinsic;
      o->euler_given = true;
    } else if (a == "--deg") {
      o->unit = AngleUnit::Degrees;
      o->unit_given = true;
    } else if (a == "--rad") {
      o->unit = AngleUnit::Radians;
      o->unit_given = true;
    } else if (a == "--as") {
      auto v = value();
      if (!v) return "--as needs a reading: " + reading_kind_list();
      o->as = parse_reading_kind(*v);
      if (!o->as) return "unknown reading '" + *v + "' for --as; use one of " + reading_kind_list();
    } else if (a == "--convention") {
      auto v = value();
      if (!v) return "--convention needs a file";
      o->convention_file = *v;
      auto loaded = load_convention(*v);
      if (!loaded) return "--convention " + *v + ": " + loaded.error().describe();
      o->convention = loaded.value().convention;
      o->convention_warnings.clear();
      for (const Error& w : loaded.value().warnings)
        o->convention_warnings.push_back(*v + ": " + w.describe());
    } else if (a == "--precision") {
      auto v = value();
      int p = 0;
      std::istringstream ps(v ? *v : "");
      if (!v || !(ps >> p) || p < 1 || p > 17) return "--precision needs a whole number from 1 to 17";
      o->precision = p;
    } else if (a == "--json") {
      o->json = true;
    } else if (a == "--help" || a == "-h") {
      o->help = true;
    } else {
      return "unknown option '" + a + "' (see --help)";
    }
  }
  auto seq = parse_euler_sequence(sequence, kind);
  if (!seq) return "--euler: " + seq.error().message;
  o->euler = seq.value();
  return std::nullopt;
}

std::string input_text(const CommonOptions& o, std::istream& in) {
  if (o.positional.empty() || (o.positional.size() == 1 && o.positional[0] == "-")) {
    return std::string(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>());
  }
  std::string text;
  for (const std::string& p : o.positional) {
    if (!text.empty()) text += ' ';
    text += p;
  }
  return text;
}

std::optional<std::string> no_pose_given(const std::string& text) {
  if (text.find_first_not_of(" \t\r\n") != std::string::npos) return std::nullopt;
  return "no pose given: pass it as TEXT (e.g. \"1 0 0 0\") or on standard input";
}

}  // namespace attiscope::cli
