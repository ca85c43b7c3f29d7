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
  PowerFlags power;
  std::string mode, duty, transmit_fraction;  // as typed
  CLI::Option* mode_option = nullptr;
  CLI::Option* duty_option = nullptr;
  CLI::Option* transmit_fraction_option = nullptr;
  std::string step;       // --step, as typed
  std::string elevation;  // --elevation, as typed
  std::string azimuth;    // --azimuth, as typed
  std::string csv_path;
  std::string svg_path;
  CLI::Option* step_option = nullptr;
  CLI::Option* elevation_option = nullptr;
  CLI::Option* azimuth_option = nullptr;
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
  if (Given(flags.azimuth_option)) {
    const double azimuth_deg = ParseDegrees(flags.azimuth, "--azimuth", "90 or 45deg");
    if (!(azimuth_deg >= 0.0 && azimuth_deg <= 360.0)) {
      throw InputError(
          SourceLocation{"--azimuth", 1, 1},
          fmt::format(
              "--azimuth must lie between 0 and 360 degrees (from +x toward +y); got {:.6g}",
              azimuth_deg));
    }
    options.elevation_cut_azimuth_deg = azimuth_deg;
  }
  return options;
}

// A share in (0, 1] of an option, as a plain number; InputError naming the option otherwise.
double ShareFlag(const std::string& text, const std::string& option, const std::string& what) {
  const char* begin = text.c_str();
  char* end = nullptr;
  errno = 0;
  const double value = std::strtod(begin, &end);
  if (text.empty() || end == begin || *end != '\0' || errno == ERANGE || !(value > 0.0) ||
      !(value <= 1.0)) {
    FailOption(option, fmt::format("{} needs {} greater than 0 and at most 1, e.g. 0.5; got '{}'",
                                   option, what, text));
  }
  return value;
}

// The exposure options of --power, --mode, --duty and --transmit-fraction (empty without
// --power; the last three need it).
std::optional<ExposureOptions> ChosenExposure(const PatternFlags& flags,
                                              const std::optional<StressOptions>& stress) {
  if (!stress) {
    for (const CLI::Option* option :
         {flags.mode_option, flags.duty_option, flags.transmit_fraction_option}) {
      if (Given(option)) {
        FailOption(option->get_name(),
                   fmt::format("{} belongs to the exposure estimate: give it with --power, e.g. "
                               "--power 100W --mode ssb",
                               option->get_name()));
      }
    }
    return std::nullopt;
  }
  ExposureOptions options;
  options.power_w = stress->power_w;
  if (Given(flags.mode_option)) options.mode = ParseTransmitMode(flags.mode, "--mode");
  if (Given(flags.duty_option)) options.duty = ShareFlag(flags.duty, "--duty", "a duty factor");
  if (Given(flags.transmit_fraction_option)) {
    options.transmit_fraction = ShareFlag(flags.transmit_fraction, "--transmit-fraction",
                                          "the share of the time spent transmitting");
  }
  return options;
}

int RunPattern(const PatternFlags& flags) {
  // Check the flags before the (possibly long) file read, mesh and solve.
  FrequencyFlag(flags.model);
  const std::optional<StressOptions> stress_options = ChosenStress(flags.power);
  const std::optional<ExposureOptions> exposure_options = ChosenExposure(flags, stress_options);
  const std::vector<InputPath> inputs{{flags.model.model_path, "model"}};
  std::vector<OutputPath> outputs;
  if (Given(flags.csv_option)) outputs.push_back({flags.csv_path, "CSV"});
  if (Given(flags.svg_option)) outputs.push_back({flags.svg_path, "SVG"});
  CheckOutputPaths(outputs, inputs);
  Model model = LoadModel(flags.model);
  const PatternOptions options = ChosenOptions(flags, model);
  const double frequency_hz = ChosenFrequency(flags.model, model);
  SimulationOptions simulation_options;
  simulation_options.max_frequency_hz = frequency_hz;
  Simulation simulation(std::move(model), simulation_options);
  PrintWarnings(simulation.warnings());
  AnnounceLongSolve(simulation);
  const SolveResult solved = simulation.Solve(frequency_hz);
  const PatternResult pattern = ComputePattern(simulation, solved, options);
  PrintWarnings(pattern.warnings);
  std::optional<StressResult> stress;
  std::optional<ExposureResult> exposure;
  if (stress_options) {
    stress = ComputeStress(simulation.model(), solved, *stress_options);
    exposure = EstimateExposure(frequency_hz, pattern.max_gain_dbi, *exposure_options);
  }
  const StressResult* stress_shown = stress ? &*stress : nullptr;
  const ExposureResult* exposure_shown = exposure ? &*exposure : nullptr;

  // Format everything before writing anything, so a failure never leaves half a result.
  std::vector<OutputFile> files;
  if (flags.csv_option->count() > 0) {
    files.push_back({flags.csv_path, FormatPatternCsv(pattern), "CSV"});
  }
  if (flags.svg_option->count() > 0) {
    files.push_back({flags.svg_path, FormatPatternSvg(simulation, pattern), "SVG"});
  }
  std::string output = flags.model.json
                           ? FormatPatternJson(simulation, pattern, stress_shown, exposure_shown)
                           : FormatPatternText(simulation, pattern, stress_shown, exposure_shown);
  WriteFilesThenReport(files, inputs, output, flags.model.json);
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
      "in free space). Default: the take-off angle (elevation of the maximum), or 10 deg when "
      "the maximum lies above 60 deg (near the zenith).");
  flags->elevation_option->type_name("DEG");
  flags->azimuth_option = AddTextOption(
      *app, "--azimuth", flags->azimuth, "DEG",
      "Azimuth of the elevation cut, degrees from +x toward +y (0..360). Default: the "
      "strongest direction at low angles (the best of the low-angle table), the maximum's own "
      "azimuth when it does as well there.");
  flags->csv_option = app->add_option(
      "--csv", flags->csv_path,
      "Also write both cuts to FILE as CSV (columns in docs/commands.md). Default: none.");
  flags->csv_option->type_name("FILE");
  flags->svg_option = app->add_option(
      "--svg", flags->svg_path,
      "Also write both cuts to FILE as an SVG picture of two polar plots. Default: none.");
  flags->svg_option->type_name("FILE");
  AddPowerFlags(*app, flags->power);
  flags->mode_option = AddTextOption(
      *app, "--mode", flags->mode, "ssb|cw|fm|digital|carrier",
      "Emission of the exposure estimate (with --power); its duty factor (common practice): "
      "ssb 0.2, cw 0.4, fm, digital and carrier 1.0. Default: carrier (the worst case).");
  flags->duty_option = AddTextOption(
      *app, "--duty", flags->duty, "D",
      "Duty factor of the exposure estimate, 0 < D <= 1, instead of the mode's. Default: the "
      "mode's.");
  flags->transmit_fraction_option = AddTextOption(
      *app, "--transmit-fraction", flags->transmit_fraction, "F",
      "Share of the 30-minute averaging time spent transmitting (the rest listening), "
      "0 < F <= 1. Default: 1 (the worst case).");
  app->footer(
      "Examples:\n"
      "  wirefield pattern models/campsite_vertical.wire\n"
      "  wirefield pattern models/hiking_club_dipole.wire --json\n"
      "  wirefield pattern models/campsite_vertical.wire --step 2 --svg vertical.svg --csv "
      "vertical.csv\n"
      "  wirefield pattern models/hiking_club_dipole.wire --power 100W --mode ssb");
  return Command{app, [flags] { return RunPattern(*flags); }};
}

}  // namespace wirefield::cli
