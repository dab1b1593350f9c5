// finder.cpp: exhaustive search over conventions, ranked by residual angle; gravity test.
#include "attiscope/core/finder.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>

namespace attiscope {

namespace {

constexpr double kPi = 3.14159265358979323846;
constexpr double kDegPerRad = 180.0 / kPi;
/// How many of the closest interpretations are kept for a "no match" message.
constexpr std::size_t kNearestKept = 5;
/// Poses closer together than this cannot tell quaternion layouts apart in a gravity test.
constexpr double kGravityMinPoseSpreadDeg = 5.0;

const std::array<std::array<int, 3>, 6> kPrintOrders{
    {{0, 1, 2}, {0, 2, 1}, {1, 0, 2}, {1, 2, 0}, {2, 0, 1}, {2, 1, 0}}};

std::array<MatrixConvention, 4> all_matrix_conventions() {
  return {MatrixConvention{Direction::BodyToWorld, MatrixStorage::Rows},
          MatrixConvention{Direction::BodyToWorld, MatrixStorage::Columns},
          MatrixConvention{Direction::WorldToBody, MatrixStorage::Rows},
          MatrixConvention{Direction::WorldToBody, MatrixStorage::Columns}};
}

Rotation euler_rotation(const std::vector<double>& printed, const EulerConvention& c, AngleUnit unit,
                        const std::array<int, 3>& order) {
  const double scale = unit == AngleUnit::Degrees ? 1.0 / kDegPerRad : 1.0;
  Eigen::Vector3d applied;
  for (std::size_t k = 0; k < 3; ++k) applied[order[k]] = printed[k] * scale;
  return from_euler(c, applied);
}

std::array<double, 4> four(const std::vector<double>& v, std::size_t at) {
  return {v[at], v[at + 1], v[at + 2], v[at + 3]};
}

Expected<Rotation> read_matrix(const std::vector<double>& v, const MatrixConvention& c) {
  std::array<double, 9> n{};
  std::copy(v.begin(), v.begin() + 9, n.begin());
  return from_matrix(matrix_from_numbers(n, c.storage), c.direction);
}

Expected<bool> check_finite(const std::vector<double>& v, const char* which) {
  for (std::size_t i = 0; i < v.size(); ++i) {
    if (!std::isfinite(v[i]))
      return Error{std::string(which) + ": number " + std::to_string(i + 1) + " is not finite"};
  }
  return true;
}

// Angle between the rotations two sets of quaternion numbers stand for, sign-blind:
// 2 atan2(|p - s b|, |p + s b|) with s the sign of p . b (accurate near 0 and 180 degrees).
double quaternion_numbers_angle(const Eigen::Vector4d& p, const Eigen::Vector4d& b) {
  const Eigen::Vector4d pn = p.normalized();
  Eigen::Vector4d bn = b.normalized();
  if (pn.dot(bn) < 0.0) bn = -bn;
  return 2.0 * std::atan2((pn - bn).norm(), (pn + bn).norm());
}

// Within each run of tied entries (residuals within kFinderTieRad of the run's first),
// the ones that agree more with the house come first.
template <class T, class Key>
void order_ties(std::vector<T>* v, Key key, const std::optional<HouseConvention>& house) {
  if (!house) return;
  std::size_t start = 0;
  while (start < v->size()) {
    std::size_t end = start + 1;
    while (end < v->size() && key((*v)[end]) - key((*v)[start]) < kFinderTieRad) ++end;
    std::stable_sort(v->begin() + static_cast<std::ptrdiff_t>(start),
                     v->begin() + static_cast<std::ptrdiff_t>(end), [&](const T& a, const T& b) {
                       return house_agreement(a.interpretation, *house) >
                              house_agreement(b.interpretation, *house);
                     });
    start = end;
  }
}

void sort_and_cut(std::vector<FinderMatch>* all, const FinderOptions& o, FinderResult* r) {
  std::stable_sort(all->begin(), all->end(), [](const FinderMatch& x, const FinderMatch& y) {
    return x.residual_rad < y.residual_rad;
  });
  order_ties(
      all, [](const FinderMatch& m) { return m.residual_rad; }, o.house);
  for (const FinderMatch& m : *all) {
    if (m.residual_rad <= o.within_rad) r->matches.push_back(m);
  }
  for (std::size_t i = 0; i < std::min(kNearestKept, all->size()); ++i) r->nearest.push_back((*all)[i]);
  if (r->matches.size() > 1 && r->matches[1].residual_rad - r->matches[0].residual_rad < kFinderTieRad) {
    std::size_t ties = 1;
    while (ties < r->matches.size() &&
           r->matches[ties].residual_rad - r->matches[0].residual_rad < kFinderTieRad)
      ++ties;
    r->notes.push_back(std::to_string(ties) +
                       " interpretations tie for the best fit: these numbers cannot tell them apart "
                       "(pair them with another sample, or use the house convention)");
  }
}

// The rotations one pose's numbers stand for under every applicable interpretation.
std::vector<std::pair<Interpretation, Expected<Rotation>>> interpretations_of(const std::vector<double>& v) {
  std::vector<std::pair<Interpretation, Expected<Rotation>>> out;
  if (v.size() == 3) {
    for (const EulerConvention& c : all_euler_conventions()) {
      for (AngleUnit u : {AngleUnit::Degrees, AngleUnit::Radians}) {
        for (const auto& order : kPrintOrders) {
          Interpretation i;
          i.euler = c;
          i.unit = u;
          i.print_order = order;
          out.emplace_back(i, euler_rotation(v, c, u, order));
        }
      }
    }
  } else if (v.size() == 4) {
    for (const QuatConvention& q : all_quat_conventions()) {
      Interpretation i;
      i.quaternion = q;
      out.emplace_back(i, from_quaternion_numbers(four(v, 0), q));
    }
  } else if (v.size() == 9) {
    for (const MatrixConvention& m : all_matrix_conventions()) {
      Interpretation i;
      i.matrix = m;
      out.emplace_back(i, read_matrix(v, m));
    }
  }
  return out;
}

Interpretation merge(const Interpretation& x, const Interpretation& y) {
  Interpretation m = x;
  if (y.euler) m.euler = y.euler;
  if (y.unit) m.unit = y.unit;
  if (y.print_order) m.print_order = y.print_order;
  if (y.quaternion) m.quaternion = y.quaternion;
  if (y.matrix) m.matrix = y.matrix;
  return m;
}

}  // namespace

int house_agreement(const Interpretation& i, const HouseConvention& h) {
  int n = 0;
  if (i.euler && *i.euler == h.euler.convention) ++n;
  if (i.unit && *i.unit == h.euler.unit) ++n;
  if (i.print_order && *i.print_order == h.euler.print_order) ++n;
  if (i.quaternion) {
    n += i.quaternion->layout == h.quaternion.layout;
    n += i.quaternion->algebra == h.quaternion.algebra;
    n += !i.product_only && i.quaternion->direction == h.quaternion.direction;
  }
  if (i.matrix) {
    n += i.matrix->direction == h.matrix.direction;
    n += i.matrix->storage == h.matrix.storage;
  }
  return n;
}

std::string quaternion_layout_key(QuatLayout l) {
  return l == QuatLayout::ScalarFirst ? "wxyz" : "xyzw";
}
std::string algebra_key(QuatAlgebra a) {
  return a == QuatAlgebra::Hamilton ? "hamilton" : "jpl";
}
std::string direction_key(Direction d) {
  return d == Direction::BodyToWorld ? "body_to_world" : "world_to_body";
}
std::string storage_key(MatrixStorage s) {
  return s == MatrixStorage::Rows ? "rows" : "columns";
}

std::string Interpretation::describe() const {
  std::ostringstream s;
  const char* sep = "";
  if (euler) {
    s << "Euler " << euler->name() << " in " << (unit == AngleUnit::Radians ? "radians" : "degrees");
    if (print_order) {
      const auto& p = *print_order;
      if (p == std::array<int, 3>{0, 1, 2}) {
        s << ", written in the order applied";
      } else {
        s << ", written as angles " << p[0] + 1 << ", " << p[1] + 1 << ", " << p[2] + 1 << " of the sequence";
      }
    }
    sep = "; ";
  }
  if (quaternion) {
    s << sep << "quaternion " << (quaternion->layout == QuatLayout::ScalarFirst ? "w x y z" : "x y z w")
      << ", " << (quaternion->algebra == QuatAlgebra::Hamilton ? "Hamilton" : "JPL");
    if (!product_only)
      s << ", " << (quaternion->direction == Direction::BodyToWorld ? "body-to-world" : "world-to-body");
    sep = "; ";
  }
  if (matrix) {
    s << sep << "matrix " << (matrix->direction == Direction::BodyToWorld ? "body-to-world" : "world-to-body")
      << ", " << (matrix->storage == MatrixStorage::Rows ? "row-major" : "column-major");
  }
  return s.str();
}

Expected<FinderResult> find_conventions(const std::vector<double>& a_in, const std::vector<double>& b_in,
                                        const FinderOptions& options) {
  if (auto f = check_finite(a_in, "A"); !f) return f.error();
  if (auto f = check_finite(b_in, "B"); !f) return f.error();
  FinderResult r;
  std::vector<FinderMatch> all;
  const std::size_t na = a_in.size(), nb = b_in.size();
  // The product check: A holds q1 and q2, B their product (or the other way round).
  if ((na == 8 && nb == 4) || (na == 4 && nb == 8)) {
    const std::vector<double>& pair = na == 8 ? a_in : b_in;
    const std::vector<double>& prod = na == 8 ? b_in : a_in;
    r.mode = "product";
    for (QuatLayout layout : {QuatLayout::ScalarFirst, QuatLayout::ScalarLast}) {
      auto as_eigen = [layout](const std::array<double, 4>& n) {
        return layout == QuatLayout::ScalarFirst ? Eigen::Quaterniond(n[0], n[1], n[2], n[3])
                                                 : Eigen::Quaterniond(n[3], n[0], n[1], n[2]);
      };
      const Eigen::Quaterniond q1 = as_eigen(four(pair, 0)), q2 = as_eigen(four(pair, 4)),
                               p = as_eigen(four(prod, 0));
      if (q1.norm() < kMinQuaternionNorm || q2.norm() < kMinQuaternionNorm || p.norm() < kMinQuaternionNorm) {
        return Error{"a zero quaternion describes no rotation"};
      }
      for (QuatAlgebra algebra : {QuatAlgebra::Hamilton, QuatAlgebra::Jpl}) {
        const Eigen::Quaterniond made =
            algebra == QuatAlgebra::Hamilton ? hamilton_product(q1, q2) : jpl_product(q1, q2);
        FinderMatch m;
        m.interpretation.quaternion = QuatConvention{layout, algebra, Direction::BodyToWorld};
        m.interpretation.product_only = true;
        m.residual_rad = quaternion_numbers_angle(Eigen::Vector4d(made.w(), made.x(), made.y(), made.z()),
                                                  Eigen::Vector4d(p.w(), p.x(), p.y(), p.z()));
        all.push_back(m);
      }
    }
    r.notes.push_back(
        "a product alone does not fix the direction: q1 q2 in one direction is the conjugate product in the "
        "other");
    sort_and_cut(&all, options, &r);
    return r;
  }
  // Put the shorter list first: 3 before 4 before 9.
  const bool swap = na > nb;
  const std::vector<double>& x = swap ? b_in : a_in;
  const std::vector<double>& y = swap ? a_in : b_in;
  const std::size_t nx = x.size(), ny = y.size();
  if (!((nx == 3 && ny == 4) || (nx == 3 && ny == 9) || (nx == 4 && ny == 9))) {
    return Error{"got " + std::to_string(na) + " and " + std::to_string(nb) +
                 " numbers; the finder compares an Euler triple (3) with a quaternion (4) or a matrix (9), a "
                 "quaternion with a matrix, or q1 q2 (8) with their product (4)"};
  }
  r.mode = nx == 3 ? (ny == 4 ? "euler-quaternion" : "euler-matrix") : "quaternion-matrix";
  const auto xs = interpretations_of(x);
  const auto ys = interpretations_of(y);
  bool any_y = false;
  std::string y_error;
  for (const auto& [iy, ry] : ys) {
    if (!ry) {
      y_error = ry.error().message;
      continue;
    }
    any_y = true;
    for (const auto& [ix, rx] : xs) {
      if (!rx) continue;
      all.push_back({merge(ix, iy), geodesic_angle(rx.value(), ry.value())});
    }
  }
  if (!any_y) return Error{(swap ? "A: " : "B: ") + y_error};
  if (std::none_of(xs.begin(), xs.end(), [](const auto& p) { return p.second.ok(); })) {
    return Error{std::string(swap ? "B: " : "A: ") + xs.front().second.error().message};
  }
  sort_and_cut(&all, options, &r);
  return r;
}

Expected<std::vector<GravitySample>> parse_gravity_log(std::string_view text) {
  std::vector<GravitySample> out;
  std::size_t start = 0;
  int line_no = 0;
  std::size_t count = 0;
  while (start <= text.size()) {
    std::size_t end = text.find('\n', start);
    if (end == std::string_view::npos) end = text.size();
    const std::string_view line = text.substr(start, end - start);
    ++line_no;
    start = end + 1;
    const std::size_t first = line.find_first_not_of(" \t\r");
    if (first == std::string_view::npos || line[first] == '#') {
      if (end == text.size()) break;
      continue;
    }
    auto numbers = scan_numbers(line);
    if (!numbers) {
      const Error& e = numbers.error();
      return Error{e.message, line_no, e.column};
    }
    const auto& tokens = numbers.value();
    if (tokens.size() != 6 && tokens.size() != 7 && tokens.size() != 12) {
      return Error{
          "a sample is three accelerometer numbers and a pose of 3 (Euler), 4 (quaternion) or 9 (matrix) "
          "numbers; this line has " +
              std::to_string(tokens.size()),
          line_no, 1};
    }
    if (count == 0) count = tokens.size();
    if (tokens.size() != count) {
      return Error{"every sample must have the same count of numbers: the first had " +
                       std::to_string(count) + ", this line has " + std::to_string(tokens.size()),
                   line_no, tokens.front().column};
    }
    GravitySample s;
    s.line = line_no;
    s.accel_body = Eigen::Vector3d(tokens[0].value, tokens[1].value, tokens[2].value);
    for (std::size_t i = 3; i < tokens.size(); ++i) {
      if (!std::isfinite(tokens[i].value))
        return Error{"this number is not finite", line_no, tokens[i].column};
      s.pose.push_back(tokens[i].value);
    }
    if (!s.accel_body.allFinite() || s.accel_body.norm() == 0.0) {
      return Error{"the accelerometer vector must be finite and not zero", line_no, tokens[0].column};
    }
    out.push_back(s);
    if (end == text.size()) break;
  }
  return out;
}

Expected<GravityResult> gravity_test(const std::vector<GravitySample>& samples,
                                     const Eigen::Vector3d& expected_world,
                                     const std::optional<HouseConvention>& house) {
  if (samples.size() < 2) return Error{"the gravity test needs at least two resting samples"};
  const std::size_t count = samples.front().pose.size();
  for (const GravitySample& s : samples) {
    if (s.pose.size() != count)
      return Error{"every sample must have the same count of pose numbers", s.line, 1};
    if (!(s.accel_body.norm() > 0.0)) return Error{"a zero accelerometer vector has no direction", s.line, 1};
  }
  if (count != 3 && count != 4 && count != 9) return Error{"a pose is 3, 4 or 9 numbers"};
  const Eigen::Vector3d up = expected_world.normalized();
  GravityResult result;
  std::vector<std::vector<std::pair<Interpretation, Expected<Rotation>>>> per_sample;
  for (const GravitySample& s : samples) per_sample.push_back(interpretations_of(s.pose));
  const std::size_t n_interp = per_sample.front().size();
  for (std::size_t k = 0; k < n_interp; ++k) {
    std::vector<Eigen::Vector3d> world;
    bool ok = true;
    for (std::size_t i = 0; i < samples.size(); ++i) {
      const auto& r = per_sample[i][k].second;
      if (!r) {
        ok = false;
        break;
      }
      world.push_back(r.value().apply(samples[i].accel_body).normalized());
    }
    if (!ok) continue;
    Eigen::Vector3d mean = Eigen::Vector3d::Zero();
    for (const auto& w : world) mean += w;
    GravityMatch m;
    m.interpretation = per_sample.front()[k].first;
    auto angle = [](const Eigen::Vector3d& p, const Eigen::Vector3d& q) {
      return std::atan2(p.cross(q).norm(), p.dot(q)) * kDegPerRad;
    };
    const bool has_mean = mean.norm() > 1e-12;
    if (has_mean) mean.normalize();
    for (const auto& w : world) {
      m.worst_deg = std::max(m.worst_deg, angle(w, up));
      m.spread_deg = std::max(m.spread_deg, has_mean ? angle(w, mean) : 180.0);
    }
    m.tilt_deg = has_mean ? angle(mean, up) : 180.0;
    result.ranked.push_back(m);
  }
  if (result.ranked.empty()) return Error{"no reading of the logged poses gives a rotation"};
  std::stable_sort(result.ranked.begin(), result.ranked.end(),
                   [](const GravityMatch& x, const GravityMatch& y) { return x.worst_deg < y.worst_deg; });
  // worst_deg is in degrees: ties are compared at the same small tolerance in radians.
  order_ties(
      &result.ranked, [](const GravityMatch& m) { return m.worst_deg / kDegPerRad; }, house);
  if (result.ranked.size() > 1 &&
      (result.ranked[1].worst_deg - result.ranked[0].worst_deg) / kDegPerRad < kFinderTieRad) {
    result.notes.push_back(
        "the best readings tie: they give the same rotations for these numbers (a JPL "
        "body-to-world quaternion has the numbers of a Hamilton world-to-body one)");
  }
  // The test only tells readings apart when the body was turned between samples.
  double pose_spread = 0.0;
  const auto& first = per_sample.front();
  for (std::size_t k = 0; k < n_interp; ++k) {
    if (!first[k].second) continue;
    for (std::size_t i = 1; i < samples.size(); ++i) {
      if (per_sample[i][k].second) {
        pose_spread =
            std::max(pose_spread, geodesic_angle(first[k].second.value(), per_sample[i][k].second.value()));
      }
    }
    break;
  }
  if (pose_spread * kDegPerRad < kGravityMinPoseSpreadDeg) {
    result.notes.push_back(
        "the logged poses differ by less than 5 degrees: rest the body in a few clearly "
        "different tilts (not only turns about the vertical) so the readings can be told apart");
  }
  return result;
}

}  // namespace attiscope
