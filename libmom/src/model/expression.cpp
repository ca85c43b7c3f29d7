// Model stage: recursive-descent evaluation of expressions with SI dimension checks.
// Grammar (lowest precedence first): sum = term (('+'|'-') term)*; term = unary (('*'|'/')
// unary)*; unary = ('-'|'+') unary | power; power = primary ('^' unary)?; primary = NUMBER
// [UNIT] | NAME | NAME '(' args ')' | '(' sum ')'. So -2^2 = -4 and 2^3^2 = 2^9.
#include "model/expression.hpp"

#include <fmt/format.h>

#include <array>
#include <cmath>

#include "core/constants.hpp"

namespace wirefield::model {

Scope::Variable* Scope::Find(std::string_view name) {
  const auto it = index_.find(std::string(name));
  return it == index_.end() ? nullptr : &variables_[it->second];
}

void Scope::Define(Variable variable) {
  index_[variable.name] = variables_.size();
  variables_.push_back(std::move(variable));
}

std::vector<std::string> Scope::Names() const {
  std::vector<std::string> names;
  for (const Variable& v : variables_) names.push_back(v.name);
  return names;
}

const std::vector<std::string>& FunctionNames() {
  static const std::vector<std::string> kNames = {"sqrt", "sin",  "cos",   "tan", "asin",
                                                  "acos", "atan", "atan2", "exp", "log",
                                                  "abs",  "min",  "max",   "awg"};
  return kNames;
}

bool IsReservedName(std::string_view name, std::string* reason) {
  if (name == "pi") {
    *reason = "'pi' is the built-in constant 3.14159...";
    return true;
  }
  for (const std::string& f : FunctionNames()) {
    if (f == name) {
      *reason = fmt::format("'{}' is a built-in function", name);
      return true;
    }
  }
  if (name == "start" || name == "end") {
    *reason = fmt::format("'{}' is reserved for WIRE@{}", name, name);
    return true;
  }
  return false;
}

bool IsClauseWord(std::string_view name) {
  static constexpr std::string_view kWords[] = {
      "segments", "radius", "voltage", "series", "parallel", "R", "L", "C", "permittivity",
      "conductivity", "from", "to", "at", "material", "permeability", "diameter", "size",
      // a coil's close-wound, a transformer's refused ratio, transformer and line clauses
      "close", "ratio", "turns", "magnetizing", "al", "leakage", "compensation", "coreloss", "q",
      "length", "cable", "z0", "velocity", "loss",
      // a wire's insulation and its parts
      "insulation", "thickness", "outer_diameter", "loss_tangent"};
  for (std::string_view w : kWords) {
    if (w == name) return true;
  }
  return false;
}

std::string FormatNumber(double value) { return fmt::format("{:.6g}", value); }

namespace {

// awg(n): gauges 0000 (written -3) to 56, the range of the ASTM B258 table (from memory);
// No. 36 is 0.005 in = 0.127 mm exactly (ASTM B258 formula; REFERENCES.md section 3).
constexpr double kAwgThickest = -3.0;
constexpr double kAwgThinnest = 56.0;
constexpr double kAwg36Diameter_m = 0.127e-3;

class Evaluator {
 public:
  Evaluator(const std::vector<Token>& tokens, size_t* pos, Scope& scope, const LineSource& source)
      : tokens_(tokens), pos_(*pos), scope_(scope), source_(source) {}

  Value Sum() {
    Value left = Term();
    while (IsPunct("+") || IsPunct("-")) {
      const Token& op = Next();
      const Value right = Term();
      const bool add = op.text == "+";
      if (left.dimension != right.dimension) {
        const std::string hint = left.dimension.IsNone() != right.dimension.IsNone()
                                     ? "give both a unit or neither"
                                     : "both sides need the same kind of quantity";
        throw Error(op,
                    add ? fmt::format("cannot add {} to {}; {}", Describe(right.dimension),
                                      Describe(left.dimension), hint)
                        : fmt::format("cannot subtract {} from {}; {}", Describe(right.dimension),
                                      Describe(left.dimension), hint));
      }
      left.si = add ? left.si + right.si : left.si - right.si;
      CheckFinite(left, op, fmt::format("overflow in '{}'", op.text));
    }
    return left;
  }

 private:
  // Counts recursion so that "((((..." or "----...1" ends in an error, not a stack overflow.
  class DepthGuard {
   public:
    DepthGuard(Evaluator& e, const Token& at) : e_(e) {
      if (++e_.depth_ > kMaxExpressionNesting) {
        throw e_.Error(at, fmt::format("expression nested too deeply (more than {} levels of "
                                       "parentheses, signs or powers); simplify it",
                                       kMaxExpressionNesting));
      }
    }
    ~DepthGuard() { --e_.depth_; }
    DepthGuard(const DepthGuard&) = delete;
    DepthGuard& operator=(const DepthGuard&) = delete;

