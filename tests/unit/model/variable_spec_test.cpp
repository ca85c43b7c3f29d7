// Tests of the model stage's description of `let` variables (Model::variable_specs) and of
// ReadVariableValue, which `tune` uses for its bounds: values in SI, the SI unit of each
// dimension, the --set override as the value, the exact text of a wrong-dimension value, and
// that a trial value written as override text is read back to the last bit.
#include <fmt/format.h>
#include <gtest/gtest.h>

#include <string>

#include "wirefield/model.hpp"

namespace wirefield {
namespace {

const std::string kKit =
    "let total = 10.05m\n"
    "let coil = 82uH\n"
    "let comp = 100pF\n"
    "let h = 10\n"
    "let area = 2m * 3m\n"
    "wire dip from (-total / 2, 0, h) to (total / 2, 0, h) radius 1mm\n"
    "feed src at dip@50%\n"
    "load l at dip@25% series L=coil C=comp\n"
    "let spare = area\n";

TEST(VariableSpec, EachLetKeepsItsSiValueUnitAndLocation) {
  const Model m = ParseModelText(kKit, "kit.wire");
  ASSERT_EQ(m.variable_specs.size(), 6u);
  // SI prefixes: c = 1e-2, u = 1e-6, p = 1e-12 (SI Brochure, 9th ed., Table 7).
  EXPECT_DOUBLE_EQ(m.variable_specs[0].value_si, 10.05);
  EXPECT_EQ(m.variable_specs[0].unit, "m");
  EXPECT_EQ(m.variable_specs[0].quantity, "a length (m)");
  EXPECT_EQ(m.variable_specs[0].location.line, 1);
  EXPECT_EQ(m.variable_specs[0].location.column, 5);
  EXPECT_DOUBLE_EQ(m.variable_specs[1].value_si, 82e-6);
  EXPECT_EQ(m.variable_specs[1].unit, "H");
  EXPECT_DOUBLE_EQ(m.variable_specs[2].value_si, 100e-12);
  EXPECT_EQ(m.variable_specs[2].unit, "F");
  EXPECT_EQ(m.variable_specs[3].unit, "");
  EXPECT_EQ(m.variable_specs[3].quantity, "a plain number");
  EXPECT_EQ(m.variable_specs[4].unit, "");
  EXPECT_EQ(m.variable_specs[4].quantity, "an area (m^2)");
}

TEST(VariableSpec, AnOverrideIsTheRecordedValue) {
  const Model m = ParseModelText(kKit, "kit.wire", {Override{"total", "1034cm", ""}});
  EXPECT_DOUBLE_EQ(m.variable_specs[0].value_si, 10.34);
}

TEST(VariableSpec, SeventeenDigitOverrideTextReadsBackExactly) {
  // 17 significant digits identify every IEEE 754 double (IEEE 754-2008, 5.12.2).
  for (double value : {10.052345678901234, 8.2e-5, 1.0e-10 / 3.0}) {
    const std::string unit = value > 1 ? "m" : (value > 1e-8 ? "H" : "F");
    const std::string name = value > 1 ? "total" : (value > 1e-8 ? "coil" : "comp");
    const Model m = ParseModelText(kKit, "kit.wire",
                                   {Override{name, fmt::format("{:.17g} {}", value, unit), ""}});
    for (const VariableSpec& v : m.variable_specs) {
      if (v.name == name) {
        EXPECT_EQ(v.value_si, value) << name;
      }
    }
  }
}

TEST(VariableValue, TakesTheVariablesQuantityOrABareSiNumber) {
  const Model m = ParseModelText(kKit, "kit.wire");
  // SI prefixes: c = 1e-2, u = 1e-6 (SI Brochure, 9th ed., Table 7).
  EXPECT_DOUBLE_EQ(ReadVariableValue("950cm", m.variable_specs[0]).si, 9.5);
  EXPECT_DOUBLE_EQ(ReadVariableValue("9.5", m.variable_specs[0]).si, 9.5);
  EXPECT_DOUBLE_EQ(ReadVariableValue("60uH", m.variable_specs[1]).si, 60e-6);
  const ValueReading wrong = ReadVariableValue("9uH", m.variable_specs[0]);
  ASSERT_TRUE(wrong.problem.has_value());
  EXPECT_EQ(wrong.problem->line, 1);
  EXPECT_EQ(wrong.problem->column, 1);
  EXPECT_TRUE(wrong.problem->after_name);
  EXPECT_EQ(wrong.problem->message, "needs a length (m) like 'total'; got an inductance (H)");
}

}  // namespace
}  // namespace wirefield
