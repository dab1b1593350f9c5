// mount_report_test.cpp: a mount check from inputs to its JSON and text.
#include "attiscope/core/mount_report.hpp"

#include <cmath>

#include "attiscope/core/euler.hpp"
#include "support/check.hpp"

namespace attiscope {
namespace {

TEST(MountReportTest, RunsFromVectorsToAVerdict) {
  MountInputs in;
  in.nominal = read_mount_text("x aft, z down", {}, in.names).value();
  // Sensor x aft, z down: gravity (vehicle down) reads +z, vehicle forward reads -x.
  in.vectors = std::vector<VectorPair>{{Eigen::Vector3d(0, 0, 9.81), Eigen::Vector3d(0, 0, 1), 1.0, 1},
                                       {Eigen::Vector3d(-1, 0, 0), Eigen::Vector3d(1, 0, 0), 1.0, 2}};
  const auto r = run_mount_check(in);
  ASSERT_TRUE(r.ok()) << r.error().describe();
  ASSERT_TRUE(r->check.has_value());
  EXPECT_FALSE(r->refused());
  EXPECT_FALSE(r->failed());
  EXPECT_LT(r->check->error_rad, 1e-12);
  const nlohmann::json j = mount_json(r.value());
  EXPECT_EQ(j["within_tolerance"], true);
  EXPECT_EQ(j["residuals_deg"].size(), 2u);
  EXPECT_TRUE(j["unobservable"].is_null());
  const std::string text = mount_report_text(r.value(), 6, "2026-01-02 03:04 UTC");
  EXPECT_NE(text.find("date          2026-01-02 03:04 UTC"), std::string::npos);
  EXPECT_NE(text.find(kMountCaution), std::string::npos);
}

TEST(MountReportTest, RefusalAndInputErrors) {
  MountInputs in;
  in.vectors = std::vector<VectorPair>{{Eigen::Vector3d(0, 0, 1), Eigen::Vector3d(0, 0, 1), 1.0, 4}};
  const auto r = run_mount_check(in);
  ASSERT_TRUE(r.ok());
  EXPECT_TRUE(r->refused());
  EXPECT_EQ(r->vector_lines, std::vector<int>{4});
  const nlohmann::json j = mount_json(r.value());
  EXPECT_TRUE(j["mount"].is_null());
  EXPECT_TRUE(j["unobservable"].is_string());
  EXPECT_EQ(j["caution"], kMountCaution);
  MountInputs neither;
  EXPECT_FALSE(run_mount_check(neither).ok());
  MountInputs both = in;
  both.measured = MountReading{};
  EXPECT_FALSE(run_mount_check(both).ok());
}

}  // namespace
}  // namespace attiscope
