// Post stage: the far field, gain, pattern and power budget of a solved model
// (wirefield/pattern.hpp's FarField and ComputePattern, from the model and its solve instead of
// the Simulation). The model gives the ground and the file named in warnings; the solve gives
// the segment currents, the frequency, and the feed and load powers.
#pragma once

#include "wirefield/model.hpp"
#include "wirefield/pattern.hpp"
#include "wirefield/simulation.hpp"

namespace wirefield::post {

// The far field and gains in one direction (wirefield::FarField).
FarFieldPoint FarField(const Model& model, const SolveResult& solved, double elevation_deg,
                       double azimuth_deg);

// The pattern search, cuts, figures of merit and power budget (wirefield::ComputePattern).
// Throws InputError for options out of range, ComputationError when no power enters the feeds.
PatternResult ComputePattern(const Model& model, const SolveResult& solved,
                             const PatternOptions& options);

}  // namespace wirefield::post
