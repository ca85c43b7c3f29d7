// Fill stage: the thin-wire kernel integrated over a pair of straight segments.
// For observation segment a (parameter t) and source segment b (parameter t'), both in [0, 1],
// returns the four moments of G = exp(-jkR)/R, R = sqrt(|r(t) - r'(t')|^2 + radius^2) (the
// reduced kernel): int int G, int int t G, int int t' G, int int t t' G dt dt'.
// Near pairs take the 1/R part analytically over t'; see docs/numerics.md.
#pragma once

#include <Eigen/Core>
#include <array>
#include <complex>

#include "wirefield/core.hpp"

namespace wirefield::fill {

using Vec3 = Eigen::Vector3d;

struct PairMoments {
  Complex m00, m10, m01, m11;  // 1, t, t', t t'
};

// Moments of the reduced kernel between segments a0-a1 (observation) and b0-b1 (source).
// radius2_m2: squared equivalent radius; wavenumber_per_m: k = omega / c.
PairMoments SegmentPairMoments(const Vec3& a0, const Vec3& a1, const Vec3& b0, const Vec3& b1,
                               double radius2_m2, double wavenumber_per_m);

// The split used by the fill, so that sweeps reuse the frequency-independent part:
// near pairs = static part (1/R, closed form inner, graded outer; no frequency) + smooth part
// ((exp(-jkR) - 1)/R by a 4x4 product rule); far pairs = product rule of G.
bool IsNearPair(const Vec3& a0, const Vec3& a1, const Vec3& b0, const Vec3& b1);
PairMoments StaticNearMoments(const Vec3& a0, const Vec3& a1, const Vec3& b0, const Vec3& b1,
                              double radius2_m2);
PairMoments FrequencyMoments(const Vec3& a0, const Vec3& a1, const Vec3& b0, const Vec3& b1,
                             double radius2_m2, double wavenumber_per_m, bool near);

// The fast path of the fill, the same quadrature as FrequencyMoments to rounding. Each
// segment's Gauss points (3-, 4- and 6-point rules) are computed once per mesh; a far pair's
// rule is chosen from the distance of the centres and the half-lengths, with the exact segment
// distance only where those bounds leave the choice open; the phase exp(-jkR) of all points of
// a pair comes from one sine and cosine at the centres times a short series in k (R - R_c).
struct SegmentNodes {
  Vec3 start, end, centre;
  double length_m = 0.0;
  std::array<Vec3, 2> p2;
  std::array<Vec3, 3> p3;
  std::array<Vec3, 4> p4;
  std::array<Vec3, 6> p6;
};
SegmentNodes MakeSegmentNodes(const Vec3& start, const Vec3& end);
// Pairs whose centres lie farther apart than both half-lengths plus this many times the
// longer segment, of segments shorter than kFarthestPhase / k, take the 2x2 rule (fast path
// only) instead of the 3x3. Its relative error goes as (k L + L / gap)^3 / 180 (the rule is
// exact for cubics, so the third derivative of t G leads); the limits are set from the
// measured worst error against the high-order reference, 1.4e-7 where 1e-6 is allowed
// (tests/unit/fill/fast_kernel_test.cpp).
inline constexpr double kFarthestFactor = 30.0;
inline constexpr double kFarthestPhase = 0.04;
// FrequencyMoments(a, b, .., near = false) from the precomputed nodes, except for the pairs
// above.
PairMoments FarMoments(const SegmentNodes& a, const SegmentNodes& b, double radius2_m2,
                       double wavenumber_per_m);

// Above this |x| the series below would need more terms (the fill then falls back to one sine
// and cosine per point; 0.5 rad covers segments up to a twelfth of a wavelength).
inline constexpr double kSeriesPhaseLimit = 0.5;

// Below this |x| a shorter series serves: its first term left out, 0.05^8 / 8!, is
// 1e-15.
inline constexpr double kShortSeriesPhaseLimit = 0.05;

// exp(-jx) by its Taylor series: through x^15 for |x| <= kSeriesPhaseLimit (the first term
// left out, 0.5^16 / 16!, is 7e-19), through x^7 for |x| <= kShortSeriesPhaseLimit.
template <bool kShort>
inline void SeriesPhase(double x, double* c, double* s) {
  const double x2 = x * x;
  double cp = 0.0, sp = 0.0;
  if constexpr (kShort) {
    cp = -1.0 / 720.0;
    sp = -1.0 / 5040.0;
  } else {
    cp = 1.0 / 87178291200.0;  // 1/14!
    cp = cp * (-x2) + 1.0 / 479001600.0;
    cp = cp * (-x2) + 1.0 / 3628800.0;
    cp = cp * (-x2) + 1.0 / 40320.0;
    cp = cp * x2 - 1.0 / 720.0;
    sp = -1.0 / 1307674368000.0;  // -1/15!
    sp = sp * x2 + 1.0 / 6227020800.0;
    sp = sp * (-x2) + 1.0 / 39916800.0;
    sp = sp * (-x2) + 1.0 / 362880.0;
    sp = sp * x2 - 1.0 / 5040.0;
  }
  cp = cp * x2 + 1.0 / 24.0;
  cp = cp * (-x2) + 1.0 / 2.0;
  cp = cp * (-x2) + 1.0;
  sp = sp * x2 + 1.0 / 120.0;
  sp = sp * (-x2) + 1.0 / 6.0;
  sp = sp * (-x2) + 1.0;
  *c = cp;
  *s = -x * sp;
}

// Same moments by brute-force high-order product quadrature (for tests of the fast path).
PairMoments SegmentPairMomentsReference(const Vec3& a0, const Vec3& a1, const Vec3& b0,
                                        const Vec3& b1, double radius2_m2, double wavenumber_per_m,
                                        int subdivisions);

}  // namespace wirefield::fill
