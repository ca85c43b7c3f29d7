// Command-line program: `wirefield pattern MODEL`: solve one model at one frequency, compute
// its far-field pattern and print the gain report (text or, with --json, the contract's JSON);
// --csv and --svg also write the cuts to files. Flags -> Model, PatternOptions ->
// Simulation::Solve -> ComputePattern -> FormatPattern* -> stdout and files (written whole).
#include "wirefield/pattern.hpp"

#include <fmt/format.h>

#include <cmath>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <optional>
#include <string>
#include <system_error>
#include <vector>

#include "command.hpp"
#include "wirefield/report.hpp"

namespace wirefield::cli {

namespace {

// What `wirefield pattern --help` says besides its flags.
const CommandHelp kPatternHelp{
    "pattern",
    "Solve a model at one frequency and compute its radiation pattern: maximum gain (dBi) "
    "and its direction, take-off angle, gain at low elevations, beamwidths, front-to-back, "
    "and where the power goes (radiated, loads, wires, efficiency).",
    R"(Examples:
  wirefield pattern models/campsite_vertical.wire
  wirefield pattern models/hiking_club_dipole.wire --json
  wirefield pattern models/campsite_vertical.wire --step 2 --svg vertical.svg --csv vertical.csv
  wirefield pattern models/hiking_club_dipole.wire --power 100W --mode ssb)"};

struct PatternFlags {
  ModelFlags model;
  PowerFlags power;
  TextFlag mode, duty, transmit_fraction;
  TextFlag step, elevation, azimuth;
  TextFlag csv, svg;
};

// The fields of PatternOptions and the flags that set them.
const std::vector<FieldFlag> kPatternFlags{{"step_deg", "--step"},
                                           {"azimuth_cut_elevation_deg", "--elevation"},
                                           {"elevation_cut_azimuth_deg", "--azimuth"}};

// Each flag is checked as soon as it is read, so the first bad flag is the one reported.
PatternOptions ChosenOptions(const PatternFlags& flags, const Model& model) {
  PatternOptions options;
  const bool over_ground = model.ground.kind != GroundKind::kFree;
  const auto check = [&] { NamingFlags(kPatternFlags, [&] { options.Validate(over_ground); }); };
  if (flags.step.given()) {
    options.step_deg = ParseDegrees(flags.step.text, "--step", "1 or 2.5deg");
    check();
  }
  if (flags.elevation.given()) {
    options.azimuth_cut_elevation_deg =
        ParseDegrees(flags.elevation.text, "--elevation", "10 or 15deg");
    check();
  }
  if (flags.azimuth.given()) {
    options.elevation_cut_azimuth_deg =
        ParseDegrees(flags.azimuth.text, "--azimuth", "90 or 45deg");
    check();
  }
  return options;
}

// The exposure options of --power, --mode, --duty and --transmit-fraction (empty without
// --power; the last three need it).
std::optional<ExposureOptions> ChosenExposure(const PatternFlags& flags,
                                              const std::optional<StressOptions>& stress) {
  if (!stress) {
    for (const CLI::Option* option :
         {flags.mode.option, flags.duty.option, flags.transmit_fraction.option}) {
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
  if (flags.mode.given()) options.mode = ParseTransmitMode(flags.mode.text, "--mode");
  if (flags.duty.given()) options.duty = ShareFlag(flags.duty.text, "--duty", "a duty factor");
  if (flags.transmit_fraction.given()) {
    options.transmit_fraction = ShareFlag(flags.transmit_fraction.text, "--transmit-fraction",
                                          "the share of the time spent transmitting");
  }
  return options;
}

int RunPattern(const PatternFlags& flags) {
  // Check the flags before the (possibly long) file read, mesh and solve.
  const std::optional<double> frequency_flag_hz = FrequencyFlag(flags.model);
  const std::optional<StressOptions> stress_options = ChosenStress(flags.power);
  const std::optional<ExposureOptions> exposure_options = ChosenExposure(flags, stress_options);
  const std::vector<InputPath> inputs{{flags.model.model_path, "model"}};
  std::vector<OutputPath> outputs;
  if (flags.csv.given()) outputs.push_back({flags.csv.text, "CSV"});
  if (flags.svg.given()) outputs.push_back({flags.svg.text, "SVG"});
  CheckOutputPaths(outputs, inputs);
  Model model = LoadModel(flags.model);
  const PatternOptions options = ChosenOptions(flags, model);
  const double frequency_hz = ChosenFrequency(frequency_flag_hz, model);
  Simulation simulation = NewSimulation(std::move(model), frequency_hz);
  AnnounceLongSolve(simulation);
  const SolveResult solved = simulation.Solve(frequency_hz);
  const PatternResult pattern = ComputePattern(simulation, solved, options);
  PrintWarnings(pattern.warnings);
  std::optional<StressResult> stress;
  std::optional<ExposureResult> exposure;
  if (stress_options) {
    stress = StressAt(simulation.model(), solved, *stress_options);
    exposure = EstimateExposure(frequency_hz, pattern.max_gain_dbi, *exposure_options);
  }
  const StressResult* stress_shown = stress ? &*stress : nullptr;
  const ExposureResult* exposure_shown = exposure ? &*exposure : nullptr;

  // Format everything before writing anything, so a failure never leaves half a result.
  std::vector<OutputFile> files;
  if (flags.csv.given()) {
    files.push_back({flags.csv.text, FormatPatternCsv(pattern), "CSV"});
  }
  if (flags.svg.given()) {
    files.push_back({flags.svg.text, FormatPatternSvg(simulation, pattern), "SVG"});
  }
  std::string output = flags.model.json
                           ? FormatPatternJson(simulation, pattern, stress_shown, exposure_shown)
                           : FormatPatternText(simulation, pattern, stress_shown, exposure_shown);
  WriteFilesThenReport(files, inputs, output, flags.model.json);
  return 0;
}

// Adds the flags of `pattern` to app, kept in `flags`.
void AddPatternFlags(CLI::App& app, PatternFlags& flags) {
  AddModelFlags(app, flags.model, /*with_frequency=*/true);
  AddTextFlag(
      app, "--step", flags.step, "DEG",
      "Grid step of both cuts, degrees; must be > 0 and <= 10. The maximum is searched on a "
      "grid of this step or 2 deg, whichever is coarser, and refined off the grid. Smaller is "
      "finer and slower. Default: 1.");
  AddTextFlag(
      app, "--elevation", flags.elevation, "DEG",
      "Elevation of the azimuth cut, degrees above the horizon (0..90 over a ground, -90..90 "
      "in free space). Default: the take-off angle (elevation of the maximum), or 10 deg when "
      "the maximum lies above 60 deg (near the zenith).");
  AddTextFlag(
      app, "--azimuth", flags.azimuth, "DEG",
      "Azimuth of the elevation cut, degrees from +x toward +y (0..360). Default: the "
      "strongest direction at low angles (the best of the low-angle table), the maximum's own "
      "azimuth when it does as well there.");
  AddCsvFlag(app, flags.csv, "both cuts");
  AddTextFlag(app, "--svg", flags.svg, "FILE",
              "Also write both cuts to FILE as an SVG picture of two polar plots. Default: none.");
  AddPowerFlags(app, flags.power);
  AddTextFlag(
      app, "--mode", flags.mode, "ssb|cw|fm|digital|carrier",
      "Emission of the exposure estimate (with --power); its duty factor (common practice): "
      "ssb 0.2, cw 0.4, fm, digital and carrier 1.0. Default: carrier (the worst case).");
  AddTextFlag(
      app, "--duty", flags.duty, "D",
      "Duty factor of the exposure estimate, 0 < D <= 1, instead of the mode's. Default: the "
      "mode's.");
  AddTextFlag(app, "--transmit-fraction", flags.transmit_fraction, "F",
              "Share of the 30-minute averaging time spent transmitting (the rest listening), "
              "0 < F <= 1. Default: 1 (the worst case).");
}

}  // namespace

Command AddPatternCommand(CLI::App& program) {
  return NewCommand(program, kPatternHelp, AddPatternFlags, RunPattern);
}

}  // namespace wirefield::cli
