// CLI tests of sizes a new user gets wrong, run as the user runs them: a radius written in
// the wrong unit refused at the value (checked at the frequency actually solved, which --freq
// may set), the README's --set example without a stray warning, and a close-wound coil load
// whose inductance is the one `wirefield coil --close-wound` gives for the same coil.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>
#include <numbers>
#include <string>

#include "cli/program_runner.hpp"
#include "wirefield/coil.hpp"
#include "wirefield/model.hpp"

namespace wirefield::cli_test {
namespace {

// The README's dipole line with the radius written as `radius 1` under `units m`: 1 m meant
// as 1 mm. The wire is 10 m long, so the radius passes the bound against the length (a
// tenth, 1.004 m) and only the bound against the wavelength refuses it.
const std::string kFatWire =
    "wire dipole from (-total / 2, 0, height) to (total / 2, 0, height) radius 1";

std::string FatDipole(const std::string& frequency) {
  return "units m\n"
         "let f_mhz = 14.2\n"
         "let total = 142.6m / f_mhz\n"
         "let height = 1.2m\n" +
         kFatWire + "\nfeed src at dipole@50%\nfrequency " + frequency + "\n";
}

TEST(ModelSizes, ARadiusInTheWrongUnitIsRefusedAtTheValueWithTheUnitMeant) {
  const std::string path = WriteScratchFile("fat_dipole.wire", FatDipole("14.2MHz"));
  const int column = static_cast<int>(kFatWire.rfind('1')) + 1;
  // The wavelength at 14.2 MHz is 299.792458 / 14.2 = 21.1 m (c exact, SI); 1 m is 4.74% of it.
  EXPECT_EQ(RunBadInput({"solve", path}),
            path + ":5:" + std::to_string(column) +
                ": error: wire 'dipole': the radius 1 m is 4.74% of the wavelength (21.1 m at "
                "14.2 MHz); the thin-wire model needs a radius under 1% of the wavelength; use a "
                "thinner wire or a lower frequency (did you mean radius 1mm?)\n");
  // The fix the hint gives solves.
  const std::string fixed =
      FatDipole("14.2MHz").replace(FatDipole("14.2MHz").find("radius 1\n"), 9, "radius 1mm\n");
  const ProgramRun run = RunWirefield({"solve", WriteScratchFile("thin_dipole.wire", fixed)});
  ASSERT_TRUE(run.exited) << Describe(run);
  EXPECT_EQ(run.exit_code, 0) << run.err;
}

TEST(ModelSizes, TheRadiusIsCheckedAtTheFrequencySolvedNotOnlyTheModels) {
  // At 1.8 MHz the wavelength is 166.6 m and 1 m is 0.6% of it: thick, but within the bound.
  const std::string path = WriteScratchFile("fat_dipole_160m.wire", FatDipole("1.8MHz"));
  const ProgramRun low = RunWirefield({"solve", path, "--json"});
  ASSERT_TRUE(low.exited) << Describe(low);
  EXPECT_EQ(low.exit_code, 0) << low.err;
  const std::string err = RunBadInput({"solve", path, "--freq", "14.2MHz"});
  EXPECT_EQ(err.rfind(path + ":5:", 0), 0u) << err;
  EXPECT_NE(err.find("is 4.74% of the wavelength"), std::string::npos) << err;
  // A sweep is checked at its highest frequency.
  const std::string swept =
      RunBadInput({"sweep", path, "--from", "1.8MHz", "--to", "30MHz", "--points", "3"});
  EXPECT_NE(swept.find("(9.99 m at 30 MHz)"), std::string::npos) << swept;
}

TEST(ModelSizes, TheReadmeOverrideExampleWarnsOfNoVariable) {
  const std::string model = ModelsDir() + "/hiking_club_dipole.wire";
  const ProgramRun run = RunWirefield({"solve", model, "--set", "total=10.3m", "--json"});
  ASSERT_TRUE(run.exited) << Describe(run);
  ASSERT_EQ(run.exit_code, 0) << run.err;
  EXPECT_EQ(run.err, "");
  const nlohmann::json doc = nlohmann::json::parse(run.out);
  EXPECT_TRUE(doc.at("warnings").empty()) << doc.at("warnings");
}

// A close-wound coil: 20 turns of 1 mm bare wire on a 19 mm former. The current sheet (at the
// wire centres) is 20 mm across and 20 turns x 1 mm = 20 mm long: D/l = 1.
const std::string kCoilLoad =
    "units m\n"
    "wire mast from (0, 0, 0.2) to (0, 0, 7.5) radius 1.5mm\n"
    "wire east from (0, 0, 0.2) to (5, 0, 1) radius 1mm\n"
    "wire west from (0, 0, 0.2) to (-5, 0, 1) radius 1mm\n"
    "feed src at mast@start\n"
    "load coil at mast@40% coil turns=20 diameter=19mm close-wound wire=1mm\n"
    "ground perfect\n"
    "frequency 7.1MHz\n";

TEST(ModelSizes, ACloseWoundCoilLoadHasTheInductanceOfTheCoilCommand) {
  const Model model = ParseModelText(kCoilLoad, "coil.wire");
  ASSERT_EQ(model.loads.size(), 1u);
  ASSERT_TRUE(model.loads[0].coil.has_value());
  const CoilAnalysis load = AnalyzeCoil(*model.loads[0].coil, 7.1e6);

  const ProgramRun run =
      RunWirefield({"coil", "--turns", "20", "--diameter", "19mm", "--close-wound",
                    "--wire-diameter", "1mm", "--freq", "7.1MHz", "--json"});
  ASSERT_TRUE(run.exited && run.exit_code == 0) << Describe(run) << run.err;
  const nlohmann::json command = nlohmann::json::parse(run.out);
  // The same coil through both doors: the same computation, so equal to rounding.
  EXPECT_NEAR(load.inductance_h / command.at("inductance_h").get<double>(), 1.0, 1e-12);
  EXPECT_NEAR(load.self_capacitance_f / command.at("self_capacitance_f").get<double>(), 1.0, 1e-12);
  EXPECT_DOUBLE_EQ(load.pitch_m, 1e-3);

  // Against the handbook: the current sheet of D/l = 1 has Nagaoka's coefficient K = 0.6884
  // (Grover, Inductance Calculations, 1946, Table 36; from memory), so
  // L = mu0 pi r^2 N^2 K / l = 5.435 uH; Wheeler's formula L[uH] = r^2 N^2 / (9 r + 10 l) with
  // r and l in inches (Wheeler, Proc. IRE 16, 1928, p. 1398; within 1% for l > 0.8 r) gives
  // 5.43 uH. 0.1% covers the table's four digits.
  constexpr double kMu0 = 1.25663706212e-6;  // H/m (CODATA 2018)
  const double r_m = 0.01, l_m = 0.02, turns = 20.0;
  const double nagaoka_h = kMu0 * std::numbers::pi * r_m * r_m * turns * turns * 0.6884 / l_m;
  EXPECT_NEAR(load.inductance_sheet_h / nagaoka_h, 1.0, 1e-3);
  const double r_in = r_m / 0.0254, l_in = l_m / 0.0254;
  const double wheeler_h = 1e-6 * r_in * r_in * turns * turns / (9.0 * r_in + 10.0 * l_in);
  EXPECT_NEAR(load.inductance_sheet_h / wheeler_h, 1.0, 0.01);

  // And the model solves with it.
  const ProgramRun solve = RunWirefield({"solve", WriteScratchFile("coil.wire", kCoilLoad)});
  ASSERT_TRUE(solve.exited) << Describe(solve);
  EXPECT_EQ(solve.exit_code, 0) << solve.err;
}

}  // namespace
}  // namespace wirefield::cli_test
