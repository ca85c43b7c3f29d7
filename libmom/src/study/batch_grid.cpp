// API: one model over a grid of grounds and `let` values (`wirefield batch`). Parses the
// --grounds and --vary lists, checks the whole grid before any work, then runs each row on a
// worker thread: re-parse the model with the row's overrides, sweep it (RunSpans), solve the
// SWR columns, and compute one pattern exactly as `pattern --freq F` would. Output: rows in
// grid order and a summary (best row, spread over the grounds).
#include "wirefield/batch.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <atomic>
#include <chrono>
#include <cmath>
#include <condition_variable>
#include <exception>
#include <filesystem>
#include <map>
#include <mutex>
#include <set>
#include <thread>

#include "core/parallel.hpp"
#include "model/expression.hpp"
#include "model/lexer.hpp"
#include "model/units.hpp"
#include "solve/blas_threads.hpp"
#include "wirefield/pattern.hpp"

namespace wirefield {
namespace {

std::string Trim(const std::string& text) {
  const size_t first = text.find_first_not_of(" \t");
  if (first == std::string::npos) return "";
  const size_t last = text.find_last_not_of(" \t");
  return text.substr(first, last - first + 1);
}

std::vector<std::string> Split(const std::string& text, char separator) {
  std::vector<std::string> parts;
  size_t start = 0;
  while (true) {
    const size_t at = text.find(separator, start);
    parts.push_back(Trim(text.substr(start, at == std::string::npos ? at : at - start)));
    if (at == std::string::npos) return parts;
    start = at + 1;
  }
}

// The unit a value of `dimension` is written in: the SI unit (exact, for the override) and
// the unit shown (MHz, uH, pF read better than Hz, H, F).
struct ValueUnit {
  std::string si_unit;
  std::string shown_unit;
  double shown_factor = 1.0;  // SI per shown unit
};

std::optional<ValueUnit> UnitOf(const model::Dimension& dimension) {
  if (dimension.IsNone()) return ValueUnit{"", "", 1.0};
  if (dimension == model::kFrequency) return ValueUnit{"Hz", "MHz", 1e6};
  if (dimension == model::kInductance) return ValueUnit{"H", "uH", 1e-6};
  if (dimension == model::kCapacitance) return ValueUnit{"F", "pF", 1e-12};
  for (const model::Quantity* q :
       {&model::LengthQuantity(), &model::ResistanceQuantity(), &model::VoltageQuantity()}) {
    if (dimension == q->dimension)
      return ValueUnit{std::string(q->si_unit), std::string(q->si_unit), 1.0};
  }
  return std::nullopt;
}

// A constant of the model language ("19.5m", "7.1MHz", "-2.5"), evaluated without variables.
model::Value Constant(const std::string& text, const std::string& where) {
  const model::LineSource source{where, 1, 0};
  const std::vector<model::Token> tokens = model::LexLine(text, source);
  if (tokens.front().kind == model::TokenKind::kEnd) {
    throw InputError(model::At(source, 1),
                     "a value is empty; write --vary NAME=A:B:STEP or --vary NAME=V1,V2");
  }
  model::Scope no_variables;
  size_t pos = 0;
  const model::Value value = model::EvaluateExpression(tokens, &pos, no_variables, source);
  if (tokens[pos].kind != model::TokenKind::kEnd) {
    throw InputError(model::At(source, tokens[pos].column),
                     fmt::format("unexpected {} after the value", model::Quote(tokens[pos])));
  }
  return value;
}

BatchValue MakeValue(double si, const ValueUnit& unit) {
  if (si == 0.0) si = 0.0;  // no -0
  BatchValue value;
  value.si = si;
  // fmt's shortest form reads back to the same double, so the override is exact.
  value.expression = fmt::format("{}{}", si, unit.si_unit);
  value.shown = fmt::format("{:.6g}", si / unit.shown_factor);
  value.label = value.shown + unit.shown_unit;
  return value;
}

const char* KindName(GroundKind kind) {
  switch (kind) {
    case GroundKind::kFree:
      return "free";
    case GroundKind::kPerfect:
      return "perfect";
    case GroundKind::kReal:
      return "real";
  }
  return "real";
}

// The name a model's own ground is shown under: its preset, or its kind.
std::string OwnGroundName(const GroundSpec& ground) {
  if (!ground.preset.empty()) return ground.preset;
  return KindName(ground.kind);
}

std::string ListNames(const std::vector<std::string>& names) {
  std::string out;
  for (const std::string& n : names) out += (out.empty() ? "" : ", ") + n;
  return out;
}

// One row's work. Throws what parsing, meshing or solving throws.
struct RowPlan {
  int index = 0;
  const BatchGround* ground = nullptr;
  std::vector<BatchValue> values;
};

BatchRow RunRow(const std::string& text, const std::string& file, const BatchOptions& options,
                const RowPlan& plan, double mesh_frequency_hz, int sweep_threads,
                int fill_threads) {
  BatchRow row;
  row.index = plan.index;
  row.values = plan.values;
  std::vector<Override> overrides = options.fixed_overrides;
  for (size_t v = 0; v < options.variables.size(); ++v) {
    overrides.push_back(Override{options.variables[v].name, plan.values[v].expression});
  }
  Model model = ParseModelText(text, file, overrides);
  if (plan.ground->spec) model.ground = *plan.ground->spec;
  row.ground = plan.ground->spec ? plan.ground->name : OwnGroundName(model.ground);
  if (options.z0_ohm) model.z0_ohm = options.z0_ohm;

  SimulationOptions sweep_mesh;
  sweep_mesh.max_frequency_hz = mesh_frequency_hz;
  sweep_mesh.fill_threads = fill_threads;
  const Simulation simulation(model, sweep_mesh);
  SweepOptions sweep_options;
  sweep_options.threads = sweep_threads;
  sweep_options.interpolate = options.interpolate;
  const SweepResult sweep = RunSpans(simulation, options.spans, sweep_options);
  row.unknowns = sweep.unknowns;
  row.resonances_hz = sweep.resonances_hz;
  row.min_swr = sweep.min_swr;
  row.min_swr_frequency_hz = sweep.min_swr_frequency_hz;
  if (!options.at_hz.empty()) {
    sweep_options.interpolate = false;  // a few points: solved exactly
    const SweepResult at = RunSweep(simulation, options.at_hz, sweep_options);
    for (const SweepPoint& p : at.points) row.swr_at.emplace_back(p.frequency_hz, p.swr);
  }

  // Each span's own figures: its slice of the sweep's points (RunSpans keeps span order).
  size_t first_point = 0;
  for (const SweepSpan& span : options.spans) {
    BatchBand band;
    band.name = span.name;
    const size_t count = span.frequencies_hz.size();
    for (size_t i = first_point; i < first_point + count && i < sweep.points.size(); ++i) {
      const SweepPoint& p = sweep.points[i];
      if (i == first_point || p.swr < band.min_swr) {
        band.min_swr = p.swr;
        band.min_swr_frequency_hz = p.frequency_hz;
      }
    }
    first_point += count;
    for (double f_hz : sweep.resonances_hz) {
      if (f_hz >= span.frequencies_hz.front() && f_hz <= span.frequencies_hz.back()) {
        band.resonances_hz.push_back(f_hz);
      }
    }
    row.bands.push_back(std::move(band));
  }

  // Patterns as `wirefield pattern --freq F --elevation E` computes them: a mesh for F itself.
  std::vector<Warning> pattern_warnings;
  const auto pattern_at = [&](double f_hz, auto& figures) {
    SimulationOptions pattern_mesh;
    pattern_mesh.max_frequency_hz = f_hz;
    pattern_mesh.fill_threads = fill_threads;
    const Simulation at_pattern(model, pattern_mesh);
    const SolveResult solved = at_pattern.Solve(f_hz);
    PatternOptions pattern_options;
    pattern_options.step_deg = options.pattern_step_deg;
    pattern_options.threads = fill_threads;  // one when the rows share the cores
    pattern_options.azimuth_cut_elevation_deg = options.elevation_deg;
    const PatternResult pattern = ComputePattern(at_pattern, solved, pattern_options);
    figures.pattern_frequency_hz = f_hz;
    figures.max_gain_dbi = pattern.max_gain_dbi;
    figures.max_gain_azimuth_deg = pattern.max_gain_azimuth_deg;
    figures.takeoff_deg = pattern.takeoff_elevation_deg;
    const DirectionGain best = BestOverAzimuth(pattern.azimuth_cut);
    figures.gain_at_elevation_dbi = best.gain_dbi;
    figures.gain_at_elevation_azimuth_deg = best.azimuth_deg;
    figures.efficiency = pattern.power.efficiency;
    pattern_warnings.insert(pattern_warnings.end(), pattern.warnings.begin(),
                            pattern.warnings.end());
  };
  const auto copy_pattern = [](const auto& from, auto& to) {
    to.pattern_frequency_hz = from.pattern_frequency_hz;
    to.max_gain_dbi = from.max_gain_dbi;
    to.max_gain_azimuth_deg = from.max_gain_azimuth_deg;
    to.takeoff_deg = from.takeoff_deg;
    to.gain_at_elevation_dbi = from.gain_at_elevation_dbi;
    to.gain_at_elevation_azimuth_deg = from.gain_at_elevation_azimuth_deg;
    to.efficiency = from.efficiency;
  };
  if (options.pattern_frequency_hz) {
    pattern_at(*options.pattern_frequency_hz, row);
  } else {
    // One pattern per span at its lowest SWR; the row's own is that of the span holding the
    // lowest SWR of all (the first such span).
    bool row_set = false;
    for (BatchBand& band : row.bands) {
      pattern_at(band.min_swr_frequency_hz, band);
      band.has_pattern = true;
      if (!row_set && band.min_swr == row.min_swr) {
        copy_pattern(band, row);
        row_set = true;
      }
    }
    if (!row_set) pattern_at(row.min_swr_frequency_hz, row);
  }

  if (options.mesh_estimate) {
    const SweepSpan& first = options.spans.front();
    row.mesh_estimate = EstimateFirstFeedAt(
        simulation, 0.5 * (first.frequencies_hz.front() + first.frequencies_hz.back()), first.name,
        fill_threads);
    pattern_warnings.insert(pattern_warnings.end(), row.mesh_estimate->warnings.begin(),
                            row.mesh_estimate->warnings.end());
  }

  // The sweep's mesh is the finest (highest frequency), so its warnings stand for the
  // patterns' meshes too; those would repeat them at other frequencies.
  std::set<std::string> seen;
  for (const std::vector<Warning>* list :
       {&simulation.warnings(), static_cast<const std::vector<Warning>*>(&pattern_warnings)}) {
    for (const Warning& w : *list) {
      if (seen.insert(ToString(w)).second) row.warnings.push_back(w);
    }
  }
  return row;
}

// The grid's size as a product: "1 ground x 101 values of total x 20 values of height".
std::string GridFactors(const BatchOptions& options) {
  std::string factors = fmt::format("{} ground{}", std::max<size_t>(1, options.grounds.size()),
                                    options.grounds.size() > 1 ? "s" : "");
  for (const BatchVariable& v : options.variables) {
    factors +=
        fmt::format(" x {} value{} of {}", v.values.size(), v.values.size() > 1 ? "s" : "", v.name);
  }
  return factors;
}

// Every check that needs no row: InputError before any work.
void CheckOptions(const BatchOptions& options, const Model& base) {
  if (options.spans.empty()) {
    throw InputError({"batch", 0, 0},
                     "give the frequencies to sweep: --band NAME or --from F1 --to F2 with "
                     "--step DF or --points N");
  }
  std::set<std::string> varied;
  for (const BatchVariable& variable : options.variables) {
    if (!varied.insert(variable.name).second) {
      throw InputError({"--vary " + variable.name, 0, 0},
                       "this variable is varied twice; give one --vary per variable");
    }
    for (const Override& fixed : options.fixed_overrides) {
      if (fixed.name == variable.name) {
        throw InputError({"--vary " + variable.name, 0, 0},
                         "this variable is also given to --set; drop one of them");
      }
    }
    if (std::find(base.variables.begin(), base.variables.end(), variable.name) ==
        base.variables.end()) {
      throw InputError(
          {"--vary " + variable.name, 0, 0},
          base.variables.empty()
              ? fmt::format("the model has no variable '{}' (it defines no variables; add "
                            "`let {} = ...` to vary it)",
                            variable.name, variable.name)
              : fmt::format("the model has no variable '{}' (its variables: {})", variable.name,
                            ListNames(base.variables)));
    }
    if (variable.values.empty()) {
      throw InputError({"--vary " + variable.name, 0, 0}, "the variable has no values");
    }
  }
  const double rows = BatchRowCount(options);
  if (rows > kMaxBatchRows && !options.allow_large) {
    const std::string factors = GridFactors(options);
    throw InputError({"batch", 0, 0},
                     fmt::format("the grid has {:.0f} rows ({}), more than {}; each row is a "
                                 "sweep and a pattern. Use fewer grounds or coarser --vary "
                                 "steps, or pass --yes-large to run it anyway",
                                 rows, factors, kMaxBatchRows));
  }
  if (!(options.pattern_step_deg > 0.0 && options.pattern_step_deg <= 10.0)) {
    throw InputError({"--pattern-step", 1, 1},
                     fmt::format("the pattern step must be greater than 0 and at most 10 "
                                 "degrees; got {:.6g}",
                                 options.pattern_step_deg));
  }
  bool any_ground = options.grounds.empty() && base.ground.kind != GroundKind::kFree;
  for (const BatchGround& g : options.grounds) {
    const GroundKind kind = g.spec ? g.spec->kind : base.ground.kind;
    any_ground = any_ground || kind != GroundKind::kFree;
  }
  const double lowest_deg = any_ground ? 0.0 : -90.0;
  if (!(options.elevation_deg >= lowest_deg && options.elevation_deg <= 90.0)) {
    throw InputError({"--elevation", 1, 1},
                     any_ground ? fmt::format("--elevation must lie between 0 and 90 degrees "
                                              "over a ground (there is no far field below it); "
                                              "got {:.6g}",
                                              options.elevation_deg)
                                : fmt::format("--elevation must lie between -90 and 90 "
                                              "degrees; got {:.6g}",
                                              options.elevation_deg));
  }
  for (double f_hz : options.at_hz) {
    if (!(f_hz > 0.0) || !std::isfinite(f_hz)) {
      throw InputError({"--at", 1, 1},
                       fmt::format("--at needs a positive frequency; got {} Hz", f_hz));
    }
  }
}

}  // namespace

std::vector<BatchGround> ParseGroundList(const std::string& text) {
  std::vector<std::string> known;
  for (const GroundPreset& preset : GroundPresets()) known.push_back(preset.name);
  known.push_back("free");
  known.push_back("perfect");
  const std::string trimmed = Trim(text);
  std::vector<BatchGround> grounds;
  if (trimmed == "all") {
    for (const GroundPreset& preset : GroundPresets()) {
      grounds.push_back(BatchGround{preset.name, RealGround(preset)});
    }
    return grounds;
  }
  for (const std::string& name : Split(trimmed, ',')) {
    BatchGround ground{name, std::nullopt};
    if (name == "free") {
      ground.spec = GroundSpec{};
      ground.spec->kind = GroundKind::kFree;
    } else if (name == "perfect") {
      ground.spec = GroundSpec{};
      ground.spec->kind = GroundKind::kPerfect;
    } else if (const GroundPreset* preset = FindGroundPreset(name)) {
      ground.spec = RealGround(*preset);
    } else if (name == "all") {
      std::vector<std::string> presets(known.begin(), known.end() - 2);
      throw InputError({"--grounds", 1, 1},
                       fmt::format("'all' stands alone: --grounds all runs every ground preset "
                                   "and nothing else; to add free or perfect, list the presets "
                                   "by name: --grounds {},free,perfect",
                                   fmt::join(presets, ",")));
    } else {
      throw InputError(
          {"--grounds", 1, 1},
          fmt::format("unknown ground '{}'{}; use all, or a comma-separated list "
                      "of {}",
                      model::Shorten(name), model::DidYouMean(name, known), ListNames(known)));
    }
    ground.spec->location = SourceLocation{"--grounds", 1, 1};
    for (const BatchGround& earlier : grounds) {
      if (earlier.name == name) {
        throw InputError({"--grounds", 1, 1},
                         fmt::format("ground '{}' is listed twice; list each ground once", name));
      }
    }
    grounds.push_back(std::move(ground));
  }
  return grounds;
}

BatchVariable ParseVary(const std::string& text) {
  const size_t eq = text.find('=');
  if (eq == std::string::npos) {
    throw InputError({"--vary", 1, 1},
                     fmt::format("expected NAME=A:B:STEP or NAME=V1,V2,... (such as --vary "
                                 "length=19.5m:20.5m:0.25m); got '{}'",
                                 model::Shorten(text)));
  }
  BatchVariable variable;
  variable.name = Trim(text.substr(0, eq));
  if (!model::IsName(variable.name)) {
    throw InputError({"--vary", 1, 1},
                     fmt::format("'{}' is not a variable name (letters, digits and _, not "
                                 "starting with a digit); write --vary NAME=A:B:STEP",
                                 model::Shorten(variable.name)));
  }
  const std::string where = "--vary " + variable.name;
  const std::string body = text.substr(eq + 1);
  std::vector<model::Value> values;
  if (body.find(':') != std::string::npos) {
    const std::vector<std::string> parts = Split(body, ':');
    if (parts.size() != 3) {
      throw InputError({where, 1, 1},
                       fmt::format("a range needs three parts A:B:STEP (first, last, step, "
                                   "such as 19.5m:20.5m:0.25m); got '{}'",
                                   model::Shorten(body)));
    }
    const model::Value from = Constant(parts[0], where);
    const model::Value to = Constant(parts[1], where);
    const model::Value step = Constant(parts[2], where);
    if (!(to.dimension == from.dimension) || !(step.dimension == from.dimension)) {
      throw InputError({where, 1, 1},
                       fmt::format("A, B and STEP must be of one quantity; got {}, {} and {}",
                                   model::Describe(from.dimension), model::Describe(to.dimension),
                                   model::Describe(step.dimension)));
    }
    if (!(step.si > 0.0)) {
      throw InputError({where, 1, 1},
                       fmt::format("the step must be positive; got {}", model::Shorten(parts[2])));
    }
    if (!(to.si >= from.si)) {
      throw InputError({where, 1, 1},
                       fmt::format("the last value ({}) must not be below the first ({})",
                                   model::Shorten(parts[1]), model::Shorten(parts[0])));
    }
    const double count = std::floor((to.si - from.si) / step.si + 1e-9) + 1.0;
    if (!(count <= kMaxVaryValues)) {
      throw InputError({where, 1, 1},
                       fmt::format("the range gives {:.0f} values (at most {}); use a larger "
                                   "step",
                                   count, kMaxVaryValues));
    }
    for (int i = 0; i < static_cast<int>(count); ++i) {
      double si = from.si + i * step.si;
      if (std::abs(si - to.si) <= 1e-9 * step.si) si = to.si;  // the inclusive end, exactly
      values.push_back(model::Value{si, from.dimension});
    }
  } else {
    for (const std::string& part : Split(body, ',')) {
      values.push_back(Constant(part, where));
      if (!(values.back().dimension == values.front().dimension)) {
        throw InputError({where, 1, 1},
                         fmt::format("every value must be of one quantity; '{}' is {}, the "
                                     "first is {}",
                                     model::Shorten(part), model::Describe(values.back().dimension),
                                     model::Describe(values.front().dimension)));
      }
    }
    if (values.size() > static_cast<size_t>(kMaxVaryValues)) {
      throw InputError({where, 1, 1}, fmt::format("at most {} values", kMaxVaryValues));
    }
  }
  const std::optional<ValueUnit> unit = UnitOf(values.front().dimension);
  if (!unit) {
    throw InputError(
        {where, 1, 1},
        fmt::format("the values are {}; give a plain number or one with a unit "
                    "of the model language ({})",
                    model::Describe(values.front().dimension), model::KnownUnitsSummary()));
  }
  variable.unit = unit->si_unit;
  variable.shown_unit = unit->shown_unit;
  for (const model::Value& v : values) variable.values.push_back(MakeValue(v.si, *unit));
  return variable;
}

double BatchRowCount(const BatchOptions& options) {
  double rows = static_cast<double>(std::max<size_t>(1, options.grounds.size()));
  for (const BatchVariable& v : options.variables) rows *= static_cast<double>(v.values.size());
  return rows;
}

BatchGrid::BatchGrid(size_t ground_count, std::vector<size_t> dimension_sizes)
    : ground_count_(std::max<size_t>(1, ground_count)), sizes_(std::move(dimension_sizes)) {
  rows_ = static_cast<double>(ground_count_);
  for (size_t size : sizes_) rows_ *= static_cast<double>(size);
}

BatchGrid::Point BatchGrid::At(size_t index) const {
  if (!(static_cast<double>(index) < rows_)) {
    throw ComputationError(fmt::format("BatchGrid::At: row {} of a grid of {:.0f}", index, rows_));
  }
  Point point;
  point.values.resize(sizes_.size());
  size_t rest = index;
  for (size_t d = sizes_.size(); d-- > 0;) {
    point.values[d] = rest % sizes_[d];
    rest /= sizes_[d];
  }
  point.ground = rest;
  return point;
}

namespace {

// A finished row waiting for the rows before it, with what the run needs to know of it.
struct FinishedRow {
  BatchRow row;
  std::exception_ptr error;  // the row's own failure, to rethrow when every row fails
  size_t model = 0;
};

// The grid over one or more models (model_variable: the `model` dimension, slowest after the
// ground; null for one model). Rows are planned from their index as workers take them and
// handed on in grid order (BatchOptions::row_sink, else BatchResult::rows).
BatchResult RunGrid(const std::vector<std::string>& texts, const std::vector<std::string>& files,
                    const BatchVariable* model_variable, const BatchOptions& options,
                    const std::function<void(int, int)>& progress) {
  const auto start = std::chrono::steady_clock::now();
  std::vector<Model> bases;
  for (size_t m = 0; m < texts.size(); ++m) {
    bases.push_back(ParseModelText(texts[m], files[m], options.fixed_overrides));
    CheckOptions(options, bases.back());
  }

  // The grid: ground slowest, then the models, then the variables in the order given.
  const std::vector<BatchGround> own_ground{BatchGround{"", std::nullopt}};
  const std::vector<BatchGround>& grounds = options.grounds.empty() ? own_ground : options.grounds;
  std::vector<size_t> sizes;
  if (model_variable) sizes.push_back(model_variable->values.size());
  for (const BatchVariable& v : options.variables) sizes.push_back(v.values.size());
  const BatchGrid grid(grounds.size(), sizes);
  const size_t first_variable = model_variable ? 1 : 0;
  if (grid.rows() > kMaxBatchRowsEver) {
    std::string factors = GridFactors(options);
    if (model_variable) factors += fmt::format(" x {} models", model_variable->values.size());
    throw InputError({"batch", 0, 0},
                     fmt::format("the grid has {:.0f} rows ({}), more than {:.0f}, the most one "
                                 "batch runs even with --yes-large; split it into several "
                                 "batches over parts of the --vary ranges",
                                 grid.rows(), factors, kMaxBatchRowsEver));
  }
  const int total = static_cast<int>(grid.rows());

  double mesh_frequency_hz = 0.0;
  for (const SweepSpan& span : options.spans) {
    for (double f_hz : span.frequencies_hz) mesh_frequency_hz = std::max(mesh_frequency_hz, f_hz);
  }
  for (double f_hz : options.at_hz) mesh_frequency_hz = std::max(mesh_frequency_hz, f_hz);

  const int threads = options.threads > 0 ? options.threads : core::CoreCount();
  const int workers = std::clamp(threads, 1, total);
  const int sweep_threads = std::max(1, threads / workers);
  // Rows in parallel share the cores: each fills its matrices on one thread. A lone row fills
  // on `threads` threads.
  const int fill_threads = workers > 1 ? 1 : threads;

  BatchResult result;
  for (size_t m = 0; m < files.size(); ++m) result.model_file += (m ? ", " : "") + files[m];
  if (model_variable) result.variables.push_back(*model_variable);
  result.variables.insert(result.variables.end(), options.variables.begin(),
                          options.variables.end());
  result.spans = options.spans;
  result.at_hz = options.at_hz;
  result.pattern_frequency_hz = options.pattern_frequency_hz;
  result.elevation_deg = options.elevation_deg;
  result.pattern_step_deg = options.pattern_step_deg;
  result.z0_ohm = options.z0_ohm.value_or(bases.front().z0_ohm.value_or(50.0));
  result.threads_used = workers * sweep_threads;
  result.rows_planned = total;
  for (const BatchGround& g : grounds) {
    result.grounds.push_back(g.spec ? g.name : OwnGroundName(bases.front().ground));
  }

  // Workers take the next row from a shared counter, at most `window` rows ahead of the first
  // row not yet handed on, so the rows waiting for an earlier one stay few. A row's own
  // failure stays in its row; anything else (out of memory, a broken invariant, a sink that
  // throws) stops them all and is rethrown.
  const size_t window = 4 * static_cast<size_t>(workers);
  std::mutex mutex;
  std::condition_variable advanced;
  size_t next = 0;
  size_t handed_on = 0;  // rows handed on, all of them before `next_in_order`
  size_t next_in_order = 0;
  std::map<size_t, FinishedRow> waiting;
  bool stop = false;
  std::exception_ptr fatal;
  int done = 0;
  std::vector<int> failed(texts.size(), 0);
  std::vector<std::exception_ptr> first_error(texts.size());
  std::vector<std::set<std::string>> seen(texts.size());
  std::vector<std::vector<Warning>> warnings(texts.size());
  auto cancelled = [&options] { return options.cancel != nullptr && options.cancel->load(); };
  auto hand_on = [&](FinishedRow& finished) {  // with the mutex held
    const BatchRow& row = finished.row;
    if (row.error) {
      ++result.rows_failed;
      ++failed[finished.model];
      if (!first_error[finished.model]) first_error[finished.model] = finished.error;
    }
    for (const Warning& w : row.warnings) {
      if (seen[finished.model].insert(ToString(w)).second) warnings[finished.model].push_back(w);
    }
    ++handed_on;
    if (options.row_sink) {
      options.row_sink(result, row);
    } else {
      result.rows.push_back(std::move(finished.row));
    }
  };
  auto work = [&] {
    while (true) {
      size_t i = 0;
      {
        std::unique_lock<std::mutex> lock(mutex);
        while (!stop && !cancelled() && next < static_cast<size_t>(total) &&
               next >= next_in_order + window) {
          advanced.wait_for(lock, std::chrono::milliseconds(50));
        }
        if (stop || cancelled() || next >= static_cast<size_t>(total)) return;
        i = next++;
      }
      try {
        const BatchGrid::Point point = grid.At(i);
        RowPlan plan;
        plan.index = static_cast<int>(i);
        plan.ground = &grounds[point.ground];
        const size_t model = model_variable ? point.values.front() : 0;
        for (size_t v = 0; v < options.variables.size(); ++v) {
          plan.values.push_back(options.variables[v].values[point.values[first_variable + v]]);
        }
        FinishedRow finished;
        finished.model = model;
        BatchRow& row = finished.row;
        try {
          row = RunRow(texts[model], files[model], options, plan, mesh_frequency_hz, sweep_threads,
                       fill_threads);
        } catch (const InputError& error) {
          finished.error = std::current_exception();
          row.error = error.what();
          row.input_error = true;
        } catch (const ComputationError& error) {
          finished.error = std::current_exception();
          row.error = fmt::format("computation failed: {}", error.what());
        }
        if (row.error) {
          row.index = plan.index;
          row.values = plan.values;
          row.ground = plan.ground->spec ? plan.ground->name : OwnGroundName(bases[model].ground);
        }
        if (model_variable) row.values.insert(row.values.begin(), model_variable->values[model]);
        std::lock_guard<std::mutex> lock(mutex);
        try {
          waiting.emplace(i, std::move(finished));
          while (!waiting.empty() && waiting.begin()->first == next_in_order) {
            hand_on(waiting.begin()->second);
            waiting.erase(waiting.begin());
            ++next_in_order;
          }
          ++done;
          if (progress) progress(done, total);
        } catch (...) {
          if (!fatal) fatal = std::current_exception();
          stop = true;
        }
        advanced.notify_all();
      } catch (...) {
        std::lock_guard<std::mutex> lock(mutex);
        if (!fatal) fatal = std::current_exception();
        stop = true;
        advanced.notify_all();
      }
    }
  };
  {
    const solve::SingleThreadedBlas blas_guard;
    std::vector<std::thread> pool;
    for (int t = 1; t < workers; ++t) pool.emplace_back(work);
    work();
    for (std::thread& t : pool) t.join();
  }
  if (fatal) std::rethrow_exception(fatal);
  // Stopped by BatchOptions::cancel: the rows that finished after a gap go on too, in grid
  // order (BatchRow::index says where each sits).
  for (auto& [index, finished] : waiting) hand_on(finished);
  result.interrupted = handed_on < static_cast<size_t>(total);
  for (const std::vector<Warning>& list : warnings) {
    result.warnings.insert(result.warnings.end(), list.begin(), list.end());
  }
  if (!result.interrupted) {
    const int per_model = total / static_cast<int>(texts.size());
    for (size_t m = 0; m < texts.size(); ++m) {
      if (failed[m] == per_model) std::rethrow_exception(first_error[m]);
    }
  }
  result.elapsed_s =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  return result;
}

}  // namespace

BatchResult RunBatch(const std::string& model_text, const std::string& file_name,
                     const BatchOptions& options, const std::function<void(int, int)>& progress) {
  return RunGrid({model_text}, {file_name}, nullptr, options, progress);
}

BatchResult RunBatchFile(const std::string& path, const BatchOptions& options,
                         const std::function<void(int, int)>& progress) {
  return RunBatch(ReadModelFileText(path), path, options, progress);
}

BatchResult RunBatchFiles(const std::vector<std::string>& paths, const BatchOptions& options,
                          const std::function<void(int, int)>& progress) {
  if (paths.size() == 1) return RunBatchFile(paths.front(), options, progress);
  std::vector<std::string> texts;  // read every file before any row runs
  texts.reserve(paths.size());
  for (const std::string& path : paths) texts.push_back(ReadModelFileText(path));
  BatchVariable model_variable;
  model_variable.name = "model";
  model_variable.names = true;
  std::map<std::string, int> stems;  // a name two files share is replaced by their paths
  for (const std::string& path : paths) ++stems[std::filesystem::path(path).stem().string()];
  for (const std::string& path : paths) {
    const std::string stem = std::filesystem::path(path).stem().string();
    BatchValue v;
    v.label = v.shown = v.expression = stems[stem] > 1 ? path : stem;
    model_variable.values.push_back(v);
  }
  return RunGrid(texts, paths, &model_variable, options, progress);
}

bool BatchHasBandPatterns(const BatchResult& result) {
  return result.spans.size() > 1 && !result.pattern_frequency_hz;
}

namespace {

// The figures a summary compares: the row's own, or those of one of its spans.
struct Figures {
  bool ok = false;
  double gain_at_elevation_dbi = 0.0;
  double min_swr = 0.0;
  const std::vector<double>* resonances_hz = nullptr;
};

Figures FiguresOf(const BatchRow& row, std::optional<int> band) {
  Figures f;
  if (row.error) return f;
  if (!band) {
    f = {true, row.gain_at_elevation_dbi, row.min_swr, &row.resonances_hz};
  } else if (*band >= 0 && static_cast<size_t>(*band) < row.bands.size() &&
             row.bands[static_cast<size_t>(*band)].has_pattern) {
    const BatchBand& b = row.bands[static_cast<size_t>(*band)];
    f = {true, b.gain_at_elevation_dbi, b.min_swr, &b.resonances_hz};
  }
  return f;
}

}  // namespace

BatchSummary SummarizeBatch(const BatchResult& result, std::optional<int> band) {
  BatchSummary summary;
  for (const BatchRow& row : result.rows) {
    const Figures f = FiguresOf(row, band);
    if (!f.ok) continue;
    if (!summary.best_row ||
        f.gain_at_elevation_dbi >
            FiguresOf(result.rows[static_cast<size_t>(*summary.best_row)], band)
                .gain_at_elevation_dbi) {
      summary.best_row = row.index;
    }
  }
  // Rows of one setting differ in the ground only: the grid repeats the settings per ground.
  const size_t ground_count = std::max<size_t>(1, result.grounds.size());
  const size_t per_ground = result.rows.size() / ground_count;
  for (size_t s = 0; s < per_ground; ++s) {
    BatchSetting setting;
    for (const BatchValue& v : result.rows[s].values) setting.labels.push_back(v.label);
    std::optional<double> first_low_hz, first_high_hz;
    int with_resonance = 0;
    for (size_t g = 0; g < ground_count; ++g) {
      const BatchRow& row = result.rows[g * per_ground + s];
      const Figures f = FiguresOf(row, band);
      if (!f.ok) continue;
      const bool first = setting.rows_ok == 0;
      ++setting.rows_ok;
      if (first || f.gain_at_elevation_dbi < setting.worst_gain_dbi) {
        setting.worst_gain_dbi = f.gain_at_elevation_dbi;
        setting.worst_ground = row.ground;
      }
      if (first || f.gain_at_elevation_dbi > setting.best_gain_dbi) {
        setting.best_gain_dbi = f.gain_at_elevation_dbi;
        setting.best_ground = row.ground;
      }
      setting.min_swr_low = first ? f.min_swr : std::min(setting.min_swr_low, f.min_swr);
      setting.min_swr_high = first ? f.min_swr : std::max(setting.min_swr_high, f.min_swr);
      if (!f.resonances_hz->empty()) {
        const double f_hz = f.resonances_hz->front();
        ++with_resonance;
        first_low_hz = std::min(first_low_hz.value_or(f_hz), f_hz);
        first_high_hz = std::max(first_high_hz.value_or(f_hz), f_hz);
      }
    }
    if (with_resonance > 1) {
      setting.resonance_spread_hz = *first_high_hz - *first_low_hz;
    }
    summary.settings.push_back(std::move(setting));
  }
  for (size_t s = 0; s < summary.settings.size(); ++s) {
    const BatchSetting& setting = summary.settings[s];
    if (setting.rows_ok > 0) {
      summary.largest_gain_spread_db =
          std::max(summary.largest_gain_spread_db, setting.best_gain_dbi - setting.worst_gain_dbi);
    }
    if (ground_count < 2 || setting.rows_ok != static_cast<int>(ground_count)) continue;
    if (!summary.robust_setting ||
        setting.worst_gain_dbi > summary.settings[*summary.robust_setting].worst_gain_dbi) {
      summary.robust_setting = static_cast<int>(s);
    }
  }
  return summary;
}

}  // namespace wirefield
