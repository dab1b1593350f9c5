// teaching.cpp: the teaching mode's frames (core/steps.hpp) and its scene overlays.
#include "gui/teaching.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include <Eigen/Geometry>

#include "gui/ui.hpp"

#ifdef ATTISCOPE_HAS_RENDER
#include "attiscope/render/scene.hpp"
#endif

namespace attiscope::gui {

namespace {
constexpr float kFadedAlpha = 0.35f;
constexpr double kRadToDeg = 180.0 / 3.14159265358979323846;
}  // namespace

TeachingView teaching_view(const DocumentState& s, const TeachState& t) {
  TeachingView v;
  const HouseConvention& house = s.convention.house;
  const EulerSteps own = euler_steps(s.world_R_body, house);
  if (t.other_kind) {
    const auto [other, angles] = equivalent_other_kind(own.convention, own.angles_rad);
    v.words = with_other_kind(house);
    v.steps = euler_steps_for(other, angles, v.words);
  } else {
    v.words = house;
    v.steps = own;
  }
  const double p = std::clamp(t.position, 0.0, 3.0);
  v.current = std::min(3, static_cast<int>(std::floor(p)));
  v.fraction = v.current < 3 ? p - v.current : 0.0;
  if (v.fraction > 0.0) {
    v.focus = v.current;
    v.focus_fraction = v.fraction;
  } else if (v.current > 0) {
    v.focus = v.current - 1;
    v.focus_fraction = 1.0;
  }
  v.sentence = v.steps.steps[static_cast<std::size_t>(v.focus)].sentence;
  if (v.current >= 3) {
    v.shown_world_R_body = v.steps.steps[2].after;
  } else {
    const EulerStep& step = v.steps.steps[static_cast<std::size_t>(v.current)];
    // Part of the turn about its axis in world coordinates: for an intrinsic turn that is
    // the body's current axis, for an extrinsic one the world's (core/steps.hpp).
    const Eigen::Quaterniond part(
        Eigen::AngleAxisd(v.fraction * step.angle_rad, step.axis_world.normalized()));
    v.shown_world_R_body = Rotation(part * step.before.quaternion());
  }
  return v;
}

void apply_teaching_overlay(const Ui& ui, render::SceneState* scene) {
#ifdef ATTISCOPE_HAS_RENDER
  if (!ui.teach.active || scene == nullptr) return;
  const TeachingView v = teaching_view(ui.doc.state(), ui.teach);
  scene->world_R_body = v.shown_world_R_body;
  scene->faded_triads.clear();
  scene->faded_triads.push_back({v.steps.steps[0].before, kFadedAlpha});
  for (int i = 0; i < v.focus; ++i) {
    scene->faded_triads.push_back({v.steps.steps[static_cast<std::size_t>(i)].after, kFadedAlpha});
  }
  const EulerStep& step = v.steps.steps[static_cast<std::size_t>(v.focus)];
  render::TurnHighlight turn;
  turn.axis_world = step.axis_world;
  turn.start_world_R_body = step.before;
  turn.angle_rad = step.angle_rad;
  turn.shown_rad = v.focus_fraction * step.angle_rad;
  const double shown = std::round(turn.shown_rad * kRadToDeg * 10.0) / 10.0;
  char text[96];
  std::snprintf(text, sizeof text, "%s %+.1f deg", step.angle_name.c_str(), shown);
  turn.label = text;
  scene->turns.clear();
  scene->turns.push_back(turn);
#else
  (void)ui;
  (void)scene;
#endif
}

}  // namespace attiscope::gui
