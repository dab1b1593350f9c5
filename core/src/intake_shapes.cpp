// intake_shapes.cpp: scored readings of a list of numbers (3: Euler or rotation vector; 4:
// quaternion either layout or axis-angle; 9: matrix either storage; 12 and 16: transforms),
// the body-axes sentence, and the intake's JSON and table output.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>

#include "attiscope/core/representations.hpp"
#include "intake_internal.hpp"

namespace attiscope::intake_detail {

namespace {

constexpr double kDeg = 180.0 / M_PI;
constexpr double kTwoPi = 2.0 * M_PI;
/// A quaternion norm within this of 1 is "unit" for scoring (printed logs round to ~6 digits).
constexpr double kNormUnitForScore = 1e-4;
/// Beyond this the four numbers are unlikely to be a quaternion at all.
constexpr double kNormFarFromUnit = 0.1;
/// An axis this close to unit length looks like an axis.
constexpr double kAxisUnitForScore = 1e-3;
/// A transform's bottom row (or last column) within this of (0, 0, 0, 1).
constexpr double kHomogeneousRowTolerance = 1e-6;
/// Angles within this of a multiple of 15 degrees count as "round".
constexpr double kRoundAngleTolerance = 1e-9;

double clamp01(double s) {
  return std::min(1.0, std::max(0.0, s));
}

Error placed(const Error& e, const NumberToken& at) {
  Error out = e;
  out.line = at.line;
  out.column = at.column;
  return out;
}

std::optional<Error> non_finite(const std::vector<NumberToken>& numbers) {
  for (const NumberToken& n : numbers) {
    if (std::isnan(n.value)) return Error{"this number is NaN (not a number)", n.line, n.column};
    if (std::isinf(n.value)) return Error{"this number is infinite", n.line, n.column};
  }
  return std::nullopt;
}

double to_rad(double v, AngleUnit u) {
  return u == AngleUnit::Degrees ? v / kDeg : v;
}

std::string unit_name(AngleUnit u) {
  return u == AngleUnit::Degrees ? "degrees" : "radians";
}

// Reads a matrix with its checks; warnings for a small defect.
Expected<Reading> matrix_reading(const Eigen::Matrix3d& m, const NumberToken& place) {
  MatrixCheck check;
  auto r = from_matrix(m, Direction::BodyToWorld, &check);
  if (!r) return placed(r.error(), place);
  Reading out;
  out.rotation = r.value();
  out.matrix_check = check;
  if (check.orthonormality_defect > kMatrixDefectSilent) {
    out.warnings.push_back("the matrix is not exactly orthonormal (defect ||M^T M - I|| = " +
                           fmt(check.orthonormality_defect, 3) +
                           "): the nearest rotation is used, a correction of up to " +
                           fmt(check.correction_deg, 3) + " degrees");
  }
  return out;
}

double matrix_quality(const MatrixCheck& c) {
  if (c.orthonormality_defect <= kMatrixDefectSilent) return 1.0;
  if (c.orthonormality_defect <= 1e-4) return 0.95;
  if (c.orthonormality_defect <= 1e-2) return 0.8;
  return 0.5;
}

// Rows and columns (or the two transform storages) read the same rotation only for a
// symmetric rotation matrix (identity or a half turn).
void add_matrix_pair(std::vector<Reading>* out, const Eigen::Matrix3d& as_rows, const NumberToken& place,
                     const Layout& layout, Hint hint, const IntakePreferences& prefs,
                     std::optional<Error>* first_error) {
  auto rows = matrix_reading(as_rows, place);
  if (!rows) {
    if (!*first_error) *first_error = rows.error();
    return;
  }
  Reading cols = rows.value();
  cols.rotation = rows.value().rotation.inverse();
  const double q = matrix_quality(*rows.value().matrix_check);
  const bool grid = (layout.lines == 3 || layout.groups == 3 || layout.row_breaks) && layout.per_group != 1;
  const double hint_factor = hint == Hint::Matrix || hint == Hint::None ? 1.0 : 0.6;
  Reading r = rows.value();
  r.kind = IntakeKind::Matrix;
  r.layout = "rows";
  r.as = ReadingKind::MatrixRows;
  cols.kind = IntakeKind::Matrix;
  cols.layout = "columns";
  cols.as = ReadingKind::MatrixCols;
  const std::string inverse_note =
      "row-major and column-major are each other's inverse (the transpose), so orthonormality cannot "
      "decide between them";
  if (grid) {
    r.score = 0.85 * q * hint_factor;
    cols.score = 0.55 * q * hint_factor;
    r.why = "nine numbers printed as three rows of three, read row by row as world_R_body; " + inverse_note;
    cols.why = "the same nine numbers read column by column (the printed rows are then the body axes); " +
               inverse_note;
  } else {
    r.score = 0.6 * q * hint_factor;
    cols.score = 0.6 * q * hint_factor;
    r.why = "nine numbers read row by row as world_R_body; " + inverse_note;
    cols.why = "nine numbers read column by column as world_R_body; " + inverse_note;
  }
  (prefs.matrix_storage == MatrixStorage::Rows ? r : cols).score += kHouseBonus;
  out->push_back(r);
  out->push_back(cols);
}

void add_transform_pair(std::vector<Reading>* out, const std::vector<NumberToken>& t, const Layout& layout,
                        const IntakePreferences& prefs, std::optional<Error>* first_error) {
  const std::size_t n = t.size();
  const bool full = n == 16;
  const char* dims_rows = full ? "4x4" : "3x4";
  const char* dims_cols = full ? "4x4" : "4x3";
  auto v = [&](std::size_t i) { return t[i].value; };
  std::vector<Reading> made;
  for (int storage = 0; storage < 2; ++storage) {
    Eigen::Matrix3d m;
    Eigen::Vector3d trans;
    double bottom_defect = 0.0;
    if (storage == 0) {  // row-major, translation in the last column
      for (int i = 0; i < 3; ++i) {
        for (int j = 0; j < 3; ++j) m(i, j) = v(static_cast<std::size_t>(4 * i + j));
        trans(i) = v(static_cast<std::size_t>(4 * i + 3));
      }
      if (full) {
        bottom_defect = std::abs(v(12)) + std::abs(v(13)) + std::abs(v(14)) + std::abs(v(15) - 1.0);
      }
    } else {  // column-major: each group of 3 (or 4) is a column; the translation comes last
      const std::size_t stride = full ? 4 : 3;
      for (int i = 0; i < 3; ++i) {
        for (int j = 0; j < 3; ++j)
          m(i, j) = v(stride * static_cast<std::size_t>(j) + static_cast<std::size_t>(i));
        trans(i) = v(stride * 3 + static_cast<std::size_t>(i));
      }
      if (full) bottom_defect = std::abs(v(3)) + std::abs(v(7)) + std::abs(v(11)) + std::abs(v(15) - 1.0);
    }
    auto r = matrix_reading(m, t.front());
    if (!r) {
      if (!*first_error) *first_error = r.error();
      continue;
    }
    Reading rd = r.value();
    rd.kind = IntakeKind::Transform;
    rd.translation = trans;
    rd.layout = std::string(storage == 0 ? dims_rows : dims_cols) + (storage == 0 ? " rows" : " columns");
    const double q = matrix_quality(*rd.matrix_check);
    double s = 0.8 * q;
    if (storage == 0) {
      rd.why = std::string(dims_rows) +
               " transform read row by row: the rotation is the upper-left 3x3, the translation the last "
               "column";
    } else {
      rd.why = std::string("transform stored column by column (printed as ") + dims_cols +
               "): the rotation is the first three columns, the translation the last row as printed";
    }
    if (full) {
      if (bottom_defect > kHomogeneousRowTolerance) {
        s *= 0.3;
        rd.warnings.push_back(std::string("the ") + (storage == 0 ? "bottom row" : "last column") +
                              " is not 0 0 0 1 (off by " + fmt(bottom_defect, 3) + ")");
      }
    } else if (layout.per_group == 4 && storage == 1) {
      s *= 0.6;  // printed as rows of four: row-major is what the text shows
    } else if (layout.per_group == 3 && storage == 0) {
      s *= 0.6;
    }
    if ((storage == 0) == (prefs.matrix_storage == MatrixStorage::Rows)) s += kHouseBonus;
    rd.score = s;
    made.push_back(rd);
  }
  if (made.size() == 2 && geodesic_angle(made[0].rotation, made[1].rotation) > 1e-9 &&
      made[0].translation->isApprox(*made[1].translation)) {
    for (Reading& r : made) {
      r.why += "; the two storages are each other's inverse here, so the numbers cannot decide";
    }
  }
  for (Reading& r : made) out->push_back(r);
}

}  // namespace

std::string fmt(double v, int digits) {
  if (v == 0.0) v = 0.0;
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", digits, v);
  return buf;
}

UnitGuess guess_angle_unit(const std::vector<NumberToken>& angles, AngleUnit house) {
  UnitGuess g;
  for (const NumberToken& a : angles) {
    if (a.unit) {
      g.unit = *a.unit;
      g.confidence = 1.0;
      g.written = true;
      g.why = "the unit is written (" + unit_name(g.unit) + ")";
      return g;
    }
  }
  bool beyond = false;
  bool round = true;
  bool all_zero = true;
  for (const NumberToken& a : angles) {
    if (std::abs(a.value) > kTwoPi) beyond = true;
    const double r = a.value / 15.0;
    if (std::abs(r - std::round(r)) > kRoundAngleTolerance) round = false;
    if (a.value != 0.0) all_zero = false;
  }
  if (beyond) {
    g.unit = AngleUnit::Degrees;
    g.confidence = 0.95;
    g.why = "a magnitude beyond 2 pi can only be degrees";
  } else if (round && !all_zero) {
    g.unit = AngleUnit::Degrees;
    g.confidence = 0.8;
    g.why = "the values are round multiples of 15, as degrees usually are";
  } else if (all_zero) {
    g.unit = house;
    g.confidence = 0.5;
    g.why = "all angles are zero: the unit does not matter";
  } else if (std::all_of(angles.begin(), angles.end(),
                         [](const NumberToken& a) { return a.value == std::floor(a.value); })) {
    g.unit = AngleUnit::Degrees;
    g.confidence = 0.55;
    g.why = "whole numbers within 2 pi: more usual for degrees, but radians are possible";
  } else {
    g.unit = AngleUnit::Radians;
    g.confidence = 0.6;
    g.why = "every magnitude is within 2 pi and not a round number of degrees, as radians usually are";
  }
  return g;
}

Expected<Reading> quaternion_reading(const std::array<double, 4>& wxyz, const NumberToken& place) {
  QuatCheck check;
  auto r = from_quaternion_numbers(wxyz, QuatConvention{}, &check);
  if (!r) return placed(r.error(), place);
  Reading out;
  out.kind = IntakeKind::Quaternion;
  out.rotation = r.value();
  out.quaternion_norm = check.norm;
  if (std::abs(check.norm - 1.0) > kUnitNormTolerance) {
    out.warnings.push_back("the quaternion's norm is " + fmt(check.norm, 9) +
                           ", not 1: it was normalised, a change of " + fmt(std::abs(check.norm - 1.0), 3) +
                           " in length that does not change the rotation");
  }
  return out;
}

Reading euler_reading(const EulerConvention& convention, const Eigen::Vector3d& angles, AngleUnit unit) {
  Reading out;
  out.kind = IntakeKind::Euler;
  out.euler = convention;
  out.unit = unit;
  out.as = ReadingKind::Euler;
  out.layout = convention.name() + ", " + unit_name(unit);
  out.rotation = from_euler(
      convention, Eigen::Vector3d(to_rad(angles(0), unit), to_rad(angles(1), unit), to_rad(angles(2), unit)));
  return out;
}

std::vector<Reading> shape_readings(const std::vector<NumberToken>& t, Hint hint, const Layout& layout,
                                    const IntakePreferences& prefs, std::optional<Error>* first_error) {
  std::vector<Reading> out;
  if (auto bad = non_finite(t)) {
    if (!*first_error) *first_error = bad;
    return out;
  }
  const std::size_t n = t.size();
  if (n == 4) {
    const std::array<double, 4> v{t[0].value, t[1].value, t[2].value, t[3].value};
    const double norm = std::sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2] + v[3] * v[3]);
    const double dn = std::abs(norm - 1.0);
    const double unit_q = dn < kNormUnitForScore ? 1.0 : dn < 1e-2 ? 0.9 : dn < kNormFarFromUnit ? 0.6 : 0.15;
    const double hint_q = hint == Hint::Quaternion ? 1.0 : hint == Hint::None ? 0.85 : 0.3;
    const bool angle_written = t[3].unit.has_value();
    // Scalar first and scalar last.
    for (int layout_i = 0; layout_i < 2; ++layout_i) {
      const bool first = layout_i == 0;
      const std::array<double, 4> wxyz = first ? v : std::array<double, 4>{v[3], v[0], v[1], v[2]};
      auto r = quaternion_reading(wxyz, t.front());
      if (!r) {
        if (!*first_error) *first_error = r.error();
        break;
      }
      Reading q = r.value();
      q.layout = first ? "wxyz" : "xyzw";
      q.as = first ? ReadingKind::QuatWxyz : ReadingKind::QuatXyzw;
      const double lead = std::abs(first ? v[0] : v[3]);
      const double other = std::abs(first ? v[3] : v[0]);
      double s = 0.5;
      std::string slot;
      if (lead > other + 0.2) {
        s = 0.54;
        slot = std::string("the ") + (first ? "first" : "last") +
               " number, read as the scalar, is the larger end (a modest turn has a large scalar)";
      } else if (other > lead + 0.2) {
        s = 0.46;
        slot = std::string("the ") + (first ? "last" : "first") +
               " number is the larger end, which suggests it is the scalar";
      } else {
        slot = "the numbers do not show which end holds the scalar";
      }
      if ((prefs.quat_layout == QuatLayout::ScalarFirst) == first) s += kHouseBonus;
      if (angle_written) s *= 0.3;
      q.score = s * unit_q * hint_q;
      q.why = std::string("four numbers of norm ") + fmt(norm, 7) + " read as a quaternion, scalar " +
              (first ? "first" : "last") + "; " + slot;
      out.push_back(q);
    }
    // Axis and angle.
    const Eigen::Vector3d axis(v[0], v[1], v[2]);
    const double an = axis.norm();
    if (an > kMinQuaternionNorm) {
      const UnitGuess u = guess_angle_unit({t[3]}, prefs.unit);
      auto r = from_axis_angle(axis, to_rad(v[3], u.unit));
      if (r) {
        Reading a;
        a.kind = IntakeKind::AxisAngle;
        a.as = ReadingKind::AxisAngle;
        a.rotation = r.value();
        a.unit = u.unit;
        a.layout = "x y z angle, " + unit_name(u.unit);
        const bool axis_unit = std::abs(an - 1.0) < kAxisUnitForScore;
        double s = axis_unit ? 0.5 : 0.1;
        if (axis_unit && dn > 1e-2) s = 0.85;  // a unit axis and a non-unit quaternion: axis-angle
        if (angle_written) s = axis_unit ? 0.95 : 0.5;
        const double hint_a = hint == Hint::AxisAngle ? 1.7 : hint == Hint::None ? 1.0 : 0.5;
        a.score = s * hint_a;
        a.why = std::string("the first three numbers ") + (axis_unit ? "form a unit axis" : "form an axis") +
                " and the last is the angle in " + unit_name(u.unit) + " (" + u.why + ")";
        if (!axis_unit) {
          a.warnings.push_back("the axis has length " + fmt(an, 7) + ", not 1: it was normalised");
        }
        if (!u.written)
          a.warnings.push_back("no unit is written: the angle was read in " + unit_name(u.unit));
        out.push_back(a);
      }
    }
  } else if (n == 3) {
    const UnitGuess u = guess_angle_unit(t, prefs.unit);
    const Eigen::Vector3d v(t[0].value, t[1].value, t[2].value);
    const double hint_e = hint == Hint::Euler || hint == Hint::EulerRpy || hint == Hint::EulerYpr ? 1.5
                          : hint == Hint::None                                                    ? 1.0
                                                                                                  : 0.4;
    const double hint_v = hint == Hint::RotationVector ? 1.8 : hint == Hint::None ? 1.0 : 0.4;
    EulerConvention conv = prefs.euler;
    Eigen::Vector3d angles = v;
    std::string order_note;
    if (hint == Hint::EulerRpy || hint == Hint::EulerYpr) {
      // roll about x, pitch about y, yaw about z (common practice): yaw, pitch, roll
      // applied in the aerospace sequence ZYX intrinsic.
      conv = EulerConvention{{Axis::Z, Axis::Y, Axis::X}, EulerKind::Intrinsic};
      angles = hint == Hint::EulerRpy ? Eigen::Vector3d(v(2), v(1), v(0)) : v;
      order_note = hint == Hint::EulerRpy ? " (written roll, pitch, yaw)" : " (written yaw, pitch, roll)";
    }
    for (AngleUnit unit : {AngleUnit::Degrees, AngleUnit::Radians}) {
      Reading e = euler_reading(conv, angles, unit);
      const bool guessed = unit == u.unit;
      double s = guessed ? u.confidence : 1.0 - u.confidence;
      // Radians written: a rotation vector is as likely as Euler angles.
      if (u.written && unit == AngleUnit::Radians) s = 0.65;
      if (u.written && !guessed) continue;
      if (unit == prefs.unit && !u.written) s += kHouseBonus;
      e.score = 0.85 * s * hint_e;
      e.why = "three angles in " + unit_name(unit) + ", read in " +
              (conv == prefs.euler ? std::string("the house convention ") : std::string("")) + conv.name() +
              order_note + "; " + (guessed ? u.why : "the other unit");
      if (!u.written) e.warnings.push_back("no unit is written: " + unit_name(unit) + " is a guess");
      out.push_back(e);
    }
    // Rotation vector (radians unless a unit is written).
    const AngleUnit vu = u.written ? u.unit : AngleUnit::Radians;
    const Eigen::Vector3d rv(to_rad(v(0), vu), to_rad(v(1), vu), to_rad(v(2), vu));
    auto r = from_rotation_vector(rv);
    if (r) {
      Reading rvr;
      rvr.kind = IntakeKind::RotationVector;
      rvr.as = ReadingKind::RotVec;
      rvr.unit = vu;
      rvr.layout = unit_name(vu);
      rvr.rotation = r.value();
      const double len = rv.norm();
      double s = len <= M_PI + 1e-12 ? (u.written ? 0.6 : 0.45) : 0.1;
      if (u.unit == AngleUnit::Degrees && !u.written) s *= 0.4;
      rvr.score = 0.85 * s * hint_v;
      rvr.why = "three numbers read as a rotation vector (axis times angle) of length " + fmt(len * kDeg, 6) +
                " degrees";
      if (len > M_PI + 1e-12)
        rvr.warnings.push_back("the vector is longer than pi: an unusual rotation vector");
      out.push_back(rvr);
    }
  } else if (n == 9) {
    Eigen::Matrix3d m;
    for (int i = 0; i < 3; ++i) {
      for (int j = 0; j < 3; ++j) m(i, j) = t[static_cast<std::size_t>(3 * i + j)].value;
    }
    add_matrix_pair(&out, m, t.front(), layout, hint, prefs, first_error);
  } else if (n == 12 || n == 16) {
    add_transform_pair(&out, t, layout, prefs, first_error);
  }
  return out;
}

