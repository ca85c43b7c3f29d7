// CLI tests: every class of bad input reaches the user as one diagnostic on stderr, in the
// form "FILE:LINE:COLUMN: error: MESSAGE" (or "FILE: error:" when there is no line), with exit
// code 2 and nothing on stdout (docs/commands.md, "Exit codes"). A few representative cases
// per class; the model stage's own tests pin every message of the language.
#include <fcntl.h>
#include <gtest/gtest.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <ostream>
#include <string>
#include <vector>

#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

// A model that solves; the cases below break one line of it.
const std::string kGoodModel =
    "units m\n"
    "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm\n"
    "feed src at dip@50%\n"
    "frequency 14.2MHz\n";

// kGoodModel with its line `line` (from 1) replaced by `text`, or removed when `text` is empty.
std::string GoodModelWith(std::size_t line, const std::string& text) {
  std::string model;
  std::size_t number = 0;
  for (std::size_t start = 0; start < kGoodModel.size(); ++number) {
    const std::size_t end = kGoodModel.find('\n', start) + 1;
    if (number + 1 != line) {
      model += kGoodModel.substr(start, end - start);
    } else if (!text.empty()) {
      model += text + "\n";
    }
    start = end;
  }
  return model;
}

void ExpectBadInput(const ProgramRun& run, const std::string& expected_err) {
  ASSERT_TRUE(run.exited) << Describe(run);
  EXPECT_EQ(run.exit_code, 2) << Describe(run);
  EXPECT_EQ(run.out, "");
  EXPECT_EQ(run.err, expected_err);
}

TEST(InputErrors, UnknownStatementNamesItsLineAndColumn) {
  const std::string path = WriteScratchFile("unknown_statement.wire", kGoodModel + "antenna x\n");
  ExpectBadInput(RunWirefield({"solve", path}),
                 path +
                     ":5:1: error: unknown statement 'antenna'; statements are units, let, "
                     "wire, shape, feed, load, ground, frequency, z0, transformer, line\n");
}

TEST(InputErrors, MisspelledStatementSuggestsTheKeyword) {
  const std::string path = WriteScratchFile("misspelled.wire", kGoodModel + "grond free\n");
  const std::string err = RunBadInput({"solve", path});
  EXPECT_EQ(err.rfind(path + ":5:1: error: unknown statement 'grond'", 0), 0u) << err;
  EXPECT_NE(err.find("ground"), std::string::npos) << err;
}

TEST(InputErrors, UnitOfTheWrongQuantityIsAnErrorAtTheNumber) {
  const std::string path = WriteScratchFile(
      "bad_unit.wire", GoodModelWith(2, "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1MHz"));
  const std::string err = RunBadInput({"solve", path});
  EXPECT_EQ(err.rfind(path + ":2:48: error: ", 0), 0u) << err;
}

TEST(InputErrors, UnknownUnitIsAnError) {
  const std::string path = WriteScratchFile(
      "unknown_unit.wire",
      GoodModelWith(2, "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1 furlong"));
  const std::string err = RunBadInput({"solve", path});
  EXPECT_EQ(err.rfind(path + ":2:", 0), 0u) << err;
  EXPECT_NE(err.find(": error: "), std::string::npos) << err;
}

TEST(InputErrors, FeedOnAnUnknownWireNamesTheWire) {
  const std::string path =
      WriteScratchFile("unknown_wire.wire", GoodModelWith(3, "feed src at dipole@50%"));
  ExpectBadInput(RunWirefield({"solve", path}),
                 path +
                     ":3:13: error: feed 'src': unknown wire 'dipole'; a wire must be "
                     "defined on an earlier line\n");
}

TEST(InputErrors, MissingFileNamesThePath) {
  const std::string path = ModelsDir() + "/no_such_model.wire";
  ExpectBadInput(RunWirefield({"solve", path}),
                 path + ": error: cannot read the model file: No such file or directory\n");
}

// A FIFO as an input once blocked forever: with no writer (in open) and with a writer that
// keeps it open (in read). Only regular files are read. RunWirefield kills a run that passes
// kRunTimeLimit_s, so these tests end even where the program would hang.
std::string MakeFifo(const std::string& name) {
  const std::string path = WriteScratchFile(name, "");
  std::remove(path.c_str());
  EXPECT_EQ(::mkfifo(path.c_str(), 0600), 0) << std::strerror(errno);
  return path;
}

TEST(InputErrors, ModelThatIsAFifoWithoutAWriterIsRefusedAtOnce) {
  const std::string path = MakeFifo("no_writer.wire");
  ExpectBadInput(RunWirefield({"solve", path}),
                 path +
                     ": error: cannot read the model file: it is a FIFO (named pipe), not a "
                     "regular file; give the path of a file on disk\n");
  std::remove(path.c_str());
}

TEST(InputErrors, ModelThatIsAFifoHeldOpenByAWriterIsRefusedAtOnce) {
  const std::string path = MakeFifo("held_open.wire");
  // O_RDWR opens a FIFO at once on Linux and holds it open as a writer that never writes.
  const int writer = ::open(path.c_str(), O_RDWR | O_NONBLOCK);
  ASSERT_GE(writer, 0) << std::strerror(errno);
  ExpectBadInput(RunWirefield({"batch", path, "--from", "14MHz", "--to", "15MHz", "--points", "3"}),
                 path +
                     ": error: cannot read the model file: it is a FIFO (named pipe), not a "
                     "regular file; give the path of a file on disk\n");
  ::close(writer);
  std::remove(path.c_str());
}

