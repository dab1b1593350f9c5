// script.hpp: test scripts that drive the real window with synthetic input, one step per
// line. ImGui sees the same mouse, key and character input a person would give:
//
//   frames N            draw N frames with no input
//   click NAME          move the mouse onto the widget NAME (ui.hpp's names), press, release
//   type TEXT           type the characters of TEXT (the rest of the line)
//   key SPEC            press and release a key: enter, tab, escape, backspace, a-z, with
//                       ctrl+ shift+ alt+ in front ("ctrl+shift+z")
//   clipboard TEXT      put TEXT on the clipboard
//   resize W H          resize the window (screen coordinates)
//   dump FILE           write the document and every card's numbers as JSON
//   screenshot FILE     write the window as a PNG
//   quit                close the window
//
// Blank lines and lines starting with '#' are ignored.
#pragma once

#include <string>
#include <vector>

#include "attiscope/core/expected.hpp"

namespace attiscope::gui {

struct ScriptStep {
  std::string op;
  std::string arg;  ///< the rest of the line, trimmed
  int line = 0;
};

/// Parses a script; an unknown step is an error naming its line.
Expected<std::vector<ScriptStep>> parse_script(const std::string& text);

/// A key press: a GLFW key code and modifiers.
struct KeySpec {
  int key = 0;
  bool ctrl = false;
  bool shift = false;
  bool alt = false;
};
Expected<KeySpec> parse_key_spec(const std::string& spec);

}  // namespace attiscope::gui
