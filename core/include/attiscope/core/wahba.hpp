// wahba.hpp: a sensor mount solved from vector pairs (Wahba's problem), with TRIAD as a
// cross-check and a refusal when the vectors cannot fix the rotation.
//
// Each pair is one direction seen in two frames: `sensor` in sensor coordinates and
// `vehicle` in vehicle coordinates (a resting accelerometer reading and the known gravity
// direction in the vehicle frame, say). The solution is vehicle_R_sensor, which maps sensor
// coordinates into vehicle coordinates and minimises Wahba's loss (Wahba 1965, SIAM Review
// 7(3) 409): L(R) = 1/2 sum w_i |v_i - R s_i|^2 over unit vectors. Only directions count:
// each vector is normalised, so readings in m/s^2 pair with unit vectors.
#pragma once

#include <Eigen/Core>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "attiscope/core/expected.hpp"
#include "attiscope/core/rotation.hpp"
#include "attiscope/core/vehicle_axes.hpp"

namespace attiscope {

struct VectorPair {
  Eigen::Vector3d sensor = Eigen::Vector3d::UnitX();   ///< in sensor coordinates
  Eigen::Vector3d vehicle = Eigen::Vector3d::UnitX();  ///< the same direction, vehicle coordinates
  double weight = 1.0;
  int line = 0;  ///< where it was read (1-based), 0 when typed in
};

/// Reads a vector file: one pair per line, `sx sy sz vx vy vz [w]`, separated by spaces,
/// tabs or commas; `#` starts a comment; blank lines are skipped. Errors name the line and
/// column (a word that is not a number, the wrong count, a zero vector, a negative weight).
Expected<std::vector<VectorPair>> parse_vector_pairs(std::string_view text);

/// The SVD solution (Markley 1988, "Attitude Determination Using Vector Observations and the
/// Singular Value Decomposition", JAS 36(3) 245-258): B = sum w_i v_i s_i^T = U S V^T,
/// vehicle_R_sensor = U diag(1, 1, det U det V) V^T. Needs at least one pair of positive
/// weight; with too few directions the answer is one of many (see vector_observability).
Rotation wahba_svd(const std::vector<VectorPair>& pairs);

/// Davenport's q-method (Davenport 1968, as documented by Keat 1977): the eigenvector of the
/// 4x4 matrix K for its largest eigenvalue. Written here for the Hamilton quaternion of
/// vehicle_R_sensor: with B = sum w_i s_i v_i^T, S = B + B^T, sigma = tr B and
/// z = sum w_i s_i x v_i, K = [[S - sigma I, z], [z^T, sigma]] acting on (x, y, z, w).
/// (Shuster's attitude matrix is vehicle-to-sensor: its quaternion's numbers are those of the
/// Hamilton quaternion of vehicle_R_sensor.) `lambda_max`, when given, receives the largest
/// eigenvalue (sum w_i minus the loss, for unit vectors).
Rotation wahba_davenport(const std::vector<VectorPair>& pairs, double* lambda_max = nullptr);

/// TRIAD (Shuster & Oh 1981, "Three-Axis Attitude Determination from Vector Observations",
/// J. Guidance and Control 4(1) 70-77): exact on the first pair, uses only the plane of the
/// second. Error when either pair has parallel vectors.
Expected<Rotation> triad(const VectorPair& first, const VectorPair& second);

/// Whether the pairs fix the rotation.
struct Observability {
  bool observable = true;
  /// The largest angle between the lines of two sensor vectors (0 to 90 degrees), and the
  /// same for the vehicle vectors, whichever is smaller: near 0 the vectors are all parallel
  /// or antiparallel. Exact up to 256 pairs; beyond, a two-sweep bound of at least half the
  /// exact value (so a refusal of a very long file is conservative).
  double separation_rad = 0.0;
  /// When not observable: the line the rotation is free about, in each frame.
  Eigen::Vector3d free_axis_sensor = Eigen::Vector3d::Zero();
  Eigen::Vector3d free_axis_vehicle = Eigen::Vector3d::Zero();
  /// Empty when observable; otherwise which rotation cannot be found, and what to add.
  std::string sentence;
  /// A sentence when observable but weakly (separation below kWeakSeparationRad).
  std::string warning;
};

/// Vectors whose lines are closer than this do not fix the rotation about them: refused.
/// A heading error from noise grows as 1/sin(separation): at 3 degrees, 19 times the noise.
inline constexpr double kMinVectorSeparationRad = 3.0 * 3.14159265358979323846 / 180.0;
/// Below this the solution is given with a warning.
inline constexpr double kWeakSeparationRad = 15.0 * 3.14159265358979323846 / 180.0;

Observability vector_observability(const std::vector<VectorPair>& pairs, const VehicleAxes& names);

/// The mount solved from vector pairs.
struct VectorSolve {
  /// Empty when the pairs do not fix the rotation (then `observability.sentence` says why).
  std::optional<Rotation> vehicle_R_sensor;
  Observability observability;
  std::vector<double> residuals_rad;  ///< angle between v_i and R s_i, per pair, input order
  double loss = 0.0;                  ///< Wahba's loss at the solution, unit vectors
  std::optional<Rotation> davenport;  ///< the q-method's answer (should agree with SVD)
  double davenport_difference_rad = 0.0;
  std::optional<Rotation> triad;  ///< TRIAD on the heaviest pair and the best-spread other
  double triad_difference_rad = 0.0;
  std::vector<int> triad_lines;  ///< the two pairs TRIAD used (their `line`, or 1-based index)
  std::vector<std::string> warnings;
};

/// TRIAD further than this from the optimal solution earns a warning (the data disagree
/// among themselves by more than a careful alignment would).
inline constexpr double kTriadDisagreementRad = 1.0 * 3.14159265358979323846 / 180.0;
/// A residual above this earns a warning naming the pair.
inline constexpr double kLargeResidualRad = 2.0 * 3.14159265358979323846 / 180.0;

/// Solves the mount from pairs: observability first (refusal when too close to parallel),
/// then SVD (the answer), q-method and TRIAD as cross-checks, and the residuals. Errors for
/// an empty list or no positive weight.
Expected<VectorSolve> solve_mount_from_vectors(const std::vector<VectorPair>& pairs,
                                               const VehicleAxes& names);

}  // namespace attiscope
