// representations.hpp: axis-angle, rotation vector, Gibbs (Rodrigues) vector and modified
// Rodrigues parameters (MRP), each to and from the canonical rotation.
//
// Definitions (Shuster 1993, "A Survey of Attitude Representations", JAS 41(4); MRP
// pp. 475-476), with q = (w, v) canonical (w >= 0):
//   axis-angle  q = (cos(t/2), u sin(t/2)), t in [0, pi]
//   rotvec      t u (radians), |rotvec| <= pi
//   Gibbs       g = v / w = u tan(t/2), infinite at t = pi
//   MRP         p = v / (1 + w) = u tan(t/4), |p| <= 1; shadow set -p / |p|^2
#pragma once

#include <Eigen/Core>
#include <optional>

#include "attiscope/core/expected.hpp"
#include "attiscope/core/rotation.hpp"

namespace attiscope {

struct AxisAngle {
  Eigen::Vector3d axis = Eigen::Vector3d::UnitX();  ///< unit; x when the angle is 0
  double angle_rad = 0.0;                           ///< in [0, pi]
};

/// angle = 2 atan2(|v|, w) on the canonical quaternion: accurate near 0 and near pi.
AxisAngle to_axis_angle(const Rotation& r);
/// Error when the axis is zero or not finite, or the angle is not finite. Any angle is
/// accepted (a 270 degree turn is the -90 degree one).
Expected<Rotation> from_axis_angle(const Eigen::Vector3d& axis, double angle_rad);

Eigen::Vector3d to_rotation_vector(const Rotation& r);
/// exp map; for |v| below kSmallAngleRad the series sin(t/2)/t = 1/2 - t^2/48 is used.
/// Error when a number is not finite.
Expected<Rotation> from_rotation_vector(const Eigen::Vector3d& rotvec_rad);

/// Gibbs vector; nullopt when the rotation is 180 degrees (w < kGibbsInfiniteW).
std::optional<Eigen::Vector3d> to_gibbs(const Rotation& r);
Expected<Rotation> from_gibbs(const Eigen::Vector3d& g);

/// MRP with |p| <= 1 (the set for |t| <= 180 degrees).
Eigen::Vector3d to_mrp(const Rotation& r);
/// The shadow set -p/|p|^2 (same rotation); nullopt at the identity, where it is infinite.
std::optional<Eigen::Vector3d> mrp_shadow(const Eigen::Vector3d& p);
Expected<Rotation> from_mrp(const Eigen::Vector3d& p);

/// An axis shorter than this has no direction (from_axis_angle).
inline constexpr double kMinAxisNorm = 1e-12;
/// Below this angle the small-angle series is used.
inline constexpr double kSmallAngleRad = 1e-4;
/// The Gibbs vector is reported infinite when the canonical w is below this.
inline constexpr double kGibbsInfiniteW = 1e-12;

}  // namespace attiscope
