// Solve stage: the reduced solve of a frequency sweep. The currents of a few nearby
// frequencies, solved densely, span a space in which the currents of the frequencies between
// them nearly lie; a least-squares solve in that span costs a product of Z with a few vectors
// instead of a factorisation. Method and its error bound: docs/numerics.md, "Reduced solve in
// a window".
#pragma once

#include <Eigen/Dense>
#include <optional>
#include <vector>

#include "solve/dense.hpp"

namespace wirefield::solve {

// Currents of nearby frequencies as orthonormal columns, with what a solve in their span must
// meet to be kept.
struct ReducedSpace {
  Eigen::MatrixXcd basis;
  // The largest relative residual |Z I - V| / |V| at which the reduced currents are kept.
  double max_relative_residual = 0.0;
  // The condition number reported for a reduced solve: the largest of the dense solves the
  // columns came from.
  double condition_number = 0.0;
};

// The orthonormal span of `snapshots` (currents of one size, at least one), with the largest
// of their solves' condition numbers.
ReducedSpace MakeReducedSpace(const std::vector<Eigen::VectorXcd>& snapshots,
                              const std::vector<double>& condition_numbers,
                              double max_relative_residual);

// The least-squares currents in the span of reduced.basis, min |Z Q y - V|, when their relative
// residual is at most reduced.max_relative_residual and they are finite; else nothing (solve
// densely). Also nothing for an empty basis or a zero V. reciprocal_condition is left 0: the
// condition number to report is reduced.condition_number.
std::optional<DenseSolution> SolveReduced(const Eigen::MatrixXcd& z, const Eigen::VectorXcd& v,
                                          const ReducedSpace& reduced);

}  // namespace wirefield::solve
