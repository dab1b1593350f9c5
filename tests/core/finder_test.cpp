// finder_test.cpp: the convention finder recovers the convention that made a pair of
// numbers, and the gravity test recovers a swapped quaternion layout.
#include "attiscope/core/finder.hpp"

#include <cmath>

#include "support/check.hpp"

namespace attiscope {
namespace {

using test::kSeed;

constexpr double kDeg = M_PI / 180.0;
/// Random poses are kept this far from gimbal lock (degrees of lock margin).
constexpr double kAwayFromLockDeg = 10.0;

std::vector<double> vec(const std::array<double, 4>& a) {
  return {a.begin(), a.end()};
}
std::vector<double> vec(const std::array<double, 9>& a) {
  return {a.begin(), a.end()};
}

// Random angles in a convention, away from lock.
Eigen::Vector3d random_angles(const EulerConvention& c, std::mt19937& rng) {
  std::uniform_real_distribution<double> outer(-179.0, 179.0);
  std::uniform_real_distribution<double> middle_tb(-90.0 + kAwayFromLockDeg, 90.0 - kAwayFromLockDeg);
  std::uniform_real_distribution<double> middle_pe(kAwayFromLockDeg, 180.0 - kAwayFromLockDeg);
  return Eigen::Vector3d(outer(rng), c.proper() ? middle_pe(rng) : middle_tb(rng), outer(rng));
}

bool same_interpretation(const Interpretation& a, const Interpretation& b) {
  return a.euler == b.euler && a.unit == b.unit && a.print_order == b.print_order &&
         (a.quaternion.has_value() == b.quaternion.has_value()) &&
         (!a.quaternion || *a.quaternion == *b.quaternion) &&
         (a.matrix.has_value() == b.matrix.has_value()) &&
         (!a.matrix ||
          (a.matrix->direction == b.matrix->direction && a.matrix->storage == b.matrix->storage));
}

// The generating interpretation is among the matches that tie for the best residual.
::testing::AssertionResult TopRanked(const FinderResult& r, const Interpretation& truth) {
  if (r.matches.empty()) return ::testing::AssertionFailure() << "no matches";
  const double best = r.matches.front().residual_rad;
  for (const FinderMatch& m : r.matches) {
    if (m.residual_rad - best > kFinderTieRad) break;
    if (same_interpretation(m.interpretation, truth)) {
      if (best > 1e-9) return ::testing::AssertionFailure() << "best residual " << best << " rad";
      return ::testing::AssertionSuccess();
    }
  }
  return ::testing::AssertionFailure() << "not top-ranked: " << truth.describe() << "; best was "
                                       << r.matches.front().interpretation.describe();
}

TEST(FinderTest, RecoversEulerAndQuaternionConventions) {
  std::mt19937 rng(kSeed);
  const std::array<std::array<int, 3>, 2> orders{{{0, 1, 2}, {2, 1, 0}}};
  for (const EulerConvention& c : all_euler_conventions()) {
    for (const QuatConvention& q : all_quat_conventions()) {
      for (AngleUnit unit : {AngleUnit::Degrees, AngleUnit::Radians}) {
        const auto& order = orders[static_cast<std::size_t>(rng() % 2)];
        const Eigen::Vector3d deg = random_angles(c, rng);
        const Rotation pose = from_euler(c, deg * kDeg);
        const Eigen::Vector3d shown = unit == AngleUnit::Degrees ? deg : Eigen::Vector3d(deg * kDeg);
        std::vector<double> printed(3);
        for (std::size_t k = 0; k < 3; ++k) printed[k] = shown[order[k]];
        auto r = find_conventions(printed, vec(to_quaternion_numbers(pose, q)));
        ASSERT_TRUE(r.ok()) << r.error().describe();
        EXPECT_EQ(r.value().mode, "euler-quaternion");
        Interpretation truth;
        truth.euler = c;
        truth.unit = unit;
        truth.print_order = order;
        truth.quaternion = q;
        EXPECT_TRUE(TopRanked(r.value(), truth)) << c.name() << ", " << q.describe() << ", seed " << kSeed;
      }
    }
  }
}

TEST(FinderTest, RecoversEulerAndMatrixConventions) {
  std::mt19937 rng(kSeed + 1);
  for (const EulerConvention& c : all_euler_conventions()) {
    for (Direction d : {Direction::BodyToWorld, Direction::WorldToBody}) {
      for (MatrixStorage s : {MatrixStorage::Rows, MatrixStorage::Columns}) {
        const Eigen::Vector3d deg = random_angles(c, rng);
        const Rotation pose = from_euler(c, deg * kDeg);
        const MatrixConvention mc{d, s};
        // Matrix first: the finder takes either order.
        auto r = find_conventions(vec(to_matrix_numbers(pose, mc)), {deg[0], deg[1], deg[2]});
        ASSERT_TRUE(r.ok()) << r.error().describe();
        Interpretation truth;
        truth.euler = c;
        truth.unit = AngleUnit::Degrees;
        truth.print_order = std::array<int, 3>{0, 1, 2};
        truth.matrix = mc;
        EXPECT_TRUE(TopRanked(r.value(), truth)) << c.name() << ", " << mc.describe() << ", seed " << kSeed;
      }
    }
  }
}

TEST(FinderTest, RecoversQuaternionAndMatrixConventions) {
  std::mt19937 rng(kSeed + 2);
  for (const QuatConvention& q : all_quat_conventions()) {
    for (Direction d : {Direction::BodyToWorld, Direction::WorldToBody}) {
      for (MatrixStorage s : {MatrixStorage::Rows, MatrixStorage::Columns}) {
        const Rotation pose = test::RandomRotation(rng);
        const MatrixConvention mc{d, s};
        auto r = find_conventions(vec(to_quaternion_numbers(pose, q)), vec(to_matrix_numbers(pose, mc)));
        ASSERT_TRUE(r.ok());
        Interpretation truth;
        truth.quaternion = q;
        truth.matrix = mc;
        EXPECT_TRUE(TopRanked(r.value(), truth)) << q.describe() << ", " << mc.describe();
      }
    }
  }
}

TEST(FinderTest, RoundedPrintedNumbersStillMatch) {
  // Numbers printed to four decimals (a log) agree within the default 0.5 degrees.
  const EulerConvention zyx;
  const Rotation pose = from_euler(zyx, Eigen::Vector3d(10, 20, 30) * kDeg);
  auto q = to_quaternion_numbers(pose, QuatConvention{});
  for (double& v : q) v = std::round(v * 1e4) / 1e4;
  auto r = find_conventions({10, 20, 30}, vec(q));
  ASSERT_TRUE(r.ok());
  ASSERT_FALSE(r.value().matches.empty());
  EXPECT_EQ(r.value().matches.front().interpretation.euler->sequence(), "ZYX");
  EXPECT_LT(r.value().matches.front().residual_rad, 0.01 * kDeg);
}

TEST(FinderTest, ProductRevealsTheAlgebra) {
  // references.md T4: with fixed axes, x first then y is q_y (x) q_x = (1/2, 1/2, 1/2, -1/2)
  // in Hamilton algebra; the reversed product (1/2, 1/2, 1/2, 1/2) is what a JPL product
  // of the same two numbers gives (T8: a (x)_JPL b = b (x)_Ham a).
  const double h = M_SQRT1_2;
  const std::vector<double> pair{h, 0, h, 0, h, h, 0, 0};  // q_y then q_x, w x y z
  auto ham = find_conventions(pair, {0.5, 0.5, 0.5, -0.5});
  ASSERT_TRUE(ham.ok());
  EXPECT_EQ(ham.value().mode, "product");
  ASSERT_FALSE(ham.value().matches.empty());
  EXPECT_EQ(ham.value().matches.front().interpretation.quaternion->algebra, QuatAlgebra::Hamilton);
  EXPECT_EQ(ham.value().matches.front().interpretation.quaternion->layout, QuatLayout::ScalarFirst);
  auto jpl = find_conventions(pair, {0.5, 0.5, 0.5, 0.5});
  ASSERT_TRUE(jpl.ok());
  EXPECT_EQ(jpl.value().matches.front().interpretation.quaternion->algebra, QuatAlgebra::Jpl);
  // Random products in every layout and algebra come back top-ranked.
  std::mt19937 rng(kSeed + 3);
  for (QuatLayout layout : {QuatLayout::ScalarFirst, QuatLayout::ScalarLast}) {
    for (QuatAlgebra algebra : {QuatAlgebra::Hamilton, QuatAlgebra::Jpl}) {
      for (int n = 0; n < 20; ++n) {
        const Eigen::Quaterniond a = test::RandomRotation(rng).quaternion(),
                                 b = test::RandomRotation(rng).quaternion();
        const Eigen::Quaterniond p =
            algebra == QuatAlgebra::Hamilton ? hamilton_product(a, b) : jpl_product(a, b);
        auto put = [layout](const Eigen::Quaterniond& q, std::vector<double>* out) {
          if (layout == QuatLayout::ScalarFirst) {
            out->insert(out->end(), {q.w(), q.x(), q.y(), q.z()});
          } else {
            out->insert(out->end(), {q.x(), q.y(), q.z(), q.w()});
          }
        };
        std::vector<double> ab, prod;
        put(a, &ab);
        put(b, &ab);
        put(p, &prod);
        auto r = find_conventions(ab, prod);
        ASSERT_TRUE(r.ok());
        Interpretation truth;
        truth.quaternion = QuatConvention{layout, algebra, Direction::BodyToWorld};
        truth.product_only = true;
        EXPECT_TRUE(TopRanked(r.value(), truth)) << "seed " << kSeed;
      }
    }
  }
}

TEST(FinderTest, BadInputIsAnError) {
  EXPECT_FALSE(find_conventions({1, 2}, {1, 0, 0, 0}).ok());
  EXPECT_FALSE(find_conventions({1, 2, NAN}, {1, 0, 0, 0}).ok());
  EXPECT_FALSE(find_conventions({1, 2, 3}, {0, 0, 0, 0}).ok());
  // Nine numbers that are a reflection in every storage.
  EXPECT_FALSE(find_conventions({1, 2, 3}, {-1, 0, 0, 0, 1, 0, 0, 0, 1}).ok());
}

TEST(FinderTest, GravityTestRecoversSwappedQuaternionLayout) {
  // Invented resting samples: a sensor set down in several tilted attitudes; at rest an
  // accelerometer measures the reaction to gravity, pointing up (common practice), here
  // 9.81 m/s^2 with small noise. The log writes its quaternions x y z w.
  std::mt19937 rng(kSeed + 4);
  std::normal_distribution<double> noise(0.0, 0.02);
  std::uniform_real_distribution<double> tilt(-40.0, 40.0), yaw(-180.0, 180.0);
  const Eigen::Vector3d up(0, 0, 1);
  std::vector<GravitySample> samples;
  for (int n = 0; n < 8; ++n) {
    const Rotation world_R_body =
        from_euler(EulerConvention{}, Eigen::Vector3d(yaw(rng), tilt(rng), tilt(rng)) * kDeg);
    GravitySample s;
    s.accel_body =
        world_R_body.inverse().apply(9.81 * up) + Eigen::Vector3d(noise(rng), noise(rng), noise(rng));
    const auto q = to_quaternion_numbers(
        world_R_body, {QuatLayout::ScalarLast, QuatAlgebra::Hamilton, Direction::BodyToWorld});
    s.pose.assign(q.begin(), q.end());
    s.line = n + 1;
    samples.push_back(s);
  }
  auto r = gravity_test(samples, up);
  ASSERT_TRUE(r.ok()) << r.error().describe();
  const auto& ranked = r.value().ranked;
  ASSERT_EQ(ranked.size(), 8u);
  // The top reading is scalar last; its only twin is JPL world-to-body (the same numbers).
  const QuatConvention top = *ranked.front().interpretation.quaternion;
  EXPECT_EQ(top.layout, QuatLayout::ScalarLast);
  EXPECT_TRUE((top.algebra == QuatAlgebra::Hamilton) == (top.direction == Direction::BodyToWorld));
  EXPECT_LT(ranked.front().worst_deg, 1.0);
  EXPECT_LT(ranked.front().spread_deg, 1.0);
  // The tool's default (scalar first, Hamilton, body-to-world) is clearly worse.
  for (const GravityMatch& m : ranked) {
    if (*m.interpretation.quaternion == QuatConvention{}) {
      EXPECT_GT(m.worst_deg, 20.0);
    }
  }
  for (const std::string& note : r.value().notes)
    EXPECT_EQ(note.find("less than 5 degrees"), std::string::npos);
  // With a house convention that writes Hamilton body-to-world, its reading leads the tie.
  HouseConvention house;
  house.quaternion = {QuatLayout::ScalarLast, QuatAlgebra::Hamilton, Direction::BodyToWorld};
  auto h = gravity_test(samples, up, house);
  ASSERT_TRUE(h.ok());
  EXPECT_EQ(*h.value().ranked.front().interpretation.quaternion, house.quaternion);
}

TEST(FinderTest, HouseConventionBreaksTies) {
  // Intrinsic ZYX written (a, b, c) and extrinsic XYZ written (c, b, a) are the same
  // numbers; so are Hamilton body-to-world and JPL world-to-body quaternions. The house
  // (intrinsic ZYX, printed as applied, JPL world-to-body, x y z w) picks its own.
  HouseConvention house;
  house.quaternion = {QuatLayout::ScalarLast, QuatAlgebra::Jpl, Direction::WorldToBody};
  const Rotation pose = from_euler(house.euler.convention, Eigen::Vector3d(40, -25, 70) * kDeg);
  FinderOptions o;
  o.house = house;
  auto r = find_conventions({40, -25, 70}, vec(to_quaternion_numbers(pose, house.quaternion)), o);
  ASSERT_TRUE(r.ok());
  ASSERT_GE(r.value().matches.size(), 4u);
  const Interpretation& top = r.value().matches.front().interpretation;
  EXPECT_EQ(*top.euler, house.euler.convention);
  EXPECT_EQ(*top.quaternion, house.quaternion);
  EXPECT_EQ(*top.print_order, (std::array<int, 3>{0, 1, 2}));
  // Without the house the tie is still reported.
  auto plain = find_conventions({40, -25, 70}, vec(to_quaternion_numbers(pose, house.quaternion)));
  ASSERT_TRUE(plain.ok());
  EXPECT_FALSE(plain.value().notes.empty());
}

TEST(FinderTest, GravityLogParsingAndErrors) {
  auto ok = parse_gravity_log("# ax ay az qw qx qy qz\n0 0 9.8 1 0 0 0\n\n0 9.8 0 0.7071 -0.7071 0 0\n");
  ASSERT_TRUE(ok.ok()) << ok.error().describe();
  EXPECT_EQ(ok.value().size(), 2u);
  EXPECT_EQ(ok.value()[1].line, 4);
  auto mixed = parse_gravity_log("0 0 9.8 1 0 0 0\n0 0 9.8 10 20 30\n");
  ASSERT_FALSE(mixed.ok());
  EXPECT_EQ(mixed.error().line, 2);
  auto word = parse_gravity_log("0 0 9.8 1 0 0 0\n0 0 x 1 0 0 0\n");
  ASSERT_FALSE(word.ok());
  EXPECT_EQ(word.error().line, 2);
  EXPECT_EQ(word.error().column, 5);
  EXPECT_FALSE(gravity_test({}, {0, 0, 1}).ok());
  // Poses that barely differ cannot tell readings apart: a note says so.
  auto same = parse_gravity_log("0 0 9.8 1 0 0 0\n0 0 9.8 1 0 0 0.001\n");
  ASSERT_TRUE(same.ok());
  auto r = gravity_test(same.value(), {0, 0, 1});
  ASSERT_TRUE(r.ok());
  EXPECT_FALSE(r.value().notes.empty());
}

}  // namespace
}  // namespace attiscope
