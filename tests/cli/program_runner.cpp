// CLI tests: fork/exec of the wirefield program with stdout and stderr sent to scratch files
// (no pipes, so a large output can never dead-lock the test), a time limit armed with alarm()
// in the child so that a hang shows up as SIGALRM instead of stalling the suite, and an
// address-space limit so that a runaway allocation fails fast instead of swapping the machine.
#include "cli/program_runner.hpp"

#include <fcntl.h>
#include <gtest/gtest.h>
#include <signal.h>
#include <spawn.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cerrno>
#include <chrono>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <thread>

extern char** environ;

namespace wirefield::cli_test {

namespace {

// A folder for this test process, removed when the process ends.
class ScratchFolder {
 public:
  ScratchFolder()
      : path_(std::filesystem::temp_directory_path() /
              ("wirefield_cli_tests_" + std::to_string(::getpid()))) {
    std::filesystem::create_directories(path_);
  }
  ~ScratchFolder() {
    std::error_code ignored;
    std::filesystem::remove_all(path_, ignored);
  }
  ScratchFolder(const ScratchFolder&) = delete;
  ScratchFolder& operator=(const ScratchFolder&) = delete;
  const std::filesystem::path& path() const { return path_; }

 private:
  std::filesystem::path path_;
};

const std::filesystem::path& ScratchDir() {
  static const ScratchFolder folder;
  return folder.path();
}

}  // namespace

std::string ReadFile(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

bool TemporaryLeftBeside(const std::string& path) {
  const std::filesystem::path target(path);
  const std::string prefix = target.filename().string() + ".wirefield-";
  std::error_code error;
  for (const auto& entry : std::filesystem::directory_iterator(target.parent_path(), error)) {
    if (entry.path().filename().string().rfind(prefix, 0) == 0) return true;
  }
  return false;
}

std::string WriteScratchFile(const std::string& name, const std::string& text) {
  const std::filesystem::path path = ScratchDir() / name;
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  out << text;
  out.close();
  if (!out) throw std::runtime_error("cannot write scratch file " + path.string());
  return path.string();
}

std::string ModelsDir() { return std::string(WIREFIELD_SOURCE_DIR) + "/models"; }

ProgramRun RunWirefield(const std::vector<std::string>& args, const RunLimits& limits) {
  static int run_count = 0;
  ++run_count;
  const std::string out_path =
      (ScratchDir() / ("run" + std::to_string(run_count) + ".out")).string();
  const std::string err_path =
      (ScratchDir() / ("run" + std::to_string(run_count) + ".err")).string();

  std::vector<std::string> argv_text;
  argv_text.emplace_back(WIREFIELD_BINARY);
  argv_text.insert(argv_text.end(), args.begin(), args.end());
  std::vector<char*> argv;
  for (std::string& a : argv_text) argv.push_back(a.data());
  argv.push_back(nullptr);

  const pid_t pid = ::fork();
  if (pid < 0) throw std::runtime_error("fork failed");
  if (pid == 0) {
    const int out_fd = ::open(out_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0600);
    const int err_fd = ::open(err_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0600);
    const int in_fd = ::open("/dev/null", O_RDONLY);
    if (out_fd < 0 || err_fd < 0 || in_fd < 0) ::_exit(127);
    ::dup2(in_fd, 0);
    ::dup2(out_fd, 1);
    ::dup2(err_fd, 2);
#ifndef WIREFIELD_SANITIZED
    // AddressSanitizer reserves terabytes of address space for its shadow memory, so a
    // sanitized build runs without this limit (its own allocator reports a runaway instead).
    const rlimit memory{kRunMemoryLimit_bytes, kRunMemoryLimit_bytes};
    ::setrlimit(RLIMIT_AS, &memory);
#endif
    if (limits.file_size_bytes != RLIM_INFINITY) {
      const rlimit file_size{limits.file_size_bytes, limits.file_size_bytes};
      ::setrlimit(RLIMIT_FSIZE, &file_size);
    }
    ::alarm(limits.time_s);
    ::execv(argv[0], argv.data());
    ::_exit(127);
  }
  int status = 0;
  while (::waitpid(pid, &status, 0) < 0) {
    if (errno != EINTR) throw std::runtime_error("waitpid failed");
  }
  ProgramRun run;
  run.exited = WIFEXITED(status);
  if (run.exited) run.exit_code = WEXITSTATUS(status);
  if (WIFSIGNALED(status)) run.signal = WTERMSIG(status);
  run.out = ReadFile(out_path);
  run.err = ReadFile(err_path);
  std::filesystem::remove(out_path);
  std::filesystem::remove(err_path);
  return run;
}

SpawnedRun SpawnWirefield(const std::vector<std::string>& args, const std::string& stem) {
  SpawnedRun child;
  child.out_path = WriteScratchFile(stem + ".out", "");
  child.err_path = WriteScratchFile(stem + ".err", "");
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_addopen(&actions, 0, "/dev/null", O_RDONLY, 0);
  posix_spawn_file_actions_addopen(&actions, 1, child.out_path.c_str(), O_WRONLY | O_TRUNC, 0);
  posix_spawn_file_actions_addopen(&actions, 2, child.err_path.c_str(), O_WRONLY | O_TRUNC, 0);
  std::vector<std::string> argv_text{WIREFIELD_BINARY};
  argv_text.insert(argv_text.end(), args.begin(), args.end());
  std::vector<char*> argv;
  for (std::string& a : argv_text) argv.push_back(a.data());
  argv.push_back(nullptr);
  const int rc = posix_spawn(&child.pid, argv[0], &actions, nullptr, argv.data(), environ);
  posix_spawn_file_actions_destroy(&actions);
  if (rc != 0) child.pid = -1;
  return child;
}

int WaitForRun(pid_t pid, unsigned limit_s) {
  const auto deadline = std::chrono::steady_clock::now() + std::chrono::seconds(limit_s);
  int status = 0;
  while (true) {
    const pid_t done = ::waitpid(pid, &status, WNOHANG);
    if (done == pid) return status;
    if (done < 0 && errno != EINTR) return -1;
    if (std::chrono::steady_clock::now() > deadline) {
      ::kill(pid, SIGKILL);
      ::waitpid(pid, &status, 0);
      return status;
    }
    std::this_thread::sleep_for(std::chrono::milliseconds(5));
  }
}

std::string Describe(const ProgramRun& run) {
  std::string text =
      run.exited ? "exit " + std::to_string(run.exit_code) : "signal " + std::to_string(run.signal);
  return text + "; stdout: [" + run.out.substr(0, 400) + "] stderr: [" + run.err.substr(0, 400) +
         "]";
}

std::string RunBadInput(const std::vector<std::string>& args) {
  const ProgramRun run = RunWirefield(args);
  EXPECT_TRUE(run.exited) << Describe(run);
  EXPECT_EQ(run.exit_code, 2) << run.err;
  EXPECT_EQ(run.out, "");
  return run.err;
}

}  // namespace wirefield::cli_test
