// panel_readouts.cpp: the Readouts panel: one card per representation, in a scrolling column.
#include "gui/ui.hpp"

namespace attiscope::gui {

void draw_readouts(Ui& ui) {
  for (Card c : all_cards()) draw_card(ui, c);
}

}  // namespace attiscope::gui
