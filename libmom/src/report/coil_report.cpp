// Report stage: a coil analysis (wirefield/coil.hpp) as a readable text report with units and
// as the JSON document of the `coil` command (docs/commands.md). Input: the coil and its
// analysis (and the target inductance when the turns were designed); output: text. Every
// number is checked to be finite before it is printed.
#include <fmt/format.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <string>

#include "wirefield/coil.hpp"
#include "wirefield/model.hpp"
#include "wirefield/report.hpp"

namespace wirefield {
namespace {

void CheckFinite(const nlohmann::json& doc) {
  for (const auto& [key, value] : doc.items()) {
    if (value.is_number_float() && !std::isfinite(value.get<double>())) {
      throw ComputationError(fmt::format("the coil report has a non-finite {}", key));
    }
  }
}

nlohmann::json CoilDocument(const CoilSpec& c, const CoilAnalysis& a,
                            std::optional<double> target_inductance_h) {
  nlohmann::json doc;
  if (target_inductance_h) doc["target_inductance_h"] = *target_inductance_h;
  doc["turns"] = c.turns;
  doc["former_diameter_m"] = c.former_diameter_m;
  doc["sheet_diameter_m"] = a.sheet_diameter_m;
  doc["length_m"] = a.length_m;
  doc["pitch_m"] = a.pitch_m;
  doc["wire_diameter_m"] = c.wire_diameter_m;
  doc["insulation_m"] = c.insulation_m;
  doc["material"] = c.material;
  doc["conductivity_s_per_m"] = c.conductivity_s_per_m;
  doc["wire_length_m"] = a.wire_length_m;
  doc["nagaoka_coefficient"] = a.nagaoka_coefficient;
  doc["inductance_sheet_h"] = a.inductance_sheet_h;
  doc["rosa_correction_h"] = a.rosa_correction_h;
  doc["inductance_h"] = a.inductance_h;
  doc["inductance_wheeler_h"] = a.inductance_wheeler_h;
  doc["medhurst_h_pf_per_cm"] = a.medhurst_h_pf_per_cm;
  doc["self_capacitance_f"] = a.self_capacitance_f;
  doc["self_resonance_hz"] = a.self_resonance_hz;
  doc["frequency_hz"] = a.frequency_hz;
  doc["dc_resistance_ohm"] = a.dc_resistance_ohm;
  doc["skin_depth_m"] = a.skin_depth_m;
  doc["straight_wire_resistance_ohm"] = a.straight_wire_resistance_ohm;
  doc["proximity_factor"] = a.proximity_factor;
  doc["ac_resistance_ohm"] = a.ac_resistance_ohm;
  doc["reactance_ohm"] = a.reactance_ohm;
  doc["q"] = a.q;
  doc["apparent_resistance_ohm"] = a.apparent_resistance_ohm;
  doc["apparent_inductance_h"] = a.apparent_inductance_h;
  doc["apparent_q"] = a.apparent_q;
  CheckFinite(doc);
  doc["z_ohm"] = nlohmann::json::array({a.impedance_ohm.real(), a.impedance_ohm.imag()});
  if (!std::isfinite(a.impedance_ohm.real()) || !std::isfinite(a.impedance_ohm.imag())) {
    throw ComputationError("the coil report has a non-finite z_ohm");
  }
  doc["notes"] = a.notes;
  return doc;
}

}  // namespace

std::string FormatCoilJson(const CoilSpec& coil, const CoilAnalysis& analysis,
                           std::optional<double> target_inductance_h) {
  return CoilDocument(coil, analysis, target_inductance_h).dump(2) + "\n";
}

std::string FormatCoilText(const CoilSpec& c, const CoilAnalysis& a,
                           std::optional<double> target_inductance_h) {
  CoilDocument(c, a, target_inductance_h);  // the same finiteness checks as the JSON
  std::string out = "wirefield coil: single-layer air-core solenoid\n";
  if (target_inductance_h) {
    out += fmt::format("  designed for     {:.6g} uH: {:.4f} turns (wind {:.0f} and trim)\n",
                       *target_inductance_h * 1e6, c.turns, std::ceil(c.turns));
  }
  out += fmt::format("  turns            {:.6g}\n", c.turns);
  out += fmt::format(
      "  former           {:.6g} mm diameter; current sheet at the wire centres, "
      "{:.6g} mm\n",
      c.former_diameter_m * 1e3, a.sheet_diameter_m * 1e3);
  out += fmt::format(
      "  winding          {:.6g} mm long, pitch {:.6g} mm (length/diameter "
      "{:.3g})\n",
      a.length_m * 1e3, a.pitch_m * 1e3, a.length_m / a.sheet_diameter_m);
  out += fmt::format("  wire             {:.6g} mm {}, insulation {:.6g} mm, {:.6g} m of it\n",
                     c.wire_diameter_m * 1e3, c.material, c.insulation_m * 1e3, a.wire_length_m);
  out += "\nInductance\n";
  out += fmt::format("  Nagaoka          {:.6g} uH (current sheet, K_N = {:.6f})\n",
                     a.inductance_sheet_h * 1e6, a.nagaoka_coefficient);
  out += fmt::format("  Rosa correction  -{:.4g} uH (round wire)\n", a.rosa_correction_h * 1e6);
  out += fmt::format("  L                {:.6g} uH  (used)\n", a.inductance_h * 1e6);
  out +=
      fmt::format("  Wheeler          {:.6g} uH (for comparison)\n", a.inductance_wheeler_h * 1e6);
  out += "\nSelf-capacitance (Medhurst)\n";
  out += fmt::format("  C                {:.4g} pF (H = {:.3g} pF/cm)\n",
                     a.self_capacitance_f * 1e12, a.medhurst_h_pf_per_cm);
  out += fmt::format("  self-resonance   {:.4g} MHz (lumped estimate; leads lower it)\n",
                     a.self_resonance_hz / 1e6);
  out += fmt::format("\nAt {:.6g} MHz\n", a.frequency_hz / 1e6);
  out += fmt::format("  R_dc             {:.4g} ohm\n", a.dc_resistance_ohm);
  out += fmt::format("  skin depth       {:.4g} mm\n", a.skin_depth_m * 1e3);
  out += fmt::format(
      "  R_ac             {:.4g} ohm (straight wire {:.4g} ohm, Medhurst "
      "proximity factor {:.3g})\n",
      a.ac_resistance_ohm, a.straight_wire_resistance_ohm, a.proximity_factor);
  out += fmt::format("  X_L              {:.6g} ohm\n", a.reactance_ohm);
  out += fmt::format("  Q                {:.4g}\n", a.q);
  out += fmt::format(
      "  at the terminals {:.6g} {} j{:.6g} ohm with the self-capacitance: "
      "L {:.6g} uH, Q {:.4g}\n",
      a.impedance_ohm.real(), a.impedance_ohm.imag() < 0 ? "-" : "+",
      std::abs(a.impedance_ohm.imag()), a.apparent_inductance_h * 1e6, a.apparent_q);
  if (!a.notes.empty()) {
    out += "\nNotes\n";
    for (const std::string& note : a.notes) out += "  - " + note + "\n";
  }
  out +=
      "\nCaution: a loading coil at transmitting power carries high RF voltage across its "
      "turns and\nends, and heats; keep it out of reach, rate its insulation and former for "
      "the voltage, and\nfollow local rules and licensed practice.\n";
  return out;
}

}  // namespace wirefield
