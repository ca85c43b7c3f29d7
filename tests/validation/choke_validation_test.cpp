// Validation: a choke load in a model. Its impedance is what its points or its winding say
// (linear interpolation between points; L = N^2 A_L and R = X / Q for a winding), its loss
// closes the power balance, and a choke of very high impedance cuts the wire it sits on.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <string>

#include "core/constants.hpp"
#include "wirefield/wirefield.hpp"

namespace wirefield {
namespace {

// A campsite end-fed wire for 40 m with a 6 m counterpoise wire hanging from its feed, as
// the outside of a coax shield would; `choke` is the clause of a choke on the counterpoise
// 0.5 m from the feed (empty: no choke).
std::string EndFed(const std::string& choke) {
  std::string text =
      "units m\n"
      "wire top from (0, 0, 9) to (19.8, 0, 9) radius 0.8mm segments 41\n"
      "wire cp from (0, 0, 9) to (0, 0, 3) radius 2.5mm segments 12\n"
      "feed src at top@start\n";
  if (!choke.empty()) text += "load cm at cp@0.5m choke " + choke + "\n";
  return text;
}

// The model meshed for frequency_hz.
Simulation Meshed(const std::string& text, double frequency_hz) {
  SimulationOptions options;
  options.max_frequency_hz = frequency_hz;
  return Simulation(ParseModelText(text, "endfed.wire"), options);
}

SolveResult SolveText(const std::string& text, double frequency_hz) {
  return Meshed(text, frequency_hz).Solve(frequency_hz);
}

TEST(ChokeLoad, PointsAreInterpolatedLinearlyInFrequency) {
  // Linear interpolation: halfway between (7 MHz, 1000 + j600) and (14 MHz, 2000 - j200) in
  // frequency, 10.5 MHz, R and X are the means of the two points.
  const std::string choke = "(7MHz, 1000ohm, 600ohm), (14MHz, 2000ohm, -200ohm)";
  const SolveResult mid = SolveText(EndFed(choke), 10.5e6);
  ASSERT_EQ(mid.loads.size(), 1u);
  EXPECT_NEAR(mid.loads[0].impedance_ohm.real(), 1500.0, 1e-9);
  EXPECT_NEAR(mid.loads[0].impedance_ohm.imag(), 200.0, 1e-9);
  const SolveResult at_point = SolveText(EndFed(choke), 7e6);
  EXPECT_EQ(at_point.loads[0].impedance_ohm, Complex(1000.0, 600.0));
  // Ohm's law across the load: V = I Z.
  const LoadResult& l = mid.loads[0];
  EXPECT_LT(std::abs(l.voltage_v - l.current_a * l.impedance_ohm), 1e-9 * std::abs(l.voltage_v));
}

TEST(ChokeLoad, AWindingIsTurnsSquaredTimesALWithItsQ) {
  // The inductance factor A_L of a core: L = N^2 A_L (its definition, as core datasheets give
  // it); the Q of an inductance is X / R (its definition). 8 turns on 1000 nH/turn^2: 64 uH.
  const double f_hz = 7.1e6;
  const SolveResult r = SolveText(EndFed("turns=8 al=1000 q=2"), f_hz);
  const double x_ohm = 2.0 * core::kPi * f_hz * 64e-6;
  EXPECT_NEAR(r.loads[0].impedance_ohm.imag(), x_ohm, 1e-9 * x_ohm);
  EXPECT_NEAR(r.loads[0].impedance_ohm.real(), x_ohm / 2.0, 1e-9 * x_ohm);
}

TEST(ChokeLoad, ItsLossClosesThePowerBalance) {
  // Energy conservation (Poynting's theorem): in free space the feed power is what the far
  // field carries away plus what the loads dissipate; the choke's 0.5 |I|^2 R is in the loads.
  // Required: within 1%.
  const Simulation sim = Meshed(EndFed("(7.1MHz, 300ohm, 400ohm)"), 7.1e6);
  const SolveResult r = sim.Solve(7.1e6);
  const LoadResult& l = r.loads[0];
  EXPECT_NEAR(l.power_w, 0.5 * std::norm(l.current_a) * 300.0, 1e-12 * l.power_w);
  EXPECT_GT(l.power_w, 0.01 * r.feeds[0].power_w);  // a choke that matters here
  const PatternResult p = ComputePattern(sim, r);
  EXPECT_NEAR(p.power.loads_w, l.power_w, 1e-12 * l.power_w);
  EXPECT_LT(std::abs(p.power.balance_error), 0.01);
}

TEST(ChokeLoad, AVeryHighImpedanceCutsTheWire) {
  // The limit of a series impedance: as |Z| grows the current through it goes to zero, and
  // the wire beyond it is a conductor joined to nothing. The model with the choke must then
  // give the feed impedance of the model whose counterpoise is cut where the choke sits (0.5 m
  // from the feed, a node of the mesh) and goes on as a separate wire 2 cm further down: the
  // feed impedances agree to a few percent (the gap moves the far part 2 cm), and the choke's
  // current is tiny against the feed's.
  const SolveResult choked = SolveText(EndFed("(7.1MHz, 1e9ohm, 0ohm)"), 7.1e6);
  const std::string cut =
      "units m\n"
      "wire top from (0, 0, 9) to (19.8, 0, 9) radius 0.8mm segments 41\n"
      "wire stub from (0, 0, 9) to (0, 0, 8.5) radius 2.5mm segments 1\n"
      "wire rest from (0, 0, 8.48) to (0, 0, 3) radius 2.5mm segments 11\n"
      "feed src at top@start\n";
  const SolveResult open = SolveText(cut, 7.1e6);
  EXPECT_LT(std::abs(choked.loads[0].current_a), 1e-4 * std::abs(choked.feeds[0].current_a));
  const Complex z_choked = choked.feeds[0].impedance_ohm;
  const Complex z_open = open.feeds[0].impedance_ohm;
  EXPECT_LT(std::abs(z_choked - z_open), 0.05 * std::abs(z_open))
      << "choked " << z_choked << " cut " << z_open;
}

TEST(ChokeLoad, ARunOutsideItsPointsNamesTheLoad) {
  const Simulation sim =
      Meshed(EndFed("(7MHz, 1000ohm, 600ohm), (14MHz, 2000ohm, -200ohm)"), 21.2e6);
  try {
    sim.Solve(21.2e6);
    FAIL() << "no error";
  } catch (const InputError& e) {
    EXPECT_EQ(std::string(e.what()),
              "endfed.wire:5:1: error: load 'cm': the choke's impedance is given from 7 to 14 "
              "MHz, and the run is at 21.2 MHz; add a point of its curve at or beyond that "
              "frequency");
  }
}

}  // namespace
}  // namespace wirefield
