// convention_card.hpp: the text of a house convention's card, as a Markdown page for a
// team wiki: frames with axis names, the Euler sequence as its matrix product, names in
// application and print order, ranges, positive directions, quaternion and matrix layouts.
// The PNG card draws the same content on the model (render/); both call this for words.
#pragma once

#include <string>

#include "attiscope/core/convention.hpp"

namespace attiscope {

/// The Markdown page of a convention card.
std::string convention_card_markdown(const HouseConvention& c);

}  // namespace attiscope
