// Validation: the thin-coating approximation of an insulated wire (conductor/coating.hpp)
// against the exact axial surface wave of a dielectric-coated conductor (G. Goubau, "Surface
// waves and their application to transmission lines", J. Appl. Phys. 21, 1950, from memory).
// Both dispersion relations are solved here with Boost.Math's Bessel functions and a bracketing
// root finder; the propagation constants must agree as the approximation's order says.
#include <gtest/gtest.h>

#include <boost/math/special_functions/bessel.hpp>
#include <boost/math/tools/roots.hpp>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <functional>

#include "conductor/coating.hpp"
#include "core/constants.hpp"

namespace wirefield {
namespace {

using boost::math::cyl_bessel_j;
using boost::math::cyl_bessel_k;
using boost::math::cyl_neumann;

struct Coating {
  const char* what;
  double a_m;  // conductor radius
  double b_m;  // outer radius of the coating
  double eps;  // relative permittivity (lossless: real Bessel arguments)
  double f_hz;
};

// The root of f on [lo, hi], where f changes sign, to near double precision (TOMS 748).
double Root(const std::function<double(double)>& f, double lo, double hi) {
  std::uintmax_t iterations = 200;
  const auto [left, right] = boost::math::tools::toms748_solve(
      f, lo, hi, boost::math::tools::eps_tolerance<double>(50), iterations);
  return 0.5 * (left + right);
}

double K0(const Coating& c) { return 2.0 * core::kPi * c.f_hz / core::kSpeedOfLight_m_per_s; }

// The exact TM0 surface wave of a perfect conductor (radius a) in a coating (to b) of eps:
// E_z = A [J0(k1 r) Y0(k1 a) - Y0(k1 r) J0(k1 a)] inside, C K0(h r) outside, with
// k1^2 = eps k0^2 - beta^2 and h^2 = beta^2 - k0^2. Matching E_z and H_phi at r = b gives
//   -k1 F0(b) / (eps F1(b)) = h K0(h b) / K1(h b),
// F1(r) = J1(k1 r) Y0(k1 a) - Y1(k1 r) J0(k1 a) (Goubau 1950; the form derived here from
// Maxwell's equations in cylindrical coordinates). Returns h in 1/m.
double ExactDecay(const Coating& c) {
  const double k0 = K0(c);
  const double h_max = k0 * std::sqrt(c.eps - 1.0);
  auto mismatch = [&](double h) {
    const double k1 = std::sqrt(h_max * h_max - h * h);
    const double j0a = cyl_bessel_j(0, k1 * c.a_m), y0a = cyl_neumann(0, k1 * c.a_m);
    const double f0 = cyl_bessel_j(0, k1 * c.b_m) * y0a - cyl_neumann(0, k1 * c.b_m) * j0a;
    const double f1 = cyl_bessel_j(1, k1 * c.b_m) * y0a - cyl_neumann(1, k1 * c.b_m) * j0a;
    return -k1 * f0 / (c.eps * f1) - h * cyl_bessel_k(0, h * c.b_m) / cyl_bessel_k(1, h * c.b_m);
  };
  return Root(mismatch, 1e-9 * k0, (1.0 - 1e-9) * h_max);
}

// The same wave on a bare wire of radius a whose surface carries the coating's series
// impedance Z' = j X' (the approximation as the moment method applies it): E_z(a) = Z' I with
// I = 2 pi a H_phi(a) gives h K0(h a) / K1(h a) = 2 pi a w eps0 X' (the impedance-wire form of
// Sommerfeld's wire, derived here). Returns h in 1/m.
double ApproximateDecay(const Coating& c) {
  const double k0 = K0(c);
  const double x_ohm_per_m =
      conductor::CoatingImpedancePerMetre(c.a_m, c.b_m, c.eps, 0.0, c.f_hz).imag();
  const double rhs =
      2.0 * core::kPi * c.a_m * (2.0 * core::kPi * c.f_hz) * core::kEps0_f_per_m * x_ohm_per_m;
  auto mismatch = [&](double h) {
    return h * cyl_bessel_k(0, h * c.a_m) / cyl_bessel_k(1, h * c.a_m) - rhs;
  };
  return Root(mismatch, 1e-9 * k0, 10.0 * k0);
}

// beta / k0 - 1: how much the coating slows the wave.
double Slowing(const Coating& c, double h) {
  const double k0 = K0(c);
  return std::sqrt(1.0 + (h / k0) * (h / k0)) - 1.0;
}

// The approximation is first order in the coating's share of the wire's per-metre inductance,
// x = (1 - 1/eps) ln(b/a) / ln(1.123 / (h a)) (the transmission-line view: the exact elastance
// gives beta^2 / k0^2 = 1 / (1 - x), the series impedance 1 + x; 1.123 = 2 e^-gamma from the
// small-argument K0, Abramowitz & Stegun 9.6.13, from memory). So the slowing agrees to about
// x of itself, and always short of it (1 + x < 1 / (1 - x)).
double FirstOrderShare(const Coating& c, double h) {
  return (1.0 - 1.0 / c.eps) * std::log(c.b_m / c.a_m) / std::log(1.123 / (h * c.a_m));
}

TEST(GoubauLine, ThinCoatingSlowsTheWaveAsTheExactSurfaceWaveDoes) {
  const Coating coatings[] = {
      {"PE 2.3, 0.8 mm wire, 0.5 mm jacket, 14.2 MHz", 0.8e-3, 1.3e-3, 2.3, 14.2e6},
      {"PVC 4, 0.5 mm wire, 0.7 mm jacket, 7.1 MHz", 0.5e-3, 1.2e-3, 4.0, 7.1e6},
      {"PTFE 2.1, 1 mm wire, 0.25 mm jacket, 28.5 MHz", 1.0e-3, 1.25e-3, 2.1, 28.5e6},
  };
  for (const Coating& c : coatings) {
    const double h_exact = ExactDecay(c), h_approx = ApproximateDecay(c);
    const double s_exact = Slowing(c, h_exact), s_approx = Slowing(c, h_approx);
    const double x = FirstOrderShare(c, h_exact);
    std::printf("%s: beta/k0 - 1 exact %.5f%%, thin coating %.5f%%, ratio %.4f, x %.4f\n", c.what,
                100.0 * s_exact, 100.0 * s_approx, s_approx / s_exact, x);
    EXPECT_GT(s_exact, 0.0) << c.what;  // a bound, slow wave (Goubau 1950)
    // The approximation falls short of the exact slowing by its first-order share x, as
    // argued at FirstOrderShare: measured 1.03 to 1.05 x for these coatings. Tolerance 10% of
    // x for the terms of higher order in x and in beta/k0 - 1 (a few percent of x here).
    EXPECT_LT(s_approx, s_exact) << c.what;
    EXPECT_NEAR((1.0 - s_approx / s_exact) / x, 1.0, 0.1) << c.what;
  }
}

}  // namespace
}  // namespace wirefield
