// cmd_card.cpp: `attiscope card --convention FILE --out F.png [--md F.md]`: a house
// convention's card as one PNG (rendered headless) and, optionally, its Markdown page.
#include <iostream>

#include "attiscope/core/convention_card.hpp"
#include "cli/cli.hpp"

#ifdef ATTISCOPE_HAVE_RENDER
#include "attiscope/render/card.hpp"
#include "attiscope/render/headless.hpp"
#endif

namespace attiscope::cli {

namespace {

const char* kCardHelp =
    "usage: attiscope card --convention FILE --out F.png [--md F.md]\n\n"
    "Writes a house convention's card: the model in the convention's body frame with its axis\n"
    "names and a positive-turn arrow about each Euler axis, beside the sequence, the names in\n"
    "application and print order, the ranges, the quaternion and matrix layouts and the\n"
    "positive-direction sentences. --md also writes the same content as a Markdown page.\n\n"
    "example:\n"
    "  attiscope card --convention assets/conventions/survey-aircraft.toml --out card.png --md card.md\n";

}  // namespace

int run_card(const std::vector<std::string>& args, Streams io) {
  CommonOptions o;
  if (auto err = parse_common(args, {{"--out", true}, {"--md", true}}, &o)) {
    io.err << "attiscope card: " << *err << "\n";
    return kExitBadInput;
  }
  if (o.help) {
    io.out << kCardHelp;
    return kExitOk;
  }
  if (!o.convention) {
    io.err << "attiscope card: --convention FILE is required (see --help)\n";
    return kExitBadInput;
  }
  for (const std::string& w : o.convention_warnings) io.err << "attiscope card: warning: " << w << "\n";
  if (!o.positional.empty()) {
    io.err << "attiscope card: unexpected argument '" << o.positional[0] << "'\n";
    return kExitBadInput;
  }
  const auto out = o.last("--out");
  if (!out || out->empty()) {
    io.err << "attiscope card: --out F.png is required (see --help)\n";
    return kExitBadInput;
  }
#ifndef ATTISCOPE_HAVE_RENDER
  io.err << "attiscope card: this build has no renderer (configured with ATTISCOPE_BUILD_GUI=OFF)\n";
  return kExitBadInput;
#else
  auto context = render::HeadlessContext::create();
  if (!context) {
    io.err << "attiscope card: " << context.error().describe() << "\n";
    return kExitBadInput;
  }
  auto written = render::write_convention_card(*o.convention, *out, o.last("--md").value_or(""));
  if (!written) {
    io.err << "attiscope card: " << written.error().describe() << "\n";
    return kExitBadInput;
  }
  io.out << "wrote " << written.value() << "\n";
  return kExitOk;
#endif
}

}  // namespace attiscope::cli
