// Unit tests of the half-space correction's quadrature over pairs of segments
// (fill/half_space.hpp): the far pairs' expansion about the centres against one table lookup
// per pair of points.
#include "fill/half_space.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <complex>
#include <iostream>
#include <string>

#include "core/constants.hpp"
#include "geometry/mesh.hpp"
#include "wirefield/wirefield.hpp"

namespace wirefield::fill {
namespace {

// The expansion neglects second-order terms, of order (L / R')^2 of the correction with R' at
// least 20 segment lengths L: under 1e-4 of the image term exp(-jkR')/R' of the pair (the
// size the correction is measured against; the table's own interpolation error is under 1e-3
// of it, tests/unit/ground/sommerfeld_test.cpp). The bound is this file's own requirement.
constexpr double kExpansionTolerance = 1e-4;

struct Case {
  std::string name, text;
  double frequency_hz;
  std::complex<double> eps_c;
};

std::complex<double> Permittivity(double eps_r, double sigma_s_per_m, double frequency_hz) {
  return {eps_r, -sigma_s_per_m / (2.0 * core::kPi * frequency_hz * core::kEps0_f_per_m)};
}

// The largest difference of the expansion from the full rule over every pair of the model's
// segments, relative to the pair's image term 1/R' at its centres.
double LargestExpansionError(const Case& c, int* expanded_pairs) {
  const Model model = ParseModelText(c.text, c.name + ".wire");
  geometry::MeshOptions o;
  o.max_frequency_hz = c.frequency_hz;
  const geometry::Mesh mesh = geometry::BuildMesh(model, o);
  const double k = 2.0 * core::kPi * c.frequency_hz / core::kSpeedOfLight_m_per_s;
  HalfSpaceFill expanded(mesh, c.eps_c, k, INFINITY);
  HalfSpaceFill full(mesh, c.eps_c, k, INFINITY);
  full.UseFarExpansion(false);
  double worst = 0.0;
  *expanded_pairs = 0;
  for (const geometry::Segment& a : mesh.segments) {
    for (const geometry::Segment& b : mesh.segments) {
      const HalfSpacePair e = expanded.Moments(a.start, a.end, b.start, b.end);
      const HalfSpacePair f = full.Moments(a.start, a.end, b.start, b.end);
      const Vec3 image_b = 0.5 * (b.start + b.end).cwiseProduct(Vec3(1.0, 1.0, -1.0));
      const double image = 1.0 / (0.5 * (a.start + a.end) - image_b).norm();
      const double error =
          std::max({std::abs(e.vector.m00 - f.vector.m00), std::abs(e.vector.m10 - f.vector.m10),
                    std::abs(e.vector.m01 - f.vector.m01), std::abs(e.vector.m11 - f.vector.m11),
                    std::abs(e.charge - f.charge)}) /
          image;
      if (error > 0.0) ++*expanded_pairs;
      worst = std::max(worst, error);
    }
  }
  return worst;
}

TEST(HalfSpaceFill, FarPairsExpansionAgreesWithOneLookupPerPairOfPoints) {
  // Grounds: average (13, 5 mS/m) and dry (5, 1 mS/m) (common practice).
  const Case cases[] = {
      {"tall_vertical",
       "units m\nwire dip from (0, 0, 1) to (0, 0, 21.3) radius 1mm segments 201\n"
       "feed src at dip@50%\n",
       7.1e6, Permittivity(13.0, 5e-3, 7.1e6)},
      {"low_and_slant",
       "units m\nwire flat from (-10, 0, 1.5) to (10, 0, 1.5) radius 1mm segments 101\n"
       "feed src at flat@50%\n"
       "wire slant from (-10, 0, 1.5) to (-10, 8, 6) radius 1mm segments 100\n",
       7.1e6, Permittivity(13.0, 5e-3, 7.1e6)},
      {"sloper_dry",
       "units m\nwire sloper from (0, 0, 2) to (8.3, 0, 9) radius 0.5mm segments 61\n"
       "feed src at sloper@start\n"
       "wire radial from (0, 0, 2) to (-1.5, 3, 2) radius 0.5mm segments 11\n",
       14.2e6, Permittivity(5.0, 1e-3, 14.2e6)},
  };
  for (const Case& c : cases) {
    int expanded_pairs = 0;
    const double worst = LargestExpansionError(c, &expanded_pairs);
    std::cout << c.name << ": " << expanded_pairs << " pairs expanded, largest difference " << worst
              << " of the image term\n";
    EXPECT_GT(expanded_pairs, 0) << c.name;
    EXPECT_LT(worst, kExpansionTolerance) << c.name;
  }
}

TEST(HalfSpaceFill, PreparedSegmentsGiveTheMomentsOfTheirEndpoints) {
  // The fill takes each pair's moments from segment data prepared once (direction, lowest
  // point, centre, two-point nodes) and decides the rule from a bound on the distance to the
  // other's image before computing that distance; the moments must be those of the endpoints,
  // to the bit, over every pair of a sloper with a radial and a wire that comes down to the
  // ground (graded rule, near and far pairs). Dry ground (5, 1 mS/m; common practice).
  const Model model = ParseModelText(
      "units m\nwire sloper from (0, 0, 2) to (8.3, 0, 9) radius 0.5mm segments 41\n"
      "feed src at sloper@start\n"
      "wire radial from (0, 0, 2) to (-1.5, 3, 2) radius 0.5mm segments 9\n"
      "wire down from (8.3, 0, 9) to (8.3, 2, 0.05) radius 0.5mm segments 21\n",
      "prepared.wire");
  geometry::MeshOptions o;
  o.max_frequency_hz = 14.2e6;
  const geometry::Mesh mesh = geometry::BuildMesh(model, o);
  const double k = 2.0 * core::kPi * 14.2e6 / core::kSpeedOfLight_m_per_s;
  const HalfSpaceFill fill(mesh, Permittivity(5.0, 1e-3, 14.2e6), k, INFINITY);
  const int n = static_cast<int>(mesh.segments.size());
  for (int i = 0; i < n; ++i) {
    for (int j = 0; j < n; ++j) {
      const geometry::Segment &a = mesh.segments[i], &b = mesh.segments[j];
      const HalfSpacePair p = fill.Moments(i, j), q = fill.Moments(a.start, a.end, b.start, b.end);
      ASSERT_EQ(p.vector.m00, q.vector.m00) << i << " " << j;
      ASSERT_EQ(p.vector.m10, q.vector.m10) << i << " " << j;
      ASSERT_EQ(p.vector.m01, q.vector.m01) << i << " " << j;
      ASSERT_EQ(p.vector.m11, q.vector.m11) << i << " " << j;
      ASSERT_EQ(p.charge, q.charge) << i << " " << j;
    }
  }
}

TEST(HalfSpaceFill, NoExpansionOverSeaWater) {
  // Sea water (80, 5 S/m) (common practice): |eps_c| some 6300 at 14.2 MHz, where the
  // expansion is not used; every pair equals the full rule to the last bit.
  const Case cases[] = {
      {"dipole_sea",
       "units m\nwire dip from (-5, 0, 10) to (5, 2, 10.5) radius 1mm segments 61\n"
       "feed src at dip@50%\n"
       "wire drop from (5, 2, 10.5) to (6, 4, 3) radius 1mm segments 41\n",
       14.2e6, Permittivity(80.0, 5.0, 14.2e6)},
  };
  for (const Case& c : cases) {
    int expanded_pairs = 0;
    EXPECT_EQ(LargestExpansionError(c, &expanded_pairs), 0.0) << c.name;
    EXPECT_EQ(expanded_pairs, 0) << c.name;
  }
}

}  // namespace
}  // namespace wirefield::fill
