// Report stage: a frequency sweep as a text report (per-point table and per-band summary), as
// the JSON document of `sweep` (docs/commands.md), as CSV and as a Touchstone one-port file.
// Input: a SweepReport (sweep, bands, measured comparison); output: text. Every number is
// checked to be finite first: a non-finite one throws ComputationError instead of printing.
#include <fmt/format.h>

#include <cmath>
#include <complex>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "report/ground_text.hpp"
#include "report/insulation_text.hpp"
#include "report/mesh_estimate_text.hpp"
#include "report/notes.hpp"
#include "report/sweep_format.hpp"
#include "report/text_table.hpp"
#include "wirefield/report.hpp"
#include "wirefield/simulation.hpp"

namespace wirefield {
namespace report {
namespace {

void CheckFinite(double value, const std::string& what) {
  if (!std::isfinite(value)) {
    throw ComputationError(
        fmt::format("the sweep produced a non-finite {} ({}); the model may be degenerate at that "
                    "frequency (far above the mesh's frequency, or a load that shorts the feed)",
                    what, value));
  }
}

// The transmitter power of a --power sweep, the same at every point (0 without --power).
double StressPowerW(const SweepResult& sweep) {
  for (const SweepPoint& p : sweep.points) {
    if (p.stress) return p.stress->power_w;
  }
  return 0.0;
}

std::string Mhz(double frequency_hz) { return fmt::format("{:.4f}", frequency_hz / 1e6 + 0.0); }

std::string Khz(double frequency_hz) { return fmt::format("{:.1f}", frequency_hz / 1e3 + 0.0); }

std::string Ohm(double value) { return fmt::format("{:.2f}", value + 0.0); }

std::string RangesText(const std::vector<std::pair<double, double>>& ranges) {
  if (ranges.empty()) return "none";
  std::string out;
  for (const auto& [low_hz, high_hz] : ranges) {
    if (!out.empty()) out += ", ";
    out += fmt::format("{}-{} MHz ({} kHz)", Mhz(low_hz), Mhz(high_hz), Khz(high_hz - low_hz));
  }
  return out;
}

std::string ListMhz(const std::vector<double>& frequencies_hz) {
  if (frequencies_hz.empty()) return "none (the reactance keeps its sign)";
  std::string out;
  for (double f_hz : frequencies_hz) out += (out.empty() ? "" : ", ") + Mhz(f_hz) + " MHz";
  return out;
}

// The resonances of a band or of the sweep, each list named by where X crosses zero.
std::string ResonancesText(const std::vector<double>& antenna_hz,
                           const std::vector<double>& transmitter_hz, bool chain,
                           const std::string& indent) {
  if (!chain) {
    // The header says the transmitter connects at the terminals.
    return fmt::format("{}resonances      at the antenna terminals: {}\n", indent,
                       ListMhz(antenna_hz));
  }
  return fmt::format("{}{:<52}{}\n", indent,
                     "resonances at the antenna terminals (X = 0 there):", ListMhz(antenna_hz)) +
         fmt::format("{}{:<52}{}\n", indent,
                     "resonances at the transmitter (X = 0 there):", ListMhz(transmitter_hz));
}

std::string SummaryText(const BandSummary& summary, bool is_range, bool chain) {
  const Band& band = summary.band;
  std::string out;
  if (is_range) {
    out += fmt::format("  The swept range {}-{} MHz ({} points)\n", Mhz(band.from_hz),
                       Mhz(band.to_hz), summary.points);
  } else {
    out += fmt::format("  {} band, {}-{} MHz, ITU Region {}, {}, {} points\n", band.name,
                       Mhz(band.from_hz), Mhz(band.to_hz), band.region, band.allocation,
                       summary.points);
  }
  out += fmt::format("    lowest SWR      {:.2f} at {} MHz (at the transmitter)\n", summary.min_swr,
                     Mhz(summary.min_swr_frequency_hz));
  out += ResonancesText(summary.resonances_hz, summary.transmitter_resonances_hz, chain, "    ");
  out += fmt::format("    SWR <= 2        {}\n", RangesText(summary.swr_2_ranges_hz));
  out += fmt::format("    SWR <= 1.5      {}\n", RangesText(summary.swr_1_5_ranges_hz));
  if (summary.covered) {
    out += fmt::format("    covered: SWR stays at or below 2 from edge to edge\n");
  } else {
    out += fmt::format("    not covered: SWR rises above 2 inside the {}\n",
                       is_range ? "range" : "band");
  }
  return out;
}

nlohmann::json Pair(Complex value) { return nlohmann::json::array({value.real(), value.imag()}); }

nlohmann::json RangesJson(const std::vector<std::pair<double, double>>& ranges) {
  nlohmann::json out = nlohmann::json::array();
  for (const auto& [low_hz, high_hz] : ranges) out.push_back({low_hz, high_hz});
  return out;
}

nlohmann::json SummaryJson(const BandSummary& summary) {
  nlohmann::json out;
  out["name"] = summary.band.name;
  out["region"] = summary.band.region;
  out["allocation"] = summary.band.allocation;
  out["from_hz"] = summary.band.from_hz;
  out["to_hz"] = summary.band.to_hz;
  out["points"] = summary.points;
  out["min_swr"] = summary.min_swr;
  out["min_swr_frequency_hz"] = summary.min_swr_frequency_hz;
  out["resonances_hz"] = summary.resonances_hz;
  out["antenna_resonances_hz"] = summary.resonances_hz;
  out["transmitter_resonances_hz"] = summary.transmitter_resonances_hz;
  out["swr_2_ranges_hz"] = RangesJson(summary.swr_2_ranges_hz);
  out["swr_1_5_ranges_hz"] = RangesJson(summary.swr_1_5_ranges_hz);
  out["bandwidth_2_hz"] = summary.bandwidth_2_hz;
  out["bandwidth_1_5_hz"] = summary.bandwidth_1_5_hz;
  out["covered"] = summary.covered;
  return out;
}

}  // namespace

bool HasFeedChain(const SweepResult& sweep) {
  for (const SweepPoint& p : sweep.points) {
    if (p.feed_impedance_ohm != p.transmitter_impedance_ohm) return true;
  }
  return false;
}

void CheckSweepReport(const SweepReport& report) {
  const SweepResult& sweep = report.sweep;
  if (sweep.points.empty()) throw ComputationError("the sweep has no points to report");
  CheckFinite(sweep.z0_ohm, "z0");
  for (const SweepPoint& p : sweep.points) {
    const std::string at = fmt::format(" at {} Hz", p.frequency_hz);
    CheckFinite(p.frequency_hz, "frequency");
    CheckFinite(p.feed_impedance_ohm.real(), "feed resistance" + at);
    CheckFinite(p.feed_impedance_ohm.imag(), "feed reactance" + at);
    CheckFinite(p.transmitter_impedance_ohm.real(), "resistance at the transmitter" + at);
    CheckFinite(p.transmitter_impedance_ohm.imag(), "reactance at the transmitter" + at);
    CheckFinite(p.swr, "SWR" + at);
    CheckFinite(p.return_loss_db, "return loss" + at);
    CheckFinite(p.transformer_loss_fraction, "transformer loss" + at);
    CheckFinite(p.line_loss_fraction, "line loss" + at);
  }
  for (double f_hz : sweep.resonances_hz) CheckFinite(f_hz, "resonance frequency");
  for (double f_hz : sweep.transmitter_resonances_hz) {
    CheckFinite(f_hz, "resonance frequency at the transmitter");
  }
  CheckFinite(sweep.min_swr, "minimum SWR");
}

nlohmann::json SpansJson(const std::vector<SweepSpan>& spans) {
  nlohmann::json out = nlohmann::json::array();
  for (const SweepSpan& span : spans) {
    out.push_back({{"name", span.name},
                   {"from_hz", span.frequencies_hz.front()},
                   {"to_hz", span.frequencies_hz.back()},
                   {"points", span.frequencies_hz.size()},
                   {"how", span.how}});
  }
  return out;
}

std::string SweepTitle(const SweepReport& report) {
  std::string bands;
  for (const BandSummary& summary : report.bands) {
    bands += (bands.empty() ? "" : ", ") + summary.band.name;
  }
  if (bands.empty() && report.range) {
    return fmt::format("{}-{} MHz", Mhz(report.range->band.from_hz), Mhz(report.range->band.to_hz));
  }
  return fmt::format("{} (ITU Region {})", bands, report.region);
}

}  // namespace report

std::string FormatSweepText(const SweepReport& report) {
  report::CheckSweepReport(report);
  const SweepResult& sweep = report.sweep;
  std::string out;
  out += fmt::format("wirefield sweep: {}\n", report.model_file);
  const bool chain = report::HasFeedChain(sweep);
  out += fmt::format(
      "  feed {} (the first feed); impedance and SWR at the transmitter, SWR against {} ohm\n  "
      "{}\n",
      report.feed_name, report.sweep.z0_ohm,
      chain ? "(through the feed's transformer and feed line); R and X at the antenna terminals "
              "beside them"
            : "(no transformer or feed line: the transmitter connects at the antenna terminals)");
  out += fmt::format("  ground: {}\n", report::GroundText(report.ground));
  out += report::InsulationLines(report.wires);
  if (!report.bands.empty()) {
    out += fmt::format("  bands: {}", report::SweepTitle(report));
    out += report.region_given
               ? "\n"
               : "; region 1 assumed (Europe, Africa, Middle East): pass --region 2 or 3 for "
                 "the Americas or Asia-Pacific\n";
  }
  for (const SweepSpan& span : report.spans) {
    out += fmt::format("  points: {} {}\n", span.name, span.how);
  }
  out += fmt::format("  {} unknowns, {} threads, {:.2f} s\n", sweep.unknowns, sweep.threads_used,
                     sweep.elapsed_s);
  out += sweep.interpolated_points > 0
             ? fmt::format(
                   "  matrix: {} exact fills, interpolated in frequency between them "
                   "(--exact fills at every point)\n\n",
                   sweep.matrix_fills)
             : fmt::format("  matrix: filled exactly at every point\n\n");

  report::TextTable table;
  table.AddColumns({{"f (MHz)"}, {"R (ohm)"}, {"X (ohm)"}, {"|Z| (ohm)"}, {"SWR"}, {"RL (dB)"}});
  if (chain) {
    table.AddColumn("R antenna (ohm)", report::Align::kRight);
    table.AddColumn("X antenna (ohm)", report::Align::kRight);
  }
  table.AddColumn("", report::Align::kLeft);
  for (const SweepPoint& p : sweep.points) {
    const Complex z = p.transmitter_impedance_ohm;
    std::string mark;
    if (p.frequency_hz == sweep.min_swr_frequency_hz) mark = "lowest SWR";
    std::vector<std::string> row = {
        report::Mhz(p.frequency_hz),  report::Ohm(z.real()),
        report::Ohm(z.imag()),        report::Ohm(std::abs(z)),
        fmt::format("{:.3f}", p.swr), fmt::format("{:.2f}", p.return_loss_db)};
    if (chain) {
      row.push_back(report::Ohm(p.feed_impedance_ohm.real()));
      row.push_back(report::Ohm(p.feed_impedance_ohm.imag()));
    }
    row.push_back(mark);
    table.AddRow(row);
  }
  out += "Points\n" + table.Render(2) + "\n";

  out += "Summary\n";
  if (report.range) out += report::SummaryText(*report.range, /*is_range=*/true, chain);
  for (const BandSummary& summary : report.bands) {
    out += report::SummaryText(summary, /*is_range=*/false, chain);
  }
  out += fmt::format("  lowest SWR of the sweep (at the transmitter) {:.3f} at {} MHz\n",
                     sweep.min_swr, report::Mhz(sweep.min_swr_frequency_hz));
  out += report::ResonancesText(sweep.resonances_hz, sweep.transmitter_resonances_hz, chain, "  ");
  out += report::FormatCentreEstimatesText(report.feed_name, report.mesh_estimates);

  if (report.measured) {
    const MeasuredComparison& m = *report.measured;
    out += fmt::format("\nMeasured: {} (reference {} ohm), compared at {} frequencies", m.file,
                       m.reference_ohm, m.points.size());
    if (m.points_outside > 0) {
      out += fmt::format("; {} outside the sweep left out", m.points_outside);
    }
    out += "\n";
    report::TextTable compared;
    compared.AddColumns({{"f (MHz)"},
                         {"R meas (ohm)"},
                         {"X meas (ohm)"},
                         {"SWR meas"},
                         {"SWR pred"},
                         {"meas - pred"}});
    for (const MeasuredPoint& row : m.points) {
      compared.AddRow({report::Mhz(row.frequency_hz), report::Ohm(row.measured_z_ohm.real()),
                       report::Ohm(row.measured_z_ohm.imag()),
                       fmt::format("{:.3f}", row.measured_swr),
                       fmt::format("{:.3f}", row.predicted_swr),
                       fmt::format("{:+.3f}", row.measured_swr - row.predicted_swr)});
    }
    out += compared.Render(2);
    out += fmt::format(
        "  lowest SWR: measured {:.3f} at {} MHz, predicted {:.3f} at {} MHz; shift {:+.1f} kHz "
        "(measured - predicted)\n",
        m.measured_min_swr, report::Mhz(m.measured_min_swr_frequency_hz), m.predicted_min_swr,
        report::Mhz(m.predicted_min_swr_frequency_hz), m.shift_hz / 1e3);
    const double first_hz = m.points.front().frequency_hz;
    const double last_hz = m.points.back().frequency_hz;
    auto at_edge = [&](double f_hz) { return f_hz <= first_hz || f_hz >= last_hz; };
    if (at_edge(m.measured_min_swr_frequency_hz) || at_edge(m.predicted_min_swr_frequency_hz)) {
      out +=
          "  note: a lowest SWR lies at an end of the compared range, so the real minimum may "
          "lie\n  outside it and the shift says little; sweep and measure over a wider range\n";
    }
  }
  if (!report.sweep.stress_peaks.empty()) {
    out += FormatStressPeaksText(report.sweep.stress_peaks, report::StressPowerW(report.sweep));
  }
  out += report::WarningsSection(report.warnings);
  out +=
      "\nBand edges are the ITU Radio Regulations' allocations (Article 5, Edition of 2020); "
      "national\nrules are often narrower: transmit only where your licence allows.\n";
  out += report::TransmitCaution();
  return out;
}

std::string FormatSweepJson(const SweepReport& report) {
  report::CheckSweepReport(report);
  const SweepResult& sweep = report.sweep;
  nlohmann::json doc;
  doc["model"] = report.model_file;
  doc["feed"] = report.feed_name;
  doc["z0_ohm"] = sweep.z0_ohm;
  doc["ground"] = report::GroundJson(report.ground);
  if (report::AnyInsulation(report.wires)) doc["insulation"] = report::InsulationJson(report.wires);
  nlohmann::json points = nlohmann::json::array();
  for (const SweepPoint& p : sweep.points) {
    nlohmann::json point;
    point["frequency_hz"] = p.frequency_hz;
    point["z_ohm"] = report::Pair(p.transmitter_impedance_ohm);
    point["swr"] = p.swr;
    point["feed_z_ohm"] = report::Pair(p.feed_impedance_ohm);
    point["return_loss_db"] = p.return_loss_db;
    point["transformer_loss_fraction"] = p.transformer_loss_fraction;
    point["line_loss_fraction"] = p.line_loss_fraction;
    points.push_back(point);
  }
  doc["points"] = points;
  doc["resonances_hz"] = sweep.resonances_hz;
  doc["antenna_resonances_hz"] = sweep.resonances_hz;
  doc["transmitter_resonances_hz"] = sweep.transmitter_resonances_hz;
  doc["min_swr"] = {{"frequency_hz", sweep.min_swr_frequency_hz}, {"swr", sweep.min_swr}};
  doc["region"] = report.region;
  doc["region_assumed"] = !report.region_given;
  doc["spans"] = report::SpansJson(report.spans);
  nlohmann::json bands = nlohmann::json::array();
  for (const BandSummary& summary : report.bands) bands.push_back(report::SummaryJson(summary));
  doc["bands"] = bands;
  doc["range"] = report.range ? report::SummaryJson(*report.range) : nlohmann::json();
  if (report.measured) {
    const MeasuredComparison& m = *report.measured;
    nlohmann::json measured;
    measured["file"] = m.file;
    measured["reference_ohm"] = m.reference_ohm;
    nlohmann::json rows = nlohmann::json::array();
    for (const MeasuredPoint& row : m.points) {
      rows.push_back({{"frequency_hz", row.frequency_hz},
                      {"z_ohm", report::Pair(row.measured_z_ohm)},
                      {"swr", row.measured_swr},
                      {"predicted_swr", row.predicted_swr}});
    }
    measured["points"] = rows;
    measured["points_outside"] = m.points_outside;
    measured["min_swr"] = {{"frequency_hz", m.measured_min_swr_frequency_hz},
                           {"swr", m.measured_min_swr}};
    measured["predicted_min_swr"] = {{"frequency_hz", m.predicted_min_swr_frequency_hz},
                                     {"swr", m.predicted_min_swr}};
    measured["shift_hz"] = m.shift_hz;
    doc["measured"] = measured;
  } else {
    doc["measured"] = nullptr;
  }
  doc["unknowns"] = sweep.unknowns;
  doc["threads_used"] = sweep.threads_used;
  doc["matrix_fills"] = sweep.matrix_fills;
  doc["interpolated"] = sweep.interpolated_points > 0;
  doc["elapsed_s"] = sweep.elapsed_s;
  doc["warnings"] = report::WarningsJson(report.warnings);
  doc["mesh_estimates"] = report::CentreEstimatesJson(report.mesh_estimates);
  if (!sweep.stress_peaks.empty()) {
    doc["stress"] = nlohmann::json::parse(
        FormatStressPeaksJson(sweep.stress_peaks, report::StressPowerW(report.sweep)));
  }
  return doc.dump(2) + "\n";
}

std::string FormatSweepCsv(const SweepReport& report) {
  report::CheckSweepReport(report);
  std::string out =
      "frequency_hz,r_ohm,x_ohm,z_abs_ohm,swr,return_loss_db,feed_r_ohm,feed_x_ohm,"
      "transformer_loss_fraction,line_loss_fraction\n";
  for (const SweepPoint& p : report.sweep.points) {
    const Complex z = p.transmitter_impedance_ohm;
    out += fmt::format(
        "{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},"
        "{:.10g}\n",
        p.frequency_hz, z.real(), z.imag(), std::abs(z), p.swr, p.return_loss_db,
        p.feed_impedance_ohm.real(), p.feed_impedance_ohm.imag(), p.transformer_loss_fraction,
        p.line_loss_fraction);
  }
  return out;
}

std::string FormatSweepTouchstone(const SweepReport& report) {
  report::CheckSweepReport(report);
  std::vector<double> frequencies_hz;
  std::vector<Complex> impedances_ohm;
  for (const SweepPoint& p : report.sweep.points) {
    frequencies_hz.push_back(p.frequency_hz);
    impedances_ohm.push_back(p.transmitter_impedance_ohm);
  }
  return FormatTouchstone(
      frequencies_hz, impedances_ohm, report.sweep.z0_ohm,
      {fmt::format("wirefield {} sweep of {}", Version(), report.model_file),
       fmt::format("S11 at the transmitter of feed {} (through its transformer and line, if "
                   "any), computed by the moment method",
                   report.feed_name),
       fmt::format("reference {} ohm; {} points", report.sweep.z0_ohm,
                   report.sweep.points.size())});
}

}  // namespace wirefield
