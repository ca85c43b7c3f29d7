// CLI tests: `wirefield solve --json`: one JSON document on stdout and nothing else, with the
// contract's keys; the SWR reference (--z0 over the model's z0 over 50 ohm); and the physics
// of a half-wave dipole, loosely, through the whole program.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <nlohmann/json.hpp>
#include <string>

#include "cli/json_check.hpp"
#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

// c = 299 792 458 m/s exactly (SI definition of the metre).
constexpr double kSpeedOfLight_m_per_s = 299792458.0;

nlohmann::json SolveJson(const std::vector<std::string>& args) {
  const ProgramRun run = RunWirefield(args);
  EXPECT_TRUE(run.exited && run.exit_code == 0) << Describe(run);
  nlohmann::json doc;
  EXPECT_NO_THROW(doc = nlohmann::json::parse(run.out)) << run.out;
  return doc;
}

// SWR from the reflection coefficient: G = (Z - Z0)/(Z + Z0), SWR = (1 + |G|)/(1 - |G|)
// (standard transmission-line relations; REFERENCES.md §5, "Reflection, SWR").
double SwrFromImpedance(std::complex<double> z_ohm, double z0_ohm) {
  const double gamma = std::abs((z_ohm - z0_ohm) / (z_ohm + z0_ohm));
  return (1.0 + gamma) / (1.0 - gamma);
}

std::complex<double> FirstFeedImpedance(const nlohmann::json& doc) {
  const auto& z = doc["feeds"][0]["z_ohm"];
  return {z[0].get<double>(), z[1].get<double>()};
}

// The relative agreement asked of SWR recomputed from the printed impedance: the JSON keeps
// 15+ significant digits, so only rounding remains.
constexpr double kSwrRelativeTolerance = 1e-9;

const std::string kDipoleModel =
    "units m\n"
    "let height = 10\n"
    "wire dip from (-5, 0, height) to (5, 0, height) radius 1mm\n"
    "feed src at dip@50%\n"
    "frequency 14.2MHz\n";

TEST(SolveJson, StdoutIsExactlyOneDocumentWithTheContractKeys) {
  const std::string path = WriteScratchFile("json_dipole.wire", kDipoleModel);
  const ProgramRun run = RunWirefield({"solve", path, "--json"});
  ASSERT_TRUE(run.exited) << Describe(run);
  ASSERT_EQ(run.exit_code, 0) << Describe(run);
  nlohmann::json doc;
  ASSERT_NO_THROW(doc = nlohmann::json::parse(run.out)) << run.out;  // throws on trailing text
  ExpectSolveJsonContract(doc, path);
  EXPECT_DOUBLE_EQ(doc["frequency_hz"].get<double>(), 14.2e6);
  EXPECT_EQ(doc["feeds"][0]["name"], "src");
  EXPECT_DOUBLE_EQ(doc["feeds"][0]["z0_ohm"].get<double>(), 50.0);
  // Added keys documented in docs/commands.md.
  EXPECT_TRUE(doc["segments"].is_number_integer());
  EXPECT_TRUE(doc["loads"].is_array());
  EXPECT_TRUE(doc["warnings"].is_array());
}

TEST(SolveJson, FreqOptionOverridesTheModelsFrequency) {
  const std::string path = WriteScratchFile("json_freq.wire", kDipoleModel);
  const nlohmann::json doc = SolveJson({"solve", path, "--freq", "14.05 MHz", "--json"});
  EXPECT_DOUBLE_EQ(doc["frequency_hz"].get<double>(), 14.05e6);
}

TEST(SolveJson, SetOverridesALetOfTheModel) {
  const std::string path = WriteScratchFile("json_set.wire", kDipoleModel);
  const nlohmann::json low = SolveJson({"solve", path, "--set", "height=3m", "--json"});
  const nlohmann::json high = SolveJson({"solve", path, "--json"});
  // In free space the height of the wire does not matter: translation invariance.
  const double tolerance_ohm = 1e-6;  // only rounding differs between the two runs
  EXPECT_NEAR(FirstFeedImpedance(low).real(), FirstFeedImpedance(high).real(), tolerance_ohm);
  EXPECT_NEAR(FirstFeedImpedance(low).imag(), FirstFeedImpedance(high).imag(), tolerance_ohm);
}

