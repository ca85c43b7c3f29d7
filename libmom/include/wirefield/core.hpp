// wirefield public API: the few names every other header and stage shares: the complex type
// of phasors and impedances, and the default reference impedance of SWR and reflection.
#pragma once

#include <complex>

namespace wirefield {

// A phasor or an impedance (ohm), a current (A) or a voltage (V) at one frequency.
using Complex = std::complex<double>;

// The reference impedance Z0 of SWR, return loss and Touchstone files when a model or an
// option names none: 50 ohm, the usual coaxial feed line (common practice).
inline constexpr double kDefaultZ0Ohm = 50.0;

}  // namespace wirefield
