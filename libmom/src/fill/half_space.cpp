// Fill stage: the half-space correction integrated over a pair of segments (half_space.hpp).
// The correction varies on the scale of R', the distance from the observer to the source's
// image, which is at least the sum of their heights; the quadrature follows that scale: two
// Gauss points per segment when the segment and the other's image are two segment lengths
// apart or more, four when closer, and below half a segment length a composite rule graded
// toward the ground (for wires that come down to it), four points per piece.
#include "fill/half_space.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <utility>
#include <vector>

#include "core/constants.hpp"
#include "fill/unit_gauss.hpp"
#include "wirefield/core.hpp"

namespace wirefield::fill {
namespace {

// The quadrature follows the image moments' (fill/kernel.cpp: six points per segment within
// four segment lengths, four within ten, three beyond), so that where the half-space tends to
// no ground or to a perfect ground the correction cancels or vanishes with the image to
// rounding; far pairs with short segments take two points, exact for cubics: beyond ten segment
// lengths the correction varies by under 10% across a segment and the two-point rule's error is
// under 1e-6 of the pair's term. Closer than kGradedFactor segment lengths (wires that come
// down to the ground): a composite rule graded toward the ground.
constexpr double kGradedFactor = 0.5;
constexpr double kSixPointFactor = 4.0;
constexpr double kFourPointFactor = 10.0;
// Two points only when the phase across the longer segment (k L, with the ground's k1 where its
// wave reaches the pair) is below this: the rule's error on exp(-j k x) is (k L)^4 / 4320.
constexpr double kTwoPointPhase = 0.2;
// Two-point pairs over which the table's variable in distance, x = ln R' + R'/R_c, changes by
// at most this much (L (1/R' + 1/R_c) <= 1/16, some 0.36 of a table step: R' of 16 segment
// lengths or more, and fewer than 1/16 of the ground wave's beat per segment where that wave
// is resolved) take the normalized correction from one lookup at the centres and its slopes:
// the neglected second-order terms are of order (x span)^2 relative (docs/numerics.md;
// tests/unit/fill/half_space_test.cpp bounds them).
constexpr double kExpansionSpan = 1.0 / 16.0;
// Nor over grounds of |eps_c| above this (sea water, wet ground at low frequencies): there the
// corrections vary within a table step (the expansion was measured to depart from the full
// rule by 2.5e-3 of the image term over sea water at 14.2 MHz), and every pair takes the full
// rule.
constexpr double kExpansionMaxPermittivity = 100.0;
// Width of a graded piece relative to the local scale (its height plus the other segment's).
constexpr double kGradedWidth = 0.75;
// The table's floor on heights, in wavelengths: below it the normalized correction is that of
// the floor (it tends to the static images there; docs/numerics.md).
constexpr double kFloorWavelengths = 2e-4;

struct Node {
  double t, w;
  Vec3 p;
};

template <int N>
void AddPieces(const Vec3& s0, const Vec3& s1, double lo, double hi, std::vector<Node>* nodes) {
  const auto& g = Gauss<N>();
  for (int i = 0; i < N; ++i) {
    const double t = lo + (hi - lo) * g.x[i];
    nodes->push_back({t, (hi - lo) * g.w[i], s0 + (s1 - s0) * t});
  }
}

// The quadrature nodes on segment s0-s1 (into *nodes, emptied first): `points` Gauss points,
// or (points == 0) the composite rule graded toward the ground, the other segment's lowest
// point being at other_low_m.
void CorrectionNodes(const Vec3& s0, const Vec3& s1, int points, double other_low_m, double floor_m,
                     std::vector<Node>* nodes) {
  nodes->clear();
  // The fixed rules, by their number of points.
  using AddRule = void (*)(const Vec3&, const Vec3&, double, double, std::vector<Node>*);
  static constexpr std::array<std::pair<int, AddRule>, 4> kRules = {
      {{2, &AddPieces<2>}, {3, &AddPieces<3>}, {4, &AddPieces<4>}, {6, &AddPieces<6>}}};
  for (const auto& [rule_points, add] : kRules) {
    if (rule_points == points) {
      add(s0, s1, 0.0, 1.0, nodes);
      return;
    }
  }
  // Graded from the lower end: each piece as wide as kGradedWidth times the local scale.
  const double length = (s1 - s0).norm();
  const bool start_low = s0.z() <= s1.z();
  const double z_low = std::min(s0.z(), s1.z()), rise = std::abs(s1.z() - s0.z());
  thread_local std::vector<double> breaks;  // distance from the lower end, in lengths
  breaks.assign(1, 0.0);
  constexpr int kMaxPieces = 64;
  while (breaks.back() < 1.0 && static_cast<int>(breaks.size()) <= kMaxPieces) {
    const double s = breaks.back();
    const double scale_m = std::max(std::max(z_low, 0.0) + rise * s + other_low_m, floor_m);
    breaks.push_back(std::min(1.0, s + kGradedWidth * scale_m / length));
  }
  breaks.back() = 1.0;
  for (size_t b = 0; b + 1 < breaks.size(); ++b) {
    const double lo = start_low ? breaks[b] : 1.0 - breaks[b + 1];
    const double hi = start_low ? breaks[b + 1] : 1.0 - breaks[b];
    AddPieces<4>(s0, s1, lo, hi, nodes);
  }
}

}  // namespace

HalfSpaceFill::HalfSpaceFill(const geometry::Mesh& mesh, Complex eps_c, double wavenumber_per_m,
                             double exact_below_m, bool tabulate)
    : wavenumber_(wavenumber_per_m), exact_below_m_(exact_below_m) {
  expandable_ground_ = std::abs(eps_c) <= kExpansionMaxPermittivity;
  const Complex k1 = wavenumber_per_m * std::sqrt(eps_c);
  ground_wavenumber_ = std::abs(k1);
  ground_wave_decay_ = std::abs(std::sqrt(k1 * k1 - wavenumber_per_m * wavenumber_per_m));
  const double wavelength = 2.0 * core::kPi / wavenumber_per_m;
  floor_m_ = kFloorWavelengths * wavelength;
  // The range of the table: every pair of points of the mesh, R' = |p - mirror(q)|.
  Eigen::Vector3d lo = Eigen::Vector3d::Constant(INFINITY), hi = -lo;
  for (const geometry::Segment& s : mesh.segments) {
    lo = lo.cwiseMin(s.start).cwiseMin(s.end);
    hi = hi.cwiseMax(s.start).cwiseMax(s.end);
  }
  const double z_low = std::max(lo.z(), 0.0);
  const double zeta_min = std::max(2.0 * z_low, floor_m_);
  const double horizontal = std::hypot(hi.x() - lo.x(), hi.y() - lo.y());
  const double r_max =
      std::max(1.02 * std::hypot(horizontal, 2.0 * std::max(hi.z(), 0.0)), 2.0 * zeta_min);
  // Height sums above twice the highest point are never looked up: the table skips them.
  ground::TableOptions table_options;
  table_options.direct = !tabulate;
  table_options.zeta_max_m = std::max(2.0 * std::max(hi.z(), 0.0), zeta_min);
  // Nor horizontal distances beyond the mesh's horizontal extent (with a margin for rounding):
  // a tall vertical needs only the rows near the zenith.
  table_options.rho_max_m = 1.01 * horizontal + floor_m_;
  table_ = std::make_unique<ground::HalfSpaceTable>(ground::HalfSpace(eps_c, wavenumber_per_m),
                                                    zeta_min, r_max, zeta_min, table_options);
  segments_.reserve(mesh.segments.size());
  for (const geometry::Segment& s : mesh.segments) segments_.push_back(Prepare(s.start, s.end));
}

HalfSpaceFill::SegmentData HalfSpaceFill::Prepare(const Vec3& start, const Vec3& end) {
  SegmentData d;
  d.start = start;
  d.end = end;
  d.length = (end - start).norm();
  d.unit = (end - start).normalized();
  d.centre = 0.5 * (start + end);
  d.low = std::max(std::min(start.z(), end.z()), 0.0);
  const auto& g = Gauss<2>();
  for (int i = 0; i < 2; ++i) d.two_points[i] = start + (end - start) * g.x[i];
  return d;
}

HalfSpacePair HalfSpaceFill::Moments(int a, int b) const {
  return Moments(segments_[a], segments_[b]);
}

HalfSpacePair HalfSpaceFill::Moments(const Vec3& a0, const Vec3& a1, const Vec3& b0,
                                     const Vec3& b1) const {
  return Moments(Prepare(a0, a1), Prepare(b0, b1));
}

bool HalfSpaceFill::Applies(const geometry::Segment& a, const geometry::Segment& b) const {
  const double mean_height = 0.25 * (a.start.z() + a.end.z() + b.start.z() + b.end.z());
  return mean_height < exact_below_m_;
}

HalfSpacePair HalfSpaceFill::Moments(const SegmentData& sa, const SegmentData& sb) const {
  const Vec3 mirror(1.0, 1.0, -1.0);
  const Vec3 &a0 = sa.start, &a1 = sa.end, &b0 = sb.start, &b1 = sb.end;
  const double longest = std::max(sa.length, sb.length);
  const double r_centre = (sa.centre - sb.centre.cwiseProduct(mirror)).norm();
  // The distance from segment a to b's image: first a lower bound (no point of a segment lies
  // farther than half its length from its centre), the exact distance only where the bound
  // does not settle a rule below (the rules then decide as with the exact distance).
  double gap = r_centre - 0.5 * (sa.length + sb.length);
  bool gap_exact = false;
  auto exact_gap = [&]() {
    if (gap_exact) return;
    gap = geometry::SegmentDistance(a0, a1, b0.cwiseProduct(mirror), b1.cwiseProduct(mirror),
                                    nullptr);
    gap_exact = true;
  };
  if (gap < kFourPointFactor * longest) exact_gap();
  const double a_low = sa.low, b_low = sb.low;
  int points = 0;
  if (gap >= kFourPointFactor * longest) {
    // The ground's own wave (wavenumber k1) decays away from the surface as
    // exp(-|sqrt(k1^2 - k0^2)| zeta); where it still reaches the pair its phase counts too.
    const double k = ground_wave_decay_ * (a_low + b_low) < 7.0
                         ? std::max(wavenumber_, ground_wavenumber_)
                         : wavenumber_;
    points = k * longest < kTwoPointPhase ? 2 : 3;
  } else if (gap >= kSixPointFactor * longest) {
    points = 4;
  } else if (gap >= kGradedFactor * longest) {
    points = 6;
  }
  // The node lists are reused from pair to pair (one pair at a time per thread); the two-point
  // rule's nodes come prepared with the segments.
  thread_local std::vector<Node> obs, src;
  if (points == 2) {
    const auto& g = Gauss<2>();
    obs.assign({{g.x[0], g.w[0], sa.two_points[0]}, {g.x[1], g.w[1], sa.two_points[1]}});
    src.assign({{g.x[0], g.w[0], sb.two_points[0]}, {g.x[1], g.w[1], sb.two_points[1]}});
  } else {
    CorrectionNodes(a0, a1, points, b_low, floor_m_, &obs);
    CorrectionNodes(b0, b1, points, a_low, floor_m_, &src);
  }
  const Vec3 &ua = sa.unit, &ub = sb.unit;
  const double horizontal = ua.x() * ub.x() + ua.y() * ub.y();
  const double vertical = ua.z() * ub.z();
  // Only the kernels whose direction factors can be nonzero are looked up: two horizontal
  // segments need neither the vertical nor the coupling kernel, two vertical ones neither the
  // horizontal nor the coupling kernel (u_src . rho_hat = u_obs . rho_hat = 0).
  using Table = ground::HalfSpaceTable;
  const bool a_level = ua.x() != 0.0 || ua.y() != 0.0, b_level = ub.x() != 0.0 || ub.y() != 0.0;
  const bool coupled = (ua.z() != 0.0 && b_level) || (ub.z() != 0.0 && a_level);
  const unsigned parts = Table::kCharge | (horizontal != 0.0 ? Table::kHorizontal : 0u) |
                         (vertical != 0.0 ? Table::kVertical : 0u) |
                         (coupled ? Table::kCoupling : 0u);
  // The image factor exp(-jkR')/R' from one sine and cosine at the centres and the series of
  // fill/kernel.hpp in k (R' - R'_c) at each pair of points (one sine and cosine per pair of
  // points where the phase difference exceeds the series' range).
  const Vec3 &centre_a = sa.centre, &centre_b = sb.centre;
  const Complex phase_centre = std::polar(1.0, -wavenumber_ * r_centre);
  // Far pairs: the normalized correction from one lookup at the centres and its slopes (the
  // first-order Taylor expansion in rho and zeta), in place of one lookup per pair of points.
  std::array<Complex, 4> n_centre{}, n_rho{}, n_zeta{};
  double rho_centre = 0.0, zeta_centre = 0.0;
  bool taylor = false;
  auto spans_little = [&]() {
    return longest * (1.0 / gap + 1.0 / table_->distance_scale_m()) <= kExpansionSpan;
  };
  if (far_expansion_ && expandable_ground_ && points == 2 && !spans_little() && !gap_exact) {
    exact_gap();
  }
  if (far_expansion_ && expandable_ground_ && points == 2 && spans_little()) {
    rho_centre = (centre_a - centre_b).head<2>().norm();
    zeta_centre = centre_a.z() + centre_b.z();
    taylor = table_->NormalizedSlopes(rho_centre, zeta_centre, parts, &n_centre, &n_rho, &n_zeta);
  }
  auto normalized = [&](double rho, double zeta) {
    if (!taylor) return table_->NormalizedClamped(rho, zeta, parts);
    const double d_rho = rho - rho_centre, d_zeta = zeta - zeta_centre;
    std::array<Complex, 4> n;
    for (int c = 0; c < 4; ++c) n[c] = n_centre[c] + d_rho * n_rho[c] + d_zeta * n_zeta[c];
    return n;
  };
  HalfSpacePair out;
  for (const Node& o : obs) {
    Complex s0 = 0.0, s1 = 0.0, q0 = 0.0;
    for (const Node& s : src) {
      const double dx = o.p.x() - s.p.x(), dy = o.p.y() - s.p.y();
      const double rho = std::sqrt(dx * dx + dy * dy), zeta = o.p.z() + s.p.z();
      const double r = std::max(std::sqrt(rho * rho + zeta * zeta), 1e-12 * floor_m_);
      const std::array<Complex, 4> n = normalized(rho, zeta);
      const double x = wavenumber_ * (r - r_centre);
      double c = 0.0, sn = 0.0;
      if (std::abs(x) <= kShortSeriesPhaseLimit) {
        SeriesPhase<true>(x, &c, &sn);
      } else if (std::abs(x) <= kSeriesPhaseLimit) {
        SeriesPhase<false>(x, &c, &sn);
      } else {
        c = std::cos(x);
        sn = -std::sin(x);
      }
      const double scale = s.w / r;
      const Complex image(scale * (phase_centre.real() * c - phase_centre.imag() * sn),
                          scale * (phase_centre.real() * sn + phase_centre.imag() * c));
      // The coupling's direction factor u_obs,z (u_src . rho_hat) - u_src,z (u_obs . rho_hat),
      // rho_hat the horizontal unit vector from the source point toward the observer.
      double coupling = 0.0;
      if (coupled && rho > 0.0) {
        const double inv_rho = 1.0 / rho;
        coupling =
            (ua.z() * (ub.x() * dx + ub.y() * dy) - ub.z() * (ua.x() * dx + ua.y() * dy)) * inv_rho;
      }
      const Complex kernel = n[0] * horizontal + n[1] * vertical + n[3] * coupling;
      const Complex vector(kernel.real() * image.real() - kernel.imag() * image.imag(),
                           kernel.real() * image.imag() + kernel.imag() * image.real());
      s0 += vector;
      s1 += vector * s.t;
      q0 += Complex(n[2].real() * image.real() - n[2].imag() * image.imag(),
                    n[2].real() * image.imag() + n[2].imag() * image.real());
    }
    out.vector.m00 += o.w * s0;
    out.vector.m10 += o.w * o.t * s0;
    out.vector.m01 += o.w * s1;
    out.vector.m11 += o.w * o.t * s1;
    out.charge += o.w * q0;
  }
  return out;
}

}  // namespace wirefield::fill
