// CLI tests: --power on solve, sweep and pattern: the stress section and its JSON keys, the
// exposure estimate of pattern, the cautions, and the errors of bad powers and ratings.
#include <fmt/format.h>
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <nlohmann/json.hpp>
#include <numbers>
#include <string>

#include "cli/json_check.hpp"
#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

// The campsite's end-fed wire: a 0.49-wavelength wire for 7.1 MHz with a 2:14 transformer
// and a compensation capacitor, a loading capacitor in the counterpoise (demo values).
const std::string kEndFedModel =
    "units m\n"
    "wire top from (0, 0, 8) to (20.7, 0, 8) radius 1mm\n"
    "wire cp from (-2.1, 0, 8) to (0, 0, 8) radius 1mm\n"
    "feed src at top@start\n"
    "load c1 at cp@50% series C=150pF\n"
    "transformer unun at src turns 2:14 magnetizing=20uH compensation=100pF\n"
    "frequency 7.1MHz\n";

std::string EndFedPath() { return WriteScratchFile("stress_end_fed.wire", kEndFedModel); }

TEST(PowerFlag, SolveJsonHasTheStressKeysWithUnits) {
  const nlohmann::json doc = RunForJson({"solve", EndFedPath(), "--power", "100W", "--json"});
  ASSERT_TRUE(doc.contains("stress")) << doc.dump();
  const nlohmann::json& s = doc["stress"];
  EXPECT_DOUBLE_EQ(s["power_w"].get<double>(), 100.0);
  // The definition of --power: the transmitter delivers it (rounding only).
  EXPECT_NEAR(s["feeds"][0]["transmitter_power_w"].get<double>(), 100.0, 1e-9);
  for (const char* key : {"antenna_voltage", "transformer", "compensation_capacitor_voltage"}) {
    EXPECT_TRUE(s["feeds"][0].contains(key)) << key;
  }
  EXPECT_TRUE(s["feeds"][0]["transformer"]["transmitter_side_voltage"].contains("peak_v"));
  EXPECT_TRUE(s["feeds"][0]["compensation_capacitor_voltage"].contains("rms_v"));
  EXPECT_TRUE(s["loads"][0]["capacitor_voltage"].contains("peak_v"));
  EXPECT_TRUE(s["loads"][0]["current"].contains("rms_a"));
  EXPECT_TRUE(s["loads"][0].contains("power_w"));
  // The two wires' outer ends are free; their joint and the feed are not.
  ASSERT_EQ(s["free_ends"].size(), 2u);
  EXPECT_GT(s["free_ends"][0]["voltage"]["peak_v"].get<double>(), 0.0);
  EXPECT_FALSE(s["cautions"].empty());
  ExpectAllNumbersFinite(doc, "solve --power");
}

