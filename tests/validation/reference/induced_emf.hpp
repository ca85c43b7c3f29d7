// Validation reference: closed-form thin-dipole results (sine/cosine integrals, induced-EMF self
// and mutual impedance, short-dipole radiation resistance, half-wave directivity) that the
// moment-method solver is checked against. Test-only and independent of libmom: inputs are
// lengths in metres (or wavelengths where the name says so), outputs are ohms or plain numbers.
#pragma once

#include <complex>

namespace wirefield::reference {

// Free-space wave impedance mu0 c with mu0 = 4 pi 1e-7 H/m and c = 299 792 458 m/s (SI); kept
// here rather than taken from libmom so that the reference stays independent of the solver.
inline constexpr double kEta0_ohm = 4.0e-7 * 3.14159265358979323846 * 299792458.0;
// The rounded value 120 pi ohm that many textbooks use in place of eta0.
inline constexpr double kEta120Pi_ohm = 120.0 * 3.14159265358979323846;

// Returns the sine integral Si(x) = integral_0^x sin(t)/t dt for any finite x (odd in x).
// Throws std::invalid_argument for NaN or infinite x.
double SineIntegral(double x);

// Returns the cosine integral Ci(x) = C_E + ln x + integral_0^x (cos t - 1)/t dt for finite
// x > 0. Throws std::invalid_argument otherwise (Ci is singular at 0 and complex below it).
double CosineIntegral(double x);

// Returns the entire cosine integral Cin(x) = integral_0^x (1 - cos t)/t dt = C_E + ln x - Ci(x)
// for finite x >= 0. Throws std::invalid_argument otherwise.
double EntireCosineIntegral(double x);

// Returns the induced-EMF (Carter) self impedance of a centre-fed straight dipole of total length
// length_m and wire radius radius_m at wavelength_m, with a sinusoidal current, referred to the
// current maximum. eta_ohm is the medium's wave impedance. Throws std::invalid_argument unless
// all lengths are positive and finite and radius_m < length_m / 2.
// Precision: the resistance is a difference of O(1) terms that shrinks as (k l)^4, so for short
// dipoles rounding grows. Measured against a 50-digit evaluation of the same formula, the gap
// resistance is off by 2e-14 relative at l = 0.1 lambda, 4e-13 at 0.05, 6e-11 at 0.02, 1.6e-9 at
// 0.01, 7e-7 at 0.002 and 1e-5 at 0.001 lambda. Below 0.01 lambda use
// ShortDipoleRadiationResistance_ohm instead.
std::complex<double> DipoleImpedanceAtCurrentMaximum_ohm(double length_m, double radius_m,
                                                         double wavelength_m,
                                                         double eta_ohm = kEta0_ohm);

// Returns the same dipole's impedance at its centre gap, Z_m / sin^2(k length / 2). Throws
// std::invalid_argument as above, and when the length is within 1e-6 wavelength of a whole
// number of wavelengths (the sinusoidal current vanishes at the gap there).
std::complex<double> DipoleInputImpedance_ohm(double length_m, double radius_m, double wavelength_m,
                                              double eta_ohm = kEta0_ohm);

// Returns the mutual impedance of two parallel, side-by-side (not staggered) half-wave dipoles
// spaced spacing_m apart, referred to their current maxima (= their gaps). Throws
// std::invalid_argument unless spacing_m and wavelength_m are positive and finite.
std::complex<double> MutualImpedanceParallelHalfWave_ohm(double spacing_m, double wavelength_m,
                                                         double eta_ohm = kEta0_ohm);

// Returns the gap impedance of a horizontal half-wave dipole at height_m over a perfectly
// conducting ground: Z11 - Z21(2 height_m) by image theory (the image current is in
// antiphase). Z11 uses the induced-EMF formula, whose radius term vanishes at a half wave.
// Throws std::invalid_argument unless height_m and wavelength_m are positive and finite.
std::complex<double> HalfWaveDipoleOverPerfectGround_ohm(double height_m, double wavelength_m,
                                                         double eta_ohm = kEta0_ohm);

// Returns the radiation resistance (2 pi / 3) eta (l / lambda)^2 of a Hertzian (uniform-current)
// dipole; with eta = 120 pi this is 80 pi^2 (l / lambda)^2. Throws std::invalid_argument unless
// the inputs are positive and finite.
double HertzianDipoleRadiationResistance_ohm(double length_m, double wavelength_m,
                                             double eta_ohm = kEta0_ohm);

// Returns the radiation resistance (pi / 6) eta (l / lambda)^2 of a short centre-fed dipole with a
// triangular current, a quarter of the Hertzian value; with eta = 120 pi this is
// 20 pi^2 (l / lambda)^2. Throws std::invalid_argument unless the inputs are positive and finite.
double ShortDipoleRadiationResistance_ohm(double length_m, double wavelength_m,
                                          double eta_ohm = kEta0_ohm);

// Returns the directivity (a power ratio) of a half-wave dipole with a sinusoidal current,
// 4 / Cin(2 pi).
double HalfWaveDipoleDirectivity();

// Returns a power ratio in decibels, 10 log10(ratio). Throws std::invalid_argument unless the
// ratio is positive and finite.
double PowerRatioToDecibels(double ratio);

// Returns the dipole length, in wavelengths, at which the induced-EMF gap reactance crosses zero
// (the first resonance) for a wire of radius radius_wavelengths (in wavelengths), searched in
// [0.40, 0.50] wavelength with Boost's TOMS 748 root finder to 1e-12 wavelength. Throws
// std::invalid_argument unless 0 < radius_wavelengths <= 0.01, or if no crossing is bracketed.
double ResonantLengthWavelengths(double radius_wavelengths, double eta_ohm = kEta0_ohm);

}  // namespace wirefield::reference
