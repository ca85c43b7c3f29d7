// Solve stage: the moment-method system Z I = V with a condition and a residual check. The
// Galerkin matrix is complex symmetric (Z = Z^T), so with LAPACK the solve is a symmetric
// indefinite factorization Z = L D L^T (zsytrf, Bunch-Kaufman pivoting: half the work of LU);
// a matrix that is not symmetric, or a build without LAPACK, takes LU with partial pivoting
// (Eigen's PartialPivLU, itself on zgetrf with LAPACK). docs/numerics.md section 6.
#include "solve/dense.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <complex>
#include <optional>
#include <vector>

#include "core/fresh_memory.hpp"
#include "solve/blas_threads.hpp"
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
// Below this many unknowns the factorization runs on one BLAS thread: OpenBLAS's second thread
// costs more than it brings there (make bench, 2 cores: ours at 250 unknowns 1.28 ms on one
// thread against 1.63 ms on two, at 500 6.6 ms against 7.4 ms; at 1000, 40.6 ms against 35.1).
constexpr Eigen::Index kOneBlasThreadBelow = 750;

// |z| without hypot's guard against overflow (the entries are far from it): hypot took a
// fifth of a 100-unknown interpolated sweep (measured with perf).
double Magnitude(Complex z) { return std::sqrt(std::norm(z)); }

// What the solve needs to know of the matrix before it factors it, found in one pass over
// entry pairs (z(r, c), z(c, r)) in cache-sized tiles, instead of three separate passes (one of
// them along rows, across cache lines): make bench, our solve at 500 unknowns 8.2 -> 7.4 ms, at
// 1000 36.4 -> 35.1 ms.
struct MatrixSurvey {
  bool finite = true;
  bool symmetric = true;  // z(r, c) = z(c, r) within kSymmetryTolerance, relative
  double one_norm = 0.0;  // largest column sum of |z(r, c)| (when symmetric; else OneNorm)
};

MatrixSurvey Survey(const Eigen::MatrixXcd& z) {
  MatrixSurvey out;
  const Eigen::Index n = z.rows();
  std::vector<double> column_sum(static_cast<size_t>(n), 0.0);
  constexpr double kTolerance2 = kSymmetryTolerance * kSymmetryTolerance;
  constexpr Eigen::Index kTile = 64;
  // 0 * x is 0 for every finite x and NaN for an infinity or a NaN: the probe stays 0 exactly
  // when every entry is finite.
  double probe = 0.0;
  for (Eigen::Index c0 = 0; c0 < n; c0 += kTile) {
    const Eigen::Index c1 = std::min(n, c0 + kTile);
    for (Eigen::Index r0 = 0; r0 <= c0; r0 += kTile) {
      for (Eigen::Index c = c0; c < c1; ++c) {
        const Eigen::Index r1 = std::min(c, r0 + kTile);
        for (Eigen::Index r = r0; r < r1; ++r) {
          const Complex upper = z(r, c), lower = z(c, r);
          const double upper2 = std::norm(upper), lower2 = std::norm(lower);
          // |a - b|^2 <= tol^2 (|a|^2 + |b|^2): the test on squares, within a factor sqrt(2).
          if (std::norm(upper - lower) > kTolerance2 * (upper2 + lower2)) out.symmetric = false;
          // Symmetric to rounding, |z(c, r)| = |z(r, c)|: one square root serves both columns
          // (a matrix that is not symmetric gets its exact 1-norm from OneNorm instead).
          const double pair_abs = std::sqrt(upper2);
          column_sum[static_cast<size_t>(c)] += pair_abs;
          column_sum[static_cast<size_t>(r)] += pair_abs;
          probe += 0.0 * (upper.real() + upper.imag() + lower.real() + lower.imag());
        }
      }
    }
  }
  for (Eigen::Index c = 0; c < n; ++c) {
    column_sum[static_cast<size_t>(c)] += Magnitude(z(c, c));
    probe += 0.0 * (z(c, c).real() + z(c, c).imag());
  }
  out.finite = probe == 0.0;
  for (const double sum : column_sum) out.one_norm = std::max(out.one_norm, sum);
  return out;
}

