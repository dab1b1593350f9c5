// atomic_file.cpp: temporary file in the same folder, fsync, rename.
#include "attiscope/core/atomic_file.hpp"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <fstream>
#include <sstream>
#include <vector>

namespace attiscope {

namespace {

std::string errno_text() {
  return std::strerror(errno);
}

}  // namespace

Expected<bool> write_file_atomically(const std::string& path, std::string_view content,
                                     const BeforeRenameHook& before_rename) {
  const std::size_t slash = path.find_last_of('/');
  const std::string folder = slash == std::string::npos ? "." : path.substr(0, slash == 0 ? 1 : slash);
  const std::string base = slash == std::string::npos ? path : path.substr(slash + 1);
  std::string temp = folder + "/." + base + ".tmp-XXXXXX";
  std::vector<char> name(temp.begin(), temp.end());
  name.push_back('\0');
  const int fd = mkstemp(name.data());
  if (fd < 0) {
    return Error{"cannot save " + path + ": cannot create a temporary file in " + folder + " (" +
                 errno_text() + "); the old file is unchanged"};
  }
  temp = name.data();
  auto fail = [&](const std::string& what) -> Expected<bool> {
    const std::string reason = errno_text();
    ::close(fd);
    std::remove(temp.c_str());
    return Error{"cannot save " + path + ": " + what + " (" + reason + "); the old file is unchanged"};
  };
  std::size_t written = 0;
  while (written < content.size()) {
    const ssize_t n = ::write(fd, content.data() + written, content.size() - written);
    if (n < 0) {
      if (errno == EINTR) continue;
      return fail("writing the temporary file failed");
    }
    written += static_cast<std::size_t>(n);
  }
  // Keep the old file's permissions; a new file gets the usual 0644 (mkstemp makes 0600).
  struct stat old_stat {};
  const mode_t mode = ::stat(path.c_str(), &old_stat) == 0 ? (old_stat.st_mode & 07777) : 0644;
  if (::fchmod(fd, mode) != 0) return fail("setting the temporary file's permissions failed");
  if (::fsync(fd) != 0) return fail("flushing the temporary file failed");
  if (::close(fd) != 0) {
    std::remove(temp.c_str());
    return Error{"cannot save " + path + ": closing the temporary file failed; the old file is unchanged"};
  }
  if (before_rename && !before_rename(temp)) {
    std::remove(temp.c_str());
    return Error{"saving " + path + " was interrupted before the rename; the old file is unchanged"};
  }
  if (std::rename(temp.c_str(), path.c_str()) != 0) {
    const std::string reason = errno_text();
    std::remove(temp.c_str());
    return Error{"cannot save " + path + ": renaming the temporary file failed (" + reason +
                 "); the old file is unchanged"};
  }
  return true;
}

Expected<std::string> read_whole_file(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) return Error{"cannot open " + path + ": " + errno_text()};
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

}  // namespace attiscope
