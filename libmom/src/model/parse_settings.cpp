// Model stage: the statements that set the model's terms rather than build it: `units` (the
// length of a bare number), `let` (a variable, or its --set override), `frequency` and `z0`.
// Inputs: the statement's tokens; outputs: the parser's length unit and scope, the Model's
// variables, frequency and reference impedance (see parser.hpp).
#include <fmt/format.h>

#include "model/parser.hpp"

namespace wirefield::model {
namespace {

// Legal but dubious values, warned about: a z0 outside the impedances of feed lines and
// antenna systems (a few ohm for a small loop's match to 600 ohm open-wire line; common
// practice).
constexpr double kDubiousLowZ0_ohm = 1.0;
constexpr double kDubiousHighZ0_ohm = 1e4;

// The public description of a `let` variable: value, dimension and its SI unit when named.
VariableSpec DescribeVariable(const std::string& name, const Value& value,
                              const SourceLocation& location) {
  VariableSpec spec;
  spec.name = name;
  spec.value_si = value.si;
  spec.dimension = value.dimension.exponent;
  spec.quantity = Describe(value.dimension);
  for (const Quantity* q : {&LengthQuantity(), &FrequencyQuantity(), &ResistanceQuantity(),
                            &InductanceQuantity(), &CapacitanceQuantity(), &VoltageQuantity()}) {
    if (q->dimension == value.dimension) spec.unit = std::string(q->si_unit);
  }
  spec.location = location;
  return spec;
}

}  // namespace

void Parser::Units() {
  const Token& t = Peek();
  if (t.kind != TokenKind::kName) throw Expected("units", "the length unit (m, cm, mm, ft or in)");
  if (!IsLengthUnitName(t.text)) {
    if (FindUnit(t.text) != nullptr) {
      throw Error(t, fmt::format("units sets the length unit of bare numbers; '{}' is not a "
                                 "length unit: use m, cm, mm, ft or in",
                                 t.text));
    }
    throw Error(t,
                fmt::format("unknown length unit '{}'{}; use m, cm, mm, ft or in", Shorten(t.text),
                            DidYouMeanAside(t.text, {"m", "cm", "mm", "ft", "in"})));
  }
  Next();
  length_factor_ = FindUnit(t.text)->factor;
  ExpectEnd("units");
}

void Parser::Let() {
  const Token& name_token = Peek();
  const std::string name = Name("let", "a variable name (let NAME = EXPR)");
  std::string reason;
  if (IsReservedName(name, &reason)) {
    throw Error(name_token, fmt::format("let: {}; choose another name", reason));
  }
  if (Scope::Variable* existing = scope_.Find(name)) {
    throw Error(name_token, fmt::format("variable '{}' is already defined at {}; give each "
                                        "variable its own name",
                                        name, Line(existing->location)));
  }
  const std::string context = fmt::format("let '{}'", name);
  ExpectPunct("=", context, "'= EXPR'");
  Value value;
  const auto over = overrides_.find(name);
  if (over != overrides_.end()) {
    value = OverrideValue(name, &over->second);
  } else {
    value = Expression().value;
    ExpectEnd("let");
  }
  if (FindUnit(name) != nullptr) {
    model_.warnings.push_back(
        Warning{Loc(name_token),
                fmt::format("variable '{}' has the name of a unit; after a number '{}' still "
                            "means the unit (2 {} is not 2*{})",
                            name, name, name, name)});
  }
  scope_.Define(Scope::Variable{name, value, Loc(name_token), false});
  model_.variables.push_back(name);
  model_.variable_specs.push_back(DescribeVariable(name, value, Loc(name_token)));
}

// The value an override gives the `let` being read, in place of the model's expression.
Value Parser::OverrideValue(const std::string& name, OverrideEntry* entry) {
  entry->used = true;
  const LineSource set_source{entry->origin, 1, 0};
  const std::vector<Token> set_tokens = LexLine(entry->expression, set_source);
  size_t set_pos = 0;
  if (set_tokens[0].kind == TokenKind::kEnd) {
    throw InputError(At(set_source, 1),
                     fmt::format("the value of '{}' is empty; give an expression", name));
  }
  const Value value = EvaluateExpression(set_tokens, &set_pos, scope_, set_source);
  if (set_tokens[set_pos].kind != TokenKind::kEnd) {
    throw InputError(At(set_source, set_tokens[set_pos].column),
                     fmt::format("unexpected {} after the value", Quote(set_tokens[set_pos])));
  }
  // The model's own expression is replaced, not evaluated; skip to the end of the line.
  // The variables it names count as used: the model uses them, the command line only
  // set this one aside, so they must not draw an unused-variable warning.
  for (; pos_ + 1 < tokens_.size(); ++pos_) {
    if (tokens_[pos_].kind != TokenKind::kName) continue;
    if (Scope::Variable* read = scope_.Find(tokens_[pos_].text)) read->used = true;
  }
  return value;
}

void Parser::Frequency(const Token& keyword) {
  if (frequency_line_) {
    throw Error(keyword, fmt::format("frequency is already given at {}; give it once (the "
                                     "command line may override it)",
                                     Line(*frequency_line_)));
  }
  const Measured m = Expression();
  const double f = As(m, FrequencyQuantity(), 1.0, "frequency");
  if (f <= 0.0) {
    throw Error(m.start, fmt::format("frequency must be positive; got {} Hz", FormatNumber(f)));
  }
  InRange(ValueKind::kFrequencyHz, f, m, "frequency");
  ExpectEnd("frequency");
  frequency_line_ = Loc(keyword);
  model_.frequency_hz = f;
  model_.frequency_location = Loc(keyword);
}

void Parser::Z0(const Token& keyword) {
  if (z0_line_) {
    throw Error(keyword, fmt::format("z0 is already given at {}; give it once", Line(*z0_line_)));
  }
  const Measured m = Expression();
  const double z0 = As(m, ResistanceQuantity(), 1.0, "z0");
  if (z0 <= 0.0) {
    throw Error(m.start, fmt::format("z0 must be positive; got {} ohm", FormatNumber(z0)));
  }
  InRange(ValueKind::kImpedanceOhm, z0, m, "z0");
  if (z0 < kDubiousLowZ0_ohm || z0 > kDubiousHighZ0_ohm) {
    model_.warnings.push_back(Warning{
        Loc(m.start), fmt::format("z0 {} ohm is far from any feed line ({} to {} ohm); the SWR "
                                  "against it says little about a real transmitter",
                                  FormatNumber(z0), FormatNumber(kDubiousLowZ0_ohm),
                                  FormatNumber(kDubiousHighZ0_ohm))});
  }
  ExpectEnd("z0");
  z0_line_ = Loc(keyword);
  model_.z0_ohm = z0;
}

}  // namespace wirefield::model
