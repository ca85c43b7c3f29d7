// Solve stage: the dense complex system Z I = V by LU decomposition with partial pivoting
// (Eigen). Reports a ComputationError when the matrix is singular or the answer not finite.
#pragma once

#include <Eigen/Dense>

namespace wirefield::solve {

struct DenseSolution {
  Eigen::VectorXcd currents;
  double relative_residual = 0.0;  // |Z I - V| / |V|
};

// Solves Z I = V (Z square, V of matching size). Throws ComputationError on failure.
DenseSolution SolveDense(const Eigen::MatrixXcd& z, const Eigen::VectorXcd& v);

}  // namespace wirefield::solve
