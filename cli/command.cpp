// Command-line program: the shared model flags and their meaning (see command.hpp).
// Flags arrive as text and go through the library's own parsers, so a bad value is reported
// exactly like a bad value in a model file.
#include "command.hpp"

#include <fmt/format.h>

#include <cstdio>

namespace wirefield::cli {

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
  command.add_flag("--json", flags.json,
                   "Write one JSON document to stdout instead of the table (keys in "
                   "docs/commands.md). Default: off.");
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
  std::vector<Override> overrides;
  overrides.reserve(flags.overrides.size());
  for (const std::string& text : flags.overrides) overrides.push_back(ParseOverride(text));
  Model model = ParseModelFile(flags.model_path, overrides);
  if (z0_ohm) model.z0_ohm = z0_ohm;
  return model;
}

double ChosenFrequency(const ModelFlags& flags, const Model& model) {
  if (std::optional<double> frequency_hz = FrequencyFlag(flags)) return *frequency_hz;
  if (model.frequency_hz) return *model.frequency_hz;
  throw InputError(SourceLocation{model.file, 0, 0},
                   "the model gives no frequency: add a line such as `frequency 14.2MHz` to "
                   "the model, or pass --freq 14.2MHz");
}

void PrintWarnings(const std::vector<Warning>& warnings) {
  for (const Warning& warning : warnings) fmt::print(stderr, "{}\n", ToString(warning));
  std::fflush(stderr);
}

void WriteStdout(const std::string& text) {
  const std::size_t written = std::fwrite(text.data(), 1, text.size(), stdout);
  if (written != text.size() || std::fflush(stdout) != 0) {
    throw ComputationError("could not write the result to standard output");
  }
}

}  // namespace wirefield::cli
