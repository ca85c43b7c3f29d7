// Matrix interpolation in frequency (fill/interpolate.hpp): the quadratic through three
// anchors reproduces the exact fill at the anchors (Lagrange interpolation is exact at its
// nodes), and the direct and image parts of the fill add up to the whole matrix.
#include "fill/interpolate.hpp"

#include <gtest/gtest.h>

#include "fill/assemble.hpp"
#include "geometry/mesh.hpp"
#include "validation/test_models.hpp"

namespace wirefield::fill {
namespace {

// Rounding of a few operations per entry (phase removed and put back, weights 1, 0, 0).
constexpr double kRounding = 1e-12;

geometry::Mesh MeshOver(GroundKind ground) {
  Model m = testing::HorizontalDipole(0.5, 1e-3, 21, 0.3);
  m.ground.kind = ground;
  m.ground.permittivity = 13.0;
  m.ground.conductivity_s_per_m = 5e-3;
  geometry::MeshOptions o;
  o.max_frequency_hz = 1.1 * testing::kUnitWavelengthHz;
  return geometry::BuildMesh(m, o);
}

TEST(MatrixInterpolator, ReproducesTheExactFillAtEachAnchor) {
  for (const GroundKind g : {GroundKind::kFree, GroundKind::kPerfect, GroundKind::kReal}) {
    const geometry::Mesh mesh = MeshOver(g);
    const NearFieldCache cache = BuildNearFieldCache(mesh);
    const double f0 = testing::kUnitWavelengthHz;
    const std::array<double, 3> anchors{f0, 1.02 * f0, 1.04 * f0};
    const MatrixInterpolator interpolator(mesh, cache, anchors, 1);
    for (const double f : anchors) {
      const Eigen::MatrixXcd exact = AssembleImpedance(mesh, f, cache, 1);
      Eigen::MatrixXcd z;
      interpolator.At(f, &z);
      EXPECT_LT((z - exact).cwiseAbs().maxCoeff(), kRounding * exact.cwiseAbs().maxCoeff())
          << "ground " << static_cast<int>(g) << " at " << f << " Hz";
    }
  }
}

TEST(ImpedanceParts, DirectPlusImageIsTheWholeMatrix) {
  for (const GroundKind g : {GroundKind::kFree, GroundKind::kPerfect, GroundKind::kReal}) {
    const geometry::Mesh mesh = MeshOver(g);
    const NearFieldCache cache = BuildNearFieldCache(mesh);
    const Eigen::MatrixXcd whole = AssembleImpedance(mesh, testing::kUnitWavelengthHz, cache, 2);
    const ImpedanceParts parts = AssembleImpedanceParts(mesh, testing::kUnitWavelengthHz, cache, 2);
    Eigen::MatrixXcd sum = parts.direct;
    if (g == GroundKind::kFree) {
      EXPECT_EQ(parts.image.size(), 0);
    } else {
      sum += parts.image;
    }
    EXPECT_LT((sum - whole).cwiseAbs().maxCoeff(), kRounding * whole.cwiseAbs().maxCoeff());
  }
}

TEST(MatrixInterpolator, BetweenAnchorsStaysCloseToTheExactFillEntryByEntry) {
  // Halfway between anchors 2% apart the interpolation error of each entry is of the third
  // order in the spacing; 1e-4 of the largest entry leaves the feed impedance within 0.2%
  // (tests/validation/interpolation_validation_test.cpp checks the feed impedance itself).
  const geometry::Mesh mesh = MeshOver(GroundKind::kReal);
  const NearFieldCache cache = BuildNearFieldCache(mesh);
  const double f0 = testing::kUnitWavelengthHz;
  const MatrixInterpolator interpolator(mesh, cache, {f0, 1.02 * f0, 1.04 * f0}, 1);
  for (const double f : {1.01 * f0, 1.03 * f0}) {
    const Eigen::MatrixXcd exact = AssembleImpedance(mesh, f, cache, 1);
    Eigen::MatrixXcd z;
    interpolator.At(f, &z);
    EXPECT_LT((z - exact).cwiseAbs().maxCoeff(), 1e-4 * exact.cwiseAbs().maxCoeff());
  }
}

}  // namespace
}  // namespace wirefield::fill
