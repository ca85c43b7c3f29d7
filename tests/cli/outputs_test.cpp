// CLI tests: the files a command writes (--csv, --svg, --s1p, batch's CSV.partial) never cost
// the user data (docs/commands.md, "Output files"). An output that is one of the run's inputs
// (the same file by any name: a symbolic link, a hard link) and two outputs onto one file are
// refused with exit 2 and nothing written; a device node or a FIFO is written through, never
// replaced by a regular file; a FIFO without a reader is an error, not a hang; an existing
// file keeps its permission bits; a symbolic link keeps pointing where it did; a signal during
// the write leaves no temporary file; concurrent runs onto the same outputs leave the whole
// set of one run. (Renaming, linking and device numbers as in POSIX rename(2), link(2),
// mknod(2); /dev/null is character device 1,3 on Linux, Documentation/admin-guide/devices.txt.)
#include <fcntl.h>
#include <gtest/gtest.h>
#include <signal.h>
#include <sys/socket.h>
#include <sys/stat.h>
#include <sys/sysmacros.h>
#include <sys/un.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <array>
#include <chrono>
#include <filesystem>
#include <string>
#include <thread>
#include <vector>

#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

namespace fs = std::filesystem;

const std::string kModel =
    "units m\n"
    "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm\n"
    "feed src at dip@50%\n"
    "frequency 14.2MHz\n";

// A short sweep of `model` with `extra` flags.
std::vector<std::string> Sweep(const std::string& model, const std::vector<std::string>& extra,
                               const std::string& from = "14MHz", const std::string& points = "5") {
  std::vector<std::string> args{
      "sweep", model, "--from", from, "--to", "14.4MHz", "--points", points, "--no-mesh-estimate"};
  args.insert(args.end(), extra.begin(), extra.end());
  return args;
}

// A path in the scratch folder where nothing is (yet).
// (Never opened: a FIFO left by an earlier repeat of a test would block an open for writing.)
std::string FreshPath(const std::string& name) {
  const fs::path folder = fs::path(WriteScratchFile("fresh_path_probe", "")).parent_path();
  const fs::path path = folder / name;
  fs::remove(path);
  return path.string();
}

std::string ScratchPath(const std::string& name) { return WriteScratchFile(name, "old\n"); }

// Runs `args`, expects exit 2 with `fragment` in the diagnostic and nothing on stdout, and
// checks that every file of `unchanged` still holds "old\n" (or `kModel` for the model) and
// that no temporary is left beside it.
void ExpectRefused(const std::string& name, const std::vector<std::string>& args,
                   const std::string& fragment, const std::vector<std::string>& unchanged,
                   const std::vector<std::string>& absent = {}) {
  SCOPED_TRACE(name);
  const ProgramRun run = RunWirefield(args, RunLimits{30});
  ASSERT_TRUE(run.exited) << Describe(run);
  EXPECT_EQ(run.exit_code, 2) << Describe(run);
  EXPECT_EQ(run.out, "");
  EXPECT_NE(run.err.find(fragment), std::string::npos) << run.err;
  EXPECT_EQ(run.err.find('\n'), run.err.size() - 1) << "one diagnostic line: " << run.err;
  for (const std::string& path : unchanged) {
    const std::string text = ReadFile(path);
    EXPECT_TRUE(text == "old\n" || text == kModel) << path << " was changed";
    EXPECT_FALSE(TemporaryLeftBeside(path)) << path;
  }
  for (const std::string& path : absent) {
    EXPECT_FALSE(fs::exists(fs::symlink_status(path))) << path << " was written";
  }
}

