// Solve stage: the moment-method system Z I = V with a condition and a residual check. The
// Galerkin matrix is complex symmetric (Z = Z^T), so with LAPACK the solve is a symmetric
// indefinite factorization Z = L D L^T (zsytrf, Bunch-Kaufman pivoting: half the work of LU);
// a matrix that is not symmetric, or a build without LAPACK, takes LU with partial pivoting
// (Eigen's PartialPivLU, itself on zgetrf with LAPACK). docs/numerics.md section 6.
#include "solve/dense.hpp"

#include <fmt/format.h>

#if defined(__linux__)
#include <dlfcn.h>
#endif

#include <algorithm>
#include <cmath>
#include <complex>
#include <cstring>
#include <vector>

#include "core/fresh_memory.hpp"
#include "wirefield/model.hpp"

namespace wirefield::solve {
namespace {
// A backward-stable LU leaves a residual near machine precision times the growth factor;
// anything above this means the factorization broke down (a singular matrix).
constexpr double kMaxRelativeResidual = 1e-6;
// Double precision keeps about 16 digits; with a condition number above 1e14 fewer than two
// remain in the currents.
constexpr double kMinReciprocalCondition = 1e-14;
// Two entries Z_mn, Z_nm count as equal (the matrix as symmetric) within this relative
// difference: the fill makes them equal to the last bit, so any real asymmetry is far larger.
constexpr double kSymmetryTolerance = 1e-13;

using Complex = std::complex<double>;

// |z| without hypot's guard against overflow (the entries are far from it): hypot took a
// fifth of a 100-unknown interpolated sweep (measured with perf).
double Magnitude(Complex z) { return std::sqrt(std::norm(z)); }

double OneNorm(const Eigen::MatrixXcd& z) {
  double best = 0.0;
  for (Eigen::Index c = 0; c < z.cols(); ++c) {
    double sum = 0.0;
    for (Eigen::Index r = 0; r < z.rows(); ++r) sum += Magnitude(z(r, c));
    best = std::max(best, sum);
  }
  return best;
}

[[noreturn]] void ThrowSingular(double rcond) {
  throw ComputationError(
      fmt::format("the moment-method matrix is numerically singular (reciprocal condition number "
                  "{:.3g}); look for wires that lie on top of each other, or load impedances many "
                  "orders of magnitude above the antenna's (take the wire out instead)",
                  rcond));
}

// Reciprocal condition number in the 1-norm from the LU factors. With LAPACK, zgecon
// (O(n^2)); Eigen's own estimator costs far more (measured: 1.9 s after a 0.3 s LU at 1000
// unknowns).
double ReciprocalCondition(const Eigen::MatrixXcd& z,
                           const Eigen::PartialPivLU<Eigen::MatrixXcd>& lu) {
#ifdef EIGEN_USE_LAPACKE
  double rcond = 0.0;
  const lapack_int n = static_cast<lapack_int>(z.rows());
  const lapack_int info = LAPACKE_zgecon(
      LAPACK_COL_MAJOR, '1', n,
      reinterpret_cast<const lapack_complex_double*>(lu.matrixLU().data()), n, OneNorm(z), &rcond);
  return info == 0 ? rcond : 0.0;
#else
  (void)z;
  return lu.rcond();
#endif
}

Eigen::VectorXcd SolveLu(const Eigen::MatrixXcd& z, const Eigen::VectorXcd& v, double* rcond_out) {
  Eigen::PartialPivLU<Eigen::MatrixXcd> lu(z);
  // Reciprocal condition number estimate (O(n^2) after the factorization). Below
  // kMinReciprocalCondition the answer has no correct digits left.
  const double rcond = ReciprocalCondition(z, lu);
  if (!(rcond >= kMinReciprocalCondition)) ThrowSingular(rcond);
  *rcond_out = rcond;
  return lu.solve(v);
}

}  // namespace

bool IsSymmetric(const Eigen::MatrixXcd& z) {
  if (z.rows() != z.cols()) return false;
  for (Eigen::Index c = 0; c < z.cols(); ++c) {
    for (Eigen::Index r = c + 1; r < z.rows(); ++r) {
      // |a - b|^2 <= tol^2 (|a|^2 + |b|^2): the test on squares, within a factor sqrt(2).
      const double scale2 = std::norm(z(r, c)) + std::norm(z(c, r));
      if (std::norm(z(r, c) - z(c, r)) > kSymmetryTolerance * kSymmetryTolerance * scale2) {
        return false;
      }
    }
  }
  return true;
}

#ifdef EIGEN_USE_LAPACKE
namespace {

// Factors the symmetric z in place (its lower triangle and diagonal become L and D; the strict
// upper triangle is left as it was) and solves for v. anorm_1: the 1-norm of z.
Eigen::VectorXcd FactorAndSolveInPlace(Eigen::MatrixXcd* z, const Eigen::VectorXcd& v,
                                       double anorm_1, double* rcond_out) {
  const lapack_int n = static_cast<lapack_int>(z->rows());
  std::vector<lapack_int> pivots(static_cast<size_t>(n));
  auto* a = reinterpret_cast<lapack_complex_double*>(z->data());
  // The _work entry points: the matrix is known finite, so LAPACKE's NaN scans are skipped.
  Complex size_query = 0.0;
  LAPACKE_zsytrf_work(LAPACK_COL_MAJOR, 'L', n, a, n, pivots.data(),
                      reinterpret_cast<lapack_complex_double*>(&size_query), -1);
  // The workspace (n times the block size, 1 MB at 1000 unknowns, and at least the 2 n of
  // zsycon) is left uninitialized: LAPACK writes before it reads.
  const lapack_int lwork = std::max<lapack_int>(2 * n, static_cast<lapack_int>(size_query.real()));
  Eigen::VectorXcd work(lwork);
  core::PrepareFreshMemory(work.data(), static_cast<size_t>(lwork) * sizeof(Complex));
  auto* w = reinterpret_cast<lapack_complex_double*>(work.data());
  const lapack_int info =
      LAPACKE_zsytrf_work(LAPACK_COL_MAJOR, 'L', n, a, n, pivots.data(), w, lwork);
  if (info > 0) ThrowSingular(0.0);  // an exactly zero pivot block
  if (info < 0) throw ComputationError(fmt::format("zsytrf rejected argument {}", -info));
  double rcond = 0.0;
  const lapack_int info_con =
      LAPACKE_zsycon_work(LAPACK_COL_MAJOR, 'L', n, a, n, pivots.data(), anorm_1, &rcond, w);
  if (info_con != 0 || !(rcond >= kMinReciprocalCondition)) ThrowSingular(rcond);
  *rcond_out = rcond;
  Eigen::VectorXcd x = v;
  const lapack_int info_solve =
      LAPACKE_zsytrs_work(LAPACK_COL_MAJOR, 'L', n, 1, a, n, pivots.data(),
                          reinterpret_cast<lapack_complex_double*>(x.data()), n);
  if (info_solve != 0) throw ComputationError("zsytrs failed after a successful zsytrf");
  return x;
}

// Z x for the symmetric Z whose strict upper triangle is in `upper` and diagonal in `diagonal`
// (the lower triangle of `upper` is ignored).
Eigen::VectorXcd SymmetricProduct(const Eigen::MatrixXcd& upper, const Eigen::VectorXcd& diagonal,
                                  const Eigen::VectorXcd& x) {
  Eigen::VectorXcd y = diagonal.cwiseProduct(x);
  for (Eigen::Index c = 0; c < upper.cols(); ++c) {
    Complex column_sum = 0.0;
    for (Eigen::Index r = 0; r < c; ++r) {
      y(r) += upper(r, c) * x(c);
      column_sum += upper(r, c) * x(r);
    }
    y(c) += column_sum;
  }
  return y;
}

}  // namespace

Eigen::VectorXcd SolveSymmetric(const Eigen::MatrixXcd& z, const Eigen::VectorXcd& v) {
  Eigen::MatrixXcd factor = z;
  double rcond = 0.0;
  return FactorAndSolveInPlace(&factor, v, OneNorm(z), &rcond);
}
#endif

bool ParkIdleBlasThreads() {
#if defined(__linux__)
  // OpenBLAS's threaded build exports the shutdown of its pool (it uses it around fork); it
  // starts the pool again on the next call that wants threads. Looked up at run time, so that
  // any other BLAS, which has no such symbol, links and runs unchanged.
  using Shutdown = int (*)();
  void* symbol = dlsym(RTLD_DEFAULT, "blas_thread_shutdown_");
  if (symbol == nullptr) return false;
  Shutdown shutdown = nullptr;
  static_assert(sizeof(shutdown) == sizeof(symbol));
  std::memcpy(&shutdown, &symbol, sizeof(shutdown));  // object to function pointer, as POSIX allows
  return shutdown() == 0;
#else
  return false;
#endif
}

DenseSolution SolveDense(Eigen::MatrixXcd z, const Eigen::VectorXcd& v) {
  if (!z.allFinite() || !v.allFinite()) {
    throw ComputationError("the impedance matrix has non-finite entries (coincident segments?)");
  }
  DenseSolution out;
  const double vnorm = v.norm();
#ifdef EIGEN_USE_LAPACKE
  out.symmetric = IsSymmetric(z);
  if (out.symmetric) {
    // In place: the one matrix is all the memory the solve needs. The residual uses the
    // untouched upper triangle and the saved diagonal.
    const Eigen::VectorXcd diagonal = z.diagonal();
    const double anorm = OneNorm(z);
    out.currents = FactorAndSolveInPlace(&z, v, anorm, &out.reciprocal_condition);
    out.relative_residual =
        vnorm > 0.0 ? (SymmetricProduct(z, diagonal, out.currents) - v).norm() / vnorm : 0.0;
  } else {
    out.currents = SolveLu(z, v, &out.reciprocal_condition);
    out.relative_residual = vnorm > 0.0 ? (z * out.currents - v).norm() / vnorm : 0.0;
  }
#else
  out.currents = SolveLu(z, v, &out.reciprocal_condition);
  out.relative_residual = vnorm > 0.0 ? (z * out.currents - v).norm() / vnorm : 0.0;
#endif
  if (!out.currents.allFinite() || !(out.relative_residual <= kMaxRelativeResidual)) {
    throw ComputationError(fmt::format(
        "the moment-method matrix is singular (relative residual {:.3g}); check for wires "
        "that overlap or segments far shorter than their radius",
        out.relative_residual));
  }
  return out;
}

}  // namespace wirefield::solve
