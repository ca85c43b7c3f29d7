// The dense solve: the symmetric factorization (LAPACK zsytrf) used for the complex symmetric
// Galerkin matrix gives the currents of LU with partial pivoting (the plain path) to 1e-9
// relative on several models, and a matrix that is not symmetric is detected (it goes to LU).
#include "solve/dense.hpp"

#include <gtest/gtest.h>

#include "fill/assemble.hpp"
#include "geometry/mesh.hpp"
#include "validation/test_models.hpp"

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

}  // namespace
}  // namespace wirefield::solve
