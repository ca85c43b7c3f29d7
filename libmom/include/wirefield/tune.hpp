// wirefield public API, part 8: design by tuning. Finds the value of a model's `let` variable (a
// wire length, a coil's inductance, a capacitor) that puts the first feed at resonance (zero
// reactance at its terminals) at a target frequency, or that gives the lowest SWR at the
// transmitter there; two variables for two targets at once. Each trial value re-parses the
// model and re-meshes it. The method is in docs/numerics.md, "Tuning".
#pragma once

#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "wirefield/model.hpp"
#include "wirefield/simulation.hpp"

namespace wirefield {

// What a tune asks of the first feed at the target frequency.
enum class TuneGoal {
  kResonance,  // zero reactance at the feed terminals (before any transformer or line)
  kMinSwr,     // the lowest SWR at the transmitter (through the transformer and line)
};

// Which zero of the reactance counts as a resonance.
enum class ResonanceKind {
  kAuto,      // either kind; the one nearest the variable's start value
  kSeries,    // X crosses zero rising with frequency (dX/df > 0): low R, a centre-fed half wave
  kParallel,  // X crosses zero falling (dX/df < 0), R high: an end-fed half wave
};

// "resonance" / "min-swr"; "auto" / "series" / "parallel".
std::string ToString(TuneGoal goal);
std::string ToString(ResonanceKind kind);

// One variable and the frequency it is tuned for.
struct TuneTarget {
  std::string variable;  // the name of a `let`
  double frequency_hz = 0.0;
  // Bounds of the search, in the variable's SI unit. Default: the start value -/+
  // TuneOptions::default_span of itself.
  std::optional<double> min_si;
  std::optional<double> max_si;
};

struct TuneOptions {
  TuneGoal goal = TuneGoal::kResonance;
  ResonanceKind kind = ResonanceKind::kAuto;
  // Fixed --set overrides applied to every trial (an override of a tuned variable gives its
  // start value).
  std::vector<Override> overrides;
  // Reference impedance of the SWR; default the model's z0, else 50 ohm.
  std::optional<double> z0_ohm;
  // Half-width of the default bounds, relative to the start value. Default 0.3 (-/+30%).
  // Wider finds resonances further away but may take in another resonance.
  double default_span = 0.3;
  // Samples of the coarse scan over the bounds before the root finder refines each sign
  // change (3..200). Default 12. More samples separate close resonances at one solve each.
  int scan_samples = 12;
  // Relative tolerance on each target frequency for two-variable tunes (the alternation stops
  // when every resonance is within it) and on values for min-swr. Default 1e-4.
  double tolerance = 1e-4;
  // Largest number of alternations for two variables. Default 30; each costs a few dozen
  // solves.
  int max_iterations = 30;
  // Estimate the mesh error of each tuned impedance (EstimateMeshError, at the target
  // frequency with the tuned values; two coarser solves, small against a tune's dozens).
  // Default true; the CLI's --no-mesh-estimate turns it off.
  bool mesh_estimate = true;
  // Mesh options for every trial (max_frequency_hz defaults to the highest target).
  SimulationOptions simulation;
  // Called with one line of progress text (no newline) at each stage; may be empty.
  std::function<void(const std::string&)> progress;

  // Checks the search's fields against their bounds (scan_samples, tolerance, max_iterations,
  // default_span); throws InputError (file: the field's name, at 1:1) whose message begins
  // with that name and states the bound.
  void Validate() const;
};

// One tuned variable at the end.
struct TunedVariable {
  std::string name;
  std::string unit;       // SI unit ("m", "H", "F", ...), "" for a plain number
  std::string quantity;   // "a length (m)", ...
  double start_si = 0.0;  // the model's value (after --set)
  double min_si = 0.0;    // the bounds searched
  double max_si = 0.0;
  double value_si = 0.0;  // the tuned value
  double target_hz = 0.0;
  // The zero of the feed reactance nearest the target at the tuned values (within 10%), when
  // there is one; for the resonance goal it equals the target within the tolerance.
  std::optional<double> resonance_hz;
  std::optional<ResonanceKind> resonance_kind;  // series or parallel
  // At the target frequency with the tuned values:
  Complex z_ohm;              // at the feed terminals
  Complex transmitter_z_ohm;  // at the transmitter
  double swr = 0.0;           // at the transmitter, against z0_ohm
  // How far z_ohm may be from the converged mesh's value, ohm (TuneOptions::mesh_estimate);
  // mesh_notes: what limits the estimate (empty when it holds as documented).
  std::optional<double> mesh_error_ohm;
  std::vector<std::string> mesh_notes;
  // How far the resonance moves per SI unit of the variable (Hz/m, Hz/H, Hz/F): a central
  // finite difference of the resonance frequency at value -/+ sensitivity_step_si. Absent
  // when no resonance lies near the target.
  std::optional<double> sensitivity_hz_per_si;
  double sensitivity_step_si = 0.0;
};

struct TuneResult {
  std::string model_file;
  std::string feed_name;  // the first feed
  TuneGoal goal = TuneGoal::kResonance;
  ResonanceKind kind_given = ResonanceKind::kAuto;
  double z0_ohm = kDefaultZ0Ohm;
  std::vector<TunedVariable> variables;  // in the order of the targets
  int iterations = 0;                    // alternations (1 for one variable)
  int solves = 0;                        // moment-method solves in all
  int unknowns = 0;                      // of the final mesh
  std::vector<int> segments_used;        // per wire, held fixed over the trials
  double elapsed_s = 0.0;
  std::vector<Warning> warnings;  // of the model at its start values
};

// Tunes the model text. Throws InputError for a bad target (unknown variable, listing the
// model's; empty or reversed bounds; a variable tuned twice) and when no resonance or minimum
// exists within the bounds (naming the value that came nearest and its |X|), and
// ComputationError when the two-variable alternation does not converge.
TuneResult Tune(const std::string& model_text, const std::string& file_name,
                const std::vector<TuneTarget>& targets, const TuneOptions& options = {});

// The same for a model file.
TuneResult TuneFile(const std::string& path, const std::vector<TuneTarget>& targets,
                    const TuneOptions& options = {});

// The zero of the first feed's reactance nearest frequency_hz (within -/+10%) of one
// Simulation, of the given kind (kAuto: either); nullopt when there is none. `solves` counts.
std::optional<double> FindResonanceNear(const Simulation& simulation, double frequency_hz,
                                        ResonanceKind kind, int* solves = nullptr);

}  // namespace wirefield
