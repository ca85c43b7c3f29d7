// Conductor physics: the internal (skin-effect) impedance per metre of a round wire of finite
// conductivity, which the fill adds along each lossy wire and the coil calculator uses for its
// winding's AC resistance. Inputs: radius, conductivity, relative permeability, frequency (SI);
// output: ohm per metre, e^{jwt} convention (real part the AC resistance, imaginary part w
// times the internal inductance). See the conductor section of docs/model-language.md.
#pragma once

#include <complex>

namespace wirefield::conductor {

// Returns the skin depth delta = 1 / sqrt(pi f mu0 mu_r sigma) in metres. All inputs > 0.
double SkinDepth_m(double conductivity_s_per_m, double relative_permeability, double frequency_hz);

// Returns the DC resistance per metre of a solid round wire, 1 / (sigma pi a^2), in ohm/m.
double DcResistancePerMetre(double radius_m, double conductivity_s_per_m);

// Returns the internal impedance per metre of a solid round wire (ohm/m), e^{jwt}:
//   Z' = [k / (2 pi a sigma)] J0(k a) / J1(k a),   k = (1 - j) / delta,
// the exact form for a straight isolated wire with the current axially symmetric (Ramo,
// Whinnery & Van Duzer, Fields and Waves, 3rd ed., from memory). It tends to the DC
// resistance plus j w mu/(8 pi) at low frequency and to (1 + j) R_s / (2 pi a) + R_dc / 4 when
// the radius is many skin depths. Throws ComputationError unless every input is finite and
// positive (the parser guarantees that for model values).
std::complex<double> WireImpedancePerMetre(double radius_m, double conductivity_s_per_m,
                                           double relative_permeability, double frequency_hz);

namespace detail {

// |z| above which z J0(z)/J1(z) is taken from the Hankel asymptotic expansion instead of the
// continued fraction, whose term count grows with |z| (847 terms at |z| = 1e4 on arg z = -45
// degrees). There the omitted asymptotic terms are below 1e-24 relative, and the two methods
// agree to 5e-15 (measured; tests/unit/conductor/wire_impedance_test.cpp).
inline constexpr double kAsymptoticSwitchAbsZ = 1e4;

// z J0(z) / J1(z) by the continued fraction 2 - z^2/(4 - z^2/(6 - ...)) (from the recurrence
// of Bessel functions, Abramowitz & Stegun 9.1.27 and 9.1.73, from memory), evaluated by the
// modified Lentz method (Numerical Recipes, 3rd ed., section 5.2, from memory). Converges
// for any finite z off the zeros of J1 (all real), in at most about |z| terms; *terms (if
// given) receives the number used. Throws ComputationError when it has not converged in 4|z| + 1000
// terms.
std::complex<double> ZJ0OverJ1ContinuedFraction(std::complex<double> z, int* terms = nullptr);

// z J0(z) / J1(z) for large |z| with Im z < 0 from the Hankel asymptotic expansion of H0 and
// H1 of the first kind (Abramowitz & Stegun 9.2.7, from memory): J0/J1 -> j S0/S1 with
// S_v = sum_k j^k a_k(v) / z^k; J = (H1 + H2)/2 and H2/H1 ~ exp(2 Im z) -> 0 there.
std::complex<double> ZJ0OverJ1Asymptotic(std::complex<double> z);

}  // namespace detail
}  // namespace wirefield::conductor
