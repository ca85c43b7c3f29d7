// Model stage: values given as text outside a model file (a quantity, a variable's value),
// read as expressions of the model language so that units work as in a model. Inputs: the
// text; outputs: SI values or what is wrong with the text (ReadQuantity, ReadVariableValue).
#include <fmt/format.h>

#include <array>
#include <cstddef>

#include "model/expression.hpp"
#include "model/lexer.hpp"
#include "model/ranges.hpp"
#include "model/units.hpp"
#include "wirefield/model.hpp"

namespace wirefield {
namespace model {
namespace {

// A problem of a value's text, said after the value's name when after_name is true.
ValueReading Problem(int line, int column, std::string message, bool after_name) {
  return ValueReading{0.0, ValueProblem{line, column, std::move(message), after_name}};
}

// One expression of a value's text, alone and without variables: its value in *value and the
// column where it starts in *column. An empty text (empty_message), a defect of the expression
// or text after it gives a problem instead.
ValueReading EvaluateValueText(const std::string& text, const std::string& empty_message,
                               Value* value, int* column) {
  const LineSource source{"", 1, 0};
  try {
    const std::vector<Token> tokens = LexLine(text, source);
    if (tokens[0].kind == TokenKind::kEnd) return Problem(0, 0, empty_message, true);
    Scope no_variables;
    size_t pos = 0;
    *column = tokens[0].column;
    *value = EvaluateExpression(tokens, &pos, no_variables, source);
    if (tokens[pos].kind != TokenKind::kEnd) {
      return Problem(1, tokens[pos].column,
                     fmt::format("unexpected {} after the value", Quote(tokens[pos])), false);
    }
  } catch (const InputError& error) {
    return Problem(error.location().line, error.location().column, error.message(), false);
  }
  return ValueReading{value->si, std::nullopt};
}

// A quantity of q: one expression of the quantity (bare numbers in its SI unit), positive and
// within the range of `kind`.
ValueReading ReadPositive(const std::string& text, const Quantity& q, ValueKind kind,
                          const std::string& example) {
  Value v;
  int column = 0;
  ValueReading reading =
      EvaluateValueText(text, fmt::format("needs a value such as {}", example), &v, &column);
  if (reading.problem) return reading;
  if (!v.dimension.IsNone() && v.dimension != q.dimension) {
    return Problem(1, column,
                   fmt::format("needs {} ({}); got {}", q.noun, q.unit_list, Describe(v.dimension)),
                   true);
  }
  if (v.si <= 0.0) {
    return Problem(1, column,
                   fmt::format("must be positive; got {} {}", FormatNumber(v.si), q.si_unit), true);
  }
  // OutOfRange says "<what> must be ..."; with an empty `what` the message starts with a blank.
  if (auto message = OutOfRange(kind, v.si, ""))
    return Problem(1, column, message->substr(1), true);
  return reading;
}

}  // namespace
}  // namespace model

ValueReading ReadQuantity(const std::string& text, QuantityKind kind) {
  // Each kind's quantity, its allowed range and the example of its empty-text message, in the
  // order of QuantityKind.
  struct Kind {
    const model::Quantity& quantity;
    model::ValueKind range;
    const char* example;
  };
  const std::array<Kind, 5> kinds{{
      {model::FrequencyQuantity(), model::ValueKind::kFrequencyHz, "14.2MHz"},
      {model::ResistanceQuantity(), model::ValueKind::kImpedanceOhm, "50 or 50ohm"},
      {model::LengthQuantity(), model::ValueKind::kCoilSizeM, "28.5mm"},
      {model::InductanceQuantity(), model::ValueKind::kInductanceH, "20uH"},
      {model::VoltageQuantity(), model::ValueKind::kVoltageV, "500V or 2kV"},
  }};
  const Kind& k = kinds.at(static_cast<std::size_t>(kind));
  return model::ReadPositive(text, k.quantity, k.range, k.example);
}

ValueReading ReadVariableValue(const std::string& text, const VariableSpec& variable) {
  model::Value v;
  int column = 0;
  ValueReading reading = model::EvaluateValueText(
      text, fmt::format("needs a value of '{}', {}", variable.name, variable.quantity), &v,
      &column);
  if (reading.problem) return reading;
  const model::Dimension wanted{variable.dimension};
  if (!v.dimension.IsNone() && v.dimension != wanted) {
    return model::Problem(1, column,
                          fmt::format("needs {} like '{}'; got {}", variable.quantity,
                                      variable.name, model::Describe(v.dimension)),
                          true);
  }
  return reading;
}

}  // namespace wirefield
