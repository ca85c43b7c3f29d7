// Model stage: SI dimensions and the unit suffixes of the model language.
// A Dimension is the exponent vector over (m, kg, s, A); each unit maps a suffix such as
// "MHz" to a factor and a dimension. Inputs: unit names; outputs: factors and descriptions
// such as "a resistance (ohm)" used in diagnostics.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace wirefield::model {

// Exponents of the SI base units metre, kilogram, second, ampere.
struct Dimension {
  std::array<int, 4> exponent{};  // m, kg, s, A

  bool operator==(const Dimension&) const = default;
  bool IsNone() const { return exponent == std::array<int, 4>{}; }
};

Dimension Multiply(const Dimension& a, const Dimension& b);
Dimension Divide(const Dimension& a, const Dimension& b);
Dimension Power(const Dimension& a, int power);

// The dimensions the language names.
inline constexpr Dimension kNone{};
inline constexpr Dimension kLength{{1, 0, 0, 0}};
inline constexpr Dimension kArea{{2, 0, 0, 0}};
inline constexpr Dimension kFrequency{{0, 0, -1, 0}};
inline constexpr Dimension kResistance{{2, 1, -3, -2}};
inline constexpr Dimension kInductance{{2, 1, -2, -2}};
inline constexpr Dimension kCapacitance{{-2, -1, 4, 2}};
inline constexpr Dimension kVoltage{{2, 1, -3, -1}};

// A quantity a statement asks for: its name in messages and the units that express it.
struct Quantity {
  std::string_view noun;       // "a length"
  std::string_view si_unit;    // "m"
  std::string_view unit_list;  // "m, cm, mm, ft, in"
  Dimension dimension;
};
const Quantity& LengthQuantity();
const Quantity& AreaQuantity();
const Quantity& FrequencyQuantity();
const Quantity& ResistanceQuantity();
const Quantity& InductanceQuantity();
const Quantity& CapacitanceQuantity();
const Quantity& VoltageQuantity();

// "a length (m)", "a plain number", or "a quantity in kg m^2 s^-3" for unnamed dimensions.
std::string Describe(const Dimension& dimension);

// A unit suffix: value_si = number * factor, with the given dimension.
struct Unit {
  std::string_view name;
  double factor;
  Dimension dimension;
};

// The unit of that exact (case-sensitive) name, or nullptr.
const Unit* FindUnit(std::string_view name);
// Every unit name, in the order of the documentation table.
std::vector<std::string> UnitNames();
// "lengths m cm mm ft in; frequencies Hz kHz MHz GHz; ..." for messages.
std::string KnownUnitsSummary();
// True for m, cm, mm, ft, in: the units a `units` statement accepts.
bool IsLengthUnitName(std::string_view name);

}  // namespace wirefield::model