TEST(OutputFiles, AnOutputOntoAnInputIsRefusedWhateverItsName) {
  const std::string model = WriteScratchFile("input_model.wire", kModel);
  const std::string other = WriteScratchFile("input_other.wire", kModel);
  const std::string hard = FreshPath("input_model_hard.wire");
  fs::create_hard_link(model, hard);
  const std::string link = FreshPath("input_model_link.wire");
  fs::create_symlink("input_model.wire", link);  // relative, as `ln -s` makes it
  // A measured file: the Touchstone file of a sweep of the same model.
  const std::string measured = FreshPath("input_measured.s1p");
  ASSERT_EQ(RunWirefield(Sweep(model, {"--s1p", measured})).exit_code, 0);
  const std::string measured_text = ReadFile(measured);
  const std::string csv = FreshPath("input_new.csv");
  const std::vector<std::string> batch{
      "batch", model, "--from", "14MHz", "--to", "14.4MHz", "--points", "3", "--no-mesh-estimate"};
  auto with = [](std::vector<std::string> args, const std::vector<std::string>& extra) {
    args.insert(args.end(), extra.begin(), extra.end());
    return args;
  };
  // The message names the output, says which input it is and what to do.
  const std::string fragment = "is the model file";
  ExpectRefused("sweep --csv MODEL", Sweep(model, {"--csv", model}), fragment, {model});
  ExpectRefused("sweep --svg HARD LINK", Sweep(model, {"--csv", csv, "--svg", hard}), fragment,
                {model}, {csv});
  ExpectRefused("sweep --s1p SYMLINK", Sweep(model, {"--s1p", link}), fragment, {model});
  ExpectRefused("pattern --csv MODEL", {"pattern", model, "--step", "10", "--csv", model}, fragment,
                {model});
  ExpectRefused("pattern --svg SYMLINK", {"pattern", model, "--step", "10", "--svg", link},
                fragment, {model});
  ExpectRefused("batch --csv MODEL", with(batch, {"--csv", model}), fragment, {model});
  ExpectRefused("batch --csv COMPARED MODEL", with(batch, {"--compare", other, "--csv", other}),
                fragment, {other});
  ExpectRefused("sweep --s1p MEASURED",
                Sweep(model, {"--measured", measured, "--csv", csv, "--s1p", measured}),
                "is the measured file", {model}, {csv});
  EXPECT_EQ(ReadFile(measured), measured_text);
  EXPECT_TRUE(fs::is_symlink(link));
}

TEST(OutputFiles, TwoOutputsOntoOneFileAreRefused) {
  const std::string model = WriteScratchFile("two_model.wire", kModel);
  const std::string out = FreshPath("two.out");
  const std::string dangling = FreshPath("two_link.out");
  fs::create_symlink(out, dangling);  // points to `out`, which is not there yet
  const std::string existing = ScratchPath("two_existing.out");
  const std::string hard = FreshPath("two_hard.out");
  fs::create_hard_link(existing, hard);
  const std::string fragment = "both";
  ExpectRefused("--csv F --svg F", Sweep(model, {"--csv", out, "--svg", out}), fragment, {}, {out});
  ExpectRefused("--csv F --s1p LINK TO F", Sweep(model, {"--csv", out, "--s1p", dangling}),
                fragment, {}, {out});
  ExpectRefused("--svg F --s1p HARD LINK OF F", Sweep(model, {"--svg", existing, "--s1p", hard}),
                fragment, {existing});
  ExpectRefused("pattern --csv F --svg F",
                {"pattern", model, "--step", "10", "--csv", out, "--svg", out}, fragment, {},
                {out});
}

TEST(OutputFiles, AnOutputOntoTheFileOfStdoutIsRefused) {
  const std::string model = WriteScratchFile("stdout_model.wire", kModel);
  // stdout of a spawned run is STEM.out in the scratch folder: name it as the CSV.
  const std::string stdout_path = FreshPath("stdout_target.out");
  const SpawnedRun target = SpawnWirefield(Sweep(model, {"--csv", stdout_path}), "stdout_target");
  ASSERT_EQ(target.out_path, stdout_path);
  const int status = WaitForRun(target.pid, 30);
  ASSERT_TRUE(WIFEXITED(status));
  EXPECT_EQ(WEXITSTATUS(status), 2) << ReadFile(target.err_path);
  EXPECT_NE(ReadFile(target.err_path).find("standard output"), std::string::npos)
      << ReadFile(target.err_path);
  EXPECT_FALSE(TemporaryLeftBeside(stdout_path));
}

