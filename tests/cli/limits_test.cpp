// CLI tests: the limits that keep a generated or mistaken input from exhausting the machine,
// each a clear error with exit code 2 (docs/commands.md, "Limits"): file size, expression
// nesting, wires, statements and the memory the matrix would need; and numerical failure
// (a matrix with no digits left) as exit code 1 with the likely cause.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

const std::string kTail =
    "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm\nfeed src at dip@50%\nfrequency "
    "14.2MHz\n";

TEST(Limits, ModelFileOver16MiBIsRefusedBeforeParsing) {
  // 16 MiB + 1 byte of comment lines: the size alone is refused.
  const std::size_t limit = std::size_t{16} << 20;
  std::string text;
  text.reserve(limit + 100);
  while (text.size() <= limit)
    text += "# a comment line of a generated file, 64 characters long #\n";
  const std::string path = WriteScratchFile("too_large.wire", text);
  EXPECT_EQ(RunBadInput({"solve", path}),
            path +
                ": error: the file is larger than 16 MiB; a model file is a few kB of text. Is "
                "this the right file?\n");
}

TEST(Limits, ExpressionNestingOf256LevelsIsAcceptedAnd257Refused) {
  const std::string at_limit = "let x = " + std::string(256, '(') + "1" + std::string(256, ')');
  const std::string ok_path = WriteScratchFile("nesting_256.wire", at_limit + "\n" + kTail);
  const ProgramRun ok = RunWirefield({"solve", ok_path});
  EXPECT_EQ(ok.exit_code, 0) << Describe(ok);
  const std::string over = "let x = " + std::string(257, '(') + "1" + std::string(257, ')');
  const std::string bad_path = WriteScratchFile("nesting_257.wire", over + "\n" + kTail);
  // The 257th '(' is at column 8 + 257.
  EXPECT_EQ(RunBadInput({"solve", bad_path}),
            bad_path +
                ":1:265: error: expression nested too deeply (more than 256 levels of "
                "parentheses, signs or powers); simplify it\n");
}

TEST(Limits, MoreThan10000WiresIsAnErrorAtTheWireTooMany) {
  std::string text = "units m\n";
  for (int i = 0; i <= 10000; ++i) {
    text += "wire w" + std::to_string(i) + " from (" + std::to_string(i) + ", 0, 10) to (" +
            std::to_string(i) + ", 0.5, 10) radius 1mm\n";
  }
  text += "feed src at w0@50%\nfrequency 14.2MHz\n";
  const std::string path = WriteScratchFile("too_many_wires.wire", text);
  EXPECT_EQ(RunBadInput({"solve", path}),
            path +
                ":10002:1: error: wire 'w10000' is wire number 10001; a model may have at most "
                "10000 wires (each needs at least 3 segments, and the matrix grows as the "
                "square of their sum)\n");
}

TEST(Limits, MoreThanAMillionStatementsIsAnError) {
  std::string text;
  for (int i = 0; i <= 1000000; ++i) text += "units m\n";  // 8 MB, under 16 MiB
  const std::string path = WriteScratchFile("too_many_statements.wire", text + kTail);
  EXPECT_EQ(RunBadInput({"solve", path}),
            path +
                ":1000001:1: error: the model has more than 1000000 statements; a model is made "
                "by hand or by a script, and this one looks like a generated file gone wrong\n");
}

TEST(Limits, MatrixThatWouldNotFitInMemorySaysHowMuchItNeeds) {
  // 40000 unknowns: 40000^2 complex doubles of 16 bytes = 23.84 GiB.
  const std::string path =
      WriteScratchFile("too_many_unknowns.wire",
                       "wire dip from (-5, 0, 10) to (5, 0, 10) radius 0.01mm segments 40001\n"
                       "feed src at dip@50%\nfrequency 14.2MHz\n");
  const std::string err = RunBadInput({"solve", path});
  EXPECT_EQ(err.rfind(path + ":1:1: error: wire 'dip' would need 40001 segments; the matrix "
                             "would take 23.8 GiB",
                      0),
            0u)
      << err;
}

TEST(NumericalFailure, SolveJsonCarriesTheConditionNumber) {
  const std::string path = WriteScratchFile("conditioned.wire", kTail);
  const ProgramRun run = RunWirefield({"solve", path, "--json"});
  ASSERT_EQ(run.exit_code, 0) << Describe(run);
  const nlohmann::json doc = nlohmann::json::parse(run.out);
  ASSERT_TRUE(doc.contains("condition_number"));
  ASSERT_TRUE(doc["condition_number"].is_number());
  // A condition number is at least 1 by definition (|Z| |Z^-1| >= |Z Z^-1| = 1), and the
  // solve refuses a matrix above 1e14.
  EXPECT_GE(doc["condition_number"].get<double>(), 1.0);
  EXPECT_LT(doc["condition_number"].get<double>(), 1e14);
  ASSERT_TRUE(doc["relative_residual"].is_number());
  EXPECT_LT(doc["relative_residual"].get<double>(), 1e-6);
}

TEST(InputFailure, TwoWiresOnTopOfEachOtherAreAnInputErrorNamingBoth) {
  // Two identical wires carry currents the matrix cannot tell apart: its rows repeat, so it
  // would be singular (any textbook on linear algebra: equal rows make the determinant zero).
  // The mesher refuses them before the solve, at the later wire (once this was exit 1 from a
  // singular matrix).
  const std::string path = WriteScratchFile("wires_on_each_other.wire",
                                            "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm\n"
                                            "wire dup from (-5, 0, 10) to (5, 0, 10) radius 1mm\n"
                                            "feed src at dip@50%\nfrequency 14.2MHz\n");
  for (const bool json : {false, true}) {
    std::vector<std::string> args{"solve", path};
    if (json) args.emplace_back("--json");
    const ProgramRun run = RunWirefield(args);
    ASSERT_TRUE(run.exited) << Describe(run);
    EXPECT_EQ(run.exit_code, 2) << Describe(run);
    EXPECT_EQ(run.out, "");
    EXPECT_EQ(run.err.rfind(path + ":2:1: error: wires 'dip' and 'dup' overlap along 10 m", 0), 0u)
        << run.err;
  }
}

}  // namespace
}  // namespace wirefield::cli_test
