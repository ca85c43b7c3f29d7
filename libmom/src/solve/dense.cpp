// Solve stage: LU solve of the moment-method system with a residual check.
#include "solve/dense.hpp"

#include <fmt/format.h>

#include "wirefield/model.hpp"

namespace wirefield::solve {
namespace {
// A backward-stable LU leaves a residual near machine precision times the growth factor;
// anything above this means the factorization broke down (a singular matrix).
constexpr double kMaxRelativeResidual = 1e-6;
// Double precision keeps about 16 digits; with a condition number above 1e14 fewer than two
// remain in the currents.
constexpr double kMinReciprocalCondition = 1e-14;
}  // namespace

DenseSolution SolveDense(const Eigen::MatrixXcd& z, const Eigen::VectorXcd& v) {
  if (!z.allFinite() || !v.allFinite()) {
    throw ComputationError("the impedance matrix has non-finite entries (coincident segments?)");
  }
  Eigen::PartialPivLU<Eigen::MatrixXcd> lu(z);
  // Reciprocal condition number estimate (O(n^2) after the factorization). Below
  // kMinReciprocalCondition the answer has no correct digits left.
  const double rcond = lu.rcond();
  if (!(rcond >= kMinReciprocalCondition)) {
    throw ComputationError(fmt::format(
        "the moment-method matrix is numerically singular (reciprocal condition number "
        "{:.3g}); look for wires that lie on top of each other, or load impedances many "
        "orders of magnitude above the antenna's (take the wire out instead)",
        rcond));
  }
  DenseSolution out;
  out.currents = lu.solve(v);
  const double vnorm = v.norm();
  out.relative_residual = vnorm > 0.0 ? (z * out.currents - v).norm() / vnorm : 0.0;
  if (!out.currents.allFinite() || !(out.relative_residual <= kMaxRelativeResidual)) {
    throw ComputationError(fmt::format(
        "the moment-method matrix is singular (relative residual {:.3g}); check for wires "
        "that overlap or segments far shorter than their radius",
        out.relative_residual));
  }
  return out;
}

}  // namespace wirefield::solve
