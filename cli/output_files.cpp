// Command-line program: writing the output files (see output_files.hpp for the rules).
// Order of a write: check every path; open the write-through outputs (a FIFO without a reader
// fails here); write each regular output to its temporary; write the write-through outputs;
// then, holding the folders' locks and the stopping signals, rename every temporary. A failure
// before the renames leaves every regular output as it was.
#include "output_files.hpp"

#include <fcntl.h>
#include <fmt/format.h>
#include <signal.h>
#include <sys/file.h>
#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <array>
#include <atomic>
#include <cerrno>
#include <climits>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <initializer_list>
#include <string_view>
#include <system_error>
#include <tuple>

#include "command.hpp"
#include "wirefield/wirefield.hpp"

namespace wirefield::cli {
namespace {

namespace fs = std::filesystem;

// ---- temporaries removed by a signal ------------------------------------------------------

// The temporaries that exist now, for the signal handler: fixed storage (no allocation in the
// handler) and lock-free flags, so the handler only reads memory and calls unlink(2), which
// POSIX lists as async-signal-safe (signal-safety(7)).
struct TemporarySlot {
  std::atomic<bool> used{false};
  std::array<char, PATH_MAX> path{};
};
static_assert(std::atomic<bool>::is_always_lock_free);
std::array<TemporarySlot, 16> temporary_slots;

}  // namespace

extern "C" void RemoveTemporariesAndStop(int signal) {
  for (TemporarySlot& slot : temporary_slots) {
    if (slot.used.load()) ::unlink(slot.path.data());
  }
  // The default action, delivered when the handler returns: the run ends by this signal, and
  // a shell reports 128 + signal.
  struct sigaction action {};
  action.sa_handler = SIG_DFL;
  sigemptyset(&action.sa_mask);
  ::sigaction(signal, &action, nullptr);
  ::raise(signal);
}

namespace {

// The signals that stop a run from a terminal or a service manager.
constexpr std::initializer_list<int> kStoppingSignals{SIGINT, SIGTERM, SIGHUP, SIGQUIT};

sigset_t StoppingSignals() {
  sigset_t set;
  sigemptyset(&set);
  for (const int signal : kStoppingSignals) sigaddset(&set, signal);
  return set;
}

// Holds the stopping signals back while alive (a signal that arrives meanwhile is delivered
// when it ends).
class SignalsHeld {
 public:
  SignalsHeld() {
    const sigset_t set = StoppingSignals();
    ::pthread_sigmask(SIG_BLOCK, &set, &previous_);
  }
  ~SignalsHeld() { ::pthread_sigmask(SIG_SETMASK, &previous_, nullptr); }
  SignalsHeld(const SignalsHeld&) = delete;
  SignalsHeld& operator=(const SignalsHeld&) = delete;

