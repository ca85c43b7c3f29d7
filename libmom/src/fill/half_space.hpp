// Fill stage: the exact (Sommerfeld) half-space ground in the Galerkin matrix. Each pair of
// segments over a real ground (by default every pair; with exact_below, those below it) gets, on
// top of its perfect-ground image, the correction of the half-space (ground/sommerfeld.hpp)
// integrated over both segments: a vector part (horizontal, vertical and horizontal-vertical
// coupling kernels) and a scalar part (one kernel for every charge). Inputs: the mesh, the ground,
// the frequency; output: moments that fill/assemble.cpp scatters like any other pair's. See
// docs/numerics.md, "Real ground".
#pragma once

#include <array>
#include <complex>
#include <memory>
#include <vector>

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
  // The table covers every pair of the mesh, from its lowest to its highest point; pairs whose
  // mean height is below exact_below_m (infinity: every pair) use it. Costs one table (some 1 to 3
  // ms of CPU on two threads for the 200-unknown models of the benchmarks). tabulate = false builds
  // no table and integrates the correction at every quadrature point instead (checks of the table).
  HalfSpaceFill(const geometry::Mesh& mesh, std::complex<double> eps_c, double wavenumber_per_m,
                double exact_below_m, bool tabulate = true);

  // True when the pair (observation a, source b) gets the exact ground (always, but for an
  // explicit exact_below).
  bool Applies(const geometry::Segment& a, const geometry::Segment& b) const;

  // The correction's moments between observation segment a0-a1 and source segment b0-b1.
  HalfSpacePair Moments(const Vec3& a0, const Vec3& a1, const Vec3& b0, const Vec3& b1) const;
  // The same between segments a and b of the mesh, from their data prepared once per fill
  // (direction, lowest point, centre, the two-point rule's nodes): the same numbers.
  HalfSpacePair Moments(int a, int b) const;

  const ground::HalfSpaceTable& table() const { return *table_; }

  // Far pairs (two-point rule, some 16 segment lengths or more from the other's image, over
  // a ground of |eps_c| <= 100) take the correction from one lookup at the centres and its
  // slopes (on by default); off: one lookup per pair of points (checks of the expansion).
  void UseFarExpansion(bool on) { far_expansion_ = on; }

 private:
  // What a pair's rules need of each segment.
  struct SegmentData {
    Vec3 start, end, unit, centre;
    double length = 0.0, low = 0.0;  // low: the lowest height, at least 0
    std::array<Vec3, 2> two_points;  // the two-point Gauss rule's nodes
  };
  static SegmentData Prepare(const Vec3& start, const Vec3& end);
  HalfSpacePair Moments(const SegmentData& a, const SegmentData& b) const;
  std::vector<SegmentData> segments_;
  std::unique_ptr<ground::HalfSpaceTable> table_;
  double wavenumber_ = 0.0;
  double ground_wavenumber_ = 0.0;  // |k1|
  double ground_wave_decay_ = 0.0;  // |sqrt(k1^2 - k0^2)|: the ground wave's decay in height
  double exact_below_m_ = 0.0;
  bool far_expansion_ = true;
  bool expandable_ground_ = true;  // |eps_c| small enough for the far pairs' expansion
  double floor_m_ = 0.0;           // heights below this count as this in the table (static limit)
};

}  // namespace wirefield::fill
