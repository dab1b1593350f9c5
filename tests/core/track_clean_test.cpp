// Tests of track_clean.hpp: the clean copy removes sign flips and normalises, lists every
// change, and its CSV export in every representation and convention re-reads to the same
// rotations (1e-12 rad) with no sign flips.
#include "attiscope/core/track_clean.hpp"

#include <gtest/gtest.h>

#include <charconv>
#include <sstream>
#include <string>
#include <vector>

#include "attiscope/core/track_analysis.hpp"
#include "support/check.hpp"
#include "support/track_gen.hpp"

namespace attiscope {
namespace {

// Splits the CSV this test just wrote (header, then rows of numbers) into numbers. Only for
// checking the export; logs are read by the intake's reader.
struct Csv {
  std::string header;
  std::vector<std::vector<double>> rows;
};

Csv SplitCsv(const std::string& text) {
  Csv csv;
  std::istringstream in(text);
  std::getline(in, csv.header);
  std::string line;
  while (std::getline(in, line)) {
    std::vector<double> row;
    const char* p = line.data();
    const char* end = p + line.size();
    while (p < end) {
      double v = 0.0;
      const auto r = std::from_chars(p, end, v);
      EXPECT_EQ(r.ec, std::errc()) << "bad number in: " << line;
      row.push_back(v);
      p = r.ptr;
      if (p < end && *p == ',') ++p;
      if (r.ec != std::errc()) break;
    }
    csv.rows.push_back(row);
  }
  return csv;
}

Track FaultyTrack() {
  Track t = test::RandomWalkTrack(3000, 100.0, test::kSeed, 1.5);
  test::ScaleSamples(&t, 400, t.size(), -1.0);
  test::ScaleSamples(&t, 1000, 1100, -1.0);
  test::ScaleSamples(&t, 2000, 2001, 1.3);
  test::ScaleSamples(&t, 2500, 2502, 0.9);
  return t;
}

TEST(TrackCleanTest, RemovesSignFlipsNormalisesAndListsTheChanges) {
  const Track raw = FaultyTrack();
  const CleanTrack clean = clean_track(raw);
  ASSERT_EQ(clean.track.size(), raw.size());

  std::vector<std::pair<std::size_t, CleanChangeKind>> got;
  for (const CleanChange& c : clean.changes) got.emplace_back(c.sample, c.kind);
  const std::vector<std::pair<std::size_t, CleanChangeKind>> want = {{400, CleanChangeKind::SignFlipped},
                                                                     {1100, CleanChangeKind::SignFlipped},
                                                                     {2000, CleanChangeKind::Normalised},
                                                                     {2500, CleanChangeKind::Normalised}};
  EXPECT_EQ(got, want) << "seed " << test::kSeed;
  ASSERT_EQ(clean.changes.size(), want.size());
  EXPECT_EQ(clean.changes[0].count, 600u);   // 400..999 negated
  EXPECT_EQ(clean.changes[1].count, 1900u);  // 1100..2999 negated
  EXPECT_NEAR(clean.changes[2].value, 1.3, 1e-12);
  EXPECT_EQ(clean.changes[3].count, 2u);            // 2500 and 2501, one run
  EXPECT_NEAR(clean.changes[3].value, 0.9, 1e-12);  // the norm it had

  // Same rotations, unit norm, no sign flips and no non-unit samples left.
  for (std::size_t i = 0; i < raw.size(); ++i) {
    const Rotation a(Eigen::Quaterniond(raw.qw[i], raw.qx[i], raw.qy[i], raw.qz[i]));
    const Eigen::Quaterniond qc(clean.track.qw[i], clean.track.qx[i], clean.track.qy[i], clean.track.qz[i]);
    ASSERT_NEAR(qc.norm(), 1.0, 1e-15) << "sample " << i;
    ASSERT_TRUE(test::RotationNear(a, Rotation(qc), 1e-15)) << "sample " << i;
  }
  TrackDiagnosisOptions o;
  o.unit_tolerance = 1e-14;
  for (const TrackEvent& e : diagnose_track(clean.track, o).events) {
    EXPECT_NE(e.kind, TrackEventKind::SignFlip) << "sample " << e.sample;
    EXPECT_NE(e.kind, TrackEventKind::NonUnit) << "sample " << e.sample;
  }
}

TEST(TrackCleanTest, UnwrapAddsWholeTurnsAndListsThem) {
  const double d = M_PI / 180.0;
  std::vector<double> a = {170 * d, -170 * d, -150 * d, 170 * d, 175 * d};
  std::vector<double> c = {0.0, 10 * d, -10 * d, 20 * d, 30 * d};
  std::vector<CleanChange> changes;
  unwrap_euler(a, c, &changes);
  const std::vector<double> want = {170 * d, 190 * d, 210 * d, 170 * d, 175 * d};
  for (std::size_t i = 0; i < a.size(); ++i) EXPECT_NEAR(a[i], want[i], 1e-15) << i;
  EXPECT_NEAR(c[2], -10 * d, 1e-15);  // 20 degree steps are motion, not wraps
  ASSERT_EQ(changes.size(), 2u);
  EXPECT_EQ(changes[0].sample, 1u);
  EXPECT_EQ(changes[0].value, 1.0);
  EXPECT_EQ(changes[1].sample, 3u);
  EXPECT_EQ(changes[1].value, -1.0);
}

// Every export re-reads to the clean track's rotations to 1e-12 rad.
class TrackExportTest : public ::testing::Test {
 protected:
  void SetUp() override { clean_ = clean_track(FaultyTrack()).track; }

