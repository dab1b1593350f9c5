// display_convention.cpp: the built-in house conventions of the selector.
#include "gui/display_convention.hpp"

namespace attiscope::gui {

bool DisplayConvention::operator==(const DisplayConvention& o) const {
  return name == o.name && world_frame == o.world_frame && body_frame == o.body_frame && euler == o.euler &&
         angle_names == o.angle_names && unit == o.unit && quaternion == o.quaternion &&
         matrix.direction == o.matrix.direction && matrix.storage == o.matrix.storage &&
         precision == o.precision;
}

const std::vector<DisplayConvention>& builtin_conventions() {
  // Built once on first use; immutable afterwards (a table, not state).
  static const std::vector<DisplayConvention> kBuiltins = [] {
    std::vector<DisplayConvention> v;
    {
      DisplayConvention c;  // ENU / FLU, Hamilton w x y z: common practice in robotics math
      c.name = "Robot arm team: ENU/FLU, Hamilton wxyz, ZYX yaw-pitch-roll (deg)";
      v.push_back(c);
    }
    {
      DisplayConvention c;  // NED / FRD, 3-2-1 heading-elevation-bank: common practice in aviation
      c.name = "Survey aircraft team: NED/FRD, 3-2-1 heading-elevation-bank, DCM world-to-body";
      c.world_frame = "NED";
      c.body_frame = "FRD";
      c.angle_names = {"heading", "elevation", "bank"};
      c.matrix.direction = Direction::WorldToBody;
      c.precision = 5;
      v.push_back(c);
    }
    {
      DisplayConvention c;  // scalar-last JPL quaternions: common practice in spacecraft GNC
      c.name = "Spacecraft team: JPL xyzw world-to-body, 3-1-3 (rad), column-major";
      c.world_frame = "inertial";
      c.body_frame = "spacecraft";
      c.euler.axes = {Axis::Z, Axis::X, Axis::Z};
      c.angle_names = {"phi", "theta", "psi"};
      c.unit = AngleUnit::Radians;
      c.quaternion = {QuatLayout::ScalarLast, QuatAlgebra::Jpl, Direction::WorldToBody};
      c.matrix = {Direction::WorldToBody, MatrixStorage::Columns};
      c.precision = 7;
      v.push_back(c);
    }
    return v;
  }();
  return kBuiltins;
}

}  // namespace attiscope::gui
