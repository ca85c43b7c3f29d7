// Tests of the awg() function of the model language (libmom/src/model/expression.cpp): the
// American Wire Gauge diameter from the ASTM B258 formula against the gauge table of
// REFERENCES.md, its use as a wire radius, and the exact text of its errors.
#include <gtest/gtest.h>

#include <array>
#include <string>

#include "model/expression.hpp"
#include "model/lexer.hpp"
#include "unit/error_text.hpp"
#include "wirefield/model.hpp"

namespace wirefield::model {
namespace {

Value Eval(const std::string& text) {
  Scope scope;
  const LineSource source{"calc", 1, 0};
  const std::vector<Token> tokens = LexLine(text, source);
  size_t pos = 0;
  return EvaluateExpression(tokens, &pos, scope, source);
}

std::string ErrorOf(const std::string& text) {
  return testing::ErrorText([&] { Eval(text); });
}

TEST(Awg, DiametersMatchTheGaugeTableToAThousandthOfAMillimetre) {
  // d_n = 0.127 mm * 92^((36 - n)/39) (ASTM B258 formula), tabulated in mm to 3 decimals in
  // REFERENCES.md section 3 (computed there; +-0.001 mm, the table's last digit).
  constexpr double kTableTolerance_mm = 0.001;
  struct Row {
    int gauge;
    double diameter_mm;
  };
  constexpr std::array<Row, 10> kTable = {{{10, 2.588},
                                           {12, 2.053},
                                           {14, 1.628},
                                           {16, 1.291},
                                           {18, 1.024},
                                           {20, 0.812},
                                           {22, 0.644},
                                           {24, 0.511},
                                           {26, 0.405},
                                           {28, 0.321}}};
  for (const Row& row : kTable) {
    const Value d = Eval("awg(" + std::to_string(row.gauge) + ")");
    EXPECT_EQ(d.dimension, kLength);
    EXPECT_NEAR(d.si * 1e3, row.diameter_mm, kTableTolerance_mm) << row.gauge;
  }
}

TEST(Awg, TheDefiningGaugesAreFiveThousandthsAndFourHundredSixtyThousandthsOfAnInch) {
  // No. 36 is 0.005 in and No. 0000 is 0.4600 in by definition of the series (REFERENCES.md
  // section 3): exact up to the rounding of one power, 1e-12 relative.
  constexpr double kRounding = 1e-12;
  EXPECT_NEAR(Eval("awg(36)").si / 0.0254, 0.005, 0.005 * kRounding);
  EXPECT_NEAR(Eval("awg(-3)").si / 0.0254, 0.4600, 0.4600 * kRounding);
}

TEST(Awg, HalfAnAwgDiameterIsAWireRadius) {
  const Model m = ParseModelText(
      "wire a from (0,0,0) to (1,0,0) radius awg(14)/2 material copper\nfeed f at a@50%\n",
      "kit.wire");
  // 14 AWG: 1.628 mm diameter (REFERENCES.md section 3, +-0.001 mm).
  EXPECT_NEAR(m.wires[0].radius_m * 2e3, 1.628, 0.001);
}

TEST(Awg, GaugeMustBeAWholePlainNumberInTheTable) {
  EXPECT_EQ(ErrorOf("awg(14.5)"),
            "calc:1:5: error: awg needs a whole gauge number from -3 (for 0000) to 56; got 14.5");
  EXPECT_EQ(ErrorOf("awg(-4)"),
            "calc:1:5: error: awg needs a whole gauge number from -3 (for 0000) to 56; got -4");
  EXPECT_EQ(ErrorOf("awg(57)"),
            "calc:1:5: error: awg needs a whole gauge number from -3 (for 0000) to 56; got 57");
  EXPECT_EQ(ErrorOf("awg(14mm)"),
            "calc:1:5: error: awg needs a plain gauge number (14 for AWG 14, -3 for 0000); got "
            "a length (m)");
  EXPECT_EQ(ErrorOf("awg(1, 2)"), "calc:1:1: error: awg takes 1 argument; got 2");
}

}  // namespace
}  // namespace wirefield::model
