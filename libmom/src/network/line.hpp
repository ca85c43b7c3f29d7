// Network stage: the feed-line model. Matched loss given at one or two frequencies is fitted
// as alpha(f) = a sqrt(f) + b f (model/line_loss.hpp); beta = 2 pi f / (vf c);
// Z0 is taken as real. Inputs: a FeedLineSpec and a frequency; outputs: gamma and the line's
// ABCD matrix. See docs/numerics.md, "Feed chain".
#pragma once

#include <complex>

#include "model/line_loss.hpp"
#include "network/abcd.hpp"
#include "wirefield/model.hpp"

namespace wirefield::network {

// The loss fit is the model stage's (model/line_loss.hpp), known here by its old names too.
using model::AttenuationNepersPerMetre;
using model::DbPerNeper;
using model::FitLoss;
using model::FitLossSqrt;
using model::LossFit;
using model::NepersPerMetre;

// gamma = alpha + j beta at that frequency, 1/m.
Complex PropagationConstant(const FeedLineSpec& line, double frequency_hz);
// The line as a two-port at that frequency (real Z0).
Abcd LineAbcd(const FeedLineSpec& line, double frequency_hz);

}  // namespace wirefield::network
