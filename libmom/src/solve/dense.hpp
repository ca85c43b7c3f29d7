// Solve stage: the dense complex system Z I = V by LU decomposition with partial pivoting
// (Eigen). Reports a ComputationError when the matrix is singular or the answer not finite.
#pragma once

#include <Eigen/Dense>

namespace wirefield::solve {

struct DenseSolution {
  Eigen::VectorXcd currents;
  double relative_residual = 0.0;  // |Z I - V| / |V|
  // Estimate of 1 / (|Z|_1 |Z^-1|_1) from the LU factors (LAPACK zgecon, else Eigen's rcond):
  // near 1 for a well-posed model; about 1e-16 means no digit of the currents is left.
  double reciprocal_condition = 0.0;
};

// Solves Z I = V (Z square, V of matching size). Throws ComputationError on failure.
DenseSolution SolveDense(const Eigen::MatrixXcd& z, const Eigen::VectorXcd& v);

}  // namespace wirefield::solve
