// wahba.cpp: Wahba's problem by SVD and by the q-method, TRIAD, and observability.
#include "attiscope/core/wahba.hpp"

#include <Eigen/Eigenvalues>
#include <Eigen/SVD>
#include <algorithm>
#include <cmath>
#include <cstdio>

#include "attiscope/core/matrix.hpp"
#include "attiscope/core/text.hpp"

namespace attiscope {

namespace {

constexpr double kDeg = 180.0 / M_PI;
/// A vector shorter than this has no direction.
constexpr double kMinVectorNorm = 1e-12;
/// Lines closer than this are said to be one line.
constexpr double kParallelRad = 1e-9;
/// Up to this many pairs the separation is computed over all pairs.
constexpr std::size_t kExactSeparationCount = 256;

std::string fmt(double v, int precision = 3) {
  if (v == 0.0) v = 0.0;
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", precision, v);
  return buf;
}

std::string vec_text(const Eigen::Vector3d& v) {
  return "(" + fmt(v.x()) + ", " + fmt(v.y()) + ", " + fmt(v.z()) + ")";
}

// The angle between the lines of two unit vectors, in [0, pi/2].
double line_angle(const Eigen::Vector3d& a, const Eigen::Vector3d& b) {
  const double s = a.cross(b).norm();
  const double c = std::abs(a.dot(b));
  return std::atan2(s, c);
}

// The largest angle between the lines of two of the unit vectors. Exact (all pairs) up to
// kExactSeparationCount vectors; beyond, two sweeps (the vector furthest from the first,
// then the one furthest from that), which is at least half the exact value and exact
// whenever the vectors lie in one plane through the line: O(n) for long files.
double largest_line_angle(const std::vector<Eigen::Vector3d>& dirs) {
  double best = 0.0;
  if (dirs.size() <= kExactSeparationCount) {
    for (std::size_t i = 0; i < dirs.size(); ++i) {
      for (std::size_t j = i + 1; j < dirs.size(); ++j) best = std::max(best, line_angle(dirs[i], dirs[j]));
    }
    return best;
  }
  std::size_t from = 0;
  for (int sweep = 0; sweep < 2; ++sweep) {
    std::size_t furthest = from;
    double far_angle = 0.0;
    for (std::size_t i = 0; i < dirs.size(); ++i) {
      const double a = line_angle(dirs[from], dirs[i]);
      if (a > far_angle) {
        far_angle = a;
        furthest = i;
      }
    }
    best = std::max(best, far_angle);
    from = furthest;
  }
  return best;
}

// Names a line in vehicle words when it is close to a vehicle axis.
std::string vehicle_line_words(const Eigen::Vector3d& axis, const VehicleAxes& names) {
  int i = 0;
  axis.cwiseAbs().maxCoeff(&i);
  if (std::acos(std::min(1.0, std::abs(axis(i)))) <= kNamedAxisWindowRad) {
    return "the vehicle's " + names.turn_name(i) + " axis (" + names.axis_label(i) + ")";
  }
  return "the vehicle direction " + vec_text(axis);
}

}  // namespace

Expected<std::vector<VectorPair>> parse_vector_pairs(std::string_view text) {
  std::vector<VectorPair> out;
  std::size_t start = 0;
  int line_no = 0;
  while (start <= text.size()) {
    const std::size_t end = std::min(text.find('\n', start), text.size());
    ++line_no;
    std::string_view line = text.substr(start, end - start);
    const std::size_t hash = line.find('#');
    if (hash != std::string_view::npos) line = line.substr(0, hash);
    start = end + 1;
    auto numbers = scan_numbers(line);
    if (!numbers) {
      Error e = numbers.error();
      e.line = line_no;
      return e;
    }
    const std::vector<NumberToken>& t = numbers.value();
    if (t.empty()) {
      if (end == text.size()) break;
      continue;
    }
    if (t.size() != 6 && t.size() != 7) {
      const int column = t.size() > 7 ? t[7].column : static_cast<int>(line.size()) + 1;
      return Error{
          "a vector pair is `sx sy sz vx vy vz [w]` (6 or 7 numbers), got " + std::to_string(t.size()),
          line_no, column};
    }
    for (const NumberToken& n : t) {
      if (!std::isfinite(n.value)) return Error{"this number is not finite", line_no, n.column};
    }
    VectorPair p;
    p.sensor = Eigen::Vector3d(t[0].value, t[1].value, t[2].value);
    p.vehicle = Eigen::Vector3d(t[3].value, t[4].value, t[5].value);
    p.line = line_no;
    if (p.sensor.norm() < kMinVectorNorm) {
      return Error{"the sensor vector is zero: it has no direction", line_no, t[0].column};
    }
    if (p.vehicle.norm() < kMinVectorNorm) {
      return Error{"the vehicle vector is zero: it has no direction", line_no, t[3].column};
    }
    if (t.size() == 7) {
      p.weight = t[6].value;
      if (p.weight < 0) return Error{"a weight must be zero or positive", line_no, t[6].column};
    }
    out.push_back(p);
    if (end == text.size()) break;
  }
  if (out.empty()) return Error{"no vector pairs: each line is `sx sy sz vx vy vz [w]`", line_no, 1};
  return out;
}

Rotation wahba_svd(const std::vector<VectorPair>& pairs) {
  Eigen::Matrix3d b = Eigen::Matrix3d::Zero();
  for (const VectorPair& p : pairs)
    b += p.weight * p.vehicle.normalized() * p.sensor.normalized().transpose();
  Eigen::JacobiSVD<Eigen::Matrix3d> svd(b, Eigen::ComputeFullU | Eigen::ComputeFullV);
  const Eigen::Matrix3d u = svd.matrixU();
  const Eigen::Matrix3d v = svd.matrixV();
  // Markley 1988: the middle factor diag(1, 1, det U det V) keeps the answer a rotation
  // when B's best orthogonal fit would be a reflection.
  const Eigen::Vector3d d(1.0, 1.0, u.determinant() * v.determinant());
  const Eigen::Matrix3d vehicle_R_sensor = u * d.asDiagonal() * v.transpose();
  return Rotation(Eigen::Quaterniond(quaternion_from_rotation_matrix(vehicle_R_sensor)));
}

Rotation wahba_davenport(const std::vector<VectorPair>& pairs, double* lambda_max) {
  Eigen::Matrix3d b = Eigen::Matrix3d::Zero();
  Eigen::Vector3d z = Eigen::Vector3d::Zero();
  for (const VectorPair& p : pairs) {
    const Eigen::Vector3d s = p.sensor.normalized();
    const Eigen::Vector3d v = p.vehicle.normalized();
    b += p.weight * s * v.transpose();
    z += p.weight * s.cross(v);
  }
  const double sigma = b.trace();
  Eigen::Matrix4d k;
  k.topLeftCorner<3, 3>() = b + b.transpose() - sigma * Eigen::Matrix3d::Identity();
  k.topRightCorner<3, 1>() = z;
  k.bottomLeftCorner<1, 3>() = z.transpose();
  k(3, 3) = sigma;
  Eigen::SelfAdjointEigenSolver<Eigen::Matrix4d> eig(k);
  if (lambda_max) *lambda_max = eig.eigenvalues()(3);
  Eigen::Quaterniond q;
  q.coeffs() = eig.eigenvectors().col(3);  // (x, y, z, w), Eigen's slot order
  return Rotation(q);
}

Expected<Rotation> triad(const VectorPair& first, const VectorPair& second) {
  auto frame = [](const Eigen::Vector3d& a, const Eigen::Vector3d& b) -> std::optional<Eigen::Matrix3d> {
    const Eigen::Vector3d t1 = a.normalized();
    const Eigen::Vector3d c = t1.cross(b.normalized());
    if (c.norm() < std::sin(kMinVectorSeparationRad)) return std::nullopt;
    const Eigen::Vector3d t2 = c.normalized();
    Eigen::Matrix3d m;
    m.col(0) = t1;
    m.col(1) = t2;
    m.col(2) = t1.cross(t2);
    return m;
  };
  const auto sensor_triad = frame(first.sensor, second.sensor);
  const auto vehicle_triad = frame(first.vehicle, second.vehicle);
  if (!sensor_triad || !vehicle_triad) {
    return Error{"TRIAD needs two pairs whose vectors are not parallel"};
  }
  // vehicle_R_sensor maps the sensor triad onto the vehicle triad.
  const Eigen::Matrix3d vehicle_R_sensor = *vehicle_triad * sensor_triad->transpose();
  return Rotation(Eigen::Quaterniond(quaternion_from_rotation_matrix(vehicle_R_sensor)));
}

Observability vector_observability(const std::vector<VectorPair>& pairs, const VehicleAxes& names) {
  Observability o;
  std::vector<const VectorPair*> used;
  for (const VectorPair& p : pairs) {
    if (p.weight > 0) used.push_back(&p);
  }
  // The largest angle between the lines of any two sensor vectors (and the same for the
  // vehicle vectors: the smaller of the two decides).
  std::vector<Eigen::Vector3d> sensor_dirs, vehicle_dirs;
  for (const VectorPair* p : used) {
    sensor_dirs.push_back(p->sensor.normalized());
    vehicle_dirs.push_back(p->vehicle.normalized());
  }
  const double sensor_sep = largest_line_angle(sensor_dirs);
  const double vehicle_sep = largest_line_angle(vehicle_dirs);
  o.separation_rad = std::min(sensor_sep, vehicle_sep);
  if (used.empty()) {
    o.observable = false;
    o.sentence = "no pair has a positive weight: nothing fixes the rotation";
    return o;
  }
  if (o.separation_rad < kMinVectorSeparationRad) {
    o.observable = false;
    // The common line, signs aligned to the heaviest pair.
    const VectorPair* anchor = used.front();
    for (const VectorPair* p : used) {
      if (p->weight > anchor->weight) anchor = p;
    }
    Eigen::Vector3d s_sum = Eigen::Vector3d::Zero(), v_sum = Eigen::Vector3d::Zero();
    for (const VectorPair* p : used) {
      const Eigen::Vector3d s = p->sensor.normalized(), v = p->vehicle.normalized();
      s_sum += p->weight * (s.dot(anchor->sensor) < 0 ? -s : s);
      v_sum += p->weight * (v.dot(anchor->vehicle) < 0 ? -v : v);
    }
    o.free_axis_sensor = s_sum.normalized();
    o.free_axis_vehicle = v_sum.normalized();
    std::string how;
    if (used.size() == 1) {
      how = "there is one direction only";
    } else {
      const std::string all =
          used.size() == 2 ? "both directions" : "all " + std::to_string(used.size()) + " directions";
      how = o.separation_rad < kParallelRad
                ? all + " lie along one line"
                : all + " lie within " + fmt(o.separation_rad * kDeg, 2) + " degrees of one line";
    }
    o.sentence =
        how + ", so the turn about that line (" + vehicle_line_words(o.free_axis_vehicle, names) +
        "; sensor direction " + vec_text(o.free_axis_sensor) +
        ") is unobservable: one resting vector such as gravity gives tilt, never heading. Add a reading "
        "with the vehicle in another attitude (tilted at least " +
        fmt(kWeakSeparationRad * kDeg, 2) + " degrees) or a second known direction.";
    return o;
  }
  if (o.separation_rad < kWeakSeparationRad) {
    o.warning =
        "the directions are at most " + fmt(o.separation_rad * kDeg, 2) +
        " degrees apart: the turn about their common line is weakly fixed (noise is amplified about " +
        fmt(1.0 / std::sin(o.separation_rad), 2) + " times)";
  }
  return o;
}

Expected<VectorSolve> solve_mount_from_vectors(const std::vector<VectorPair>& pairs,
                                               const VehicleAxes& names) {
  if (pairs.empty()) return Error{"no vector pairs"};
  VectorSolve out;
  out.observability = vector_observability(pairs, names);
  if (!out.observability.observable) return out;
  if (!out.observability.warning.empty()) out.warnings.push_back(out.observability.warning);
  const Rotation best = wahba_svd(pairs);
  out.vehicle_R_sensor = best;
  double loss = 0.0;
  for (std::size_t i = 0; i < pairs.size(); ++i) {
    const VectorPair& p = pairs[i];
    const Eigen::Vector3d predicted = best.apply(p.sensor.normalized());
    const Eigen::Vector3d v = p.vehicle.normalized();
    const double r = std::atan2(predicted.cross(v).norm(), predicted.dot(v));
    out.residuals_rad.push_back(r);
    loss += 0.5 * p.weight * (v - predicted).squaredNorm();
    if (p.weight > 0 && r > kLargeResidualRad) {
      out.warnings.push_back("pair " + std::to_string(p.line > 0 ? p.line : static_cast<int>(i) + 1) +
                             " is " + fmt(r * kDeg) + " degrees from the solution: check that reading");
    }
  }
  out.loss = loss;
  out.davenport = wahba_davenport(pairs);
  out.davenport_difference_rad = geodesic_angle(*out.davenport, best);
  // TRIAD on the heaviest pair (exact on it) and the pair whose sensor vector is furthest
  // from that one's line (the best-conditioned plane).
  std::size_t first = 0;
  for (std::size_t i = 0; i < pairs.size(); ++i) {
    if (pairs[i].weight > pairs[first].weight) first = i;
  }
  std::size_t second = first;
  double best_angle = -1.0;
  for (std::size_t i = 0; i < pairs.size(); ++i) {
    if (i == first || pairs[i].weight <= 0) continue;
    const double a = line_angle(pairs[first].sensor.normalized(), pairs[i].sensor.normalized());
    if (a > best_angle) {
      best_angle = a;
      second = i;
    }
  }
  if (second != first) {
    auto t = triad(pairs[first], pairs[second]);
    if (t) {
      out.triad = t.value();
      out.triad_difference_rad = geodesic_angle(*out.triad, best);
      auto line_of = [&](std::size_t i) {
        return pairs[i].line > 0 ? pairs[i].line : static_cast<int>(i) + 1;
      };
      out.triad_lines = {line_of(first), line_of(second)};
      if (out.triad_difference_rad > kTriadDisagreementRad) {
        out.warnings.push_back("TRIAD on pairs " + std::to_string(out.triad_lines[0]) + " and " +
                               std::to_string(out.triad_lines[1]) + " is " +
                               fmt(out.triad_difference_rad * kDeg) +
                               " degrees from the optimal solution: the readings disagree among themselves");
      }
    }
  }
  return out;
}

}  // namespace attiscope
