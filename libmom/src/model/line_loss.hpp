// Model stage: the loss of a feed line as a function of frequency, fitted to the matched loss
// a `line` statement (or a cable of the built-in table) gives at one or two frequencies:
// alpha(f) = a sqrt(f) + b f (conductor plus dielectric loss, Np/m). Pure arithmetic on the
// given figures: the parser warns with it where a fit misses them, the network stage (the
// line's two-port, network/line.hpp) evaluates it. See docs/numerics.md, "Feed chain".
#pragma once

#include "wirefield/model.hpp"

namespace wirefield::model {

// dB of matched loss per neper: 20 / ln 10 = 8.686 (REFERENCES §5, "matched-line loss").
double DbPerNeper();
// Matched loss in dB per 100 m to attenuation constant in Np/m.
double NepersPerMetre(double db_per_100m);

// alpha(f) = a sqrt(f) + b f in Np/m, with a, b >= 0.
struct LossFit {
  double a_np_per_m_per_sqrt_hz = 0.0;
  double b_np_per_m_per_hz = 0.0;
  // True when the fit passes through both given points. When the figures grow more slowly
  // than sqrt(f) (or faster than f) between the two frequencies, no fit with a, b >= 0 passes
  // through both; the fit then keeps only the sqrt(f) (or the f) term, scaled to the least
  // squared relative misfit, and worst_misfit says by how much it misses a point (0.1 = 10%).
  bool exact = true;
  double worst_misfit = 0.0;
};

// Fits loss given at two frequencies (dB per 100 m; both zero or both positive, f1 != f2).
LossFit FitLoss(double loss1_db_per_100m, double f1_hz, double loss2_db_per_100m, double f2_hz);
// Fits loss given at one frequency as growing with sqrt(f).
LossFit FitLossSqrt(double loss_db_per_100m, double f_hz);
// The fit of a line statement (one, two or no loss points).
LossFit FitLoss(const FeedLineSpec& line);

double AttenuationNepersPerMetre(const LossFit& fit, double frequency_hz);

}  // namespace wirefield::model
