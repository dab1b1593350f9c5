// script.hpp: test scripts that drive the real window with synthetic input, one step per
// line. ImGui sees the same mouse, key and character input a person would give:
//
//   frames N            draw N frames with no input
//   click NAME          move the mouse onto the widget NAME (ui.hpp's names), press, release
//   type TEXT           type the characters of TEXT (the rest of the line)
//   key SPEC            press and release a key: enter, tab, escape, backspace, comma,
//                       period, left, right, a-z, 0-9,
//                       with ctrl+ shift+ alt+ in front ("ctrl+shift+z")
//   drag NAME DX DY [B] press a mouse button (left, right or middle; left if not given) on
//                       the centre of widget NAME, move by DX, DY points in steps, release
//   scroll NAME N       turn the mouse wheel N notches (up is positive) over widget NAME
//   clipboard TEXT      put TEXT on the clipboard
//   resize W H          resize the window (screen coordinates)
//   wait [S]            draw frames until the Track panel's background job is done (at
//                       most S seconds, 60 if not given; longer fails the script)
//   dump FILE           write the document and every card's numbers as JSON
//   screenshot FILE     write the window as a PNG
//   redraw-check [P]    repaint this frame whole and fail unless it matches the frame as
//                       drawn (which repaints only what changed; see redraw.hpp); on a
//                       mismatch write both pictures as P-partial.png and P-full.png
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

/// A drag: from the centre of a widget, by (dx, dy) points, with a mouse button (0 left,
/// 1 right, 2 middle).
struct DragSpec {
  std::string widget;
  float dx = 0.0f;
  float dy = 0.0f;
  int button = 0;
};
Expected<DragSpec> parse_drag_spec(const std::string& spec);

}  // namespace attiscope::gui
