// script.cpp: parsing of the window's test scripts.
#include "gui/script.hpp"

#include <GLFW/glfw3.h>

#include <algorithm>
#include <cctype>
#include <sstream>

namespace attiscope::gui {

namespace {

std::string trim(const std::string& s) {
  const auto b = s.find_first_not_of(" \t\r");
  if (b == std::string::npos) return "";
  const auto e = s.find_last_not_of(" \t\r");
  return s.substr(b, e - b + 1);
}

const char* const kOps[] = {"frames", "click",      "type", "key",    "clipboard", "resize",      "dump",
                            "drag",   "screenshot", "quit", "scroll", "wait",      "redraw-check"};

}  // namespace

Expected<std::vector<ScriptStep>> parse_script(const std::string& text) {
  std::vector<ScriptStep> steps;
  std::istringstream in(text);
  std::string raw;
  int line = 0;
  while (std::getline(in, raw)) {
    ++line;
    const std::string s = trim(raw);
    if (s.empty() || s[0] == '#') continue;
    const auto sp = s.find_first_of(" \t");
    ScriptStep step;
    step.op = s.substr(0, sp);
    // `type` keeps its text as written after one space; the others are trimmed.
    step.arg = sp == std::string::npos
                   ? ""
                   : (step.op == "type" ? raw.substr(raw.find(step.op) + 5) : trim(s.substr(sp)));
    step.line = line;
    if (std::find(std::begin(kOps), std::end(kOps), step.op) == std::end(kOps)) {
      return Error{"unknown script step '" + step.op + "'", line, 1};
    }
    if (step.op == "key") {
      auto k = parse_key_spec(step.arg);
      if (!k) return Error{k.error().message, line, static_cast<int>(sp + 2)};
    }
    if (step.op == "drag") {
      auto d = parse_drag_spec(step.arg);
      if (!d) return Error{d.error().message, line, static_cast<int>(sp + 2)};
    }
    steps.push_back(step);
  }
  return steps;
}

Expected<DragSpec> parse_drag_spec(const std::string& spec) {
  std::istringstream in(spec);
  DragSpec d;
  std::string button;
  if (!(in >> d.widget >> d.dx >> d.dy)) return Error{"drag needs NAME DX DY [left|right|middle]"};
  if (in >> button) {
    if (button == "left")
      d.button = 0;
    else if (button == "right")
      d.button = 1;
    else if (button == "middle")
      d.button = 2;
    else
      return Error{"unknown mouse button '" + button + "'; use left, right or middle"};
  }
  return d;
}

Expected<KeySpec> parse_key_spec(const std::string& spec) {
  KeySpec k;
  std::string rest = spec;
  std::transform(rest.begin(), rest.end(), rest.begin(), [](unsigned char c) { return std::tolower(c); });
  for (;;) {
    if (rest.rfind("ctrl+", 0) == 0) {
      k.ctrl = true;
      rest = rest.substr(5);
    } else if (rest.rfind("shift+", 0) == 0) {
      k.shift = true;
      rest = rest.substr(6);
    } else if (rest.rfind("alt+", 0) == 0) {
      k.alt = true;
      rest = rest.substr(4);
    } else {
      break;
    }
  }
  if (rest == "enter")
    k.key = GLFW_KEY_ENTER;
  else if (rest == "tab")
    k.key = GLFW_KEY_TAB;
  else if (rest == "escape")
    k.key = GLFW_KEY_ESCAPE;
  else if (rest == "backspace")
    k.key = GLFW_KEY_BACKSPACE;
  else if (rest == "comma")
    k.key = GLFW_KEY_COMMA;
  else if (rest == "period")
    k.key = GLFW_KEY_PERIOD;
  else if (rest == "left")
    k.key = GLFW_KEY_LEFT;
  else if (rest == "right")
    k.key = GLFW_KEY_RIGHT;
  else if (rest.size() == 1 && rest[0] >= 'a' && rest[0] <= 'z')
    k.key = GLFW_KEY_A + (rest[0] - 'a');
  else if (rest.size() == 1 && rest[0] >= '0' && rest[0] <= '9')
    k.key = GLFW_KEY_0 + (rest[0] - '0');
  else
    return Error{"unknown key '" + spec + "'"};
  return k;
}

}  // namespace attiscope::gui
