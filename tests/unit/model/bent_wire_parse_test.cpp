// Tests of the model stage's bent wires and field-deployment shapes (libmom/src/model/
// parser.cpp, wire_path.cpp, shapes.cpp): `wire NAME through ...` and `shape NAME KIND ...`
// resolved to corners in metres, `let`/--set/units in their numbers, and the exact text and
// FILE:LINE:COLUMN of every input error they give. Expected corners come from Pythagoras'
// theorem (a leg of length l dropping h reaches sqrt(l^2 - h^2) away; elementary geometry).
#include <gtest/gtest.h>

#include <cmath>
#include <string>

#include "unit/error_text.hpp"
#include "wirefield/model.hpp"

namespace wirefield {
namespace {

Model Parse(const std::string& text, const std::vector<Override>& overrides = {}) {
  return ParseModelText(text, "kit.wire", overrides);
}

std::string ErrorOf(const std::string& text) {
  return testing::ErrorText([&] { Parse(text); });
}

// Corners from a square root and a few products: 1e-12 m leaves room for the roundings
// (1e-16 relative each) and is far below any wrong formula (millimetres at least).
constexpr double kCornerTolerance_m = 1e-12;

void ExpectPoint(const Point& got, const Point& want) {
  for (size_t i = 0; i < 3; ++i) EXPECT_NEAR(got[i], want[i], kCornerTolerance_m) << "axis " << i;
}

const std::string kFeed = "feed src at kit@50%\n";

TEST(ParseBentWire, ThroughStoresEveryCornerInOrder) {
  const Model m = Parse(
      "wire kit through (0, 0, 1), (0, 0, 6), (14, 0, 6) radius 1mm segments 20 material "
      "copper\n" +
      kFeed);
  const WireSpec& w = m.wires.at(0);
  ExpectPoint(w.from_m, {0, 0, 1});
  ASSERT_EQ(w.bends_m.size(), 1u);
  ExpectPoint(w.bends_m[0], {0, 0, 6});
  ExpectPoint(w.to_m, {14, 0, 6});
  EXPECT_DOUBLE_EQ(WireLength(w), 5.0 + 14.0);  // the legs add up
  EXPECT_EQ(w.segments, 20);
  EXPECT_EQ(w.material, "copper");
  EXPECT_DOUBLE_EQ(w.radius_m, 1e-3);
}

TEST(ParseBentWire, TwoPointsMakeAStraightWire) {
  const Model m = Parse("wire kit through (0, 0, 1), (0, 0, 6) radius 1mm\n" + kFeed);
  EXPECT_TRUE(m.wires.at(0).bends_m.empty());
  EXPECT_DOUBLE_EQ(WireLength(m.wires.at(0)), 5.0);
}

TEST(ParseBentWire, CornersTakeUnitsAndVariables) {
  const Model m =
      Parse("units ft\nlet h = 20\nwire kit through (0, 0, 0), (0, 0, h), (h, 0, h) radius 0.01\n" +
            kFeed);
  ExpectPoint(m.wires.at(0).bends_m.at(0), {0, 0, 20 * 0.3048});  // 1 ft = 0.3048 m exactly
  ExpectPoint(m.wires.at(0).to_m, {20 * 0.3048, 0, 20 * 0.3048});
}

TEST(ParseBentWire, PositionsAreMeasuredAlongTheWholeWire) {
  // 5 m up and 14 m along: 17 m lies on the second leg, 20 m beyond the end (19 m).
  const std::string wire = "wire kit through (0, 0, 1), (0, 0, 6), (14, 0, 6) radius 1mm\n";
  const Model m = Parse(wire + "feed src at kit@17m\n");
  EXPECT_EQ(m.feeds.at(0).at.kind, PointKind::kDistance);
  EXPECT_DOUBLE_EQ(m.feeds.at(0).at.value, 17.0);
  EXPECT_EQ(ErrorOf(wire + "feed src at kit@20m\n"),
            "kit.wire:2:17: error: feed 'src': position 20 m is beyond the end of wire 'kit' "
            "(its length is 19 m); use a position from 0 to 19 m, or a percent");
}

TEST(ParseBentWireError, OnePointIsNotAWire) {
  EXPECT_EQ(ErrorOf("wire kit through (0, 0, 1) radius 1mm\n" + kFeed),
            "kit.wire:1:28: error: wire 'kit': expected ', (X, Y, Z)' and a second point (a "
            "wire through points needs at least two); got 'radius'");
  EXPECT_EQ(ErrorOf("wire kit through (0, 0, 1) (0, 0, 6) radius 1mm\n" + kFeed),
            "kit.wire:1:28: error: wire 'kit': expected ', (X, Y, Z)' and a second point (a "
            "wire through points needs at least two); got '('");
  EXPECT_EQ(ErrorOf("wire kit through radius 1mm\n" + kFeed),
            "kit.wire:1:18: error: wire 'kit': expected '(' to open the 1st point (X, Y, Z); "
            "got 'radius'");
}

TEST(ParseBentWireError, ARepeatedPointIsAZeroLengthLegAtThatPoint) {
  EXPECT_EQ(ErrorOf("wire kit through (0, 0, 1), (0, 0, 6), (0, 0, 6) radius 1mm\n" + kFeed),
            "kit.wire:1:40: error: wire 'kit': the 3rd point (0, 0, 6) m is the 2nd point "
            "again, so the leg between them has zero length; remove one of them");
}

TEST(ParseBentWireError, ALegTurningStraightBackIsRefusedAtItsPoint) {
  EXPECT_EQ(ErrorOf("wire kit through (0, 0, 1), (0, 0, 6), (0, 0, 2) radius 1mm\n" + kFeed),
            "kit.wire:1:40: error: wire 'kit': the 3rd point (0, 0, 2) m takes the wire "
            "straight back along the leg before it (a 180-degree bend at the 2nd point), so "
            "the two legs would lie on each other; move the 3rd point, or end the wire at the "
            "2nd point");
  // Going on past the start of the leg is a reversal too; a sharp bend is not.
  EXPECT_NE(ErrorOf("wire kit through (0, 0, 1), (0, 0, 6), (0, 0, -3) radius 1mm\n" + kFeed),
            "no error");
  EXPECT_EQ(ErrorOf("wire kit through (0, 0, 1), (0, 0, 6), (0.5, 0, 1) radius 1mm\n" + kFeed),
            "no error");
}

TEST(ParseBentWireError, TheRadiusIsCheckedAgainstTheWholeLength) {
  EXPECT_EQ(ErrorOf("wire kit through (0, 0, 1), (0, 0, 2), (1, 0, 2) radius 0.5\n" + kFeed),
            "kit.wire:1:57: error: wire 'kit': the radius 0.5 m is not small against the wire "
            "length 2 m; the thin-wire model needs the radius under a tenth of the length (did "
            "you mean radius 0.5mm?)");
}

// ---- shapes ------------------------------------------------------------------------------

TEST(ParseShape, SloperRunsFromItsLowEndUpToTheSupport) {
  // Drop 6 - 1 = 5 m over a 10 m wire: the low end is sqrt(10^2 - 5^2) = 8.660 m out
  // (Pythagoras' theorem), toward +y (90 degrees) from the support at (2, 3).
  const Model m = Parse(
      "shape kit sloper top=6 length=10 low=1 toward=90deg at (2, 3) radius 1mm segments 12\n" +
      kFeed);
  const WireSpec& w = m.wires.at(0);
  EXPECT_EQ(w.name, "kit");
  ExpectPoint(w.from_m, {2, 3 + std::sqrt(75.0), 1});
  ExpectPoint(w.to_m, {2, 3, 6});
  EXPECT_TRUE(w.bends_m.empty());
  EXPECT_NEAR(WireLength(w), 10.0, kCornerTolerance_m);
  EXPECT_EQ(w.segments, 12);
  EXPECT_EQ(w.location.line, 1);
  EXPECT_EQ(w.location.column, 1);
}

TEST(ParseShape, InvertedLGoesUpTheSupportThenLevel) {
  const Model m = Parse("shape kit inverted-l top=6 length=20 radius 1mm\n" + kFeed);
  const WireSpec& w = m.wires.at(0);
  ExpectPoint(w.from_m, {0, 0, 0});  // low= left out: the foot of the support
  ASSERT_EQ(w.bends_m.size(), 1u);
  ExpectPoint(w.bends_m[0], {0, 0, 6});
  ExpectPoint(w.to_m, {14, 0, 6});  // the rest of the 20 m, 20 - 6 = 14 m, runs level
}

TEST(ParseShape, InvertedVHangsTwoEqualLegsFromTheApex) {
  // Legs of 10 m dropping 8 - 2 = 6 m reach sqrt(10^2 - 6^2) = 8 m out each side (Pythagoras'
  // theorem, the 6-8-10 right triangle).
  const Model m = Parse("shape kit inverted-v top=8 length=20 low=2 radius 1mm\n" + kFeed);
  const WireSpec& w = m.wires.at(0);
  ExpectPoint(w.from_m, {-8, 0, 2});
  ASSERT_EQ(w.bends_m.size(), 1u);
  ExpectPoint(w.bends_m[0], {0, 0, 8});
  ExpectPoint(w.to_m, {8, 0, 2});
}

TEST(ParseShape, HorizontalRunsLevelFromTheSupportTop) {
  const Model m = Parse("shape kit horizontal top=5 length=10 toward=180deg radius 1mm\n" + kFeed);
  ExpectPoint(m.wires.at(0).from_m, {0, 0, 5});
  ExpectPoint(m.wires.at(0).to_m, {-10, 0, 5});
}

TEST(ParseShape, NumbersAreExpressionsThatSetCanOverride) {
  const std::string text =
      "let pole = 6m\nlet length = 20.1\n"
      "shape kit inverted-l top=pole length=length low=pole/6 radius 1mm\n" +
      kFeed;
  EXPECT_NEAR(WireLength(Parse(text).wires.at(0)), 20.1, kCornerTolerance_m);
  const Model set = Parse(text, {{"length", "25"}, {"pole", "7m"}});
  EXPECT_NEAR(WireLength(set.wires.at(0)), 25.0, kCornerTolerance_m);
  ExpectPoint(set.wires.at(0).bends_m.at(0), {0, 0, 7});
  ExpectPoint(set.wires.at(0).from_m, {0, 0, 7.0 / 6.0});
}

TEST(ParseShape, AShapeIsAWireForFeedsLoadsAndNames) {
  const Model m = Parse(
      "shape kit inverted-v top=8 length=20 low=2 radius 1mm\nfeed src at kit@50%\n"
      "load coil at kit@25% series L=1uH\n");
  EXPECT_EQ(m.feeds.at(0).at.wire, "kit");
  EXPECT_EQ(m.loads.at(0).at.wire, "kit");
  EXPECT_EQ(ErrorOf("wire kit from (0,0,1) to (0,0,2) radius 1mm\n"
                    "shape kit sloper top=6 length=10 radius 1mm\n" +
                    kFeed),
            "kit.wire:2:7: error: wire 'kit' is already defined at line 1; give each wire its "
            "own name");
}

TEST(ParseShapeError, UnknownKindSuggestsTheNearest) {
  EXPECT_EQ(ErrorOf("shape kit invertedl top=6 length=10 radius 1mm\n" + kFeed),
            "kit.wire:1:11: error: shape 'kit': unknown kind 'invertedl' (did you mean "
            "'inverted-l'?); use sloper, inverted-l, inverted-v or horizontal");
  EXPECT_EQ(ErrorOf("shape kit\n" + kFeed),
            "kit.wire:1:10: error: shape 'kit': missing the kind (sloper, inverted-l, "
            "inverted-v or horizontal)");
}

TEST(ParseShapeError, TopAndLengthAreRequired) {
  EXPECT_EQ(ErrorOf("shape kit sloper length=10 radius 1mm\n" + kFeed),
            "kit.wire:1:38: error: shape 'kit': missing 'top=H' (the height of the support's "
            "top)");
  EXPECT_EQ(ErrorOf("shape kit sloper top=6 radius 1mm\n" + kFeed),
            "kit.wire:1:34: error: shape 'kit': missing 'length=L' (the length of the wire)");
  EXPECT_EQ(ErrorOf("shape kit sloper top=6 length=10\n" + kFeed),
            "kit.wire:1:33: error: shape 'kit': missing 'radius R' (or 'diameter D')");
}

TEST(ParseShapeError, ASloperTooShortToReachTheGroundSaysHowLongItMustBe) {
  EXPECT_EQ(ErrorOf("shape kit sloper top=6 length=5 radius 1mm\n" + kFeed),
            "kit.wire:1:31: error: shape 'kit': a sloper of length=5 m cannot reach from top=6 "
            "m down to low=0 m (a drop of 6 m): give a length of at least 6 m, or raise low=");
}

TEST(ParseShapeError, AnInvertedLWithNothingLeftToRunLevelIsRefused) {
  EXPECT_EQ(ErrorOf("shape kit inverted-l top=6 length=5.5 low=0.5 radius 1mm\n" + kFeed),
            "kit.wire:1:35: error: shape 'kit': an inverted-l of length=5.5 m is used up by the "
            "vertical part from low=0.5 m to top=6 m (5.5 m), leaving nothing to run level: "
            "give a length above 5.5 m, or raise low=");
}

TEST(ParseShapeError, AnInvertedVWithLegsTooShortForTheDropIsRefused) {
  EXPECT_EQ(ErrorOf("shape kit inverted-v top=8 length=12 low=2 radius 1mm\n" + kFeed),
            "kit.wire:1:35: error: shape 'kit': an inverted-v of length=12 m has legs of 6 m, "
            "too short to slope from the apex at top=8 m down to low=2 m (a drop of 6 m) and "
            "away from the support: give a length above 12 m, or raise low=");
}

TEST(ParseShapeError, TheLowEndMustBeBelowTheTopAndAboveTheGround) {
  EXPECT_EQ(ErrorOf("shape kit sloper top=6 length=10 low=6 radius 1mm\n" + kFeed),
            "kit.wire:1:38: error: shape 'kit': low=6 m is not below top=6 m; the low end of a "
            "sloper hangs below the support's top: lower low= or raise top= (for a level wire "
            "use 'horizontal')");
  EXPECT_EQ(ErrorOf("shape kit inverted-v top=6 length=20 low=-1 radius 1mm\n" + kFeed),
            "kit.wire:1:42: error: shape 'kit': low=-1 m is below the ground (z = 0); heights "
            "are measured up from the ground: give low= of 0 m or more");
  EXPECT_EQ(ErrorOf("shape kit inverted-l top=0 length=10 radius 1mm\n" + kFeed),
            "kit.wire:1:26: error: shape 'kit': top=0 m is not above the ground; top is the "
            "height of the support's top above z = 0: give it positive");
  EXPECT_EQ(ErrorOf("shape kit horizontal top=5 length=10 low=1 radius 1mm\n" + kFeed),
            "kit.wire:1:42: error: shape 'kit': a horizontal wire has no low end; remove low= "
            "(the wire runs level at top=5 m)");
}

TEST(ParseShapeError, TowardTakesAnAngleInDegreesWithDeg) {
  EXPECT_EQ(ErrorOf("shape kit sloper top=6 length=10 toward=90 radius 1mm\n" + kFeed),
            "kit.wire:1:41: error: shape 'kit': toward=90 is more than a turn; plain numbers "
            "are radians (as in cos()), so write the azimuth in degrees with deg, as "
            "toward=90deg");
  EXPECT_EQ(ErrorOf("shape kit sloper top=6 length=10 toward=3m radius 1mm\n" + kFeed),
            "kit.wire:1:41: error: shape 'kit': toward needs a plain number (an angle: 90deg); "
            "got a length (m)");
}

TEST(ParseShapeError, NumbersTooLargeForDoublePrecisionAreRefused) {
  // 1e308 m + 1e308 m overflows double precision (about 1.8e308): no corner may become inf.
  // The allowed range of a coordinate or shape size (model/ranges.cpp) stops each at its token.
  EXPECT_EQ(
      ErrorOf("shape kit horizontal top=1 length=1e308 at (1e308, 0) radius 1mm\n" + kFeed),
      "kit.wire:1:35: error: shape 'kit': length must be -100000 m to 100000 m; got 1e+308 m");
  EXPECT_EQ(
      ErrorOf("wire kit through (-1e308, 0, 1), (1e308, 0, 1), (1e308, 1, 1) radius 1mm\n" + kFeed),
      "kit.wire:1:19: error: wire 'kit': the X coordinate must be -100000 m to 100000 m; got "
      "-1e+308 m");
}

TEST(ParseShapeError, ClausesAreCheckedLikeAWiresClauses) {
  EXPECT_EQ(ErrorOf("shape kit sloper top=6 top=7 length=10 radius 1mm\n" + kFeed),
            "kit.wire:1:24: error: shape 'kit': top is given twice");
  EXPECT_EQ(ErrorOf("shape kit sloper height=6 length=10 radius 1mm\n" + kFeed),
            "kit.wire:1:18: error: shape 'kit': unexpected 'height'; after the kind come top=H, "
            "length=L, radius R (or diameter D) and the optional low=HL, toward=AZ, at (X, Y), "
            "'segments N', "
            "'material NAME' or 'conductivity=SIGMA [permeability=MU_R]', and 'insulation PLASTIC "
            "thickness=T'");
  EXPECT_EQ(ErrorOf("shape kit sloper top=6 length=10 at (1, 2, 3) radius 1mm\n" + kFeed),
            "kit.wire:1:42: error: shape 'kit': the at point has more than 2 coordinates; "
            "write (X, Y)");
  EXPECT_EQ(ErrorOf("shape kit horizontal top=5 length=1 radius 0.3\n" + kFeed),
            "kit.wire:1:44: error: shape 'kit': the radius 0.3 m is not small against the wire "
            "length 1 m; the thin-wire model needs the radius under a tenth of the length (did "
            "you mean radius 0.3mm?)");
}

}  // namespace
}  // namespace wirefield
