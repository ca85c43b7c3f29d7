// Report stage: a tune result as the text report of `tune` (value with its unit, impedance and
// SWR at the target, sensitivity in the trade's units, a trimming hint, the caution) and as
// its JSON document (docs/commands.md). Input: a TuneResult; output: text. Every number is
// checked to be finite before it is printed.
#include <fmt/format.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <string>

#include "report/mesh_estimate_text.hpp"
#include "report/notes.hpp"
#include "wirefield/report.hpp"
#include "wirefield/tune.hpp"

namespace wirefield {
namespace {

double Finite(double value, const std::string& what) {
  if (!std::isfinite(value)) {
    throw ComputationError(fmt::format("the tune produced a non-finite {} ({})", what, value));
  }
  return value + 0.0;  // no "-0"
}

// The unit builders trim in, and its size in SI: cm of wire, uH of coil, pF of capacitor.
struct TradeUnit {
  std::string name;
  double si = 1.0;
};

TradeUnit TradeUnitOf(const std::string& unit) {
  if (unit == "m") return {"cm", 0.01};
  if (unit == "H") return {"uH", 1e-6};
  if (unit == "F") return {"pF", 1e-12};
  if (unit.empty()) return {"unit", 1.0};
  return {unit, 1.0};
}

std::string ShowValue(const TunedVariable& v, double si) {
  if (v.unit == "m") return fmt::format("{:.4f} m", Finite(si, "value"));
  if (v.unit == "H") return fmt::format("{:.4g} uH", Finite(si * 1e6, "value"));
  if (v.unit == "F") return fmt::format("{:.4g} pF", Finite(si * 1e12, "value"));
  if (v.unit.empty()) return fmt::format("{:.6g}", Finite(si, "value"));
  return fmt::format("{:.6g} {}", Finite(si, "value"), v.unit);
}

std::string ShowZ(Complex z) {
  return fmt::format("{:.2f} {} j{:.2f} ohm", Finite(z.real(), "resistance"),
                     z.imag() < 0 ? "-" : "+", Finite(std::abs(z.imag()), "reactance"));
}

std::string TrimmingHint(const TunedVariable& v, double khz_per_unit, const TradeUnit& unit) {
  const double magnitude = std::abs(khz_per_unit);
  const bool raise_when_less = khz_per_unit < 0;  // a smaller value raises the resonance
  const std::string direction = raise_when_less ? "raises" : "lowers";
  if (v.unit == "m") {
    const double spare_m = 0.02 * std::abs(v.value_si);
    return fmt::format(
        "  Trimming (common practice): cut the wire about 2% long ({:.0f} cm more, the "
        "resonance then\n  sits about {:.0f} kHz {}), measure, and trim: each cm off {} it "
        "by about {:.1f} kHz.\n",
        spare_m * 100, magnitude * spare_m * 100, raise_when_less ? "lower" : "higher", direction,
        magnitude);
  }
  if (v.unit == "H") {
    return fmt::format(
        "  Trimming (common practice): wind a turn or two more than needed and remove turns "
        "(or spread\n  them) while measuring: each uH less {} the resonance by about {:.1f} "
        "kHz.\n",
        direction, magnitude);
  }
  if (v.unit == "F") {
    return fmt::format(
        "  Trimming (common practice): use a trimmer or a parallel pair near the value: each "
        "pF less {}\n  the resonance by about {:.1f} kHz.\n",
        direction, magnitude);
  }
  return fmt::format("  Each {} less {} the resonance by about {:.3g} kHz.\n", unit.name, direction,
                     magnitude);
}

}  // namespace

std::string FormatTuneText(const TuneResult& result) {
  std::string out =
      fmt::format("Tune: {}, feed '{}', goal {}\n", result.model_file, result.feed_name,
                  result.goal == TuneGoal::kResonance
                      ? "resonance (zero reactance at the feed terminals, before any transformer)"
                      : "min-swr (the lowest SWR at the transmitter)");
  std::string segments;
  for (int s : result.segments_used) segments += (segments.empty() ? "" : ", ") + std::to_string(s);
  out += fmt::format("Mesh: {} unknowns; segments per wire held at {} while the wires move\n",
                     result.unknowns, segments.empty() ? "the mesher's choice" : segments);
  for (const TunedVariable& v : result.variables) {
    out += fmt::format("\n{} = {}   ({}; start {}, searched {} to {})\n", v.name,
                       ShowValue(v, v.value_si), v.quantity, ShowValue(v, v.start_si),
                       ShowValue(v, v.min_si), ShowValue(v, v.max_si));
    out += fmt::format("  Target {:.4f} MHz; ", Finite(v.target_hz / 1e6, "frequency"));
    if (v.resonance_hz) {
      out +=
          fmt::format("resonance at {:.4f} MHz ({})\n", Finite(*v.resonance_hz / 1e6, "frequency"),
                      v.resonance_kind ? ToString(*v.resonance_kind) : "?");
    } else {
      out += "no resonance within 10% of the target\n";
    }
    out += fmt::format(
        "  At {:.4f} MHz: Z {} at the feed terminals; {} at the transmitter; "
        "SWR {:.2f} (z0 {:g} ohm)\n",
        v.target_hz / 1e6, ShowZ(v.z_ohm), ShowZ(v.transmitter_z_ohm), Finite(v.swr, "SWR"),
        result.z0_ohm);
    if (v.mesh_error_ohm || !v.mesh_notes.empty()) {
      out += fmt::format("  Mesh estimate at the feed terminals: Z = {}\n",
                         report::ImpedanceWithMeshError(v.z_ohm, v.mesh_error_ohm));
      for (const std::string& note : v.mesh_notes) out += fmt::format("    note: {}\n", note);
    }
    if (v.sensitivity_hz_per_si) {
      const TradeUnit unit = TradeUnitOf(v.unit);
      const double khz_per_unit = Finite(*v.sensitivity_hz_per_si * unit.si / 1e3, "sensitivity");
      out += fmt::format(
          "  Sensitivity: the resonance moves {:+.1f} kHz per {} (finite difference at -/+ {})\n",
          khz_per_unit, unit.name, ShowValue(v, v.sensitivity_step_si));
      out += TrimmingHint(v, khz_per_unit, unit);
    } else {
      out += "  Sensitivity: none (no resonance near the target to follow)\n";
    }
  }
  out += fmt::format("\n{} pass{}, {} solves, {:.2f} s\n", result.iterations,
                     result.iterations == 1 ? "" : "es", result.solves,
                     Finite(result.elapsed_s, "time"));
  out += "Trim with the transmitter off; measure with low power or an antenna analyser.\n";
  out += report::TransmitCaution();
  out += report::WarningsSection(result.warnings);
  return out;
}

std::string FormatTuneJson(const TuneResult& result) {
  auto pair = [](Complex z) {
    return nlohmann::json::array({Finite(z.real(), "resistance"), Finite(z.imag(), "reactance")});
  };
  nlohmann::json doc;
  doc["model"] = result.model_file;
  doc["feed"] = result.feed_name;
  doc["goal"] = ToString(result.goal);
  doc["kind"] = ToString(result.kind_given);
  doc["z0_ohm"] = Finite(result.z0_ohm, "z0");
  doc["variables"] = nlohmann::json::array();
  for (const TunedVariable& v : result.variables) {
    nlohmann::json j;
    j["name"] = v.name;
    j["unit"] = v.unit;
    j["quantity"] = v.quantity;
    j["value_si"] = Finite(v.value_si, "value");
    j["start_value_si"] = Finite(v.start_si, "value");
    j["min_si"] = Finite(v.min_si, "value");
    j["max_si"] = Finite(v.max_si, "value");
    j["target_frequency_hz"] = Finite(v.target_hz, "frequency");
    j["resonance_hz"] =
        v.resonance_hz ? nlohmann::json(Finite(*v.resonance_hz, "frequency")) : nlohmann::json();
    j["resonance_kind"] =
        v.resonance_kind ? nlohmann::json(ToString(*v.resonance_kind)) : nlohmann::json();
    j["z_ohm"] = pair(v.z_ohm);
    j["transmitter_z_ohm"] = pair(v.transmitter_z_ohm);
    j["swr"] = Finite(v.swr, "SWR");
    if (v.mesh_error_ohm) j["mesh_error_ohm"] = Finite(*v.mesh_error_ohm, "mesh estimate");
    if (v.mesh_error_ohm || !v.mesh_notes.empty()) j["mesh_notes"] = v.mesh_notes;
    const TradeUnit unit = TradeUnitOf(v.unit);
    j["sensitivity_unit"] = unit.name;
    j["sensitivity_step_si"] = Finite(v.sensitivity_step_si, "step");
    if (v.sensitivity_hz_per_si) {
      j["sensitivity_hz_per_si"] = Finite(*v.sensitivity_hz_per_si, "sensitivity");
      j["sensitivity_khz_per_unit"] =
          Finite(*v.sensitivity_hz_per_si * unit.si / 1e3, "sensitivity");
    } else {
      j["sensitivity_hz_per_si"] = nullptr;
      j["sensitivity_khz_per_unit"] = nullptr;
    }
    doc["variables"].push_back(j);
  }
  doc["iterations"] = result.iterations;
  doc["solves"] = result.solves;
  doc["unknowns"] = result.unknowns;
  doc["segments_used"] = result.segments_used;
  doc["elapsed_s"] = Finite(result.elapsed_s, "time");
  nlohmann::json warnings = nlohmann::json::array();
  for (const Warning& w : result.warnings) warnings.push_back(ToString(w));
  doc["warnings"] = warnings;
  return doc.dump(2) + "\n";
}

}  // namespace wirefield
