// API: the transmitter power given on the command line (wirefield/stress.hpp). The stress
// itself is post-processing of a solve (post/stress.cpp).
#include "wirefield/stress.hpp"

#include <fmt/format.h>

#include <cerrno>
#include <cmath>
#include <cstdlib>

#include "model/ranges.hpp"

namespace wirefield {

double ParsePowerArgument(const std::string& text, const std::string& option_name) {
  const SourceLocation where{option_name, 1, 1};
  const std::string example = "100W, 500mW or 1.5kW";
  std::string body = text;
  auto trim = [](std::string& s) {
    while (!s.empty() && (s.back() == ' ' || s.back() == '\t')) s.pop_back();
    size_t first = 0;
    while (first < s.size() && (s[first] == ' ' || s[first] == '\t')) ++first;
    s.erase(0, first);
  };
  trim(body);
  if (body.empty()) {
    throw InputError(
        where, fmt::format("{} needs a power with its unit, such as {}", option_name, example));
  }
  double factor = 0.0;
  for (const auto& [suffix, f] :
       {std::pair<std::string, double>{"kW", 1e3}, {"mW", 1e-3}, {"W", 1.0}}) {
    if (body.size() > suffix.size() &&
        body.compare(body.size() - suffix.size(), suffix.size(), suffix) == 0) {
      factor = f;
      body.resize(body.size() - suffix.size());
      break;
    }
  }
  trim(body);
  char* end = nullptr;
  errno = 0;
  const double number = std::strtod(body.c_str(), &end);
  const bool is_number = !body.empty() && end != body.c_str() && *end == '\0' && errno != ERANGE &&
                         std::isfinite(number);
  if (!is_number) {
    throw InputError(
        where, fmt::format("{} needs a power such as {}; got '{}'", option_name, example, text));
  }
  if (factor == 0.0) {
    throw InputError(where, fmt::format("{} needs a unit: W, mW or kW (e.g. {}W); got '{}'",
                                        option_name, body, text));
  }
  if (!(number > 0.0)) {
    throw InputError(where, fmt::format("{} must be positive; got '{}'", option_name, text));
  }
  if (auto message = model::OutOfRange(model::ValueKind::kPowerW, number * factor, option_name)) {
    throw InputError(where, *message);
  }
  return number * factor;
}

}  // namespace wirefield
