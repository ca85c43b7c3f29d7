// Unit tests of the geometry stage: node placement at feeds and loads, joints and their
// bases, ground connections, automatic segment counts, geometry errors and warnings.
#include "geometry/mesh.hpp"

#include <gtest/gtest.h>

#include <cmath>

#include "unit/error_text.hpp"
#include "validation/test_models.hpp"

namespace wirefield::geometry {
namespace {

using wirefield::testing::Feed;
using wirefield::testing::Wire;

MeshOptions Options(double frequency_hz = 14.2e6) {
  MeshOptions o;
  o.max_frequency_hz = frequency_hz;
  return o;
}

Model OneWire(int segments, PointKind kind, double value) {
  Model m;
  m.file = "t.wire";
  m.wires.push_back(Wire("w", {0, 0, 5}, {10, 0, 5}, 1e-3, segments));
  m.feeds.push_back(Feed("f", "w", kind, value));
  return m;
}

bool HasNodeAtX(const Mesh& mesh, double x) {
  for (const Segment& s : mesh.segments) {
    if (std::abs(s.end.x() - x) < 1e-12) return true;
  }
  return false;
}

TEST(WirePoint, PercentOfLengthLandsOnANode) {
  const Mesh mesh = BuildMesh(OneWire(10, PointKind::kPercent, 37.0), Options());
  EXPECT_TRUE(HasNodeAtX(mesh, 3.7));
  EXPECT_EQ(mesh.wires[0].segments_used, 10);
}

TEST(WirePoint, DistanceAlongTheWireLandsOnANode) {
  const Mesh mesh = BuildMesh(OneWire(7, PointKind::kDistance, 2.345), Options());
  EXPECT_TRUE(HasNodeAtX(mesh, 2.345));
}

TEST(WirePoint, FeedNodeHasOneBasisWithCurrentAlongTheWire) {
  const Mesh mesh = BuildMesh(OneWire(10, PointKind::kPercent, 50.0), Options());
  ASSERT_EQ(mesh.feed_ports.size(), 1u);
  ASSERT_EQ(mesh.feed_ports[0].bases.size(), 1u);
  EXPECT_EQ(mesh.feed_ports[0].bases[0].second, 1.0);
  EXPECT_EQ(mesh.bases.size(), 9u) << "a free wire of n segments has n - 1 bases";
}

TEST(Mesher, ChoosesSegmentsForTheFrequencyWhenTheModelGivesNone) {
  // 10 m at 14.2 MHz is 0.474 wavelength: 80 per wavelength asks for ceil(37.9) = 38.
  const Mesh mesh = BuildMesh(OneWire(0, PointKind::kPercent, 50.0), Options());
  EXPECT_EQ(mesh.wires[0].segments_given, 0);
  EXPECT_EQ(mesh.wires[0].segments_used, 38);
}

TEST(Joint, ThreeWiresMeetingMakeTwoBasesThroughTheFirst) {
  Model m;
  m.file = "t.wire";
  m.wires.push_back(Wire("a", {0, 0, 5}, {1, 0, 5}, 1e-3, 4));
  m.wires.push_back(Wire("b", {1, 0, 5}, {2, 0, 5}, 1e-3, 4));
  m.wires.push_back(Wire("c", {1, 0, 5}, {1, 0, 6}, 1e-3, 4));
  m.feeds.push_back(Feed("f", "a", PointKind::kEnd, 0.0));
  const Mesh mesh = BuildMesh(m, Options());
  EXPECT_EQ(mesh.bases.size(), 3u * 3u + 2u);
  // The feed at a@end passes through both joint bases.
  EXPECT_EQ(mesh.feed_ports[0].bases.size(), 2u);
}

TEST(Ground, WireEndOnPerfectGroundGetsAHalfBasis) {
  // A ground-mounted vertical: its end at z = 0 is a ground connection, legal (a wire lying on
  // the ground or through it is refused; see GeometryError below).
  Model m;
  m.file = "t.wire";
  m.wires.push_back(Wire("mast", {0, 0, 0}, {0, 0, 5}, 1e-3, 5));
  m.feeds.push_back(Feed("base", "mast", PointKind::kStart, 0.0));
  m.ground.kind = GroundKind::kPerfect;
  const Mesh mesh = BuildMesh(m, Options());
  EXPECT_EQ(mesh.bases.size(), 5u);
  EXPECT_TRUE(mesh.ground_images);
  ASSERT_EQ(mesh.feed_ports[0].bases.size(), 1u);
  EXPECT_EQ(mesh.bases[mesh.feed_ports[0].bases[0].first].piece_count, 1);
}

TEST(GeometryError, FeedAtAFreeEndSaysThereIsNothingToConnect) {
  Model m = OneWire(10, PointKind::kEnd, 0.0);
  m.feeds[0].location = {"t.wire", 3, 1};
  m.feeds[0].at.location = {"t.wire", 3, 11};  // the WIRE@POS text is where to change it
  EXPECT_EQ(testing::ErrorText([&] { BuildMesh(m, Options()); }),
            "t.wire:3:11: error: feed 'f' is at the free end of wire 'w', where nothing is "
            "connected: move it inside the wire (for example w@50%) or join another wire "
            "there");
}

TEST(GeometryError, ModelTooLargeForMemoryIsRefusedWithTheFigure) {
  MeshOptions o = Options();
  o.max_matrix_bytes = 1e6;  // 1 MB: 250 unknowns need exactly 1e6 bytes, 300 more
  try {
    BuildMesh(OneWire(300, PointKind::kPercent, 50.0), o);
    FAIL() << "expected an InputError";
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("about 300 unknowns; the matrix would take 0.00 GiB"),
              std::string::npos)
        << e.what();
  }
}

TEST(GeometryError, RadiusThickAgainstTheWavelengthIsRefused) {
  Model m = OneWire(10, PointKind::kPercent, 50.0);
  m.wires[0].radius_m = 0.5;
  EXPECT_THROW(BuildMesh(m, Options(300e6)), InputError);  // k a = 3.1 at 1 m wavelength
}

bool Warns(const Mesh& mesh, const std::string& text) {
  for (const Warning& w : mesh.warnings) {
    if (w.message.find(text) != std::string::npos) return true;
  }
  return false;
}

TEST(GeometryWarning, SegmentsShorterThanFourRadiiAreFlagged) {
  Model m = OneWire(10, PointKind::kPercent, 50.0);
  m.wires[0].radius_m = 0.3;  // 1 m segments, 3.3 radii
  EXPECT_TRUE(Warns(BuildMesh(m, Options(3e6)), "less than 4 radii"));
}

TEST(GeometryWarning, SegmentsLongerThanATenthWavelengthAreFlagged) {
  // 10 m in 3 segments at 14.2 MHz: 3.33 m = 0.158 wavelength.
  EXPECT_TRUE(
      Warns(BuildMesh(OneWire(3, PointKind::kPercent, 50.0), Options()), "wavelength long"));
}

TEST(GeometryWarning, WiresCrossingWithoutAJointAreFlagged) {
  Model m = OneWire(10, PointKind::kPercent, 50.0);
  m.wires.push_back(Wire("x", {5, -1, 5}, {5, 1, 5}, 1e-3, 4));
  EXPECT_TRUE(Warns(BuildMesh(m, Options()), "cross or touch"));
}

// The text of the InputError that meshing the model throws, or "" when it meshes.
std::string MeshError(const Model& m, const MeshOptions& o = Options()) {
  try {
    BuildMesh(m, o);
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

TEST(GeometryError, WireThroughThePerfectGroundIsRefusedAtItsLowestPoint) {
  // Once a warning, after which the solve failed or not depending on the frequency.
  Model m = OneWire(10, PointKind::kPercent, 50.0);
  m.wires[0].to_m = {10, 0, -1};
  m.wires[0].location = {"t.wire", 2, 1};
  m.ground.kind = GroundKind::kPerfect;
  EXPECT_EQ(MeshError(m),
            "t.wire:2:1: error: wire 'w' goes below the perfect ground (z = -1 m): wirefield "
            "models wires in the air above z = 0 only, not wires through the ground plane; raise "
            "the wire above the ground");
}

TEST(GeometryError, WireLyingOnThePerfectGroundIsRefused) {
  // Once a warning, after which the solve failed with a singular matrix.
  Model m = OneWire(10, PointKind::kPercent, 50.0);
  m.wires[0].from_m = {0, 0, 0.0005};
  m.wires[0].to_m = {10, 0, 0.0005};
  m.ground.kind = GroundKind::kPerfect;
  EXPECT_NE(MeshError(m).find("wire 'w' lies on the perfect ground or runs closer to it than its "
                              "radius (0.001 m)"),
            std::string::npos)
      << MeshError(m);
  m.wires[0].from_m = {0, 0, 0};  // both ends on the ground: the wire lies on it
  m.wires[0].to_m = {10, 0, 0};
  EXPECT_NE(MeshError(m).find("lies on the perfect ground"), std::string::npos) << MeshError(m);
}

TEST(GeometryError, CollinearWiresThatOverlapAreRefusedAtTheLaterWire) {
  // Two conductors in one place once solved with only a "cross or touch" warning (a 10 m
  // dipole overlapped 3 m by a 6 m wire: 248.5 + j541.1 ohm, measured before the check).
  Model m = OneWire(10, PointKind::kPercent, 50.0);  // w from (0, 0, 5) to (10, 0, 5)
  m.wires.push_back(Wire("v", {7, 0, 5}, {13, 0, 5}, 1e-3, 6));
  m.wires[1].location = {"t.wire", 3, 1};
  EXPECT_EQ(MeshError(m),
            "t.wire:3:1: error: wires 'w' and 'v' overlap along 3 m, from (7, 0, 5) to (10, 0, 5) "
            "m: two conductors in one place have no thin-wire solution; shorten 'v' so that it "
            "ends where 'w' ends (a joint), or move it apart");
  // Joined at w's end and running back along it: a joint does not make it legal.
  m.wires[1].from_m = {10, 0, 5};
  m.wires[1].to_m = {4, 0, 5};
  EXPECT_NE(MeshError(m).find("overlap along 6 m"), std::string::npos) << MeshError(m);
}

TEST(GeometryError, CollinearWiresThatMeetEndToEndAreLegal) {
  // Two halves of a dipole meeting at their ends: a joint, not an overlap.
  Model m = OneWire(10, PointKind::kPercent, 50.0);
  m.wires.push_back(Wire("v", {10, 0, 5}, {16, 0, 5}, 1e-3, 6));
  EXPECT_EQ(MeshError(m), "");
}

TEST(GeometryError, ABentWireThatFoldsBackOnItselfIsRefused) {
  Model m = OneWire(10, PointKind::kPercent, 50.0);
  m.wires[0].bends_m = {{10, 0, 5}};  // from (0, 0, 5) to (10, 0, 5), then back to (6, 0, 5)
  m.wires[0].to_m = {6, 0, 5};
  EXPECT_NE(MeshError(m).find("wire 'w' folds back onto itself along 4 m"), std::string::npos)
      << MeshError(m);
}

// The 10.2 m dipole of 5 cm radius whose 1000 given segments (0.2 radius each) once solved
// to 2.3e-5 - j0.046 ohm with exit 0 (measured before the check; 51 segments give
// 80.3 + j19.5 ohm).
Model ThickDipole(int segments) {
  Model m;
  m.file = "t.wire";
  m.wires.push_back(Wire("d", {-5.1, 0, 0}, {5.1, 0, 0}, 0.05, segments));
  m.wires[0].location = {"t.wire", 4, 1};
  m.feeds.push_back(Feed("src", "d", PointKind::kPercent, 50.0));
  return m;
}

TEST(GeometryError, GivenSegmentsShorterThanTheRadiusAreRefusedWithTheLargestCountAllowed) {
  EXPECT_EQ(MeshError(ThickDipole(1000)),
            "t.wire:4:1: error: wire 'd': segments as short as 0.0102 m are shorter than its "
            "radius (0.05 m), where the thin-wire kernel fails (measured: 5.6% off at one radius, "
            "67% at half of it; docs/numerics.md); the shortest segment allowed is 0.05 m: give "
            "at most 204 segments, or leave 'segments' out");
  // The count it names meshes: 204 segments of exactly one radius (10.2 m / 204 = 0.05 m).
  EXPECT_EQ(MeshError(ThickDipole(204)), "");
  EXPECT_NE(MeshError(ThickDipole(206)), "");
}

TEST(Mesher, AnAutomaticCountKeepsSegmentsLongerThanTheRadius) {
  // Without 'segments' the same wire meshes: at 59 MHz 80 per wavelength would ask for 161
  // segments of 0.063 m, and the automatic count stops at 4 radii (floor(10.2 / 0.2), which
  // rounds to 50: segments of 0.204 m).
  const Mesh mesh = BuildMesh(ThickDipole(0), Options(59e6));
  EXPECT_EQ(mesh.wires[0].segments_given, 0);
  EXPECT_EQ(mesh.wires[0].segments_used, 50);
  for (const Segment& seg : mesh.segments) EXPECT_GE(seg.length_m(), 4 * 0.05);
}

TEST(GeometryError, FeedsAndLoadsCloserThanTheRadiusAreRefusedWhateverTheCount) {
  // No segment count mends a stretch of 0.01 m between a feed and a load on a 2 cm wire.
  for (const int segments : {0, 40}) {
    Model m = ThickDipole(segments);
    m.wires[0].radius_m = 0.02;
    LoadSpec load;
    load.name = "l";
    load.at = {"d", PointKind::kDistance, 5.11, {}};
    load.resistance_ohm = 10.0;
    m.loads.push_back(load);
    EXPECT_NE(MeshError(m).find("its feeds, loads and bends leave a stretch shorter than that "
                                "whatever the segment count: move them at least 0.02 m apart"),
              std::string::npos)
        << segments << ": " << MeshError(m);
  }
}

TEST(GeometryWarning, CleanModelHasNoWarnings) {
  EXPECT_TRUE(BuildMesh(OneWire(40, PointKind::kPercent, 50.0), Options()).warnings.empty());
}

}  // namespace
}  // namespace wirefield::geometry
