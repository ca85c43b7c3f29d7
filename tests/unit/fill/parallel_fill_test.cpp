// The parallel fill must give the plain single-threaded matrix, whatever the number of
// threads (the sums are the same; only their grouping across threads differs), on models with
// junctions (rows shared by two threads' blocks) and over each kind of ground.
#include <gtest/gtest.h>

#include "fill/assemble.hpp"
#include "geometry/mesh.hpp"
#include "validation/test_models.hpp"

namespace wirefield::fill {
namespace {

Model JunctionModel(GroundKind ground, int scale = 1) {
  // A T of three wires joined at one point, and a separate slanted wire: junction bases have
  // pieces on segments far apart in the segment order.
  Model m;
  m.file = "junction";
  m.wires.push_back(testing::Wire("left", {-0.25, 0.0, 0.3}, {0.0, 0.0, 0.3}, 1e-3, 9 * scale));
  m.wires.push_back(testing::Wire("right", {0.0, 0.0, 0.3}, {0.25, 0.0, 0.3}, 1e-3, 8 * scale));
  m.wires.push_back(testing::Wire("drop", {0.0, 0.0, 0.3}, {0.0, 0.0, 0.05}, 1e-3, 7 * scale));
  m.feeds.push_back(testing::Feed("f", "left", PointKind::kPercent, 50.0));
  m.wires.push_back(testing::Wire("slant", {0.4, 0.3, 0.1}, {0.1, 0.6, 0.5}, 1e-3, 9 * scale));
  m.wires.push_back(testing::Wire("arm", {0.0, 0.0, 0.05}, {0.2, 0.1, 0.05}, 1e-3, 5 * scale));
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

TEST(ParallelFill, NearFieldCacheIsTheSameForAnyThreadCount) {
  // 190 segments, enough for the cache to use several threads (one per 64 segments at most).
  for (const GroundKind g : {GroundKind::kFree, GroundKind::kReal}) {
    geometry::MeshOptions o;
    o.max_frequency_hz = testing::kUnitWavelengthHz;
    const geometry::Mesh mesh = geometry::BuildMesh(JunctionModel(g, 5), o);
    ASSERT_GE(mesh.segments.size(), 190u);
    const NearFieldCache plain = BuildNearFieldCache(mesh, 1);
    for (const int threads : {2, 3}) {
      const NearFieldCache cache = BuildNearFieldCache(mesh, threads);
      ASSERT_EQ(cache.by_observation.size(), plain.by_observation.size());
      for (size_t i = 0; i < plain.by_observation.size(); ++i) {
        const auto& a = cache.by_observation[i];
        const auto& b = plain.by_observation[i];
        ASSERT_EQ(a.size(), b.size()) << "row " << i;
        for (size_t e = 0; e < a.size(); ++e) {
          // Each row is computed by one thread in the same order: identical to the bit.
          EXPECT_EQ(a[e].source, b[e].source);
          EXPECT_EQ(a[e].image, b[e].image);
          EXPECT_EQ(a[e].statics.m00, b[e].statics.m00);
          EXPECT_EQ(a[e].statics.m11, b[e].statics.m11);
        }
      }
    }
  }
}

}  // namespace
}  // namespace wirefield::fill
