// chain_view.hpp: the Mount check panel's frame chain in the Scene: every frame of the loaded
// chain as a small labelled triad beside the body, the selected one highlighted
// (render/chain_overlay.hpp draws it; core/chain_layout.hpp places it).
#pragma once

#include <nlohmann/json.hpp>

#include "gui/ui.hpp"

#ifdef ATTISCOPE_HAS_RENDER
#include "attiscope/render/scene.hpp"
#endif

namespace attiscope::gui {

#ifdef ATTISCOPE_HAS_RENDER
/// Adds the chain's marks to a Scene (nothing when no chain is loaded or it is hidden). The
/// chain is drawn in its root frame's axes, which the Scene takes as its world axes.
void apply_chain_overlay(const Ui& ui, render::SceneState* scene);
#endif

/// What the chain view shows (frames, the selected one, where each is drawn), for dumps.
nlohmann::json chain_view_dump(const Ui& ui);

}  // namespace attiscope::gui
