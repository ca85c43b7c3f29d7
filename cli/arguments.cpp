// Command-line program: reading the text of a flag (see arguments.hpp).
#include "arguments.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <cerrno>
#include <cmath>
#include <cstdlib>
#include <utility>

#include "wirefield/names.hpp"

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

std::string Trimmed(std::string s) {
  TrimBlanks(s);
  return s;
}

// The parts of text between separators, each trimmed.
std::vector<std::string> Split(const std::string& text, char separator) {
  std::vector<std::string> parts;
  size_t start = 0;
  while (true) {
    const size_t at = text.find(separator, start);
    parts.push_back(Trimmed(text.substr(start, at == std::string::npos ? at : at - start)));
    if (at == std::string::npos) return parts;
    start = at + 1;
  }
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

std::vector<Override> ParseOverrides(const std::vector<std::string>& texts) {
  std::vector<Override> overrides;
  for (const std::string& text : texts) {
    const size_t eq = text.find('=');
    if (eq == std::string::npos) {
      throw InputError({"--set", 0, 0},
                       fmt::format("expected NAME=VALUE (such as --set height=10m); got '{}'",
                                   ShortenForMessage(text)));
    }
    std::string name = text.substr(0, eq);
    TrimBlanks(name);
    if (!IsModelName(name)) {
      throw InputError({"--set", 0, 0},
                       fmt::format("'{}' is not a variable name (letters, digits and _, not "
                                   "starting with a digit); write --set NAME=VALUE",
                                   ShortenForMessage(name)));
    }
    Override o{name, text.substr(eq + 1), "--set " + name};
    std::string value = o.expression;
    TrimBlanks(value);
    if (value.empty()) FailOption(o.origin, "the value is empty; write --set NAME=VALUE");
    for (const Override& earlier : overrides) {
      if (earlier.name == name) {
        throw InputError({o.origin, 0, 0},
                         "this variable is set twice on the command line; set it once");
      }
    }
    overrides.push_back(std::move(o));
  }
  return overrides;
}

std::vector<BatchGround> ParseGroundList(const std::string& text) {
  const std::vector<std::string> known = BatchGroundNames();
  const std::string trimmed = Trimmed(text);
  std::vector<BatchGround> grounds;
  if (trimmed == "all") {
    for (const std::string& name : known) {
      if (name != "free" && name != "perfect")
        grounds.push_back(*BatchGroundNamed(name, "--grounds"));
    }
    return grounds;
  }
  for (const std::string& name : Split(trimmed, ',')) {
    std::optional<BatchGround> ground = BatchGroundNamed(name, "--grounds");
    if (!ground && name == "all") {
      std::vector<std::string> presets(known.begin(), known.end() - 2);
      FailOption("--grounds",
                 fmt::format("'all' stands alone: --grounds all runs every ground preset "
                             "and nothing else; to add free or perfect, list the presets "
                             "by name: --grounds {},free,perfect",
                             fmt::join(presets, ",")));
    }
    if (!ground) {
      FailOption("--grounds", fmt::format("unknown ground '{}'{}; use all, or a comma-separated "
                                          "list of {}",
                                          ShortenForMessage(name), DidYouMean(name, known),
                                          fmt::join(known, ", ")));
    }
    for (const BatchGround& earlier : grounds) {
      if (earlier.name == name) {
        FailOption("--grounds",
                   fmt::format("ground '{}' is listed twice; list each ground once", name));
      }
    }
    grounds.push_back(std::move(*ground));
  }
  return grounds;
}

BatchVariable ParseVary(const std::string& text) {
  const size_t eq = text.find('=');
  if (eq == std::string::npos) {
    FailOption("--vary", fmt::format("expected NAME=A:B:STEP or NAME=V1,V2,... (such as --vary "
                                     "length=19.5m:20.5m:0.25m); got '{}'",
                                     ShortenForMessage(text)));
  }
  const std::string name = Trimmed(text.substr(0, eq));
  if (!IsModelName(name)) {
    FailOption("--vary", fmt::format("'{}' is not a variable name (letters, digits and _, not "
                                     "starting with a digit); write --vary NAME=A:B:STEP",
                                     ShortenForMessage(name)));
  }
  const std::string where = "--vary " + name;
  const std::string body = text.substr(eq + 1);
  const bool range = body.find(':') != std::string::npos;
  const std::vector<std::string> parts = Split(body, range ? ':' : ',');
  for (const std::string& part : parts) {
    if (part.empty()) {
      FailOption(where, "a value is empty; write --vary NAME=A:B:STEP or --vary NAME=V1,V2");
    }
  }
  if (!range) return BatchVariableFromValues(name, parts, where);
  if (parts.size() != 3) {
    FailOption(where, fmt::format("a range needs three parts A:B:STEP (first, last, step, "
                                  "such as 19.5m:20.5m:0.25m); got '{}'",
                                  ShortenForMessage(body)));
  }
  return BatchVariableFromRange(name, parts[0], parts[1], parts[2], where);
}

InputError AboutFlag(const InputError& error, const std::vector<FieldFlag>& fields) {
  SourceLocation where = error.location();
  std::string message = error.message();
  const std::string& file = error.location().file;
  for (const FieldFlag& f : fields) {
    const bool same = file == f.field;
    const bool named = file.size() > f.field.size() &&
                       file.compare(0, f.field.size(), f.field) == 0 && file[f.field.size()] == ' ';
    if (!same && !named) continue;
    where.file = std::string(f.flag) + file.substr(f.field.size());
    if (message.compare(0, f.field.size(), f.field) == 0) {
      message = std::string(f.flag) + message.substr(f.field.size());
    }
    break;
  }
  return InputError(where, SayFlags(message, fields));
}

std::string SayFlags(std::string text, const std::vector<FieldFlag>& fields) {
  for (const FieldFlag& f : fields) {
    const std::string quoted = fmt::format("`{}`", f.field);
    for (size_t at = text.find(quoted); at != std::string::npos;
         at = text.find(quoted, at + f.flag.size())) {
      text.replace(at, quoted.size(), f.flag);
    }
  }
  return text;
}

}  // namespace wirefield::cli
