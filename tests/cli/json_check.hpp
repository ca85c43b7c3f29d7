// CLI tests: checks that a `solve --json` document has the keys and types of the contract
// (docs/commands.md) and only finite numbers. Input: parsed JSON; output: gtest failures.
#pragma once

#include <nlohmann/json.hpp>
#include <string>
#include <vector>

namespace wirefield::cli_test {

// Adds a gtest failure for each contract key of `solve --json` that is missing or of the
// wrong type, and for every number in the document that is not finite.
void ExpectSolveJsonContract(const nlohmann::json& doc, const std::string& context);

// Adds a gtest failure for each null or non-finite number anywhere in `value`, except the
// z_ohm of a load marked "open": true.
void ExpectAllNumbersFinite(const nlohmann::json& value, const std::string& path);

// Runs wirefield with `args`, adds a gtest failure unless it exits 0 with one JSON document
// on stdout, and returns the document (null when it does not parse).
nlohmann::json RunForJson(const std::vector<std::string>& args);

}  // namespace wirefield::cli_test
