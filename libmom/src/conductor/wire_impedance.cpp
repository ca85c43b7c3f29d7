// Conductor physics: skin-effect impedance of a round wire from the ratio of Bessel functions
// of a complex argument. Boost.Math has no complex-argument Bessel functions, so the ratio comes
// from its continued fraction (modified Lentz) and, for very thick wires, from the Hankel
// asymptotic expansion. Inputs and outputs in SI; see wire_impedance.hpp and docs/numerics.md.
#include "conductor/wire_impedance.hpp"

#include <fmt/format.h>

#include <array>
#include <cmath>
#include <limits>

#include "core/constants.hpp"
#include "wirefield/model.hpp"

namespace wirefield::conductor {
namespace {

// Lentz stops when a step changes the value by less than this (relative): a few rounding
// units of a complex product, so the result is good to about 1e-15.
constexpr double kLentzTolerance = 4.0 * std::numeric_limits<double>::epsilon();
// Stands in for a zero denominator in Lentz's method (Numerical Recipes' FPMIN, from memory).
constexpr double kLentzTiny = 1e-300;
// Terms of the Hankel expansion summed. The first omitted one, a_6(0)/z^6 = 0.57/|z|^6, is
// below 1e-24 beyond the switch (|z| = 1e4).
constexpr int kHankelTerms = 6;

void CheckPositive(double value, const char* what) {
  if (!(value > 0.0) || !std::isfinite(value)) {
    throw ComputationError(
        fmt::format("conductor impedance: {} must be finite and positive; got {}", what, value));
  }
}

// S_v(z) = sum_{k=0}^{n-1} j^k a_k(v) / z^k with a_0 = 1 and
// a_k = a_{k-1} (4 v^2 - (2k - 1)^2) / (8 k)   (A&S 9.2.7 and 9.2.9, from memory).
Complex HankelSeries(int order, Complex z) {
  const double mu = 4.0 * order * order;
  const Complex j(0.0, 1.0);
  Complex term(1.0, 0.0);
  Complex sum = term;
  for (int k = 1; k < kHankelTerms; ++k) {
    const double odd = 2.0 * k - 1.0;
    term *= j * ((mu - odd * odd) / (8.0 * k)) / z;
    sum += term;
  }
  return sum;
}

}  // namespace

namespace detail {

Complex ZJ0OverJ1ContinuedFraction(Complex z, int* terms) {
  // T = b0 + a1/(b1 + a2/(b2 + ...)) with b0 = 2, b_n = 2(n + 1), a_n = -z^2. From
  // J_{n-1} + J_{n+1} = (2n/z) J_n: z J_{n-1}/J_n = 2n - z^2 / (z J_n / J_{n+1}).
  const Complex minus_z2 = -z * z;
  Complex f(2.0, 0.0);
  Complex c = f;
  Complex d(0.0, 0.0);
  const int max_terms = 1000 + static_cast<int>(4.0 * std::abs(z));
  for (int n = 1; n <= max_terms; ++n) {
    const double b = 2.0 * (n + 1);
    d = b + minus_z2 * d;
    if (std::abs(d) < kLentzTiny) d = kLentzTiny;
    c = b + minus_z2 / c;
    if (std::abs(c) < kLentzTiny) c = kLentzTiny;
    d = 1.0 / d;
    const Complex delta = c * d;
    f *= delta;
    if (std::abs(delta - 1.0) < kLentzTolerance) {
      if (terms != nullptr) *terms = n;
      return f;
    }
  }
  throw ComputationError(
      fmt::format("conductor impedance: the continued fraction for "
                  "J0/J1 did not converge in {} terms at z = ({}, {})",
                  max_terms, z.real(), z.imag()));
}

Complex ZJ0OverJ1Asymptotic(Complex z) {
  const Complex j(0.0, 1.0);
  return z * j * HankelSeries(0, z) / HankelSeries(1, z);
}

}  // namespace detail

double SkinDepth_m(double conductivity_s_per_m, double relative_permeability, double frequency_hz) {
  CheckPositive(conductivity_s_per_m, "the conductivity");
  CheckPositive(relative_permeability, "the relative permeability");
  CheckPositive(frequency_hz, "the frequency");
  return 1.0 / std::sqrt(core::kPi * frequency_hz * core::kMu0_h_per_m * relative_permeability *
                         conductivity_s_per_m);
}

double DcResistancePerMetre(double radius_m, double conductivity_s_per_m) {
  CheckPositive(radius_m, "the radius");
  CheckPositive(conductivity_s_per_m, "the conductivity");
  return 1.0 / (conductivity_s_per_m * core::kPi * radius_m * radius_m);
}

std::complex<double> WireImpedancePerMetre(double radius_m, double conductivity_s_per_m,
                                           double relative_permeability, double frequency_hz) {
  const double delta_m = SkinDepth_m(conductivity_s_per_m, relative_permeability, frequency_hz);
  const double r_dc_ohm_per_m = DcResistancePerMetre(radius_m, conductivity_s_per_m);
  // k a = (1 - j) a / delta. Z' = [k / (2 pi a sigma)] J0/J1 = R_dc (ka J0(ka)/J1(ka)) / 2,
  // which stays exact as ka -> 0 (no division by a small ka).
  const Complex z = Complex(1.0, -1.0) * (radius_m / delta_m);
  const Complex t = std::abs(z) > detail::kAsymptoticSwitchAbsZ
                        ? detail::ZJ0OverJ1Asymptotic(z)
                        : detail::ZJ0OverJ1ContinuedFraction(z);
  return r_dc_ohm_per_m * t / 2.0;
}

}  // namespace wirefield::conductor
