// rotation.hpp: the one canonical rotation type of attiscope.
//
// Convention (docs/conventions.md): a pose is world_R_body, v_world = R v_body; the
// columns of R are the body axes written in world coordinates. We write a_R_b for the
// rotation that maps b-coordinates into a. Internally a unit Hamilton quaternion
// (i j = k), scalar first (w, x, y, z), active: v_world = q v_body q*.
#pragma once

#include <Eigen/Core>
#include <Eigen/Geometry>
#include <vector>

#include "attiscope/core/expected.hpp"

namespace attiscope {

/// Returns q or -q, whichever has w > 0; when w == 0 the first non-zero of (x, y, z) is
/// made positive. q and -q are the same rotation; this picks the printed one.
Eigen::Quaterniond canonical_sign(const Eigen::Quaterniond& q);

/// A rotation of 3D space, held as a unit Hamilton quaternion. The stored sign is kept
/// (so a track can stay sign-continuous); quaternion() gives the canonical sign.
class Rotation {
 public:
  /// The identity.
  Rotation() : q_(1.0, 0.0, 0.0, 0.0) {}

  /// From a quaternion in Hamilton algebra, scalar first, body-to-world. It is normalised;
  /// it must be finite and non-zero (validate person-typed numbers with
  /// from_quaternion_numbers in quaternion.hpp instead).
  explicit Rotation(const Eigen::Quaterniond& hamilton_wxyz);

  static Rotation identity() { return Rotation(); }

  /// The quaternion with canonical sign (w >= 0, ties broken as canonical_sign says).
  Eigen::Quaterniond quaternion() const { return canonical_sign(q_); }
  /// The quaternion with the sign it was built with.
  const Eigen::Quaterniond& stored_quaternion() const { return q_; }

  /// world_R_body: v_world = matrix() * v_body.
  Eigen::Matrix3d matrix() const { return q_.toRotationMatrix(); }

  /// body_R_world.
  Rotation inverse() const { return Rotation(q_.conjugate(), Unchecked{}); }

  /// Composition: (a * b).matrix() == a.matrix() * b.matrix(); b is applied first.
  Rotation operator*(const Rotation& rhs) const;

  /// Turns a vector: matrix() * v.
  Eigen::Vector3d apply(const Eigen::Vector3d& v) const { return q_ * v; }

  /// The same rotation with the opposite quaternion sign.
  Rotation negated() const { return Rotation(Eigen::Quaterniond(-q_.coeffs()), Unchecked{}); }

 private:
  struct Unchecked {};
  Rotation(const Eigen::Quaterniond& unit_q, Unchecked) : q_(unit_q) {}
  Eigen::Quaterniond q_;
};

/// Geodesic angle between two rotations in radians, in [0, pi]: the angle of a^-1 b.
/// Uses 2 atan2(|v|, |w|) of the relative quaternion, accurate for tiny and near-180 angles.
double geodesic_angle(const Rotation& a, const Rotation& b);

/// Spherical linear interpolation along the shortest arc, t in [0, 1] (Shoemake 1985,
/// "Animating Rotation with Quaternion Curves"): slerp(a, b, t) = a (a^-1 b)^t, with the
/// relative quaternion's sign chosen so the arc is at most 180 degrees.
Rotation slerp(const Rotation& a, const Rotation& b, double t);

/// Weighted mean of rotations: the eigenvector of M = sum w_i q_i q_i^T for its largest
/// eigenvalue (Markley, Cheng, Crassidis, Oshman 2007, "Averaging Quaternions", JGCD
/// 30(4)). Independent of every q_i's sign. Empty weights mean equal weights. Error when
/// the input is empty, a weight is negative or not finite, or the largest eigenvalue is
/// repeated (the mean is not unique, e.g. two rotations 180 degrees apart).
Expected<Rotation> mean_rotation(const std::vector<Rotation>& rotations,
                                 const std::vector<double>& weights = {});

}  // namespace attiscope
