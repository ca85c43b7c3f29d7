// Study layer: runs the spans of a sweep plan (bands, or one --from/--to range) through the
// library's RunSweep in chunks, so that a caller can show progress, and merges the results.
// Input: a Simulation and its spans; output: one SweepResult in span order.
#include <algorithm>
#include <cmath>
#include <vector>

#include "core/parallel.hpp"
#include "wirefield/bands.hpp"

namespace wirefield {
namespace {

// Points per RunSweep call. Each call after the first in a span repeats the previous call's
// last point, so that no zero crossing between two chunks is lost: 48 points keep that extra
// work near 2%, and still give a progress line every second or two on a large model.
constexpr std::size_t kMinChunkPoints = 48;
constexpr std::size_t kChunkPointsPerThread = 8;
// With matrix interpolation each call fills three anchors per window: longer calls share them
// among more points (a 351-point sweep takes two calls, six fills).
constexpr std::size_t kInterpolatedChunkPoints = 192;

void AddResonance(std::vector<double>& list, double f_hz) {
  // A crossing at a shared chunk point is found by both chunks: keep one.
  for (double known_hz : list) {
    if (std::abs(known_hz - f_hz) <= 1e-9 * f_hz) return;
  }
  list.push_back(f_hz);
}

}  // namespace

SweepResult RunSpans(const Simulation& simulation, const std::vector<SweepSpan>& spans,
                     const SweepOptions& options, const std::function<void(int, int)>& progress) {
  int total = 0;
  for (const SweepSpan& span : spans) total += static_cast<int>(span.frequencies_hz.size());
  const auto threads = static_cast<std::size_t>(core::ResolveThreads(options.threads));
  const std::size_t chunk =
      std::max(options.interpolate ? kInterpolatedChunkPoints : kMinChunkPoints,
               kChunkPointsPerThread * threads);

  SweepResult merged;
  bool first = true;
  int done = 0;
  for (const SweepSpan& span : spans) {
    const std::vector<double>& all = span.frequencies_hz;
    std::size_t begin = 0;
    while (begin < all.size()) {
      const std::size_t start = begin == 0 ? 0 : begin - 1;  // repeat the last point
      const std::size_t end = std::min(all.size(), start + chunk);
      const std::vector<double> part(all.begin() + static_cast<std::ptrdiff_t>(start),
                                     all.begin() + static_cast<std::ptrdiff_t>(end));
      const SweepResult result = RunSweep(simulation, part, options);
      const std::size_t skip = begin == 0 ? 0 : 1;
      for (std::size_t i = skip; i < result.points.size(); ++i) {
        merged.points.push_back(result.points[i]);
      }
      for (double f_hz : result.resonances_hz) AddResonance(merged.resonances_hz, f_hz);
      for (double f_hz : result.transmitter_resonances_hz) {
        AddResonance(merged.transmitter_resonances_hz, f_hz);
      }
      if (first || result.min_swr < merged.min_swr) {
        merged.min_swr = result.min_swr;
        merged.min_swr_frequency_hz = result.min_swr_frequency_hz;
      }
      if (first) {
        merged.z0_ohm = result.z0_ohm;
        merged.unknowns = result.unknowns;
      }
      merged.threads_used = std::max(first ? 0 : merged.threads_used, result.threads_used);
      merged.elapsed_s += result.elapsed_s;
      merged.matrix_fills += result.matrix_fills;
      merged.interpolated_points += result.interpolated_points;
      merged.projected_points += result.projected_points;
      first = false;
      done += static_cast<int>(end - begin);
      begin = end;
      if (progress) progress(done, total);
    }
  }
  std::sort(merged.resonances_hz.begin(), merged.resonances_hz.end());
  std::sort(merged.transmitter_resonances_hz.begin(), merged.transmitter_resonances_hz.end());
  merged.stress_peaks = SweepStressPeaks(merged.points);
  return merged;
}

}  // namespace wirefield
