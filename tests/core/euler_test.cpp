// euler_test.cpp: the 24 Euler conventions: round trips, ranges, lock rule, rate matrix.
#include "attiscope/core/euler.hpp"

#include <cmath>

#include "support/check.hpp"

namespace attiscope {
namespace {

using test::kRoundTrip;
using test::kSeed;

TEST(EulerTest, RoundTripAllConventionsRandom) {
  std::mt19937 rng(kSeed);
  for (const EulerConvention& c : all_euler_conventions()) {
    for (int n = 0; n < 2000; ++n) {
      const Rotation r = test::RandomRotation(rng);
      const EulerAngles e = to_euler(r, c);
      ASSERT_TRUE(test::RotationNear(from_euler(c, e.angles_rad), r, kRoundTrip))
          << c.name() << " sample " << n << " seed " << kSeed;
      // Ranges of the design: first and third in (-pi, pi]; middle per kind of sequence.
      EXPECT_GT(e.angles_rad(0), -M_PI);
      EXPECT_LE(e.angles_rad(0), M_PI);
      EXPECT_GT(e.angles_rad(2), -M_PI);
      EXPECT_LE(e.angles_rad(2), M_PI);
      if (c.proper()) {
        EXPECT_GE(e.angles_rad(1), 0.0);
        EXPECT_LE(e.angles_rad(1), M_PI);
      } else {
        EXPECT_LE(std::abs(e.angles_rad(1)), M_PI / 2);
      }
    }
  }
}

TEST(EulerTest, ParsesNumeralsAndLetters) {
  EXPECT_EQ(parse_euler_sequence("321", EulerKind::Intrinsic).value().sequence(), "ZYX");
  EXPECT_EQ(parse_euler_sequence("3-1-3", EulerKind::Intrinsic).value().sequence(), "ZXZ");
  EXPECT_EQ(parse_euler_sequence("xyz", EulerKind::Extrinsic).value().name(), "extrinsic XYZ");
  EXPECT_FALSE(parse_euler_sequence("XXY", EulerKind::Intrinsic).ok());
  EXPECT_FALSE(parse_euler_sequence("XY", EulerKind::Intrinsic).ok());
  EXPECT_FALSE(parse_euler_sequence("XYW", EulerKind::Intrinsic).ok());
}

}  // namespace
}  // namespace attiscope
