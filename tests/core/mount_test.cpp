// mount_test.cpp: the 24 axis-aligned mounts and their words, trim, and the mount check's
// error words and classifier.
#include "attiscope/core/mount.hpp"

#include <cmath>
#include <cstdio>
#include <set>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/matrix.hpp"
#include "support/check.hpp"

namespace attiscope {
namespace {

using test::kSeed;

constexpr double kDeg = M_PI / 180.0;
const VehicleAxes kFrd{};

std::string numbers_text(std::initializer_list<double> values) {
  std::string s;
  for (double v : values) {
    char buf[40];
    std::snprintf(buf, sizeof buf, "%.17g ", v);
    s += buf;
  }
  return s;
}

TEST(MountTest, TwentyFourAxisAlignedMounts) {
  const std::vector<AxisAlignedMount> all = axis_aligned_mounts(kFrd);
  ASSERT_EQ(all.size(), 24u);
  EXPECT_TRUE(test::RotationNear(all[0].vehicle_R_sensor, Rotation::identity(), 1e-15));
  EXPECT_EQ(all[0].name, "sensor x toward vehicle forward, sensor z down");
  std::set<std::string> names;
  for (std::size_t i = 0; i < all.size(); ++i) {
    const Eigen::Matrix3d m = all[i].vehicle_R_sensor.matrix();
    // A signed permutation with det +1 (the rotation group of the cube; common practice).
    EXPECT_TRUE(test::MatrixNear(m.cwiseAbs().rowwise().sum(), Eigen::Vector3d::Ones(), 1e-15));
    EXPECT_NEAR(m.determinant(), 1.0, 1e-15);
    for (std::size_t j = 0; j < i; ++j) {
      EXPECT_GT(geodesic_angle(all[i].vehicle_R_sensor, all[j].vehicle_R_sensor), 89.0 * kDeg)
          << i << " " << j;
    }
    names.insert(all[i].name);
    // Each name reads back as its own rotation.
    const auto back = parse_axis_aligned_mount(all[i].name, kFrd);
    ASSERT_TRUE(back.ok()) << all[i].name << ": " << back.error().describe();
    EXPECT_TRUE(test::RotationNear(back.value(), all[i].vehicle_R_sensor, 1e-15)) << all[i].name;
  }
  EXPECT_EQ(names.size(), 24u);
}

TEST(MountTest, WordsGiveTheColumns) {
  // vehicle_R_sensor's columns are the sensor axes in vehicle coordinates: x aft, z down
  // leaves y = z cross x = left (FRD).
  const Rotation r = parse_axis_aligned_mount("sensor x toward vehicle aft, sensor z down", kFrd).value();
  Eigen::Matrix3d expected;
  expected << -1, 0, 0, 0, -1, 0, 0, 0, 1;
  EXPECT_TRUE(test::MatrixNear(r.matrix(), expected, 1e-15));
  for (const char* same : {"x aft z down", "x=aft, z=down", "z down, x aft",
                           "x toward vehicle -x; z toward +z", "y left, x rear", "-x forward, z bottom"}) {
    const auto other = parse_axis_aligned_mount(same, kFrd);
    ASSERT_TRUE(other.ok()) << same << ": " << other.error().describe();
    EXPECT_TRUE(test::RotationNear(other.value(), r, 1e-15)) << same;
  }
  // The vehicle's own naming decides the axes: in FLU, "down" is vehicle -z.
  const Rotation flu = parse_axis_aligned_mount("x aft, z down", parse_vehicle_axes("FLU").value()).value();
  EXPECT_TRUE(test::MatrixNear(flu.matrix().col(2), Eigen::Vector3d(0, 0, -1), 1e-15));
}

TEST(MountTest, WordErrorsNameTheColumn) {
  const auto same_line = parse_axis_aligned_mount("x aft, y forward", kFrd);
  ASSERT_FALSE(same_line.ok());
  EXPECT_EQ(same_line.error().column, 10);
  const auto mirror = parse_axis_aligned_mount("x forward, y right, z up", kFrd);
  ASSERT_FALSE(mirror.ok());
  EXPECT_NE(mirror.error().message.find("left-handed"), std::string::npos);
  EXPECT_EQ(mirror.error().column, 21);
  const auto word = parse_axis_aligned_mount("x sideways", kFrd);
  ASSERT_FALSE(word.ok());
  EXPECT_EQ(word.error().column, 3);
  EXPECT_FALSE(parse_axis_aligned_mount("x forward", kFrd).ok());
  EXPECT_FALSE(parse_axis_aligned_mount("x forward, z", kFrd).ok());
  EXPECT_FALSE(parse_axis_aligned_mount("forward", kFrd).ok());
  EXPECT_TRUE(looks_like_mount_words("x aft z down"));
  EXPECT_FALSE(looks_like_mount_words("0.5 0.5 0.5 0.5"));
  EXPECT_FALSE(looks_like_mount_words("30deg 0 0"));
}

TEST(MountTest, TrimTurnsAboutVehicleAxes) {
  const Rotation base = parse_axis_aligned_mount("x aft z down", kFrd).value();
  const Rotation trimmed = trimmed_mount(base, Eigen::Vector3d(0, 0.5, 0) * kDeg);
  EXPECT_NEAR(geodesic_angle(base, trimmed), 0.5 * kDeg, 1e-15);
  const Rotation error = trimmed * base.inverse();
  EXPECT_TRUE(test::RotationNear(error, elementary_rotation(Axis::Y, 0.5 * kDeg), 1e-15));
}

TEST(MountTest, ErrorInVehicleWords) {
  // Measured 2.1 degrees nose down from nominal, FRD: the example sentence.
  const Rotation nominal = parse_axis_aligned_mount("x forward z down", kFrd).value();
  const Rotation measured = elementary_rotation(Axis::Y, -2.1 * kDeg) * nominal;
  const MountCheck c = check_mount(nominal, measured, 0.5 * kDeg, kFrd);
  EXPECT_NEAR(c.error_rad, 2.1 * kDeg, 1e-12);
  EXPECT_EQ(c.error_words, "2.1 degrees about the vehicle's pitch axis (y, right), nose down");
  EXPECT_FALSE(c.within_tolerance);
  EXPECT_EQ(c.verdict, MountVerdict::Misaligned);
  EXPECT_NEAR(c.error_turns[1].angle_rad, -2.1 * kDeg, 1e-12);
  EXPECT_EQ(c.error_turns[1].sense, "nose down");
  const MountCheck pass = check_mount(nominal, measured, 2.5 * kDeg, kFrd);
  EXPECT_TRUE(pass.within_tolerance);
  EXPECT_EQ(pass.verdict, MountVerdict::WithinTolerance);
}

// A nominal mount with no symmetry: a random rotation, so its inverse, transpose and
// re-ordered readings are all different rotations.
Rotation generic_nominal(std::mt19937& rng) {
  for (;;) {
    const Rotation r = test::RandomRotation(rng);
    if (geodesic_angle(r, Rotation::identity()) > 40 * kDeg) return r;
  }
}

MountCheck classify(const Rotation& nominal, const std::string& text, ReadingKind kind,
                    const ExplicitReadingOptions& options) {
  const Rotation measured = read_explicit(text, kind, options).value().rotation;
  return check_mount(nominal, measured, 0.5 * kDeg, kFrd, alternative_readings(text, kind, options, false));
}

// A misreading only needs explaining when it changes the rotation: with yaw close to roll,
// reversing the angle order gives almost the same rotation. Such draws are skipped (and
// counted, so the test cannot pass by skipping everything).
bool distinguishable(const MountCheck& c) {
  return c.error_rad > 5 * kDeg;
}

TEST(MountTest, ClassifierNamesInverseTransposeAndLayout) {
  std::mt19937 rng(kSeed + 11);
  const ExplicitReadingOptions options;
  for (int n = 0; n < 50; ++n) {
    const Rotation nominal = generic_nominal(rng);
    const Eigen::Quaterniond q = nominal.quaternion();
    // Inverted: the calibration wrote vehicle-to-sensor.
    const Eigen::Quaterniond qi = nominal.inverse().quaternion();
    const MountCheck inv =
        classify(nominal, numbers_text({qi.w(), qi.x(), qi.y(), qi.z()}), ReadingKind::QuatWxyz, options);
    ASSERT_EQ(inv.verdict, MountVerdict::ConventionMistake) << "seed " << kSeed + 11 << " n " << n;
    EXPECT_EQ(inv.explanations.front().label.rfind("the other direction", 0), 0u)
        << inv.explanations.front().label;
    EXPECT_LT(inv.explanations.front().error_rad, 1e-9);
    // Transposed: the matrix was written with rows and columns swapped.
    const Eigen::Matrix3d m = nominal.matrix();
    const MountCheck tr = classify(
        nominal,
        numbers_text({m(0, 0), m(1, 0), m(2, 0), m(0, 1), m(1, 1), m(2, 1), m(0, 2), m(1, 2), m(2, 2)}),
        ReadingKind::MatrixRows, options);
    ASSERT_EQ(tr.verdict, MountVerdict::ConventionMistake) << "n " << n;
    EXPECT_EQ(tr.explanations.front().label.rfind("the transpose", 0), 0u) << tr.explanations.front().label;
    // Quaternion layout: x y z w numbers read as w x y z.
    const MountCheck lay =
        classify(nominal, numbers_text({q.x(), q.y(), q.z(), q.w()}), ReadingKind::QuatWxyz, options);
    ASSERT_EQ(lay.verdict, MountVerdict::ConventionMistake) << "n " << n;
    EXPECT_EQ(lay.explanations.front().label, "the other quaternion layout (x y z w, scalar last)");
  }
}

TEST(MountTest, ClassifierNamesEulerReorderings) {
  std::mt19937 rng(kSeed + 12);
  ExplicitReadingOptions zyx;  // intrinsic ZYX, degrees
  EulerConvention xyz;
  xyz.axes = {Axis::X, Axis::Y, Axis::Z};
  EulerConvention extrinsic_zyx;
  extrinsic_zyx.kind = EulerKind::Extrinsic;
  int checked = 0;
  for (int n = 0; n < 50; ++n) {
    const Rotation nominal = generic_nominal(rng);
    // Written in XYZ but read as ZYX: the sequence reversed.
    const Eigen::Vector3d a = to_euler(nominal, xyz).angles_rad / kDeg;
    const MountCheck seq = classify(nominal, numbers_text({a(0), a(1), a(2)}), ReadingKind::Euler, zyx);
    const Eigen::Vector3d b = to_euler(nominal, EulerConvention{}).angles_rad / kDeg;
    const MountCheck rev = classify(nominal, numbers_text({b(2), b(1), b(0)}), ReadingKind::Euler, zyx);
    const Eigen::Vector3d c = to_euler(nominal, extrinsic_zyx).angles_rad / kDeg;
    const MountCheck kind = classify(nominal, numbers_text({c(0), c(1), c(2)}), ReadingKind::Euler, zyx);
    if (!distinguishable(seq) || !distinguishable(rev) || !distinguishable(kind)) continue;
    ++checked;
    ASSERT_EQ(seq.verdict, MountVerdict::ConventionMistake) << "seed " << kSeed + 12 << " n " << n;
    EXPECT_EQ(seq.explanations.front().label.rfind("the sequence reversed", 0), 0u)
        << seq.explanations.front().label;
    // ZYX angles listed roll, pitch, yaw instead of yaw, pitch, roll.
    ASSERT_EQ(rev.verdict, MountVerdict::ConventionMistake) << "n " << n;
    EXPECT_EQ(rev.explanations.front().label.rfind("the angles listed in reverse order", 0), 0u)
        << rev.explanations.front().label;
    // Extrinsic angles read as intrinsic.
    ASSERT_EQ(kind.verdict, MountVerdict::ConventionMistake) << "n " << n;
    EXPECT_EQ(kind.explanations.front().label.rfind("the angles as extrinsic ZYX", 0), 0u)
        << kind.explanations.front().label;
  }
  EXPECT_GE(checked, 40);
}

TEST(MountTest, NinetyDegreeMixUpWithoutAnExplanation) {
  // A sensor axis mix-up that no re-reading of the numbers explains: the measured mount is
  // the nominal turned 90 degrees about the vehicle's yaw axis.
  const Rotation nominal = parse_axis_aligned_mount("x aft z down", kFrd).value();
  const Rotation measured = elementary_rotation(Axis::Z, 90.4 * kDeg) * nominal;
  const MountCheck c = check_mount(nominal, measured, 1.0 * kDeg, kFrd);
  EXPECT_EQ(c.verdict, MountVerdict::LikelyAxisMixUp);
  EXPECT_NEAR(c.nearest_reorientation_rad, 0.4 * kDeg, 1e-9);
  EXPECT_NEAR(c.reorientation_angle_rad, 90 * kDeg, 1e-9);
  // A plain 3-degree error is not a mix-up.
  const MountCheck plain =
      check_mount(nominal, elementary_rotation(Axis::X, 3 * kDeg) * nominal, 1.0 * kDeg, kFrd);
  EXPECT_EQ(plain.verdict, MountVerdict::Misaligned);
  EXPECT_TRUE(plain.explanations.empty());
}

TEST(MountTest, RealMisalignmentIsNotBlamedOnAConvention) {
  std::mt19937 rng(kSeed + 13);
  const ExplicitReadingOptions options;
  for (int n = 0; n < 50; ++n) {
    const Rotation nominal = generic_nominal(rng);
    const Rotation measured = nominal * elementary_rotation(Axis::Y, 2.0 * kDeg);
    const Eigen::Quaterniond q = measured.quaternion();
    const MountCheck c =
        classify(nominal, numbers_text({q.w(), q.x(), q.y(), q.z()}), ReadingKind::QuatWxyz, options);
    EXPECT_EQ(c.verdict, MountVerdict::Misaligned)
        << "seed " << kSeed + 13 << " n " << n << " " << c.verdict_text;
  }
}

}  // namespace
}  // namespace attiscope