 private:
  sigset_t previous_{};
};

// ---- where each output goes ----------------------------------------------------------------

enum class Kind {
  kNew,           // nothing there yet: a new regular file
  kRegular,       // an existing regular file: replaced by rename
  kWriteThrough,  // a character device or a FIFO: written through
};

struct Target {
  std::string path;  // as given
  std::string what;
  std::string file;  // the path written: symbolic links followed
  Kind kind = Kind::kNew;
  struct stat status {};  // of `file`, unless kNew
};

[[noreturn]] void Refuse(const std::string& path, const std::string& message) {
  throw InputError(SourceLocation{path, 0, 0}, message);
}

[[noreturn]] void FailToWrite(const std::string& path, const std::string& what,
                              const std::string& reason) {
  Refuse(path, fmt::format("cannot write the {} file: {}; check that its folder exists and is "
                           "writable, or give another path",
                           what, reason));
}

bool SameFile(const struct stat& a, const struct stat& b) {
  return a.st_dev == b.st_dev && a.st_ino == b.st_ino;
}

// The path a new file gets when `path` does not exist: a dangling symbolic link leads to its
// (missing) target, through as many links as the system follows (40, path_resolution(7)).
std::string FollowDanglingLinks(const std::string& path) {
  fs::path current = path;
  for (int hop = 0; hop < 40; ++hop) {
    std::error_code error;
    if (!fs::is_symlink(fs::symlink_status(current, error))) break;
    const fs::path next = fs::read_symlink(current, error);
    if (error) break;
    current = next.is_absolute() ? next : current.parent_path() / next;
  }
  std::error_code error;
  const fs::path whole = fs::weakly_canonical(current, error);
  return error ? current.string() : whole.string();
}

Target Resolve(const OutputPath& output) {
  Target target{output.path, output.what, output.path, Kind::kNew, {}};
  if (output.path.empty()) {
    Refuse(output.what, fmt::format("the {} file's name is empty; give a path", output.what));
  }
  if (::stat(output.path.c_str(), &target.status) == 0) {
    const mode_t type = target.status.st_mode & S_IFMT;
    if (type == S_IFDIR) {
      Refuse(output.path, fmt::format("the {} file to write is a folder; give a file name in it, "
                                      "e.g. {}/out",
                                      output.what, Printable(output.path)));
    }
    if (type == S_IFREG) {
      target.kind = Kind::kRegular;
      std::error_code error;
      const fs::path whole = fs::canonical(output.path, error);
      if (!error) target.file = whole.string();
      return target;
    }
    if (type == S_IFCHR || type == S_IFIFO) {
      target.kind = Kind::kWriteThrough;
      return target;
    }
    Refuse(output.path,
           fmt::format("the {} file to write is a {}; wirefield writes regular files, character "
                       "devices (such as /dev/null) and FIFOs; give another path",
                       output.what, type == S_IFBLK ? "block device" : "socket"));
  }
  if (errno != ENOENT) FailToWrite(output.path, output.what, std::strerror(errno));
  target.file = FollowDanglingLinks(output.path);
  return target;
}

std::vector<Target> CheckTargets(const std::vector<OutputPath>& outputs,
                                 const std::vector<InputPath>& inputs) {
  std::vector<Target> targets;
  targets.reserve(outputs.size());
  for (const OutputPath& output : outputs) targets.push_back(Resolve(output));
  struct stat out_status {};
  const bool stdout_is_file =
      ::fstat(STDOUT_FILENO, &out_status) == 0 && S_ISREG(out_status.st_mode);
  for (std::size_t i = 0; i < targets.size(); ++i) {
    const Target& target = targets[i];
    if (target.kind != Kind::kNew) {
      for (const InputPath& input : inputs) {
        struct stat in_status {};
        if (::stat(input.path.c_str(), &in_status) != 0 || !SameFile(in_status, target.status))
          continue;
        Refuse(target.path,
               fmt::format("the {} file to write is the {} file {}{}; nothing was written: give "
                           "the {} file another path",
                           target.what, input.what, Printable(input.path),
                           input.path == target.path ? "" : " (the same file by another name)",
                           target.what));
      }
      if (stdout_is_file && SameFile(out_status, target.status)) {
        Refuse(target.path,
               fmt::format("the {} file to write is the file standard output goes to; nothing "
                           "was written: give the {} file another path, or send the report "
                           "elsewhere",
                           target.what, target.what));
      }
    }
    for (std::size_t j = 0; j < i; ++j) {
      const Target& other = targets[j];
      const bool same = target.kind == Kind::kNew
                            ? other.kind == Kind::kNew && other.file == target.file
                            : other.kind != Kind::kNew && SameFile(other.status, target.status);
      if (!same) continue;
      Refuse(target.path,
             fmt::format("the {} and {} files are both {}{}; nothing was written: give each its "
                         "own path",
                         other.what, target.what, Printable(other.path),
                         other.path == target.path ? "" : " (one file by two names)"));
    }
  }
  return targets;
}

// ---- writing ------------------------------------------------------------------------------

// Writes the whole text to `fd`; errno is set on failure.
bool WriteAll(int fd, std::string_view text) {
  std::size_t done = 0;
  while (done < text.size()) {
    const ssize_t n = ::write(fd, text.data() + done, text.size() - done);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) return false;
    done += static_cast<std::size_t>(n);
  }
  return true;
}

// The text of an output: a string, or the whole of an open file (a StreamedOutput's
// temporary), read in pieces.
struct Source {
  const std::string* text = nullptr;
  int fd = -1;
};

// Writes the source to `fd`; errno is set on failure.
bool WriteSource(int fd, const Source& source) {
  if (source.text != nullptr) return WriteAll(fd, *source.text);
  std::string piece(StreamedOutput::kBufferBytes, '\0');
  for (off_t offset = 0;;) {
    const ssize_t n = ::pread(source.fd, piece.data(), piece.size(), offset);
    if (n < 0 && errno == EINTR) continue;
    if (n < 0) return false;
    if (n == 0) return true;
    if (!WriteAll(fd, std::string_view(piece.data(), static_cast<std::size_t>(n)))) return false;
    offset += n;
  }
}

// What a write has made so far; the destructor undoes whatever was not finished.
class WriteInProgress {
 public:
  WriteInProgress() = default;
  WriteInProgress(const WriteInProgress&) = delete;
  WriteInProgress& operator=(const WriteInProgress&) = delete;
  ~WriteInProgress() {
    for (const int fd : open_fds_) ::close(fd);
    for (std::size_t slot = 0; slot < temporary_slots.size(); ++slot) {
      if (!owned_[slot]) continue;
      ::unlink(temporary_slots[slot].path.data());
      temporary_slots[slot].used.store(false);
    }
  }

