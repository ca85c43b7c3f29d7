// CLI tests: Ctrl-C, SIGTERM and SIGHUP during `wirefield batch`. The test starts a long batch
// in a child process (posix_spawn), sends it the signal midway, and checks what a user is
// promised (docs/commands.md, "Interrupting a batch"): exit code 128 + signal, the finished
// rows in CSV.partial with the CSV's header, the CSV file itself untouched, and a note on
// stderr naming the partial file.
#include <gtest/gtest.h>
#include <signal.h>
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

namespace wirefield::cli_test {
namespace {

// True once the process catches `signal` (bit signal-1 of SigCgt in /proc/PID/status, Linux
// proc(5)): the batch has installed its handler and is running rows. Waits at most `limit`.
bool WaitUntilCatching(pid_t pid, int signal, std::chrono::seconds limit) {
  const auto deadline = std::chrono::steady_clock::now() + limit;
  while (std::chrono::steady_clock::now() < deadline) {
    std::ifstream status("/proc/" + std::to_string(pid) + "/status");
    for (std::string line; std::getline(status, line);) {
      if (line.rfind("SigCgt:", 0) != 0) continue;
      const unsigned long long mask = std::stoull(line.substr(7), nullptr, 16);
      if ((mask >> (signal - 1)) & 1ull) return true;
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

// Runs a batch of the hiking club dipole with `extra` flags, sends `signal` once it is running
// rows (and a moment later, so that some rows finish), and waits for it to end.
Interrupted RunAndInterrupt(const std::vector<std::string>& extra, const std::string& stem,
                            int signal = SIGINT) {
  std::vector<std::string> args{"batch",    ModelsDir() + "/hiking_club_dipole.wire",
                                "--from",   "13.8MHz",
                                "--to",     "14.6MHz",
                                "--points", "5",
                                "--vary",   "total=9m:10.99m:0.01m"};
  args.insert(args.end(), extra.begin(), extra.end());
  Interrupted result;
  const SpawnedRun child = SpawnWirefield(args, stem);
  EXPECT_GT(child.pid, 0);
  if (child.pid <= 0) return result;
  EXPECT_TRUE(WaitUntilCatching(child.pid, signal, std::chrono::seconds(30)));
  std::this_thread::sleep_for(std::chrono::milliseconds(300));  // let some rows finish
  EXPECT_EQ(::kill(child.pid, signal), 0);
  // The rows in flight finish, then the program writes and exits; 60 s is ample.
  const int status = WaitForRun(child.pid, 60);
  result.exited = WIFEXITED(status);
  if (result.exited) result.exit_code = WEXITSTATUS(status);
  result.err = ReadFile(child.err_path);
  return result;
}

// Stops a one-thread batch with `signal` and checks the promise of docs/commands.md: exit
// 128 + signal, the finished rows in CSV.partial, the CSV itself untouched, no temporary.
void ExpectFinishedRowsKept(int signal, const std::string& stem) {
  const std::string csv = WriteScratchFile(stem + ".csv", "old results\n");
  const std::string partial = csv + ".partial";
  std::filesystem::remove(partial);
  // 200 x 6 = 1200 rows on one thread: tens of milliseconds each, so about a minute in all,
  // far longer than the fraction of a second before the interrupt on any machine.
  const Interrupted run =
      RunAndInterrupt({"--vary", "height=1m:6m:1m", "--threads", "1", "--csv", csv}, stem, signal);
  ASSERT_TRUE(run.exited) << run.err;
  EXPECT_EQ(run.exit_code, 128 + signal) << run.err;  // as a shell reports it
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

TEST(BatchInterrupt, CtrlCWritesTheFinishedRowsToAPartialFileAndKeepsTheOldCsv) {
  ExpectFinishedRowsKept(SIGINT, "interrupted");  // exit 130
}

// A batch stopped by `kill` (SIGTERM) or by a closed terminal (SIGHUP) keeps its rows alike.
TEST(BatchInterrupt, SigtermKeepsTheFinishedRowsLikeCtrlC) {
  ExpectFinishedRowsKept(SIGTERM, "terminated");  // exit 143
}

TEST(BatchInterrupt, SighupKeepsTheFinishedRowsLikeCtrlC) {
  ExpectFinishedRowsKept(SIGHUP, "hung_up");  // exit 129
}

TEST(BatchInterrupt, CtrlCWithoutCsvSaysNothingWasWritten) {
  const Interrupted run = RunAndInterrupt({"--threads", "2"}, "interrupted_no_csv");
  ASSERT_TRUE(run.exited) << run.err;
  EXPECT_EQ(run.exit_code, 130) << run.err;
  EXPECT_NE(run.err.find("of 200 rows; nothing was written"), std::string::npos) << run.err;
}

// The flags of a fast streamed grid: 2 sweep points, one coarse pattern, no mesh estimate.
std::vector<std::string> FastBatch(const std::vector<std::string>& extra) {
  std::vector<std::string> args{"batch",
                                ModelsDir() + "/hiking_club_dipole.wire",
                                "--from",
                                "13.8MHz",
                                "--to",
                                "14.6MHz",
                                "--points",
                                "2",
                                "--pattern-freq",
                                "14.2MHz",
                                "--pattern-step",
                                "10",
                                "--no-mesh-estimate",
                                "--threads",
                                "2"};
  args.insert(args.end(), extra.begin(), extra.end());
  return args;
}

// 502 heights x 200 lengths = 100400 rows, past the 100000 that the reports hold: the rows
// stream into the CSV's temporary as they finish. Its first 200 rows are the grid at 1 m.
const std::vector<std::string> kStreamedGrid{"--vary", "height=1m:502m:1m", "--vary",
                                             "total=9m:10.99m:0.01m", "--yes-large"};

// A streamed grid, stopped, keeps its finished rows in CSV.partial as a smaller grid does, and
// each is byte for byte the row of the same index of the grid written whole.
TEST(BatchInterrupt, StreamedGridKeepsRowsIdenticalToTheGridWrittenWhole) {
  const std::string csv = WriteScratchFile("streamed_interrupted.csv", "old results\n");
  const std::string partial = csv + ".partial";
  std::filesystem::remove(partial);
  std::vector<std::string> grid = kStreamedGrid;
  grid.insert(grid.end(), {"--csv", csv});
  const SpawnedRun child = SpawnWirefield(FastBatch(grid), "streamed_interrupted");
  ASSERT_GT(child.pid, 0);
  EXPECT_TRUE(WaitUntilCatching(child.pid, SIGINT, std::chrono::seconds(30)));
  std::this_thread::sleep_for(std::chrono::milliseconds(1500));  // some rows finish
  EXPECT_TRUE(TemporaryLeftBeside(csv)) << "the rows go to the CSV's temporary as they finish";
  EXPECT_EQ(::kill(child.pid, SIGINT), 0);
  const int status = WaitForRun(child.pid, 60);
  const std::string err = ReadFile(child.err_path);
  ASSERT_TRUE(WIFEXITED(status)) << err;
  EXPECT_EQ(WEXITSTATUS(status), 130) << err;
  EXPECT_EQ(ReadFile(csv), "old results\n") << "the final CSV must be left as it was";
  EXPECT_FALSE(TemporaryLeftBeside(csv));
  EXPECT_FALSE(TemporaryLeftBeside(partial));
  const std::vector<std::string> rows = Lines(ReadFile(partial));
  ASSERT_GE(rows.size(), 2u) << "no row finished in 1.5 s: " << err;
  EXPECT_NE(err.find("interrupted after " + std::to_string(rows.size() - 1) + " of 100400 rows"),
            std::string::npos)
      << err;

  const std::string whole_csv = WriteScratchFile("streamed_reference.csv", "");
  const ProgramRun whole = RunWirefield(
      FastBatch({"--vary", "height=1m", "--vary", "total=9m:10.99m:0.01m", "--csv", whole_csv}));
  ASSERT_TRUE(whole.exited && whole.exit_code == 0) << Describe(whole) << whole.err;
  const std::vector<std::string> expected = Lines(ReadFile(whole_csv));
  ASSERT_EQ(expected.size(), 201u);
  EXPECT_EQ(rows[0], expected[0]) << "the same header";
  int compared = 0;
  for (size_t i = 1; i < rows.size(); ++i) {
    const int index = std::stoi(rows[i].substr(0, rows[i].find(',')));
    if (index >= 200) continue;
    EXPECT_EQ(rows[i], expected[static_cast<size_t>(index) + 1]) << "row " << index;
    ++compared;
  }
  EXPECT_GE(compared, 1);
}

// The same signal a second time stops a streamed grid at once, and still leaves the CSV as it
// was and no temporary beside it (the handler removes the streamed CSV's temporary).
TEST(BatchInterrupt, SecondSignalStopsAStreamedGridWithoutATemporary) {
  const std::string csv = WriteScratchFile("streamed_twice.csv", "old results\n");
  std::vector<std::string> grid = kStreamedGrid;
  grid.insert(grid.end(), {"--csv", csv});
  const SpawnedRun child = SpawnWirefield(FastBatch(grid), "streamed_twice");
  ASSERT_GT(child.pid, 0);
  EXPECT_TRUE(WaitUntilCatching(child.pid, SIGTERM, std::chrono::seconds(30)));
  std::this_thread::sleep_for(std::chrono::milliseconds(500));
  EXPECT_TRUE(TemporaryLeftBeside(csv));
  EXPECT_EQ(::kill(child.pid, SIGTERM), 0);
  EXPECT_EQ(::kill(child.pid, SIGTERM), 0);
  const int status = WaitForRun(child.pid, 60);
  // Ended by the signal, or (had the rows in flight finished between the two) exit 143.
  EXPECT_TRUE((WIFSIGNALED(status) && WTERMSIG(status) == SIGTERM) ||
              (WIFEXITED(status) && WEXITSTATUS(status) == 143))
      << ReadFile(child.err_path);
  EXPECT_EQ(ReadFile(csv), "old results\n");
  EXPECT_FALSE(TemporaryLeftBeside(csv));
}

}  // namespace
}  // namespace wirefield::cli_test