TEST(SolveJson, SwrIsAgainstFiftyOhmByDefault) {
  const std::string path = WriteScratchFile("json_swr50.wire", kDipoleModel);
  const nlohmann::json doc = SolveJson({"solve", path, "--json"});
  const double expected = SwrFromImpedance(FirstFeedImpedance(doc), 50.0);
  EXPECT_NEAR(doc["feeds"][0]["swr"].get<double>(), expected, kSwrRelativeTolerance * expected);
}

TEST(SolveJson, ModelZ0SetsTheSwrReference) {
  const std::string path = WriteScratchFile("json_swr_model.wire", kDipoleModel + "z0 75ohm\n");
  const nlohmann::json doc = SolveJson({"solve", path, "--json"});
  EXPECT_DOUBLE_EQ(doc["feeds"][0]["z0_ohm"].get<double>(), 75.0);
  const double expected = SwrFromImpedance(FirstFeedImpedance(doc), 75.0);
  EXPECT_NEAR(doc["feeds"][0]["swr"].get<double>(), expected, kSwrRelativeTolerance * expected);
}

TEST(SolveJson, Z0OptionWinsOverTheModelsZ0) {
  const std::string path = WriteScratchFile("json_swr_flag.wire", kDipoleModel + "z0 75ohm\n");
  const nlohmann::json doc = SolveJson({"solve", path, "--z0", "2.45kohm", "--json"});
  EXPECT_DOUBLE_EQ(doc["feeds"][0]["z0_ohm"].get<double>(), 2450.0);
  const double expected = SwrFromImpedance(FirstFeedImpedance(doc), 2450.0);
  EXPECT_NEAR(doc["feeds"][0]["swr"].get<double>(), expected, kSwrRelativeTolerance * expected);
}

TEST(SolveJson, HalfWaveDipoleFeedResistanceIsNearSeventyOhm) {
  // A 0.49-wavelength dipole of radius 1e-4 wavelength in free space at 14.2 MHz.
  const double wavelength_m = kSpeedOfLight_m_per_s / 14.2e6;
  const std::string model =
      "units m\n"
      "let lambda = " +
      std::to_string(wavelength_m) +
      "\n"
      "wire dip from (-0.245 * lambda, 0, 0) to (0.245 * lambda, 0, 0) radius 1e-4 * lambda\n"
      "feed src at dip@50%\n"
      "frequency 14.2MHz\n";
  const std::string path = WriteScratchFile("json_half_wave.wire", model);
  const nlohmann::json doc = SolveJson({"solve", path, "--json"});
  ExpectSolveJsonContract(doc, path);
  // REFERENCES.md §1: a thin dipole resonates at about 0.47-0.49 lambda with R approx
  // 65-73 ohm (from memory); the exact figure is checked in tests/validation. Kept loose here
  // (60..80 ohm): this test checks that the program carries the solver's answer through.
  const double r_ohm = FirstFeedImpedance(doc).real();
  EXPECT_GT(r_ohm, 60.0);
  EXPECT_LT(r_ohm, 80.0);
  // Power balance of the source (standard circuit theory): P = 0.5 Re(V I*) with V = 1 V.
  const auto& i = doc["feeds"][0]["current_a"];
  const double power_w = 0.5 * i[0].get<double>();
  EXPECT_NEAR(doc["feeds"][0]["power_w"].get<double>(), power_w, 1e-9 * std::abs(power_w));
}

