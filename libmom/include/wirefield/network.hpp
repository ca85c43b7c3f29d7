// wirefield public API, part 5: the feed chain between an antenna feed and the transmitter
// (transformer, feed line) as exactly chained two-port (ABCD) networks, and the reflection
// quantities at the transmitter. Implemented in libmom/src/network/.
#pragma once

#include <complex>
#include <string>
#include <vector>

#include "wirefield/model.hpp"

namespace wirefield {

// What the transmitter sees through a feed's chain at one frequency, for the antenna
// impedance z_antenna_ohm at the feed terminals.
struct ChainResult {
  Complex transmitter_impedance_ohm;
  double swr = 1.0;                        // against z0_ohm
  double return_loss_db = 0.0;             // -20 log10 |Gamma|, capped at 99 dB for a perfect match
  double mismatch_loss_db = 0.0;           // -10 log10 (1 - |Gamma|^2)
  double transformer_loss_fraction = 0.0;  // of the power entering the chain
  double line_loss_fraction = 0.0;
  double antenna_power_fraction = 1.0;  // reaches the antenna terminals
};

// Evaluates the chain of model.feeds[feed_index] (its transformer and feed line, if any).
ChainResult EvaluateFeedChain(const Model& model, int feed_index, Complex z_antenna_ohm,
                              double frequency_hz, double z0_ohm);

// A cable of the built-in table (name, Z0, velocity factor, matched loss at two frequencies,
// source of the figures).
struct CableInfo {
  std::string name;
  double z0_ohm;
  double velocity_factor;
  double loss1_db_per_100m, loss1_frequency_hz;
  double loss2_db_per_100m, loss2_frequency_hz;
  std::string source;
};
const std::vector<CableInfo>& CableTable();

}  // namespace wirefield
