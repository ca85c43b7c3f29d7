// Post stage: the scalar potential of segment charges (see charge_potential.hpp).
#include "post/charge_potential.hpp"

#include <Eigen/Core>
#include <algorithm>
#include <boost/math/quadrature/gauss.hpp>
#include <cmath>
#include <utility>

#include "core/constants.hpp"
#include "ground/reflection.hpp"

namespace wirefield::post {
namespace {

using Vec3 = Eigen::Vector3d;

// Gauss-Legendre points for the remainder (e^{-jkR} - 1)/R: it is bounded (-> -jk) and, on
// either side of the point's foot, varies on the scale of a wavelength, so 8 points on a
// segment of at most a tenth of a wavelength integrate it far below the thin-wire model's
// own error.
constexpr int kGaussPoints = 8;

Vec3 ToVec(const Point& p) { return Vec3(p[0], p[1], p[2]); }

}  // namespace

Complex SegmentPotentialIntegral(const Point& a, const Point& b, double radius_m, const Point& p,
                                 double wavenumber_per_m) {
  const Vec3 va = ToVec(a), vb = ToVec(b), vp = ToVec(p);
  const double length_m = (vb - va).norm();
  if (!(length_m > 0.0)) return Complex{0.0, 0.0};
  const Vec3 t = (vb - va) / length_m;
  const double s0 = (vp - va).dot(t);  // the point's abscissa along the segment
  const double rho2 = std::max(0.0, (vp - va).squaredNorm() - s0 * s0);
  const double rho_m = std::sqrt(rho2 + radius_m * radius_m);  // reduced distance off the axis
  // int_0^L ds / sqrt((s - s0)^2 + rho^2) in closed form.
  const double static_part = std::asinh((length_m - s0) / rho_m) + std::asinh(s0 / rho_m);
  const double k = wavenumber_per_m;
  auto remainder = [&](double s) {
    const double r = std::sqrt((s - s0) * (s - s0) + rho_m * rho_m);
    return (std::exp(Complex{0.0, -k * r}) - 1.0) / r;
  };
  auto re = [&](double s) { return remainder(s).real(); };
  auto im = [&](double s) { return remainder(s).imag(); };
  // The remainder has a kink of width ~radius where the point's foot s0 lies on the segment
  // (it goes as |s - s0| there), so the rule is applied on either side of it.
  using Gauss = boost::math::quadrature::gauss<double, kGaussPoints>;
  const double foot = std::clamp(s0, 0.0, length_m);
  double re_sum = 0.0, im_sum = 0.0;
  for (const auto& [from, to] : {std::pair{0.0, foot}, std::pair{foot, length_m}}) {
    if (!(to > from)) continue;
    re_sum += Gauss::integrate(re, from, to);
    im_sum += Gauss::integrate(im, from, to);
  }
  return Complex{static_part + re_sum, im_sum};
}

Complex ScalarPotential(const std::vector<ChargedSegment>& segments, double frequency_hz,
                        const GroundSpec& ground, const Point& point_m) {
  const double omega = 2.0 * core::kPi * frequency_hz;
  const double k = omega / core::kSpeedOfLight_m_per_s;
  // The charge image of a quasi-static ground: -1 for a perfect conductor,
  // -(eps_c - 1)/(eps_c + 1) for a lossy half-space, none in free space.
  Complex image{0.0, 0.0};
  if (ground.kind == GroundKind::kPerfect) {
    image = -1.0;
  } else if (ground.kind == GroundKind::kReal) {
    const Complex eps_c =
        ground::ComplexPermittivity(ground.permittivity, ground.conductivity_s_per_m, frequency_hz);
    image = -(eps_c - 1.0) / (eps_c + 1.0);
  }
  const Complex j{0.0, 1.0};
  Complex sum{0.0, 0.0};
  for (const ChargedSegment& s : segments) {
    const SegmentCurrent& c = s.current;
    // Total charge of the segment (j / omega)(I_end - I_start); as a line density over L.
    const double length_m = (ToVec(c.end_m) - ToVec(c.start_m)).norm();
    if (!(length_m > 0.0)) continue;
    const Complex q_per_m = j / omega * (c.current_end_a - c.current_start_a) / length_m;
    sum += q_per_m * SegmentPotentialIntegral(c.start_m, c.end_m, s.radius_m, point_m, k);
    if (image != Complex{0.0, 0.0}) {
      const Point a{c.start_m[0], c.start_m[1], -c.start_m[2]};
      const Point b{c.end_m[0], c.end_m[1], -c.end_m[2]};
      sum += image * q_per_m * SegmentPotentialIntegral(a, b, s.radius_m, point_m, k);
    }
  }
  return sum / (4.0 * core::kPi * core::kEps0_f_per_m);
}

}  // namespace wirefield::post
