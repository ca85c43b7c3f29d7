// Core: reads an input file whole after checking that it is a regular file (read_file.hpp).
#include "core/read_file.hpp"

#include <fcntl.h>
#include <fmt/format.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>

#include "wirefield/model.hpp"

namespace wirefield::core {
namespace {

const char* KindOf(mode_t mode) {
  if (S_ISFIFO(mode)) return "a FIFO (named pipe)";
  if (S_ISCHR(mode)) return "a character device";
  if (S_ISBLK(mode)) return "a block device";
  if (S_ISDIR(mode)) return "a directory";
  if (S_ISSOCK(mode)) return "a socket";
  return "not a plain file";
}

// Closes the descriptor on every path out.
class Descriptor {
 public:
  explicit Descriptor(int fd) : fd_(fd) {}
  ~Descriptor() {
    if (fd_ >= 0) ::close(fd_);
  }
  Descriptor(const Descriptor&) = delete;
  Descriptor& operator=(const Descriptor&) = delete;
  int get() const { return fd_; }

 private:
  int fd_;
};

}  // namespace

std::string ReadInputFile(const std::string& path, const std::string& what, std::size_t max_bytes,
                          const std::string& too_large) {
  const SourceLocation where{path, 0, 0};
  const auto fail = [&](const std::string& reason) {
    throw InputError(where, fmt::format("cannot read the {}: {}", what, reason));
  };
  // O_NONBLOCK: opening a FIFO with no writer returns at once instead of waiting for one.
  const Descriptor file(::open(path.c_str(), O_RDONLY | O_NONBLOCK | O_CLOEXEC | O_NOCTTY));
  if (file.get() < 0) fail(std::strerror(errno));
  struct stat status {};
  if (::fstat(file.get(), &status) != 0) fail(std::strerror(errno));
  if (!S_ISREG(status.st_mode)) {
    fail(fmt::format("it is {}, not a regular file; give the path of a file on disk",
                     KindOf(status.st_mode)));
  }
  std::string text;
  char buffer[1 << 16];
  while (true) {
    const ssize_t n = ::read(file.get(), buffer, sizeof buffer);
    if (n < 0) {
      if (errno == EINTR) continue;
      fail(std::strerror(errno));
    }
    if (n == 0) break;
    text.append(buffer, static_cast<std::size_t>(n));
    if (text.size() > max_bytes) throw InputError(where, too_large);
  }
  return text;
}

}  // namespace wirefield::core
