// CLI tests: `wirefield coil`: exit codes, the exact text of its bad options, the JSON
// document's keys and types, the common 50-turn coil, and the --inductance design mode.
#include <fmt/format.h>
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/json_check.hpp"
#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

const std::vector<std::string> kFiftyTurns = {"coil",   "--turns",      "50",    "--diameter",
                                              "28.5mm", "--pitch",      "1mm",   "--wire-diameter",
                                              "0.9mm",  "--insulation", "0.05mm"};

std::vector<std::string> With(std::vector<std::string> args, const std::vector<std::string>& more) {
  args.insert(args.end(), more.begin(), more.end());
  return args;
}

nlohmann::json JsonOf(const std::vector<std::string>& args) {
  const ProgramRun run = RunWirefield(args);
  EXPECT_TRUE(run.exited && run.exit_code == 0) << run.err;
  nlohmann::json doc;
  EXPECT_NO_THROW(doc = nlohmann::json::parse(run.out)) << run.out;
  return doc;
}

void ExpectBadInput(const std::vector<std::string>& args, const std::string& error) {
  const ProgramRun run = RunWirefield(args);
  EXPECT_TRUE(run.exited);
  EXPECT_EQ(run.exit_code, 2) << run.err;
  EXPECT_EQ(run.out, "");
  EXPECT_EQ(run.err, error + "\n");
}

TEST(CoilCommand, PrintsTheCoilWithUnitsAndACaution) {
  const ProgramRun run = RunWirefield(kFiftyTurns);
  ASSERT_TRUE(run.exited && run.exit_code == 0) << run.err;
  EXPECT_NE(run.out.find(" uH"), std::string::npos);
  EXPECT_NE(run.out.find("Wheeler"), std::string::npos);
  EXPECT_NE(run.out.find(" pF"), std::string::npos);
  EXPECT_NE(run.out.find("Caution: a loading coil at transmitting power"), std::string::npos);
}

TEST(CoilJson, HasTheDocumentedKeysAndTypes) {
  const nlohmann::json doc = JsonOf(With(kFiftyTurns, {"--json", "--freq", "7.1MHz"}));
  for (const char* key : {"turns",
                          "former_diameter_m",
                          "sheet_diameter_m",
                          "length_m",
                          "pitch_m",
                          "wire_diameter_m",
                          "insulation_m",
                          "conductivity_s_per_m",
                          "wire_length_m",
                          "nagaoka_coefficient",
                          "inductance_sheet_h",
                          "rosa_correction_h",
                          "inductance_h",
                          "inductance_wheeler_h",
                          "medhurst_h_pf_per_cm",
                          "self_capacitance_f",
                          "self_resonance_hz",
                          "frequency_hz",
                          "dc_resistance_ohm",
                          "skin_depth_m",
                          "straight_wire_resistance_ohm",
                          "proximity_factor",
                          "ac_resistance_ohm",
                          "reactance_ohm",
                          "q",
                          "apparent_resistance_ohm",
                          "apparent_inductance_h",
                          "apparent_q"}) {
    EXPECT_TRUE(doc.contains(key) && doc.at(key).is_number()) << key;
  }
  EXPECT_TRUE(doc.at("material").is_string());
  EXPECT_TRUE(doc.at("z_ohm").is_array() && doc.at("z_ohm").size() == 2u);
  EXPECT_TRUE(doc.at("notes").is_array());
  EXPECT_FALSE(doc.contains("target_inductance_h"));
  ExpectAllNumbersFinite(doc, "coil");
  EXPECT_EQ(doc.at("frequency_hz").get<double>(), 7.1e6);
  // The 50-turn coil on a 28.5 mm former is about 34 uH (common practice): +-5%.
  EXPECT_NEAR(doc.at("inductance_h").get<double>() / 34e-6, 1.0, 0.05);
}

TEST(CoilJson, TheInductanceOptionDesignsTheTurns) {
  // Round trip through the program: the inductance of the 50-turn coil asks for 50 turns.
  // Tolerance 1e-6 turns (the JSON carries 17 digits; the root finder stops at 44 bits).
  const double target_h = JsonOf(With(kFiftyTurns, {"--json"})).at("inductance_h").get<double>();
  const nlohmann::json doc =
      JsonOf({"coil", "--inductance", fmt::format("{:.17g}", target_h), "--diameter", "28.5mm",
              "--close-wound", "--wire-diameter", "0.9mm", "--insulation", "0.05mm", "--json"});
  EXPECT_NEAR(doc.at("turns").get<double>(), 50.0, 1e-6);
  EXPECT_EQ(doc.at("target_inductance_h").get<double>(), target_h);
}

TEST(CoilCommand, BadOptionsExitWithTwoAndSayWhatToChange) {
  ExpectBadInput({"coil", "--turns", "50", "--diameter", "28.5mm", "--pitch", "0.5mm",
                  "--wire-diameter", "0.9mm"},
                 "coil: error: the pitch 0.5 mm is smaller than the wire's overall diameter 0.9 "
                 "mm (wire 0.9 mm plus twice the insulation 0 mm): the turns would overlap; use "
                 "a larger pitch or length, fewer turns or a thinner wire");
  ExpectBadInput({"coil", "--turns", "50", "--diameter", "28.5MHz", "--pitch", "1mm",
                  "--wire-diameter", "0.9mm"},
                 "--diameter:1:1: error: --diameter needs a length (m, cm, mm, ft, in); got a "
                 "frequency (Hz)");
  ExpectBadInput({"coil", "--turns", "50", "--diameter", "28.5mm", "--wire-diameter", "0.9mm"},
                 "coil: error: give the winding by --length L, --pitch P or --close-wound, "
                 "exactly one");
  ExpectBadInput({"coil", "--diameter", "28.5mm", "--pitch", "1mm", "--wire-diameter", "0.9mm"},
                 "coil: error: give either --turns N (analyse a coil) or --inductance L (find "
                 "the turns for it), exactly one");
  ExpectBadInput({"coil", "--turns", "many", "--diameter", "28.5mm", "--pitch", "1mm",
                  "--wire-diameter", "0.9mm"},
                 "--turns: error: --turns needs a number of turns such as 50; got 'many'");
  ExpectBadInput({"coil", "--inductance", "20uF", "--diameter", "28.5mm", "--pitch", "1mm",
                  "--wire-diameter", "0.9mm"},
                 "--inductance:1:1: error: --inductance needs an inductance (H, mH, uH, nH); "
                 "got a capacitance (F)");
  ExpectBadInput({"coil", "--turns", "5", "--diameter", "28.5mm", "--pitch", "1mm",
                  "--wire-diameter", "0.9mm", "--material", "gold"},
                 "--material: error: unknown wire material 'gold'; the materials are copper, "
                 "hard_drawn_copper, aluminium, copper_clad_steel, steel, stainless_steel, "
                 "brass, aluminum");
}

TEST(CoilCommand, AMissingRequiredOptionIsABadOption) {
  const ProgramRun run = RunWirefield({"coil", "--turns", "5"});
  EXPECT_TRUE(run.exited);
  EXPECT_EQ(run.exit_code, 2);
  EXPECT_NE(run.err.find("--diameter"), std::string::npos) << run.err;
}

}  // namespace
}  // namespace wirefield::cli_test
