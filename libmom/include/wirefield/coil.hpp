// wirefield public API: the single-layer air-core solenoid (a loading coil). From its turns,
// former, winding and wire: the inductance (Nagaoka's coefficient with Rosa's round-wire
// correction, and Wheeler's formula beside it), Medhurst's self-capacitance, the AC
// resistance with the proximity effect, Q, and the turns for a target inductance. SI units
// throughout; the methods and their sources are in docs/numerics.md, "Coils".
#pragma once

#include <complex>
#include <optional>
#include <string>
#include <vector>

namespace wirefield {

// A single-layer solenoid as it is wound. Give the winding either by its length or by its
// pitch (length = turns x pitch); exactly one of the two.
struct CoilSpec {
  double turns = 0.0;              // N, at least 1; need not be whole
  double former_diameter_m = 0.0;  // outside diameter of the former the wire is wound on
  std::optional<double> length_m;  // winding length l
  std::optional<double> pitch_m;   // distance between the centres of adjacent turns p
  double wire_diameter_m = 0.0;    // bare conductor diameter d
  double insulation_m = 0.0;       // radial thickness of the wire's insulation (enamel: ~0.02 mm)
  // The conductor; default annealed copper (100% IACS, core/materials.cpp).
  std::string material = "copper";
  double conductivity_s_per_m = 58.0e6;
  double relative_permeability = 1.0;
};

// What a coil is, at DC and at one frequency.
struct CoilAnalysis {
  // Geometry used: the current sheet lies on the wire centres.
  double sheet_diameter_m = 0.0;  // former diameter + d + 2 x insulation
  double length_m = 0.0;          // winding length, N p
  double pitch_m = 0.0;
  double wire_length_m = 0.0;  // N turns of helix, N sqrt((pi D)^2 + p^2)
  // Inductance.
  double nagaoka_coefficient = 0.0;   // K_N(D/l), exact (complete elliptic integrals)
  double inductance_sheet_h = 0.0;    // current sheet: mu0 pi r^2 N^2 K_N / l
  double rosa_correction_h = 0.0;     // round-wire correction, subtracted: mu0 r N (k_s + k_m)
  double inductance_h = 0.0;          // sheet minus Rosa's correction: the value used
  double inductance_wheeler_h = 0.0;  // Wheeler's 1928 formula, for comparison
  // Self-capacitance and the lumped self-resonance.
  double medhurst_h_pf_per_cm = 0.0;  // Medhurst's H(l/D)
  double self_capacitance_f = 0.0;    // H D
  double self_resonance_hz = 0.0;     // 1 / (2 pi sqrt(L C))
  // At frequency_hz.
  double frequency_hz = 0.0;
  double dc_resistance_ohm = 0.0;
  double skin_depth_m = 0.0;
  double straight_wire_resistance_ohm = 0.0;  // the same wire stretched straight (skin effect)
  double proximity_factor = 0.0;              // Medhurst's Phi(l/D, d/p)
  double ac_resistance_ohm = 0.0;  // R_straight [1 + (Phi - 1)(1 - (R_dc / R_straight)^2)]
  double reactance_ohm = 0.0;      // omega L
  double q = 0.0;                  // omega L / R_ac, the coil alone
  // The coil as seen at its terminals: (R_ac + j omega L) in parallel with the self-capacitance.
  std::complex<double> impedance_ohm;
  double apparent_inductance_h = 0.0;    // Im Z / omega; negative above the self-resonance
  double apparent_resistance_ohm = 0.0;  // Re Z
  double apparent_q = 0.0;               // Im Z / Re Z
  // Things the user should know (a value outside a table's range, above self-resonance).
  std::vector<std::string> notes;
};

// Sets the coil's conductor to a material of the wire table (the names `material` takes in
// the model language: copper, aluminium, ...). Throws InputError naming `where` (an option or
// a file) and listing the materials when the name is unknown.
void SetCoilMaterial(CoilSpec* coil, const std::string& name, const std::string& where);

// Returns an empty string when `coil` describes a coil that can be wound, else what is wrong
// and what to change (non-positive sizes, fewer than 1 turn, pitch below the wire's overall
// diameter, both or neither of length and pitch, an unusable conductor).
std::string CoilProblem(const CoilSpec& coil);

// Analyses `coil` at frequency_hz (> 0). Throws InputError (file "coil") when CoilProblem
// finds a defect, ComputationError when a result is not finite.
CoilAnalysis AnalyzeCoil(const CoilSpec& coil, double frequency_hz);

// The impedance at the terminals of `coil` at frequency_hz: (R_ac + j omega L) in parallel
// with the self-capacitance. The same value as AnalyzeCoil(...).impedance_ohm.
std::complex<double> CoilImpedance(const CoilSpec& coil, double frequency_hz);

// The design problem: the turns that give target_inductance_h on a given former and wire at
// a given pitch. `coil` gives the former, wire, insulation, conductor and pitch (its turns
// and length are ignored). Returns the coil with the turns found (not rounded; N is
// continuous). Solved by TOMS 748 bracketing (Boost.Math) over 1 to kMaxDesignTurns turns;
// throws InputError when the target is below what one turn gives or above what
// kMaxDesignTurns give, or when the coil is impossible.
inline constexpr double kMaxDesignTurns = 100000.0;
CoilSpec DesignCoilTurns(CoilSpec coil, double target_inductance_h);

}  // namespace wirefield
