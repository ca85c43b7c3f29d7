// Conductor physics: the thin-coating series impedance of a dielectric jacket and the sum of
// skin effect and jacket along one wire. The formula and its limits are in coating.hpp and
// docs/numerics.md ("Insulated wire"). Inputs and outputs in SI.
#include "conductor/coating.hpp"

#include <fmt/format.h>

#include <cmath>

#include "conductor/wire_impedance.hpp"
#include "core/constants.hpp"

namespace wirefield::conductor {
namespace {

void Check(bool ok, double value, const char* what) {
  if (!ok || !std::isfinite(value)) {
    throw ComputationError(fmt::format("coating impedance: {}; got {}", what, value));
  }
}

}  // namespace

std::complex<double> CoatingImpedancePerMetre(double conductor_radius_m, double outer_radius_m,
                                              double relative_permittivity, double loss_tangent,
                                              double frequency_hz) {
  Check(conductor_radius_m > 0.0, conductor_radius_m, "the conductor radius must be positive");
  Check(outer_radius_m > conductor_radius_m, outer_radius_m,
        "the outer radius must exceed the conductor radius");
  Check(relative_permittivity >= 1.0, relative_permittivity,
        "the relative permittivity must be at least 1");
  Check(loss_tangent >= 0.0, loss_tangent, "the loss tangent must not be negative");
  Check(frequency_hz > 0.0, frequency_hz, "the frequency must be positive");
  const std::complex<double> eps(relative_permittivity, -relative_permittivity * loss_tangent);
  const double omega = 2.0 * core::kPi * frequency_hz;
  const double log_ratio = std::log(outer_radius_m / conductor_radius_m);
  const std::complex<double> j(0.0, 1.0);
  return j * (omega * core::kMu0_h_per_m / (2.0 * core::kPi) * log_ratio) * (1.0 - 1.0 / eps);
}

bool HasSeriesImpedance(const WireSpec& wire) {
  return wire.conductivity_s_per_m.has_value() || wire.insulation.has_value();
}

std::complex<double> SeriesImpedancePerMetre(const WireSpec& wire, double radius_m,
                                             double frequency_hz) {
  std::complex<double> z(0.0, 0.0);
  if (wire.conductivity_s_per_m) {
    z = WireImpedancePerMetre(radius_m, *wire.conductivity_s_per_m, wire.relative_permeability,
                              frequency_hz);
  }
  if (wire.insulation) {
    const InsulationSpec& jacket = *wire.insulation;
    z += CoatingImpedancePerMetre(radius_m, radius_m + jacket.thickness_m,
                                  jacket.relative_permittivity, jacket.loss_tangent, frequency_hz);
  }
  return z;
}

}  // namespace wirefield::conductor
