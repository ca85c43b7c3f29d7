// CLI tests: `wirefield tune`: the command runs on the bundled models, its JSON document has
// the documented keys and finite numbers, the exact text of its bad options and of an unknown
// variable (exit 2), the no-resonance error naming the nearest value, and the two-band
// coil-loaded end-fed demo landing both bands in time.
#include <gtest/gtest.h>

#include <chrono>
#include <cmath>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/json_check.hpp"
#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

std::string Dipole() { return ModelsDir() + "/hiking_club_dipole.wire"; }
std::string TwoBand() { return ModelsDir() + "/hiking_club_two_band_end_fed.wire"; }

const std::vector<std::string> kDipoleTune = {"tune",  Dipole(),   "--vary",
                                              "total", "--target", "14.2MHz"};

std::vector<std::string> With(std::vector<std::string> args, const std::vector<std::string>& more) {
  args.insert(args.end(), more.begin(), more.end());
  return args;
}

TEST(TuneCommand, TextReportGivesTheLengthSensitivityTrimmingAndCaution) {
  const ProgramRun run = RunWirefield(kDipoleTune);
  ASSERT_TRUE(run.exited && run.exit_code == 0) << Describe(run) << run.err;
  EXPECT_NE(run.out.find("total = "), std::string::npos) << run.out;
  EXPECT_NE(run.out.find(" m   (a length (m)"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("kHz per cm"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("Trimming (common practice)"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("Caution: at transmitting power"), std::string::npos) << run.out;
}

TEST(TuneJson, HasTheDocumentedKeysAndALengthNearTheCutRule) {
  const nlohmann::json doc = RunForJson(With(kDipoleTune, {"--json"}));
  ASSERT_TRUE(doc.is_object());
  ExpectAllNumbersFinite(doc, "tune");
  for (const char* key : {"model", "feed", "goal", "kind"}) {
    EXPECT_TRUE(doc.contains(key) && doc[key].is_string()) << key;
  }
  for (const char* key : {"z0_ohm", "iterations", "solves", "unknowns", "elapsed_s"}) {
    EXPECT_TRUE(doc.contains(key) && doc[key].is_number()) << key;
  }
  ASSERT_TRUE(doc["variables"].is_array());
  ASSERT_EQ(doc["variables"].size(), 1u);
  const nlohmann::json& v = doc["variables"][0];
  for (const char* key :
       {"value_si", "start_value_si", "min_si", "max_si", "target_frequency_hz", "resonance_hz",
        "swr", "sensitivity_hz_per_si", "sensitivity_khz_per_unit", "sensitivity_step_si"}) {
    EXPECT_TRUE(v.contains(key) && v[key].is_number()) << key;
  }
  for (const char* key : {"z_ohm", "transmitter_z_ohm"}) {
    EXPECT_TRUE(v.contains(key) && v[key].is_array() && v[key].size() == 2) << key;
  }
  EXPECT_EQ(v["name"], "total");
  EXPECT_EQ(v["unit"], "m");
  EXPECT_EQ(v["sensitivity_unit"], "cm");
  EXPECT_EQ(v["resonance_kind"], "series");
  // The half-wave cut rule 142.6/f(MHz) m (REFERENCES.md section 5, common practice) gives
  // 10.04 m at 14.2 MHz; the tuned bare wire in free space must lie within its +-3% band.
  const double rule_m = 142.6 / 14.2;
  EXPECT_NEAR(v["value_si"].get<double>() / rule_m, 1.0, 0.03);
  // At resonance X is zero; the resonance equals the target (the tune's tolerance is 1e-4).
  EXPECT_LT(std::abs(v["z_ohm"][1].get<double>()), 0.5);
  EXPECT_NEAR(v["resonance_hz"].get<double>() / 14.2e6, 1.0, 1e-4);
  // Longer wire, lower resonance: the sensitivity is negative, about -f/l per metre by the cut
  // rule (l f constant), i.e. about -14 kHz per cm here; within 15% (thickness effect).
  const double khz_per_cm = v["sensitivity_khz_per_unit"].get<double>();
  EXPECT_NEAR(khz_per_cm / (-14.2e3 / v["value_si"].get<double>() * 0.01), 1.0, 0.15);
}

TEST(TuneCommand, UnknownVariableIsExitTwoListingTheModelsVariables) {
  EXPECT_EQ(RunBadInput({"tune", Dipole(), "--vary", "lenght", "--target", "14.2MHz"}),
            "--vary: error: the model has no variable 'lenght' (its variables: f_mhz, total, "
            "height, wire_diameter)\n");
}

TEST(TuneCommand, NoRootInTheBoundsIsExitTwoNamingTheNearestValue) {
  const std::string err = RunBadInput(With(kDipoleTune, {"--min", "6m", "--max", "8m"}));
  EXPECT_EQ(err.rfind(Dipole() + ":10:5: error: tune: no resonance of the feed 'src' at "
                                 "14.2000 MHz for 'total' between 6.0000 m and 8.0000 m; the "
                                 "nearest value found is total = 8.0000 m, where |X| = ",
                      0),
            0u)
      << err;
  EXPECT_NE(err.find("widen --min/--max, check --target, or use --goal min-swr"), std::string::npos)
      << err;
}

TEST(TuneCommand, BadOptionsAreExitTwoWithTheirText) {
  EXPECT_EQ(RunBadInput(With(kDipoleTune, {"--goal", "flat"})),
            "--goal:1:1: error: --goal is resonance or min-swr; got 'flat'\n");
  EXPECT_EQ(RunBadInput(With(kDipoleTune, {"--kind", "loud"})),
            "--kind:1:1: error: --kind is auto, series or parallel; got 'loud'\n");
  EXPECT_EQ(
      RunBadInput({"tune", Dipole(), "--vary", "total", "--vary", "height", "--target", "14.2MHz"}),
      "--target:1:1: error: give one --target F for each --vary NAME, in order (got 2 "
      "--vary and 1 --target), e.g. --vary length --target 14.2MHz\n");
  EXPECT_EQ(RunBadInput(With(kDipoleTune, {"--min", "9uH"})),
            "--min:1:1: error: --min needs a length (m) like 'total'; got an inductance (H)\n");
  EXPECT_EQ(RunBadInput(With(kDipoleTune, {"--min", "11m", "--max", "10m"})),
            "--min: error: the bounds of 'total' must have --min below --max; got 11.0000 m to "
            "10.0000 m\n");
}

TEST(TuneCommand, MinSwrGoalLowersTheSwrAtTheTransmitter) {
  const nlohmann::json doc = RunForJson(With(kDipoleTune, {"--goal", "min-swr", "--json"}));
  ASSERT_TRUE(doc.is_object());
  const nlohmann::json& v = doc["variables"][0];
  // SWR = (1 + |G|)/(1 - |G|) with G = (Z - 50)/(Z + 50) (REFERENCES.md section 5): any length
  // gives at least 1, and the minimum over lengths is no worse than the cut-rule length's.
  const nlohmann::json start = RunForJson({"solve", Dipole(), "--json"});
  ASSERT_TRUE(start.is_object());
  EXPECT_GE(v["swr"].get<double>(), 1.0);
  EXPECT_LE(v["swr"].get<double>(), start["feeds"][0]["swr"].get<double>());
}

TEST(TuneTwoBandDemo, LandsBothBandsWithinHalfAPercentInUnderThirtySeconds) {
  const auto start = std::chrono::steady_clock::now();
  const nlohmann::json doc =
      RunForJson({"tune", TwoBand(), "--vary", "section", "--target", "14.2MHz", "--vary", "tail",
                  "--target", "7.1MHz", "--json"});
  const double seconds =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  ASSERT_TRUE(doc.is_object());
  ASSERT_EQ(doc["variables"].size(), 2u);
  for (const nlohmann::json& v : doc["variables"]) {
    // Within 0.5% of the target: a fifth of the 40 m band's width (7.0-7.2 MHz), finer than a
    // builder trims to (common practice).
    ASSERT_TRUE(v["resonance_hz"].is_number()) << v.dump();
    EXPECT_NEAR(v["resonance_hz"].get<double>() / v["target_frequency_hz"].get<double>(), 1.0,
                0.005);
    EXPECT_EQ(v["resonance_kind"], "parallel");
  }
  // 30 s: the time a new user may wait for a two-band tune (measured about 2 s here).
  EXPECT_LT(seconds, 30.0);
}

}  // namespace
}  // namespace wirefield::cli_test
