// wirefield public API, part 10: stress and exposure at a transmitter power. Scales a solved
// model so the transmitter delivers a given power into its feed chain(s), and reports the
// voltages, currents and dissipation at every load, both sides of each feed's transformer,
// the compensation capacitor, and the free wire ends (from the segment charges); and a
// far-field estimate of the distance beyond which RF exposure falls below general-public
// limits. Implemented in libmom/src/post/stress.cpp; the method is in docs/numerics.md §7c.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "wirefield/model.hpp"
#include "wirefield/results.hpp"
#include "wirefield/simulation.hpp"

namespace wirefield {

struct StressOptions {
  // Power the transmitter delivers into the feed chain(s) (line, transformer, feed), W; > 0.
  // With several feeds the solved excitations keep their ratios and the total is this power.
  double power_w = 100.0;
  // Peak voltage above which a capacitor (a load's C, the compensation capacitor) gets a
  // caution, V; > 0.
  double capacitor_rating_v = kDefaultCapacitorRatingV;
  // Peak voltage above which a coil or another load gets a caution, V; > 0.
  double load_rating_v = kDefaultLoadRatingV;

  // Checks every field against its bound; throws InputError (file: the field's name, such as
  // "power_w", at 1:1) whose message begins with that name and states the bound.
  void Validate() const;
};

// Scales `solved` (a solve of `model`) to the transmitter power and computes the stress.
// Throws InputError for a non-positive power or rating, ComputationError when no power
// enters the feeds or a result is not finite.
StressResult ComputeStress(const Model& model, const SolveResult& solved,
                           const StressOptions& options);

std::vector<StressPeak> HighestStress(const std::vector<StressResult>& results);

// --- RF exposure --------------------------------------------------------------------------

enum class TransmitMode { kSsb, kCw, kFm, kDigital, kCarrier };

// The mode's duty factor (common practice): SSB 0.2, CW 0.4, FM, digital and carrier 1.0.
double ModeDutyFactor(TransmitMode mode);
// "ssb", "cw", "fm", "digital", "carrier".
std::string ToString(TransmitMode mode);

struct ExposureOptions {
  double power_w = 100.0;  // transmitter power, W; > 0
  TransmitMode mode = TransmitMode::kCarrier;
  // Duty factor of the emission, 0 < duty <= 1; empty: the mode's.
  std::optional<double> duty;
  // Share of the averaging time (30 min for the general public) spent transmitting,
  // 0 < share <= 1. Default 1 (transmitting all the time, the worst case).
  double transmit_fraction = 1.0;

  // Checks every field against its bound; throws InputError (file: the field's name, such as
  // "duty", at 1:1) whose message begins with that name and states the bound.
  void Validate() const;
};

// S = 2.56 P_avg G / (4 pi R^2) (far field, with the ground-reflection factor 1.6^2 of U.S.
// evaluations): the power density at distance_m, W/m^2.
double ExposurePowerDensity(double average_power_w, double gain_numeric, double distance_m);
// General-public limits at a frequency, W/m^2 (empty where the table has none).
std::optional<double> FccGeneralPublicLimit(double frequency_hz);
std::optional<double> IcnirpGeneralPublicLimit(double frequency_hz);

// Throws InputError for a non-positive power or a duty or share outside (0, 1].
ExposureResult EstimateExposure(double frequency_hz, double max_gain_dbi,
                                const ExposureOptions& options);

}  // namespace wirefield
