// wirefield public API: what a solve and its post-processing give back, in one place. A
// solve (Simulation::Solve) gives a SolveResult: each feed's impedance, SWR and powers at the
// antenna terminals and at the transmitter, each load's current, voltage and power, and the
// current on every segment. From a solved model come its far field and pattern
// (ComputePattern, pattern.hpp), its voltages and currents at a power (ComputeStress,
// stress.hpp) and an RF-exposure estimate (EstimateExposure, stress.hpp). Every phasor is a
// peak value (e^{jwt}); every quantity is in SI units, named in its field.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "wirefield/core.hpp"
#include "wirefield/model.hpp"

namespace wirefield {

// ---- a solve -------------------------------------------------------------------------------

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

// ---- the far field and the pattern -------------------------------------------------------

// Far field in one direction. e_theta_v / e_phi_v are r e^{jkr} E (volts): the field at
// distance r is that over r. Gains are relative to the power into the feeds (dBi); a gain of
// no radiation is reported as kNoGainDbi, never minus infinity.
struct FarFieldPoint {
  double elevation_deg = 0.0;
  double azimuth_deg = 0.0;
  Complex e_theta_v;  // vertical polarization (in the plane of elevation)
  Complex e_phi_v;    // horizontal polarization
  double gain_dbi = 0.0;
  double gain_vertical_dbi = 0.0;
  double gain_horizontal_dbi = 0.0;
};
inline constexpr double kNoGainDbi = -999.0;

// The best gain over azimuth at one elevation: the maximum of the azimuth cut there, on the
// pattern's grid (the first azimuth of equal ones), with its polarization parts.
struct DirectionGain {
  double elevation_deg = 0.0;
  double azimuth_deg = 0.0;
  double gain_dbi = 0.0;
  double gain_vertical_dbi = 0.0;
  double gain_horizontal_dbi = 0.0;
};

// Why a cut lies where it does.
enum class CutChoice {
  kGiven,               // the options fixed it (--azimuth, --elevation)
  kStrongestLowAngle,   // elevation cut: through the azimuth of the strongest low-angle gain
  kTakeoff,             // azimuth cut: at the take-off angle
  kLowAngleNearZenith,  // azimuth cut: at kLowAzimuthCutElevation_deg, the maximum being
                        // near the zenith
};

// One cut: gain against angle (elevation 0..180 through the azimuth of the maximum and its
// back, or azimuth 0..360 at a fixed elevation).
struct PatternCut {
  std::string plane;       // "elevation" or "azimuth"
  double fixed_angle_deg;  // the azimuth (elevation cut) or elevation (azimuth cut) held fixed
  std::vector<double> angle_deg;
  std::vector<double> gain_dbi;
  std::vector<double> gain_vertical_dbi;
  std::vector<double> gain_horizontal_dbi;
  std::optional<double> beamwidth_deg;   // -3 dB width of the main lobe, when it closes
  CutChoice choice = CutChoice::kGiven;  // why fixed_angle_deg is what it is
};

// Where the power goes. input = sum of 0.5 Re(V I*) over feeds.
struct PowerBudget {
  double input_w = 0.0;
  double radiated_w = 0.0;  // integrated over the sphere (free) or the upper half-space
  double loads_w = 0.0;
  double wires_w = 0.0;  // skin effect of lossy wires plus dielectric loss of insulated ones
  // Over a real ground: the power the ground absorbs, input - radiated - loads - wires (the
  // balance cannot be checked then, and balance_error is 0). 0 otherwise.
  double ground_w = 0.0;
  // radiated / input, at most 1: a lossless antenna cannot radiate more than it takes in, and
  // a ratio above 1 is the discretization's power-balance error (see efficiency_note).
  double efficiency = 0.0;
  double efficiency_computed = 0.0;  // radiated / input as computed, before the clamp to 1
  // Why efficiency is not efficiency_computed: empty unless the ratio came out more than
  // 0.005% above 1 (below that the clamp does not change the printed percentage).
  std::string efficiency_note;
  double balance_error = 0.0;  // (radiated + loads + wires - input) / input
};

struct PatternResult {
  double frequency_hz = 0.0;
  double step_deg = 1.0;  // used
  double max_gain_dbi = 0.0;
  double max_gain_elevation_deg = 0.0;
  double max_gain_azimuth_deg = 0.0;
  double max_gain_vertical_dbi = 0.0;  // the polarization parts in the direction of the maximum
  double max_gain_horizontal_dbi = 0.0;
  double takeoff_elevation_deg = 0.0;  // elevation of maximum radiation
  // The best gain over azimuth at each of kLowAngleElevations_deg, in that order.
  std::vector<DirectionGain> low_angle;
  PatternCut elevation_cut;
  PatternCut azimuth_cut;
  std::optional<double> front_to_back_db;  // when the azimuth cut has a clear front
  std::optional<double> front_to_side_db;
  PowerBudget power;
  std::vector<Warning> warnings;  // e.g. power balance off by more than 2%
};

// ---- voltages and currents at a power, and RF exposure ------------------------------------

// Common component ratings, peak volts. Small mica and ceramic capacitors are commonly rated
// about 500 V; coils and other loads on good formers stand about 2 kV (both common practice).
inline constexpr double kDefaultCapacitorRatingV = 500.0;
inline constexpr double kDefaultLoadRatingV = 2000.0;

// RMS voltage above which a free wire end gets the high-voltage caution: 50 V RMS (70.7 V
// peak), the upper limit of extra-low voltage for AC (IEC 61140, from memory). That limit is
// set for power frequencies; it serves here as the line where touching becomes dangerous
// (common practice). Below it a free end's voltage is shown without a caution.
inline constexpr double kHighVoltageRmsV = 50.0;

// A voltage or current as its peak (amplitude of the phasor) and RMS value.
struct Amplitude {
  double peak = 0.0;
  double rms = 0.0;
};

struct FeedStress {
  std::string name;
  double transmitter_power_w = 0.0;  // into this feed's chain at the transmitter
  double antenna_power_w = 0.0;      // reaching the feed terminals
  Amplitude antenna_voltage_v;       // across the feed terminals (the antenna side)
  Amplitude antenna_current_a;
  bool has_transformer = false;
  Amplitude transformer_transmitter_voltage_v;  // its transmitter (primary) side
  Amplitude transformer_transmitter_current_a;
  std::optional<Amplitude> compensation_voltage_v;  // across the compensation capacitor
  bool compensation_over_rating = false;
  bool has_line = false;
  Amplitude transmitter_voltage_v;  // where the transmitter connects (the line's input)
  Amplitude transmitter_current_a;
};

struct LoadStress {
  std::string name;
  Amplitude voltage_v;   // across the whole load
  Amplitude current_a;   // through it
  double power_w = 0.0;  // dissipated
  // Across its capacitor alone: |I|/(omega C) in a series load, the load's voltage in a
  // parallel one; empty when the load has no capacitor.
  std::optional<Amplitude> capacitor_voltage_v;
  bool capacitor_over_rating = false;
  bool has_coil_or_other = false;  // R, L or a coil present: the load rating applies
  bool over_rating = false;        // voltage_v.peak above the load rating
  bool open = false;               // an ideal open circuit at this frequency
};

// A wire end connected to nothing (no other wire end, no ground plane).
struct FreeEndStress {
  std::string wire;
  std::string end;  // "start" or "end"
  Point at_m{};
  // The scalar potential of all segment charges (and their ground images) against far away,
  // on the wire surface at the centre of the last segment; docs/numerics.md §7c.
  Amplitude voltage_v;
  bool high_voltage = false;  // voltage_v.rms above kHighVoltageRmsV: the caution applies
};

struct StressResult {
  double frequency_hz = 0.0;
  double power_w = 0.0;  // the transmitter power asked for
  double scale = 1.0;    // the solved currents and voltages times this give the values here
  double capacitor_rating_v = kDefaultCapacitorRatingV;
  double load_rating_v = kDefaultLoadRatingV;
  std::vector<FeedStress> feeds;
  std::vector<LoadStress> loads;
  std::vector<FreeEndStress> free_ends;
  // One sentence each: every voltage above its rating, and the high-voltage caution for each
  // free end above kHighVoltageRmsV (keep it out of reach).
  std::vector<std::string> cautions;
};

// The highest of each stress over several frequencies (a sweep), with where it happens.
struct StressPeak {
  std::string what;  // e.g. "load c1 capacitor", "free end dip@end", "feed src transformer"
  double peak_v = 0.0;
  double rms_v = 0.0;
  double frequency_hz = 0.0;
  double rating_v = 0.0;  // 0 when no rating applies (feed terminals)
  bool over_rating = false;
};

struct ExposureResult {
  double frequency_hz = 0.0;
  double power_w = 0.0;
  std::string mode;
  double duty = 1.0;
  double transmit_fraction = 1.0;
  double average_power_w = 0.0;  // power * duty * transmit_fraction
  double gain_dbi = 0.0;         // the pattern's maximum gain
  double gain_numeric = 1.0;
  // 47 CFR 1.1310 Table 1, general population/uncontrolled, W/m^2 (empty outside its
  // 0.3-100000 MHz), and the distance where the estimate falls to it, m.
  std::optional<double> fcc_limit_w_per_m2;
  std::optional<double> fcc_distance_m;
  // ICNIRP 2020 reference levels, general public, whole body (the plane-wave equivalent
  // of its E and H levels where it gives no power density), W/m^2, and the distance, m.
  std::optional<double> icnirp_limit_w_per_m2;
  std::optional<double> icnirp_distance_m;
  std::vector<std::string> cautions;
};

}  // namespace wirefield
