// Study layer: the public Simulation, a face of the solve pipeline (study/pipeline.hpp) that
// meshes a Model once and solves it at any frequency, and the solve-cost estimate.
#include "wirefield/simulation.hpp"

#include <fmt/format.h>

#include "core/parallel.hpp"
#include "core/progress.hpp"
#include "solve/blas_threads.hpp"
#include "study/pipeline.hpp"
#include "wirefield/version.hpp"

namespace wirefield {

struct Simulation::Impl {
  study::Pipeline pipeline;
};

Simulation::Simulation(Model model, SimulationOptions options)
    : impl_(std::make_unique<Impl>(Impl{study::Pipeline(std::move(model), options)})) {}

Simulation::~Simulation() = default;
Simulation::Simulation(Simulation&&) noexcept = default;
Simulation& Simulation::operator=(Simulation&&) noexcept = default;

const study::Pipeline& study::Pipeline::Of(const Simulation& simulation) {
  return simulation.impl_->pipeline;
}

double Simulation::DefaultFrequency() const { return impl_->pipeline.DefaultFrequency(); }

SolveResult Simulation::Solve(double frequency_hz) const {
  return Solve(frequency_hz, impl_->pipeline.options().fill_threads);
}

SolveResult Simulation::Solve(double frequency_hz, int fill_threads) const {
  return impl_->pipeline.Solve(frequency_hz, fill_threads);
}

namespace {
// Factors of the solve-cost estimate, measured on the project's 2-core machine (quiet, load
// below 1; docs/performance.md, "Cost of a large solve"): `solve --no-mesh-estimate` of a
// straight dipole of 4000 and 6000 unknowns filled in 0.4-0.9 s and 2.0 s on two threads
// (50-110 ns per entry and thread: the matrix outgrows the cache), and factorised (zsytrf,
// zsycon, zsytrs and the checks, both cores) in 1.4-1.5 s and 4.0 s, 3.7e-11 to 4.5e-11
// core-seconds per n^3.
constexpr double kFillSecondsPerEntry = 100e-9;
constexpr double kFactorCoreSecondsPerCube = 4.2e-11;

}  // namespace

SolveCostEstimate EstimateSolveCost(int unknowns, int threads) {
  SolveCostEstimate e;
  e.unknowns = unknowns;
  e.threads = core::ResolveThreads(threads);
  const double n = unknowns;
  e.matrix_bytes = 16.0 * n * n;
  e.fill_s = kFillSecondsPerEntry * n * n / e.threads;
  // The factorisation runs on the BLAS library's threads, one per core, whatever the fill's.
  e.factorisation_s = kFactorCoreSecondsPerCube * n * n * n / core::CoreCount();
  return e;
}

std::string LongSolveNotice(int unknowns, int threads) {
  const core::ProgressSettings settings = core::ProgressFromEnvironment();
  if (!settings.estimates) return {};
  const SolveCostEstimate e = EstimateSolveCost(unknowns, threads);
  if (e.total_s() < settings.after_s) return {};
  return fmt::format(
      "wirefield: {} unknowns: the matrix takes {:.3g} GB of memory; expect about {} for the "
      "fill and {} for the factorisation on {} cores (an estimate: n^2 and n^3 scaling "
      "calibrated on a 2-core 2.1 GHz machine; a busy or different machine takes more or less)",
      unknowns, e.matrix_bytes / 1e9, core::FormatDuration(e.fill_s),
      core::FormatDuration(e.factorisation_s), core::CoreCount());
}

const Model& Simulation::model() const { return impl_->pipeline.model(); }
int Simulation::unknowns() const { return impl_->pipeline.unknowns(); }
int Simulation::segments() const {
  return static_cast<int>(impl_->pipeline.mesh().segments.size());
}
const std::vector<WireMeshInfo>& Simulation::wire_mesh() const {
  return impl_->pipeline.mesh().wires;
}
const std::vector<Warning>& Simulation::warnings() const { return impl_->pipeline.warnings(); }

std::string Version() { return WIREFIELD_VERSION_STRING; }

bool ParkIdleBlasThreads() { return solve::ParkIdleBlasThreads(); }

}  // namespace wirefield
