// scratch_dir.hpp: a test fixture with a scratch folder of its own, named by the process and
// the test (so parallel ctest runs never share one), removed after the test.
#pragma once

#include <gtest/gtest.h>
#include <unistd.h>

#include <filesystem>
#include <string>
#include <utility>

namespace attiscope::test {

class ScratchDirTest : public ::testing::Test {
 protected:
  /// `prefix` starts the folder's name, e.g. "attiscope_track_cli_".
  explicit ScratchDirTest(std::string prefix) : prefix_(std::move(prefix)) {}
  void SetUp() override {
    dir_ = std::filesystem::temp_directory_path() /
           (prefix_ + std::to_string(::getpid()) + "_" +
            ::testing::UnitTest::GetInstance()->current_test_info()->name());
    std::filesystem::create_directories(dir_);
  }
  void TearDown() override { std::filesystem::remove_all(dir_); }
  std::string Path(const std::string& name) const { return (dir_ / name).string(); }

  std::filesystem::path dir_;

 private:
  std::string prefix_;
};

}  // namespace attiscope::test
