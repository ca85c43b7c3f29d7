// Report stage: one solve's results (SolveResult plus the Simulation's model and mesh) as a
// readable text report and as the JSON document of the `solve` command (docs/commands.md).
// Input: the simulation and its result; output: text. Every number printed is checked to be
// finite first: a non-finite value throws ComputationError instead of reaching the user.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <complex>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "core/constants.hpp"
#include "report/ground_text.hpp"
#include "report/insulation_text.hpp"
#include "report/json_values.hpp"
#include "report/mesh_estimate_text.hpp"
#include "report/text_table.hpp"
#include "wirefield/report.hpp"

namespace wirefield {
namespace report {
namespace {

// Power from the transmitter (into the feed chains) the "at 100 W" lines scale the 1 V (or
// model-given) excitation to, as --power does. 100 W is a common transmitter output on HF
// (common practice); the lines only scale the linear solution.
constexpr double kScaledPower_w = 100.0;

void CheckFinite(double value, const std::string& what) {
  if (!std::isfinite(value)) {
    throw ComputationError(fmt::format(
        "the solve produced a non-finite {} ({}); the model may be degenerate (a wire far "
        "shorter than its radius, a load that shorts the feed, or a frequency far from the "
        "mesh's)",
        what, value));
  }
}

void CheckFinite(Complex value, const std::string& what) {
  CheckFinite(value.real(), what + " (real part)");
  CheckFinite(value.imag(), what + " (imaginary part)");
}

// Checks every number either report prints, so both refuse the same results.
void CheckResult(const SolveResult& result) {
  CheckFinite(result.frequency_hz, "frequency");
  CheckFinite(result.condition_number, "condition number of the matrix");
  CheckFinite(result.relative_residual, "residual of the solve");
  for (const FeedResult& feed : result.feeds) {
    const std::string who = fmt::format("value at feed '{}'", feed.name);
    CheckFinite(feed.impedance_ohm, "impedance " + who);
    CheckFinite(feed.current_a, "current " + who);
    CheckFinite(feed.voltage_v, "voltage " + who);
    CheckFinite(feed.swr, "SWR " + who);
    CheckFinite(feed.z0_ohm, "z0 " + who);
    CheckFinite(feed.power_w, "power " + who);
    CheckFinite(feed.antenna_swr, "SWR at the antenna terminals " + who);
    CheckFinite(feed.transmitter_impedance_ohm, "impedance at the transmitter " + who);
    CheckFinite(feed.return_loss_db, "return loss " + who);
    CheckFinite(feed.transmitter_power_w, "power at the transmitter " + who);
    CheckFinite(feed.line_loss_w, "line loss " + who);
    CheckFinite(feed.transformer_loss_w, "transformer loss " + who);
  }
  for (const LoadResult& load : result.loads) {
    const std::string who = fmt::format("value at load '{}'", load.name);
    if (!load.open) CheckFinite(load.impedance_ohm, "impedance " + who);
    CheckFinite(load.current_a, "current " + who);
    CheckFinite(load.voltage_v, "voltage " + who);
    CheckFinite(load.power_w, "power " + who);
  }
}

// What the transmitter delivers into every feed's chain (line, transformer, feed) at the
// solved excitation: the power the "at P W from the transmitter" lines scale to.
double TotalTransmitterPower(const SolveResult& result) {
  double total_w = 0.0;
  for (const FeedResult& feed : result.feeds) total_w += feed.transmitter_power_w;
  return total_w;
}

bool AnyFeedChain(const SolveResult& result) {
  return std::any_of(result.feeds.begin(), result.feeds.end(),
                     [](const FeedResult& feed) { return feed.has_transformer || feed.has_line; });
}

// A value with about five significant digits, without exponent for everyday magnitudes.
std::string Number(double value) {
  const double magnitude = std::abs(value);
  if (magnitude == 0.0) return "0";
  if (magnitude >= 1e-3 && magnitude < 1e7) {
    const int digits_before = static_cast<int>(std::floor(std::log10(magnitude))) + 1;
    const int decimals = std::max(0, 5 - digits_before);
    return fmt::format("{:.{}f}", value, decimals);
  }
  return fmt::format("{:.4e}", value);
}

std::string Signed(double value) {
  const std::string text = Number(value);
  return value >= 0.0 ? "+" + text : text;
}

std::string Degrees(Complex value) {
  if (value == Complex(0.0, 0.0)) return "0.00";
  return fmt::format("{:.2f}", std::arg(value) * 180.0 / core::kPi);
}

std::string Swr(double swr) {
  if (swr < 100.0) return fmt::format("{:.2f}", swr);
  return fmt::format("{:.0f}", swr);
}

// An SWR in a table whose header names the reference z0: the feed's own reference is added
// when it differs.
std::string SwrCell(double swr, double feed_z0_ohm, double table_z0_ohm) {
  std::string text = Swr(swr);
  if (feed_z0_ohm != table_z0_ohm) text += fmt::format(" ({:.6g} ohm)", feed_z0_ohm);
  return text;
}

std::string PointText(const WirePointSpec& at) {
  switch (at.kind) {
    case PointKind::kStart:
      return at.wire + "@start";
    case PointKind::kEnd:
      return at.wire + "@end";
    case PointKind::kDistance:
      return fmt::format("{}@{:.6g}m", at.wire, at.value);
    case PointKind::kPercent:
      return fmt::format("{}@{:.6g}%", at.wire, at.value);
  }
  return at.wire;
}

std::string FeedPlace(const Model& model, const std::string& name) {
  for (const FeedSpec& feed : model.feeds) {
    if (feed.name == name) return PointText(feed.at);
  }
  return "?";
}

const LoadSpec* FindLoad(const Model& model, const std::string& name) {
  for (const LoadSpec& load : model.loads) {
    if (load.name == name) return &load;
  }
  return nullptr;
}

std::string LoadElements(const LoadSpec* load, double frequency_hz) {
  if (load == nullptr) return "?";
  if (load->coil) {
    const CoilAnalysis coil = AnalyzeCoil(*load->coil, frequency_hz);
    return fmt::format("coil {:.6g} turns: L={:.6g}uH R_ac={:.4g}ohm C={:.4g}pF Q={:.4g}",
                       load->coil->turns, coil.inductance_h * 1e6, coil.ac_resistance_ohm,
                       coil.self_capacitance_f * 1e12, coil.q);
  }
  if (load->choke) {
    const ChokeSpec& choke = *load->choke;
    if (!choke.points.empty()) {
      return fmt::format("choke, curve of {} point{}", choke.points.size(),
                         choke.points.size() == 1 ? "" : "s");
    }
    return fmt::format("choke {:.6g} turns on A_L={:.6g}nH{}", choke.turns, choke.al_nh,
                       choke.q ? fmt::format(" Q={:.4g}", *choke.q) : std::string(" lossless"));
  }
  std::vector<std::string> parts;
  if (load->resistance_ohm) parts.push_back(fmt::format("R={:.6g}ohm", *load->resistance_ohm));
  if (load->inductance_h) parts.push_back(fmt::format("L={:.6g}uH", *load->inductance_h * 1e6));
  if (load->capacitance_f) {
    parts.push_back(fmt::format("C={:.6g}pF", *load->capacitance_f * 1e12));
  }
  const char* joint = load->topology == LoadTopology::kSeries ? " + " : " || ";
  std::string text = load->topology == LoadTopology::kSeries ? "series " : "parallel ";
  for (std::size_t i = 0; i < parts.size(); ++i) text += (i ? joint : "") + parts[i];
  return text;
}

// What sits between a feed and the transmitter: "transformer unun 1:49, line coax 10 m",
// or "direct" when nothing does.
std::string ChainText(const Model& model, const std::string& feed) {
  std::vector<std::string> parts;
  for (const TransformerSpec& t : model.transformers) {
    if (t.feed != feed) continue;
    const double ratio = t.secondary_turns / t.primary_turns;
    parts.push_back(fmt::format("transformer {} 1:{:.4g}", t.name, ratio * ratio));
  }
  for (const FeedLineSpec& line : model.feed_lines) {
    if (line.feed == feed)
      parts.push_back(fmt::format("line {} {:.4g} m", line.name, line.length_m));
  }
  if (parts.empty()) return "direct";
  std::string text;
  for (const std::string& part : parts) text += (text.empty() ? "" : ", ") + part;
  return text;
}

// The heading of the feed table: where its numbers are.
std::string AntennaHeading(const SolveResult& result) {
  if (AnyFeedChain(result)) return "\nFeeds at the antenna terminals\n";
  return "\nFeeds at the antenna terminals (no transformer or feed line: the transmitter "
         "connects here)\n";
}

// The feeds as the transmitter sees them through their transformer and line: empty when no
// feed has either. Powers at the solved excitation, like the antenna table's.
std::string TransmitterTable(const Model& model, const SolveResult& result, double z0_ohm) {
  if (!AnyFeedChain(result)) return "";
  TextTable table;
  table.AddColumns({{"feed", Align::kLeft},
                    {"through", Align::kLeft},
                    {"R (ohm)"},
                    {"X (ohm)"},
                    {"|Z| (ohm)"},
                    {fmt::format("SWR ({:.6g} ohm)", z0_ohm)},
                    {"RL (dB)"},
                    {"P (W)"},
                    {"line loss (W)"},
                    {"transformer loss (W)"}});
  for (const FeedResult& feed : result.feeds) {
    const Complex z = feed.transmitter_impedance_ohm;
    table.AddRow({feed.name, ChainText(model, feed.name), Number(z.real()), Signed(z.imag()),
                  Number(std::abs(z)), SwrCell(feed.swr, feed.z0_ohm, z0_ohm),
                  fmt::format("{:.2f}", feed.return_loss_db), Number(feed.transmitter_power_w),
                  Number(feed.line_loss_w), Number(feed.transformer_loss_w)});
  }
  return "\nFeeds at the transmitter (through their transformer and feed line)\n" + table.Render(2);
}

// One feed's lines of the "at P W from the transmitter" section: where the power goes, and
// the power, current and voltage at the antenna terminals.
std::string ScaledFeedLines(const FeedResult& feed, double scale) {
  const double s2 = scale * scale;
  std::string out = fmt::format("  feed {}", feed.name);
  if (feed.has_transformer || feed.has_line) {
    out += fmt::format(
        ": {} W from the transmitter; lost: {} W in the line, {} W in the transformer\n    ",
        Number(feed.transmitter_power_w * s2), Number(feed.line_loss_w * s2),
        Number(feed.transformer_loss_w * s2));
  } else {
    out += " ";
  }
  return out + fmt::format("at the antenna terminals: {} W, {} A, {} V peak\n",
                           Number(feed.power_w * s2), Number(std::abs(feed.current_a) * scale),
                           Number(std::abs(feed.voltage_v) * scale));
}

}  // namespace
}  // namespace report

std::string FormatSolveText(const Simulation& simulation, const SolveResult& result,
                            const StressResult* stress) {
  using report::Align;
  using report::Number;
  using report::TextTable;
  report::CheckResult(result);
  const Model& model = simulation.model();
  std::string out;
  out += fmt::format("wirefield solve: {}\n", model.file);
  out += fmt::format("  frequency       {:.6f} MHz\n", result.frequency_hz / 1e6);
  out += fmt::format("  mesh            {} wire{}, {} segments, {} unknowns\n",
                     simulation.wire_mesh().size(), simulation.wire_mesh().size() == 1 ? "" : "s",
                     result.segments, result.unknowns);
  out += fmt::format("  ground          {}\n", report::GroundText(model.ground));
  out += report::InsulationLines(model.wires);

  out += report::AntennaHeading(result);
  TextTable feeds;
  const double z0_ohm =
      result.feeds.empty() ? model.z0_ohm.value_or(kDefaultZ0Ohm) : result.feeds[0].z0_ohm;
  feeds.AddColumns({{"feed", Align::kLeft},
                    {"at", Align::kLeft},
                    {"R (ohm)"},
                    {"X (ohm)"},
                    {"|Z| (ohm)"},
                    {fmt::format("SWR ({:.6g} ohm)", z0_ohm)},
                    {"|I| (A)"},
                    {"arg I (deg)"},
                    {"P (W)"}});
  for (const FeedResult& feed : result.feeds) {
    feeds.AddRow({feed.name, report::FeedPlace(model, feed.name), Number(feed.impedance_ohm.real()),
                  report::Signed(feed.impedance_ohm.imag()), Number(std::abs(feed.impedance_ohm)),
                  report::SwrCell(feed.antenna_swr, feed.z0_ohm, z0_ohm),
                  Number(std::abs(feed.current_a)), report::Degrees(feed.current_a),
                  Number(feed.power_w)});
  }
  out += feeds.Render(2);
  out += report::FormatMeshEstimateText(result);
  out += report::TransmitterTable(model, result, z0_ohm);

  if (!result.loads.empty()) {
    out += "\nLoads\n";
    TextTable loads;
    loads.AddColumns({{"load", Align::kLeft},
                      {"elements", Align::kLeft},
                      {"R (ohm)"},
                      {"X (ohm)"},
                      {"|I| (A)"},
                      {"|V| (V)"},
                      {"P (W)"}});
    for (const LoadResult& load : result.loads) {
      const LoadSpec* spec = report::FindLoad(model, load.name);
      loads.AddRow({load.name, report::LoadElements(spec, result.frequency_hz),
                    load.open ? "open" : Number(load.impedance_ohm.real()),
                    load.open ? "open" : report::Signed(load.impedance_ohm.imag()),
                    Number(std::abs(load.current_a)), Number(std::abs(load.voltage_v)),
                    Number(load.power_w)});
    }
    out += loads.Render(2);
  }

  out += "\nWires\n";
  TextTable wires;
  wires.AddColumns({{"wire", Align::kLeft}, {"segments given"}, {"segments used"}});
  for (const WireMeshInfo& wire : simulation.wire_mesh()) {
    wires.AddRow({wire.name,
                  wire.segments_given > 0 ? fmt::format("{}", wire.segments_given) : "auto",
                  fmt::format("{}", wire.segments_used)});
  }
  out += wires.Render(2);

  out +=
      "\nEach feed is a delta-gap source of peak voltage V (1 V unless its `voltage` says "
      "otherwise),\nphase 0. Currents and voltages above are peak phasors and scale with V; "
      "powers scale with V^2.\n";

  const double total_w = report::TotalTransmitterPower(result);
  if (stress != nullptr) {
    out += FormatStressText(*stress);
    return out;
  }
  if (total_w > 0.0) {
    const double scale = std::sqrt(report::kScaledPower_w / total_w);
    out += fmt::format(
        "At {:.0f} W from the transmitter (--power sets another; currents and voltages above x "
        "{}):\n",
        report::kScaledPower_w, Number(scale));
    for (const FeedResult& feed : result.feeds) out += report::ScaledFeedLines(feed, scale);
    for (const LoadResult& load : result.loads) {
      out += fmt::format("  load {}: {} V peak across it, {} W in it\n", load.name,
                         Number(std::abs(load.voltage_v) * scale),
                         Number(load.power_w * scale * scale));
    }
  }
  out +=
      "Caution: at transmitting power the open ends of wires and the capacitors and coils of "
      "loads\ncarry high RF voltage, and the field near the antenna can exceed exposure limits. "
      "Keep people\nclear, keep masts and wires well away from power lines, and follow local "
      "rules and licensed practice.\n";
  return out;
}

std::string FormatSolveJson(const Simulation& simulation, const SolveResult& result,
                            const StressResult* stress) {
  report::CheckResult(result);
  nlohmann::json doc;
  doc["model"] = simulation.model().file;
  doc["frequency_hz"] = result.frequency_hz;
  doc["unknowns"] = result.unknowns;
  doc["segments"] = result.segments;
  doc["condition_number"] = result.condition_number;
  doc["relative_residual"] = result.relative_residual;
  doc["ground"] = report::GroundJson(simulation.model().ground);
  // Only for a model with insulated wires, so the documents of bare models keep their keys.
  if (report::AnyInsulation(simulation.model().wires)) {
    doc["insulation"] = report::InsulationJson(simulation.model().wires);
  }
  doc["feeds"] = nlohmann::json::array();
  for (const FeedResult& feed : result.feeds) {
    doc["feeds"].push_back({{"name", feed.name},
                            {"z_ohm", report::ComplexJson(feed.impedance_ohm)},
                            {"current_a", report::ComplexJson(feed.current_a)},
                            {"voltage_v", report::ComplexJson(feed.voltage_v)},
                            {"swr", feed.swr},
                            {"z0_ohm", feed.z0_ohm},
                            {"power_w", feed.power_w}});
    nlohmann::json& added = doc["feeds"].back();
    added["antenna"] = {{"z_ohm", report::ComplexJson(feed.impedance_ohm)},
                        {"swr", feed.antenna_swr},
                        {"power_w", feed.power_w}};
    added["transmitter"] = {{"z_ohm", report::ComplexJson(feed.transmitter_impedance_ohm)},
                            {"swr", feed.swr},
                            {"return_loss_db", feed.return_loss_db},
                            {"power_w", feed.transmitter_power_w}};
    added["has_transformer"] = feed.has_transformer;
    added["has_line"] = feed.has_line;
    added["line_loss_w"] = feed.line_loss_w;
    added["transformer_loss_w"] = feed.transformer_loss_w;
  }
  doc["loads"] = nlohmann::json::array();
  for (const LoadResult& load : result.loads) {
    doc["loads"].push_back(
        {{"name", load.name},
         {"z_ohm", load.open ? nlohmann::json(nullptr) : report::ComplexJson(load.impedance_ohm)},
         {"open", load.open},
         {"current_a", report::ComplexJson(load.current_a)},
         {"voltage_v", report::ComplexJson(load.voltage_v)},
         {"power_w", load.power_w}});
    const LoadSpec* spec = report::FindLoad(simulation.model(), load.name);
    if (spec != nullptr && spec->coil) {
      const CoilAnalysis coil = AnalyzeCoil(*spec->coil, result.frequency_hz);
      doc["loads"].back()["coil"] = {{"inductance_h", coil.inductance_h},
                                     {"ac_resistance_ohm", coil.ac_resistance_ohm},
                                     {"self_capacitance_f", coil.self_capacitance_f},
                                     {"self_resonance_hz", coil.self_resonance_hz},
                                     {"q", coil.q}};
    }
  }
  doc["warnings"] = report::WarningsJson(simulation.warnings());
  report::AddMeshEstimateJson(result, &doc);
  if (stress != nullptr) doc["stress"] = nlohmann::json::parse(FormatStressJson(*stress));
  return doc.dump(2) + "\n";
}

}  // namespace wirefield
