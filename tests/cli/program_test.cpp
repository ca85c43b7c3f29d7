// CLI tests: the program's own surface: --version, --help, unknown options and missing
// commands, and the exit codes of docs/commands.md (0 done, 2 bad input, 1 failed run).
// Runs the built binary; checks exit codes and the exact text users see.
#include <fmt/format.h>
#include <gtest/gtest.h>

#include <regex>
#include <string>
#include <utility>
#include <vector>

#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

TEST(Program, VersionPrintsOneLineAndExitsZero) {
  const ProgramRun run = RunWirefield({"--version"});
  ASSERT_TRUE(run.exited) << Describe(run);
  EXPECT_EQ(run.exit_code, 0);
  EXPECT_EQ(run.out, "wirefield 0.1.0\n");  // CMakeLists.txt: project(wirefield VERSION 0.1.0)
  EXPECT_EQ(run.err, "");
}

TEST(Program, HelpExitsZeroAndListsTheSolveCommand) {
  const ProgramRun run = RunWirefield({"--help"});
  ASSERT_TRUE(run.exited) << Describe(run);
  EXPECT_EQ(run.exit_code, 0);
  EXPECT_NE(run.out.find("solve"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("Exit codes: 0 done; 1 the computation failed; 2 the input or an "
                         "option is wrong."),
            std::string::npos)
      << run.out;
}

TEST(Program, SolveHelpDescribesEveryOptionWithItsDefault) {
  const ProgramRun run = RunWirefield({"solve", "--help"});
  ASSERT_TRUE(run.exited) << Describe(run);
  EXPECT_EQ(run.exit_code, 0);
  for (const char* option : {"--freq", "--set", "--z0", "--json"}) {
    EXPECT_NE(run.out.find(option), std::string::npos) << option << " missing in\n" << run.out;
  }
  EXPECT_NE(run.out.find("Default: the model's `frequency` statement."), std::string::npos);
  EXPECT_NE(run.out.find("Default: the model's `z0`, else 50 ohm."), std::string::npos);
}

TEST(Program, NoCommandIsABadInputWithAHint) {
  const ProgramRun run = RunWirefield({});
  ASSERT_TRUE(run.exited) << Describe(run);
  EXPECT_EQ(run.exit_code, 2);
  EXPECT_EQ(run.out, "");
  EXPECT_NE(run.err.find("Run `wirefield --help` to see the options."), std::string::npos)
      << run.err;
}

TEST(Program, UnknownOptionExitsTwoNotTheParserLibraryCode) {
  const ProgramRun run =
      RunWirefield({"solve", ModelsDir() + "/hiking_club_dipole.wire", "--frequency", "14MHz"});
  ASSERT_TRUE(run.exited) << Describe(run);
  EXPECT_EQ(run.exit_code, 2);
  EXPECT_EQ(run.out, "");
  EXPECT_TRUE(std::regex_search(run.err, std::regex("^wirefield: error: .*--frequency")))
      << run.err;
  EXPECT_NE(run.err.find("Run `wirefield solve --help` to see the options."), std::string::npos)
      << run.err;
}

TEST(Program, UnknownCommandIsNamedWithTheListOfCommands) {
  const ProgramRun run = RunWirefield({"polish", "model.wire"});
  ASSERT_TRUE(run.exited) << Describe(run);
  EXPECT_EQ(run.exit_code, 2);
  EXPECT_EQ(run.out, "");
  EXPECT_EQ(run.err,
            "wirefield: error: unknown command 'polish'; the commands are solve, pattern, sweep, "
            "batch, coil, tune\nRun `wirefield --help` to see the options.\n");
}

TEST(Program, MistypedCommandGetsADidYouMean) {
  // One letter dropped (edit distance 1) and two letters swapped (edit distance 2 within a
  // third of the word's 7 letters): both are slips of a command's name.
  for (const auto& [typed, meant] : std::vector<std::pair<std::string, std::string>>{
           {"solv", "solve"}, {"pattren", "pattern"}, {"SWEEP", "sweep"}}) {
    const ProgramRun run = RunWirefield({typed, ModelsDir() + "/hiking_club_dipole.wire"});
    ASSERT_TRUE(run.exited) << Describe(run);
    EXPECT_EQ(run.exit_code, 2) << typed;
    EXPECT_EQ(run.out, "");
    EXPECT_EQ(run.err.rfind(fmt::format("wirefield: error: unknown command '{}' (did you mean "
                                        "'{}'?); the commands are solve, pattern, sweep, batch, "
                                        "coil, tune\n",
                                        typed, meant),
                            0),
              0u)
        << run.err;
  }
}

TEST(Program, SolveWithoutAModelExitsTwo) {
  const ProgramRun run = RunWirefield({"solve"});
  ASSERT_TRUE(run.exited) << Describe(run);
  EXPECT_EQ(run.exit_code, 2);
  EXPECT_NE(run.err.find("MODEL"), std::string::npos) << run.err;
}

TEST(Program, FailedComputationExitsOneWithAComputationMessage) {
  // Well-formed input whose numbers overflow the feed chain: every value is in its allowed
  // range and the line's loss is 900 dB at its own figure (1 MHz), but scaled as sqrt(f) it is
  // 9000 dB at 100 MHz, past the 709 nepers (6158 dB) where e^x overflows double precision
  // (the largest double is about 1.8e308, IEEE 754).
  const std::string path =
      WriteScratchFile("overflowing_line.wire",
                       "wire w from (-5, 0, 10) to (5, 0, 10) radius 1mm\n"
                       "feed f at w@50%\n"
                       "line feeder at f length 1e5 z0=50 velocity=0.66 loss=0.9@1MHz\n"
                       "frequency 100MHz\n");
  const ProgramRun run = RunWirefield({"solve", path, "--json"});
  ASSERT_TRUE(run.exited) << Describe(run);
  EXPECT_EQ(run.exit_code, 1) << Describe(run);
  EXPECT_EQ(run.out, "");
  EXPECT_EQ(run.err.rfind("wirefield: computation failed: ", 0), 0u) << run.err;
  // The message says what happened: an overflow in the chain, not a non-finite impedance.
  EXPECT_NE(run.err.find("overflow double precision"), std::string::npos) << run.err;
  EXPECT_NE(run.err.find("feed line 'feeder' has a total loss too large"), std::string::npos)
      << run.err;
}

TEST(Program, SolvingTheDemoModelExitsZeroWithAReport) {
  const ProgramRun run = RunWirefield({"solve", ModelsDir() + "/hiking_club_dipole.wire"});
  ASSERT_TRUE(run.exited) << Describe(run);
  EXPECT_EQ(run.exit_code, 0) << Describe(run);
  EXPECT_NE(run.out.find("frequency       14.200000 MHz"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("R (ohm)"), std::string::npos) << run.out;
  // The safety note of the project rules: high voltage, exposure, power lines, local rules.
  EXPECT_NE(run.out.find("Caution:"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("power lines"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("follow local rules and licensed practice"), std::string::npos) << run.out;
}

}  // namespace
}  // namespace wirefield::cli_test
