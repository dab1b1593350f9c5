// Tests of track_report.hpp: the `track --json` object carries design.md's keys with the
// diagnosis' content, and the table says the same.
#include "attiscope/core/track_report.hpp"

#include <gtest/gtest.h>

#include "support/check.hpp"
#include "support/track_gen.hpp"

namespace attiscope {
namespace {

Track Demo() {
  Track t = test::TrackFromEuler(EulerConvention{}, 1000, 0.01, [](double time) {
    return Eigen::Vector3d(150.3 + 10.0 * time, 5.0, 2.0);  // yaw crosses 180 at t = 2.97
  });
  test::ScaleSamples(&t, 600, t.size(), -1.0);
  t.bad_rows.push_back({17, "4 numbers expected, found 3"});
  t.columns = {{"t", "time"},
               {"qw", "quaternion w"},
               {"qx", "quaternion x"},
               {"qy", "quaternion y"},
               {"qz", "quaternion z"}};
  return t;
}

TEST(TrackReportTest, JsonHasTheDesignKeys) {
  const Track t = Demo();
  TrackDiagnosisOptions o;
  const TrackDiagnosis d = diagnose_track(t, o);
  const nlohmann::json j = track_json(t, d, o);
  for (const char* key : {"samples", "bad_rows", "events", "columns", "duration_s"}) {
    EXPECT_TRUE(j.contains(key)) << key;
  }
  EXPECT_EQ(j["samples"], 1000);
  ASSERT_EQ(j["bad_rows"].size(), 1u);
  EXPECT_EQ(j["bad_rows"][0]["line"], 17);
  EXPECT_EQ(j["bad_rows"][0]["reason"], "4 numbers expected, found 3");
  ASSERT_EQ(j["events"].size(), 2u);
  EXPECT_EQ(j["events"][0]["sample"], 298);  // 150.3 + 10 * 2.98 = 180.1
  EXPECT_EQ(j["events"][0]["kind"], "wrap");
  EXPECT_EQ(j["events"][0]["angle"], 1);
  EXPECT_EQ(j["events"][1]["sample"], 600);
  EXPECT_EQ(j["events"][1]["kind"], "sign_flip");
  EXPECT_EQ(j["columns"].size(), 5u);
  EXPECT_EQ(j["columns"][0]["role"], "time");
  EXPECT_NEAR(j["duration_s"].get<double>(), 9.99, 1e-12);
  EXPECT_EQ(j["counts"]["wrap"], 1);
  EXPECT_EQ(j["counts"]["fast_motion"], 0);
  EXPECT_TRUE(j["options"]["rate_limit_deg_s"].is_null());

  const std::string table = track_table(t, d, o);
  EXPECT_NE(table.find("samples       1000 (1 bad rows)"), std::string::npos) << table;
  EXPECT_NE(table.find("line 17: 4 numbers expected"), std::string::npos) << table;
  EXPECT_NE(table.find("sign_flip"), std::string::npos) << table;
}

TEST(TrackReportTest, TableListsAtMostMaxRows) {
  Track t = Demo();
  for (std::size_t i = 700; i < 800; i += 2) test::ScaleSamples(&t, i, i + 1, -1.0);
  TrackDiagnosisOptions o;
  const TrackDiagnosis d = diagnose_track(t, o);
  ASSERT_GT(d.events.size(), 40u);
  const std::string table = track_table(t, d, o, std::nullopt, 10);
  EXPECT_NE(table.find("... " + std::to_string(d.events.size() - 10) + " more"), std::string::npos) << table;
  EXPECT_EQ(track_json(t, d, o)["events"].size(), d.events.size());
}

}  // namespace
}  // namespace attiscope