TEST(SolveJson, TrapAtItsResonanceIsReportedOpenNotAsANumber) {
  // An ideal parallel LC is an open circuit at f = 1/(2 pi sqrt(LC)) (Thomson's formula,
  // any circuits text); L is chosen from C so that 14.2 MHz is that frequency.
  const std::string path = WriteScratchFile("open_trap.wire",
                                            "let c_f = 100e-12\n"
                                            "let l_h = 1 / ((2 * pi * 14.2e6)^2 * c_f)\n"
                                            "wire w from (-5, 0, 10) to (5, 0, 10) radius 1mm\n"
                                            "feed f at w@50%\n"
                                            "load trap at w@25% parallel L=l_h C=c_f\n"
                                            "frequency 14.2MHz\n");
  const nlohmann::json doc = SolveJson({"solve", path, "--json"});
  ExpectSolveJsonContract(doc, path);
  ASSERT_EQ(doc["loads"].size(), 1u);
  const nlohmann::json& trap = doc["loads"][0];
  EXPECT_EQ(trap["name"], "trap");
  EXPECT_EQ(trap["open"], true);
  EXPECT_TRUE(trap["z_ohm"].is_null());
  // Almost no current passes an open circuit: the feed current is ~1e-3 A here, so 1e-9 A
  // is six orders below it.
  const std::complex<double> current(trap["current_a"][0].get<double>(),
                                     trap["current_a"][1].get<double>());
  EXPECT_LT(std::abs(current), 1e-9);

  const ProgramRun text = RunWirefield({"solve", path});
  ASSERT_TRUE(text.exited && text.exit_code == 0) << Describe(text);
  EXPECT_NE(text.out.find("open     open"), std::string::npos) << text.out;
}

TEST(SolveJson, WarningsGoToStderrAndIntoTheDocumentNeverToStdoutAsText) {
  const std::string path = WriteScratchFile("json_warning.wire", "let unused = 3\n" + kDipoleModel);
  const ProgramRun run = RunWirefield({"solve", path, "--json"});
  ASSERT_TRUE(run.exited) << Describe(run);
  ASSERT_EQ(run.exit_code, 0) << Describe(run);
  const std::string warning = path + ":1:5: warning: variable 'unused' is never used";
  EXPECT_EQ(run.err, warning + "\n");
  nlohmann::json doc;
  ASSERT_NO_THROW(doc = nlohmann::json::parse(run.out)) << run.out;
  ASSERT_EQ(doc["warnings"].size(), 1u);
  EXPECT_EQ(doc["warnings"][0], warning);
}

TEST(SolveJson, TextReportShowsTheSameImpedanceAsTheJson) {
  const std::string path = WriteScratchFile("text_dipole.wire", kDipoleModel);
  const nlohmann::json doc = SolveJson({"solve", path, "--json"});
  const ProgramRun text = RunWirefield({"solve", path});
  ASSERT_TRUE(text.exited && text.exit_code == 0) << Describe(text);
  // The table prints R with about five significant digits: recompute the same rounding.
  const double r_ohm = FirstFeedImpedance(doc).real();
  char expected[64];
  std::snprintf(expected, sizeof expected, "%.3f", r_ohm);  // R of 10..99 ohm: 3 decimals
  ASSERT_GT(r_ohm, 10.0);
  ASSERT_LT(r_ohm, 100.0);
  EXPECT_NE(text.out.find(expected), std::string::npos) << expected << " not in\n" << text.out;
}

// --- the two places of a feed with a transformer and a feed line ---------------------------

// A half-wave end-fed wire for 40 m fed through a 3:21 transformer (impedance 1:49) with a
// lossy core and 10 m of 50 ohm coax (illustrative figures of a generic line).
std::string EndFedChainPath() {
  return std::string(WIREFIELD_SOURCE_DIR) + "/tests/models/end_fed_transformer_coax.wire";
}

std::complex<double> ComplexOf(const nlohmann::json& pair) {
  return {pair.at(0).get<double>(), pair.at(1).get<double>()};
}

