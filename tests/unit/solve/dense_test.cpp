// The dense solve: the symmetric factorization (LAPACK zsytrf) used for the complex symmetric
// Galerkin matrix gives the currents of LU with partial pivoting (the plain path) to 1e-9
// relative on several models, and a matrix that is not symmetric is detected (it goes to LU).
#include "solve/dense.hpp"

#include <gtest/gtest.h>

#include <filesystem>
#include <limits>
#include <thread>
#include <tuple>

#include "core/fresh_memory.hpp"
#include "fill/assemble.hpp"
#include "geometry/mesh.hpp"
#include "validation/test_models.hpp"
#include "wirefield/simulation.hpp"

namespace wirefield::solve {
namespace {

// Both factorizations are backward stable; on these well-conditioned matrices (condition
// number below 1e5) the currents agree to about 1e-11: 1e-9 leaves room for rounding only.
constexpr double kRelative = 1e-9;

std::vector<Model> Models() {
  std::vector<Model> models;
  models.push_back(testing::Dipole(0.5, 1e-3, 31));
  Model over = testing::HorizontalDipole(0.48, 2e-3, 25, 0.2);
  over.ground.kind = GroundKind::kReal;
  over.ground.permittivity = 13.0;
  over.ground.conductivity_s_per_m = 5e-3;
  models.push_back(over);
  Model bent = testing::Dipole(0.5, 1e-3, 21);
  bent.wires.push_back(testing::Wire("arm", {0.0, 0.0, 0.25}, {0.2, 0.1, 0.4}, 1e-3, 9));
  models.push_back(bent);
  return models;
}

TEST(SolveDense, SymmetricFactorizationMatchesLuOnGalerkinMatrices) {
  for (const Model& m : Models()) {
    geometry::MeshOptions o;
    o.max_frequency_hz = testing::kUnitWavelengthHz;
    const geometry::Mesh mesh = geometry::BuildMesh(m, o);
    const Eigen::MatrixXcd z = fill::AssembleImpedance(mesh, testing::kUnitWavelengthHz);
    const Eigen::VectorXcd v = fill::AssembleExcitation(mesh, m);
    ASSERT_TRUE(IsSymmetric(z)) << m.file;  // reciprocity of Galerkin testing
    const Eigen::VectorXcd lu = z.partialPivLu().solve(v);
    const DenseSolution solved = SolveDense(z, v);
#ifdef EIGEN_USE_LAPACKE
    EXPECT_TRUE(solved.symmetric);
    EXPECT_LE((SolveSymmetric(z, v) - lu).norm(), kRelative * lu.norm()) << m.file;
#endif
    EXPECT_LE((solved.currents - lu).norm(), kRelative * lu.norm()) << m.file;
    EXPECT_LT(solved.relative_residual, 1e-12);
  }
}

TEST(SolveDense, UnsymmetricMatrixIsDetectedAndSolvedByLu) {
  Eigen::MatrixXcd z(3, 3);
  z << 4.0, 1.0, 0.0, 2.0, 5.0, 1.0, 0.0, 1.0, 6.0;  // z(0,1) != z(1,0)
  const Eigen::VectorXcd v = Eigen::VectorXcd::Ones(3);
  EXPECT_FALSE(IsSymmetric(z));
  const DenseSolution solved = SolveDense(z, v);
  EXPECT_FALSE(solved.symmetric);
  EXPECT_LT((z * solved.currents - v).norm(), 1e-14);
}

// A NaN or an infinity anywhere in the matrix (here in either triangle or on the diagonal of a
// symmetric matrix) is refused before any factorization, and so is one in the excitation.
// The matrix and excitation of a half-wave dipole of `segments` segments at one wavelength.
std::pair<Eigen::MatrixXcd, Eigen::VectorXcd> DipoleSystem(int segments) {
  const Model m = testing::Dipole(0.5, 1e-3, segments);
  geometry::MeshOptions o;
  o.max_frequency_hz = testing::kUnitWavelengthHz;
  const geometry::Mesh mesh = geometry::BuildMesh(m, o);
  return {fill::AssembleImpedance(mesh, testing::kUnitWavelengthHz),
          fill::AssembleExcitation(mesh, m)};
}

TEST(SolveDense, NonFiniteEntriesAreRefused) {
  const auto [z, v] = DipoleSystem(31);
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const double inf = std::numeric_limits<double>::infinity();
  for (const auto& [r, c, value] : {std::tuple{3, 17, std::complex<double>(nan, 0.0)},
                                    std::tuple{17, 3, std::complex<double>(0.0, inf)},
                                    std::tuple{5, 5, std::complex<double>(-inf, 1.0)}}) {
    Eigen::MatrixXcd bad = z;
    bad(r, c) = value;
    EXPECT_THROW((void)SolveDense(bad, v), ComputationError) << r << "," << c;
  }
  Eigen::VectorXcd bad_v = v;
  bad_v(0) = {nan, nan};
  EXPECT_THROW((void)SolveDense(z, bad_v), ComputationError);
}

// The message names what overflowed: the excitation or the matrix, never a guess at a cause
// the input does not have.
std::string SolveMessage(const Eigen::MatrixXcd& z, const Eigen::VectorXcd& v) {
  try {
    (void)SolveDense(z, v);
  } catch (const ComputationError& e) {
    return e.what();
  }
  return "";
}

TEST(SolveDense, AnOverflowIsCalledAnOverflowAndSaysWhere) {
  const auto [z, v] = DipoleSystem(11);
  const double inf = std::numeric_limits<double>::infinity();
  Eigen::VectorXcd bad_v = v;
  bad_v(2) = {inf, 0.0};
  EXPECT_NE(SolveMessage(z, bad_v).find("the excitation overflows double precision"),
            std::string::npos);
  Eigen::MatrixXcd bad_z = z;
  bad_z(1, 1) = {inf, 0.0};
  const std::string matrix = SolveMessage(bad_z, v);
  EXPECT_NE(matrix.find("the impedance matrix overflows double precision"), std::string::npos)
      << matrix;
}

int ThreadsOfThisProcess() {
  int count = 0;
  for ([[maybe_unused]] const auto& entry :
       std::filesystem::directory_iterator("/proc/self/task")) {
    ++count;
  }
  return count;
}

// A 1000-unknown symmetric matrix takes the symmetric factorization and gives LU's currents
// (Eigen's partial-pivoting LU) to 1e-9. The same solve runs after the BLAS
// library's idle workers are parked (as the program does at start): the answer is unchanged,
// and with OpenBLAS's threaded build (where there is a pool to park) the pool is back after it.
TEST(SolveDense, LargeMatrixTakesTheSymmetricPathAlsoAfterTheBlasPoolIsParked) {
  const Model m = testing::Dipole(0.5, 5e-5, 1001);  // 1000 unknowns, segments 10 radii long
  geometry::MeshOptions o;
  o.max_frequency_hz = testing::kUnitWavelengthHz;
  const geometry::Mesh mesh = geometry::BuildMesh(m, o);
  const Eigen::MatrixXcd z = fill::AssembleImpedance(mesh, testing::kUnitWavelengthHz);
  const Eigen::VectorXcd v = fill::AssembleExcitation(mesh, m);
  ASSERT_EQ(z.rows(), 1000);
  const Eigen::VectorXcd lu = z.partialPivLu().solve(v);
  const DenseSolution before = SolveDense(z, v);
#ifdef EIGEN_USE_LAPACKE
  EXPECT_TRUE(before.symmetric);
#endif
  EXPECT_LE((before.currents - lu).norm(), kRelative * lu.norm());
  const bool parked = ParkIdleBlasThreads();
  const int threads_parked = ThreadsOfThisProcess();
  const DenseSolution after = SolveDense(z, v);
  // A backward-stable factorization: residual about n eps times a modest growth factor
  // (1000 x 1.1e-16 = 1.1e-13).
  EXPECT_LT(after.relative_residual, 1e-10);
  EXPECT_LE((after.currents - lu).norm(), kRelative * lu.norm());
  if (parked && std::thread::hardware_concurrency() > 1 &&
      std::filesystem::exists("/proc/self/task")) {
    EXPECT_GT(ThreadsOfThisProcess(), threads_parked);
  }
}

// The first-touch hint keeps the contents of a buffer (here one already written) and accepts
// a start that is not page-aligned.
TEST(FreshMemory, PreparingKeepsTheContents) {
  Eigen::VectorXcd data(100000);  // 1.6 MB
  for (Eigen::Index i = 0; i < data.size(); ++i) {
    data(i) = {static_cast<double>(i), -0.5 * static_cast<double>(i)};
  }
  core::PrepareFreshMemory(data.data() + 1,
                           static_cast<std::size_t>(data.size() - 1) * sizeof(data(0)));
  for (Eigen::Index i = 0; i < data.size(); ++i) {
    ASSERT_EQ(data(i), std::complex<double>(static_cast<double>(i), -0.5 * static_cast<double>(i)));
  }
}

}  // namespace
}  // namespace wirefield::solve
