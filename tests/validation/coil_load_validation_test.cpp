// Validation: a coil load in a model. The solver must treat `load ... coil ...` as the coil's
// (R_ac + j omega L) in parallel with its self-capacitance at each frequency, so a model with
// the coil and a model with the equivalent R, L (and C) load solve to the same feed impedance.
#include <fmt/format.h>
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <string>

#include "core/constants.hpp"
#include "fill/assemble.hpp"
#include "wirefield/wirefield.hpp"

namespace wirefield {
namespace {

// A hiking club's shortened 40 m vertical dipole with a loading coil in each half.
std::string Model(const std::string& load_clause) {
  return "units m\n"
         "wire top from (0,0,5.2) to (0,0,8) radius 1mm segments 21\n"
         "wire low from (0,0,2.4) to (0,0,5.2) radius 1mm segments 21\n"
         "feed f at top@start\n"
         "load up at top@50% " +
         load_clause + "\nload down at low@50% " + load_clause + "\n";
}

const std::string kCoil = "coil turns=30 diameter=40mm pitch=1.5mm wire=1.2mm";

CoilSpec TheCoil() {
  CoilSpec c;
  c.turns = 30;
  c.former_diameter_m = 40e-3;
  c.pitch_m = 1.5e-3;
  c.wire_diameter_m = 1.2e-3;
  return c;
}

std::complex<double> FeedImpedance(const std::string& text, double f_hz) {
  SimulationOptions o;
  o.max_frequency_hz = f_hz;
  Simulation sim(ParseModelText(text, "kit.wire"), o);
  return sim.Solve(f_hz).feeds.at(0).impedance_ohm;
}

TEST(CoilLoad, SolvesLikeTheEquivalentSeriesLoadAtEachFrequency) {
  // At one frequency the coil is one complex impedance Z; a series load R = Re Z,
  // L = Im Z / omega is the same impedance (circuit theory). Tolerance 1e-9 relative: the
  // two runs differ only in how the load's Z is rounded.
  for (double f_hz : {7.0e6, 7.2e6}) {
    const CoilAnalysis a = AnalyzeCoil(TheCoil(), f_hz);
    ASSERT_GT(a.impedance_ohm.imag(), 0.0);  // below self-resonance: inductive
    const std::string series = fmt::format("series R={:.17g} L={:.17g}", a.impedance_ohm.real(),
                                           a.impedance_ohm.imag() / (2.0 * core::kPi * f_hz));
    const std::complex<double> z_coil = FeedImpedance(Model(kCoil), f_hz);
    const std::complex<double> z_rl = FeedImpedance(Model(series), f_hz);
    EXPECT_NEAR(std::abs(z_coil - z_rl) / std::abs(z_rl), 0.0, 1e-9) << f_hz;
  }
}

TEST(CoilLoad, IsTheSeriesRLInParallelWithTheSelfCapacitance) {
  // The fill's load impedance for a coil: (R_ac + j omega L) || C (circuit theory), with the
  // coil's own computed R_ac, L and C. Tolerance 1e-12 relative.
  LoadSpec load;
  load.coil = TheCoil();
  const double f_hz = 7.1e6, w = 2.0 * core::kPi * f_hz;
  const CoilAnalysis a = AnalyzeCoil(TheCoil(), f_hz);
  bool open = true;
  const std::complex<double> z = fill::LoadImpedance(load, f_hz, &open);
  EXPECT_FALSE(open);
  const std::complex<double> zl(a.ac_resistance_ohm, w * a.inductance_h);
  const std::complex<double> zc(0.0, -1.0 / (w * a.self_capacitance_f));
  EXPECT_NEAR(std::abs(z - zl * zc / (zl + zc)) / std::abs(z), 0.0, 1e-12);
}

}  // namespace
}  // namespace wirefield
