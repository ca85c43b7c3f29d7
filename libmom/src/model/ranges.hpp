// Model stage: the allowed range of every numeric input, one row per kind of value.
// The parser and the command-line options check each value against its row before any
// work starts, so no value can overflow the fill, the solve or the network chain later.
// Inputs: a kind and a value in SI; output: nothing, or the message that states the range.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace wirefield::model {

enum class ValueKind {
  kCoordinateM,          // a point's X, Y or Z, a shape's size (m)
  kRadiusM,              // a wire's radius (m)
  kFrequencyHz,          // the frequency of a model or an option (Hz)
  kVoltageV,             // a feed's voltage (V), either sign
  kResistanceOhm,        // a load's R (ohm)
  kInductanceH,          // a load's L, a coil's or a transformer's inductance (H)
  kCapacitanceF,         // a load's C (F)
  kImpedanceOhm,         // z0, a line's or a reference impedance (ohm)
  kPermittivity,         // a ground's relative permittivity
  kConductivitySPerM,    // a ground's or a wire's conductivity (S/m)
  kPermeability,         // a wire's relative permeability
  kLineLengthM,          // a transmission line's length (m)
  kCoilSizeM,            // a coil's diameter, length, pitch, wire diameter (m)
  kCoilTurns,            // a coil's turns
  kTransformerTurns,     // a transformer's primary or secondary turns
  kPowerW,               // a transmitter power (W)
  kLossDbPer100m,        // a line's matched loss figure (dB per 100 m)
  kAlNanohenryPerTurn2,  // a transformer core's A_L (nH/turn^2)
  kQuality,              // a transformer core's Q
};

// One row of the table: [min_si, max_si] (on the magnitude when signed), its unit.
struct ValueRange {
  ValueKind kind;
  std::string_view name;  // "a length", for the docs
  double min_si;
  double max_si;
  bool signed_value;  // the sign is free; the range bounds the magnitude
  std::string_view unit;
  std::string_view why;  // what the bounds keep out, for the docs
};

// The table, in the order of docs/model-language.md "Allowed ranges".
const std::vector<ValueRange>& ValueRanges();
const ValueRange& RangeOf(ValueKind kind);

// Empty when `value_si` lies in the range of `kind`, else "WHAT must be from MIN to MAX UNIT;
// got VALUE UNIT" (NaN and infinities are outside every range).
std::optional<std::string> OutOfRange(ValueKind kind, double value_si, std::string_view what);

// "1e-07 m to 10 m" for messages and docs.
std::string DescribeRange(ValueKind kind);

}  // namespace wirefield::model
