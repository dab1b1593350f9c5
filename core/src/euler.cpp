// euler.cpp: the 24 Euler conventions: to and from rotations, lock margin, Euler rates.
#include "attiscope/core/euler.hpp"

#include <Eigen/SVD>
#include <cctype>
#include <cmath>
#include <limits>

namespace attiscope {

char axis_letter(Axis a) {
  return "XYZ"[static_cast<int>(a)];
}

Eigen::Vector3d axis_vector(Axis a) {
  return Eigen::Vector3d::Unit(static_cast<int>(a));
}

Eigen::Matrix3d elementary_matrix(Axis a, double angle_rad) {
  return Eigen::AngleAxisd(angle_rad, axis_vector(a)).toRotationMatrix();
}

Rotation elementary_rotation(Axis a, double angle_rad) {
  Eigen::Quaterniond q;
  q.w() = std::cos(0.5 * angle_rad);
  q.vec() = axis_vector(a) * std::sin(0.5 * angle_rad);
  return Rotation(q);
}

std::string EulerConvention::sequence() const {
  return {axis_letter(axes[0]), axis_letter(axes[1]), axis_letter(axes[2])};
}

std::string EulerConvention::kind_name() const {
  return kind == EulerKind::Intrinsic ? "intrinsic" : "extrinsic";
}

std::string EulerConvention::name() const {
  return kind_name() + " " + sequence();
}

Expected<EulerConvention> parse_euler_sequence(std::string_view text, EulerKind kind) {
  EulerConvention c;
  c.kind = kind;
  int n = 0;
  for (std::size_t pos = 0; pos < text.size(); ++pos) {
    const char ch = static_cast<char>(std::toupper(static_cast<unsigned char>(text[pos])));
    int axis = -1;
    if (ch >= 'X' && ch <= 'Z') axis = ch - 'X';
    if (ch >= '1' && ch <= '3') axis = ch - '1';
    if (ch == '-' || ch == ' ' || ch == '_') continue;
    if (axis < 0) {
      return Error{"'" + std::string(text) + "' is not an Euler sequence: '" + std::string(1, text[pos]) +
                       "' is not an axis (use X, Y, Z or 1, 2, 3)",
                   1, static_cast<int>(pos) + 1};
    }
    if (n == 3)
      return Error{"'" + std::string(text) + "' names more than three axes", 1, static_cast<int>(pos) + 1};
    c.axes[static_cast<std::size_t>(n++)] = static_cast<Axis>(axis);
  }
  if (n != 3)
    return Error{"'" + std::string(text) +
                 "' is not an Euler sequence: it needs three axes such as ZYX or 321"};
  if (c.axes[0] == c.axes[1] || c.axes[1] == c.axes[2]) {
    return Error{"'" + std::string(text) +
                 "' is not a valid Euler sequence: two turns in a row about the same axis are one turn"};
  }
  return c;
}

const std::array<EulerConvention, 24>& all_euler_conventions() {
  // Built once from constants; immutable after construction.
  static const std::array<EulerConvention, 24> all = [] {
    const char* seqs[12] = {"XYZ", "XZY", "YXZ", "YZX", "ZXY", "ZYX",
                            "XYX", "XZX", "YXY", "YZY", "ZXZ", "ZYZ"};
    std::array<EulerConvention, 24> out{};
    for (int k = 0; k < 2; ++k) {
      for (int s = 0; s < 12; ++s) {
        out[static_cast<std::size_t>(12 * k + s)] =
            parse_euler_sequence(seqs[s], k == 0 ? EulerKind::Intrinsic : EulerKind::Extrinsic).value();
      }
    }
    return out;
  }();
  return all;
}

double wrap_pi(double angle_rad) {
  double r = std::remainder(angle_rad, 2.0 * M_PI);  // [-pi, pi]
  if (r <= -M_PI) r += 2.0 * M_PI;
  return r;
}

double lock_margin(const EulerConvention& c, double middle_rad) {
  if (c.proper()) return std::min(middle_rad, M_PI - middle_rad);
  return 0.5 * M_PI - std::abs(middle_rad);
}

namespace {

// Angle of a (near-)elementary rotation about axis a: 2 atan2(q_a, w).
double elementary_angle(const Eigen::Quaterniond& q, Axis a) {
  return wrap_pi(2.0 * std::atan2(q.vec()(static_cast<int>(a)), q.w()));
}

}  // namespace

EulerAngles to_euler(const Rotation& world_R_body, const EulerConvention& c) {
  // Bernardes & Viollet (2022) work on the extrinsic form R = R_k(t3) R_j(t2) R_i(t1).
  // Intrinsic (a, b, c) about (i, j, k) is extrinsic (c, b, a) about (k, j, i).
  const bool intrinsic = c.kind == EulerKind::Intrinsic;
  const std::array<Axis, 3> ext = intrinsic ? std::array<Axis, 3>{c.axes[2], c.axes[1], c.axes[0]} : c.axes;
  const Eigen::Quaterniond q = world_R_body.stored_quaternion();
  const double qv[3] = {q.x(), q.y(), q.z()};
  const int i = static_cast<int>(ext[0]);
  const int j = static_cast<int>(ext[1]);
  const bool proper = ext[0] == ext[2];
  const int k = proper ? 3 - i - j : static_cast<int>(ext[2]);
  const double sign = static_cast<double>((i - j) * (j - k) * (k - i) / 2);  // permutation parity

  double a, b, cc, d;
  if (proper) {
    a = q.w();
    b = qv[i];
    cc = qv[j];
    d = qv[k] * sign;
  } else {
    // Rotate the quaternion by 45 degrees about the j axis to turn the sequence proper.
    a = q.w() - qv[j];
    b = qv[i] + qv[k] * sign;
    cc = qv[j] + q.w();
    d = qv[k] * sign - qv[i];
  }
  const double hyp_ab = std::hypot(a, b);
  const double hyp_cd = std::hypot(cc, d);
  double t2 = 2.0 * std::atan2(hyp_cd, hyp_ab);  // [0, pi]
  const double half_sum = std::atan2(b, a);
  const double half_diff = std::atan2(d, cc);
  double t1 = half_sum - half_diff;
  double t3 = half_sum + half_diff;
  if (!proper) {
    t3 *= sign;
    // The paper's t2 - pi/2 cancels when the middle angle is small (a level pitch): about
    // 1e-16 absolute, but a 1e-9 rad pitch then keeps only 7 digits. The same angle without
    // the subtraction, from tan(x - pi/4) = (tan x - 1) / (tan x + 1) with tan x = |cd|/|ab|:
    // sin t2 = (|cd|^2 - |ab|^2) / 2, cos t2 = |ab| |cd| (for a unit quaternion), and
    // |cd|^2 - |ab|^2 = 4 (w q_j - sign q_i q_k) exactly, so small pitches keep full
    // relative precision and the lock side (|ab| or |cd| near 0) stays as accurate as before.
    t2 = std::atan2(2.0 * (q.w() * qv[j] - sign * qv[i] * qv[k]), hyp_ab * hyp_cd);
  }

  EulerAngles out;
  out.convention = c;
  Eigen::Vector3d angles = intrinsic ? Eigen::Vector3d(t3, t2, t1) : Eigen::Vector3d(t1, t2, t3);
  angles(0) = wrap_pi(angles(0));
  angles(2) = wrap_pi(angles(2));
  out.lock_margin_rad = lock_margin(c, angles(1));
  if (out.lock_margin_rad < kLockMarginRad) {
    // At lock only a1 +/- a3 is defined. Set the third angle to 0 and recover the first
    // exactly from the rotation that remains once the middle turn is taken out:
    // intrinsic R = R_i(a) R_j(b)  =>  R_i(a) = R R_j(b)^T;
    // extrinsic R = R_j(b) R_i(a)  =>  R_i(a) = R_j(b)^T R.
    const Eigen::Quaterniond mid = elementary_rotation(c.axes[1], angles(1)).stored_quaternion();
    const Eigen::Quaterniond first = intrinsic ? q * mid.conjugate() : mid.conjugate() * q;
    angles(0) = elementary_angle(first, c.axes[0]);
    angles(2) = 0.0;
    out.at_lock = true;
  }
  out.angles_rad = angles;
  return out;
}

Rotation from_euler(const EulerConvention& c, const Eigen::Vector3d& angles_rad) {
  const Rotation r1 = elementary_rotation(c.axes[0], angles_rad(0));
  const Rotation r2 = elementary_rotation(c.axes[1], angles_rad(1));
  const Rotation r3 = elementary_rotation(c.axes[2], angles_rad(2));
  return c.kind == EulerKind::Intrinsic ? r1 * r2 * r3 : r3 * r2 * r1;
}

Eigen::Matrix3d euler_rate_matrix(const EulerConvention& c, const Eigen::Vector3d& angles_rad) {
  const Eigen::Matrix3d r1 = elementary_matrix(c.axes[0], angles_rad(0));
  const Eigen::Matrix3d r2 = elementary_matrix(c.axes[1], angles_rad(1));
  const Eigen::Matrix3d r3 = elementary_matrix(c.axes[2], angles_rad(2));
  const Eigen::Vector3d e1 = axis_vector(c.axes[0]);
  const Eigen::Vector3d e2 = axis_vector(c.axes[1]);
  const Eigen::Vector3d e3 = axis_vector(c.axes[2]);
  Eigen::Matrix3d e;
  if (c.kind == EulerKind::Intrinsic) {
    // R = R1 R2 R3: omega_body = R3^T R2^T e1 da + R3^T e2 db + e3 dc.
    e.col(0) = r3.transpose() * r2.transpose() * e1;
    e.col(1) = r3.transpose() * e2;
    e.col(2) = e3;
  } else {
    // R = R3 R2 R1: omega_world = R3 R2 e1 da + R3 e2 db + e3 dc; omega_body = R^T omega_world.
    e.col(0) = e1;
    e.col(1) = r1.transpose() * e2;
    e.col(2) = r1.transpose() * r2.transpose() * e3;
  }
  return e;
}

double condition_number(const Eigen::Matrix3d& m) {
  const Eigen::Vector3d s = Eigen::JacobiSVD<Eigen::Matrix3d>(m).singularValues();
  if (s(2) <= 0.0) return std::numeric_limits<double>::infinity();
  return s(0) / s(2);
}

}  // namespace attiscope