// The exact 1-norm of any matrix (Survey's assumes symmetry).
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
// anorm_1: the 1-norm of the matrix the LU factors came from.
double ReciprocalCondition(double anorm_1, const Eigen::PartialPivLU<Eigen::MatrixXcd>& lu) {
#ifdef EIGEN_USE_LAPACKE
  double rcond = 0.0;
  const lapack_int n = static_cast<lapack_int>(lu.matrixLU().rows());
  const lapack_int info = LAPACKE_zgecon(
      LAPACK_COL_MAJOR, '1', n,
      reinterpret_cast<const lapack_complex_double*>(lu.matrixLU().data()), n, anorm_1, &rcond);
  return info == 0 ? rcond : 0.0;
#else
  (void)anorm_1;
  return lu.rcond();
#endif
}

Eigen::VectorXcd SolveLu(const Eigen::MatrixXcd& z, const Eigen::VectorXcd& v, double anorm_1,
                         double* rcond_out) {
  Eigen::PartialPivLU<Eigen::MatrixXcd> lu(z);
  // Reciprocal condition number estimate (O(n^2) after the factorization). Below
  // kMinReciprocalCondition the answer has no correct digits left.
  const double rcond = ReciprocalCondition(anorm_1, lu);
  if (!(rcond >= kMinReciprocalCondition)) ThrowSingular(rcond);
  *rcond_out = rcond;
  return lu.solve(v);
}

}  // namespace

bool IsSymmetric(const Eigen::MatrixXcd& z) { return z.rows() == z.cols() && Survey(z).symmetric; }

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

DenseSolution SolveDense(Eigen::MatrixXcd z, const Eigen::VectorXcd& v) {
  if (z.rows() != z.cols() || v.size() != z.rows()) {
    throw ComputationError(fmt::format("internal: a {} x {} matrix with {} right-hand sides",
                                       z.rows(), z.cols(), v.size()));
  }
  const MatrixSurvey survey = Survey(z);
  if (!v.allFinite()) {
    throw ComputationError(
        "the excitation overflows double precision (a feed voltage past 1e308 V?); the allowed "
        "voltages are 1 uV to 1 MV");
  }
  if (!survey.finite) {
    throw ComputationError(
        "the impedance matrix overflows double precision (its entries are not finite numbers): "
        "a ground, a load or a wire constant too large for the fill, or two segments at the same "
        "place");
  }
  DenseSolution out;
  const double vnorm = v.norm();
  std::optional<SingleThreadedBlas> one_thread;
  if (z.rows() < kOneBlasThreadBelow) one_thread.emplace();
#ifdef EIGEN_USE_LAPACKE
  out.symmetric = survey.symmetric;
  if (out.symmetric) {
    // In place: the one matrix is all the memory the solve needs. The residual uses the
    // untouched upper triangle and the saved diagonal.
    const Eigen::VectorXcd diagonal = z.diagonal();
    out.currents = FactorAndSolveInPlace(&z, v, survey.one_norm, &out.reciprocal_condition);
    out.relative_residual =
        vnorm > 0.0 ? (SymmetricProduct(z, diagonal, out.currents) - v).norm() / vnorm : 0.0;
  } else {
    out.currents = SolveLu(z, v, OneNorm(z), &out.reciprocal_condition);
    out.relative_residual = vnorm > 0.0 ? (z * out.currents - v).norm() / vnorm : 0.0;
  }
#else
  out.currents = SolveLu(z, v, OneNorm(z), &out.reciprocal_condition);
  out.relative_residual = vnorm > 0.0 ? (z * out.currents - v).norm() / vnorm : 0.0;
#endif
  if (!out.currents.allFinite() || !std::isfinite(out.relative_residual)) {
    // Finite matrix and excitation, non-finite currents: the solve itself overflowed.
    throw ComputationError(
        "the currents overflow double precision (the matrix is singular or its scale is "
        "extreme); check for wires that overlap or segments far shorter than their radius");
  }
  if (!(out.relative_residual <= kMaxRelativeResidual)) {
    throw ComputationError(fmt::format(
        "the moment-method matrix is singular (relative residual {:.3g}); check for wires "
        "that overlap or segments far shorter than their radius",
        out.relative_residual));
  }
  return out;
}

}  // namespace wirefield::solve
