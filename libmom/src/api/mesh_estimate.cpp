// API: the discretisation estimate of the feed impedances. The model is meshed again with half
// and a quarter of the segments on every wire, solved at the same frequency, and the three feed
// impedances give Richardson's extrapolation with the observed order, in the form of Roache's
// grid convergence index (P. J. Roache, "Quantification of uncertainty in computational fluid
// dynamics", Annu. Rev. Fluid Mech. 29, 1997). Method and limits: docs/numerics.md, "Mesh
// error estimate".
#include <fmt/format.h>

#include <Eigen/Sparse>
#include <algorithm>
#include <chrono>
#include <cmath>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

#include "core/fresh_memory.hpp"
#include "fill/assemble.hpp"
#include "geometry/mesh.hpp"
#include "solve/dense.hpp"
#include "study/pipeline.hpp"
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
  SimulationOptions options = study::Pipeline::Of(simulation).options();
  options.fill_threads = fill_threads;
  const Simulation coarse(std::move(model), options);
  const SolveResult r = coarse.Solve(frequency_hz, fill_threads);
  Level level;
  level.segments = r.segments;
  for (const FeedResult& feed : r.feeds) level.impedance_ohm.push_back(feed.impedance_ohm);
  return level;
}

// The nested coarser meshes: a subset of the fine mesh's nodes on every wire (its ends, feeds,
// loads and bends always kept, else every other node), whose triangle bases are sums of the
// fine ones: P maps coarse basis currents to fine ones. The coarse Galerkin system is then
// P^T Z P I_c = P^T V, from the fine matrix (loads and conductor loss included) without a new
// fill; the coarse currents P I_c give the ports' currents as on the fine mesh.
struct WireNodes {
  int first_segment = 0;
  int segments = 0;
  int first_interior_basis = 0;  // the fine basis of node 1 (interior bases come first)
  std::vector<double> s_m;       // node positions along the wire
  std::vector<bool> required;    // ends, ports, bends
};

// The fine mesh's wires, or an empty list when its bases are not laid out as the mesher does.
std::vector<WireNodes> FineWires(const geometry::Mesh& mesh) {
  std::vector<WireNodes> wires(mesh.wires.size());
  int segment = 0, basis = 0;
  for (size_t w = 0; w < wires.size(); ++w) {
    WireNodes& wire = wires[w];
    wire.first_segment = segment;
    wire.segments = mesh.wires[w].segments_used;
    wire.first_interior_basis = basis;
    wire.s_m.push_back(0.0);
    wire.required.assign(static_cast<size_t>(wire.segments) + 1, false);
    wire.required.front() = wire.required.back() = true;
    for (int k = 0; k < wire.segments; ++k) {
      const geometry::Segment& seg = mesh.segments.at(static_cast<size_t>(segment + k));
      if (seg.wire != static_cast<int>(w)) return {};
      wire.s_m.push_back(wire.s_m.back() + seg.length_m());
      if (k > 0) {
        const geometry::Segment& before = mesh.segments[static_cast<size_t>(segment + k - 1)];
        const geometry::Vec3 a = (before.end - before.start).normalized();
        const geometry::Vec3 b = (seg.end - seg.start).normalized();
        if (a.cross(b).norm() > 1e-9) wire.required[static_cast<size_t>(k)] = true;  // a bend
      }
      if (k > 0) {
        const geometry::Basis& hat = mesh.bases.at(static_cast<size_t>(basis + k - 1));
        if (hat.piece_count != 2 || hat.pieces[0].segment != segment + k - 1 ||
            !hat.pieces[0].node_at_end || hat.pieces[1].segment != segment + k) {
          return {};
        }
      }
    }
    segment += wire.segments;
    basis += std::max(0, wire.segments - 1);
  }
  // The nodes of the feeds' and loads' gaps.
  for (const std::vector<geometry::Port>* ports : {&mesh.feed_ports, &mesh.load_ports}) {
    for (const geometry::Port& port : *ports) {
      for (const auto& [b, sign] : port.bases) {
        for (WireNodes& wire : wires) {
          const int k = b - wire.first_interior_basis + 1;
          if (k >= 1 && k < wire.segments) wire.required[static_cast<size_t>(k)] = true;
        }
      }
    }
  }
  return wires;
}

// Every other node of `candidates` (indices into the wire's nodes), keeping the required ones.
std::vector<int> EveryOther(const WireNodes& wire, const std::vector<int>& candidates) {
  std::vector<int> kept{candidates.front()};
  size_t last = 0;
  for (size_t i = 1; i < candidates.size(); ++i) {
    if (wire.required[static_cast<size_t>(candidates[i])] || i - last >= 2 ||
        i + 1 == candidates.size()) {
      kept.push_back(candidates[i]);
      last = i;
    }
  }
  return kept;
}

