// Validation: wires that start or end on a point of an earlier wire (WIRE@POS as a corner)
// against laws that need no new physics: identity (a wire end written as rad@end is the same
// model as its coordinates, bit for bit; a T-junction in the middle of one wire is the same
// antenna as that wire cut in two there, with three ends joined), Kirchhoff's current law at
// the junction, and mirror symmetry (a T fed on its stem splits its current equally).
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <string>

#include "validation/test_models.hpp"

namespace wirefield {
namespace {

using testing::kUnitWavelengthHz;
using testing::SolveFeedImpedance;
using testing::SolveModel;

Model Parse(const std::string& text) { return ParseModelText(text, "tap.wire"); }

const std::string kFrequency = "frequency 299.792458MHz\n";  // a wavelength of 1 m

TEST(WireTapIdentity, EndWrittenAsWirePointIsBitForBitTheCoordinates) {
  // Identity: rad@end and rad@start are the coordinates of rad's ends, so the two models are
  // one model: every result equal bit for bit. A campsite mast's top wire with a drop to the
  // ground and a counterpoise, over a perfect ground at 7.1 MHz.
  const std::string tail = "feed src at drop@end\nground perfect\nfrequency 7.1MHz\n";
  const testing::Solved written =
      SolveModel(Parse("wire rad from (0, 0, 8) to (20, 0, 8) radius 1mm\n"
                       "wire drop from (20, 0, 8) to (20, 0, 0) radius 1mm\n"
                       "wire cp from (0, 0, 8) to (-5, 0, 1) radius 1mm\n" +
                       tail),
                 7.1e6);
  const testing::Solved tapped =
      SolveModel(Parse("wire rad from (0, 0, 8) to (20, 0, 8) radius 1mm\n"
                       "wire drop from rad@end to (20, 0, 0) radius 1mm\n"
                       "wire cp from rad@start to (-5, 0, 1) radius 1mm\n" +
                       tail),
                 7.1e6);
  EXPECT_EQ(tapped.result.feeds.at(0).impedance_ohm, written.result.feeds.at(0).impedance_ohm);
  ASSERT_EQ(tapped.result.currents.size(), written.result.currents.size());
  for (size_t s = 0; s < written.result.currents.size(); ++s) {
    EXPECT_EQ(tapped.result.currents[s].current_a, written.result.currents[s].current_a) << s;
  }
}

// The T of the tests below: a 0.5-wavelength top along x at z = 0 and a 0.25-wavelength stem
// down from its middle, fed at the stem's middle. All nodes are binary fractions of a metre,
// so the two ways of writing it have the same segments bit for bit.
const std::string kTapped =
    "wire top from (-0.25, 0, 0) to (0.25, 0, 0) radius 1mm segments 32\n"
    "wire stem from top@50% to (0, 0, -0.25) radius 1mm segments 16\n"
    "feed src at stem@50%\n" +
    kFrequency;

TEST(WireTapIdentity, TJunctionEqualsTheWireCutInTwo) {
  // Identity: the top cut at its middle into two wires joined with the stem (three ends at one
  // joint) is the same antenna, on the same segments. Tolerance 1e-9 relative: the bases come
  // in another order and combination, so the LU rounds differently, far below this.
  const Complex cut =
      SolveFeedImpedance(Parse("wire left from (-0.25, 0, 0) to (0, 0, 0) radius 1mm segments 16\n"
                               "wire right from (0, 0, 0) to (0.25, 0, 0) radius 1mm segments 16\n"
                               "wire stem from (0, 0, 0) to (0, 0, -0.25) radius 1mm segments 16\n"
                               "feed src at stem@50%\n" +
                               kFrequency));
  const Complex tapped = SolveFeedImpedance(Parse(kTapped));
  EXPECT_LT(std::abs(tapped - cut), 1e-9 * std::abs(cut)) << tapped << " vs " << cut;
}

// The current of the segment of `wire` that starts (at_start) or ends at point p, positive
// along the segment.
Complex CurrentAt(const SolveResult& r, int wire, const Point& p, bool at_start) {
  for (const SegmentCurrent& c : r.currents) {
    if (c.wire != wire) continue;
    if (at_start && c.start_m == p) return c.current_start_a;
    if (!at_start && c.end_m == p) return c.current_end_a;
  }
  ADD_FAILURE() << "no segment of wire " << wire << " at the junction";
  return {};
}

TEST(WireTapJunction, KirchhoffsCurrentLawAndMirrorSymmetry) {
  const testing::Solved t = SolveModel(Parse(kTapped));
  const Point junction{0.0, 0.0, 0.0};
  const Complex into_from_left = CurrentAt(t.result, 0, junction, false);
  const Complex out_to_right = CurrentAt(t.result, 0, junction, true);
  const Complex out_to_stem = CurrentAt(t.result, 1, junction, true);
  const double scale = std::abs(t.result.feeds.at(0).current_a);
  // The stem carries current into the top: well above zero (a free end carries none).
  EXPECT_GT(std::abs(out_to_stem), 0.1 * scale);
  // Kirchhoff's current law (Kirchhoff 1845): what flows in flows out. The triangle bases
  // through the joint conserve it by construction; 1e-12 relative is rounding.
  EXPECT_LT(std::abs(into_from_left - out_to_right - out_to_stem), 1e-12 * scale);
  // Mirror symmetry in x = 0: the top's two arms carry equal currents away from the joint,
  // each half of the stem's (1e-6 relative: the LU's rounding of an asymmetric ordering).
  EXPECT_LT(std::abs(out_to_right - (-into_from_left)), 1e-6 * scale);
  EXPECT_LT(std::abs(out_to_right + 0.5 * out_to_stem), 1e-6 * scale);
}

TEST(WireTapJunction, CoordinatesAloneDoNotJoinTheMiddleOfAWire) {
  // The same T written with coordinates: a wire end on the middle of another is not joined
  // (only ends are), so the stem's top is a free end with no current, and the mesher says so.
  const Model written = Parse(
      "wire top from (-0.25, 0, 0) to (0.25, 0, 0) radius 1mm segments 32\n"
      "wire stem from (0, 0, 0) to (0, 0, -0.25) radius 1mm segments 16\n"
      "feed src at stem@50%\n" +
      kFrequency);
  const testing::Solved w = SolveModel(written);
  EXPECT_EQ(CurrentAt(w.result, 1, {0.0, 0.0, 0.0}, true), Complex(0.0, 0.0));
  auto touches = [](const std::vector<Warning>& warnings) {
    return std::any_of(warnings.begin(), warnings.end(), [](const Warning& x) {
      return x.message.find("without a joint") != std::string::npos;
    });
  };
  EXPECT_TRUE(touches(w.sim.warnings()));
  EXPECT_FALSE(touches(SolveModel(Parse(kTapped)).sim.warnings()));
}

TEST(WireTapJunction, FeedAtTheStemsJoinedEnd) {
  // The stem's top is joined to the top wire, so a feed there drives the stem against the top
  // (not refused as a free end); by symmetry the top's arms again carry equal currents.
  const testing::Solved t =
      SolveModel(Parse("wire top from (-0.25, 0, 0) to (0.25, 0, 0) radius 1mm segments 32\n"
                       "wire stem from top@50% to (0, 0, -0.25) radius 1mm segments 16\n"
                       "feed src at stem@start\n" +
                       kFrequency));
  const Point junction{0.0, 0.0, 0.0};
  const Complex feed = t.result.feeds.at(0).current_a;
  EXPECT_GT(std::abs(feed), 0.0);
  EXPECT_LT(
      std::abs(CurrentAt(t.result, 0, junction, true) + CurrentAt(t.result, 0, junction, false)),
      1e-6 * std::abs(feed));
}

}  // namespace
}  // namespace wirefield
