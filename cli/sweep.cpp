// Command-line program: `wirefield sweep MODEL`: solve one model over a frequency range or over
// amateur bands and print the SWR at the transmitter, resonances and SWR bandwidths per band
// (text or, with --json, the contract's JSON); --csv, --svg and --s1p also write files, and
// --measured compares a measured .s1p file. Flags -> spans -> RunSpans -> FormatSweep*.
#include <fmt/format.h>
#include <unistd.h>

#include <algorithm>
#include <cstdio>
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
  FrequencyFlags frequencies;
  PowerFlags power;
  std::string threads;
  bool exact = false;
  bool no_mesh_estimate = false;
  std::string csv_path, svg_path, s1p_path, measured_path;
  CLI::Option* threads_option = nullptr;
  CLI::Option* csv_option = nullptr;
  CLI::Option* svg_option = nullptr;
  CLI::Option* s1p_option = nullptr;
  CLI::Option* measured_option = nullptr;
};

int RunSweepCommand(const SweepFlags& flags) {
  // Check every flag before the (possibly long) file read, mesh and solves.
  const bool region_given = Given(flags.frequencies.region_option);
  const int region = ChosenRegion(flags.frequencies);
  SweepOptions options;
  if (Given(flags.threads_option)) {
    options.threads = WholeNumber(flags.threads, "--threads", 0, 1024,
                                  "a whole number of worker threads from 0 (one per core) to "
                                  "1024");
  }
  options.stress = ChosenStress(flags.power);
  options.interpolate = !flags.exact;
  std::vector<Band> bands;
  const std::vector<SweepSpan> spans = ChosenSpans(flags.frequencies, "sweep", region, bands);
  std::vector<InputPath> inputs{{flags.model.model_path, "model"}};
  if (Given(flags.measured_option)) inputs.push_back({flags.measured_path, "measured"});
  std::vector<OutputPath> outputs;
  if (Given(flags.csv_option)) outputs.push_back({flags.csv_path, "CSV"});
  if (Given(flags.svg_option)) outputs.push_back({flags.svg_path, "SVG"});
  if (Given(flags.s1p_option)) outputs.push_back({flags.s1p_path, "Touchstone"});
  CheckOutputPaths(outputs, inputs);
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
  if (Given(flags.csv_option)) files.push_back({flags.csv_path, FormatSweepCsv(report), "CSV"});
  if (Given(flags.svg_option)) files.push_back({flags.svg_path, FormatSweepSvg(report), "SVG"});
  if (Given(flags.s1p_option)) {
    files.push_back({flags.s1p_path, FormatSweepTouchstone(report), "Touchstone"});
  }
  std::string output = flags.model.json ? FormatSweepJson(report) : FormatSweepText(report);
  WriteFilesThenReport(files, inputs, output, flags.model.json);
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
  AddFrequencyFlags(*app, flags->frequencies);
  AddPowerFlags(*app, flags->power);
  flags->threads_option =
      AddTextOption(*app, "--threads", flags->threads, "N",
                    "Worker threads; each holds one matrix in memory. Default: 0, one "
                    "per core.");
  app->add_flag("--exact", flags->exact,
                "Fill the matrix exactly at every point instead of interpolating it between "
                "exact fills up to 10% apart (which adds under 0.2% to the impedance). "
                "Default: off; several times slower on a long sweep.");
  AddMeshEstimateFlag(*app, flags->no_mesh_estimate,
                      "the first feed's impedance at each band's centre (not at every point)");
  flags->csv_option =
      AddTextOption(*app, "--csv", flags->csv_path, "FILE",
                    "Also write the points to FILE as CSV (columns in docs/commands.md). "
                    "Default: none.");
  flags->svg_option =
      AddTextOption(*app, "--svg", flags->svg_path, "FILE",
                    "Also write an SVG picture: SWR against frequency and a Smith chart. "
                    "Default: none.");
  flags->s1p_option = AddTextOption(*app, "--s1p", flags->s1p_path, "FILE",
                                    "Also write S11 at the transmitter to FILE as a Touchstone 1.1 "
                                    "one-port file (MHz, RI, R = z0). Default: none.");
  flags->measured_option =
      AddTextOption(*app, "--measured", flags->measured_path, "FILE.s1p",
                    "A measured one-port Touchstone file to compare: measured SWR "
                    "beside the predicted, and the shift of the lowest SWR. "
                    "Default: none.");
  app->footer(
      "Examples:\n"
      "  wirefield sweep models/hiking_club_dipole.wire --band 20m\n"
      "  wirefield sweep models/hiking_club_dipole.wire --from 13.5MHz --to 15MHz --points 61 "
      "--svg dipole.svg\n"
      "  wirefield sweep models/end_fed_field_kit.wire --band 40m --band 20m --region 2 --json\n"
      "  wirefield sweep models/end_fed_field_kit.wire --band 40m --power 100W");
  return Command{app, [flags] { return RunSweepCommand(*flags); }};
}

}  // namespace wirefield::cli
