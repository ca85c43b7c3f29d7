// Report stage: the current on every segment of a solve (`solve --currents FILE`), as CSV or
// as a JSON document: each wire's segments in order, with their ends, their distance from the
// wire's start and the current's peak magnitude and phase at the start, centre and end.
// Inputs: the meshed model, its solve and the excitation the currents are scaled to; output:
// the text of the file.
#include <fmt/format.h>

#include <cmath>
#include <complex>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "core/constants.hpp"
#include "wirefield/report.hpp"

namespace wirefield {
namespace {

// One segment as the reports give it: its wire's name, its number on the wire (from 1) and
// its distance from the wire's start.
struct SegmentRow {
  const SegmentCurrent* segment = nullptr;
  std::string wire;
  int number = 0;
  double from_m = 0.0;
  double to_m = 0.0;
};

std::vector<SegmentRow> Rows(const Simulation& simulation, const SolveResult& result) {
  const Model& model = simulation.model();
  std::vector<SegmentRow> rows;
  std::vector<double> length_m(model.wires.size(), 0.0);
  std::vector<int> count(model.wires.size(), 0);
  for (const SegmentCurrent& s : result.currents) {
    if (s.wire < 0 || static_cast<std::size_t>(s.wire) >= model.wires.size()) {
      throw ComputationError(
          fmt::format("the currents report: segment of unknown wire {}", s.wire));
    }
    const std::size_t w = static_cast<std::size_t>(s.wire);
    const double dx = s.end_m[0] - s.start_m[0];
    const double dy = s.end_m[1] - s.start_m[1];
    const double dz = s.end_m[2] - s.start_m[2];
    const double length = std::sqrt(dx * dx + dy * dy + dz * dz);
    rows.push_back({&s, model.wires[w].name, ++count[w], length_m[w], length_m[w] + length});
    length_m[w] += length;
    for (const Complex& c : {s.current_start_a, s.current_a, s.current_end_a}) {
      if (!std::isfinite(c.real()) || !std::isfinite(c.imag())) {
        throw ComputationError(
            fmt::format("the currents report: a non-finite current on wire "
                        "'{}'",
                        model.wires[w].name));
      }
    }
  }
  return rows;
}

double PhaseDeg(Complex c) { return std::abs(c) == 0.0 ? 0.0 : std::arg(c) * 180.0 / core::kPi; }

}  // namespace

std::string FormatCurrentsCsv(const Simulation& simulation, const SolveResult& result,
                              const CurrentsScale& scale) {
  std::string out =
      "wire,segment,from_m,to_m,x_start_m,y_start_m,z_start_m,x_end_m,y_end_m,z_end_m,"
      "i_start_peak_a,i_start_phase_deg,i_centre_peak_a,i_centre_phase_deg,i_end_peak_a,"
      "i_end_phase_deg,excitation\n";
  for (const SegmentRow& row : Rows(simulation, result)) {
    const SegmentCurrent& s = *row.segment;
    out += fmt::format("{},{},{:.6f},{:.6f},{:.6f},{:.6f},{:.6f},{:.6f},{:.6f},{:.6f}", row.wire,
                       row.number, row.from_m, row.to_m, s.start_m[0] + 0.0, s.start_m[1] + 0.0,
                       s.start_m[2] + 0.0, s.end_m[0] + 0.0, s.end_m[1] + 0.0, s.end_m[2] + 0.0);
    for (const Complex& c : {s.current_start_a, s.current_a, s.current_end_a}) {
      out += fmt::format(",{:.6e},{:.3f}", std::abs(c) * scale.factor, PhaseDeg(c) + 0.0);
    }
    out += "," + scale.excitation + "\n";
  }
  return out;
}

std::string FormatCurrentsJson(const Simulation& simulation, const SolveResult& result,
                               const CurrentsScale& scale) {
  nlohmann::ordered_json doc;
  doc["model"] = simulation.model().file;
  doc["frequency_hz"] = result.frequency_hz;
  doc["excitation"] = scale.excitation;
  doc["segments"] = nlohmann::ordered_json::array();
  for (const SegmentRow& row : Rows(simulation, result)) {
    const SegmentCurrent& s = *row.segment;
    auto current = [&](Complex c) {
      return nlohmann::ordered_json{{"peak_a", std::abs(c) * scale.factor},
                                    {"phase_deg", PhaseDeg(c) + 0.0}};
    };
    doc["segments"].push_back({{"wire", row.wire},
                               {"segment", row.number},
                               {"from_m", row.from_m},
                               {"to_m", row.to_m},
                               {"start_m", {s.start_m[0], s.start_m[1], s.start_m[2]}},
                               {"end_m", {s.end_m[0], s.end_m[1], s.end_m[2]}},
                               {"current_start", current(s.current_start_a)},
                               {"current_centre", current(s.current_a)},
                               {"current_end", current(s.current_end_a)}});
  }
  return doc.dump(2) + "\n";
}

}  // namespace wirefield
