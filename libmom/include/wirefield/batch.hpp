// wirefield public API, part 10: one model over a grid of grounds, `let` values and
// frequencies (the `batch` command). Each grid point (row) re-parses the model with its
// values as overrides, sweeps it and computes one pattern; rows run on worker threads
// and come back in grid order. Implemented in libmom/src/study/batch_grid.cpp, batch_run.cpp
// and batch_summary.cpp (reports in libmom/src/report/batch_report.cpp).
#pragma once

#include <atomic>
#include <cstddef>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "wirefield/bands.hpp"
#include "wirefield/model.hpp"
#include "wirefield/sweep.hpp"

namespace wirefield {

// One ground of the grid: the name shown and what it sets (empty: the model's own ground).
struct BatchGround {
  std::string name;
  std::optional<GroundSpec> spec;
};

// The ground of a grid called `name`: a ground preset, "free" or "perfect", its spec located
// at `origin` (at 1:1) for the errors it may raise; empty for any other name.
std::optional<BatchGround> BatchGroundNamed(const std::string& name, const std::string& origin);
// The names BatchGroundNamed takes: every ground preset, then free and perfect.
std::vector<std::string> BatchGroundNames();

// One value of a varied `let`.
struct BatchValue {
  double si = 0.0;         // SI number (m, Hz, ohm, H, F, V, or a plain number)
  std::string label;       // as shown in reports: "19.75m", "7.1MHz", "2.5"
  std::string shown;       // the number of the label alone: "19.75", "7.1", "2.5"
  std::string expression;  // the override applied to the model (exact, SI unit)
};

// A varied `let` and its values, in the order they are run.
struct BatchVariable {
  std::string name;
  std::string unit;        // SI unit of `si` ("m", "Hz", ...), empty for a plain number
  std::string shown_unit;  // unit of the labels ("m", "MHz", "uH", "pF", ...)
  std::vector<BatchValue> values;
  // True for the `model` column of RunBatchFiles: each value is a model's name (its label),
  // not a number (its `si` is 0 and unused), and reports print the name.
  bool names = false;
  // Where the values come from, named as the "file" of errors about them (the command line
  // gives "--vary NAME"); empty: "variables NAME".
  std::string origin;
};

// The most values one variable may take (a range finer than this is surely a typing slip).
inline constexpr int kMaxVaryValues = 10000;

// A varied `let` from its values, each a constant of the model language with its unit (19.5m,
// 7.1MHz, 2.5), all of one quantity; labels in the unit they read best in (MHz, uH, pF).
// Throws InputError at `origin` (empty: "variables NAME") saying what to change.
BatchVariable BatchVariableFromValues(const std::string& name,
                                      const std::vector<std::string>& values,
                                      const std::string& origin = {});
// The same for a range: first, first + step, ... up to last, inclusive within 1e-9 of a step
// (first <= last, step > 0, all of one quantity).
BatchVariable BatchVariableFromRange(const std::string& name, const std::string& first,
                                     const std::string& last, const std::string& step,
                                     const std::string& origin = {});

// Grids larger than this need BatchOptions::allow_large.
inline constexpr int kMaxBatchRows = 2000;
// No grid runs with more rows than this, allow_large or not: a row's index is an int. At a
// millisecond a row such a grid would run for weeks.
inline constexpr double kMaxBatchRowsEver = 2147483647.0;

// The rows of a grid, each computed from its index alone, so that no row costs memory before
// it runs: the ground varies slowest, then each dimension in the order given (the
// variables; RunBatchFiles puts the models first), the last fastest.
class BatchGrid {
 public:
  struct Point {
    size_t ground = 0;
    std::vector<size_t> values;  // the index of the value of each dimension
  };
  // ground_count 0 counts as one (the model's own ground); a dimension of size 0 empties it.
  BatchGrid(size_t ground_count, std::vector<size_t> dimension_sizes);
  // The number of rows, as a double: a grid may be far beyond any integer before it is refused.
  double rows() const { return rows_; }
  // The ground and values of row `index` (0 <= index < rows()).
  Point At(size_t index) const;

