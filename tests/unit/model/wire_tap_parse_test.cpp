// Tests of a point on a wire used as a corner (libmom/src/model/parse_wires.cpp, wire_path.cpp):
// `from WIRE@POS`, `to WIRE@POS` and WIRE@POS among `through` points resolve to the point on the
// earlier wire's path, are recorded as taps for the mesher, and give the input errors of
// WIRE@POS at FILE:LINE:COLUMN. Expected points come from the coordinates as written and
// elementary geometry (a point a fraction t along a leg from a to b is a + t (b - a)).
#include <gtest/gtest.h>

#include <string>

#include "unit/error_text.hpp"
#include "wirefield/model.hpp"

namespace wirefield {
namespace {

// Parses the model with a feed on its first wire, which is named rad or kit.
Model Parse(const std::string& text) {
  const std::string first = text.substr(5, 3);
  return ParseModelText(text + "feed src at " + first + "@50%\n", "kit.wire");
}

std::string ErrorOf(const std::string& text) {
  return testing::ErrorText([&] { Parse(text); });
}

const std::string kRad = "wire rad from (0, 0, 8) to (20, 0, 8) radius 1mm\n";

TEST(WireTap, EndsAreTheExactCoordinates) {
  const Model m = Parse(kRad +
                        "wire tail from rad@end to (20, 0, 0.5) radius 1mm\n"
                        "wire cp from rad@start to (-5, 0, 1) radius 1mm\n");
  const WireSpec& tail = m.wires.at(1);
  EXPECT_EQ(tail.from_m, m.wires.at(0).to_m);  // bit for bit
  EXPECT_EQ(m.wires.at(2).from_m, m.wires.at(0).from_m);
  ASSERT_EQ(tail.taps.size(), 1u);
  EXPECT_EQ(tail.taps[0].corner, 0u);
  EXPECT_EQ(tail.taps[0].on.wire, "rad");
  EXPECT_EQ(tail.taps[0].on.kind, PointKind::kEnd);
  EXPECT_EQ(tail.taps[0].on.location.line, 2);
  EXPECT_EQ(tail.taps[0].on.location.column, 16);
}

TEST(WireTap, PercentAndDistanceAlongABentWire) {
  // A bent wire up 6 m and along 14 m (20 m in all): 60% is 12 m from its start, 6 m along the
  // top leg, at (6, 0, 6); 2.5 m is on the first leg, at (0, 0, 2.5).
  const Model m = Parse(
      "wire kit through (0, 0, 0), (0, 0, 6), (14, 0, 6) radius 1mm\n"
      "wire a from kit@60% to (6, 5, 6) radius 1mm\n"
      "wire b from (3, 0, 2.5) to kit@2.5m radius 1mm\n"
      "wire c from kit@6m to (0, 4, 6) radius 1mm\n");
  const Point a = m.wires.at(1).from_m;
  EXPECT_NEAR(a[0], 6.0, 1e-12);
  EXPECT_NEAR(a[1], 0.0, 1e-12);
  EXPECT_NEAR(a[2], 6.0, 1e-12);
  const Point b = m.wires.at(2).to_m;
  EXPECT_EQ(b, (Point{0.0, 0.0, 2.5}));
  EXPECT_EQ(m.wires.at(2).taps.at(0).corner, 1u);
  EXPECT_EQ(m.wires.at(3).from_m, m.wires.at(0).bends_m.at(0));  // the corner, exactly
}

TEST(WireTap, ThroughPointsMayBeWirePoints) {
  const Model m =
      Parse(kRad + "wire loop through rad@25%, (5, 0, 4), (15, 0, 4), rad@75% radius 1mm\n");
  const WireSpec& loop = m.wires.at(1);
  EXPECT_EQ(loop.from_m, (Point{5.0, 0.0, 8.0}));
  EXPECT_EQ(loop.to_m, (Point{15.0, 0.0, 8.0}));
  ASSERT_EQ(loop.taps.size(), 2u);
  EXPECT_EQ(loop.taps[0].corner, 0u);
  EXPECT_EQ(loop.taps[1].corner, 3u);
  EXPECT_EQ(loop.taps[1].on.kind, PointKind::kPercent);
  EXPECT_DOUBLE_EQ(loop.taps[1].on.value, 75.0);
}

TEST(WireTap, CoordinatesRecordNoTap) { EXPECT_TRUE(Parse(kRad).wires.at(0).taps.empty()); }

TEST(WireTapError, UnknownWireSuggestsTheNearest) {
  EXPECT_EQ(ErrorOf(kRad + "wire tail from rab@end to (20, 0, 0) radius 1mm\n"),
            "kit.wire:2:16: error: wire 'tail': unknown wire 'rab' (did you mean 'rad'?); a wire "
            "must be defined on an earlier line");
  EXPECT_EQ(ErrorOf("wire tail from rad@end to (20, 0, 0) radius 1mm\n"),
            "kit.wire:1:16: error: wire 'tail': unknown wire 'rad'; no wire is defined above "
            "this line");
}

TEST(WireTapError, WireCannotStartOnItself) {
  EXPECT_EQ(ErrorOf("wire tail from (0, 0, 1) to tail@start radius 1mm\n"),
            "kit.wire:1:29: error: wire 'tail': unknown wire 'tail'; no wire is defined above "
            "this line");
}

TEST(WireTapError, PositionOffTheWire) {
  EXPECT_EQ(ErrorOf(kRad + "wire tail from rad@25m to (20, 0, 0) radius 1mm\n"),
            "kit.wire:2:20: error: wire 'tail': position 25 m is beyond the end of wire 'rad' "
            "(its length is 20 m); use a position from 0 to 20 m, or a percent");
  EXPECT_EQ(ErrorOf(kRad + "wire tail from (0, 0, 1) to rad@120% radius 1mm\n"),
            "kit.wire:2:33: error: wire 'tail': position 120% is outside 0% to 100% of wire "
            "'rad'");
  EXPECT_EQ(ErrorOf(kRad + "wire tail from rad to (20, 0, 0) radius 1mm\n"),
            "kit.wire:2:16: error: wire 'tail': expected '(' to open the from point (X, Y, Z); "
            "got 'rad'");
}

TEST(WireTapError, ZeroLengthFromTwoPoints) {
  EXPECT_EQ(ErrorOf(kRad + "wire tail from rad@end to (20, 0, 8) radius 1mm\n"),
            "kit.wire:2:6: error: wire 'tail' has zero length: both ends are at (20, 0, 8) m; "
            "move one end");
}

}  // namespace
}  // namespace wirefield
