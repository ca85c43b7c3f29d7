// Validation: the mesh error estimate (SolveWithMeshEstimate). The feed impedance of a mesh of N
// segments per wire is compared with that of a mesh four times finer: the estimate must bound
// the difference, as Richardson extrapolation with Roache's grid convergence index promises
// (P. J. Roache, "Quantification of uncertainty in computational fluid dynamics", Annu. Rev.
// Fluid Mech. 29, 1997: the index bounds the discretisation error with about 95% confidence
// once the meshes are in the asymptotic range).
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <string>

#include "validation/test_models.hpp"
#include "wirefield/wirefield.hpp"

namespace wirefield {
namespace {

// The model with every wire's segment count multiplied by `factor`.
Model Refined(Model model, int factor) {
  for (WireSpec& wire : model.wires) wire.segments *= factor;
  return model;
}

// The model solved at a 1 m wavelength with its mesh estimate.
SolveResult SolvedWithEstimate(const Model& model) {
  SimulationOptions options;
  options.max_frequency_hz = testing::kUnitWavelengthHz;
  const Simulation simulation(model, options);
  return SolveWithMeshEstimate(simulation, testing::kUnitWavelengthHz);
}

struct Check {
  double estimate_ohm = 0.0;
  double to_finer_ohm = 0.0;  // |Z_N - Z_4N|
  double magnitude_ohm = 0.0;
};

Check EstimateAndRefine(const Model& model, double frequency_hz) {
  SimulationOptions options;
  options.max_frequency_hz = frequency_hz;
  const Simulation simulation(model, options);
  const SolveResult result = SolveWithMeshEstimate(simulation, frequency_hz);
  EXPECT_TRUE(result.mesh_estimate.has_value());
  EXPECT_FALSE(result.mesh_estimate->feeds.empty());
  EXPECT_TRUE(result.feeds.at(0).mesh_error_ohm.has_value());
  const Complex z_n = result.feeds.at(0).impedance_ohm;
  const Complex z_4n = testing::SolveFeedImpedance(Refined(model, 4), frequency_hz);
  return {result.feeds.at(0).mesh_error_ohm.value_or(-1.0), std::abs(z_n - z_4n), std::abs(z_n)};
}

TEST(MeshEstimate, BoundsTheChangeToAFourTimesFinerMeshOnAHalfWaveDipole) {
  // A half-wave dipole in free space at a 1 m wavelength, fed at its centre (Balanis, Antenna
  // Theory, 3rd ed., section 4.6: about 73 + j42.5 ohm for an infinitely thin half wave).
  // Radius 0.1 mm (2 pi a / wavelength = 6e-4, a field-kit wire on HF) from 10 segments to the
  // default's 40, and 1 mm up to 20 segments: the four times finer mesh then keeps its
  // segments at least 4 radii long, the thin-wire kernel's range (common practice, and the
  // mesher's own limit).
  struct Case {
    double radius_m;
    int segments;
  };
  for (const Case& k :
       {Case{1e-4, 10}, Case{1e-4, 20}, Case{1e-4, 40}, Case{1e-3, 10}, Case{1e-3, 20}}) {
    const Model model = testing::Dipole(0.5, k.radius_m, k.segments);
    const Check c = EstimateAndRefine(model, testing::kUnitWavelengthHz);
    EXPECT_GE(c.estimate_ohm, c.to_finer_ohm) << k.radius_m << " m, " << k.segments;
    EXPECT_GT(c.to_finer_ohm, 0.0);
    if (k.segments == 40) {
      // An honest error bar, not a blanket one: at the default's 40 segments (common
      // practice: a converged mesh for the trade) below 3% of |Z|, and within four times the
      // change it bounds.
      EXPECT_LT(c.estimate_ohm, 0.03 * c.magnitude_ohm);
      EXPECT_LT(c.estimate_ohm, 4.0 * c.to_finer_ohm);
    }
  }
}

TEST(MeshEstimate, BoundsTheChangeToAFourTimesFinerMeshOnACoilLoadedWire) {
  // A hiking club's shortened 40 m vertical dipole with a loading coil in each half, as in
  // coil_load_validation_test.cpp; 7.1 MHz.
  const std::string text =
      "units m\n"
      "wire top from (0,0,5.2) to (0,0,8) radius 1mm segments 10\n"
      "wire low from (0,0,2.4) to (0,0,5.2) radius 1mm segments 10\n"
      "feed f at top@start\n"
      "load up at top@50% coil turns=30 diameter=40mm pitch=1.5mm wire=1.2mm\n"
      "load down at low@50% coil turns=30 diameter=40mm pitch=1.5mm wire=1.2mm\n";
  const Model model = ParseModelText(text, "coil_loaded.wire");
  const Check c = EstimateAndRefine(model, 7.1e6);
  EXPECT_GE(c.estimate_ohm, c.to_finer_ohm);
  EXPECT_GT(c.to_finer_ohm, 0.0);
}

TEST(MeshEstimate, WarnsOnACoarseMeshAndNotOnTheDefault) {
  // 5 segments on a half wave are far coarser than the common 10 per half wave (common
  // practice); the default mesh (80 per wavelength) is not.
  const SolveResult r = SolvedWithEstimate(testing::Dipole(0.5, 1e-4, 5));
  ASSERT_EQ(r.mesh_estimate->warnings.size(), 1u);
  EXPECT_NE(r.mesh_estimate->warnings[0].message.find("segments"), std::string::npos);

  const SolveResult d = SolvedWithEstimate(testing::Dipole(0.5, 1e-4, 0));
  EXPECT_TRUE(d.mesh_estimate->warnings.empty());
  EXPECT_TRUE(d.feeds[0].mesh_error_ohm.has_value());
}

TEST(MeshEstimate, SaysWhenNoWireCanBeHalved) {
  // Two segments cannot be halved around a centre feed: no estimate, and a note saying why.
  const SolveResult r = SolvedWithEstimate(testing::Dipole(0.5, 1e-4, 2));
  ASSERT_TRUE(r.mesh_estimate.has_value());
  EXPECT_TRUE(r.mesh_estimate->feeds.empty());
  EXPECT_FALSE(r.feeds[0].mesh_error_ohm.has_value());
  EXPECT_FALSE(r.mesh_estimate->notes.empty());
}

}  // namespace
}  // namespace wirefield

