// Study layer: the solve pipeline (see pipeline.hpp). Model -> geometry::Mesh (once) -> per
// frequency: fill -> solve -> post results.
#include "study/pipeline.hpp"

#include <fmt/format.h>

#include <chrono>
#include <cmath>
#include <fstream>
#include <optional>

#include "core/parallel.hpp"
#include "post/results.hpp"
#include "solve/dense.hpp"

namespace wirefield::study {
namespace {

// Half the memory the system reports available, or 4 GiB when it does not say.
double DefaultMatrixBudgetBytes() {
  std::ifstream meminfo("/proc/meminfo");
  std::string key;
  double kib = 0.0;
  std::string unit;
  while (meminfo >> key >> kib >> unit) {
    if (key == "MemAvailable:") return 0.5 * kib * 1024.0;
  }
  return 4.0 * 1024.0 * 1024.0 * 1024.0;
}

double Seconds(std::chrono::steady_clock::time_point since) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - since).count();
}

// An InputError naming the model's file unless frequency_hz is positive and finite.
void CheckFrequency(const Model& model, double frequency_hz) {
  if (!(frequency_hz > 0.0) || !std::isfinite(frequency_hz)) {
    throw InputError({model.file, 0, 0},
                     fmt::format("the frequency must be positive, not {} Hz", frequency_hz));
  }
}

}  // namespace

Pipeline::Pipeline(Model model, SimulationOptions options)
    : model_(std::move(model)), options_(options) {
  const Model& m = model_;
  geometry::MeshOptions mo;
  if (options.max_frequency_hz) {
    mo.max_frequency_hz = *options.max_frequency_hz;
  } else {
    mo.max_frequency_hz = DefaultFrequency();
  }
  if (!(mo.max_frequency_hz > 0.0) || !std::isfinite(mo.max_frequency_hz)) {
    throw InputError({m.file, 0, 0}, "the frequency must be a positive number of hertz");
  }
  if (!(options.segments_per_wavelength > 0.0) || options.min_segments_per_wire < 1) {
    throw InputError({"options", 0, 0},
                     "segments_per_wavelength must be positive and min_segments_per_wire >= 1");
  }
  mo.segments_per_wavelength = options.segments_per_wavelength;
  mo.min_segments_per_wire = options.min_segments_per_wire;
  mo.max_matrix_bytes =
      options.max_matrix_bytes ? *options.max_matrix_bytes : DefaultMatrixBudgetBytes();
  mesh_ = geometry::BuildMesh(m, mo);
  near_field_ = fill::BuildNearFieldCache(mesh_, core::ResolveThreads(options.fill_threads));
  warnings_ = m.warnings;
  warnings_.insert(warnings_.end(), mesh_.warnings.begin(), mesh_.warnings.end());
}

double Pipeline::DefaultFrequency() const {
  if (!model_.frequency_hz) {
    throw InputError({model_.file, 0, 0},
                     "the model gives no frequency: add a line such as 'frequency 14.2MHz' or "
                     "give `max_frequency_hz` in the simulation options");
  }
  return *model_.frequency_hz;
}

int Pipeline::FillThreads() const { return core::ResolveThreads(options_.fill_threads); }

std::unique_ptr<core::Progress> SolveStageProgress(int unknowns, const std::string& stage,
                                                   bool counted, double expected_s) {
  const core::ProgressSettings settings = core::ProgressFromEnvironment();
  // No ticker thread for a solve that ends before its first line would be due.
  if (!settings.enabled || EstimateSolveCost(unknowns).total_s() < 0.5 * settings.after_s) {
    return nullptr;
  }
  return std::make_unique<core::Progress>(stage, counted ? 1.0 : 0.0, expected_s, settings);
}

Eigen::MatrixXcd Pipeline::Fill(double frequency_hz, int threads) const {
  const auto progress = SolveStageProgress(unknowns(), "fill", true);
  return fill::AssembleImpedance(mesh_, frequency_hz, near_field_, threads, progress.get());
}

SolveResult Pipeline::Solve(double frequency_hz, int fill_threads) const {
  CheckFrequency(model_, frequency_hz);
  const auto t0 = std::chrono::steady_clock::now();
  Eigen::MatrixXcd z = Fill(frequency_hz, core::ResolveThreads(fill_threads));
  return SolveFilled(frequency_hz, std::move(z), Seconds(t0));
}

SolveResult Pipeline::SolveFilled(double frequency_hz, Eigen::MatrixXcd z, double fill_time_s,
                                  const solve::ReducedSpace* reduced, Eigen::VectorXcd* currents,
                                  bool* projected) const {
  CheckFrequency(model_, frequency_hz);
  SolveResult r;
  r.frequency_hz = frequency_hz;
  r.unknowns = static_cast<int>(mesh_.bases.size());
  r.segments = static_cast<int>(mesh_.segments.size());

  auto t0 = std::chrono::steady_clock::now();
  fill::AddLoads(mesh_, model_, frequency_hz, &z);
  fill::AddConductorLoss(mesh_, model_, frequency_hz, &z);
  const Eigen::VectorXcd v = fill::AssembleExcitation(mesh_, model_);
  r.fill_time_s = fill_time_s + Seconds(t0);
  t0 = std::chrono::steady_clock::now();
  std::optional<solve::DenseSolution> from_reduced;
  if (reduced) from_reduced = solve::SolveReduced(z, v, *reduced);
  solve::DenseSolution sol;
  if (from_reduced) {
    sol = std::move(*from_reduced);
    r.condition_number = reduced->condition_number;
  } else {
    // The factorisation cannot say how far it is: its lines show the time against the
    // estimate.
    const double expected_s = EstimateSolveCost(r.unknowns).factorisation_s;
    const auto progress = SolveStageProgress(r.unknowns, "factorisation", false, expected_s);
    sol = solve::SolveDense(std::move(z), v);
    r.condition_number = 1.0 / sol.reciprocal_condition;  // SolveDense refuses rcond < 1e-14
  }
  if (projected) *projected = from_reduced.has_value();
  if (currents) *currents = sol.currents;
  r.solve_time_s = Seconds(t0);
  r.relative_residual = sol.relative_residual;

  r.feeds = post::FeedResults(model_, mesh_, sol.currents, frequency_hz);
  r.loads = post::LoadResults(model_, mesh_, sol.currents, frequency_hz);
  r.currents = post::SegmentCurrents(mesh_, sol.currents);
  r.wire_loss_w = post::WireLossW(model_, mesh_, r.currents, frequency_hz);
  return r;
}

}  // namespace wirefield::study
