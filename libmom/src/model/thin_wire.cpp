// Model stage: the hint for a radius written in the wrong unit and the radii of stranded wire
// (model/thin_wire.hpp).
#include "model/thin_wire.hpp"

#include <fmt/format.h>

#include <cmath>

#include "model/expression.hpp"

namespace wirefield::model {

std::string RadiusUnitHint(const WireSpec& wire, double max_radius_m) {
  if (!wire.radius_written_number) return "";
  const double number = *wire.radius_written_number;
  const double as_mm_m = (wire.radius_clause == "diameter" ? 0.5e-3 : 1e-3) * number;
  // Written in mm already (the radius is the number in mm): no other unit to suggest.
  if (std::abs(as_mm_m - wire.radius_m) <= 1e-9 * wire.radius_m) return "";
  if (!(as_mm_m > 0.0 && as_mm_m <= max_radius_m)) return "";
  return fmt::format(" (did you mean {} {}mm?)", wire.radius_clause, FormatNumber(number));
}

int StrandCount(int layers) { return 1 + 3 * layers * (layers + 1); }

int StrandLayers(int strands) {
  for (int layers = 0; layers <= kMaxStrandLayers; ++layers) {
    if (StrandCount(layers) == strands) return layers;
  }
  return -1;
}

double StrandedEquivalentRadius(int strands, double strand_diameter_m) {
  const int layers = StrandLayers(strands);
  if (layers <= 0) return strand_diameter_m / 2.0;
  const double m = 6.0 * layers;
  const double b = strand_diameter_m / 2.0;
  const double ring = layers * strand_diameter_m;
  return std::exp((std::log(m) + std::log(b) + (m - 1.0) * std::log(ring)) / m);
}

const SourceLocation& RadiusLocation(const WireSpec& wire) {
  return wire.radius_location.line > 0 ? wire.radius_location : wire.location;
}

}  // namespace wirefield::model
