// wirefield public API: the reports, for people and scripts: text, JSON, CSV, SVG and
// Touchstone made from results. They are the library target wirefield::report (libmom/src/
// report/), apart from the numerics (wirefield::wirefield), and are what the command-line
// program prints; the JSON follows /work/shared CONTRACT.md (keys in docs/commands.md). Every
// number is checked to be finite before it is printed (ComputationError otherwise).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "wirefield/bands.hpp"
#include "wirefield/batch.hpp"
#include "wirefield/coil.hpp"
#include "wirefield/pattern.hpp"
#include "wirefield/results.hpp"
#include "wirefield/simulation.hpp"
#include "wirefield/stress.hpp"
#include "wirefield/sweep.hpp"
#include "wirefield/touchstone.hpp"
#include "wirefield/tune.hpp"

namespace wirefield {

// ---- solve ---------------------------------------------------------------------------------

// A readable report of one solve: frequency, unknowns, each feed (R + jX, |Z|, SWR, current)
// and each load (current, voltage, dissipated power), with units.
// With `stress` (a --power run), a section of voltages, currents and cautions at that power.
std::string FormatSolveText(const Simulation& simulation, const SolveResult& result,
                            const StressResult* stress = nullptr);

// The contract's JSON document for `solve` (one line or pretty-printed, always valid JSON).
// With `stress`, the key "stress" (docs/commands.md).
std::string FormatSolveJson(const Simulation& simulation, const SolveResult& result,
                            const StressResult* stress = nullptr);

// ---- the current on every segment (solve --currents) ----------------------------------------

// What the currents of a solve are scaled to: the solved ones (a source of 1 V peak at each
// feed unless the model gives another voltage) have factor 1; at a transmitter power, the
// stress's scale (StressResult::scale).
struct CurrentsScale {
  double factor = 1.0;
  std::string excitation;  // said beside every value: "1 V peak at each feed", "100 W ..."
};
// One CSV row per segment, each wire's segments in order from its start: the wire, the
// segment's number on it (from 1), its distance from the wire's start (from_m, to_m), its ends,
// and the current's peak magnitude (A) and phase (degrees) at its start, centre and end (the
// current flows positive from start to end), with the excitation. Non-finite currents:
// ComputationError.
std::string FormatCurrentsCsv(const Simulation& simulation, const SolveResult& result,
                              const CurrentsScale& scale);
// The same as one JSON document {"model", "frequency_hz", "excitation", "segments": [...]}.
std::string FormatCurrentsJson(const Simulation& simulation, const SolveResult& result,
                               const CurrentsScale& scale);

// ---- pattern -------------------------------------------------------------------------------

// Reports (the command-line program prints these).
// With `stress` and `exposure` (a --power run), their sections (text) or keys "stress" and
// "exposure" (JSON).
std::string FormatPatternText(const Simulation& simulation, const PatternResult& pattern,
                              const StressResult* stress = nullptr,
                              const ExposureResult* exposure = nullptr);
std::string FormatPatternJson(const Simulation& simulation, const PatternResult& pattern,
                              const StressResult* stress = nullptr,
                              const ExposureResult* exposure = nullptr);
std::string FormatPatternCsv(const PatternResult& pattern);
// Two polar plots (elevation and azimuth cut, dB scale) as one self-contained SVG document.
std::string FormatPatternSvg(const Simulation& simulation, const PatternResult& pattern);

// ---- stress and exposure -------------------------------------------------------------------

// Reports: a text section (each ending in '\n') and the JSON object as text.
std::string FormatStressText(const StressResult& stress);
std::string FormatStressJson(const StressResult& stress);
std::string FormatStressPeaksText(const std::vector<StressPeak>& peaks, double power_w);
std::string FormatStressPeaksJson(const std::vector<StressPeak>& peaks, double power_w);
std::string FormatExposureText(const ExposureResult& exposure);
std::string FormatExposureJson(const ExposureResult& exposure);

// ---- sweep ---------------------------------------------------------------------------------

// Everything a sweep report shows, gathered by the caller.
struct SweepReport {
  std::string model_file;
  std::string feed_name;  // the first feed, whose points these are
  GroundSpec ground;      // the model's ground, stated in the report
  // The model's wires: the report states the insulated ones (their jacket and the method).
  std::vector<WireSpec> wires;
  SweepResult sweep;
  std::vector<SweepSpan> spans;      // how the frequencies were chosen, in order
  std::vector<BandSummary> bands;    // one per --band, in the order given (empty for a range)
  std::optional<BandSummary> range;  // the whole --from/--to range (empty for bands)
  int region = 1;
  bool region_given = false;  // false: region 1 was assumed
  std::optional<MeasuredComparison> measured;
  // The first feed's mesh error estimate at the centre of each band (or of the range), in
  // order; only at the centres, not at every point (empty with --no-mesh-estimate).
  std::vector<FeedMeshEstimateAt> mesh_estimates;
  std::vector<Warning> warnings;
};

// A readable report: header, per-point table (MHz, R, X, |Z| at the transmitter, SWR, return
// loss), per-band summary, measured comparison, and a safety note.
std::string FormatSweepText(const SweepReport& report);
// The JSON document of `sweep` (docs/commands.md). Always valid JSON, finite numbers only.
std::string FormatSweepJson(const SweepReport& report);
// One CSV row per point; header row with units.
std::string FormatSweepCsv(const SweepReport& report);
// One self-contained SVG: SWR against frequency (bands shaded, 2:1 line, resonances, the
// measured curve dashed) and a Smith chart of the impedance at the transmitter.
std::string FormatSweepSvg(const SweepReport& report);
// A Touchstone 1.1 one-port file of S11 at the transmitter against z0.
std::string FormatSweepTouchstone(const SweepReport& report);

// ---- tune ----------------------------------------------------------------------------------

// The text report: each variable's value with its unit, the impedance and SWR at the target,
// the sensitivity (kHz per cm, per uH or per pF) and a trimming hint, with a safety caution.
std::string FormatTuneText(const TuneResult& result);
// The JSON document of `tune` (docs/commands.md); every number finite.
std::string FormatTuneJson(const TuneResult& result);

// ---- batch ---------------------------------------------------------------------------------

// Reports. Every number is checked to be finite first (ComputationError otherwise).
// A table with units in its headers, the failed rows with their reasons, the summary and a
// safety note.
std::string FormatBatchText(const BatchResult& result);
// One JSON document: {"model", "rows": [...], "summary", ...} (keys in docs/commands.md).
std::string FormatBatchJson(const BatchResult& result);
// One CSV row per grid row (failed rows too, with their error), header row with units.
std::string FormatBatchCsv(const BatchResult& result);
// FormatBatchCsv in pieces, for rows that stream (BatchOptions::row_sink): the header line,
// then one line per row (the row is checked to be finite first).
std::string FormatBatchCsvHeader(const BatchResult& result);
std::string FormatBatchCsvRow(const BatchResult& result, const BatchRow& row);
// The text report of a run whose rows streamed to the CSV file csv_path (BatchOptions::
// row_sink): the grid, the count of rows and failures, the warnings and the safety note; no
// table and no summary, which would need every row.
std::string FormatBatchStreamedText(const BatchResult& result, const std::string& csv_path);

// ---- coil ----------------------------------------------------------------------------------

// A readable report of an analysis (with units), and its JSON document (keys carry units:
// inductance_h, self_capacitance_f, self_resonance_hz, ac_resistance_ohm, q, ...). When
// target_inductance_h is given the reports say that the turns were designed for it.
std::string FormatCoilText(const CoilSpec& coil, const CoilAnalysis& analysis,
                           std::optional<double> target_inductance_h = std::nullopt);
std::string FormatCoilJson(const CoilSpec& coil, const CoilAnalysis& analysis,
                           std::optional<double> target_inductance_h = std::nullopt);

}  // namespace wirefield
