// API: the far field and pattern of a Simulation's solve (wirefield/pattern.hpp): the model it
// meshed and the solve, handed to the post stage (post/pattern.cpp).
#include "wirefield/pattern.hpp"

#include "post/pattern.hpp"

namespace wirefield {

FarFieldPoint FarField(const Simulation& simulation, const SolveResult& solved,
                       double elevation_deg, double azimuth_deg) {
  return post::FarField(simulation.model(), solved, elevation_deg, azimuth_deg);
}

PatternResult ComputePattern(const Simulation& simulation, const SolveResult& solved,
                             const PatternOptions& options) {
  return post::ComputePattern(simulation.model(), solved, options);
}

}  // namespace wirefield
