// Validation: far field, gain and radiated power against antenna theory: half-wave and short
// dipole directivity, the monopole on a perfect ground, the horizontal dipole over a perfect
// ground (image array factor), polarisation, and energy conservation.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <iterator>
#include <numbers>

#include "validation/reference/induced_emf.hpp"
#include "validation/test_models.hpp"

namespace wirefield {
namespace {

using testing::Dipole;
using testing::HorizontalDipole;
using testing::kUnitWavelengthHz;
using testing::Solved;
using testing::SolveModel;

TEST(HalfWaveDipole, GainIsTheTextbookDirectivity) {
  // D = 4 / Cin(2 pi) = 1.6409 -> 2.151 dBi (Balanis, 3rd ed., eq. 4-91, from memory;
  // REFERENCES.md §1), for the sinusoidal current of a vanishing radius. Tolerance 0.05 dB:
  // at a = 1e-6 wavelength the real current departs from the sinusoid by O(1/Omega).
  const Solved s = SolveModel(Dipole(0.5, 1e-6, 41));
  const PatternResult p = ComputePattern(s.sim, s.result);
  const double ref_dbi = reference::PowerRatioToDecibels(reference::HalfWaveDipoleDirectivity());
  EXPECT_NEAR(p.max_gain_dbi, ref_dbi, 0.05);
  EXPECT_NEAR(p.max_gain_elevation_deg, 0.0, 0.5) << "broadside to a vertical dipole";
  // Half-power beamwidth of the half-wave dipole, 78 degrees (Balanis §4.6, from memory).
  ASSERT_TRUE(p.elevation_cut.beamwidth_deg.has_value());
  EXPECT_NEAR(*p.elevation_cut.beamwidth_deg, 78.0, 1.0);
}

TEST(ThickDipole, EfficiencyNeverExceedsOne) {
  // Energy conservation (Poynting's theorem; power balance): a lossless antenna radiates what
  // it takes in, no more. A half-wave dipole of radius 0.007 wavelength (0.3 m at 7.1 MHz) in
  // 17 segments: its far-field integral comes out 0.04% above the feed's 0.5 Re(V I*)
  // (measured), the discretization's power-balance error, within the 2% the balance check
  // allows. The efficiency reported is 1, with the note; the computed ratio is kept.
  const Solved s = SolveModel(Dipole(0.4834, 0.0071, 17));
  const PatternResult p = ComputePattern(s.sim, s.result);
  EXPECT_GT(p.power.efficiency_computed, 1.0);
  EXPECT_LT(p.power.efficiency_computed, 1.02);
  EXPECT_EQ(p.power.efficiency, 1.0);
  EXPECT_NE(p.power.efficiency_note.find("within the 2% tolerance"), std::string::npos)
      << p.power.efficiency_note;
  // A thin one balances to within the printed precision: no note, and the figure is unclamped.
  const Solved thin = SolveModel(Dipole(0.5, 1e-5, 41));
  const PatternResult q = ComputePattern(thin.sim, thin.result);
  EXPECT_LE(q.power.efficiency, 1.0);
  EXPECT_TRUE(q.power.efficiency_note.empty()) << q.power.efficiency_note;
}

TEST(ShortDipole, GainIsOnePointFive) {
  // Directivity 1.5 -> 1.761 dBi for any short current element (Balanis §4.2, from memory).
  const Solved s = SolveModel(Dipole(0.02, 1e-5, 11));
  EXPECT_NEAR(ComputePattern(s.sim, s.result).max_gain_dbi, 10.0 * std::log10(1.5), 0.02);
}

TEST(QuarterWaveMonopole, GainOverPerfectGroundIsTwiceTheDipoles) {
  // D = 2 x 1.6409 -> 5.161 dBi: the power goes into one half-space (image theory,
  // Balanis §4.7.4, from memory; REFERENCES.md §1). Tolerance 0.05 dB as for the dipole.
  Model m;
  m.file = "monopole";
  m.wires.push_back(testing::Wire("mast", {0, 0, 0}, {0, 0, 0.25}, 1e-6, 20));
  m.feeds.push_back(testing::Feed("base", "mast", PointKind::kStart, 0.0));
  m.ground.kind = GroundKind::kPerfect;
  m.frequency_hz = kUnitWavelengthHz;
  const Solved s = SolveModel(m);
  const PatternResult p = ComputePattern(s.sim, s.result);
  EXPECT_NEAR(p.max_gain_dbi,
              reference::PowerRatioToDecibels(2.0 * reference::HalfWaveDipoleDirectivity()), 0.05);
  EXPECT_NEAR(p.max_gain_elevation_deg, 0.0, 0.5);
}

TEST(HorizontalDipoleOverPerfectGround, TakeOffAngleFollowsTheImageArrayFactor) {
  // Array factor 2 sin(kh sin(elevation)): the lowest lobe peaks at sin(el) = lambda/(4h)
  // for h >= lambda/4 (REFERENCES.md §1, confirmed in secondary sources; Balanis §4.7.2,
  // from memory): 30.0 deg at h = lambda/2, 14.48 deg at h = lambda; the zenith for
  // h = lambda/4. Peak gains (induced-EMF estimate, computed in REFERENCES): 8.42, 8.24,
  // 7.48 dBi, +-0.3 dB for MoM.
  struct Case {
    double height, elevation_deg, gain_dbi;
  };
  for (const Case c : {Case{0.5, 30.0, 8.42}, Case{1.0, 14.48, 8.24}, Case{0.25, 90.0, 7.48}}) {
    Model m = HorizontalDipole(0.5, 1e-4, 41, c.height);
    m.ground.kind = GroundKind::kPerfect;
    const Solved s = SolveModel(m);
    const PatternResult p = ComputePattern(s.sim, s.result);
    EXPECT_NEAR(p.takeoff_elevation_deg, c.elevation_deg, 0.5) << "h " << c.height;
    EXPECT_NEAR(p.max_gain_dbi, c.gain_dbi, 0.3) << "h " << c.height;
    if (c.height > 0.25) {
      EXPECT_NEAR(std::fmod(p.max_gain_azimuth_deg, 180.0), 90.0, 0.5) << "broadside";
    }
  }
}

TEST(HorizontalDipoleOverPerfectGround, BroadsidePlaneCarriesNoVerticalPolarisation) {
  // By symmetry the field in the plane normal to a horizontal wire (y-z plane here) is
  // parallel to the wire, so horizontal; the vertical component vanishes (image theory).
  Model m = HorizontalDipole(0.5, 1e-4, 41, 0.5);
  m.ground.kind = GroundKind::kPerfect;
  const Solved s = SolveModel(m);
  for (double el : {5.0, 20.0, 45.0, 70.0}) {
    const FarFieldPoint f = FarField(s.sim, s.result, el, 90.0);
    EXPECT_LT(std::abs(f.e_theta_v), 1e-9 * std::abs(f.e_phi_v)) << "elevation " << el;
  }
}

TEST(HorizontalDipoleInFreeSpace, ReportsItsMaximumOnTheHorizonBroadside) {
  // A horizontal half-wave dipole in free space radiates equally in its whole broadside
  // plane (rotational symmetry about the wire); among equal directions the report prefers
  // the horizon, where a take-off angle means something, and no beamwidth exists in that
  // plane.
  const Solved s = SolveModel(HorizontalDipole(0.5, 1e-4, 41, 0.0));
  const PatternResult p = ComputePattern(s.sim, s.result);
  EXPECT_EQ(p.max_gain_elevation_deg, 0.0);
  EXPECT_NEAR(std::fmod(p.max_gain_azimuth_deg, 180.0), 90.0, 0.01);
  EXPECT_FALSE(p.elevation_cut.beamwidth_deg.has_value());
  ASSERT_TRUE(p.azimuth_cut.beamwidth_deg.has_value());
  EXPECT_NEAR(*p.azimuth_cut.beamwidth_deg, 78.0, 1.0);  // Balanis §4.6 (from memory)
}

// A horizontal half-wave dipole along x, 0.2 wavelength over a perfect ground: below a
// quarter wavelength its maximum is at the zenith (image theory, as above).
Solved LowDipoleOverPerfectGround() {
  Model m = HorizontalDipole(0.5, 1e-4, 41, 0.2);
  m.ground.kind = GroundKind::kPerfect;
  return SolveModel(m);
}

// |2 sin(k h sin(elevation))|, the array factor of a horizontal current and its reversed image
// over a perfect ground (Balanis, Antenna Theory, 3rd ed., §4.7.2, from memory; REFERENCES.md
// §1), in dB; h in wavelengths.
double ImageArrayFactorDb(double height_wavelengths, double elevation_deg) {
  const double kh = 2.0 * std::numbers::pi * height_wavelengths;
  return 20.0 * std::log10(std::abs(
                    2.0 * std::sin(kh * std::sin(elevation_deg * std::numbers::pi / 180.0))));
}

TEST(LowHorizontalDipoleOverPerfectGround, LowAngleGainIsTakenBroadside) {
  // The maximum is straight up, where azimuth means nothing; toward low angles a horizontal
  // dipole radiates best broadside to its wire (azimuth 90 or 270 for a wire along x) and
  // nothing off its ends (the current element's sin pattern, Balanis §4.2, from memory).
  const Solved s = LowDipoleOverPerfectGround();
  const PatternResult p = ComputePattern(s.sim, s.result);
  EXPECT_NEAR(p.max_gain_elevation_deg, 90.0, 0.5);
  ASSERT_EQ(p.low_angle.size(), std::size(kLowAngleElevations_deg));
  for (std::size_t i = 0; i < p.low_angle.size(); ++i) {
    const DirectionGain& row = p.low_angle[i];
    EXPECT_EQ(row.elevation_deg, kLowAngleElevations_deg[i]);
    EXPECT_NEAR(std::fmod(row.azimuth_deg, 180.0), 90.0, 1e-9) << "elevation " << row.elevation_deg;
    // The best over azimuth is no lower than any sample of a cut through that elevation.
    const FarFieldPoint off_end = FarField(s.sim, s.result, row.elevation_deg, 0.0);
    EXPECT_GT(row.gain_dbi, off_end.gain_dbi + 3.0) << "elevation " << row.elevation_deg;
  }
  // The default cuts: the elevation cut through broadside, the azimuth cut at a low angle
  // rather than a circle around the zenith.
  EXPECT_NEAR(std::fmod(p.elevation_cut.fixed_angle_deg, 180.0), 90.0, 1e-9);
  EXPECT_EQ(p.elevation_cut.choice, CutChoice::kStrongestLowAngle);
  EXPECT_EQ(p.azimuth_cut.fixed_angle_deg, kLowAzimuthCutElevation_deg);
  EXPECT_EQ(p.azimuth_cut.choice, CutChoice::kLowAngleNearZenith);
}

TEST(LowHorizontalDipoleOverPerfectGround, BroadsideGainFollowsTheImageArrayFactor) {
  // Broadside (the y-z plane) every point of the wire is equally far from the observer but
  // for its height, so the pattern there is the image array factor times a constant: the gain
  // differences between elevations are those of |2 sin(k h sin(elevation))| exactly (Balanis
  // §4.7.2, from memory). 0.01 dB: only the quadrature of the far-field integral differs.
  const double kTolerance_db = 0.01;
  const Solved s = LowDipoleOverPerfectGround();
  const PatternResult p = ComputePattern(s.sim, s.result);
  const DirectionGain& reference = p.low_angle.back();  // 30 deg
  for (const DirectionGain& row : p.low_angle) {
    EXPECT_NEAR(row.gain_dbi - reference.gain_dbi,
                ImageArrayFactorDb(0.2, row.elevation_deg) - ImageArrayFactorDb(0.2, 30.0),
                kTolerance_db)
        << "elevation " << row.elevation_deg;
    // All of it horizontally polarized (the field is parallel to the wire there).
    EXPECT_NEAR(row.gain_horizontal_dbi, row.gain_dbi, 1e-9);
  }
  // The default elevation cut runs broadside: the same law up to the zenith (angle 90).
  const PatternCut& cut = p.elevation_cut;
  const auto gain_at = [&](double angle_deg) {
    const auto i = std::find(cut.angle_deg.begin(), cut.angle_deg.end(), angle_deg);
    EXPECT_NE(i, cut.angle_deg.end()) << angle_deg;
    return cut.gain_dbi[static_cast<std::size_t>(i - cut.angle_deg.begin())];
  };
  for (const double el : {3.0, 10.0, 25.0, 45.0, 60.0, 80.0}) {
    EXPECT_NEAR(gain_at(el) - gain_at(90.0),
                ImageArrayFactorDb(0.2, el) - ImageArrayFactorDb(0.2, 90.0), kTolerance_db)
        << "elevation " << el;
  }
}

TEST(PatternCuts, GivenAzimuthAndElevationFixTheCuts) {
  const Solved s = LowDipoleOverPerfectGround();
  PatternOptions options;
  options.elevation_cut_azimuth_deg = 45.0;
  options.azimuth_cut_elevation_deg = 25.0;
  const PatternResult p = ComputePattern(s.sim, s.result, options);
  EXPECT_EQ(p.elevation_cut.fixed_angle_deg, 45.0);
  EXPECT_EQ(p.elevation_cut.choice, CutChoice::kGiven);
  EXPECT_EQ(p.azimuth_cut.fixed_angle_deg, 25.0);
  EXPECT_EQ(p.azimuth_cut.choice, CutChoice::kGiven);
  // The elevation cut at 45 deg azimuth agrees with the far field there (same evaluator).
  EXPECT_NEAR(p.elevation_cut.gain_dbi[20], FarField(s.sim, s.result, 20.0, 45.0).gain_dbi, 1e-9);
  options.elevation_cut_azimuth_deg = 361.0;
  EXPECT_THROW(ComputePattern(s.sim, s.result, options), InputError);
}

TEST(DipoleHalfAWavelengthUp, AzimuthCutStaysAtTheTakeOffAngle) {
  // A lobe at 30 deg (image theory, above) is not near the zenith: the azimuth cut is taken
  // through it, and the elevation cut through its azimuth (broadside).
  Model m = HorizontalDipole(0.5, 1e-4, 41, 0.5);
  m.ground.kind = GroundKind::kPerfect;
  const Solved s = SolveModel(m);
  const PatternResult p = ComputePattern(s.sim, s.result);
  EXPECT_EQ(p.azimuth_cut.choice, CutChoice::kTakeoff);
  EXPECT_EQ(p.azimuth_cut.fixed_angle_deg, p.takeoff_elevation_deg);
  EXPECT_NEAR(p.takeoff_elevation_deg, 30.0, 0.5);
  EXPECT_EQ(p.elevation_cut.fixed_angle_deg, p.max_gain_azimuth_deg);
}

TEST(PowerBalance, LosslessModelsRadiateTheirInputPower) {
  // Energy conservation (Poynting's theorem): with no losses the power integrated over the
  // far-field sphere (or half-space over a perfect ground) equals the feed power. The required
  // tolerance is 1%; the Galerkin solution meets it far more tightly.
  std::vector<Model> models = {Dipole(0.5, 1e-4, 41), Dipole(1.3, 1e-3, 61)};
  Model bent = HorizontalDipole(0.7, 1e-3, 31, 0.3);
  bent.wires.push_back(testing::Wire("drop", {0.35, 0, 0.3}, {0.35, 0, 0.0}, 1e-3, 9));
  bent.ground.kind = GroundKind::kPerfect;
  models.push_back(bent);
  for (const Model& m : models) {
    const Solved s = SolveModel(m);
    const PatternResult p = ComputePattern(s.sim, s.result);
    EXPECT_NEAR(p.power.radiated_w, p.power.input_w, 0.01 * p.power.input_w);
    EXPECT_LT(std::abs(p.power.balance_error), 0.01);
    EXPECT_TRUE(p.warnings.empty());
  }
}

TEST(PowerBalance, CurrentsThatDoNotConserveEnergyAreFlagged) {
  // The check compares the feed power with the far field of the currents. Galerkin testing
  // conserves energy on any mesh to the accuracy of the integration (measured 1e-5 even with
  // one-wavelength segments), so a real failure needs broken integration; here the currents
  // of a solved dipole are perturbed instead, which must trip the 2% warning.
  Solved s = SolveModel(Dipole(0.5, 1e-4, 41));
  for (SegmentCurrent& c : s.result.currents) {
    c.current_start_a *= 1.1;
    c.current_end_a *= 1.1;
  }
  const PatternResult p = ComputePattern(s.sim, s.result);
  EXPECT_NEAR(p.power.balance_error, 0.21, 0.01);  // 1.1^2 - 1
  ASSERT_EQ(p.warnings.size(), 1u);
  EXPECT_NE(p.warnings[0].message.find("power balance is off by 21.0%"), std::string::npos)
      << p.warnings[0].message;
}

}  // namespace
}  // namespace wirefield
