// wahba_test.cpp: the mount solved from vector pairs: SVD, q-method and TRIAD against each
// other and a worked example, observability refusals, and the vector file reader.
#include "attiscope/core/wahba.hpp"

#include <cmath>

#include "attiscope/core/matrix.hpp"
#include "support/check.hpp"

namespace attiscope {
namespace {

using test::kSeed;

const VehicleAxes kFrd{};

Eigen::Vector3d random_unit(std::mt19937& rng) {
  std::normal_distribution<double> n(0.0, 1.0);
  return Eigen::Vector3d(n(rng), n(rng), n(rng)).normalized();
}

std::vector<VectorPair> pairs_for(const Rotation& vehicle_R_sensor, int count, double noise,
                                  std::mt19937& rng) {
  std::normal_distribution<double> n(0.0, noise);
  std::uniform_real_distribution<double> w(0.5, 3.0);
  std::vector<VectorPair> out;
  for (int i = 0; i < count; ++i) {
    VectorPair p;
    p.sensor = random_unit(rng);
    // The first two (TRIAD's) are kept at least 20 degrees from parallel.
    while (i == 1 && std::abs(p.sensor.dot(out[0].sensor)) > std::cos(20.0 * M_PI / 180.0))
      p.sensor = random_unit(rng);
    p.vehicle = (vehicle_R_sensor.apply(p.sensor) + Eigen::Vector3d(n(rng), n(rng), n(rng))).normalized();
    p.weight = w(rng);
    p.line = i + 1;
    out.push_back(p);
  }
  return out;
}

double loss_of(const Rotation& r, const std::vector<VectorPair>& pairs) {
  double l = 0.0;
  for (const VectorPair& p : pairs) {
    l += 0.5 * p.weight * (p.vehicle.normalized() - r.apply(p.sensor.normalized())).squaredNorm();
  }
  return l;
}

TEST(WahbaTest, WorkedExampleOfTheReferenceCatalogue) {
  // Worked example of references.md section 2.6 (TRIAD of Shuster & Oh 1981 and scipy 1.10.1
  // align_vectors, measured in a reference script): body (vehicle) directions
  // {(0,1,0), (0,0,1)}, sensor directions {(1,0,0), (0,0,1)}; the answer is Rz(+90) =
  // [[0,-1,0],[1,0,0],[0,0,1]].
  VectorPair a{Eigen::Vector3d(1, 0, 0), Eigen::Vector3d(0, 1, 0), 1.0, 1};
  VectorPair b{Eigen::Vector3d(0, 0, 1), Eigen::Vector3d(0, 0, 1), 1.0, 2};
  Eigen::Matrix3d expected;
  expected << 0, -1, 0, 1, 0, 0, 0, 0, 1;
  EXPECT_TRUE(test::MatrixNear(triad(a, b).value().matrix(), expected, 1e-15));
  EXPECT_TRUE(test::MatrixNear(wahba_svd({a, b}).matrix(), expected, 1e-15));
  EXPECT_TRUE(test::MatrixNear(wahba_davenport({a, b}).matrix(), expected, 1e-15));
}

TEST(WahbaTest, NoiseFreePairsGiveTheTrueRotationByEveryMethod) {
  std::mt19937 rng(kSeed);
  for (int n = 0; n < 200; ++n) {
    const Rotation truth = test::RandomRotation(rng);
    const std::vector<VectorPair> pairs = pairs_for(truth, 5, 0.0, rng);
    double lambda = 0.0;
    EXPECT_TRUE(test::RotationNear(wahba_svd(pairs), truth, 1e-12)) << "seed " << kSeed << " n " << n;
    EXPECT_TRUE(test::RotationNear(wahba_davenport(pairs, &lambda), truth, 1e-12)) << "n " << n;
    const auto t = triad(pairs[0], pairs[1]);
    ASSERT_TRUE(t.ok()) << "n " << n;
    EXPECT_TRUE(test::RotationNear(t.value(), truth, 1e-12)) << "n " << n;
    // Noise free, lambda_max = sum of weights (Markley & Crassidis 2014 ch. 5 [memory];
    // also measured in references.md section 2.6).
    double sum_w = 0.0;
    for (const VectorPair& p : pairs) sum_w += p.weight;
    EXPECT_NEAR(lambda, sum_w, 1e-12) << "n " << n;
  }
}

TEST(WahbaTest, NoisyPairsSvdAndQMethodAgreeAndBeatTriad) {
  std::mt19937 rng(kSeed + 1);
  for (int n = 0; n < 200; ++n) {
    const Rotation truth = test::RandomRotation(rng);
    const std::vector<VectorPair> pairs = pairs_for(truth, 8, 0.01, rng);
    const Rotation svd = wahba_svd(pairs);
    double lambda = 0.0;
    const Rotation q = wahba_davenport(pairs, &lambda);
    EXPECT_TRUE(test::RotationNear(svd, q, 1e-9)) << "seed " << kSeed + 1 << " n " << n;
    // lambda_max = sum w - L_min (references.md section 2.6).
    double sum_w = 0.0;
    for (const VectorPair& p : pairs) sum_w += p.weight;
    EXPECT_NEAR(lambda, sum_w - loss_of(svd, pairs), 1e-10) << "n " << n;
    // The optimum is no worse than TRIAD or the truth, which are not optimal for noisy data.
    const auto triad_result = triad(pairs[0], pairs[1]);
    ASSERT_TRUE(triad_result.ok()) << "n " << n;
    const Rotation t = triad_result.value();
    EXPECT_LE(loss_of(svd, pairs), loss_of(t, pairs) + 1e-15);
    EXPECT_LE(loss_of(svd, pairs), loss_of(truth, pairs) + 1e-15);
    // TRIAD is exact on its first pair (Shuster & Oh 1981).
    EXPECT_TRUE(test::MatrixNear(t.apply(pairs[0].sensor), pairs[0].vehicle, 1e-12));
  }
}

TEST(WahbaTest, SolveReportsResidualsAndCrossChecks) {
  std::mt19937 rng(kSeed + 2);
  const Rotation truth = test::RandomRotation(rng);
  const std::vector<VectorPair> pairs = pairs_for(truth, 6, 0.001, rng);
  const auto s = solve_mount_from_vectors(pairs, kFrd);
  ASSERT_TRUE(s.ok());
  ASSERT_TRUE(s->vehicle_R_sensor.has_value());
  ASSERT_EQ(s->residuals_rad.size(), pairs.size());
  for (std::size_t i = 0; i < pairs.size(); ++i) {
    const Eigen::Vector3d p = s->vehicle_R_sensor->apply(pairs[i].sensor);
    EXPECT_NEAR(s->residuals_rad[i], std::acos(std::min(1.0, p.dot(pairs[i].vehicle))), 1e-7);
  }
  EXPECT_LT(s->davenport_difference_rad, 1e-9);
  ASSERT_TRUE(s->triad.has_value());
  EXPECT_LT(s->triad_difference_rad, 0.01);
  EXPECT_EQ(s->triad_lines.size(), 2u);
}

TEST(WahbaTest, OneRestingVectorGivesTiltNeverHeading) {
  // Gravity seen once (sensor z along vehicle down): heading about the vehicle's down axis is free.
  const std::vector<VectorPair> one{{Eigen::Vector3d(0, 0, 9.81), Eigen::Vector3d(0, 0, 1), 1.0, 1}};
  const auto s = solve_mount_from_vectors(one, kFrd);
  ASSERT_TRUE(s.ok());
  EXPECT_FALSE(s->vehicle_R_sensor.has_value());
  EXPECT_FALSE(s->observability.observable);
  EXPECT_NE(s->observability.sentence.find("never heading"), std::string::npos);
  EXPECT_NE(s->observability.sentence.find("yaw axis"), std::string::npos) << s->observability.sentence;
  EXPECT_TRUE(test::MatrixNear(s->observability.free_axis_vehicle, Eigen::Vector3d(0, 0, 1), 1e-12));
  // The same gravity twice (and once reversed) is no better.
  const std::vector<VectorPair> same{{Eigen::Vector3d(0, 0, 1), Eigen::Vector3d(0, 0, 1), 1.0, 1},
                                     {Eigen::Vector3d(0, 0.01, -1), Eigen::Vector3d(0, 0, -1), 1.0, 2}};
  EXPECT_FALSE(solve_mount_from_vectors(same, kFrd)->vehicle_R_sensor.has_value());
}

TEST(WahbaTest, SeparationDecidesRefusalAndWarning) {
  auto at_angle = [](double deg) {
    const double a = deg * M_PI / 180.0;
    const Eigen::Vector3d d(std::sin(a), 0, std::cos(a));
    return std::vector<VectorPair>{{Eigen::Vector3d(0, 0, 1), Eigen::Vector3d(0, 0, 1), 1.0, 1},
                                   {d, d, 1.0, 2}};
  };
  EXPECT_FALSE(solve_mount_from_vectors(at_angle(2.0), kFrd)->vehicle_R_sensor.has_value());
  const auto weak = solve_mount_from_vectors(at_angle(8.0), kFrd);
  ASSERT_TRUE(weak->vehicle_R_sensor.has_value());
  EXPECT_FALSE(weak->observability.warning.empty());
  const auto good = solve_mount_from_vectors(at_angle(90.0), kFrd);
  ASSERT_TRUE(good->vehicle_R_sensor.has_value());
  EXPECT_TRUE(good->observability.warning.empty());
  EXPECT_TRUE(test::RotationNear(*good->vehicle_R_sensor, Rotation::identity(), 1e-12));
  // A zero weight removes a pair from the count.
  std::vector<VectorPair> zeroed = at_angle(90.0);
  zeroed[1].weight = 0.0;
  EXPECT_FALSE(solve_mount_from_vectors(zeroed, kFrd)->vehicle_R_sensor.has_value());
}

TEST(WahbaTest, LongFilesUseTheLinearSeparationBound) {
  // 400 pairs (beyond the all-pairs limit) within 1 degree of one line, either sign: refused;
  // one more pair 40 degrees off that line makes it observable.
  std::mt19937 rng(kSeed + 3);
  std::uniform_real_distribution<double> u(-1.0, 1.0);
  std::vector<VectorPair> pairs;
  for (int i = 0; i < 400; ++i) {
    const double a = 0.7 * M_PI / 180.0 * u(rng), b = 0.7 * M_PI / 180.0 * u(rng);
    Eigen::Vector3d d(std::sin(a), std::sin(b), 1.0);
    if (i % 2) d = -d;
    pairs.push_back({d, d, 1.0, i + 1});
  }
  const auto refused = solve_mount_from_vectors(pairs, kFrd);
  EXPECT_FALSE(refused->vehicle_R_sensor.has_value()) << "seed " << kSeed + 3;
  EXPECT_TRUE(
      test::MatrixNear(refused->observability.free_axis_vehicle.cwiseAbs(), Eigen::Vector3d(0, 0, 1), 0.02));
  const Eigen::Vector3d off(std::sin(40 * M_PI / 180), 0, std::cos(40 * M_PI / 180));
  pairs.push_back({off, off, 1.0, 401});
  const auto solved = solve_mount_from_vectors(pairs, kFrd);
  ASSERT_TRUE(solved->vehicle_R_sensor.has_value());
  EXPECT_TRUE(test::RotationNear(*solved->vehicle_R_sensor, Rotation::identity(), 1e-12));
}

TEST(WahbaTest, VectorFileErrorsNameLineAndColumn) {
  const auto ok = parse_vector_pairs("# sensor then vehicle\n0 0 1  0 0 1\n\n1 0 0  0 1 0  2.5 # weighted\n");
  ASSERT_TRUE(ok.ok());
  ASSERT_EQ(ok->size(), 2u);
  EXPECT_EQ((*ok)[1].line, 4);
  EXPECT_DOUBLE_EQ((*ok)[1].weight, 2.5);
  const auto word = parse_vector_pairs("0 0 1 0 0 1\n1 0 0 0 one 0\n");
  ASSERT_FALSE(word.ok());
  EXPECT_EQ(word.error().line, 2);
  EXPECT_EQ(word.error().column, 9);
  const auto count = parse_vector_pairs("0 0 1 0 0\n");
  ASSERT_FALSE(count.ok());
  EXPECT_EQ(count.error().line, 1);
  const auto zero = parse_vector_pairs("0 0 1 0 0 1\n0 0 0 1 0 0\n");
  ASSERT_FALSE(zero.ok());
  EXPECT_EQ(zero.error().line, 2);
  EXPECT_EQ(zero.error().column, 1);
  const auto weight = parse_vector_pairs("0 0 1 0 0 1 -1\n");
  ASSERT_FALSE(weight.ok());
  EXPECT_EQ(weight.error().column, 13);
  EXPECT_FALSE(parse_vector_pairs("# nothing\n\n").ok());
}

}  // namespace
}  // namespace attiscope
