// Post stage: the far-field RF exposure estimate (wirefield/stress.hpp). Power, duty factor
// and the pattern's maximum gain -> power density S = 2.56 P_avg G / (4 pi R^2) (FCC OET
// Bulletin 65, the ground-reflection factor 1.6^2) -> the distance where S falls to the
// general-public limits of 47 CFR 1.1310 Table 1 and of the ICNIRP 2020 guidelines.
// docs/numerics.md §7d.
#include <fmt/format.h>

#include <cmath>

#include "core/constants.hpp"
#include "core/enum_names.hpp"
#include "wirefield/stress.hpp"

namespace wirefield {
namespace {

// The field-reflection factor 1.6 of U.S. evaluations, squared for power density: FCC OET
// Bulletin 65 (1997), Section 2 (the EPA ground-reflection model); S = 0.64 EIRP / (pi R^2).
constexpr double kGroundReflectionFactor = 1.6 * 1.6;

std::string Metres(double m) { return fmt::format("{:.1f} m", m); }

}  // namespace

double ModeDutyFactor(TransmitMode mode) {
  // Common practice: speech on SSB averages about a fifth of the peak envelope power, keyed
  // CW about 40%; FM, most digital modes and a carrier run at full power.
  switch (mode) {
    case TransmitMode::kSsb:
      return 0.2;
    case TransmitMode::kCw:
      return 0.4;
    case TransmitMode::kFm:
    case TransmitMode::kDigital:
    case TransmitMode::kCarrier:
      return 1.0;
  }
  return 1.0;
}

std::string ToString(TransmitMode mode) {
  static constexpr core::EnumNames<TransmitMode, 5> kNames = {
      {{TransmitMode::kSsb, "ssb"},
       {TransmitMode::kCw, "cw"},
       {TransmitMode::kFm, "fm"},
       {TransmitMode::kDigital, "digital"},
       {TransmitMode::kCarrier, "carrier"}}};
  return core::NameOf(mode, kNames, "carrier");
}

double ExposurePowerDensity(double average_power_w, double gain_numeric, double distance_m) {
  return kGroundReflectionFactor * average_power_w * gain_numeric /
         (4.0 * core::kPi * distance_m * distance_m);
}

std::optional<double> FccGeneralPublicLimit(double frequency_hz) {
  // 47 CFR 1.1310 Table 1 (B), general population/uncontrolled exposure, averaged over 30 min;
  // mW/cm^2 with f in MHz (1 mW/cm^2 = 10 W/m^2).
  const double f = frequency_hz / 1e6;
  double mw_per_cm2 = 0.0;
  if (f < 0.3 || f > 100000.0) return std::nullopt;
  if (f < 1.34) {
    mw_per_cm2 = 100.0;
  } else if (f < 30.0) {
    mw_per_cm2 = 180.0 / (f * f);
  } else if (f < 300.0) {
    mw_per_cm2 = 0.2;
  } else if (f < 1500.0) {
    mw_per_cm2 = f / 1500.0;
  } else {
    mw_per_cm2 = 1.0;
  }
  return mw_per_cm2 * 10.0;
}

std::optional<double> IcnirpGeneralPublicLimit(double frequency_hz) {
  // ICNIRP 2020 guidelines (Health Physics 118(5):483-524), Table 5, general public, whole
  // body averaged over 30 min (from memory): 0.1-30 MHz E = 300/f^0.7 V/m and H = 2.2/f A/m
  // (no power density; here the plane-wave equivalent of the stricter of the two, E^2/eta0
  // or eta0 H^2); 30-400 MHz 2 W/m^2; 400-2000 MHz f/200 W/m^2; 2-300 GHz 10 W/m^2.
  const double f = frequency_hz / 1e6;
  if (f < 0.1 || f > 300000.0) return std::nullopt;
  if (f <= 30.0) {
    const double e_v_per_m = 300.0 / std::pow(f, 0.7);
    const double h_a_per_m = 2.2 / f;
    return std::min(e_v_per_m * e_v_per_m / core::kEta0_ohm,
                    core::kEta0_ohm * h_a_per_m * h_a_per_m);
  }
  if (f <= 400.0) return 2.0;
  if (f <= 2000.0) return f / 200.0;
  return 10.0;
}

ExposureResult EstimateExposure(double frequency_hz, double max_gain_dbi,
                                const ExposureOptions& options) {
  options.Validate();
  if (!std::isfinite(max_gain_dbi) || !(frequency_hz > 0.0)) {
    throw ComputationError(
        fmt::format("exposure: needs a finite gain and a positive frequency; got {} dBi, {} Hz",
                    max_gain_dbi, frequency_hz));
  }
  ExposureResult r;
  r.frequency_hz = frequency_hz;
  r.power_w = options.power_w;
  r.mode = ToString(options.mode);
  r.duty = options.duty.value_or(ModeDutyFactor(options.mode));
  r.transmit_fraction = options.transmit_fraction;
  r.average_power_w = r.power_w * r.duty * r.transmit_fraction;
  r.gain_dbi = max_gain_dbi;
  r.gain_numeric = std::pow(10.0, max_gain_dbi / 10.0);
  // S(R) = limit  <=>  R = sqrt(2.56 P_avg G / (4 pi limit)).
  auto distance = [&r](double limit_w_per_m2) {
    return std::sqrt(kGroundReflectionFactor * r.average_power_w * r.gain_numeric /
                     (4.0 * core::kPi * limit_w_per_m2));
  };
  r.fcc_limit_w_per_m2 = FccGeneralPublicLimit(frequency_hz);
  if (r.fcc_limit_w_per_m2) r.fcc_distance_m = distance(*r.fcc_limit_w_per_m2);
  r.icnirp_limit_w_per_m2 = IcnirpGeneralPublicLimit(frequency_hz);
  if (r.icnirp_limit_w_per_m2) r.icnirp_distance_m = distance(*r.icnirp_limit_w_per_m2);

  const double wavelength_m = core::kSpeedOfLight_m_per_s / frequency_hz;
  r.cautions.push_back(
      "This is a far-field estimate from the maximum gain in any direction, with the "
      "ground-reflection factor of U.S. evaluations; it is not a compliance evaluation.");
  r.cautions.push_back(fmt::format(
      "Closer than about a wavelength ({} here) the antenna's near field dominates: near "
      "HF antennas the fields need more care (a near-field evaluation or a measurement), and "
      "the distances above may be too short there.",
      Metres(wavelength_m)));
  r.cautions.push_back(
      "Local rules and licensed practice decide which limits apply and how compliance is "
      "shown; keep people clear of the antenna while transmitting.");
  return r;
}

}  // namespace wirefield
