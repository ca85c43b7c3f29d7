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

struct FeedResult {
  std::string name;
  Complex impedance_ohm;  // at the feed's terminals
  Complex current_a;      // peak phasor, into the antenna
  Complex voltage_v;      // the source voltage
  double swr = 0.0;       // at the transmitter (see below), against z0_ohm
  double z0_ohm = kDefaultZ0Ohm;
  double power_w = 0.0;  // 0.5 Re(V I*): power delivered to the antenna terminals
  // At the antenna terminals: the SWR of impedance_ohm against z0_ohm.
  double antenna_swr = 0.0;
  // Whether a transformer or a feed line sits between the feed and the transmitter.
  bool has_transformer = false;
  bool has_line = false;
  // At the transmitter, through the feed's transformer and line (equal to the terminals'
  // values when the feed has neither). swr above is against z0_ohm at this point.
  Complex transmitter_impedance_ohm;
  double return_loss_db = 0.0;
  // Shares of the transmitter's power lost in the transformer and the line (0..1).
  double transformer_loss_fraction = 0.0;
  double line_loss_fraction = 0.0;
  // Powers at the solved excitation, W: what the transmitter delivers into the chain (power_w
  // plus the two losses), and what the line and the transformer dissipate.
  double transmitter_power_w = 0.0;
  double line_loss_w = 0.0;
  double transformer_loss_w = 0.0;
  // How far impedance_ohm may be from the converged (infinitely fine mesh) value, ohm, from
  // coarser solves of the same model (EstimateMeshError); empty when not estimated.
  std::optional<double> mesh_error_ohm;
};

struct LoadResult {
  std::string name;
  Complex impedance_ohm;  // of the lumped element at this frequency
  Complex current_a;      // peak phasor through the load
  Complex voltage_v;      // peak phasor across the load, I * Z
  double power_w = 0.0;   // 0.5 |I|^2 Re(Z)
  bool open = false;      // true when the element is an ideal open circuit at this frequency
};

// Current on one segment (peak phasors, positive along the segment from its start to its
// end). The current is linear along the segment, from current_start_a to current_end_a.
struct SegmentCurrent {
  int wire = 0;  // index into Model::wires
  Point start_m{};
  Point end_m{};
  Complex current_a;  // at the centre
  Complex current_start_a;
  Complex current_end_a;
};

// A discretisation estimate of the feed impedances (docs/numerics.md, "Mesh error estimate"):
// the model solved again with half and a quarter of the segments on every wire, and Richardson
// extrapolation with the observed order of convergence (Roache's grid convergence index).
struct FeedMeshError {
  double error_ohm = 0.0;  // estimated |Z - Z_converged| of the feed's terminal impedance
  // Observed order p of |Z_N - Z_N/2| ~ h^p; 0 when not observed (two levels only).
  double observed_order = 0.0;
  // True when p lay in the range where the extrapolation is trusted; false: the conservative
  // fallback estimate (docs/numerics.md).
  bool asymptotic = false;
  Complex half_mesh_impedance_ohm;     // with half the segments
  Complex quarter_mesh_impedance_ohm;  // with a quarter (equal to half's with two levels)
};

struct MeshEstimate {
  std::vector<FeedMeshError> feeds;  // in the order of SolveResult::feeds
  int segments = 0;                  // of the mesh estimated
  int half_segments = 0;             // of the coarser meshes
  int quarter_segments = 0;          // 0 with two levels only
  double time_s = 0.0;               // the coarser meshes and solves
  // What limits the estimate (a wire too short to halve, an order outside the trusted range).
  std::vector<std::string> notes;
  // An estimate above 2% of |Z|, saying what to change.
  std::vector<Warning> warnings;
};

struct SolveResult {
  double frequency_hz = 0.0;
  int unknowns = 0;
  int segments = 0;
  std::vector<FeedResult> feeds;
  std::vector<LoadResult> loads;
  std::vector<SegmentCurrent> currents;
  // Power dissipated along the wires, W: the skin effect of lossy conductors and the
  // dielectric loss of insulated wires' jackets.
  double wire_loss_w = 0.0;
  // Condition number of the moment-method matrix in the 1-norm, estimated from its LU
  // factors (1 / LAPACK zgecon's rcond): each decade of it costs a digit of the currents'
  // 16. The solve refuses the model above 1e14 (ComputationError).
  double condition_number = 0.0;
  double relative_residual = 0.0;  // |Z I - V| / |V| of the solved system
  double fill_time_s = 0.0;
  double solve_time_s = 0.0;
  std::optional<MeshEstimate> mesh_estimate;  // set by EstimateMeshError
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

// The first feed at one frequency with its mesh estimate (Solve, then EstimateMeshError): what a
// sweep reports at each band's centre and a batch row at its first span's centre.
struct FeedMeshEstimateAt {
  std::string label;  // the band's name, "range", ... (the caller's)
  double frequency_hz = 0.0;
  Complex z_ohm;  // at the first feed's terminals, an exact fill
  std::optional<double> mesh_error_ohm;
  std::vector<std::string> notes;
  std::vector<Warning> warnings;  // an estimate above 2% of |Z|
};
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
