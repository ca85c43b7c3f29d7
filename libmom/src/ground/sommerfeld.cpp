// Ground stage: numerical evaluation of the half-space Sommerfeld integrals (sommerfeld.hpp).
// The path runs along the real k_rho axis in three parts: [0, k0] with k_rho = k0 cos(theta)
// and [k0, 2 k0] with k_rho = k0 cosh(u), which take the square-root branch point k0 out of
// the integrand (and the 1/k_z0 of P with it); then panels in k_rho graded toward the branch
// point Re k1 of the ground, which lies near the axis over low-loss ground; then the
// oscillating tail, split at the asymptotic half-periods pi/rho of the Bessel functions and
// summed by Levin's t-transformation (the partition-extrapolation of Michalski, "Extrapolation
// methods for Sommerfeld integral tails", IEEE Trans. AP-46(10), 1998, whose review ranks
// Levin-type transformations with the weighted averages among the most effective). Over a
// half-space with both points in the air there is no pole on the proper sheet (the Zenneck
// root of eps k_z0 + k_z1 = 0 lies on the improper one), so the real axis is a valid path for
// e^{j omega t} (the singularities lie just below it). Bessel functions from Boost.Math.
#include "ground/sommerfeld.hpp"

#include <algorithm>
#include <array>
#include <boost/math/quadrature/gauss.hpp>
#include <boost/math/special_functions/bessel.hpp>
#include <boost/math/special_functions/detail/bessel_j0.hpp>
#include <boost/math/special_functions/detail/bessel_j1.hpp>
#include <cmath>
#include <cstddef>
#include <limits>
#include <thread>
#include <vector>

#include "core/constants.hpp"

