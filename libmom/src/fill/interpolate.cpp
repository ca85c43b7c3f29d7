// Fill stage: matrix interpolation in frequency. Z_mn(f) = e^{-jk R_mn} A_mn(f) / omega, with
// A_mn = omega Z_mn e^{+jk R_mn} smooth in f (the scalar-potential part of Z goes as 1/omega,
// the vector-potential part as omega: A is then a constant plus an omega^2 term, both times a
// slowly varying integral), interpolated by the quadratic through three anchors. The direct
// and the image parts of Z (over a ground) have different path lengths R and are interpolated
// separately. Method: Newman (1988), Virga and Rahmat-Samii (1999); docs/numerics.md.
#include "fill/interpolate.hpp"

#include <cmath>
#include <complex>

#include "core/constants.hpp"
#include "wirefield/model.hpp"

namespace wirefield::fill {
namespace {

double Wavenumber(double frequency_hz) {
  return 2.0 * core::kPi * frequency_hz / core::kSpeedOfLight_m_per_s;
}

// A = omega Z e^{+jkR} in place, from the nodes of the bases (image: the source node
// mirrored in z = 0).
void RemovePhase(const std::vector<Eigen::Vector3d>& nodes, bool mirror, double frequency_hz,
                 Eigen::MatrixXcd* z) {
  const double k = Wavenumber(frequency_hz);
  const double omega = 2.0 * core::kPi * frequency_hz;
  const Eigen::Index n = z->rows();
  const Eigen::Vector3d flip(1.0, 1.0, mirror ? -1.0 : 1.0);
  for (Eigen::Index c = 0; c < n; ++c) {
    const Eigen::Vector3d source = nodes[static_cast<size_t>(c)].cwiseProduct(flip);
    for (Eigen::Index r = 0; r < n; ++r) {
      const double distance_m = (nodes[static_cast<size_t>(r)] - source).norm();
      (*z)(r, c) *= omega * std::polar(1.0, k * distance_m);
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
  for (size_t a = 0; a < 3; ++a) {
    ImpedanceParts parts = AssembleImpedanceParts(mesh, anchors_hz[a], cache, fill_threads);
    RemovePhase(nodes_m_, false, anchors_hz[a], &parts.direct);
    direct_[a] = std::move(parts.direct);
    if (images_) {
      RemovePhase(nodes_m_, true, anchors_hz[a], &parts.image);
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
  const double k = Wavenumber(f);
  const Eigen::Index n = direct_[0].rows();
  z->resize(n, n);
  const Eigen::Vector3d flip(1.0, 1.0, -1.0);
  for (Eigen::Index c = 0; c < n; ++c) {
    const Eigen::Vector3d& source = nodes_m_[static_cast<size_t>(c)];
    const Eigen::Vector3d image = source.cwiseProduct(flip);
    for (Eigen::Index r = c; r < n; ++r) {
      const Eigen::Vector3d& observer = nodes_m_[static_cast<size_t>(r)];
      Complex value = (w0 * direct_[0](r, c) + w1 * direct_[1](r, c) + w2 * direct_[2](r, c)) *
                      std::polar(1.0, -k * (observer - source).norm());
      if (images_) {
        value += (w0 * image_[0](r, c) + w1 * image_[1](r, c) + w2 * image_[2](r, c)) *
                 std::polar(1.0, -k * (observer - image).norm());
      }
      (*z)(r, c) = value;
      (*z)(c, r) = value;
    }
  }
}

}  // namespace wirefield::fill
