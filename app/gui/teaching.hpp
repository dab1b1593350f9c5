// teaching.hpp: the step-through teaching mode's model (no ImGui, no GL): for the current
// pose and house convention, the three elementary turns from core/steps.hpp, the frame
// shown at a play position, and the overlays handed to render's SceneState.
#pragma once

#include <string>

#include "attiscope/core/steps.hpp"
#include "gui/document.hpp"

namespace attiscope::render {
struct SceneState;
}

namespace attiscope::gui {

struct Ui;

/// Which turn is playing and how far.
struct TeachState {
  bool active = false;      ///< the overlays are drawn in the Scene
  double position = 0.0;    ///< turns done, 0..3 (2.5: halfway through the third turn)
  bool playing = false;     ///< position advances with time
  double speed = 0.5;       ///< turns per second
  bool other_kind = false;  ///< play the equivalent order of the other kind
};

inline constexpr double kTeachMinSpeed = 0.05;
inline constexpr double kTeachMaxSpeed = 4.0;

struct TeachingView {
  EulerSteps steps;             ///< the three turns (the other kind's when asked)
  HouseConvention words;        ///< the convention whose names the sentences use
  int current = 0;              ///< the turn playing (0..2); 3 when all are done
  double fraction = 0.0;        ///< how much of it is done, 0..1
  Rotation shown_world_R_body;  ///< the frame at this position
  /// The turn the overlays and the sentence are about: the one playing, or (between turns)
  /// the one just finished; the first turn, not yet begun, at position 0.
  int focus = 0;
  double focus_fraction = 0.0;  ///< how much of the focus turn is drawn, 0..1
  std::string sentence;         ///< the focus turn's sentence
};

/// The teaching view of a document state at a play position.
TeachingView teaching_view(const DocumentState& s, const TeachState& t);

/// Copies the teaching overlays into a scene: the body at the shown frame, the frames left
/// by finished turns as faded triads (the start pose too), and the playing turn's axis and
/// arc. Does nothing when teaching is off.
void apply_teaching_overlay(const Ui& ui, render::SceneState* scene);

}  // namespace attiscope::gui
