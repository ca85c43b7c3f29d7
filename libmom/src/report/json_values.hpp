// Report stage: the JSON values every JSON report writes the same way: a number that may be
// absent (null then), a complex number as [real, imaginary], and warnings as their text.
// Input: results' fields; output: nlohmann::json values.
#pragma once

#include <nlohmann/json.hpp>
#include <optional>
#include <vector>

#include "wirefield/model.hpp"

namespace wirefield::report {

// The value, or null when there is none.
template <typename T>
nlohmann::json OptionalJson(const std::optional<T>& value) {
  return value ? nlohmann::json(*value) : nlohmann::json(nullptr);
}

// [real, imaginary].
inline nlohmann::json ComplexJson(Complex value) {
  return nlohmann::json::array({value.real(), value.imag()});
}

// Warnings as a JSON array of their text ("FILE:LINE:COLUMN: warning: ..."), those of `first`
// then those of `then`.
inline nlohmann::json WarningsJson(const std::vector<Warning>& first,
                                   const std::vector<Warning>& then = {}) {
  nlohmann::json out = nlohmann::json::array();
  for (const Warning& warning : first) out.push_back(ToString(warning));
  for (const Warning& warning : then) out.push_back(ToString(warning));
  return out;
}

}  // namespace wirefield::report
