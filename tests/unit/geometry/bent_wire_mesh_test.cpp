// Unit tests of the geometry stage on bent wires and shapes: a node at every bend, one basis
// across each bend, segments shared over the legs by length, WIRE@POS along the whole path,
// the lengths and heights of each shape (Pythagoras' theorem, elementary geometry), and the
// warnings (crossings, short segments, ground clearance) on bent wires.
#include <gtest/gtest.h>

#include <cmath>
#include <string>

#include "geometry/mesh.hpp"

namespace wirefield::geometry {
namespace {

MeshOptions Options(double frequency_hz = 14.2e6) {
  MeshOptions o;
  o.max_frequency_hz = frequency_hz;
  return o;
}

Mesh MeshOf(const std::string& text, double frequency_hz = 14.2e6) {
  return BuildMesh(ParseModelText(text, "kit.wire"), Options(frequency_hz));
}

// Node positions come from one division and one product each: 1e-12 m covers the rounding
// (1e-16 relative of metre-sized numbers) and is far below a misplaced node (centimetres).
constexpr double kNodeTolerance_m = 1e-12;

double TotalLength(const Mesh& mesh) {
  double sum_m = 0.0;
  for (const Segment& s : mesh.segments) sum_m += s.length_m();
  return sum_m;
}

double MaxHeight(const Mesh& mesh) {
  double z = -INFINITY;
  for (const Segment& s : mesh.segments) z = std::max({z, s.start.z(), s.end.z()});
  return z;
}

bool HasNodeAt(const Mesh& mesh, const Vec3& p) {
  for (const Segment& s : mesh.segments) {
    if ((s.end - p).norm() < kNodeTolerance_m) return true;
  }
  return false;
}

bool Warns(const Mesh& mesh, const std::string& text) {
  for (const Warning& w : mesh.warnings) {
    if (w.message.find(text) != std::string::npos) return true;
  }
  return false;
}

// An inverted-L of 5 m up and 15 m along, free ends, fed inside the level part.
const std::string kL =
    "wire kit through (0, 0, 1), (0, 0, 6), (15, 0, 6) radius 1mm segments 8\n"
    "feed src at kit@12m\n";

TEST(BentWireMesh, SegmentsAreSharedOverTheLegsByLength) {
  // 8 segments over 5 m + 15 m: 2 and 6; the feed at 12 m splits the level leg 7 : 8 m.
  const Mesh mesh = MeshOf(kL);
  ASSERT_EQ(mesh.segments.size(), 8u);
  EXPECT_TRUE(HasNodeAt(mesh, Vec3(0, 0, 6)));  // the bend
  EXPECT_TRUE(HasNodeAt(mesh, Vec3(7, 0, 6)));  // the feed, 12 m along the whole wire
  int vertical = 0;
  for (const Segment& s : mesh.segments) vertical += s.start.x() == 0.0 && s.end.x() == 0.0;
  EXPECT_EQ(vertical, 2);
  EXPECT_NEAR(TotalLength(mesh), 20.0, kNodeTolerance_m);
}

TEST(BentWireMesh, EachLegGetsASegmentEvenWhenFewAreGiven) {
  const Mesh mesh = MeshOf(
      "wire kit through (0, 0, 1), (0, 0, 2), (9, 0, 2), (9, 0, 10) radius 1mm segments 2\n"
      "feed src at kit@50%\n");
  EXPECT_EQ(mesh.wires[0].segments_given, 2);
  EXPECT_GE(mesh.wires[0].segments_used, 3);
  EXPECT_TRUE(HasNodeAt(mesh, Vec3(0, 0, 2)));
  EXPECT_TRUE(HasNodeAt(mesh, Vec3(9, 0, 2)));
}

TEST(BentWireMesh, TheCurrentRunsOnThroughEveryBend) {
  // A free wire of n segments has n - 1 bases whether or not it bends: one across each node,
  // the bend included.
  const Mesh mesh = MeshOf(kL);
  EXPECT_EQ(mesh.bases.size(), 7u);
  for (const Basis& b : mesh.bases) EXPECT_EQ(b.piece_count, 2);
}

TEST(BentWireMesh, AFeedAtTheBendSitsInTheOneBasisAcrossIt) {
  const Mesh mesh = MeshOf(
      "wire kit through (0, 0, 1), (0, 0, 6), (15, 0, 6) radius 1mm segments 8\n"
      "feed src at kit@25%\n");  // 25% of 20 m is 5 m: the bend
  ASSERT_EQ(mesh.feed_ports[0].bases.size(), 1u);
  const Basis& b = mesh.bases[mesh.feed_ports[0].bases[0].first];
  ASSERT_EQ(b.piece_count, 2);
  // One piece on the vertical leg, one on the level leg.
  const Segment& s0 = mesh.segments[b.pieces[0].segment];
  const Segment& s1 = mesh.segments[b.pieces[1].segment];
  EXPECT_NEAR((s0.end - Vec3(0, 0, 6)).norm(), 0.0, kNodeTolerance_m);
  EXPECT_NEAR((s1.start - Vec3(0, 0, 6)).norm(), 0.0, kNodeTolerance_m);
}

TEST(BentWireMesh, AutomaticSegmentsFollowTheWholeLength) {
  // 20 m at 14.2 MHz is 0.947 wavelength; 80 per wavelength asks for ceil(75.8) = 76, the
  // same as a straight 20 m wire.
  const Mesh bent =
      MeshOf("wire kit through (0, 0, 1), (0, 0, 6), (15, 0, 6) radius 1mm\nfeed src at kit@50%\n");
  const Mesh straight =
      MeshOf("wire kit from (0, 0, 6) to (20, 0, 6) radius 1mm\nfeed src at kit@50%\n");
  EXPECT_EQ(bent.wires[0].segments_used, 76);
  EXPECT_EQ(straight.wires[0].segments_used, 76);
}

TEST(BentWireMesh, AnEndOnPerfectGroundIsConnectedAsForAStraightWire) {
  const Mesh mesh = MeshOf(
      "wire kit through (0, 0, 0), (0, 0, 6), (15, 0, 6) radius 1mm segments 21\n"
      "feed src at kit@start\nground perfect\n");
  ASSERT_EQ(mesh.feed_ports[0].bases.size(), 1u);
  EXPECT_EQ(mesh.bases[mesh.feed_ports[0].bases[0].first].piece_count, 1);
  EXPECT_TRUE(mesh.warnings.empty()) << ToString(mesh.warnings.front());
}

// ---- shapes: lengths and heights add up (Pythagoras' theorem) -----------------------------

TEST(ShapeMesh, SloperLengthHeightsAndRunAddUp) {
  // top 6 m, low end 1.5 m, 20.1 m of wire: it reaches sqrt(20.1^2 - 4.5^2) from the support.
  const Mesh mesh = MeshOf(
      "shape kit sloper top=6 length=20.1 low=1.5 toward=30deg radius 1mm segments 40\n"
      "feed src at kit@50%\n");
  EXPECT_NEAR(TotalLength(mesh), 20.1, kNodeTolerance_m);
  EXPECT_NEAR(MaxHeight(mesh), 6.0, kNodeTolerance_m);
  const Vec3 low = mesh.segments.front().start;
  EXPECT_NEAR(low.z(), 1.5, kNodeTolerance_m);
  const double run = std::sqrt(20.1 * 20.1 - 4.5 * 4.5);
  EXPECT_NEAR(std::hypot(low.x(), low.y()), run, kNodeTolerance_m);
  EXPECT_NEAR(std::atan2(low.y(), low.x()), 30.0 * M_PI / 180.0, 1e-12);  // toward 30 degrees
  EXPECT_NEAR((mesh.segments.back().end - Vec3(0, 0, 6)).norm(), 0.0, kNodeTolerance_m);
}

TEST(ShapeMesh, InvertedLVerticalPlusLevelIsTheLength) {
  const Mesh mesh = MeshOf(
      "shape kit inverted-l top=6 length=20.1 low=1 at (3, 4) radius 1mm segments 40\n"
      "feed src at kit@50%\n");
  EXPECT_NEAR(TotalLength(mesh), 20.1, kNodeTolerance_m);
  EXPECT_NEAR(MaxHeight(mesh), 6.0, kNodeTolerance_m);
  EXPECT_NEAR((mesh.segments.front().start - Vec3(3, 4, 1)).norm(), 0.0, kNodeTolerance_m);
  EXPECT_TRUE(HasNodeAt(mesh, Vec3(3, 4, 6)));  // the top of the support: the bend
  double level_m = 0.0, vertical_m = 0.0;
  for (const Segment& s : mesh.segments) {
    (s.start.z() == s.end.z() ? level_m : vertical_m) += s.length_m();
  }
  EXPECT_NEAR(vertical_m, 5.0, kNodeTolerance_m);      // top - low
  EXPECT_NEAR(level_m, 20.1 - 5.0, kNodeTolerance_m);  // the rest of the wire
  EXPECT_NEAR((mesh.segments.back().end - Vec3(3 + 15.1, 4, 6)).norm(), 0.0, kNodeTolerance_m);
}

TEST(ShapeMesh, InvertedVLegsAreHalfTheLengthAndMeetAtTheTop) {
  const Mesh mesh = MeshOf(
      "shape kit inverted-v top=9 length=20 low=3 toward=90deg radius 1mm segments 40\n"
      "feed src at kit@50%\n");
  EXPECT_NEAR(TotalLength(mesh), 20.0, kNodeTolerance_m);
  EXPECT_NEAR(MaxHeight(mesh), 9.0, kNodeTolerance_m);
  const Vec3 a = mesh.segments.front().start, b = mesh.segments.back().end;
  EXPECT_NEAR(a.z(), 3.0, kNodeTolerance_m);
  EXPECT_NEAR(b.z(), 3.0, kNodeTolerance_m);
  // Legs of 10 m dropping 6 m reach 8 m out (the 6-8-10 right triangle), along -y and +y.
  EXPECT_NEAR((a - Vec3(0, -8, 3)).norm(), 0.0, kNodeTolerance_m);
  EXPECT_NEAR((b - Vec3(0, 8, 3)).norm(), 0.0, kNodeTolerance_m);
  // The feed at 50% is the apex.
  const Port& port = mesh.feed_ports[0];
  EXPECT_NEAR((mesh.segments[port.segment].end - Vec3(0, 0, 9)).norm(), 0.0, kNodeTolerance_m);
}

TEST(ShapeMesh, HorizontalRunsItsLengthAtTheTop) {
  const Mesh mesh = MeshOf(
      "shape kit horizontal top=7 length=10 toward=-90deg radius 1mm segments 10\n"
      "feed src at kit@50%\n");
  EXPECT_NEAR(TotalLength(mesh), 10.0, kNodeTolerance_m);
  for (const Segment& s : mesh.segments) {
    EXPECT_NEAR(s.start.z(), 7.0, kNodeTolerance_m);
    EXPECT_NEAR(s.end.z(), 7.0, kNodeTolerance_m);
  }
  EXPECT_NEAR((mesh.segments.back().end - Vec3(0, -10, 7)).norm(), 0.0, kNodeTolerance_m);
}

// ---- warnings on bent wires ----------------------------------------------------------------

TEST(BentWireWarning, LegsMeetingAtABendAreNotACrossing) {
  // A sharp bend (legs 5.7 degrees apart) touches only at the bend.
  const Mesh mesh = MeshOf(
      "wire kit through (0, 0, 1), (0, 0, 11), (1, 0, 1) radius 1mm segments 40\n"
      "feed src at kit@50%\n",
      7.1e6);
  EXPECT_FALSE(Warns(mesh, "cross")) << ToString(mesh.warnings.front());
}

TEST(BentWireWarning, AWireFoldedAcrossItselfIsFlagged) {
  // The third leg, (10, 5) to (5, -5), crosses the first (y = 0) at x = 7.5.
  const Mesh mesh = MeshOf(
      "wire kit through (0, 0, 5), (10, 0, 5), (10, 5, 5), (5, -5, 5) radius 1mm segments 60\n"
      "feed src at kit@10%\n");
  EXPECT_TRUE(Warns(mesh, "wire 'kit' crosses or touches itself near (7.5, 0, 5) m"));
}

TEST(BentWireWarning, AnotherWireCrossingAnyLegIsFlagged) {
  const Mesh mesh = MeshOf(
      "wire kit through (0, 0, 1), (0, 0, 6), (15, 0, 6) radius 1mm segments 40\n"
      "wire guy from (10, -1, 6) to (10, 1, 6) radius 1mm segments 4\n"
      "feed src at kit@50%\n");
  EXPECT_TRUE(Warns(mesh, "wires 'kit' and 'guy' cross or touch near (10, 0, 6) m"));
}

TEST(BentWireWarning, AWireJoinedAtOneEndButCrossingFurtherOnIsFlagged) {
  // Joined at (0, 0, 6), the second wire also passes through the level leg at x = 10.
  const Mesh mesh = MeshOf(
      "wire kit through (0, 0, 1), (0, 0, 6), (15, 0, 6) radius 1mm segments 40\n"
      "wire tail through (15, 0, 6), (10, 5, 6), (10, -5, 6) radius 1mm segments 20\n"
      "feed src at kit@50%\n");
  EXPECT_TRUE(Warns(mesh, "wires 'kit' and 'tail' cross or touch near (10, 0, 6) m"));
}

TEST(BentWireWarning, ShortSegmentsOnAShortLegAreFlagged) {
  // A 2 mm leg of a wire of 1 mm radius: its segment is 2 radii long.
  const Mesh mesh = MeshOf(
      "wire kit through (0, 0, 1), (0, 0, 1.002), (10, 0, 1.002) radius 1mm segments 20\n"
      "feed src at kit@50%\n");
  EXPECT_TRUE(Warns(mesh, "less than 4 radii"));
}

TEST(BentWireError, ABendDownToThePerfectGroundIsRefused) {
  // A bend is not a wire end: touching the ground there is a wire on the ground.
  EXPECT_THROW(MeshOf("wire kit through (0, 0, 5), (5, 0, 0), (10, 0, 5) radius 1mm segments 20\n"
                      "feed src at kit@25%\nground perfect\n"),
               InputError);
}

}  // namespace
}  // namespace wirefield::geometry
