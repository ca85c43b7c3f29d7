// CLI tests: the estimate before a long solve and the progress lines during one
// (docs/commands.md, "Progress and estimates"). Both go to stderr only; stdout, the JSON
// above all, is the same with them as without. The delay is lowered through
// WIREFIELD_PROGRESS_AFTER so that a model of a few hundred segments, cheap to run, counts as
// long; WIREFIELD_PROGRESS=1 forces the lines though stderr is a pipe here.
#include <gtest/gtest.h>

#include <cstdlib>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <vector>

#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

// Sets an environment variable for the life of the object, then restores it.
class ScopedEnvironment {
 public:
  ScopedEnvironment(const char* name, const char* value) : name_(name) {
    if (const char* old = std::getenv(name)) old_ = old;
    if (value) {
      ::setenv(name, value, 1);
    } else {
      ::unsetenv(name);
    }
  }
  ~ScopedEnvironment() {
    if (old_) {
      ::setenv(name_, old_->c_str(), 1);
    } else {
      ::unsetenv(name_);
    }
  }
  ScopedEnvironment(const ScopedEnvironment&) = delete;
  ScopedEnvironment& operator=(const ScopedEnvironment&) = delete;

 private:
  const char* name_;
  std::optional<std::string> old_;
};

// 400 segments: some 0.1 s to run, an estimated few milliseconds.
std::string Model() {
  return WriteScratchFile("progress_dipole.wire",
                          "wire dip from (0, -5.1, 10) to (0, 5.1, 10) radius 1mm segments 400\n"
                          "feed src at dip@50%\nground perfect\nfrequency 14.2MHz\n");
}

bool Contains(const std::string& text, const std::string& part) {
  return text.find(part) != std::string::npos;
}

TEST(Progress, EstimateLineAppearsBeforeASolveLongerThanTheDelay) {
  const ScopedEnvironment after("WIREFIELD_PROGRESS_AFTER", "0.000001");
  const ScopedEnvironment forced("WIREFIELD_PROGRESS", nullptr);
  for (const char* command : {"solve", "pattern"}) {
    const ProgramRun run = RunWirefield({command, Model()});
    ASSERT_EQ(run.exit_code, 0) << Describe(run) << run.err;
    // The matrix of 399 unknowns: 16 * 399^2 bytes = 2.55 MB.
    EXPECT_TRUE(Contains(run.err, "wirefield: 399 unknowns: the matrix takes 0.00255 GB of memory"))
        << command << ": " << run.err;
    EXPECT_TRUE(Contains(run.err, "(an estimate")) << run.err;
    EXPECT_FALSE(Contains(run.out, "unknowns: the matrix takes")) << run.out;
  }
}

TEST(Progress, NoEstimateLineForAShortSolveAtTheDefaultDelay) {
  const ScopedEnvironment after("WIREFIELD_PROGRESS_AFTER", nullptr);
  const ScopedEnvironment forced("WIREFIELD_PROGRESS", "1");
  const ProgramRun run = RunWirefield({"solve", Model()});
  ASSERT_EQ(run.exit_code, 0) << Describe(run);
  EXPECT_FALSE(Contains(run.err, "the matrix takes")) << run.err;
  EXPECT_FALSE(Contains(run.err, "wirefield: fill")) << run.err;  // done before 3 s
}

// `solve --json` and `pattern --json --step 5` of the model, with WIREFIELD_PROGRESS set to
// `progress` and no delay before the lines.
struct SolveAndPattern {
  ProgramRun solve;
  ProgramRun pattern;
};

SolveAndPattern RunWithProgress(const char* progress) {
  const ScopedEnvironment forced("WIREFIELD_PROGRESS", progress);
  const ScopedEnvironment after("WIREFIELD_PROGRESS_AFTER", "0");
  return {RunWirefield({"solve", Model(), "--json"}),
          RunWirefield({"pattern", Model(), "--json", "--step", "5"})};
}

TEST(Progress, ForcedLinesGoToStderrOnlyAndLeaveTheJsonAlone) {
  const SolveAndPattern plain = RunWithProgress("0");
  ASSERT_EQ(plain.solve.exit_code, 0) << Describe(plain.solve);
  ASSERT_EQ(plain.pattern.exit_code, 0) << Describe(plain.pattern);
  // WIREFIELD_PROGRESS=0: neither lines nor the estimate, whatever the delay.
  EXPECT_FALSE(Contains(plain.solve.err + plain.pattern.err, "wirefield: "))
      << plain.solve.err << plain.pattern.err;
  const std::string& plain_solve = plain.solve.out;
  const std::string& plain_pattern = plain.pattern.out;
  const auto [solve, pattern] = RunWithProgress("1");
  ASSERT_EQ(solve.exit_code, 0) << Describe(solve);
  ASSERT_EQ(pattern.exit_code, 0) << Describe(pattern);
  // A line at once (delay 0) for each stage, and its end.
  EXPECT_TRUE(Contains(solve.err, "wirefield: fill ")) << solve.err;
  EXPECT_TRUE(Contains(solve.err, "wirefield: fill done in")) << solve.err;
  EXPECT_TRUE(Contains(solve.err, "wirefield: factorisation running (")) << solve.err;
  EXPECT_TRUE(Contains(solve.err, "estimated")) << solve.err;
  EXPECT_TRUE(Contains(pattern.err, "wirefield: pattern ")) << pattern.err;
  EXPECT_TRUE(Contains(pattern.err, "wirefield: pattern done in")) << pattern.err;
  // Nothing of it on stdout: the same bytes as without progress, and valid JSON.
  EXPECT_EQ(solve.out, plain_solve);
  EXPECT_EQ(pattern.out, plain_pattern);
  EXPECT_TRUE(nlohmann::json::accept(solve.out));
  EXPECT_TRUE(nlohmann::json::accept(pattern.out));
}

TEST(Progress, NoLinesWhenStderrIsNotATerminalAndNothingForcesThem) {
  const ScopedEnvironment forced("WIREFIELD_PROGRESS", nullptr);
  const ScopedEnvironment after("WIREFIELD_PROGRESS_AFTER", "0");
  const ProgramRun run = RunWirefield({"pattern", Model(), "--step", "5"});
  ASSERT_EQ(run.exit_code, 0) << Describe(run);
  EXPECT_FALSE(Contains(run.err, "wirefield: fill")) << run.err;
  EXPECT_FALSE(Contains(run.err, "wirefield: pattern ")) << run.err;
  // The estimate is a note, not progress: it is printed for a pipe too.
  EXPECT_TRUE(Contains(run.err, "unknowns: the matrix takes")) << run.err;
}

}  // namespace
}  // namespace wirefield::cli_test
