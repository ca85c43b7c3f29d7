// API: the library's own access to a Simulation's stages (its mesh and near-field cache, and a
// solve from a matrix filled elsewhere), for the sweep's matrix interpolation. Not part of the
// public API: the header lives beside the code that uses it.
#pragma once

#include <Eigen/Dense>

#include "fill/assemble.hpp"
#include "geometry/mesh.hpp"
#include "wirefield/simulation.hpp"

namespace wirefield {

struct SimulationAccess {
  static const geometry::Mesh& Mesh(const Simulation& simulation);
  static const fill::NearFieldCache& NearField(const Simulation& simulation);
  // The fill threads the Simulation's options ask for (0 resolved to one per core).
  static int FillThreads(const Simulation& simulation);
  // Solve() from the antenna's own matrix z (as fill::AssembleImpedance returns it, or
  // interpolated): adds the loads and the conductor loss at frequency_hz, solves, and reports.
  // fill_time_s is the time already spent on z (reported as part of the fill time).
  static SolveResult SolveFilled(const Simulation& simulation, double frequency_hz,
                                 Eigen::MatrixXcd z, double fill_time_s);
};

}  // namespace wirefield