TEST(SolveJson, FeedWithTransformerAndLineReportsBothPlaces) {
  const std::string path = EndFedChainPath();
  const nlohmann::json doc = SolveJson({"solve", path, "--json"});
  ExpectSolveJsonContract(doc, path);
  const nlohmann::json& feed = doc.at("feeds").at(0);
  const double z0_ohm = feed.at("z0_ohm").get<double>();
  const std::complex<double> z_terminals = ComplexOf(feed.at("z_ohm"));
  const nlohmann::json& antenna = feed.at("antenna");
  const nlohmann::json& transmitter = feed.at("transmitter");
  EXPECT_TRUE(feed.at("has_transformer").get<bool>());
  EXPECT_TRUE(feed.at("has_line").get<bool>());
  // z_ohm keeps its contract meaning (the terminals) and the antenna object repeats it.
  EXPECT_EQ(ComplexOf(antenna.at("z_ohm")), z_terminals);
  // SWR at each place from that place's impedance by the textbook formula (REFERENCES.md §5,
  // "Reflection, SWR"): the contract's swr is the transmitter's.
  EXPECT_NEAR(antenna.at("swr").get<double>(), SwrFromImpedance(z_terminals, z0_ohm),
              kSwrRelativeTolerance * antenna.at("swr").get<double>());
  const std::complex<double> z_transmitter = ComplexOf(transmitter.at("z_ohm"));
  EXPECT_NEAR(transmitter.at("swr").get<double>(), SwrFromImpedance(z_transmitter, z0_ohm),
              kSwrRelativeTolerance * transmitter.at("swr").get<double>());
  EXPECT_EQ(feed.at("swr").get<double>(), transmitter.at("swr").get<double>());
  // Through a 1:49 transformer the kilohm terminals (REFERENCES.md §8, common practice for an
  // end-fed half wave) come near 50 ohm: the two places differ.
  EXPECT_GT(std::abs(z_terminals), 1000.0);
  EXPECT_LT(std::abs(z_transmitter), 500.0);
  // Power balance of the chain: what the transmitter delivers is what reaches the antenna
  // (0.5 Re(V I*) of the peak phasors at the terminals) plus the line's and transformer's loss.
  const std::complex<double> v = ComplexOf(feed.at("voltage_v"));
  const std::complex<double> i = ComplexOf(feed.at("current_a"));
  const double antenna_w = 0.5 * std::real(v * std::conj(i));
  EXPECT_NEAR(antenna.at("power_w").get<double>(), antenna_w, 1e-12 * antenna_w);
  const double line_w = feed.at("line_loss_w").get<double>();
  const double transformer_w = feed.at("transformer_loss_w").get<double>();
  const double transmitter_w = transmitter.at("power_w").get<double>();
  EXPECT_GT(line_w, 0.0);
  EXPECT_GT(transformer_w, 0.0);
  EXPECT_NEAR(transmitter_w, antenna_w + line_w + transformer_w, 1e-12 * transmitter_w);
}

TEST(SolveJson, TextReportHeadsTheTerminalsAndTheTransmitterApartAndStatesThePower) {
  const std::string path = EndFedChainPath();
  const ProgramRun run = RunWirefield({"solve", path});
  ASSERT_TRUE(run.exited && run.exit_code == 0) << Describe(run);
  const std::size_t antenna = run.out.find("Feeds at the antenna terminals\n");
  const std::size_t transmitter = run.out.find("Feeds at the transmitter");
  ASSERT_NE(antenna, std::string::npos) << run.out;
  ASSERT_NE(transmitter, std::string::npos) << run.out;
  EXPECT_LT(antenna, transmitter);
  EXPECT_NE(run.out.find("transformer box 1:49, line coax 10 m"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("line loss (W)"), std::string::npos);
  EXPECT_NE(run.out.find("transformer loss (W)"), std::string::npos);
  // One power convention: the transmitter's output, and what is left at the terminals.
  EXPECT_NE(run.out.find("At 100 W from the transmitter"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("W from the transmitter; lost: "), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("at the antenna terminals: "), std::string::npos) << run.out;
  EXPECT_EQ(run.out.find("into the feeds"), std::string::npos) << run.out;
}

TEST(SolveJson, TextReportWithoutAChainSaysTheTransmitterConnectsAtTheTerminals) {
  const std::string path = WriteScratchFile("text_direct_dipole.wire", kDipoleModel);
  const ProgramRun run = RunWirefield({"solve", path});
  ASSERT_TRUE(run.exited && run.exit_code == 0) << Describe(run);
  EXPECT_NE(run.out.find("Feeds at the antenna terminals (no transformer or feed line: the "
                         "transmitter connects here)"),
            std::string::npos)
      << run.out;
  EXPECT_EQ(run.out.find("Feeds at the transmitter"), std::string::npos);
  EXPECT_NE(run.out.find("At 100 W from the transmitter"), std::string::npos) << run.out;
}

}  // namespace
}  // namespace wirefield::cli_test
