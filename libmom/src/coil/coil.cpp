// Coil stage: a single-layer solenoid (wirefield/coil.hpp) analysed at one frequency, and the
// turns for a target inductance. Combines the formulas of coil/formulas.hpp with the round-
// wire skin-effect impedance of conductor/wire_impedance.hpp. Inputs: CoilSpec (SI) and a
// frequency; outputs: CoilAnalysis, an impedance, or a designed CoilSpec. Method: docs/numerics.md.
#include "wirefield/coil.hpp"

#include <fmt/format.h>

#include <boost/math/tools/toms748_solve.hpp>
#include <cmath>
#include <cstdint>

#include "coil/formulas.hpp"
#include "conductor/wire_impedance.hpp"
#include "core/constants.hpp"
#include "core/materials.hpp"
#include "wirefield/model.hpp"

namespace wirefield {
namespace {

// Metres as millimetres for messages.
std::string Mm(double m) { return fmt::format("{:.6g} mm", m * 1e3); }

// Below this fraction of the self-resonance the parallel self-capacitance hardly matters;
// above this fraction of it the apparent values are dominated by it and the lumped model of
// the coil is rough (Medhurst's H is a low-frequency figure; common practice is to use a coil
// well below its self-resonance).
constexpr double kNearResonanceFraction = 0.5;

// Medhurst measured Phi with the wire many skin depths thick; below this many skin depths
// across the wire the proximity figure is an extrapolation (our bridge, docs/numerics.md).
constexpr double kMinWireSkinDepthsForPhi = 5.0;

void Require(bool ok, const std::string& message) {
  if (!ok) throw ComputationError(message);
}

}  // namespace

void SetCoilMaterial(CoilSpec* coil, const std::string& name, const std::string& where) {
  const core::Material* entry = core::FindMaterial(name);
  if (entry == nullptr) {
    std::string list;
    for (const std::string& n : core::MaterialNames()) list += (list.empty() ? "" : ", ") + n;
    throw InputError(SourceLocation{where, 0, 0},
                     fmt::format("unknown wire material '{}'; the materials are {}", name, list));
  }
  coil->material = entry->name;
  coil->conductivity_s_per_m = entry->conductivity_s_per_m;
  coil->relative_permeability = entry->relative_permeability;
}

std::string CoilProblem(const CoilSpec& c) {
  auto finite = [](double v) { return std::isfinite(v); };
  if (!finite(c.turns) || c.turns < 1.0) {
    return fmt::format("the coil needs at least 1 turn; got {:.6g}", c.turns);
  }
  if (!finite(c.former_diameter_m) || c.former_diameter_m <= 0.0) {
    return fmt::format("the former diameter must be positive; got {}", Mm(c.former_diameter_m));
  }
  if (!finite(c.wire_diameter_m) || c.wire_diameter_m <= 0.0) {
    return fmt::format("the wire diameter must be positive; got {}", Mm(c.wire_diameter_m));
  }
  if (!finite(c.insulation_m) || c.insulation_m < 0.0) {
    return fmt::format("the insulation thickness must not be negative; got {}", Mm(c.insulation_m));
  }
  if (c.length_m.has_value() == c.pitch_m.has_value()) {
    return "give the winding either by its length or by its pitch (length = turns x pitch), "
           "exactly one of the two";
  }
  if (c.length_m && (!finite(*c.length_m) || *c.length_m <= 0.0)) {
    return fmt::format("the winding length must be positive; got {}", Mm(*c.length_m));
  }
  if (c.pitch_m && (!finite(*c.pitch_m) || *c.pitch_m <= 0.0)) {
    return fmt::format("the pitch must be positive; got {}", Mm(*c.pitch_m));
  }
  const double pitch_m = c.pitch_m ? *c.pitch_m : *c.length_m / c.turns;
  const double overall_m = c.wire_diameter_m + 2.0 * c.insulation_m;
  if (pitch_m < overall_m * (1.0 - 1e-9)) {
    return fmt::format(
        "the pitch {} is smaller than the wire's overall diameter {} (wire {} plus twice the "
        "insulation {}): the turns would overlap; use a larger pitch or length, fewer turns or "
        "a thinner wire",
        Mm(pitch_m), Mm(overall_m), Mm(c.wire_diameter_m), Mm(c.insulation_m));
  }
  if (!finite(c.conductivity_s_per_m) || c.conductivity_s_per_m <= 0.0) {
    return fmt::format("the wire's conductivity must be positive; got {:.6g} S/m",
                       c.conductivity_s_per_m);
  }
  if (!finite(c.relative_permeability) || c.relative_permeability < 1.0) {
    return fmt::format("the wire's relative permeability must be at least 1; got {:.6g}",
                       c.relative_permeability);
  }
  return "";
}

CoilAnalysis AnalyzeCoil(const CoilSpec& c, double frequency_hz) {
  const std::string problem = CoilProblem(c);
  if (!problem.empty()) throw InputError(SourceLocation{"coil", 0, 0}, problem);
  if (!std::isfinite(frequency_hz) || frequency_hz <= 0.0) {
    throw InputError(SourceLocation{"coil", 0, 0},
                     fmt::format("the frequency must be positive; got {:.6g} Hz", frequency_hz));
  }
  CoilAnalysis a;
  const double n = c.turns;
  a.pitch_m = c.pitch_m ? *c.pitch_m : *c.length_m / n;
  a.length_m = n * a.pitch_m;
  a.sheet_diameter_m = c.former_diameter_m + c.wire_diameter_m + 2.0 * c.insulation_m;
  const double d = a.sheet_diameter_m;
  a.wire_length_m = n * std::hypot(core::kPi * d, a.pitch_m);

  a.nagaoka_coefficient = coil::NagaokaCoefficient(d, a.length_m);
  a.inductance_sheet_h = coil::SheetInductance_h(n, d, a.length_m);
  a.rosa_correction_h = coil::RosaCorrection_h(n, d, a.pitch_m, c.wire_diameter_m);
  a.inductance_h = a.inductance_sheet_h - a.rosa_correction_h;
  a.inductance_wheeler_h = coil::WheelerInductance_h(n, d, a.length_m);
  Require(std::isfinite(a.inductance_h) && a.inductance_h > 0.0,
          fmt::format("the coil's inductance came out as {:.6g} H; the geometry is outside what "
                      "the current-sheet formulas cover",
                      a.inductance_h));

  bool outside = false;
  a.medhurst_h_pf_per_cm = coil::MedhurstH_pf_per_cm(a.length_m / d, &outside);
  a.self_capacitance_f = a.medhurst_h_pf_per_cm * 1e-12 * (d * 100.0);
  a.self_resonance_hz = 1.0 / (2.0 * core::kPi * std::sqrt(a.inductance_h * a.self_capacitance_f));
  if (outside) {
    a.notes.push_back(fmt::format(
        "length/diameter {:.3g} is outside Medhurst's self-capacitance table (0.1 to 50); the "
        "nearest table value of H is used",
        a.length_m / d));
  }

  a.frequency_hz = frequency_hz;
  const double radius_m = 0.5 * c.wire_diameter_m;
  a.dc_resistance_ohm =
      conductor::DcResistancePerMetre(radius_m, c.conductivity_s_per_m) * a.wire_length_m;
  a.skin_depth_m =
      conductor::SkinDepth_m(c.conductivity_s_per_m, c.relative_permeability, frequency_hz);
  a.straight_wire_resistance_ohm =
      conductor::WireImpedancePerMetre(radius_m, c.conductivity_s_per_m, c.relative_permeability,
                                       frequency_hz)
          .real() *
      a.wire_length_m;
  a.proximity_factor = coil::MedhurstProximityFactor(a.length_m / d, c.wire_diameter_m / a.pitch_m);
  // Medhurst's Phi holds for wire many skin depths thick; the weight 1 - (R_dc/R_straight)^2
  // brings it in as the skin effect sets in (our bridge, docs/numerics.md "Coils").
  const double dc_share = a.dc_resistance_ohm / a.straight_wire_resistance_ohm;
  a.ac_resistance_ohm = a.straight_wire_resistance_ohm *
                        (1.0 + (a.proximity_factor - 1.0) * (1.0 - dc_share * dc_share));
  if (c.wire_diameter_m < kMinWireSkinDepthsForPhi * a.skin_depth_m) {
    a.notes.push_back(fmt::format(
        "the wire is only {:.2g} skin depths thick at this frequency; Medhurst's proximity "
        "factor was measured on wire many skin depths thick, so R_ac is a rough estimate here",
        c.wire_diameter_m / a.skin_depth_m));
  }
  if (c.relative_permeability > 1.0) {
    a.notes.push_back(
        "the wire is magnetic; Medhurst's proximity factor was measured on copper wire");
  }

  const double w = 2.0 * core::kPi * frequency_hz;
  a.reactance_ohm = w * a.inductance_h;
  a.q = a.reactance_ohm / a.ac_resistance_ohm;
  const std::complex<double> series(a.ac_resistance_ohm, a.reactance_ohm);
  a.impedance_ohm = series / (1.0 + std::complex<double>(0.0, w * a.self_capacitance_f) * series);
  a.apparent_resistance_ohm = a.impedance_ohm.real();
  a.apparent_inductance_h = a.impedance_ohm.imag() / w;
  a.apparent_q = a.impedance_ohm.imag() / a.impedance_ohm.real();
  if (frequency_hz >= a.self_resonance_hz) {
    a.notes.push_back(fmt::format(
        "{:.6g} MHz is above the coil's self-resonance ({:.6g} MHz): it acts as a capacitor "
        "there; use fewer turns or a smaller coil",
        frequency_hz / 1e6, a.self_resonance_hz / 1e6));
  } else if (frequency_hz > kNearResonanceFraction * a.self_resonance_hz) {
    a.notes.push_back(
        fmt::format("{:.6g} MHz is more than half the coil's self-resonance ({:.6g} MHz): the "
                    "self-capacitance dominates the apparent values and the lumped model is rough",
                    frequency_hz / 1e6, a.self_resonance_hz / 1e6));
  }
  for (double v :
       {a.inductance_wheeler_h, a.self_capacitance_f, a.self_resonance_hz, a.ac_resistance_ohm, a.q,
        a.apparent_resistance_ohm, a.apparent_inductance_h, a.apparent_q}) {
    Require(std::isfinite(v), "the coil analysis produced a non-finite value; check the sizes");
  }
  return a;
}

std::complex<double> CoilImpedance(const CoilSpec& coil, double frequency_hz) {
  return AnalyzeCoil(coil, frequency_hz).impedance_ohm;
}

CoilSpec DesignCoilTurns(CoilSpec c, double target_inductance_h) {
  const SourceLocation where{"coil", 0, 0};
  if (!std::isfinite(target_inductance_h) || target_inductance_h <= 0.0) {
    throw InputError(where, fmt::format("the target inductance must be positive; got {:.6g} H",
                                        target_inductance_h));
  }
  if (!c.pitch_m) {
    throw InputError(where,
                     "designing the turns needs the pitch (or a close-wound coil), not "
                     "the winding length");
  }
  c.length_m.reset();
  c.turns = 1.0;
  const std::string problem = CoilProblem(c);
  if (!problem.empty()) throw InputError(where, problem);
  // The inductance at the analysis frequency is not needed: L does not depend on it.
  constexpr double kAnyFrequency_hz = 1e6;
  auto inductance = [&](double turns) {
    CoilSpec trial = c;
    trial.turns = turns;
    return AnalyzeCoil(trial, kAnyFrequency_hz).inductance_h;
  };
  const double one_turn_h = inductance(1.0);
  if (target_inductance_h < one_turn_h) {
    throw InputError(
        where, fmt::format("{:.6g} uH is less than one turn gives on this former ({:.6g} uH); "
                           "use a smaller former or a larger pitch",
                           target_inductance_h * 1e6, one_turn_h * 1e6));
  }
  const double max_h = inductance(kMaxDesignTurns);
  if (target_inductance_h > max_h) {
    throw InputError(where, fmt::format("{:.6g} uH needs more than {:.0f} turns on this former "
                                        "({:.6g} uH at {:.0f}); use a larger former or a "
                                        "smaller pitch",
                                        target_inductance_h * 1e6, kMaxDesignTurns, max_h * 1e6,
                                        kMaxDesignTurns));
  }
  if (target_inductance_h == one_turn_h) return c;
  // L(N) rises with N (more turns at a fixed pitch); bracket [1, kMaxDesignTurns]. 44 bits
  // of N is far finer than any winding; 200 iterations is far more than TOMS 748 needs.
  std::uintmax_t iterations = 200;
  const auto [lo, hi] = boost::math::tools::toms748_solve(
      [&](double turns) { return inductance(turns) - target_inductance_h; }, 1.0, kMaxDesignTurns,
      one_turn_h - target_inductance_h, max_h - target_inductance_h,
      boost::math::tools::eps_tolerance<double>(44), iterations);
  c.turns = 0.5 * (lo + hi);
  return c;
}

}  // namespace wirefield
