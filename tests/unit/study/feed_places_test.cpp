// Feed results at both places: the antenna terminals and the transmitter, through a 1:49
// transformer with a lossy core and a lossy coax. The impedance at the transmitter, the SWR at
// each place, the power lost in line and transformer and the power balance are checked against
// textbook circuit relations evaluated here, not against the library's own network code; and a
// sweep's resonances at each place against the sign changes of X at that place.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <numbers>
#include <string>

#include "wirefield/sweep.hpp"
#include "wirefield/wirefield.hpp"

namespace wirefield {
namespace {

// A half-wave end-fed wire for 40 m with a short counterpoise, fed through a 3:21 transformer
// (impedance 1:49) with a lossy core and 10 m of 50 ohm coax; its figures are restated below.
std::string EndFedPath() {
  return std::string(WIREFIELD_SOURCE_DIR) + "/tests/models/end_fed_transformer_coax.wire";
}

constexpr double kFrequencyHz = 7.1e6;
constexpr double kZ0Ohm = 50.0;  // the default SWR reference
// The model's chain, restated for the checks.
constexpr double kTurnsRatio = 7.0;  // 21 / 3
constexpr double kMagnetizingH = 10e-6;
constexpr double kCoreQ = 5.0;
constexpr double kLineLengthM = 10.0;
constexpr double kLineZ0Ohm = 50.0;
constexpr double kVelocityFactor = 0.66;
constexpr double kLineLossDbPer100m = 3.6;
// c = 299 792 458 m/s exactly (SI definition of the metre).
constexpr double kSpeedOfLight = 299792458.0;

// Γ = (Z - Z0)/(Z + Z0), SWR = (1 + |Γ|)/(1 - |Γ|) (REFERENCES.md §5, "Reflection, SWR").
double TextbookSwr(Complex z_ohm, double z0_ohm) {
  const double g = std::abs((z_ohm - z0_ohm) / (z_ohm + z0_ohm));
  return (1.0 + g) / (1.0 - g);
}

// The transformer's primary side: the antenna impedance divided by the turns ratio squared
// (ideal transformer, REFERENCES.md §5: Z_sec/Z_pri = (N_sec/N_pri)²), in parallel with the
// magnetizing inductance and its core-loss resistance R = Q ωL (the parallel equivalent of
// a coil of quality factor Q, any circuits text (from memory)).
Complex PrimaryImpedance(Complex z_antenna_ohm) {
  const double omega = 2.0 * std::numbers::pi * kFrequencyHz;
  const Complex j{0.0, 1.0};
  const Complex y = kTurnsRatio * kTurnsRatio / z_antenna_ohm + 1.0 / (j * omega * kMagnetizingH) +
                    1.0 / (kCoreQ * omega * kMagnetizingH);
  return 1.0 / y;
}

// γ = α + jβ of the coax: α from its matched loss in dB (1 Np = 20/ln 10 dB), β = ω/(VF c).
Complex LinePropagation() {
  const double alpha = kLineLossDbPer100m / 100.0 / (20.0 / std::log(10.0));
  const double beta = 2.0 * std::numbers::pi * kFrequencyHz / (kVelocityFactor * kSpeedOfLight);
  return {alpha, beta};
}

// Input impedance of a lossy line: Z_in = Z0 (Z_L + Z0 tanh γl)/(Z0 + Z_L tanh γl)
// (REFERENCES.md §5, "Lossy line"; the line equation of any transmission-line text).
Complex LineInput(Complex z_load_ohm) {
  const Complex t = std::tanh(LinePropagation() * kLineLengthM);
  return kLineZ0Ohm * (z_load_ohm + kLineZ0Ohm * t) / (kLineZ0Ohm + z_load_ohm * t);
}

SolveResult SolveEndFed() {
  const Simulation sim(ParseModelFile(EndFedPath()));
  return sim.Solve(kFrequencyHz);
}

TEST(FeedPlaces, AntennaSwrFollowsTheTextbookFormulaFromTheTerminalImpedance) {
  const SolveResult r = SolveEndFed();
  const FeedResult& feed = r.feeds.at(0);
  EXPECT_TRUE(feed.has_transformer);
  EXPECT_TRUE(feed.has_line);
  // Only rounding separates the two evaluations of the same formula.
  EXPECT_NEAR(feed.antenna_swr, TextbookSwr(feed.impedance_ohm, kZ0Ohm), 1e-9 * feed.antenna_swr);
  // An end-fed half wave is a few kilohm (REFERENCES.md §8, common practice): against 50 ohm
  // its terminals are badly mismatched, and the transformer is what brings the SWR down.
  EXPECT_GT(feed.antenna_swr, 20.0);
  EXPECT_LT(feed.swr, feed.antenna_swr);
}

TEST(FeedPlaces, TransmitterImpedanceIsTheChainsTransformationOfTheTerminalImpedance) {
  const SolveResult r = SolveEndFed();
  const FeedResult& feed = r.feeds.at(0);
  const Complex expected = LineInput(PrimaryImpedance(feed.impedance_ohm));
  // Both evaluate closed-form circuit relations in double precision: 1e-9 of |Z|.
  EXPECT_NEAR(feed.transmitter_impedance_ohm.real(), expected.real(), 1e-9 * std::abs(expected));
  EXPECT_NEAR(feed.transmitter_impedance_ohm.imag(), expected.imag(), 1e-9 * std::abs(expected));
  // The contract's SWR is the one at the transmitter.
  EXPECT_NEAR(feed.swr, TextbookSwr(expected, kZ0Ohm), 1e-9 * feed.swr);
}

TEST(FeedPlaces, PowerAtTheTransmitterIsAntennaPowerPlusLineAndTransformerLoss) {
  const SolveResult r = SolveEndFed();
  const FeedResult& feed = r.feeds.at(0);
  // Power at the terminals: 0.5 Re(V I*) of the peak phasors (circuit theory).
  const double antenna_w = 0.5 * std::real(feed.voltage_v * std::conj(feed.current_a));
  EXPECT_NEAR(feed.power_w, antenna_w, 1e-12 * antenna_w);
  EXPECT_NEAR(feed.transmitter_power_w, antenna_w + feed.line_loss_w + feed.transformer_loss_w,
              1e-12 * feed.transmitter_power_w);
  EXPECT_GT(feed.line_loss_w, 0.0);
  EXPECT_GT(feed.transformer_loss_w, 0.0);

  // The line's share from forward and reflected power on a line of real Z0 (REFERENCES.md §5,
  // "Total loss of a line with mismatch", exact for a real Z0): with Γ_L at its load end,
  // P_out / P_in = e^(-2αl) (1 - |Γ_L|²) / (1 - |Γ_L|² e^(-4αl)).
  const Complex z_primary = PrimaryImpedance(feed.impedance_ohm);
  const double g2 = std::norm((z_primary - kLineZ0Ohm) / (z_primary + kLineZ0Ohm));
  const double a = std::exp(-2.0 * LinePropagation().real() * kLineLengthM);
  const double line_out_over_in = a * (1.0 - g2) / (1.0 - g2 * a * a);
  EXPECT_NEAR(feed.line_loss_w / feed.transmitter_power_w, 1.0 - line_out_over_in, 1e-9);

  // The transformer's share of what enters it: the core resistance's conductance over the
  // primary side's whole conductance (the same voltage across both).
  const double omega = 2.0 * std::numbers::pi * kFrequencyHz;
  const double core_g = 1.0 / (kCoreQ * omega * kMagnetizingH);
  const double transformer_in_w = feed.transmitter_power_w - feed.line_loss_w;
  EXPECT_NEAR(feed.transformer_loss_w / transformer_in_w, core_g / std::real(1.0 / z_primary),
              1e-9);
}

TEST(FeedPlaces, WithoutAChainBothPlacesAreTheTerminals) {
  const char* dipole =
      "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm segments 21\n"
      "feed src at dip@50%\n"
      "frequency 14.2MHz\n";
  const Simulation sim(ParseModelText(dipole, "dipole.wire"));
  const FeedResult feed = sim.Solve(14.2e6).feeds.at(0);
  EXPECT_FALSE(feed.has_transformer);
  EXPECT_FALSE(feed.has_line);
  EXPECT_EQ(feed.transmitter_impedance_ohm, feed.impedance_ohm);
  EXPECT_NEAR(feed.swr, feed.antenna_swr, 1e-12 * feed.swr);
  EXPECT_EQ(feed.transmitter_power_w, feed.power_w);
  EXPECT_EQ(feed.line_loss_w, 0.0);
  EXPECT_EQ(feed.transformer_loss_w, 0.0);
}

// Each listed resonance must lie between two neighbouring points where X(point) changes sign,
// and every such sign change must be listed: a zero of X found by linear interpolation.
template <typename Reactance>
void ExpectZerosOf(const SweepResult& sweep, const std::vector<double>& listed_hz,
                   Reactance reactance, const char* where) {
  std::vector<double> expected_hz;
  for (size_t i = 1; i < sweep.points.size(); ++i) {
    const double x0 = reactance(sweep.points[i - 1]), x1 = reactance(sweep.points[i]);
    if ((x0 < 0.0) != (x1 < 0.0)) {
      const double f0 = sweep.points[i - 1].frequency_hz, f1 = sweep.points[i].frequency_hz;
      expected_hz.push_back(f0 + (f1 - f0) * x0 / (x0 - x1));
    }
  }
  ASSERT_EQ(listed_hz.size(), expected_hz.size()) << where;
  for (size_t k = 0; k < listed_hz.size(); ++k) {
    EXPECT_NEAR(listed_hz[k], expected_hz[k], 1e-6) << where << " " << k;
  }
}

TEST(FeedPlaces, SweepResonancesAreZerosOfXAtEachPlace) {
  SimulationOptions so;
  so.max_frequency_hz = 7.6e6;
  const Simulation sim(ParseModelFile(EndFedPath()), so);
  SweepOptions o;
  o.interpolate = false;
  const SweepResult sweep = RunSweep(sim, FrequencyPoints(6.4e6, 7.6e6, 25), o);
  ExpectZerosOf(
      sweep, sweep.resonances_hz, [](const SweepPoint& p) { return p.feed_impedance_ohm.imag(); },
      "antenna terminals");
  ExpectZerosOf(
      sweep, sweep.transmitter_resonances_hz,
      [](const SweepPoint& p) { return p.transmitter_impedance_ohm.imag(); }, "transmitter");
  // The wire's own resonances lie in the range (X at its terminals crossed zero at about 6.64
  // and 6.93 MHz when this was written), and the transmitter's, seen through the transformer
  // and the coax, fall elsewhere.
  ASSERT_FALSE(sweep.resonances_hz.empty());
  EXPECT_NE(sweep.resonances_hz, sweep.transmitter_resonances_hz);
}

}  // namespace
}  // namespace wirefield
