// Unit tests of the ground stage: the Fresnel coefficients of a flat lossy ground and the
// image weights of the reflection-coefficient approximation, against the textbook formulas
// (REFERENCES.md §2.2: Balanis, Advanced Engineering Electromagnetics, 2nd ed., ch. 5, from
// memory) at angles where they have closed forms.
#include "ground/reflection.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

namespace wirefield::ground {
namespace {

constexpr double kPi = std::numbers::pi;
constexpr double kDeg = kPi / 180.0;

TEST(ComplexPermittivity, ImaginaryPartIsSigmaOverOmegaEps0) {
  // eps_c = eps_r - j sigma / (omega eps0) = eps_r - j 17975 sigma / f_MHz (REFERENCES.md
  // §2.2; the constant 1 / (2 pi eps0) / 1e6 = 17 975 follows from eps0 = 8.8541878e-12 F/m).
  const Complex e = ComplexPermittivity(15.0, 1e-3, 14.2e6);
  EXPECT_DOUBLE_EQ(e.real(), 15.0);
  EXPECT_NEAR(e.imag(), -17975.1 * 1e-3 / 14.2, 1e-3);
}

TEST(Fresnel, GrazingIncidenceGivesMinusOneForBothPolarizations) {
  // At psi -> 0 both coefficients tend to -1 (magnitude 1, phase pi) over any finite ground
  // (REFERENCES.md §2.2; standard texts).
  for (const Complex eps : {Complex(3.0, -0.1), Complex(15.0, -1.27), Complex(70.0, -6330.0)}) {
    for (const Complex g : {FresnelHorizontal(eps, 0.0), FresnelVertical(eps, 0.0)}) {
      EXPECT_NEAR(std::abs(g), 1.0, 1e-12);
      EXPECT_NEAR(std::abs(std::arg(g)), kPi, 1e-12);
    }
  }
}

TEST(Fresnel, AGroundEqualToFreeSpaceReflectsNothingAtAnyAngle) {
  // eps_c = 1: there is no interface, and both coefficients vanish at every angle, grazing
  // included (Fresnel equations with n = 1: the numerators vanish identically; standard texts,
  // REFERENCES.md §2.2). Zero is exact: the numerators cancel term by term. Near grazing
  // incidence cos^2 psi rounds to 1, which once made both coefficients +1.
  const Complex eps = ComplexPermittivity(1.0, 0.0, 14.2e6);
  for (double psi_deg = 0.0; psi_deg <= 90.0; psi_deg += 0.25) {
    EXPECT_EQ(FresnelHorizontal(eps, psi_deg * kDeg), Complex(0.0)) << psi_deg << " deg";
    EXPECT_EQ(FresnelVertical(eps, psi_deg * kDeg), Complex(0.0)) << psi_deg << " deg";
  }
  for (const double psi_rad : {1e-300, 1e-17, 6.123e-17, 1e-9, 1e-6}) {
    EXPECT_EQ(FresnelHorizontal(eps, psi_rad), Complex(0.0)) << psi_rad << " rad";
    EXPECT_EQ(FresnelVertical(eps, psi_rad), Complex(0.0)) << psi_rad << " rad";
  }
}

TEST(Fresnel, ANearlyFreeGroundStillReflectsFullyAtGrazingIncidence) {
  // For any eps_c != 1 both coefficients tend to -1 as psi -> 0 (standard texts,
  // REFERENCES.md §2.2): the limit eps_c -> 1 is not uniform in the angle, so only eps_c = 1
  // itself reflects nothing. 1e-6 away from 1, the coefficient at 1e-9 rad is -1 to 1e-5
  // (1 - Gamma ~ 2 psi / sqrt(eps_c - 1)).
  const Complex eps(1.0 + 1e-6, 0.0);
  EXPECT_NEAR(std::abs(FresnelHorizontal(eps, 1e-9) + 1.0), 0.0, 1e-5);
  EXPECT_NEAR(std::abs(FresnelVertical(eps, 1e-9) + 1.0), 0.0, 1e-5);
}

TEST(Fresnel, NormalIncidenceMatchesTheClosedForm) {
  // At normal incidence Gamma = (1 - n) / (1 + n) for E parallel to the ground, n = sqrt(eps);
  // for eps = 4 that is -1/3, and the in-plane (vertical) coefficient is its negative in the
  // convention of a perfect ground giving +1 (standard texts; REFERENCES.md §2.2).
  EXPECT_NEAR(std::abs(FresnelHorizontal(4.0, kPi / 2) + 1.0 / 3.0), 0.0, 1e-12);
  EXPECT_NEAR(std::abs(FresnelVertical(4.0, kPi / 2) - 1.0 / 3.0), 0.0, 1e-12);
}

TEST(Fresnel, LosslessGroundHasNoVerticalReflectionAtBrewstersAngle) {
  // Brewster's law: Gamma_v = 0 where tan(psi) = 1 / sqrt(eps_r) (grazing angle), for a
  // lossless dielectric; Gamma_h has no zero (standard texts).
  const double eps = 15.0;
  const double psi_b = std::atan(1.0 / std::sqrt(eps));
  EXPECT_NEAR(std::abs(FresnelVertical(eps, psi_b)), 0.0, 1e-12);
  EXPECT_GT(std::abs(FresnelHorizontal(eps, psi_b)), 0.5);
}

TEST(Fresnel, LossyGroundHasAPseudoBrewsterMinimumWherePhaseCrossesMinus90) {
  // Medium dry ground (15, 1 mS/m, ITU-R P.527-3, from memory) at 14.2 MHz: |Gamma_v| is
  // smallest near the lossless estimate arctan(1/sqrt(15)) = 14.48 deg, and its phase passes
  // -90 deg there (REFERENCES.md §2.2: behaviour from standard texts, from memory; the
  // computed minimum 14.45 deg). Search on a 0.001-degree grid.
  const Complex eps = ComplexPermittivity(15.0, 1e-3, 14.2e6);
  double best_psi = 0.0, best = 2.0;
  for (double psi_deg = 1.0; psi_deg < 40.0; psi_deg += 0.001) {
    const double g = std::abs(FresnelVertical(eps, psi_deg * kDeg));
    if (g < best) {
      best = g;
      best_psi = psi_deg;
    }
  }
  EXPECT_NEAR(best_psi, std::atan(1.0 / std::sqrt(15.0)) / kDeg, 0.1);
  EXPECT_LT(best, 0.05);
  EXPECT_NEAR(std::arg(FresnelVertical(eps, best_psi * kDeg)) / kDeg, -90.0, 1.0);
  // Below the minimum the phase is near -180 deg (the reflected wave cancels the direct one),
  // above it near 0 deg.
  EXPECT_LT(std::arg(FresnelVertical(eps, 3.0 * kDeg)) / kDeg, -150.0);
  EXPECT_GT(std::arg(FresnelVertical(eps, 60.0 * kDeg)) / kDeg, -30.0);
}

TEST(Fresnel, ConductivityToInfinityGivesThePerfectGround) {
  // sigma -> infinity: Gamma_h -> -1, Gamma_v -> +1 at every angle above grazing (the image
  // of a perfect conductor; standard texts). The departure falls as 1/sqrt(sigma).
  const Complex eps = ComplexPermittivity(15.0, 1e8, 14.2e6);
  for (const double psi_deg : {5.0, 30.0, 60.0, 90.0}) {
    EXPECT_NEAR(std::abs(FresnelHorizontal(eps, psi_deg * kDeg) + 1.0), 0.0, 1e-4);
    EXPECT_NEAR(std::abs(FresnelVertical(eps, psi_deg * kDeg) - 1.0), 0.0, 2e-3);
  }
}

TEST(ImageWeights, PerfectGroundGivesTheExactImage) {
  // Image theory: over a perfect conductor the image of a current (Jx, Jy, Jz) is
  // (-Jx, -Jy, Jz), its charge -q (Balanis, Antenna Theory, 3rd ed., §4.7.1, from memory).
  GroundSpec spec;
  spec.kind = GroundKind::kPerfect;
  const Ground g(spec, 14.2e6);
  const ImageWeights w = g.WeightsBetween(Vec3(1.0, 2.0, 3.0), Vec3(-2.0, 0.5, 1.0));
  EXPECT_NEAR(
      (w.vector_dyadic - Eigen::Vector3cd(-1.0, -1.0, 1.0).asDiagonal().toDenseMatrix()).norm(),
      0.0, 1e-15);
  EXPECT_NEAR(std::abs(w.charge_factor + 1.0), 0.0, 1e-15);
}

TEST(ImageWeights, SplitTheHorizontalCurrentIntoTheTwoPolarizations) {
  // Reflection-coefficient approximation: the horizontal current across the plane of
  // incidence reflects with Gamma_h, the one in it with -Gamma_v, the vertical one with
  // Gamma_v (the perfect-ground image with each polarization weighted by its Fresnel
  // coefficient; standard texts).
  GroundSpec spec;
  spec.kind = GroundKind::kReal;
  spec.permittivity = 13.0;
  spec.conductivity_s_per_m = 5e-3;
  const double f = 7.1e6;
  const Ground g(spec, f);
  const Vec3 source(0.0, 0.0, 4.0), observer(3.0, 4.0, 6.0);  // rho along (0.6, 0.8)
  const ImageWeights w = g.WeightsBetween(observer, source);
  const double psi = std::atan2(10.0, 5.0);
  const Complex eps = ComplexPermittivity(13.0, 5e-3, f);
  const Complex gv = FresnelVertical(eps, psi), gh = FresnelHorizontal(eps, psi);
  const Eigen::Vector3cd along(0.6, 0.8, 0.0), across(-0.8, 0.6, 0.0), up(0.0, 0.0, 1.0);
  EXPECT_NEAR((w.vector_dyadic * along + gv * along).norm(), 0.0, 1e-14);
  EXPECT_NEAR((w.vector_dyadic * across - gh * across).norm(), 0.0, 1e-14);
  EXPECT_NEAR((w.vector_dyadic * up - gv * up).norm(), 0.0, 1e-14);
  EXPECT_NEAR(std::abs(w.charge_factor + gv), 0.0, 1e-15);
  // The same pair seen the other way round: M is unchanged (reciprocity keeps Z symmetric).
  EXPECT_NEAR((g.WeightsBetween(source, observer).vector_dyadic - w.vector_dyadic).norm(), 0.0,
              1e-15);
}

}  // namespace
}  // namespace wirefield::ground
