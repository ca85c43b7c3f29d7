// Validation: the exact (Sommerfeld) half-space ground in the matrix. Checked against its two
// closed-form limits (no contrast: free space; infinite conductivity: the perfect image),
// reciprocity, the reflection-coefficient approximation far from the ground, where both must
// agree (Fresnel's plane-wave reflection is the far-zone limit of the Sommerfeld integrals),
// and the trend of a low dipole's feed resistance with height over average ground.
#include <gtest/gtest.h>

#include <cmath>
#include <iostream>
#include <string>

#include "fill/assemble.hpp"
#include "geometry/mesh.hpp"
#include "validation/test_models.hpp"

namespace wirefield {
namespace {

using testing::HorizontalDipole;
using testing::kUnitWavelengthHz;

constexpr double kC = 299792458.0;

GroundSpec Exact(double permittivity, double conductivity, double exact_below_m = 1e9) {
  GroundSpec g;
  g.kind = GroundKind::kReal;
  g.permittivity = permittivity;
  g.conductivity_s_per_m = conductivity;
  g.method = GroundMethod::kExact;
  g.exact_below_m = exact_below_m;
  return g;
}

// A horizontal dipole 0.2 wavelength up and a sloping wire above it (wavelength 1 m, segments
// of about 1/40 wavelength): every direction of current, with its image pairs.
Model TwoWires(const GroundSpec& ground) {
  Model m = HorizontalDipole(0.5, 1e-3, 21, 0.2);
  m.wires.push_back(testing::Wire("slant", {0.3, 0.2, 0.25}, {0.1, 0.5, 0.6}, 1e-3, 19));
  m.ground = ground;
  return m;
}

Eigen::MatrixXcd Matrix(const Model& m, double frequency_hz = kUnitWavelengthHz) {
  geometry::MeshOptions o;
  o.max_frequency_hz = frequency_hz;
  return fill::AssembleImpedance(geometry::BuildMesh(m, o), frequency_hz);
}

double RelativeDifference(const Eigen::MatrixXcd& a, const Eigen::MatrixXcd& b) {
  return (a - b).norm() / b.norm();
}

TEST(HalfSpaceGround, EmptySpaceBelowGivesTheFreeSpaceMatrix) {
  // eps_r = 1, sigma = 0: the half-space is vacuum, the reflection coefficients R_TE, R_TM and
  // R_q vanish, and the corrections cancel the perfect image exactly (Sommerfeld's identity,
  // ground/sommerfeld.hpp), so the matrix must be the free-space one. Tolerance 1e-6, as
  // required of the limit; the cancellation happens at the same quadrature points.
  const Eigen::MatrixXcd free_space = Matrix(TwoWires({}));
  const double error = RelativeDifference(Matrix(TwoWires(Exact(1.0, 0.0))), free_space);
  EXPECT_LT(error, 1e-6);
}

TEST(HalfSpaceGround, InfiniteConductivityGivesThePerfectGroundMatrix) {
  // As sigma grows, R_TE -> -1, R_TM -> 1 and R_q -> 0: the corrections vanish as
  // 1/sqrt(|eps_c|) and the matrix tends to the perfect ground's (image theory). At
  // sigma = 1e10 S/m, |eps_c| = 6e11 at this frequency: the departure must be below 1e-6, the
  // bound required of this limit (1/sqrt(6e11) is about 1.3e-6 of the image, a fraction of Z).
  GroundSpec perfect;
  perfect.kind = GroundKind::kPerfect;
  const Eigen::MatrixXcd image = Matrix(TwoWires(perfect));
  double previous = INFINITY;
  for (const double sigma : {1e4, 1e6, 1e8, 1e10}) {
    const double error = RelativeDifference(Matrix(TwoWires(Exact(10.0, sigma))), image);
    EXPECT_LT(error, previous) << "sigma " << sigma;
    previous = error;
  }
  EXPECT_LT(previous, 1e-6);
}

TEST(HalfSpaceGround, MatrixIsSymmetric) {
  // Reciprocity: the Galerkin matrix of a reciprocal medium is symmetric, Z = Z^T (Harrington,
  // Field Computation by Moment Methods, 1968, from memory); the half-space kernels are
  // symmetric under the exchange of source and observer. Here with a wire that comes down to
  // the ground (graded quadrature) and a low sloping wire.
  Model m = TwoWires(Exact(13.0, 5e-3));
  m.wires.push_back(testing::Wire("mast", {-0.6, 0.0, 0.0}, {-0.6, 0.0, 0.25}, 1e-3, 10));
  m.feeds.push_back(testing::Feed("base", "mast", PointKind::kStart, 0.0));
  const Eigen::MatrixXcd z = Matrix(m);
  EXPECT_LT((z - z.transpose()).norm(), 1e-12 * z.norm());
}

TEST(HalfSpaceGround, FarFromTheGroundItAgreesWithTheReflectionCoefficients) {
  // A wavelength up, the Fresnel coefficients at the specular point describe the reflected
  // field to O(1/(k R')) (the stationary-phase limit of the Sommerfeld integrals; Banos,
  // Dipole Radiation in the Presence of a Conducting Half-Space, 1966, from memory): the feed
  // impedances must agree to well under 1%: 0.5%, some ten times the O(1/(k R')^2) term here.
  const double f = 14.2e6, lambda = kC / f;
  for (const GroundSpec& g : {Exact(13.0, 5e-3), Exact(3.0, 1e-4), Exact(30.0, 1e-2)}) {
    Model m = HorizontalDipole(0.48 * lambda, 1e-3, 21, lambda);
    GroundSpec approx = g;
    approx.method = GroundMethod::kReflection;
    m.ground = g;
    const Complex exact = testing::SolveFeedImpedance(m, f);
    m.ground = approx;
    const Complex reflection = testing::SolveFeedImpedance(m, f);
    EXPECT_LT(std::abs(exact - reflection) / std::abs(exact), 0.005)
        << exact << " vs " << reflection << " eps " << g.permittivity;
  }
}

TEST(HalfSpaceGround, LowDipoleResistanceFallsThenRisesOverLossyGround) {
  // A horizontal half-wave dipole over average ground (13, 5 mS/m; common practice): its feed
  // resistance falls well below the free-space value (about 73 ohm) under about 0.15
  // wavelength and rises again very close to the lossy ground, where the ground's loss
  // dominates (REFERENCES.md §8, common practice).
  const double f = 14.2e6, lambda = kC / f;
  auto resistance = [&](double height_wavelengths) {
    Model m = HorizontalDipole(0.48 * lambda, 1e-3, 21, height_wavelengths * lambda);
    m.ground = Exact(13.0, 5e-3);
    return testing::SolveFeedImpedance(m, f).real();
  };
  const double r02 = resistance(0.02), r05 = resistance(0.05), r10 = resistance(0.1),
               r15 = resistance(0.15), r30 = resistance(0.3);
  EXPECT_LT(r10, 60.0) << r10;
  EXPECT_LT(r10, r30) << r10 << " " << r30;
  EXPECT_LT(r15, r30) << r15 << " " << r30;
  EXPECT_GT(r02, std::min(r05, r10)) << r02 << " " << r05 << " " << r10;
}

TEST(HalfSpaceGround, TheTableAddsUnderAHundredthOfAPercentToALowModel) {
  // What the table's interpolation adds inside the matrix: a 14.2 MHz half-wave dipole 0.05
  // wavelength over very dry, average and wet ground (3 / 0.1 mS/m, 13 / 5 mS/m, 30 / 10 mS/m:
  // ITU-R P.527-3 (from memory) and common practice, REFERENCES.md §2.1) with a low sloping
  // wire beside it, filled once through the table and once with the correction integrated
  // directly at every quadrature point (GroundSpec::half_space_table = false). The reference
  // is the same Sommerfeld integrals without interpolation, so the difference is the table's.
  // Measured (30 unknowns), very dry / average / wet: matrix 1.1e-8 / 2.6e-9 / 2.6e-9
  // relative (Frobenius), feed impedance 2.7e-6 / 2.1e-6 / 3.6e-6 relative (75.31 - j6.80,
  // 60.41 - j7.81, 47.98 - j12.84 ohm). Bounds 1e-6 and 1e-4: the table's pointwise error is
  // under 1e-3 of the image (tests/unit/ground/sommerfeld_test.cpp) and the corrections are a
  // small part of Z; 1e-4 of the impedance is a three-hundredth of the 3% to which the exact
  // ground must agree with an independent computation, and the margins over the measured
  // figures (some 100 and 20) leave room for other meshes.
  const double f = 14.2e6, lambda = kC / f;
  for (const auto& [eps_r, sigma] :
       {std::pair{3.0, 1e-4}, std::pair{13.0, 5e-3}, std::pair{30.0, 1e-2}}) {
    Model m = HorizontalDipole(0.48 * lambda, 1e-3, 21, 0.05 * lambda);
    m.wires.push_back(
        testing::Wire("slope", {-2.0, 2.0, 0.6}, {3.0, 5.0, 3.5}, 1e-3, 11));  // metres
    m.ground = Exact(eps_r, sigma);
    const Eigen::MatrixXcd z_table = Matrix(m, f);
    const Complex feed_table = testing::SolveFeedImpedance(m, f);
    m.ground.half_space_table = false;
    const Eigen::MatrixXcd z_direct = Matrix(m, f);
    const Complex feed_direct = testing::SolveFeedImpedance(m, f);
    ASSERT_EQ(z_table.rows(), z_direct.rows());
    EXPECT_GE(z_table.rows(), 20);
    EXPECT_LE(z_table.rows(), 40);
    const double matrix_error = RelativeDifference(z_table, z_direct);
    const double feed_error = std::abs(feed_table - feed_direct) / std::abs(feed_direct);
    std::cout << eps_r << " unknowns " << z_table.rows() << ", matrix " << matrix_error << ", feed "
              << feed_error << " (table " << feed_table << ", direct " << feed_direct << ")\n";
    EXPECT_GT(matrix_error, 0.0) << eps_r;  // the two fills did take different paths
    EXPECT_LT(matrix_error, 1e-6) << eps_r;
    EXPECT_LT(feed_error, 1e-4) << eps_r;
  }
}

// A 7.1 MHz (near) quarter-wave vertical fed at the centre of four level quarter-wave radials, all
// radials_m above the ground (the campsite mast of models/campsite_elevated_radials.wire).
Model ElevatedRadials(double radials_m, const GroundSpec& ground) {
  const double quarter = 71.3 / 7.1;  // 71.3/f(MHz) m (REFERENCES.md §8, common practice)
  const double mast_m = 10.6;         // trimmed in the demo model for resonance at 2 m
  Model m;
  m.file = "radials";
  m.wires.push_back(testing::Wire("mast", {0, 0, radials_m}, {0, 0, radials_m + mast_m}, 1e-3, 12));
  const double directions[4][2] = {{1, 0}, {0, 1}, {-1, 0}, {0, -1}};
  for (int r = 0; r < 4; ++r) {
    m.wires.push_back(testing::Wire(
        "radial" + std::to_string(r), {0, 0, radials_m},
        {quarter * directions[r][0], quarter * directions[r][1], radials_m}, 1e-3, 10));
  }
  m.feeds.push_back(testing::Feed("base", "mast", PointKind::kStart, 0.0));
  m.ground = ground;
  return m;
}

TEST(HalfSpaceGround, LowRadialsLoseMorePowerInTheGround) {
  // Elevated radials close to lossy ground induce ground currents under them: the lower they
  // hang, the more power the ground near the antenna absorbs, seen at the feed as a larger
  // ground-loss resistance in series with the radiation resistance (REFERENCES.md §8: a
  // quarter-wave vertical shows its radiation resistance plus the ground-loss resistance,
  // common practice; raising the radials cuts that loss, and trade reports put significant
  // loss below about a sixteenth of a wavelength, 2.6 m here (common practice); Severns, "A
  // closer look at vertical antennas with elevated ground systems", on his measurements of
  // four elevated radials against many on the ground (title and subject confirmed)). Asserted:
  // - the ground-loss resistance R_loss = R_in (1 - efficiency) (input minus radiated power,
  //   per half the squared feed current) falls with every step of height, 0.3 m to 3 m (the
  //   published trend), and so does the feed resistance R_in;
  // - over the lossy ground the efficiency stays below 1 (a passive absorber takes power);
  // - over a perfect ground the same antenna loses nothing: efficiency 1 to the pattern
  //   integration's accuracy (energy conservation; 2%).
  // Measured (this build), R_in / efficiency / R_loss: 0.3 m 39.2 ohm / 0.284 / 28.1 ohm;
  // 0.5 m 38.0 / 0.287 / 27.1; 1 m 35.7 / 0.291 / 25.3; 2 m 32.2 / 0.289 / 22.9; 3 m 29.5 /
  // 0.282 / 21.2. The efficiency itself barely moves (0.282 to 0.291, highest at 1 m): a
  // vertical over average ground loses much of its low-angle space wave in the ground's
  // reflection whatever its radials (|Gamma_v| well below 1 under the pseudo-Brewster angle,
  // REFERENCES.md §2.2), and as the whole antenna rises its radiation resistance R_in x
  // efficiency falls too (11.2 ohm at 0.3 m, 8.3 ohm at 3 m); so the efficiency is not asserted.
  const double f = 7.1e6;
  GroundSpec perfect;
  perfect.kind = GroundKind::kPerfect;
  const testing::Solved ideal = testing::SolveModel(ElevatedRadials(2.0, perfect), f);
  EXPECT_NEAR(ComputePattern(ideal.sim, ideal.result).power.efficiency, 1.0, 0.02);
  double previous_loss_ohm = INFINITY, previous_r_ohm = INFINITY;
  for (const double h : {0.3, 0.5, 1.0, 2.0, 3.0}) {
    const testing::Solved s = testing::SolveModel(ElevatedRadials(h, Exact(13.0, 5e-3)), f);
    const double efficiency = ComputePattern(s.sim, s.result).power.efficiency;
    const double r_ohm = s.result.feeds.at(0).impedance_ohm.real();
    const double loss_ohm = r_ohm * (1.0 - efficiency);
    std::cout << "radials at " << h << " m: Z " << s.result.feeds.at(0).impedance_ohm
              << " ohm, efficiency " << efficiency << ", ground-loss resistance " << loss_ohm
              << " ohm\n";
    EXPECT_LT(efficiency, 1.0) << h;
    EXPECT_LT(loss_ohm, previous_loss_ohm) << h;
    EXPECT_LT(r_ohm, previous_r_ohm) << h;
    previous_loss_ohm = loss_ohm;
    previous_r_ohm = r_ohm;
  }
}

TEST(HalfSpaceGround, AWireInTheGroundIsRefused) {
  // The fill assumes both points of every pair in the air: a wire below z = 0 or lying on the
  // soil would be computed wrongly, so it is an input error naming the wire.
  Model m = HorizontalDipole(0.5, 1e-3, 21, -0.1);
  m.ground = Exact(13.0, 5e-3);
  geometry::MeshOptions o;
  o.max_frequency_hz = kUnitWavelengthHz;
  try {
    geometry::BuildMesh(m, o);
    FAIL() << "a buried wire was accepted";
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("goes below the real ground"), std::string::npos)
        << e.what();
  }
  m = HorizontalDipole(0.5, 1e-3, 21, 0.0005);
  m.ground = Exact(13.0, 5e-3);
  EXPECT_THROW(geometry::BuildMesh(m, o), InputError);
}

}  // namespace
}  // namespace wirefield
