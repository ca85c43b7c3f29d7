// API: the discretisation estimate of the feed impedances. The model is meshed again with half
// and a quarter of the segments on every wire, solved at the same frequency, and the three feed
// impedances give Richardson's extrapolation with the observed order, in the form of Roache's
// grid convergence index (P. J. Roache, "Quantification of uncertainty in computational fluid
// dynamics", Annu. Rev. Fluid Mech. 29, 1997). Method and limits: docs/numerics.md, "Mesh
// error estimate".
#include <fmt/format.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <stdexcept>
#include <string>
#include <vector>

#include "api/simulation_access.hpp"
#include "wirefield/simulation.hpp"

namespace wirefield {
namespace {

// The observed order is trusted inside this range (the thin-wire feed impedance converges at
// about first to second order in the segment length, docs/numerics.md); outside it the meshes
// are not in the asymptotic range and the conservative fallback applies.
constexpr double kMinTrustedOrder = 0.5;
constexpr double kMaxTrustedOrder = 4.0;
// Roache's safety factors: 1.25 with an observed order from three meshes, 3 when the order is
// not observed (Roache 1997, section 3.3).
constexpr double kSafetyObserved = 1.25;
constexpr double kSafetyAssumed = 3.0;
// The order assumed in the fallback: first order.
constexpr double kAssumedOrder = 1.0;
// An estimate above this share of |Z| gets a warning.
constexpr double kWarnShare = 0.02;

// Segments of a wire on a mesh `halvings` times coarser: at least 2, never more than it has.
int CoarserCount(int used, int halvings) {
  const int scaled = (used + (1 << halvings) - 1) >> halvings;
  return std::min(used, std::max(2, scaled));
}

struct Level {
  int segments = 0;
  std::vector<Complex> impedance_ohm;
};

// Solves the model with every wire's segment count divided by 2^halvings.
Level SolveCoarser(const Simulation& simulation, double frequency_hz, int halvings,
                   int fill_threads) {
  Model model = simulation.model();
  const std::vector<WireMeshInfo>& wires = simulation.wire_mesh();
  for (size_t w = 0; w < model.wires.size(); ++w) {
    model.wires[w].segments = CoarserCount(wires[w].segments_used, halvings);
  }
  SimulationOptions options = SimulationAccess::Options(simulation);
  options.fill_threads = fill_threads;
  const Simulation coarse(std::move(model), options);
  const SolveResult r = coarse.Solve(frequency_hz, fill_threads);
  Level level;
  level.segments = r.segments;
  for (const FeedResult& feed : r.feeds) level.impedance_ohm.push_back(feed.impedance_ohm);
  return level;
}

// Richardson / grid convergence index for one feed from the fine, half and quarter meshes;
// r1, r2: the refinement ratios (fine / half, half / quarter segment counts).
FeedMeshError Extrapolate(Complex fine, Complex half, Complex quarter, double r1, double r2) {
  FeedMeshError e;
  e.half_mesh_impedance_ohm = half;
  e.quarter_mesh_impedance_ohm = quarter;
  const double d1 = std::abs(fine - half);
  const double d2 = std::abs(half - quarter);
  const double fallback = kSafetyAssumed * d1 / (std::pow(r1, kAssumedOrder) - 1.0);
  if (d1 > 0.0 && d2 > 0.0) {
    e.observed_order = std::log(d2 / d1) / std::log(std::sqrt(r1 * r2));
  }
  e.asymptotic = e.observed_order >= kMinTrustedOrder && e.observed_order <= kMaxTrustedOrder;
  e.error_ohm =
      e.asymptotic ? kSafetyObserved * d1 / (std::pow(r1, e.observed_order) - 1.0) : fallback;
  // Never below the change from the half mesh (what first order gives): the delta-gap feed's
  // reactance converges ever more slowly as the segments shrink (measured on a half-wave
  // dipole of radius 0.1 mm at a 1 m wavelength: observed orders 2.1, 1.7, 1.2, 0.8 from 20 to
  // 160 segments, docs/numerics.md), so a high order seen on coarse meshes does not last.
  e.error_ohm = std::max(e.error_ohm, d1);
  return e;
}

std::string WireOfFeed(const Model& model, size_t feed) {
  return feed < model.feeds.size() ? model.feeds[feed].at.wire : std::string();
}

}  // namespace

void EstimateMeshError(const Simulation& simulation, SolveResult* result, int fill_threads) {
  const auto t0 = std::chrono::steady_clock::now();
  const Model& model = simulation.model();
  MeshEstimate estimate;
  estimate.segments = result->segments;
  bool any_halved = false;
  for (const WireMeshInfo& wire : simulation.wire_mesh()) {
    if (CoarserCount(wire.segments_used, 1) < wire.segments_used) {
      any_halved = true;
    } else {
      estimate.notes.push_back(fmt::format(
          "wire '{}' has {} segment{}, too few to halve; the estimate leaves out its own "
          "discretisation",
          wire.name, wire.segments_used, wire.segments_used == 1 ? "" : "s"));
    }
  }
  const auto finish = [&] {
    estimate.time_s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    result->mesh_estimate = std::move(estimate);
  };
  if (!any_halved) {
    estimate.notes.push_back("no wire can be made coarser: no mesh estimate");
    finish();
    return;
  }
  Level half, quarter;
  try {
    half = SolveCoarser(simulation, result->frequency_hz, 1, fill_threads);
    quarter = SolveCoarser(simulation, result->frequency_hz, 2, fill_threads);
  } catch (const std::runtime_error& error) {
    estimate.notes.push_back(
        fmt::format("a coarser mesh could not be solved ({}): no mesh estimate", error.what()));
    finish();
    return;
  }
  estimate.half_segments = half.segments;
  estimate.quarter_segments = quarter.segments;
  const double r1 = static_cast<double>(result->segments) / half.segments;
  const double r2 = static_cast<double>(half.segments) / quarter.segments;
  for (size_t f = 0; f < result->feeds.size(); ++f) {
    FeedResult& feed = result->feeds[f];
    FeedMeshError e =
        Extrapolate(feed.impedance_ohm, half.impedance_ohm[f], quarter.impedance_ohm[f], r1, r2);
    if (!e.asymptotic) {
      estimate.notes.push_back(fmt::format(
          "feed '{}': the observed order {:.2g} is outside {}..{} (the meshes are not yet in "
          "the asymptotic range): the estimate is {} times the change from half the segments",
          feed.name, e.observed_order, kMinTrustedOrder, kMaxTrustedOrder,
          kSafetyAssumed / (std::pow(r1, kAssumedOrder) - 1.0)));
    }
    const double magnitude = std::abs(feed.impedance_ohm);
    if (e.error_ohm > kWarnShare * magnitude) {
      const std::string wire = WireOfFeed(model, f);
      int used = 0;
      for (const WireMeshInfo& info : simulation.wire_mesh()) {
        if (info.name == wire) used = info.segments_used;
      }
      estimate.warnings.push_back(
          {model.feeds[f].location,
           fmt::format("feed '{}': the mesh may put its impedance {:.3g} ohm ({:.1f}% of |Z|) "
                       "from the converged value: give wire '{}' more segments (`segments {}` "
                       "instead of {}), and the wires near the feed too",
                       feed.name, e.error_ohm, 100.0 * e.error_ohm / magnitude, wire,
                       std::max(2 * used, 10), used)});
    }
    feed.mesh_error_ohm = e.error_ohm;
    estimate.feeds.push_back(e);
  }
  finish();
}

FeedMeshEstimateAt EstimateFirstFeedAt(const Simulation& simulation, double frequency_hz,
                                       const std::string& label, int fill_threads) {
  SolveResult solved = simulation.Solve(frequency_hz, fill_threads);
  EstimateMeshError(simulation, &solved, fill_threads);
  FeedMeshEstimateAt out;
  out.label = label;
  out.frequency_hz = frequency_hz;
  out.z_ohm = solved.feeds.front().impedance_ohm;
  out.mesh_error_ohm = solved.feeds.front().mesh_error_ohm;
  out.notes = solved.mesh_estimate->notes;
  out.warnings = solved.mesh_estimate->warnings;
  return out;
}

}  // namespace wirefield
