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
#include "wirefield/simulation.hpp"

namespace wirefield {

// Common component ratings, peak volts. Small mica and ceramic capacitors are commonly rated
// about 500 V; coils and other loads on good formers stand about 2 kV (both common practice).
inline constexpr double kDefaultCapacitorRatingV = 500.0;
inline constexpr double kDefaultLoadRatingV = 2000.0;

// RMS voltage above which a free wire end gets the high-voltage caution: 50 V RMS (70.7 V
// peak), the upper limit of extra-low voltage for AC (IEC 61140, from memory). That limit is
// set for power frequencies; it serves here as the line where touching becomes dangerous
// (common practice). Below it a free end's voltage is shown without a caution.
inline constexpr double kHighVoltageRmsV = 50.0;

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

// Scales `solved` (a solve of `model`) to the transmitter power and computes the stress.
// Throws InputError for a non-positive power or rating, ComputationError when no power
// enters the feeds or a result is not finite.
StressResult ComputeStress(const Model& model, const SolveResult& solved,
                           const StressOptions& options);

// The highest of each stress over several frequencies (a sweep), with where it happens.
struct StressPeak {
  std::string what;  // e.g. "load c1 capacitor", "free end dip@end", "feed src transformer"
  double peak_v = 0.0;
  double rms_v = 0.0;
  double frequency_hz = 0.0;
  double rating_v = 0.0;  // 0 when no rating applies (feed terminals)
  bool over_rating = false;
};
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

// S = 2.56 P_avg G / (4 pi R^2) (far field, with the ground-reflection factor 1.6^2 of U.S.
// evaluations): the power density at distance_m, W/m^2.
double ExposurePowerDensity(double average_power_w, double gain_numeric, double distance_m);
// General-public limits at a frequency, W/m^2 (empty where the table has none).
std::optional<double> FccGeneralPublicLimit(double frequency_hz);
std::optional<double> IcnirpGeneralPublicLimit(double frequency_hz);

// Throws InputError for a non-positive power or a duty or share outside (0, 1].
ExposureResult EstimateExposure(double frequency_hz, double max_gain_dbi,
                                const ExposureOptions& options);

// Reports: a text section (each ending in '\n') and the JSON object as text.
std::string FormatStressText(const StressResult& stress);
std::string FormatStressJson(const StressResult& stress);
std::string FormatStressPeaksText(const std::vector<StressPeak>& peaks, double power_w);
std::string FormatStressPeaksJson(const std::vector<StressPeak>& peaks, double power_w);
std::string FormatExposureText(const ExposureResult& exposure);
std::string FormatExposureJson(const ExposureResult& exposure);

}  // namespace wirefield
