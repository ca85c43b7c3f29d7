// Core: progress lines on stderr from a ticker thread (progress.hpp).
#include "core/progress.hpp"

#include <fmt/format.h>
#include <unistd.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <string_view>

namespace wirefield::core {
namespace {

// A positive finite number of seconds from the environment, else `fallback`.
double SecondsFromEnvironment(const char* name, double fallback) {
  const char* text = std::getenv(name);
  if (!text || !*text) return fallback;
  char* end = nullptr;
  const double value = std::strtod(text, &end);
  return (*end == '\0' && value >= 0.0 && std::isfinite(value)) ? value : fallback;
}

}  // namespace

std::string FormatDuration(double s) {
  if (s < 10.0) return fmt::format("{:.1f} s", s);
  if (s < 90.0) return fmt::format("{:.0f} s", s);
  if (s < 5400.0) return fmt::format("{:.0f} min", s / 60.0);
  return fmt::format("{:.1f} h", s / 3600.0);
}

ProgressSettings ProgressFromEnvironment() {
  ProgressSettings s;
  const char* forced = std::getenv("WIREFIELD_PROGRESS");
  if (forced && std::string_view(forced) == "1") {
    s.enabled = true;
  } else if (forced && std::string_view(forced) == "0") {
    s.enabled = false;
    s.estimates = false;
  } else {
    s.enabled = ::isatty(STDERR_FILENO) == 1;
  }
  s.after_s = SecondsFromEnvironment("WIREFIELD_PROGRESS_AFTER", s.after_s);
  return s;
}

Progress::Progress(std::string stage, double total_units, double expected_s,
                   const ProgressSettings& settings)
    : stage_(std::move(stage)),
      total_units_(total_units),
      expected_s_(expected_s),
      settings_(settings),
      start_(std::chrono::steady_clock::now()) {
  if (settings_.enabled) ticker_ = std::thread([this] { Tick(); });
}

Progress::~Progress() {
  if (!ticker_.joinable()) return;
  {
    std::lock_guard<std::mutex> lock(mutex_);
    stop_ = true;
  }
  wake_.notify_all();
  ticker_.join();
  const double elapsed =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - start_).count();
  // A stage that outlasted the delay says so even when it ended before the ticker woke.
  if (!printed_ && elapsed >= settings_.after_s) {
    std::fprintf(stderr, "%s\n", Line(elapsed).c_str());
    printed_ = true;
  }
  if (printed_) {
    std::fprintf(stderr, "wirefield: %s done in %s\n", stage_.c_str(),
                 FormatDuration(elapsed).c_str());
    std::fflush(stderr);
  }
}

std::string Progress::Line(double elapsed_s) const {
  if (total_units_ > 0.0) {
    const double share = std::clamp(done_.load(std::memory_order_relaxed) / total_units_, 0.0, 1.0);
    std::string line =
        fmt::format("wirefield: {} {:.0f}% ({}", stage_, 100.0 * share, FormatDuration(elapsed_s));
    if (share > 0.0 && share < 1.0) {
      line += fmt::format(", about {} left", FormatDuration(elapsed_s * (1.0 - share) / share));
    }
    return line + ")";
  }
  if (expected_s_ > 0.0) {
    const double left = expected_s_ - elapsed_s;
    return fmt::format("wirefield: {} running ({} of about {} estimated{})", stage_,
                       FormatDuration(elapsed_s), FormatDuration(expected_s_),
                       left > 0.0 ? "" : "; taking longer than estimated");
  }
  return fmt::format("wirefield: {} running ({})", stage_, FormatDuration(elapsed_s));
}

void Progress::Tick() {
  std::unique_lock<std::mutex> lock(mutex_);
  auto next = start_ + std::chrono::duration_cast<std::chrono::steady_clock::duration>(
                           std::chrono::duration<double>(settings_.after_s));
  const auto every = std::chrono::duration_cast<std::chrono::steady_clock::duration>(
      std::chrono::duration<double>(std::max(0.05, settings_.every_s)));
  while (!wake_.wait_until(lock, next, [this] { return stop_; })) {
    const auto now = std::chrono::steady_clock::now();
    const std::string line = Line(std::chrono::duration<double>(now - start_).count());
    std::fprintf(stderr, "%s\n", line.c_str());
    std::fflush(stderr);
    printed_ = true;
    next = now + every;
  }
}

}  // namespace wirefield::core
