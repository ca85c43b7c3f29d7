// CLI tests: the reports state an insulated wire. `solve` and `sweep` say it in their text and
// carry the `insulation` key in their JSON; a bare model's documents keep their keys without it.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>
#include <string>

#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

// The hiking club's 20 m dipole of PVC-insulated wire, and the same wire bare.
const char* kInsulated =
    "units m\n"
    "wire dip from (-5, 0, 10) to (5, 0, 10) radius 0.8mm segments 21 insulation pvc "
    "thickness=0.6mm\n"
    "feed src at dip@50%\n"
    "frequency 14.2MHz\n";
const char* kBare =
    "units m\n"
    "wire dip from (-5, 0, 10) to (5, 0, 10) radius 0.8mm segments 21\n"
    "feed src at dip@50%\n"
    "frequency 14.2MHz\n";

TEST(InsulationReport, SolveAndSweepStateTheJacketInTextAndJson) {
  const std::string model = WriteScratchFile("insulated.wire", kInsulated);
  for (const char* command : {"solve", "sweep"}) {
    std::vector<std::string> args{command, model, "--no-mesh-estimate"};
    if (std::string(command) == "sweep") {
      args.insert(args.end(), {"--from", "14MHz", "--to", "14.4MHz", "--points", "3"});
    }
    const ProgramRun text = RunWirefield(args);
    ASSERT_EQ(text.exit_code, 0) << command << text.err;
    EXPECT_NE(text.out.find("dip: pvc, 0.6 mm thick, relative permittivity 4"), std::string::npos)
        << command << "\n"
        << text.out;
    args.push_back("--json");
    const ProgramRun json = RunWirefield(args);
    ASSERT_EQ(json.exit_code, 0) << command << json.err;
    const nlohmann::json doc = nlohmann::json::parse(json.out);
    ASSERT_TRUE(doc.contains("insulation")) << command;
    ASSERT_EQ(doc["insulation"].size(), 1u);
    EXPECT_EQ(doc["insulation"][0]["wire"], "dip");
    EXPECT_EQ(doc["insulation"][0]["preset"], "pvc");
    EXPECT_DOUBLE_EQ(doc["insulation"][0]["thickness_m"].get<double>(), 0.6e-3);
  }
}

TEST(InsulationReport, ABareModelHasNoInsulationKey) {
  const std::string model = WriteScratchFile("bare.wire", kBare);
  const ProgramRun run = RunWirefield({"solve", model, "--no-mesh-estimate", "--json"});
  ASSERT_EQ(run.exit_code, 0) << run.err;
  EXPECT_FALSE(nlohmann::json::parse(run.out).contains("insulation"));
  const ProgramRun text = RunWirefield({"solve", model, "--no-mesh-estimate"});
  EXPECT_EQ(text.out.find("insulation"), std::string::npos) << text.out;
}

}  // namespace
}  // namespace wirefield::cli_test
