// json_lines_test.cpp: pose logs written as one JSON object per line (columns.hpp): the
// column finder takes the keys of the first object as the header, the reader finds each
// line's numbers by key in any order, and a line that cannot be read is listed with its line
// number and the reason, never dropped silently.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>
#include <string>

#include "attiscope/core/columns.hpp"
#include "support/check.hpp"
#include "support/track_gen.hpp"

namespace attiscope {
namespace {

// The lines are written by nlohmann::json's dump, an independent JSON writer whose numbers
// round-trip (it prints the shortest text that reads back to the same double).
std::string JsonLine(double t, double w, double x, double y, double z) {
  nlohmann::json j;
  j["t"] = t;
  j["qw"] = w;
  j["qx"] = x;
  j["qy"] = y;
  j["qz"] = z;
  return j.dump();
}

TEST(JsonLinesTest, ReadsBackTheWrittenNumbersExactly) {
  const Track t = test::RandomWalkTrack(500, 100.0, test::kSeed, 1.0);
  std::string text;
  for (std::size_t i = 0; i < t.size(); ++i)
    text += JsonLine(t.time_s[i], t.qw[i], t.qx[i], t.qy[i], t.qz[i]) + "\n";
  auto m = find_columns(text);
  ASSERT_TRUE(m) << m.error().describe();
  EXPECT_TRUE(m.value().json_lines);
  // nlohmann::json orders object keys alphabetically by default: the time key comes last.
  EXPECT_EQ(m.value().json_keys, (std::vector<std::string>{"qw", "qx", "qy", "qz", "t"}));
  EXPECT_EQ(m.value().time_column, 4);
  auto r = read_track_text(text, m.value());
  ASSERT_TRUE(r) << r.error().describe();
  const Track& got = r.value();
  ASSERT_EQ(got.size(), t.size());
  EXPECT_TRUE(got.bad_rows.empty());
  EXPECT_TRUE(got.has_time);
  for (std::size_t i = 0; i < t.size(); ++i) {
    ASSERT_EQ(got.time_s[i], t.time_s[i]) << "sample " << i;
    ASSERT_EQ(got.qw[i], t.qw[i]) << "sample " << i;
    ASSERT_EQ(got.qx[i], t.qx[i]) << "sample " << i;
    ASSERT_EQ(got.qy[i], t.qy[i]) << "sample " << i;
    ASSERT_EQ(got.qz[i], t.qz[i]) << "sample " << i;
  }
}

TEST(JsonLinesTest, NestedKeysInAnyOrderAndOtherValuesIgnored) {
  // Scalar-last keys in a nested object, time in milliseconds, a string, an array and a null
  // beside them; the second line lists its keys in another order.
  const std::string text =
      "# invented test log\n"
      "{\"stamp_ms\": 0, \"note\": \"start, \\\"quoted\\\"\", \"orientation\": {\"x\": 0, \"y\": 0, \"z\": "
      "0, "
      "\"w\": 1}, \"flags\": [1, [2, {\"a\": 3}]], \"ok\": true, \"gps\": null}\n"
      "{\"orientation\": {\"w\": 0.70710678118654757, \"z\": 0.70710678118654757, \"y\": 0, \"x\": 0}, "
      "\"stamp_ms\": 20}\n"
      "{\"stamp_ms\": 40, \"orientation\": {\"x\": 0, \"y\": 0, \"z\": 1, \"w\": 0}}\n";
  auto m = find_columns(text);
  ASSERT_TRUE(m) << m.error().describe();
  EXPECT_TRUE(m.value().json_lines);
  EXPECT_EQ(m.value().time_unit, "ms");
  auto r = read_track_text(text, m.value());
  ASSERT_TRUE(r) << r.error().describe();
  const Track& t = r.value();
  ASSERT_EQ(t.size(), 3u) << (t.bad_rows.empty() ? "" : t.bad_rows[0].reason);
  EXPECT_EQ(t.skipped_lines, 1u);
  EXPECT_DOUBLE_EQ(t.time_s[1], 0.02);
  EXPECT_DOUBLE_EQ(t.time_s[2], 0.04);
  // Sample 1: 90 degrees about z (w = z = sqrt(1/2)); sample 2: 180 degrees about z.
  EXPECT_EQ(t.qw[1], 0.70710678118654757);
  EXPECT_EQ(t.qz[1], 0.70710678118654757);
  EXPECT_EQ(t.qw[2], 0.0);
  EXPECT_EQ(t.qz[2], 1.0);
}

TEST(JsonLinesTest, BadLinesAreCountedAndNamedAndTheRestLoads) {
  std::string text;
  std::vector<std::size_t> bad_lines;
  std::size_t line = 0;
  auto add = [&](const std::string& l, bool bad) {
    text += l + "\n";
    ++line;
    if (bad) bad_lines.push_back(line);
  };
  for (int i = 0; i < 40; ++i) {
    add(JsonLine(0.01 * i, 1, 0, 0, 0), false);
    if (i == 10) add("{\"t\": 0.105, \"qw\": 1, \"qx\": 0, \"qy\": 0", true);                    // cut short
    if (i == 20) add("{\"t\": 0.205, \"qw\": 1, \"qx\": 0, \"qy\": 0}", true);                   // no qz
    if (i == 25) add("{\"t\": 0.255, \"qw\": \"one\", \"qx\": 0, \"qy\": 0, \"qz\": 0}", true);  // a string
    if (i == 30) add("0.305, 1, 0, 0, 0", true);                                                 // not JSON
    if (i == 35) add("{\"t\": 0.355, \"qw\": 0, \"qx\": 0, \"qy\": 0, \"qz\": 0}", true);        // zero
  }
  auto m = find_columns(text);
  ASSERT_TRUE(m) << m.error().describe();
  auto r = read_track_text(text, m.value());
  ASSERT_TRUE(r) << r.error().describe();
  const Track& t = r.value();
  EXPECT_EQ(t.size(), 40u);
  ASSERT_EQ(t.bad_rows.size(), bad_lines.size());
  for (std::size_t k = 0; k < bad_lines.size(); ++k) EXPECT_EQ(t.bad_rows[k].line, bad_lines[k]) << k;
  EXPECT_NE(t.bad_rows[0].reason.find("column"), std::string::npos) << t.bad_rows[0].reason;
  EXPECT_NE(t.bad_rows[1].reason.find("'qz'"), std::string::npos) << t.bad_rows[1].reason;
  EXPECT_NE(t.bad_rows[2].reason.find("'qw'"), std::string::npos) << t.bad_rows[2].reason;
  EXPECT_NE(t.bad_rows[3].reason.find("not a JSON object"), std::string::npos) << t.bad_rows[3].reason;
  EXPECT_NE(t.bad_rows[4].reason.find("zero"), std::string::npos) << t.bad_rows[4].reason;
}

TEST(JsonLinesTest, MalformedFirstObjectNamesLineAndColumn) {
  const std::string text = "\n{\"t\": 0, \"qw\": }\n";
  auto m = find_columns(text);
  ASSERT_FALSE(m);
  EXPECT_EQ(m.error().line, 2);
  EXPECT_EQ(m.error().column, 16);  // the '}' where a value should be
}

}  // namespace
}  // namespace attiscope
