// wirefield public API, part 2: meshing and solving a model.
// A Simulation meshes a Model once (for the highest frequency it will be asked about) and then
// solves it at any frequency: fill the moment-method matrix, solve, report feeds and loads.
// Standard types only; the numerics are described in docs/numerics.md.
#pragma once

#include <complex>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "wirefield/model.hpp"
#include "wirefield/results.hpp"

namespace wirefield {

namespace study {
class Pipeline;  // the solve pipeline a Simulation holds (libmom/src/study/pipeline.hpp)
}

struct SimulationOptions {
  // Highest frequency the mesh must serve, Hz. Default: the model's frequency. The mesher
  // picks segment counts for this frequency; higher means more unknowns (slower, finer).
  std::optional<double> max_frequency_hz;
  // Target segments per wavelength at max_frequency_hz when a wire gives no `segments`.
  // Default 80: a half-wave dipole gets 40 segments, and its feed impedance is then within
  // about 1 ohm of the converged value (docs/validation.md). Raising it costs time as the
  // cube of the unknown count.
  double segments_per_wavelength = 80.0;
  // Minimum segments on a wire that gives no `segments`. Default 3.
  int min_segments_per_wire = 3;
  // Largest matrix (bytes) the solver may allocate before refusing the model. Default: half of
  // the memory the system reports available (or 4 GiB when unknown).
  std::optional<double> max_matrix_bytes;
  // Threads that fill the matrix in Solve(frequency). Default 0: one per core. The result is
  // the same, bit for bit, for any count (the fill is cut into fixed blocks).
  int fill_threads = 0;
};

class Simulation {
 public:
  // Meshes the model and checks it. Throws InputError when the geometry is inconsistent
  // (a feed at a free wire end, a model too large to fit in memory, ...).
  explicit Simulation(Model model, SimulationOptions options = {});
  ~Simulation();
  Simulation(Simulation&&) noexcept;
  Simulation& operator=(Simulation&&) noexcept;

  // Solves at frequency_hz (> 0). Throws ComputationError when the solve fails.
  SolveResult Solve(double frequency_hz) const;
  // Same, with the matrix filled by fill_threads threads (0: one per core). Callers that run
  // several solves at once on their own threads (sweeps, batches) pass 1.
  SolveResult Solve(double frequency_hz, int fill_threads) const;

  // The model's frequency, or InputError naming the file when it has none.
  double DefaultFrequency() const;

  const Model& model() const;
  int unknowns() const;
  int segments() const;
  const std::vector<WireMeshInfo>& wire_mesh() const;
  // Warnings of the parser and the mesher together (segment length, crossings, ground).
  const std::vector<Warning>& warnings() const;

 private:
  friend class study::Pipeline;
  struct Impl;
  std::unique_ptr<Impl> impl_;
};

// Solve(frequency_hz) with an estimate of how far each feed impedance is from the converged
// value (docs/numerics.md, "Mesh error estimate"): the same system restricted to the triangle
// bases of two nested coarser meshes, with every other node and every fourth node of each
// wire (ends, feeds, loads and bends kept), which costs no new fill, the two restricted
// matrices (5/16 of the fine one's memory) and their solves. Sets mesh_estimate and each feed's
// mesh_error_ohm. A wire of two segments or fewer keeps its count (said in the notes); when no wire
// can be made coarser, or a coarser solve fails, mesh_estimate->feeds stays empty and its notes say
// why.
SolveResult SolveWithMeshEstimate(const Simulation& simulation, double frequency_hz,
                                  int fill_threads = 0);
// The same estimate for a result already solved, from the model meshed again with half and a
// quarter of the segments per wire and filled anew (about a third of a fill more).
void EstimateMeshError(const Simulation& simulation, SolveResult* result, int fill_threads = 0);

FeedMeshEstimateAt EstimateFirstFeedAt(const Simulation& simulation, double frequency_hz,
                                       const std::string& label, int fill_threads = 0);

// What one solve is expected to cost: an estimate from n^2 (fill) and n^3 (factorisation)
// scaling, with factors measured on the project's 2-core machine (docs/performance.md,
// "Cost of a large solve") and the work shared over `threads` (0: one per core). A faster or
// slower machine, or one busy with other work, takes proportionally less or more.
struct SolveCostEstimate {
  int unknowns = 0;
  int threads = 0;               // used
  double matrix_bytes = 0.0;     // the one matrix, 16 bytes an entry
  double fill_s = 0.0;           // the matrix fill
  double factorisation_s = 0.0;  // symmetric factorisation, condition estimate and solve
  double total_s() const { return fill_s + factorisation_s; }
};
SolveCostEstimate EstimateSolveCost(int unknowns, int threads = 0);
// The line a program prints on stderr before a long solve: the matrix's memory and the
// estimate's times, said to be an estimate. Empty when the estimate is under the progress
// delay (WIREFIELD_PROGRESS_AFTER, default 3 s) or WIREFIELD_PROGRESS=0 (docs/commands.md,
// "Progress and estimates").
std::string LongSolveNotice(int unknowns, int threads = 0);

// The version string, e.g. "0.1.0".
std::string Version();

// Stops the idle worker threads of the BLAS library, where it has such a pool: OpenBLAS's
// threaded build starts its workers when it loads, and each spins on a core for about 0.1 s
// before it sleeps, competing with the matrix fill's own threads (measured: a 1000-unknown
// fill took 46-70 ms instead of 32 ms in about half of the runs). The next multithreaded BLAS call
// (the factorization) starts them again. Returns whether there was such a pool. Call it only
// while no other thread of the process is inside BLAS, as at the start of a program; with any
// other BLAS it does nothing.
bool ParkIdleBlasThreads();

}  // namespace wirefield
