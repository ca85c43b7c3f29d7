// Core: physical constants (SI) with their sources.
#pragma once

#include <numbers>

namespace wirefield::core {

inline constexpr double kPi = std::numbers::pi;
// Speed of light in vacuum, exact by definition of the metre (SI, 1983).
inline constexpr double kSpeedOfLight_m_per_s = 299792458.0;
// Vacuum permeability; 4 pi 1e-7 H/m (exact before the 2019 SI redefinition, and equal to
// the CODATA 2018 value to 1e-10 relative, far below anything wirefield resolves).
inline constexpr double kMu0_h_per_m = 4.0e-7 * kPi;
// Vacuum permittivity from 1 / (mu0 c^2).
inline constexpr double kEps0_f_per_m =
    1.0 / (kMu0_h_per_m * kSpeedOfLight_m_per_s * kSpeedOfLight_m_per_s);
// Free-space wave impedance mu0 c = 376.730 ohm.
inline constexpr double kEta0_ohm = kMu0_h_per_m * kSpeedOfLight_m_per_s;

}  // namespace wirefield::core
