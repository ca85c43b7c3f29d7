// Post stage: the scalar potential of the charges on solved segments. Continuity gives each
// segment a uniform line charge q = (j / omega) dI/dl (C/m, the current being linear along
// the segment); the potential at a point is (1 / 4 pi eps0) sum_s q_s int e^{-jkR} / R dl,
// with the thin-wire reduced distance R = sqrt(|r - r'|^2 + a^2), taken against far away.
// Over a ground each segment has a quasi-static image of charge Gamma q, Gamma =
// -(eps_c - 1)/(eps_c + 1) (-1 over a perfect ground). See docs/numerics.md §7c.
#pragma once

#include <vector>

#include "wirefield/simulation.hpp"

namespace wirefield::post {

// A segment's current with the radius of its wire.
struct ChargedSegment {
  SegmentCurrent current;
  double radius_m = 0.0;
};

// Peak phasor potential (V) at point_m of the charges of `segments` at frequency_hz.
Complex ScalarPotential(const std::vector<ChargedSegment>& segments, double frequency_hz,
                        const GroundSpec& ground, const Point& point_m);

// The integral of e^{-jkR} / R along a straight segment from a to b (m) with R the reduced
// distance sqrt(|p - r'|^2 + radius^2): the static part in closed form (asinh), the smooth
// rest (e^{-jkR} - 1) / R by Gauss-Legendre quadrature.
Complex SegmentPotentialIntegral(const Point& a, const Point& b, double radius_m, const Point& p,
                                 double wavenumber_per_m);

}  // namespace wirefield::post
