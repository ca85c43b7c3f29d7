// Ground stage: the exact field of a current element above a homogeneous lossy half-space,
// as a correction to the perfect-ground image, by Sommerfeld integrals over the radial
// spectral variable k_rho. Inputs: eps_c = eps_r - j sigma / (omega eps0) (time factor
// e^{j omega t}), k0; outputs: four scalar functions of rho (horizontal distance) and
// zeta = z + z' (sum of heights). See docs/numerics.md, "Real ground: the exact half-space".
#pragma once

#include <array>
#include <cmath>
#include <complex>
#include <vector>

#include "wirefield/core.hpp"

namespace wirefield::ground {

// The reflected potentials of a half-space in the mixed-potential form of Michalski & Zheng's
// "Formulation C" (IEEE Trans. AP-38(3), 1990; for a half-space with source and observer in
// the air it coincides with Sommerfeld's 1909 vector potential of the horizontal and vertical
// dipoles), rearranged so that every charge sees one scalar kernel and the dyadic kernel is
// symmetric (docs/numerics.md). With P = k_rho / (j k_z0), k_zi = sqrt(k_i^2 - k_rho^2),
// Im k_zi <= 0, R_TE = (k_z0 - k_z1)/(k_z0 + k_z1), R_TM = (eps k_z0 - k_z1)/(eps k_z0 + k_z1),
// R_q = 2 k_z0^2 (1 - eps) / ((k_z0 + k_z1)(eps k_z0 + k_z1)), E = exp(-j k_z0 zeta), the
// reflected parts are
//   horizontal-horizontal vector kernel (mu0/4pi)  int J0(k_rho rho) E P R_TE dk_rho,
//   vertical-vertical vector kernel     (mu0/4pi)  int J0 E P (R_TM - R_q) dk_rho,
//   scalar kernel of every charge       (1/4pi eps0) int J0 E P (R_TE + R_q) dk_rho,
//   horizontal-vertical coupling        (mu0/4pi)  dF/drho, F = int J0 E k_rho (R_TE + R_TM)
//                                        / k_rho^2 dk_rho,
// and a perfect ground has R_TE = -1, R_TM = 1, R_q = 0: the image (-1, +1, -1, 0) times
// exp(-jkR')/R', R' = sqrt(rho^2 + zeta^2) (the Sommerfeld identity). This type holds the
// integrals minus those perfect-image parts, each without its mu0/4pi or 1/(4 pi eps0):
struct HalfSpaceCorrection {
  Complex horizontal;  // int J0 E P (R_TE + 1)                   [1/m]
  Complex vertical;    // int J0 E P (R_TM - R_q - 1)             [1/m]
  Complex charge;      // int J0 E P (R_TE + R_q + 1)             [1/m]
  Complex coupling;    // dF/drho = -int J1 E (R_TE + R_TM) dk_rho   [1/m]
};

// The coupling enters the vector potential of a pair with unit directions u_obs, u_src (rho_hat
// the horizontal unit vector from source to observer) as
//   coupling * (u_obs,z (u_src . rho_hat) - u_src,z (u_obs . rho_hat)),
// symmetric under exchange of the two, so the Galerkin matrix stays symmetric.

// Controls of the numerical integration.
struct SommerfeldOptions {
  // Partial integrals of the tail (between zeros of J0) before extrapolation; more is slower
  // and more accurate up to ~20.
  int tail_partitions = 14;
};

// The Sommerfeld integrals of one ground at one frequency.
class HalfSpace {
 public:
  HalfSpace(Complex eps_c, double wavenumber_per_m, SommerfeldOptions options = {});

  // The corrections at horizontal distance rho_m >= 0 and height sum zeta_m > 0.
  HalfSpaceCorrection Correction(double rho_m, double zeta_m) const;
  // The same, keeping in *paths the path points near k0 (with the ground's factors there),
  // which depend on the panel count only, for the next call: what a table build does, one
  // PathCache per thread (sommerfeld.cpp).
  class PathCache;
  HalfSpaceCorrection Correction(double rho_m, double zeta_m, PathCache* paths) const;

  Complex permittivity() const { return eps_c_; }
  double wavenumber() const { return k0_; }