TEST(InputErrors, MeasuredTouchstoneThatIsAFifoIsRefusedAtOnce) {
  const std::string path = MakeFifo("measured.s1p");
  const int writer = ::open(path.c_str(), O_RDWR | O_NONBLOCK);
  ASSERT_GE(writer, 0) << std::strerror(errno);
  ExpectBadInput(RunWirefield({"sweep", ModelsDir() + "/hiking_club_dipole.wire", "--band", "20m",
                               "--measured", path}),
                 path +
                     ": error: cannot read the Touchstone file: it is a FIFO (named pipe), "
                     "not a regular file; give the path of a file on disk\n");
  ::close(writer);
  std::remove(path.c_str());
}

TEST(InputErrors, ModelThatIsADirectoryOrADeviceIsRefused) {
  ExpectBadInput(RunWirefield({"solve", ModelsDir()}),
                 ModelsDir() +
                     ": error: cannot read the model file: it is a directory, not a "
                     "regular file; give the path of a file on disk\n");
  ExpectBadInput(RunWirefield({"pattern", "/dev/null"}),
                 "/dev/null: error: cannot read the model file: it is a character device, not a "
                 "regular file; give the path of a file on disk\n");
}

TEST(InputErrors, ModelWithoutAFeedSaysWhatToAdd) {
  const std::string path = WriteScratchFile("no_feed.wire", GoodModelWith(3, ""));
  ExpectBadInput(RunWirefield({"solve", path}),
                 path + ":4:1: error: the model has no feed; add 'feed NAME at WIRE@POS'\n");
}

TEST(InputErrors, ModelWithoutAFrequencyAsksForOne) {
  const std::string path = WriteScratchFile("no_frequency.wire", GoodModelWith(4, ""));
  const std::string err = RunBadInput({"solve", path});
  EXPECT_EQ(err.rfind(path + ": error: ", 0), 0u) << err;
  EXPECT_NE(err.find("--freq"), std::string::npos) << err;
  EXPECT_NE(err.find("frequency"), std::string::npos) << err;
}

// A bad value of an option of the good model: exit code 2, nothing on stdout, and stderr
// opening with the option's diagnostic.
struct BadOption {
  const char* claim;  // the test's name
  std::vector<std::string> option;
  const char* error_start;
};

// A case printed by its claim (gtest shows the parameter of a failing case).
void PrintTo(const BadOption& bad, std::ostream* out) { *out << bad.claim; }

// The name of a case's test: its claim.
std::string ClaimOf(const ::testing::TestParamInfo<BadOption>& param) { return param.param.claim; }

class OptionError : public ::testing::TestWithParam<BadOption> {};

TEST_P(OptionError, IsRefusedWithItsDiagnostic) {
  std::vector<std::string> args = {
      "solve", WriteScratchFile(std::string(GetParam().claim) + ".wire", kGoodModel)};
  args.insert(args.end(), GetParam().option.begin(), GetParam().option.end());
  const std::string err = RunBadInput(args);
  EXPECT_EQ(err.rfind(GetParam().error_start, 0), 0u) << err;
}

INSTANTIATE_TEST_SUITE_P(InputErrors, OptionError,
                         ::testing::Values(BadOption{"FrequencyOptionOfTheWrongQuantityIsAnError",
                                                     {"--freq", "14.2mm"},
                                                     "--freq:1:1: error: --freq needs "},
                                           BadOption{"NegativeFrequencyOptionIsAnError",
                                                     {"--freq=-14MHz"},
                                                     "--freq:1:1: error: --freq must be positive"},
                                           BadOption{"ResistanceOptionMustBeAResistance",
                                                     {"--z0", "50uH"},
                                                     "--z0:1:1: error: --z0 needs "}),
                         ClaimOf);

TEST(InputErrors, SetWithoutEqualsSignShowsTheForm) {
  const std::string path = WriteScratchFile("good_for_set.wire", kGoodModel);
  ExpectBadInput(RunWirefield({"solve", path, "--set", "height"}),
                 "--set: error: expected NAME=VALUE (such as --set height=10m); got 'height'\n");
}

TEST(InputErrors, SetOfAnUnknownVariableListsTheModelsVariables) {
  const std::string path =
      WriteScratchFile("with_let.wire",
                       "units m\n"
                       "let height = 10\n"
                       "wire dip from (-5, 0, height) to (5, 0, height) radius 1mm\n"
                       "feed src at dip@50%\n"
                       "frequency 14.2MHz\n");
  ExpectBadInput(RunWirefield({"solve", path, "--set", "hieght=8m"}),
                 "--set hieght: error: the model has no variable 'hieght' (its variables: "
                 "height)\n");
}

TEST(InputErrors, UnknownOptionIsAnErrorWithExitTwo) {
  const std::string path = WriteScratchFile("good_for_option.wire", kGoodModel);
  const std::string err = RunBadInput({"solve", path, "--zo", "50"});
  EXPECT_EQ(err.rfind("wirefield: error: ", 0), 0u) << err;
  EXPECT_NE(err.find("--zo"), std::string::npos) << err;
}

}  // namespace
}  // namespace wirefield::cli_test
