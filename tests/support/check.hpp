// check.hpp: the comparison helpers and tolerances every test uses. Test tolerances live
// here, apart from the library's own thresholds (core never shares its epsilons with tests).
#pragma once

#include <gtest/gtest.h>

#include <Eigen/Core>
#include <cstdint>
#include <random>
#include <sstream>

#include "attiscope/core/rotation.hpp"

namespace attiscope::test {

/// Conversions of exact inputs agree to this (radians or unitless).
inline constexpr double kTight = 1e-12;
/// Round trips through every representation over random rotations.
inline constexpr double kRoundTrip = 1e-12;
/// The SIMD batch kernels (batch.hpp) against the single-pose functions: angles away from
/// lock, lock margins and rotations (glibc's vector math is within a few ulp of libm).
inline constexpr double kBatchAngle = 1e-14;
/// The batch kernels' quaternion components and matrix entries against the single-pose ones.
inline constexpr double kBatchComponent = 4e-15;
/// The batch kernels' own atan2 against std::atan2, and their lock margins next to lock
/// against to_euler's (radians: a few ulp of pi).
inline constexpr double kBatchAtan2 = 1e-15;
/// Small Tait-Bryan middle angles of the batch against to_euler's, relative (a few ulp).
inline constexpr double kBatchRelative = 1e-14;
/// The fixed seed of every property test; failure messages print it.
inline constexpr std::uint32_t kSeed = 20261201;

/// Rotations compare by geodesic angle, so q and -q are equal.
inline ::testing::AssertionResult RotationNear(const Rotation& a, const Rotation& b, double tol_rad) {
  const double d = geodesic_angle(a, b);
  if (d <= tol_rad) return ::testing::AssertionSuccess();
  std::ostringstream s;
  s.precision(17);
  s << "rotations differ by " << d << " rad (tolerance " << tol_rad
    << ")\n  a = " << a.quaternion().coeffs().transpose()
    << " (x y z w)\n  b = " << b.quaternion().coeffs().transpose() << " (x y z w)";
  return ::testing::AssertionFailure() << s.str();
}

/// Matrices (any size) compare element by element; the message prints both and the difference.
template <class A, class B>
::testing::AssertionResult MatrixNear(const Eigen::MatrixBase<A>& a, const Eigen::MatrixBase<B>& b,
                                      double tol) {
  const double d = (a - b).cwiseAbs().maxCoeff();
  if (d <= tol) return ::testing::AssertionSuccess();
  std::ostringstream s;
  s.precision(17);
  s << "largest difference " << d << " (tolerance " << tol << ")\n  a =\n" << a << "\n  b =\n" << b;
  return ::testing::AssertionFailure() << s.str();
}

/// A uniformly distributed (Haar) random rotation: a normalised 4D Gaussian quaternion.
inline Rotation RandomRotation(std::mt19937& rng) {
  std::normal_distribution<double> n(0.0, 1.0);
  return Rotation(Eigen::Quaterniond(n(rng), n(rng), n(rng), n(rng)));
}

}  // namespace attiscope::test