 private:
  Complex eps_c_;
  double k0_;
  SommerfeldOptions options_;
};

// The four corrections tabulated once per ground and frequency over R' = sqrt(rho^2 + zeta^2)
// (log-spaced near the source, evenly spaced far away) and the elevation angle psi = atan(zeta /
// rho) (uniform in sqrt(tan(psi / 2)), close to sqrt(psi / 2) at low angles), with the image's
// exp(-jkR')/R' factored out (what remains is smooth: it tends to constants as k0 R' -> 0 and to
// the Fresnel factors as k0 R' -> inf), and interpolated by tensor cubic Lagrange polynomials.
// Points outside the table are integrated directly.
struct TableOptions {
  // Nodes per factor of 2 in R'; more costs build time linearly and cuts the interpolation
  // error as the fourth power.
  int nodes_per_octave = 4;
  // Nodes in sqrt(tan(psi / 2)) over all elevations [0, pi/2] (y from 0 to 1); a table
  // over [psi_min, pi/2] keeps their spacing, with fewer nodes (at least four); same trade.
  int angle_nodes = 20;
  // Threads building the table (1 or 2).
  int threads = 2;
  // Build no table: every lookup integrates the corrections directly (at the same clamped
  // point). Exact up to the quadrature, some hundred times slower in a fill; for measuring
  // what the interpolation adds.
  bool direct = false;
  // The highest height sum zeta (m) that will be looked up: nodes that serve only points
  // above it (at long R' and steep elevation) are not integrated, which saves up to half the
  // build for a low model; they hold NaN, so a lookup there could not go unnoticed, and
  // lookups clamp zeta to it. Infinity (the default): the whole range.
  double zeta_max_m = INFINITY;
  // The greatest horizontal distance rho (m) that will be looked up: nodes that serve only
  // points farther out (at low elevation) are not integrated either. A vertical wire looks up
  // rho near 0 only and needs a few rows of the table near the zenith. Infinity: all of them.
  double rho_max_m = INFINITY;
};

class HalfSpaceTable {
 public:
  HalfSpaceTable() = default;
  // Covers r_min_m <= R' <= r_max_m and zeta_min_m <= zeta <= options.zeta_max_m.
  HalfSpaceTable(const HalfSpace& ground, double r_min_m, double r_max_m, double zeta_min_m,
                 TableOptions options = {});

  HalfSpaceCorrection Correction(double rho_m, double zeta_m) const;
  // The parts a lookup may ask for (a bit mask; the others come back zero).
  static constexpr unsigned kHorizontal = 1, kVertical = 2, kCharge = 4, kCoupling = 8;
  static constexpr unsigned kAllParts = 15;
  // The four corrections divided by the image's exp(-jkR')/R' (what the table holds), at the
  // nearest point of the table's range: zeta is raised to the table's zeta_min and R' kept
  // within [r_min, r_max]. Near the source these tend to constants (the static images), so the
  // clamp changes little there; the caller multiplies by the true image factor. Only the parts
  // in the mask are interpolated (two horizontal segments need the horizontal and charge
  // parts, two vertical ones the vertical and charge parts: half the cost); the parts left
  // out are zero. The order of the result: horizontal, vertical, charge, coupling.
  std::array<Complex, 4> NormalizedClamped(double rho_m, double zeta_m,
                                           unsigned parts = kAllParts) const;
  bool Covers(double rho_m, double zeta_m) const;
  // The same parts and their slopes d/drho and d/dzeta (per metre), from the same cubic
  // interpolant, at a point the table covers without clamping (false, nothing written, where it
  // does not or the table is direct): the first-order Taylor expansion about a pair's centres
  // that serves its far pairs (fill/half_space.hpp).
  bool NormalizedSlopes(double rho_m, double zeta_m, unsigned parts, std::array<Complex, 4>* value,
                        std::array<Complex, 4>* d_rho, std::array<Complex, 4>* d_zeta) const;
  int nodes() const { return static_cast<int>(values_.size()); }
  // R_c of the table's variable in distance, x = ln R' + R'/R_c (m): the values vary on the
  // scale of one x step (ln 2 / nodes_per_octave), so x changes by L (1/R' + 1/R_c) over a
  // length L at distance R'.
  double distance_scale_m() const { return r_c_; }
  bool direct() const { return direct_; }
  const HalfSpace& ground() const { return ground_; }

 private:
  HalfSpace ground_{Complex(1.0, 0.0), 1.0};
  double Map(double r) const { return std::log(r) + r / r_c_; }
  // The stencil of a point: its coordinates x, y, the steps, and the cell (nodes i-1..i+2,
  // j-1..j+2).
  struct Cell {
    double x, y, dx, dy;
    int i, j;
  };
  Cell Locate(double rho_m, double zeta_m, double r_m) const;
  // The tabulated (normalized) values at a point inside the range, R' = r_m: the parts whose
  // bits are set in kMask, bit c standing for part c of values_' order (horizontal, charge,
  // coupling, vertical).
  template <unsigned kMask>
  std::array<Complex, 4> Interpolate(double rho_m, double zeta_m, double r_m) const;
  // The same with the slopes in x and y (d/dx, d/dy of the interpolant) into slopes[0], [1].
  template <unsigned kMask>
  std::array<Complex, 4> InterpolateSlopes(double rho_m, double zeta_m, double r_m,
                                           std::array<std::array<Complex, 4>, 2>* slopes) const;
  double r_min_ = 0.0, r_max_ = 0.0, zeta_min_ = 0.0, zeta_max_ = INFINITY, r_c_ = 1.0;
  bool direct_ = false;
  std::vector<double> x_, y_;                   // nodes in ln R' + R'/R_c and sqrt(tan(psi/2))
  std::array<double, 4> first_y_scale_{};       // 1 / prod (y_a - y_b), first y stencil
  std::vector<std::array<Complex, 4>> values_;  // [i_x * y_.size() + i_y], image factored out;
                                                // horizontal, charge, coupling, vertical
};

// The Sommerfeld identity's integral int_0^inf J0(k_rho rho) exp(-j k_z0 zeta) k_rho/(j k_z0)
// dk_rho, by the same quadrature as HalfSpace (its closed form is exp(-jkR)/R): for tests.
Complex SommerfeldIdentityIntegral(double rho_m, double zeta_m, double wavenumber_per_m,
                                   SommerfeldOptions options = {});

}  // namespace wirefield::ground
