// Model stage: the unit table and dimension algebra of the model language.
// Factors are exact SI definitions: 1 ft = 0.3048 m and 1 in = 0.0254 m by the international
// yard and pound agreement of 1959; 1 deg = pi/180 rad. Outputs factors and descriptions.
#include "model/units.hpp"

#include <fmt/format.h>

#include "core/constants.hpp"

namespace wirefield::model {

Dimension Multiply(const Dimension& a, const Dimension& b) {
  Dimension r;
  for (size_t i = 0; i < r.exponent.size(); ++i) r.exponent[i] = a.exponent[i] + b.exponent[i];
  return r;
}

Dimension Divide(const Dimension& a, const Dimension& b) {
  Dimension r;
  for (size_t i = 0; i < r.exponent.size(); ++i) r.exponent[i] = a.exponent[i] - b.exponent[i];
  return r;
}

Dimension Power(const Dimension& a, int power) {
  Dimension r;
  for (size_t i = 0; i < r.exponent.size(); ++i) r.exponent[i] = a.exponent[i] * power;
  return r;
}

namespace {

constexpr Quantity kLengthQ{"a length", "m", "m, cm, mm, ft, in", kLength};
constexpr Quantity kAreaQ{"an area", "m^2", "mm2, cm2, m2", kArea};
constexpr Quantity kFrequencyQ{"a frequency", "Hz", "Hz, kHz, MHz, GHz", kFrequency};
constexpr Quantity kResistanceQ{"a resistance", "ohm", "ohm, kohm", kResistance};
constexpr Quantity kInductanceQ{"an inductance", "H", "H, mH, uH, nH", kInductance};
constexpr Quantity kCapacitanceQ{"a capacitance", "F", "F, uF, nF, pF", kCapacitance};
constexpr Quantity kVoltageQ{"a voltage", "V", "V, mV, kV", kVoltage};

// Named only in messages (no suffix of the language gives them directly).
constexpr Quantity kDescribedOnly[] = {
    {"a time", "s", "", Dimension{{0, 0, 1, 0}}},
    {"a current", "A", "", Dimension{{0, 0, 0, 1}}},
    {"a conductance", "S", "", Dimension{{-2, -1, 3, 2}}},
    {"a power", "W", "", Dimension{{2, 1, -3, 0}}},
};

constexpr double kDegree = core::kPi / 180.0;

// The unit table. Sources: SI Brochure, 9th ed. (BIPM 2019) for the prefixes; the
// international yard and pound agreement of 1959 for ft and in. The areas are the squares of
// their lengths (mm2 is the square millimetre of wire cross-sections, IEC 60228).
constexpr Unit kUnits[] = {
    {"m", 1.0, kLength},         {"cm", 1e-2, kLength},      {"mm", 1e-3, kLength},
    {"ft", 0.3048, kLength},     {"in", 0.0254, kLength},    {"mm2", 1e-6, kArea},
    {"cm2", 1e-4, kArea},        {"m2", 1.0, kArea},         {"Hz", 1.0, kFrequency},
    {"kHz", 1e3, kFrequency},    {"MHz", 1e6, kFrequency},   {"GHz", 1e9, kFrequency},
    {"ohm", 1.0, kResistance},   {"kohm", 1e3, kResistance}, {"H", 1.0, kInductance},
    {"mH", 1e-3, kInductance},   {"uH", 1e-6, kInductance},  {"nH", 1e-9, kInductance},
    {"F", 1.0, kCapacitance},    {"uF", 1e-6, kCapacitance}, {"nF", 1e-9, kCapacitance},
    {"pF", 1e-12, kCapacitance}, {"V", 1.0, kVoltage},       {"mV", 1e-3, kVoltage},
    {"kV", 1e3, kVoltage},       {"deg", kDegree, kNone},
};

}  // namespace

const Quantity& LengthQuantity() { return kLengthQ; }
const Quantity& AreaQuantity() { return kAreaQ; }
const Quantity& FrequencyQuantity() { return kFrequencyQ; }
const Quantity& ResistanceQuantity() { return kResistanceQ; }
const Quantity& InductanceQuantity() { return kInductanceQ; }
const Quantity& CapacitanceQuantity() { return kCapacitanceQ; }
const Quantity& VoltageQuantity() { return kVoltageQ; }

std::string Describe(const Dimension& dimension) {
  if (dimension.IsNone()) return "a plain number";
  for (const Quantity* q : {&kLengthQ, &kAreaQ, &kFrequencyQ, &kResistanceQ, &kInductanceQ,
                            &kCapacitanceQ, &kVoltageQ}) {
    if (q->dimension == dimension) return fmt::format("{} ({})", q->noun, q->si_unit);
  }
  for (const Quantity& q : kDescribedOnly) {
    if (q.dimension == dimension) return fmt::format("{} ({})", q.noun, q.si_unit);
  }
  static constexpr std::string_view kBase[] = {"m", "kg", "s", "A"};
  std::string text;
  for (size_t i = 0; i < dimension.exponent.size(); ++i) {
    const int e = dimension.exponent[i];
    if (e == 0) continue;
    if (!text.empty()) text += ' ';
    text += kBase[i];
    if (e != 1) text += fmt::format("^{}", e);
  }
  return "a quantity in " + text;
}

const Unit* FindUnit(std::string_view name) {
  for (const Unit& u : kUnits) {
    if (u.name == name) return &u;
  }
  return nullptr;
}

std::vector<std::string> UnitNames() {
  std::vector<std::string> names;
  for (const Unit& u : kUnits) names.emplace_back(u.name);
  return names;
}

std::string KnownUnitsSummary() {
  return "lengths m cm mm ft in; areas mm2 cm2 m2; frequencies Hz kHz MHz GHz; resistance ohm "
         "kohm; "
         "inductance H mH uH nH; capacitance F uF nF pF; voltage V mV kV; angle deg";
}

bool IsLengthUnitName(std::string_view name) {
  const Unit* u = FindUnit(name);
  return u != nullptr && u->dimension == kLength;
}

}  // namespace wirefield::model
