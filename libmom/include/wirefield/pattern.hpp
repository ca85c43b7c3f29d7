// wirefield public API, part 4: the far field, gain, radiation pattern and power budget of a
// solved model (free space, or the upper half-space over a perfect or real ground).
// Angles: elevation up from the horizon (90 = zenith), azimuth from +x toward +y, degrees.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "wirefield/simulation.hpp"
#include "wirefield/stress.hpp"

namespace wirefield {

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

// The elevations of the low-angle table, degrees: those that carry long-distance contacts,
// the ones portable operators compare antennas at (common practice).
inline constexpr double kLowAngleElevations_deg[] = {5.0, 10.0, 15.0, 20.0, 30.0};
// A maximum above this elevation (degrees) is "near the zenith": an azimuth cut there is a
// small circle that says nothing about directions toward the horizon, so the default azimuth
// cut is taken at kLowAzimuthCutElevation_deg instead.
inline constexpr double kNearZenithElevation_deg = 60.0;
// The elevation of the default azimuth cut when the maximum is near the zenith: the elevation
// `batch` compares antennas at by default (its --elevation), so both commands quote one
// figure.
inline constexpr double kLowAzimuthCutElevation_deg = 10.0;
// The text report prints a gain more than this far below the maximum (dB) as "below -40 dB
// of max": the field there is a null of the pattern, whose exact depth is numerical noise
// (a symmetric null comes out as -300 dBi or less).
inline constexpr double kTextFloor_db = 40.0;

struct PatternOptions {
  // Grid step of the search for the maximum and of the cuts, degrees. Default 1; smaller is
  // finer and slower (the cost grows as 1/step^2 for the search).
  double step_deg = 1.0;
  // Elevation of the azimuth cut, degrees; default the take-off angle, or
  // kLowAzimuthCutElevation_deg when the maximum is near the zenith.
  std::optional<double> azimuth_cut_elevation_deg;
  // Azimuth of the elevation cut, degrees (0..360); default the strongest low-angle
  // direction (PatternResult::low_angle).
  std::optional<double> elevation_cut_azimuth_deg;
  // Threads that evaluate the far field (search grid, cuts, power integration). Default 0:
  // one per core. The result is the same to the bit for any count; callers that compute
  // several patterns at once on their own threads (batches) pass 1.
  int threads = 0;

  // Checks every field against its bound (the cut's elevation may be negative only in free
  // space, over_ground false); throws InputError (file: the field's name, such as "step_deg",
  // at 1:1) whose message begins with that name and states the bound.
  void Validate(bool over_ground) const;
};

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

// The far field of a solved model in one direction.
FarFieldPoint FarField(const Simulation& simulation, const SolveResult& solved,
                       double elevation_deg, double azimuth_deg);

// The best sample of an azimuth cut (the first of those within 1e-9 dB of it, so that equal
// lobes differing by rounding keep a stable choice; the cut's repeated 360 deg never wins
// over 0 deg): the low-angle gain of `pattern` and `batch`.
DirectionGain BestOverAzimuth(const PatternCut& azimuth_cut);

// Gain search, cuts, figures of merit and the power budget.
PatternResult ComputePattern(const Simulation& simulation, const SolveResult& solved,
                             const PatternOptions& options = {});

// Reports (the command-line program prints these).
// With `stress` and `exposure` (a --power run), their sections (text) or keys "stress" and
// "exposure" (JSON).
std::string FormatPatternText(const Simulation& simulation, const PatternResult& pattern,
                              const StressResult* stress = nullptr,
                              const ExposureResult* exposure = nullptr);
std::string FormatPatternJson(const Simulation& simulation, const PatternResult& pattern,
                              const StressResult* stress = nullptr,
                              const ExposureResult* exposure = nullptr);
std::string FormatPatternCsv(const PatternResult& pattern);
// Two polar plots (elevation and azimuth cut, dB scale) as one self-contained SVG document.
std::string FormatPatternSvg(const Simulation& simulation, const PatternResult& pattern);

}  // namespace wirefield
