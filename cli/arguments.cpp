// Command-line program: reading the text of a flag (see arguments.hpp).
#include "arguments.hpp"

#include <fmt/format.h>

#include <cerrno>
#include <cmath>
#include <cstdlib>
#include <utility>

namespace wirefield::cli {
namespace {

// The SI number of a reading, or its problem as an InputError at `option`.
double ValueOrFail(const ValueReading& reading, const std::string& option) {
  if (!reading.problem) return reading.si;
  const ValueProblem& problem = *reading.problem;
  throw InputError(
      SourceLocation{option, problem.line, problem.column},
      problem.after_name ? fmt::format("{} {}", option, problem.message) : problem.message);
}

void TrimBlanks(std::string& s) {
  while (!s.empty() && (s.back() == ' ' || s.back() == '\t')) s.pop_back();
  size_t first = 0;
  while (first < s.size() && (s[first] == ' ' || s[first] == '\t')) ++first;
  s.erase(0, first);
}

}  // namespace

void FailOption(const std::string& option, const std::string& message) {
  throw InputError(SourceLocation{option, 1, 1}, message);
}

int WholeNumber(const std::string& text, const std::string& option, long low, long high,
                const std::string& what) {
  const char* begin = text.c_str();
  char* end = nullptr;
  errno = 0;
  const long value = std::strtol(begin, &end, 10);
  if (text.empty() || end == begin || *end != '\0' || errno == ERANGE || value < low ||
      value > high) {
    FailOption(option, fmt::format("{} needs {}; got '{}'", option, what, text));
  }
  return static_cast<int>(value);
}

double ParseDegrees(const std::string& text, const std::string& option,
                    const std::string& example) {
  const SourceLocation where{option, 1, 1};
  std::string body = text;
  while (!body.empty() && (body.back() == ' ' || body.back() == '\t')) body.pop_back();
  if (body.size() >= 3 && body.compare(body.size() - 3, 3, "deg") == 0) {
    body.resize(body.size() - 3);
  }
  while (!body.empty() && (body.back() == ' ' || body.back() == '\t')) body.pop_back();
  const char* begin = body.c_str();
  while (*begin == ' ' || *begin == '\t') ++begin;
  char* end = nullptr;
  errno = 0;
  const double value = std::strtod(begin, &end);
  if (*begin == '\0' || end == begin || *end != '\0' || errno == ERANGE || !std::isfinite(value)) {
    throw InputError(where, fmt::format("{} needs an angle in degrees such as {}; got '{}'", option,
                                        example, text));
  }
  return value;
}

double ShareFlag(const std::string& text, const std::string& option, const std::string& what) {
  const char* begin = text.c_str();
  char* end = nullptr;
  errno = 0;
  const double value = std::strtod(begin, &end);
  if (text.empty() || end == begin || *end != '\0' || errno == ERANGE || !(value > 0.0) ||
      !(value <= 1.0)) {
    FailOption(option, fmt::format("{} needs {} greater than 0 and at most 1, e.g. 0.5; got '{}'",
                                   option, what, text));
  }
  return value;
}

double ParseFrequencyArgument(const std::string& text, const std::string& option) {
  return ValueOrFail(ReadQuantity(text, QuantityKind::kFrequency), option);
}

double ParseResistanceArgument(const std::string& text, const std::string& option) {
  return ValueOrFail(ReadQuantity(text, QuantityKind::kResistance), option);
}

double ParseLengthArgument(const std::string& text, const std::string& option) {
  return ValueOrFail(ReadQuantity(text, QuantityKind::kLength), option);
}

double ParseInductanceArgument(const std::string& text, const std::string& option) {
  return ValueOrFail(ReadQuantity(text, QuantityKind::kInductance), option);
}

double ParseVoltageArgument(const std::string& text, const std::string& option) {
  return ValueOrFail(ReadQuantity(text, QuantityKind::kVoltage), option);
}

double ParseVariableArgument(const std::string& text, const std::string& option,
                             const VariableSpec& variable) {
  return ValueOrFail(ReadVariableValue(text, variable), option);
}

double ParsePowerArgument(const std::string& text, const std::string& option) {
  const SourceLocation where{option, 1, 1};
  const std::string example = "100W, 500mW or 1.5kW";
  std::string body = text;
  TrimBlanks(body);
  if (body.empty()) {
    throw InputError(where,
                     fmt::format("{} needs a power with its unit, such as {}", option, example));
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
  TrimBlanks(body);
  char* end = nullptr;
  errno = 0;
  const double number = std::strtod(body.c_str(), &end);
  const bool is_number = !body.empty() && end != body.c_str() && *end == '\0' && errno != ERANGE &&
                         std::isfinite(number);
  if (!is_number) {
    throw InputError(where,
                     fmt::format("{} needs a power such as {}; got '{}'", option, example, text));
  }
  if (factor == 0.0) {
    throw InputError(where, fmt::format("{} needs a unit: W, mW or kW (e.g. {}W); got '{}'", option,
                                        body, text));
  }
  if (!(number > 0.0)) {
    throw InputError(where, fmt::format("{} must be positive; got '{}'", option, text));
  }
  StressOptions power;
  power.power_w = number * factor;
  NamingFlags({{"power_w", option}}, [&] { power.Validate(); });
  return power.power_w;
}

TransmitMode ParseTransmitMode(const std::string& text, const std::string& option) {
  for (TransmitMode m : {TransmitMode::kSsb, TransmitMode::kCw, TransmitMode::kFm,
                         TransmitMode::kDigital, TransmitMode::kCarrier}) {
    if (text == ToString(m)) return m;
  }
  FailOption(option, fmt::format("{} must be one of ssb, cw, fm, digital, carrier; got '{}'",
                                 option, text));
}

std::optional<TuneGoal> ParseTuneGoal(const std::string& text) {
  for (TuneGoal g : {TuneGoal::kResonance, TuneGoal::kMinSwr}) {
    if (text == ToString(g)) return g;
  }
  return std::nullopt;
}

std::optional<ResonanceKind> ParseResonanceKind(const std::string& text) {
  for (ResonanceKind k : {ResonanceKind::kAuto, ResonanceKind::kSeries, ResonanceKind::kParallel}) {
    if (text == ToString(k)) return k;
  }
  return std::nullopt;
}

InputError AboutFlag(const InputError& error, const std::vector<FieldFlag>& fields) {
  const std::string& file = error.location().file;
  for (const FieldFlag& f : fields) {
    const bool same = file == f.field;
    const bool named = file.size() > f.field.size() &&
                       file.compare(0, f.field.size(), f.field) == 0 && file[f.field.size()] == ' ';
    if (!same && !named) continue;
    SourceLocation where = error.location();
    where.file = std::string(f.flag) + file.substr(f.field.size());
    std::string message = error.message();
    if (message.compare(0, f.field.size(), f.field) == 0) {
      message = std::string(f.flag) + message.substr(f.field.size());
    }
    return InputError(where, message);
  }
  return error;
}

}  // namespace wirefield::cli
