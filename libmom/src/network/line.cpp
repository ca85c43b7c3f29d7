// Network stage: a feed line's propagation constant and ABCD matrix (see line.hpp).
#include "network/line.hpp"

#include <cmath>

#include "core/constants.hpp"

namespace wirefield::network {

Complex PropagationConstant(const FeedLineSpec& line, double frequency_hz) {
  const double alpha = AttenuationNepersPerMetre(FitLoss(line), frequency_hz);
  const double beta =
      2.0 * core::kPi * frequency_hz / (line.velocity_factor * core::kSpeedOfLight_m_per_s);
  return Complex{alpha, beta};
}

Abcd LineAbcd(const FeedLineSpec& line, double frequency_hz) {
  return TransmissionLine(PropagationConstant(line, frequency_hz), Complex{line.z0_ohm, 0.0},
                          line.length_m);
}

}  // namespace wirefield::network
