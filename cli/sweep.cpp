// Command-line program: `wirefield sweep MODEL`: solve one model over a frequency range or over
// amateur bands and print the SWR at the transmitter, resonances and SWR bandwidths per band
// (text or, with --json, the contract's JSON); --csv, --svg and --s1p also write files, and
// --measured compares a measured .s1p file. Flags -> spans -> RunSpans -> FormatSweep*.
#include <fmt/format.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <memory>
#include <optional>
#include <string>
#include <system_error>
#include <vector>

#include "command.hpp"
#include "wirefield/bands.hpp"
#include "wirefield/sweep_report.hpp"
#include "wirefield/touchstone.hpp"

namespace wirefield::cli {

namespace {

struct SweepFlags {
  ModelFlags model;
  std::string from, to, step, points, region, threads;
  std::vector<std::string> bands;
  std::string csv_path, svg_path, s1p_path, measured_path;
  CLI::Option* from_option = nullptr;
  CLI::Option* to_option = nullptr;
  CLI::Option* step_option = nullptr;
  CLI::Option* points_option = nullptr;
  CLI::Option* band_option = nullptr;
  CLI::Option* region_option = nullptr;
  CLI::Option* threads_option = nullptr;
  CLI::Option* csv_option = nullptr;
  CLI::Option* svg_option = nullptr;
  CLI::Option* s1p_option = nullptr;
  CLI::Option* measured_option = nullptr;
};

[[noreturn]] void Fail(const std::string& option, const std::string& message) {
  throw InputError(SourceLocation{option, 1, 1}, message);
}

// A whole number of the whole text, within [low, high]; else InputError naming the option.
int WholeNumber(const std::string& text, const std::string& option, long low, long high,
                const std::string& what) {
  const char* begin = text.c_str();
  char* end = nullptr;
  errno = 0;
  const long value = std::strtol(begin, &end, 10);
  if (text.empty() || end == begin || *end != '\0' || errno == ERANGE || value < low ||
      value > high) {
    Fail(option, fmt::format("{} needs {}; got '{}'", option, what, text));
  }
  return static_cast<int>(value);
}

// The spans to sweep, from --from/--to/--step/--points or from --band (sorted by frequency).
std::vector<SweepSpan> ChosenSpans(const SweepFlags& flags, int region, std::vector<Band>& bands) {
  const bool range = Given(flags.from_option) || Given(flags.to_option);
  if (range && Given(flags.band_option)) {
    Fail("--band",
         "--band and --from/--to both choose the frequencies; give --band NAME or --from F1 "
         "--to F2, not both");
  }
  if (!range && !Given(flags.band_option)) {
    throw InputError(
        SourceLocation{"sweep", 0, 0},
        "give the frequencies to sweep: --from F1 --to F2 with --step DF or --points N (e.g. "
        "--from 7MHz --to 7.3MHz --step 5kHz), or --band NAME (e.g. --band 40m)");
  }
  std::vector<SweepSpan> spans;
  if (range) {
    if (!Given(flags.from_option) || !Given(flags.to_option)) {
      Fail(Given(flags.from_option) ? "--to" : "--from",
           "a range sweep needs both --from and --to, e.g. --from 7MHz --to 7.3MHz");
    }
    const double from_hz = ParseFrequencyArgument(flags.from, "--from");
    const double to_hz = ParseFrequencyArgument(flags.to, "--to");
    if (!(to_hz > from_hz)) {
      Fail("--to", fmt::format("--to ({:.6g} MHz) must be above --from ({:.6g} MHz)", to_hz / 1e6,
                               from_hz / 1e6));
    }
    if (Given(flags.step_option) == Given(flags.points_option)) {
      Fail("--step",
           "a range sweep needs one of --step DF (e.g. --step 5kHz) or --points N "
           "(e.g. --points 101), not both and not neither");
    }
    SweepSpan span;
    span.name = "range";
    if (Given(flags.step_option)) {
      const double step_hz = ParseFrequencyArgument(flags.step, "--step");
      span.frequencies_hz = FrequencyRange(from_hz, to_hz, step_hz);
      span.how =
          fmt::format("{:g} kHz steps, {} points", step_hz / 1e3, span.frequencies_hz.size());
    } else {
      const int points = WholeNumber(flags.points, "--points", 2, 100000,
                                     "a whole number of points from 2 to 100000");
      span.frequencies_hz = FrequencyPoints(from_hz, to_hz, points);
      span.how = fmt::format("{} points, {:.6g} kHz apart", points,
                             (to_hz - from_hz) / (points - 1) / 1e3);
    }
    spans.push_back(span);
    return spans;
  }
  if (Given(flags.step_option) || Given(flags.points_option)) {
    Fail(Given(flags.step_option) ? "--step" : "--points",
         fmt::format("{} applies to --from/--to; a band sweep uses 1 kHz steps, or {} points "
                     "on a band wider than {} kHz",
                     Given(flags.step_option) ? "--step" : "--points", kMaxBandPoints,
                     kMaxBandPoints - 1));
  }
  for (const std::string& name : flags.bands) {
    const Band band = FindBand(name, region);
    for (const Band& known : bands) {
      if (known.name == band.name) Fail("--band", fmt::format("--band {} is given twice", name));
    }
    bands.push_back(band);
  }
  std::sort(bands.begin(), bands.end(),
            [](const Band& a, const Band& b) { return a.from_hz < b.from_hz; });
  for (const Band& band : bands) spans.push_back(BandSpan(band));
  return spans;
}

int RunSweepCommand(const SweepFlags& flags) {
  // Check every flag before the (possibly long) file read, mesh and solves.
  const bool region_given = Given(flags.region_option);
  const int region = region_given
                         ? WholeNumber(flags.region, "--region", 1, 3,
                                       "an ITU region: 1 (Europe, Africa, Middle East), 2 (the "
                                       "Americas) or 3 (Asia-Pacific)")
                         : 1;
  SweepOptions options;
  if (Given(flags.threads_option)) {
    options.threads = WholeNumber(flags.threads, "--threads", 0, 1024,
                                  "a whole number of worker threads from 0 (one per core) to "
                                  "1024");
  }
  std::vector<Band> bands;
  const std::vector<SweepSpan> spans = ChosenSpans(flags, region, bands);
  std::optional<TouchstoneData> measured;
  if (Given(flags.measured_option)) measured = ReadTouchstone(flags.measured_path);

  Model model = LoadModel(flags.model);
  if (model.feeds.empty()) {
    throw InputError(SourceLocation{model.file, 0, 0},
                     "the model has no feed: add a line such as `feed src at dipole@50%`; a "
                     "sweep reports the first feed");
  }
  double highest_hz = 0.0;
  for (const SweepSpan& span : spans) {
    for (double f_hz : span.frequencies_hz) highest_hz = std::max(highest_hz, f_hz);
  }
  SimulationOptions simulation_options;
  simulation_options.max_frequency_hz = highest_hz;
  const std::string feed_name = model.feeds.front().name;
  Simulation simulation(std::move(model), simulation_options);
  PrintWarnings(simulation.warnings());

  // Progress on a terminal only: "sweep: 120/351 points", rewritten in place.
  const bool show_progress = ::isatty(STDERR_FILENO) == 1;
  auto progress = [show_progress](int done, int total) {
    if (!show_progress) return;
    fmt::print(stderr, "\rsweep: {}/{} points", done, total);
    if (done == total) fmt::print(stderr, "\n");
    std::fflush(stderr);
  };

  SweepReport report;
  report.model_file = simulation.model().file;
  report.ground = simulation.model().ground;
  report.feed_name = feed_name;
  report.sweep = RunSpans(simulation, spans, options, progress);
  report.spans = spans;
  report.region = region;
  report.region_given = region_given;
  report.warnings = simulation.warnings();
  std::vector<std::pair<double, double>> ranges_hz;
  for (const SweepSpan& span : spans) {
    ranges_hz.emplace_back(span.frequencies_hz.front(), span.frequencies_hz.back());
  }
  if (bands.empty()) {
    Band whole{"range", region, ranges_hz.front().first, ranges_hz.front().second, ""};
    report.range = SummarizeBand(report.sweep, whole);
  }
  for (const Band& band : bands) report.bands.push_back(SummarizeBand(report.sweep, band));
  if (measured) report.measured = CompareMeasured(report.sweep, *measured, ranges_hz);

  // Format everything before writing anything, so a failure never leaves half a result.
  std::vector<OutputFile> files;
  if (Given(flags.csv_option)) files.push_back({flags.csv_path, FormatSweepCsv(report), "CSV"});
  if (Given(flags.svg_option)) files.push_back({flags.svg_path, FormatSweepSvg(report), "SVG"});
  if (Given(flags.s1p_option)) {
    files.push_back({flags.s1p_path, FormatSweepTouchstone(report), "Touchstone"});
  }
  std::string output = flags.model.json ? FormatSweepJson(report) : FormatSweepText(report);
  WriteFilesThenReport(files, output, flags.model.json);
  return 0;
}

}  // namespace

Command AddSweepCommand(CLI::App& program) {
  auto flags = std::make_shared<SweepFlags>();
  CLI::App* app = program.add_subcommand(
      "sweep",
      "Solve a model over a frequency range or over amateur bands: impedance and SWR at the "
      "transmitter at each point, resonances, the lowest SWR, and per band the 2:1 and 1.5:1 "
      "SWR bandwidths and whether the band is covered.");
  AddModelFlags(*app, flags->model, /*with_frequency=*/false);
  auto add = [&](const char* name, std::string& target, const char* type, const char* help) {
    CLI::Option* option = app->add_option(name, target, help);
    option->type_name(type);
    return option;
  };
  flags->from_option = add("--from", flags->from, "F",
                           "Lowest frequency of a range sweep (with --to and --step or "
                           "--points), e.g. 7MHz; a bare number is in Hz. Default: none.");
  flags->to_option = add("--to", flags->to, "F",
                         "Highest frequency of a range sweep, included; must be above --from. "
                         "Default: none.");
  flags->step_option = add("--step", flags->step, "DF",
                           "Step of a range sweep, e.g. 5kHz; more points cost time in "
                           "proportion. Default: none (give --step or --points).");
  flags->points_option = add("--points", flags->points, "N",
                             "Points of a range sweep, spread evenly from --from to --to "
                             "(2..100000). Default: none.");
  flags->band_option =
      app->add_option("--band", flags->bands,
                      "An amateur band to sweep: 160m, 80m, 60m, 40m, 30m, 20m, 17m, 15m, 12m "
                      "or 10m; repeatable. 1 kHz steps, or 401 points on a band wider than "
                      "400 kHz. Default: none.");
  flags->band_option->type_name("NAME")->allow_extra_args(false);
  flags->region_option = add("--region", flags->region, "1|2|3",
                             "ITU region of the band edges: 1 Europe, Africa, Middle East; 2 the "
                             "Americas; 3 Asia-Pacific. Default: 1 (the report says so).");
  flags->threads_option = add("--threads", flags->threads, "N",
                              "Worker threads; each holds one matrix in memory. Default: 0, one "
                              "per core.");
  flags->csv_option = add("--csv", flags->csv_path, "FILE",
                          "Also write the points to FILE as CSV (columns in docs/commands.md). "
                          "Default: none.");
  flags->svg_option = add("--svg", flags->svg_path, "FILE",
                          "Also write an SVG picture: SWR against frequency and a Smith chart. "
                          "Default: none.");
  flags->s1p_option = add("--s1p", flags->s1p_path, "FILE",
                          "Also write S11 at the transmitter to FILE as a Touchstone 1.1 "
                          "one-port file (MHz, RI, R = z0). Default: none.");
  flags->measured_option = add("--measured", flags->measured_path, "FILE.s1p",
                               "A measured one-port Touchstone file to compare: measured SWR "
                               "beside the predicted, and the shift of the lowest SWR. "
                               "Default: none.");
  app->footer(
      "Examples:\n"
      "  wirefield sweep models/hiking_club_dipole.wire --band 20m\n"
      "  wirefield sweep models/hiking_club_dipole.wire --from 13.5MHz --to 15MHz --points 61 "
      "--svg dipole.svg\n"
      "  wirefield sweep models/end_fed_field_kit.wire --band 40m --band 20m --region 2 --json");
  return Command{app, [flags] { return RunSweepCommand(*flags); }};
}

}  // namespace wirefield::cli
