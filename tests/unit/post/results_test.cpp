// Segment currents and wire loss of solved currents (post/results.hpp). The loss of a segment
// is Joule's law, P = 1/2 |I|^2 R for a peak current I, with the resistance of a round wire at
// direct current R = L / (sigma pi a^2) (any circuits textbook); at 1 Hz a 1 mm copper wire is
// far thinner than the skin depth (about 66 mm), so its resistance is the DC one. A current
// falling linearly from I to 0 along the segment dissipates a third of that (the mean of t^2
// over [0, 1] is 1/3).
#include "post/results.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

namespace wirefield::post {
namespace {

constexpr double kCopperSPerM = 5.8e7;  // annealed copper (IACS, 100%)
constexpr double kRadiusM = 1e-3;
constexpr double kFrequencyHz = 1.0;

struct OneSegment {
  Model model;
  geometry::Mesh mesh;
};

OneSegment Lossy(double length_m, bool conductive) {
  OneSegment s;
  WireSpec wire;
  wire.radius_m = kRadiusM;
  if (conductive) wire.conductivity_s_per_m = kCopperSPerM;
  s.model.wires.push_back(wire);
  geometry::Segment seg;
  seg.start = geometry::Vec3(0.0, 0.0, 0.0);
  seg.end = geometry::Vec3(0.0, 0.0, length_m);
  seg.radius_m = kRadiusM;
  s.mesh.segments.push_back(seg);
  return s;
}

SegmentCurrent Current(Complex start_a, Complex end_a) {
  SegmentCurrent c;
  c.current_start_a = start_a;
  c.current_end_a = end_a;
  return c;
}

double DcResistanceOhm(double length_m) {
  return length_m / (kCopperSPerM * std::numbers::pi * kRadiusM * kRadiusM);
}

TEST(WireLoss, UniformCurrentFollowsJoulesLaw) {
  const OneSegment s = Lossy(2.0, true);
  const Complex i_a(0.6, 0.8);  // |I| = 1 A
  const double loss_w = WireLossW(s.model, s.mesh, {Current(i_a, i_a)}, kFrequencyHz);
  EXPECT_NEAR(loss_w, 0.5 * DcResistanceOhm(2.0), 1e-6 * loss_w);
}

TEST(WireLoss, LinearCurrentToZeroDissipatesAThird) {
  const OneSegment s = Lossy(2.0, true);
  const double loss_w = WireLossW(s.model, s.mesh, {Current(2.0, 0.0)}, kFrequencyHz);
  EXPECT_NEAR(loss_w, 0.5 * 4.0 * DcResistanceOhm(2.0) / 3.0, 1e-6 * loss_w);
}

TEST(WireLoss, PerfectConductorLosesNothing) {
  const OneSegment s = Lossy(2.0, false);
  EXPECT_EQ(WireLossW(s.model, s.mesh, {Current(1.0, 1.0)}, kFrequencyHz), 0.0);
}

}  // namespace
}  // namespace wirefield::post
