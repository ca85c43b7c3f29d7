// Tests of the model stage's expression evaluator (libmom/src/model/expression.*): numbers,
// precedence, functions, degrees, unit suffixes and the dimension algebra, and the exact
// text and column of each expression error.
#include "model/expression.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

#include "model/lexer.hpp"
#include "unit/error_text.hpp"

namespace wirefield::model {
namespace {

// Results of one or two floating-point operations: 4 ulp (EXPECT_DOUBLE_EQ) unless stated.
// A chain of a few multiplications and divisions rounds by a few parts in 1e16; the relative
// bound 1e-12 leaves room for that (and for a different order of evaluation) and still
// catches any wrong factor or prefix, which would be off by 1e-3 or more.
constexpr double kChainRelative = 1e-12;
Value Eval(const std::string& text, Scope* scope = nullptr) {
  Scope local;
  Scope& s = scope != nullptr ? *scope : local;
  const LineSource source{"calc", 1, 0};
  const std::vector<Token> tokens = LexLine(text, source);
  size_t pos = 0;
  const Value v = EvaluateExpression(tokens, &pos, s, source);
  EXPECT_EQ(tokens[pos].kind, TokenKind::kEnd) << "left over: " << tokens[pos].text;
  return v;
}

double Number(const std::string& text) { return Eval(text).si; }

std::string ErrorOf(const std::string& text) {
  return testing::ErrorText([&] { Eval(text); });
}

TEST(Expression, NumbersInEveryWrittenForm) {
  EXPECT_DOUBLE_EQ(Number("123"), 123.0);
  EXPECT_DOUBLE_EQ(Number("1.5"), 1.5);
  EXPECT_DOUBLE_EQ(Number("2e-3"), 2e-3);
  EXPECT_DOUBLE_EQ(Number("2E+3"), 2000.0);
  EXPECT_DOUBLE_EQ(Number(".5"), 0.5);
  EXPECT_DOUBLE_EQ(Number("5."), 5.0);
}

TEST(Expression, MultiplicationBindsTighterThanAddition) {
  EXPECT_DOUBLE_EQ(Number("1 + 2 * 3"), 7.0);
  EXPECT_DOUBLE_EQ(Number("(1 + 2) * 3"), 9.0);
  EXPECT_DOUBLE_EQ(Number("8 / 4 / 2"), 1.0);  // left-associative
  EXPECT_DOUBLE_EQ(Number("8 - 4 - 2"), 2.0);
}

TEST(Expression, PowerIsRightAssociativeAndBindsTighterThanUnaryMinus) {
  EXPECT_DOUBLE_EQ(Number("-2^2"), -4.0);
  EXPECT_DOUBLE_EQ(Number("(-2)^2"), 4.0);
  EXPECT_DOUBLE_EQ(Number("2^3^2"), 512.0);
  EXPECT_DOUBLE_EQ(Number("2^-1"), 0.5);
  EXPECT_DOUBLE_EQ(Number("+3 - -2"), 5.0);
}

TEST(Expression, PiIsTheCircleConstant) { EXPECT_DOUBLE_EQ(Number("pi"), std::numbers::pi); }

TEST(Expression, FunctionsMatchTheStandardLibrary) {
  EXPECT_DOUBLE_EQ(Number("sqrt(2)"), std::sqrt(2.0));
  EXPECT_DOUBLE_EQ(Number("sin(0.5)"), std::sin(0.5));
  EXPECT_DOUBLE_EQ(Number("cos(0.5)"), std::cos(0.5));
  EXPECT_DOUBLE_EQ(Number("tan(0.5)"), std::tan(0.5));
  EXPECT_DOUBLE_EQ(Number("asin(0.5)"), std::asin(0.5));
  EXPECT_DOUBLE_EQ(Number("acos(0.5)"), std::acos(0.5));
  EXPECT_DOUBLE_EQ(Number("atan(0.5)"), std::atan(0.5));
  EXPECT_DOUBLE_EQ(Number("atan2(1, -1)"), std::atan2(1.0, -1.0));
  EXPECT_DOUBLE_EQ(Number("exp(1)"), std::exp(1.0));
  EXPECT_DOUBLE_EQ(Number("log(10)"), std::log(10.0));
  EXPECT_DOUBLE_EQ(Number("abs(-3)"), 3.0);
  EXPECT_DOUBLE_EQ(Number("min(3, 1, 2)"), 1.0);
  EXPECT_DOUBLE_EQ(Number("max(3, 1, 2, 7)"), 7.0);
}

TEST(Expression, DegreesConvertToRadians) {
  // cos 60 deg = 1/2 and sin 30 deg = 1/2 exactly (the 30-60-90 triangle); the conversion
  // and the library's sin/cos round within a few ulp, hence 1e-15.
  constexpr double kTrigRounding = 1e-15;
  EXPECT_NEAR(Number("cos(60deg)"), 0.5, kTrigRounding);
  EXPECT_NEAR(Number("sin(30 deg)"), 0.5, kTrigRounding);
  EXPECT_DOUBLE_EQ(Number("180deg"), std::numbers::pi);
  EXPECT_TRUE(Eval("30deg").dimension.IsNone());
}

TEST(Expression, UnitSuffixMayBeAttachedOrSpaced) {
  EXPECT_DOUBLE_EQ(Number("14.2MHz"), 14.2e6);
  EXPECT_DOUBLE_EQ(Number("14.2 MHz"), 14.2e6);
  EXPECT_DOUBLE_EQ(Number("3ft"), 3 * 0.3048);
  EXPECT_DOUBLE_EQ(Number("2.5 in"), 2.5 * 0.0254);
  EXPECT_EQ(Eval("14.2 MHz").dimension, kFrequency);
}

TEST(Expression, UnitBindsToItsNumberBeforeAnyOperator) {
  EXPECT_DOUBLE_EQ(Number("-3m"), -3.0);
  EXPECT_EQ(Eval("2m^2").dimension, Power(kLength, 2));  // (2 m)^2
  EXPECT_DOUBLE_EQ(Number("2m^2"), 4.0);
  EXPECT_EQ(Eval("1/2m").dimension, Power(kLength, -1));  // 1 / (2 m)
}

TEST(Expression, InductiveReactanceIsAResistance) {
  // X_L = 2 pi f L (textbook reactance formula); 14 MHz and 10 uH give 879.6459430 ohm
  // (computed here: 2 * 3.14159265358979 * 1.4e7 * 1e-5).
  const Value x = Eval("2*pi*14MHz*10uH");
  EXPECT_EQ(x.dimension, kResistance);
  EXPECT_NEAR(x.si, 879.6459430051421, 879.6459430051421 * kChainRelative);
}

TEST(Expression, CapacitiveReactanceIsAResistance) {
  // X_C = 1 / (2 pi f C) (textbook reactance formula); 14.2 MHz and 100 pF give
  // 112.0815 ohm (computed here).
  const Value x = Eval("1/(2*pi*14.2MHz*100pF)");
  EXPECT_EQ(x.dimension, kResistance);
  const double expected_ohm = 1.0 / (2 * std::numbers::pi * 14.2e6 * 100e-12);
  EXPECT_NEAR(x.si, expected_ohm, expected_ohm * kChainRelative);
}

TEST(Expression, SqrtHalvesEvenExponents) {
  // Resonance: f = 1 / (2 pi sqrt(L C)) (textbook LC resonance); 10 uH with 100 pF gives
  // 5.0329 MHz (computed here).
  const Value f = Eval("1/(2*pi*sqrt(10uH*100pF))");
  EXPECT_EQ(f.dimension, kFrequency);
  const double expected_hz = 1.0 / (2 * std::numbers::pi * std::sqrt(1e-5 * 1e-10));
  EXPECT_NEAR(f.si, expected_hz, expected_hz * kChainRelative);
  EXPECT_EQ(Eval("sqrt(4m*9m)").dimension, kLength);
  EXPECT_DOUBLE_EQ(Number("sqrt(4m*9m)"), 6.0);
}

TEST(Expression, MinMaxAbsAndAtan2KeepOrCancelDimensions) {
  EXPECT_EQ(Eval("max(1m, 20cm)").dimension, kLength);
  EXPECT_DOUBLE_EQ(Number("max(1m, 20cm)"), 1.0);
  EXPECT_EQ(Eval("abs(-2kohm)").dimension, kResistance);
  EXPECT_TRUE(Eval("atan2(1m, 1m)").dimension.IsNone());
  EXPECT_DOUBLE_EQ(Number("atan2(1m, 1m)"), std::numbers::pi / 4);
}

TEST(Expression, VariablesKeepTheirDimension) {
  Scope scope;
  scope.Define(Scope::Variable{"h", Value{10.0, kNone}, {}, false});
  scope.Define(Scope::Variable{"f", Value{7.1e6, kFrequency}, {}, false});
  EXPECT_TRUE(Eval("h*2", &scope).dimension.IsNone());
  EXPECT_EQ(Eval("f/2", &scope).dimension, kFrequency);
  EXPECT_TRUE(scope.Find("h")->used);
  EXPECT_TRUE(scope.Find("f")->used);
}

TEST(ExpressionError, AddingAPlainNumberToALengthNamesBoth) {
  EXPECT_EQ(ErrorOf("1m + 2"),
            "calc:1:4: error: cannot add a plain number to a length (m); give both a unit or "
            "neither");
  EXPECT_EQ(ErrorOf("2 - 1m"),
            "calc:1:3: error: cannot subtract a length (m) from a plain number; give both a "
            "unit or neither");
}

TEST(ExpressionError, AddingDifferentQuantitiesIsRefused) {
  EXPECT_EQ(ErrorOf("1m + 1MHz"),
            "calc:1:4: error: cannot add a frequency (Hz) to a length (m); both sides need the "
            "same kind of quantity");
}

TEST(ExpressionError, MinOfMixedQuantitiesNamesTheArgument) {
  EXPECT_EQ(ErrorOf("min(1m, 2)"),
            "calc:1:9: error: min needs arguments of one kind: argument 2 is a plain number, "
            "argument 1 is a length (m); give all a unit or none");
}

TEST(ExpressionError, SqrtOfAnOddPowerIsRefused) {
  EXPECT_EQ(ErrorOf("sqrt(2m)"),
            "calc:1:6: error: sqrt needs a quantity whose unit is a square (such as m^2); got a "
            "length (m)");
}

TEST(ExpressionError, FractionalPowerOfAQuantityIsRefused) {
  EXPECT_EQ(ErrorOf("(2m)^0.5"),
            "calc:1:5: error: a length (m) can only be raised to a whole-number power (at most "
            "64); got ^0.5 (use sqrt for a square root)");
}

TEST(ExpressionError, TrigOfALengthIsRefused) {
  EXPECT_EQ(ErrorOf("sin(2m)"),
            "calc:1:5: error: sin needs a plain number (radians, or degrees with deg); got a "
            "length (m)");
  EXPECT_EQ(ErrorOf("log(1MHz)"),
            "calc:1:5: error: log needs a plain number; got a frequency (Hz)");
}

TEST(ExpressionError, DivisionByZeroPointsAtTheSlash) {
  EXPECT_EQ(ErrorOf("1/(2-2)"), "calc:1:2: error: division by zero");
}

TEST(ExpressionError, NonFiniteResultsAreRefused) {
  EXPECT_EQ(ErrorOf("log(0)"), "calc:1:1: error: expression is not a finite number (log of 0)");
  EXPECT_EQ(ErrorOf("sqrt(-4)"), "calc:1:1: error: expression is not a finite number (sqrt of -4)");
  EXPECT_EQ(ErrorOf("asin(2)"),
            "calc:1:1: error: expression is not a finite number (asin of 2 is outside [-1, 1])");
  EXPECT_EQ(ErrorOf("exp(1000)"),
            "calc:1:1: error: expression is not a finite number (exp(1000) overflows)");
  EXPECT_EQ(ErrorOf("1e300*1e300"),
            "calc:1:6: error: expression is not a finite number (overflow in '*')");
  EXPECT_EQ(ErrorOf("10^400"), "calc:1:3: error: expression is not a finite number (10 ^ 400)");
}

TEST(ExpressionError, TooLargeALiteralIsRefused) {
  EXPECT_EQ(ErrorOf("1e999"),
            "calc:1:1: error: number '1e999' is out of the range of double precision (about "
            "1e-308 to 1e308); write it with a unit or smaller");
}

TEST(ExpressionError, UnknownUnitSuggestsTheNearestAndListsAll) {
  EXPECT_EQ(ErrorOf("14.2Mhz"),
            "calc:1:5: error: unknown unit 'Mhz'; did you mean 'MHz'? (units: lengths m cm mm ft "
            "in; areas mm2 cm2 m2; frequencies Hz kHz MHz GHz; resistance ohm kohm; inductance H "
            "mH uH nH; "
            "capacitance F uF nF pF; voltage V mV kV; angle deg)");
  EXPECT_EQ(ErrorOf("3 km").substr(0, 40), "calc:1:3: error: unknown unit 'km'; did ");
}

TEST(ExpressionError, UnknownVariableSuggestsTheNearest) {
  Scope scope;
  scope.Define(Scope::Variable{"height", Value{10.0, kNone}, {}, false});
  EXPECT_EQ(testing::ErrorText([&] { Eval("hieght*2", &scope); }),
            "calc:1:1: error: unknown variable 'hieght'; did you mean 'height'?");
  EXPECT_EQ(ErrorOf("span"),
            "calc:1:1: error: unknown variable 'span'; define it on an earlier line with 'let "
            "span = ...'");
}

TEST(ExpressionError, UnknownFunctionSuggestsTheNearest) {
  EXPECT_EQ(ErrorOf("sqr(2)"),
            "calc:1:1: error: unknown function 'sqr'; did you mean 'sqrt'? (functions: sqrt sin "
            "cos tan asin acos atan atan2 exp log abs min max awg)");
}

TEST(ExpressionError, WrongArgumentCountsAreNamed) {
  EXPECT_EQ(ErrorOf("sqrt(1, 2)"), "calc:1:1: error: sqrt takes 1 argument; got 2");
  EXPECT_EQ(ErrorOf("atan2(1)"), "calc:1:1: error: atan2 takes 2 arguments; got 1");
  EXPECT_EQ(ErrorOf("max(1)"), "calc:1:1: error: max takes 2 or more arguments; got 1");
}

TEST(ExpressionError, UnitAfterAnExpressionAsksForMultiplication) {
  EXPECT_EQ(ErrorOf("(1+2) m"),
            "calc:1:7: error: a unit goes right after a number (2.5m); to give an expression a "
            "unit, multiply it: (...)*1m");
  EXPECT_EQ(ErrorOf("2 m ft"), "calc:1:5: error: a number takes one unit; remove 'ft'");
}

TEST(ExpressionError, MissingOperatorIsReported) {
  EXPECT_EQ(ErrorOf("2(3)"),
            "calc:1:2: error: missing an operator before '(' (after '2'); write '*' to multiply");
}

TEST(ExpressionError, UnclosedParenthesisNamesItsColumn) {
  EXPECT_EQ(ErrorOf("(1+2"),
            "calc:1:5: error: expected ')' to close the '(' at column 1; got the end of the line");
}

TEST(ExpressionError, MissingOperandAtTheEnd) {
  EXPECT_EQ(ErrorOf("1 +"),
            "calc:1:4: error: missing a value at the end of the line (a number, a variable, a "
            "function call or a parenthesis)");
}

TEST(ExpressionError, NestingIsCappedInsteadOfOverflowingTheStack) {
  const std::string ok = std::string(256, '(') + "1" + std::string(256, ')');
  EXPECT_DOUBLE_EQ(Number(ok), 1.0);
  const std::string deep = std::string(4000, '(') + "1" + std::string(4000, ')');
  EXPECT_EQ(ErrorOf(deep),
            "calc:1:257: error: expression nested too deeply (more than 256 levels of "
            "parentheses, signs or powers); simplify it");
  EXPECT_NE(ErrorOf(std::string(9000, '-') + "1").find("nested too deeply"), std::string::npos);
  std::string powers = "2";
  for (int i = 0; i < 4000; ++i) powers += "^1";
  EXPECT_NE(ErrorOf(powers).find("nested too deeply"), std::string::npos);
}

}  // namespace
}  // namespace wirefield::model
