// wirefield public API, part 6: frequency sweeps. Solves a Simulation at many frequencies
// (in parallel across cores, reusing the mesh) and summarises the first feed: SWR at the
// transmitter, resonances, minimum SWR, SWR bandwidths, per band.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "wirefield/simulation.hpp"
#include "wirefield/stress.hpp"

namespace wirefield {

struct SweepOptions {
  // Worker threads; 0 = one per hardware core. More threads cost memory (one matrix each).
  int threads = 0;
  // When set (a --power run), each point also gets its stress at that power (ComputeStress;
  // a few percent of a point's time for the free-end potentials).
  std::optional<StressOptions> stress;
  // Matrix interpolation in frequency (docs/numerics.md, "Interpolation in frequency"): the
  // antenna's matrix is filled exactly at three anchor frequencies in each window of up to 10%
  // bandwidth and interpolated entry by entry, phase removed, at the other points;
  // loads, conductor loss and the feed chain stay exact at every point. Used where a window
  // holds at least 8 points (so small sweeps stay exact) and the anchors fit in 1 GiB. Default
  // true: it adds under 0.2% to the feed impedance (tests/validation/
  // interpolation_validation_test.cpp) and saves most of the fill time of a long sweep. false
  // fills exactly at every point (the CLI's --exact). With it, a window of 24 points or more
  // also solves only 8 of them densely and the others in the span of those 8 currents where
  // the relative residual stays under 1e-8 (SweepResult::projected_points), which saves most
  // of the solve time; false turns this off too.
  bool interpolate = true;

  // Checks the fields against their bounds (threads not negative, the stress options' own
  // Validate); throws InputError (file: the field's name, at 1:1) whose message begins with
  // that name and states the bound. RunSweep calls it first.
  void Validate() const;
};

struct SweepPoint {
  double frequency_hz = 0.0;
  Complex feed_impedance_ohm;         // at the first feed's terminals
  Complex transmitter_impedance_ohm;  // through its transformer and line
  double swr = 0.0;                   // at the transmitter, against z0_ohm
  double return_loss_db = 0.0;
  double transformer_loss_fraction = 0.0;
  double line_loss_fraction = 0.0;
  std::optional<StressResult> stress;  // with SweepOptions::stress
};

struct SweepResult {
  double z0_ohm = kDefaultZ0Ohm;
  std::vector<SweepPoint> points;  // in the order of the frequencies given
  // Zero crossings of X, interpolated between points: at the first feed's terminals (the
  // antenna's own resonances, the contract's `resonances_hz`), and at the transmitter, through
  // the feed's transformer and line (the same list when the feed has neither).
  std::vector<double> resonances_hz;
  std::vector<double> transmitter_resonances_hz;
  double min_swr = 0.0;
  double min_swr_frequency_hz = 0.0;
  int unknowns = 0;
  int threads_used = 1;
  int matrix_fills = 0;         // exact fills of the matrix (interpolation anchors included)
  int interpolated_points = 0;  // points whose matrix was interpolated (0: every one exact)
  // Interpolated points solved in the span of the currents of a few densely solved points of
  // their window, without a factorisation (residual checked; the others solved densely).
  int projected_points = 0;
  // With SweepOptions::stress: the highest of each stress over the points, where it happens
  // (HighestStress); empty otherwise.
  std::vector<StressPeak> stress_peaks;
  double elapsed_s = 0.0;
};

// The highest of each stress over the points of a sweep that has them (HighestStress of the
// points' stress); empty when no point has a stress.
std::vector<StressPeak> SweepStressPeaks(const std::vector<SweepPoint>& points);

// Frequencies from_hz, from_hz + step_hz, ... up to to_hz (inclusive within 1e-9 of a step).
std::vector<double> FrequencyRange(double from_hz, double to_hz, double step_hz);
// points >= 2 frequencies spread evenly from from_hz to to_hz inclusive.
std::vector<double> FrequencyPoints(double from_hz, double to_hz, int points);

// Solves at every frequency. Throws InputError for an empty or non-positive frequency list.
SweepResult RunSweep(const Simulation& simulation, const std::vector<double>& frequencies_hz,
                     const SweepOptions& options = {});

// The frequency ranges (interpolated) where the SWR stays at or below `limit` (e.g. 2.0,
// 1.5) among the given points: pairs of [low, high] Hz.
std::vector<std::pair<double, double>> SwrBandwidths(const SweepResult& sweep, double limit);

}  // namespace wirefield