void finish_readings(std::vector<Reading>* readings, const IntakePreferences& prefs, bool* ambiguous) {
  for (Reading& r : *readings) {
    r.score = clamp01(r.score);
    r.body_axes = describe_body_axes(r.rotation, prefs.world_up);
  }
  std::stable_sort(readings->begin(), readings->end(),
                   [](const Reading& a, const Reading& b) { return a.score > b.score; });
  *ambiguous = false;
  if (readings->size() >= 2) {
    const Reading& a = (*readings)[0];
    for (std::size_t i = 1; i < readings->size(); ++i) {
      const Reading& b = (*readings)[i];
      if (a.score - b.score >= kAmbiguityGap) break;
      const bool same_rotation =
          geodesic_angle(a.rotation, b.rotation) < 1e-9 &&
          (!a.translation || !b.translation || a.translation->isApprox(*b.translation));
      if (!same_rotation) {
        *ambiguous = true;
        break;
      }
    }
  }
}

}  // namespace attiscope::intake_detail

namespace attiscope {

using intake_detail::fmt;

std::string intake_kind_name(IntakeKind k) {
  switch (k) {
    case IntakeKind::Quaternion: return "quaternion";
    case IntakeKind::AxisAngle: return "axis-angle";
    case IntakeKind::Euler: return "euler";
    case IntakeKind::RotationVector: return "rotation-vector";
    case IntakeKind::Matrix: return "matrix";
    case IntakeKind::Transform: return "transform";
  }
  return "?";
}

namespace {

/// An axis direction within this angle of a world axis is "along" it.
constexpr double kAlongDeg = 0.5;

std::string degrees_words(double deg) {
  char buf[32];
  if (deg < 9.95) {
    std::snprintf(buf, sizeof buf, "%.1f", deg);
  } else {
    std::snprintf(buf, sizeof buf, "%.0f", deg);
  }
  return std::string(buf) + " degrees";
}

std::string signed_axis(int k, double sign) {
  return std::string(sign >= 0 ? "+" : "-") + static_cast<char>('x' + k);
}

}  // namespace

std::string describe_body_axes(const Rotation& world_R_body, const Eigen::Vector3d& world_up) {
  const Eigen::Matrix3d m = world_R_body.matrix();
  int up_axis = 0;
  world_up.cwiseAbs().maxCoeff(&up_axis);
  std::string out;
  for (int i = 0; i < 3; ++i) {
    const Eigen::Vector3d v = m.col(i);
    int k = 0;
    v.cwiseAbs().maxCoeff(&k);
    const double off = std::acos(std::min(1.0, std::abs(v(k)))) * 180.0 / M_PI;
    std::string s = std::string("body ") + static_cast<char>('x' + i) + " points ";
    if (off < kAlongDeg) {
      s += "along world " + signed_axis(k, v(k));
    } else if (k == up_axis) {
      // Tilted from the vertical: say toward which horizontal axis.
      int t = -1;
      for (int j = 0; j < 3; ++j) {
        if (j != k && (t < 0 || std::abs(v(j)) > std::abs(v(t)))) t = j;
      }
      s += "near world " + signed_axis(k, v(k)) + ", tilted " + degrees_words(off) + " toward " +
           signed_axis(t, v(t));
    } else {
      const double up = v.dot(world_up.normalized());
      const double elevation = std::asin(std::max(-1.0, std::min(1.0, up))) * 180.0 / M_PI;
      int side = 3 - k - up_axis;
      const double horizontal = std::atan2(std::abs(v(side)), std::abs(v(k))) * 180.0 / M_PI;
      s += "near world " + signed_axis(k, v(k));
      if (std::abs(elevation) >= kAlongDeg) {
        s += ", " + degrees_words(std::abs(elevation)) + (elevation > 0 ? " up" : " down");
      }
      if (horizontal >= kAlongDeg)
        s += ", " + degrees_words(horizontal) + " toward " + signed_axis(side, v(side));
    }
    if (!out.empty()) out += "; ";
    out += s;
  }
  return out;
}

namespace {

// The text with every byte that is not part of a well-formed UTF-8 sequence replaced by
// '?': notes quote the pasted text, and JSON strings must be valid UTF-8.
std::string utf8(const std::string& s) {
  std::string out;
  out.reserve(s.size());
  std::size_t i = 0;
  while (i < s.size()) {
    const auto c = static_cast<unsigned char>(s[i]);
    // Well-formed sequences (Unicode 15, table 3-7): no overlongs, surrogates or > U+10FFFF.
    std::size_t n = 0;
    unsigned char lo = 0x80, hi = 0xBF;  // range of the second byte
    if (c < 0x80) {
      n = 1;
    } else if (c >= 0xC2 && c <= 0xDF) {
      n = 2;
    } else if (c >= 0xE0 && c <= 0xEF) {
      n = 3;
      if (c == 0xE0) lo = 0xA0;
      if (c == 0xED) hi = 0x9F;
    } else if (c >= 0xF0 && c <= 0xF4) {
      n = 4;
      if (c == 0xF0) lo = 0x90;
      if (c == 0xF4) hi = 0x8F;
    }
    bool ok = n > 0 && i + n <= s.size();
    if (ok && n > 1) {
      const auto b = static_cast<unsigned char>(s[i + 1]);
      ok = b >= lo && b <= hi;
    }
    for (std::size_t k = 2; ok && k < n; ++k) ok = (static_cast<unsigned char>(s[i + k]) & 0xC0) == 0x80;
    if (ok) {
      out.append(s, i, n);
      i += n;
    } else {
      out += '?';
      ++i;
    }
  }
  return out;
}

std::vector<std::string> utf8(const std::vector<std::string>& v) {
  std::vector<std::string> out;
  for (const std::string& s : v) out.push_back(utf8(s));
  return out;
}

}  // namespace

nlohmann::json intake_json(const IntakeResult& result) {
  nlohmann::json readings = nlohmann::json::array();
  for (const Reading& r : result.readings) {
    const Eigen::Quaterniond q = r.rotation.quaternion();
    nlohmann::json j = {{"kind", intake_kind_name(r.kind)},
                        {"layout", r.layout},
                        {"score", r.score},
                        {"why", utf8(r.why)},
                        {"quaternion", {{"w", q.w()}, {"x", q.x()}, {"y", q.y()}, {"z", q.z()}}},
                        {"warnings", utf8(r.warnings)},
                        {"body_axes", r.body_axes}};
    j["as"] = r.as ? nlohmann::json(reading_kind_name(*r.as)) : nlohmann::json();
    if (r.translation) j["translation"] = {r.translation->x(), r.translation->y(), r.translation->z()};
    if (r.quaternion_norm) j["quaternion_norm"] = *r.quaternion_norm;
    if (r.matrix_check) {
      j["orthonormality_defect"] = r.matrix_check->orthonormality_defect;
      j["determinant"] = r.matrix_check->determinant;
      j["correction_deg"] = r.matrix_check->correction_deg;
    }
    if (r.kind == IntakeKind::Euler) {
      j["euler"] = {{"sequence", r.euler.sequence()}, {"kind", r.euler.kind_name()}};
    }
    readings.push_back(j);
  }
  nlohmann::json out = {{"readings", readings},
                        {"ambiguous", result.ambiguous},
                        {"shape", utf8(result.shape)},
                        {"notes", utf8(result.notes)}};
  if (result.track) {
    nlohmann::json cols = nlohmann::json::array();
    for (const TrackColumn& c : result.track->columns)
      cols.push_back({{"name", utf8(c.name)}, {"role", c.role}});
    out["track"] = {{"rows", result.track_rows},
                    {"reading", track_form_name(result.track->form)},
                    {"time_unit", result.track->time_column >= 0 ? result.track->time_unit : ""},
                    {"columns", cols},
                    {"notes", utf8(result.track->notes)}};
  } else {
    out["track"] = nullptr;
  }
  return out;
}

std::string intake_table(const IntakeResult& result, int precision) {
  std::ostringstream s;
  s << "shape: " << result.shape << "\n";
  if (result.track) {
    s << "track: " << result.track_rows << " rows read as " << track_form_name(result.track->form) << "\n";
    for (const TrackColumn& c : result.track->columns) s << "  column " << c.name << ": " << c.role << "\n";
    for (const std::string& n : result.track->notes) s << "  " << n << "\n";
    s << "readings of the first row:\n";
  }
  for (const std::string& n : result.notes) s << "note: " << n << "\n";
  if (result.ambiguous) {
    s << "AMBIGUOUS: the text does not decide between the first readings; say which with --as\n";
  }
  int index = 1;
  for (const Reading& r : result.readings) {
    const Eigen::Quaterniond q = r.rotation.quaternion();
    s << "\n"
      << index++ << ". " << intake_kind_name(r.kind) << (r.layout.empty() ? "" : " (" + r.layout + ")")
      << "  score " << fmt(r.score, 3);
    if (r.as) s << "  [--as " << reading_kind_name(*r.as) << "]";
    s << "\n   why: " << r.why << "\n   quaternion w x y z: " << fmt(q.w(), precision) << " "
      << fmt(q.x(), precision) << " " << fmt(q.y(), precision) << " " << fmt(q.z(), precision) << "\n";
    if (r.translation) {
      s << "   translation: " << fmt(r.translation->x(), precision) << " "
        << fmt(r.translation->y(), precision) << " " << fmt(r.translation->z(), precision) << "\n";
    }
    s << "   " << r.body_axes << "\n";
    for (const std::string& w : r.warnings) s << "   warning: " << w << "\n";
  }
  return s.str();
}

}  // namespace attiscope