   private:
    Evaluator& e_;
  };

  const Token& Peek(size_t ahead = 0) const {
    const size_t i = std::min(pos_ + ahead, tokens_.size() - 1);
    return tokens_[i];
  }
  const Token& Next() {
    const Token& t = tokens_[pos_];
    if (pos_ + 1 < tokens_.size()) ++pos_;
    return t;
  }
  bool IsPunct(std::string_view p) const {
    return Peek().kind == TokenKind::kPunct && Peek().text == p;
  }

  InputError Error(const Token& at, const std::string& message) const {
    return InputError(At(source_, at.column), message);
  }

  void CheckFinite(const Value& v, const Token& at, const std::string& detail) const {
    if (!std::isfinite(v.si)) {
      throw Error(at, fmt::format("expression is not a finite number ({})", detail));
    }
  }

  Value Term() {
    Value left = Unary();
    while (IsPunct("*") || IsPunct("/")) {
      const Token& op = Next();
      const Value right = Unary();
      if (op.text == "*") {
        left.si *= right.si;
        left.dimension = Multiply(left.dimension, right.dimension);
      } else {
        if (right.si == 0.0) throw Error(op, "division by zero");
        left.si /= right.si;
        left.dimension = Divide(left.dimension, right.dimension);
      }
      CheckFinite(left, op, fmt::format("overflow in '{}'", op.text));
    }
    return left;
  }

  Value Unary() {
    if (IsPunct("-") || IsPunct("+")) {
      const DepthGuard guard(*this, Peek());
      const bool negate = Next().text == "-";
      Value v = Unary();
      if (negate) v.si = -v.si;
      return v;
    }
    return PowerExpression();
  }

  Value PowerExpression() {
    Value base = Primary();
    if (!IsPunct("^")) return base;
    const DepthGuard guard(*this, Peek());
    const Token& op = Next();
    const Token& exponent_token = Peek();
    const Value exponent = Unary();
    if (!exponent.dimension.IsNone()) {
      throw Error(exponent_token, fmt::format("the exponent of '^' must be a plain number; got {}",
                                              Describe(exponent.dimension)));
    }
    if (!base.dimension.IsNone()) {
      constexpr double kLargestUnitPower = 64.0;  // beyond any physical quantity
      if (exponent.si != std::round(exponent.si) || std::abs(exponent.si) > kLargestUnitPower) {
        throw Error(op, fmt::format("{} can only be raised to a whole-number power (at most {}); "
                                    "got ^{} (use sqrt for a square root)",
                                    Describe(base.dimension), kLargestUnitPower,
                                    FormatNumber(exponent.si)));
      }
      base.dimension = Power(base.dimension, static_cast<int>(exponent.si));
    }
    const double b = base.si;
    base.si = std::pow(b, exponent.si);
    CheckFinite(base, op, fmt::format("{} ^ {}", FormatNumber(b), FormatNumber(exponent.si)));
    return base;
  }

  Value Primary() {
    const Token& t = Peek();
    Value v;
    bool was_number = false;
    if (t.kind == TokenKind::kNumber) {
      Next();
      v = NumberWithUnit(t);
      was_number = true;
    } else if (t.kind == TokenKind::kName) {
      Next();
      if (IsPunct("(")) {
        v = Call(t);
      } else {
        v = NameValue(t);
      }
    } else if (t.kind == TokenKind::kPunct && t.text == "(") {
      const DepthGuard guard(*this, t);
      Next();
      v = Sum();
      if (!IsPunct(")")) {
        throw Error(Peek(), fmt::format("expected ')' to close the '(' at column {}; got {}",
                                        t.column + source_.column_offset, Quote(Peek())));
      }
      Next();
    } else if (t.kind == TokenKind::kEnd) {
      throw Error(t,
                  "missing a value at the end of the line (a number, a variable, a function "
                  "call or a parenthesis)");
    } else if (t.kind == TokenKind::kPunct && t.text == "=") {
      throw Error(t,
                  "expected a value; got '=': a keyword takes its value after a space, without "
                  "'=' (radius 1mm, frequency 14.2MHz)");
    } else {
      throw Error(t, fmt::format("expected a value (a number, a variable, a function call or "
                                 "'('); got {}",
                                 Quote(t)));
    }
    CheckJuxtaposition(t, was_number);
    return v;
  }

