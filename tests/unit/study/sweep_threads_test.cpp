// Sweeps do not depend on the number of worker threads: with matrix interpolation the
// anchors are filled the same way and each point is interpolated the same way, so 1 and 2
// workers give the same numbers to the last bit; filling exactly at every point, the fill's
// grouping across threads changes only the rounding.
#include <gtest/gtest.h>

#include "unit/error_text.hpp"
#include "wirefield/sweep.hpp"
#include "wirefield/wirefield.hpp"

namespace wirefield {
namespace {

const char* kModel =
    "wire top from (-5.1, 0, 10) to (5.1, 0, 10) radius 1mm segments 31\n"
    "feed src at top@50%\n"
    "load tip at top@80% series R=5ohm L=1uH\n"
    "ground real permittivity=13 conductivity=0.005\n";

SweepResult Sweep(int threads, bool interpolate) {
  SimulationOptions so;
  so.max_frequency_hz = 14.35e6;
  so.fill_threads = 2;  // the anchors' fill threads, whatever the sweep's worker count
  const Simulation sim(ParseModelText(kModel, "threads.wire"), so);
  SweepOptions o;
  o.threads = threads;
  o.interpolate = interpolate;
  return RunSweep(sim, FrequencyRange(14.0e6, 14.35e6, 5e3), o);
}

TEST(SweepThreads, InterpolatedSweepIsIdenticalForOneAndTwoWorkers) {
  const SweepResult one = Sweep(1, true), two = Sweep(2, true);
  ASSERT_EQ(one.points.size(), two.points.size());
  EXPECT_GT(one.interpolated_points, 0);
  for (size_t i = 0; i < one.points.size(); ++i) {
    EXPECT_EQ(one.points[i].feed_impedance_ohm, two.points[i].feed_impedance_ohm) << i;
    EXPECT_EQ(one.points[i].swr, two.points[i].swr) << i;
  }
}

TEST(SweepThreads, ExactSweepAgreesForOneAndTwoWorkersToRounding) {
  // Rounding of sums regrouped across threads (1e-16 relative) times the matrix's condition
  // number (below 1e5 here): 1e-10 leaves a factor of ten, far below any real difference.
  const SweepResult one = Sweep(1, false), two = Sweep(2, false);
  EXPECT_EQ(one.interpolated_points, 0);
  for (size_t i = 0; i < one.points.size(); ++i) {
    const Complex z1 = one.points[i].feed_impedance_ohm, z2 = two.points[i].feed_impedance_ohm;
    EXPECT_LE(std::abs(z2 - z1), 1e-10 * std::abs(z1)) << i;
  }
}

TEST(SweepThreads, ANegativeThreadCountIsRefusedNamingTheField) {
  SweepOptions o;
  o.threads = -2;
  EXPECT_EQ(testing::ErrorText([&] { o.Validate(); }),
            "threads:1:1: error: threads must be 0 (one per core) or a positive count; got -2");
  o.threads = 0;
  o.stress = StressOptions{};
  o.stress->power_w = -1.0;
  EXPECT_EQ(testing::ErrorText([&] { o.Validate(); }).rfind("power_w:1:1: error: power_w", 0), 0u);
}

}  // namespace
}  // namespace wirefield
