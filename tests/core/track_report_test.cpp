// Tests of track_report.hpp: the `track --json` object carries design.md's keys with the
// diagnosis' content, and the table says the same.
#include "attiscope/core/track_report.hpp"

#include <gtest/gtest.h>
#include <unistd.h>

#include <atomic>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "attiscope/core/atomic_file.hpp"

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

/// A folder of its own for the export tests (the process id keeps runs side by side apart).
std::filesystem::path ExportFolder(const std::string& name) {
  const auto dir = std::filesystem::temp_directory_path() /
                   ("attiscope_export_" + name + "_" + std::to_string(static_cast<long>(::getpid())));
  std::filesystem::remove_all(dir);
  std::filesystem::create_directories(dir);
  return dir;
}

std::string ReadAll(const std::filesystem::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

std::size_t FilesIn(const std::filesystem::path& dir) {
  std::size_t n = 0;
  for (const auto& e : std::filesystem::directory_iterator(dir)) n += e.is_regular_file() ? 1 : 0;
  return n;
}

/// Enough samples for many 64 KiB blocks of CSV rows.
Track LongDemo() {
  return test::TrackFromEuler(EulerConvention{}, 20000, 0.01, [](double time) {
    return Eigen::Vector3d(150.3 + 10.0 * time, 5.0 * std::sin(time), 2.0);
  });
}

TEST(TrackReportTest, StreamedExportIsTheCsvOfTheCleanCopy) {
  const Track t = LongDemo();
  const auto dir = ExportFolder("stream");
  const std::string out = (dir / "clean.csv").string();
  std::size_t calls = 0, last_done = 0, last_total = 0;
  bool increasing = true;
  auto r = export_clean_track(t, TrackExportOptions{}, out, [&](std::size_t done, std::size_t total) {
    increasing = increasing && done >= last_done;
    last_done = done;
    last_total = total;
    ++calls;
  });
  ASSERT_TRUE(r) << r.error().describe();
  // The same bytes as write_track_csv of clean_track into memory (the two-step path).
  std::ostringstream expected;
  std::vector<CleanChange> changes = clean_track(t).changes;
  ASSERT_TRUE(write_track_csv(expected, clean_track(t).track, TrackExportOptions{}, &changes));
  EXPECT_EQ(ReadAll(out), expected.str());
  EXPECT_EQ(r.value().changes.size(), changes.size());
  EXPECT_GT(calls, 2u) << "progress should come block by block";
  EXPECT_TRUE(increasing);
  EXPECT_EQ(last_done, t.size());
  EXPECT_EQ(last_total, t.size());
  EXPECT_EQ(FilesIn(dir), 1u) << "a temporary file was left beside the export";
  std::filesystem::remove_all(dir);
}

TEST(TrackReportTest, CancelledExportLeavesTheOldFileUntouched) {
  const Track t = LongDemo();
  const auto dir = ExportFolder("cancel");
  const auto out = dir / "clean.csv";
  std::ofstream(out) << "the previous export\n";
  std::atomic<bool> cancel{false};
  std::size_t calls = 0;
  auto r = export_clean_track(
      t, TrackExportOptions{}, out.string(),
      [&](std::size_t, std::size_t) {
        if (++calls == 2) cancel.store(true);  // part of the rows are in the temporary file
      },
      &cancel);
  ASSERT_FALSE(r) << "a cancelled export reported success";
  EXPECT_NE(r.error().message.find("cancelled"), std::string::npos) << r.error().message;
  EXPECT_EQ(ReadAll(out), "the previous export\n");
  EXPECT_EQ(FilesIn(dir), 1u) << "the temporary file was not removed";
  std::filesystem::remove_all(dir);
}

TEST(TrackReportTest, FailedStreamedSaveLeavesTheOldFileUntouched) {
  const auto dir = ExportFolder("fail");
  const auto out = dir / "setup.csv";
  std::ofstream(out) << "old\n";
  // The filler writes a good part, then fails (as a failed conversion or a full disk would).
  auto r = write_file_atomically_streamed(out.string(), [](std::ostream& s) -> Expected<bool> {
    for (int k = 0; k < 100000; ++k) s << "0.123456789,0.987654321\n";
    return Error{"the rows could not be made"};
  });
  ASSERT_FALSE(r);
  EXPECT_EQ(r.error().message, "the rows could not be made");
  EXPECT_EQ(ReadAll(out), "old\n");
  EXPECT_EQ(FilesIn(dir), 1u);
  // And a save into a folder that does not exist fails without creating anything.
  const auto missing = dir / "no_such_folder" / "x.csv";
  auto e = export_clean_track(LongDemo(), TrackExportOptions{}, missing.string());
  ASSERT_FALSE(e);
  EXPECT_NE(e.error().message.find(missing.string()), std::string::npos) << e.error().message;
  EXPECT_FALSE(std::filesystem::exists(missing));
  std::filesystem::remove_all(dir);
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
