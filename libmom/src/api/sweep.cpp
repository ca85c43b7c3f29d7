// API: frequency sweeps. Solves one Simulation (one mesh) at many frequencies on worker
// threads, then summarises the first feed at the transmitter: resonances (zero crossings of
// the reactance, interpolated), the minimum SWR, and SWR bandwidths.
#include "wirefield/sweep.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <atomic>
#include <chrono>
#include <cmath>
#include <exception>
#include <mutex>
#include <thread>

#include "solve/blas_threads.hpp"

namespace wirefield {

std::vector<double> FrequencyRange(double from_hz, double to_hz, double step_hz) {
  if (!(from_hz > 0.0) || !(to_hz >= from_hz) || !(step_hz > 0.0) || !std::isfinite(to_hz)) {
    throw InputError({"--from/--to/--step", 0, 0},
                     fmt::format("a sweep needs 0 < from <= to and a positive step; got from "
                                 "{} Hz, to {} Hz, step {} Hz",
                                 from_hz, to_hz, step_hz));
  }
  const double count = std::floor((to_hz - from_hz) / step_hz + 1e-9) + 1.0;
  if (count > 100000) {
    throw InputError({"--step", 0, 0},
                     fmt::format("the sweep would have {:.0f} points (at most 100000): use a "
                                 "larger step",
                                 count));
  }
  std::vector<double> f;
  for (int i = 0; i < static_cast<int>(count); ++i) f.push_back(from_hz + i * step_hz);
  return f;
}

std::vector<double> FrequencyPoints(double from_hz, double to_hz, int points) {
  if (!(from_hz > 0.0) || !(to_hz > from_hz) || points < 2 || points > 100000 ||
      !std::isfinite(to_hz)) {
    throw InputError({"--points", 0, 0},
                     fmt::format("a sweep needs 0 < from < to and 2..100000 points; got from "
                                 "{} Hz, to {} Hz, {} points",
                                 from_hz, to_hz, points));
  }
  std::vector<double> f;
  for (int i = 0; i < points; ++i) f.push_back(from_hz + (to_hz - from_hz) * i / (points - 1));
  return f;
}

SweepResult RunSweep(const Simulation& simulation, const std::vector<double>& frequencies_hz,
                     const SweepOptions& options) {
  if (frequencies_hz.empty()) throw InputError({"sweep", 0, 0}, "the sweep has no frequencies");
  for (double f : frequencies_hz) {
    if (!(f > 0.0) || !std::isfinite(f)) {
      throw InputError({"sweep", 0, 0}, fmt::format("sweep frequency {} Hz is not positive", f));
    }
  }
  const auto start = std::chrono::steady_clock::now();
  SweepResult out;
  out.unknowns = simulation.unknowns();
  out.points.resize(frequencies_hz.size());
  const int hardware = std::max(1u, std::thread::hardware_concurrency());
  const int threads = std::clamp(options.threads > 0 ? options.threads : hardware, 1,
                                 static_cast<int>(frequencies_hz.size()));
  out.threads_used = threads;

  // Workers take the next frequency from a shared counter; the first error stops them all.
  std::atomic<size_t> next{0};
  std::atomic<bool> failed{false};
  std::exception_ptr error;
  std::mutex error_mutex;
  auto work = [&] {
    while (!failed) {
      const size_t i = next++;
      if (i >= frequencies_hz.size()) return;
      try {
        // One fill thread per worker when the workers share the cores; a single worker fills
        // as the Simulation's options say (a batch running rows in parallel asks for one).
        const SolveResult r = threads > 1 ? simulation.Solve(frequencies_hz[i], 1)
                                          : simulation.Solve(frequencies_hz[i]);
        const FeedResult& feed = r.feeds.at(0);
        SweepPoint& p = out.points[i];
        p.frequency_hz = frequencies_hz[i];
        p.feed_impedance_ohm = feed.impedance_ohm;
        p.transmitter_impedance_ohm = feed.transmitter_impedance_ohm;
        p.swr = feed.swr;
        p.return_loss_db = feed.return_loss_db;
        p.transformer_loss_fraction = feed.transformer_loss_fraction;
        p.line_loss_fraction = feed.line_loss_fraction;
        if (options.stress) p.stress = ComputeStress(simulation.model(), r, *options.stress);
        out.z0_ohm = feed.z0_ohm;
      } catch (...) {
        std::lock_guard<std::mutex> lock(error_mutex);
        if (!error) error = std::current_exception();
        failed = true;
      }
    }
  };
  const solve::SingleThreadedBlas blas_guard;
  std::vector<std::thread> pool;
  for (int t = 1; t < threads; ++t) pool.emplace_back(work);
  work();
  for (std::thread& t : pool) t.join();
  if (error) std::rethrow_exception(error);

  // Summary in frequency order.
  std::vector<const SweepPoint*> sorted;
  for (const SweepPoint& p : out.points) sorted.push_back(&p);
  std::sort(sorted.begin(), sorted.end(), [](const SweepPoint* a, const SweepPoint* b) {
    return a->frequency_hz < b->frequency_hz;
  });
  const SweepPoint* best = sorted.front();
  for (const SweepPoint* p : sorted) {
    if (p->swr < best->swr) best = p;
  }
  out.min_swr = best->swr;
  out.min_swr_frequency_hz = best->frequency_hz;
  for (size_t i = 1; i < sorted.size(); ++i) {
    // The contract: resonances are zero crossings of the feed's own reactance.
    const double x0 = sorted[i - 1]->feed_impedance_ohm.imag();
    const double x1 = sorted[i]->feed_impedance_ohm.imag();
    if ((x0 < 0.0 && x1 >= 0.0) || (x0 > 0.0 && x1 <= 0.0)) {
      // A reactance sign change through a pole (parallel resonance seen through a large |X|)
      // also counts; interpolate linearly either way.
      const double f0 = sorted[i - 1]->frequency_hz, f1 = sorted[i]->frequency_hz;
      out.resonances_hz.push_back(f0 + (f1 - f0) * (-x0) / (x1 - x0));
    }
  }
  out.elapsed_s = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  return out;
}

std::vector<std::pair<double, double>> SwrBandwidths(const SweepResult& sweep, double limit) {
  std::vector<const SweepPoint*> sorted;
  for (const SweepPoint& p : sweep.points) sorted.push_back(&p);
  std::sort(sorted.begin(), sorted.end(), [](const SweepPoint* a, const SweepPoint* b) {
    return a->frequency_hz < b->frequency_hz;
  });
  std::vector<std::pair<double, double>> ranges;
  auto crossing = [&](size_t i) {  // between sorted[i-1] and sorted[i]
    const double s0 = sorted[i - 1]->swr, s1 = sorted[i]->swr;
    const double f0 = sorted[i - 1]->frequency_hz, f1 = sorted[i]->frequency_hz;
    return f0 + (f1 - f0) * (limit - s0) / (s1 - s0);
  };
  bool inside = false;
  double low = 0.0;
  for (size_t i = 0; i < sorted.size(); ++i) {
    const bool ok = sorted[i]->swr <= limit;
    if (ok && !inside) low = i == 0 ? sorted[0]->frequency_hz : crossing(i);
    if (!ok && inside) ranges.emplace_back(low, crossing(i));
    inside = ok;
  }
  if (inside) ranges.emplace_back(low, sorted.back()->frequency_hz);
  return ranges;
}

}  // namespace wirefield
