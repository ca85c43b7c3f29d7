// Conductor physics: the series impedance per metre that a thin dielectric jacket adds along a
// wire (the thin-coating approximation), and the whole series impedance per metre of a wire
// (skin effect plus jacket) that the fill adds and the power budget charges. Inputs: radii,
// the jacket's permittivity and loss tangent, frequency (SI); output: ohm per metre, e^{jwt}.
#pragma once

#include <complex>

#include "wirefield/model.hpp"

namespace wirefield::conductor {

// Returns the series impedance per metre (ohm/m) of a thin dielectric coating from the
// conductor radius a to the outer radius b:
//   Z' = j w mu0 / (2 pi) (1 - 1/eps*) ln(b/a),   eps* = eps_r (1 - j tan d),
// the thin-coating approximation of Richmond and Newman, "Dielectric coated wire antennas",
// Radio Science 11(1), 1976 (from memory). It holds while the coating is thin against the
// wavelength in it and b/a is moderate (docs/numerics.md). Zero when eps_r is 1 and tan d 0;
// its real part (the jacket's loss) is positive for tan d > 0. Throws ComputationError unless
// 0 < a < b, eps_r >= 1, tan d >= 0 and the frequency is positive, all finite.
std::complex<double> CoatingImpedancePerMetre(double conductor_radius_m, double outer_radius_m,
                                              double relative_permittivity, double loss_tangent,
                                              double frequency_hz);

// True when the wire has a series impedance along it: a finite conductivity or a jacket.
bool HasSeriesImpedance(const WireSpec& wire);

// Returns the series impedance per metre (ohm/m) of the wire at a conductor radius radius_m:
// the skin-effect impedance (wire_impedance.hpp) when the conductor is lossy plus the jacket's
// coating impedance when it is insulated (outer radius radius_m + thickness); 0 when neither.
std::complex<double> SeriesImpedancePerMetre(const WireSpec& wire, double radius_m,
                                             double frequency_hz);

}  // namespace wirefield::conductor