// P (fine bases x coarse bases) for the kept nodes of every wire.
Eigen::SparseMatrix<double> Prolongation(const geometry::Mesh& mesh,
                                         const std::vector<WireNodes>& wires,
                                         const std::vector<std::vector<int>>& kept) {
  std::vector<Eigen::Triplet<double>> entries;
  int column = 0;
  for (size_t w = 0; w < wires.size(); ++w) {
    const WireNodes& wire = wires[w];
    const std::vector<int>& nodes = kept[w];
    for (size_t i = 1; i + 1 < nodes.size(); ++i) {
      const int before = nodes[i - 1], at = nodes[i], after = nodes[i + 1];
      for (int m = before + 1; m < after; ++m) {
        const double s = wire.s_m[static_cast<size_t>(m)];
        const double weight =
            m <= at
                ? (s - wire.s_m[static_cast<size_t>(before)]) /
                      (wire.s_m[static_cast<size_t>(at)] - wire.s_m[static_cast<size_t>(before)])
                : (wire.s_m[static_cast<size_t>(after)] - s) /
                      (wire.s_m[static_cast<size_t>(after)] - wire.s_m[static_cast<size_t>(at)]);
        entries.emplace_back(wire.first_interior_basis + m - 1, column, weight);
      }
      ++column;
    }
  }
  // Junction and ground bases: the fine one, and its ramp over the coarse end segment.
  const int interior =
      wires.empty() ? 0
                    : wires.back().first_interior_basis + std::max(0, wires.back().segments - 1);
  for (int b = interior; b < static_cast<int>(mesh.bases.size()); ++b) {
    entries.emplace_back(b, column, 1.0);
    const geometry::Basis& basis = mesh.bases[static_cast<size_t>(b)];
    for (int p = 0; p < basis.piece_count; ++p) {
      const geometry::Piece& piece = basis.pieces[static_cast<size_t>(p)];
      const size_t w = static_cast<size_t>(mesh.segments[static_cast<size_t>(piece.segment)].wire);
      const WireNodes& wire = wires[w];
      const std::vector<int>& nodes = kept[w];
      const int joint = piece.node_at_end ? wire.segments : 0;
      const int near = piece.node_at_end ? nodes[nodes.size() - 2] : nodes[1];
      const double span_m =
          wire.s_m[static_cast<size_t>(joint)] - wire.s_m[static_cast<size_t>(near)];
      for (int m = std::min(joint, near) + 1; m < std::max(joint, near); ++m) {
        const double fraction =
            (wire.s_m[static_cast<size_t>(m)] - wire.s_m[static_cast<size_t>(near)]) / span_m;
        entries.emplace_back(wire.first_interior_basis + m - 1, column,
                             piece.DirectionAtNode() * fraction);
      }
    }
    ++column;
  }
  Eigen::SparseMatrix<double> p(static_cast<Eigen::Index>(mesh.bases.size()), column);
  p.setFromTriplets(entries.begin(), entries.end());
  return p;
}

// Additions to a matrix by column: for column n, the (row m, value) pairs of Z(m, n) += value
// in the order they are made.
using ColumnAdditions = std::vector<std::vector<std::pair<int, Complex>>>;

// P^T (A + additions) P, column by column: a few scaled columns of A (in memory order, with
// their additions applied to a copy in the order the fine solve applies them, so the sums are
// those of the loaded matrix to the last bit) into one work column, then the sparse sums of it.
// No intermediate of A's size; the result's fresh memory is mapped in one go
// (core/fresh_memory.hpp).
Eigen::MatrixXcd Restrict(const Eigen::MatrixXcd& a, const ColumnAdditions& additions,
                          const Eigen::SparseMatrix<double>& p) {
  const Eigen::Index n = p.cols();
  Eigen::MatrixXcd out(n, n);
  core::PrepareFreshMemory(out.data(), static_cast<size_t>(out.size()) * sizeof(Complex));
  Eigen::VectorXcd column(a.rows()), loaded(a.rows());
  for (Eigen::Index c = 0; c < n; ++c) {
    column.setZero();
    for (Eigen::SparseMatrix<double>::InnerIterator it(p, c); it; ++it) {
      const std::vector<std::pair<int, Complex>>& added = additions[static_cast<size_t>(it.row())];
      if (added.empty()) {
        column += it.value() * a.col(it.row());
        continue;
      }
      loaded = a.col(it.row());
      for (const auto& [m, value] : added) loaded(m) += value;
      column += it.value() * loaded;
    }
    for (Eigen::Index r = 0; r < n; ++r) {
      Complex sum = 0.0;
      for (Eigen::SparseMatrix<double>::InnerIterator it(p, r); it; ++it) {
        sum += it.value() * column(it.row());
      }
      out(r, c) = sum;
    }
  }
  return out;
}

