// document_test.cpp: the window's document model, card values and settings, without a window.
#include <gtest/gtest.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>

#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"
#include "gui/card_values.hpp"
#include "gui/document.hpp"
#include "gui/settings.hpp"
#include "support/check.hpp"

namespace attiscope::gui {
namespace {

constexpr double kPi = 3.14159265358979323846;

TEST(DocumentTest, UndoRedoRestoreEveryChange) {
  Document doc;
  const Rotation a = elementary_rotation(Axis::Z, 0.3);
  doc.set_pose(a, "a");
  doc.nudge(Axis::X, 0.1, true);
  doc.set_unit(AngleUnit::Radians);
  EXPECT_EQ(doc.history().size(), 3u);
  doc.undo();
  EXPECT_EQ(doc.convention().house.euler.unit, AngleUnit::Degrees);
  doc.undo();
  EXPECT_TRUE(test::RotationNear(doc.pose(), a, test::kTight));
  doc.redo();
  EXPECT_TRUE(test::RotationNear(doc.pose(), a * elementary_rotation(Axis::X, 0.1), test::kTight));
  doc.undo();
  doc.undo();
  EXPECT_TRUE(test::RotationNear(doc.pose(), Rotation::identity(), test::kTight));
  EXPECT_FALSE(doc.can_undo());
}

TEST(DocumentTest, NudgeAboutBodyAndWorldAxes) {
  // About a body axis the turn comes first (R * R_x), about a world axis last (R_x * R):
  // common practice for intrinsic versus extrinsic turns.
  Document doc;
  const Rotation start = elementary_rotation(Axis::Z, kPi / 2);
  doc.set_pose(start, "start");
  doc.nudge(Axis::X, kPi / 2, true);
  const Eigen::Vector3d body_y_in_world = doc.pose().matrix().col(1);
  // Yaw 90 then a body-x turn of 90: the body's y axis points along world +z.
  EXPECT_TRUE(test::MatrixNear(body_y_in_world, Eigen::Vector3d(0, 0, 1), test::kTight));
  doc.undo();
  doc.nudge(Axis::X, kPi / 2, false);
  // A world-x turn of 90 after yaw 90: the body's x axis (world +y) goes to world +z.
  EXPECT_TRUE(
      test::MatrixNear(Eigen::Vector3d(doc.pose().matrix().col(0)), Eigen::Vector3d(0, 0, 1), test::kTight));
}

TEST(DocumentTest, InvalidMatrixEditLeavesPoseUnchanged) {
  Document doc;
  doc.set_pose(elementary_rotation(Axis::Y, 0.4), "start");
  const Rotation before = doc.pose();
  CardView v = card_view(Card::Matrix, doc.state());
  v.numbers[0] = 0.9;
  const EditCheck check = check_card_edit(Card::Matrix, v.numbers, doc.state());
  ASSERT_FALSE(check.rotation.has_value());
  EXPECT_NE(check.problem.find("orthonormality defect"), std::string::npos) << check.problem;
  ASSERT_TRUE(check.nearest.has_value());
  doc.commit(Card::Matrix, v.numbers, check);
  EXPECT_TRUE(test::RotationNear(doc.pose(), before, 0.0));
  ASSERT_NE(doc.edit(Card::Matrix), nullptr);
  EXPECT_TRUE(doc.edit(Card::Matrix)->invalid);
  doc.accept_nearest(Card::Matrix);
  EXPECT_EQ(doc.edit(Card::Matrix), nullptr);
  std::array<double, 9> a{};
  std::copy(v.numbers.begin(), v.numbers.end(), a.begin());
  const Eigen::Matrix3d nearest = nearest_rotation(matrix_from_numbers(a, MatrixStorage::Rows));
  EXPECT_TRUE(test::MatrixNear(doc.pose().matrix(), nearest, 1e-12));
}

TEST(DocumentTest, ZeroQuaternionHasNoRotation) {
  Document doc;
  const EditCheck check = check_card_edit(Card::Quaternion, {0, 0, 0, 0}, doc.state());
  EXPECT_FALSE(check.rotation.has_value());
  EXPECT_FALSE(check.nearest.has_value());
  EXPECT_FALSE(check.problem.empty());
}

TEST(CardValuesTest, QuarterTurnAboutZInEveryCard) {
  // q = (cos 45deg, 0, 0, sin 45deg) is +90 deg about z: R_z(90) = [[0,-1,0],[1,0,0],[0,0,1]],
  // yaw 90 in intrinsic ZYX, axis (0,0,1) angle 90, rotation vector (0,0,pi/2), Gibbs
  // (0,0,tan 45deg = 1), MRP (0,0,tan 22.5deg). Common practice (right-hand rule);
  // Shuster 1993 for the Gibbs and MRP definitions.
  DocumentState s;
  s.world_R_body = Rotation(Eigen::Quaterniond(std::sqrt(0.5), 0, 0, std::sqrt(0.5)));
  const auto near = [](const std::vector<double>& got, const std::vector<double>& want) {
    Eigen::VectorXd a = Eigen::Map<const Eigen::VectorXd>(got.data(), static_cast<Eigen::Index>(got.size()));
    Eigen::VectorXd b =
        Eigen::Map<const Eigen::VectorXd>(want.data(), static_cast<Eigen::Index>(want.size()));
    return test::MatrixNear(a, b, 1e-12);
  };
  EXPECT_TRUE(near(card_view(Card::Matrix, s).numbers, {0, -1, 0, 1, 0, 0, 0, 0, 1}));
  EXPECT_TRUE(near(card_view(Card::EulerHouse, s).numbers, {90, 0, 0}));
  EXPECT_TRUE(near(card_view(Card::AxisAngle, s).numbers, {0, 0, 1, 90}));
  EXPECT_TRUE(near(card_view(Card::RotationVector, s).numbers, {0, 0, kPi / 2}));
  EXPECT_TRUE(near(card_view(Card::Gibbs, s).numbers, {0, 0, 1}));
  EXPECT_TRUE(near(card_view(Card::Mrp, s).numbers, {0, 0, std::tan(kPi / 8)}));
}

TEST(CardValuesTest, EveryCardReadsBackItsOwnNumbers) {
  std::mt19937 rng(test::kSeed);
  for (int i = 0; i < 50; ++i) {
    DocumentState s;
    s.world_R_body = test::RandomRotation(rng);
    std::vector<DisplayConvention> conventions = {DisplayConvention{}};
    for (const std::string& f : demo_convention_files()) {
      auto d = load_display_convention(f);
      ASSERT_TRUE(d.ok()) << f;
      conventions.push_back(d.value());
    }
    ASSERT_GE(conventions.size(), 4u) << "the demo conventions in assets/conventions/ were not found";
    for (const DisplayConvention& c : conventions) {
      s.convention = c;
      for (Card card : all_cards()) {
        const CardView v = card_view(card, s);
        const EditCheck e = check_card_edit(card, v.numbers, s);
        ASSERT_TRUE(e.rotation.has_value())
            << card_key(card) << " " << c.house.name << " seed " << test::kSeed << ": " << e.problem;
        EXPECT_TRUE(test::RotationNear(*e.rotation, s.world_R_body, 1e-9))
            << card_key(card) << " " << c.house.name << " seed " << test::kSeed;
      }
    }
  }
}

TEST(SettingsTest, SavedAtomicallyInTheXdgFolder) {
  const std::filesystem::path tmp = std::filesystem::temp_directory_path() / "attiscope_settings_test";
  std::filesystem::remove_all(tmp);
  ASSERT_EQ(setenv("XDG_CONFIG_HOME", tmp.c_str(), 1), 0);
  const auto dir = config_dir();
  ASSERT_TRUE(dir.has_value());
  EXPECT_EQ(*dir, (tmp / "attiscope").string());
  SettingsStore store(*dir);
  Settings s;
  s.ui_scale = 1.75f;
  remember_convention(s, "a.toml");
  remember_convention(s, "b.toml");
  remember_convention(s, "a.toml");
  store.changed(s, 10.0);
  EXPECT_FALSE(store.save_if_due(10.5)) << "saved before the debounce delay";
  EXPECT_FALSE(std::filesystem::exists(tmp / "attiscope" / "settings.json"));
  EXPECT_TRUE(store.save_if_due(10.0 + SettingsStore::kSaveDelayS));
  EXPECT_TRUE(std::filesystem::exists(tmp / "attiscope" / "settings.json"));
  EXPECT_FALSE(std::filesystem::exists(tmp / "attiscope" / "settings.json.tmp"));
  const Settings back = load_settings(*dir);
  EXPECT_FLOAT_EQ(back.ui_scale, 1.75f);
  EXPECT_EQ(back.convention_path, "a.toml");
  EXPECT_EQ(back.recent_conventions, (std::vector<std::string>{"a.toml", "b.toml"}));
  std::filesystem::remove_all(tmp);
}

TEST(SettingsTest, MalformedFileGivesDefaults) {
  const std::filesystem::path tmp = std::filesystem::temp_directory_path() / "attiscope_settings_bad";
  std::filesystem::create_directories(tmp);
  std::ofstream(tmp / "settings.json") << "{ not json";
  std::string warning;
  const Settings s = load_settings(tmp.string(), &warning);
  EXPECT_FLOAT_EQ(s.ui_scale, Settings{}.ui_scale);
  EXPECT_FALSE(warning.empty());
  std::filesystem::remove_all(tmp);
}

}  // namespace
}  // namespace attiscope::gui
