// Tests of the conductor impedance (libmom/src/conductor/wire_impedance.cpp): skin depth,
// DC resistance and the exact Bessel-function internal impedance of a round wire, against
// handbook values, the textbook thick-wire and low-frequency limits, the power series of
// J0 and J1, and the Hankel asymptotic form it switches to for very thick wires.
#include "conductor/wire_impedance.hpp"

#include <gtest/gtest.h>

#include <array>
#include <cmath>
#include <complex>
#include <numbers>

#include "unit/error_text.hpp"
#include "wirefield/model.hpp"

namespace wirefield::conductor {
namespace {

using Complex = std::complex<double>;

// Annealed copper, 100% IACS (IEC 60028, from memory; REFERENCES.md section 3).
constexpr double kCopper_s_per_m = 5.80e7;
constexpr double kMu0_h_per_m = 4e-7 * std::numbers::pi;
// AWG 14: d = 0.127 mm * 92^(22/39) = 1.628 mm (ASTM B258 formula; REFERENCES.md section 3),
// radius 0.8139 mm as REFERENCES.md gives it for the AWG 14 check.
constexpr double kAwg14Radius_m = 0.8139e-3;

double Relative(double value, double reference) {
  return std::abs(value - reference) / std::abs(reference);
}

TEST(SkinDepth, CopperMatchesTheHandbookTableToItsLastDigit) {
  // delta = 1/sqrt(pi f mu0 sigma) in annealed copper (REFERENCES.md section 3, computed
  // there from the formula of Ramo, Whinnery & Van Duzer, from memory), tabulated to 3
  // significant digits. A table rounded to 0.1 um is matched within half its last digit,
  // 0.05 um; a relative 1e-3 would be too tight (17.662 um rounds to 17.7, 2.1e-3 off).
  constexpr double kHalfLastDigit_um = 0.05;
  struct Row {
    double frequency_hz;
    double delta_um;
  };
  constexpr std::array<Row, 6> kTable = {
      {{1.0e6, 66.1}, {1.8e6, 49.3}, {3.5e6, 35.3}, {7.0e6, 25.0}, {14.0e6, 17.7}, {28.0e6, 12.5}}};
  for (const Row& row : kTable) {
    EXPECT_NEAR(SkinDepth_m(kCopper_s_per_m, 1.0, row.frequency_hz) * 1e6, row.delta_um,
                kHalfLastDigit_um)
        << row.frequency_hz;
  }
}

TEST(SkinDepth, ScalesAsOneOverTheSquareRootOfFrequencyConductivityAndPermeability) {
  // delta = sqrt(2/(w mu sigma)) (Ramo, Whinnery & Van Duzer, 3rd ed., from memory): the
  // formula itself, to rounding (1e-14: a handful of products and one square root).
  constexpr double kRounding = 1e-14;
  const double base_m = SkinDepth_m(kCopper_s_per_m, 1.0, 7e6);
  EXPECT_LT(Relative(base_m, std::sqrt(2.0 / (2 * std::numbers::pi * 7e6 * kMu0_h_per_m *
                                              kCopper_s_per_m))),
            kRounding);
  EXPECT_LT(Relative(SkinDepth_m(kCopper_s_per_m, 1.0, 28e6), base_m / 2.0), kRounding);
  EXPECT_LT(Relative(SkinDepth_m(kCopper_s_per_m / 4.0, 1.0, 7e6), base_m * 2.0), kRounding);
  EXPECT_LT(Relative(SkinDepth_m(kCopper_s_per_m, 100.0, 7e6), base_m / 10.0), kRounding);
}

TEST(DcResistance, Awg14CopperIsAbout8Point29MilliohmPerMetre) {
  // R_dc = 1/(sigma pi a^2) = 8.286 mOhm/m for AWG 14 copper (REFERENCES.md section 3,
  // +-0.1%). The formula itself gives 8.2848; the table's figure is 1.5e-4 above it.
  constexpr double kReferenceTolerance = 1e-3;
  EXPECT_LT(Relative(DcResistancePerMetre(kAwg14Radius_m, kCopper_s_per_m), 8.286e-3),
            kReferenceTolerance);
}

TEST(WireImpedance, Awg14CopperAt7MegahertzMatchesTheExactBesselFormValues) {
  // Exact Z' = [k/(2 pi a sigma)] J0(ka)/J1(ka) for AWG 14 copper at 7 MHz: R' = 137.08 and
  // X' = 134.96 mOhm/m (REFERENCES.md section 3, computed there, +-0.1%).
  constexpr double kReferenceTolerance = 1e-3;
  const Complex z = WireImpedancePerMetre(kAwg14Radius_m, kCopper_s_per_m, 1.0, 7e6);
  EXPECT_LT(Relative(z.real(), 137.08e-3), kReferenceTolerance) << z.real();
  EXPECT_LT(Relative(z.imag(), 134.96e-3), kReferenceTolerance) << z.imag();
}

TEST(WireImpedance, Awg14CopperAt14MegahertzMatchesTheExactBesselFormValue) {
  // R' = 192.98 mOhm/m (REFERENCES.md section 3, computed there, +-0.1%).
  constexpr double kReferenceTolerance = 1e-3;
  const Complex z = WireImpedancePerMetre(kAwg14Radius_m, kCopper_s_per_m, 1.0, 14e6);
  EXPECT_LT(Relative(z.real(), 192.98e-3), kReferenceTolerance) << z.real();
}

TEST(WireImpedance, ThickWireApproximationsAgreeWithTheExactFormAt7Megahertz) {
  // For a >> delta: R'/R_dc ~ a/(2 delta) + 1/4 (Schelkunoff, from memory) and
  // X' ~ R_s/(2 pi a) with R_s = 1/(sigma delta) (REFERENCES.md section 3: 137.06 and 134.98
  // mOhm/m for AWG 14 at 7 MHz, where a/delta = 33). Their error is of order delta/a
  // squared and smaller, so they meet the exact form to 0.1% here.
  constexpr double kApproximationTolerance = 1e-3;
  const double delta_m = SkinDepth_m(kCopper_s_per_m, 1.0, 7e6);
  const double r_dc = DcResistancePerMetre(kAwg14Radius_m, kCopper_s_per_m);
  const double r_thick = r_dc * (kAwg14Radius_m / (2.0 * delta_m) + 0.25);
  const double x_thick =
      1.0 / (kCopper_s_per_m * delta_m) / (2.0 * std::numbers::pi * kAwg14Radius_m);
  EXPECT_LT(Relative(r_thick, 137.06e-3), kApproximationTolerance);  // REFERENCES.md section 3
  EXPECT_LT(Relative(x_thick, 134.98e-3), kApproximationTolerance);  // REFERENCES.md section 3
  const Complex z = WireImpedancePerMetre(kAwg14Radius_m, kCopper_s_per_m, 1.0, 7e6);
  EXPECT_LT(Relative(z.real(), r_thick), kApproximationTolerance);
  EXPECT_LT(Relative(z.imag(), x_thick), kApproximationTolerance);
}

TEST(WireImpedance, AtOneHertzIsTheDcResistancePlusTheClassicalInternalInductance) {
  // At low frequency Z' -> R_dc + j w mu/(8 pi): the internal inductance of a round wire with
  // uniform current, mu0/(8 pi) = 50 nH/m (Ramo, Whinnery & Van Duzer, 3rd ed., from memory).
  // At 1 Hz a 1 mm radius copper wire has a/delta = 0.015; the next terms are of relative
  // order (a/delta)^4 / 48, about 1e-9, so 1e-6 leaves room and still catches any slip.
  constexpr double kLowFrequencyTolerance = 1e-6;
  constexpr double kRadius_m = 1e-3;
  const Complex z = WireImpedancePerMetre(kRadius_m, kCopper_s_per_m, 1.0, 1.0);
  EXPECT_LT(Relative(z.real(), DcResistancePerMetre(kRadius_m, kCopper_s_per_m)),
            kLowFrequencyTolerance);
  const double inductance_h_per_m = z.imag() / (2.0 * std::numbers::pi * 1.0);
  EXPECT_LT(Relative(inductance_h_per_m, kMu0_h_per_m / (8.0 * std::numbers::pi)),
            kLowFrequencyTolerance)
      << inductance_h_per_m;
  EXPECT_LT(Relative(inductance_h_per_m, 50e-9), kLowFrequencyTolerance);
}

TEST(WireImpedance, MagneticWireScalesItsInternalInductanceWithPermeability) {
  // The low-frequency internal inductance is mu0 mu_r / (8 pi) (same textbook, from memory):
  // for mu_r = 100 at 1 Hz, 5 uH/m, with a/delta = 0.4 for a 1 mm steel-like wire of
  // 6 MS/m, whose next term is of relative order (a/delta)^4 / 48 (about 5e-4): 2e-3.
  constexpr double kLowFrequencyTolerance = 2e-3;
  const Complex z = WireImpedancePerMetre(1e-3, 6e6, 100.0, 1.0);
  EXPECT_LT(Relative(z.imag() / (2.0 * std::numbers::pi),
                     100.0 * kMu0_h_per_m / (8.0 * std::numbers::pi)),
            kLowFrequencyTolerance);
}

TEST(WireImpedance, ResistanceRisesAndInternalReactanceFallsBelowItWithFrequency) {
  // Physics (Ramo, Whinnery & Van Duzer, from memory): R' grows monotonically from R_dc,
  // and X' <= R' for a round wire at every frequency, the two meeting as a/delta grows.
  double previous_r = DcResistancePerMetre(kAwg14Radius_m, kCopper_s_per_m);
  for (double f_hz = 1e3; f_hz <= 1e9; f_hz *= 3.0) {
    const Complex z = WireImpedancePerMetre(kAwg14Radius_m, kCopper_s_per_m, 1.0, f_hz);
    EXPECT_GE(z.real(), previous_r) << f_hz;
    EXPECT_GT(z.imag(), 0.0) << f_hz;  // inductive in the e^{jwt} convention
    EXPECT_LE(z.imag(), z.real()) << f_hz;
    previous_r = z.real();
  }
}

// z J0(z)/J1(z) from the power series J_n(z) = sum_k (-1)^k (z/2)^(2k+n) / (k! (k+n)!)
// (Abramowitz & Stegun 9.1.10, from memory), usable for |z| up to about 10 in double.
Complex SeriesZJ0OverJ1(Complex z) {
  const Complex q = -(z / 2.0) * (z / 2.0);
  Complex j0(0.0), j1(0.0);
  Complex term0(1.0), term1 = z / 2.0;
  for (int k = 0; k < 80; ++k) {
    j0 += term0;
    j1 += term1;
    term0 *= q / double((k + 1) * (k + 1));
    term1 *= q / double((k + 1) * (k + 2));
  }
  return z * j0 / j1;
}

TEST(BesselRatio, ContinuedFractionMatchesThePowerSeriesOfJ0AndJ1) {
  // Arguments of the wire problem lie on arg z = -45 degrees (z = (1 - j) a/delta), plus a
  // few others. For |z| <= 7 the largest term of either series is under 100 times its sum,
  // so cancellation costs at most two of the 16 digits: 1e-12.
  constexpr double kSeriesTolerance = 1e-12;
  for (const Complex z :
       {Complex(1e-4, -1e-4), Complex(0.3, -0.3), Complex(1.0, -1.0), Complex(2.5, -2.5),
        Complex(5.0, -5.0), Complex(3.0, 1.0), Complex(0.5, 0.0), Complex(0.0, -4.0)}) {
    const Complex series = SeriesZJ0OverJ1(z);
    const Complex fraction = detail::ZJ0OverJ1ContinuedFraction(z);
    EXPECT_LT(std::abs(fraction - series) / std::abs(series), kSeriesTolerance) << z;
  }
}

TEST(BesselRatio, ContinuedFractionAndHankelFormAgreeAtTheSwitchAndWellBelowIt) {
  // Two independent methods: the continued fraction is exact to rounding; the Hankel sum of
  // 6 terms is off by its first omitted term, a_6(0)/z^6 = 0.57/|z|^6 (A&S 9.2.7, from
  // memory): 7e-14 at |z| = 141, below 1e-18 from |z| = 1414 on. Tolerances: 1e-12 at
  // |z| = 141 (measured 1.6e-13), and 1e-13 above, rounding over the ~850 fraction terms
  // (measured 5e-15 at the switch).
  struct Case {
    double a_over_delta;
    double tolerance;
  };
  for (const Case c : {Case{100.0, 1e-12}, Case{1000.0, 1e-13},
                       Case{detail::kAsymptoticSwitchAbsZ / std::sqrt(2.0), 1e-13},
                       Case{detail::kAsymptoticSwitchAbsZ, 1e-13}}) {
    const Complex z = Complex(1.0, -1.0) * c.a_over_delta;
    const Complex fraction = detail::ZJ0OverJ1ContinuedFraction(z);
    const Complex hankel = detail::ZJ0OverJ1Asymptotic(z);
    EXPECT_LT(std::abs(fraction - hankel) / std::abs(hankel), c.tolerance) << c.a_over_delta;
  }
}

TEST(BesselRatio, HankelFormLeadsWithTheThickWireLimit) {
  // J0/J1 -> j + 1/(2z) + O(1/z^2) for Im z < 0 (from A&S 9.2.7), which is where the
  // thick-wire rule R'/R_dc = a/(2 delta) + 1/4 comes from; at |z| = 1e5 the next term is
  // 3/(8 |z|^2) relative to j, below 1e-10.
  constexpr double kNextTerm = 1e-10;
  const Complex z = Complex(1.0, -1.0) * 1e5 / std::sqrt(2.0);
  const Complex ratio = detail::ZJ0OverJ1Asymptotic(z) / z;
  EXPECT_LT(std::abs(ratio - (Complex(0.0, 1.0) + 1.0 / (2.0 * z))), kNextTerm);
}

TEST(WireImpedance, IsContinuousAcrossTheSwitchToTheHankelForm) {
  // A 10 mm copper rod crosses |ka| = 1e4 near 1.5 GHz; one side of the switch uses the
  // continued fraction, the other the Hankel form. Z' ~ sqrt(f), so two frequencies 1e-9
  // apart give Z' 5e-10 apart; anything much larger is a jump. Bound: 1e-9.
  constexpr double kContinuity = 1e-9;
  constexpr double kRadius_m = 10e-3;
  // |ka| = sqrt(2) a / delta = 1e4  <=>  f = (1e4 / (sqrt(2) a))^2 / (pi mu0 sigma).
  const double ratio = detail::kAsymptoticSwitchAbsZ / (std::sqrt(2.0) * kRadius_m);
  const double f_switch_hz = ratio * ratio / (std::numbers::pi * kMu0_h_per_m * kCopper_s_per_m);
  const Complex below =
      WireImpedancePerMetre(kRadius_m, kCopper_s_per_m, 1.0, f_switch_hz * (1.0 - 1e-9));
  const Complex above =
      WireImpedancePerMetre(kRadius_m, kCopper_s_per_m, 1.0, f_switch_hz * (1.0 + 1e-9));
  EXPECT_LT(std::abs(above - below) / std::abs(below), kContinuity);
}

TEST(WireImpedance, NonPositiveOrNonFiniteInputsAreAComputationError) {
  EXPECT_THROW(WireImpedancePerMetre(0.0, kCopper_s_per_m, 1.0, 7e6), ComputationError);
  EXPECT_THROW(WireImpedancePerMetre(1e-3, -1.0, 1.0, 7e6), ComputationError);
  EXPECT_THROW(WireImpedancePerMetre(1e-3, kCopper_s_per_m, 0.0, 7e6), ComputationError);
  EXPECT_THROW(WireImpedancePerMetre(1e-3, kCopper_s_per_m, 1.0, 0.0), ComputationError);
  EXPECT_THROW(WireImpedancePerMetre(1e-3, kCopper_s_per_m, 1.0, std::nan("")), ComputationError);
  EXPECT_EQ(testing::ErrorText<ComputationError>([&] { SkinDepth_m(kCopper_s_per_m, 1.0, -5.0); }),
            "conductor impedance: the frequency must be finite and positive; "
            "got -5");
}

}  // namespace
}  // namespace wirefield::conductor