TEST(OutputFiles, AnExistingFileKeepsItsPermissionBits) {
  const std::string model = WriteScratchFile("mode_model.wire", kModel);
  const std::string csv = ScratchPath("mode.csv");
  fs::permissions(csv, fs::perms::owner_read | fs::perms::owner_write);  // 0600
  const ProgramRun run = RunWirefield(Sweep(model, {"--csv", csv}));
  ASSERT_EQ(run.exit_code, 0) << Describe(run);
  EXPECT_NE(ReadFile(csv), "old\n");
  struct stat after {};
  ASSERT_EQ(::stat(csv.c_str(), &after), 0);
  EXPECT_EQ(after.st_mode & 07777, 0600u);
}

TEST(OutputFiles, ASymbolicLinkIsFollowedAndKept) {
  const std::string model = WriteScratchFile("symlink_model.wire", kModel);
  const std::string target = ScratchPath("symlink_target.csv");
  const std::string link = FreshPath("symlink.csv");
  fs::create_symlink("symlink_target.csv", link);
  const std::string dangling = FreshPath("symlink_dangling.svg");
  const std::string dangling_target = FreshPath("symlink_dangling_target.svg");
  fs::create_symlink("symlink_dangling_target.svg", dangling);
  const ProgramRun run = RunWirefield(Sweep(model, {"--csv", link, "--svg", dangling}));
  ASSERT_EQ(run.exit_code, 0) << Describe(run);
  EXPECT_TRUE(fs::is_symlink(link));
  EXPECT_TRUE(fs::is_symlink(dangling));
  EXPECT_EQ(ReadFile(target).rfind("frequency_hz", 0), 0u) << ReadFile(target).substr(0, 80);
  EXPECT_NE(ReadFile(dangling_target).find("<svg"), std::string::npos);
  EXPECT_FALSE(TemporaryLeftBeside(target));
  EXPECT_FALSE(TemporaryLeftBeside(link));
}

TEST(OutputFiles, ADeviceNodeIsWrittenThroughNotReplaced) {
  const std::string model = WriteScratchFile("device_model.wire", kModel);
  const std::string node = FreshPath("device_null");
  // A copy of /dev/null: character device 1,3.
  if (::mknod(node.c_str(), S_IFCHR | 0666, makedev(1, 3)) != 0) {
    GTEST_SKIP() << "mknod is not permitted here";
  }
  const ProgramRun run = RunWirefield(Sweep(model, {"--csv", node, "--s1p", node + ".s1p"}));
  ASSERT_EQ(run.exit_code, 0) << Describe(run);
  struct stat after {};
  ASSERT_EQ(::lstat(node.c_str(), &after), 0);
  EXPECT_TRUE(S_ISCHR(after.st_mode)) << "the device node was replaced";
  EXPECT_EQ(after.st_rdev, makedev(1, 3));
  EXPECT_FALSE(TemporaryLeftBeside(node));
  EXPECT_NE(ReadFile(node + ".s1p"), "");
}

TEST(OutputFiles, AFifoWithoutAReaderIsAnErrorNotAHang) {
  const std::string model = WriteScratchFile("fifo_model.wire", kModel);
  const std::string fifo = FreshPath("fifo_no_reader");
  ASSERT_EQ(::mkfifo(fifo.c_str(), 0600), 0);
  const std::string svg = FreshPath("fifo_no_reader.svg");
  const auto start = std::chrono::steady_clock::now();
  const ProgramRun run = RunWirefield(Sweep(model, {"--svg", svg, "--csv", fifo}), RunLimits{20});
  const double seconds =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  ASSERT_TRUE(run.exited) << Describe(run);
  EXPECT_EQ(run.exit_code, 2) << Describe(run);
  EXPECT_NE(run.err.find("no program is reading"), std::string::npos) << run.err;
  EXPECT_LT(seconds, 10.0);
  struct stat after {};
  ASSERT_EQ(::lstat(fifo.c_str(), &after), 0);
  EXPECT_TRUE(S_ISFIFO(after.st_mode));
  EXPECT_FALSE(fs::exists(svg)) << "nothing is written when one output fails";
  EXPECT_FALSE(TemporaryLeftBeside(fifo));
  EXPECT_FALSE(TemporaryLeftBeside(svg));
}

