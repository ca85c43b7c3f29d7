// CLI tests: legal but dubious models solve (exit 0) with a warning that says why, and names
// and paths from the user are printed quoted, never raw (docs/commands.md, "Exit codes";
// docs/model-language.md, "Allowed ranges").
#include <gtest/gtest.h>

#include <filesystem>
#include <string>

#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

const std::string kDipole =
    "units m\nwire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm\nfeed src at dip@50%\n";

// Solves `text` and returns stderr, failing unless the run exits 0.
std::string WarningsOf(const std::string& name, const std::string& text) {
  const std::string path = WriteScratchFile(name + ".wire", text);
  const ProgramRun run = RunWirefield({"solve", path});
  EXPECT_TRUE(run.exited && run.exit_code == 0) << Describe(run) << run.err;
  return run.err;
}

TEST(DubiousInputs, AnHfWireAtKilohertzIsCalledElectricallySmall) {
  // 10 m against a wavelength of c / 14.2 kHz = 21.1 km: 4.74e-4 wavelengths.
  const std::string err = WarningsOf("khz", kDipole + "frequency 14.2kHz\n");
  EXPECT_NE(err.find(":2:1: warning: the longest wire, 'dip', is 0.000474 wavelengths long"),
            std::string::npos)
      << err;
  EXPECT_NE(err.find("electrically small"), std::string::npos) << err;
  const std::string hz = WarningsOf("hz", kDipole + "frequency 14.2Hz\n");
  EXPECT_NE(hz.find("is 4.74e-07 wavelengths long"), std::string::npos) << hz;
}

TEST(DubiousInputs, TheSameWireAtItsOwnBandIsNotElectricallySmall) {
  const std::string err = WarningsOf("mhz", kDipole + "frequency 14.2MHz\n");
  EXPECT_EQ(err.find("electrically small"), std::string::npos) << err;
}

TEST(DubiousInputs, AFarFetchedZ0IsWarnedAbout) {
  const std::string err = WarningsOf("z0", kDipole + "frequency 14.2MHz\nz0 0.01\n");
  EXPECT_NE(err.find(":5:4: warning: z0 0.01 ohm is far from any feed line"), std::string::npos)
      << err;
}

TEST(DubiousInputs, ACoilOfAHundredThousandTurnsIsWarnedAbout) {
  const std::string err = WarningsOf(
      "coil", kDipole + "frequency 14.2MHz\n" +
                  "load c at dip@25% coil turns=1e5 diameter=5cm length=20m wire=0.1mm\n");
  EXPECT_NE(err.find(":5:30: warning: load 'c': 100000 turns is more than"), std::string::npos)
      << err;
}

TEST(DubiousInputs, AFeedAtAJointOfThreeWiresNamesTheWireItIsInSeriesWith) {
  // a and b form a straight 10 m dipole; c hangs from its middle; the feed is at b's start.
  const std::string err = WarningsOf(
      "joint", std::string("units m\n") + "wire a from (0, 0, 10) to (5, 0, 10) radius 1mm\n" +
                   "wire b from (5, 0, 10) to (10, 0, 10) radius 1mm\n" +
                   "wire c from (5, 0, 10) to (5, 0, 5) radius 1mm\n" +
                   "feed src at b@start\nfrequency 14.2MHz\n");
  EXPECT_NE(err.find(":5:13: warning: feed 'src' is at a joint of 3 wires; it is in series with "
                     "wire 'b' alone, driving it against 'a', 'c' together, not against 'a' "
                     "alone"),
            std::string::npos)
      << err;
}

TEST(DubiousInputs, AMastFedAgainstItsRadialsIsNotWarnedAbout) {
  const ProgramRun run = RunWirefield(
      {"solve", ModelsDir() + "/campsite_elevated_radials.wire", "--no-mesh-estimate"});
  EXPECT_EQ(run.exit_code, 0) << run.err;
  EXPECT_EQ(run.err.find("joint of"), std::string::npos) << run.err;
}

TEST(FileNames, ANameStartingWithADashIsExplained) {
  const std::string path = WriteScratchFile("-rf.wire", kDipole + "frequency 14.2MHz\n");
  // The program runs in this process's folder: move to the scratch folder so that the
  // argument is the bare name, as a user would type it.
  const std::filesystem::path before = std::filesystem::current_path();
  std::filesystem::current_path(std::filesystem::path(path).parent_path());
  const std::string err = RunBadInput({"solve", "-rf.wire"});
  std::filesystem::current_path(before);
  EXPECT_NE(err.find("'-rf.wire' is an existing file, but a name starting with '-' reads as an "
                     "option: put '--' before it (wirefield solve -- -rf.wire) or write "
                     "./-rf.wire"),
            std::string::npos)
      << err;
}

TEST(FileNames, ControlCharactersInAPathArePrintedEscaped) {
  const std::string path = WriteScratchFile("a\x1b[31mb.wire", kDipole + "frequency 1e308GHz\n");
  const std::string err = RunBadInput({"solve", path});
  EXPECT_EQ(err.find('\x1b'), std::string::npos) << "the escape byte is echoed raw";
  EXPECT_NE(err.find("a\\x1B[31mb.wire:4:11: error:"), std::string::npos) << err;
}

}  // namespace
}  // namespace wirefield::cli_test
