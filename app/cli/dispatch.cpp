// dispatch.cpp: `attiscope SUBCOMMAND ...`: finds the subcommand and runs it.
#include <ostream>

#include "cli/cli.hpp"

namespace attiscope::cli {

namespace {

struct Subcommand {
  const char* name;
  const char* summary;
  int (*run)(const std::vector<std::string>&, Streams);
};

// `gui` has no function here: run() hands it to the window entry the executable passes in.
const Subcommand kSubcommands[] = {
    {"gui", "the window, opening logs or convention files", nullptr},
    {"convert", "read one pose, print every representation", run_convert},
    {"render", "headless PNG of the body in a pose", run_render},
    {"find", "the conventions under which two texts are one rotation", run_find},
    {"convention", "check a house convention file and show what it means", run_convention},
    {"compare", "relative rotation, angle, per-axis error; mean and spread", run_compare},
    {"mount", "mount check: nominal vs measured, or a solve from vector pairs", run_mount},
    {"read", "print the ranked readings of pasted text", run_read},
    {"track", "summary and diagnosis of a pose log; clean copy as CSV", run_track},
    {"card", "a house convention's card as a PNG (and Markdown)", run_card},
};

void print_usage(std::ostream& os) {
  os << "usage: attiscope [SUBCOMMAND] [options]\n\n"
        "With no subcommand, attiscope opens the window on the demo scene.\n\nSubcommands:\n";
  for (const Subcommand& s : kSubcommands) {
    std::string n = s.name;
    n.resize(12, ' ');
    os << "  " << n << s.summary << "\n";
  }
  os << "\nEvery subcommand takes --help. Exit codes: 0 success, 1 a check failed, 2 bad input.\n";
}

}  // namespace

int run(const std::vector<std::string>& args, Streams io, WindowEntry window) {
  if (args.empty() && window) return window({}, io.out, io.err);
  if (args.empty() || args[0] == "--help" || args[0] == "-h" || args[0] == "help") {
    print_usage(io.out);
    return kExitOk;
  }
  for (const Subcommand& s : kSubcommands) {
    if (args[0] != s.name) continue;
    const std::vector<std::string> rest(args.begin() + 1, args.end());
    if (s.run) return s.run(rest, io);
    if (window) return window(rest, io.out, io.err);
    io.err << "attiscope: this build has no window (configured with ATTISCOPE_BUILD_GUI=OFF)\n";
    return kExitBadInput;
  }
  io.err << "attiscope: unknown subcommand '" << args[0] << "'\n";
  print_usage(io.err);
  return kExitBadInput;
}

}  // namespace attiscope::cli
