// main.cpp: the attiscope executable.
#include <iostream>
#include <string>
#include <vector>

#include "cli/cli.hpp"
#ifdef ATTISCOPE_HAS_GUI
#include "gui/gui.hpp"
#endif

int main(int argc, char** argv) {
  std::vector<std::string> args(argv + 1, argv + argc);
#ifdef ATTISCOPE_HAS_GUI
  return attiscope::cli::run(args, {std::cout, std::cerr, std::cin}, attiscope::gui::run_window);
#else
  return attiscope::cli::run(args, {std::cout, std::cerr, std::cin});
#endif
}
