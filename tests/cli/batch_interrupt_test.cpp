// CLI tests: Ctrl-C during `wirefield batch`. The test starts a long batch in a child process
// (posix_spawn), sends it SIGINT midway, and checks what a user is promised (docs/commands.md,
// "Interrupting a batch"): exit code 130, the finished rows in CSV.partial with the CSV's
// header, the CSV file itself untouched, and a note on stderr naming the partial file.
#include <fcntl.h>
#include <gtest/gtest.h>
#include <signal.h>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cerrno>
#include <chrono>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <thread>
#include <vector>

#include "cli/program_runner.hpp"

extern char** environ;

namespace wirefield::cli_test {
namespace {

struct Child {
  pid_t pid = -1;
  std::string err_path;
};

// Starts wirefield with `args`, stdout and stderr to files, stdin from /dev/null.
Child Spawn(const std::vector<std::string>& args, const std::string& stem) {
  Child child;
  child.err_path = WriteScratchFile(stem + ".err", "");
  const std::string out_path = WriteScratchFile(stem + ".out", "");
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_addopen(&actions, 0, "/dev/null", O_RDONLY, 0);
  posix_spawn_file_actions_addopen(&actions, 1, out_path.c_str(), O_WRONLY | O_TRUNC, 0);
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

// Waits for the child, at most `limit`; kills it (SIGKILL) past that. Returns the wait status.
int WaitFor(pid_t pid, std::chrono::seconds limit) {
  const auto deadline = std::chrono::steady_clock::now() + limit;
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
    std::this_thread::sleep_for(std::chrono::milliseconds(20));
  }
}

// True once the process catches SIGINT (bit 2 of SigCgt in /proc/PID/status, Linux proc(5)):
// the batch has installed its handler and is running rows. Waits at most `limit`.
bool WaitUntilCatchingSigint(pid_t pid, std::chrono::seconds limit) {
  const auto deadline = std::chrono::steady_clock::now() + limit;
  while (std::chrono::steady_clock::now() < deadline) {
    std::ifstream status("/proc/" + std::to_string(pid) + "/status");
    for (std::string line; std::getline(status, line);) {
      if (line.rfind("SigCgt:", 0) != 0) continue;
      const unsigned long long mask = std::stoull(line.substr(7), nullptr, 16);
      if ((mask >> (SIGINT - 1)) & 1ull) return true;
    }
    std::this_thread::sleep_for(std::chrono::milliseconds(10));
  }
  return false;
}

std::vector<std::string> Lines(const std::string& text) {
  std::vector<std::string> lines;
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);) lines.push_back(line);
  return lines;
}

struct Interrupted {
  bool exited = false;
  int exit_code = -1;
  std::string err;
};

// Runs a batch of the hiking club dipole with `extra` flags, sends SIGINT once it is running
// rows (and a moment later, so that some rows finish), and waits for it to end.
Interrupted RunAndInterrupt(const std::vector<std::string>& extra, const std::string& stem) {
  std::vector<std::string> args{"batch",    ModelsDir() + "/hiking_club_dipole.wire",
                                "--from",   "13.8MHz",
                                "--to",     "14.6MHz",
                                "--points", "5",
                                "--vary",   "total=9m:10.99m:0.01m"};
  args.insert(args.end(), extra.begin(), extra.end());
  Interrupted result;
  const Child child = Spawn(args, stem);
  EXPECT_GT(child.pid, 0);
  if (child.pid <= 0) return result;
  EXPECT_TRUE(WaitUntilCatchingSigint(child.pid, std::chrono::seconds(30)));
  std::this_thread::sleep_for(std::chrono::milliseconds(300));  // let some rows finish
  EXPECT_EQ(::kill(child.pid, SIGINT), 0);
  // The rows in flight finish, then the program writes and exits; 60 s is ample.
  const int status = WaitFor(child.pid, std::chrono::seconds(60));
  result.exited = WIFEXITED(status);
  if (result.exited) result.exit_code = WEXITSTATUS(status);
  result.err = ReadFile(child.err_path);
  return result;
}

TEST(BatchInterrupt, CtrlCWritesTheFinishedRowsToAPartialFileAndKeepsTheOldCsv) {
  const std::string csv = WriteScratchFile("interrupted.csv", "old results\n");
  const std::string partial = csv + ".partial";
  std::filesystem::remove(partial);
  // 200 x 6 = 1200 rows on one thread: tens of milliseconds each, so about a minute in all,
  // far longer than the fraction of a second before the interrupt on any machine.
  const Interrupted run =
      RunAndInterrupt({"--vary", "height=1m:6m:1m", "--threads", "1", "--csv", csv}, "interrupted");
  ASSERT_TRUE(run.exited) << run.err;
  EXPECT_EQ(run.exit_code, 130) << run.err;  // 128 + SIGINT, as a shell reports it
  EXPECT_EQ(ReadFile(csv), "old results\n") << "the final CSV must be left as it was";
  EXPECT_FALSE(TemporaryLeftBeside(csv));
  ASSERT_TRUE(std::filesystem::exists(partial)) << run.err;
  const std::vector<std::string> lines = Lines(ReadFile(partial));
  ASSERT_GE(lines.size(), 1u);
  EXPECT_EQ(lines[0].rfind("index,ground,total_m,height_m,resonances_hz", 0), 0u) << lines[0];
  EXPECT_LT(lines.size() - 1, 1200u) << "a partial file holds fewer rows than the grid";
  for (size_t i = 1; i < lines.size(); ++i) {
    // The rows finished are the first ones of the grid, in order, on one thread.
    EXPECT_EQ(lines[i].rfind(std::to_string(i - 1) + ",", 0), 0u) << lines[i];
  }
  EXPECT_NE(run.err.find("interrupted after " + std::to_string(lines.size() - 1) + " of 1200 rows"),
            std::string::npos)
      << run.err;
  EXPECT_NE(run.err.find(partial), std::string::npos) << run.err;
}

TEST(BatchInterrupt, CtrlCWithoutCsvSaysNothingWasWritten) {
  const Interrupted run = RunAndInterrupt({"--threads", "2"}, "interrupted_no_csv");
  ASSERT_TRUE(run.exited) << run.err;
  EXPECT_EQ(run.exit_code, 130) << run.err;
  EXPECT_NE(run.err.find("of 200 rows; nothing was written"), std::string::npos) << run.err;
}

}  // namespace
}  // namespace wirefield::cli_test
