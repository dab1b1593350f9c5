// card_values.hpp: what each Readouts card shows and what its typed numbers mean, all by
// core calls (no math here beyond unit scaling). GUI-free, so tests and the window's state
// dump read exactly the numbers the cards draw.
#pragma once

#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "gui/document.hpp"

namespace attiscope::gui {

/// One card as drawn: its editable numbers with their labels, and read-only lines.
struct CardView {
  std::string title;
  std::vector<std::string> labels;  ///< one per number
  std::vector<double> numbers;      ///< from the document's pose, in the card's order
  int columns = 4;                  ///< numbers per row in the card's grid
  std::vector<std::string> info;    ///< read-only lines (other layout, defect, margin...)
  bool editable = true;             ///< false when the form does not exist (Gibbs at 180 deg)
};

CardView card_view(Card c, const DocumentState& s);

/// What typed numbers (in the card's order) mean, checked by core: a rotation, or the
/// defect and the nearest valid rotation.
EditCheck check_card_edit(Card c, const std::vector<double>& numbers, const DocumentState& s);

/// A card's content for the clipboard: plain text at display precision, the card's part of
/// `convert --json` (core/report.hpp), or a C++ literal with round-trip digits.
std::string card_plain_text(Card c, const DocumentState& s);
nlohmann::json card_json(Card c, const DocumentState& s);
std::string card_code_literal(Card c, const DocumentState& s);

/// "%.*g" with no "-0".
std::string format_number(double v, int significant_digits);

/// Degrees per display unit step (1 for degrees, pi/180 for radians) and its name.
double angle_scale(AngleUnit unit);  ///< multiply radians by this for display
const char* unit_name(AngleUnit unit);

}  // namespace attiscope::gui
