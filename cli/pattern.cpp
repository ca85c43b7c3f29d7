// Command-line program: `wirefield pattern MODEL`: solve one model at one frequency, compute
// its far-field pattern and print the gain report (text or, with --json, the contract's JSON);
// --csv and --svg also write the cuts to files. Flags -> Model, PatternOptions ->
// Simulation::Solve -> ComputePattern -> FormatPattern* -> stdout and files (written whole).
#include "wirefield/pattern.hpp"

#include <fmt/format.h>

#include <cerrno>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <memory>
#include <optional>
#include <string>
#include <system_error>
#include <vector>

#include "command.hpp"
#include "wirefield/report.hpp"

namespace wirefield::cli {

namespace {

// The grid step's bounds: finer than 0 is meaningless; coarser than 10 deg misses the maximum
// of a lobe by up to 5 deg and blurs beamwidths, and the search cost grows as 1/step^2.
constexpr double kMaxStep_deg = 10.0;

struct PatternFlags {
  ModelFlags model;
  std::string step;       // --step, as typed
  std::string elevation;  // --elevation, as typed
  std::string csv_path;
  std::string svg_path;
  CLI::Option* step_option = nullptr;
  CLI::Option* elevation_option = nullptr;
  CLI::Option* csv_option = nullptr;
  CLI::Option* svg_option = nullptr;
};

PatternOptions ChosenOptions(const PatternFlags& flags, const Model& model) {
  PatternOptions options;
  if (flags.step_option->count() > 0) {
    options.step_deg = ParseDegrees(flags.step, "--step", "1 or 2.5deg");
    if (!(options.step_deg > 0.0 && options.step_deg <= kMaxStep_deg)) {
      throw InputError(SourceLocation{"--step", 1, 1},
                       fmt::format("--step must be greater than 0 and at most {:.0f} degrees; "
                                   "got {:.6g}",
                                   kMaxStep_deg, options.step_deg));
    }
  }
  if (flags.elevation_option->count() > 0) {
    const double elevation_deg = ParseDegrees(flags.elevation, "--elevation", "10 or 15deg");
    const bool ground = model.ground.kind != GroundKind::kFree;
    const double lowest_deg = ground ? 0.0 : -90.0;
    if (elevation_deg < lowest_deg || elevation_deg > 90.0) {
      throw InputError(
          SourceLocation{"--elevation", 1, 1},
          ground ? fmt::format("--elevation must lie between 0 and 90 degrees over a ground "
                               "(there is no far field below it); got {:.6g}",
                               elevation_deg)
                 : fmt::format("--elevation must lie between -90 and 90 degrees; got {:.6g}",
                               elevation_deg));
    }
    options.azimuth_cut_elevation_deg = elevation_deg;
  }
  return options;
}

int RunPattern(const PatternFlags& flags) {
  // Check the flags before the (possibly long) file read, mesh and solve.
  FrequencyFlag(flags.model);
  Model model = LoadModel(flags.model);
  const PatternOptions options = ChosenOptions(flags, model);
  const double frequency_hz = ChosenFrequency(flags.model, model);
  SimulationOptions simulation_options;
  simulation_options.max_frequency_hz = frequency_hz;
  Simulation simulation(std::move(model), simulation_options);
  PrintWarnings(simulation.warnings());
  const SolveResult solved = simulation.Solve(frequency_hz);
  const PatternResult pattern = ComputePattern(simulation, solved, options);
  PrintWarnings(pattern.warnings);

  // Format everything before writing anything, so a failure never leaves half a result.
  std::vector<OutputFile> files;
  if (flags.csv_option->count() > 0) {
    files.push_back({flags.csv_path, FormatPatternCsv(pattern), "CSV"});
  }
  if (flags.svg_option->count() > 0) {
    files.push_back({flags.svg_path, FormatPatternSvg(simulation, pattern), "SVG"});
  }
  std::string output = flags.model.json ? FormatPatternJson(simulation, pattern)
                                        : FormatPatternText(simulation, pattern);
  WriteFilesThenReport(files, output, flags.model.json);
  return 0;
}

}  // namespace

Command AddPatternCommand(CLI::App& program) {
  auto flags = std::make_shared<PatternFlags>();
  CLI::App* app = program.add_subcommand(
      "pattern",
      "Solve a model at one frequency and compute its radiation pattern: maximum gain (dBi) "
      "and its direction, take-off angle, gain at low elevations, beamwidths, front-to-back, "
      "and where the power goes (radiated, loads, wires, efficiency).");
  AddModelFlags(*app, flags->model, /*with_frequency=*/true);
  flags->step_option = app->add_option(
      "--step", flags->step,
      "Grid step of both cuts, degrees; must be > 0 and <= 10. The maximum is searched on a "
      "grid of this step or 2 deg, whichever is coarser, and refined off the grid. Smaller is "
      "finer and slower. Default: 1.");
  flags->step_option->type_name("DEG");
  flags->elevation_option = app->add_option(
      "--elevation", flags->elevation,
      "Elevation of the azimuth cut, degrees above the horizon (0..90 over a ground, -90..90 "
      "in free space). Default: the take-off angle (elevation of the maximum).");
  flags->elevation_option->type_name("DEG");
  flags->csv_option = app->add_option(
      "--csv", flags->csv_path,
      "Also write both cuts to FILE as CSV (columns in docs/commands.md). Default: none.");
  flags->csv_option->type_name("FILE");
  flags->svg_option = app->add_option(
      "--svg", flags->svg_path,
      "Also write both cuts to FILE as an SVG picture of two polar plots. Default: none.");
  flags->svg_option->type_name("FILE");
  app->footer(
      "Examples:\n"
      "  wirefield pattern models/campsite_vertical.wire\n"
      "  wirefield pattern models/hiking_club_dipole.wire --json\n"
      "  wirefield pattern models/campsite_vertical.wire --step 2 --svg vertical.svg --csv "
      "vertical.csv");
  return Command{app, [flags] { return RunPattern(*flags); }};
}

}  // namespace wirefield::cli
