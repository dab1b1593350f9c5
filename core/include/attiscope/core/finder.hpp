// finder.hpp: which conventions explain two sets of numbers that should be one rotation,
// and the gravity test that picks the reading of a logged orientation under which a
// resting accelerometer points steadily up.
//
// The finder tries every combination of Euler sequence, kind, unit and print order,
// quaternion layout, algebra and direction, and matrix direction and storage that applies
// to the two inputs, and ranks them by the residual angle between the two rotations they
// then describe. Some combinations always give the same numbers (a JPL body-to-world
// quaternion has the numbers of a Hamilton world-to-body one; intrinsic ZYX printed
// (a, b, c) is extrinsic XYZ printed (c, b, a)): such twins share a residual and are all
// listed, so a tie at the top is a real ambiguity of the data, not of the search.
#pragma once

#include <Eigen/Core>
#include <array>
#include <optional>
#include <string>
#include <vector>

#include "attiscope/core/convention.hpp"
#include "attiscope/core/euler.hpp"
#include "attiscope/core/expected.hpp"
#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"
#include "attiscope/core/rotation.hpp"
#include "attiscope/core/text.hpp"

namespace attiscope {

/// One interpretation of the inputs. Fields that do not apply are empty.
struct Interpretation {
  std::optional<EulerConvention> euler;
  std::optional<AngleUnit> unit;
  /// print_order[k] = application index of the k-th number as written.
  std::optional<std::array<int, 3>> print_order;
  std::optional<QuatConvention> quaternion;
  std::optional<MatrixConvention> matrix;
  /// For a product check only the layout and algebra are known.
  bool product_only = false;

  /// One line, e.g. "intrinsic ZYX in degrees printed as applied; quaternion x y z w, Hamilton,
  /// body-to-world".
  std::string describe() const;
};

struct FinderMatch {
  Interpretation interpretation;
  double residual_rad = 0.0;
};

/// Interpretations whose residual is within this are listed (printed numbers are rounded).
inline constexpr double kFinderDefaultWithinRad = 0.5 * 3.14159265358979323846 / 180.0;
/// Residuals this close to the best count as a tie with it.
inline constexpr double kFinderTieRad = 1e-9;

struct FinderOptions {
  double within_rad = kFinderDefaultWithinRad;
  /// When set, interpretations that tie are ordered by how many of their choices agree
  /// with this house convention (the house breaks ties; it never changes a residual).
  std::optional<HouseConvention> house;
};

/// How many of an interpretation's choices (sequence and kind, unit, print order,
/// quaternion layout, algebra and direction, matrix direction and storage) agree with a
/// house convention.
int house_agreement(const Interpretation& i, const HouseConvention& house);

struct FinderResult {
  std::string mode;                  ///< "euler-quaternion", "euler-matrix", "quaternion-matrix", "product"
  std::vector<FinderMatch> matches;  ///< within options.within_rad, best first
  std::vector<FinderMatch> nearest;  ///< the best few, whether or not within (for "no match" messages)
  std::vector<std::string> notes;    ///< ambiguities the data cannot resolve
};

/// Finds the interpretations under which numbers `a` and `b` are the same rotation.
/// Shapes (either order): 3 and 4 (Euler triple, quaternion), 3 and 9 (Euler, matrix),
/// 4 and 9 (quaternion, matrix), 8 and 4 (q1 q2, then their product). Error for other
/// counts, numbers that are not finite, a zero quaternion, or nine numbers that are no
/// rotation in any storage.
Expected<FinderResult> find_conventions(const std::vector<double>& a, const std::vector<double>& b,
                                        const FinderOptions& options = {});

/// One resting sample: the accelerometer vector in the sensor (body) frame and the
/// orientation numbers logged at the same moment.
struct GravitySample {
  Eigen::Vector3d accel_body = Eigen::Vector3d::Zero();
  std::vector<double> pose;  ///< 3 (Euler), 4 (quaternion) or 9 (matrix) numbers
  int line = 0;              ///< line in the file, for messages
};

/// Reads a gravity log: one sample per line, "ax ay az" then the pose numbers; blank
/// lines and lines starting with '#' are skipped. Every line must have the same count
/// (6, 7 or 12). Errors name the line and column.
Expected<std::vector<GravitySample>> parse_gravity_log(std::string_view text);

struct GravityMatch {
  Interpretation interpretation;
  double worst_deg = 0.0;   ///< largest angle of a rotated sample from the expected direction (rank key)
  double spread_deg = 0.0;  ///< largest angle of a rotated sample from the samples' mean direction
  double tilt_deg = 0.0;    ///< angle of the mean direction from the expected direction
};

struct GravityResult {
  std::vector<GravityMatch> ranked;  ///< every interpretation, best first
  std::vector<std::string> notes;
};

/// Ranks the interpretations of the logged poses under which world_R_body * accel points
/// steadily along `expected_world` (the world's up for an accelerometer at rest, which
/// measures the reaction to gravity: common practice). Error for fewer than two samples,
/// a zero accelerometer vector, or poses of mixed counts.
/// With a house convention, tied readings are ordered by agreement with it.
Expected<GravityResult> gravity_test(const std::vector<GravitySample>& samples,
                                     const Eigen::Vector3d& expected_world,
                                     const std::optional<HouseConvention>& house = std::nullopt);

/// "degrees" / "radians" and the like, as the JSON writes them.
std::string quaternion_layout_key(QuatLayout l);  ///< "wxyz" / "xyzw"
std::string algebra_key(QuatAlgebra a);           ///< "hamilton" / "jpl"
std::string direction_key(Direction d);           ///< "body_to_world" / "world_to_body"
std::string storage_key(MatrixStorage s);         ///< "rows" / "columns"

}  // namespace attiscope