TEST(PowerFlag, SolveTextShowsTheStressAndTheCautions) {
  const ProgramRun run = RunWirefield({"solve", EndFedPath(), "--power", "100W"});
  ASSERT_TRUE(run.exited && run.exit_code == 0) << Describe(run);
  EXPECT_NE(run.out.find("Stress at 100.0 W from the transmitter"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("Caution: free end top@end"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("follow local rules and licensed practice"), std::string::npos);
}

TEST(PowerFlag, SweepJsonHasTheHighestStress) {
  const nlohmann::json doc = RunForJson({"sweep", EndFedPath(), "--from", "7MHz", "--to", "7.2MHz",
                                         "--points", "3", "--power", "50W", "--json"});
  ASSERT_TRUE(doc.contains("stress")) << doc.dump();
  EXPECT_DOUBLE_EQ(doc["stress"]["power_w"].get<double>(), 50.0);
  ASSERT_FALSE(doc["stress"]["highest"].empty());
  for (const char* key : {"what", "peak_v", "rms_v", "frequency_hz", "over_rating"}) {
    EXPECT_TRUE(doc["stress"]["highest"][0].contains(key)) << key;
  }
  for (const nlohmann::json& item : doc["stress"]["highest"]) {
    for (const char* key : {"peak_v", "rms_v", "frequency_hz"}) {
      ExpectAllNumbersFinite(item[key], item["what"].get<std::string>() + "." + key);
    }
  }
}

TEST(PowerFlag, PatternJsonHasTheExposureEstimate) {
  const nlohmann::json doc = RunForJson(
      {"pattern", EndFedPath(), "--step", "5", "--power", "100W", "--mode", "ssb", "--json"});
  ASSERT_TRUE(doc.contains("exposure")) << doc.dump();
  const nlohmann::json& e = doc["exposure"];
  EXPECT_EQ(e["mode"], "ssb");
  EXPECT_DOUBLE_EQ(e["duty"].get<double>(), 0.2);  // SSB (common practice)
  // FCC OET Bulletin 65: R = sqrt(2.56 P_avg G / (4 pi S)), S from 47 CFR 1.1310 Table 1 (B)
  // (180 / f^2 mW/cm^2 at 7.1 MHz), G from the pattern's own maximum gain.
  const double g = std::pow(10.0, doc["max_gain_dbi"].get<double>() / 10.0);
  const double s = 180.0 / (7.1 * 7.1) * 10.0;
  const double r = std::sqrt(2.56 * 20.0 * g / (4.0 * std::numbers::pi * s));
  EXPECT_NEAR(e["fcc_distance_m"].get<double>(), r, 1e-9 * r);
  EXPECT_GT(e["icnirp_distance_m"].get<double>(), 0.0);
  EXPECT_TRUE(doc.contains("stress"));
  ExpectAllNumbersFinite(doc["exposure"], "pattern --power: exposure");
  ExpectAllNumbersFinite(doc["stress"], "pattern --power: stress");
}

TEST(PowerFlag, PatternTextPrintsBothDistancesAndTheCautions) {
  const ProgramRun run = RunWirefield({"pattern", EndFedPath(), "--step", "5", "--power", "1kW"});
  ASSERT_TRUE(run.exited && run.exit_code == 0) << Describe(run);
  EXPECT_NE(run.out.find("47 CFR 1.1310"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("ICNIRP 2020"), std::string::npos);
  EXPECT_NE(run.out.find("far-field estimate"), std::string::npos);
  EXPECT_NE(run.out.find("Local rules and licensed practice decide"), std::string::npos);
}

TEST(PowerFlag, PowerWithoutAUnitIsRefused) {
  EXPECT_EQ(RunBadInput({"solve", EndFedPath(), "--power", "100"}),
            "--power:1:1: error: --power needs a unit: W, mW or kW (e.g. 100W); got '100'\n");
}

TEST(PowerFlag, NegativePowerIsRefused) {
  for (const char* command : {"solve", "pattern"}) {
    EXPECT_EQ(RunBadInput({command, EndFedPath(), "--power=-5W"}),
              "--power:1:1: error: --power must be positive; got '-5W'\n")
        << command;
  }
  EXPECT_EQ(RunBadInput({"sweep", EndFedPath(), "--from", "7MHz", "--to", "7.2MHz", "--points", "3",
                         "--power=0W"}),
            "--power:1:1: error: --power must be positive; got '0W'\n");
}

TEST(PowerFlag, RatingWithoutPowerIsRefused) {
  EXPECT_EQ(RunBadInput({"solve", EndFedPath(), "--rating-cap", "1kV"}),
            "--rating-cap:1:1: error: --rating-cap sets a rating for the stress report: give it "
            "with --power, e.g. --power 100W --rating-cap 1kV\n");
}

TEST(PowerFlag, BadModeAndDutyAreRefused) {
  EXPECT_EQ(RunBadInput({"pattern", EndFedPath(), "--power", "100W", "--mode", "am"}),
            "--mode:1:1: error: --mode must be one of ssb, cw, fm, digital, carrier; got 'am'\n");
  EXPECT_EQ(RunBadInput({"pattern", EndFedPath(), "--power", "100W", "--duty", "1.5"}),
            "--duty:1:1: error: --duty needs a duty factor greater than 0 and at most 1, e.g. "
            "0.5; got '1.5'\n");
}

TEST(PowerFlag, FreeEndHighVoltageCautionStartsAtFiftyVoltsRms) {
  // Where the caution starts: 50 V RMS, the upper limit of extra-low voltage for AC (IEC
  // 61140, from memory), as docs/commands.md states. The free-end voltage scales with the
  // square root of the power (the solution is scaled linearly, docs/numerics.md §7c), so the
  // powers that put both ends of a free-space dipole 5% below and 5% above the line follow
  // from one run at 1 W; 5% is far beyond the rounding of a printed power (6 digits).
  const std::string dipole = ModelsDir() + "/hiking_club_dipole.wire";
  const nlohmann::json one_watt = RunForJson({"solve", dipole, "--power", "1W", "--json"});
  const nlohmann::json& ends = one_watt.at("stress").at("free_ends");
  ASSERT_EQ(ends.size(), 2u);
  double rms_at_1w = 0.0;
  for (const nlohmann::json& end : ends) {
    rms_at_1w = std::max(rms_at_1w, end.at("voltage").at("rms_v").get<double>());
  }
  double lowest_at_1w = rms_at_1w;
  for (const nlohmann::json& end : ends) {
    lowest_at_1w = std::min(lowest_at_1w, end.at("voltage").at("rms_v").get<double>());
  }
  ASSERT_GT(lowest_at_1w, 0.97 * rms_at_1w);  // a symmetric dipole: both ends alike
  constexpr double kLimitRmsV = 50.0;
  for (const double factor : {0.95, 1.05}) {
    const double ratio = factor * kLimitRmsV / (factor < 1.0 ? rms_at_1w : lowest_at_1w);
    const std::string power = fmt::format("{:.6g}W", ratio * ratio);
    const bool above = factor > 1.0;
    const nlohmann::json doc = RunForJson({"solve", dipole, "--power", power, "--json"});
    for (const nlohmann::json& end : doc.at("stress").at("free_ends")) {
      EXPECT_EQ(end.at("high_voltage").get<bool>(), above) << power << " " << end.dump();
      EXPECT_EQ(end.at("voltage").at("rms_v").get<double>() > kLimitRmsV, above) << power;
    }
    int free_end_cautions = 0;
    for (const nlohmann::json& caution : doc.at("stress").at("cautions")) {
      if (caution.get<std::string>().rfind("free end", 0) == 0) ++free_end_cautions;
    }
    EXPECT_EQ(free_end_cautions, above ? 2 : 0) << power;
    const ProgramRun text = RunWirefield({"solve", dipole, "--power", power});
    ASSERT_TRUE(text.exited && text.exit_code == 0) << Describe(text);
    EXPECT_EQ(text.out.find("(high voltage)") != std::string::npos, above) << text.out;
    EXPECT_NE(text.out.find("A free end above 50 V RMS (70.7 V peak) gets the high-voltage "
                            "caution below."),
              std::string::npos)
        << text.out;
  }
}

}  // namespace
}  // namespace wirefield::cli_test
