// convention_file_test.cpp: the convention file: round trips of every field, comments on
// every key, warnings for unknown keys, malformed fixtures with line and column, and
// atomic saves that never lose the old file.
#include "attiscope/core/convention_file.hpp"

#include <sys/resource.h>
#include <sys/stat.h>
#include <unistd.h>

#include <csignal>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "support/check.hpp"

namespace attiscope {
namespace {

namespace fs = std::filesystem;

std::string fixture(const std::string& name) {
  return std::string(ATTISCOPE_SOURCE_DIR) + "/tests/core/fixtures/conventions/" + name;
}

bool same(const HouseConvention& a, const HouseConvention& b) {
  return a.name == b.name && a.description == b.description && a.world == b.world && a.body == b.body &&
         a.front_name == b.front_name && a.right_name == b.right_name &&
         a.euler.convention == b.euler.convention && a.euler.names == b.euler.names &&
         a.euler.print_order == b.euler.print_order && a.euler.unit == b.euler.unit &&
         a.euler.ranges == b.euler.ranges && a.quaternion == b.quaternion &&
         a.matrix.direction == b.matrix.direction && a.matrix.storage == b.matrix.storage &&
         a.precision == b.precision;
}

void expect_round_trip(const HouseConvention& c, const std::string& what) {
  const std::string text = convention_to_toml(c);
  auto back = parse_convention(text);
  ASSERT_TRUE(back.ok()) << what << ": " << back.error().describe() << "\n" << text;
  EXPECT_TRUE(back.value().warnings.empty()) << what;
  EXPECT_TRUE(same(back.value().convention, c)) << what << "\n" << text;
}

/// A folder of its own under the system's temporary folder, removed at the end.
class TempDir {
 public:
  TempDir() {
    std::string templ = (fs::temp_directory_path() / "attiscope-conv-XXXXXX").string();
    path_ = mkdtemp(templ.data());
  }
  ~TempDir() {
    ::chmod(path_.c_str(), 0755);
    std::error_code ec;
    fs::remove_all(path_, ec);
  }
  const std::string& path() const { return path_; }

