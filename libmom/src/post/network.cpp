// Post stage: reflection coefficient and SWR of an impedance against a reference.
#include "post/network.hpp"

#include <algorithm>
#include <cmath>

namespace wirefield::post {

// SWR reported for a total reflection (|G| = 1): larger than any measurable value.
constexpr double kSwrCap = 1e9;

Complex ReflectionCoefficient(Complex z_ohm, double z0_ohm) {
  return (z_ohm - z0_ohm) / (z_ohm + z0_ohm);
}

double Swr(Complex z_ohm, double z0_ohm) {
  const double g = std::abs(ReflectionCoefficient(z_ohm, z0_ohm));
  if (!std::isfinite(g) || g >= 1.0) return kSwrCap;
  return std::min((1.0 + g) / (1.0 - g), kSwrCap);
}

double ReturnLossDb(Complex z_ohm, double z0_ohm) {
  const double g = std::abs(ReflectionCoefficient(z_ohm, z0_ohm));
  if (!std::isfinite(g)) return 0.0;
  if (g <= std::pow(10.0, -kMaxReturnLossDb / 20.0)) return kMaxReturnLossDb;
  return -20.0 * std::log10(g);
}

}  // namespace wirefield::post
