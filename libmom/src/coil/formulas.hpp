// Coil stage: the published formulas behind wirefield/coil.hpp, one function each, so the
// tests can check each against its source. Inputs are SI numbers (metres, counts); outputs
// are SI (henry, farad) or plain coefficients. Sources are named beside each function and in
// docs/numerics.md, "Coils".
#pragma once

namespace wirefield::coil {

// Nagaoka's coefficient K_N of a current sheet of diameter D and length l, exact, from the
// complete elliptic integrals K(k), E(k) of modulus k = D / sqrt(D^2 + l^2), k' = l / sqrt(..):
//   K_N = 4 / (3 pi k') [ (k'^2 / k^2) (K - E) + E - k ]
// (Jahnke & Emde, Tables of Functions, 4th ed., pp. 86-89; Nagaoka 1909). Boost.Math ellint.
double NagaokaCoefficient(double diameter_m, double length_m);

// Lundin's closed-form approximation to K_N (Proc. IEEE 73(9), 1985, pp. 1428-1429), a
// few ppm from the exact value; kept to cross-check the exact form.
double LundinNagaokaCoefficient(double diameter_m, double length_m);

// Current-sheet inductance mu0 pi r^2 N^2 K_N / l (henry), r = D / 2.
double SheetInductance_h(double turns, double diameter_m, double length_m);

// Rosa's round-wire correction (henry), to be subtracted from the sheet inductance:
// mu0 r N (k_s + k_m), k_s = 5/4 - ln(2 p / d), k_m ~ ln(2 pi) - 3/2 - ln N / (6 N) - 0.3308 / N
// (Rosa, Bull. Bureau of Standards 2, 1906; the combined form as in a published review of
// solenoid inductance formulas). d is the bare wire diameter.
double RosaCorrection_h(double turns, double diameter_m, double pitch_m, double wire_diameter_m);

// Wheeler's formula (Proc. IRE 16(10), 1928): L(uH) = D^2 N^2 / (18 D + 40 l), D and l in
// inches; returned in henry.
double WheelerInductance_h(double turns, double diameter_m, double length_m);

// Medhurst's H (pF per cm of diameter) for a coil of length / diameter ratio
// length_over_diameter, linearly interpolated in his table (Wireless Engineer 24, 1947).
// The table spans l/D = 0.1 to 50; outside it the end value is used and *outside (if given)
// is set.
double MedhurstH_pf_per_cm(double length_over_diameter, bool* outside = nullptr);

// Medhurst's proximity factor Phi = R_coil / R_straight at high frequency, bilinearly
// interpolated in his table against l/D (0 to infinity) and d/p (0 to 1), same paper.
double MedhurstProximityFactor(double length_over_diameter, double wire_over_pitch);

}  // namespace wirefield::coil
