// Tests of the model stage's unit table and dimension algebra (libmom/src/model/units.*).
// Each suffix's factor is checked against its definition; each derived unit's dimension
// against its expression in SI base units.
#include "model/units.hpp"

#include <gtest/gtest.h>

#include <numbers>

namespace wirefield::model {
namespace {

// Factors are single constants, so they must match their definitions to the last bit:
// EXPECT_DOUBLE_EQ (4 ulp) allows only the rounding of the decimal literal itself.
double Factor(const char* name) {
  const Unit* unit = FindUnit(name);
  EXPECT_NE(unit, nullptr) << name;
  return unit == nullptr ? 0.0 : unit->factor;
}

TEST(Units, FootIsExactly0_3048Metre) {
  // International yard and pound agreement (1959): 1 yd = 0.9144 m, so 1 ft = 0.3048 m.
  EXPECT_DOUBLE_EQ(Factor("ft"), 0.3048);
  EXPECT_EQ(FindUnit("ft")->dimension, kLength);
}

TEST(Units, InchIsExactly0_0254Metre) {
  // International yard and pound agreement (1959): 1 in = 1/36 yd = 25.4 mm.
  EXPECT_DOUBLE_EQ(Factor("in"), 0.0254);
  EXPECT_DOUBLE_EQ(Factor("in") * 12.0, Factor("ft"));
}

TEST(Units, MetricPrefixesFollowTheSiBrochure) {
  // SI Brochure, 9th edition (BIPM 2019), SI prefixes: c = 1e-2, m = 1e-3, u (micro) = 1e-6,
  // n = 1e-9, p = 1e-12, k = 1e3, M = 1e6, G = 1e9.
  EXPECT_DOUBLE_EQ(Factor("m"), 1.0);
  EXPECT_DOUBLE_EQ(Factor("cm"), 1e-2);
  EXPECT_DOUBLE_EQ(Factor("mm"), 1e-3);
  EXPECT_DOUBLE_EQ(Factor("Hz"), 1.0);
  EXPECT_DOUBLE_EQ(Factor("kHz"), 1e3);
  EXPECT_DOUBLE_EQ(Factor("MHz"), 1e6);
  EXPECT_DOUBLE_EQ(Factor("GHz"), 1e9);
  EXPECT_DOUBLE_EQ(Factor("ohm"), 1.0);
  EXPECT_DOUBLE_EQ(Factor("kohm"), 1e3);
  EXPECT_DOUBLE_EQ(Factor("H"), 1.0);
  EXPECT_DOUBLE_EQ(Factor("mH"), 1e-3);
  EXPECT_DOUBLE_EQ(Factor("uH"), 1e-6);
  EXPECT_DOUBLE_EQ(Factor("nH"), 1e-9);
  EXPECT_DOUBLE_EQ(Factor("F"), 1.0);
  EXPECT_DOUBLE_EQ(Factor("uF"), 1e-6);
  EXPECT_DOUBLE_EQ(Factor("nF"), 1e-9);
  EXPECT_DOUBLE_EQ(Factor("pF"), 1e-12);
  EXPECT_DOUBLE_EQ(Factor("V"), 1.0);
  EXPECT_DOUBLE_EQ(Factor("mV"), 1e-3);
  EXPECT_DOUBLE_EQ(Factor("kV"), 1e3);
}

TEST(Units, AreasAreTheSquaresOfTheirLengths) {
  // SI Brochure, 9th edition (2019): a prefix binds to its unit before the power, so
  // 1 mm^2 = (1e-3 m)^2 = 1e-6 m^2 and 1 cm^2 = 1e-4 m^2; mm2 is how wire cross-sections are
  // written (IEC 60228 nominal cross-sections, 0.5 mm2, 1.5 mm2).
  EXPECT_DOUBLE_EQ(Factor("mm2"), Factor("mm") * Factor("mm"));
  EXPECT_DOUBLE_EQ(Factor("cm2"), Factor("cm") * Factor("cm"));
  EXPECT_DOUBLE_EQ(Factor("m2"), 1.0);
  for (const char* name : {"mm2", "cm2", "m2"}) {
    EXPECT_EQ(FindUnit(name)->dimension, Power(kLength, 2)) << name;
  }
  EXPECT_EQ(Describe(kArea), "an area (m^2)");
  EXPECT_FALSE(IsLengthUnitName("mm2"));
}

TEST(Units, DegreeIsPiOver180AndDimensionless) {
  // SI Brochure, 9th edition (2019), non-SI units accepted for use with the SI: 1 deg = pi/180 rad.
  EXPECT_DOUBLE_EQ(Factor("deg"), std::numbers::pi / 180.0);
  EXPECT_TRUE(FindUnit("deg")->dimension.IsNone());
}

TEST(Units, DerivedUnitsHaveTheirSiBaseDimensions) {
  // SI Brochure, 9th edition (2019), coherent derived units in base units:
  // V = kg m^2 s^-3 A^-1, ohm = V/A, H = ohm s (Wb/A), F = s/ohm (C/V).
  EXPECT_EQ(kVoltage, (Dimension{{2, 1, -3, -1}}));
  EXPECT_EQ(kResistance, Divide(kVoltage, Dimension{{0, 0, 0, 1}}));
  EXPECT_EQ(kInductance, Multiply(kResistance, Dimension{{0, 0, 1, 0}}));
  EXPECT_EQ(kCapacitance, Divide(Dimension{{0, 0, 1, 0}}, kResistance));
  EXPECT_EQ(kFrequency, Power(Dimension{{0, 0, 1, 0}}, -1));
}

TEST(Units, UnitNamesAreCaseSensitive) {
  EXPECT_EQ(FindUnit("Mhz"), nullptr);
  EXPECT_EQ(FindUnit("MHZ"), nullptr);
  EXPECT_EQ(FindUnit("M"), nullptr);
  EXPECT_NE(FindUnit("MHz"), nullptr);
}

TEST(Units, OnlyLengthUnitsAreAcceptedByTheUnitsStatement) {
  for (const char* name : {"m", "cm", "mm", "ft", "in"}) EXPECT_TRUE(IsLengthUnitName(name));
  for (const char* name : {"Hz", "ohm", "deg", "km", "yd"}) EXPECT_FALSE(IsLengthUnitName(name));
}

TEST(Units, DescribeNamesTheQuantityAndItsSiUnit) {
  EXPECT_EQ(Describe(kNone), "a plain number");
  EXPECT_EQ(Describe(kLength), "a length (m)");
  EXPECT_EQ(Describe(kFrequency), "a frequency (Hz)");
  EXPECT_EQ(Describe(kResistance), "a resistance (ohm)");
  EXPECT_EQ(Describe(kInductance), "an inductance (H)");
  EXPECT_EQ(Describe(kCapacitance), "a capacitance (F)");
  EXPECT_EQ(Describe(kVoltage), "a voltage (V)");
  EXPECT_EQ(Describe(Power(kLength, 2)), "an area (m^2)");
  EXPECT_EQ(Describe(Dimension{{1, 0, 1, 0}}), "a quantity in m s");
  EXPECT_EQ(Describe(Dimension{{-3, 2, 0, 1}}), "a quantity in m^-3 kg^2 A");
}

}  // namespace
}  // namespace wirefield::model