 private:
  size_t ground_count_ = 1;
  std::vector<size_t> sizes_;
  double rows_ = 1.0;
};

struct BatchRow;
struct BatchResult;

struct BatchOptions {
  // Grounds to run; empty: the model's own ground only. Cost: one row per ground per setting.
  std::vector<BatchGround> grounds;
  // Varied `let`s; the grid is the product of all, the first varying slowest (after the
  // ground, which varies slowest of all).
  std::vector<BatchVariable> variables;
  // Overrides applied to every row (a variable may not be both set and varied).
  std::vector<Override> fixed_overrides;
  // Reference impedance of the SWR; default the model's z0, else 50 ohm.
  std::optional<double> z0_ohm;
  // The frequencies of each row's sweep (bands or a range, see bands.hpp). Required; the
  // rows' cost grows in proportion to the points.
  std::vector<SweepSpan> spans;
  // Extra columns: the SWR solved at each of these frequencies (not interpolated).
  std::vector<double> at_hz;
  // Frequency of each row's pattern; default the row's own minimum-SWR frequency.
  std::optional<double> pattern_frequency_hz;
  // Elevation of the low-angle gain column, degrees (0..90 over a ground, -90..90 in free
  // space). Default 10.
  double elevation_deg = 10.0;
  // Grid step of each row's pattern, degrees (0 < step <= 10). Default 2: the maximum is
  // searched on a 2-degree grid and refined anyway, and the cuts cost 1/step.
  double pattern_step_deg = 2.0;
  // Worker threads; 0 = one per hardware core. Rows run in parallel (one matrix per worker);
  // with fewer rows than threads each row's sweep gets the spare threads.
  int threads = 0;
  // Matrix interpolation in each row's sweep (SweepOptions::interpolate). Default true;
  // false fills the matrix exactly at every point (the CLI's --exact), several times slower.
  bool interpolate = true;
  // Estimate each row's mesh error (EstimateFirstFeedAt at the centre of the first span: one
  // exact solve and two coarser ones per row). Default true; the CLI's --no-mesh-estimate
  // turns it off.
  bool mesh_estimate = true;
  // Run grids of more than kMaxBatchRows rows (otherwise InputError before any row).
  bool allow_large = false;
  // Asks the run to stop early (the CLI sets it on Ctrl-C; null: never). Once it reads true,
  // no new row starts; rows in flight finish and the result holds the rows finished so far,
  // with BatchResult::interrupted set. Costs one atomic load per row.
  const std::atomic<bool>* cancel = nullptr;
  // Takes each row as it finishes, in grid order, one call at a time (from the worker
  // threads); the result's `rows` then stay empty (its other fields are filled before the
  // first call), so memory does not grow with the grid. The rows that finish out of order wait
  // for the ones before them: at most a few per worker thread. Empty: rows are kept in
  // BatchResult::rows.
  std::function<void(const BatchResult& run, const BatchRow& row)> row_sink;

