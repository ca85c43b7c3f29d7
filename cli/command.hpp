// Command-line program: what every command shares. The flags that choose a model and how to
// read it (MODEL, --set, --freq, --z0, --json), loading the model with them, and printing
// warnings. Inputs: the parsed flags; outputs: a wirefield::Model and stderr lines.
#pragma once

#include <CLI/CLI.hpp>
#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "arguments.hpp"
#include "output_files.hpp"
#include "wirefield/bands.hpp"
#include "wirefield/wirefield.hpp"

namespace wirefield::cli {

// A subcommand and what to do once its flags are parsed (returns the exit code).
struct Command {
  CLI::App* app = nullptr;
  std::function<int()> run;
};

// What a command's --help says besides its flags: its name, what it does, and its footer
// ("Examples:" and a command line a line).
struct CommandHelp {
  const char* name;
  const char* about;
  const char* footer;
};

// The subcommand help.name of `program`: add_flags adds its flags to it, kept in one Flags,
// and the command runs `run` on them once they are parsed.
template <typename Flags>
Command NewCommand(CLI::App& program, const CommandHelp& help,
                   void (*add_flags)(CLI::App& command, Flags& flags),
                   int (*run)(const Flags& flags)) {
  auto flags = std::make_shared<Flags>();
  CLI::App* app = program.add_subcommand(help.name, help.about);
  add_flags(*app, *flags);
  app->footer(help.footer);
  return Command{app, [flags, run] { return run(*flags); }};
}

// The flags that pick a model and how to read it.
struct ModelFlags {
  std::string model_path;
  std::vector<std::string> overrides;  // --set NAME=VALUE, in order
  std::string frequency;               // --freq, as typed
  std::string z0;                      // --z0, as typed
  bool json = false;
  CLI::Option* frequency_option = nullptr;
  CLI::Option* z0_option = nullptr;
};

// True when the option exists and was given on the command line.
bool Given(const CLI::Option* option);

// Adds MODEL, --set, --z0 and --json to `command`, and --freq when with_frequency is true.
void AddModelFlags(CLI::App& command, ModelFlags& flags, bool with_frequency);

// Parses --freq (when given); throws InputError naming --freq when it is malformed.
std::optional<double> FrequencyFlag(const ModelFlags& flags);

// Reads the model with the --set overrides and applies --z0 (which wins over the model's z0).
// Throws InputError for any defect of the flags or the file.
Model LoadModel(const ModelFlags& flags);

// The frequency to work at: --freq as read by FrequencyFlag, else the model's `frequency`;
// InputError when neither.
double ChosenFrequency(const std::optional<double>& frequency_flag_hz, const Model& model);

// Adds --no-mesh-estimate (sets `skip`); `where` says which impedances get the estimate.
void AddMeshEstimateFlag(CLI::App& command, bool& skip, const std::string& where);

// Prints each warning to stderr, one per line.
void PrintWarnings(const std::vector<Warning>& warnings);

// The simulation of `model` for frequencies up to max_frequency_hz, its warnings printed.
Simulation NewSimulation(Model model, double max_frequency_hz);

// Before a long solve: the matrix's memory and the time estimate on stderr (LongSolveNotice).
void AnnounceLongSolve(const Simulation& simulation);

// Writes text to stdout in full and flushes; ComputationError when stdout cannot take it.
void WriteStdout(const std::string& text);

// Adds an option taking one value, kept as typed in `target`, with its type name and help.
CLI::Option* AddTextOption(CLI::App& command, const std::string& name, std::string& target,
                           const std::string& type, const std::string& help);

// A flag that takes one value: the value as typed, and its option (to tell whether it was given).
struct TextFlag {
  std::string text;
  CLI::Option* option = nullptr;
  bool given() const { return Given(option); }
};

// Adds the flag `name` taking one value into `flag`, with its type name and help.
void AddTextFlag(CLI::App& command, const std::string& name, TextFlag& flag,
                 const std::string& type, const std::string& help);

// Adds --threads N to `command`; `help` says what each thread does and its default.
void AddThreadsFlag(CLI::App& command, TextFlag& flag, const std::string& help);

// The --threads count: 0 (one per core) when not given; InputError for anything but 0..1024.
int ChosenThreads(const TextFlag& flag);

// Adds --exact (sets `exact`): fill `matrix` exactly at `points` instead of interpolating;
// `cost` says how much slower it is.
void AddExactFlag(CLI::App& command, bool& exact, const std::string& matrix,
                  const std::string& points, const std::string& cost);

// Adds --csv FILE (kept in `flag`), which also writes `what` ("the rows") as CSV.
void AddCsvFlag(CLI::App& command, TextFlag& flag, const std::string& what);

// Adds --json (sets `json`): one JSON document on stdout instead of `instead` ("the table").
void AddJsonFlag(CLI::App& command, bool& json, const std::string& instead);

// The flags that choose a sweep's frequencies: a --from/--to range with --step or --points,
// or --band (repeatable), and the ITU --region of the band edges.
struct FrequencyFlags {
  std::string from, to, step, points, region;
  std::vector<std::string> bands;
  CLI::Option* from_option = nullptr;
  CLI::Option* to_option = nullptr;
  CLI::Option* step_option = nullptr;
  CLI::Option* points_option = nullptr;
  CLI::Option* band_option = nullptr;
  CLI::Option* region_option = nullptr;
};

// Adds --from, --to, --step, --points, --band and --region to `command`.
void AddFrequencyFlags(CLI::App& command, FrequencyFlags& flags);

// The ITU region of --region (1 when not given); InputError for anything but 1, 2 or 3.
int ChosenRegion(const FrequencyFlags& flags);

// The spans to sweep, from --from/--to/--step/--points or from --band (sorted by frequency;
// `bands` receives the bands). `command` names the command in the error given when neither
// is present. Throws InputError for any defect of the flags.
std::vector<SweepSpan> ChosenSpans(const FrequencyFlags& flags, const std::string& command,
                                   int region, std::vector<Band>& bands);

// The flags of a transmitter power: --power and the component ratings of its cautions.
struct PowerFlags {
  std::string power, rating_cap, rating_load;
  CLI::Option* power_option = nullptr;
  CLI::Option* rating_cap_option = nullptr;
  CLI::Option* rating_load_option = nullptr;
};

// Adds --power, --rating-cap and --rating-load to `command`.
void AddPowerFlags(CLI::App& command, PowerFlags& flags);

// The stress options of --power, empty without it. InputError for a malformed or
// non-positive value, or for a rating given without --power.
std::optional<StressOptions> ChosenStress(const PowerFlags& flags);
// The stress of a solved model (ComputeStress), its cautions naming the flags of the ratings.
StressResult StressAt(const Model& model, const SolveResult& solved, const StressOptions& options);

// The commands, one file each.
Command AddSolveCommand(CLI::App& program);
Command AddPatternCommand(CLI::App& program);
Command AddSweepCommand(CLI::App& program);
Command AddBatchCommand(CLI::App& program);
Command AddCoilCommand(CLI::App& program);
Command AddTuneCommand(CLI::App& program);

}  // namespace wirefield::cli
