// intake_test.cpp: the paste reader against the corpus in tests/intake/corpus.txt (every
// form the reader takes, with the expected top reading and rotation, and every error class
// with the place it must name), plus the body-axes sentence and the column finder.
#include "attiscope/core/intake.hpp"

#include <charconv>
#include <cstring>
#include <fstream>
#include <sstream>

#include "attiscope/core/columns.hpp"
#include "support/check.hpp"

namespace attiscope {
namespace {

/// Corpus rotations are compared to this (radians).
constexpr double kCorpusTolerance = 1e-9;
/// Rounded printouts (six digits) are compared to this.
constexpr double kRoundedTolerance = 1e-5;

struct Entry {
  std::string name;
  std::vector<std::string> top;  // accepted "kind layout" of the first reading
  std::string rotation;
  std::string ambiguous;
  std::string translation;
  std::string error;
  std::string text;
};

std::string trim(const std::string& s) {
  const auto a = s.find_first_not_of(' ');
  const auto b = s.find_last_not_of(' ');
  return a == std::string::npos ? "" : s.substr(a, b - a + 1);
}

std::vector<Entry> load_corpus() {
  std::ifstream in(std::string(ATTISCOPE_SOURCE_DIR) + "/tests/intake/corpus.txt");
  EXPECT_TRUE(in.good()) << "cannot open the corpus";
  std::vector<Entry> out;
  std::string line;
  bool in_text = false;
  while (std::getline(in, line)) {
    if (line.rfind("=== ", 0) == 0) {
      if (!out.empty() && !out.back().text.empty()) out.back().text.pop_back();  // last newline
      out.push_back({});
      out.back().name = line.substr(4);
      in_text = false;
      continue;
    }
    if (out.empty()) continue;
    Entry& e = out.back();
    if (in_text) {
      e.text += line + "\n";
    } else if (line == "text:") {
      in_text = true;
    } else if (line.rfind("top: ", 0) == 0) {
      std::stringstream ss(line.substr(5));
      std::string part;
      while (std::getline(ss, part, '|')) e.top.push_back(trim(part));
    } else if (line.rfind("rotation: ", 0) == 0) {
      e.rotation = line.substr(10);
    } else if (line.rfind("ambiguous: ", 0) == 0) {
      e.ambiguous = line.substr(11);
    } else if (line.rfind("translation: ", 0) == 0) {
      e.translation = line.substr(13);
    } else if (line.rfind("error: ", 0) == 0) {
      e.error = line.substr(7);
    }
  }
  if (!out.empty() && !out.back().text.empty()) out.back().text.pop_back();
  return out;
}

// "quat-wxyz 1 0 0 0", "euler intrinsic ZYX deg 90 5 10", "rotvec 0 0 1", "axis-angle 0 0 1 45".
Rotation expected_rotation(const std::string& spec) {
  std::stringstream ss(spec);
  std::string as;
  ss >> as;
  ExplicitReadingOptions o;
  std::string rest;
  if (as == "euler") {
    std::string kind, seq, unit;
    ss >> kind >> seq >> unit;
    auto c = parse_euler_sequence(seq, kind == "intrinsic" ? EulerKind::Intrinsic : EulerKind::Extrinsic);
    EXPECT_TRUE(c.ok());
    o.euler = c.value();
    o.unit = unit == "deg" ? AngleUnit::Degrees : AngleUnit::Radians;
  }
  std::getline(ss, rest);
  auto r = read_explicit(rest, *parse_reading_kind(as), o);
  EXPECT_TRUE(r.ok()) << spec;
  return r.ok() ? r.value().rotation : Rotation();
}

std::string label(const Reading& r) {
  return intake_kind_name(r.kind) + " " + r.layout;
}

TEST(IntakeTest, CorpusHasEveryFormAndEightyEntries) {
  const auto corpus = load_corpus();
  EXPECT_GE(corpus.size(), 80u);
}

void CheckEntry(const Entry& e) {
  SCOPED_TRACE(e.name + ":\n" + e.text);
  auto res = read_pasted(e.text);
  ASSERT_TRUE(res.ok()) << res.error().describe();
  const IntakeResult& r = res.value();
  ASSERT_FALSE(r.readings.empty());
  const std::string top = label(r.readings.front());
  EXPECT_NE(std::find(e.top.begin(), e.top.end(), top), e.top.end()) << "top reading was " << top;
  // Scores are in [0, 1] and sorted best first.
  for (std::size_t i = 0; i < r.readings.size(); ++i) {
    EXPECT_GE(r.readings[i].score, 0.0);
    EXPECT_LE(r.readings[i].score, 1.0);
    if (i > 0) {
      EXPECT_LE(r.readings[i].score, r.readings[i - 1].score);
    }
    EXPECT_FALSE(r.readings[i].why.empty());
    EXPECT_FALSE(r.readings[i].body_axes.empty());
  }
  if (!e.ambiguous.empty()) {
    EXPECT_EQ(r.ambiguous, e.ambiguous == "yes");
  }
  // The rotation of the reading the corpus names first (it is the top one when the text
  // decides; in an ambiguous set it must be listed).
  const Reading* named = nullptr;
  for (const Reading& rd : r.readings) {
    if (label(rd) == e.top.front()) {
      named = &rd;
      break;
    }
  }
  ASSERT_NE(named, nullptr) << "no reading " << e.top.front();
  const bool rounded = e.name.find("numpy") != std::string::npos ||
                       e.name.find("right-aligned") != std::string::npos ||
                       e.name.find("small-defect") != std::string::npos;
  EXPECT_TRUE(test::RotationNear(named->rotation, expected_rotation(e.rotation),
                                 rounded ? kRoundedTolerance : kCorpusTolerance));
  if (!e.translation.empty()) {
    std::stringstream ss(e.translation);
    Eigen::Vector3d t;
    ss >> t.x() >> t.y() >> t.z();
    ASSERT_TRUE(named->translation.has_value());
    EXPECT_TRUE(test::MatrixNear(*named->translation, t, kCorpusTolerance));
  }
}

TEST(IntakeTest, CorpusTopReadingAndRotation) {
  for (const Entry& e : load_corpus()) {
    if (e.error.empty()) CheckEntry(e);
  }
}

TEST(IntakeTest, CorpusErrorsNameThePlace) {
  for (const Entry& e : load_corpus()) {
    if (e.error.empty()) continue;
    SCOPED_TRACE(e.name + ":\n" + e.text);
    std::stringstream ss(e.error);
    int line = 0, column = 0;
    std::string words;
    ss >> line >> column;
    std::getline(ss, words);
    auto res = read_pasted(e.text);
    ASSERT_FALSE(res.ok()) << "expected an error";
    EXPECT_EQ(res.error().line, line);
    EXPECT_EQ(res.error().column, column);
    EXPECT_NE(res.error().message.find(trim(words)), std::string::npos) << res.error().message;
  }
}

TEST(IntakeTest, SmallMatrixDefectWarnsInDegrees) {
  auto res = read_pasted("0.7071 -0.7071 0\n0.7071 0.7071 0\n0 0 1");
  ASSERT_TRUE(res.ok());
  const Reading& r = res.value().readings.front();
  ASSERT_FALSE(r.warnings.empty());
  EXPECT_NE(r.warnings.front().find("degrees"), std::string::npos);
  ASSERT_TRUE(r.matrix_check.has_value());
  EXPECT_GT(r.matrix_check->orthonormality_defect, 0.0);
}

TEST(IntakeTest, HousePreferenceBreaksTies) {
  IntakePreferences prefs;
  prefs.quat_layout = QuatLayout::ScalarLast;
  auto res = read_pasted("0.5 -0.5 0.5 0.5", prefs);
  ASSERT_TRUE(res.ok());
  EXPECT_EQ(res.value().readings.front().layout, "xyzw");
  EXPECT_TRUE(res.value().ambiguous);
  prefs.quat_layout = QuatLayout::ScalarFirst;
  res = read_pasted("0.5 -0.5 0.5 0.5", prefs);
  EXPECT_EQ(res.value().readings.front().layout, "wxyz");
  prefs.matrix_storage = MatrixStorage::Columns;
  res = read_pasted("0 -1 0 1 0 0 0 0 1", prefs);
  EXPECT_EQ(res.value().readings.front().layout, "columns");
}

TEST(IntakeTest, BodyAxesInWords) {
  // 90 degrees about z: body x along world +y, body y along world -x (common practice).
  const Rotation r(Eigen::Quaterniond(std::sqrt(0.5), 0, 0, std::sqrt(0.5)));
  EXPECT_EQ(describe_body_axes(r),
            "body x points along world +y; body y points along world -x; body z points along world +z");
  // Yaw 90, pitch -5 (nose up 5 degrees in ZYX with z up: R_y(-5) tips x toward +z).
  const Rotation up = from_euler(EulerConvention{}, Eigen::Vector3d(M_PI / 2, -5 * M_PI / 180, 0));
  EXPECT_EQ(describe_body_axes(up).substr(0, 43), "body x points near world +y, 5.0 degrees up");
}

TEST(IntakeTest, TrackIsRecognised) {
  const std::string text = "t,qw,qx,qy,qz\n0.00,1,0,0,0\n0.01,0.99995,0.01,0,0\n0.02,0.9998,0.02,0,0\n";
  auto res = read_pasted(text);
  ASSERT_TRUE(res.ok()) << res.error().describe();
  ASSERT_TRUE(res.value().track.has_value());
  EXPECT_EQ(res.value().track_rows, 3u);
}

TEST(ColumnsTest, TimeStepsBeyondAnyIntegerAreNamedInTheNote) {
  // Found by the intake fuzzer: a time step of about 1e110 went through a cast to long long
  // for the unit note, undefined behaviour that the sanitizer build stops on. The reading
  // must go on, and the note must give the step as a number. Invented values.
  struct Case {
    std::string times[5];
    std::string step;
  };
  const Case cases[] = {
      {{"0.00", std::string(110, '1') + "0.01", "", "", ""}, "1.1111111111111111e+110"},
      {{"0", "-1.7e308", "1.7e308", "-1.7e308", "1.7e308"}, "inf"},
  };
  for (const Case& c : cases) {
    std::string text = "t,qw,qx,qy,qz\n";
    for (const std::string& t : c.times) {
      if (!t.empty()) text += t + ",1,0,0,0\n";
    }
    auto m = find_columns(text);
    ASSERT_TRUE(m.ok()) << m.error().describe();
    EXPECT_EQ(m.value().time_unit, "ns");
    bool named = false;
    for (const std::string& n : m.value().notes)
      named |= n.find("about " + c.step + " ") != std::string::npos;
    EXPECT_TRUE(named) << text;
    auto track = read_track_text(text, m.value());
    EXPECT_TRUE(track.ok()) << text;
    // Two rows are too few for a track, so the paste reader may refuse them as one
    // reading; when it does, it must name the place.
    auto pasted = read_pasted(text);
    if (!pasted.ok()) {
      EXPECT_GT(pasted.error().line, 0) << pasted.error().describe();
    }
  }
}

TEST(ColumnsTest, StatisticsWithoutHeader) {
  // Invented log: time in milliseconds, a quaternion scalar last, an id column.
  std::string text;
  for (int i = 0; i < 50; ++i) {
    const double a = 0.01 * (i - 25);
    text += std::to_string(1000 + 10 * i) + " " + std::to_string(std::sin(a)) + " 0 0 " +
            std::to_string(std::cos(a)) + " 7\n";
  }
  auto m = find_columns(text);
  ASSERT_TRUE(m.ok()) << m.error().describe();
  EXPECT_EQ(m.value().time_column, 0);
  EXPECT_EQ(m.value().time_unit, "ms");
  EXPECT_EQ(m.value().rotation_columns[0], 4);  // w is the never-negative last column
  auto track = read_track_text(text, m.value());
  ASSERT_TRUE(track.ok());
  EXPECT_EQ(track.value().size(), 50u);
  EXPECT_NEAR(track.value().time_s[1] - track.value().time_s[0], 0.01, 1e-12);
}

TEST(ColumnsTest, BadRowsAreListedWithLineNumbers) {
  const std::string text =
      "time,qw,qx,qy,qz\n0,1,0,0,0\n0.1,1,0,zero,0\n0.2,1,0,0\n0.3,0,0,0,0\n0.4,1,0,0,0\n";
  auto m = find_columns(text);
  ASSERT_TRUE(m.ok());
  auto track = read_track_text(text, m.value());
  ASSERT_TRUE(track.ok());
  EXPECT_EQ(track.value().size(), 2u);
  ASSERT_EQ(track.value().bad_rows.size(), 3u);
  EXPECT_EQ(track.value().bad_rows[0].line, 3u);
  EXPECT_EQ(track.value().bad_rows[1].line, 4u);
  EXPECT_EQ(track.value().bad_rows[2].line, 5u);
}

TEST(ColumnsTest, MatrixColumnsByStatistics) {
  std::mt19937 rng(test::kSeed);
  std::string text;
  std::vector<Rotation> truth;
  for (int i = 0; i < 20; ++i) {
    const Rotation r = test::RandomRotation(rng);
    truth.push_back(r);
    const Eigen::Matrix3d m = r.matrix();
    char buf[512];
    std::snprintf(buf, sizeof buf, "%d;%.17g;%.17g;%.17g;%.17g;%.17g;%.17g;%.17g;%.17g;%.17g\n", i, m(0, 0),
                  m(0, 1), m(0, 2), m(1, 0), m(1, 1), m(1, 2), m(2, 0), m(2, 1), m(2, 2));
    text += buf;
  }
  auto m = find_columns(text);
  ASSERT_TRUE(m.ok()) << m.error().describe();
  EXPECT_EQ(m.value().form, TrackForm::MatrixRows);
  EXPECT_TRUE(m.value().ambiguous);
  auto track = read_track_text(text, m.value());
  ASSERT_TRUE(track.ok());
  ASSERT_EQ(track.value().size(), 20u);
  for (std::size_t i = 0; i < 20; ++i) {
    const Track& t = track.value();
    EXPECT_TRUE(
        test::RotationNear(Rotation(Eigen::Quaterniond(t.qw[i], t.qx[i], t.qy[i], t.qz[i])), truth[i], 1e-12))
        << "seed " << test::kSeed << " row " << i;
  }
}

}  // namespace
}  // namespace attiscope

