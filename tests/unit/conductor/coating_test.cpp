// Tests of the thin-coating series impedance of an insulated wire
// (libmom/src/conductor/coating.cpp): the formula of Richmond and Newman, "Dielectric coated
// wire antennas", Radio Science 11(1), 1976 (from memory), Z' = j w mu0/(2 pi) (1 - 1/eps*)
// ln(b/a), its limits, its growth with the permittivity and ln(b/a), and its loss.
#include "conductor/coating.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <numbers>

#include "conductor/wire_impedance.hpp"

namespace wirefield::conductor {
namespace {

using Complex = std::complex<double>;

// mu0 = 4 pi 1e-7 H/m (SI before 2019; the 2019 value differs by 1e-10 relative, CODATA 2018).
constexpr double kMu0 = 4e-7 * std::numbers::pi;
// Rounding of a handful of double operations on values of order 1 to 100.
constexpr double kRounding = 1e-12;

// The formula written out independently: w mu0/(2 pi) = mu0 f, times (1 - 1/eps*) ln(b/a).
Complex Formula(double a_m, double b_m, double eps, double tan_d, double f_hz) {
  const Complex eps_c(eps, -eps * tan_d);
  return Complex(0.0, kMu0 * f_hz * std::log(b_m / a_m)) * (1.0 - 1.0 / eps_c);
}

TEST(CoatingImpedance, IsExactlyZeroForAVacuumCoating) {
  // eps_r = 1 and no loss: the coating is empty space, the wire is bare (Richmond & Newman).
  const Complex z = CoatingImpedancePerMetre(0.8e-3, 1.3e-3, 1.0, 0.0, 14.2e6);
  EXPECT_EQ(z.real(), 0.0);
  EXPECT_EQ(z.imag(), 0.0);
}

TEST(CoatingImpedance, MatchesTheFormulaForAPvcJacket) {
  // 0.8 mm conductor, 0.5 mm PVC-like jacket (eps 4, tan d 0.05) at 14.2 MHz. By hand:
  // mu0 f = 17.844 ohm/m, ln(1.3/0.8) = 0.48551, eps* = 4 - 0.2 j, 1 - 1/eps* = 0.75062 -
  // 0.01247 j: X = 6.503 ohm/m, R = 0.1080 ohm/m.
  const Complex z = CoatingImpedancePerMetre(0.8e-3, 1.3e-3, 4.0, 0.05, 14.2e6);
  const Complex expected = Formula(0.8e-3, 1.3e-3, 4.0, 0.05, 14.2e6);
  EXPECT_NEAR(z.real(), expected.real(), kRounding * std::abs(expected));
  EXPECT_NEAR(z.imag(), expected.imag(), kRounding * std::abs(expected));
  // The hand figures above, to their 4 digits.
  EXPECT_NEAR(z.imag(), 6.503, 0.001);
  EXPECT_NEAR(z.real(), 0.1080, 0.0001);
}

TEST(CoatingImpedance, GrowsWithPermittivityAsOneMinusItsInverse) {
  // Lossless: X' is proportional to 1 - 1/eps_r, so X'(eps 4) / X'(eps 2) = 0.75 / 0.5.
  const double x2 = CoatingImpedancePerMetre(1e-3, 1.5e-3, 2.0, 0.0, 7e6).imag();
  const double x4 = CoatingImpedancePerMetre(1e-3, 1.5e-3, 4.0, 0.0, 7e6).imag();
  const double x10 = CoatingImpedancePerMetre(1e-3, 1.5e-3, 10.0, 0.0, 7e6).imag();
  EXPECT_GT(x2, 0.0);  // inductive: the jacket slows the wave (Richmond & Newman)
  EXPECT_LT(x2, x4);
  EXPECT_LT(x4, x10);
  EXPECT_NEAR(x4 / x2, 0.75 / 0.5, kRounding);
  EXPECT_NEAR(x10 / x2, 0.9 / 0.5, kRounding);
}

TEST(CoatingImpedance, IsProportionalToTheLogOfTheRadiusRatio) {
  // ln(b/a): b/a = 1.5 and b/a = 2.25 = 1.5^2 give twice the impedance.
  const Complex z1 = CoatingImpedancePerMetre(1e-3, 1.5e-3, 3.0, 0.02, 7e6);
  const Complex z2 = CoatingImpedancePerMetre(1e-3, 2.25e-3, 3.0, 0.02, 7e6);
  EXPECT_NEAR(std::abs(z2 / z1 - 2.0), 0.0, kRounding);
  // And with the frequency, as w.
  const Complex z3 = CoatingImpedancePerMetre(1e-3, 1.5e-3, 3.0, 0.02, 21e6);
  EXPECT_NEAR(std::abs(z3 / z1 - 3.0), 0.0, kRounding);
}

TEST(CoatingImpedance, ChargesTheLossTangentAsAPositiveResistance) {
  // Re Z' = mu0 f ln(b/a) tan d / (eps (1 + tan^2 d)) from Im(1/eps*) (the formula expanded
  // by hand): positive, and zero for a lossless jacket.
  const double a = 1e-3, b = 1.6e-3, eps = 3.5, tan_d = 0.08, f = 10e6;
  const double expected = kMu0 * f * std::log(b / a) * tan_d / (eps * (1.0 + tan_d * tan_d));
  EXPECT_NEAR(CoatingImpedancePerMetre(a, b, eps, tan_d, f).real(), expected, kRounding * expected);
  EXPECT_EQ(CoatingImpedancePerMetre(a, b, eps, 0.0, f).real(), 0.0);
}

TEST(CoatingImpedance, RefusesImpossibleInput) {
  EXPECT_THROW(CoatingImpedancePerMetre(0.0, 1e-3, 2.0, 0.0, 7e6), ComputationError);
  EXPECT_THROW(CoatingImpedancePerMetre(1e-3, 1e-3, 2.0, 0.0, 7e6), ComputationError);
  EXPECT_THROW(CoatingImpedancePerMetre(1e-3, 2e-3, 0.5, 0.0, 7e6), ComputationError);
  EXPECT_THROW(CoatingImpedancePerMetre(1e-3, 2e-3, 2.0, -0.1, 7e6), ComputationError);
  EXPECT_THROW(CoatingImpedancePerMetre(1e-3, 2e-3, 2.0, 0.0, 0.0), ComputationError);
  EXPECT_THROW(CoatingImpedancePerMetre(1e-3, 2e-3, std::nan(""), 0.0, 7e6), ComputationError);
}

TEST(SeriesImpedance, AddsTheJacketToTheSkinEffect) {
  // A copper wire with a PE jacket: the sum of the two impedances, each as its function says.
  WireSpec wire;
  wire.radius_m = 1e-3;
  wire.conductivity_s_per_m = 5.8e7;  // copper, IEC 60028 (from memory)
  InsulationSpec jacket;
  jacket.thickness_m = 0.6e-3;
  jacket.relative_permittivity = 2.3;
  jacket.loss_tangent = 3e-4;
  wire.insulation = jacket;
  const Complex sum = SeriesImpedancePerMetre(wire, 1e-3, 14e6);
  const Complex skin = WireImpedancePerMetre(1e-3, 5.8e7, 1.0, 14e6);
  const Complex coat = CoatingImpedancePerMetre(1e-3, 1.6e-3, 2.3, 3e-4, 14e6);
  EXPECT_NEAR(std::abs(sum - (skin + coat)), 0.0, kRounding * std::abs(sum));
  EXPECT_TRUE(HasSeriesImpedance(wire));
  EXPECT_FALSE(HasSeriesImpedance(WireSpec{}));
}

}  // namespace
}  // namespace wirefield::conductor