namespace wirefield::ground {
namespace {

// J0 and J1 by Boost.Math's rational approximations for orders 0 and 1 (the routines its
// cyl_bessel_j uses inside; called directly, since the general entry point takes a path some
// ten times slower for arguments above ~50, which the tails reach all the time).
double J0(double x) { return boost::math::detail::bessel_j0(x); }
double J1(double x) { return boost::math::detail::bessel_j1(x); }

// Gauss-Legendre rule on [0, 1] of 12 points (Boost's tabulated nodes).
struct Rule12 {
  std::array<double, 12> x{}, w{};
  Rule12() {
    using G = boost::math::quadrature::gauss<double, 12>;
    const auto& abs = G::abscissa();
    const auto& wts = G::weights();
    int k = 0;
    for (int i = static_cast<int>(abs.size()) - 1; i >= 0; --i) {
      x[k] = 0.5 * (1.0 - abs[i]);
      w[k++] = 0.5 * wts[i];
    }
    for (size_t i = 0; i < abs.size(); ++i) {
      x[k] = 0.5 * (1.0 + abs[i]);
      w[k++] = 0.5 * wts[i];
    }
  }
};

const Rule12& Rule() {
  static const Rule12 rule;
  return rule;
}

// sqrt(k^2 - k_rho^2) on the proper sheet, Im <= 0 (decaying away from the ground), by the
// half-angle formulas (the library's complex square root guards against overflow of |z|^2,
// which wavenumbers cannot reach, at the cost of a hypot: an eighth of the table's time).
Complex Kz(Complex k2, double k_rho) {
  const double a = k2.real() - k_rho * k_rho, b = k2.imag();
  const double t = std::sqrt(0.5 * (std::sqrt(a * a + b * b) + std::abs(a)));
  if (t == 0.0) return 0.0;
  // The root with Re >= 0, then the sign that makes Im <= 0.
  const Complex s =
      a >= 0.0 ? Complex(t, 0.5 * b / t) : Complex(0.5 * std::abs(b) / t, std::copysign(t, b));
  return s.imag() > 0.0 ? -s : s;
}

// a b by the textbook formula. The operator's C99 Annex G checks for infinite parts (which
// cannot occur here: every factor is finite) cost the kernel a branch and a call per product.
inline Complex Mul(Complex a, Complex b) {
  return {a.real() * b.real() - a.imag() * b.imag(), a.real() * b.imag() + a.imag() * b.real()};
}

// One point of the path: k_rho (real), k_z0, the Jacobians dk = dk_rho / dvar and
// dm = P dk = k_rho / (j k_z0) dk_rho / dvar, the latter finite at the branch point k0, and
// E = exp(-j k_z0 zeta) (a real exponential beyond k0, where k_z0 is imaginary: the path
// computes it without the complex exponential).
struct PathPoint {
  double k_rho;
  Complex kz0;
  double dk;
  Complex dm;
  Complex e;
};

template <int N>
using Values = std::array<Complex, N>;

// The four kernels of HalfSpaceCorrection at a path point, in two steps: the ground's factors
// (functions of k_rho alone, which a table build shares between its nodes where their paths
// meet) and their combination with the Bessel functions and E (which depend on rho and zeta).
struct CorrectionKernel {
  Complex eps, k1_2, one_minus_eps;
  double rho;
  // P (R_TE + 1), P (R_TM - R_q - 1), P (R_TE + R_q + 1), each times dk_rho/dvar, and
  // k_rho^2 (R_TE + R_TM) dk_rho/dvar.
  Values<4> Factors(const PathPoint& p) const {
    const Complex kz0 = p.kz0;
    const Complex kz1 = Kz(k1_2, p.k_rho);
    const Complex te = kz0 + kz1, tm = Mul(eps, kz0) + kz1;
    // One reciprocal, 2 / (te tm), for the four quotients below (by its real formula: the
    // complex division's checks for infinite parts cost the table a sixth of its time).
    const Complex d = Mul(te, tm);
    const Complex inv = std::conj(d) * (2.0 / std::norm(d));
    // R_TE + R_TM = 2 k_rho^2 (1 - eps) / (te tm), written without the cancellation.
    const Complex sum_rc = Mul(one_minus_eps, inv);
    const Complex rq = Mul(Mul(kz0, kz0), sum_rc);
    const Complex horizontal = Mul(Mul(kz0, tm), inv);  // R_TE + 1 = 2 kz0 / te
    const Complex vertical = -Mul(Mul(kz1, te), inv);   // R_TM - 1 = -2 kz1 / tm
    return {Mul(p.dm, horizontal), Mul(p.dm, vertical - rq), Mul(p.dm, horizontal + rq),
            (p.dk * p.k_rho * p.k_rho) * sum_rc};
  }
  Values<4> Combine(const PathPoint& p, const Values<4>& f) const {
    const double j0 = J0(p.k_rho * rho);
    const double j1 = rho > 0.0 ? J1(p.k_rho * rho) : 0.0;
    const Complex a = j0 * p.e, c = -j1 * p.e;
    return {Mul(a, f[0]), Mul(a, f[1]), Mul(a, f[2]), Mul(c, f[3])};
  }
};

// The Sommerfeld identity's integrand J0 E P.
struct IdentityKernel {
  double rho;
  Values<1> Factors(const PathPoint& p) const { return {p.dm}; }
  Values<1> Combine(const PathPoint& p, const Values<1>& f) const {
    return {J0(p.k_rho * rho) * Mul(p.e, f[0])};
  }
};

// The path points of the two parts next to k0 ([0, k0] and [k0, 2 k0]) depend on the number
// of panels only (and on the ground), so a table build keeps them with the ground's factors
// there (weights included), one list per part and panel count, and every node with that panel
// count reuses them.
template <int N>
struct SharedPoint {
  PathPoint point;  // e not set: it depends on zeta
  Values<N> factors;
};
template <int N>
struct SharedPaths {
  std::array<std::vector<std::vector<SharedPoint<N>>>, 2> parts;
  std::vector<SharedPoint<N>>* Get(int part, int panels) {
    auto& lists = parts[part];
    if (static_cast<int>(lists.size()) <= panels) lists.resize(panels + 1);
    return &lists[panels];
  }
};

template <int N>
void Accumulate(Values<N>* sum, const Values<N>& v, double w) {
  for (int i = 0; i < N; ++i) (*sum)[i] += w * v[i];
}

// Levin's t-transformation of the partial sums s[0..m] (terms a_n = s_n - s_{n-1} as the
// remainder estimates; Levin, Int. J. Comput. Math. B3, 1973; beta = 1).
Complex LevinT(const std::vector<Complex>& s) {
  const int m = static_cast<int>(s.size()) - 1;
  Complex num = 0.0, den = 0.0;
  double binom = 1.0;
  for (int j = 0; j <= m; ++j) {
    const Complex a = j == 0 ? s[0] : s[j] - s[j - 1];
    if (std::abs(a) == 0.0) return s[m];  // the series has ended
    const double ratio = std::pow((1.0 + j) / (1.0 + m), m - 1);
    const double c = ((j % 2) ? -1.0 : 1.0) * binom * ratio;
    num += c * s[j] / a;
    den += c / a;
    binom = binom * (m - j) / (j + 1);
  }
  const Complex value = num / den;
  return std::isfinite(value.real()) && std::isfinite(value.imag()) ? value : s[m];
}

// Integral over k_rho in [0, inf) of kernel(point) along the path above.
// shared: the path points next to k0 kept from node to node of a table build (or null).
template <int N, typename Kernel>
Values<N> Integrate(const Kernel& kernel, double k0, Complex eps_c, double rho, double zeta,
                    const SommerfeldOptions& options, SharedPaths<N>* shared = nullptr) {
  const Rule12& g = Rule();
  Values<N> total{};
  const double span = rho + zeta;
  // One point with weight w: into *sum, or (points not null) into the shared list.
  auto add = [&](const PathPoint& p, double w, Values<N>* sum,
                 std::vector<SharedPoint<N>>* points = nullptr) {
    Values<N> f = kernel.Factors(p);
    if (!points) {
      Accumulate<N>(sum, kernel.Combine(p, f), w);
      return;
    }
    for (Complex& v : f) v *= w;
    points->push_back({p, f});
  };
  // The shared points of a part, with E for this zeta from e_of(point).
  auto add_shared = [&](std::vector<SharedPoint<N>>* points, auto e_of) {
    for (SharedPoint<N>& s : *points) {
      s.point.e = e_of(s.point);
      Accumulate<N>(&total, kernel.Combine(s.point, s.factors), 1.0);
    }
  };

  // [0, k0]: k_rho = k0 cos(theta), theta in [0, pi/2].
  {
    const int panels = 1 + static_cast<int>(k0 * span / 3.0);
    std::vector<SharedPoint<N>>* points = shared ? shared->Get(0, panels) : nullptr;
    if (!points || points->empty()) {
      const double h = 0.5 * core::kPi / panels;
      for (int p = 0; p < panels; ++p) {
        for (int i = 0; i < 12; ++i) {
          const double theta = h * (p + g.x[i]);
          const double kr = k0 * std::cos(theta);
          const double kz = k0 * std::sin(theta);
          add(PathPoint{kr, kz, kz, Complex(0.0, -kr), std::polar(1.0, -kz * zeta)}, h * g.w[i],
              &total, points);
        }
      }
    }
    if (points) {
      add_shared(points, [&](const PathPoint& p) { return std::polar(1.0, -p.kz0.real() * zeta); });
    }
  }
  // Where the integrand has decayed to e^-36 of its start (exp(-|k_z0| zeta)): the end of the
  // part next to k0.
  const double k_cut = std::sqrt(k0 * k0 + std::pow(36.0 / zeta, 2));
  // [k0, min(2 k0, k_cut)]: k_rho = k0 cosh(u).
  const double k_b = std::min(2.0 * k0, k_cut);
  // Beyond 2 k0 the kernels' factors are of order one, and the rest of the integral is about
  // exp(-|k_z0| zeta) / zeta, in units of the image's 1/R' that is exp(-|k_z0| zeta) R'/zeta:
  // the path ends where that falls to e^-22 (3e-10, some 1e-5 of the table's interpolation error).
  const double k_end = std::max(
      k_b,
      std::sqrt(k0 * k0 + std::pow((22.0 + std::log(std::hypot(rho, zeta) / zeta)) / zeta, 2)));
  const Complex k1 = k0 * std::sqrt(eps_c);
  const double k1_re = k1.real();
  // Finest panel next to the ground's branch point: its distance from the axis.
  const double finest = std::max(std::abs(k1.imag()), 1e-9 * k0);
  {
    const double u_end = std::acosh(k_b / k0);
    const int panels = 1 + static_cast<int>(k0 * span / 3.0);
    std::vector<double> breaks;
    for (int p = 0; p <= panels; ++p) breaks.push_back(u_end * p / panels);
    if (k1_re > k0 && k1_re < k_b) {
      const double u1 = std::acosh(k1_re / k0);
      const double du = finest / std::sqrt(k1_re * k1_re - k0 * k0);  // dk = k0 sinh(u) du
      for (double d = 0.5 * std::min(u1, u_end - u1); d > du; d *= 0.25) {
        breaks.push_back(u1 - d);
        breaks.push_back(u1 + d);
      }
      breaks.push_back(u1);
      std::sort(breaks.begin(), breaks.end());
    }
    // Shared between the nodes where the part ends at 2 k0 (its breaks then depend on the
    // panel count alone).
    std::vector<SharedPoint<N>>* points =
        shared && k_b == 2.0 * k0 ? shared->Get(1, panels) : nullptr;
    if (!points || points->empty()) {
      for (size_t b = 0; b + 1 < breaks.size(); ++b) {
        const double h = breaks[b + 1] - breaks[b];
        for (int i = 0; i < 12; ++i) {
          const double u = breaks[b] + h * g.x[i];
          const double kr = k0 * std::cosh(u);
          const double sh = k0 * std::sinh(u);
          add(PathPoint{kr, Complex(0.0, -sh), sh, Complex(kr, 0.0), std::exp(-sh * zeta)},
              h * g.w[i], &total, points);
        }
      }
    }
    if (points) {
      // k_z0 = -j k0 sinh(u): E = exp(-k0 sinh(u) zeta).
      add_shared(points,
                 [&](const PathPoint& p) { return Complex(std::exp(p.kz0.imag() * zeta)); });
    }
  }
  if (k_b >= k_end) return total;

  auto panel = [&](double a, double b, Values<N>* sum) {
    const double w = b - a;
    for (int i = 0; i < 12; ++i) {
      const double kr = a + w * g.x[i];
      const double s = std::sqrt(kr * kr - k0 * k0);
      add(PathPoint{kr, Complex(0.0, -s), 1.0, Complex(kr / s, 0.0), std::exp(-s * zeta)},
          w * g.w[i], sum);
    }
  };
  const double half_period = rho > 0.0 ? core::kPi / rho : INFINITY;
  // [a, b] in panels no wider than half a Bessel period, 3 / zeta (the decay length) or half
  // their distance from the origin (the factor k_rho / |k_z0| and the ground's factors vary
  // on that scale), so the panel count grows with the logarithm of the range.
  auto range = [&](double a, double b, Values<N>* sum) {
    while (a < b) {
      const double next = std::min(b, a + std::min({4.0 * half_period, 10.0 / zeta, 1.0 * a}));
      panel(a, next, sum);
      a = next;
    }
  };
  // Breakpoints of the middle part: up to past the ground's branch point (when it is near
  // the axis), graded geometrically toward it from both sides.
  const double k_tail = std::min(std::max(k_b, 1.5 * k1_re), k_end);
  std::vector<double> breaks{k_b};
  if (k1_re > k_b && k1_re < k_tail) {
    // Geometric grading toward k1 on both sides, down to the scale of its distance from the
    // axis (or 1e-9 k0).
    for (double d = 0.5 * (k1_re - k_b); d > finest; d *= 0.25) breaks.push_back(k1_re - d);
    breaks.push_back(k1_re);
    std::vector<double> right;
    for (double d = 0.5 * (k_tail - k1_re); d > finest; d *= 0.25) right.push_back(k1_re + d);
    breaks.insert(breaks.end(), right.rbegin(), right.rend());
  }
  breaks.push_back(k_tail);
  for (size_t b = 0; b + 1 < breaks.size(); ++b) range(breaks[b], breaks[b + 1], &total);
  if (k_tail >= k_end) return total;

  // Tail [k_tail, inf): direct while it is short, else partition-extrapolation.
  const double tail_half_periods = (k_end - k_tail) / half_period;
  if (!(tail_half_periods > 4.0 * options.tail_partitions)) {
    range(k_tail, k_end, &total);
    return total;
  }
  const int parts = std::max(2, options.tail_partitions);
  std::vector<Values<N>> partial(parts);
  for (int p = 0; p < parts; ++p) {
    Values<N> sum{};
    range(k_tail + p * half_period, k_tail + (p + 1) * half_period, &sum);
    partial[p] = sum;
  }
  for (int c = 0; c < N; ++c) {
    std::vector<Complex> s(parts);
    Complex run = 0.0;
    for (int p = 0; p < parts; ++p) {
      run += partial[p][c];
      s[p] = run;
    }
    total[c] += LevinT(s);
  }
  return total;
}

}  // namespace

HalfSpace::HalfSpace(Complex eps_c, double wavenumber_per_m, SommerfeldOptions options)
    : eps_c_(eps_c), k0_(wavenumber_per_m), options_(options) {}

class HalfSpace::PathCache {
 public:
  SharedPaths<4> paths;
};

HalfSpaceCorrection HalfSpace::Correction(double rho_m, double zeta_m) const {
  return Correction(rho_m, zeta_m, nullptr);
}

HalfSpaceCorrection HalfSpace::Correction(double rho_m, double zeta_m, PathCache* paths) const {
  const CorrectionKernel kernel{eps_c_, eps_c_ * k0_ * k0_, 1.0 - eps_c_, rho_m};
  const Values<4> v =
      Integrate<4>(kernel, k0_, eps_c_, rho_m, zeta_m, options_, paths ? &paths->paths : nullptr);
  return {v[0], v[1], v[2], v[3]};
}

namespace {

// The corrections divided by the image's exp(-jkR')/R', in the table's order: horizontal,
// charge, coupling, vertical (so that a pair of segments needing fewer parts reads a prefix).
std::array<Complex, 4> Normalized(const HalfSpaceCorrection& c, double r, double k0) {
  const Complex f = std::polar(r, k0 * r);  // R' exp(+jkR'): divides out the image
  return {c.horizontal * f, c.charge * f, c.coupling * f, c.vertical * f};
}

// A mask of public parts (HalfSpaceTable::kHorizontal, ...) in values_' order (horizontal,
// charge, coupling, vertical).
unsigned TableMask(unsigned parts) {
  return ((parts & HalfSpaceTable::kHorizontal) ? 1u : 0u) |
         ((parts & HalfSpaceTable::kCharge) ? 2u : 0u) |
         ((parts & HalfSpaceTable::kCoupling) ? 4u : 0u) |
         ((parts & HalfSpaceTable::kVertical) ? 8u : 0u);
}

// Weights of the 4-point Lagrange interpolation on equally spaced nodes -1, 0, 1, 2 at u.
std::array<double, 4> Lagrange(double u) {
  constexpr double kSixth = 1.0 / 6.0;
  const double up = u + 1.0, um = u - 1.0, um2 = u - 2.0;
  const double u_um = u * um, up_um2 = up * um2;
  return {-kSixth * u_um * um2, 0.5 * up_um2 * um, -0.5 * up_um2 * u, kSixth * up * u_um};
}

// The same at x from any four nodes n[0..3], scale[a] = 1 / prod_{b != a} (n[a] - n[b]).
std::array<double, 4> Lagrange(const double* n, const std::array<double, 4>& scale, double x) {
  const double d0 = x - n[0], d1 = x - n[1], d2 = x - n[2], d3 = x - n[3];
  return {scale[0] * d1 * d2 * d3, scale[1] * d0 * d2 * d3, scale[2] * d0 * d1 * d3,
          scale[3] * d0 * d1 * d2};
}

// Their derivatives in u.
std::array<double, 4> LagrangeSlope(double u) {
  constexpr double kSixth = 1.0 / 6.0;
  const double u2 = 3.0 * u * u;
  return {-kSixth * (u2 - 6.0 * u + 2.0), 0.5 * (u2 - 4.0 * u - 1.0), -0.5 * (u2 - 2.0 * u - 2.0),
          kSixth * (u2 - 1.0)};
}

// The derivatives in x of Lagrange(n, scale, x).
std::array<double, 4> LagrangeSlope(const double* n, const std::array<double, 4>& scale, double x) {
  const double d0 = x - n[0], d1 = x - n[1], d2 = x - n[2], d3 = x - n[3];
  return {scale[0] * (d2 * d3 + d1 * d3 + d1 * d2), scale[1] * (d2 * d3 + d0 * d3 + d0 * d2),
          scale[2] * (d1 * d3 + d0 * d3 + d0 * d1), scale[3] * (d1 * d2 + d0 * d2 + d0 * d1)};
}

}  // namespace

HalfSpaceTable::HalfSpaceTable(const HalfSpace& ground, double r_min_m, double r_max_m,
                               double zeta_min_m, TableOptions options)
    : ground_(ground),
      r_min_(r_min_m),
      r_max_(r_max_m),
      zeta_min_(zeta_min_m),
      zeta_max_(std::max(options.zeta_max_m, zeta_min_m)),
      direct_(options.direct) {
  if (direct_) return;  // no nodes: every lookup integrates
  // x = ln R' + R'/R_c, uniform: log-spaced near the source, evenly spaced far from it, where
  // the lateral wave of the ground's branch point k1 beats with the image as
  // exp(-j (k1 - k0) R') (R_c: some 8 nodes per beat, and not below a quarter wavelength, as
  // over a good conductor that wave is negligible). One node beyond each end so that the
  // cubic stencil always fits.
  const double k0 = ground_.wavenumber();
  r_c_ =
      std::max(7.0 / std::abs(k0 * std::sqrt(ground_.permittivity()) - k0), 0.5 * core::kPi / k0);
  const int per_octave = std::max(2, options.nodes_per_octave);
  const double x_lo = Map(r_min_m), x_hi = Map(r_max_m);
  const int n_r = static_cast<int>(std::ceil((x_hi - x_lo) / (std::log(2.0) / per_octave))) + 3;
  const double dx = (x_hi - x_lo) / (n_r - 3);
  for (int i = 0; i < n_r; ++i) x_.push_back(x_lo + (i - 1) * dx);
  // Node radii: invert the map by Newton's method (it is increasing and convex in ln R').
  std::vector<double> radius(x_.size());
  for (size_t i = 0; i < x_.size(); ++i) {
    double ln_r = std::min(x_[i], std::log(r_max_m * 2.0));
    for (int it = 0; it < 60; ++it) {
      const double r = std::exp(ln_r);
      const double step = (ln_r + r / r_c_ - x_[i]) / (1.0 + r / r_c_);
      ln_r -= step;
      if (std::abs(step) < 1e-14) break;
    }
    radius[i] = std::exp(ln_r);
  }
  // y = sqrt(tan(psi / 2)) = sqrt(zeta / (R' + rho)), which costs the lookup a division where
  // psi would cost an arc tangent, and is sqrt(psi / 2) to within 0.2% up to psi = 0.2:
  // finer toward grazing, where the functions vary fastest; from psi_min (the lowest
  // elevation the table serves) to one node past the zenith (y > 1 stands for the mirror
  // side, rho < 0, so the stencil is centred there too). The node below psi_min sits
  // halfway to zero when a full step would cross it.
  const double y_lo = std::sqrt(std::tan(0.5 * std::asin(std::min(1.0, zeta_min_m / r_max_m))));
  const double y_hi = 1.0;
  // As many steps as angle_nodes - 1 would take over all elevations (y from 0 to 1), at least
  // as fine: a model that spans fewer elevations (a low one, whose R' never much exceeds its
  // height sums) gets fewer nodes at the same spacing.
  const int steps = std::max(
      3,
      static_cast<int>(std::ceil((y_hi - y_lo) * (std::max(4, options.angle_nodes) - 1) - 1e-9)));
  const int n_psi = steps + 3;
  const double dy = (y_hi - y_lo) / steps;
  y_.push_back(std::max(y_lo - dy, 0.5 * y_lo));
  for (int j = 1; j < n_psi; ++j) y_.push_back(y_lo + (j - 1) * dy);
  for (int a = 0; a < 4; ++a) {
    double p = 1.0;
    for (int b = 0; b < 4; ++b) {
      if (b != a) p *= y_[a] - y_[b];
    }
    first_y_scale_[a] = 1.0 / p;
  }
  // The nodes a lookup can reach: a point in cell (i, j) reads nodes i-1..i+2 and j-1..j+2,
  // so node (i, j) serves R' between the radii of nodes i-2 and i+2 and y between nodes j-2
  // and j+2; it is needed where that window meets zeta_min <= R' sin(psi) <= zeta_max and
  // R' cos(psi) <= rho_max. Within the window psi >= asin(zeta_min / r_hi) and psi >=
  // acos(rho_max / r_lo): a lower bound on the elevations it serves.
  const size_t nx = x_.size(), ny = y_.size();
  auto y_of = [](double psi) { return std::sqrt(std::tan(0.5 * psi)); };
  const double rho_max = options.rho_max_m;
  auto needed = [&](size_t i, size_t j) {
    const double r_lo = radius[i < 2 ? 0 : i - 2], r_hi = radius[std::min(i + 2, nx - 1)];
    const double psi_rho = rho_max >= r_lo ? 0.0 : std::acos(rho_max / r_lo);
    const double y_low = y_of(std::max(std::asin(std::min(1.0, zeta_min_m / r_hi)), psi_rho));
    const double y_high = zeta_max_ >= r_lo ? INFINITY : y_of(std::asin(zeta_max_ / r_lo));
    return y_[std::min(j + 2, ny - 1)] >= y_low && y_[j < 2 ? 0 : j - 2] <= y_high;
  };
  const double not_built = std::numeric_limits<double>::quiet_NaN();
  values_.assign(nx * ny, {Complex(not_built, not_built), Complex(not_built, not_built),
                           Complex(not_built, not_built), Complex(not_built, not_built)});
  auto build = [&](size_t first, size_t step) {
    HalfSpace::PathCache paths;
    for (size_t i = first; i < x_.size(); i += step) {
      const double r = radius[i];
      for (size_t j = 0; j < y_.size(); ++j) {
        if (!needed(i, j)) continue;
        const double psi = 2.0 * std::atan(y_[j] * y_[j]);
        const double rho = r * std::cos(psi), zeta = r * std::sin(psi);
        // Past the zenith rho < 0: the functions are even in rho but for the coupling, odd.
        HalfSpaceCorrection c = ground_.Correction(std::abs(rho), zeta, &paths);
        if (rho < 0.0) c.coupling = -c.coupling;
        values_[i * y_.size() + j] = Normalized(c, r, ground_.wavenumber());
      }
    }
  };
  if (std::clamp(options.threads, 1, 2) == 1) {
    build(0, 1);
  } else {
    std::thread other(build, 1, 2);
    build(0, 2);
    other.join();
  }
}

HalfSpaceTable::Cell HalfSpaceTable::Locate(double rho_m, double zeta_m, double r_m) const {
  Cell c;
  c.x = Map(r_m);
  c.y = std::sqrt(zeta_m / (r_m + rho_m));
  const int nx = static_cast<int>(x_.size()), ny = static_cast<int>(y_.size());
  c.dx = x_[2] - x_[1];
  c.dy = y_[2] - y_[1];
  c.i = std::clamp(1 + static_cast<int>((c.x - x_[1]) / c.dx), 1, nx - 3);
  c.j = std::clamp(1 + static_cast<int>((c.y - y_[1]) / c.dy), 1, ny - 3);
  return c;
}

bool HalfSpaceTable::Covers(double rho_m, double zeta_m) const {
  const double r = std::hypot(rho_m, zeta_m);
  return !x_.empty() && r >= r_min_ && r <= r_max_ && zeta_m >= zeta_min_ && zeta_m <= zeta_max_;
}

HalfSpaceCorrection HalfSpaceTable::Correction(double rho_m, double zeta_m) const {
  if (!Covers(rho_m, zeta_m)) return ground_.Correction(rho_m, zeta_m);
  const double r = std::hypot(rho_m, zeta_m);
  const std::array<Complex, 4> v = Interpolate<15>(rho_m, zeta_m, r);
  const Complex image = std::polar(1.0 / r, -ground_.wavenumber() * r);
  return {v[0] * image, v[1] * image, v[2] * image, v[3] * image};
}

std::array<Complex, 4> HalfSpaceTable::NormalizedClamped(double rho_m, double zeta_m,
                                                         unsigned parts) const {
  double rho = std::max(rho_m, 0.0);
  double zeta = std::clamp(zeta_m, zeta_min_, zeta_max_);
  double r = std::sqrt(rho * rho + zeta * zeta);
  if (r < r_min_ || r > r_max_) {
    // Move along the ray from the image to the nearest end of the range.
    const double scale = std::clamp(r, r_min_, r_max_) / r;
    rho *= scale;
    zeta = std::clamp(zeta * scale, zeta_min_, zeta_max_);
    rho = std::min(rho, std::sqrt(std::max(r_max_ * r_max_ - zeta * zeta, 0.0)));
    r = std::sqrt(rho * rho + zeta * zeta);
  }
  if (direct_) {
    // The public order (horizontal, vertical, charge, coupling), the parts left out zero.
    const HalfSpaceCorrection c = ground_.Correction(rho, zeta);
    const Complex f = std::polar(r, ground_.wavenumber() * r);  // divides out the image
    auto part = [&](unsigned bit, Complex value) { return (parts & bit) ? value * f : Complex(); };
    return {part(kHorizontal, c.horizontal), part(kVertical, c.vertical), part(kCharge, c.charge),
            part(kCoupling, c.coupling)};
  }
  // The mask in values_' order (horizontal, charge, coupling, vertical); the charge is always
  // wanted in a fill, so its masks come first.
  const unsigned mask = TableMask(parts);
  using Interpolator = std::array<Complex, 4> (HalfSpaceTable::*)(double, double, double) const;
  // By mask: each mask holding the charge (which a fill always wants) has its own loop, the
  // others take the loop over all four parts.
  static constexpr std::array<Interpolator, 16> kByMask = {
      &HalfSpaceTable::Interpolate<15>, &HalfSpaceTable::Interpolate<15>,
      &HalfSpaceTable::Interpolate<2>,  &HalfSpaceTable::Interpolate<3>,
      &HalfSpaceTable::Interpolate<15>, &HalfSpaceTable::Interpolate<15>,
      &HalfSpaceTable::Interpolate<6>,  &HalfSpaceTable::Interpolate<7>,
      &HalfSpaceTable::Interpolate<15>, &HalfSpaceTable::Interpolate<15>,
      &HalfSpaceTable::Interpolate<10>, &HalfSpaceTable::Interpolate<11>,
      &HalfSpaceTable::Interpolate<15>, &HalfSpaceTable::Interpolate<15>,
      &HalfSpaceTable::Interpolate<14>, &HalfSpaceTable::Interpolate<15>};
  return (this->*kByMask[mask])(rho, zeta, r);
}

template <unsigned kMask>
std::array<Complex, 4> HalfSpaceTable::Interpolate(double rho_m, double zeta_m, double r_m) const {
  const Cell cell = Locate(rho_m, zeta_m, r_m);
  const double x = cell.x, y = cell.y, dx = cell.dx, dy = cell.dy;
  const int i = cell.i, j = cell.j;
  // The x nodes are equally spaced; so are the y nodes but for the first (see the constructor).
  const std::array<double, 4> wx = Lagrange((x - x_[i]) / dx);
  const std::array<double, 4> wy =
      j > 1 ? Lagrange((y - y_[j]) / dy) : Lagrange(&y_[0], first_y_scale_, y);
  // Along y within each of the four rows of the stencil, then across them, on the parts of
  // kMask only (bit c: part c of values_' order), as real and imaginary parts in a row of
  // doubles (a std::complex array may be read so), which the compiler keeps in vector
  // registers. The parts left out stay zero.
  const double* base = reinterpret_cast<const double*>(values_.data());
  double v[8] = {};
  for (int a = 0; a < 4; ++a) {
    const double* row =
        base + std::ptrdiff_t{8} * ((i - 1 + a) * static_cast<std::ptrdiff_t>(y_.size()) + j - 1);
    double t[8] = {};
    for (int b = 0; b < 4; ++b) {
      for (int c = 0; c < 8; ++c) {
        if ((kMask >> (c / 2)) & 1u) t[c] += wy[b] * row[8 * b + c];
      }
    }
    for (int c = 0; c < 8; ++c) {
      if ((kMask >> (c / 2)) & 1u) v[c] += wx[a] * t[c];
    }
  }
  // Back to the public order: horizontal, vertical, charge, coupling.
  return {Complex(v[0], v[1]), Complex(v[6], v[7]), Complex(v[2], v[3]), Complex(v[4], v[5])};
}

bool HalfSpaceTable::NormalizedSlopes(double rho_m, double zeta_m, unsigned parts,
                                      std::array<Complex, 4>* value, std::array<Complex, 4>* d_rho,
                                      std::array<Complex, 4>* d_zeta) const {
  const double r = std::sqrt(rho_m * rho_m + zeta_m * zeta_m);
  if (direct_ || x_.empty() || !(rho_m >= 0.0) || r < r_min_ || r > r_max_ || zeta_m < zeta_min_ ||
      zeta_m > zeta_max_) {
    return false;  // not covered (Covers) or no table
  }
  std::array<std::array<Complex, 4>, 2> slopes;
  const unsigned mask = TableMask(parts);
  switch (mask) {
    case 2:
      *value = InterpolateSlopes<2>(rho_m, zeta_m, r, &slopes);
      break;
    case 3:
      *value = InterpolateSlopes<3>(rho_m, zeta_m, r, &slopes);
      break;
    case 6:
      *value = InterpolateSlopes<6>(rho_m, zeta_m, r, &slopes);
      break;
    case 7:
      *value = InterpolateSlopes<7>(rho_m, zeta_m, r, &slopes);
      break;
    case 10:
      *value = InterpolateSlopes<10>(rho_m, zeta_m, r, &slopes);
      break;
    case 11:
      *value = InterpolateSlopes<11>(rho_m, zeta_m, r, &slopes);
      break;
    case 14:
      *value = InterpolateSlopes<14>(rho_m, zeta_m, r, &slopes);
      break;
    default:
      *value = InterpolateSlopes<15>(rho_m, zeta_m, r, &slopes);
      break;
  }
  // x = ln R' + R'/R_c and y = sqrt(zeta / (R' + rho)), with dR'/drho = rho/R' and dR'/dzeta =
  // zeta/R': dx/drho = (1/R' + 1/R_c) rho/R', dx/dzeta = (1/R' + 1/R_c) zeta/R', dy/drho =
  // -y/(2 R'), dy/dzeta = y rho/(2 zeta R').
  const double y = std::sqrt(zeta_m / (r + rho_m));
  const double x_r = (1.0 / r + 1.0 / r_c_) / r;
  const double x_rho = x_r * rho_m, x_zeta = x_r * zeta_m;
  const double y_rho = -0.5 * y / r, y_zeta = 0.5 * y * rho_m / (zeta_m * r);
  for (int c = 0; c < 4; ++c) {
    (*d_rho)[c] = slopes[0][c] * x_rho + slopes[1][c] * y_rho;
    (*d_zeta)[c] = slopes[0][c] * x_zeta + slopes[1][c] * y_zeta;
  }
  return true;
}

template <unsigned kMask>
std::array<Complex, 4> HalfSpaceTable::InterpolateSlopes(
    double rho_m, double zeta_m, double r_m, std::array<std::array<Complex, 4>, 2>* slopes) const {
  const Cell cell = Locate(rho_m, zeta_m, r_m);
  const double x = cell.x, y = cell.y, dx = cell.dx, dy = cell.dy;
  const int i = cell.i, j = cell.j;
  const double u = (x - x_[i]) / dx;
  const std::array<double, 4> wx = Lagrange(u);
  std::array<double, 4> sx = LagrangeSlope(u);
  for (double& w : sx) w /= dx;
  std::array<double, 4> wy, sy;
  if (j > 1) {
    const double v = (y - y_[j]) / dy;
    wy = Lagrange(v);
    sy = LagrangeSlope(v);
    for (double& w : sy) w /= dy;
  } else {
    wy = Lagrange(&y_[0], first_y_scale_, y);
    sy = LagrangeSlope(&y_[0], first_y_scale_, y);
  }
  // As Interpolate: along y (value and slope) within each row, then across the rows.
  const double* base = reinterpret_cast<const double*>(values_.data());
  double v[8] = {}, vx[8] = {}, vy[8] = {};
  for (int a = 0; a < 4; ++a) {
    const double* row =
        base + std::ptrdiff_t{8} * ((i - 1 + a) * static_cast<std::ptrdiff_t>(y_.size()) + j - 1);
    double t[8] = {}, ty[8] = {};
    for (int b = 0; b < 4; ++b) {
      for (int c = 0; c < 8; ++c) {
        if ((kMask >> (c / 2)) & 1u) {
          t[c] += wy[b] * row[8 * b + c];
          ty[c] += sy[b] * row[8 * b + c];
        }
      }
    }
    for (int c = 0; c < 8; ++c) {
      if ((kMask >> (c / 2)) & 1u) {
        v[c] += wx[a] * t[c];
        vx[c] += sx[a] * t[c];
        vy[c] += wx[a] * ty[c];
      }
    }
  }
  // Back to the public order: horizontal, vertical, charge, coupling.
  auto order = [](const double* d) -> std::array<Complex, 4> {
    return {Complex(d[0], d[1]), Complex(d[6], d[7]), Complex(d[2], d[3]), Complex(d[4], d[5])};
  };
  (*slopes)[0] = order(vx);
  (*slopes)[1] = order(vy);
  return order(v);
}

Complex SommerfeldIdentityIntegral(double rho_m, double zeta_m, double wavenumber_per_m,
                                   SommerfeldOptions options) {
  const IdentityKernel kernel{rho_m};
  return Integrate<1>(kernel, wavenumber_per_m, Complex(1.0, 0.0), rho_m, zeta_m, options)[0];
}

}  // namespace wirefield::ground
