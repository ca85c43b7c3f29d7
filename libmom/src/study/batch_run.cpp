// Study layer: running a batch's grid (`wirefield batch`). Each row on a worker thread:
// re-parse the model with the row's overrides, sweep it (RunSpans), solve the SWR columns, and
// compute one pattern exactly as `pattern --freq F` would. Output: rows in grid order.
#include <fmt/format.h>

#include <algorithm>
#include <atomic>
#include <chrono>
#include <condition_variable>
#include <exception>
#include <filesystem>
#include <map>
#include <mutex>
#include <set>
#include <thread>

#include "core/parallel.hpp"
#include "solve/blas_threads.hpp"
#include "study/batch_grid.hpp"
#include "wirefield/batch.hpp"
#include "wirefield/pattern.hpp"

namespace wirefield {
namespace {

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
    overrides.push_back(Override{options.variables[v].name, plan.values[v].expression,
                                 options.variables[v].origin});
  }
  Model model = ParseModelText(text, file, overrides);
  if (plan.ground->spec) model.ground = *plan.ground->spec;
  row.ground = plan.ground->spec ? plan.ground->name : study::OwnGroundName(model.ground);
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
    study::CheckBatchOptions(options, bases.back());
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
    std::string factors = study::GridFactors(options);
    if (model_variable) factors += fmt::format(" x {} models", model_variable->values.size());
    throw InputError({"batch", 0, 0},
                     fmt::format("the grid has {:.0f} rows ({}), more than {:.0f}, the most one "
                                 "batch runs even with `allow_large`; split it into several "
                                 "batches over parts of the `variables` ranges",
                                 grid.rows(), factors, kMaxBatchRowsEver));
  }
  const int total = static_cast<int>(grid.rows());

  double mesh_frequency_hz = 0.0;
  for (const SweepSpan& span : options.spans) {
    for (double f_hz : span.frequencies_hz) mesh_frequency_hz = std::max(mesh_frequency_hz, f_hz);
  }
  for (double f_hz : options.at_hz) mesh_frequency_hz = std::max(mesh_frequency_hz, f_hz);

  const int threads = core::ResolveThreads(options.threads);
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
  result.z0_ohm = options.z0_ohm.value_or(bases.front().z0_ohm.value_or(kDefaultZ0Ohm));
  result.threads_used = workers * sweep_threads;
  result.rows_planned = total;
  for (const BatchGround& g : grounds) {
    result.grounds.push_back(g.spec ? g.name : study::OwnGroundName(bases.front().ground));
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
          row.ground =
              plan.ground->spec ? plan.ground->name : study::OwnGroundName(bases[model].ground);
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

}  // namespace wirefield
