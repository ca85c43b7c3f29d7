// CLI tests: every example in models/ runs through the program with exit 0 and gives the
// contract's JSON with finite numbers, and opens with its description (what it shows, how
// to run it, the rough result). The folder is listed at run time, so a new model is covered
// without touching this file.
#include <gtest/gtest.h>

#include <algorithm>
#include <filesystem>
#include <nlohmann/json.hpp>
#include <regex>
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
