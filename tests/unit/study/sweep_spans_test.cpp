// RunSpans merges the sweeps of its spans: the counts of work each sweep reports (matrix fills,
// interpolated and projected points) add up over the spans, and the points are those of each
// span solved on its own. Checked against RunSweep run on each span separately, by the
// definitions of SweepResult's counts in wirefield/sweep.hpp and of RunSpans in
// wirefield/bands.hpp ("solves every span on its own").
#include <gtest/gtest.h>

#include <vector>

#include "wirefield/bands.hpp"
#include "wirefield/sweep.hpp"
#include "wirefield/wirefield.hpp"

namespace wirefield {
namespace {

// A campsite dipole for 20 m, 1.2 m over the picnic table, in free space.
const char* kModel =
    "wire dipole from (-5.02, 0, 1.2) to (5.02, 0, 1.2) radius 1mm segments 31\n"
    "feed src at dipole@50%\n"
    "ground free\n";

// 36 points per span: enough for a window solved partly by projection (24 points or more,
// docs/numerics.md, "Interpolation in frequency") and, at under 48 points, one chunk of
// RunSpans whatever the thread count (the progress count below confirms it).
constexpr int kPointsPerSpan = 36;

TEST(RunSpans, AddsTheProjectedPointsOfEverySpan) {
  SimulationOptions so;
  so.max_frequency_hz = 18.2e6;
  const Simulation sim(ParseModelText(kModel, "campsite.wire"), so);
  SweepOptions options;
  options.threads = 1;
  const std::vector<SweepSpan> spans = {
      {"20m", FrequencyPoints(14.0e6, 14.35e6, kPointsPerSpan), "test"},
      {"17m", FrequencyPoints(18.068e6, 18.168e6, kPointsPerSpan), "test"}};

  int chunks = 0;
  const SweepResult merged = RunSpans(sim, spans, options, [&chunks](int, int) { ++chunks; });
  const SweepResult low = RunSweep(sim, spans[0].frequencies_hz, options);
  const SweepResult high = RunSweep(sim, spans[1].frequencies_hz, options);

  ASSERT_EQ(chunks, 2);  // one RunSweep per span, so the sums below are the whole story
  // Each span has projected points of its own, so a merge that dropped them shows.
  EXPECT_GT(low.projected_points, 0);
  EXPECT_GT(high.projected_points, 0);
  EXPECT_EQ(merged.projected_points, low.projected_points + high.projected_points);
  EXPECT_EQ(merged.interpolated_points, low.interpolated_points + high.interpolated_points);
  EXPECT_EQ(merged.matrix_fills, low.matrix_fills + high.matrix_fills);
  // The same points, bit for bit: a sweep does not depend on how it is called
  // (sweep_threads_test.cpp shows it does not depend on the threads either).
  ASSERT_EQ(merged.points.size(), 2u * kPointsPerSpan);
  for (int i = 0; i < kPointsPerSpan; ++i) {
    EXPECT_EQ(merged.points[static_cast<size_t>(i)].feed_impedance_ohm,
              low.points[static_cast<size_t>(i)].feed_impedance_ohm)
        << i;
    EXPECT_EQ(merged.points[static_cast<size_t>(kPointsPerSpan + i)].feed_impedance_ohm,
              high.points[static_cast<size_t>(i)].feed_impedance_ohm)
        << i;
  }
}

}  // namespace
}  // namespace wirefield
