// corpus.hpp: the fixed edge-case corpus every property test runs over, next to random
// rotations from test::kSeed. Each case has a name that failure messages print.
#pragma once

#include <cmath>
#include <string>
#include <vector>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/rotation.hpp"

namespace attiscope::test {

struct NamedRotation {
  std::string name;
  Rotation rotation;
};

inline Rotation AxisTurn(const Eigen::Vector3d& axis, double angle_rad) {
  const Eigen::Vector3d u = axis.normalized();
  Eigen::Quaterniond q;
  q.w() = std::cos(0.5 * angle_rad);
  q.vec() = u * std::sin(0.5 * angle_rad);
  return Rotation(q);
}

/// Middle angles of a convention that put it exactly at lock.
inline std::vector<double> LockMiddles(const EulerConvention& c) {
  if (c.proper()) return {0.0, M_PI};
  return {0.5 * M_PI, -0.5 * M_PI};
}

/// Identity, 1e-9 rad turns, exactly 180 degrees about each axis and a skew axis, negative
/// w, exactly at lock and 1e-8 degrees from lock in every one of the 24 conventions.
inline std::vector<NamedRotation> EdgeCorpus() {
  std::vector<NamedRotation> out;
  out.push_back({"identity", Rotation::identity()});
  out.push_back({"identity with w = -1", Rotation(Eigen::Quaterniond(-1.0, 0.0, 0.0, 0.0))});
  const Eigen::Vector3d skew = Eigen::Vector3d(1.0, -2.0, 3.0).normalized();
  const std::vector<std::pair<std::string, Eigen::Vector3d>> axes = {
      {"x", Eigen::Vector3d::UnitX()},
      {"y", Eigen::Vector3d::UnitY()},
      {"z", Eigen::Vector3d::UnitZ()},
      {"skew (1,-2,3)", skew},
      {"(1,1,0)", Eigen::Vector3d(1.0, 1.0, 0.0)}};
  for (const auto& [name, axis] : axes) {
    out.push_back({"1e-9 rad about " + name, AxisTurn(axis, 1e-9)});
    out.push_back({"-1e-9 rad about " + name, AxisTurn(axis, -1e-9)});
    // Exactly 180 degrees: the quaternion (0, u) is exact, no cos(pi/2) rounding.
    out.push_back({"180 deg about " + name, Rotation(Eigen::Quaterniond(0.0, axis.x(), axis.y(), axis.z()))});
    out.push_back({"180 deg - 1e-9 rad about " + name, AxisTurn(axis, M_PI - 1e-9)});
    out.push_back({"negative w, 200 deg about " + name, AxisTurn(axis, 200.0 * M_PI / 180.0).negated()});
  }
  out.push_back({"negative w (-0.5, 0.5, -0.5, 0.5)", Rotation(Eigen::Quaterniond(-0.5, 0.5, -0.5, 0.5))});
  const double near = 1e-8 * M_PI / 180.0;
  for (const EulerConvention& c : all_euler_conventions()) {
    for (double mid : LockMiddles(c)) {
      const double toward = mid > 0.0 ? -1.0 : 1.0;  // stay inside the range
      const std::string at = c.name() + " middle " + std::to_string(mid * 180.0 / M_PI);
      out.push_back({"at lock " + at, from_euler(c, Eigen::Vector3d(0.5, mid, -0.3))});
      out.push_back(
          {"1e-8 deg from lock " + at, from_euler(c, Eigen::Vector3d(0.5, mid + toward * near, -0.3))});
    }
  }
  return out;
}

}  // namespace attiscope::test