namespace attiscope {
namespace {

TEST(ColumnsTest, FastNumberPathIsBitIdenticalToFromChars) {
  // The bulk reader's fast path (Clinger's exact case) must give the very double that
  // std::from_chars gives for the same text.
  std::mt19937 rng(test::kSeed);
  std::uniform_real_distribution<double> mag(-6.0, 6.0);
  std::uniform_int_distribution<int> prec(0, 17);
  std::vector<std::string> fields;
  std::string text;
  for (int row = 0; row < 4000; ++row) {
    text += std::to_string(row);
    for (int k = 0; k < 4; ++k) {
      const double v = (rng() % 2 ? -1.0 : 1.0) * std::pow(10.0, mag(rng)) * (k == 0 ? 1.0 : 0.3);
      char buf[64];
      std::snprintf(buf, sizeof buf, "%.*f", prec(rng), v);
      fields.push_back(buf);
      text += std::string(",") + buf;
    }
    text += "\n";
  }
  ColumnMapping m;
  m.delimiter = ',';
  m.column_count = 5;
  m.time_column = 0;
  m.rotation_columns = {1, 2, 3, 4, 0, 0, 0, 0, 0};
  auto track = read_track_text(text, m);
  ASSERT_TRUE(track.ok());
  const Track& t = track.value();
  std::size_t row = 0;
  std::size_t f = 0;
  for (std::size_t i = 0; i < t.size(); ++i, ++row) {
    const std::vector<double>* cols[4] = {&t.qw, &t.qx, &t.qy, &t.qz};
    for (int k = 0; k < 4; ++k, ++f) {
      double ref = 0;
      std::from_chars(fields[f].data(), fields[f].data() + fields[f].size(), ref);
      EXPECT_EQ(std::memcmp(&ref, &(*cols[k])[i], sizeof ref), 0)
          << fields[f] << " seed " << test::kSeed << " row " << row;
    }
  }
  EXPECT_EQ(t.bad_rows.size(), 0u);
}

}  // namespace
}  // namespace attiscope
