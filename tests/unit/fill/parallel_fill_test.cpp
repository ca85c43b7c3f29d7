// The parallel fill must give the plain single-threaded matrix, whatever the number of
// threads (the sums are the same; only their grouping across threads differs), on models with
// junctions (rows shared by two threads' blocks) and over each kind of ground.
#include <gtest/gtest.h>

#include "fill/assemble.hpp"
#include "geometry/mesh.hpp"
#include "validation/test_models.hpp"

namespace wirefield::fill {
namespace {

Model JunctionModel(GroundKind ground) {
  // A T of three wires joined at one point, and a separate slanted wire: junction bases have
  // pieces on segments far apart in the segment order.
  Model m;
  m.file = "junction";
  m.wires.push_back(testing::Wire("left", {-0.25, 0.0, 0.3}, {0.0, 0.0, 0.3}, 1e-3, 9));
  m.wires.push_back(testing::Wire("right", {0.0, 0.0, 0.3}, {0.25, 0.0, 0.3}, 1e-3, 8));
  m.wires.push_back(testing::Wire("drop", {0.0, 0.0, 0.3}, {0.0, 0.0, 0.05}, 1e-3, 7));
  m.feeds.push_back(testing::Feed("f", "left", PointKind::kPercent, 50.0));
  m.wires.push_back(testing::Wire("slant", {0.4, 0.3, 0.1}, {0.1, 0.6, 0.5}, 1e-3, 9));
  m.wires.push_back(testing::Wire("arm", {0.0, 0.0, 0.05}, {0.2, 0.1, 0.05}, 1e-3, 5));
  m.ground.kind = ground;
  m.ground.permittivity = 13.0;
  m.ground.conductivity_s_per_m = 5e-3;
  return m;
}

TEST(ParallelFill, AnyThreadCountGivesTheSingleThreadMatrix) {
  for (const GroundKind g : {GroundKind::kFree, GroundKind::kPerfect, GroundKind::kReal}) {
    geometry::MeshOptions o;
    o.max_frequency_hz = testing::kUnitWavelengthHz;
    const geometry::Mesh mesh = geometry::BuildMesh(JunctionModel(g), o);
    const NearFieldCache cache = BuildNearFieldCache(mesh);
    const Eigen::MatrixXcd plain = AssembleImpedance(mesh, testing::kUnitWavelengthHz, cache, 1);
    for (const int threads : {2, 3, 7, 64}) {
      const Eigen::MatrixXcd z =
          AssembleImpedance(mesh, testing::kUnitWavelengthHz, cache, threads);
      // Bit-identical: the fill's blocks, and so the order of every sum, are the same for
      // every thread count (fill/assemble.cpp), so outputs do not depend on --threads.
      EXPECT_TRUE((z.array() == plain.array()).all()) << threads << " threads";
    }
  }
}

}  // namespace
}  // namespace wirefield::fill