TEST(OutputFiles, AFifoWithAReaderGetsTheFile) {
  const std::string model = WriteScratchFile("fifo_read_model.wire", kModel);
  const std::string fifo = FreshPath("fifo_reader");
  ASSERT_EQ(::mkfifo(fifo.c_str(), 0600), 0);
  // The test holds the reading end; the CSV of 5 points fits the pipe's buffer (64 KiB on
  // Linux, pipe(7)), so the run need not wait for the test to read.
  const int reader = ::open(fifo.c_str(), O_RDONLY | O_NONBLOCK);
  ASSERT_GE(reader, 0);
  const ProgramRun run = RunWirefield(Sweep(model, {"--csv", fifo}), RunLimits{20});
  std::string received;
  std::array<char, 4096> buffer{};
  for (ssize_t n; (n = ::read(reader, buffer.data(), buffer.size())) > 0;) {
    received.append(buffer.data(), static_cast<size_t>(n));
  }
  ::close(reader);
  ASSERT_EQ(run.exit_code, 0) << Describe(run);
  EXPECT_EQ(received.rfind("frequency_hz", 0), 0u) << received.substr(0, 80);
  struct stat after {};
  ASSERT_EQ(::lstat(fifo.c_str(), &after), 0);
  EXPECT_TRUE(S_ISFIFO(after.st_mode));
}

// Paths that cannot take a file, each refused before any work with what to change.
TEST(OutputFiles, AFolderASocketOrAnEmptyNameIsRefused) {
  const std::string model = WriteScratchFile("refused_model.wire", kModel);
  const std::string folder = FreshPath("refused_folder.csv");
  fs::create_directory(folder);
  const std::string socket_path = FreshPath("refused.sock");
  const int socket_fd = ::socket(AF_UNIX, SOCK_STREAM, 0);
  ASSERT_GE(socket_fd, 0);
  sockaddr_un address{};
  address.sun_family = AF_UNIX;
  ASSERT_LT(socket_path.size(), sizeof address.sun_path);
  std::copy(socket_path.begin(), socket_path.end(), address.sun_path);
  ASSERT_EQ(::bind(socket_fd, reinterpret_cast<sockaddr*>(&address), sizeof address), 0);
  const std::string svg = FreshPath("refused.svg");
  ExpectRefused("--csv FOLDER", Sweep(model, {"--svg", svg, "--csv", folder}), "is a folder", {},
                {svg});
  ExpectRefused("--csv SOCKET", Sweep(model, {"--svg", svg, "--csv", socket_path}), "is a socket",
                {}, {svg});
  ExpectRefused("--csv ''", Sweep(model, {"--svg", svg, "--csv", ""}), "name is empty", {}, {svg});
  ExpectRefused("--svg IN A MISSING FOLDER", Sweep(model, {"--svg", folder + "/no/such.svg"}),
                "cannot write the SVG file", {});
  ::close(socket_fd);
  EXPECT_TRUE(fs::is_directory(folder));
}

