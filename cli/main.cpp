// Command-line program: the entry point. Builds the command tree (one file per command),
// parses the arguments with CLI11, runs the chosen command and turns every outcome into an
// exit code: 0 done, 2 bad input or options, 1 a failed computation or an internal error.
#include <fmt/format.h>

#include <CLI/CLI.hpp>
#include <cstdio>
#include <exception>
#include <new>
#include <string>
#include <vector>

#include "command.hpp"
#include "wirefield/simulation.hpp"

namespace {

constexpr int kExitDone = 0;
constexpr int kExitFailed = 1;
constexpr int kExitBadInput = 2;

// Runs a command and maps its exceptions to exit codes; nothing escapes.
int RunGuarded(const wirefield::cli::Command& command) {
  try {
    return command.run();
  } catch (const wirefield::InputError& error) {
    fmt::print(stderr, "{}\n", error.what());
    return kExitBadInput;
  } catch (const wirefield::ComputationError& error) {
    fmt::print(stderr, "wirefield: computation failed: {}\n", error.what());
    return kExitFailed;
  } catch (const std::bad_alloc&) {
    fmt::print(stderr,
               "wirefield: internal error: out of memory; use fewer segments or a lower "
               "frequency\n");
    return kExitFailed;
  } catch (const std::exception& error) {
    fmt::print(stderr, "wirefield: internal error: {}\n", error.what());
    return kExitFailed;
  } catch (...) {
    fmt::print(stderr, "wirefield: internal error: unknown exception\n");
    return kExitFailed;
  }
}

int Run(int argc, char** argv) {
  CLI::App program(
      "wirefield: thin-wire method-of-moments antenna simulator. Reads a .wire model and "
      "reports feedpoint impedance, SWR, currents and losses.",
      "wirefield");
  program.set_version_flag("--version", "wirefield " + wirefield::Version(),
                           "Print the program's version on one line and exit.");
  program.require_subcommand(1);
  program.footer(
      "Exit codes: 0 done; 1 the computation failed; 2 the input or an option is wrong.\n"
      "Run `wirefield COMMAND --help` for a command's options; docs/commands.md has them all.");
  std::vector<wirefield::cli::Command> commands;
  commands.push_back(wirefield::cli::AddSolveCommand(program));
  commands.push_back(wirefield::cli::AddPatternCommand(program));
  commands.push_back(wirefield::cli::AddSweepCommand(program));
  commands.push_back(wirefield::cli::AddBatchCommand(program));
  commands.push_back(wirefield::cli::AddCoilCommand(program));
  commands.push_back(wirefield::cli::AddTuneCommand(program));

  try {
    program.parse(argc, argv);
  } catch (const CLI::ParseError& error) {
    if (error.get_exit_code() == 0) return program.exit(error);  // --help, --version
    std::string help = "wirefield --help";
    for (const auto& command : commands) {
      if (command.app->parsed()) help = fmt::format("wirefield {} --help", command.app->get_name());
    }
    fmt::print(stderr, "wirefield: error: {}\nRun `{}` to see the options.\n", error.what(), help);
    return kExitBadInput;
  }
  for (const auto& command : commands) {
    if (command.app->parsed()) return RunGuarded(command);
  }
  fmt::print(stderr, "wirefield: error: no command given\nRun `wirefield --help`.\n");
  return kExitBadInput;
}

}  // namespace

int main(int argc, char** argv) {
  // Nothing has entered BLAS yet: its idle workers would only compete with the fill's threads.
  (void)wirefield::ParkIdleBlasThreads();
  try {
    return Run(argc, argv);
  } catch (const std::exception& error) {
    std::fprintf(stderr, "wirefield: internal error: %s\n", error.what());
  } catch (...) {
    std::fprintf(stderr, "wirefield: internal error: unknown exception\n");
  }
  return kExitFailed;
}
