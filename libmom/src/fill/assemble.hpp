// Fill stage: Mesh -> the Galerkin impedance matrix Z and the excitation vector V of the
// mixed-potential electric-field integral equation, Z I = V, for one frequency. Lumped loads
// are added at their ports; a perfect ground adds the image of every source segment.
#pragma once

#include <Eigen/Dense>
#include <complex>
#include <functional>
#include <vector>

#include "core/progress.hpp"
#include "fill/kernel.hpp"
#include "geometry/mesh.hpp"
#include "wirefield/model.hpp"

namespace wirefield::fill {

// Impedance of a lumped load at a frequency (a coil load: its (R_ac + j omega L) in parallel
// with its self-capacitance, wirefield/coil.hpp; a choke: ChokeSpec's rule, InputError at the
// load for a frequency outside its points). *open is set when the element is an ideal open
// circuit there (parallel L and C at exact resonance, nothing else in parallel); the returned
// impedance is then a finite stand-in of 1e12 ohm.
Complex LoadImpedance(const LoadSpec& load, double frequency_hz, bool* open);

// The frequency-independent part of the fill: the static (1/R) moments of every near
// segment pair (i <= j), and of near image pairs over a perfect ground. Built once per mesh
// and reused at every frequency of a sweep.
struct NearFieldCache {
  struct Entry {
    int source = 0;
    bool image = false;
    PairMoments statics;
  };
  // Indexed by the observation segment; each list in increasing (source, image) order, which
  // the fill relies on to walk a row's near pairs in one pass.
  std::vector<std::vector<Entry>> by_observation;
  const Entry* Find(int observation, int source, bool image) const;
};
// Built on `threads` threads (rows interleaved; each row's list is the same for any count).
NearFieldCache BuildNearFieldCache(const geometry::Mesh& mesh, int threads = 1);

// The antenna's own impedance matrix (no loads), n_bases x n_bases, symmetric, filled by
// fill_threads threads (at most 32 help; the matrix is bit-identical for any count).
// progress (optional) is advanced by the share of the fill each block completes (1 in all).
Eigen::MatrixXcd AssembleImpedance(const geometry::Mesh& mesh, double frequency_hz,
                                   const NearFieldCache& cache, int fill_threads = 1,
                                   core::Progress* progress = nullptr);
// Same, building the cache on the way (single solves, tests).
Eigen::MatrixXcd AssembleImpedance(const geometry::Mesh& mesh, double frequency_hz);
// The same matrix in two parts, Z = direct + image: the pairs of real segments, and the pairs
// of a segment with an image segment (empty without a ground). Each part has its own
// propagation phase, which the interpolation in frequency removes separately
// (fill/interpolate.hpp). Costs one fill.
struct ImpedanceParts {
  Eigen::MatrixXcd direct, image;
};
ImpedanceParts AssembleImpedanceParts(const geometry::Mesh& mesh, double frequency_hz,
                                      const NearFieldCache& cache, int fill_threads = 1);

// Receives one addition Z(m, n) += value (a few per load port and per lossy segment).
using MatrixAddition = std::function<void(int m, int n, Complex value)>;

// Adds the loads of `model` to Z at their ports.
void AddLoads(const geometry::Mesh& mesh, const Model& model, double frequency_hz,
              Eigen::MatrixXcd* z);
// The same additions, handed to `add` one by one (for a matrix held in another form).
void AddLoads(const geometry::Mesh& mesh, const Model& model, double frequency_hz,
              const MatrixAddition& add);

// Adds the series impedance of lossy wires (Model::wires[].conductivity_s_per_m, skin effect)
// and of insulated ones (Model::wires[].insulation, the thin-coating impedance) as a
// distributed series impedance: Z_mn += Z' int f_m . f_n dl over each segment.
void AddConductorLoss(const geometry::Mesh& mesh, const Model& model, double frequency_hz,
                      Eigen::MatrixXcd* z);
// The same additions, handed to `add` one by one.
void AddConductorLoss(const geometry::Mesh& mesh, const Model& model, double frequency_hz,
                      const MatrixAddition& add);

// The delta-gap excitation of every feed.
Eigen::VectorXcd AssembleExcitation(const geometry::Mesh& mesh, const Model& model);

}  // namespace wirefield::fill
