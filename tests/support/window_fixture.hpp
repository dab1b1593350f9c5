// window_fixture.hpp: the fixture of the tests that drive the real window with a script
// (app/gui/script.hpp): a scratch folder per test and process (removed unless the test
// failed; the process id keeps runs side by side apart), settings kept in it
// (XDG_CONFIG_HOME), the window run from its "cwd" subfolder so stray files would show
// there, and the dumps read back as JSON. Needs an X display (scripts/test.sh runs the tests
// under xvfb-run when there is none).
#pragma once

#include <gtest/gtest.h>
#include <unistd.h>

#include <Eigen/Geometry>
#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>
#include <vector>

#include "attiscope/core/rotation.hpp"
#include "gui/gui.hpp"

namespace attiscope::test {

class WindowFixture : public ::testing::Test {
 protected:
  /// prefix: the scratch folder's name before the test's name; size: the default window size.
  WindowFixture(std::string prefix, std::string size) : prefix_(std::move(prefix)), size_(std::move(size)) {}

  void SetUp() override {
    ASSERT_NE(std::getenv("DISPLAY"), nullptr)
        << "the window tests need an X display: run scripts/test.sh, or ctest under xvfb-run";
    dir_ = std::filesystem::temp_directory_path() /
           (prefix_ + std::to_string(::getpid()) + "_" +
            ::testing::UnitTest::GetInstance()->current_test_info()->name());
    std::filesystem::remove_all(dir_);
    std::filesystem::create_directories(dir_ / "cwd");
    setenv("XDG_CONFIG_HOME", (dir_ / "config").c_str(), 1);
  }
  void TearDown() override {
    if (!::testing::Test::HasFailure()) std::filesystem::remove_all(dir_);
  }

  std::string path(const std::string& name) const { return (dir_ / name).string(); }

  /// Runs the window on a script with FILE arguments; size "" is the fixture's default.
  int run(const std::string& script, const std::string& size = "",
          const std::vector<std::string>& files = {}) {
    std::ofstream(path("test.script")) << script;
    const auto old = std::filesystem::current_path();
    std::filesystem::current_path(dir_ / "cwd");
    std::ostringstream out, err;
    std::vector<std::string> args = {"--size", size.empty() ? size_ : size, "--script", path("test.script")};
    args.insert(args.end(), files.begin(), files.end());
    const int rc = gui::run_window(args, out, err);
    std::filesystem::current_path(old);
    err_ = err.str();
    return rc;
  }

  nlohmann::json dump(const std::string& name) const {
    std::ifstream in(path(name));
    return nlohmann::json::parse(in);
  }

  /// The document's current pose in a dump.
  static Rotation pose(const nlohmann::json& d) {
    const auto& q = d["document"]["quaternion"];
    return Rotation(Eigen::Quaterniond(q["w"], q["x"], q["y"], q["z"]));
  }
  /// The document's reference pose in a dump.
  static Rotation reference(const nlohmann::json& d) {
    const auto& q = d["document"]["reference_quaternion"];
    return Rotation(Eigen::Quaterniond(q["w"], q["x"], q["y"], q["z"]));
  }
  static bool has_widget(const nlohmann::json& d, const std::string& name) {
    const auto& w = d["widgets"];
    return std::find(w.begin(), w.end(), name) != w.end();
  }

  std::filesystem::path dir_;
  std::string err_;

 private:
  std::string prefix_;
  std::string size_;
};

}  // namespace attiscope::test
