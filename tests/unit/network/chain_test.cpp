// Tests of the network stage's feed chain (libmom/src/network/chain.cpp): magnetizing
// inductance from A_L, where the power goes, the compensation capacitor, and the public
// EvaluateFeedChain on a parsed model. Sources: REFERENCES.md §5 and circuit theory.
#include "network/chain.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

#include "network/line.hpp"
#include "validation/test_models.hpp"
#include "wirefield/model.hpp"

namespace wirefield::network {
namespace {

// A few operations on numbers of order 1: 1e-12.
constexpr double kRelative = 1e-12;
constexpr double kTwoPi = 2.0 * std::numbers::pi;

TransformerSpec EndFed64() { return testing::Transformer("ef", "src", 2.0, 16.0); }

TEST(Magnetizing, ALOfOneThousandWithTwoTurnsGivesFourMicrohenry) {
  // L = A_L N^2 with A_L in nH/turn^2 (REFERENCES §5; maker datasheets, from memory):
  // 1000 * 2^2 = 4000 nH = 4.0 uH.
  TransformerSpec t = EndFed64();
  t.al_nh_per_turn2 = 1000.0;
  ASSERT_TRUE(MagnetizingInductanceH(t));
  EXPECT_NEAR(*MagnetizingInductanceH(t), 4.0e-6, 4.0e-6 * kRelative);
}

TEST(Magnetizing, ReactanceOfFourMicrohenryAtTheLowBands) {
  // X = 2 pi f L: 46 ohm at 1.85 MHz, 90 at 3.6, 178 at 7.1 (REFERENCES §5, computed there
  // and rounded to whole ohm: tolerance half an ohm). Measured as Z at the primary with the
  // secondary open, a / c of the transformer's ABCD matrix.
  TransformerSpec t = EndFed64();
  t.secondary_turns = 2.0;  // 1:1, so the primary sees the core alone
  t.al_nh_per_turn2 = 1000.0;
  const struct { double f_hz, x_ohm; } rows[] = {{1.85e6, 46.0}, {3.6e6, 90.0}, {7.1e6, 178.0}};
  for (const auto& row : rows) {
    const Abcd m = TransformerAbcd(t, row.f_hz);
    const Complex z_open = m.a / m.c;
    EXPECT_NEAR(z_open.real(), 0.0, 1e-9);
    EXPECT_NEAR(z_open.imag(), row.x_ohm, 0.5) << row.f_hz;
    EXPECT_NEAR(z_open.imag(), kTwoPi * row.f_hz * 4.0e-6, kRelative * z_open.imag());
  }
}

TEST(Magnetizing, QSetsTheCoreLossResistanceAtEachFrequency) {
  // q=Q means R = Q w L in parallel with L (brief of the statement; circuit theory): the
  // open-secondary admittance is 1/R + 1/(jwL), so its real part is 1/(Q w L).
  TransformerSpec t = EndFed64();
  t.secondary_turns = 2.0;
  t.magnetizing_inductance_h = 4.0e-6;
  t.core_q = 20.0;
  for (const double f_hz : {3.6e6, 14.2e6}) {
    const Abcd m = TransformerAbcd(t, f_hz);
    const Complex y = m.c / m.a;
    EXPECT_NEAR(y.real(), 1.0 / (20.0 * kTwoPi * f_hz * 4.0e-6), kRelative * y.real());
    EXPECT_NEAR(y.imag(), -1.0 / (kTwoPi * f_hz * 4.0e-6), kRelative * std::abs(y.imag()));
  }
}

// A lossy feed line of the kit: 15 m of a 50 ohm line, 4.25 / 8.1 dB per 100 m.
FeedLineSpec KitLine() {
  FeedLineSpec l = testing::FeedLine("coax", "src", 15.0);
  l.loss1_db_per_100m = 4.25;
  l.loss2_db_per_100m = 8.1;
  return l;
}

TEST(PowerFractions, LineTransformerAndAntennaSumToOne) {
  // Conservation of energy in a passive network (Tellegen's theorem): what enters at the
  // transmitter is lost in the line, in the transformer, or delivered to the antenna.
  TransformerSpec t = EndFed64();
  t.al_nh_per_turn2 = 1000.0;
  t.core_q = 12.0;
  t.leakage_inductance_h = 0.3e-6;
  t.compensation_capacitance_f = 100e-12;
  const FeedLineSpec l = KitLine();
  for (const double f_hz : {3.6e6, 7.1e6, 14.2e6, 28.5e6}) {
    for (const Complex z : {Complex{3200.0, 0.0}, Complex{1500.0, -2200.0}, Complex{90.0, 40.0}}) {
      const ChainResult r = EvaluateChain(&t, &l, z, f_hz, 50.0);
      EXPECT_NEAR(r.line_loss_fraction + r.transformer_loss_fraction + r.antenna_power_fraction,
                  1.0, kRelative);
      for (const double part :
           {r.line_loss_fraction, r.transformer_loss_fraction, r.antenna_power_fraction}) {
        EXPECT_GT(part, 0.0);
        EXPECT_LT(part, 1.0);
      }
    }
  }
}

TEST(PowerFractions, CoreLossTakesItsShareByTheCurrentDivider) {
  // Ideal 64:1 with a shunt core resistance R on the primary, into a real antenna Z_a: the
  // primary sees R parallel to Z_a/64, so the core takes G_R / (G_R + 64/Z_a) (circuit theory).
  TransformerSpec t = EndFed64();
  t.core_loss_resistance_ohm = 400.0;
  const ChainResult r = EvaluateChain(&t, nullptr, Complex{3200.0, 0.0}, 7.1e6, 50.0);
  const double g_r = 1.0 / 400.0, g_a = 64.0 / 3200.0;
  EXPECT_NEAR(r.transformer_loss_fraction, g_r / (g_r + g_a), kRelative);
  EXPECT_NEAR(r.transmitter_impedance_ohm.real(), 1.0 / (g_r + g_a), kRelative * 50.0);
}

TEST(PowerFractions, LosslessChainDeliversEverything) {
  // Inductors, capacitors, an ideal transformer and a lossless line dissipate nothing
  // (circuit theory): all the power reaches the antenna.
  TransformerSpec t = EndFed64();
  t.magnetizing_inductance_h = 4.0e-6;
  t.leakage_inductance_h = 0.3e-6;
  t.compensation_capacitance_f = 100e-12;
  FeedLineSpec l = KitLine();
  l.loss_points = 0;
  for (const double f_hz : {3.6e6, 14.2e6, 28.5e6}) {
    const ChainResult r = EvaluateChain(&t, &l, Complex{2800.0, -600.0}, f_hz, 50.0);
    EXPECT_NEAR(r.antenna_power_fraction, 1.0, kRelative);
    EXPECT_NEAR(r.line_loss_fraction, 0.0, kRelative);
    EXPECT_NEAR(r.transformer_loss_fraction, 0.0, kRelative);
  }
}

TEST(Compensation, CapacitorLowersSwrWhenLeakageInductanceIsPresent) {
  // 64:1 into 3200 ohm at 28 MHz: the ideal part gives 50 ohm; 0.3 uH of leakage in series
  // makes it 50 + j52.8 ohm (SWR about 2.8). A capacitor across the transmitter side forms an
  // L-network with the leakage: the C whose susceptance cancels that of 1/(50 + jX), i.e.
  // wC = X / (50^2 + X^2), leaves a pure conductance 50 / (50^2 + X^2) (circuit theory), and
  // the SWR drops. Without leakage the same capacitor only adds reactance and raises the SWR.
  const double f_hz = 28e6, l_leak_h = 0.3e-6;
  const double x = kTwoPi * f_hz * l_leak_h;
  const double c_best_f = x / (50.0 * 50.0 + x * x) / (kTwoPi * f_hz);
  TransformerSpec t = EndFed64();
  t.leakage_inductance_h = l_leak_h;
  const ChainResult without = EvaluateChain(&t, nullptr, Complex{3200.0, 0.0}, f_hz, 50.0);
  EXPECT_NEAR(without.transmitter_impedance_ohm.real(), 50.0, 50.0 * kRelative);
  EXPECT_NEAR(without.transmitter_impedance_ohm.imag(), x, x * kRelative);
  t.compensation_capacitance_f = c_best_f;
  const ChainResult with = EvaluateChain(&t, nullptr, Complex{3200.0, 0.0}, f_hz, 50.0);
  const double r_expected = (50.0 * 50.0 + x * x) / 50.0;
  EXPECT_NEAR(with.transmitter_impedance_ohm.real(), r_expected, r_expected * kRelative);
  EXPECT_NEAR(with.transmitter_impedance_ohm.imag(), 0.0, r_expected * kRelative);
  EXPECT_LT(with.swr, without.swr);
  EXPECT_NEAR(with.swr, r_expected / 50.0, kRelative * with.swr);

  TransformerSpec no_leak = EndFed64();
  const ChainResult ideal = EvaluateChain(&no_leak, nullptr, Complex{3200.0, 0.0}, f_hz, 50.0);
  no_leak.compensation_capacitance_f = c_best_f;
  const ChainResult ideal_c = EvaluateChain(&no_leak, nullptr, Complex{3200.0, 0.0}, f_hz, 50.0);
  EXPECT_NEAR(ideal.swr, 1.0, kRelative);
  EXPECT_GT(ideal_c.swr, ideal.swr);
}

TEST(ChainOrder, LineSitsBetweenTransmitterAndTransformer) {
  // The documented order: transmitter - line - transformer - antenna. 2500 ohm at the antenna
  // becomes 2500/64 = 39.0625 ohm at the transformer's primary (turns-ratio law), and a
  // lossless quarter wave of 50 ohm inverts that to 50^2/39.0625 = 64 ohm (REFERENCES §5).
  // The other order would give (50^2/2500)/64 = 0.0156 ohm.
  TransformerSpec t = EndFed64();
  FeedLineSpec l = KitLine();
  l.loss_points = 0;
  const double f_hz = 7.1e6;
  l.length_m = 0.25 * l.velocity_factor * 299792458.0 / f_hz;
  const ChainResult r = EvaluateChain(&t, &l, Complex{2500.0, 0.0}, f_hz, 50.0);
  EXPECT_NEAR(r.transmitter_impedance_ohm.real(), 50.0 * 50.0 / (2500.0 / 64.0), 1e-9 * 64.0);
  EXPECT_NEAR(r.transmitter_impedance_ohm.imag(), 0.0, 1e-9 * 64.0);
}

TEST(EvaluateFeedChain, UsesTheTransformerAndLineOfThatFeedOnly) {
  // The hiking club's end-fed kit: the transformer and line sit at feed 'src'; feed 'aux'
  // has neither and reports its own impedance.
  const Model m = ParseModelText(
      "wire ef from (0, 0, 8) to (20, 0, 8) radius 1mm\n"
      "wire aux from (0, 5, 8) to (10, 5, 8) radius 1mm\n"
      "feed src at ef@start\n"
      "feed side at aux@50%\n"
      "transformer unun at src turns 2:16 al=1000 leakage=0.3uH compensation=100pF q=12\n"
      "line coax at src length 15m cable=RG-58\n",
      "kit.wire");
  const Complex z{3000.0, -800.0};
  const ChainResult got = EvaluateFeedChain(m, 0, z, 7.1e6, 50.0);
  const ChainResult want = EvaluateChain(&m.transformers[0], &m.feed_lines[0], z, 7.1e6, 50.0);
  EXPECT_EQ(got.transmitter_impedance_ohm, want.transmitter_impedance_ohm);
  EXPECT_EQ(got.antenna_power_fraction, want.antenna_power_fraction);
  const ChainResult side = EvaluateFeedChain(m, 1, Complex{60.0, 5.0}, 7.1e6, 50.0);
  EXPECT_EQ(side.transmitter_impedance_ohm, (Complex{60.0, 5.0}));
  EXPECT_THROW(EvaluateFeedChain(m, 2, z, 7.1e6, 50.0), ComputationError);
}

}  // namespace
}  // namespace wirefield::network