  // Checks the pattern and extra-column fields against their bounds (the low-angle elevation
  // may be negative only when no row is over a ground, over_ground false); throws InputError
  // (file: the field's name, such as "elevation_deg", at 1:1) whose message states the bound.
  void Validate(bool over_ground) const;
};

// What one row does in one span of its sweep (a band, or the --from/--to range): the sweep's
// figures inside the span and, unless BatchOptions::pattern_frequency_hz fixes one pattern for
// the row, a pattern at the span's own lowest-SWR frequency, so that the gains of a 40 m and a
// 20 m band are never mixed.
struct BatchBand {
  std::string name;                   // the span's name ("40m", "range")
  std::vector<double> resonances_hz;  // zero crossings of the feed reactance in the span
  double min_swr = 0.0;
  double min_swr_frequency_hz = 0.0;
  bool has_pattern = false;  // false with a fixed pattern frequency: the fields below are 0
  double pattern_frequency_hz = 0.0;
  double max_gain_dbi = 0.0;
  double max_gain_azimuth_deg = 0.0;
  double takeoff_deg = 0.0;
  double gain_at_elevation_dbi = 0.0;  // best over azimuth at BatchOptions::elevation_deg
  double gain_at_elevation_azimuth_deg = 0.0;
  double efficiency = 0.0;
};

// One grid point. When error is set the numbers are unset (zero) and only the ground,
// variables and error mean anything.
struct BatchRow {
  int index = 0;                      // 0-based, in grid order
  std::string ground;                 // the BatchGround's name
  std::vector<BatchValue> values;     // one per BatchOptions::variables, in that order
  std::optional<std::string> error;   // why the row failed (the error's full text)
  bool input_error = false;           // the failure was an InputError (else a ComputationError)
  std::vector<double> resonances_hz;  // zero crossings of the feed reactance in the sweep
  double min_swr = 0.0;
  double min_swr_frequency_hz = 0.0;
  std::vector<std::pair<double, double>> swr_at;  // (frequency_hz, swr) per BatchOptions::at_hz
  double pattern_frequency_hz = 0.0;
  double max_gain_dbi = 0.0;
  double max_gain_azimuth_deg = 0.0;
  double takeoff_deg = 0.0;  // elevation of the maximum (PatternResult's take-off)
  // The best gain over azimuth at BatchOptions::elevation_deg (the azimuth cut there, on the
  // pattern's grid), and its azimuth: how well the row does at low angles in its best
  // direction.
  double gain_at_elevation_dbi = 0.0;
  double gain_at_elevation_azimuth_deg = 0.0;
  double efficiency = 0.0;        // radiated / input power (ground loss included)
  std::vector<BatchBand> bands;   // one per BatchOptions::spans, in that order
  int unknowns = 0;               // of the sweep's mesh
  std::vector<Warning> warnings;  // of the model, meshes and pattern of this row
  // The first feed's impedance at the centre of the first span with its mesh error estimate
  // (BatchOptions::mesh_estimate).
  std::optional<FeedMeshEstimateAt> mesh_estimate;
};

struct BatchResult {
  std::string model_file;
  std::vector<std::string> grounds;      // in grid order
  std::vector<BatchVariable> variables;  // as run
  std::vector<SweepSpan> spans;
  std::vector<double> at_hz;
  std::optional<double> pattern_frequency_hz;  // as asked (empty: per row's minimum SWR)
  double elevation_deg = 10.0;
  double pattern_step_deg = 2.0;
  double z0_ohm = kDefaultZ0Ohm;
  std::vector<BatchRow> rows;  // in grid order, whatever the thread count (empty with row_sink)
  // True when BatchOptions::cancel stopped the run: `rows` then holds only the rows that
  // finished (in grid order; BatchRow::index says where each sits), of rows_planned.
  bool interrupted = false;
  int rows_planned = 0;
  int rows_failed = 0;
  int threads_used = 1;
  double elapsed_s = 0.0;
  std::vector<Warning> warnings;  // every distinct warning of every row, in row order
};

// The grid size BatchOptions asks for (grounds times the product of the variables' values).
double BatchRowCount(const BatchOptions& options);

// Runs the grid over the model text (file_name is for diagnostics). Checks everything it can
// before any row: the model parses with the fixed overrides, every varied name is a `let` of
// the model, the grid size, the angles; those throw InputError. A row that fails (InputError
// or ComputationError from parsing, meshing or solving) keeps its reason and the rest go on.
// When every row fails, throws the first row's error (not when interrupted). progress(done,
// total) is called after each row from the worker threads, one call at a time.
BatchResult RunBatch(const std::string& model_text, const std::string& file_name,
                     const BatchOptions& options,
                     const std::function<void(int, int)>& progress = {});
// The same for a model file (read once).
BatchResult RunBatchFile(const std::string& path, const BatchOptions& options,
                         const std::function<void(int, int)>& progress = {});

// Several models over the same grid, compared row by row: the result has a first variable
// "model" (the file name without its folder and extension, or the path as given when two
// files share that name; BatchVariable::names) before the others, so reports
// and the summary treat each model as a setting ("which shape is best whatever the ground").
// Every model must accept the same varied names. One path: RunBatchFile.
BatchResult RunBatchFiles(const std::vector<std::string>& paths, const BatchOptions& options,
                          const std::function<void(int, int)>& progress = {});

// What a user acts on: the best row, and with several grounds how much the ground matters.
struct BatchSetting {
  std::vector<std::string> labels;  // the variables' values (empty without variables)
  int rows_ok = 0;                  // rows of this setting that succeeded (one per ground)
  double worst_gain_dbi = 0.0;      // lowest gain at the elevation over the grounds
  std::string worst_ground;
  double best_gain_dbi = 0.0;  // highest over the grounds
  std::string best_ground;
  std::optional<double> resonance_spread_hz;  // first resonance, highest - lowest (2+ rows)
  double min_swr_low = 0.0;                   // the minimum SWR's range over the grounds
  double min_swr_high = 0.0;
};
struct BatchSummary {
  std::optional<int> best_row;         // highest gain at the elevation among the rows that ran
  std::vector<BatchSetting> settings;  // one per setting of the variables, in grid order
  // The setting whose worst ground still gives the highest gain at the elevation, among the
  // settings that ran over every ground (only with more than one ground).
  std::optional<int> robust_setting;
  double largest_gain_spread_db = 0.0;  // best - worst over the grounds, largest of settings
};
// band: summarise the figures of that span (BatchRow::bands[band]) instead of the row's own;
// a span without its own pattern gives an empty summary.
BatchSummary SummarizeBatch(const BatchResult& result, std::optional<int> band = {});

// True when the rows carry a pattern per span (several spans and no fixed pattern frequency):
// the reports then show and summarise each band on its own.
bool BatchHasBandPatterns(const BatchResult& result);

}  // namespace wirefield
