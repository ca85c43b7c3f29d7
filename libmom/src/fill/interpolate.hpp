// Fill stage: matrix interpolation in frequency for sweeps. From exact fills at three anchor
// frequencies, the antenna's own impedance matrix (no loads, no conductor loss) at any
// frequency between them, entry by entry with the propagation phase of the entry removed
// before a quadratic interpolation and put back after (docs/numerics.md, "Interpolation in
// frequency"). Input: a Mesh, its NearFieldCache, three frequencies; output: Z(f).
#pragma once

#include <Eigen/Dense>
#include <array>
#include <vector>

#include "fill/assemble.hpp"
#include "geometry/mesh.hpp"

namespace wirefield::fill {

class MatrixInterpolator {
 public:
  // Fills the matrix exactly at the three anchors (distinct, any order), each by fill_threads
  // threads. Costs three fills and 3 (6 over a ground) matrices of memory.
  MatrixInterpolator(const geometry::Mesh& mesh, const NearFieldCache& cache,
                     const std::array<double, 3>& anchors_hz, int fill_threads);

  // The interpolated matrix at frequency_hz (meant for the span of the anchors), written
  // into *z (resized to n x n). Symmetric exactly. Costs O(n^2): a short series per entry for
  // its phase (no sine or cosine).
  void At(double frequency_hz, Eigen::MatrixXcd* z) const;

  // Bytes the anchors of a mesh take (the sweep checks it against its budget).
  static double AnchorBytes(const geometry::Mesh& mesh);

 private:
  std::array<double, 3> anchors_hz_{};
  // Per anchor a: omega_a Z_a(m, n) e^{+j (k_a - k_ref) R_mn}, for the direct pairs and the
  // image pairs (R the distance from basis m's node to basis n's node, or to its mirror image;
  // k_ref the wavenumber at the middle of the anchors' span).
  std::array<Eigen::MatrixXcd, 3> direct_, image_;
  std::vector<Eigen::Vector3d> nodes_m_;  // node of each basis (centre of its triangle)
  bool images_ = false;
  double reference_wavenumber_per_m_ = 0.0;
  double max_distance_m_ = 0.0;  // bounds every R_mn
};

}  // namespace wirefield::fill
