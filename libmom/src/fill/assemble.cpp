// Fill stage: assembly of the Galerkin matrix from segment-pair kernel moments.
// Over a ground each source segment also acts through its mirror image, weighted by the
// ground's image weights (exact for a perfect ground, the reflection-coefficient approximation
// for a real one: ground/reflection.hpp).
// Z_mn = j omega mu/(4 pi) int int f_m . f_n G + 1/(j omega eps 4 pi) int int (div f_m)(div f_n) G
// with triangle bases f (docs/numerics.md). Each segment pair's moments are computed once and
// scattered to the bases whose pieces lie on the two segments; Z is symmetric, so only pairs
// i <= j are integrated.
#include "fill/assemble.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <optional>

#include "conductor/coating.hpp"
#include "core/constants.hpp"
#include "core/fresh_memory.hpp"
#include "core/parallel.hpp"
#include "fill/half_space.hpp"
#include "ground/reflection.hpp"

namespace wirefield::fill {
namespace {

struct PieceRef {
  int basis;
  double alpha, beta;
};

// Blocks of observation segments the fill is cut into (at most this many threads help). Fixed,
// so that the order of every sum, and with it the matrix to the last bit, does not depend on
// the thread count. 32 serves the cores of a workstation; more blocks would only keep more
// rows aside (about two rows of n entries per block).
constexpr int kFillBlocks = 32;
// Below this admittance relative to its largest branch, a parallel load counts as open.
constexpr double kOpenRelativeAdmittance = 1e-12;
constexpr double kOpenStandInOhm = 1e12;

// a b by the textbook formula. The operator's C99 Annex G checks for infinite parts (which
// cannot occur here: every factor is finite) cost the fill's inner loop a branch and a call.
inline Complex Multiply(Complex a, Complex b) {
  return {a.real() * b.real() - a.imag() * b.imag(), a.real() * b.imag() + a.imag() * b.real()};
}

// A segment's interaction with itself (or its own image) is symmetric in t and t'; the
// quadrature is not exactly, so average the two mixed moments to keep Z = Z^T to rounding.
void Symmetrize(PairMoments* m) {
  const Complex mixed = 0.5 * (m->m10 + m->m01);
  m->m10 = mixed;
  m->m01 = mixed;
}

// The matrix of the direct pairs, of the image pairs, or of both (their sum), to rounding
// the same for any number of fill threads.
Eigen::MatrixXcd AssembleSelected(const geometry::Mesh& mesh, double frequency_hz,
                                  const NearFieldCache& cache, int fill_threads, bool direct,
                                  bool images, core::Progress* progress = nullptr);

}  // namespace

Complex ChokeImpedance(const LoadSpec& load, double frequency_hz) {
  const ChokeSpec& choke = *load.choke;
  if (choke.points.empty()) {
    const double x =
        2.0 * core::kPi * frequency_hz * choke.turns * choke.turns * choke.al_nh * 1e-9;
    return {choke.q ? x / *choke.q : 0.0, x};
  }
  const std::vector<ChokePoint>& p = choke.points;
  if (p.size() == 1) return {p[0].resistance_ohm, p[0].reactance_ohm};
  if (frequency_hz < p.front().frequency_hz || frequency_hz > p.back().frequency_hz) {
    throw InputError(load.location,
                     fmt::format("load '{}': the choke's impedance is given from {:.6g} to {:.6g} "
                                 "MHz, and the run is at {:.6g} MHz; add a point of its curve "
                                 "at or beyond that frequency",
                                 load.name, p.front().frequency_hz / 1e6,
                                 p.back().frequency_hz / 1e6, frequency_hz / 1e6));
  }
  size_t i = 1;
  while (i + 1 < p.size() && p[i].frequency_hz < frequency_hz) ++i;
  const double t =
      (frequency_hz - p[i - 1].frequency_hz) / (p[i].frequency_hz - p[i - 1].frequency_hz);
  return {p[i - 1].resistance_ohm + t * (p[i].resistance_ohm - p[i - 1].resistance_ohm),
          p[i - 1].reactance_ohm + t * (p[i].reactance_ohm - p[i - 1].reactance_ohm)};
}

Complex LoadImpedance(const LoadSpec& load, double frequency_hz, bool* open) {
  const double w = 2.0 * core::kPi * frequency_hz;
  *open = false;
  if (load.coil) return CoilImpedance(*load.coil, frequency_hz);
  if (load.choke) return ChokeImpedance(load, frequency_hz);
  if (load.topology == LoadTopology::kSeries) {
    Complex z = 0.0;
    if (load.resistance_ohm) z += *load.resistance_ohm;
    if (load.inductance_h) z += Complex(0.0, w * *load.inductance_h);
    if (load.capacitance_f) z += Complex(0.0, -1.0 / (w * *load.capacitance_f));
    return z;
  }
  // Parallel: an element of zero impedance shorts the load.
  if ((load.resistance_ohm && *load.resistance_ohm == 0.0) ||
      (load.inductance_h && *load.inductance_h == 0.0)) {
    return 0.0;
  }
  Complex y = 0.0;
  double scale = 0.0;
  if (load.resistance_ohm) {
    y += 1.0 / *load.resistance_ohm;
    scale = std::max(scale, 1.0 / *load.resistance_ohm);
  }
  if (load.inductance_h) {
    y += Complex(0.0, -1.0 / (w * *load.inductance_h));
    scale = std::max(scale, 1.0 / (w * *load.inductance_h));
  }
  if (load.capacitance_f) {
    y += Complex(0.0, w * *load.capacitance_f);
    scale = std::max(scale, w * *load.capacitance_f);
  }
  if (std::abs(y) <= kOpenRelativeAdmittance * scale) {
    *open = true;
    return kOpenStandInOhm;
  }
  return 1.0 / y;
}

const NearFieldCache::Entry* NearFieldCache::Find(int observation, int source, bool image) const {
  for (const Entry& e : by_observation[observation]) {
    if (e.source == source && e.image == image) return &e;
  }
  return nullptr;
}

NearFieldCache BuildNearFieldCache(const geometry::Mesh& mesh, int threads) {
  const int ns = static_cast<int>(mesh.segments.size());
  const geometry::Vec3 mirror(1.0, 1.0, -1.0);
  NearFieldCache cache;
  cache.by_observation.resize(ns);
  // A pair is near only if its centres lie within both half-lengths plus the longer length
  // (IsNearPair): farther pairs are passed over without a square root. The margin keeps
  // rounding from passing over a pair IsNearPair would take.
  std::vector<geometry::Vec3> centre(ns);
  std::vector<double> length(ns);
  for (int s = 0; s < ns; ++s) {
    centre[s] = 0.5 * (mesh.segments[s].start + mesh.segments[s].end);
    length[s] = mesh.segments[s].length_m();
  }
  auto may_be_near = [&](int i, int j, const geometry::Vec3& centre_j) {
    const double reach = 0.5 * (length[i] + length[j]) + std::max(length[i], length[j]);
    return (centre[i] - centre_j).squaredNorm() <= 1.01 * reach * reach;
  };
  // Row i is written by one task only, so any thread count gives the same cache.
  auto row = [&](std::size_t row_index) {
    const int i = static_cast<int>(row_index);
    const geometry::Segment& si = mesh.segments[i];
    for (int j = i; j < ns; ++j) {
      const geometry::Segment& sj = mesh.segments[j];
      const double radius2 = 0.5 * (si.radius_m * si.radius_m + sj.radius_m * sj.radius_m);
      if (may_be_near(i, j, centre[j]) && IsNearPair(si.start, si.end, sj.start, sj.end)) {
        cache.by_observation[i].push_back(
            {j, false, StaticNearMoments(si.start, si.end, sj.start, sj.end, radius2)});
      }
      if (mesh.ground_images) {
        const geometry::Vec3 img0 = sj.start.cwiseProduct(mirror);
        const geometry::Vec3 img1 = sj.end.cwiseProduct(mirror);
        if (may_be_near(i, j, centre[j].cwiseProduct(mirror)) &&
            IsNearPair(si.start, si.end, img0, img1)) {
          cache.by_observation[i].push_back(
              {j, true, StaticNearMoments(si.start, si.end, img0, img1, radius2)});
        }
      }
    }
  };
  const int used = std::clamp(threads, 1, std::max(1, ns / 64));  // small meshes: one thread
  core::ParallelFor(used, static_cast<std::size_t>(ns), row);
  return cache;
}

Eigen::MatrixXcd AssembleImpedance(const geometry::Mesh& mesh, double frequency_hz) {
  return AssembleImpedance(mesh, frequency_hz, BuildNearFieldCache(mesh));
}

Eigen::MatrixXcd AssembleImpedance(const geometry::Mesh& mesh, double frequency_hz,
                                   const NearFieldCache& cache, int fill_threads,
                                   core::Progress* progress) {
  return AssembleSelected(mesh, frequency_hz, cache, fill_threads, true, true, progress);
}

ImpedanceParts AssembleImpedanceParts(const geometry::Mesh& mesh, double frequency_hz,
                                      const NearFieldCache& cache, int fill_threads) {
  ImpedanceParts parts;
  parts.direct = AssembleSelected(mesh, frequency_hz, cache, fill_threads, true, false);
  if (mesh.ground_images) {
    parts.image = AssembleSelected(mesh, frequency_hz, cache, fill_threads, false, true);
  }
  return parts;
}

namespace {

Eigen::MatrixXcd AssembleSelected(const geometry::Mesh& mesh, double frequency_hz,
                                  const NearFieldCache& cache, int fill_threads, bool direct,
                                  bool images, core::Progress* progress) {
  const int n = static_cast<int>(mesh.bases.size());
  const int ns = static_cast<int>(mesh.segments.size());
  const double omega = 2.0 * core::kPi * frequency_hz;
  const double k = omega / core::kSpeedOfLight_m_per_s;
  const Complex c_vector(0.0, omega * core::kMu0_h_per_m / (4.0 * core::kPi));
  const Complex c_scalar(0.0, -1.0 / (4.0 * core::kPi * omega * core::kEps0_f_per_m));

  std::vector<std::vector<PieceRef>> on_segment(ns);
  for (int b = 0; b < n; ++b) {
    const geometry::Basis& basis = mesh.bases[b];
    for (int p = 0; p < basis.piece_count; ++p) {
      const geometry::Piece& piece = basis.pieces[p];
      on_segment[piece.segment].push_back({b, piece.alpha(), piece.beta()});
    }
  }
  std::vector<geometry::Vec3> unit(ns);
  std::vector<double> length(ns);
  for (int s = 0; s < ns; ++s) {
    length[s] = mesh.segments[s].length_m();
    unit[s] = (mesh.segments[s].end - mesh.segments[s].start) / length[s];
  }
  const geometry::Vec3 mirror(1.0, 1.0, -1.0);
  const ground::Ground ground(mesh.ground, frequency_hz);
  // Over a real ground by the exact method every pair gets the half-space correction on top of
  // the perfect image (fill/half_space.hpp); with an explicit exact_below only the pairs below
  // it, the others the reflection coefficients.
  std::optional<HalfSpaceFill> half_space;
  if (images && mesh.ground_images && mesh.ground.kind == GroundKind::kReal &&
      mesh.ground.method == GroundMethod::kExact) {
    const double exact_below_m = mesh.ground.exact_below_m.value_or(INFINITY);
    if (exact_below_m > 0.0) {
      half_space.emplace(mesh, ground.permittivity(), k, exact_below_m,
                         mesh.ground.half_space_table);
    }
  }

  // Parallel fill. Z = sum over ordered segment pairs (i, j) of their contributions F_ij, and
  // F_ji = F_ij^T, so Z = W + W^T with W = sum over i < j of F_ij plus half of each F_ii: only
  // pairs i <= j are integrated. The observation segments are cut into kFillBlocks blocks of
  // equal triangle area; block t writes the rows of the bases on it, and a basis with pieces
  // in two blocks (block edges, junctions) has its row kept aside by each block and added
  // after, in block order. The blocks do not depend on the thread count, so neither does any
  // rounding: the matrix is bit-identical for every fill_threads. W is stored transposed (its
  // row of basis m as column m of z), so that a block writes down columns, one cache line
  // after another, not across them (stride n) as rows of the column-major matrix would.
  const int blocks = std::clamp(kFillBlocks, 1, std::max(1, ns));
  const int threads = std::clamp(fill_threads, 1, blocks);
  std::vector<int> block_start(blocks + 1);
  for (int t = 0; t <= blocks; ++t) {
    block_start[t] = static_cast<int>(
        std::lround(ns * (1.0 - std::sqrt(std::max(0.0, 1.0 - static_cast<double>(t) / blocks)))));
  }
  block_start[blocks] = ns;
  std::vector<int> block_of(ns);
  for (int t = 0; t < blocks; ++t) {
    for (int s = block_start[t]; s < block_start[t + 1]; ++s) block_of[s] = t;
  }
  std::vector<int> owner(n, -1);  // the block that writes the row directly, or -1 (kept aside)
  for (int b = 0; b < n; ++b) {
    const geometry::Basis& basis = mesh.bases[b];
    owner[b] = block_of[basis.pieces[0].segment];
    for (int p = 1; p < basis.piece_count; ++p) {
      if (block_of[basis.pieces[p].segment] != owner[b]) owner[b] = -1;
    }
  }

  // Each segment's Gauss points, and those of its mirror image, once per fill.
  const bool with_images = mesh.ground_images && images;
  std::vector<SegmentNodes> nodes(ns), image_nodes(with_images ? ns : 0);
  for (int s = 0; s < ns; ++s) {
    nodes[s] = MakeSegmentNodes(mesh.segments[s].start, mesh.segments[s].end);
    if (with_images) {
      image_nodes[s] = MakeSegmentNodes(mesh.segments[s].start.cwiseProduct(mirror),
                                        mesh.segments[s].end.cwiseProduct(mirror));
    }
  }

  // Cached static part (near pairs) plus the frequency-dependent part.
  auto Moments = [&](const NearFieldCache::Entry* near, const SegmentNodes& a,
                     const SegmentNodes& b, double radius2) {
    if (!near) return FarMoments(a, b, radius2, k);
    PairMoments m = FrequencyMoments(a.start, a.end, b.start, b.end, radius2, k, true);
    m.m00 += near->statics.m00;
    m.m10 += near->statics.m10;
    m.m01 += near->statics.m01;
    m.m11 += near->statics.m11;
    return m;
  };

  Eigen::MatrixXcd z(n, n);
  core::PrepareFreshMemory(z.data(), static_cast<std::size_t>(z.size()) * sizeof(Complex));
  z.setZero();
  using SpillRows = std::vector<std::pair<int, Eigen::VectorXcd>>;
  auto work = [&](int t, SpillRows* spill) {
    auto row_of = [&](int basis) -> Complex* {
      if (owner[basis] == t) return nullptr;
      for (auto& [b, row] : *spill) {
        if (b == basis) return row.data();
      }
      spill->emplace_back(basis, Eigen::VectorXcd::Zero(n));
      return spill->back().second.data();
    };
    // Adds the moments of (observation i, source j) to W. vector_weight multiplies the
    // vector-potential part (u_i . u_j for a direct pair, u_i . M u_j for an image),
    // charge_weight the scalar-potential part (1 direct, s for an image); see
    // ground/reflection.hpp.
    auto scatter = [&](int i, int j, const PairMoments& m, Complex vector_weight,
                       Complex charge_weight) {
      const Complex a_part = c_vector * (length[i] * length[j]) * vector_weight;
      const Complex s_part = c_scalar * charge_weight;
      for (const PieceRef& pm : on_segment[i]) {
        Complex* aside = row_of(pm.basis);
        // value(pn) = a_part (pm.alpha pn.alpha m00 + pm.alpha pn.beta m01 + pm.beta pn.alpha
        // m10 + pm.beta pn.beta m11) + s_part pm.beta pn.beta m00 = pn.alpha p + pn.beta q.
        const Complex p = Multiply(a_part, pm.alpha * m.m00 + pm.beta * m.m10);
        const Complex q = Multiply(a_part, pm.alpha * m.m01 + pm.beta * m.m11) +
                          Multiply(s_part * pm.beta, m.m00);
        for (const PieceRef& pn : on_segment[j]) {
          const Complex value = pn.alpha * p + pn.beta * q;
          if (aside) {
            aside[pn.basis] += value;
          } else {
            z(pn.basis, pm.basis) += value;  // W^T: basis m's row of W is its column here
          }
        }
      }
    };
    // The same with the vector-potential moments weighted already and a charge moment of its
    // own (the image and the half-space correction of a pair, added before they are scattered).
    auto scatter_split = [&](int i, int j, const PairMoments& m, Complex charge, double share) {
      const Complex a_part = c_vector * (length[i] * length[j] * share);
      const Complex s_part = c_scalar * (share * charge);
      for (const PieceRef& pm : on_segment[i]) {
        Complex* aside = row_of(pm.basis);
        const Complex p = Multiply(a_part, pm.alpha * m.m00 + pm.beta * m.m10);
        const Complex q = Multiply(a_part, pm.alpha * m.m01 + pm.beta * m.m11) + s_part * pm.beta;
        for (const PieceRef& pn : on_segment[j]) {
          const Complex value = pn.alpha * p + pn.beta * q;
          if (aside) {
            aside[pn.basis] += value;
          } else {
            z(pn.basis, pm.basis) += value;
          }
        }
      }
    };
    for (int i = block_start[t]; i < block_start[t + 1]; ++i) {
      if (on_segment[i].empty()) continue;
      const geometry::Segment& si = mesh.segments[i];
      // The near pairs of row i, in increasing source order (NearFieldCache): one pass.
      const std::vector<NearFieldCache::Entry>& near_row = cache.by_observation[i];
      size_t cursor = 0;
      auto near_entry = [&](int j, bool image) -> const NearFieldCache::Entry* {
        while (cursor < near_row.size() &&
               (near_row[cursor].source < j ||
                (near_row[cursor].source == j && near_row[cursor].image < image))) {
          ++cursor;
        }
        if (cursor < near_row.size() && near_row[cursor].source == j &&
            near_row[cursor].image == image) {
          return &near_row[cursor];
        }
        return nullptr;
      };
      for (int j = i; j < ns; ++j) {
        if (on_segment[j].empty()) continue;
        const geometry::Segment& sj = mesh.segments[j];
        const double radius2 = 0.5 * (si.radius_m * si.radius_m + sj.radius_m * sj.radius_m);
        const double share = j == i ? 0.5 : 1.0;  // F_ii is counted twice by W + W^T
        if (direct) {
          PairMoments m = Moments(near_entry(j, false), nodes[i], nodes[j], radius2);
          if (j == i) Symmetrize(&m);
          scatter(i, j, m, share * unit[i].dot(unit[j]), share);
        }
        if (!mesh.ground_images || !images) continue;
        PairMoments mi = Moments(near_entry(j, true), nodes[i], image_nodes[j], radius2);
        if (j == i) Symmetrize(&mi);
        Complex vector_weight, charge_weight;
        const bool exact = half_space && half_space->Applies(si, sj);
        if (ground.perfect() || exact) {
          // The exact image: M = diag(-1, -1, 1), s = -1.
          vector_weight = -unit[i].dot(unit[j].cwiseProduct(mirror));
          charge_weight = -1.0;
        } else {
          // Reflection-coefficient approximation at the specular angle of the two centres.
          const ground::ImageWeights w =
              ground.WeightsBetween(0.5 * (si.start + si.end), 0.5 * (sj.start + sj.end));
          vector_weight = unit[i].cast<Complex>().dot(w.vector_dyadic * unit[j].cast<Complex>());
          charge_weight = w.charge_factor;
        }
        if (exact) {
          // The half-space's correction to the image: its kernels are symmetric under the
          // exchange of the two segments, so Z stays symmetric. Added to the image's moments
          // and scattered with them.
          const HalfSpacePair c = half_space->Moments(i, j);
          PairMoments vector_part = c.vector;
          if (j == i) Symmetrize(&vector_part);
          const PairMoments sum{Multiply(mi.m00, vector_weight) + vector_part.m00,
                                Multiply(mi.m10, vector_weight) + vector_part.m10,
                                Multiply(mi.m01, vector_weight) + vector_part.m01,
                                Multiply(mi.m11, vector_weight) + vector_part.m11};
          scatter_split(i, j, sum, Multiply(mi.m00, charge_weight) + c.charge, share);
          continue;
        }
        // M is symmetric and the specular angle is the same both ways: Z stays symmetric.
        scatter(i, j, mi, share * vector_weight, share * charge_weight);
      }
    }
  };
  std::vector<SpillRows> spills(blocks);
  // The workers take the blocks in turn; each block writes only its own rows and spill.
  core::ParallelFor(threads, static_cast<std::size_t>(blocks), [&](std::size_t block) {
    work(static_cast<int>(block), &spills[block]);
    if (progress) progress->Advance(1.0 / blocks);
  });
  for (const SpillRows& spill : spills) {
    for (const auto& [b, row] : spill) z.col(b) += row;
  }
  // z holds W^T; Z = W^T + W, in place, in tiles that stay in the cache (column by column,
  // z(c, r) would touch one entry per cache line).
  constexpr int kTile = 64;
  for (int c0 = 0; c0 < n; c0 += kTile) {
    for (int r0 = 0; r0 <= c0; r0 += kTile) {
      for (int c = c0; c < std::min(n, c0 + kTile); ++c) {
        for (int r = r0; r < std::min(c, r0 + kTile); ++r) {
          const Complex sum = z(r, c) + z(c, r);
          z(r, c) = sum;
          z(c, r) = sum;
        }
      }
    }
  }
  for (int c = 0; c < n; ++c) z(c, c) *= 2.0;
  return z;
}

}  // namespace

void AddLoads(const geometry::Mesh& mesh, const Model& model, double frequency_hz,
              Eigen::MatrixXcd* z) {
  AddLoads(mesh, model, frequency_hz, [z](int m, int n, Complex value) { (*z)(m, n) += value; });
}

void AddLoads(const geometry::Mesh& mesh, const Model& model, double frequency_hz,
              const MatrixAddition& add) {
  for (size_t l = 0; l < model.loads.size(); ++l) {
    bool open = false;
    const Complex zl = LoadImpedance(model.loads[l], frequency_hz, &open);
    const geometry::Port& port = mesh.load_ports[l];
    for (const auto& [bm, sm] : port.bases) {
      for (const auto& [bn, sn] : port.bases) add(bm, bn, sm * sn * zl);
    }
  }
}

void AddConductorLoss(const geometry::Mesh& mesh, const Model& model, double frequency_hz,
                      Eigen::MatrixXcd* z) {
  AddConductorLoss(mesh, model, frequency_hz,
                   [z](int m, int n, Complex value) { (*z)(m, n) += value; });
}

void AddConductorLoss(const geometry::Mesh& mesh, const Model& model, double frequency_hz,
                      const MatrixAddition& add) {
  std::vector<std::vector<PieceRef>> on_segment(mesh.segments.size());
  for (size_t b = 0; b < mesh.bases.size(); ++b) {
    const geometry::Basis& basis = mesh.bases[b];
    for (int p = 0; p < basis.piece_count; ++p) {
      const geometry::Piece& piece = basis.pieces[p];
      on_segment[piece.segment].push_back({static_cast<int>(b), piece.alpha(), piece.beta()});
    }
  }
  for (size_t s = 0; s < mesh.segments.size(); ++s) {
    const geometry::Segment& seg = mesh.segments[s];
    const WireSpec& wire = model.wires[seg.wire];
    if (!conductor::HasSeriesImpedance(wire)) continue;
    const Complex per_metre =
        conductor::SeriesImpedancePerMetre(wire, LossRadius(wire), frequency_hz);
    const Complex zs = per_metre * seg.length_m();
    // int_0^1 (a_m + b_m t)(a_n + b_n t) dt for the two pieces' linear currents.
    for (const PieceRef& pm : on_segment[s]) {
      for (const PieceRef& pn : on_segment[s]) {
        const double overlap = pm.alpha * pn.alpha +
                               0.5 * (pm.alpha * pn.beta + pm.beta * pn.alpha) +
                               pm.beta * pn.beta / 3.0;
        add(pm.basis, pn.basis, zs * overlap);
      }
    }
  }
}

Eigen::VectorXcd AssembleExcitation(const geometry::Mesh& mesh, const Model& model) {
  Eigen::VectorXcd v = Eigen::VectorXcd::Zero(static_cast<Eigen::Index>(mesh.bases.size()));
  for (size_t f = 0; f < model.feeds.size(); ++f) {
    for (const auto& [b, sign] : mesh.feed_ports[f].bases) v(b) += sign * model.feeds[f].voltage_v;
  }
  return v;
}

}  // namespace wirefield::fill
