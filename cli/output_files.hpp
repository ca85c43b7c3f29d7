// Command-line program: the files a command writes (--csv, --svg, --s1p, batch's CSV.partial),
// in one place for every command. Inputs: the outputs' paths and texts, and the files the run
// reads; output: the files on disk, or an InputError (exit 2) with nothing written.
//
// The rules (docs/commands.md, "Output files"):
// - an output that is one of the run's inputs (the same file by any name: a symbolic link, a
//   hard link), the file standard output goes to, or another output of the same run is
//   refused before anything is written; so is a folder, a block device or a socket;
// - a regular file is written to a fresh PATH.wirefield-XXXXXX beside it and renamed over it;
//   an existing file keeps its permission bits (and owner, where the system allows);
// - a symbolic link is followed: its target is written, the link stays;
// - a character device (/dev/null) or a FIFO is written through, never replaced; a FIFO
//   that no program is reading is an error, not a wait;
// - the set of renames happens under an exclusive flock(2) of each output folder, with the
//   signals that stop a run held back, so the files of one run appear together;
// - a signal (SIGINT, SIGTERM, SIGHUP, SIGQUIT) during the write removes the temporaries.
#pragma once

#include <signal.h>

#include <initializer_list>
#include <string>
#include <utility>
#include <vector>

namespace wirefield::cli {

// Installs `handler` for each of `signals` while alive; restores the previous actions after.
class ScopedSignalHandlers {
 public:
  ScopedSignalHandlers(void (*handler)(int), std::initializer_list<int> signals);
  ~ScopedSignalHandlers();
  ScopedSignalHandlers(const ScopedSignalHandlers&) = delete;
  ScopedSignalHandlers& operator=(const ScopedSignalHandlers&) = delete;

 private:
  std::vector<std::pair<int, struct sigaction>> previous_;
};

// A file the command will write: its path as given and what it is ("CSV", "SVG",
// "Touchstone"), named in messages.
struct OutputPath {
  std::string path;
  std::string what;
};

// A file the run reads ("model", "measured"), which no output may replace.
struct InputPath {
  std::string path;
  std::string what;
};

// A file to write whole.
struct OutputFile {
  std::string path;
  std::string text;
  std::string what;
};

// Checks the outputs before any work, as above; InputError naming the output otherwise.
void CheckOutputPaths(const std::vector<OutputPath>& outputs, const std::vector<InputPath>& inputs);

// Checks the outputs again, then writes every file or none of the regular ones: on any failure
// removes its temporaries and throws an InputError naming the file (exit 2).
void WriteOutputFiles(const std::vector<OutputFile>& files, const std::vector<InputPath>& inputs);

// Writes the files, then prints `report` to stdout; a text report (json false) gets one line
// per file written.
void WriteFilesThenReport(const std::vector<OutputFile>& files,
                          const std::vector<InputPath>& inputs, std::string report, bool json);

}  // namespace wirefield::cli