  void KeepOpen(int fd) { open_fds_.push_back(fd); }
  void CloseAll() {
    for (const int fd : open_fds_) ::close(fd);
    open_fds_.clear();
  }

  // A fresh temporary beside `file`, registered for the signal handler before a signal can
  // see it exist unregistered. Returns its descriptor and slot; throws on failure.
  std::pair<int, std::size_t> CreateTemporary(const Target& target) {
    std::string name = target.file + ".wirefield-XXXXXX";
    std::size_t slot = 0;
    while (slot < temporary_slots.size() && temporary_slots[slot].used.load()) ++slot;
    if (slot == temporary_slots.size() || name.size() >= PATH_MAX) {
      FailToWrite(target.path, target.what, "too many files or too long a path");
    }
    const SignalsHeld held;
    const int fd = ::mkstemp(name.data());
    if (fd < 0) FailToWrite(target.path, target.what, std::strerror(errno));
    std::copy(name.begin(), name.end(), temporary_slots[slot].path.begin());
    temporary_slots[slot].path[name.size()] = '\0';
    temporary_slots[slot].used.store(true);
    owned_[slot] = true;
    KeepOpen(fd);
    return {fd, slot};
  }

  // Renames the temporary of `slot` over `file`; false with errno on failure.
  bool Rename(std::size_t slot, const std::string& file) {
    if (::rename(temporary_slots[slot].path.data(), file.c_str()) != 0) return false;
    temporary_slots[slot].used.store(false);
    owned_[slot] = false;
    return true;
  }

