// Validation: antennas over a real (lossy) ground, by the reflection-coefficient
// approximation in the matrix and the Fresnel-weighted reflected wave in the far field.
// Checked against image theory in the perfect-ground limit, the two-ray far field of a
// current element over a flat ground, the horizon null, reciprocity, energy, and the known
// behaviour of a vertical over land (REFERENCES.md §2.2).
#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

#include "fill/assemble.hpp"
#include "geometry/mesh.hpp"
#include "ground/reflection.hpp"
#include "post/far_field.hpp"
#include "validation/test_models.hpp"

namespace wirefield {
namespace {

using testing::HorizontalDipole;
using testing::kUnitWavelengthHz;
using testing::Solved;
using testing::SolveModel;

constexpr double kDeg = std::numbers::pi / 180.0;

// A real ground by the reflection-coefficient approximation, which this file checks (the exact
// half-space has its own checks in half_space_validation_test.cpp).
GroundSpec Real(double permittivity, double conductivity) {
  GroundSpec g;
  g.kind = GroundKind::kReal;
  g.permittivity = permittivity;
  g.conductivity_s_per_m = conductivity;
  g.method = GroundMethod::kReflection;
  return g;
}

GroundSpec Perfect() {
  GroundSpec g;
  g.kind = GroundKind::kPerfect;
  return g;
}

// A quarter-wave vertical fed at its base on the ground, wavelength 1 m.
Model Vertical(const GroundSpec& ground) {
  Model m;
  m.file = "vertical";
  m.wires.push_back(testing::Wire("mast", {0, 0, 0}, {0, 0, 0.25}, 1e-4, 20));
  m.feeds.push_back(testing::Feed("base", "mast", PointKind::kStart, 0.0));
  m.ground = ground;
  m.frequency_hz = kUnitWavelengthHz;
  return m;
}

TEST(RealGround, HighConductivityGivesThePerfectGroundImpedance) {
  // As sigma grows the Fresnel coefficients tend to the perfect-ground image (standard
  // texts; REFERENCES.md §2.2), so the matrix, and the feed impedance, must tend to the
  // perfect-ground ones: a horizontal dipole at 0.25 wavelength and a ground-fed vertical.
  // The departure of the coefficients falls as 1/sqrt(sigma).
  for (Model m : {HorizontalDipole(0.5, 1e-4, 21, 0.25), Vertical({})}) {
    m.ground = Perfect();
    const Complex perfect = testing::SolveFeedImpedance(m);
    double previous = INFINITY;
    for (const double sigma : {1e2, 1e4, 1e6, 1e8}) {
      m.ground = Real(10.0, sigma);
      const double error = std::abs(testing::SolveFeedImpedance(m) - perfect) / std::abs(perfect);
      EXPECT_LT(error, previous) << "sigma " << sigma;
      previous = error;
    }
    EXPECT_LT(previous, 1e-4);
  }
}

TEST(RealGround, SeaWaterIsCloseToPerfectGroundAtHf) {
  // Sea water (70, 5 S/m, ITU-R P.527-3, from memory) at 14.2 MHz: |eps_c| is about 6000, so
  // the Fresnel coefficients are within a few percent of the perfect ground's above a few
  // degrees of elevation, and a dipole's impedance follows (salt water acts as a near-perfect
  // ground at HF: common practice). Here at 14.2 MHz, 0.25 wavelength up.
  const double f = 14.2e6, lambda = 299792458.0 / f;
  Model m = HorizontalDipole(0.48 * lambda, 1e-3, 21, 0.25 * lambda);
  m.frequency_hz = f;
  m.ground = Perfect();
  const Complex perfect = testing::SolveFeedImpedance(m, f);
  m.ground = Real(70.0, 5.0);
  const Complex sea = testing::SolveFeedImpedance(m, f);
  EXPECT_LT(std::abs(sea - perfect) / std::abs(perfect), 0.02) << sea << " vs " << perfect;
}

TEST(RealGround, MatrixIsSymmetric) {
  // Reciprocity: the Galerkin matrix of a reciprocal medium is symmetric, Z = Z^T
  // (Harrington, Field Computation by Moment Methods, 1968, from memory); the reflection
  // weights are the same both ways, so it must hold to rounding over a lossy ground.
  Model m = HorizontalDipole(0.5, 1e-3, 15, 0.1);
  m.wires.push_back(testing::Wire("slant", {0.3, 0.2, 0.05}, {0.1, 0.5, 0.4}, 1e-3, 9));
  m.ground = Real(13.0, 5e-3);
  geometry::MeshOptions o;
  o.max_frequency_hz = kUnitWavelengthHz;
  const geometry::Mesh mesh = geometry::BuildMesh(m, o);
  const Eigen::MatrixXcd z = fill::AssembleImpedance(mesh, kUnitWavelengthHz);
  EXPECT_LT((z - z.transpose()).norm(), 1e-12 * z.norm());
}

TEST(RealGroundFarField, ElementOverGroundFollowsTheTwoRayFormula) {
  // The far field of a current element at height h over a flat ground is the direct wave plus
  // the wave reflected at the specular point: E = E_free (1 + Gamma(psi) exp(-j 2 k h sin psi)),
  // with Gamma_h for a horizontal element seen broadside (E across the plane of incidence) and
  // Gamma_v for a vertical one (standard texts; Balanis, Antenna Theory, 3rd ed., §4.8, from
  // memory). A short element of uniform current, lambda = 1 m.
  const double h = 0.3, f = kUnitWavelengthHz, k = 2.0 * std::numbers::pi;
  // 1 S/m at 300 MHz: eps_c = 15 - j60, a lossy ground at this scale.
  const GroundSpec ground = Real(15.0, 1.0);
  const Complex eps = ground::ComplexPermittivity(15.0, 1.0, f);
  for (const bool vertical : {false, true}) {
    SegmentCurrent c;
    c.start_m = vertical ? Point{0, 0, h - 0.005} : Point{-0.005, 0, h};
    c.end_m = vertical ? Point{0, 0, h + 0.005} : Point{0.005, 0, h};
    c.current_start_a = c.current_end_a = c.current_a = 1.0;
    const post::FarFieldSource free_space({c}, f, GroundSpec{});
    const post::FarFieldSource over_ground({c}, f, ground);
    for (const double psi_deg : {2.0, 10.0, 30.0, 60.0, 85.0}) {
      const double theta = (90.0 - psi_deg) * kDeg, phi = 90.0 * kDeg;  // broadside, y-z plane
      const auto [ft, fp] = free_space.Field(theta, phi);
      const auto [gt, gp] = over_ground.Field(theta, phi);
      const double psi = psi_deg * kDeg;
      const Complex gamma =
          vertical ? ground::FresnelVertical(eps, psi) : ground::FresnelHorizontal(eps, psi);
      const Complex factor = 1.0 + gamma * std::polar(1.0, -2.0 * k * h * std::sin(psi));
      const Complex expected = factor * (vertical ? ft : fp);
      const Complex got = vertical ? gt : gp;
      EXPECT_NEAR(std::abs(got - expected), 0.0, 1e-9 * std::abs(vertical ? ft : fp))
          << (vertical ? "vertical" : "horizontal") << " at " << psi_deg << " deg";
    }
  }
}

TEST(RealGroundFarField, HorizonIsANullOverAnyFiniteGround) {
  // At grazing incidence Gamma_h = Gamma_v = -1, so the reflected wave cancels the direct one
  // at zero elevation over any finite ground (standard texts; REFERENCES.md §2.2): a vertical
  // and a sloping dipole radiate nothing along the horizon.
  Model m = Vertical(Real(15.0, 1e-3));
  m.wires.push_back(testing::Wire("slope", {0.0, 0.0, 0.25}, {0.3, 0.1, 0.6}, 1e-4, 10));
  const Solved s = SolveModel(m);
  const PatternResult p = ComputePattern(s.sim, s.result);
  for (const double az : {0.0, 45.0, 200.0}) {
    const FarFieldPoint at_horizon = FarField(s.sim, s.result, 0.0, az);
    EXPECT_LT(at_horizon.gain_dbi, p.max_gain_dbi - 100.0) << "azimuth " << az;
  }
}

TEST(RealGround, AGroundEqualToFreeSpaceGivesTheFreeSpaceAntennaAtEveryElevation) {
  // eps_r = 1, sigma = 0 is no interface: the Fresnel coefficients vanish at every angle
  // (standard texts, REFERENCES.md §2.2), so the feed impedance and the gain in every
  // direction above the ground must be the free-space ones, the horizon included (where the
  // coefficients once came out +1 and the gain 6 dB too high). A horizontal dipole at 0.3
  // wavelength, both ground methods.
  Model free_model = HorizontalDipole(0.5, 1e-4, 21, 0.3);
  const Solved free_space = SolveModel(free_model);
  for (const GroundMethod method : {GroundMethod::kReflection, GroundMethod::kExact}) {
    Model m = free_model;
    m.ground = Real(1.0, 0.0);
    m.ground.method = method;
    const Solved s = SolveModel(m);
    const Complex z_free = free_space.result.feeds.at(0).impedance_ohm;
    // The exact half-space evaluates its integrals numerically: 1e-6 of |Z| is their accuracy
    // here; the reflection approximation multiplies the image by zero.
    EXPECT_NEAR(std::abs(s.result.feeds.at(0).impedance_ohm - z_free), 0.0, 1e-6 * std::abs(z_free))
        << "method " << static_cast<int>(method);
    for (double el = 0.0; el <= 90.0; el += 1.0) {
      for (const double az : {0.0, 30.0, 90.0}) {
        const double free_dbi = FarField(free_space.sim, free_space.result, el, az).gain_dbi;
        const double got_dbi = FarField(s.sim, s.result, el, az).gain_dbi;
        // 1e-4 dB: the impedance agrees to 1e-6, so the currents and the gain do too.
        EXPECT_NEAR(got_dbi, free_dbi, 1e-4)
            << "elevation " << el << " azimuth " << az << " method " << static_cast<int>(method);
      }
    }
  }
}

TEST(RealGround, VerticalOverMediumDryLosesGainAndLiftsItsTakeOffAngle) {
  // Over land, below the pseudo-Brewster angle the reflected wave nearly cancels the direct
  // one, so a vertical's maximum gain falls and its take-off angle rises above the horizon,
  // where over a perfect ground it is 5.16 dBi at zero elevation (REFERENCES.md §2.2,
  // standard, from memory; image theory for the perfect ground). Medium dry ground
  // (15, 1 mS/m, ITU-R P.527-3, from memory) at 14.2 MHz: a 5.28 m vertical.
  const double f = 14.2e6, lambda = 299792458.0 / f;
  auto pattern = [&](const GroundSpec& g) {
    Model m;
    m.file = "vertical";
    m.wires.push_back(testing::Wire("mast", {0, 0, 0}, {0, 0, 0.25 * lambda}, 1e-3, 20));
    m.feeds.push_back(testing::Feed("base", "mast", PointKind::kStart, 0.0));
    m.ground = g;
    m.frequency_hz = f;
    SimulationOptions o;
    o.max_frequency_hz = f;
    Simulation sim(m, o);
    const SolveResult r = sim.Solve(f);
    return ComputePattern(sim, r);
  };
  const PatternResult perfect = pattern(Perfect());
  const PatternResult dry = pattern(Real(15.0, 1e-3));
  EXPECT_LT(dry.max_gain_dbi, perfect.max_gain_dbi - 2.0);
  EXPECT_LT(perfect.max_gain_elevation_deg, 1.0);
  EXPECT_GT(dry.max_gain_elevation_deg, 10.0);
  EXPECT_LT(dry.max_gain_elevation_deg, 40.0);
  // The ground absorbs part of the input: efficiency below one, ground loss positive.
  EXPECT_GT(dry.power.ground_w, 0.05 * dry.power.input_w);
  EXPECT_LT(dry.power.efficiency, 0.95);
  RecordProperty("perfect_gain_dbi", std::to_string(perfect.max_gain_dbi));
  RecordProperty("dry_gain_dbi", std::to_string(dry.max_gain_dbi));
  RecordProperty("dry_takeoff_deg", std::to_string(dry.max_gain_elevation_deg));
  std::printf(
      "quarter-wave vertical, 14.2 MHz: perfect %.2f dBi at %.1f deg; medium dry %.2f "
      "dBi at %.1f deg, efficiency %.1f%%\n",
      perfect.max_gain_dbi, perfect.max_gain_elevation_deg, dry.max_gain_dbi,
      dry.max_gain_elevation_deg, 100.0 * dry.power.efficiency);
}

TEST(RealGround, PowerGoesIntoRadiationAndGroundOnly) {
  // Energy: for a lossless antenna over lossy ground, input = radiated + ground loss, so the
  // radiated power must stay below the input (conservation of energy). A dipole half a wavelength
  // up over average ground (13, 5 mS/m, common practice) loses a modest share to the ground, and as
  // the ground becomes a better conductor that share falls.
  const double f = 7.1e6, lambda = 299792458.0 / f;
  double previous_loss = 1.0;
  for (const double sigma : {5e-3, 5e-2, 5.0}) {
    Model m = HorizontalDipole(0.48 * lambda, 1e-3, 21, 0.5 * lambda);
    m.frequency_hz = f;
    m.ground = Real(13.0, sigma);
    SimulationOptions o;
    o.max_frequency_hz = f;
    Simulation sim(m, o);
    const PatternResult p = ComputePattern(sim, sim.Solve(f));
    const double loss = p.power.ground_w / p.power.input_w;
    EXPECT_GT(loss, 0.0) << sigma;
    EXPECT_LT(loss, previous_loss) << sigma;
    previous_loss = loss;
  }
}

TEST(RealGround, LowWireIsWarnedAboutWithItsHeightInWavelengths) {
  // The reflection-coefficient approximation errs by a few percent at 0.2 wavelength and tens
  // of percent at 0.1 wavelength above the ground (a fact given to the project, measured
  // against an exact half-space solution): such models carry a warning.
  Model m = HorizontalDipole(0.5, 1e-3, 11, 0.08);
  m.ground = Real(13.0, 5e-3);
  SimulationOptions o;
  o.max_frequency_hz = kUnitWavelengthHz;
  const Simulation sim(m, o);
  bool found = false;
  for (const Warning& w : sim.warnings()) {
    if (w.message.find("0.08 wavelength") != std::string::npos &&
        w.message.find("reflection-coefficient approximation") != std::string::npos) {
      found = true;
    }
  }
  EXPECT_TRUE(found);
  m.wires[0].from_m[2] = m.wires[0].to_m[2] = 0.3;
  // A named Simulation: a range-for over warnings() of a temporary reads freed memory (the
  // temporary dies before the loop runs), which the AddressSanitizer suite caught here.
  const Simulation raised(m, o);
  for (const Warning& w : raised.warnings()) {
    EXPECT_EQ(w.message.find("reflection-coefficient"), std::string::npos) << w.message;
  }
}

}  // namespace
}  // namespace wirefield
