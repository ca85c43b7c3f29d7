// Ground stage: the reflection of waves by a flat homogeneous ground at z = 0.
// The Fresnel coefficients of a lossy half-space for the two polarizations, with the complex
// relative permittivity eps_c = eps_r - j sigma / (omega eps0) (time factor e^{j omega t}),
// and the reflection dyadic that turns the mirrored image of a current into the reflected
// source of the reflection-coefficient approximation (docs/numerics.md, "Real ground").
#pragma once

#include <Eigen/Core>
#include <complex>

#include "wirefield/model.hpp"

namespace wirefield::ground {

using Vec3 = Eigen::Vector3d;

// eps_r - j sigma / (omega eps0).
Complex ComplexPermittivity(double relative_permittivity, double conductivity_s_per_m,
                            double frequency_hz);

// Fresnel reflection coefficients at grazing angle psi (radians above the horizon, 0..pi/2),
// in the convention where a perfect ground gives Gamma_h = -1 and Gamma_v = +1:
//   Gamma_h = (sin psi - sqrt(eps_c - cos^2 psi)) / (sin psi + sqrt(eps_c - cos^2 psi))
//   Gamma_v = (eps_c sin psi - sqrt(eps_c - cos^2 psi)) / (eps_c sin psi + sqrt(...))
// with the principal square root. Both tend to -1 at grazing incidence over any finite ground.
Complex FresnelHorizontal(Complex eps_c, double psi_rad);
Complex FresnelVertical(Complex eps_c, double psi_rad);

// How the ground turns the mirror image of a current element into its reflected source.
// The image of a source at (x, y, z) sits at (x, y, -z) and carries the current M J, its charge
// is s q. With rho the unit horizontal vector from the source toward the observer and
// phi = z x rho: M = Gamma_v z z - Gamma_v rho rho + Gamma_h phi phi, s = -Gamma_v.
// A perfect ground (Gamma_v = 1, Gamma_h = -1) gives M = diag(-1, -1, 1), s = -1: the exact
// image. Over a finite ground this is the reflection-coefficient approximation.
struct ImageWeights {
  Eigen::Matrix3cd vector_dyadic;  // M
  Complex charge_factor;           // s
};

// The ground of a model at one frequency. Free space has no reflection.
class Ground {
 public:
  Ground() = default;  // free space
  Ground(const GroundSpec& spec, double frequency_hz);

  bool reflects() const { return kind_ != GroundKind::kFree; }
  bool perfect() const { return kind_ == GroundKind::kPerfect; }
  Complex permittivity() const { return eps_c_; }

  // Gamma_h and Gamma_v at grazing angle psi (perfect ground: -1 and +1).
  Complex Horizontal(double psi_rad) const;
  Complex Vertical(double psi_rad) const;

  // The image weights for a wave from a source at `source` to an observer at `observer`
  // (both above the ground) by way of the specular point: psi from the heights and the
  // horizontal distance.
  ImageWeights WeightsBetween(const Vec3& observer, const Vec3& source) const;
  // The same for a far-field direction (unit vector rhat with rhat_z >= 0).
  ImageWeights WeightsToward(const Vec3& rhat) const;

 private:
  ImageWeights Weights(double psi_rad, double rho_x, double rho_y) const;
  GroundKind kind_ = GroundKind::kFree;
  Complex eps_c_ = 1.0;
};

}  // namespace wirefield::ground
