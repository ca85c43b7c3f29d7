// Validation: multi-port and loaded antennas against circuit and field laws: reciprocity,
// the mutual impedance of parallel dipoles, image theory for a horizontal dipole, power
// balance with a resistive load, and a parallel LC trap at resonance.
#include <gtest/gtest.h>

#include <Eigen/Dense>
#include <cmath>

#include "core/constants.hpp"
#include "validation/reference/induced_emf.hpp"
#include "validation/test_models.hpp"

namespace wirefield {
namespace {

using testing::Feed;
using testing::HorizontalDipole;
using testing::kUnitWavelengthHz;
using testing::SolveFeedImpedance;
using testing::Wire;

// Open-circuit impedance matrix of a model's feeds: one solve per feed driven at 1 V with
// the others shorted gives the admittance matrix; Z is its inverse.
Eigen::MatrixXcd PortImpedances(Model model) {
  const int n = static_cast<int>(model.feeds.size());
  Eigen::MatrixXcd y(n, n);
  for (int drive = 0; drive < n; ++drive) {
    for (int f = 0; f < n; ++f) model.feeds[f].voltage_v = f == drive ? 1.0 : 0.0;
    SimulationOptions o;
    o.max_frequency_hz = kUnitWavelengthHz;
    const SolveResult r = Simulation(model, o).Solve(kUnitWavelengthHz);
    for (int f = 0; f < n; ++f) y(f, drive) = r.feeds[f].current_a;
  }
  return y.inverse();
}

Model TwoParallelDipoles(double spacing, double radius, int segments) {
  Model m;
  m.file = "pair";
  m.wires.push_back(Wire("a", {0, 0, -0.25}, {0, 0, 0.25}, radius, segments));
  m.wires.push_back(Wire("b", {spacing, 0, -0.25}, {spacing, 0, 0.25}, radius, segments));
  m.feeds.push_back(Feed("fa", "a", PointKind::kPercent, 50.0));
  m.feeds.push_back(Feed("fb", "b", PointKind::kPercent, 50.0));
  m.frequency_hz = kUnitWavelengthHz;
  return m;
}

TEST(Reciprocity, TransferImpedancesOfTwoUnlikeAntennasAreEqual) {
  // Lorentz reciprocity: Z12 = Z21 for any linear passive antenna pair. The pair here is
  // deliberately unlike: a tilted short wire fed off-centre and a bent wire over ground.
  Model m;
  m.file = "reciprocity";
  m.wires.push_back(Wire("tilted", {0.1, 0.0, 0.2}, {0.3, 0.1, 0.6}, 1e-3, 15));
  m.wires.push_back(Wire("leg", {0.7, 0.2, 0.05}, {0.7, 0.2, 0.35}, 2e-3, 9));
  m.wires.push_back(Wire("arm", {0.7, 0.2, 0.35}, {1.0, -0.1, 0.4}, 2e-3, 11));
  m.feeds.push_back(Feed("f1", "tilted", PointKind::kPercent, 30.0));
  m.feeds.push_back(Feed("f2", "arm", PointKind::kStart, 0.0));
  m.ground.kind = GroundKind::kPerfect;
  m.frequency_hz = kUnitWavelengthHz;
  const Eigen::MatrixXcd z = PortImpedances(m);
  // Rounding only: relative 1e-9 of the transfer impedance.
  EXPECT_LT(std::abs(z(0, 1) - z(1, 0)), 1e-9 * std::abs(z(0, 1)));
  EXPECT_GT(std::abs(z(0, 1)), 1.0) << "the two antennas must couple measurably";
}

TEST(ParallelDipoles, MutualImpedanceApproachesInducedEmfFormula) {
  // Z21 of side-by-side half-wave dipoles (Balanis, 3rd ed., §8.6, eqs. 8-71a,b, from memory;
  // REFERENCES.md §1 suggests MoM within 2 ohm). Very thin wires (a = 1e-8) keep the
  // sinusoidal-current error of the formula small (O(1/Omega), Omega = 35.5); tolerance 3 ohm
  // in each part.
  for (double spacing : {0.25, 0.5, 0.75, 1.0}) {
    const Eigen::MatrixXcd z = PortImpedances(TwoParallelDipoles(spacing, 1e-8, 41));
    const Complex ref = reference::MutualImpedanceParallelHalfWave_ohm(spacing, 1.0);
    EXPECT_NEAR(z(1, 0).real(), ref.real(), 3.0) << "spacing " << spacing;
    EXPECT_NEAR(z(1, 0).imag(), ref.imag(), 3.0) << "spacing " << spacing;
  }
}

TEST(HorizontalDipoleOverPerfectGround, ImpedanceShiftIsMinusMutualOfTheImage) {
  // Image theory (REFERENCES.md §1): over a perfect ground the image is in antiphase, so
  // Z(h) - Z(free) = -Z21(2h). The formula's Z21 assumes sinusoidal currents; the shift
  // measured here moves toward it as the wire thins (O(1/Omega)), and at a = 1e-8 lies
  // within 2.5 ohm (REFERENCES suggests 2 ohm at "thin").
  for (double height : {0.125, 0.25, 0.5}) {
    double previous = INFINITY;
    const Complex ref = -reference::MutualImpedanceParallelHalfWave_ohm(2 * height, 1.0);
    for (double radius : {1e-4, 1e-6, 1e-8}) {
      Model over = HorizontalDipole(0.5, radius, 41, height);
      over.ground.kind = GroundKind::kPerfect;
      const Complex shift =
          SolveFeedImpedance(over) - SolveFeedImpedance(HorizontalDipole(0.5, radius, 41, height));
      const double error = std::abs(shift - ref);
      EXPECT_LT(error, previous) << "height " << height << " radius " << radius;
      previous = error;
    }
    EXPECT_LT(previous, 2.5) << "height " << height;
  }
}

// Radiated power of segment currents by far-field integration over the sphere (free space):
// each segment is a short element at its centre (midpoint rule, adequate for lambda/40).
double RadiatedPowerFreeSpace(const SolveResult& r) {
  const double k = 2.0 * core::kPi * r.frequency_hz / core::kSpeedOfLight_m_per_s;
  const int n_theta = 90, n_phi = 72;
  double power = 0.0;
  for (int it = 0; it < n_theta; ++it) {
    const double th = (it + 0.5) * core::kPi / n_theta;
    for (int ip = 0; ip < n_phi; ++ip) {
      const double ph = (ip + 0.5) * 2.0 * core::kPi / n_phi;
      const Eigen::Vector3d rhat(std::sin(th) * std::cos(ph), std::sin(th) * std::sin(ph),
                                 std::cos(th));
      Eigen::Vector3cd m = Eigen::Vector3cd::Zero();
      for (const SegmentCurrent& s : r.currents) {
        const Eigen::Vector3d a(s.start_m[0], s.start_m[1], s.start_m[2]);
        const Eigen::Vector3d b(s.end_m[0], s.end_m[1], s.end_m[2]);
        const Eigen::Vector3d c = 0.5 * (a + b);
        m += (b - a).cast<Complex>() * s.current_a * std::polar(1.0, k * rhat.dot(c));
      }
      const Eigen::Vector3cd transverse = m - rhat.cast<Complex>() * rhat.cast<Complex>().dot(m);
      // |E| = eta k |M_t| / (4 pi r); power density |E|^2 / (2 eta).
      const double e = core::kEta0_ohm * k * transverse.norm() / (4.0 * core::kPi);
      power += e * e / (2.0 * core::kEta0_ohm) * std::sin(th) * (core::kPi / n_theta) *
               (2.0 * core::kPi / n_phi);
    }
  }
  return power;
}

TEST(SeriesResistorLoad, InputPowerSplitsIntoLoadAndRadiation) {
  // Energy conservation (Poynting): the power into the feed equals the power dissipated in
  // the load, 0.5 |I|^2 R, plus the radiated power. Tolerance 1%: the far-field integration
  // here uses a midpoint rule per segment.
  Model m = testing::Dipole(0.5, 1e-4, 41);
  LoadSpec load;
  load.name = "r";
  load.at = {"dipole", PointKind::kPercent, 75.0, {}};
  load.topology = LoadTopology::kSeries;
  load.resistance_ohm = 50.0;
  m.loads.push_back(load);
  SimulationOptions o;
  o.max_frequency_hz = kUnitWavelengthHz;
  const SolveResult r = Simulation(m, o).Solve(kUnitWavelengthHz);
  const LoadResult& l = r.loads.at(0);
  EXPECT_NEAR(l.power_w, 0.5 * std::norm(l.current_a) * 50.0, 1e-15);
  EXPECT_GT(l.power_w, 0.05 * r.feeds[0].power_w) << "the load must take a real share";
  const double radiated = RadiatedPowerFreeSpace(r);
  EXPECT_NEAR(radiated + l.power_w, r.feeds[0].power_w, 0.01 * r.feeds[0].power_w);
}

TEST(SeriesResistorLoad, AtTheFeedAddsItsResistanceToTheFeedImpedance) {
  // Circuit theory: an element in series with the source at the same gap adds its impedance.
  Model m = testing::Dipole(0.48, 1e-4, 41);
  const Complex bare = SolveFeedImpedance(m);
  LoadSpec load;
  load.name = "r";
  load.at = {"dipole", PointKind::kPercent, 50.0, {}};
  load.resistance_ohm = 22.0;
  load.inductance_h = 1e-9;
  m.loads.push_back(load);
  const Complex loaded = SolveFeedImpedance(m);
  const Complex element(22.0, 2.0 * core::kPi * kUnitWavelengthHz * 1e-9);
  EXPECT_LT(std::abs(loaded - bare - element), 1e-9 * std::abs(loaded));
}

TEST(ParallelLcTrap, AtResonanceActsAsAnOpenCircuit) {
  // A parallel LC at omega^2 LC = 1 has zero admittance (circuit theory): the wire beyond
  // it is cut off. Check: the trap carries no current, and the feed sees the same impedance
  // as with the arms cut by a 1e12-ohm resistor in the same place.
  const double inductance_h = 1e-7;
  const double capacitance_f =
      1.0 / (std::pow(2.0 * core::kPi * kUnitWavelengthHz, 2) * inductance_h);
  auto trap_model = [&](bool lc) {
    Model m = testing::Dipole(0.8, 1e-4, 64);
    for (double pos : {25.0, 75.0}) {
      LoadSpec load;
      load.name = pos < 50 ? "lower" : "upper";
      load.at = {"dipole", PointKind::kPercent, pos, {}};
      if (lc) {
        load.topology = LoadTopology::kParallel;
        load.inductance_h = inductance_h;
        load.capacitance_f = capacitance_f;
      } else {
        load.resistance_ohm = 1e12;
      }
      m.loads.push_back(load);
    }
    return m;
  };
  SimulationOptions o;
  o.max_frequency_hz = kUnitWavelengthHz;
  const SolveResult trap = Simulation(trap_model(true), o).Solve(kUnitWavelengthHz);
  for (const LoadResult& l : trap.loads) {
    EXPECT_LT(std::abs(l.current_a), 1e-6 * std::abs(trap.feeds[0].current_a));
  }
  const Complex cut = SolveFeedImpedance(trap_model(false));
  EXPECT_LT(std::abs(trap.feeds[0].impedance_ohm - cut), 1e-4 * std::abs(cut));
  // The inner 0.4-wavelength dipole is capacitive (induced-EMF, REFERENCES.md §1).
  EXPECT_LT(cut.imag(), 0.0);
}

}  // namespace
}  // namespace wirefield
