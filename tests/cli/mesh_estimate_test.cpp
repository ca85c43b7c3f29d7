// CLI tests: the mesh error estimate in every command that reports a feed impedance: the text
// "Z = R + jX ohm (mesh +-E ohm)", the JSON keys with finite numbers (solve, sweep, tune,
// batch), the warning on a deliberately coarse mesh and its absence on the default mesh, and
// --no-mesh-estimate.
#include <gtest/gtest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/json_check.hpp"
#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

std::string Dipole() { return ModelsDir() + "/hiking_club_dipole.wire"; }

// The club dipole with `segments N` on its wire.
std::string DipoleWithSegments(int segments) {
  std::string text = ReadFile(Dipole());
  const std::string radius = "radius wire_diameter / 2";
  const size_t at = text.find(radius);
  EXPECT_NE(at, std::string::npos);
  text.insert(at + radius.size(), " segments " + std::to_string(segments));
  return WriteScratchFile("dipole_" + std::to_string(segments) + ".wire", text);
}

bool FinitePositive(const nlohmann::json& value) {
  return value.is_number() && std::isfinite(value.get<double>()) && value.get<double>() > 0.0;
}

TEST(MeshEstimateCommand, SolvePrintsTheImpedanceWithItsErrorBar) {
  const ProgramRun run = RunWirefield({"solve", Dipole()});
  ASSERT_TRUE(run.exited && run.exit_code == 0) << Describe(run) << run.err;
  EXPECT_NE(run.out.find("feed src: Z = 67.1 - j36.1 ohm (mesh +-"), std::string::npos) << run.out;
  // The default mesh needs no warning about the mesh (its estimate is about 1.5% of |Z|).
  EXPECT_EQ(run.err.find("from the converged value"), std::string::npos) << run.err;
}

TEST(MeshEstimateCommand, SolveJsonGivesAFiniteErrorPerFeed) {
  const nlohmann::json doc = RunForJson({"solve", Dipole(), "--json"});
  ASSERT_TRUE(doc.is_object());
  ExpectSolveJsonContract(doc, "solve");
  ExpectAllNumbersFinite(doc, "solve");
  ASSERT_EQ(doc["feeds"].size(), 1u);
  EXPECT_TRUE(FinitePositive(doc["feeds"][0]["mesh_error_ohm"]));
  const nlohmann::json& estimate = doc["mesh_estimate"];
  ASSERT_TRUE(estimate.is_object());
  EXPECT_EQ(estimate["segments"], doc["segments"]);
  EXPECT_LT(estimate["half_segments"].get<int>(), doc["segments"].get<int>());
  EXPECT_LT(estimate["quarter_segments"].get<int>(), estimate["half_segments"].get<int>());
  ASSERT_EQ(estimate["feeds"].size(), 1u);
  EXPECT_EQ(estimate["feeds"][0]["mesh_error_ohm"], doc["feeds"][0]["mesh_error_ohm"]);
  EXPECT_TRUE(estimate["feeds"][0]["observed_order"].is_number());
  EXPECT_TRUE(estimate["feeds"][0]["asymptotic"].is_boolean());
  EXPECT_TRUE(doc["warnings"].empty()) << doc["warnings"];
}

TEST(MeshEstimateCommand, WarnsOnACoarseMeshSayingWhatToChange) {
  // 5 segments on a half wave: coarser than the common 10 per half wave (common practice).
  const ProgramRun run = RunWirefield({"solve", DipoleWithSegments(5)});
  ASSERT_TRUE(run.exited && run.exit_code == 0) << Describe(run) << run.err;
  EXPECT_NE(run.err.find("warning: feed 'src': the mesh may put its impedance"), std::string::npos)
      << run.err;
  EXPECT_NE(run.err.find("give wire 'dipole' more segments (`segments 10` instead of 5)"),
            std::string::npos)
      << run.err;
  const nlohmann::json doc = RunForJson({"solve", DipoleWithSegments(5), "--json"});
  ASSERT_TRUE(doc.is_object());
  bool warned = false;
  for (const auto& w : doc["warnings"]) {
    warned = warned || w.get<std::string>().find("from the converged value") != std::string::npos;
  }
  EXPECT_TRUE(warned) << doc["warnings"];
}

TEST(MeshEstimateCommand, NoMeshEstimateLeavesItOut) {
  const nlohmann::json doc = RunForJson({"solve", Dipole(), "--json", "--no-mesh-estimate"});
  ASSERT_TRUE(doc.is_object());
  EXPECT_FALSE(doc.contains("mesh_estimate"));
  EXPECT_FALSE(doc["feeds"][0].contains("mesh_error_ohm"));
}

TEST(MeshEstimateCommand, SweepEstimatesAtTheBandCentreOnly) {
  const nlohmann::json doc = RunForJson(
      {"sweep", Dipole(), "--from", "14MHz", "--to", "14.4MHz", "--points", "11", "--json"});
  ASSERT_TRUE(doc.is_object());
  ExpectAllNumbersFinite(doc["points"], "sweep points");
  ASSERT_EQ(doc["mesh_estimates"].size(), 1u);
  const nlohmann::json& e = doc["mesh_estimates"][0];
  EXPECT_NEAR(e["frequency_hz"].get<double>(), 14.2e6, 1.0);
  EXPECT_TRUE(FinitePositive(e["mesh_error_ohm"]));
  ExpectAllNumbersFinite(e, "sweep mesh estimate");
  const ProgramRun run =
      RunWirefield({"sweep", Dipole(), "--from", "14MHz", "--to", "14.4MHz", "--points", "11"});
  ASSERT_TRUE(run.exited && run.exit_code == 0) << Describe(run) << run.err;
  EXPECT_NE(run.out.find("at each band's centre only"), std::string::npos) << run.out;
}

TEST(MeshEstimateCommand, TuneGivesTheTunedImpedanceWithItsError) {
  const nlohmann::json doc =
      RunForJson({"tune", Dipole(), "--vary", "total", "--target", "14.2MHz", "--json"});
  ASSERT_TRUE(doc.is_object());
  ExpectAllNumbersFinite(doc, "tune");
  ASSERT_EQ(doc["variables"].size(), 1u);
  EXPECT_TRUE(FinitePositive(doc["variables"][0]["mesh_error_ohm"]));
}

TEST(MeshEstimateCommand, BatchRowsCarryTheEstimate) {
  const nlohmann::json doc = RunForJson({"batch", Dipole(), "--from", "14MHz", "--to", "14.4MHz",
                                         "--points", "5", "--vary", "total=10m,10.3m", "--json"});
  ASSERT_TRUE(doc.is_object());
  ASSERT_EQ(doc["rows"].size(), 2u);
  for (const auto& row : doc["rows"]) {
    ASSERT_TRUE(row["mesh_estimate"].is_object()) << row;
    EXPECT_TRUE(FinitePositive(row["mesh_estimate"]["mesh_error_ohm"])) << row;
    ExpectAllNumbersFinite(row["mesh_estimate"], "batch row mesh estimate");
  }
  const std::string csv = WriteScratchFile("mesh_batch.csv", "");
  const ProgramRun run = RunWirefield(
      {"batch", Dipole(), "--from", "14MHz", "--to", "14.4MHz", "--points", "5", "--csv", csv});
  ASSERT_TRUE(run.exited && run.exit_code == 0) << Describe(run) << run.err;
  EXPECT_NE(ReadFile(csv).find(",mesh_error_ohm,error\n"), std::string::npos);
  EXPECT_NE(run.out.find("Z at centre, mesh +- (ohm)"), std::string::npos) << run.out;
}

}  // namespace
}  // namespace wirefield::cli_test
