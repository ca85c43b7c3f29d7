// API: the library's own access to a Simulation's stages (its mesh and near-field cache, and a
// solve from a matrix filled elsewhere), for the sweep's matrix interpolation. Not part of the
// public API: the header lives beside the code that uses it.
#pragma once

#include <Eigen/Dense>
#include <memory>
#include <string>

#include "core/progress.hpp"
#include "fill/assemble.hpp"
#include "geometry/mesh.hpp"
#include "wirefield/simulation.hpp"

namespace wirefield {

struct SimulationAccess {
  static const geometry::Mesh& Mesh(const Simulation& simulation);
  static const fill::NearFieldCache& NearField(const Simulation& simulation);
  static const SimulationOptions& Options(const Simulation& simulation);
  // The fill threads the Simulation's options ask for (0 resolved to one per core).
  static int FillThreads(const Simulation& simulation);
  // Solve() from the antenna's own matrix z (as fill::AssembleImpedance returns it, or
  // interpolated): adds the loads and the conductor loss at frequency_hz, solves, and reports.
  // fill_time_s is the time already spent on z (reported as part of the fill time).
  //
  // reduced (optional): currents of nearby frequencies as orthonormal columns. The solve then
  // first tries the least-squares currents in their span, min |Z Q y - V|, and keeps them when
  // their relative residual |Z I - V| / |V| is at most reduced->max_relative_residual (the
  // condition number reported is then reduced->condition_number, that of the dense solves the
  // columns came from); else it solves densely. currents (optional) receives the currents;
  // projected (optional) says whether the reduced solve served.
  struct ReducedSpace {
    Eigen::MatrixXcd basis;
    double max_relative_residual = 0.0;
    double condition_number = 0.0;
  };
  static SolveResult SolveFilled(const Simulation& simulation, double frequency_hz,
                                 Eigen::MatrixXcd z, double fill_time_s,
                                 const ReducedSpace* reduced = nullptr,
                                 Eigen::VectorXcd* currents = nullptr, bool* projected = nullptr);
};

// A progress reporter (core/progress.hpp) for the fill (counted: the fill says how far it
// is) or the factorisation (timed against expected_s) of a solve of `unknowns`; null when
// progress lines are off or the solve is expected to end before the first line is due.
std::unique_ptr<core::Progress> SolveStageProgress(int unknowns, const std::string& stage,
                                                   bool counted, double expected_s = 0.0);

}  // namespace wirefield
