// text_field.cpp: a std::string behind ImGui's char-array text fields.
#include "gui/text_field.hpp"
#include <algorithm>

namespace attiscope::gui {

bool text_field(const char* id, std::string& text, std::size_t capacity, bool multiline, ImVec2 size) {
  std::string buffer = text;
  buffer.resize(std::max(capacity, text.size() + 1), '\0');
  const bool changed = multiline ? ImGui::InputTextMultiline(id, buffer.data(), buffer.size(), size)
                                 : ImGui::InputText(id, buffer.data(), buffer.size());
  if (changed) text = std::string(buffer.c_str());
  return changed;
}

}  // namespace attiscope::gui
