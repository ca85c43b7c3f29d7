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
// A text too large to hold (batch's streamed CSV) goes through StreamedOutput, under the same
// rules: its temporary is opened first and takes the text as it comes.
#pragma once

#include <signal.h>

#include <cstddef>
#include <cstdint>
#include <initializer_list>
#include <memory>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace wirefield::cli {

// Removes the temporaries of the writes in progress, then ends the run by `signal` (its default
// action): the handler of a stopping signal while an output is being written.
extern "C" void RemoveTemporariesAndStop(int signal);

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

// An output written as its text comes, for a text too large to hold in memory (the rows of a
// streamed batch), under the rules above:
// - the constructor checks the path and opens the temporary: PATH.wirefield-XXXXXX beside a
//   regular file; for a character device or a FIFO, a spool file without a name in $TMPDIR
//   (else /tmp), written through at the end, so the device gets the text whole or not at all;
// - Append keeps the text in a buffer and writes the buffer out once it holds `buffer_bytes`,
//   so the memory held is at most `buffer_bytes` and one piece, whatever the total;
// - Commit checks the path again and puts the text in place (fsync and rename under the
//   folder's lock, with the stopping signals held back; or the write-through);
// - CommitTo writes the text so far to another output instead (batch's CSV.partial, through
//   WriteOutputFiles' rules) and leaves the path itself as it was.
// Until a commit, an error (InputError naming the file), the destructor or a stopping signal
// (SIGINT, SIGTERM, SIGHUP, SIGQUIT: the handler is installed while it lives) removes the
// temporary.
class StreamedOutput {
 public:
  static constexpr std::size_t kBufferBytes = std::size_t{64} << 10;

  StreamedOutput(OutputPath output, std::vector<InputPath> inputs,
                 std::size_t buffer_bytes = kBufferBytes);
  ~StreamedOutput();
  StreamedOutput(const StreamedOutput&) = delete;
  StreamedOutput& operator=(const StreamedOutput&) = delete;

  void Append(std::string_view text);
  void Commit();
  void CommitTo(const OutputPath& other);

  const OutputPath& output() const;
  std::size_t buffered_bytes() const;       // in the buffer now
  std::size_t most_buffered_bytes() const;  // the most the buffer has held
  std::uintmax_t appended_bytes() const;    // the whole text so far

 private:
  struct State;
  std::unique_ptr<State> state_;
};

// Commits `output`, then prints `report` to stdout; a text report (json false) gets the line
// WriteFilesThenReport gives each file written.
void CommitThenReport(StreamedOutput& output, std::string report, bool json);

}  // namespace wirefield::cli
