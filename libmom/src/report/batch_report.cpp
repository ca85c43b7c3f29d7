// Report stage: a batch (one model over grounds, variable values and frequencies) as a
// readable table with a summary, as the `batch` command's JSON document and as CSV
// (docs/commands.md). Input: a BatchResult; output: text. Every number of a row that ran is
// checked to be finite first; a failed row shows its reason and no numbers.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <vector>

#include "report/mesh_estimate_text.hpp"
#include "report/notes.hpp"
#include "report/pattern_format.hpp"
#include "report/sweep_format.hpp"
#include "report/text_table.hpp"
#include "wirefield/batch.hpp"
#include "wirefield/pattern.hpp"
#include "wirefield/report.hpp"

namespace wirefield {
namespace report {
namespace {

void CheckFinite(double value, const std::string& what, const BatchRow& row) {
  if (!std::isfinite(value)) {
    throw ComputationError(
        fmt::format("batch row {} ({}) has a non-finite {} ({}); the model may be degenerate there",
                    row.index, row.ground, what, value));
  }
}

void CheckRow(const BatchRow& row) {
  if (row.error) return;
  {
    for (double f_hz : row.resonances_hz) CheckFinite(f_hz, "resonance", row);
    CheckFinite(row.min_swr, "minimum SWR", row);
    CheckFinite(row.min_swr_frequency_hz, "frequency of the minimum SWR", row);
    for (const auto& [f_hz, swr] : row.swr_at) CheckFinite(swr, "SWR", row);
    CheckFinite(row.pattern_frequency_hz, "pattern frequency", row);
    CheckFinite(row.max_gain_dbi, "maximum gain", row);
    CheckFinite(row.max_gain_azimuth_deg, "azimuth of the maximum", row);
    CheckFinite(row.takeoff_deg, "take-off angle", row);
    CheckFinite(row.gain_at_elevation_dbi, "gain at the elevation", row);
    CheckFinite(row.efficiency, "efficiency", row);
    CheckFinite(row.gain_at_elevation_azimuth_deg, "azimuth of the low-angle gain", row);
    for (const BatchBand& band : row.bands) {
      for (double f_hz : band.resonances_hz) CheckFinite(f_hz, "resonance", row);
      for (double value :
           {band.min_swr, band.min_swr_frequency_hz, band.pattern_frequency_hz, band.max_gain_dbi,
            band.max_gain_azimuth_deg, band.takeoff_deg, band.gain_at_elevation_dbi,
            band.gain_at_elevation_azimuth_deg, band.efficiency}) {
        CheckFinite(value, "figure of band " + band.name, row);
      }
    }
  }
}

void CheckBatch(const BatchResult& result) {
  CheckFinite(result.z0_ohm, "z0", BatchRow{});
  for (const BatchRow& row : result.rows) CheckRow(row);
}

std::string ResonanceList(const std::vector<double>& resonances_hz);

// The summary of one set of figures (the rows' own, or one band's): the best row, how much
// the ground matters, the setting that holds up on every ground.
std::string SummaryText(const BatchResult& result, const BatchSummary& summary,
                        const std::string& indent, std::optional<int> band);

std::string Mhz(double frequency_hz) { return fmt::format("{:.4f}", frequency_hz / 1e6 + 0.0); }

// "total=10.3m, height=8m", or "" without variables.
std::string SettingText(const std::vector<BatchValue>& values,
                        const std::vector<BatchVariable>& variables) {
  std::string out;
  for (size_t v = 0; v < values.size(); ++v) {
    out += fmt::format("{}{}={}", out.empty() ? "" : ", ", variables[v].name, values[v].label);
  }
  return out;
}

std::string RowName(const BatchRow& row, const BatchResult& result) {
  const std::string setting = SettingText(row.values, result.variables);
  return fmt::format("#{} ({}{}{})", row.index + 1, row.ground, setting.empty() ? "" : ", ",
                     setting);
}

std::string FrequencyPlan(const BatchResult& result) {
  std::string out;
  size_t points = 0;
  for (const SweepSpan& span : result.spans) {
    out += fmt::format("{}{} {}-{} MHz", out.empty() ? "" : ", ", span.name,
                       Mhz(span.frequencies_hz.front()), Mhz(span.frequencies_hz.back()));
    points += span.frequencies_hz.size();
  }
  return fmt::format("{} ({} points a row)", out, points);
}

std::string CsvQuoted(const std::string& text) {
  std::string out = "\"";
  for (char c : text) {
    if (c == '"') out += '"';
    out += c == '\n' ? ' ' : c;
  }
  return out + "\"";
}

std::string AtHeader(double f_hz) {
  return fmt::format("SWR @{} MHz", fmt::format("{:.6g}", f_hz / 1e6));
}

// The row's first feed at its first span's centre with the mesh estimate, or "-".
std::string RowMeshCell(const BatchRow& row) {
  if (!row.mesh_estimate) return "-";
  return ImpedanceWithMeshError(row.mesh_estimate->z_ohm, row.mesh_estimate->mesh_error_ohm);
}

// ",F,R,X,E" of the row's mesh estimate (empty fields without one).
std::string RowMeshCsv(const BatchRow& row) {
  if (!row.mesh_estimate) return ",,,,";
  const FeedMeshEstimateAt& e = *row.mesh_estimate;
  return fmt::format(",{:.10g},{:.10g},{:.10g},{}", e.frequency_hz, e.z_ohm.real(), e.z_ohm.imag(),
                     e.mesh_error_ohm ? fmt::format("{:.10g}", *e.mesh_error_ohm) : "");
}

}  // namespace
}  // namespace report

namespace report {
namespace {

// The lines that open a batch report: the model, the grid, the sweep, the pattern, the threads.
std::string RunHeader(const BatchResult& result, size_t rows) {
  std::string out = fmt::format("wirefield batch: {}\n", result.model_file);
  std::string ground_names;
  for (const std::string& g : result.grounds) {
    ground_names += (ground_names.empty() ? "" : ", ") + g;
  }
  std::string grid = fmt::format("{} ground{} ({})", result.grounds.size(),
                                 result.grounds.size() == 1 ? "" : "s", ground_names);
  for (const BatchVariable& v : result.variables) {
    grid += fmt::format(" x {} value{} of {}", v.values.size(), v.values.size() == 1 ? "" : "s",
                        v.name);
  }
  out += fmt::format("  {} rows: {}\n", rows, grid);
  out += fmt::format("  sweep: {}; SWR at the first feed's transmitter against {} ohm\n",
                     report::FrequencyPlan(result), result.z0_ohm);
  out += fmt::format(
      "  pattern: at {}, {} deg grid; gain at {} deg elevation in its best azimuth\n",
      result.pattern_frequency_hz ? fmt::format("{} MHz", report::Mhz(*result.pattern_frequency_hz))
      : BatchHasBandPatterns(result) ? std::string("each band's lowest-SWR frequency, per row")
                                     : std::string("each row's lowest-SWR frequency"),
      report::AngleText(result.pattern_step_deg), report::AngleText(result.elevation_deg));
  out += fmt::format("  {} threads, {:.2f} s\n", result.threads_used, result.elapsed_s);
  return out;
}

}  // namespace
}  // namespace report

std::string FormatBatchText(const BatchResult& result) {
  report::CheckBatch(result);
  const BatchSummary summary = SummarizeBatch(result);
  std::string out = report::RunHeader(result, result.rows.size()) + "\n";
  const bool per_band = BatchHasBandPatterns(result);

  report::TextTable table;
  table.AddColumn("#", report::Align::kRight);
  table.AddColumn("ground", report::Align::kLeft);
  for (const BatchVariable& v : result.variables) {
    table.AddColumn(v.shown_unit.empty() ? v.name : fmt::format("{} ({})", v.name, v.shown_unit),
                    report::Align::kRight);
  }
  if (per_band) table.AddColumn("band", report::Align::kLeft);
  table.AddColumns({{"resonance (MHz)"}, {"min SWR"}, {"at (MHz)"}});
  for (double f_hz : result.at_hz) table.AddColumn(report::AtHeader(f_hz), report::Align::kRight);
  table.AddColumn("max gain (dBi)", report::Align::kRight);
  table.AddColumn("take-off (deg)", report::Align::kRight);
  table.AddColumn(fmt::format("gain @{} deg (dBi)", report::AngleText(result.elevation_deg)),
                  report::Align::kRight);
  table.AddColumn("toward (deg)", report::Align::kRight);
  table.AddColumn("eff (%)", report::Align::kRight);
  const bool with_mesh = std::any_of(result.rows.begin(), result.rows.end(),
                                     [](const BatchRow& row) { return row.mesh_estimate; });
  if (with_mesh) table.AddColumn("Z at centre, mesh +- (ohm)", report::Align::kRight);
  table.AddColumn("", report::Align::kLeft);
  std::vector<BatchSummary> band_summaries;
  if (per_band) {
    for (size_t b = 0; b < result.spans.size(); ++b) {
      band_summaries.push_back(SummarizeBatch(result, static_cast<int>(b)));
    }
  }
  for (const BatchRow& row : result.rows) {
    const size_t lines = per_band && !row.error ? row.bands.size() : 1;
    for (size_t line = 0; line < lines; ++line) {
      std::vector<std::string> cells{fmt::format("{}", row.index + 1), row.ground};
      for (const BatchValue& v : row.values) cells.push_back(v.shown);
      if (row.error) {
        const size_t blanks = 8 + result.at_hz.size() + (per_band ? 1 : 0) + (with_mesh ? 1 : 0);
        for (size_t i = 0; i < blanks; ++i) cells.push_back("-");
        cells.push_back("failed (below)");
        table.AddRow(std::move(cells));
        continue;
      }
      if (per_band) {
        const BatchBand& band = row.bands[line];
        cells.push_back(band.name);
        cells.push_back(report::ResonanceList(band.resonances_hz));
        cells.push_back(fmt::format("{:.3f}", band.min_swr));
        cells.push_back(report::Mhz(band.min_swr_frequency_hz));
        for (const auto& pair : row.swr_at) {
          cells.push_back(line == 0 ? fmt::format("{:.3f}", pair.second) : std::string());
        }
        cells.push_back(report::GainText(band.max_gain_dbi));
        cells.push_back(report::AngleText(band.takeoff_deg));
        cells.push_back(report::GainText(band.gain_at_elevation_dbi));
        cells.push_back(report::AngleText(band.gain_at_elevation_azimuth_deg));
        cells.push_back(fmt::format("{:.1f}", 100.0 * band.efficiency));
        if (with_mesh) cells.push_back(line == 0 ? report::RowMeshCell(row) : std::string());
        const std::optional<int>& best = band_summaries[line].best_row;
        cells.push_back(best && *best == row.index ? "best on " + band.name : "");
      } else {
        cells.push_back(report::ResonanceList(row.resonances_hz));
        cells.push_back(fmt::format("{:.3f}", row.min_swr));
        cells.push_back(report::Mhz(row.min_swr_frequency_hz));
        for (const auto& pair : row.swr_at) cells.push_back(fmt::format("{:.3f}", pair.second));
        cells.push_back(report::GainText(row.max_gain_dbi));
        cells.push_back(report::AngleText(row.takeoff_deg));
        cells.push_back(report::GainText(row.gain_at_elevation_dbi));
        cells.push_back(report::AngleText(row.gain_at_elevation_azimuth_deg));
        cells.push_back(fmt::format("{:.1f}", 100.0 * row.efficiency));
        if (with_mesh) cells.push_back(report::RowMeshCell(row));
        cells.push_back(summary.best_row && *summary.best_row == row.index ? "best" : "");
      }
      table.AddRow(std::move(cells));
    }
  }
  out += "Rows\n";
  out += table.Render(2);
  if (with_mesh) {
    out += fmt::format(
        "  Z at centre: the first feed's terminals at the centre of the first span ({}), "
        "with the\n  mesh error estimate (docs/numerics.md); the other points are not "
        "estimated.\n",
        result.spans.front().name);
  }
  if (result.rows_failed > 0) {
    out += fmt::format("\nFailed rows ({} of {}; the others ran)\n", result.rows_failed,
                       result.rows.size());
    for (const BatchRow& row : result.rows) {
      if (row.error) out += fmt::format("  {}: {}\n", report::RowName(row, result), *row.error);
    }
  }

  out += "\nSummary\n";
  if (per_band) {
    for (size_t b = 0; b < result.spans.size(); ++b) {
      out += fmt::format("  {} (patterns at each row's lowest SWR in the band):\n",
                         result.spans[b].name);
      out += report::SummaryText(result, band_summaries[b], "    ", static_cast<int>(b));
    }
  } else {
    out += report::SummaryText(result, summary, "  ", std::nullopt);
  }
  out += report::WarningsSection(result.warnings);
  out +=
      "\nResonances are zero crossings of the feed reactance within the sweep; gains are dBi "
      "over the\npower into the feed terminals, so ground and wire losses lower them; efficiency "
      "is radiated\nover input power, at most 100% (a ratio computed above 1 is the power-balance "
      "error of\nthe mesh, which `pattern` reports; beyond 2% it is warned about).\n";
  out += report::TransmitCaution();
  return out;
}

namespace report {
namespace {

std::string ResonanceList(const std::vector<double>& resonances_hz) {
  std::string out;
  for (double f_hz : resonances_hz) {
    if (!out.empty()) out += ' ';
    out += Mhz(f_hz);
  }
  return out.empty() ? "none" : out;
}

std::string SummaryText(const BatchResult& result, const BatchSummary& summary,
                        const std::string& indent, std::optional<int> band) {
  std::string out;
  const std::string at_elevation =
      fmt::format("at {} deg elevation", AngleText(result.elevation_deg));
  if (summary.best_row) {
    const BatchRow& best = result.rows[static_cast<size_t>(*summary.best_row)];
    double gain = best.gain_at_elevation_dbi, azimuth = best.gain_at_elevation_azimuth_deg;
    double max_gain = best.max_gain_dbi, takeoff = best.takeoff_deg;
    double min_swr = best.min_swr, min_swr_hz = best.min_swr_frequency_hz;
    if (band) {
      const BatchBand& b = best.bands.at(static_cast<size_t>(*band));
      gain = b.gain_at_elevation_dbi;
      azimuth = b.gain_at_elevation_azimuth_deg;
      max_gain = b.max_gain_dbi;
      takeoff = b.takeoff_deg;
      min_swr = b.min_swr;
      min_swr_hz = b.min_swr_frequency_hz;
    }
    out += fmt::format(
        "{}best {}: row {}: {} dBi toward {} deg azimuth (maximum {} dBi at take-off {} deg), "
        "lowest SWR {:.2f} at {} MHz\n",
        indent, at_elevation, RowName(best, result), GainText(gain), AngleText(azimuth),
        GainText(max_gain), AngleText(takeoff), min_swr, Mhz(min_swr_hz));
  }
  if (result.grounds.size() > 1) {
    out += fmt::format("{}the ground moves the gain {} by up to {:.2f} dB for one setting\n",
                       indent, at_elevation, summary.largest_gain_spread_db);
    if (summary.robust_setting) {
      const BatchSetting& s = summary.settings[static_cast<size_t>(*summary.robust_setting)];
      const std::string name =
          s.labels.empty()
              ? "the model as written"
              : SettingText(result.rows[static_cast<size_t>(*summary.robust_setting)].values,
                            result.variables);
      out += fmt::format(
          "{}safest choice whatever the ground: {}: at least {} dBi {} (worst over {}, best {} "
          "dBi over {})\n",
          indent, name, GainText(s.worst_gain_dbi), at_elevation, s.worst_ground,
          GainText(s.best_gain_dbi), s.best_ground);
    }
    TextTable settings;
    settings.AddColumns({{"setting", Align::kLeft},
                         {"worst (dBi)"},
                         {"over", Align::kLeft},
                         {"best (dBi)"},
                         {"over", Align::kLeft},
                         {"resonance spread (kHz)"},
                         {"min SWR range"}});
    for (size_t i = 0; i < summary.settings.size(); ++i) {
      const BatchSetting& s = summary.settings[i];
      const std::string name =
          s.labels.empty() ? "as written" : SettingText(result.rows[i].values, result.variables);
      if (s.rows_ok == 0) {
        settings.AddRow({name, "-", "-", "-", "-", "-", "failed on every ground"});
        continue;
      }
      settings.AddRow(
          {name, GainText(s.worst_gain_dbi), s.worst_ground, GainText(s.best_gain_dbi),
           s.best_ground,
           s.resonance_spread_hz ? fmt::format("{:.1f}", *s.resonance_spread_hz / 1e3) : "-",
           fmt::format("{:.2f}-{:.2f}", s.min_swr_low, s.min_swr_high)});
    }
    out += fmt::format("{}per setting, gain {} over the {} grounds:\n", indent, at_elevation,
                       result.grounds.size());
    out += settings.Render(static_cast<int>(indent.size()) + 2);
  }
  return out;
}

}  // namespace
}  // namespace report

namespace report {
namespace {

// The pattern figures of a row or of one of its bands.
template <class Figures>
void PutPattern(const Figures& f, nlohmann::json& j) {
  j["pattern_frequency_hz"] = f.pattern_frequency_hz;
  j["max_gain_dbi"] = GainValue(f.max_gain_dbi);
  j["max_gain_azimuth_deg"] = f.max_gain_azimuth_deg;
  j["takeoff_deg"] = f.takeoff_deg;
  j["gain_at_elevation_dbi"] = GainValue(f.gain_at_elevation_dbi);
  j["gain_at_elevation_azimuth_deg"] = f.gain_at_elevation_azimuth_deg;
  j["efficiency"] = f.efficiency;
}

// A variable's value: its SI number, or the model's name for the `model` column.
nlohmann::json ValueJson(const BatchVariable& variable, const BatchValue& value) {
  return variable.names ? nlohmann::json(value.label) : nlohmann::json(value.si);
}

nlohmann::json SummaryJson(const BatchSummary& summary) {
  nlohmann::json s;
  s["best_row"] = report::OptionalJson(summary.best_row);
  s["robust_setting"] = report::OptionalJson(summary.robust_setting);
  s["largest_gain_spread_db"] = summary.largest_gain_spread_db;
  nlohmann::json settings = nlohmann::json::array();
  for (const BatchSetting& setting : summary.settings) {
    nlohmann::json one;
    one["labels"] = setting.labels;
    one["rows_ok"] = setting.rows_ok;
    const bool ran = setting.rows_ok > 0;
    one["worst_gain_dbi"] =
        ran ? nlohmann::json(report::GainValue(setting.worst_gain_dbi)) : nullptr;
    one["worst_ground"] = ran ? nlohmann::json(setting.worst_ground) : nullptr;
    one["best_gain_dbi"] = ran ? nlohmann::json(report::GainValue(setting.best_gain_dbi)) : nullptr;
    one["best_ground"] = ran ? nlohmann::json(setting.best_ground) : nullptr;
    one["resonance_spread_hz"] = report::OptionalJson(setting.resonance_spread_hz);
    one["min_swr_range"] =
        ran ? nlohmann::json::array({setting.min_swr_low, setting.min_swr_high}) : nullptr;
    settings.push_back(one);
  }
  s["settings"] = settings;
  return s;
}

}  // namespace
}  // namespace report

std::string FormatBatchJson(const BatchResult& result) {
  report::CheckBatch(result);
  const BatchSummary summary = SummarizeBatch(result);
  nlohmann::json doc;
  doc["model"] = result.model_file;
  doc["z0_ohm"] = result.z0_ohm;
  doc["grounds"] = result.grounds;
  nlohmann::json vary = nlohmann::json::array();
  for (const BatchVariable& v : result.variables) {
    nlohmann::json values = nlohmann::json::array();
    for (const BatchValue& value : v.values) values.push_back(report::ValueJson(v, value));
    vary.push_back({{"name", v.name}, {"unit", v.unit}, {"values", values}});
  }
  doc["vary"] = vary;
  doc["spans"] = report::SpansJson(result.spans);
  doc["at_hz"] = result.at_hz;
  doc["pattern_frequency_hz"] = report::OptionalJson(result.pattern_frequency_hz);
  doc["pattern_step_deg"] = result.pattern_step_deg;
  doc["elevation_deg"] = result.elevation_deg;
  nlohmann::json rows = nlohmann::json::array();
  for (const BatchRow& row : result.rows) {
    nlohmann::json r;
    r["index"] = row.index;
    r["ground"] = row.ground;
    nlohmann::json variables = nlohmann::json::object();
    nlohmann::json labels = nlohmann::json::object();
    for (size_t v = 0; v < row.values.size(); ++v) {
      variables[result.variables[v].name] = report::ValueJson(result.variables[v], row.values[v]);
      labels[result.variables[v].name] = row.values[v].label;
    }
    r["variables"] = variables;
    r["variable_labels"] = labels;
    r["elevation_deg"] = result.elevation_deg;
    if (row.error) {
      for (const char* key :
           {"resonances_hz", "min_swr", "swr_at", "pattern_frequency_hz", "max_gain_dbi",
            "max_gain_azimuth_deg", "takeoff_deg", "gain_at_elevation_dbi",
            "gain_at_elevation_azimuth_deg", "efficiency", "unknowns", "bands"}) {
        r[key] = nullptr;
      }
      r["error"] = *row.error;
      r["error_kind"] = row.input_error ? "input" : "computation";
    } else {
      r["resonances_hz"] = row.resonances_hz;
      r["min_swr"] = {{"frequency_hz", row.min_swr_frequency_hz}, {"swr", row.min_swr}};
      nlohmann::json at = nlohmann::json::array();
      for (const auto& [f_hz, swr] : row.swr_at)
        at.push_back({{"frequency_hz", f_hz}, {"swr", swr}});
      r["swr_at"] = at;
      report::PutPattern(row, r);
      nlohmann::json bands = nlohmann::json::array();
      for (const BatchBand& band : row.bands) {
        nlohmann::json b;
        b["name"] = band.name;
        b["resonances_hz"] = band.resonances_hz;
        b["min_swr"] = {{"frequency_hz", band.min_swr_frequency_hz}, {"swr", band.min_swr}};
        if (band.has_pattern) {
          report::PutPattern(band, b);
        } else {
          for (const char* key :
               {"pattern_frequency_hz", "max_gain_dbi", "max_gain_azimuth_deg", "takeoff_deg",
                "gain_at_elevation_dbi", "gain_at_elevation_azimuth_deg", "efficiency"}) {
            b[key] = nullptr;
          }
        }
        bands.push_back(b);
      }
      r["bands"] = bands;
      r["unknowns"] = row.unknowns;
      r["mesh_estimate"] = row.mesh_estimate
                               ? report::CentreEstimatesJson({*row.mesh_estimate}).front()
                               : nlohmann::json();
      r["error"] = nullptr;
      r["error_kind"] = nullptr;
    }
    r["warnings"] = report::WarningsJson(row.warnings);
    rows.push_back(r);
  }
  doc["rows"] = rows;
  doc["rows_failed"] = result.rows_failed;
  nlohmann::json s = report::SummaryJson(summary);
  if (BatchHasBandPatterns(result)) {
    nlohmann::json bands = nlohmann::json::array();
    for (size_t b = 0; b < result.spans.size(); ++b) {
      nlohmann::json one = report::SummaryJson(SummarizeBatch(result, static_cast<int>(b)));
      one["name"] = result.spans[b].name;
      bands.push_back(one);
    }
    s["bands"] = bands;
  } else {
    s["bands"] = nullptr;
  }
  doc["summary"] = s;
  doc["threads_used"] = result.threads_used;
  doc["elapsed_s"] = result.elapsed_s;
  doc["warnings"] = report::WarningsJson(result.warnings);
  return doc.dump(2) + "\n";
}

std::string FormatBatchCsv(const BatchResult& result) {
  report::CheckBatch(result);
  std::string out = FormatBatchCsvHeader(result);
  for (const BatchRow& row : result.rows) out += FormatBatchCsvRow(result, row);
  return out;
}

std::string FormatBatchStreamedText(const BatchResult& result, const std::string& csv_path) {
  report::CheckFinite(result.z0_ohm, "z0", BatchRow{});
  std::string out = report::RunHeader(result, static_cast<size_t>(result.rows_planned));
  out += fmt::format(
      "\nThe rows went to {} as they finished ({} of {} failed; see its error column). A grid "
      "this large\nis not tabled here and has no summary: both would hold every row in "
      "memory. Sort the CSV\nby gain_at_elevation_dbi for the best row.\n",
      csv_path, result.rows_failed, result.rows_planned);
  out += report::WarningsSection(result.warnings);
  out += report::TransmitCaution();
  return out;
}

std::string FormatBatchCsvHeader(const BatchResult& result) {
  report::CheckFinite(result.z0_ohm, "z0", BatchRow{});
  std::string out = "index,ground";
  for (const BatchVariable& v : result.variables) {
    out += fmt::format(",{}{}{}", v.name, v.unit.empty() ? "" : "_", v.unit);
  }
  out += ",resonances_hz,min_swr,min_swr_frequency_hz";
  for (double f_hz : result.at_hz) out += fmt::format(",swr_at_{:.10g}_hz", f_hz);
  out +=
      ",pattern_frequency_hz,max_gain_dbi,max_gain_azimuth_deg,takeoff_deg,"
      "gain_at_elevation_dbi,elevation_deg,efficiency,unknowns,gain_at_elevation_azimuth_deg";
  for (const SweepSpan& span : result.spans) {
    for (const char* key :
         {"resonances_hz", "min_swr", "min_swr_frequency_hz", "pattern_frequency_hz",
          "max_gain_dbi", "takeoff_deg", "gain_at_elevation_dbi", "gain_at_elevation_azimuth_deg",
          "efficiency"}) {
      out += fmt::format(",{}_{}", span.name, key);
    }
  }
  out += ",mesh_frequency_hz,mesh_r_ohm,mesh_x_ohm,mesh_error_ohm,error\n";
  return out;
}

std::string FormatBatchCsvRow(const BatchResult& result, const BatchRow& row) {
  report::CheckRow(row);
  const size_t band_columns = 9 * result.spans.size();
  std::string out;
  out += fmt::format("{},{}", row.index, report::CsvQuoted(row.ground));
  for (size_t v = 0; v < row.values.size(); ++v) {
    out += result.variables[v].names ? fmt::format(",{}", report::CsvQuoted(row.values[v].label))
                                     : fmt::format(",{:.10g}", row.values[v].si);
  }
  if (row.error) {
    out += std::string(3 + result.at_hz.size() + 9 + band_columns + 4 + 1, ',');
    out += report::CsvQuoted(*row.error) + "\n";
    return out;
  }
  std::string resonances;
  for (double f_hz : row.resonances_hz) {
    resonances += fmt::format("{}{:.10g}", resonances.empty() ? "" : ";", f_hz);
  }
  out += fmt::format(",{},{:.10g},{:.10g}", resonances, row.min_swr, row.min_swr_frequency_hz);
  for (const auto& [f_hz, swr] : row.swr_at) out += fmt::format(",{:.10g}", swr);
  out += fmt::format(",{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},{},{:.10g}",
                     row.pattern_frequency_hz, report::GainValue(row.max_gain_dbi),
                     row.max_gain_azimuth_deg, row.takeoff_deg,
                     report::GainValue(row.gain_at_elevation_dbi), result.elevation_deg,
                     row.efficiency, row.unknowns, row.gain_at_elevation_azimuth_deg);
  for (const BatchBand& band : row.bands) {
    std::string band_resonances;
    for (double f_hz : band.resonances_hz) {
      band_resonances += fmt::format("{}{:.10g}", band_resonances.empty() ? "" : ";", f_hz);
    }
    out += fmt::format(",{},{:.10g},{:.10g}", band_resonances, band.min_swr,
                       band.min_swr_frequency_hz);
    if (band.has_pattern) {
      out += fmt::format(",{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},{:.10g}",
                         band.pattern_frequency_hz, report::GainValue(band.max_gain_dbi),
                         band.takeoff_deg, report::GainValue(band.gain_at_elevation_dbi),
                         band.gain_at_elevation_azimuth_deg, band.efficiency);
    } else {
      out += ",,,,,,";
    }
  }
  out += report::RowMeshCsv(row);
  out += ",\n";
  return out;
}

}  // namespace wirefield
