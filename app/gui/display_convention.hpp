// display_convention.hpp: how the window writes a rotation for a team (the "house
// convention" as far as the readouts need it): Euler convention and angle names, unit,
// quaternion layout/algebra/direction, matrix direction/storage, precision. Every card
// applies it. The house convention file loader fills one of these; until then the window
// offers the built-in choices below. Views only: the document always holds the canonical
// Rotation (core/rotation.hpp).
#pragma once

#include <array>
#include <string>
#include <vector>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"
#include "attiscope/core/text.hpp"

namespace attiscope::gui {

struct DisplayConvention {
  std::string name = "Default (Hamilton w x y z, ZYX yaw-pitch-roll)";
  std::string world_frame = "ENU";
  std::string body_frame = "FLU";
  EulerConvention euler;                                           ///< intrinsic ZYX by default
  std::array<std::string, 3> angle_names{"yaw", "pitch", "roll"};  ///< application order
  AngleUnit unit = AngleUnit::Degrees;
  QuatConvention quaternion;  ///< house layout, algebra and direction
  MatrixConvention matrix;    ///< house direction and storage
  int precision = 6;          ///< significant digits shown

  bool operator==(const DisplayConvention& o) const;
  bool operator!=(const DisplayConvention& o) const { return !(*this == o); }
};

/// The built-in choices of the house convention selector (invented examples, each a
/// common combination in its trade).
const std::vector<DisplayConvention>& builtin_conventions();

}  // namespace attiscope::gui