 private:
  std::string path_;
};

std::string slurp(const std::string& path) {
  std::ifstream in(path);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

TEST(ConventionFileTest, RoundTripEveryField) {
  expect_round_trip(HouseConvention{}, "defaults");
  HouseConvention c;
  c.name = "Quotes \" and \\ backslash, tab\t, unicode \u00b0";
  c.description = "Line one\nline two";
  expect_round_trip(c, "texts");
  for (const FrameAxes& w : {world_enu(), world_ned(), FrameAxes{{"south", "up", "west"}, {"S", "U", "W"}}}) {
    c = HouseConvention{};
    c.world = w;
    expect_round_trip(c, "world " + w.directions[0]);
  }
  for (const FrameAxes& b :
       {body_flu(), body_frd(), body_camera_rdf(), FrameAxes{{"up", "back", "right"}, {"u", "b", "r"}}}) {
    c = HouseConvention{};
    c.body = b;
    c.front_name = "bow";
    c.right_name = "starboard side";
    expect_round_trip(c, "body " + b.directions[0]);
  }
  for (const EulerConvention& e : all_euler_conventions()) {
    c = HouseConvention{};
    c.euler.convention = e;
    c.euler.ranges = {AngleRange::ZeroTo360, AngleRange::Standard, AngleRange::ZeroTo360};
    expect_round_trip(c, e.name());
  }
  const std::array<std::array<int, 3>, 6> orders{
      {{0, 1, 2}, {0, 2, 1}, {1, 0, 2}, {1, 2, 0}, {2, 0, 1}, {2, 1, 0}}};
  for (const auto& order : orders) {
    c = HouseConvention{};
    c.euler.names = {"azimuth", "elevation", "twist"};
    c.euler.print_order = order;
    c.euler.unit = AngleUnit::Radians;
    expect_round_trip(c, "print order");
  }
  for (const QuatConvention& q : all_quat_conventions()) {
    c = HouseConvention{};
    c.quaternion = q;
    expect_round_trip(c, q.describe());
  }
  for (Direction d : {Direction::BodyToWorld, Direction::WorldToBody}) {
    for (MatrixStorage s : {MatrixStorage::Rows, MatrixStorage::Columns}) {
      c = HouseConvention{};
      c.matrix = {d, s};
      expect_round_trip(c, c.matrix.describe());
    }
  }
  for (int p : {1, 9, 17}) {
    c = HouseConvention{};
    c.precision = p;
    expect_round_trip(c, "precision");
  }
}

TEST(ConventionFileTest, EveryKeyHasACommentAndEveryFieldADefault) {
  const std::string text = convention_to_toml(HouseConvention{});
  std::istringstream in(text);
  std::string line, previous;
  int keys = 0;
  while (std::getline(in, line)) {
    if (!line.empty() && line[0] != '#' && line[0] != '[') {
      ++keys;
      EXPECT_EQ(previous.rfind("# ", 0), 0u) << "no comment above: " << line;
    }
    previous = line;
  }
  EXPECT_EQ(keys, 22);  // every key of the schema
  // An empty file is the default convention.
  auto empty = parse_convention("");
  ASSERT_TRUE(empty.ok());
  EXPECT_TRUE(same(empty.value().convention, HouseConvention{}));
  // A partial file keeps the defaults of what it leaves out.
  auto partial = parse_convention("[euler]\nunit = \"radians\"\n");
  ASSERT_TRUE(partial.ok());
  HouseConvention expected;
  expected.euler.unit = AngleUnit::Radians;
  EXPECT_TRUE(same(partial.value().convention, expected));
}

TEST(ConventionFileTest, CustomAxesWithoutNamesAreCalledXyz) {
  auto c = parse_convention("[world]\nframe = \"custom\"\naxes = [\"south\", \"up\", \"west\"]\n");
  ASSERT_TRUE(c.ok()) << c.error().describe();
  EXPECT_EQ(c.value().convention.world.names, (std::array<std::string, 3>{"x", "y", "z"}));
  auto ned = parse_convention("[world]\nframe = \"NED\"\n");
  ASSERT_TRUE(ned.ok());
  EXPECT_EQ(ned.value().convention.world.names, (std::array<std::string, 3>{"N", "E", "D"}));
}

TEST(ConventionFileTest, DemoConventionsLoadAndSayTheyAreInvented) {
  for (const char* f : {"orchard-rover.toml", "survey-aircraft.toml", "camera-rig.toml"}) {
    auto c = load_convention(std::string(ATTISCOPE_SOURCE_DIR) + "/assets/conventions/" + f);
    ASSERT_TRUE(c.ok()) << f << ": " << c.error().describe();
    EXPECT_TRUE(c.value().warnings.empty()) << f;
    EXPECT_NE(c.value().convention.name.find("invented"), std::string::npos) << f;
    EXPECT_NE(c.value().convention.description.find("invented"), std::string::npos) << f;
    // The committed file is exactly what the tool writes for it.
    EXPECT_EQ(convention_to_toml(c.value().convention),
              slurp(std::string(ATTISCOPE_SOURCE_DIR) + "/assets/conventions/" + f))
        << f;
  }
}

TEST(ConventionFileTest, UnknownKeysAreWarningsWithPlaces) {
  auto c = load_convention(fixture("warn-unknown-keys.toml"));
  ASSERT_TRUE(c.ok()) << c.error().describe();
  EXPECT_EQ(c.value().convention.name, "Unknown keys");
  const auto& w = c.value().warnings;
  ASSERT_EQ(w.size(), 3u);
  EXPECT_EQ(w[0].field, "colour");
  EXPECT_EQ(w[0].line, 3);
  EXPECT_EQ(w[0].column, 1);
  EXPECT_EQ(w[1].field, "euler.sequnce");
  EXPECT_EQ(w[1].line, 5);
  EXPECT_EQ(w[2].field, "extras");
  EXPECT_EQ(w[2].line, 6);
}

struct BadFixture {
  const char* file;
  int line;
  int column;  ///< 0: only the line is checked (the parser's own column for a syntax error)
  const char* says;
};

TEST(ConventionFileTest, MalformedFilesFailWithLineAndColumn) {
  // Places read off each fixture: the line of the offending text and the column where its
  // value (or list item) starts.
  const BadFixture cases[] = {
      {"bad-syntax.toml", 2, 0, "not a valid TOML file"},
      {"bad-duplicate-key.toml", 3, 0, "not a valid TOML file"},
      {"bad-type.toml", 3, 12, "expected a text"},
      {"bad-word.toml", 3, 8, "use one of \"intrinsic\", \"extrinsic\""},
      {"bad-sequence.toml", 3, 12, "ZZX"},
      {"bad-left-handed.toml", 4, 8, "left-handed"},
      {"bad-preset-axes.toml", 4, 8, "disagree with frame = \"FRD\""},
      {"bad-custom-no-axes.toml", 3, 9, "needs axes"},
      {"bad-direction.toml", 4, 20, "'port' is not a body direction"},
      {"bad-print-order.toml", 4, 33, "'heading' is not one of the angle names"},
      {"bad-print-twice.toml", 3, 24, "printed twice"},
      {"bad-range.toml", 3, 26, "not a range for the middle angle"},
      {"bad-precision.toml", 2, 13, "1 to 17"},
      {"bad-section.toml", 2, 9, "expected a table [world]"},
      {"bad-names.toml", 3, 9, "used twice"},
      {"bad-list-length.toml", 3, 9, "three texts"},
  };
  for (const BadFixture& f : cases) {
    auto c = load_convention(fixture(f.file));
    ASSERT_FALSE(c.ok()) << f.file;
    EXPECT_EQ(c.error().line, f.line) << f.file << ": " << c.error().describe();
    if (f.column > 0) {
      EXPECT_EQ(c.error().column, f.column) << f.file << ": " << c.error().describe();
    } else {
      EXPECT_GE(c.error().column, 1) << f.file;
    }
    EXPECT_NE(c.error().message.find(f.says), std::string::npos) << f.file << ": " << c.error().describe();
  }
  EXPECT_FALSE(load_convention(fixture("no-such-file.toml")).ok());
}

TEST(ConventionFileTest, SaveReplacesAndKeepsPermissions) {
  TempDir dir;
  const std::string path = dir.path() + "/house.toml";
  HouseConvention c;
  c.name = "first";
  ASSERT_TRUE(save_convention(path, c).ok());
  ::chmod(path.c_str(), 0640);
  c.name = "second";
  ASSERT_TRUE(save_convention(path, c).ok());
  EXPECT_EQ(load_convention(path).value().convention.name, "second");
  struct stat st {};
  ASSERT_EQ(::stat(path.c_str(), &st), 0);
  EXPECT_EQ(st.st_mode & 0777, 0640u);
  // No temporary file is left behind.
  int files = 0;
  for (const auto& e : fs::directory_iterator(dir.path())) {
    (void)e;
    ++files;
  }
  EXPECT_EQ(files, 1);
}

TEST(ConventionFileTest, SaveInterruptedBeforeRenameKeepsTheOldFile) {
  TempDir dir;
  const std::string path = dir.path() + "/house.toml";
  HouseConvention c;
  c.name = "old";
  ASSERT_TRUE(save_convention(path, c).ok());
  const std::string old_text = slurp(path);
  c.name = "new";
  std::string seen_temp;
  // The hook stands in for a crash between write and rename: the temporary file is
  // complete (it holds the new text) but the rename never happens.
  auto r = save_convention(path, c, [&](const std::string& temp) {
    seen_temp = temp;
    EXPECT_NE(slurp(temp).find("name = \"new\""), std::string::npos);
    EXPECT_EQ(fs::path(temp).parent_path(), fs::path(path).parent_path());  // same folder
    return false;
  });
  EXPECT_FALSE(r.ok());
  EXPECT_NE(r.error().message.find("old file is unchanged"), std::string::npos);
  EXPECT_EQ(slurp(path), old_text);
  EXPECT_FALSE(fs::exists(seen_temp));
}

TEST(ConventionFileTest, SaveIntoReadOnlyFolderKeepsTheOldFile) {
  TempDir dir;
  const std::string path = dir.path() + "/house.toml";
  HouseConvention c;
  c.name = "old";
  ASSERT_TRUE(save_convention(path, c).ok());
  const std::string old_text = slurp(path);
  ASSERT_EQ(::chmod(dir.path().c_str(), 0555), 0);
  if (::access(dir.path().c_str(), W_OK) == 0) {
    GTEST_SKIP() << "this user can write into a read-only folder (root): the permission case cannot be made";
  }
  c.name = "new";
  auto r = save_convention(path, c);
  EXPECT_FALSE(r.ok());
  EXPECT_NE(r.error().message.find("old file is unchanged"), std::string::npos) << r.error().message;
  EXPECT_EQ(slurp(path), old_text);
}

TEST(ConventionFileTest, SaveThatRunsOutOfSpaceKeepsTheOldFile) {
  // A full disk, made with a file-size limit (it also binds root, unlike folder
  // permissions): writing the temporary file fails halfway.
  TempDir dir;
  const std::string path = dir.path() + "/house.toml";
  HouseConvention c;
  c.name = "old";
  ASSERT_TRUE(save_convention(path, c).ok());
  const std::string old_text = slurp(path);
  c.name = "new";
  c.description = std::string(4096, 'x');
  rlimit saved{};
  ASSERT_EQ(::getrlimit(RLIMIT_FSIZE, &saved), 0);
  const auto old_handler = std::signal(SIGXFSZ, SIG_IGN);  // fail with EFBIG instead of a signal
  rlimit small = saved;
  small.rlim_cur = 512;
  ASSERT_EQ(::setrlimit(RLIMIT_FSIZE, &small), 0);
  auto r = save_convention(path, c);
  ::setrlimit(RLIMIT_FSIZE, &saved);
  std::signal(SIGXFSZ, old_handler);
  ASSERT_FALSE(r.ok());
  EXPECT_NE(r.error().message.find("old file is unchanged"), std::string::npos) << r.error().message;
  EXPECT_EQ(slurp(path), old_text);
  int files = 0;
  for (const auto& e : fs::directory_iterator(dir.path())) {
    (void)e;
    ++files;
  }
  EXPECT_EQ(files, 1);  // the partial temporary file was removed
}

TEST(ConventionFileTest, InvalidConventionIsNotSaved) {
  TempDir dir;
  const std::string path = dir.path() + "/house.toml";
  HouseConvention c;
  c.euler.print_order = {1, 1, 1};
  EXPECT_FALSE(save_convention(path, c).ok());
  EXPECT_FALSE(fs::exists(path));
}

}  // namespace
}  // namespace attiscope
