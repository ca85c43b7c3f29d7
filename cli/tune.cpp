// Command-line program: `wirefield tune MODEL --vary NAME --target F`: find the value of a
// model variable that puts the first feed at resonance (or the lowest SWR) at F; repeat the
// pair for a second variable and band. Flags -> TuneTargets and TuneOptions -> TuneFile ->
// FormatTuneText / FormatTuneJson -> stdout; progress on stderr when it is a terminal.
#include "wirefield/tune.hpp"

#include <fmt/format.h>
#include <unistd.h>

#include <algorithm>
#include <cstdio>
#include <string>
#include <vector>

#include "command.hpp"

namespace wirefield::cli {

namespace {

// What `wirefield tune --help` says besides its flags.
const CommandHelp kTuneHelp{
    "tune",
    "Find the value of a model variable (a wire length, a coil's inductance, a capacitor) "
    "that puts the first feed at resonance at a frequency, or gives the lowest SWR there; "
    "two --vary/--target pairs tune two variables for two bands. Reports the value, the "
    "impedance, the SWR and how far the resonance moves per cm, uH or pF.",
    R"(Examples:
  wirefield tune models/hiking_club_dipole.wire --vary total --target 14.2MHz
  wirefield tune models/hiking_club_two_band_end_fed.wire --vary section --target 14.2MHz --vary tail --target 7.1MHz --kind parallel
  wirefield tune models/end_fed_field_kit.wire --vary radiator_length --target 7.05MHz --goal min-swr --z0 2450ohm --json)"};

struct TuneFlags {
  ModelFlags model;
  std::vector<std::string> vary, target, min, max;
  std::string goal, kind;
  CLI::Option* goal_option = nullptr;
  CLI::Option* kind_option = nullptr;
  bool no_mesh_estimate = false;
};

// The fields of TuneTarget and TuneOptions and the flags that set them.
const std::vector<FieldFlag> kTuneFlags{{"variable", "--vary"}, {"frequency_hz", "--target"},
                                        {"min_si", "--min"},    {"max_si", "--max"},
                                        {"kind", "--kind"},     {"goal", "--goal"}};

int RunTune(const TuneFlags& flags) {
  // Check every flag before the model is read and the (possibly long) tune starts.
  if (flags.vary.size() != flags.target.size()) {
    FailOption("--target",
               fmt::format("give one --target F for each --vary NAME, in order (got {} --vary and "
                           "{} --target), e.g. --vary length --target 14.2MHz",
                           flags.vary.size(), flags.target.size()));
  }
  for (const auto* bound : {&flags.min, &flags.max}) {
    if (!bound->empty() && bound->size() != flags.vary.size()) {
      FailOption(
          bound == &flags.min ? "--min" : "--max",
          fmt::format("give {} for every --vary, in order, or for none (got {} for {} "
                      "--vary)",
                      bound == &flags.min ? "--min" : "--max", bound->size(), flags.vary.size()));
    }
  }
  TuneOptions options;
  options.mesh_estimate = !flags.no_mesh_estimate;
  if (Given(flags.goal_option)) {
    const std::optional<TuneGoal> goal = ParseTuneGoal(flags.goal);
    if (!goal) {
      FailOption("--goal", fmt::format("--goal is resonance or min-swr; got '{}'", flags.goal));
    }
    options.goal = *goal;
  }
  if (Given(flags.kind_option)) {
    const std::optional<ResonanceKind> kind = ParseResonanceKind(flags.kind);
    if (!kind) {
      FailOption("--kind", fmt::format("--kind is auto, series or parallel; got '{}'", flags.kind));
    }
    options.kind = *kind;
  }
  std::vector<TuneTarget> targets;
  for (size_t i = 0; i < flags.vary.size(); ++i) {
    TuneTarget t;
    t.variable = flags.vary[i];
    t.frequency_hz = ParseFrequencyArgument(flags.target[i], "--target");
    targets.push_back(t);
  }
  if (Given(flags.model.z0_option)) {
    options.z0_ohm = ParseResistanceArgument(flags.model.z0, "--z0");
  }
  options.overrides = ParseOverrides(flags.model.overrides);

  // The bounds take the unit of their variable, so they are read against the model.
  const std::string text = ReadModelFileText(flags.model.model_path);
  const Model model = ParseModelText(text, flags.model.model_path, options.overrides);
  for (size_t i = 0; i < targets.size(); ++i) {
    const auto spec =
        std::find_if(model.variable_specs.begin(), model.variable_specs.end(),
                     [&](const VariableSpec& v) { return v.name == targets[i].variable; });
    if (spec == model.variable_specs.end()) continue;  // Tune names the model's variables
    if (!flags.min.empty()) targets[i].min_si = ParseVariableArgument(flags.min[i], "--min", *spec);
    if (!flags.max.empty()) targets[i].max_si = ParseVariableArgument(flags.max[i], "--max", *spec);
  }

  if (::isatty(STDERR_FILENO) == 1) {
    options.progress = [](const std::string& line) {
      fmt::print(stderr, "{}\n", line);
      std::fflush(stderr);
    };
  }
  const TuneResult result =
      NamingFlags(kTuneFlags, [&] { return Tune(text, flags.model.model_path, targets, options); });
  PrintWarnings(result.warnings);
  WriteStdout(flags.model.json ? FormatTuneJson(result) : FormatTuneText(result));
  return 0;
}

// Adds the flags of `tune` to app, kept in `flags`.
void AddTuneFlags(CLI::App& app, TuneFlags& flags) {
  AddModelFlags(app, flags.model, /*with_frequency=*/false);
  AddMeshEstimateFlag(app, flags.no_mesh_estimate, "the tuned impedance");
  app.add_option("--vary", flags.vary,
                 "The `let` variable to tune, by name; repeatable, paired in order with "
                 "--target. Required.")
      ->type_name("NAME")
      ->required()
      ->allow_extra_args(false);
  app.add_option("--target", flags.target,
                 "The frequency for the --vary in the same position, e.g. 14.2MHz (bare "
                 "number: Hz). Required, one per --vary.")
      ->type_name("F")
      ->required()
      ->allow_extra_args(false);
  app.add_option("--min", flags.min,
                 "Lowest value to try, in the variable's unit (e.g. 9.5m, 60uH; bare: its SI "
                 "unit); one per --vary or none. Default: 30% below the model's value.")
      ->type_name("V")
      ->allow_extra_args(false);
  app.add_option("--max", flags.max,
                 "Highest value to try, like --min. Default: 30% above the model's value. A "
                 "wider range costs no more solves but may take in another resonance.")
      ->type_name("V")
      ->allow_extra_args(false);
  flags.goal_option = AddTextOption(
      app, "--goal", flags.goal, "resonance|min-swr",
      "resonance: zero reactance at the feed terminals (before any transformer); min-swr: the "
      "lowest SWR at the transmitter. Default: resonance.");
  flags.kind_option = AddTextOption(
      app, "--kind", flags.kind, "auto|series|parallel",
      "Which resonance: series (low R, X rising with frequency: a centre-fed half wave), "
      "parallel (high R, X falling: an end-fed half wave) or auto (either, the one nearest the "
      "model's value). Default: auto.");
}

}  // namespace

Command AddTuneCommand(CLI::App& program) {
  return NewCommand(program, kTuneHelp, AddTuneFlags, RunTune);
}

}  // namespace wirefield::cli
