// Unit tests of post/charge_potential: the scalar potential of segment charges against
// Coulomb's law, image theory, and a brute-force integration of the thin-wire kernel.
#include "post/charge_potential.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <complex>

#include "core/constants.hpp"

namespace wirefield::post {
namespace {

// One segment along z from z0 to z1 whose current rises linearly from 0 to 1 A: its charge is
// Q = (j / omega)(I_end - I_start) (continuity, dI/dl = -j omega q).
ChargedSegment RisingSegment(double z0, double z1, double radius_m) {
  SegmentCurrent c;
  c.start_m = {0.0, 0.0, z0};
  c.end_m = {0.0, 0.0, z1};
  c.current_start_a = 0.0;
  c.current_end_a = 1.0;
  c.current_a = 0.5;
  return ChargedSegment{c, radius_m};
}

TEST(ChargePotential, FarFromASmallChargeItIsCoulombsLaw) {
  // 1 kHz, a 0.1 m segment seen from 10 m: k r = 2e-4 and (L / r)^2 = 1e-4, so the static
  // point-charge law holds to about 1e-3; the tolerance is that size.
  const double f_hz = 1e3;
  const double omega = 2.0 * core::kPi * f_hz;
  const std::vector<ChargedSegment> segments{RisingSegment(-0.05, 0.05, 1e-3)};
  const Point p{10.0, 0.0, 0.0};
  const Complex phi = ScalarPotential(segments, f_hz, GroundSpec{}, p);
  // Coulomb: phi = Q / (4 pi eps0 r), Q = j / omega coulomb (any electrostatics text).
  const Complex q = Complex{0.0, 1.0} / omega;
  const Complex expected = q / (4.0 * core::kPi * core::kEps0_f_per_m * 10.0);
  EXPECT_NEAR(std::abs(phi - expected) / std::abs(expected), 0.0, 1e-3);
}

TEST(ChargePotential, APerfectGroundHoldsTheGroundPlaneAtZero) {
  // Image theory: a charge above a perfect conductor and its opposite image give zero
  // potential on the plane z = 0 (any electrostatics text, method of images).
  GroundSpec perfect;
  perfect.kind = GroundKind::kPerfect;
  const std::vector<ChargedSegment> segments{RisingSegment(2.0, 2.5, 1e-3)};
  const Complex on_plane = ScalarPotential(segments, 1e6, perfect, Point{3.0, 1.0, 0.0});
  const Complex above = ScalarPotential(segments, 1e6, perfect, Point{3.0, 1.0, 2.0});
  // Rounding only: the two sums cancel term by term.
  EXPECT_LT(std::abs(on_plane), 1e-9 * std::abs(above));
}

TEST(ChargePotential, SegmentIntegralMatchesBruteForceQuadrature) {
  // The closed-form static part plus Gauss-Legendre remainder against a midpoint rule with
  // 200000 points of e^{-jkR}/R (R the reduced distance): the midpoint rule's own error at
  // this step is below 1e-6 relative, the tolerance.
  const Point a{0.0, 0.0, 0.0}, b{0.0, 0.0, 0.5};
  const double radius_m = 2e-3, k = 2.0 * core::kPi / 20.0;  // 15 MHz
  for (const Point& p : {Point{0.0, 0.0, 0.25}, Point{0.0, 0.0, 0.6}, Point{0.3, 0.1, 0.4}}) {
    const Complex got = SegmentPotentialIntegral(a, b, radius_m, p, k);
    const int n = 200000;
    Complex sum{0.0, 0.0};
    for (int i = 0; i < n; ++i) {
      const double z = 0.5 * (i + 0.5) / n;
      const double r =
          std::sqrt(p[0] * p[0] + p[1] * p[1] + (p[2] - z) * (p[2] - z) + radius_m * radius_m);
      sum += std::exp(Complex{0.0, -k * r}) / r * (0.5 / n);
    }
    EXPECT_NEAR(std::abs(got - sum) / std::abs(sum), 0.0, 1e-6) << p[0] << " " << p[2];
  }
}

}  // namespace
}  // namespace wirefield::post
