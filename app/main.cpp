// main.cpp: the attiscope executable.
#include <iostream>
#include <string>
#include <vector>

#include "cli/cli.hpp"

int main(int argc, char** argv) {
  std::vector<std::string> args(argv + 1, argv + argc);
  return attiscope::cli::run(args, {std::cout, std::cerr, std::cin});
}
