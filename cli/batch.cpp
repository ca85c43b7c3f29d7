// Command-line program: `wirefield batch MODEL`: one model over a grid of grounds (--grounds),
// `let` values (--vary) and a sweep's frequencies (--band or --from/--to), one row per grid
// point: resonances, lowest SWR, SWR at --at, gain and take-off, low-angle gain, efficiency.
// Flags -> BatchOptions -> RunBatchFiles -> FormatBatch* -> stdout and --csv; a grid past
// 100000 rows (--yes-large) streams its rows into the CSV's temporary as they finish
// (StreamedOutput) and gets a short account on stdout.
// Ctrl-C (SIGINT), SIGTERM or SIGHUP stops the grid after the rows in flight: their rows go
// to CSV.partial, the CSV itself is left as it was, and the exit code is 128 + signal.
#include "wirefield/batch.hpp"

#include <fmt/format.h>
#include <signal.h>
#include <unistd.h>

#include <atomic>
#include <cstdio>
#include <optional>
#include <string>
#include <vector>

#include "command.hpp"

namespace wirefield::cli {

namespace {

// What `wirefield batch --help` says besides its flags.
const CommandHelp kBatchHelp{
    "batch",
    "Run one model over a grid of grounds, `let` values and frequencies: one row per grid "
    "point with its resonances, lowest SWR, SWR at chosen frequencies, maximum gain and "
    "take-off angle, gain at a low elevation and efficiency; then the best row and how much "
    "the ground matters.",
    R"(Examples:
  wirefield batch models/hiking_club_dipole.wire --band 20m --vary total=9.8m:10.4m:0.2m
  wirefield batch models/campsite_mast_dipole.wire --band 20m --grounds all --at 14.2MHz
  wirefield batch models/hiking_club_dipole.wire --from 13.5MHz --to 15MHz --points 31 --vary height=2m,5m,8m --grounds perfect,free --json)"};

struct BatchFlags {
  ModelFlags model;
  FrequencyFlags frequencies;
  TextFlag grounds, elevation, pattern_freq, pattern_step, csv, threads;
  std::vector<std::string> vary, at, compare;
  bool yes_large = false;
  bool exact = false;
  bool no_mesh_estimate = false;
};

// Set by the stop handler; read by the batch's workers before each row. Lock-free atomics, so
// the handler may write them.
std::atomic<bool> interrupt_requested{false};
std::atomic<int> interrupt_signal{0};
static_assert(std::atomic<bool>::is_always_lock_free);
static_assert(std::atomic<int>::is_always_lock_free);

extern "C" void OnInterrupt(int signal) {
  interrupt_signal.store(signal);
  interrupt_requested.store(true);
  static constexpr char kNote[] =
      "\nbatch: interrupted; finishing the rows in flight (the same signal again stops at "
      "once)\n";
  // write() and sigaction() are async-signal-safe; the same signal again removes the
  // temporaries of the outputs being written (a streamed CSV's) and gets the default action.
  [[maybe_unused]] const ssize_t ignored = ::write(STDERR_FILENO, kNote, sizeof kNote - 1);
  struct sigaction action {};
  action.sa_handler = RemoveTemporariesAndStop;
  sigemptyset(&action.sa_mask);
  ::sigaction(signal, &action, nullptr);
}

// After a stop signal: the finished rows (csv_text, or the streamed CSV's when `streamed` is
// given) to CSV.partial (when --csv), a note on stderr, exit 128 + signal (130 for Ctrl-C), as
// a shell reports it.
int ReportInterrupted(const BatchFlags& flags, const std::vector<InputPath>& inputs,
                      const BatchResult& result, int finished, const std::string& csv_text,
                      StreamedOutput* streamed) {
  const int exit_code = 128 + interrupt_signal.load();
  if (!flags.csv.given()) {
    fmt::print(stderr,
               "batch: interrupted after {} of {} rows; nothing was written (with --csv FILE "
               "the finished rows go to FILE.partial)\n",
               finished, result.rows_planned);
    return exit_code;
  }
  const std::string partial_path = flags.csv.text + ".partial";
  if (streamed != nullptr) {
    streamed->CommitTo({partial_path, "partial CSV"});
  } else {
    WriteOutputFiles({OutputFile{partial_path, csv_text, "partial CSV"}}, inputs);
  }
  fmt::print(stderr,
             "batch: interrupted after {} of {} rows; wrote the finished rows to {} (the index "
             "column gives each row's place in the grid); {} was not written\n",
             finished, result.rows_planned, Printable(partial_path), Printable(flags.csv.text));
  return exit_code;
}

// The most rows the text and JSON reports take: they hold every row in memory (some kB a
// row). A larger grid (with --yes-large) streams its rows to --csv.
constexpr double kMaxRowsInReport = 100000;

// A streamed grid needs --csv for its rows, and has no JSON report (which lists every row).
void RequireCsvForStreaming(const BatchFlags& flags, double rows) {
  const std::string what = fmt::format(
      "the grid has {:.0f} rows, more than {:.0f}, the most the text and JSON reports hold "
      "(they keep every row in memory)",
      rows, kMaxRowsInReport);
  if (!flags.csv.given()) {
    throw InputError({"batch", 0, 0},
                     fmt::format("{}; give --csv FILE: the rows then go to FILE as they finish "
                                 "and stdout gets a short account",
                                 what));
  }
  if (flags.model.json) {
    throw InputError({"batch", 0, 0},
                     fmt::format("{}; drop --json: the rows go to the --csv file and stdout gets "
                                 "a short text account",
                                 what));
  }
}

// Progress on a terminal only: "batch: [#######.............] 12/40 rows", rewritten in place.
void ShowProgress(int done, int total) {
  constexpr int kWidth = 30;
  const int filled = total > 0 ? done * kWidth / total : kWidth;
  fmt::print(stderr, "\rbatch: [{}{}] {}/{} rows", std::string(filled, '#'),
             std::string(kWidth - filled, '.'), done, total);
  if (done == total) fmt::print(stderr, "\n");
  std::fflush(stderr);
}

// The fields of BatchOptions and the flags that set them.
const std::vector<FieldFlag> kBatchFlags{
    {"variables", "--vary"},          {"fixed_overrides", "--set"},
    {"allow_large", "--yes-large"},   {"pattern_step_deg", "--pattern-step"},
    {"elevation_deg", "--elevation"}, {"at_hz", "--at"}};

int RunBatchCommand(const BatchFlags& flags) {
  // Check every flag before the file read and the rows.
  BatchOptions options;
  std::vector<Band> bands;
  options.spans = ChosenSpans(flags.frequencies, "batch", ChosenRegion(flags.frequencies), bands);
  if (flags.grounds.given()) options.grounds = ParseGroundList(flags.grounds.text);
  for (const std::string& text : flags.vary) options.variables.push_back(ParseVary(text));
  options.fixed_overrides = ParseOverrides(flags.model.overrides);
  if (Given(flags.model.z0_option)) {
    options.z0_ohm = ParseResistanceArgument(flags.model.z0, "--z0");
  }
  for (const std::string& text : flags.at)
    options.at_hz.push_back(ParseFrequencyArgument(text, "--at"));
  if (flags.pattern_freq.given()) {
    options.pattern_frequency_hz =
        ParseFrequencyArgument(flags.pattern_freq.text, "--pattern-freq");
  }
  if (flags.elevation.given()) {
    options.elevation_deg = ParseDegrees(flags.elevation.text, "--elevation", "10 or 15deg");
  }
  if (flags.pattern_step.given()) {
    options.pattern_step_deg =
        ParseDegrees(flags.pattern_step.text, "--pattern-step", "2 or 2.5deg");
  }
  options.threads = ChosenThreads(flags.threads);
  options.allow_large = flags.yes_large;
  options.cancel = &interrupt_requested;
  options.interpolate = !flags.exact;
  options.mesh_estimate = !flags.no_mesh_estimate;

  std::vector<std::string> paths{flags.model.model_path};
  paths.insert(paths.end(), flags.compare.begin(), flags.compare.end());
  std::vector<InputPath> inputs;
  for (const std::string& path : paths) inputs.push_back({path, "model"});
  if (flags.csv.given()) {
    CheckOutputPaths({{flags.csv.text, "CSV"}, {flags.csv.text + ".partial", "partial CSV"}},
                     inputs);
  }

  // A grid past kMaxRowsInReport streams: each row goes to the CSV's temporary as it finishes
  // (in grid order) and is dropped, and stdout gets a short account instead of the table and
  // summary.
  const double rows = BatchRowCount(options) * static_cast<double>(paths.size());
  const bool stream = options.allow_large && rows > kMaxRowsInReport && rows <= kMaxBatchRowsEver;
  if (stream) RequireCsvForStreaming(flags, rows);
  std::string csv_text;
  std::optional<StreamedOutput> csv_stream;
  int streamed = 0;
  if (stream) {
    csv_stream.emplace(OutputPath{flags.csv.text, "CSV"}, inputs);
    options.row_sink = [&csv_stream, &streamed](const BatchResult& run, const BatchRow& row) {
      if (streamed++ == 0) csv_stream->Append(FormatBatchCsvHeader(run));
      csv_stream->Append(FormatBatchCsvRow(run, row));
    };
  }

  const bool show_progress = ::isatty(STDERR_FILENO) == 1;
  // Ctrl-C, `kill` and a closed terminal stop the batch cleanly.
  const ScopedSignalHandlers on_interrupt(OnInterrupt, {SIGINT, SIGTERM, SIGHUP});
  const BatchResult result = NamingFlags(kBatchFlags, [&] {
    return RunBatchFiles(paths, options, [show_progress](int done, int total) {
      if (show_progress) ShowProgress(done, total);
    });
  });
  PrintWarnings(result.warnings);
  if (!stream && flags.csv.given()) csv_text = FormatBatchCsv(result);
  if (stream && streamed == 0) csv_stream->Append(FormatBatchCsvHeader(result));
  if (result.interrupted) {
    return ReportInterrupted(flags, inputs, result,
                             stream ? streamed : static_cast<int>(result.rows.size()), csv_text,
                             stream ? &*csv_stream : nullptr);
  }
  if (stream) {
    CommitThenReport(*csv_stream, FormatBatchStreamedText(result, flags.csv.text), false);
    return 0;
  }

  // Format everything before writing anything, so a failure never leaves half a result.
  std::vector<OutputFile> files;
  if (flags.csv.given()) files.push_back({flags.csv.text, std::move(csv_text), "CSV"});
  std::string output = flags.model.json ? FormatBatchJson(result) : FormatBatchText(result);
  WriteFilesThenReport(files, inputs, output, flags.model.json);
  return 0;
}

// Adds the flags of `batch` to app, kept in `flags`.
void AddBatchFlags(CLI::App& app, BatchFlags& flags) {
  AddModelFlags(app, flags.model, /*with_frequency=*/false);
  AddFrequencyFlags(app, flags.frequencies);
  AddTextFlag(app, "--grounds", flags.grounds, "LIST",
              "Grounds to run, each a row of its own: all (every ground preset), or a comma-"
              "separated list of preset names, free and perfect, e.g. medium_dry,wet_ground,free. "
              "Default: the model's own ground.");
  app.add_option("--vary", flags.vary,
                 "Vary a `let` of the model: NAME=A:B:STEP (A to B inclusive, e.g. "
                 "length=19.5m:20.5m:0.25m) or NAME=V1,V2,... (e.g. height=6m,8m,10m); each "
                 "value is applied as --set NAME=VALUE. Repeatable: the grid is the product, "
                 "the first --vary varying slowest. Default: none.")
      ->type_name("NAME=VALUES")
      ->allow_extra_args(false);
  app.add_option("--compare", flags.compare,
                 "Run another model over the same grid and compare it row by row (a `model` "
                 "column; e.g. the same wire hung as a sloper and as an inverted-L); "
                 "repeatable. Each must have the --vary names as `let`s. Default: none.")
      ->type_name("MODEL")
      ->allow_extra_args(false);
  app.add_option("--at", flags.at,
                 "Add a column with the SWR solved at this frequency, e.g. 14.2MHz; "
                 "repeatable. Default: none.")
      ->type_name("F")
      ->allow_extra_args(false);
  AddTextFlag(app, "--elevation", flags.elevation, "DEG",
              "Elevation of the low-angle gain column, degrees above the "
              "horizon (0..90 over a ground, -90..90 in free space), taken "
              "toward the azimuth of the maximum. Default: 10.");
  AddTextFlag(app, "--pattern-freq", flags.pattern_freq, "F",
              "Frequency of every row's pattern (gain, take-off, efficiency), e.g. 14.2MHz. "
              "Default: each row's own lowest-SWR frequency.");
  AddTextFlag(app, "--pattern-step", flags.pattern_step, "DEG",
              "Grid step of each row's pattern, degrees (> 0, <= 10); "
              "smaller is finer and slower. Default: 2.");
  AddThreadsFlag(app, flags.threads,
                 "Worker threads: rows run in parallel, each holding one matrix. Default: 0, "
                 "one per core.");
  AddCsvFlag(app, flags.csv, "the rows");
  AddMeshEstimateFlag(app, flags.no_mesh_estimate,
                      "each row's first feed at the centre of the first span");
  AddExactFlag(app, flags.exact, "each row's matrix", "every sweep point", "several times slower");
  app.add_flag("--yes-large", flags.yes_large,
               fmt::format("Run a grid of more than {} rows (each row is a sweep and a "
                           "pattern). Default: off, such a grid is refused.",
                           kMaxBatchRows));
}

}  // namespace

Command AddBatchCommand(CLI::App& program) {
  return NewCommand(program, kBatchHelp, AddBatchFlags, RunBatchCommand);
}

}  // namespace wirefield::cli