Complex PortCurrent(const geometry::Port& port, const Eigen::VectorXcd& currents) {
  Complex i = 0.0;
  for (const auto& [b, sign] : port.bases) i += sign * currents(b);
  return i;
}

// The feed impedances of the coarse Galerkin system zc = P^T Z P (consumed), P^T V.
Level SolveRestricted(const geometry::Mesh& mesh, const Model& model, Eigen::MatrixXcd zc,
                      const Eigen::VectorXcd& v, const Eigen::SparseMatrix<double>& p,
                      int segments) {
  const Eigen::SparseMatrix<Complex> pc = p.cast<Complex>();
  const Eigen::VectorXcd vc = pc.transpose() * v;
  const solve::DenseSolution sol = solve::SolveDense(std::move(zc), vc);
  const Eigen::VectorXcd fine = pc * sol.currents;
  Level level;
  level.segments = segments;
  for (size_t f = 0; f < mesh.feed_ports.size(); ++f) {
    const Complex i = PortCurrent(mesh.feed_ports[f], fine);
    if (std::abs(i) == 0.0) throw ComputationError("a coarser mesh carries no feed current");
    level.impedance_ohm.push_back(model.feeds[f].voltage_v / i);
  }
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

// The two coarser levels, and what limits them.
struct Levels {
  bool any_halved = false;
  Level half, quarter;
  std::vector<std::string> notes;
};

void NoteUnhalved(const std::string& wire, int segments, std::vector<std::string>* notes) {
  notes->push_back(
      fmt::format("wire '{}' has {} segment{}, too few to halve; the estimate leaves out its own "
                  "discretisation",
                  wire, segments, segments == 1 ? "" : "s"));
}

// The nested coarser systems, restricted from the fine matrix before its solve consumes it.
struct NestedSystems {
  bool nested = false;  // false: the mesh's bases are not laid out as the mesher lays them
  Levels levels;        // any_halved and notes; the impedances come from SolveNested
  int half_segments = 0, quarter_segments = 0;
  Eigen::SparseMatrix<double> p_half, p_quarter;  // fine bases from half / quarter bases
  Eigen::MatrixXcd z_half, z_quarter;             // P^T (Z + loads + loss) P
};

// The nested systems from the fine matrix z before its loads and wire loss are added (they are
// applied column by column as the restriction reads them): no copy of the fine matrix.
NestedSystems RestrictNested(const Simulation& simulation, const Eigen::MatrixXcd& z,
                             double frequency_hz) {
  NestedSystems out;
  const geometry::Mesh& mesh = study::Pipeline::Of(simulation).mesh();
  const std::vector<WireNodes> wires = FineWires(mesh);
  if (wires.empty()) return out;
  out.nested = true;
  std::vector<std::vector<int>> half(wires.size()), quarter(wires.size());
  int fine_segments = 0;
  for (size_t w = 0; w < wires.size(); ++w) {
    std::vector<int> all(static_cast<size_t>(wires[w].segments) + 1);
    for (size_t k = 0; k < all.size(); ++k) all[k] = static_cast<int>(k);
    half[w] = EveryOther(wires[w], all);
    quarter[w] = EveryOther(wires[w], half[w]);
    fine_segments += wires[w].segments;
    out.half_segments += static_cast<int>(half[w].size()) - 1;
    out.quarter_segments += static_cast<int>(quarter[w].size()) - 1;
    if (static_cast<int>(half[w].size()) - 1 == wires[w].segments) {
      NoteUnhalved(mesh.wires[w].name, wires[w].segments, &out.levels.notes);
    }
  }
  out.levels.any_halved = out.half_segments < fine_segments;
  if (!out.levels.any_halved) return out;
  const Model& model = simulation.model();
  out.p_half = Prolongation(mesh, wires, half);
  out.p_quarter = Prolongation(mesh, wires, quarter);
  ColumnAdditions additions(static_cast<size_t>(z.cols()));
  const fill::MatrixAddition add = [&](int m, int n, Complex value) {
    additions[static_cast<size_t>(n)].emplace_back(m, value);
  };
  fill::AddLoads(mesh, model, frequency_hz, add);
  fill::AddConductorLoss(mesh, model, frequency_hz, add);
  out.z_half = Restrict(z, additions, out.p_half);
  out.z_quarter = Restrict(z, additions, out.p_quarter);
  return out;
}

// The nested levels' feed impedances (their matrices consumed).
Levels SolveNested(const Simulation& simulation, NestedSystems* systems) {
  Levels out = std::move(systems->levels);
  if (!out.any_halved) return out;
  const geometry::Mesh& mesh = study::Pipeline::Of(simulation).mesh();
  const Model& model = simulation.model();
  const Eigen::VectorXcd v = fill::AssembleExcitation(mesh, model);
  out.half = SolveRestricted(mesh, model, std::move(systems->z_half), v, systems->p_half,
                             systems->half_segments);
  out.quarter = SolveRestricted(mesh, model, std::move(systems->z_quarter), v, systems->p_quarter,
                                systems->quarter_segments);
  return out;
}

// The levels from the model meshed again with fewer segments (and filled anew).
Levels RemeshedLevels(const Simulation& simulation, double frequency_hz, int fill_threads) {
  Levels out;
  for (const WireMeshInfo& wire : simulation.wire_mesh()) {
    if (CoarserCount(wire.segments_used, 1) < wire.segments_used) {
      out.any_halved = true;
    } else {
      NoteUnhalved(wire.name, wire.segments_used, &out.notes);
    }
  }
  if (!out.any_halved) return out;
  out.half = SolveCoarser(simulation, frequency_hz, 1, fill_threads);
  out.quarter = SolveCoarser(simulation, frequency_hz, 2, fill_threads);
  return out;
}

// The estimate of `result` from its coarser levels (a thrown level: no estimate, said why).
// prior_s: time spent on the estimate before (added to its reported time).
template <typename MakeLevels>
void Estimate(const Simulation& simulation, SolveResult* result, MakeLevels make_levels,
              double prior_s = 0.0) {
  const auto t0 = std::chrono::steady_clock::now();
  const Model& model = simulation.model();
  MeshEstimate estimate;
  estimate.segments = result->segments;
  const auto finish = [&] {
    estimate.time_s =
        prior_s + std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    result->mesh_estimate = std::move(estimate);
  };
  Levels levels;
  try {
    levels = make_levels();
  } catch (const std::runtime_error& error) {
    estimate.notes.push_back(
        fmt::format("a coarser mesh could not be solved ({}): no mesh estimate", error.what()));
    finish();
    return;
  }
  estimate.notes = levels.notes;
  if (!levels.any_halved) {
    estimate.notes.push_back("no wire can be made coarser: no mesh estimate");
    finish();
    return;
  }
  const Level& half = levels.half;
  const Level& quarter = levels.quarter;
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
                       "instead of {}), and the wires joined at the feed too",
                       feed.name, e.error_ohm, 100.0 * e.error_ohm / magnitude, wire,
                       std::max(2 * used, 10), used)});
    }
    feed.mesh_error_ohm = e.error_ohm;
    estimate.feeds.push_back(e);
  }
  finish();
}