  // After a value: a unit here is misplaced, and a number or '(' lacks an operator.
  void CheckJuxtaposition(const Token& first, bool was_number) {
    const Token& n = Peek();
    if (n.kind == TokenKind::kName && FindUnit(n.text) != nullptr) {
      throw Error(n, was_number
                         ? fmt::format("a number takes one unit; remove '{}'", n.text)
                         : fmt::format("a unit goes right after a number (2.5{}); to give an "
                                       "expression a unit, multiply it: (...)*1{}",
                                       n.text, n.text));
    }
    if (n.kind == TokenKind::kNumber || (n.kind == TokenKind::kPunct && n.text == "(")) {
      throw Error(n, fmt::format("missing an operator before {} (after {}); write '*' to "
                                 "multiply",
                                 Quote(n), Quote(first)));
    }
  }

  Value NumberWithUnit(const Token& number) {
    Value v{number.number, kNone};
    const Token& n = Peek();
    if (n.kind != TokenKind::kName) return v;
    if (const Unit* unit = FindUnit(n.text)) {
      Next();
      v.si *= unit->factor;
      v.dimension = unit->dimension;
      CheckFinite(v, number, fmt::format("{}{} overflows", number.text, n.text));
      return v;
    }
    if (n.space_before && IsClauseWord(n.text)) return v;  // "radius 1 segments 9"
    // "R=50 Q=3": a spaced name with '=' after it starts the next clause, which the statement
    // then names as unknown, rather than being taken for an unknown unit.
    if (n.space_before && Peek(1).kind == TokenKind::kPunct && Peek(1).text == "=") return v;
    if (n.space_before && scope_.Find(n.text) != nullptr) {
      throw Error(n, fmt::format("'{}' after the number {} is not a unit; write '{}*{}' to "
                                 "multiply",
                                 n.text, number.text, number.text, n.text));
    }
    throw Error(n, fmt::format("unknown unit '{}'{} (units: {})", Shorten(n.text),
                               DidYouMean(n.text, UnitNames()), KnownUnitsSummary()));
  }

  Value NameValue(const Token& name) {
    if (name.text == "pi") return Value{core::kPi, kNone};
    if (Scope::Variable* var = scope_.Find(name.text)) {
      var->used = true;
      return var->value;
    }
    for (const std::string& f : FunctionNames()) {
      if (f == name.text) {
        throw Error(name, fmt::format("'{}' is a function; write {}(...)", f, f));
      }
    }
    if (FindUnit(name.text) != nullptr) {
      throw Error(name, fmt::format("'{}' is a unit; write it right after a number (2{}), or "
                                    "define a variable with let",
                                    name.text, name.text));
    }
    std::vector<std::string> candidates = scope_.Names();
    candidates.emplace_back("pi");
    std::string hint = DidYouMean(name.text, candidates);
    if (hint.empty()) {
      hint = fmt::format("; define it on an earlier line with 'let {} = ...'", Shorten(name.text));
    }
    throw Error(name, fmt::format("unknown variable '{}'{}", Shorten(name.text), hint));
  }

  Value Call(const Token& name) {
    const std::string& f = name.text;
    bool known = false;
    for (const std::string& k : FunctionNames()) known = known || k == f;
    if (!known) {
      if (scope_.Find(f) != nullptr) {
        throw Error(Peek(), fmt::format("'{}' is a variable, not a function; write '{}*(...)' "
                                        "to multiply",
                                        f, f));
      }
      throw Error(name, fmt::format("unknown function '{}'{} (functions: sqrt sin cos tan asin "
                                    "acos atan atan2 exp log abs min max awg)",
                                    Shorten(f), DidYouMean(f, FunctionNames())));
    }
    const DepthGuard guard(*this, Peek());
    Next();  // '('
    std::vector<Value> args;
    std::vector<const Token*> arg_tokens;
    if (!IsPunct(")")) {
      while (true) {
        arg_tokens.push_back(&Peek());
        args.push_back(Sum());
        if (IsPunct(",")) {
          Next();
          continue;
        }
        break;
      }
    }
    if (!IsPunct(")")) {
      throw Error(Peek(), fmt::format("expected ',' or ')' in the arguments of {}; got {}", f,
                                      Quote(Peek())));
    }
    Next();
    const bool variadic = f == "min" || f == "max";
    const size_t wanted = f == "atan2" ? 2 : 1;
    if (variadic ? args.size() < 2 : args.size() != wanted) {
      throw Error(name, variadic
                            ? fmt::format("{} takes 2 or more arguments; got {}", f, args.size())
                            : fmt::format("{} takes {} argument{}; got {}", f, wanted,
                                          wanted == 1 ? "" : "s", args.size()));
    }
    return Apply(name, args, arg_tokens);
  }

  void RequirePlain(const Value& v, const Token& at, std::string_view f) const {
    if (!v.dimension.IsNone()) {
      throw Error(at,
                  fmt::format("{} needs a plain number{}; got {}", f,
                              (f == "exp" || f == "log") ? "" : " (radians, or degrees with deg)",
                              Describe(v.dimension)));
    }
  }

