// Model stage: the table of allowed ranges (ranges.hpp). Each bound keeps a value out of
// which no wirefield result can be trusted, or which overflows double precision later in the
// fill, the solve or the network chain; see docs/model-language.md "Allowed ranges".
#include "model/ranges.hpp"

#include <fmt/format.h>

#include <cmath>

#include "model/expression.hpp"

namespace wirefield::model {

const std::vector<ValueRange>& ValueRanges() {
  // clang-format off
  static const std::vector<ValueRange> kTable = {
      {ValueKind::kCoordinateM, "a coordinate or shape size", 0.0, 1e5, true, "m",
       "100 km bounds any wire antenna; larger values overflow the kernel's distances squared"},
      {ValueKind::kRadiusM, "a wire radius", 1e-7, 10.0, false, "m",
       "0.1 um to 10 m: thinner than any drawn wire, thicker than any mast"},
      // Radio waves are those below 3000 GHz (ITU Radio Regulations, No. 1.5; from memory).
      {ValueKind::kFrequencyHz, "a frequency", 1.0, 3e12, false, "Hz",
       "1 Hz to 3000 GHz, the radio spectrum"},
      {ValueKind::kVoltageV, "a feed voltage", 1e-6, 1e6, true, "V",
       "1 uV to 1 MV, either sign; the currents scale with it and must stay finite"},
      {ValueKind::kResistanceOhm, "a load resistance", 0.0, 1e12, false, "ohm",
       "0 to 1 Tohm; above that the load is an open circuit"},
      {ValueKind::kInductanceH, "an inductance", 0.0, 1e3, false, "H", "0 to 1 kH"},
      {ValueKind::kCapacitanceF, "a capacitance", 1e-18, 1.0, false, "F", "1 aF to 1 F"},
      {ValueKind::kImpedanceOhm, "a reference or line impedance", 1e-3, 1e6, false, "ohm",
       "1 mohm to 1 Mohm; reflection coefficients against it must stay finite"},
      {ValueKind::kPermittivity, "a relative permittivity", 1.0, 1e3, false, "",
       "1 (vacuum) to 1000; water is about 80"},
      {ValueKind::kConductivitySPerM, "a conductivity", 0.0, 1e9, false, "S/m",
       "0 to 1e9 S/m; silver is about 6.3e7 S/m"},
      {ValueKind::kPermeability, "a relative permeability", 1.0, 1e6, false, "",
       "1 to 1e6"},
      {ValueKind::kLineLengthM, "a line length", 1e-6, 1e5, false, "m",
       "1 um to 100 km; longer lines overflow the line's hyperbolic functions"},
      {ValueKind::kCoilSizeM, "a coil size", 0.0, 100.0, false, "m", "0 to 100 m"},
      {ValueKind::kCoilTurns, "coil turns", 1.0, 1e6, false, "", "1 to 1e6 turns"},
      {ValueKind::kTransformerTurns, "transformer turns", 1e-3, 1e6, false, "",
       "0.001 to 1e6 turns on each side"},
      {ValueKind::kPowerW, "a power", 1e-9, 1e7, false, "W", "1 nW to 10 MW"},
      {ValueKind::kLossDbPer100m, "a line loss figure", 0.0, 1e4, false, "dB/100 m",
       "0 to 10 000 dB per 100 m"},
      {ValueKind::kAlNanohenryPerTurn2, "a core's A_L", 1e-3, 1e7, false, "nH/turn^2",
       "0.001 to 1e7 nH/turn^2"},
      {ValueKind::kQuality, "a Q", 1e-3, 1e6, false, "", "0.001 to 1e6"},
  };
  // clang-format on
  return kTable;
}

const ValueRange& RangeOf(ValueKind kind) {
  for (const ValueRange& r : ValueRanges()) {
    if (r.kind == kind) return r;
  }
  return ValueRanges().front();  // unreachable: every kind has a row
}

namespace {
std::string WithUnit(double v, std::string_view unit) {
  return unit.empty() ? FormatNumber(v) : fmt::format("{} {}", FormatNumber(v), unit);
}
}  // namespace

std::string DescribeRange(ValueKind kind) {
  const ValueRange& r = RangeOf(kind);
  if (r.signed_value && r.min_si == 0.0) {
    return fmt::format("-{} to {}", WithUnit(r.max_si, r.unit), WithUnit(r.max_si, r.unit));
  }
  if (r.signed_value) {
    return fmt::format("{} to {} in magnitude, either sign", WithUnit(r.min_si, r.unit),
                       WithUnit(r.max_si, r.unit));
  }
  return fmt::format("{} to {}", WithUnit(r.min_si, r.unit), WithUnit(r.max_si, r.unit));
}

std::optional<std::string> OutOfRange(ValueKind kind, double value_si, std::string_view what) {
  const ValueRange& r = RangeOf(kind);
  const double v = r.signed_value ? std::fabs(value_si) : value_si;
  if (std::isfinite(v) && v >= r.min_si && v <= r.max_si) return std::nullopt;
  return fmt::format("{} must be {}; got {}", what, DescribeRange(kind),
                     WithUnit(value_si, r.unit));
}

}  // namespace wirefield::model
