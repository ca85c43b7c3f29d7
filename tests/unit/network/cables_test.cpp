// Tests of the built-in cable table (libmom/src/network/cables.cpp) against REFERENCES.md
// §5.1, and of the loss fit each cable gets.
#include <gtest/gtest.h>

#include <cmath>

#include "network/line.hpp"
#include "wirefield/network.hpp"

namespace wirefield {
namespace {

const CableInfo& Find(const std::string& name) {
  for (const CableInfo& c : CableTable()) {
    if (c.name == name) return c;
  }
  throw std::runtime_error("no cable " + name);
}

TEST(CableTable, HoldsTheFourCablesOfTheReferenceSheetWithTheirFigures) {
  // REFERENCES §5.1: Z0, velocity factor, loss at 30 MHz (dB/100 m; RG-58, RG-174 and RG-213
  // confirmed from a handbook table, RG-316 from memory) and at 10 MHz (from memory).
  const struct {
    const char* name;
    double vf, loss10, loss30;
  } rows[] = {{"RG-58", 0.66, 4.25, 8.1},
              {"RG-174", 0.66, 10.8, 15.0},
              {"RG-213", 0.66, 2.0, 3.5},
              {"RG-316", 0.695, 9.0, 15.0}};
  ASSERT_EQ(CableTable().size(), 4u);
  for (const auto& row : rows) {
    const CableInfo& c = Find(row.name);
    EXPECT_EQ(c.z0_ohm, 50.0);
    EXPECT_EQ(c.velocity_factor, row.vf);
    EXPECT_EQ(c.loss1_frequency_hz, 10e6);
    EXPECT_EQ(c.loss2_frequency_hz, 30e6);
    EXPECT_EQ(c.loss1_db_per_100m, row.loss10);
    EXPECT_EQ(c.loss2_db_per_100m, row.loss30);
    EXPECT_NE(c.source.find("from memory"), std::string::npos) << c.name;
  }
}

TEST(CableTable, RG58TenMegahertzFigureLiesInTheReferenceRange) {
  // REFERENCES §5.1: 1.2-1.4 dB/100 ft = 3.9-4.6 dB/100 m at 10 MHz (1 ft = 0.3048 m).
  const CableInfo& c = Find("RG-58");
  EXPECT_GE(c.loss1_db_per_100m, 1.2 / 0.3048 - 0.05);
  EXPECT_LE(c.loss1_db_per_100m, 1.4 / 0.3048 + 0.05);
  // 2.47 dB/100 ft = 8.10 dB/100 m at 30 MHz; the table keeps 2 digits.
  EXPECT_NEAR(c.loss2_db_per_100m, 2.47 / 0.3048, 0.05);
}

TEST(CableTable, EveryCableFitMeetsItsFiguresWithinTheReferenceTolerance) {
  // REFERENCES §5.1 gives +-25% (+-30% for RG-316) for these generic figures; the fit
  // alpha = a sqrt(f) + b f is exact where the figures allow it (RG-58, RG-213) and within
  // that tolerance where they grow more slowly than sqrt(f) (RG-174, RG-316).
  for (const CableInfo& c : CableTable()) {
    const network::LossFit fit = network::FitLoss(c.loss1_db_per_100m, c.loss1_frequency_hz,
                                                  c.loss2_db_per_100m, c.loss2_frequency_hz);
    const double tol = c.name == "RG-316" ? 0.30 : 0.25;
    for (const auto& [db, f] : {std::pair{c.loss1_db_per_100m, c.loss1_frequency_hz},
                                std::pair{c.loss2_db_per_100m, c.loss2_frequency_hz}}) {
      const double got_db =
          network::AttenuationNepersPerMetre(fit, f) * 100.0 * network::DbPerNeper();
      EXPECT_LE(std::abs(got_db / db - 1.0), fit.exact ? 1e-12 : tol) << c.name << " " << f;
    }
  }
  EXPECT_TRUE(network::FitLoss(4.25, 10e6, 8.1, 30e6).exact);
  EXPECT_TRUE(network::FitLoss(2.0, 10e6, 3.5, 30e6).exact);
}

}  // namespace
}  // namespace wirefield