// The nested levels are restricted from a fine matrix at most this large (they keep about
// 5/16 of its memory more); above, the model is meshed again.
constexpr double kMaxKeptMatrixBytes = 2.0 * 1024 * 1024 * 1024;

}  // namespace

void EstimateMeshError(const Simulation& simulation, SolveResult* result, int fill_threads) {
  Estimate(simulation, result,
           [&] { return RemeshedLevels(simulation, result->frequency_hz, fill_threads); });
}

SolveResult SolveWithMeshEstimate(const Simulation& simulation, double frequency_hz,
                                  int fill_threads) {
  const geometry::Mesh& mesh = study::Pipeline::Of(simulation).mesh();
  if (!(frequency_hz > 0.0) || !std::isfinite(frequency_hz) ||
      geometry::MatrixBytes(static_cast<long long>(mesh.bases.size())) > kMaxKeptMatrixBytes) {
    SolveResult result = simulation.Solve(frequency_hz, fill_threads);  // throws for a bad one
    EstimateMeshError(simulation, &result, fill_threads);
    return result;
  }
  const study::Pipeline& pipeline = study::Pipeline::Of(simulation);
  const int threads = fill_threads > 0 ? fill_threads : pipeline.FillThreads();
  const auto t0 = std::chrono::steady_clock::now();
  Eigen::MatrixXcd z = pipeline.Fill(frequency_hz, threads);
  const double fill_time_s =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  const auto t1 = std::chrono::steady_clock::now();
  NestedSystems nested = RestrictNested(simulation, z, frequency_hz);
  const double restrict_s =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - t1).count();
  SolveResult result = pipeline.SolveFilled(frequency_hz, std::move(z), fill_time_s);
  Estimate(
      simulation, &result,
      [&] {
        if (nested.nested) return SolveNested(simulation, &nested);
        return RemeshedLevels(simulation, frequency_hz, fill_threads);
      },
      restrict_s);
  return result;
}

FeedMeshEstimateAt EstimateFirstFeedAt(const Simulation& simulation, double frequency_hz,
                                       const std::string& label, int fill_threads) {
  const SolveResult solved = SolveWithMeshEstimate(simulation, frequency_hz, fill_threads);
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
