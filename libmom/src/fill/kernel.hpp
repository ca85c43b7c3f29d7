// Fill stage: the thin-wire kernel integrated over a pair of straight segments.
// For observation segment a (parameter t) and source segment b (parameter t'), both in [0, 1],
// returns the four moments of G = exp(-jkR)/R, R = sqrt(|r(t) - r'(t')|^2 + radius^2) (the
// reduced kernel): int int G, int int t G, int int t' G, int int t t' G dt dt'.
// Near pairs take the 1/R part analytically over t'; see docs/numerics.md.
#pragma once

#include <Eigen/Core>
#include <complex>

namespace wirefield::fill {

using Complex = std::complex<double>;
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

// Same moments by brute-force high-order product quadrature (for tests of the fast path).
PairMoments SegmentPairMomentsReference(const Vec3& a0, const Vec3& a1, const Vec3& b0,
                                        const Vec3& b1, double radius2_m2, double wavenumber_per_m,
                                        int subdivisions);

}  // namespace wirefield::fill
