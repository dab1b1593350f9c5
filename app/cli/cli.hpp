// cli.hpp: the command line: shared options and the subcommands. Every subcommand calls the
// same core functions the window calls, so the command line is the testable face of the GUI.
#pragma once

#include <iosfwd>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "attiscope/core/convention.hpp"
#include "attiscope/core/euler.hpp"
#include "attiscope/core/text.hpp"

namespace attiscope::cli {

/// Exit codes (design.md): 0 success, 1 a check failed, 2 bad input or usage.
inline constexpr int kExitOk = 0;
inline constexpr int kExitCheckFailed = 1;
inline constexpr int kExitBadInput = 2;

/// Options every subcommand shares.
struct CommonOptions {
  EulerConvention euler;     ///< --euler SEQ with --intrinsic/--extrinsic
  bool euler_given = false;  ///< --euler, --intrinsic or --extrinsic was given explicitly
  AngleUnit unit = AngleUnit::Degrees;
  bool unit_given = false;        ///< --deg or --rad was given explicitly
  std::optional<ReadingKind> as;  ///< --as READING
  std::optional<std::string> convention_file;
  /// The house convention loaded from --convention FILE (parse_common loads it).
  std::optional<HouseConvention> convention;
  /// Warnings found while loading it (unknown keys), each naming its line and column.
  std::vector<std::string> convention_warnings;
  bool json = false;
  bool help = false;
  int precision = 6;
  std::vector<std::string> positional;
  /// Values of a subcommand's own options, by name ("--out" -> {"F.png"}); a flag that
  /// takes no value has one empty string per use.
  std::map<std::string, std::vector<std::string>> extra;

  bool has(const std::string& name) const { return extra.count(name) > 0; }
  /// The last value given for an option, or nullopt.
  std::optional<std::string> last(const std::string& name) const;
};

/// A subcommand's own option.
struct OptionSpec {
  std::string name;  ///< "--out"
  bool takes_value;
};

/// Where a subcommand writes: stdout for results, stderr for messages.
struct Streams {
  std::ostream& out;
  std::ostream& err;
  std::istream& in;
};

/// Parses the shared options and a subcommand's own (`extra`) out of args. Returns an
/// error message on bad usage (an unknown option, a missing value).
std::optional<std::string> parse_common(const std::vector<std::string>& args,
                                        const std::vector<OptionSpec>& extra, CommonOptions* options);

/// The help text of the shared options.
std::string common_options_help();

/// The text to read: the positional arguments joined, or all of stdin when there are none
/// (or the only one is "-").
std::string input_text(const CommonOptions& options, std::istream& in);

/// When `text` (from input_text) holds nothing but white space: the message that no pose was
/// given and where one goes, else nullopt.
std::optional<std::string> no_pose_given(const std::string& text);

int run_convert(const std::vector<std::string>& args, Streams io);
int run_render(const std::vector<std::string>& args, Streams io);
int run_find(const std::vector<std::string>& args, Streams io);
int run_convention(const std::vector<std::string>& args, Streams io);
int run_compare(const std::vector<std::string>& args, Streams io);
int run_mount(const std::vector<std::string>& args, Streams io);
int run_read(const std::vector<std::string>& args, Streams io);
int run_track(const std::vector<std::string>& args, Streams io);
int run_card(const std::vector<std::string>& args, Streams io);

/// The window's entry point (app/gui/gui.hpp), when the executable is built with it.
using WindowEntry = int (*)(const std::vector<std::string>& args, std::ostream& out, std::ostream& err);

/// The top-level dispatcher: args excludes the program name. No args (or `gui ...`) opens
/// the window through `window`; without one it prints the usage (no args) or an error.
int run(const std::vector<std::string>& args, Streams io, WindowEntry window = nullptr);

}  // namespace attiscope::cli
