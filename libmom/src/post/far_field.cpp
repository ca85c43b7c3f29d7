// Post stage: far field, radiation intensity and radiated power of segment currents, with the
// wave reflected by the ground when there is one.
// Integration over the sphere: composite 8-point Gauss-Legendre in cos(theta) and the
// trapezoid rule in phi (exact for the band-limited periodic integrand), both with a number of
// points that grows with the electrical size k * extent of the antenna and its image.
#include "post/far_field.hpp"

#include <atomic>
#include <boost/math/quadrature/gauss.hpp>
#include <cmath>

#include "core/constants.hpp"
#include "core/parallel.hpp"

namespace wirefield::post {
namespace {

// e_s int_0^1 exp(j psi t) dt and e_s int_0^1 t exp(j psi t) dt with e_e = e_s exp(j psi):
// the phases of the two ends come in, so no exponential is evaluated here. Series for small
// psi, where the closed form cancels.
void LinearPhaseIntegrals(double psi, Complex e_s, Complex e_e, Complex* a0, Complex* a1) {
  if (std::abs(psi) < 1e-2) {
    const double p2 = psi * psi;
    *a0 = e_s * Complex(1.0 - p2 / 6.0 + p2 * p2 / 120.0, psi / 2.0 - p2 * psi / 24.0);
    *a1 = e_s * Complex(0.5 - p2 / 8.0 + p2 * p2 / 144.0, psi / 3.0 - p2 * psi / 30.0);
    return;
  }
  // a0 = (e_e - e_s) / (j psi), a1 = e_e / (j psi) + (e_e - e_s) / psi^2, written out.
  const double inv = 1.0 / psi, inv2 = inv * inv;
  const Complex diff = e_e - e_s;
  *a0 = Complex(diff.imag() * inv, -diff.real() * inv);
  *a1 = Complex(e_e.imag() * inv + diff.real() * inv2, -e_e.real() * inv + diff.imag() * inv2);
}

// Sum over elements of delta (i0 a0 + (i1 - i0) a1), a0 and a1 as LinearPhaseIntegrals gives
// them from the phases of the ends, with the products written out in real arithmetic (the
// complex operators' checks for infinite parts, which cannot occur here, cost the loop a
// branch per product, and Eigen multiplies the real delta as a complex vector).
template <typename Element>
CVec3 SumElements(const std::vector<Element>& elements, const std::vector<Complex>& phase,
                  const Vec3& k_rhat) {
  double sx_re = 0.0, sx_im = 0.0, sy_re = 0.0, sy_im = 0.0, sz_re = 0.0, sz_im = 0.0;
  for (const Element& e : elements) {
    Complex a0, a1;
    LinearPhaseIntegrals(k_rhat.dot(e.delta), phase[e.start], phase[e.end], &a0, &a1);
    const Complex di = e.i1 - e.i0;
    const double c_re = e.i0.real() * a0.real() - e.i0.imag() * a0.imag() + di.real() * a1.real() -
                        di.imag() * a1.imag();
    const double c_im = e.i0.real() * a0.imag() + e.i0.imag() * a0.real() + di.real() * a1.imag() +
                        di.imag() * a1.real();
    sx_re += e.delta.x() * c_re;
    sx_im += e.delta.x() * c_im;
    sy_re += e.delta.y() * c_re;
    sy_im += e.delta.y() * c_im;
    sz_re += e.delta.z() * c_re;
    sz_im += e.delta.z() * c_im;
  }
  return CVec3(Complex(sx_re, sx_im), Complex(sy_re, sy_im), Complex(sz_re, sz_im));
}

}  // namespace

PowerGrid PowerGridFor(double wavenumber_per_m, double radius_m) {
  // Angular band limit of the pattern: about k * radius harmonics in each angle, radius taken
  // from the phase centre (the intensity does not change when the antenna moves, so neither
  // may its grid).
  const int bandwidth = static_cast<int>(std::ceil(wavenumber_per_m * radius_m)) + 8;
  return {std::max(4, bandwidth / 4 + 2), std::max(16, 2 * bandwidth + 2)};
}

FarFieldSource::FarFieldSource(const std::vector<SegmentCurrent>& currents, double frequency_hz,
                               const GroundSpec& ground)
    : k_(2.0 * core::kPi * frequency_hz / core::kSpeedOfLight_m_per_s),
      upper_half_only_(ground.kind != GroundKind::kFree),
      ground_(ground, frequency_hz) {
  // The phase centre: the middle of the bounding box, at height 0 over a ground.
  if (!currents.empty()) {
    Vec3 lo = Vec3::Constant(INFINITY), hi = Vec3::Constant(-INFINITY);
    for (const SegmentCurrent& c : currents) {
      for (const auto& p : {c.start_m, c.end_m}) {
        const Vec3 v(p[0], p[1], p[2]);
        lo = lo.cwiseMin(v);
        hi = hi.cwiseMax(v);
      }
    }
    centre_m_ = 0.5 * (lo + hi);
    if (upper_half_only_) centre_m_.z() = 0.0;
  }
  for (const SegmentCurrent& c : currents) {
    const Vec3 a = Vec3(c.start_m[0], c.start_m[1], c.start_m[2]) - centre_m_;
    const Vec3 b = Vec3(c.end_m[0], c.end_m[1], c.end_m[2]) - centre_m_;
    elements_.push_back({PointIndex(a), PointIndex(b), b - a, c.current_start_a, c.current_end_a});
    // Over a ground the image lies as far from the centre (height 0) as the wire itself.
    extent_m_ = std::max({extent_m_, a.norm(), b.norm()});
  }
  static std::atomic<std::uint64_t> next_id{1};
  id_ = next_id++;
}

int FarFieldSource::PointIndex(const Vec3& p) {
  // Consecutive segments share ends: look back a few points only (linear cost overall).
  const int n = static_cast<int>(points_.size());
  for (int i = n - 1; i >= std::max(0, n - 4); --i) {
    if (points_[i] == p) return i;
  }
  points_.push_back(p);
  return n;
}

void FarFieldSource::RadiationVectors(const Vec3& rhat, CVec3* direct, CVec3* mirrored) const {
  thread_local std::vector<Complex> phase;
  phase.resize(points_.size());
  for (size_t i = 0; i < points_.size(); ++i) phase[i] = std::polar(1.0, k_ * rhat.dot(points_[i]));
  // int_0^1 (i0 + (i1 - i0) t) exp(jk rhat.(start + delta t)) dt, times the length vector.
  *direct = SumElements(elements_, phase, k_ * rhat);
  if (!mirrored) return;
  // Mirrored points: rhat . (x, y, -z) = rhat . (x, y, z) - 2 rhat_z z, so each mirrored phase
  // is the direct one times exp(-2jk rhat_z z). Those factors depend on the elevation only, and
  // the pattern grid and the power integration sweep the azimuth at one elevation: they are
  // kept per thread while the source and rhat_z stay the same (one sine and cosine per point
  // and direction instead of two).
  thread_local std::vector<Complex> lift;
  thread_local std::uint64_t lift_source = 0;
  thread_local double lift_rz = 0.0;
  if (lift_source != id_ || lift_rz != rhat.z() || lift.size() != points_.size()) {
    lift.resize(points_.size());
    for (size_t i = 0; i < points_.size(); ++i) {
      lift[i] = std::polar(1.0, -2.0 * k_ * rhat.z() * points_[i].z());
    }
    lift_source = id_;
    lift_rz = rhat.z();
  }
  const Vec3 rm(rhat.x(), rhat.y(), -rhat.z());
  for (size_t i = 0; i < points_.size(); ++i) {
    const Complex p = phase[i], f = lift[i];
    phase[i] = Complex(p.real() * f.real() - p.imag() * f.imag(),
                       p.real() * f.imag() + p.imag() * f.real());
  }
  *mirrored = SumElements(elements_, phase, k_ * rm);
}

CVec3 FarFieldSource::RadiationVector(const Vec3& rhat) const {
  CVec3 direct, mirrored;
  if (!ground_.reflects()) {
    RadiationVectors(rhat, &direct, nullptr);
    return direct;
  }
  RadiationVectors(rhat, &direct, &mirrored);
  // Below the horizon there is no field over a ground (the caller integrates z >= 0 only).
  return direct + ground_.WeightsToward(rhat).vector_dyadic * mirrored;
}

std::pair<Complex, Complex> FarFieldSource::CentredField(double theta_rad, double phi_rad) const {
  const double st = std::sin(theta_rad), ct = std::cos(theta_rad);
  const double sp = std::sin(phi_rad), cp = std::cos(phi_rad);
  const Vec3 rhat(st * cp, st * sp, ct);
  const Vec3 theta_hat(ct * cp, ct * sp, -st);
  const Vec3 phi_hat(-sp, cp, 0.0);
  const CVec3 n = RadiationVector(rhat);
  const Complex factor(0.0, -k_ * core::kEta0_ohm / (4.0 * core::kPi));
  return {factor * theta_hat.cast<Complex>().dot(n), factor * phi_hat.cast<Complex>().dot(n)};
}

Complex FarFieldSource::CentrePhase(double theta_rad, double phi_rad) const {
  const double st = std::sin(theta_rad);
  const Vec3 rhat(st * std::cos(phi_rad), st * std::sin(phi_rad), std::cos(theta_rad));
  return std::polar(1.0, k_ * rhat.dot(centre_m_));
}

std::pair<Complex, Complex> FarFieldSource::Field(double theta_rad, double phi_rad) const {
  // Back from the centre to the origin: the whole source moved by centre_m_.
  const auto [et, ep] = CentredField(theta_rad, phi_rad);
  const Complex shift = CentrePhase(theta_rad, phi_rad);
  return {et * shift, ep * shift};
}

double FarFieldSource::Intensity(double theta_rad, double phi_rad) const {
  const auto [et, ep] = CentredField(theta_rad, phi_rad);
  return (std::norm(et) + std::norm(ep)) / (2.0 * core::kEta0_ohm);
}

double FarFieldSource::RadiatedPower(int threads, const std::function<void(int)>& done) const {
  const PowerGrid grid = power_grid();
  using G = boost::math::quadrature::gauss<double, 8>;
  // The 8-point rule stores its 4 non-negative abscissae: ring r is panel r / 8, abscissa
  // (r % 8) / 2, on the side r % 2.
  const double u_lo = upper_half_only_ ? 0.0 : -1.0;
  const double panel = (1.0 - u_lo) / grid.panels;
  // Each elevation's weighted ring sum on its own, then added in order: the same to the bit
  // for any thread count.
  std::vector<double> rings(static_cast<size_t>(grid.rings()));
  core::ParallelFor(threads, static_cast<size_t>(grid.rings()), [&](size_t ring_index) {
    const int r = static_cast<int>(ring_index);
    const int p = r / 8, i = (r % 8) / 2, sign = r % 2 == 0 ? -1 : 1;
    const double mid = u_lo + (p + 0.5) * panel;
    const double u = mid + sign * 0.5 * panel * G::abscissa()[i];
    const double w = 0.5 * panel * G::weights()[i];
    const double theta = std::acos(std::clamp(u, -1.0, 1.0));
    double ring = 0.0;
    for (int q = 0; q < grid.phi_points; ++q) {
      ring += Intensity(theta, 2.0 * core::kPi * q / grid.phi_points);
    }
    rings[r] = w * ring * (2.0 * core::kPi / grid.phi_points);
    if (done) done(grid.phi_points);
  });
  double power = 0.0;
  for (double ring : rings) power += ring;
  return power;
}

}  // namespace wirefield::post
