// CLI tests: every example in models/ runs through the program with exit 0 and gives the
// contract's JSON with finite numbers, and opens with its description (what it shows, how
// to run it, the rough result); each "# Rough result: ..." line is run and its impedance
// and SWR (or maximum gain and take-off angle) checked. The folder is listed at run time, so a new
// model is covered without touching this file.
#include <gtest/gtest.h>

#include <algorithm>
#include <complex>
#include <filesystem>
#include <nlohmann/json.hpp>
#include <regex>
#include <sstream>
#include <string>
#include <vector>

#include "cli/json_check.hpp"
#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

std::vector<std::string> ModelFiles() {
  std::vector<std::string> files;
  for (const auto& entry : std::filesystem::directory_iterator(ModelsDir())) {
    if (entry.path().extension() == ".wire") files.push_back(entry.path().string());
  }
  std::sort(files.begin(), files.end());
  return files;
}

class BundledModel : public testing::TestWithParam<std::string> {};

TEST_P(BundledModel, SolvesWithExitZeroAndFiniteContractJson) {
  const ProgramRun run = RunWirefield({"solve", GetParam(), "--json"});
  ASSERT_TRUE(run.exited) << Describe(run);
  ASSERT_EQ(run.exit_code, 0) << Describe(run);
  nlohmann::json doc;
  ASSERT_NO_THROW(doc = nlohmann::json::parse(run.out)) << run.out;
  ExpectSolveJsonContract(doc, GetParam());
}

TEST_P(BundledModel, TextReportHasNoNonFiniteNumber) {
  const ProgramRun run = RunWirefield({"solve", GetParam()});
  ASSERT_TRUE(run.exited) << Describe(run);
  ASSERT_EQ(run.exit_code, 0) << Describe(run);
  EXPECT_FALSE(
      std::regex_search(run.out, std::regex("\\b(nan|inf|infinity)\\b", std::regex::icase)))
      << run.out;
}

TEST_P(BundledModel, OpensWithWhatItShowsHowToRunItAndTheRoughResult) {
  const std::string text = ReadFile(GetParam());
  ASSERT_FALSE(text.empty());
  EXPECT_EQ(text[0], '#');
  const std::string header = text.substr(0, text.find("\nunits"));
  EXPECT_NE(header.find("# Shows:"), std::string::npos) << header;
  EXPECT_NE(header.find("# Run: wirefield solve models/"), std::string::npos) << header;
  EXPECT_NE(header.find("# Rough result:"), std::string::npos) << header;
}

// What a model states in its header, one line each, in one of two forms:
//   # Rough result: solve [ARGS] at F MHz: Z = R +|- jX ohm|kohm, SWR S (Z0 ohm)
//   # Rough result: pattern [ARGS] at F MHz: max G dBi at E deg elevation
// Z is at the feed's terminals (`feeds[0].z_ohm`), the SWR where the transmitter connects
// against Z0 (`feeds[0].swr`), G and E the pattern's maximum gain and take-off angle
// (`max_gain_dbi`, `takeoff_elevation_deg`), as docs/commands.md defines them.
struct RoughResult {
  std::string line;
  std::string command;            // "solve" or "pattern"
  std::vector<std::string> args;  // the command's options before --freq
  std::string frequency;          // "7.1MHz"
  std::complex<double> z_ohm;     // solve
  double swr = 0.0;
  double z0_ohm = 0.0;
  double max_gain_dbi = 0.0;  // pattern
  double takeoff_deg = 0.0;
};

std::vector<RoughResult> RoughResults(const std::string& text, std::vector<std::string>* bad) {
  static const std::regex kSolve(
      "# Rough result: solve((?: \\S+)*) at ([0-9.]+) MHz: Z = ([0-9.]+) ([+-]) j([0-9.]+) "
      "(ohm|kohm), SWR ([0-9.]+) \\(([0-9.]+) ohm\\)");
  static const std::regex kPattern(
      "# Rough result: pattern((?: \\S+)*) at ([0-9.]+) MHz: max (-?[0-9.]+) dBi at ([0-9.]+) "
      "deg elevation");
  std::vector<RoughResult> results;
  std::istringstream lines(text);
  for (std::string line; std::getline(lines, line);) {
    if (line.rfind("# Rough result:", 0) != 0) continue;
    std::smatch m;
    RoughResult r;
    r.line = line;
    if (std::regex_match(line, m, kSolve)) {
      r.command = "solve";
      const double unit = m[6].str() == "kohm" ? 1e3 : 1.0;
      const double sign = m[4].str() == "-" ? -1.0 : 1.0;
      r.z_ohm = {std::stod(m[3].str()) * unit, sign * std::stod(m[5].str()) * unit};
      r.swr = std::stod(m[7].str());
      r.z0_ohm = std::stod(m[8].str());
    } else if (std::regex_match(line, m, kPattern)) {
      r.command = "pattern";
      r.max_gain_dbi = std::stod(m[3].str());
      r.takeoff_deg = std::stod(m[4].str());
    } else {
      bad->push_back(line);
      continue;
    }
    std::istringstream args(m[1].str());
    for (std::string arg; args >> arg;) r.args.push_back(arg);
    r.frequency = m[2].str() + "MHz";
    results.push_back(r);
  }
  return results;
}

