// Command-line program: what every command shares. The flags that choose a model and how to
// read it (MODEL, --set, --freq, --z0, --json), loading the model with them, and printing
// warnings. Inputs: the parsed flags; outputs: a wirefield::Model and stderr lines.
#pragma once

#include <CLI/CLI.hpp>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "wirefield/wirefield.hpp"

namespace wirefield::cli {

// A subcommand and what to do once its flags are parsed (returns the exit code).
struct Command {
  CLI::App* app = nullptr;
  std::function<int()> run;
};

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

// The frequency to work at: --freq, else the model's `frequency`; InputError when neither.
double ChosenFrequency(const ModelFlags& flags, const Model& model);

// Prints each warning to stderr, one per line.
void PrintWarnings(const std::vector<Warning>& warnings);

// Writes text to stdout in full and flushes; ComputationError when stdout cannot take it.
void WriteStdout(const std::string& text);

// The commands, one file each.
Command AddSolveCommand(CLI::App& program);
Command AddPatternCommand(CLI::App& program);
Command AddSweepCommand(CLI::App& program);
Command AddCoilCommand(CLI::App& program);

// A file to write whole: first to PATH.tmp, renamed over PATH only when every file is ready.
struct OutputFile {
  std::string path;
  std::string text;
  std::string what;  // "CSV", "SVG", "Touchstone": named in error messages
};

// Writes every file or none: on any failure removes the temporary files and throws an
// InputError naming the file (exit 2). Never leaves a half-written file.
void WriteFilesAtomically(const std::vector<OutputFile>& files);

// Writes the files atomically, then prints `report` to stdout; a text report (json false)
// gets one line per file written.
void WriteFilesThenReport(const std::vector<OutputFile>& files, std::string report, bool json);

}  // namespace wirefield::cli
