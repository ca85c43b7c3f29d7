// CLI tests: the same model and options give byte-identical output whatever the number of
// threads (issue: "Determinism"). Each row or frequency is computed by one thread from the
// same inputs in the same order of operations, and results are stored by index, so nothing
// may differ; only the reported thread count and the elapsed time are allowed to.
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

std::string Dipole() { return ModelsDir() + "/hiking_club_dipole.wire"; }

// The JSON document without the keys that describe the run rather than the result.
std::string WithoutRunKeys(const std::string& json_text) {
  nlohmann::json doc = nlohmann::json::parse(json_text);
  doc.erase("threads_used");
  doc.erase("elapsed_s");
  return doc.dump();
}

struct Outputs {
  std::string json, csv, s1p, svg;
};

Outputs Sweep(const std::string& threads) {
  const std::string stem = "determinism_sweep_" + threads;
  Outputs o;
  const std::string csv = WriteScratchFile(stem + ".csv", "");
  const std::string s1p = WriteScratchFile(stem + ".s1p", "");
  const std::string svg = WriteScratchFile(stem + ".svg", "");
  const ProgramRun run =
      RunWirefield({"sweep", Dipole(), "--from", "13MHz", "--to", "15.5MHz", "--points", "26",
                    "--threads", threads, "--csv", csv, "--s1p", s1p, "--svg", svg, "--json"});
  EXPECT_EQ(run.exit_code, 0) << Describe(run);
  o.json = WithoutRunKeys(run.out);
  o.csv = ReadFile(csv);
  o.s1p = ReadFile(s1p);
  o.svg = ReadFile(svg);
  return o;
}

TEST(Determinism, SweepOutputsAreByteIdenticalForOneTwoAndThreeThreads) {
  const Outputs one = Sweep("1");
  ASSERT_FALSE(one.csv.empty());
  ASSERT_FALSE(one.s1p.empty());
  ASSERT_FALSE(one.svg.empty());
  for (const std::string threads : {"2", "3"}) {
    SCOPED_TRACE("--threads " + threads);
    const Outputs other = Sweep(threads);
    EXPECT_EQ(one.json, other.json);
    EXPECT_EQ(one.csv, other.csv);
    EXPECT_EQ(one.s1p, other.s1p);
    EXPECT_EQ(one.svg, other.svg);
  }
}

TEST(Determinism, BatchJsonIsIdenticalForOneAndTwoThreads) {
  std::vector<std::string> json;
  for (const std::string threads : {"1", "2"}) {
    const ProgramRun run = RunWirefield({"batch", Dipole(), "--from", "13.8MHz", "--to", "14.6MHz",
                                         "--points", "5", "--vary", "height=2m,5m,8m", "--grounds",
                                         "perfect,medium_dry", "--threads", threads, "--json"});
    ASSERT_EQ(run.exit_code, 0) << Describe(run);
    json.push_back(WithoutRunKeys(run.out));
  }
  EXPECT_EQ(json[0], json[1]);
}

TEST(Determinism, RepeatedSolveGivesTheSameJson) {
  const ProgramRun first = RunWirefield({"solve", Dipole(), "--json"});
  const ProgramRun second = RunWirefield({"solve", Dipole(), "--json"});
  ASSERT_EQ(first.exit_code, 0) << Describe(first);
  EXPECT_EQ(first.out, second.out);
}

}  // namespace
}  // namespace wirefield::cli_test