 private:
  std::vector<int> open_fds_;
  std::array<bool, std::tuple_size_v<decltype(temporary_slots)>> owned_{};
};

// The mode of a new file: what open(2) would give with this umask.
mode_t NewFileMode() {
  const mode_t mask = ::umask(0);
  ::umask(mask);
  return static_cast<mode_t>(0666 & ~mask);
}

// The temporary `fd` of `target` gets the existing file's owner where the system allows it
// (root, or a group of ours) and its permission bits; a new file gets `new_mode`.
void KeepOwnerAndMode(int fd, const Target& target, mode_t new_mode) {
  if (target.kind != Kind::kRegular) {
    ::fchmod(fd, new_mode);
    return;
  }
  if (target.status.st_uid != ::geteuid() || target.status.st_gid != ::getegid()) {
    [[maybe_unused]] const int ignored = ::fchown(fd, target.status.st_uid, target.status.st_gid);
  }
  ::fchmod(fd, target.status.st_mode & 07777);
}

// Exclusive flock(2) of each folder while alive (a folder that cannot be opened is not
// locked: its renames are still each atomic). Folders are locked in sorted order, so two runs
// never wait for each other crosswise.
class FolderLocks {
 public:
  explicit FolderLocks(std::vector<std::string> folders) {
    std::sort(folders.begin(), folders.end());
    folders.erase(std::unique(folders.begin(), folders.end()), folders.end());
    for (const std::string& folder : folders) {
      const int fd = ::open(folder.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
      if (fd < 0) continue;
      while (::flock(fd, LOCK_EX) != 0 && errno == EINTR) {
      }
      fds_.push_back(fd);
    }
  }
  ~FolderLocks() {
    for (const int fd : fds_) ::close(fd);  // closing releases the lock
  }
  FolderLocks(const FolderLocks&) = delete;
  FolderLocks& operator=(const FolderLocks&) = delete;

 private:
  std::vector<int> fds_;
};

}  // namespace

ScopedSignalHandlers::ScopedSignalHandlers(void (*handler)(int),
                                           std::initializer_list<int> signals) {
  struct sigaction action {};
  action.sa_handler = handler;
  sigemptyset(&action.sa_mask);
  for (const int signal : signals) {
    struct sigaction previous {};
    if (::sigaction(signal, &action, &previous) == 0) previous_.emplace_back(signal, previous);
  }
}

ScopedSignalHandlers::~ScopedSignalHandlers() {
  for (const auto& [signal, previous] : previous_) ::sigaction(signal, &previous, nullptr);
}

void CheckOutputPaths(const std::vector<OutputPath>& outputs,
                      const std::vector<InputPath>& inputs) {
  (void)CheckTargets(outputs, inputs);
}

namespace {

// WriteOutputFiles with each output's text from `sources`.
void WriteSources(const std::vector<OutputPath>& outputs, const std::vector<Source>& sources,
                  const std::vector<InputPath>& inputs) {
  const std::vector<Target> targets = CheckTargets(outputs, inputs);

  const ScopedSignalHandlers on_signal(RemoveTemporariesAndStop, kStoppingSignals);
  WriteInProgress progress;
  // Write-through outputs, opened first: a FIFO without a reader fails before anything else.
  std::vector<int> through_fds(targets.size(), -1);
  for (std::size_t i = 0; i < targets.size(); ++i) {
    const Target& target = targets[i];
    if (target.kind != Kind::kWriteThrough) continue;
    const int fd = ::open(target.file.c_str(), O_WRONLY | O_NONBLOCK | O_NOCTTY | O_CLOEXEC);
    if (fd < 0 && errno == ENXIO && S_ISFIFO(target.status.st_mode)) {
      Refuse(target.path,
             fmt::format("no program is reading the FIFO {} (the {} file); start the reader "
                         "first, or give a regular file",
                         Printable(target.path), target.what));
    }
    if (fd < 0) FailToWrite(target.path, target.what, std::strerror(errno));
    progress.KeepOpen(fd);
    ::fcntl(fd, F_SETFL, ::fcntl(fd, F_GETFL) & ~O_NONBLOCK);
    through_fds[i] = fd;
  }
  // Regular outputs, each to its temporary.
  const mode_t new_mode = NewFileMode();
  std::vector<std::size_t> slots(targets.size(), 0);
  std::vector<std::string> folders;
  for (std::size_t i = 0; i < targets.size(); ++i) {
    const Target& target = targets[i];
    if (target.kind == Kind::kWriteThrough) continue;
    const auto [fd, slot] = progress.CreateTemporary(target);
    slots[i] = slot;
    folders.push_back(fs::path(target.file).parent_path().string());
    KeepOwnerAndMode(fd, target, new_mode);
    if (!WriteSource(fd, sources[i]) || ::fsync(fd) != 0) {
      FailToWrite(target.path, target.what, std::strerror(errno));
    }
  }
  // Write-through outputs.
  for (std::size_t i = 0; i < targets.size(); ++i) {
    if (through_fds[i] < 0) continue;
    if (!WriteSource(through_fds[i], sources[i])) {
      FailToWrite(targets[i].path, targets[i].what, std::strerror(errno));
    }
  }
  progress.CloseAll();
  // The renames: under the folders' locks, with the stopping signals held back, so that the
  // set appears whole (a signal meanwhile stops the run after the last rename).
  const FolderLocks locks(folders);
  const SignalsHeld held;
  for (std::size_t i = 0; i < targets.size(); ++i) {
    if (targets[i].kind == Kind::kWriteThrough) continue;
    if (!progress.Rename(slots[i], targets[i].file)) {
      FailToWrite(targets[i].path, targets[i].what, std::strerror(errno));
    }
  }
}

std::string WroteLine(const std::string& what, const std::string& path) {
  return fmt::format("Wrote the {} file {}\n", what, Printable(path));
}

}  // namespace

void WriteOutputFiles(const std::vector<OutputFile>& files, const std::vector<InputPath>& inputs) {
  std::vector<OutputPath> outputs;
  std::vector<Source> sources;
  outputs.reserve(files.size());
  sources.reserve(files.size());
  for (const OutputFile& file : files) {
    outputs.push_back({file.path, file.what});
    sources.push_back({&file.text, -1});
  }
  WriteSources(outputs, sources, inputs);
}

void WriteFilesThenReport(const std::vector<OutputFile>& files,
                          const std::vector<InputPath>& inputs, std::string report, bool json) {
  WriteOutputFiles(files, inputs);
  if (!json) {
    for (const OutputFile& file : files) report += WroteLine(file.what, file.path);
  }
  WriteStdout(report);
}

// ---- streamed outputs ---------------------------------------------------------------------

struct StreamedOutput::State {
  State(OutputPath output_path, std::vector<InputPath> input_paths, std::size_t limit)
      : output(std::move(output_path)), inputs(std::move(input_paths)), buffer_bytes(limit) {}

