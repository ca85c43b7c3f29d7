// Tests of the network stage's reflection quantities (libmom/src/network/reflection.cpp) and
// the ChainResult fields they fill, against the worked SWR table of REFERENCES.md §5.
#include "network/reflection.hpp"

#include <gtest/gtest.h>

#include "network/chain.hpp"

namespace wirefield::network {
namespace {

// The closed forms are a few operations: 1e-12 relative.
constexpr double kFormulaRelative = 1e-12;

struct WorkedRow {
  double swr, gamma, return_loss_db, mismatch_loss_db;
  // Half a unit of the last digit quoted: |G| and ML to 3 decimals, RL to 2.
  double gamma_tol, rl_tol, ml_tol;
};

// REFERENCES §5, "Reflection, SWR, return loss, mismatch loss" (the SWR table is confirmed
// there against a secondary table, e.g. SWR 2.0 -> RL 9.54 dB, 0.51 dB).
constexpr WorkedRow kRows[] = {
    {1.5, 0.200, 13.98, 0.177, 5e-4, 5e-3, 5e-4},
    {2.0, 0.333, 9.54, 0.512, 5e-4, 5e-3, 5e-4},
    {3.0, 0.500, 6.02, 1.249, 5e-4, 5e-3, 5e-4},
};

TEST(Reflection, WorkedSwrTableGivesGammaReturnLossAndMismatchLoss) {
  for (const WorkedRow& row : kRows) {
    const double g = MagnitudeFromSwr(row.swr);
    EXPECT_NEAR(g, row.gamma, row.gamma_tol) << row.swr;
    EXPECT_NEAR(ReturnLossDb(g), row.return_loss_db, row.rl_tol) << row.swr;
    EXPECT_NEAR(MismatchLossDb(g), row.mismatch_loss_db, row.ml_tol) << row.swr;
    EXPECT_NEAR(SwrFromMagnitude(g), row.swr, kFormulaRelative * row.swr);
  }
}

TEST(Reflection, ChainWithoutTransformerOrLineReportsTheFeedItself) {
  // A real load of SWR * Z0 has exactly that SWR (Gamma = (s - 1)/(s + 1), REFERENCES §5);
  // with no transformer and no line the transmitter sees the feed impedance itself.
  for (const WorkedRow& row : kRows) {
    const Complex z{50.0 * row.swr, 0.0};
    const ChainResult r = EvaluateChain(nullptr, nullptr, z, 14.2e6, 50.0);
    EXPECT_EQ(r.transmitter_impedance_ohm, z);
    EXPECT_NEAR(r.swr, row.swr, kFormulaRelative * row.swr);
    EXPECT_NEAR(r.return_loss_db, row.return_loss_db, row.rl_tol);
    EXPECT_NEAR(r.mismatch_loss_db, row.mismatch_loss_db, row.ml_tol);
    EXPECT_DOUBLE_EQ(r.antenna_power_fraction, 1.0);
    EXPECT_DOUBLE_EQ(r.line_loss_fraction, 0.0);
    EXPECT_DOUBLE_EQ(r.transformer_loss_fraction, 0.0);
  }
}

TEST(Reflection, PerfectMatchCapsReturnLossAtNinetyNineDecibels) {
  // |G| = 0 has an infinite return loss; reported as the 99 dB cap (documented).
  const ChainResult r = EvaluateChain(nullptr, nullptr, Complex{50.0, 0.0}, 7.1e6, 50.0);
  EXPECT_EQ(r.return_loss_db, kLossCap_db);
  EXPECT_EQ(r.mismatch_loss_db, 0.0);
  EXPECT_EQ(r.swr, 1.0);
}

TEST(Reflection, TotalReflectionStaysFinite) {
  // A pure reactance reflects everything (|G| = 1): SWR and mismatch loss hit their caps.
  const ChainResult r = EvaluateChain(nullptr, nullptr, Complex{0.0, 120.0}, 7.1e6, 50.0);
  EXPECT_EQ(r.swr, kSwrCap);
  EXPECT_EQ(r.mismatch_loss_db, kLossCap_db);
  EXPECT_NEAR(r.return_loss_db, 0.0, 1e-12);
}

}  // namespace
}  // namespace wirefield::network
