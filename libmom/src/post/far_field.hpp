// Post stage: the far field of solved segment currents. The radiation vector
// N(rhat) = sum over segments of int I(l) u exp(jk rhat.r(l)) dl gives
// E = -j k eta / (4 pi) [N - (N.rhat) rhat] exp(-jkr) / r. Over a ground the wave reflected by
// the ground adds M(rhat) N_image(rhat), N_image being the same sum over the mirrored positions
// and M the reflection dyadic of the Fresnel coefficients at the elevation of rhat
// (ground/reflection.hpp): exact for the far field of a flat ground, without the surface wave.
// Each segment's integral of its linear current is taken in closed form.
#pragma once

#include <Eigen/Core>
#include <complex>
#include <cstdint>
#include <functional>
#include <vector>

#include "ground/reflection.hpp"
#include "wirefield/simulation.hpp"

namespace wirefield::post {

using Vec3 = Eigen::Vector3d;
using CVec3 = Eigen::Vector3cd;

// The grid RadiatedPower integrates on: `panels` composite 8-point Gauss-Legendre panels in
// cos(theta) and `phi_points` azimuths, from the band limit of the pattern, about
// k * radius harmonics in each angle.
struct PowerGrid {
  int panels = 0;
  int phi_points = 0;
  int rings() const { return 8 * panels; }  // elevations
  long long directions() const { return static_cast<long long>(rings()) * phi_points; }
};

// The grid for wavenumber k and a source (with its image) within radius_m of its centre.
PowerGrid PowerGridFor(double wavenumber_per_m, double radius_m);

// A radiating source: segment currents ready for far-field sums (images included).
class FarFieldSource {
 public:
  FarFieldSource(const std::vector<SegmentCurrent>& currents, double frequency_hz,
                 const GroundSpec& ground);

  // r e^{jkr} (E_theta, E_phi) in volts in the direction (theta, phi), radians
  // (theta from the zenith), r measured from the origin.
  std::pair<Complex, Complex> Field(double theta_rad, double phi_rad) const;
  // The same with r measured from centre(): equal in magnitude, and the same to the bit for
  // a copy of the antenna moved sideways (or anywhere, in free space). Gains come from it.
  std::pair<Complex, Complex> CentredField(double theta_rad, double phi_rad) const;
  // exp(jk rhat . centre): Field = CentredField times this.
  Complex CentrePhase(double theta_rad, double phi_rad) const;

  // Radiation intensity U = r^2 |E|^2 / (2 eta), W/sr, for peak phasors.
  double Intensity(double theta_rad, double phi_rad) const;

  // Power radiated: U integrated over the sphere (free space) or the upper half-space, on
  // power_grid(), whose elevations are shared out over `threads` threads (the sum is the
  // same to the bit for any count). `done(n)` is called after each n directions.
  double RadiatedPower(int threads = 1, const std::function<void(int)>& done = {}) const;
  PowerGrid power_grid() const { return PowerGridFor(k_, extent_m_); }

  double wavenumber_per_m() const { return k_; }
  // The phase centre: the middle of the antenna's bounding box; over a ground its height is
  // 0 (the image mirrors in the ground plane, so only sideways moves leave the pair alike).
  const Vec3& centre_m() const { return centre_m_; }
  // Largest distance of a segment end (or its image) from centre_m().
  double extent_m() const { return extent_m_; }

 private:
  struct Element {
    int start, end;  // indices into points_
    Vec3 delta;      // end - start
    Complex i0, i1;  // current at start, end
  };
  int PointIndex(const Vec3& p);
  CVec3 RadiationVector(const Vec3& rhat) const;
  // The direct sum, and the same currents at the mirrored points (directions not mirrored).
  void RadiationVectors(const Vec3& rhat, CVec3* direct, CVec3* mirrored) const;

  std::vector<Element> elements_;
  std::vector<Vec3> points_;  // segment ends less centre_m_, shared by neighbours
  double k_ = 0.0;
  Vec3 centre_m_ = Vec3::Zero();
  double extent_m_ = 0.0;
  bool upper_half_only_ = false;
  ground::Ground ground_;
  // Identifies the points_ of this source (copies share it) for the per-thread cache of the
  // mirrored phases' factors in RadiationVectors.
  std::uint64_t id_ = 0;
};

}  // namespace wirefield::post
