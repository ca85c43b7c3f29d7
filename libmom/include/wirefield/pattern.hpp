// wirefield public API, part 4: the far field, gain, radiation pattern and power budget of a
// solved model (free space, or the upper half-space over a perfect or real ground).
// Angles: elevation up from the horizon (90 = zenith), azimuth from +x toward +y, degrees.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "wirefield/results.hpp"
#include "wirefield/simulation.hpp"
#include "wirefield/stress.hpp"

namespace wirefield {

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

}  // namespace wirefield