// A signal while the program writes its files: the run is blocked writing a large CSV into a
// FIFO nobody reads, after its SVG and Touchstone temporaries are complete.
TEST(OutputFiles, ASignalDuringTheWriteLeavesNoTemporaryAndNoFile) {
  const std::string model = WriteScratchFile("signal_model.wire", kModel);
  for (const int signal : {SIGTERM, SIGHUP, SIGINT}) {
    SCOPED_TRACE(signal);
    const std::string stem = "signal_" + std::to_string(signal);
    const std::string fifo = FreshPath(stem + ".fifo");
    ASSERT_EQ(::mkfifo(fifo.c_str(), 0600), 0);
    const int reader = ::open(fifo.c_str(), O_RDONLY | O_NONBLOCK);
    ASSERT_GE(reader, 0);
    const std::string svg = ScratchPath(stem + ".svg");
    const std::string s1p = ScratchPath(stem + ".s1p");
    // 5000 points: a CSV of about 500 kB, far more than the pipe's 64 KiB.
    const SpawnedRun child = SpawnWirefield(
        Sweep(model, {"--csv", fifo, "--svg", svg, "--s1p", s1p}, "14MHz", "5000"), stem);
    ASSERT_GT(child.pid, 0);
    bool blocked = false;
    const auto deadline = std::chrono::steady_clock::now() + std::chrono::seconds(30);
    while (!blocked && std::chrono::steady_clock::now() < deadline) {
      blocked = TemporaryLeftBeside(svg) && TemporaryLeftBeside(s1p);
      if (!blocked) std::this_thread::sleep_for(std::chrono::milliseconds(5));
    }
    EXPECT_TRUE(blocked) << "the run never held its temporaries: " << ReadFile(child.err_path);
    std::this_thread::sleep_for(std::chrono::milliseconds(100));  // into the blocked write
    ::kill(child.pid, signal);
    const int status = WaitForRun(child.pid, 30);
    ::close(reader);
    EXPECT_TRUE(WIFSIGNALED(status) && WTERMSIG(status) == signal) << status;
    EXPECT_FALSE(TemporaryLeftBeside(svg));
    EXPECT_FALSE(TemporaryLeftBeside(s1p));
    EXPECT_EQ(ReadFile(svg), "old\n");
    EXPECT_EQ(ReadFile(s1p), "old\n");
  }
}

// Five sweeps at once onto the same CSV, SVG and Touchstone files, each of other frequencies:
// in every round the three files must all come from one run. Before the set was renamed
// under a lock, mixed sets were seen (figures in the commit that added this test).
TEST(OutputFiles, ConcurrentRunsLeaveTheWholeSetOfOneRun) {
  const std::string model = WriteScratchFile("concurrent_model.wire", kModel);
  const std::vector<std::string> outputs{FreshPath("concurrent.csv"), FreshPath("concurrent.svg"),
                                         FreshPath("concurrent.s1p")};
  constexpr int kRuns = 5;
  auto args = [&](int i) {
    return Sweep(model, {"--csv", outputs[0], "--svg", outputs[1], "--s1p", outputs[2]},
                 std::to_string(14000 + 10 * i) + "kHz");
  };
  auto read_set = [&] {
    std::vector<std::string> set;
    for (const std::string& path : outputs) set.push_back(ReadFile(path));
    return set;
  };
  std::vector<std::vector<std::string>> expected;
  for (int i = 0; i < kRuns; ++i) {
    ASSERT_EQ(RunWirefield(args(i)).exit_code, 0);
    expected.push_back(read_set());
  }
  constexpr int kRounds = 20;
  int mixed = 0;
  for (int round = 0; round < kRounds; ++round) {
    std::vector<SpawnedRun> children;
    for (int i = 0; i < kRuns; ++i) {
      children.push_back(SpawnWirefield(args(i), "concurrent_" + std::to_string(i)));
    }
    for (const SpawnedRun& child : children) {
      ASSERT_GT(child.pid, 0);
      const int status = WaitForRun(child.pid, 60);
      EXPECT_TRUE(WIFEXITED(status) && WEXITSTATUS(status) == 0) << ReadFile(child.err_path);
    }
    const std::vector<std::string> set = read_set();
    bool one_run = false;
    for (const auto& candidate : expected) one_run = one_run || candidate == set;
    if (!one_run) ++mixed;
    for (const std::string& path : outputs) EXPECT_FALSE(TemporaryLeftBeside(path));
  }
  EXPECT_EQ(mixed, 0) << mixed << " of " << kRounds << " rounds left a mixed set";
}

}  // namespace
}  // namespace wirefield::cli_test
