// Solve stage: the dense complex system Z I = V, by the symmetric factorization Z = L D L^T
// (LAPACK zsytrf) when Z is complex symmetric, as the Galerkin matrix is, else by LU with
// partial pivoting (Eigen). Reports a ComputationError when the matrix is singular or the
// answer not finite.
#pragma once

#include <Eigen/Dense>

namespace wirefield::solve {

struct DenseSolution {
  Eigen::VectorXcd currents;
  double relative_residual = 0.0;  // |Z I - V| / |V|
  // Estimate of 1 / (|Z|_1 |Z^-1|_1) from the LU factors (LAPACK zgecon, else Eigen's rcond):
  // near 1 for a well-posed model; about 1e-16 means no digit of the currents is left.
  double reciprocal_condition = 0.0;
  bool symmetric = false;  // solved by the symmetric factorization (else by LU)
};

// Solves Z I = V (Z square, V of matching size). Throws ComputationError on failure. Z is
// taken by value: pass it with std::move and a symmetric Z is factored in place (the peak
// memory is then one matrix).
DenseSolution SolveDense(Eigen::MatrixXcd z, const Eigen::VectorXcd& v);

// True when Z = Z^T to rounding (1e-13 relative per entry pair).
bool IsSymmetric(const Eigen::MatrixXcd& z);

#ifdef EIGEN_USE_LAPACKE
// The symmetric path alone (LAPACK zsytrf, zsycon, zsytrs on the lower triangle), without the
// residual check; for benchmarks and tests. Throws ComputationError when singular.
Eigen::VectorXcd SolveSymmetric(const Eigen::MatrixXcd& z, const Eigen::VectorXcd& v);
#endif

}  // namespace wirefield::solve
