// text_field.hpp: an ImGui text field (one line or several) editing a std::string. Dear
// ImGui 1.86 edits a char array; the string lives in the panel's state between frames.
#pragma once

#include <string>

#include <imgui.h>

namespace attiscope::gui {

/// Draws the field; returns true when the text changed this frame. `capacity` bounds the text.
bool text_field(const char* id, std::string& text, std::size_t capacity, bool multiline,
                ImVec2 size = ImVec2(0.0f, 0.0f));

}  // namespace attiscope::gui
