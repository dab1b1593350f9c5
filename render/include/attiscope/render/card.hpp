// card.hpp: a house convention's card as one picture for a team wiki or a wall: the model
// in the convention's body frame with the axis names and a positive-turn arrow about each
// Euler axis, beside the sequence, names, ranges, layouts and sentences as text (the words
// of core/convention_card.hpp). Needs a current OpenGL 3.3 core context (the window's or a
// HeadlessContext).
#pragma once

#include <string>

#include "attiscope/core/convention.hpp"
#include "attiscope/core/expected.hpp"
#include "attiscope/render/image.hpp"
#include "attiscope/render/scene.hpp"

namespace attiscope::render {

inline constexpr int kCardWidth = 1400;
inline constexpr int kCardHeight = 800;
inline constexpr int kCardSceneSide = 640;

/// The scene of a card: identity pose, the model placed in the house's body frame, the
/// triads labelled with the house's axis names, one positive-turn arc per Euler angle.
SceneState card_scene(const HouseConvention& c);

/// The lines of text a card shows (printable ASCII).
std::vector<std::string> card_text_lines(const HouseConvention& c);

/// Renders the card. Error when the renderer cannot start.
Expected<Image> render_convention_card(const HouseConvention& c);

/// Renders and writes the card's PNG, and the Markdown page when md_path is not empty.
/// Returns the paths written, for a message.
Expected<std::string> write_convention_card(const HouseConvention& c, const std::string& png_path,
                                            const std::string& md_path = "");

}  // namespace attiscope::render