  Csv Export(const TrackExportOptions& o, std::vector<CleanChange>* changes = nullptr) {
    std::ostringstream out;
    const auto n = write_track_csv(out, clean_, o, changes);
    EXPECT_TRUE(n.ok());
    const Csv csv = SplitCsv(out.str());
    EXPECT_EQ(csv.header, track_csv_header(o));
    EXPECT_EQ(csv.rows.size(), clean_.size());
    return csv;
  }

  Rotation Clean(std::size_t i) const {
    return Rotation(Eigen::Quaterniond(clean_.qw[i], clean_.qx[i], clean_.qy[i], clean_.qz[i]));
  }

  Track clean_;
};

TEST_F(TrackExportTest, QuaternionInEveryConventionRereadsSignContinuous) {
  for (const QuatConvention& qc : all_quat_conventions()) {
    TrackExportOptions o;
    o.representation = ExportRepresentation::Quaternion;
    o.quaternion = qc;
    const Csv csv = Export(o);
    for (std::size_t i = 0; i < csv.rows.size(); ++i) {
      const auto& r = csv.rows[i];
      ASSERT_EQ(r.size(), 5u);
      ASSERT_EQ(r[0], clean_.time_s[i]);  // 17 digits: the time is exact
      auto back = from_quaternion_numbers({r[1], r[2], r[3], r[4]}, qc);
      ASSERT_TRUE(back.ok());
      ASSERT_TRUE(test::RotationNear(back.value(), Clean(i), test::kRoundTrip))
          << qc.describe() << " row " << i;
      if (i > 0) {
        const auto& p = csv.rows[i - 1];
        const double dot = p[1] * r[1] + p[2] * r[2] + p[3] * r[3] + p[4] * r[4];
        ASSERT_GT(dot, 0.0) << "sign flip in the export at row " << i << ", " << qc.describe();
      }
    }
  }
}

TEST_F(TrackExportTest, EulerInAll24ConventionsRereadsUnwrapped) {
  for (const EulerConvention& c : all_euler_conventions()) {
    for (AngleUnit unit : {AngleUnit::Degrees, AngleUnit::Radians}) {
      TrackExportOptions o;
      o.representation = ExportRepresentation::Euler;
      o.euler = c;
      o.unit = unit;
      const double to_rad = unit == AngleUnit::Degrees ? M_PI / 180.0 : 1.0;
      std::vector<CleanChange> changes;
      const Csv csv = Export(o, &changes);
      for (std::size_t i = 0; i < csv.rows.size(); ++i) {
        const auto& r = csv.rows[i];
        ASSERT_EQ(r.size(), 4u);
        const Rotation back = from_euler(c, Eigen::Vector3d(r[1], r[2], r[3]) * to_rad);
        ASSERT_TRUE(test::RotationNear(back, Clean(i), test::kRoundTrip)) << c.name() << " row " << i;
        if (i > 0) {
          // Unwrapped: the first and third angles never step by more than half a turn.
          ASSERT_LE(std::abs(r[1] - csv.rows[i - 1][1]) * to_rad, M_PI) << c.name() << " row " << i;
          ASSERT_LE(std::abs(r[3] - csv.rows[i - 1][3]) * to_rad, M_PI) << c.name() << " row " << i;
        }
      }
      // The tumbling track wraps in every convention; each unwrap step is listed.
      EXPECT_FALSE(changes.empty()) << c.name();
      for (const CleanChange& ch : changes) EXPECT_EQ(ch.kind, CleanChangeKind::EulerUnwrapped);
    }
  }
}

TEST_F(TrackExportTest, MatrixInEveryStorageAndDirectionRereads) {
  for (Direction dir : {Direction::BodyToWorld, Direction::WorldToBody}) {
    for (MatrixStorage st : {MatrixStorage::Rows, MatrixStorage::Columns}) {
      TrackExportOptions o;
      o.representation = ExportRepresentation::Matrix;
      o.matrix.direction = dir;
      o.matrix.storage = st;
      const Csv csv = Export(o);
      for (std::size_t i = 0; i < csv.rows.size(); ++i) {
        const auto& r = csv.rows[i];
        ASSERT_EQ(r.size(), 10u);
        std::array<double, 9> m{};
        std::copy(r.begin() + 1, r.end(), m.begin());
        auto back = from_matrix(matrix_from_numbers(m, st), dir);
        ASSERT_TRUE(back.ok());
        ASSERT_TRUE(test::RotationNear(back.value(), Clean(i), test::kRoundTrip))
            << o.matrix.describe() << " row " << i;
      }
    }
  }
}

TEST(TrackExportHeaderTest, NamesSayTheConvention) {
  TrackExportOptions o;
  EXPECT_EQ(track_csv_header(o), "t_s,qw,qx,qy,qz");
  o.quaternion.layout = QuatLayout::ScalarLast;
  o.quaternion.algebra = QuatAlgebra::Jpl;
  EXPECT_EQ(track_csv_header(o), "t_s,qx_jpl,qy_jpl,qz_jpl,qw_jpl");
  o.representation = ExportRepresentation::Euler;
  o.euler = parse_euler_sequence("ZXZ", EulerKind::Extrinsic).value();
  EXPECT_EQ(track_csv_header(o), "t_s,extrinsic_ZXZ_1_Z_deg,extrinsic_ZXZ_2_X_deg,extrinsic_ZXZ_3_Z_deg");
  o.representation = ExportRepresentation::Matrix;
  o.matrix.storage = MatrixStorage::Columns;
  EXPECT_EQ(track_csv_header(o), "t_s,r11,r21,r31,r12,r22,r32,r13,r23,r33");
}

}  // namespace
}  // namespace attiscope
