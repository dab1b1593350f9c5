// atomic_file.cpp: temporary file in the same folder, fsync, rename.
#include "attiscope/core/atomic_file.hpp"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <fstream>
#include <ostream>
#include <sstream>
#include <streambuf>
#include <vector>

namespace attiscope {

namespace {

std::string errno_text() {
  return std::strerror(errno);
}

/// A stream buffer onto a file descriptor (the temporary file): 64 KiB at a time, and
/// remembers the first failed write (its errno) instead of losing it.
class FdBuffer : public std::streambuf {
 public:
  explicit FdBuffer(int fd) : fd_(fd), buf_(kBufferBytes) { setp(buf_.data(), buf_.data() + buf_.size()); }
  int failed_errno() const { return errno_; }

 protected:
  int_type overflow(int_type ch) override {
    if (!drain()) return traits_type::eof();
    if (!traits_type::eq_int_type(ch, traits_type::eof())) {
      *pptr() = traits_type::to_char_type(ch);
      pbump(1);
    }
    return traits_type::not_eof(ch);
  }
  int sync() override { return drain() ? 0 : -1; }

 private:
  static constexpr std::size_t kBufferBytes = 1u << 16;
  bool drain() {
    if (errno_ != 0) return false;
    const char* p = pbase();
    const char* const end = pptr();
    while (p < end) {
      const ssize_t n = ::write(fd_, p, static_cast<std::size_t>(end - p));
      if (n < 0) {
        if (errno == EINTR) continue;
        errno_ = errno != 0 ? errno : EIO;
        return false;
      }
      p += n;
    }
    setp(buf_.data(), buf_.data() + buf_.size());
    return true;
  }
  int fd_;
  std::vector<char> buf_;
  int errno_ = 0;
};

}  // namespace

Expected<bool> write_file_atomically(const std::string& path, std::string_view content,
                                     const BeforeRenameHook& before_rename) {
  return write_file_atomically_streamed(
      path,
      [content](std::ostream& out) -> Expected<bool> {
        out.write(content.data(), static_cast<std::streamsize>(content.size()));
        return true;
      },
      before_rename);
}

Expected<bool> write_file_atomically_streamed(const std::string& path, const StreamFiller& fill,
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
  {
    FdBuffer buffer(fd);
    std::ostream out(&buffer);
    Expected<bool> filled = fill(out);
    out.flush();
    if (buffer.failed_errno() != 0) {  // the disk's reason first (fill only saw a failed stream)
      errno = buffer.failed_errno();
      return fail("writing the temporary file failed");
    }
    if (!filled) {
      ::close(fd);
      std::remove(temp.c_str());
      return filled.error();
    }
    if (!out) {
      errno = EIO;
      return fail("writing the temporary file failed");
    }
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
