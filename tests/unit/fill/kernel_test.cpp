// Unit tests of the fill stage: the fast segment-pair integrals against brute-force
// quadrature and against the closed-form static self term, and the Z matrix's symmetry.
#include "fill/kernel.hpp"

#include <gtest/gtest.h>

#include <cmath>

#include "fill/assemble.hpp"
#include "validation/test_models.hpp"

namespace wirefield::fill {
namespace {

double RelativeError(const PairMoments& a, const PairMoments& b) {
  return std::max(
      {std::abs(a.m00 - b.m00) / std::abs(b.m00), std::abs(a.m10 - b.m10) / std::abs(b.m10),
       std::abs(a.m01 - b.m01) / std::abs(b.m01), std::abs(a.m11 - b.m11) / std::abs(b.m11)});
}

TEST(SegmentPairMoments, SelfTermMatchesClosedFormStaticIntegral) {
  // For k = 0: int_0^L int_0^L dz dz' / sqrt((z - z')^2 + a^2)
  //   = 2 [L asinh(L / a) - sqrt(L^2 + a^2) + a]   (elementary calculus).
  const double length = 0.01, radius = 1e-4;
  const PairMoments m = SegmentPairMoments({0, 0, 0}, {0, 0, length}, {0, 0, 0}, {0, 0, length},
                                           radius * radius, 0.0);
  const double exact = 2.0 *
                       (length * std::asinh(length / radius) -
                        std::sqrt(length * length + radius * radius) + radius) /
                       (length * length);
  EXPECT_NEAR(m.m00.real(), exact, 1e-8 * exact);
}

TEST(SegmentPairMoments, NearAndFarPairsMatchBruteForceQuadrature) {
  // Brute force: 20-point Gauss on 60 sub-intervals of each segment (each about 2 radii long).
  // Tolerance 1e-5: well below the discretisation error of the method itself.
  const double l = 0.0125, a = 1e-4, k = 2.0 * M_PI;
  const Vec3 o(0, 0, 0), z1(0, 0, l);
  const std::vector<std::pair<Vec3, Vec3>> sources = {
      {o, z1},                                     // self
      {z1, Vec3(0, 0, 2 * l)},                     // collinear neighbour
      {z1, Vec3(l, 0, l)},                         // neighbour at a right-angle bend
      {Vec3(0, 0, 2 * l), Vec3(0, 0, 3 * l)},      // next but one
      {Vec3(0.3 * l, 0, 0), Vec3(0.3 * l, 0, l)},  // parallel, close
      {Vec3(0, 0, 6 * l), Vec3(0, 0, 7 * l)},      // far
  };
  for (const auto& [b0, b1] : sources) {
    const PairMoments fast = SegmentPairMoments(o, z1, b0, b1, a * a, k);
    const PairMoments slow = SegmentPairMomentsReference(o, z1, b0, b1, a * a, k, 60);
    EXPECT_LT(RelativeError(fast, slow), 1e-5) << b0.transpose() << " " << b1.transpose();
  }
}

TEST(ImpedanceMatrix, IsSymmetricForGalerkinTestingOverGround) {
  // Galerkin testing with a reciprocal kernel gives Z = Z^T (free space and image ground).
  Model m;
  m.file = "t";
  m.wires.push_back(testing::Wire("a", {0, 0, 0}, {0, 0, 0.3}, 1e-3, 6));
  m.wires.push_back(testing::Wire("b", {0, 0, 0.3}, {0.4, 0.1, 0.5}, 1e-3, 7));
  m.feeds.push_back(testing::Feed("f", "a", PointKind::kStart, 0.0));
  m.ground.kind = GroundKind::kPerfect;
  geometry::MeshOptions o;
  o.max_frequency_hz = testing::kUnitWavelengthHz;
  const geometry::Mesh mesh = geometry::BuildMesh(m, o);
  const Eigen::MatrixXcd z = AssembleImpedance(mesh, testing::kUnitWavelengthHz);
  EXPECT_LT((z - z.transpose()).norm(), 1e-12 * z.norm());
  // Passive: the radiation part (Hermitian part) is positive semi-definite.
  const Eigen::MatrixXcd h = 0.5 * (z + z.adjoint());
  EXPECT_GT(Eigen::SelfAdjointEigenSolver<Eigen::MatrixXcd>(h).eigenvalues().minCoeff(),
            -1e-9 * z.norm());
}

}  // namespace
}  // namespace wirefield::fill
