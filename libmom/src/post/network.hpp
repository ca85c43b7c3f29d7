// Post stage: small network quantities of a feed impedance: reflection coefficient and SWR.
#pragma once

#include <complex>

namespace wirefield::post {

using Complex = std::complex<double>;

// Reflection coefficient (Z - Z0) / (Z + Z0) against a real reference impedance.
Complex ReflectionCoefficient(Complex z_ohm, double z0_ohm);

// Standing-wave ratio (1 + |G|) / (1 - |G|); a very large finite number for a total
// reflection, so that output stays finite.
double Swr(Complex z_ohm, double z0_ohm);

// Return loss -20 log10 |G| in dB, capped at kMaxReturnLossDb for a perfect match.
inline constexpr double kMaxReturnLossDb = 99.0;
double ReturnLossDb(Complex z_ohm, double z0_ohm);

}  // namespace wirefield::post