  Value Apply(const Token& name, const std::vector<Value>& args,
              const std::vector<const Token*>& at) {
    const std::string& f = name.text;
    const Value& a = args[0];
    Value r{0.0, kNone};
    auto not_finite = [&](const std::string& detail) {
      return Error(name, fmt::format("expression is not a finite number ({})", detail));
    };
    if (f == "sqrt") {
      for (int e : a.dimension.exponent) {
        if (e % 2 != 0) {
          throw Error(*at[0], fmt::format("sqrt needs a quantity whose unit is a square (such as "
                                          "m^2); got {}",
                                          Describe(a.dimension)));
        }
      }
      if (a.si < 0.0) throw not_finite(fmt::format("sqrt of {}", FormatNumber(a.si)));
      r.si = std::sqrt(a.si);
      for (size_t i = 0; i < r.dimension.exponent.size(); ++i) {
        r.dimension.exponent[i] = a.dimension.exponent[i] / 2;
      }
    } else if (f == "sin" || f == "cos" || f == "tan" || f == "atan" || f == "exp") {
      RequirePlain(a, *at[0], f);
      r.si = f == "sin"    ? std::sin(a.si)
             : f == "cos"  ? std::cos(a.si)
             : f == "tan"  ? std::tan(a.si)
             : f == "atan" ? std::atan(a.si)
                           : std::exp(a.si);
      if (!std::isfinite(r.si))
        throw not_finite(fmt::format("{}({}) overflows", f, FormatNumber(a.si)));
    } else if (f == "asin" || f == "acos") {
      RequirePlain(a, *at[0], f);
      if (a.si < -1.0 || a.si > 1.0) {
        throw not_finite(fmt::format("{} of {} is outside [-1, 1]", f, FormatNumber(a.si)));
      }
      r.si = f == "asin" ? std::asin(a.si) : std::acos(a.si);
    } else if (f == "log") {
      RequirePlain(a, *at[0], f);
      if (a.si <= 0.0) throw not_finite(fmt::format("log of {}", FormatNumber(a.si)));
      r.si = std::log(a.si);
    } else if (f == "abs") {
      r = Value{std::abs(a.si), a.dimension};
    } else if (f == "awg") {
      // American Wire Gauge diameter d_n = 0.005 in * 92^((36 - n)/39) = 0.127 mm *
      // 92^((36 - n)/39): No. 36 is 0.005 in, No. 0000 (n = -3) is 0.4600 in (the formula of
      // ASTM B258; REFERENCES.md section 3). The standard rounds its table to 0.1 mil; this is
      // the unrounded formula.
      if (!a.dimension.IsNone()) {
        throw Error(*at[0], fmt::format("awg needs a plain gauge number (14 for AWG 14, -3 for "
                                        "0000); got {}",
                                        Describe(a.dimension)));
      }
      if (a.si != std::floor(a.si) || a.si < kAwgThickest || a.si > kAwgThinnest) {
        throw Error(*at[0], fmt::format("awg needs a whole gauge number from {} (for 0000) to "
                                        "{}; got {}",
                                        kAwgThickest, kAwgThinnest, FormatNumber(a.si)));
      }
      r = Value{kAwg36Diameter_m * std::pow(92.0, (36.0 - a.si) / 39.0), kLength};
    } else if (f == "atan2") {
      if (args[0].dimension != args[1].dimension) {
        throw Error(*at[1], fmt::format("atan2(y, x) needs y and x of one kind; got {} and {}",
                                        Describe(args[0].dimension), Describe(args[1].dimension)));
      }
      r.si = std::atan2(args[0].si, args[1].si);
    } else {  // min, max
      r = a;
      for (size_t i = 1; i < args.size(); ++i) {
        if (args[i].dimension != a.dimension) {
          throw Error(*at[i],
                      fmt::format("{} needs arguments of one kind: argument {} is {}, "
                                  "argument 1 is {}; give all a unit or none",
                                  f, i + 1, Describe(args[i].dimension), Describe(a.dimension)));
        }
        r.si = f == "min" ? std::min(r.si, args[i].si) : std::max(r.si, args[i].si);
      }
    }
    return r;
  }

  const std::vector<Token>& tokens_;
  size_t& pos_;
  Scope& scope_;
  const LineSource& source_;
  int depth_ = 0;
};

}  // namespace

Value EvaluateExpression(const std::vector<Token>& tokens, size_t* pos, Scope& scope,
                         const LineSource& source) {
  Evaluator evaluator(tokens, pos, scope, source);
  return evaluator.Sum();
}

}  // namespace wirefield::model
