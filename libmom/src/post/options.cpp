// Post stage: the checks of the post-processing options (pattern, stress, exposure), run as a
// whole before any work. Each failure is an InputError whose file is the field's name and
// whose message begins with it and states the bound, so a caller can say it in its own words
// (the program names its flags instead). Inputs: an options struct; outputs: nothing or the
// error.
#include <fmt/format.h>

#include <cmath>
#include <string>

#include "model/ranges.hpp"
#include "wirefield/pattern.hpp"
#include "wirefield/stress.hpp"

namespace wirefield {
namespace {

// The grid step's bounds: finer than 0 is meaningless; coarser than 10 deg misses the maximum
// of a lobe by up to 5 deg and blurs beamwidths, and the search cost grows as 1/step^2.
constexpr double kMaxPatternStep_deg = 10.0;

[[noreturn]] void Fail(const std::string& field, const std::string& message) {
  throw InputError(SourceLocation{field, 1, 1}, message);
}

void RequirePositiveFinite(double value, const std::string& field) {
  if (!(value > 0.0) || !std::isfinite(value)) {
    Fail(field, fmt::format("{} must be a positive finite number; got {}", field, value));
  }
}

void RequireShare(double value, const std::string& field, const std::string& what) {
  if (!(value > 0.0 && value <= 1.0)) {
    Fail(field,
         fmt::format("{} must be a {} greater than 0 and at most 1; got {}", field, what, value));
  }
}

}  // namespace

void PatternOptions::Validate(bool over_ground) const {
  if (!(step_deg > 0.0 && step_deg <= kMaxPatternStep_deg)) {
    Fail("step_deg", fmt::format("step_deg must be greater than 0 and at most {:.0f} degrees; "
                                 "got {:.6g}",
                                 kMaxPatternStep_deg, step_deg));
  }
  if (const std::optional<double>& el = azimuth_cut_elevation_deg;
      el && !(*el >= (over_ground ? 0.0 : -90.0) && *el <= 90.0)) {
    Fail("azimuth_cut_elevation_deg",
         over_ground ? fmt::format("azimuth_cut_elevation_deg must lie between 0 and 90 degrees "
                                   "over a ground (there is no far field below it); got {:.6g}",
                                   *el)
                     : fmt::format("azimuth_cut_elevation_deg must lie between -90 and 90 "
                                   "degrees; got {:.6g}",
                                   *el));
  }
  if (const std::optional<double>& az = elevation_cut_azimuth_deg;
      az && !(*az >= 0.0 && *az <= 360.0)) {
    Fail("elevation_cut_azimuth_deg",
         fmt::format("elevation_cut_azimuth_deg must lie between 0 and 360 degrees (from +x "
                     "toward +y); got {:.6g}",
                     *az));
  }
}

void StressOptions::Validate() const {
  RequirePositiveFinite(power_w, "power_w");
  if (auto message = model::OutOfRange(model::ValueKind::kPowerW, power_w, "power_w")) {
    Fail("power_w", *message);
  }
  RequirePositiveFinite(capacitor_rating_v, "capacitor_rating_v");
  RequirePositiveFinite(load_rating_v, "load_rating_v");
}

void ExposureOptions::Validate() const {
  RequirePositiveFinite(power_w, "power_w");
  if (duty) RequireShare(*duty, "duty", "duty factor");
  RequireShare(transmit_fraction, "transmit_fraction", "share of the time");
}

}  // namespace wirefield
