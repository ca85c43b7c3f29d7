// Command-line program: `wirefield sweep MODEL`: solve one model over a frequency range or over
// amateur bands and print the SWR at the transmitter, resonances and SWR bandwidths per band
// (text or, with --json, the contract's JSON); --csv, --svg and --s1p also write files, and
// --measured compares a measured .s1p file. Flags -> spans -> RunSpans -> FormatSweep*.
#include <fmt/format.h>
#include <unistd.h>

#include <algorithm>
#include <cstdio>
#include <filesystem>
#include <optional>
#include <string>
#include <system_error>
#include <vector>

#include "command.hpp"
#include "wirefield/bands.hpp"
#include "wirefield/report.hpp"
#include "wirefield/touchstone.hpp"

namespace wirefield::cli {

namespace {

// What `wirefield sweep --help` says besides its flags.
const CommandHelp kSweepHelp{
    "sweep",
    "Solve a model over a frequency range or over amateur bands: impedance and SWR at the "
    "transmitter at each point, resonances, the lowest SWR, and per band the 2:1 and 1.5:1 "
    "SWR bandwidths and whether the band is covered.",
    R"(Examples:
  wirefield sweep models/hiking_club_dipole.wire --band 20m
  wirefield sweep models/hiking_club_dipole.wire --from 13.5MHz --to 15MHz --points 61 --svg dipole.svg
  wirefield sweep models/end_fed_field_kit.wire --band 40m --band 20m --region 2 --json
  wirefield sweep models/end_fed_field_kit.wire --band 40m --power 100W)"};

struct SweepFlags {
  ModelFlags model;
  FrequencyFlags frequencies;
  PowerFlags power;
  TextFlag threads;
  bool exact = false;
  bool no_mesh_estimate = false;
  TextFlag csv, svg, s1p, measured;
};

int RunSweepCommand(const SweepFlags& flags) {
  // Check every flag before the (possibly long) file read, mesh and solves.
  const bool region_given = Given(flags.frequencies.region_option);
  const int region = ChosenRegion(flags.frequencies);
  SweepOptions options;
  options.threads = ChosenThreads(flags.threads);
  options.stress = ChosenStress(flags.power);
  options.interpolate = !flags.exact;
  std::vector<Band> bands;
  const std::vector<SweepSpan> spans = ChosenSpans(flags.frequencies, "sweep", region, bands);
  std::vector<InputPath> inputs{{flags.model.model_path, "model"}};
  if (flags.measured.given()) inputs.push_back({flags.measured.text, "measured"});
  std::vector<OutputPath> outputs;
  if (flags.csv.given()) outputs.push_back({flags.csv.text, "CSV"});
  if (flags.svg.given()) outputs.push_back({flags.svg.text, "SVG"});
  if (flags.s1p.given()) outputs.push_back({flags.s1p.text, "Touchstone"});
  CheckOutputPaths(outputs, inputs);
  std::optional<TouchstoneData> measured;
  if (flags.measured.given()) measured = ReadTouchstone(flags.measured.text);

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
  const std::string feed_name = model.feeds.front().name;
  Simulation simulation = NewSimulation(std::move(model), highest_hz);

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
  report.wires = simulation.model().wires;
  report.feed_name = feed_name;
  report.sweep = RunSpans(simulation, spans, options, progress);
  report.spans = spans;
  report.region = region;
  report.region_given = region_given;
  report.warnings = simulation.warnings();
  std::vector<std::pair<double, double>> ranges_hz;
  ranges_hz.reserve(spans.size());
  for (const SweepSpan& span : spans) {
    ranges_hz.emplace_back(span.frequencies_hz.front(), span.frequencies_hz.back());
  }
  if (bands.empty()) {
    Band whole{"range", region, ranges_hz.front().first, ranges_hz.front().second, ""};
    report.range = SummarizeBand(report.sweep, whole);
  }
  for (const Band& band : bands) report.bands.push_back(SummarizeBand(report.sweep, band));
  if (measured) report.measured = CompareMeasured(report.sweep, *measured, ranges_hz);
  if (!flags.no_mesh_estimate) {
    for (const SweepSpan& span : spans) {
      const double centre_hz = 0.5 * (span.frequencies_hz.front() + span.frequencies_hz.back());
      report.mesh_estimates.push_back(EstimateFirstFeedAt(simulation, centre_hz, span.name));
      const std::vector<Warning>& mesh_warnings = report.mesh_estimates.back().warnings;
      PrintWarnings(mesh_warnings);
      report.warnings.insert(report.warnings.end(), mesh_warnings.begin(), mesh_warnings.end());
    }
  }

  // Format everything before writing anything, so a failure never leaves half a result.
  std::vector<OutputFile> files;
  if (flags.csv.given()) files.push_back({flags.csv.text, FormatSweepCsv(report), "CSV"});
  if (flags.svg.given()) files.push_back({flags.svg.text, FormatSweepSvg(report), "SVG"});
  if (flags.s1p.given()) {
    files.push_back({flags.s1p.text, FormatSweepTouchstone(report), "Touchstone"});
  }
  std::string output = flags.model.json ? FormatSweepJson(report) : FormatSweepText(report);
  WriteFilesThenReport(files, inputs, output, flags.model.json);
  return 0;
}

// Adds the flags of `sweep` to app, kept in `flags`.
void AddSweepFlags(CLI::App& app, SweepFlags& flags) {
  AddModelFlags(app, flags.model, /*with_frequency=*/false);
  AddFrequencyFlags(app, flags.frequencies);
  AddPowerFlags(app, flags.power);
  AddThreadsFlag(app, flags.threads,
                 "Worker threads; each holds one matrix in memory. Default: 0, one per core.");
  AddExactFlag(app, flags.exact, "the matrix", "every point",
               "several times slower on a long sweep");
  AddMeshEstimateFlag(app, flags.no_mesh_estimate,
                      "the first feed's impedance at each band's centre (not at every point)");
  AddCsvFlag(app, flags.csv, "the points");
  AddTextFlag(app, "--svg", flags.svg, "FILE",
              "Also write an SVG picture: SWR against frequency and a Smith chart. "
              "Default: none.");
  AddTextFlag(app, "--s1p", flags.s1p, "FILE",
              "Also write S11 at the transmitter to FILE as a Touchstone 1.1 "
              "one-port file (MHz, RI, R = z0). Default: none.");
  AddTextFlag(app, "--measured", flags.measured, "FILE.s1p",
              "A measured one-port Touchstone file to compare: measured SWR "
              "beside the predicted, and the shift of the lowest SWR. "
              "Default: none.");
}

}  // namespace

Command AddSweepCommand(CLI::App& program) {
  return NewCommand(program, kSweepHelp, AddSweepFlags, RunSweepCommand);
}

}  // namespace wirefield::cli
