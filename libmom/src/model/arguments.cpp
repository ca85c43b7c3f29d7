// Model stage: quantities and overrides given on the command line (--freq, --z0, --set and
// the like), read as expressions of the model language so that units work as in a model.
// Inputs: the option's text and name; outputs: SI values and overrides, or an InputError at
// the option.
#include <fmt/format.h>

#include "model/expression.hpp"
#include "model/lexer.hpp"
#include "model/ranges.hpp"
#include "model/units.hpp"
#include "wirefield/model.hpp"

namespace wirefield {
namespace model {
namespace {

// One expression on the command line, alone: its value and where it starts. if_empty is the
// message for an empty value.
struct Argument {
  Value value;
  SourceLocation start;
};
Argument ReadArgument(const std::string& text, const std::string& option_name,
                      const std::string& if_empty) {
  const LineSource source{option_name, 1, 0};
  const std::vector<Token> tokens = LexLine(text, source);
  if (tokens[0].kind == TokenKind::kEnd) {
    throw InputError(SourceLocation{option_name, 0, 0}, if_empty);
  }
  Scope no_variables;
  size_t pos = 0;
  const Value v = EvaluateExpression(tokens, &pos, no_variables, source);
  if (tokens[pos].kind != TokenKind::kEnd) {
    throw InputError(At(source, tokens[pos].column),
                     fmt::format("unexpected {} after the value", Quote(tokens[pos])));
  }
  return Argument{v, At(source, tokens[0].column)};
}

// A command-line quantity: one expression of the quantity q (bare numbers in its SI unit).
double ParseArgument(const std::string& text, const std::string& option_name, const Quantity& q,
                     ValueKind kind, const std::string& example) {
  const auto [v, start] = ReadArgument(
      text, option_name, fmt::format("{} needs a value such as {}", option_name, example));
  const double si = v.si;
  if (!v.dimension.IsNone() && v.dimension != q.dimension) {
    throw InputError(start, fmt::format("{} needs {} ({}); got {}", option_name, q.noun,
                                        q.unit_list, Describe(v.dimension)));
  }
  if (si <= 0.0) {
    throw InputError(start, fmt::format("{} must be positive; got {} {}", option_name,
                                        FormatNumber(si), q.si_unit));
  }
  if (auto message = OutOfRange(kind, si, option_name)) {
    throw InputError(start, *message);
  }
  return si;
}

}  // namespace
}  // namespace model

Override ParseOverride(const std::string& text) {
  const SourceLocation where{"--set", 0, 0};
  const size_t eq = text.find('=');
  if (eq == std::string::npos) {
    throw InputError(where, fmt::format("expected NAME=VALUE (such as --set height=10m); got "
                                        "'{}'",
                                        model::Shorten(text)));
  }
  std::string name = text.substr(0, eq);
  while (!name.empty() && (name.back() == ' ' || name.back() == '\t')) name.pop_back();
  while (!name.empty() && (name.front() == ' ' || name.front() == '\t')) name.erase(0, 1);
  if (!model::IsName(name)) {
    throw InputError(where, fmt::format("'{}' is not a variable name (letters, digits and _, not "
                                        "starting with a digit); write --set NAME=VALUE",
                                        model::Shorten(name)));
  }
  return Override{name, text.substr(eq + 1)};
}

double ParseFrequencyArgument(const std::string& text, const std::string& option_name) {
  return model::ParseArgument(text, option_name, model::FrequencyQuantity(),
                              model::ValueKind::kFrequencyHz, "14.2MHz");
}

double ParseResistanceArgument(const std::string& text, const std::string& option_name) {
  return model::ParseArgument(text, option_name, model::ResistanceQuantity(),
                              model::ValueKind::kImpedanceOhm, "50 or 50ohm");
}

double ParseLengthArgument(const std::string& text, const std::string& option_name) {
  return model::ParseArgument(text, option_name, model::LengthQuantity(),
                              model::ValueKind::kCoilSizeM, "28.5mm");
}

double ParseVariableArgument(const std::string& text, const std::string& option_name,
                             const VariableSpec& variable) {
  const auto [v, start] = model::ReadArgument(
      text, option_name,
      fmt::format("{} needs a value of '{}', {}", option_name, variable.name, variable.quantity));
  const model::Dimension wanted{variable.dimension};
  if (!v.dimension.IsNone() && v.dimension != wanted) {
    throw InputError(start,
                     fmt::format("{} needs {} like '{}'; got {}", option_name, variable.quantity,
                                 variable.name, model::Describe(v.dimension)));
  }
  return v.si;
}

double ParseInductanceArgument(const std::string& text, const std::string& option_name) {
  return model::ParseArgument(text, option_name, model::InductanceQuantity(),
                              model::ValueKind::kInductanceH, "20uH");
}

double ParseVoltageArgument(const std::string& text, const std::string& option_name) {
  return model::ParseArgument(text, option_name, model::VoltageQuantity(),
                              model::ValueKind::kVoltageV, "500V or 2kV");
}

}  // namespace wirefield
