// Fill stage: matrix interpolation in frequency. Z_mn(f) = e^{-jk R_mn} A_mn(f) / omega, with
// A_mn = omega Z_mn e^{+jk R_mn} smooth in f (the scalar-potential part of Z goes as 1/omega,
// the vector-potential part as omega: A is then a constant plus an omega^2 term, both times a
// slowly varying integral), interpolated by the quadratic through three anchors. The direct
// and the image parts of Z (over a ground) have different path lengths R and are interpolated
// separately. Method: Newman (1988), Virga and Rahmat-Samii (1999); docs/numerics.md.
#include "fill/interpolate.hpp"

#include <algorithm>
#include <cmath>
#include <complex>
#include <limits>

#include "core/constants.hpp"
#include "wirefield/model.hpp"

namespace wirefield::fill {
namespace {

double Wavenumber(double frequency_hz) {
  return 2.0 * core::kPi * frequency_hz / core::kSpeedOfLight_m_per_s;
}

// A = omega Z e^{+j(k - k_ref)R} in place, from the nodes of the bases (image: the source
// node mirrored in z = 0): the phase of the entry removed, that of the reference put back.
void RemovePhase(const std::vector<Eigen::Vector3d>& nodes, bool mirror, double frequency_hz,
                 double reference_wavenumber_per_m, Eigen::MatrixXcd* z) {
  const double dk = Wavenumber(frequency_hz) - reference_wavenumber_per_m;
  const double omega = 2.0 * core::kPi * frequency_hz;
  const Eigen::Index n = z->rows();
  const Eigen::Vector3d flip(1.0, 1.0, mirror ? -1.0 : 1.0);
  for (Eigen::Index c = 0; c < n; ++c) {
    const Eigen::Vector3d source = nodes[static_cast<size_t>(c)].cwiseProduct(flip);
    for (Eigen::Index r = 0; r < n; ++r) {
      const double distance_m = (nodes[static_cast<size_t>(r)] - source).norm();
      (*z)(r, c) *= omega * std::polar(1.0, dk * distance_m);
    }
  }
}

}  // namespace

MatrixInterpolator::MatrixInterpolator(const geometry::Mesh& mesh, const NearFieldCache& cache,
                                       const std::array<double, 3>& anchors_hz, int fill_threads)
    : anchors_hz_(anchors_hz), images_(mesh.ground_images) {
  if (anchors_hz[0] == anchors_hz[1] || anchors_hz[1] == anchors_hz[2] ||
      anchors_hz[0] == anchors_hz[2]) {
    throw ComputationError("matrix interpolation needs three distinct anchor frequencies");
  }
  for (const geometry::Basis& basis : mesh.bases) {
    const geometry::Piece& piece = basis.pieces[0];
    const geometry::Segment& segment = mesh.segments[static_cast<size_t>(piece.segment)];
    nodes_m_.push_back(piece.node_at_end ? segment.end : segment.start);
  }
  const auto [low_hz, high_hz] = std::minmax({anchors_hz[0], anchors_hz[1], anchors_hz[2]});
  reference_wavenumber_per_m_ = Wavenumber(0.5 * (low_hz + high_hz));
  // No two nodes, nor a node and a mirrored node, lie farther apart than the diagonal of the
  // box around all of them.
  Eigen::Vector3d lo = Eigen::Vector3d::Constant(std::numeric_limits<double>::max());
  Eigen::Vector3d hi = -lo;
  for (const Eigen::Vector3d& p : nodes_m_) {
    const Eigen::Vector3d q(p.x(), p.y(), images_ ? -std::abs(p.z()) : p.z());
    lo = lo.cwiseMin(p).cwiseMin(q);
    hi = hi.cwiseMax(p).cwiseMax(q);
  }
  max_distance_m_ = nodes_m_.empty() ? 0.0 : (hi - lo).norm();
  for (size_t a = 0; a < 3; ++a) {
    ImpedanceParts parts = AssembleImpedanceParts(mesh, anchors_hz[a], cache, fill_threads);
    RemovePhase(nodes_m_, false, anchors_hz[a], reference_wavenumber_per_m_, &parts.direct);
    direct_[a] = std::move(parts.direct);
    if (images_) {
      RemovePhase(nodes_m_, true, anchors_hz[a], reference_wavenumber_per_m_, &parts.image);
      image_[a] = std::move(parts.image);
    }
  }
}

double MatrixInterpolator::AnchorBytes(const geometry::Mesh& mesh) {
  const double n = static_cast<double>(mesh.bases.size());
  return (mesh.ground_images ? 6.0 : 3.0) * n * n * sizeof(std::complex<double>);
}

void MatrixInterpolator::At(double frequency_hz, Eigen::MatrixXcd* z) const {
  // Lagrange weights of the quadratic through the anchors, divided by omega.
  const std::array<double, 3>& x = anchors_hz_;
  const double f = frequency_hz;
  const double omega = 2.0 * core::kPi * f;
  const double w0 = (f - x[1]) * (f - x[2]) / ((x[0] - x[1]) * (x[0] - x[2])) / omega;
  const double w1 = (f - x[0]) * (f - x[2]) / ((x[1] - x[0]) * (x[1] - x[2])) / omega;
  const double w2 = (f - x[0]) * (f - x[1]) / ((x[2] - x[0]) * (x[2] - x[1])) / omega;
  // The phase e^{-j(k - k_ref)R} of each entry by the series of kernel.hpp: |(k - k_ref) R| is
  // at most |k - k_ref| max_distance_m_; the angle is halved until the series applies, and
  // the factor squared back as often (each squaring doubles a rounding error of 1e-16).
  const double dk = Wavenumber(f) - reference_wavenumber_per_m_;
  int halvings = 0;
  for (double bound = std::abs(dk) * max_distance_m_; bound > kSeriesPhaseLimit; bound *= 0.5) {
    ++halvings;
  }
  const double scaled_dk = std::ldexp(dk, -halvings);
  // Near the middle of the window the angle stays within the short series' range everywhere.
  const bool short_series = std::abs(scaled_dk) * max_distance_m_ <= kShortSeriesPhaseLimit;
  auto phase = [&](double distance_m) {
    double c = 0.0, s = 0.0;
    if (short_series) {
      SeriesPhase<true>(scaled_dk * distance_m, &c, &s);
    } else {
      SeriesPhase<false>(scaled_dk * distance_m, &c, &s);
    }
    for (int h = 0; h < halvings; ++h) {
      const double c2 = c * c - s * s;
      s = 2.0 * c * s;
      c = c2;
    }
    return Complex(c, s);
  };
  const Eigen::Index n = direct_[0].rows();
  z->resize(n, n);
  const Eigen::Vector3d flip(1.0, 1.0, -1.0);
  // a b written out: the complex operator's checks for infinite parts (which cannot occur
  // here) cost the loop a branch per entry.
  auto multiply = [](Complex a, Complex b) {
    return Complex(a.real() * b.real() - a.imag() * b.imag(),
                   a.real() * b.imag() + a.imag() * b.real());
  };
  for (Eigen::Index c = 0; c < n; ++c) {
    const Eigen::Vector3d& source = nodes_m_[static_cast<size_t>(c)];
    const Eigen::Vector3d image = source.cwiseProduct(flip);
    const Complex* d0 = &direct_[0](0, c);
    const Complex* d1 = &direct_[1](0, c);
    const Complex* d2 = &direct_[2](0, c);
    for (Eigen::Index r = c; r < n; ++r) {
      const Eigen::Vector3d& observer = nodes_m_[static_cast<size_t>(r)];
      Complex value =
          multiply(w0 * d0[r] + w1 * d1[r] + w2 * d2[r], phase((observer - source).norm()));
      if (images_) {
        value += multiply(w0 * image_[0](r, c) + w1 * image_[1](r, c) + w2 * image_[2](r, c),
                          phase((observer - image).norm()));
      }
      (*z)(r, c) = value;
    }
  }
  // The upper triangle from the lower, in tiles that stay in the cache (a column-by-column
  // copy would write one entry per cache line).
  constexpr Eigen::Index kTile = 64;
  for (Eigen::Index c0 = 0; c0 < n; c0 += kTile) {
    for (Eigen::Index r0 = 0; r0 <= c0; r0 += kTile) {
      for (Eigen::Index c = c0; c < std::min(n, c0 + kTile); ++c) {
        for (Eigen::Index r = r0; r < std::min(c, r0 + kTile); ++r) (*z)(r, c) = (*z)(c, r);
      }
    }
  }
}

}  // namespace wirefield::fill
