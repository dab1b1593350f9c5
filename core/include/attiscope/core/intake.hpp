// intake.hpp: the paste reader. Takes whatever a person copied from a terminal, a log, a
// debugger, a notebook or a spreadsheet and lists every plausible reading of it as a
// rotation, best first, each with a score, a one-sentence reason and its warnings. It never
// picks silently: when the text does not decide, the readings say so (`ambiguous`).
//
// Every reading's rotation is world_R_body (v_world = R v_body), the canonical Hamilton
// quaternion of rotation.hpp.
//
// Forms understood: bare numbers (spaces, commas, semicolons, tabs, brackets, across
// lines); labelled fields in any order (w x y z, qw.., q0..q3, q1..q4, roll pitch yaw,
// heading pitch bank, phi theta psi, rx ry rz, axis + angle, prefixed names such as
// orientation.w or q_w); indented key-value blocks; brace objects; JSON; matrix literals
// with ';' row breaks; nested-brace initializer lists; constructor-like text
// `name(1, 2, 3, 4)`; i/j/k quaternion notation; 3x4 and 4x4 transforms (the translation is
// kept); a leading time stamp and trailing fields. Several lines holding one pose each are a
// track (columns.hpp finds its columns).
#pragma once

#include <Eigen/Core>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "attiscope/core/columns.hpp"
#include "attiscope/core/euler.hpp"
#include "attiscope/core/expected.hpp"
#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"
#include "attiscope/core/rotation.hpp"
#include "attiscope/core/text.hpp"

namespace attiscope {

/// The house choices that break ties between readings the text cannot decide. Plain
/// defaults; a house convention file fills them.
struct IntakePreferences {
  EulerConvention euler;                             ///< for unlabelled angle triples
  AngleUnit unit = AngleUnit::Degrees;               ///< for angles with no unit word
  QuatLayout quat_layout = QuatLayout::ScalarFirst;  ///< for four unlabelled numbers
  MatrixStorage matrix_storage = MatrixStorage::Rows;
  /// The world's up direction, for "5 degrees up" in the body-axes sentence (+z for ENU;
  /// a NED house sets -z).
  Eigen::Vector3d world_up = Eigen::Vector3d::UnitZ();

  bool operator==(const IntakePreferences& o) const {
    return euler == o.euler && unit == o.unit && quat_layout == o.quat_layout &&
           matrix_storage == o.matrix_storage && world_up == o.world_up;
  }
};

enum class IntakeKind {
  Quaternion,
  AxisAngle,
  Euler,
  RotationVector,
  Matrix,     ///< 3x3
  Transform,  ///< 3x4 or 4x4; the rotation part is the reading, the translation is kept
};

/// "quaternion", "axis-angle", "euler", "rotation-vector", "matrix", "transform".
std::string intake_kind_name(IntakeKind k);

/// One way of reading the text.
struct Reading {
  IntakeKind kind = IntakeKind::Quaternion;
  /// Where the kind has a layout: "wxyz", "xyzw", "rows", "columns", "3x4 rows",
  /// "4x4 columns", "intrinsic ZYX, degrees", "x y z angle, degrees", "radians".
  std::string layout;
  /// The explicit reading (`--as`) that reproduces this one, when there is one.
  std::optional<ReadingKind> as;
  double score = 0.0;  ///< in [0, 1]; near 1 when labels decide
  std::string why;     ///< one sentence
  std::vector<std::string> warnings;
  Rotation rotation;                           ///< world_R_body
  std::optional<Eigen::Vector3d> translation;  ///< transforms and labelled positions
  std::string body_axes;                       ///< "body x points along world +y, 5 degrees up; ..."

  // What the checks found, for display.
  std::optional<double> quaternion_norm;
  std::optional<MatrixCheck> matrix_check;
  EulerConvention euler;                ///< Euler readings
  AngleUnit unit = AngleUnit::Degrees;  ///< Euler and axis-angle readings
};

/// Everything the intake says about a text.
struct IntakeResult {
  std::vector<Reading> readings;  ///< best first; never empty on success
  /// The top two readings are too close for the text to decide (or labels were missing):
  /// the house preference or the order picked the first. Say so to the person.
  bool ambiguous = false;
  std::string shape;               ///< "4 numbers", "labelled fields qw qx qy qz", "track of 120 lines"...
  std::vector<std::string> notes;  ///< what was ignored (a time stamp, an id, a file name)
  /// Set when the text is several lines holding one pose each; readings then hold the
  /// readings of the first pose.
  std::optional<ColumnMapping> track;
  std::size_t track_rows = 0;
};

/// Reads a pasted text. Errors (with the line and column of the text they are about): no
/// numbers, a count of numbers no reading takes, NaN or Inf, a zero quaternion, a reflection
/// ("this is a reflection, not a rotation: an odd number of axes was flipped"), a matrix far
/// from orthonormal. An error is returned only when no reading is valid.
Expected<IntakeResult> read_pasted(std::string_view text, const IntakePreferences& preferences = {});

/// Where the body axes point, in words: "body x points along world +y, 5 degrees up; body y
/// ...". `world_up` is the world's up direction (unit, along a world axis).
std::string describe_body_axes(const Rotation& world_R_body,
                               const Eigen::Vector3d& world_up = Eigen::Vector3d::UnitZ());

/// The `read --json` object: {"readings": [...]} best first, each with kind, layout,
/// score, why, quaternion {w,x,y,z}, warnings, body_axes, and translation when kept; plus
/// "ambiguous", "shape", "notes" and "track" (when the text is a track).
nlohmann::json intake_json(const IntakeResult& result);

/// The same as readable text.
std::string intake_table(const IntakeResult& result, int precision = 6);

}  // namespace attiscope
