// Core: progress of a long stage on stderr (the matrix fill, the factorisation, a pattern).
//
// Lines read "wirefield: fill 45% (12 s, about 15 s left)". None appears before a stage has
// run for the delay (3 s), then one every 2 s, and one "done" line at its end if any was
// printed. They go to stderr only, never to stdout, and only when stderr is a terminal,
// unless the environment says otherwise:
//   WIREFIELD_PROGRESS=1        progress lines even when stderr is not a terminal (tests, logs)
//   WIREFIELD_PROGRESS=0        never
//   WIREFIELD_PROGRESS_AFTER=S  the delay in seconds (default 3); also the estimated length
//                               above which a solve announces its memory and time first
#pragma once

#include <algorithm>
#include <atomic>
#include <chrono>
#include <condition_variable>
#include <mutex>
#include <string>
#include <thread>
#include <vector>

namespace wirefield::core {

struct ProgressSettings {
  bool enabled = false;  // lines are printed at all
  double after_s = 3.0;  // silent for this long
  double every_s = 2.0;  // then a line this often
  // The memory and time estimate before a long solve (off only with WIREFIELD_PROGRESS=0).
  bool estimates = true;
};

// The settings the environment and stderr give (see the header comment).
ProgressSettings ProgressFromEnvironment();

// Reports one stage's progress from a ticker thread while it lives. The work says how far it
// is with Advance (any thread; a share of `total_units`), or, for work that cannot say (one
// LAPACK call), the line shows the time against `expected_s`, marked as an estimate.
class Progress {
 public:
  // stage: what runs ("fill", "factorisation", "pattern"); total_units: the work's size in
  // the units Advance counts (0: it does not count); expected_s: an estimate of its length
  // (0: none).
  Progress(std::string stage, double total_units, double expected_s = 0.0,
           const ProgressSettings& settings = ProgressFromEnvironment());
  ~Progress();
  Progress(const Progress&) = delete;
  Progress& operator=(const Progress&) = delete;

  // Counts `units` more of the work as done. Cheap (one atomic add); thread-safe.
  void Advance(double units) {
    double seen = done_.load(std::memory_order_relaxed);
    while (!done_.compare_exchange_weak(seen, seen + units, std::memory_order_relaxed)) {
    }
  }

 private:
  void Tick();
  std::string Line(double elapsed_s) const;

  std::string stage_;
  double total_units_;
  double expected_s_;
  ProgressSettings settings_;
  std::chrono::steady_clock::time_point start_;
  std::atomic<double> done_{0.0};
  std::mutex mutex_;
  std::condition_variable wake_;
  bool stop_ = false;
  bool printed_ = false;
  std::thread ticker_;
};

// A duration for a reader: "42 s", "7 min", "2.5 h".
std::string FormatDuration(double seconds);

}  // namespace wirefield::core
