// Command-line program: the shared model flags and their meaning (see command.hpp).
// Flags arrive as text and go through the library's own parsers, so a bad value is reported
// exactly like a bad value in a model file.
#include "command.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cstdio>

namespace wirefield::cli {
bool Given(const CLI::Option* option) { return option != nullptr && option->count() > 0; }

CLI::Option* AddTextOption(CLI::App& command, const std::string& name, std::string& target,
                           const std::string& type, const std::string& help) {
  CLI::Option* option = command.add_option(name, target, help);
  option->type_name(type);
  return option;
}

void AddTextFlag(CLI::App& command, const std::string& name, TextFlag& flag,
                 const std::string& type, const std::string& help) {
  flag.option = AddTextOption(command, name, flag.text, type, help);
}

void AddThreadsFlag(CLI::App& command, TextFlag& flag, const std::string& help) {
  AddTextFlag(command, "--threads", flag, "N", help);
}

int ChosenThreads(const TextFlag& flag) {
  if (!flag.given()) return 0;
  return WholeNumber(flag.text, "--threads", 0, 1024,
                     "a whole number of worker threads from 0 (one per core) to 1024");
}

void AddExactFlag(CLI::App& command, bool& exact, const std::string& matrix,
                  const std::string& points, const std::string& cost) {
  command.add_flag("--exact", exact,
                   fmt::format("Fill {} exactly at {} instead of interpolating it between exact "
                               "fills up to 10% apart (which adds under 0.2% to the impedance). "
                               "Default: off; {}.",
                               matrix, points, cost));
}

void AddCsvFlag(CLI::App& command, TextFlag& flag, const std::string& what) {
  AddTextFlag(
      command, "--csv", flag, "FILE",
      fmt::format("Also write {} to FILE as CSV (columns in docs/commands.md). Default: none.",
                  what));
}

void AddJsonFlag(CLI::App& command, bool& json, const std::string& instead) {
  command.add_flag("--json", json,
                   fmt::format("Write one JSON document to stdout instead of {} (keys in "
                               "docs/commands.md). Default: off.",
                               instead));
}

void AddFrequencyFlags(CLI::App& command, FrequencyFlags& flags) {
  flags.from_option = AddTextOption(command, "--from", flags.from, "F",
                                    "Lowest frequency of a range sweep (with --to and --step or "
                                    "--points), e.g. 7MHz; a bare number is in Hz. Default: none.");
  flags.to_option =
      AddTextOption(command, "--to", flags.to, "F",
                    "Highest frequency of a range sweep, included; must be above --from. "
                    "Default: none.");
  flags.step_option = AddTextOption(command, "--step", flags.step, "DF",
                                    "Step of a range sweep, e.g. 5kHz; more points cost time in "
                                    "proportion. Default: none (give --step or --points).");
  flags.points_option = AddTextOption(command, "--points", flags.points, "N",
                                      "Points of a range sweep, spread evenly from --from to --to "
                                      "(2..100000). Default: none.");
  flags.band_option =
      command.add_option("--band", flags.bands,
                         "An amateur band to sweep: 160m, 80m, 60m, 40m, 30m, 20m, 17m, 15m, "
                         "12m or 10m; repeatable. 1 kHz steps, or 401 points on a band wider "
                         "than 400 kHz. Default: none.");
  flags.band_option->type_name("NAME")->allow_extra_args(false);
  flags.region_option =
      AddTextOption(command, "--region", flags.region, "1|2|3",
                    "ITU region of the band edges: 1 Europe, Africa, Middle East; 2 the "
                    "Americas; 3 Asia-Pacific. Default: 1 (the report says so).");
}

int ChosenRegion(const FrequencyFlags& flags) {
  if (!Given(flags.region_option)) return 1;
  return WholeNumber(flags.region, "--region", 1, 3,
                     "an ITU region: 1 (Europe, Africa, Middle East), 2 (the Americas) or 3 "
                     "(Asia-Pacific)");
}

std::vector<SweepSpan> ChosenSpans(const FrequencyFlags& flags, const std::string& command,
                                   int region, std::vector<Band>& bands) {
  const bool range = Given(flags.from_option) || Given(flags.to_option);
  if (range && Given(flags.band_option)) {
    FailOption("--band",
               "--band and --from/--to both choose the frequencies; give --band NAME or --from F1 "
               "--to F2, not both");
  }
  if (!range && !Given(flags.band_option)) {
    throw InputError(
        SourceLocation{command, 0, 0},
        "give the frequencies to sweep: --from F1 --to F2 with --step DF or --points N (e.g. "
        "--from 7MHz --to 7.3MHz --step 5kHz), or --band NAME (e.g. --band 40m)");
  }
  std::vector<SweepSpan> spans;
  if (range) {
    if (!Given(flags.from_option) || !Given(flags.to_option)) {
      FailOption(Given(flags.from_option) ? "--to" : "--from",
                 "a range sweep needs both --from and --to, e.g. --from 7MHz --to 7.3MHz");
    }
    const double from_hz = ParseFrequencyArgument(flags.from, "--from");
    const double to_hz = ParseFrequencyArgument(flags.to, "--to");
    if (!(to_hz > from_hz)) {
      FailOption("--to", fmt::format("--to ({:.6g} MHz) must be above --from ({:.6g} MHz)",
                                     to_hz / 1e6, from_hz / 1e6));
    }
    if (Given(flags.step_option) == Given(flags.points_option)) {
      FailOption("--step",
                 "a range sweep needs one of --step DF (e.g. --step 5kHz) or --points N "
                 "(e.g. --points 101), not both and not neither");
    }
    SweepSpan span;
    span.name = "range";
    if (Given(flags.step_option)) {
      const double step_hz = ParseFrequencyArgument(flags.step, "--step");
      span.frequencies_hz = NamingFlags({{"step_hz", "--step"}},
                                        [&] { return FrequencyRange(from_hz, to_hz, step_hz); });
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
    FailOption(Given(flags.step_option) ? "--step" : "--points",
               fmt::format("{} applies to --from/--to; a band sweep uses 1 kHz steps, or {} points "
                           "on a band wider than {} kHz",
                           Given(flags.step_option) ? "--step" : "--points", kMaxBandPoints,
                           kMaxBandPoints - 1));
  }
  for (const std::string& name : flags.bands) {
    const Band band = NamingFlags({{"band", "--band"}, {"region", "--region"}},
                                  [&] { return FindBand(name, region); });
    for (const Band& known : bands) {
      if (known.name == band.name)
        FailOption("--band", fmt::format("--band {} is given twice", name));
    }
    bands.push_back(band);
  }
  std::sort(bands.begin(), bands.end(),
            [](const Band& a, const Band& b) { return a.from_hz < b.from_hz; });
  for (const Band& band : bands) spans.push_back(BandSpan(band));
  return spans;
}

void AddModelFlags(CLI::App& command, ModelFlags& flags, bool with_frequency) {
  command.add_option("MODEL", flags.model_path, "The model file to read (a .wire text file).")
      ->required()
      ->type_name("FILE");
  if (with_frequency) {
    flags.frequency_option = command.add_option(
        "--freq", flags.frequency,
        "Frequency to work at: a number with a unit of Hz, kHz, MHz or GHz, e.g. 14.2MHz; a "
        "bare number is in Hz. Default: the model's `frequency` statement.");
    flags.frequency_option->type_name("F");
  }
  command
      .add_option("--set", flags.overrides,
                  "Override a `let` of the model: NAME=VALUE, where VALUE is an expression of "
                  "the model language with its unit, e.g. --set height=8m. Repeatable; applied "
                  "in order. Default: none.")
      ->type_name("NAME=VALUE")
      ->allow_extra_args(false);
  flags.z0_option = command.add_option(
      "--z0", flags.z0,
      "Reference impedance for the SWR, ohm (bare number) or with a unit ohm or kohm, e.g. 50, "
      "2.45kohm; must be > 0. Default: the model's `z0`, else 50 ohm.");
  flags.z0_option->type_name("OHM");
  AddJsonFlag(command, flags.json, "the table");
}

void AddMeshEstimateFlag(CLI::App& command, bool& skip, const std::string& where) {
  command.add_flag("--no-mesh-estimate", skip,
                   fmt::format("Skip the mesh error estimate of {} (coarser solves with half and "
                               "a quarter of the segments; their cost: docs/numerics.md). "
                               "Default: off (estimated).",
                               where));
}

void AddPowerFlags(CLI::App& command, PowerFlags& flags) {
  flags.power_option = AddTextOption(
      command, "--power", flags.power, "W",
      "Transmitter power: scale the solution so the transmitter delivers this power into the "
      "feed chain, and report the voltage, current and dissipation at every load, the feed, "
      "the transformer and the free wire ends, with cautions. A unit is required: W, mW or "
      "kW, e.g. 100W. Default: none (no stress report).");
  flags.rating_cap_option = AddTextOption(
      command, "--rating-cap", flags.rating_cap, "V",
      "Peak voltage rating of capacitors (load capacitors and the compensation capacitor): a "
      "caution above it. Volt, or with V or kV. Default: 500V (common for small mica and "
      "ceramic capacitors).");
  flags.rating_load_option = AddTextOption(
      command, "--rating-load", flags.rating_load, "V",
      "Peak voltage rating of coils and other loads: a caution above it. Volt, or with V or "
      "kV. Default: 2kV.");
}

// The fields of StressOptions and the flags that set them.
const std::vector<FieldFlag> kStressFlags{{"power_w", "--power"},
                                          {"capacitor_rating_v", "--rating-cap"},
                                          {"load_rating_v", "--rating-load"}};

std::optional<StressOptions> ChosenStress(const PowerFlags& flags) {
  if (!Given(flags.power_option)) {
    for (const CLI::Option* option : {flags.rating_cap_option, flags.rating_load_option}) {
      if (Given(option)) {
        FailOption(option->get_name(),
                   fmt::format("{} sets a rating for the stress report: give it with --power, "
                               "e.g. --power 100W {} 1kV",
                               option->get_name(), option->get_name()));
      }
    }
    return std::nullopt;
  }
  StressOptions options;
  options.power_w = ParsePowerArgument(flags.power, "--power");
  if (Given(flags.rating_cap_option)) {
    options.capacitor_rating_v = ParseVoltageArgument(flags.rating_cap, "--rating-cap");
  }
  if (Given(flags.rating_load_option)) {
    options.load_rating_v = ParseVoltageArgument(flags.rating_load, "--rating-load");
  }
  NamingFlags(kStressFlags, [&] { options.Validate(); });
  return options;
}

StressResult StressAt(const Model& model, const SolveResult& solved, const StressOptions& options) {
  StressResult stress = ComputeStress(model, solved, options);
  for (std::string& caution : stress.cautions) caution = SayFlags(caution, kStressFlags);
  return stress;
}

std::optional<double> FrequencyFlag(const ModelFlags& flags) {
  if (flags.frequency_option == nullptr || flags.frequency_option->count() == 0) return {};
  return ParseFrequencyArgument(flags.frequency, "--freq");
}

Model LoadModel(const ModelFlags& flags) {
  std::optional<double> z0_ohm;
  if (flags.z0_option != nullptr && flags.z0_option->count() > 0) {
    z0_ohm = ParseResistanceArgument(flags.z0, "--z0");
  }
  Model model = ParseModelFile(flags.model_path, ParseOverrides(flags.overrides));
  if (z0_ohm) model.z0_ohm = z0_ohm;
  return model;
}

double ChosenFrequency(const std::optional<double>& frequency_flag_hz, const Model& model) {
  if (frequency_flag_hz) return *frequency_flag_hz;
  if (model.frequency_hz) return *model.frequency_hz;
  throw InputError(SourceLocation{model.file, 0, 0},
                   "the model gives no frequency: add a line such as `frequency 14.2MHz` to "
                   "the model, or pass --freq 14.2MHz");
}

void PrintWarnings(const std::vector<Warning>& warnings) {
  for (const Warning& warning : warnings) fmt::print(stderr, "{}\n", ToString(warning));
  std::fflush(stderr);
}

Simulation NewSimulation(Model model, double max_frequency_hz) {
  SimulationOptions options;
  options.max_frequency_hz = max_frequency_hz;
  Simulation simulation(std::move(model), options);
  PrintWarnings(simulation.warnings());
  return simulation;
}

void AnnounceLongSolve(const Simulation& simulation) {
  const std::string notice = LongSolveNotice(simulation.unknowns());
  if (notice.empty()) return;
  fmt::print(stderr, "{}\n", notice);
  std::fflush(stderr);
}

void WriteStdout(const std::string& text) {
  const std::size_t written = std::fwrite(text.data(), 1, text.size(), stdout);
  if (written != text.size() || std::fflush(stdout) != 0) {
    throw ComputationError("could not write the result to standard output");
  }
}

}  // namespace wirefield::cli
