// columns_parallel_test.cpp: a log long enough to be read in parts on several threads gives
// exactly what one pass gives: the same samples bit for bit, the same bad rows with the same
// line numbers, the same skipped-line count, sample-index times continuing across parts.
#include <atomic>
#include <cstdio>
#include <cstring>
#include <random>
#include <string>

#include "attiscope/core/columns.hpp"
#include "support/check.hpp"

namespace attiscope {
namespace {

/// Bytes of rows above which the reader uses more than one thread (columns.cpp reads in
/// parts from 4 MB on); the tests make logs well beyond it.
constexpr std::size_t kLongLogBytes = std::size_t{9} << 20;

/// One block of an invented log: good rows, a bad number, a short row, a zero quaternion,
/// comments, blank lines and CRLF endings, in no tidy order.
std::string block(std::mt19937& rng, bool with_time) {
  std::normal_distribution<double> n(0.0, 1.0);
  std::string out;
  char line[200];
  for (int i = 0; i < 400; ++i) {
    const double q[4] = {n(rng), n(rng), n(rng), n(rng)};
    if (with_time) {
      std::snprintf(line, sizeof line, "%.3f,%.9f,%.9f,%.9f,%.9f", 0.001 * i, q[0], q[1], q[2], q[3]);
    } else {
      std::snprintf(line, sizeof line, "%.9f,%.9f,%.9f,%.9f", q[0], q[1], q[2], q[3]);
    }
    out += line;
    const int kind = static_cast<int>(rng() % 97);
    if (kind == 0) out += ",extra";                                 // wrong field count
    if (kind == 1) out += "\n# a comment line";                     // skipped
    if (kind == 2) out += "\n";                                     // a blank line follows
    if (kind == 3) out += with_time ? "\n1,0,0,x,0" : "\n0,0,x,0";  // not a number
    if (kind == 4) out += with_time ? "\n1,0,0,0,0" : "\n0,0,0,0";  // zero quaternion
    out += (rng() % 5 == 0) ? "\r\n" : "\n";
  }
  return out;
}

ColumnMapping mapping(bool with_time) {
  ColumnMapping m;
  m.delimiter = ',';
  m.header_lines = 1;
  m.column_count = with_time ? 5 : 4;
  m.time_column = with_time ? 0 : -1;
  m.rotation_columns = with_time ? std::array<int, 9>{1, 2, 3, 4, 0, 0, 0, 0, 0}
                                 : std::array<int, 9>{0, 1, 2, 3, 0, 0, 0, 0, 0};
  return m;
}

/// Counts the lines of a text as the reader numbers them.
std::size_t line_count(const std::string& s) {
  std::size_t n = 0;
  for (char c : s) n += c == '\n';
  return n + (!s.empty() && s.back() != '\n');
}

void expect_same_bits(const std::vector<double>& a, const std::vector<double>& b, const char* what) {
  ASSERT_EQ(a.size(), b.size()) << what;
  EXPECT_EQ(std::memcmp(a.data(), b.data(), a.size() * sizeof(double)), 0) << what;
}

TEST(ColumnsParallelTest, LongLogReadsAsOnePassWould) {
  for (bool with_time : {true, false}) {
    // Each variant moves the cut between the parts to another place inside a block.
    for (std::size_t pad : {0u, 1u, 37u}) {
      std::mt19937 rng(test::kSeed + static_cast<unsigned>(pad));
      const std::string header = std::string(with_time ? "t,qw,qx,qy,qz" : "qw,qx,qy,qz") + "\n";
      const std::string b = std::string(pad, '#') + "\n" + block(rng, with_time);
      // The reference: one block read alone (short: one thread), repeated in expectation.
      const ColumnMapping m = mapping(with_time);
      const Expected<Track> one = read_track_text(header + b, m);
      ASSERT_TRUE(one.ok());
      const std::size_t block_lines = line_count(b);
      const std::size_t copies = kLongLogBytes / b.size() + 1;
      std::string text = header;
      for (std::size_t k = 0; k < copies; ++k) text += b;
      std::size_t progress_calls = 0;
      std::size_t last_done = 0;
      const ReadProgress progress = [&](std::size_t done, std::size_t total) {
        ++progress_calls;
        EXPECT_GE(done, last_done);
        EXPECT_LE(done, total);
        last_done = done;
      };
      const Expected<Track> all = read_track_text(text, m, progress);
      ASSERT_TRUE(all.ok());
      const Track& a = all.value();
      const Track& o = one.value();
      Track want;
      for (std::size_t k = 0; k < copies; ++k) {
        for (std::size_t s = 0; s < o.size(); ++s) {
          want.time_s.push_back(with_time ? o.time_s[s] : static_cast<double>(k * o.size() + s));
          want.qw.push_back(o.qw[s]);
          want.qx.push_back(o.qx[s]);
          want.qy.push_back(o.qy[s]);
          want.qz.push_back(o.qz[s]);
        }
        for (const BadRow& r : o.bad_rows) want.bad_rows.push_back({r.line + k * block_lines, r.reason});
      }
      expect_same_bits(a.time_s, want.time_s, "time");
      expect_same_bits(a.qw, want.qw, "qw");
      expect_same_bits(a.qx, want.qx, "qx");
      expect_same_bits(a.qy, want.qy, "qy");
      expect_same_bits(a.qz, want.qz, "qz");
      ASSERT_EQ(a.bad_rows.size(), want.bad_rows.size());
      for (std::size_t r = 0; r < a.bad_rows.size(); ++r) {
        EXPECT_EQ(a.bad_rows[r].line, want.bad_rows[r].line) << "bad row " << r << " seed " << test::kSeed;
        EXPECT_EQ(a.bad_rows[r].reason, want.bad_rows[r].reason) << "bad row " << r;
      }
      EXPECT_EQ(a.skipped_lines, copies * o.skipped_lines);
      EXPECT_GT(progress_calls, 1u);
      EXPECT_EQ(last_done, text.size());
    }
  }
}

TEST(ColumnsParallelTest, CancelStopsEveryPart) {
  std::mt19937 rng(test::kSeed);
  const std::string b = block(rng, true);
  std::string text = "t,qw,qx,qy,qz\n";
  while (text.size() < kLongLogBytes) text += b;
  std::atomic<bool> cancel{true};
  const Expected<Track> t = read_track_text(text, mapping(true), {}, &cancel);
  ASSERT_FALSE(t.ok());
  EXPECT_NE(t.error().message.find("cancelled"), std::string::npos);
}

}  // namespace
}  // namespace attiscope
