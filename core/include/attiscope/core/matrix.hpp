// matrix.hpp: rotation matrices: validity checks, nearest rotation, matrix -> quaternion,
// and the matrix *views* (direction and storage) of a rotation.
#pragma once

#include <Eigen/Core>
#include <array>
#include <string>

#include "attiscope/core/expected.hpp"
#include "attiscope/core/quaternion.hpp"
#include "attiscope/core/rotation.hpp"

namespace attiscope {

/// Order of nine matrix numbers in a flat list.
enum class MatrixStorage {
  Rows,     ///< m00 m01 m02 m10 ... (row-major)
  Columns,  ///< m00 m10 m20 m01 ... (column-major)
};

/// How nine numbers are to be read or written as a matrix.
struct MatrixConvention {
  Direction direction = Direction::BodyToWorld;
  MatrixStorage storage = MatrixStorage::Rows;
  std::string describe() const;
};

/// How far a 3x3 matrix is from a rotation.
struct MatrixCheck {
  double orthonormality_defect = 0.0;  ///< ||M^T M - I|| (Frobenius)
  double determinant = 1.0;
  bool finite = true;
  /// The largest angle in degrees between a column of M and the same column of its
  /// nearest rotation: how far an axis had to move to make M a rotation.
  double correction_deg = 0.0;
};

/// Defects up to this are exact rotations for every purpose (no warning).
inline constexpr double kMatrixDefectSilent = 1e-9;
/// Defects beyond this are not accepted as a rotation (an error, not a warning).
inline constexpr double kMatrixDefectMax = 0.05;

MatrixCheck check_matrix(const Eigen::Matrix3d& m);

/// The rotation nearest to m in the Frobenius norm: the orthogonal polar factor from the
/// SVD m = U S V^T, R = U diag(1, 1, det(U V^T)) V^T (Higham 1986; Markley 1988 for the
/// same projection in attitude determination). For det(m) < 0 this is the nearest
/// *rotation*, not the nearest orthogonal matrix.
Eigen::Matrix3d nearest_rotation(const Eigen::Matrix3d& m);

/// Quaternion of an exact rotation matrix by Shepperd's method (Shepperd 1978, "Quaternion
/// from Rotation Matrix", J. Guidance and Control 1(3)): pivot on the largest of tr R and
/// the diagonal, so it is stable for every rotation, 180 degrees included.
Eigen::Quaterniond quaternion_from_rotation_matrix(const Eigen::Matrix3d& r);

/// Reads a world_R_body (or body_R_world, per direction) matrix as a rotation. A reflection
/// (det < 0), non-finite numbers or a defect beyond kMatrixDefectMax are errors; a smaller
/// defect is accepted through nearest_rotation and reported in `check`.
Expected<Rotation> from_matrix(const Eigen::Matrix3d& m, Direction direction = Direction::BodyToWorld,
                               MatrixCheck* check = nullptr);

/// Nine numbers in storage order -> the matrix as written (no direction applied).
Eigen::Matrix3d matrix_from_numbers(const std::array<double, 9>& numbers, MatrixStorage storage);
/// The matrix of a rotation under a convention, as nine numbers in storage order.
std::array<double, 9> to_matrix_numbers(const Rotation& world_R_body, const MatrixConvention& c);

}  // namespace attiscope
