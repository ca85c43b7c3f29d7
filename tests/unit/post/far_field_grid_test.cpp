// The pattern's cost is set by its grids, which follow the antenna's electrical size, not its
// distance from the origin: the radiated-power grid of an antenna is the same wherever it
// stands, and so is its pattern. Both are translation invariance of the far-field intensity:
// moving a source by d multiplies E(rhat) by exp(jk rhat.d) and leaves |E|^2 unchanged
// (Balanis, Antenna Theory, 3rd ed., sec. 6.2, the array factor of a shifted element).
#include <gtest/gtest.h>

#include <array>
#include <cmath>
#include <string>

#include "post/far_field.hpp"
#include "wirefield/pattern.hpp"
#include "wirefield/wirefield.hpp"

namespace wirefield {
namespace {

// A half-wave dipole along y of 40 segments with the sinusoidal current of a thin dipole
// (Balanis, Antenna Theory, 3rd ed., eq. 4-56), centred at `centre`.
std::vector<SegmentCurrent> Dipole(double cx, double cy, double cz) {
  constexpr double kLength = 10.2;
  constexpr int kSegments = 40;
  const double k = 2.0 * M_PI / (2.0 * kLength);
  std::vector<SegmentCurrent> currents;
  auto current = [&](double y) {
    return Complex(std::sin(k * (0.5 * kLength - std::abs(y))), 0.0);
  };
  for (int s = 0; s < kSegments; ++s) {
    const double y0 = -0.5 * kLength + kLength * s / kSegments;
    const double y1 = -0.5 * kLength + kLength * (s + 1) / kSegments;
    SegmentCurrent c;
    c.start_m = {cx, cy + y0, cz};
    c.end_m = {cx, cy + y1, cz};
    c.current_start_a = current(y0);
    c.current_end_a = current(y1);
    c.current_a = current(0.5 * (y0 + y1));
    currents.push_back(c);
  }
  return currents;
}

constexpr double kFrequencyHz = 14.2e6;

TEST(FarFieldGrid, PowerGridDoesNotDependOnWhereTheAntennaStands) {
  GroundSpec free_space;
  const post::FarFieldSource here(Dipole(0.0, 0.0, 10.0), kFrequencyHz, free_space);
  for (const auto& [x, y, z] :
       {std::array<double, 3>{1000.0, 0.0, 10.0}, std::array<double, 3>{-3000.0, 2500.0, 10.0},
        std::array<double, 3>{0.0, 0.0, 5000.0}}) {
    const post::FarFieldSource there(Dipole(x, y, z), kFrequencyHz, free_space);
    EXPECT_EQ(there.power_grid().panels, here.power_grid().panels) << x << " " << y << " " << z;
    EXPECT_EQ(there.power_grid().phi_points, here.power_grid().phi_points);
    EXPECT_NEAR(there.extent_m(), here.extent_m(), 1e-9);
    // The integral itself: the same to rounding (relative 1e-12, some 10^4 times the
    // rounding of the sums).
    const double p_here = here.RadiatedPower(), p_there = there.RadiatedPower();
    EXPECT_NEAR(p_there, p_here, 1e-12 * p_here);
  }
  // A 10.2 m dipole at 14.2 MHz (k * radius about 1.5): the smallest grid, whatever its place
  // (1 km from the origin the old grid, sized by the distance to the origin, had 78 panels).
  EXPECT_EQ(here.power_grid().panels, 4);
  EXPECT_EQ(here.power_grid().phi_points, 2 * (2 + 8) + 2);
}

TEST(FarFieldGrid, OverGroundOnlyTheHeightSetsTheGrid) {
  GroundSpec perfect;
  perfect.kind = GroundKind::kPerfect;
  const post::FarFieldSource here(Dipole(0.0, 0.0, 10.0), kFrequencyHz, perfect);
  const post::FarFieldSource there(Dipole(2000.0, -700.0, 10.0), kFrequencyHz, perfect);
  EXPECT_EQ(there.power_grid().panels, here.power_grid().panels);
  EXPECT_EQ(there.power_grid().phi_points, here.power_grid().phi_points);
  // The image is 10 m below the ground: the radius is the distance of a wire end from the
  // centre at height 0, sqrt(5.1^2 + 10^2).
  EXPECT_NEAR(here.extent_m(), std::hypot(5.1, 10.0), 1e-12);
  EXPECT_EQ(there.RadiatedPower(), there.RadiatedPower(3));  // any thread count, to the bit
}

PatternResult PatternOf(const std::string& text, int threads) {
  SimulationOptions so;
  so.max_frequency_hz = kFrequencyHz;
  const Simulation sim(ParseModelText(text, "moved.wire"), so);
  const SolveResult solved = sim.Solve(kFrequencyHz);
  PatternOptions po;
  po.step_deg = 5.0;
  po.azimuth_cut_elevation_deg = 20.0;  // fixed cuts: no tie between equal lobes decides them
  po.elevation_cut_azimuth_deg = 90.0;
  po.threads = threads;
  return ComputePattern(sim, solved, po);
}

std::string Model(const std::string& x, const std::string& ground) {
  // A wire along y at x = X: its mesh points differ only in x, by a power of two, so the
  // two solves see the same segment vectors to the bit.
  return "wire d from (" + x + ", -5.1, 10) to (" + x + ", 5.1, 10) radius 1mm segments 41\n" +
         "feed f at d@50%\n" + ground + "frequency 14.2MHz\n";
}

TEST(FarFieldGrid, PatternOfAMovedAntennaEqualsTheUnmovedOne) {
  for (const std::string ground : {"", "ground perfect\n", "ground real preset=average\n"}) {
    const PatternResult here = PatternOf(Model("0", ground), 1);
    const PatternResult there = PatternOf(Model("1024", ground), 2);
    ASSERT_EQ(here.azimuth_cut.gain_dbi.size(), there.azimuth_cut.gain_dbi.size());
    ASSERT_EQ(here.elevation_cut.gain_dbi.size(), there.elevation_cut.gain_dbi.size());
    for (size_t i = 0; i < here.azimuth_cut.gain_dbi.size(); ++i) {
      EXPECT_NEAR(there.azimuth_cut.gain_dbi[i], here.azimuth_cut.gain_dbi[i], 1e-9) << ground << i;
    }
    for (size_t i = 0; i < here.elevation_cut.gain_dbi.size(); ++i) {
      EXPECT_NEAR(there.elevation_cut.gain_dbi[i], here.elevation_cut.gain_dbi[i], 1e-9)
          << ground << i;
    }
    EXPECT_NEAR(there.max_gain_dbi, here.max_gain_dbi, 1e-9) << ground;
    EXPECT_NEAR(there.power.radiated_w, here.power.radiated_w, 1e-12 * here.power.radiated_w);
  }
}

TEST(FarFieldGrid, PatternIsTheSameToTheBitForAnyThreadCount) {
  const std::string model = Model("3", "ground real preset=average\n");
  const PatternResult one = PatternOf(model, 1), three = PatternOf(model, 3);
  EXPECT_EQ(one.max_gain_dbi, three.max_gain_dbi);
  EXPECT_EQ(one.max_gain_elevation_deg, three.max_gain_elevation_deg);
  EXPECT_EQ(one.max_gain_azimuth_deg, three.max_gain_azimuth_deg);
  EXPECT_EQ(one.azimuth_cut.gain_dbi, three.azimuth_cut.gain_dbi);
  EXPECT_EQ(one.elevation_cut.gain_dbi, three.elevation_cut.gain_dbi);
  EXPECT_EQ(one.power.radiated_w, three.power.radiated_w);
}

}  // namespace
}  // namespace wirefield
