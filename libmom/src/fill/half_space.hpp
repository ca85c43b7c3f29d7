// Fill stage: the exact (Sommerfeld) half-space ground in the Galerkin matrix. Each pair of
// segments low enough over a real ground gets, on top of its perfect-ground image, the
// correction of the half-space (ground/sommerfeld.hpp) integrated over both segments: a vector
// part (horizontal, vertical and horizontal-vertical coupling kernels) and a scalar part (one
// kernel for every charge). Inputs: the mesh, the ground, the frequency; output: moments that
// fill/assemble.cpp scatters like any other pair's. See docs/numerics.md, "Real ground".
#pragma once

#include <complex>
#include <memory>

#include "fill/kernel.hpp"
#include "geometry/mesh.hpp"
#include "ground/sommerfeld.hpp"

namespace wirefield::fill {

// The correction's moments for one pair: vector.m_pq = int int t^p t'^q K_A dt dt' with
// K_A = u_obs . G_A u_src (the dyadic correction, direction factors included), and charge =
// int int K_phi dt dt'. Both without the constants mu0/4pi and 1/(4 pi eps0).
struct HalfSpacePair {
  PairMoments vector;
  Complex charge = 0.0;
};

// The half-space correction of one mesh at one frequency: the tabulated Sommerfeld integrals
// over the distances the mesh spans, and the quadrature over pairs of segments.
class HalfSpaceFill {
 public:
  // The table covers every pair of the mesh; pairs whose mean height is below exact_below_m
  // use it. Costs one table (some 0.05 s, two threads). tabulate = false builds no table and
  // integrates the correction at every quadrature point instead (checks of the table).
  HalfSpaceFill(const geometry::Mesh& mesh, std::complex<double> eps_c, double wavenumber_per_m,
                double exact_below_m, bool tabulate = true);

  // True when the pair (observation a, source b) is low enough for the exact ground.
  bool Applies(const geometry::Segment& a, const geometry::Segment& b) const;

  // The correction's moments between observation segment a0-a1 and source segment b0-b1.
  HalfSpacePair Moments(const Vec3& a0, const Vec3& a1, const Vec3& b0, const Vec3& b1) const;

  const ground::HalfSpaceTable& table() const { return *table_; }

 private:
  std::unique_ptr<ground::HalfSpaceTable> table_;
  double wavenumber_ = 0.0;
  double ground_wavenumber_ = 0.0;  // |k1|
  double ground_wave_decay_ = 0.0;  // |sqrt(k1^2 - k0^2)|: the ground wave's decay in height
  double exact_below_m_ = 0.0;
  double floor_m_ = 0.0;  // heights below this count as this in the table (static limit)
};

}  // namespace wirefield::fill
