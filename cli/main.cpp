// Command-line program: the entry point. Builds the command tree (one file per command),
// parses the arguments with CLI11, runs the chosen command and turns every outcome into an
// exit code: 0 done, 2 bad input or options, 1 a failed computation or an internal error.
#include <fmt/format.h>
#include <sys/stat.h>

#include <CLI/CLI.hpp>
#include <cstdio>
#include <exception>
#include <new>
#include <string>
#include <vector>

#include "command.hpp"
#include "wirefield/names.hpp"
#include "wirefield/simulation.hpp"

namespace {

constexpr int kExitDone = 0;
constexpr int kExitFailed = 1;
constexpr int kExitBadInput = 2;

// "solve, pattern, sweep, ..." in the order of `wirefield --help`.
std::string CommandList(const std::vector<std::string>& names) {
  std::string out;
  for (const std::string& name : names) out += (out.empty() ? "" : ", ") + name;
  return out;
}

// The first argument that is not an option: where the command's name belongs (the program's
// own options, --help and --version, take no value).
std::string FirstWord(int argc, char** argv) {
  for (int i = 1; i < argc; ++i) {
    const std::string arg = argv[i];
    if (arg.empty() || arg.front() != '-') return arg;
  }
  return {};
}

// "; '-rf.wire' is an existing file: ..." when an argument that the option parser took for an
// option names an existing file, else empty.
std::string DashFileHint(int argc, char** argv) {
  for (int i = 1; i < argc; ++i) {
    const std::string arg = argv[i];
    if (arg == "--") break;
    if (arg.size() < 2 || arg[0] != '-') continue;
    struct stat info {};
    if (stat(arg.c_str(), &info) != 0 || S_ISDIR(info.st_mode)) continue;
    return fmt::format(
        "; '{}' is an existing file, but a name starting with '-' reads as an "
        "option: put '--' before it (wirefield {} -- {}) or write ./{}",
        wirefield::Printable(arg), wirefield::Printable(argv[1]), wirefield::Printable(arg),
        wirefield::Printable(arg));
  }
  return "";
}

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
    bool command_parsed = false;
    std::vector<std::string> names;
    for (const auto& command : commands) {
      names.push_back(command.app->get_name());
      if (command.app->parsed()) {
        help = fmt::format("wirefield {} --help", command.app->get_name());
        command_parsed = true;
      }
    }
    const std::string word = FirstWord(argc, argv);
    if (!command_parsed && (argc <= 1 || !word.empty())) {
      fmt::print(stderr,
                 "wirefield: error: {}; the commands are {}\nRun `{}` to see the options.\n",
                 word.empty() ? std::string("no command given")
                              : fmt::format("unknown command '{}'{}", word,
                                            wirefield::DidYouMeanAside(word, names)),
                 CommandList(names), help);
      return kExitBadInput;
    }
    fmt::print(stderr, "wirefield: error: {}{}\nRun `{}` to see the options.\n",
               wirefield::Printable(error.what()), DashFileHint(argc, argv), help);
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
