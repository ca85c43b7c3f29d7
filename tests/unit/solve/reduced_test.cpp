// The reduced solve of a sweep: a least-squares solve in the span of a few snapshot currents
// (the QR method of linear least squares, G. H. Golub and C. F. Van Loan, Matrix
// Computations, 4th ed., section 5.3, from memory). When V = Z x lies exactly in the span, the
// solve recovers x; when the span misses it, the residual test refuses the reduced currents.
#include "solve/reduced.hpp"

#include <gtest/gtest.h>

#include <complex>
#include <vector>

namespace wirefield::solve {
namespace {

using C = std::complex<double>;

// A well-conditioned complex matrix: the identity times 4 plus small off-diagonal terms.
Eigen::MatrixXcd TestMatrix(int n) {
  Eigen::MatrixXcd z(n, n);
  for (int i = 0; i < n; ++i) {
    for (int j = 0; j < n; ++j) z(i, j) = i == j ? C(4.0, 1.0) : C(0.1 * (i + 1), -0.05 * j);
  }
  return z;
}

Eigen::VectorXcd Unit(int n, int k) {
  Eigen::VectorXcd e = Eigen::VectorXcd::Zero(n);
  e(k) = 1.0;
  return e;
}

TEST(ReducedSolve, MakeReducedSpaceGivesOrthonormalColumnsSpanningTheSnapshots) {
  const int n = 6;
  Eigen::VectorXcd a(n), b(n);
  a << C(1, 0), C(2, 1), C(0, -1), C(3, 0), C(1, 1), C(0, 2);
  b << C(0, 1), C(1, 0), C(1, 1), C(-1, 0), C(2, 0), C(1, -1);
  const ReducedSpace space = MakeReducedSpace({a, b}, {10.0, 30.0}, 1e-8);
  ASSERT_EQ(space.basis.cols(), 2);
  // Q^H Q = I (orthonormal columns).
  const Eigen::MatrixXcd gram = space.basis.adjoint() * space.basis;
  EXPECT_LT((gram - Eigen::MatrixXcd::Identity(2, 2)).norm(), 1e-12);
  // Each snapshot equals its projection Q Q^H s onto the span.
  for (const Eigen::VectorXcd& s : {a, b}) {
    EXPECT_LT((space.basis * (space.basis.adjoint() * s) - s).norm(), 1e-12 * s.norm());
  }
  EXPECT_EQ(space.condition_number, 30.0);  // the largest of the snapshots' solves
  EXPECT_EQ(space.max_relative_residual, 1e-8);
}

TEST(ReducedSolve, RecoversCurrentsThatLieInTheSpan) {
  const int n = 6;
  const Eigen::MatrixXcd z = TestMatrix(n);
  const Eigen::VectorXcd x = Unit(n, 1) * C(2.0, -1.0) + Unit(n, 4) * C(0.5, 0.25);
  const Eigen::VectorXcd v = z * x;
  const ReducedSpace space = MakeReducedSpace({Unit(n, 1), Unit(n, 4)}, {5.0, 5.0}, 1e-10);
  const std::optional<DenseSolution> sol = SolveReduced(z, v, space);
  ASSERT_TRUE(sol.has_value());
  EXPECT_LT((sol->currents - x).norm(), 1e-12 * x.norm());
  EXPECT_LE(sol->relative_residual, 1e-12);
}

TEST(ReducedSolve, RefusesASpanThatMissesTheCurrents) {
  const int n = 6;
  const Eigen::MatrixXcd z = TestMatrix(n);
  const Eigen::VectorXcd v = z * Unit(n, 0);  // x = e0, outside span{e2, e3}
  const ReducedSpace space = MakeReducedSpace({Unit(n, 2), Unit(n, 3)}, {5.0, 5.0}, 1e-8);
  EXPECT_FALSE(SolveReduced(z, v, space).has_value());
}

TEST(ReducedSolve, RefusesAnEmptyBasisOrAZeroExcitation) {
  const int n = 4;
  const Eigen::MatrixXcd z = TestMatrix(n);
  EXPECT_FALSE(SolveReduced(z, z * Unit(n, 0), ReducedSpace{}).has_value());
  const ReducedSpace space = MakeReducedSpace({Unit(n, 0)}, {1.0}, 1e-8);
  EXPECT_FALSE(SolveReduced(z, Eigen::VectorXcd::Zero(n), space).has_value());
}

}  // namespace
}  // namespace wirefield::solve
