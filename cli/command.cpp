// Command-line program: the shared model flags and their meaning (see command.hpp).
// Flags arrive as text and go through the library's own parsers, so a bad value is reported
// exactly like a bad value in a model file.
#include "command.hpp"

#include <fmt/format.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>

namespace wirefield::cli {
namespace {

void RemoveQuietly(const std::string& path) {
  std::error_code ignored;
  std::filesystem::remove(path, ignored);
}

[[noreturn]] void FailToWrite(const OutputFile& file, const std::string& reason) {
  throw InputError(SourceLocation{file.path, 0, 0},
                   fmt::format("cannot write the {} file: {}; check that its folder exists and "
                               "is writable, or give another path",
                               file.what, reason));
}

}  // namespace

void WriteFilesAtomically(const std::vector<OutputFile>& files) {
  std::vector<std::string> written;
  auto clean_up = [&written] {
    for (const std::string& tmp : written) RemoveQuietly(tmp);
  };
  for (const OutputFile& file : files) {
    const std::string tmp = file.path + ".tmp";
    std::FILE* out = std::fopen(tmp.c_str(), "wb");
    if (out == nullptr) {
      const std::string reason = std::strerror(errno);
      clean_up();
      FailToWrite(file, reason);
    }
    written.push_back(tmp);
    const bool ok = std::fwrite(file.text.data(), 1, file.text.size(), out) == file.text.size();
    const int errno_after_write = errno;
    const bool closed = std::fclose(out) == 0;
    if (!ok || !closed) {
      clean_up();
      FailToWrite(file, std::strerror(ok ? errno : errno_after_write));
    }
  }
  for (std::size_t i = 0; i < files.size(); ++i) {
    std::error_code error;
    std::filesystem::rename(written[i], files[i].path, error);
    if (error) {
      clean_up();
      FailToWrite(files[i], error.message());
    }
  }
}

bool Given(const CLI::Option* option) { return option != nullptr && option->count() > 0; }

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

void WriteFilesThenReport(const std::vector<OutputFile>& files, std::string report, bool json) {
  WriteFilesAtomically(files);
  if (!json) {
    for (const OutputFile& file : files) {
      report += fmt::format("Wrote the {} file {}\n", file.what, file.path);
    }
  }
  WriteStdout(report);
}

}  // namespace wirefield::cli
