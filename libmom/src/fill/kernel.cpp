// Fill stage: segment-pair integrals of the reduced thin-wire kernel (see kernel.hpp).
// Far pairs: Gauss-Legendre product rules. Near pairs: for each outer point the static part
// 1/R is integrated over the source segment in closed form, the smooth rest (exp(-jkR)-1)/R by
// Gauss-Legendre; the outer rule is graded toward segment ends that touch the source segment,
// where the closed-form inner integral varies on the scale of the radius.
#include "fill/kernel.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <vector>

#include "fill/unit_gauss.hpp"
#include "geometry/mesh.hpp"

namespace wirefield::fill {
namespace {

// A pair is near when the segments come closer than this many times the longer one.
constexpr double kNearFactor = 1.0;
// Far pairs closer than this many times the longer segment get the 6x6 rule, those closer
// than kFarFactor the 4x4 rule, the rest 3x3: beyond ten segment lengths 1/R varies by under
// 10% across a segment, and the 3-point rule's error (order 6) is some 1e-6 of the entry.
constexpr double kMidFactor = 4.0;
constexpr double kFarFactor = 10.0;

// Product Gauss-Legendre rule of kernel(R) over both segments.
template <int N, typename Kernel>
PairMoments ProductRule(const Vec3& a0, const Vec3& da, const Vec3& b0, const Vec3& db,
                        double radius2, Kernel kernel) {
  const auto& r = Gauss<N>();
  PairMoments m;
  for (int i = 0; i < N; ++i) {
    const Vec3 p = a0 + da * r.x[i];
    Complex s0 = 0.0, s1 = 0.0;
    for (int j = 0; j < N; ++j) {
      const Complex g = r.w[j] * kernel(std::sqrt((p - b0 - db * r.x[j]).squaredNorm() + radius2));
      s0 += g;
      s1 += g * r.x[j];
    }
    m.m00 += r.w[i] * s0;
    m.m10 += r.w[i] * r.x[i] * s0;
    m.m01 += r.w[i] * s1;
    m.m11 += r.w[i] * r.x[i] * s1;
  }
  return m;
}

// The full kernel exp(-jkR)/R.
struct FullKernel {
  double k;
  Complex operator()(double R) const { return std::polar(1.0 / R, -k * R); }
};

// The smooth part (exp(-jkR) - 1) / R of a near pair, without cancellation for small kR. It
// is bounded by k and its only roughness, a kink of k^2 R / 2 along t = t', is far below the
// static part, so a product rule serves.
struct SmoothKernel {
  double k;
  Complex operator()(double R) const {
    const double kr = k * R;
    return kr < 1e-3 ? Complex(-0.5 * k * kr, -k * (1.0 - kr * kr / 6.0))
                     : (std::polar(1.0, -kr) - 1.0) / R;
  }
};

// Inner integral over the source segment for one observation point: static part closed form.
struct Inner {
  Complex i0, i1;  // int G dt', int t' G dt'
};

Inner InnerStatic(const Vec3& p, const Vec3& b0, const Vec3& ub, double lb, double radius2) {
  const Vec3 r = p - b0;
  const double z0 = r.dot(ub);
  const double d2 = std::max(r.squaredNorm() - z0 * z0, 0.0) + radius2;
  const double d = std::sqrt(d2);
  // int_0^lb ds / sqrt((s - z0)^2 + d^2) and int_0^lb s ds / sqrt(...)
  const double s0 = std::asinh((lb - z0) / d) + std::asinh(z0 / d);
  const double rl = std::sqrt((lb - z0) * (lb - z0) + d2);
  const double r0 = std::sqrt(z0 * z0 + d2);
  const double s1 = rl - r0 + z0 * s0;
  return {Complex(s0 / lb, 0.0), Complex(s1 / (lb * lb), 0.0)};
}

// Breakpoints of the outer rule on [0, 1], graded geometrically toward touching ends.
std::vector<double> OuterBreaks(bool grade_start, bool grade_end, double scale) {
  std::vector<double> mids;
  // Grading stops at kFinestBreak of the segment: what lies closer to the end contributes
  // below 1e-8 of the integral (its integrand is only logarithmically singular).
  constexpr double kFinestBreak = 1e-8;
  if (scale < 0.05) {
    for (double x = std::max(scale, kFinestBreak); x < 0.5; x *= 4.0) mids.push_back(x);
  }
  std::vector<double> breaks{0.0};
  if (grade_start) breaks.insert(breaks.end(), mids.begin(), mids.end());
  breaks.push_back(0.5);
  if (grade_end) {
    for (auto it = mids.rbegin(); it != mids.rend(); ++it) breaks.push_back(1.0 - *it);
  }
  breaks.push_back(1.0);
  return breaks;
}

PairMoments StaticNear(const Vec3& a0, const Vec3& a1, const Vec3& b0, const Vec3& b1,
                       double radius2) {
  const Vec3 da = a1 - a0, db = b1 - b0;
  const double la = da.norm(), lb = db.norm();
  const Vec3 ub = db / lb;
  const double radius = std::sqrt(radius2);
  auto touches = [&](const Vec3& p) {
    return geometry::SegmentDistance(p, p, b0, b1, nullptr) < 2.0 * radius;
  };
  const std::vector<double> breaks = OuterBreaks(touches(a0), touches(a1), radius / la);
  const auto& g = Gauss<8>();
  PairMoments m;
  for (size_t iv = 0; iv + 1 < breaks.size(); ++iv) {
    const double lo = breaks[iv], width = breaks[iv + 1] - breaks[iv];
    for (int i = 0; i < 8; ++i) {
      const double t = lo + width * g.x[i];
      const double w = width * g.w[i];
      const Inner in = InnerStatic(a0 + da * t, b0, ub, lb, radius2);
      m.m00 += w * in.i0;
      m.m10 += w * t * in.i0;
      m.m01 += w * in.i1;
      m.m11 += w * t * in.i1;
    }
  }
  return m;
}

}  // namespace

bool IsNearPair(const Vec3& a0, const Vec3& a1, const Vec3& b0, const Vec3& b1) {
  const double la = (a1 - a0).norm(), lb = (b1 - b0).norm();
  const double longest = std::max(la, lb);
  // The segments lie no closer than their centres' distance less both half-lengths: beyond
  // the near distance by a margin for rounding, the exact distance is not needed.
  const double lower = 0.5 * (a0 + a1 - b0 - b1).norm() - 0.5 * (la + lb);
  if (lower > kNearFactor * longest * (1.0 + 1e-9)) return false;
  return geometry::SegmentDistance(a0, a1, b0, b1, nullptr) < kNearFactor * longest;
}

PairMoments StaticNearMoments(const Vec3& a0, const Vec3& a1, const Vec3& b0, const Vec3& b1,
                              double radius2_m2) {
  return StaticNear(a0, a1, b0, b1, radius2_m2);
}

PairMoments FrequencyMoments(const Vec3& a0, const Vec3& a1, const Vec3& b0, const Vec3& b1,
                             double radius2_m2, double wavenumber_per_m, bool near) {
  if (near)
    return ProductRule<4>(a0, a1 - a0, b0, b1 - b0, radius2_m2, SmoothKernel{wavenumber_per_m});
  const double longest = std::max((a1 - a0).norm(), (b1 - b0).norm());
  const double gap = geometry::SegmentDistance(a0, a1, b0, b1, nullptr);
  if (gap < kMidFactor * longest) {
    return ProductRule<6>(a0, a1 - a0, b0, b1 - b0, radius2_m2, FullKernel{wavenumber_per_m});
  }
  if (gap < kFarFactor * longest) {
    return ProductRule<4>(a0, a1 - a0, b0, b1 - b0, radius2_m2, FullKernel{wavenumber_per_m});
  }
  return ProductRule<3>(a0, a1 - a0, b0, b1 - b0, radius2_m2, FullKernel{wavenumber_per_m});
}

PairMoments SegmentPairMoments(const Vec3& a0, const Vec3& a1, const Vec3& b0, const Vec3& b1,
                               double radius2_m2, double wavenumber_per_m) {
  const bool near = IsNearPair(a0, a1, b0, b1);
  PairMoments m = FrequencyMoments(a0, a1, b0, b1, radius2_m2, wavenumber_per_m, near);
  if (near) {
    const PairMoments s = StaticNear(a0, a1, b0, b1, radius2_m2);
    m.m00 += s.m00;
    m.m10 += s.m10;
    m.m01 += s.m01;
    m.m11 += s.m11;
  }
  return m;
}

SegmentNodes MakeSegmentNodes(const Vec3& start, const Vec3& end) {
  SegmentNodes s;
  s.start = start;
  s.end = end;
  s.centre = 0.5 * (start + end);
  s.length_m = (end - start).norm();
  const Vec3 d = end - start;
  // The same expressions as ProductRule's points, so the nodes agree to the last bit.
  for (int i = 0; i < 2; ++i) s.p2[i] = start + d * Gauss<2>().x[i];
  for (int i = 0; i < 3; ++i) s.p3[i] = start + d * Gauss<3>().x[i];
  for (int i = 0; i < 4; ++i) s.p4[i] = start + d * Gauss<4>().x[i];
  for (int i = 0; i < 6; ++i) s.p6[i] = start + d * Gauss<6>().x[i];
  return s;
}

namespace {

// w exp(-jkR) / R at every point of a pair as real and imaginary parts, the phase from the
// centres' and a series (|k (R - R_c)| <= k reach, FarMoments).
template <bool kShort, int Count>
void PhasedKernel(const std::array<double, Count>& distance,
                  const std::array<double, Count>& weight, double k, double rc,
                  std::array<double, Count>* gr, std::array<double, Count>* gi) {
  const Complex e0 = std::polar(1.0, -k * rc);
  for (int q = 0; q < Count; ++q) {
    double c, s;
    SeriesPhase<kShort>(k * (distance[q] - rc), &c, &s);
    const double scale = weight[q] / distance[q];
    (*gr)[q] = scale * (e0.real() * c - e0.imag() * s);
    (*gi)[q] = scale * (e0.real() * s + e0.imag() * c);
  }
}

// ProductRule<N> with the full kernel, from precomputed points.
template <int N>
PairMoments FarProduct(const std::array<Vec3, N>& pa, const std::array<Vec3, N>& pb, double radius2,
                       double k, double centre_distance, double reach) {
  const auto& r = Gauss<N>();
  std::array<double, N * N> distance;
  for (int i = 0; i < N; ++i) {
    for (int j = 0; j < N; ++j) {
      distance[i * N + j] = std::sqrt((pa[i] - pb[j]).squaredNorm() + radius2);
    }
  }
  // g = w_j exp(-jkR) / R, as real and imaginary parts.
  std::array<double, N * N> gr, gi, weight;
  for (int q = 0; q < N * N; ++q) weight[q] = r.w[q % N];
  const double rc = std::sqrt(centre_distance * centre_distance + radius2);
  if (k * reach <= kShortSeriesPhaseLimit) {
    PhasedKernel<true, N * N>(distance, weight, k, rc, &gr, &gi);
  } else if (k * reach <= kSeriesPhaseLimit) {
    PhasedKernel<false, N * N>(distance, weight, k, rc, &gr, &gi);
  } else {
    for (int q = 0; q < N * N; ++q) {
      const Complex g = weight[q] * FullKernel{k}(distance[q]);
      gr[q] = g.real();
      gi[q] = g.imag();
    }
  }
  PairMoments m;
  for (int i = 0; i < N; ++i) {
    double s0r = 0.0, s0i = 0.0, s1r = 0.0, s1i = 0.0;
    for (int j = 0; j < N; ++j) {
      s0r += gr[i * N + j];
      s0i += gi[i * N + j];
      s1r += gr[i * N + j] * r.x[j];
      s1i += gi[i * N + j] * r.x[j];
    }
    const Complex s0(s0r, s0i), s1(s1r, s1i);
    m.m00 += r.w[i] * s0;
    m.m10 += r.w[i] * r.x[i] * s0;
    m.m01 += r.w[i] * s1;
    m.m11 += r.w[i] * r.x[i] * s1;
  }
  return m;
}

}  // namespace

PairMoments FarMoments(const SegmentNodes& a, const SegmentNodes& b, double radius2_m2,
                       double wavenumber_per_m) {
  const double longest = std::max(a.length_m, b.length_m);
  const double centres = (a.centre - b.centre).norm();
  // Every point of a lies within half its length of its centre, and so for b: the segments'
  // distance lies in [centres - reach, centres], and |R - R_c| <= reach for every pair of points.
  const double reach = 0.5 * (a.length_m + b.length_m);
  // The bounds decide only with a margin, so that rounding never picks another rule than the
  // exact distance would.
  constexpr double kMargin = 1.0 + 1e-9;
  const double lower = centres - reach;
  int points = 0;
  if (lower > kFarFactor * longest * kMargin) {
    points = 3;
  } else if (centres * kMargin < kMidFactor * longest) {
    points = 6;
  } else {
    const double gap = geometry::SegmentDistance(a.start, a.end, b.start, b.end, nullptr);
    points = gap < kMidFactor * longest ? 6 : gap < kFarFactor * longest ? 4 : 3;
  }
  if (points == 3 && lower > kFarthestFactor * longest &&
      wavenumber_per_m * longest <= kFarthestPhase) {
    return FarProduct<2>(a.p2, b.p2, radius2_m2, wavenumber_per_m, centres, reach);
  }
  if (points == 3) {
    return FarProduct<3>(a.p3, b.p3, radius2_m2, wavenumber_per_m, centres, reach);
  }
  if (points == 4) {
    return FarProduct<4>(a.p4, b.p4, radius2_m2, wavenumber_per_m, centres, reach);
  }
  return FarProduct<6>(a.p6, b.p6, radius2_m2, wavenumber_per_m, centres, reach);
}

PairMoments SegmentPairMomentsReference(const Vec3& a0, const Vec3& a1, const Vec3& b0,
                                        const Vec3& b1, double radius2_m2, double wavenumber_per_m,
                                        int subdivisions) {
  // Composite 20-point Gauss-Legendre on `subdivisions` equal parts of each segment.
  const auto& g = Gauss<20>();
  const Vec3 da = a1 - a0, db = b1 - b0;
  PairMoments m;
  const double h = 1.0 / subdivisions;
  for (int ia = 0; ia < subdivisions; ++ia) {
    for (int i = 0; i < 20; ++i) {
      const double t = (ia + g.x[i]) * h;
      const Vec3 p = a0 + da * t;
      Complex s0 = 0.0, s1 = 0.0;
      for (int ib = 0; ib < subdivisions; ++ib) {
        for (int j = 0; j < 20; ++j) {
          const double tp = (ib + g.x[j]) * h;
          const double R = std::sqrt((p - b0 - db * tp).squaredNorm() + radius2_m2);
          const Complex gv = std::polar(g.w[j] * h / R, -wavenumber_per_m * R);
          s0 += gv;
          s1 += gv * tp;
        }
      }
      const double w = g.w[i] * h;
      m.m00 += w * s0;
      m.m10 += w * t * s0;
      m.m01 += w * s1;
      m.m11 += w * t * s1;
    }
  }
  return m;
}

}  // namespace wirefield::fill