namespace wirefield {
namespace {

// The half mesh's impedance of the estimate (the fine system restricted to every other node)
// against the model meshed and filled anew with half the segments on every wire: the same
// Galerkin subspace when the meshes are uniform, so the two agree but for the fill's
// quadrature (Harrington, Field Computation by Moment Methods, 1968, ch. 1: the Galerkin
// solution depends only on the subspace). Models with a wire junction at the feed, a ground
// connection at the feed, and a load.
TEST(MeshEstimate, NestedHalfMeshEqualsTheModelMeshedWithHalfTheSegments) {
  const auto model_text = [](int segments) {
    const std::string n = std::to_string(segments);
    return "units m\n"
           "wire left from (0,0,8) to (-7,0,3) radius 1mm segments " +
           n +
           "\n"
           "wire right from (0,0,8) to (7,0,3) radius 1mm segments " +
           n +
           "\n"
           "wire mast from (3,3,0) to (3,3,6) radius 2mm segments " +
           n +
           "\n"
           "wire radial from (3,3,6) to (8,3,6) radius 2mm segments " +
           n +
           "\n"
           "feed apex at left@start\n"
           "feed base at mast@start\n"
           "load trap at radial@50% parallel L=5uH C=50pF\n"
           "ground perfect\n"
           "frequency 7.1MHz\n";
  };
  SimulationOptions options;
  options.max_frequency_hz = 7.1e6;
  const Simulation fine(ParseModelText(model_text(20), "nested.wire"), options);
  const SolveResult r = SolveWithMeshEstimate(fine, 7.1e6);
  ASSERT_EQ(r.mesh_estimate->feeds.size(), 2u);
  EXPECT_EQ(r.mesh_estimate->half_segments, 40);
  const Simulation half(ParseModelText(model_text(10), "nested.wire"), options);
  const SolveResult h = half.Solve(7.1e6);
  for (size_t f = 0; f < 2; ++f) {
    const Complex nested = r.mesh_estimate->feeds[f].half_mesh_impedance_ohm;
    const Complex remeshed = h.feeds[f].impedance_ohm;
    EXPECT_LT(std::abs(nested - remeshed), 2e-3 * std::abs(remeshed))
        << f << ": " << nested << " vs " << remeshed;
  }
}

}  // namespace
}  // namespace wirefield
