// Report stage: a computed radiation pattern (PatternResult plus the Simulation's model) as a
// readable text report, the `pattern` command's JSON document and a CSV of both cuts
// (docs/commands.md). Every number is checked to be finite first; no radiation (kNoGainDbi)
// reads "none" in text and -999 in JSON and CSV. The text prints a gain more than
// kTextFloor_db below the maximum as "below -40 dB of max"; JSON and CSV keep the number.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "core/enum_names.hpp"
#include "report/json_values.hpp"
#include "report/pattern_format.hpp"
#include "report/text_table.hpp"
#include "wirefield/pattern.hpp"
#include "wirefield/report.hpp"

namespace wirefield {
namespace report {

namespace {

void CheckNumber(double value, const std::string& what) {
  if (!std::isfinite(value)) {
    throw ComputationError(fmt::format(
        "the pattern has a non-finite {} ({}); the model may be degenerate or the solve may "
        "have failed silently",
        what, value));
  }
}

void CheckCut(const PatternCut& cut) {
  const std::size_t n = cut.angle_deg.size();
  if (cut.gain_dbi.size() != n || cut.gain_vertical_dbi.size() != n ||
      cut.gain_horizontal_dbi.size() != n) {
    throw ComputationError(
        fmt::format("internal error: the {} cut has arrays of different lengths", cut.plane));
  }
  CheckNumber(cut.fixed_angle_deg, cut.plane + " cut fixed angle");
  for (std::size_t i = 0; i < n; ++i) {
    CheckNumber(cut.angle_deg[i], cut.plane + " cut angle");
    CheckNumber(cut.gain_dbi[i], cut.plane + " cut gain");
    CheckNumber(cut.gain_vertical_dbi[i], cut.plane + " cut vertical gain");
    CheckNumber(cut.gain_horizontal_dbi[i], cut.plane + " cut horizontal gain");
  }
  if (cut.beamwidth_deg) CheckNumber(*cut.beamwidth_deg, cut.plane + " cut beamwidth");
}

}  // namespace

void CheckPattern(const PatternResult& pattern) {
  CheckNumber(pattern.frequency_hz, "frequency");
  CheckNumber(pattern.step_deg, "grid step");
  CheckNumber(pattern.max_gain_dbi, "maximum gain");
  CheckNumber(pattern.max_gain_elevation_deg, "elevation of the maximum");
  CheckNumber(pattern.max_gain_azimuth_deg, "azimuth of the maximum");
  CheckNumber(pattern.takeoff_elevation_deg, "take-off angle");
  CheckNumber(pattern.max_gain_vertical_dbi, "vertical gain at the maximum");
  CheckNumber(pattern.max_gain_horizontal_dbi, "horizontal gain at the maximum");
  for (const DirectionGain& row : pattern.low_angle) {
    CheckNumber(row.elevation_deg, "low-angle elevation");
    CheckNumber(row.azimuth_deg, "low-angle azimuth");
    CheckNumber(row.gain_dbi, "low-angle gain");
    CheckNumber(row.gain_vertical_dbi, "low-angle vertical gain");
    CheckNumber(row.gain_horizontal_dbi, "low-angle horizontal gain");
  }
  CheckCut(pattern.elevation_cut);
  CheckCut(pattern.azimuth_cut);
  if (pattern.front_to_back_db) CheckNumber(*pattern.front_to_back_db, "front-to-back ratio");
  if (pattern.front_to_side_db) CheckNumber(*pattern.front_to_side_db, "front-to-side ratio");
  CheckNumber(pattern.power.input_w, "input power");
  CheckNumber(pattern.power.radiated_w, "radiated power");
  CheckNumber(pattern.power.loads_w, "power in loads");
  CheckNumber(pattern.power.wires_w, "power in wires");
  CheckNumber(pattern.power.efficiency, "efficiency");
  CheckNumber(pattern.power.efficiency_computed, "efficiency as computed");
  CheckNumber(pattern.power.balance_error, "power balance error");
  CheckNumber(pattern.power.ground_w, "power in the ground");
}

bool IsNoGain(double gain_dbi) { return gain_dbi <= kNoGainDbi; }

std::string GainText(double gain_dbi, int decimals) {
  if (IsNoGain(gain_dbi)) return "none";
  return fmt::format("{:.{}f}", gain_dbi, decimals);
}

double GainValue(double gain_dbi) { return IsNoGain(gain_dbi) ? kNoGainDbi : gain_dbi; }

std::string AngleText(double angle_deg) {
  // Grid angles show exactly (1, 2.5, 0.25); refined angles such as 30.177 show to 0.1 deg,
  // finer than any pattern step and than a user can aim an antenna.
  for (int decimals = 0; decimals <= 2; ++decimals) {
    const double scale = std::pow(10.0, decimals);
    if (std::abs(angle_deg * scale - std::round(angle_deg * scale)) < 1e-4 * scale) {
      return fmt::format("{:.{}f}", std::round(angle_deg * scale) / scale + 0.0, decimals);
    }
  }
  return fmt::format("{:.1f}", angle_deg + 0.0);  // + 0.0: no "-0"
}

std::string ModelFileName(const std::string& path) {
  const std::string name = std::filesystem::path(path).filename().string();
  return name.empty() ? path : name;
}

namespace {

// Power the "at 100 W" line scales the budget to: a common HF transmitter output (common
// practice). The budget is linear in power, so this only rescales.
constexpr double kScaledPower_w = 100.0;

std::string GainWithUnit(double gain_dbi) {
  return IsNoGain(gain_dbi) ? "none" : GainText(gain_dbi) + " dBi";
}

// True when a gain lies more than kTextFloor_db below the maximum (or is no radiation at all
// while something radiates): a null whose printed depth would be numerical noise.
bool BelowFloor(double gain_dbi, double max_gain_dbi) {
  return !IsNoGain(max_gain_dbi) && (IsNoGain(gain_dbi) || gain_dbi < max_gain_dbi - kTextFloor_db);
}

// A gain as the text report prints it: "below -40 dB of max" under the floor, else the value
// (with " dBi" when `unit`).
std::string FlooredGainText(double gain_dbi, double max_gain_dbi, bool unit) {
  if (BelowFloor(gain_dbi, max_gain_dbi))
    return fmt::format("below -{:.0f} dB of max", kTextFloor_db);
  return unit ? GainWithUnit(gain_dbi) : GainText(gain_dbi);
}

// A ratio of gains in dB (front-to-back, how far below the maximum), "more than 40 dB" past
// the floor.
std::string FlooredRatioText(double ratio_db, bool unit) {
  if (ratio_db > kTextFloor_db)
    return fmt::format("more than {:.0f}{}", kTextFloor_db, unit ? " dB" : "");
  return fmt::format("{:.2f}{}", ratio_db, unit ? " dB" : "");
}

// Why the elevation cut lies at its azimuth, in words.
std::string ElevationCutReason(const PatternCut& cut) {
  return cut.choice == CutChoice::kGiven
             ? "as asked with --azimuth"
             : "the strongest direction at low angles (the best row of the table above)";
}

// Why the azimuth cut lies at its elevation, in words.
std::string AzimuthCutReason(const PatternResult& pattern) {
  switch (pattern.azimuth_cut.choice) {
    case CutChoice::kGiven:
      return "as asked with --elevation";
    case CutChoice::kLowAngleNearZenith:
      return fmt::format(
          "a low angle, {} deg (batch's default elevation), as the maximum is at {} deg,\n"
          "    above {:.0f} deg: near the zenith an azimuth cut is a small circle around it",
          AngleText(kLowAzimuthCutElevation_deg), AngleText(pattern.takeoff_elevation_deg),
          kNearZenithElevation_deg);
    case CutChoice::kTakeoff:
    case CutChoice::kStrongestLowAngle:
      break;
  }
  return "the take-off angle";
}

// The JSON name of a cut's choice.
std::string ChoiceName(CutChoice choice) {
  static constexpr core::EnumNames<CutChoice, 4> kNames = {
      {{CutChoice::kGiven, "option"},
       {CutChoice::kStrongestLowAngle, "strongest_low_angle"},
       {CutChoice::kTakeoff, "takeoff"},
       {CutChoice::kLowAngleNearZenith, "low_angle_near_zenith"}}};
  return core::NameOf(choice, kNames, "option");
}

std::string Watts(double power_w) {
  const double magnitude = std::abs(power_w);
  if (magnitude == 0.0) return "0 W";
  if (magnitude >= 1e-3 && magnitude < 1e6) return fmt::format("{:.6g} W", power_w);
  return fmt::format("{:.4e} W", power_w);
}

std::string Percent(double part_w, double whole_w) {
  if (whole_w <= 0.0) return "";
  return fmt::format("{:7.2f} %", 100.0 * part_w / whole_w);
}

std::string BeamwidthText(const PatternCut& cut) {
  if (!cut.beamwidth_deg) return "not defined (the main lobe does not fall 3 dB on both sides)";
  if (*cut.beamwidth_deg >= 360.0 - 1e-6) return "360 deg (within 3 dB of the maximum all round)";
  return fmt::format("{} deg", AngleText(std::round(*cut.beamwidth_deg * 10.0) / 10.0));
}

nlohmann::json GainArray(const std::vector<double>& gains_dbi) {
  nlohmann::json out = nlohmann::json::array();
  for (double gain : gains_dbi) out.push_back(GainValue(gain));
  return out;
}

nlohmann::json CutJson(const PatternCut& cut) {
  nlohmann::json out;
  out["plane"] = cut.plane;
  out["fixed_angle_deg"] = cut.fixed_angle_deg;
  out["angle_deg"] = cut.angle_deg;
  out["gain_dbi"] = GainArray(cut.gain_dbi);
  out["gain_vertical_dbi"] = GainArray(cut.gain_vertical_dbi);
  out["gain_horizontal_dbi"] = GainArray(cut.gain_horizontal_dbi);
  out["beamwidth_deg"] = OptionalJson(cut.beamwidth_deg);
  out["chosen_by"] = ChoiceName(cut.choice);
  return out;
}

}  // namespace
}  // namespace report

std::string FormatPatternText(const Simulation& simulation, const PatternResult& pattern,
                              const StressResult* stress, const ExposureResult* exposure) {
  using report::Align;
  using report::AngleText;
  using report::GainText;
  using report::TextTable;
  report::CheckPattern(pattern);
  const Model& model = simulation.model();
  const PowerBudget& power = pattern.power;
  std::string out;
  out += fmt::format("wirefield pattern: {}\n", model.file);
  out += fmt::format("  frequency        {:.6f} MHz\n", pattern.frequency_hz / 1e6);
  out += fmt::format("  ground           {}\n", report::GroundText(model.ground));
  out += fmt::format(
      "  grid step        {} deg for both cuts; the maximum is searched on a grid of at most 2 deg "
      "and refined off it\n",
      AngleText(pattern.step_deg));

  const double max_dbi = pattern.max_gain_dbi;
  const bool zenith = std::abs(pattern.max_gain_elevation_deg) >= 90.0 - 1e-6;
  out += "\nMaximum\n";
  out += fmt::format(
      "  gain             {} at elevation {} deg{}\n", report::GainWithUnit(max_dbi),
      AngleText(pattern.max_gain_elevation_deg),
      zenith ? " (straight up; azimuth does not apply)"
             : fmt::format(", azimuth {} deg", AngleText(pattern.max_gain_azimuth_deg)));
  out += fmt::format("  take-off angle   {} deg (elevation of the main lobe toward the front)\n",
                     AngleText(pattern.takeoff_elevation_deg));
  if (std::abs(pattern.max_gain_elevation_deg) > kNearZenithElevation_deg) {
    out += fmt::format(
        "  polarization     not split above {:.0f} deg elevation: near the zenith even the "
        "vertical part\n                   lies nearly horizontal (the low-angle table splits "
        "it)\n",
        kNearZenithElevation_deg);
  } else {
    out += fmt::format("  polarization     vertical {}, horizontal {} (at the maximum)\n",
                       report::FlooredGainText(pattern.max_gain_vertical_dbi, max_dbi, true),
                       report::FlooredGainText(pattern.max_gain_horizontal_dbi, max_dbi, true));
  }

  if (!pattern.low_angle.empty()) {
    out += "\nLow angles (long-distance contacts): the best gain over azimuth at each elevation\n";
    TextTable low;
    low.AddColumns({{"elevation (deg)"},
                    {"azimuth (deg)"},
                    {"gain (dBi)"},
                    {"vertical (dBi)"},
                    {"horizontal (dBi)"},
                    {"below max (dB)"}});
    for (const DirectionGain& row : pattern.low_angle) {
      const bool none = report::IsNoGain(row.gain_dbi) || report::IsNoGain(max_dbi);
      low.AddRow({AngleText(row.elevation_deg), AngleText(row.azimuth_deg),
                  report::FlooredGainText(row.gain_dbi, max_dbi, false),
                  report::FlooredGainText(row.gain_vertical_dbi, max_dbi, false),
                  report::FlooredGainText(row.gain_horizontal_dbi, max_dbi, false),
                  none ? "none" : report::FlooredRatioText(max_dbi - row.gain_dbi, false)});
    }
    out += low.Render(2);
  }

  const PatternCut& elevation = pattern.elevation_cut;
  out += "\nCuts (-3 dB beamwidth of the main lobe)\n";
  out += fmt::format("  elevation cut through azimuth {} deg and its back: {}\n",
                     AngleText(elevation.fixed_angle_deg), report::BeamwidthText(elevation));
  out += fmt::format("    where: {}\n", report::ElevationCutReason(elevation));
  out += fmt::format("  azimuth cut at elevation {} deg: {}\n",
                     AngleText(pattern.azimuth_cut.fixed_angle_deg),
                     report::BeamwidthText(pattern.azimuth_cut));
  out += fmt::format("    where: {}\n", report::AzimuthCutReason(pattern));
  out += fmt::format("  front-to-back    {}\n",
                     pattern.front_to_back_db
                         ? report::FlooredRatioText(*pattern.front_to_back_db, true)
                         : "none (no clear front in the azimuth cut)");
  out += fmt::format("  front-to-side    {}\n",
                     pattern.front_to_side_db
                         ? report::FlooredRatioText(*pattern.front_to_side_db, true)
                         : "none (no clear front in the azimuth cut)");

  out +=
      "\nPower budget (share of the power delivered to the antenna terminals, after any feed "
      "line\nand transformer)\n";
  TextTable budget;
  budget.AddColumns({{"where", Align::kLeft}, {"power"}, {"share"}});
  budget.AddRow({"into the antenna terminals", report::Watts(power.input_w),
                 report::Percent(power.input_w, power.input_w)});
  budget.AddRow({model.ground.kind == GroundKind::kFree ? "radiated (whole sphere)"
                                                        : "radiated (above the ground)",
                 report::Watts(power.radiated_w),
                 report::Percent(power.radiated_w, power.input_w)});
  budget.AddRow({"lost in loads", report::Watts(power.loads_w),
                 report::Percent(power.loads_w, power.input_w)});
  budget.AddRow({"lost in wires", report::Watts(power.wires_w),
                 report::Percent(power.wires_w, power.input_w)});
  const bool real_ground = model.ground.kind == GroundKind::kReal;
  if (real_ground) {
    budget.AddRow({"lost in the ground", report::Watts(power.ground_w),
                   report::Percent(power.ground_w, power.input_w)});
  }
  out += budget.Render(2);
  out += fmt::format("  efficiency       {:.2f} % (radiated / into the antenna terminals)\n",
                     100.0 * power.efficiency);
  if (!power.efficiency_note.empty()) {
    out += fmt::format("                   note: {}\n", power.efficiency_note);
  }
  if (real_ground) {
    out += "  ground loss      input - radiated - loads - wires (not checked independently)\n";
  } else {
    out +=
        fmt::format("  balance error    {:+.3f} % ((radiated + loads + wires - input) / input)\n",
                    100.0 * power.balance_error);
  }
  if (power.input_w > 0.0) {
    const double scale = report::kScaledPower_w / power.input_w;
    out += fmt::format(
        "  at {:.0f} W into the antenna terminals: {} radiated, {} in loads, {} in wires\n",
        report::kScaledPower_w, report::Watts(power.radiated_w * scale),
        report::Watts(power.loads_w * scale), report::Watts(power.wires_w * scale));
    if (real_ground) {
      out += fmt::format("  and {} in the ground\n", report::Watts(power.ground_w * scale));
    }
  }

  if (!pattern.warnings.empty()) {
    out += "\nWarnings\n";
    for (const Warning& warning : pattern.warnings) out += "  " + ToString(warning) + "\n";
  }

  out +=
      "\nGains are relative to the power delivered to the feed terminals (dBi), so losses in "
      "loads,\nwires and ground lower them. Elevation is measured up from the horizon, azimuth "
      "from +x\ntoward +y. Full cuts: --csv FILE or --svg FILE.\n";
  if (stress != nullptr) out += FormatStressText(*stress);
  if (exposure != nullptr) out += FormatExposureText(*exposure);
  out +=
      "Caution: in the direction of maximum gain the field of a transmitting antenna is "
      "strongest;\nnear the antenna it can exceed RF exposure limits, and wire ends and loads "
      "carry high RF\nvoltage. Keep people clear, keep masts and wires well away from power "
      "lines, and follow\nlocal rules and licensed practice.\n";
  return out;
}

std::string FormatPatternJson(const Simulation& simulation, const PatternResult& pattern,
                              const StressResult* stress, const ExposureResult* exposure) {
  report::CheckPattern(pattern);
  nlohmann::json doc;
  doc["model"] = simulation.model().file;
  doc["frequency_hz"] = pattern.frequency_hz;
  doc["max_gain_dbi"] = report::GainValue(pattern.max_gain_dbi);
  doc["max_gain_elevation_deg"] = pattern.max_gain_elevation_deg;
  doc["max_gain_azimuth_deg"] = pattern.max_gain_azimuth_deg;
  doc["input_power_w"] = pattern.power.input_w;
  doc["radiated_power_w"] = pattern.power.radiated_w;
  doc["efficiency"] = pattern.power.efficiency;
  doc["efficiency_computed"] = pattern.power.efficiency_computed;
  doc["efficiency_note"] = pattern.power.efficiency_note.empty()
                               ? nlohmann::json(nullptr)
                               : nlohmann::json(pattern.power.efficiency_note);
  doc["takeoff_elevation_deg"] = pattern.takeoff_elevation_deg;
  doc["max_gain_vertical_dbi"] = report::GainValue(pattern.max_gain_vertical_dbi);
  doc["max_gain_horizontal_dbi"] = report::GainValue(pattern.max_gain_horizontal_dbi);
  doc["low_angle"] = nlohmann::json::array();
  for (const DirectionGain& row : pattern.low_angle) {
    doc["low_angle"].push_back(
        {{"elevation_deg", row.elevation_deg},
         {"azimuth_deg", row.azimuth_deg},
         {"gain_dbi", report::GainValue(row.gain_dbi)},
         {"gain_vertical_dbi", report::GainValue(row.gain_vertical_dbi)},
         {"gain_horizontal_dbi", report::GainValue(row.gain_horizontal_dbi)}});
  }
  doc["step_deg"] = pattern.step_deg;
  doc["loads_power_w"] = pattern.power.loads_w;
  doc["wires_power_w"] = pattern.power.wires_w;
  doc["ground_power_w"] = pattern.power.ground_w;
  doc["power_balance_error"] = pattern.power.balance_error;
  doc["ground"] = report::GroundJson(simulation.model().ground);
  doc["front_to_back_db"] = report::OptionalJson(pattern.front_to_back_db);
  doc["front_to_side_db"] = report::OptionalJson(pattern.front_to_side_db);
  doc["elevation_cut"] = report::CutJson(pattern.elevation_cut);
  doc["azimuth_cut"] = report::CutJson(pattern.azimuth_cut);
  doc["warnings"] = report::WarningsJson(simulation.warnings(), pattern.warnings);
  if (stress != nullptr) doc["stress"] = nlohmann::json::parse(FormatStressJson(*stress));
  if (exposure != nullptr) doc["exposure"] = nlohmann::json::parse(FormatExposureJson(*exposure));
  return doc.dump(2) + "\n";
}

std::string FormatPatternCsv(const PatternResult& pattern) {
  report::CheckPattern(pattern);
  std::string out =
      "plane,fixed_angle_deg,angle_deg,gain_dbi,gain_vertical_dbi,gain_horizontal_dbi\n";
  for (const PatternCut* cut : {&pattern.elevation_cut, &pattern.azimuth_cut}) {
    for (std::size_t i = 0; i < cut->angle_deg.size(); ++i) {
      out += fmt::format("{},{:.10g},{:.10g},{:.6f},{:.6f},{:.6f}\n", cut->plane,
                         cut->fixed_angle_deg + 0.0, cut->angle_deg[i] + 0.0,  // + 0.0: no "-0"
                         report::GainValue(cut->gain_dbi[i]),
                         report::GainValue(cut->gain_vertical_dbi[i]),
                         report::GainValue(cut->gain_horizontal_dbi[i]));
    }
  }
  return out;
}

}  // namespace wirefield
