// quaternion.hpp: quaternion algebra and the quaternion *views* of a rotation.
//
// The internal form is always Hamilton, scalar first, body-to-world (rotation.hpp).
// Scalar-last storage, JPL algebra and world-to-body direction are views chosen per house
// convention, never a second internal form.
//
// JPL (Breckenridge 1979; Trawny & Roumeliotis 2005): i j = -k, and the matrix of a JPL
// quaternion is C(q) = R_Hamilton(q)^T for the same four numbers. So the JPL quaternion of
// a world-to-body DCM has the same numbers as the Hamilton quaternion of world_R_body.
#pragma once

#include <Eigen/Core>
#include <Eigen/Geometry>
#include <array>
#include <string>
#include <vector>

#include "attiscope/core/expected.hpp"
#include "attiscope/core/rotation.hpp"

namespace attiscope {

/// Which way round a rotation (or its matrix, or its quaternion) is written.
enum class Direction {
  BodyToWorld,  ///< world_R_body: maps body coordinates into world coordinates
  WorldToBody,  ///< body_R_world: the aerospace DCM from world to body
};

/// Storage order of the four quaternion numbers.
enum class QuatLayout {
  ScalarFirst,  ///< (w, x, y, z)
  ScalarLast,   ///< (x, y, z, w)
};

/// Quaternion multiplication rule.
enum class QuatAlgebra {
  Hamilton,  ///< i j = k
  Jpl,       ///< i j = -k (Shuster / JPL "natural order")
};

/// How a set of four quaternion numbers is to be read or written.
struct QuatConvention {
  QuatLayout layout = QuatLayout::ScalarFirst;
  QuatAlgebra algebra = QuatAlgebra::Hamilton;
  Direction direction = Direction::BodyToWorld;

  /// "w x y z, Hamilton, body-to-world" and the like.
  std::string describe() const;
  bool operator==(const QuatConvention& o) const {
    return layout == o.layout && algebra == o.algebra && direction == o.direction;
  }
};

/// The 8 quaternion conventions (2 layouts x 2 algebras x 2 directions).
std::array<QuatConvention, 8> all_quat_conventions();

/// Hamilton product a (x) b, both stored (w, x, y, z).
Eigen::Quaterniond hamilton_product(const Eigen::Quaterniond& a, const Eigen::Quaterniond& b);
/// JPL product a (x) b of quaternions whose four numbers are stored in Eigen's slots; it
/// equals the Hamilton product b (x) a (Trawny & Roumeliotis 2005, eq. 8 [memory]).
Eigen::Quaterniond jpl_product(const Eigen::Quaterniond& a, const Eigen::Quaterniond& b);

/// The four numbers of a rotation under a convention, in storage order, canonical sign.
std::array<double, 4> to_quaternion_numbers(const Rotation& world_R_body, const QuatConvention& c);

/// What was found about four typed quaternion numbers.
struct QuatCheck {
  double norm = 1.0;  ///< Euclidean norm of the numbers as given
};

/// Reads four numbers (in storage order) as a rotation. Errors: a number not finite, a norm
/// below kMinQuaternionNorm. A non-unit norm is accepted (normalised); `check` reports it.
Expected<Rotation> from_quaternion_numbers(const std::array<double, 4>& numbers, const QuatConvention& c,
                                           QuatCheck* check = nullptr);

/// Below this norm four numbers are not a quaternion of a rotation (a zero quaternion).
inline constexpr double kMinQuaternionNorm = 1e-9;
/// A norm within this of 1 is unit for every purpose (no warning).
inline constexpr double kUnitNormTolerance = 1e-9;

/// 4x4 real matrix of left multiplication: p (x) q = L(p) q, numbers (w, x, y, z).
Eigen::Matrix4d left_multiplication_matrix(const Eigen::Quaterniond& p);
/// 4x4 real matrix of right multiplication: p (x) q = R(q) p, numbers (w, x, y, z).
Eigen::Matrix4d right_multiplication_matrix(const Eigen::Quaterniond& q);

/// Which multiplication matrix: L(p) (p on the left) or R(q) (q on the right).
enum class MultiplicationSide { Left, Right };

/// Inverse of left_multiplication_matrix / right_multiplication_matrix. Both are linear in
/// the quaternion with the orthogonal basis L(e_i) (or R(e_i)), <B_i, B_j> = 4 delta_ij, so
/// the nearest form in the Frobenius norm has p_i = trace(B_i^T m) / 4 (a least-squares
/// projection). Error when m is farther than `tolerance` (relative) from that form, or zero.
/// A tolerance of +infinity gives the nearest rotation of any finite matrix.
Expected<Rotation> from_multiplication_matrix(const Eigen::Matrix4d& m, MultiplicationSide side,
                                              double tolerance = 1e-6);

/// The 2x2 complex (SU(2)) form, layout U(q) = [[w + x i, y + z i], [-y + z i, w - x i]].
/// U(p) U(q) = U(p (x) q) and det U = |q|^2.
Eigen::Matrix2cd su2_matrix(const Eigen::Quaterniond& q);
/// Inverse of su2_matrix. Error when the matrix is not of that form (to `tolerance`) or zero.
Expected<Rotation> from_su2_matrix(const Eigen::Matrix2cd& u, double tolerance = 1e-6);

}  // namespace attiscope
