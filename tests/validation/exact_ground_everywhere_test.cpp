// Validation: the default real ground is the exact (Sommerfeld) half-space for every pair of
// segments, however high, on models that span from near the ground to well above 0.3
// wavelength. The reference is the same Sommerfeld integrals evaluated directly at every
// quadrature point of the fill (GroundSpec::half_space_table = false), without the table that
// the default interpolates from, so the comparison measures whether the default is exact
// everywhere and whether its table holds over the model's whole height range. Written as a
// user writes them, through the model language.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <iostream>
#include <string>

#include "wirefield/wirefield.hpp"

namespace wirefield {
namespace {

// A feed impedance is quoted to three significant figures in practice (common practice): the
// default must agree with the direct integration to 0.1% of |Z|, which also bounds what the
// table's interpolation may add (its pointwise error is under 1e-3 of the image,
// tests/unit/ground/sommerfeld_test.cpp, and the ground's correction is a part of Z).
constexpr double kExactTolerance = 1e-3;

struct Outcome {
  Complex z_ohm;
  std::vector<Warning> warnings;
};

Outcome Solve(const std::string& text, double frequency_hz, bool table = true) {
  Model m = ParseModelText(text, "ground.wire");
  m.ground.half_space_table = table;
  SimulationOptions o;
  o.max_frequency_hz = frequency_hz;
  const Simulation sim(m, o);
  return {sim.Solve(frequency_hz).feeds.at(0).impedance_ohm, sim.warnings()};
}

double Relative(Complex a, Complex reference) {
  return std::abs(a - reference) / std::abs(reference);
}

// Default, direct reference, and the reflection approximation of one model; returns the default.
Complex ExpectDefaultIsExact(const std::string& model, const std::string& ground,
                             double frequency_hz) {
  const Complex by_default = Solve(model + ground + "\n", frequency_hz).z_ohm;
  const Complex direct = Solve(model + ground + "\n", frequency_hz, false).z_ohm;
  const Complex reflection = Solve(model + ground + " method=reflection\n", frequency_hz).z_ohm;
  std::cout << "default " << by_default << " ohm, direct integration " << direct
            << " ohm (relative " << Relative(by_default, direct) << "), reflection " << reflection
            << " ohm\n";
  EXPECT_LT(Relative(by_default, direct), kExactTolerance) << by_default << " vs " << direct;
  return by_default;
}

// A vertical half-wave dipole for 7.1 MHz, 1 mm radius, from 1 m to 21.3 m up (0.02 to 0.5
// wavelength), fed at its middle: its pairs span every mean height from 1 m to 21 m.
constexpr const char* kVertical =
    "units m\n"
    "wire dip from (0, 0, 1) to (0, 0, 21.3) radius 1mm\n"
    "feed src at dip@50%\n";
constexpr double kVerticalHz = 7.1e6;

// A 20 m end-fed sloper, 0.5 mm radius, from 2 m to 9 m up over an 8.3 m run, fed at its low
// end against a 1.5 m counterpoise 2 m up.
constexpr const char* kSloper =
    "units m\n"
    "wire sloper from (0, 0, 2) to (8.3, 0, 9) radius 0.5mm\n"
    "wire counterpoise from (0, 0, 2) to (-1.5, 0, 2) radius 0.5mm\n"
    "feed src at sloper@start\n";
constexpr double kSloperHz = 14.2e6;

TEST(ExactGroundEverywhere, TallVerticalDipoleOverAverageGroundMatchesDirectIntegration) {
  // Average ground: 13, 5 mS/m (common practice). Measured on an earlier build, whose default
  // was the exact ground below a mean height of 0.3 wavelength and the reflection
  // coefficients above: 91.5 - j21.4 ohm by default against 87.95 - j20.75 ohm with the exact
  // ground everywhere (4.0% apart), and 84.0 - j19.7 ohm by the reflection coefficients.
  const Complex z = ExpectDefaultIsExact(kVertical, "ground real preset=average", kVerticalHz);
  // The vertical half-wave dipole's feed resistance near 73 ohm in free space (induced EMF,
  // REFERENCES.md section 1) is moved by the ground, not beyond recognition: a sanity bound.
  EXPECT_GT(z.real(), 60.0);
  EXPECT_LT(z.real(), 120.0);
}

TEST(ExactGroundEverywhere, EndFedSloperOverMediumDryGroundMatchesDirectIntegration) {
  // Medium dry ground: 15, 1 mS/m (ITU-R P.527-3, from memory). Measured on an earlier build
  // (mixture at 0.3 wavelength): 1031.9 - j2339.1 ohm by default against 1024.0 - j2369.2 ohm
  // with the exact ground everywhere (1.2% apart).
  const Complex z = ExpectDefaultIsExact(kSloper, "ground real preset=medium_dry", kSloperHz);
  // An end-fed half wave shows a high impedance, some kilohm (common practice).
  EXPECT_GT(std::abs(z), 500.0);
}

TEST(ExactGroundEverywhere, EightyMetreInvertedLOverVeryDryGroundMatchesDirectIntegration) {
  // A tall model for the table's range: an inverted-L for 3.6 MHz (wavelength 83 m) fed 1 m up
  // against a 10 m counterpoise, its vertical part to 15 m, 6.3 m level at the top, over very
  // dry ground (3, 0.1 mS/m: ITU-R P.527-3, from memory), whose lateral wave beats with the
  // image over the longest distances of the table.
  const std::string model =
      "units m\n"
      "wire up from (0, 0, 1) to (0, 0, 15) radius 1mm\n"
      "wire top from (0, 0, 15) to (6.3, 0, 15) radius 1mm\n"
      "wire counterpoise from (0, 0, 1) to (-10, 0, 1) radius 1mm\n"
      "feed src at up@start\n";
  const Complex z = ExpectDefaultIsExact(model, "ground real preset=very_dry", 3.6e6);
  EXPECT_GT(z.real(), 0.0);
}

TEST(ExactGroundEverywhere, AnExplicitThresholdStillMixesTheMethodsAndSaysSo) {
  // exact_below=H keeps its meaning for models written with it: the exact ground for pairs
  // whose mean height is below H, the reflection coefficients above. With H at 0.3 wavelength
  // (the threshold an earlier build used by default) the mixture is off the exact-everywhere
  // solve by several percent on wires that span H, and the program warns, quoting the figures
  // measured here (mesh.cpp). Measured (this build): the vertical 91.49 - j21.40 ohm against
  // 87.95 - j20.75 (4.0%), the sloper 1031.9 - j2339.1 against 1024.0 - j2369.2 (1.2%), the
  // earlier build's figures to the digit. Bounds: 3% and 0.8%, under the measured figures, so a
  // future change that makes the mixture better fails here and updates the warning's figures.
  struct Case {
    const char* model;
    const char* ground;
    double frequency_hz;
    double at_least;
  };
  for (const Case& c : {Case{kVertical, "ground real preset=average", kVerticalHz, 0.03},
                        Case{kSloper, "ground real preset=medium_dry", kSloperHz, 0.008}}) {
    const double threshold_m = 0.3 * 299792458.0 / c.frequency_hz;
    const Outcome mixed = Solve(
        std::string(c.model) + c.ground + " exact_below=" + std::to_string(threshold_m) + "m\n",
        c.frequency_hz);
    const Outcome exact = Solve(std::string(c.model) + c.ground + "\n", c.frequency_hz);
    std::cout << "mixture " << mixed.z_ohm << " ohm, exact everywhere " << exact.z_ohm
              << " ohm (relative " << Relative(mixed.z_ohm, exact.z_ohm) << ")\n";
    EXPECT_GT(Relative(mixed.z_ohm, exact.z_ohm), c.at_least);
    bool warned = false;
    for (const Warning& w : mixed.warnings) {
      warned = warned || w.message.find("exact_below=") != std::string::npos;
    }
    EXPECT_TRUE(warned) << c.model;
    for (const Warning& w : exact.warnings) {
      EXPECT_EQ(w.message.find("exact_below"), std::string::npos) << w.message;
    }
  }
  // A threshold above the whole model is no mixture (every pair exact): no warning.
  const Outcome high =
      Solve(std::string(kVertical) + "ground real preset=average exact_below=1000m\n", kVerticalHz);
  for (const Warning& w : high.warnings) {
    EXPECT_EQ(w.message.find("exact_below"), std::string::npos) << w.message;
  }
}

}  // namespace
}  // namespace wirefield
