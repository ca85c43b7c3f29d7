// Validation: an end-fed half-wave wire through its step-up transformer. The feed shows a few
// thousand ohms (common practice: 2-5 kOhm); a transformer whose impedance ratio matches it
// brings the SWR at the transmitter down, mismatched ratios raise it, and a coax line moves
// the impedance along a circle of constant SWR (less its loss).
#include <gtest/gtest.h>

#include <cmath>

#include "core/constants.hpp"
#include "validation/test_models.hpp"

namespace wirefield {
namespace {

constexpr double kFrequencyHz = 7.1e6;

// A 0.49-wavelength wire 8 m up, fed at one end against a 0.05-wavelength counterpoise
// (the hiking club's field kit, in free space for this check).
Model EndFed() {
  const double lambda = core::kSpeedOfLight_m_per_s / kFrequencyHz;
  Model m;
  m.file = "end_fed";
  m.wires.push_back(testing::Wire("radiator", {0, 0, 8}, {0.49 * lambda, 0, 8}, 1e-3, 81));
  m.wires.push_back(testing::Wire("counterpoise", {-0.05 * lambda, 0, 8}, {0, 0, 8}, 1e-3, 9));
  m.feeds.push_back(testing::Feed("feed", "radiator", PointKind::kStart, 0.0));
  m.frequency_hz = kFrequencyHz;
  return m;
}

FeedResult SolveWith(const Model& m) {
  SimulationOptions o;
  o.max_frequency_hz = kFrequencyHz;
  return Simulation(m, o).Solve(kFrequencyHz).feeds.at(0);
}

TEST(EndFedHalfWave, FeedImpedanceIsAFewKiloohms) {
  // REFERENCES.md §8 (common practice): R_in between 1.5 and 6 kOhm for an end-fed half wave.
  const FeedResult f = SolveWith(EndFed());
  EXPECT_GT(f.impedance_ohm.real(), 1500.0);
  EXPECT_LT(f.impedance_ohm.real(), 6000.0);
}

TEST(EndFedHalfWave, MatchedTransformerRatioGivesTheLowestSwr) {
  // Turns-ratio law (REFERENCES.md §5): an ideal P:S transformer divides the impedance by
  // (S/P)^2. Choosing S/P = sqrt(R_feed / 50) (an ideal autotransformer, no magnetizing
  // current) makes the resistive part 50 ohm; the SWR is then set by the feed's reactance
  // only, and both a 1:4 (16:1) and a 1:14 (196:1) ratio do worse.
  const FeedResult bare = SolveWith(EndFed());
  const double matched_ratio = std::sqrt(bare.impedance_ohm.real() / 50.0);
  auto swr_for = [&](double ratio) {
    Model m = EndFed();
    m.transformers.push_back(testing::Transformer("t", "feed", 1.0, ratio));
    const FeedResult f = SolveWith(m);
    // The ideal transformer presents Z / ratio^2 exactly.
    EXPECT_LT(std::abs(f.transmitter_impedance_ohm - f.impedance_ohm / (ratio * ratio)),
              1e-9 * std::abs(f.transmitter_impedance_ohm));
    return f.swr;
  };
  const double matched = swr_for(matched_ratio);
  const Complex z = bare.impedance_ohm / (matched_ratio * matched_ratio);
  const double gamma = std::abs((z - 50.0) / (z + 50.0));  // SWR definition, REFERENCES §5
  EXPECT_NEAR(matched, (1 + gamma) / (1 - gamma), 1e-9);
  EXPECT_LT(matched, swr_for(4.0));
  EXPECT_LT(matched, swr_for(14.0));
  EXPECT_LT(swr_for(7.0), swr_for(4.0)) << "1:49 beats 1:16 on a few-kiloohm feed";
}

TEST(EndFedHalfWave, LosslessLineKeepsTheSwrAndLossyLineLowersIt) {
  // A lossless line only rotates the reflection coefficient (REFERENCES.md §5), so the SWR
  // at the transmitter is unchanged; a lossy line lowers it and takes its share of power.
  Model m = EndFed();
  m.transformers.push_back(testing::Transformer("t", "feed", 2.0, 14.0));
  const FeedResult no_line = SolveWith(m);
  FeedLineSpec line = testing::FeedLine("coax", "feed", 11.3);
  line.z0_ohm = 50.0;
  line.velocity_factor = 0.66;
  m.feed_lines.push_back(line);
  const FeedResult lossless = SolveWith(m);
  EXPECT_NEAR(lossless.swr, no_line.swr, 1e-6 * no_line.swr);
  EXPECT_NEAR(lossless.line_loss_fraction, 0.0, 1e-9);
  m.feed_lines[0].loss1_db_per_100m = 4.0;
  m.feed_lines[0].loss2_db_per_100m = 8.0;
  const FeedResult lossy = SolveWith(m);
  EXPECT_LT(lossy.swr, no_line.swr);
  EXPECT_GT(lossy.line_loss_fraction, 0.0);
}

}  // namespace
}  // namespace wirefield
