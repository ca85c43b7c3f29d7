// Network stage: the feed chain of one feed as ABCD two-ports, from the transmitter (port 1)
// to the antenna terminals (port 2): line, then the transformer's compensation C, leakage L,
// core (R || magnetizing L) and ideal turns ratio. Inputs: the specs, Z of the antenna,
// frequency, Z0; output: ChainResult. See docs/numerics.md, "Feed chain".
#pragma once

#include <string>

#include "network/abcd.hpp"
#include "wirefield/model.hpp"
#include "wirefield/network.hpp"

namespace wirefield::network {

// Magnetizing inductance of a transformer on its primary: magnetizing= as given, or
// A_L * P^2 from al= (A_L in nH/turn^2); empty for an ideal (infinite) inductance.
std::optional<double> MagnetizingInductanceH(const TransformerSpec& t);

// The transformer as one two-port at that frequency (transmitter side first):
// shunt jwC (compensation) * series jwL (leakage) * shunt 1/R + 1/(jwL_m) (core) * ideal n.
Abcd TransformerAbcd(const TransformerSpec& t, double frequency_hz);

// The transformer and the feed line at the feed of that name, or nullptr when it has none.
const TransformerSpec* FindTransformer(const Model& model, const std::string& feed);
const FeedLineSpec* FindFeedLine(const Model& model, const std::string& feed);

// The chain of a feed with an optional transformer and an optional line (nullptr: absent).
ChainResult EvaluateChain(const TransformerSpec* transformer, const FeedLineSpec* line,
                          Complex z_antenna_ohm, double frequency_hz, double z0_ohm);

}  // namespace wirefield::network
