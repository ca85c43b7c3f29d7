// Validation: conductor loss of real wires. A half-wave copper dipole loses the share of its
// power that the skin-effect resistance predicts for a sinusoidal current, and the power
// budget (radiated + wire loss) still adds up to the input.
#include <gtest/gtest.h>

#include <cmath>

#include "conductor/wire_impedance.hpp"
#include "core/constants.hpp"
#include "validation/test_models.hpp"

namespace wirefield {
namespace {

TEST(CopperDipole, LosesTheShareOfPowerItsSkinResistancePredicts) {
  // 40 m band half-wave dipole of AWG 14 copper (a = 0.8139 mm, REFERENCES.md §3; copper
  // 58.0 MS/m, IEC 60028 (from memory)). With the current I0 cos(kz) of a half-wave dipole,
  // the loss resistance referred to the feed is R' l / 2 (integral of cos^2 over the wire).
  // Tolerance 10% of the loss: the MoM current is not exactly sinusoidal.
  const double f_hz = 7.1e6, lambda = core::kSpeedOfLight_m_per_s / f_hz;
  const double radius = 0.8139e-3, sigma = 5.8e7, length = 0.48 * lambda;
  Model lossless;
  lossless.file = "copper";
  lossless.wires.push_back(testing::Wire("d", {-length / 2, 0, 0}, {length / 2, 0, 0}, radius, 41));
  lossless.feeds.push_back(testing::Feed("gap", "d", PointKind::kPercent, 50.0));
  lossless.frequency_hz = f_hz;
  Model copper = lossless;
  copper.wires[0].conductivity_s_per_m = sigma;
  copper.wires[0].material = "copper";

  const double r_per_m = std::real(conductor::WireImpedancePerMetre(radius, sigma, 1.0, f_hz));
  EXPECT_NEAR(r_per_m, 0.1378, 0.002);  // about 137 mOhm/m at 7 MHz (REFERENCES.md §3)
  const double predicted_loss_ohm = r_per_m * length / 2.0;

  const Complex z0 = testing::SolveFeedImpedance(lossless, f_hz);
  SimulationOptions o;
  o.max_frequency_hz = f_hz;
  Simulation sim(copper, o);
  const SolveResult r = sim.Solve(f_hz);
  const Complex z1 = r.feeds[0].impedance_ohm;
  EXPECT_NEAR(z1.real() - z0.real(), predicted_loss_ohm, 0.1 * predicted_loss_ohm);

  const PatternResult p = ComputePattern(sim, r);
  const double loss_share = p.power.wires_w / p.power.input_w;
  EXPECT_NEAR(loss_share, predicted_loss_ohm / z1.real(), 0.1 * predicted_loss_ohm / z1.real());
  // Energy conservation with losses (Poynting): radiated + dissipated = input, 1%.
  EXPECT_NEAR(p.power.radiated_w + p.power.wires_w, p.power.input_w, 0.01 * p.power.input_w);
  EXPECT_NEAR(p.power.efficiency, 1.0 - loss_share, 0.01);
  EXPECT_TRUE(p.warnings.empty());
}

TEST(SteelWire, LosesFarMoreThanCopper) {
  // Skin-effect resistance grows as sqrt(mu_r / sigma) (REFERENCES.md §3): a thin steel wire
  // of mu_r 100 and 6 MS/m wastes an order of magnitude more than copper.
  const double f_hz = 14.2e6, length = 10.0;
  auto efficiency = [&](double sigma, double mu_r) {
    Model m;
    m.file = "steel";
    m.wires.push_back(testing::Wire("d", {-length / 2, 0, 0}, {length / 2, 0, 0}, 0.5e-3, 41));
    m.wires[0].conductivity_s_per_m = sigma;
    m.wires[0].relative_permeability = mu_r;
    m.feeds.push_back(testing::Feed("gap", "d", PointKind::kPercent, 50.0));
    m.frequency_hz = f_hz;
    Simulation sim(m);
    const SolveResult r = sim.Solve(f_hz);
    return ComputePattern(sim, r).power.efficiency;
  };
  const double copper = efficiency(5.8e7, 1.0), steel = efficiency(6e6, 100.0);
  EXPECT_GT(copper, 0.97);
  EXPECT_GT(1.0 - steel, 10.0 * (1.0 - copper));
}

}  // namespace
}  // namespace wirefield
