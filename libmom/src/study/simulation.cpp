// API: the Simulation class, the one place that sees every stage. Model -> geometry::Mesh
// (once) -> per frequency: fill::Assemble -> solve::SolveDense -> feed, load and segment
// results.
#include "wirefield/simulation.hpp"

#include <fmt/format.h>

#include <chrono>
#include <cmath>
#include <fstream>
#include <sstream>

#include "study/pipeline.hpp"
#include "core/constants.hpp"
#include "core/parallel.hpp"
#include "core/progress.hpp"
#include "fill/assemble.hpp"
#include "fill/conductor.hpp"
#include "geometry/mesh.hpp"
#include "network/chain.hpp"
#include "network/reflection.hpp"
#include "post/network.hpp"
#include "solve/blas_threads.hpp"
#include "solve/dense.hpp"
#include "wirefield/network.hpp"

namespace wirefield {
namespace {

constexpr double kDefaultZ0Ohm = 50.0;

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

Complex PortCurrent(const geometry::Port& port, const Eigen::VectorXcd& currents) {
  Complex i = 0.0;
  for (const auto& [b, sign] : port.bases) i += sign * currents(b);
  return i;
}

}  // namespace

struct Simulation::Impl {
  Model model;
  SimulationOptions options;
  geometry::Mesh mesh;
  fill::NearFieldCache near_field;  // frequency-independent part of the fill
  std::vector<Warning> warnings;
};

Simulation::Simulation(Model model, SimulationOptions options) : impl_(std::make_unique<Impl>()) {
  impl_->model = std::move(model);
  impl_->options = options;
  const Model& m = impl_->model;
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
  impl_->mesh = geometry::BuildMesh(m, mo);
  impl_->near_field = fill::BuildNearFieldCache(
      impl_->mesh, options.fill_threads > 0 ? options.fill_threads : core::CoreCount());
  impl_->warnings = m.warnings;
  impl_->warnings.insert(impl_->warnings.end(), impl_->mesh.warnings.begin(),
                         impl_->mesh.warnings.end());
}

Simulation::~Simulation() = default;
Simulation::Simulation(Simulation&&) noexcept = default;
Simulation& Simulation::operator=(Simulation&&) noexcept = default;

double Simulation::DefaultFrequency() const {
  const Model& m = impl_->model;
  if (!m.frequency_hz) {
    throw InputError({m.file, 0, 0},
                     "the model gives no frequency: add a line such as 'frequency 14.2MHz' or "
                     "pass --freq");
  }
  return *m.frequency_hz;
}

SolveResult Simulation::Solve(double frequency_hz) const {
  return Solve(frequency_hz, impl_->options.fill_threads);
}

namespace {

// An InputError naming the model's file unless frequency_hz is positive and finite.
void CheckFrequency(const Model& model, double frequency_hz) {
  if (!(frequency_hz > 0.0) || !std::isfinite(frequency_hz)) {
    throw InputError({model.file, 0, 0},
                     fmt::format("the frequency must be positive, not {} Hz", frequency_hz));
  }
}

// A fill-thread count with 0 (or less) meaning one per core.
int ResolveFillThreads(int asked) { return asked > 0 ? asked : core::CoreCount(); }

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
  e.threads = ResolveFillThreads(threads);
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

std::unique_ptr<core::Progress> SolveStageProgress(int unknowns, const std::string& stage,
                                                   bool counted, double expected_s) {
  const core::ProgressSettings settings = core::ProgressFromEnvironment();
  // No ticker thread for a solve that ends before its first line would be due.
  if (!settings.enabled || EstimateSolveCost(unknowns).total_s() < 0.5 * settings.after_s) {
    return nullptr;
  }
  return std::make_unique<core::Progress>(stage, counted ? 1.0 : 0.0, expected_s, settings);
}

SolveResult Simulation::Solve(double frequency_hz, int fill_threads) const {
  const geometry::Mesh& mesh = impl_->mesh;
  CheckFrequency(impl_->model, frequency_hz);
  const auto t0 = std::chrono::steady_clock::now();
  Eigen::MatrixXcd z;
  {
    const auto progress = SolveStageProgress(unknowns(), "fill", true);
    z = fill::AssembleImpedance(mesh, frequency_hz, impl_->near_field,
                                ResolveFillThreads(fill_threads), progress.get());
  }
  return SimulationAccess::SolveFilled(*this, frequency_hz, std::move(z), Seconds(t0));
}

const geometry::Mesh& SimulationAccess::Mesh(const Simulation& simulation) {
  return simulation.impl_->mesh;
}

const fill::NearFieldCache& SimulationAccess::NearField(const Simulation& simulation) {
  return simulation.impl_->near_field;
}

const SimulationOptions& SimulationAccess::Options(const Simulation& simulation) {
  return simulation.impl_->options;
}

int SimulationAccess::FillThreads(const Simulation& simulation) {
  return ResolveFillThreads(simulation.impl_->options.fill_threads);
}

SolveResult SimulationAccess::SolveFilled(const Simulation& simulation, double frequency_hz,
                                          Eigen::MatrixXcd z, double fill_time_s,
                                          const ReducedSpace* reduced, Eigen::VectorXcd* currents,
                                          bool* projected) {
  const Model& model = simulation.impl_->model;
  const geometry::Mesh& mesh = simulation.impl_->mesh;
  CheckFrequency(model, frequency_hz);
  SolveResult r;
  r.frequency_hz = frequency_hz;
  r.unknowns = static_cast<int>(mesh.bases.size());
  r.segments = static_cast<int>(mesh.segments.size());

  auto t0 = std::chrono::steady_clock::now();
  fill::AddLoads(mesh, model, frequency_hz, &z);
  fill::AddConductorLoss(mesh, model, frequency_hz, &z);
  const Eigen::VectorXcd v = fill::AssembleExcitation(mesh, model);
  r.fill_time_s = fill_time_s + Seconds(t0);
  t0 = std::chrono::steady_clock::now();
  solve::DenseSolution sol;
  bool from_reduced = false;
  if (reduced && reduced->basis.cols() > 0 && v.norm() > 0.0) {
    const Eigen::MatrixXcd zq = z * reduced->basis;
    const Eigen::VectorXcd y = zq.householderQr().solve(v);
    // Products with the few columns of the basis through Eigen's own kernel (lazyProduct), not
    // BLAS: under the address sanitizer, OpenBLAS 0.3.21's zgemv_n kernel for this processor
    // (Cooper Lake) read an unmapped address on these narrow matrices in 7 of 16 runs of a
    // 5000-point sweep of a dipole; with Eigen's kernel 0 of 15.
    const double residual = (zq.lazyProduct(y) - v).norm() / v.norm();
    if (residual <= reduced->max_relative_residual && y.allFinite()) {
      sol.currents = reduced->basis.lazyProduct(y);
      sol.relative_residual = residual;
      r.condition_number = reduced->condition_number;
      from_reduced = true;
    }
  }
  if (!from_reduced) {
    // The factorisation cannot say how far it is: its lines show the time against the
    // estimate.
    const double expected_s = EstimateSolveCost(r.unknowns).factorisation_s;
    const auto progress = SolveStageProgress(r.unknowns, "factorisation", false, expected_s);
    sol = solve::SolveDense(std::move(z), v);
    r.condition_number = 1.0 / sol.reciprocal_condition;  // SolveDense refuses rcond < 1e-14
  }
  if (projected) *projected = from_reduced;
  if (currents) *currents = sol.currents;
  r.solve_time_s = Seconds(t0);
  r.relative_residual = sol.relative_residual;

  const double z0 = model.z0_ohm.value_or(kDefaultZ0Ohm);
  for (size_t f = 0; f < model.feeds.size(); ++f) {
    FeedResult fr;
    fr.name = model.feeds[f].name;
    fr.voltage_v = model.feeds[f].voltage_v;
    fr.current_a = PortCurrent(mesh.feed_ports[f], sol.currents);
    if (std::abs(fr.current_a) == 0.0) {
      throw ComputationError(fmt::format("feed '{}' carries no current", fr.name));
    }
    fr.impedance_ohm = fr.voltage_v / fr.current_a;
    fr.z0_ohm = z0;
    // What the transmitter sees through the feed's transformer and line (if any).
    const ChainResult chain =
        EvaluateFeedChain(model, static_cast<int>(f), fr.impedance_ohm, frequency_hz, z0);
    fr.transmitter_impedance_ohm = chain.transmitter_impedance_ohm;
    fr.swr = chain.swr;
    fr.return_loss_db = chain.return_loss_db;
    fr.transformer_loss_fraction = chain.transformer_loss_fraction;
    fr.line_loss_fraction = chain.line_loss_fraction;
    fr.power_w = 0.5 * std::real(fr.voltage_v * std::conj(fr.current_a));
    // At the antenna terminals, and the chain's power balance at the solved excitation.
    fr.antenna_swr =
        network::SwrFromMagnitude(std::abs(network::ReflectionCoefficient(fr.impedance_ohm, z0)));
    fr.has_transformer = network::FindTransformer(model, fr.name) != nullptr;
    fr.has_line = network::FindFeedLine(model, fr.name) != nullptr;
    fr.transmitter_power_w = chain.antenna_power_fraction != 0.0
                                 ? fr.power_w / chain.antenna_power_fraction
                                 : fr.power_w;
    fr.line_loss_w = fr.transmitter_power_w * chain.line_loss_fraction;
    fr.transformer_loss_w = fr.transmitter_power_w * chain.transformer_loss_fraction;
    r.feeds.push_back(fr);
  }
  for (size_t l = 0; l < model.loads.size(); ++l) {
    LoadResult lr;
    lr.name = model.loads[l].name;
    lr.impedance_ohm = fill::LoadImpedance(model.loads[l], frequency_hz, &lr.open);
    lr.current_a = PortCurrent(mesh.load_ports[l], sol.currents);
    lr.voltage_v = lr.current_a * lr.impedance_ohm;
    lr.power_w = 0.5 * std::norm(lr.current_a) * std::real(lr.impedance_ohm);
    r.loads.push_back(lr);
  }
  // Segment end currents: each piece carries alpha + beta t times its basis current.
  std::vector<Complex> at_start(mesh.segments.size(), 0.0), at_end(mesh.segments.size(), 0.0);
  for (size_t b = 0; b < mesh.bases.size(); ++b) {
    const geometry::Basis& basis = mesh.bases[b];
    for (int p = 0; p < basis.piece_count; ++p) {
      const geometry::Piece& piece = basis.pieces[p];
      at_start[piece.segment] += piece.alpha() * sol.currents(b);
      at_end[piece.segment] += (piece.alpha() + piece.beta()) * sol.currents(b);
    }
  }
  for (size_t s = 0; s < mesh.segments.size(); ++s) {
    const geometry::Segment& seg = mesh.segments[s];
    SegmentCurrent c;
    c.wire = seg.wire;
    c.start_m = {seg.start.x(), seg.start.y(), seg.start.z()};
    c.end_m = {seg.end.x(), seg.end.y(), seg.end.z()};
    c.current_start_a = at_start[s];
    c.current_end_a = at_end[s];
    c.current_a = 0.5 * (at_start[s] + at_end[s]);
    r.currents.push_back(c);
    // Skin-effect loss: 0.5 Re(Z') L int_0^1 |I(t)|^2 dt for the linear current.
    const WireSpec& wire = model.wires[seg.wire];
    if (wire.conductivity_s_per_m) {
      const double r_per_m = std::real(fill::WireImpedancePerMetre(
          seg.radius_m, *wire.conductivity_s_per_m, wire.relative_permeability, frequency_hz));
      const double mean_square = (std::norm(at_start[s]) + std::norm(at_end[s]) +
                                  std::real(at_start[s] * std::conj(at_end[s]))) /
                                 3.0;
      r.wire_loss_w += 0.5 * r_per_m * seg.length_m() * mean_square;
    }
  }
  return r;
}

const Model& Simulation::model() const { return impl_->model; }
int Simulation::unknowns() const { return static_cast<int>(impl_->mesh.bases.size()); }
int Simulation::segments() const { return static_cast<int>(impl_->mesh.segments.size()); }
const std::vector<WireMeshInfo>& Simulation::wire_mesh() const { return impl_->mesh.wires; }
const std::vector<Warning>& Simulation::warnings() const { return impl_->warnings; }

std::string Version() { return WIREFIELD_VERSION; }

bool ParkIdleBlasThreads() { return solve::ParkIdleBlasThreads(); }

}  // namespace wirefield
