// Solve stage: the reduced solve of a sweep (see reduced.hpp).
#include "solve/reduced.hpp"

#include <algorithm>

namespace wirefield::solve {

ReducedSpace MakeReducedSpace(const std::vector<Eigen::VectorXcd>& snapshots,
                              const std::vector<double>& condition_numbers,
                              double max_relative_residual) {
  ReducedSpace reduced;
  const Eigen::Index n = snapshots[0].size();
  const Eigen::Index m = static_cast<Eigen::Index>(snapshots.size());
  Eigen::MatrixXcd columns(n, m);
  for (Eigen::Index s = 0; s < m; ++s) columns.col(s) = snapshots[s];
  reduced.basis = columns.householderQr().householderQ() * Eigen::MatrixXcd::Identity(n, m);
  reduced.max_relative_residual = max_relative_residual;
  reduced.condition_number = *std::max_element(condition_numbers.begin(), condition_numbers.end());
  return reduced;
}

std::optional<DenseSolution> SolveReduced(const Eigen::MatrixXcd& z, const Eigen::VectorXcd& v,
                                          const ReducedSpace& reduced) {
  if (reduced.basis.cols() == 0 || !(v.norm() > 0.0)) return std::nullopt;
  const Eigen::MatrixXcd zq = z * reduced.basis;
  const Eigen::VectorXcd y = zq.householderQr().solve(v);
  // Products with the few columns of the basis through Eigen's own kernel (lazyProduct), not
  // BLAS: under the address sanitizer, OpenBLAS 0.3.21's zgemv_n kernel for this processor
  // (Cooper Lake) read an unmapped address on these narrow matrices in 7 of 16 runs of a
  // 5000-point sweep of a dipole; with Eigen's kernel 0 of 15.
  const double residual = (zq.lazyProduct(y) - v).norm() / v.norm();
  if (!(residual <= reduced.max_relative_residual && y.allFinite())) return std::nullopt;
  DenseSolution sol;
  sol.currents = reduced.basis.lazyProduct(y);
  sol.relative_residual = residual;
  return sol;
}

}  // namespace wirefield::solve
