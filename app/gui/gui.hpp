// gui.hpp: the window's entry point, called by `attiscope` and `attiscope gui`.
#pragma once

#include <iosfwd>
#include <string>
#include <vector>

namespace attiscope::gui {

/// Opens the window on the demo scene. args: FILE... and the window's own options
/// (--help lists them: --script for test runs, --bench for the frame-time benchmark).
/// Returns an exit code (0 ok, 2 bad usage or a failed script).
int run_window(const std::vector<std::string>& args, std::ostream& out, std::ostream& err);

}  // namespace attiscope::gui
