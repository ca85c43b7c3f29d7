// Study layer: the solve pipeline behind a Simulation, the one object that every study (solve,
// sweep, batch, tune, the mesh estimate) runs its solves through. Model -> geometry::Mesh and
// the near-field cache (once) -> per frequency: fill::AssembleImpedance (or a matrix filled
// elsewhere, as the sweep's interpolation gives it) -> loads, conductor loss and excitation ->
// solve::SolveDense (or solve::SolveReduced) -> post:: feed, load and segment results.
// Not part of the public API.
#pragma once

#include <Eigen/Dense>
#include <memory>
#include <string>
#include <vector>

#include "core/progress.hpp"
#include "fill/assemble.hpp"
#include "geometry/mesh.hpp"
#include "solve/reduced.hpp"
#include "wirefield/simulation.hpp"

namespace wirefield::study {

class Pipeline {
 public:
  // Meshes the model for options.max_frequency_hz (else the model's frequency) and builds the
  // near-field cache. Throws InputError for a bad frequency or option, and what the mesher
  // throws.
  Pipeline(Model model, SimulationOptions options);

  // The pipeline of a Simulation (the Simulation holds one).
  static const Pipeline& Of(const Simulation& simulation);

  const Model& model() const { return model_; }
  const SimulationOptions& options() const { return options_; }
  const geometry::Mesh& mesh() const { return mesh_; }
  const fill::NearFieldCache& near_field() const { return near_field_; }
  // Warnings of the parser and the mesher together.
  const std::vector<Warning>& warnings() const { return warnings_; }
  int unknowns() const { return static_cast<int>(mesh_.bases.size()); }
  // The model's frequency, or InputError naming the file when it has none.
  double DefaultFrequency() const;
  // The fill threads the options ask for (0 resolved to one per core).
  int FillThreads() const;

  // The antenna's own matrix at frequency_hz filled by `threads` threads (> 0), with progress
  // lines when the fill is long.
  Eigen::MatrixXcd Fill(double frequency_hz, int threads) const;
  // Fill, then SolveFilled; fill_threads 0 means one per core.
  SolveResult Solve(double frequency_hz, int fill_threads) const;
  // The solve from the antenna's own matrix z (as Fill returns it, or interpolated): adds the
  // loads and the conductor loss at frequency_hz, solves, and reports. fill_time_s is the time
  // already spent on z (reported as part of the fill time).
  //
  // reduced (optional): the solve first tries solve::SolveReduced in its span and keeps those
  // currents when they pass (the condition number reported is then reduced->condition_number);
  // else it solves densely. currents (optional) receives the currents; projected (optional)
  // says whether the reduced solve served.
  SolveResult SolveFilled(double frequency_hz, Eigen::MatrixXcd z, double fill_time_s,
                          const solve::ReducedSpace* reduced = nullptr,
                          Eigen::VectorXcd* currents = nullptr, bool* projected = nullptr) const;

 private:
  Model model_;
  SimulationOptions options_;
  geometry::Mesh mesh_;
  fill::NearFieldCache near_field_;  // frequency-independent part of the fill
  std::vector<Warning> warnings_;
};

// A progress reporter (core/progress.hpp) for the fill (counted: the fill says how far it
// is) or the factorisation (timed against expected_s) of a solve of `unknowns`; null when
// progress lines are off or the solve is expected to end before the first line is due.
std::unique_ptr<core::Progress> SolveStageProgress(int unknowns, const std::string& stage,
                                                   bool counted, double expected_s = 0.0);

}  // namespace wirefield::study
