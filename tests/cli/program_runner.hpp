// CLI tests: runs the built wirefield program as a user would and captures what it did.
// Input: arguments (and files written to a scratch folder); output: exit code or the signal
// that ended it, and everything written to stdout and stderr.
#pragma once

#include <sys/resource.h>
#include <sys/types.h>

#include <string>
#include <vector>

namespace wirefield::cli_test {

struct ProgramRun {
  bool exited = false;  // false: ended by a signal (a crash, an abort or the time limit)
  int exit_code = -1;   // valid when exited
  int signal = 0;       // valid when !exited
  std::string out;      // stdout
  std::string err;      // stderr
};

// Seconds a single run may take before it is killed and counted as a hang. Every run of the
// CLI tests took under 0.1 s when measured; a mesh at the mesher's cap of 2500 segments per
// wire took about 30 s, so 120 s leaves room for such a model on a slow, loaded CI machine.
inline constexpr unsigned kRunTimeLimit_s = 120;

// Address space a single run may use. The bundled models need a few MiB; 4 GiB lets the
// largest matrix the CLI tests ask for (none above 100 MiB) fit many times over, and keeps a
// runaway allocation from taking the whole 24 GiB machine. Past it, new throws bad_alloc,
// which the program must report with exit code 1.
inline constexpr rlim_t kRunMemoryLimit_bytes = rlim_t{4} << 30;

// Limits of one run beyond the defaults above.
struct RunLimits {
  unsigned time_s = kRunTimeLimit_s;       // killed by SIGALRM past it
  rlim_t file_size_bytes = RLIM_INFINITY;  // RLIMIT_FSIZE: a larger write raises SIGXFSZ
};

// Runs WIREFIELD_BINARY with the given arguments (no shell involved).
ProgramRun RunWirefield(const std::vector<std::string>& args, const RunLimits& limits = {});

// A wirefield started without waiting for it: stdout and stderr go to the two files.
struct SpawnedRun {
  pid_t pid = -1;  // -1 when it could not be started
  std::string out_path;
  std::string err_path;
};

// Starts wirefield with `args` (stdin from /dev/null); `stem` names its scratch files.
SpawnedRun SpawnWirefield(const std::vector<std::string>& args, const std::string& stem);

// Waits for a spawned run, at most `limit_s` seconds, killing it (SIGKILL) past that; returns
// its wait status.
int WaitForRun(pid_t pid, unsigned limit_s);

// Writes `text` to a file of that name in a scratch folder for this test process and
// returns its path.
std::string WriteScratchFile(const std::string& name, const std::string& text);

// The repository's models/ folder.
std::string ModelsDir();

// Reads a whole file (empty when it cannot be read).
std::string ReadFile(const std::string& path);

// True when a temporary file of the program's atomic writes (PATH.wirefield-XXXXXX) is left
// beside `path`.
bool TemporaryLeftBeside(const std::string& path);

// Runs wirefield with `args`, adds a gtest failure unless it exits 2 with nothing on stdout,
// and returns its stderr.
std::string RunBadInput(const std::vector<std::string>& args);

// "exit 2" or "signal 11", for failure messages.
std::string Describe(const ProgramRun& run);

}  // namespace wirefield::cli_test
