// Network stage: reflection quantities of an impedance against a real reference impedance:
// reflection coefficient, SWR, return loss and mismatch loss. Inputs: Z and Z0 in ohm;
// outputs: plain ratios and dB, always finite (capped for a total reflection or a perfect match).
#pragma once

#include <complex>

#include "wirefield/core.hpp"

namespace wirefield::network {

// SWR reported for a total reflection (|G| = 1): larger than any measurable value.
inline constexpr double kSwrCap = 1e9;
// Return loss and mismatch loss are capped here: 99 dB is a perfect match for every
// practical purpose (a |G| of 1e-5), and a total reflection has an infinite mismatch loss.
inline constexpr double kLossCap_db = 99.0;

// (Z - Z0) / (Z + Z0).
Complex ReflectionCoefficient(Complex z_ohm, double z0_ohm);
// (1 + |G|) / (1 - |G|), at most kSwrCap.
double SwrFromMagnitude(double gamma_magnitude);
// |G| = (SWR - 1) / (SWR + 1).
double MagnitudeFromSwr(double swr);
// -20 log10 |G|, at most kLossCap_db.
double ReturnLossDb(double gamma_magnitude);
// -10 log10 (1 - |G|^2), at most kLossCap_db.
double MismatchLossDb(double gamma_magnitude);

}  // namespace wirefield::network
