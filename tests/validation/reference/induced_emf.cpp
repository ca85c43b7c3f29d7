// Validation reference: evaluates the closed-form thin-dipole results declared in
// induced_emf.hpp with Boost.Math quadrature (Gauss-Kronrod, exp-sinh) and root finding (TOMS 748).
// Inputs: lengths in metres; outputs: ohms, power ratios. Formulas and their sources are listed
// in the shared reference sheet, section 1 (dipole and monopole theory).
#include "validation/reference/induced_emf.hpp"

#include <fmt/core.h>

#include <boost/math/constants/constants.hpp>
#include <boost/math/quadrature/exp_sinh.hpp>
#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/math/tools/toms748_solve.hpp>
#include <cmath>
#include <cstdint>
#include <limits>
#include <stdexcept>
#include <string>

namespace wirefield::reference {
namespace {

constexpr double kPi = boost::math::constants::pi<double>();
constexpr double kEulerGamma = boost::math::constants::euler<double>();

// Below this argument Si and Ci come from a direct integral over [0, x], whose integrand is
// smooth and not cancelling; above it from the auxiliary functions f and g (no cancellation
// against ln x there). 4 keeps the direct Ci cancellation under a factor of 15.
constexpr double kDirectIntegralLimit = 4.0;
// Relative tolerance asked of the quadratures: a few machine epsilons; the Gauss-Kronrod pair
// converges geometrically on these analytic integrands, so this costs little.
constexpr double kQuadratureTolerance = 4.0 * std::numeric_limits<double>::epsilon();
// At most 2^10 subintervals: a bound on the work if the error estimate stalls at rounding level.
constexpr unsigned kMaxBisections = 10;

void RequireFinite(const char* function, const char* name, double value) {
  if (!std::isfinite(value)) {
    throw std::invalid_argument(
        fmt::format("{}: {} must be finite (got {}); pass a finite number", function, name, value));
  }
}

void RequirePositive(const char* function, const char* name, double value) {
  if (!std::isfinite(value) || !(value > 0.0)) {
    throw std::invalid_argument(
        fmt::format("{}: {} must be positive and finite (got {}); pass a value above 0", function,
                    name, value));
  }
}

// The checks of a formula for a wire of one given dimension (a length, a spacing, a height):
// that dimension, the wavelength and the wave impedance positive and finite, in that order.
void RequireDimensionWavelengthAndEta(const char* function, const char* name, double value,
                                      double wavelength_m, double eta_ohm) {
  RequirePositive(function, name, value);
  RequirePositive(function, "wavelength_m", wavelength_m);
  RequirePositive(function, "eta_ohm", eta_ohm);
}

// integral_0^x sin(t)/t dt for 0 <= x <= kDirectIntegralLimit.
double SineIntegralDirect(double x) {
  auto sinc = [](double t) { return t == 0.0 ? 1.0 : std::sin(t) / t; };
  return boost::math::quadrature::gauss_kronrod<double, 31>::integrate(sinc, 0.0, x, kMaxBisections,
                                                                       kQuadratureTolerance);
}

// Cin(x) = integral_0^x (1 - cos t)/t dt for 0 <= x <= kDirectIntegralLimit; 1 - cos t is
// written 2 sin^2(t/2) so that small t loses no digits.
double EntireCosineIntegralDirect(double x) {
  auto integrand = [](double t) {
    if (t == 0.0) return 0.0;
    const double s = std::sin(0.5 * t);
    return 2.0 * s * s / t;
  };
  return boost::math::quadrature::gauss_kronrod<double, 31>::integrate(
      integrand, 0.0, x, kMaxBisections, kQuadratureTolerance);
}

// The auxiliary functions f(x) = integral_0^inf exp(-x t)/(1 + t^2) dt and
// g(x) = integral_0^inf t exp(-x t)/(1 + t^2) dt (DLMF 6.7.13-14, from memory), for x > 0.
// After s = x t both integrands are exp(-s) times a slowly varying factor, which exp-sinh
// quadrature handles to full precision.
struct AuxiliaryFunctions {
  double f;
  double g;
};

AuxiliaryFunctions AuxiliaryFunctionsAt(double x) {
  // Building the abscissa tables is costly, so each thread keeps one integrator; it cannot be
  // const because Boost 1.74 defines this integrate() overload as a non-const member.
  thread_local boost::math::quadrature::exp_sinh<double> integrator;
  const double inv_x2 = 1.0 / (x * x);
  auto f_integrand = [inv_x2](double s) { return std::exp(-s) / (1.0 + s * s * inv_x2); };
  auto g_integrand = [inv_x2](double s) { return s * std::exp(-s) / (1.0 + s * s * inv_x2); };
  const double f = integrator.integrate(f_integrand, kQuadratureTolerance) / x;
  const double g = integrator.integrate(g_integrand, kQuadratureTolerance) * inv_x2;
  return {f, g};
}

void RequireDipoleGeometry(const char* function, double length_m, double radius_m,
                           double wavelength_m, double eta_ohm) {
  RequirePositive(function, "length_m", length_m);
  RequirePositive(function, "radius_m", radius_m);
  RequirePositive(function, "wavelength_m", wavelength_m);
  RequirePositive(function, "eta_ohm", eta_ohm);
  if (!(radius_m < 0.5 * length_m)) {
    throw std::invalid_argument(fmt::format(
        "{}: radius_m ({}) must be less than half of length_m ({}); a thin-wire formula needs "
        "a wire much thinner than it is long",
        function, radius_m, length_m));
  }
}

}  // namespace

double SineIntegral(double x) {
  RequireFinite("SineIntegral", "x", x);
  if (x < 0.0) return -SineIntegral(-x);
  if (x <= kDirectIntegralLimit) return SineIntegralDirect(x);
  // Si(x) = pi/2 - f(x) cos x - g(x) sin x (DLMF 6.2.17, from memory).
  const AuxiliaryFunctions aux = AuxiliaryFunctionsAt(x);
  return 0.5 * kPi - aux.f * std::cos(x) - aux.g * std::sin(x);
}

double CosineIntegral(double x) {
  RequirePositive("CosineIntegral", "x", x);
  if (x <= kDirectIntegralLimit) return kEulerGamma + std::log(x) - EntireCosineIntegralDirect(x);
  // Ci(x) = f(x) sin x - g(x) cos x (DLMF 6.2.18, from memory).
  const AuxiliaryFunctions aux = AuxiliaryFunctionsAt(x);
  return aux.f * std::sin(x) - aux.g * std::cos(x);
}

double EntireCosineIntegral(double x) {
  if (!std::isfinite(x) || x < 0.0) {
    throw std::invalid_argument(fmt::format(
        "EntireCosineIntegral: x must be finite and not negative (got {}); pass a value >= 0", x));
  }
  if (x <= kDirectIntegralLimit) return EntireCosineIntegralDirect(x);
  return kEulerGamma + std::log(x) - CosineIntegral(x);
}

std::complex<double> DipoleImpedanceAtCurrentMaximum_ohm(double length_m, double radius_m,
                                                         double wavelength_m, double eta_ohm) {
  RequireDipoleGeometry("DipoleImpedanceAtCurrentMaximum_ohm", length_m, radius_m, wavelength_m,
                        eta_ohm);
  const double k_per_m = 2.0 * kPi / wavelength_m;
  const double kl = k_per_m * length_m;
  const double sin_kl = std::sin(kl);
  const double cos_kl = std::cos(kl);
  const double si_kl = SineIntegral(kl);
  const double si_2kl = SineIntegral(2.0 * kl);
  const double ci_kl = CosineIntegral(kl);
  const double ci_2kl = CosineIntegral(2.0 * kl);
  // Induced-EMF self impedance referred to the current maximum: Carter 1932 (from memory);
  // Balanis, Antenna Theory, 3rd ed., eqs. 4-70 and 4-71 (from memory).
  const double resistance_ohm =
      eta_ohm / (2.0 * kPi) *
      (kEulerGamma + std::log(kl) - ci_kl + 0.5 * sin_kl * (si_2kl - 2.0 * si_kl) +
       0.5 * cos_kl * (kEulerGamma + std::log(0.5 * kl) + ci_2kl - 2.0 * ci_kl));
  const double radius_argument = 2.0 * k_per_m * radius_m * radius_m / length_m;
  const double reactance_ohm = eta_ohm / (4.0 * kPi) *
                               (2.0 * si_kl + cos_kl * (2.0 * si_kl - si_2kl) -
                                sin_kl * (2.0 * ci_kl - ci_2kl - CosineIntegral(radius_argument)));
  return {resistance_ohm, reactance_ohm};
}

std::complex<double> DipoleInputImpedance_ohm(double length_m, double radius_m, double wavelength_m,
                                              double eta_ohm) {
  RequireDipoleGeometry("DipoleInputImpedance_ohm", length_m, radius_m, wavelength_m, eta_ohm);
  const double length_wavelengths = length_m / wavelength_m;
  // Distance to the nearest whole number of wavelengths, where sin(k l / 2) = 0.
  const double off_whole_wavelengths =
      std::abs(length_wavelengths - std::round(length_wavelengths));
  constexpr double kMinimumOffWholeWavelengths = 1e-6;
  if (off_whole_wavelengths < kMinimumOffWholeWavelengths) {
    throw std::invalid_argument(fmt::format(
        "DipoleInputImpedance_ohm: length_m / wavelength_m = {} is a whole number of wavelengths, "
        "where the sinusoidal current vanishes at the gap and the gap impedance is infinite; use "
        "DipoleImpedanceAtCurrentMaximum_ohm or another length",
        length_wavelengths));
  }
  // Refer the current-maximum impedance to the gap (Balanis 3rd ed. section 4.6, from memory):
  // the same radiated power with the gap current I_max sin(k l / 2).
  const double sin_half = std::sin(kPi * length_wavelengths);
  return DipoleImpedanceAtCurrentMaximum_ohm(length_m, radius_m, wavelength_m, eta_ohm) /
         (sin_half * sin_half);
}

std::complex<double> MutualImpedanceParallelHalfWave_ohm(double spacing_m, double wavelength_m,
                                                         double eta_ohm) {
  RequireDimensionWavelengthAndEta("MutualImpedanceParallelHalfWave_ohm", "spacing_m", spacing_m,
                                   wavelength_m, eta_ohm);
  const double k_per_m = 2.0 * kPi / wavelength_m;
  const double length_m = 0.5 * wavelength_m;
  const double hypotenuse_m = std::hypot(spacing_m, length_m);
  const double u0 = k_per_m * spacing_m;
  const double u1 = k_per_m * (hypotenuse_m + length_m);
  // k (sqrt(d^2 + l^2) - l) rewritten without the cancellation at small spacing.
  const double u2 = k_per_m * spacing_m * spacing_m / (hypotenuse_m + length_m);
  // Balanis, Antenna Theory, 3rd ed., section 8.6, eqs. 8-71a,b (from memory).
  const double resistance_ohm =
      eta_ohm / (4.0 * kPi) * (2.0 * CosineIntegral(u0) - CosineIntegral(u1) - CosineIntegral(u2));
  const double reactance_ohm =
      -eta_ohm / (4.0 * kPi) * (2.0 * SineIntegral(u0) - SineIntegral(u1) - SineIntegral(u2));
  return {resistance_ohm, reactance_ohm};
}

std::complex<double> HalfWaveDipoleOverPerfectGround_ohm(double height_m, double wavelength_m,
                                                         double eta_ohm) {
  RequireDimensionWavelengthAndEta("HalfWaveDipoleOverPerfectGround_ohm", "height_m", height_m,
                                   wavelength_m, eta_ohm);
  // At a half wave sin(k l) = 0, so any thin radius gives the same Z11; a / lambda = 1e-4 is used.
  const double radius_m = 1e-4 * wavelength_m;
  const std::complex<double> z11_ohm =
      DipoleInputImpedance_ohm(0.5 * wavelength_m, radius_m, wavelength_m, eta_ohm);
  // Image theory: a horizontal current over a perfect conductor has an antiphase image at
  // depth h, i.e. a parallel neighbour at spacing 2h carrying -I (Balanis 3rd ed. section 4.7,
  // from memory).
  return z11_ohm - MutualImpedanceParallelHalfWave_ohm(2.0 * height_m, wavelength_m, eta_ohm);
}

double HertzianDipoleRadiationResistance_ohm(double length_m, double wavelength_m, double eta_ohm) {
  RequireDimensionWavelengthAndEta("HertzianDipoleRadiationResistance_ohm", "length_m", length_m,
                                   wavelength_m, eta_ohm);
  const double ratio = length_m / wavelength_m;
  // Balanis 3rd ed. eq. 4-19 (from memory): R_r = eta (2 pi / 3) (l / lambda)^2.
  return eta_ohm * (2.0 * kPi / 3.0) * ratio * ratio;
}

double ShortDipoleRadiationResistance_ohm(double length_m, double wavelength_m, double eta_ohm) {
  RequireDimensionWavelengthAndEta("ShortDipoleRadiationResistance_ohm", "length_m", length_m,
                                   wavelength_m, eta_ohm);
  const double ratio = length_m / wavelength_m;
  // Balanis 3rd ed. eq. 4-37 (from memory): the triangular current radiates a quarter of the
  // power of a uniform one with the same peak, R_r = eta (pi / 6) (l / lambda)^2.
  return eta_ohm * (kPi / 6.0) * ratio * ratio;
}

double HalfWaveDipoleDirectivity() {
  // Balanis 3rd ed. eq. 4-91 (from memory): D = 4 / Cin(2 pi).
  return 4.0 / EntireCosineIntegral(2.0 * kPi);
}

double PowerRatioToDecibels(double ratio) {
  RequirePositive("PowerRatioToDecibels", "ratio", ratio);
  return 10.0 * std::log10(ratio);
}

double ResonantLengthWavelengths(double radius_wavelengths, double eta_ohm) {
  const char* function = "ResonantLengthWavelengths";
  RequirePositive(function, "eta_ohm", eta_ohm);
  constexpr double kMaxRadiusWavelengths = 0.01;
  if (!std::isfinite(radius_wavelengths) || !(radius_wavelengths > 0.0) ||
      radius_wavelengths > kMaxRadiusWavelengths) {
    throw std::invalid_argument(fmt::format(
        "{}: radius_wavelengths must be in (0, {}] (got {}); the thin-wire induced-EMF formula "
        "does not describe thicker wires",
        function, kMaxRadiusWavelengths, radius_wavelengths));
  }
  // Work in units of one wavelength.
  auto gap_reactance_ohm = [radius_wavelengths, eta_ohm](double length_wavelengths) {
    return DipoleInputImpedance_ohm(length_wavelengths, radius_wavelengths, 1.0, eta_ohm).imag();
  };
  constexpr double kLowWavelengths = 0.40;
  constexpr double kHighWavelengths = 0.50;
  const double x_low_ohm = gap_reactance_ohm(kLowWavelengths);
  const double x_high_ohm = gap_reactance_ohm(kHighWavelengths);
  if (!(x_low_ohm < 0.0 && x_high_ohm > 0.0)) {
    throw std::invalid_argument(fmt::format(
        "{}: the gap reactance does not change sign between {} and {} wavelength (X = {} and {} "
        "ohm); no first resonance is bracketed",
        function, kLowWavelengths, kHighWavelengths, x_low_ohm, x_high_ohm));
  }
  constexpr double kLengthToleranceWavelengths = 1e-12;
  auto close_enough = [](double a, double b) {
    return std::abs(a - b) <= kLengthToleranceWavelengths;
  };
  std::uintmax_t max_iterations = 100;
  const auto bracket =
      boost::math::tools::toms748_solve(gap_reactance_ohm, kLowWavelengths, kHighWavelengths,
                                        x_low_ohm, x_high_ohm, close_enough, max_iterations);
  return 0.5 * (bracket.first + bracket.second);
}

}  // namespace wirefield::reference
