// CLI tests: the contract check of the `solve --json` document (see json_check.hpp). The key
// list is the one of docs/commands.md: frequency_hz, unknowns, feeds[{name, z_ohm, current_a,
// swr, z0_ohm}]; complex numbers are [re, im] arrays.
#include "cli/json_check.hpp"

#include <gtest/gtest.h>

#include <cmath>

#include "cli/program_runner.hpp"

namespace wirefield::cli_test {

namespace {

bool IsComplexPair(const nlohmann::json& value) {
  return value.is_array() && value.size() == 2 && value[0].is_number() && value[1].is_number();
}

}  // namespace

void ExpectAllNumbersFinite(const nlohmann::json& value, const std::string& path) {
  if (value.is_null()) {
    ADD_FAILURE() << "null at " << path;
  } else if (value.is_number_float()) {
    EXPECT_TRUE(std::isfinite(value.get<double>())) << "non-finite number at " << path;
  } else if (value.is_array()) {
    for (std::size_t i = 0; i < value.size(); ++i) {
      ExpectAllNumbersFinite(value[i], path + "[" + std::to_string(i) + "]");
    }
  } else if (value.is_object()) {
    const bool open_load =
        value.contains("open") && value["open"].is_boolean() && value["open"].get<bool>();
    for (const auto& [key, item] : value.items()) {
      if (open_load && key == "z_ohm" && item.is_null()) continue;
      ExpectAllNumbersFinite(item, path + "." + key);
    }
  }
}

void ExpectSolveJsonContract(const nlohmann::json& doc, const std::string& context) {
  ASSERT_TRUE(doc.is_object()) << context;
  ASSERT_TRUE(doc.contains("frequency_hz")) << context;
  EXPECT_TRUE(doc["frequency_hz"].is_number()) << context;
  ASSERT_TRUE(doc.contains("unknowns")) << context;
  EXPECT_TRUE(doc["unknowns"].is_number_integer()) << context;
  EXPECT_GT(doc["unknowns"].get<long long>(), 0) << context;
  ASSERT_TRUE(doc.contains("feeds")) << context;
  ASSERT_TRUE(doc["feeds"].is_array()) << context;
  EXPECT_FALSE(doc["feeds"].empty()) << context;
  for (const nlohmann::json& feed : doc["feeds"]) {
    ASSERT_TRUE(feed.is_object()) << context;
    ASSERT_TRUE(feed.contains("name") && feed["name"].is_string()) << context;
    ASSERT_TRUE(feed.contains("z_ohm")) << context;
    EXPECT_TRUE(IsComplexPair(feed["z_ohm"])) << context << ": z_ohm " << feed["z_ohm"];
    ASSERT_TRUE(feed.contains("current_a")) << context;
    EXPECT_TRUE(IsComplexPair(feed["current_a"])) << context;
    ASSERT_TRUE(feed.contains("swr") && feed["swr"].is_number()) << context;
    EXPECT_GE(feed["swr"].get<double>(), 1.0) << context;  // SWR >= 1 by definition
    ASSERT_TRUE(feed.contains("z0_ohm") && feed["z0_ohm"].is_number()) << context;
  }
  ExpectAllNumbersFinite(doc, context);
}

nlohmann::json RunForJson(const std::vector<std::string>& args) {
  const ProgramRun run = RunWirefield(args);
  EXPECT_TRUE(run.exited && run.exit_code == 0) << Describe(run) << "\n" << run.err;
  nlohmann::json doc;
  EXPECT_NO_THROW(doc = nlohmann::json::parse(run.out)) << run.out;
  return doc;
}

}  // namespace wirefield::cli_test