// Tolerances of a stated figure. Impedance and SWR: 5%. They are written to 2-3 significant
// digits (rounding up to 0.5% of |Z| or of the SWR), and a change of the ground model or of
// the mesh that moves a model by a few percent should not make its comment wrong; a comment
// off by more than that no longer describes the model. Gain: 0.5 dB (a 12% change of the
// radiated power density; the figures are written to 0.01 dB). Take-off: 2 degrees (two
// steps of the pattern's default 1-degree grid; written to the nearest degree).
constexpr double kRoughTolerance = 0.05;
constexpr double kRoughGainTolerance_db = 0.5;
constexpr double kRoughAngleTolerance_deg = 2.0;

void CheckSolve(const RoughResult& r, const nlohmann::json& doc) {
  const nlohmann::json& feed = doc.at("feeds").at(0);
  const std::complex<double> z_ohm{feed.at("z_ohm").at(0).get<double>(),
                                   feed.at("z_ohm").at(1).get<double>()};
  EXPECT_LE(std::abs(z_ohm - r.z_ohm), kRoughTolerance * std::abs(r.z_ohm))
      << r.line << "\n  the program gives Z = " << z_ohm.real() << " + j" << z_ohm.imag() << " ohm";
  EXPECT_EQ(feed.at("z0_ohm").get<double>(), r.z0_ohm) << r.line;
  EXPECT_LE(std::abs(feed.at("swr").get<double>() - r.swr), kRoughTolerance * r.swr)
      << r.line << "\n  the program gives SWR " << feed.at("swr").get<double>();
}

void CheckPattern(const RoughResult& r, const nlohmann::json& doc) {
  EXPECT_NEAR(doc.at("max_gain_dbi").get<double>(), r.max_gain_dbi, kRoughGainTolerance_db)
      << r.line;
  EXPECT_NEAR(doc.at("takeoff_elevation_deg").get<double>(), r.takeoff_deg,
              kRoughAngleTolerance_deg)
      << r.line;
}

TEST_P(BundledModel, StatesItsRoughResultAndTheProgramAgrees) {
  std::vector<std::string> bad;
  const std::vector<RoughResult> results = RoughResults(ReadFile(GetParam()), &bad);
  EXPECT_TRUE(bad.empty()) << "lines not in the form '# Rough result: solve [ARGS] at F MHz: Z = "
                              "R + jX ohm, SWR S (Z0 ohm)' or '# Rough result: pattern [ARGS] at "
                              "F MHz: max G dBi at E deg elevation': "
                           << testing::PrintToString(bad);
  ASSERT_TRUE(std::any_of(results.begin(), results.end(),
                          [](const RoughResult& r) { return r.command == "solve"; }))
      << "no '# Rough result: solve ...' line in " << GetParam();
  for (const RoughResult& r : results) {
    std::vector<std::string> args{r.command, GetParam()};
    args.insert(args.end(), r.args.begin(), r.args.end());
    args.insert(args.end(), {"--freq", r.frequency, "--json"});
    const nlohmann::json doc = RunForJson(args);
    if (r.command == "solve") {
      CheckSolve(r, doc);
    } else {
      CheckPattern(r, doc);
    }
  }
}

std::string TestName(const testing::TestParamInfo<std::string>& info) {
  std::string name = std::filesystem::path(info.param).stem().string();
  std::replace_if(
      name.begin(), name.end(), [](char c) { return !std::isalnum(c); }, '_');
  return name;
}

INSTANTIATE_TEST_SUITE_P(Models, BundledModel, testing::ValuesIn(ModelFiles()), TestName);

TEST(BundledModels, TheFolderHoldsTheDocumentedExamples) {
  const std::vector<std::string> files = ModelFiles();
  for (const char* name :
       {"hiking_club_dipole.wire", "campsite_vertical.wire", "inverted_v_trail.wire",
        "trap_dipole.wire", "end_fed_field_kit.wire", "kit_sloper.wire", "kit_inverted_l.wire"}) {
    EXPECT_TRUE(std::any_of(files.begin(), files.end(), [&](const std::string& f) {
      return std::filesystem::path(f).filename() == name;
    })) << name;
  }
}

}  // namespace
}  // namespace wirefield::cli_test
