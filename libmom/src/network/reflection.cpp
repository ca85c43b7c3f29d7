// Network stage: reflection coefficient, SWR, return loss and mismatch loss (see reflection.hpp).
#include "network/reflection.hpp"

#include <algorithm>
#include <cmath>

namespace wirefield::network {

Complex ReflectionCoefficient(Complex z_ohm, double z0_ohm) {
  return (z_ohm - z0_ohm) / (z_ohm + z0_ohm);
}

double SwrFromMagnitude(double g) {
  if (!std::isfinite(g) || g >= 1.0) return kSwrCap;
  return std::min((1.0 + g) / (1.0 - g), kSwrCap);
}

double MagnitudeFromSwr(double swr) { return (swr - 1.0) / (swr + 1.0); }

double ReturnLossDb(double g) {
  if (!(g > 0.0)) return kLossCap_db;
  return std::min(-20.0 * std::log10(g), kLossCap_db);
}

double MismatchLossDb(double g) {
  if (!std::isfinite(g) || g >= 1.0) return kLossCap_db;
  return std::min(-10.0 * std::log10(1.0 - g * g), kLossCap_db);
}

}  // namespace wirefield::network