  OutputPath output;
  std::vector<InputPath> inputs;
  std::size_t buffer_bytes;
  // The handler first, so that it is in place before the temporary exists and until after
  // `progress` has removed it.
  ScopedSignalHandlers on_signal{RemoveTemporariesAndStop, kStoppingSignals};
  WriteInProgress progress;
  Target target;
  int fd = -1;
  std::size_t slot = 0;
  bool beside = false;  // the temporary is PATH.wirefield-XXXXXX, renamed by Commit
  bool committed = false;
  std::string buffer;
  std::size_t most_buffered = 0;
  std::uintmax_t appended = 0;

  void Flush() {
    if (!WriteAll(fd, buffer)) FailToWrite(target.path, target.what, std::strerror(errno));
    buffer.clear();
  }

  void CheckOpen() const {
    if (committed) {
      throw ComputationError(
          fmt::format("the {} file {} was already written", target.what, Printable(target.path)));
    }
  }
};

StreamedOutput::StreamedOutput(OutputPath output, std::vector<InputPath> inputs,
                               std::size_t buffer_bytes)
    : state_(std::make_unique<State>(std::move(output), std::move(inputs), buffer_bytes)) {
  State& s = *state_;
  s.target = CheckTargets({s.output}, s.inputs).front();
  if (s.target.kind == Kind::kWriteThrough) {
    // A spool without a name: nothing to remove, whatever ends the run.
    const char* folder = std::getenv("TMPDIR");
    std::string name = std::string(folder != nullptr && *folder != '\0' ? folder : "/tmp") +
                       "/wirefield-spool-XXXXXX";
    const SignalsHeld held;
    s.fd = ::mkstemp(name.data());
    if (s.fd < 0) {
      FailToWrite(
          s.target.path, s.target.what,
          fmt::format("cannot make a spool file in {}: {}",
                      Printable(fs::path(name).parent_path().string()), std::strerror(errno)));
    }
    ::unlink(name.c_str());
    s.progress.KeepOpen(s.fd);
  } else {
    std::tie(s.fd, s.slot) = s.progress.CreateTemporary(s.target);
    s.beside = true;
  }
  s.buffer.reserve(buffer_bytes);
}

StreamedOutput::~StreamedOutput() = default;

void StreamedOutput::Append(std::string_view text) {
  State& s = *state_;
  s.CheckOpen();
  s.buffer += text;
  s.appended += text.size();
  s.most_buffered = std::max(s.most_buffered, s.buffer.size());
  if (s.buffer.size() >= s.buffer_bytes) s.Flush();
}

void StreamedOutput::Commit() {
  State& s = *state_;
  s.CheckOpen();
  s.Flush();
  const Target now = CheckTargets({s.output}, s.inputs).front();
  if (!s.beside || now.kind == Kind::kWriteThrough || now.file != s.target.file) {
    // A device or FIFO, or a path that leads elsewhere since the start: written from the
    // temporary as WriteOutputFiles writes a text.
    WriteSources({s.output}, {Source{nullptr, s.fd}}, s.inputs);
  } else {
    KeepOwnerAndMode(s.fd, now, NewFileMode());
    if (::fsync(s.fd) != 0) FailToWrite(now.path, now.what, std::strerror(errno));
    s.progress.CloseAll();
    const FolderLocks locks({fs::path(now.file).parent_path().string()});
    const SignalsHeld held;
    if (!s.progress.Rename(s.slot, now.file)) {
      FailToWrite(now.path, now.what, std::strerror(errno));
    }
  }
  s.committed = true;
}

void StreamedOutput::CommitTo(const OutputPath& other) {
  State& s = *state_;
  s.CheckOpen();
  s.Flush();
  WriteSources({other}, {Source{nullptr, s.fd}}, s.inputs);
  s.committed = true;
}

const OutputPath& StreamedOutput::output() const { return state_->output; }
std::size_t StreamedOutput::buffered_bytes() const { return state_->buffer.size(); }
std::size_t StreamedOutput::most_buffered_bytes() const { return state_->most_buffered; }
std::uintmax_t StreamedOutput::appended_bytes() const { return state_->appended; }

void CommitThenReport(StreamedOutput& output, std::string report, bool json) {
  output.Commit();
  if (!json) report += WroteLine(output.output().what, output.output().path);
  WriteStdout(report);
}

}  // namespace wirefield::cli
