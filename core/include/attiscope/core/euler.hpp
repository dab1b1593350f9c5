// euler.hpp: the 24 Euler conventions (12 axis sequences x intrinsic/extrinsic).
//
// Axes i, j, k from {X, Y, Z}. Intrinsic (a, b, c): R = R_i(a) R_j(b) R_k(c), each turn
// about the body's current axis. Extrinsic (a, b, c): R = R_k(c) R_j(b) R_i(a), each turn
// about the fixed world axis, in the order i, j, k. Angles are listed in the order they are
// applied; R is world_R_body. Aerospace numerals: X=1, Y=2, Z=3 ("321" = ZYX).
//
// Ranges: first and third angle in (-180, 180]; the middle in [-90, 90] (Tait-Bryan, three
// different axes) or [0, 180] (proper Euler, first axis = third axis).
// Lock: when the lock margin is below kLockMarginRad the third angle is set to 0 and the
// first carries the whole free rotation.
#pragma once

#include <Eigen/Core>
#include <array>
#include <string>
#include <string_view>

#include "attiscope/core/expected.hpp"
#include "attiscope/core/rotation.hpp"

namespace attiscope {

enum class Axis { X = 0, Y = 1, Z = 2 };
enum class EulerKind { Intrinsic, Extrinsic };

/// 'X', 'Y' or 'Z'.
char axis_letter(Axis a);
/// Unit vector along a coordinate axis.
Eigen::Vector3d axis_vector(Axis a);
/// Active elementary rotation about a coordinate axis: R_x(angle), R_y(angle), R_z(angle).
Eigen::Matrix3d elementary_matrix(Axis a, double angle_rad);
/// The same as a Rotation (built from half angles, exact).
Rotation elementary_rotation(Axis a, double angle_rad);

/// One of the 24 Euler conventions.
struct EulerConvention {
  std::array<Axis, 3> axes{Axis::Z, Axis::Y, Axis::X};  ///< in application order
  EulerKind kind = EulerKind::Intrinsic;

  /// Proper Euler (first axis == third axis), as opposed to Tait-Bryan.
  bool proper() const { return axes[0] == axes[2]; }
  /// "ZYX".
  std::string sequence() const;
  /// "intrinsic ZYX".
  std::string name() const;
  /// "intrinsic" or "extrinsic".
  std::string kind_name() const;
  bool operator==(const EulerConvention& o) const { return axes == o.axes && kind == o.kind; }
  bool operator!=(const EulerConvention& o) const { return !(*this == o); }
};

/// Parses "ZYX", "zyx", "321", "3-2-1", "z-y-x". Error when it is not one of the 12 valid
/// sequences (two equal neighbours, a letter outside X/Y/Z...).
Expected<EulerConvention> parse_euler_sequence(std::string_view text, EulerKind kind);

/// All 24 conventions: the 12 sequences (XYZ XZY YXZ YZX ZXY ZYX XYX XZX YXY YZY ZXZ ZYZ)
/// intrinsic, then the same 12 extrinsic.
const std::array<EulerConvention, 24>& all_euler_conventions();

/// Lock margins below this (1e-6 degrees) are "at lock".
inline constexpr double kLockMarginRad = 1e-6 * 3.14159265358979323846 / 180.0;

/// Euler angles of a rotation in a convention.
struct EulerAngles {
  EulerConvention convention;
  Eigen::Vector3d angles_rad = Eigen::Vector3d::Zero();  ///< application order
  double lock_margin_rad = 0.0;  ///< Tait-Bryan: 90 deg - |b|; proper: min(b, 180 deg - b)
  bool at_lock = false;          ///< margin < kLockMarginRad: third angle set to 0
};

/// Euler angles of world_R_body in a convention, in the ranges above.
/// Method: the direct quaternion-to-Euler formula of Bernardes & Viollet 2022 ("Quaternion
/// to Euler angles conversion: A direct, general and computationally efficient method",
/// PLoS ONE 17(11) e0276302): the middle angle from 2 atan2(hypot, hypot), accurate at
/// every angle including next to lock (no asin of a rounded number).
EulerAngles to_euler(const Rotation& world_R_body, const EulerConvention& c);

/// world_R_body from Euler angles (application order, radians), as a product of three
/// elementary half-angle quaternions. Any finite angles are accepted.
Rotation from_euler(const EulerConvention& c, const Eigen::Vector3d& angles_rad);

/// Lock margin in radians of a middle angle (already in range) in a convention.
double lock_margin(const EulerConvention& c, double middle_rad);

/// The Euler-rate matrix E: omega_body = E * (da, db, dc)/dt, columns in application order.
/// det E = +/-cos(b) (Tait-Bryan) or +/-sin(b) (proper): singular exactly at lock.
Eigen::Matrix3d euler_rate_matrix(const EulerConvention& c, const Eigen::Vector3d& angles_rad);

/// 2-norm condition number sigma_max / sigma_min; +infinity when sigma_min is 0.
double condition_number(const Eigen::Matrix3d& m);

/// Wraps an angle into (-pi, pi].
double wrap_pi(double angle_rad);

}  // namespace attiscope
