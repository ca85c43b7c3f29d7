// Benchmarks (build/bin/wirefield_bench; make bench prints the summary table instead): the
// whole solve of a 20 m band dipole, the matrix fill, and the dense solve (ours, LAPACK's zgesv
// and the symmetric zsytrf path on the same matrix).
#include <benchmark/benchmark.h>

#include <cmath>
#include <complex>
#include <cstdint>
#include <vector>

#include "core/constants.hpp"
#include "fill/assemble.hpp"
#include "fill/half_space.hpp"
#include "geometry/mesh.hpp"
#include "solve/dense.hpp"
#include "wirefield/wirefield.hpp"

#ifdef EIGEN_USE_LAPACKE
#include <lapacke.h>
#endif

namespace {

const char* kDipoleModel =
    "# 20 m band half-wave dipole, 1 mm radius, 10 m up, free space\n"
    "let f = 14.2MHz\n"
    "wire top from (-5.02, 0, 10) to (5.02, 0, 10) radius 1mm\n"
    "feed src at top@50%\n"
    "frequency f\n";

// A straight wire of n segments (n - 1 unknowns) at 14.2 MHz, for size scans.
wirefield::Model LongWire(int segments) {
  wirefield::Model m;
  m.file = "bench";
  wirefield::WireSpec w;
  w.name = "w";
  w.from_m = {0, 0, 10};
  w.to_m = {40, 0, 10};
  w.radius_m = 1e-3;
  w.segments = segments;
  m.wires.push_back(w);
  wirefield::FeedSpec f;
  f.name = "f";
  f.at = {"w", wirefield::PointKind::kPercent, 50.0, {}};
  m.feeds.push_back(f);
  m.frequency_hz = 14.2e6;
  return m;
}

wirefield::geometry::Mesh MeshOf(const wirefield::Model& m) {
  wirefield::geometry::MeshOptions o;
  o.max_frequency_hz = *m.frequency_hz;
  return wirefield::geometry::BuildMesh(m, o);
}

// Parse, mesh, fill, solve and report, as `wirefield solve` does.
// The ground benchmarks run at 7.1 MHz over average ground (permittivity 13, 5 mS/m).
constexpr double kGroundFrequency_hz = 7.1e6;
constexpr double kAveragePermittivity = 13.0;
constexpr double kAverageConductivity_s_per_m = 5e-3;

// Puts m over average ground at kGroundFrequency_hz: Arg 0 with the reflection-coefficient
// approximation, any other with the exact half-space.
void OverAverageGround(wirefield::Model* m, std::int64_t arg) {
  m->frequency_hz = kGroundFrequency_hz;
  m->ground.kind = wirefield::GroundKind::kReal;
  m->ground.permittivity = kAveragePermittivity;
  m->ground.conductivity_s_per_m = kAverageConductivity_s_per_m;
  m->ground.method =
      arg == 0 ? wirefield::GroundMethod::kReflection : wirefield::GroundMethod::kExact;
}

// Free-space wavenumber 2 pi f / c at kGroundFrequency_hz.
double GroundWavenumber() {
  return 2.0 * wirefield::core::kPi * kGroundFrequency_hz / wirefield::core::kSpeedOfLight_m_per_s;
}

// Complex relative permittivity eps_r - j sigma / (omega eps0) of average ground there.
std::complex<double> AverageGroundPermittivity() {
  const double omega = 2.0 * wirefield::core::kPi * kGroundFrequency_hz;
  return {kAveragePermittivity,
          -kAverageConductivity_s_per_m / (omega * wirefield::core::kEps0_f_per_m)};
}

void BM_DipoleWholeSolve(benchmark::State& state) {
  for (auto _ : state) {
    wirefield::Model m = wirefield::ParseModelText(kDipoleModel, "bench.wire");
    wirefield::Simulation sim(std::move(m));
    const wirefield::SolveResult r = sim.Solve(sim.DefaultFrequency());
    benchmark::DoNotOptimize(wirefield::FormatSolveJson(sim, r));
  }
}
BENCHMARK(BM_DipoleWholeSolve)->Unit(benchmark::kMillisecond);

// A low 40 m end-fed layout of 200 unknowns over average ground (13, 5 mS/m): a level wire
// 1.5 m up and a sloping one to 6 m. Arg 0: reflection-coefficient approximation; 1: the exact
// half-space for every pair (the default), table built inside the fill (on two threads, both
// counted: process CPU time); 2: the half-space table alone.
void BM_LowModelGroundFill(benchmark::State& state) {
  wirefield::Model m = LongWire(101);
  m.wires[0].from_m = {-10, 0, 1.5};
  m.wires[0].to_m = {10, 0, 1.5};
  wirefield::WireSpec slant = m.wires[0];
  slant.name = "slant";
  slant.from_m = {-10, 0, 1.5};
  slant.to_m = {-10, 8, 6};
  slant.segments = 100;
  m.wires.push_back(slant);
  OverAverageGround(&m, state.range(0));
  const wirefield::geometry::Mesh mesh = MeshOf(m);
  const wirefield::fill::NearFieldCache cache = wirefield::fill::BuildNearFieldCache(mesh);
  for (auto _ : state) {
    if (state.range(0) == 2) {
      benchmark::DoNotOptimize(wirefield::fill::HalfSpaceFill(mesh, AverageGroundPermittivity(),
                                                              GroundWavenumber(), 1e9));
    } else {
      benchmark::DoNotOptimize(wirefield::fill::AssembleImpedance(mesh, 7.1e6, cache, 1));
    }
  }
  state.counters["unknowns"] = static_cast<double>(mesh.bases.size());
}
// CPU time of the whole process: the half-space table's second thread counts too.
BENCHMARK(BM_LowModelGroundFill)
    ->Arg(0)
    ->Arg(1)
    ->Arg(2)
    ->MeasureProcessCPUTime()
    ->Unit(benchmark::kMillisecond);

// A tall model of 200 unknowns over average ground (13, 5 mS/m): a vertical half-wave dipole
// for 7.1 MHz from 1 m to 21.3 m (201 segments), whose pairs span every mean height from 0.02 to
// 0.5 wavelength. Arg 0: reflection-coefficient approximation; 1: the exact half-space for
// every pair (the default), table built inside the fill; 2: the mixture of an explicit
// exact_below at 0.3 wavelength (12.67 m), the default of earlier builds; 3: the half-space
// table alone.
void BM_TallModelGroundFill(benchmark::State& state) {
  wirefield::Model m = LongWire(201);
  m.wires[0].from_m = {0, 0, 1};
  m.wires[0].to_m = {0, 0, 21.3};
  m.feeds[0].at.value = 50.0;
  OverAverageGround(&m, state.range(0));
  if (state.range(0) == 2) {
    m.ground.exact_below_m = 0.3 * wirefield::core::kSpeedOfLight_m_per_s / kGroundFrequency_hz;
  }
  const wirefield::geometry::Mesh mesh = MeshOf(m);
  const wirefield::fill::NearFieldCache cache = wirefield::fill::BuildNearFieldCache(mesh);
  for (auto _ : state) {
    if (state.range(0) == 3) {
      benchmark::DoNotOptimize(wirefield::fill::HalfSpaceFill(mesh, AverageGroundPermittivity(),
                                                              GroundWavenumber(), INFINITY));
    } else {
      benchmark::DoNotOptimize(wirefield::fill::AssembleImpedance(mesh, 7.1e6, cache, 1));
    }
  }
  state.counters["unknowns"] = static_cast<double>(mesh.bases.size());
}
// CPU time of the whole process: the table's second thread counts too.
BENCHMARK(BM_TallModelGroundFill)
    ->Arg(0)
    ->Arg(1)
    ->Arg(2)
    ->Arg(3)
    ->MeasureProcessCPUTime()
    ->Unit(benchmark::kMillisecond);

void BM_Fill(benchmark::State& state) {
  const wirefield::Model m = LongWire(static_cast<int>(state.range(0)) + 1);
  const wirefield::geometry::Mesh mesh = MeshOf(m);
  for (auto _ : state) {
    benchmark::DoNotOptimize(wirefield::fill::AssembleImpedance(mesh, 14.2e6));
  }
  state.counters["unknowns"] = static_cast<double>(mesh.bases.size());
}
BENCHMARK(BM_Fill)->Arg(250)->Arg(500)->Arg(1000)->Unit(benchmark::kMillisecond);

void BM_SolveEigen(benchmark::State& state) {
  const wirefield::Model m = LongWire(static_cast<int>(state.range(0)) + 1);
  const wirefield::geometry::Mesh mesh = MeshOf(m);
  const Eigen::MatrixXcd z = wirefield::fill::AssembleImpedance(mesh, 14.2e6);
  const Eigen::VectorXcd v = wirefield::fill::AssembleExcitation(mesh, m);
  for (auto _ : state) benchmark::DoNotOptimize(wirefield::solve::SolveDense(z, v));
}
BENCHMARK(BM_SolveEigen)->Arg(250)->Arg(500)->Arg(1000)->Unit(benchmark::kMillisecond);

#ifdef EIGEN_USE_LAPACKE
void BM_SolveLapack(benchmark::State& state) {
  const wirefield::Model m = LongWire(static_cast<int>(state.range(0)) + 1);
  const wirefield::geometry::Mesh mesh = MeshOf(m);
  const Eigen::MatrixXcd z = wirefield::fill::AssembleImpedance(mesh, 14.2e6);
  const Eigen::VectorXcd v = wirefield::fill::AssembleExcitation(mesh, m);
  const lapack_int n = static_cast<lapack_int>(z.rows());
  std::vector<lapack_int> pivots(n);
  for (auto _ : state) {
    Eigen::MatrixXcd a = z;
    Eigen::VectorXcd b = v;
    const lapack_int info =
        LAPACKE_zgesv(LAPACK_COL_MAJOR, n, 1, reinterpret_cast<lapack_complex_double*>(a.data()), n,
                      pivots.data(), reinterpret_cast<lapack_complex_double*>(b.data()), n);
    benchmark::DoNotOptimize(info);
    benchmark::DoNotOptimize(b);
  }
}
BENCHMARK(BM_SolveLapack)->Arg(250)->Arg(500)->Arg(1000)->Unit(benchmark::kMillisecond);

// The symmetric factorization alone (zsytrf, zsycon, zsytrs), as SolveDense uses it.
void BM_SolveSymmetric(benchmark::State& state) {
  const wirefield::Model m = LongWire(static_cast<int>(state.range(0)) + 1);
  const wirefield::geometry::Mesh mesh = MeshOf(m);
  const Eigen::MatrixXcd z = wirefield::fill::AssembleImpedance(mesh, 14.2e6);
  const Eigen::VectorXcd v = wirefield::fill::AssembleExcitation(mesh, m);
  for (auto _ : state) benchmark::DoNotOptimize(wirefield::solve::SolveSymmetric(z, v));
}
BENCHMARK(BM_SolveSymmetric)->Arg(250)->Arg(500)->Arg(1000)->Unit(benchmark::kMillisecond);
#endif

// Fill and solve of 1000 unknowns together (the budget: 2 s on one core).
void BM_FillAndSolve1000(benchmark::State& state) {
  const wirefield::Model m = LongWire(1001);
  wirefield::Simulation sim(m);
  for (auto _ : state) benchmark::DoNotOptimize(sim.Solve(14.2e6));
}
BENCHMARK(BM_FillAndSolve1000)->Unit(benchmark::kMillisecond);

// The default pattern (1 degree grid, cuts, power integration) of a 200-unknown model over
// a perfect ground, including its solve: the budget is one second.
void BM_Pattern200(benchmark::State& state) {
  wirefield::Model m = LongWire(201);
  m.ground.kind = wirefield::GroundKind::kPerfect;
  for (auto _ : state) {
    wirefield::Simulation sim(m);
    const wirefield::SolveResult r = sim.Solve(14.2e6);
    benchmark::DoNotOptimize(wirefield::ComputePattern(sim, r));
  }
}
BENCHMARK(BM_Pattern200)->Unit(benchmark::kMillisecond);

// The reference sweep: 351 points (1 kHz steps, 14.00-14.35 MHz) of a 100-unknown dipole,
// mesh included, on all cores (argument: threads, 0 = all).
void BM_Sweep351Points100Unknowns(benchmark::State& state) {
  wirefield::Model m = LongWire(101);
  m.wires[0].to_m = {10.2, 0, 10};
  wirefield::SimulationOptions o;
  o.max_frequency_hz = 14.35e6;
  wirefield::SweepOptions so;
  so.threads = static_cast<int>(state.range(0));
  for (auto _ : state) {
    wirefield::Simulation sim(m, o);
    benchmark::DoNotOptimize(
        wirefield::RunSweep(sim, wirefield::FrequencyRange(14.0e6, 14.35e6, 1e3), so));
  }
}
BENCHMARK(BM_Sweep351Points100Unknowns)
    ->Arg(1)
    ->Arg(0)
    ->Unit(benchmark::kMillisecond)
    ->UseRealTime();

}  // namespace

BENCHMARK_MAIN();