namespace attiscope {
namespace {

TEST(MountTextTest, WordsNumbersAndDirection) {
  const PoseTextOptions guess;  // no reading given: the paste reader's top reading
  const auto words = read_mount_text("x aft, z down", guess, kFrd);
  ASSERT_TRUE(words.ok());
  EXPECT_TRUE(words->words);
  EXPECT_TRUE(test::RotationNear(words->vehicle_R_sensor, elementary_rotation(Axis::Z, M_PI), 1e-15));
  const auto quat = read_mount_text("0.9 0.3 0.2 0.1", guess, kFrd);
  ASSERT_TRUE(quat.ok());
  EXPECT_FALSE(quat->words);
  EXPECT_FALSE(quat->warnings.empty());  // the guess is said
  const auto inverted = read_mount_text("0.9 0.3 0.2 0.1", guess, kFrd, true);
  EXPECT_TRUE(test::RotationNear(inverted->vehicle_R_sensor, quat->vehicle_R_sensor.inverse(), 1e-15));
  // The inverse of an inverted entry is the entry as written.
  bool found = false;
  for (const AlternativeReading& a : inverted->alternatives) {
    if (a.label.rfind("the other direction", 0) == 0) {
      found = true;
      EXPECT_TRUE(test::RotationNear(a.vehicle_R_sensor, quat->vehicle_R_sensor, 1e-15));
    }
  }
  EXPECT_TRUE(found);
  PoseTextOptions as_quaternion;
  as_quaternion.as = ReadingKind::QuatWxyz;
  const auto bad = read_mount_text("0.9 0.3 0.2", as_quaternion, kFrd);
  ASSERT_FALSE(bad.ok());
  EXPECT_EQ(bad.error().line, 1);
  EXPECT_FALSE(read_mount_text("1 2", guess, kFrd).ok());
}

}  // namespace
}  // namespace attiscope
