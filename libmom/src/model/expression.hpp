// Model stage: expressions of the model language, evaluated to values with SI dimensions.
// Input: the tokens of a line from a given position and the variables defined so far; output:
// a Value (SI number and dimension) and the position after the expression. Defects (unknown
// name, unit mismatch, division by zero, non-finite result) are InputErrors at the token.
#pragma once

#include <string>
#include <string_view>
#include <unordered_map>
#include <vector>

#include "model/lexer.hpp"
#include "model/units.hpp"

namespace wirefield::model {

// A number in SI units with its dimension: 14MHz is {1.4e7, s^-1}; a plain 3 is {3, none}.
struct Value {
  double si = 0.0;
  Dimension dimension;
};

// The variables defined by `let`, in order of definition.
class Scope {
 public:
  struct Variable {
    std::string name;
    Value value;
    SourceLocation location;  // of the name in its let
    bool used = false;
  };

  Variable* Find(std::string_view name);
  void Define(Variable variable);
  const std::vector<Variable>& variables() const { return variables_; }
  std::vector<std::string> Names() const;

 private:
  std::vector<Variable> variables_;
  std::unordered_map<std::string, size_t> index_;
};

// The deepest nesting of parentheses, unary signs and powers an expression may have.
inline constexpr int kMaxExpressionNesting = 256;

// Evaluates the expression starting at tokens[*pos]; on return *pos is the first token after
// it (a ',', ')', '%', '=' or keyword the caller handles, or the end). Variables it reads are
// marked used.
Value EvaluateExpression(const std::vector<Token>& tokens, size_t* pos, Scope& scope,
                         const LineSource& source);

// The names of the built-in functions, and whether a name is taken by the language (pi, a
// function, start, end); reason says why, for the error message.
const std::vector<std::string>& FunctionNames();
bool IsReservedName(std::string_view name, std::string* reason);

// Spaced words that end an expression after a number instead of being read as its unit
// ("radius 1 segments 9").
bool IsClauseWord(std::string_view name);

// "12.5" style number for messages (6 significant digits).
std::string FormatNumber(double value);

}  // namespace wirefield::model
