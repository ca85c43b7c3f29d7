// Study layer: frequency sweeps. Solves one Simulation's pipeline (one mesh) at many
// frequencies on worker threads, then summarises the first feed: resonances (zero crossings of
// the reactance at its terminals and at the transmitter, interpolated), the minimum SWR at the
// transmitter, SWR bandwidths, and the highest stresses of a --power sweep.
#include "wirefield/sweep.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <atomic>
#include <chrono>
#include <cmath>
#include <exception>
#include <functional>

#include "core/parallel.hpp"
#include "fill/interpolate.hpp"
#include "solve/blas_threads.hpp"
#include "solve/reduced.hpp"
#include "study/pipeline.hpp"

namespace wirefield {

std::vector<double> FrequencyRange(double from_hz, double to_hz, double step_hz) {
  if (!(from_hz > 0.0) || !(to_hz >= from_hz) || !(step_hz > 0.0) || !std::isfinite(to_hz)) {
    throw InputError({"from_hz/to_hz/step_hz", 0, 0},
                     fmt::format("a sweep needs 0 < from <= to and a positive step; got from "
                                 "{} Hz, to {} Hz, step {} Hz",
                                 from_hz, to_hz, step_hz));
  }
  const double count = std::floor((to_hz - from_hz) / step_hz + 1e-9) + 1.0;
  if (count > 100000) {
    throw InputError({"step_hz", 0, 0},
                     fmt::format("the sweep would have {:.0f} points (at most 100000): use a "
                                 "larger step",
                                 count));
  }
  std::vector<double> f;
  f.reserve(static_cast<size_t>(count));
  for (int i = 0; i < static_cast<int>(count); ++i) f.push_back(from_hz + i * step_hz);
  return f;
}

std::vector<double> FrequencyPoints(double from_hz, double to_hz, int points) {
  if (!(from_hz > 0.0) || !(to_hz > from_hz) || points < 2 || points > 100000 ||
      !std::isfinite(to_hz)) {
    throw InputError({"points", 0, 0},
                     fmt::format("a sweep needs 0 < from < to and 2..100000 points; got from "
                                 "{} Hz, to {} Hz, {} points",
                                 from_hz, to_hz, points));
  }
  std::vector<double> f;
  f.reserve(static_cast<size_t>(points));
  for (int i = 0; i < points; ++i) f.push_back(from_hz + (to_hz - from_hz) * i / (points - 1));
  return f;
}

namespace {

// Matrix interpolation (docs/numerics.md, "Interpolation in frequency"). Each window spans at
// most this fraction of its lowest frequency; its three anchors are its ends and its middle.
// Chosen from the measured error (docs/performance.md, "Interpolation error"): the worst feed
// impedance error of a 10% window was 5e-6 over the tested models, 400 times below 0.2%, and
// it grows as the cube of the width.
constexpr double kWindowFraction = 0.10;
// Reduced solve (solve/reduced.hpp): a window of at least kMinPointsForReducedSolve points
// solves kSnapshots of them densely and the others, where the residual allows, in the span of
// those currents. The residual bound keeps the currents'
// error (at most the condition number times the residual) far below the interpolation's
// own; measured against the exact sweep in tests/validation/interpolation_validation_test.cpp.
constexpr size_t kSnapshots = 8;
constexpr size_t kMinPointsForReducedSolve = 3 * kSnapshots;
constexpr double kReducedMaxRelativeResidual = 1e-8;
// A window with fewer points than this is solved exactly: three anchor fills would not pay.
constexpr size_t kMinPointsPerWindow = 8;
// The anchors of a window (3 matrices, 6 over a ground) may take at most this much memory;
// beyond it the sweep fills exactly at every point.
constexpr double kMaxAnchorBytes = 1024.0 * 1024.0 * 1024.0;

// The sweep's points split into interpolation windows (indices into the frequencies, sorted
// by frequency) and points solved exactly.
struct SweepPlan {
  std::vector<std::vector<size_t>> windows;
  std::vector<size_t> exact;
};

SweepPlan PlanSweep(const std::vector<double>& frequencies_hz, bool interpolate) {
  SweepPlan plan;
  std::vector<size_t> order(frequencies_hz.size());
  for (size_t i = 0; i < order.size(); ++i) order[i] = i;
  if (!interpolate) {
    plan.exact = order;
    return plan;
  }
  std::sort(order.begin(), order.end(),
            [&](size_t a, size_t b) { return frequencies_hz[a] < frequencies_hz[b]; });
  const double low_hz = frequencies_hz[order.front()];
  const double high_hz = frequencies_hz[order.back()];
  // Windows of equal width in log f, as few as keep each within kWindowFraction.
  const double ratio = std::log(high_hz / low_hz);
  const int count =
      std::max(1, static_cast<int>(std::ceil(ratio / std::log1p(kWindowFraction) - 1e-9)));
  std::vector<std::vector<size_t>> groups(static_cast<size_t>(count));
  for (size_t i : order) {
    const double position = ratio > 0.0 ? std::log(frequencies_hz[i] / low_hz) / ratio : 0.0;
    const int w = std::clamp(static_cast<int>(position * count), 0, count - 1);
    groups[static_cast<size_t>(w)].push_back(i);
  }
  for (std::vector<size_t>& group : groups) {
    if (group.empty()) continue;
    const bool spread = frequencies_hz[group.back()] > frequencies_hz[group.front()];
    if (group.size() >= kMinPointsPerWindow && spread) {
      plan.windows.push_back(std::move(group));
    } else {
      plan.exact.insert(plan.exact.end(), group.begin(), group.end());
    }
  }
  return plan;
}

// The frequencies where reactance(point) changes sign between neighbours of `sorted` (points
// in frequency order), interpolated linearly. A sign change through a pole (a parallel
// resonance seen through a large |X|) also counts.
std::vector<double> ReactanceZeros(const std::vector<const SweepPoint*>& sorted,
                                   const std::function<double(const SweepPoint&)>& reactance) {
  std::vector<double> zeros_hz;
  for (size_t i = 1; i < sorted.size(); ++i) {
    const double x0 = reactance(*sorted[i - 1]);
    const double x1 = reactance(*sorted[i]);
    if ((x0 < 0.0 && x1 >= 0.0) || (x0 > 0.0 && x1 <= 0.0)) {
      const double f0 = sorted[i - 1]->frequency_hz, f1 = sorted[i]->frequency_hz;
      zeros_hz.push_back(f0 + (f1 - f0) * (-x0) / (x1 - x0));
    }
  }
  return zeros_hz;
}

}  // namespace

void SweepOptions::Validate() const {
  if (threads < 0) {
    throw InputError(
        {"threads", 1, 1},
        fmt::format("threads must be 0 (one per core) or a positive count; got {}", threads));
  }
  if (stress) stress->Validate();
}

SweepResult RunSweep(const Simulation& simulation, const std::vector<double>& frequencies_hz,
                     const SweepOptions& options) {
  options.Validate();
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
  const int threads =
      std::clamp(core::ResolveThreads(options.threads), 1, static_cast<int>(frequencies_hz.size()));
  out.threads_used = threads;

  auto record = [&](size_t i, const SolveResult& r) {
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
  };

  const study::Pipeline& pipeline = study::Pipeline::Of(simulation);
  const geometry::Mesh& mesh = pipeline.mesh();
  const bool may_interpolate =
      options.interpolate && fill::MatrixInterpolator::AnchorBytes(mesh) <= kMaxAnchorBytes;
  const SweepPlan plan = PlanSweep(frequencies_hz, may_interpolate);
  // A single worker fills as the Simulation's options say (a batch running rows in parallel
  // asks for one thread); several workers share the cores, one fill thread each.
  const int fill_threads = threads > 1 ? threads : pipeline.FillThreads();
  const solve::SingleThreadedBlas blas_guard;
  for (const std::vector<size_t>& window : plan.windows) {
    const double low_hz = frequencies_hz[window.front()];
    const double high_hz = frequencies_hz[window.back()];
    const fill::MatrixInterpolator interpolator(
        mesh, pipeline.near_field(), {low_hz, 0.5 * (low_hz + high_hz), high_hz}, fill_threads);
    out.matrix_fills += 3;
    // Dense solves at kSnapshots points spread over the window; every other point then first
    // tries the currents in the span of theirs (solve::SolveReduced), which costs a product of
    // Z with kSnapshots vectors instead of a factorisation. The snapshots do not
    // depend on the threads, so neither does any result.
    auto solve_point = [&](size_t w, const solve::ReducedSpace* reduced, Eigen::VectorXcd* currents,
                           bool* projected) {
      const size_t i = window[w];
      const auto t0 = std::chrono::steady_clock::now();
      Eigen::MatrixXcd z;
      interpolator.At(frequencies_hz[i], &z);
      const double fill_s =
          std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
      return pipeline.SolveFilled(frequencies_hz[i], std::move(z), fill_s, reduced, currents,
                                  projected);
    };
    const size_t snapshots = window.size() >= kMinPointsForReducedSolve ? kSnapshots : 0;
    std::vector<bool> is_snapshot(window.size(), false);
    std::vector<size_t> snapshot_at;
    for (size_t s = 0; s < snapshots; ++s) {
      snapshot_at.push_back(s * (window.size() - 1) / (snapshots - 1));
      is_snapshot[snapshot_at.back()] = true;
    }
    std::vector<Eigen::VectorXcd> snapshot_currents(snapshots);
    std::vector<double> snapshot_condition(snapshots, 0.0);
    core::ParallelFor(threads, snapshots, [&](size_t s) {
      const SolveResult r = solve_point(snapshot_at[s], nullptr, &snapshot_currents[s], nullptr);
      snapshot_condition[s] = r.condition_number;
      record(window[snapshot_at[s]], r);
    });
    solve::ReducedSpace reduced;
    if (snapshots > 0) {
      reduced = solve::MakeReducedSpace(snapshot_currents, snapshot_condition,
                                        kReducedMaxRelativeResidual);
    }
    std::vector<size_t> rest;
    for (size_t w = 0; w < window.size(); ++w) {
      if (!is_snapshot[w]) rest.push_back(w);
    }
    std::atomic<int> projected_count{0};
    core::ParallelFor(threads, rest.size(), [&](size_t e) {
      bool projected = false;
      record(window[rest[e]],
             solve_point(rest[e], snapshots > 0 ? &reduced : nullptr, nullptr, &projected));
      if (projected) ++projected_count;
    });
    out.projected_points += projected_count;
    out.interpolated_points += static_cast<int>(window.size());
  }
  core::ParallelFor(threads, plan.exact.size(), [&](size_t e) {
    const size_t i = plan.exact[e];
    record(i, threads > 1 ? simulation.Solve(frequencies_hz[i], 1)
                          : simulation.Solve(frequencies_hz[i]));
  });
  out.matrix_fills += static_cast<int>(plan.exact.size());

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
  // The contract: `resonances_hz` are zero crossings of the feed's own reactance.
  out.resonances_hz =
      ReactanceZeros(sorted, [](const SweepPoint& p) { return p.feed_impedance_ohm.imag(); });
  out.transmitter_resonances_hz = ReactanceZeros(
      sorted, [](const SweepPoint& p) { return p.transmitter_impedance_ohm.imag(); });
  out.stress_peaks = SweepStressPeaks(out.points);
  out.elapsed_s = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  return out;
}

std::vector<StressPeak> SweepStressPeaks(const std::vector<SweepPoint>& points) {
  std::vector<StressResult> stress;
  for (const SweepPoint& p : points) {
    if (p.stress) stress.push_back(*p.stress);
  }
  return HighestStress(stress);
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
