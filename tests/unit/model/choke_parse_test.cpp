// Tests of the `choke` load of the model language (libmom/src/model/parse_feeds.cpp): its
// points and its winding resolved to SI values, and the exact text and place of its errors.
#include <gtest/gtest.h>

#include <string>

#include "unit/error_text.hpp"
#include "wirefield/model.hpp"

namespace wirefield {
namespace {

// A campsite end-fed wire and its counterpoise: a choke goes on the counterpoise.
const std::string kWires =
    "wire top from (0, 0, 9) to (19.8, 0, 9) radius 0.8mm\n"
    "wire cp from (0, 0, 9) to (0, 0, 3) radius 2.5mm\n"
    "feed src at top@start\n";

Model Parse(const std::string& text) { return ParseModelText(text, "camp.wire"); }

std::string ErrorOf(const std::string& line) {
  return testing::ErrorText([&] { Parse(kWires + line + "\n"); });
}

TEST(ChokeParse, PointsAreStoredInSiUnitsInOrder) {
  // SI prefixes: M = 1e6, k = 1e3 (SI Brochure, 9th ed., Table 7).
  const Model m =
      Parse(kWires + "load cm at cp@1m choke (3.5MHz, 450ohm, 620ohm), (7MHz, 1.1kohm, -70ohm)\n");
  ASSERT_EQ(m.loads.size(), 1u);
  ASSERT_TRUE(m.loads[0].choke);
  const ChokeSpec& c = *m.loads[0].choke;
  ASSERT_EQ(c.points.size(), 2u);
  EXPECT_DOUBLE_EQ(c.points[0].frequency_hz, 3.5e6);
  EXPECT_DOUBLE_EQ(c.points[0].resistance_ohm, 450.0);
  EXPECT_DOUBLE_EQ(c.points[0].reactance_ohm, 620.0);
  EXPECT_DOUBLE_EQ(c.points[1].resistance_ohm, 1100.0);
  EXPECT_DOUBLE_EQ(c.points[1].reactance_ohm, -70.0);
  EXPECT_FALSE(m.loads[0].coil);
}

TEST(ChokeParse, AWindingTakesTurnsALAndAnOptionalQ) {
  const Model m = Parse(kWires + "load cm at cp@1m choke turns=8 al=1.2uH q=1.5\n");
  const ChokeSpec& c = *m.loads[0].choke;
  EXPECT_TRUE(c.points.empty());
  EXPECT_DOUBLE_EQ(c.turns, 8.0);
  EXPECT_DOUBLE_EQ(c.al_nh, 1200.0);  // 1.2 uH per turn^2 in nH
  ASSERT_TRUE(c.q);
  EXPECT_DOUBLE_EQ(*c.q, 1.5);
  EXPECT_FALSE(Parse(kWires + "load cm at cp@1m choke al=800 turns=3\n").loads[0].choke->q);
}

TEST(ChokeParse, ErrorsSayWhatToChange) {
  EXPECT_EQ(ErrorOf("load cm at cp@1m choke (7MHz, -5ohm, 100ohm)"),
            "camp.wire:4:31: error: load 'cm': a choke point's R must not be negative; got -5 "
            "ohm");
  EXPECT_EQ(ErrorOf("load cm at cp@1m choke (14MHz, 5ohm, 1ohm), (7MHz, 5ohm, 1ohm)"),
            "camp.wire:4:45: error: load 'cm': the choke's points must go up in frequency; "
            "7 MHz follows 14 MHz");
  EXPECT_EQ(ErrorOf("load cm at cp@1m choke (7MHz, 5ohm)"),
            "camp.wire:4:35: error: load 'cm': expected ',' after R (F, R, X); got ')'");
  EXPECT_EQ(ErrorOf("load cm at cp@1m choke turns=8"),
            "camp.wire:4:31: error: load 'cm': missing the choke's (F, R, X) points of its "
            "impedance, such as (7MHz, 1.2kohm, 300ohm), or turns=N al=A_L [q=Q]");
  EXPECT_EQ(ErrorOf("load cm at cp@1m choke turns=8 al=10uF"),
            "camp.wire:4:35: error: load 'cm': al needs A_L in nH/turn^2 (a plain number, or "
            "with nH); got a capacitance (F)");
  EXPECT_EQ(ErrorOf("load cm at cp@1m choke turns=8 al=100 q=0"),
            "camp.wire:4:41: error: load 'cm': q must be positive; got 0");
  EXPECT_EQ(ErrorOf("load cm at cp@1m choke (7MHz, 5ohm, 1ohm) extra"),
            "camp.wire:4:43: error: load 'cm': unexpected 'extra' after the choke's points; "
            "separate points with commas");
}

}  // namespace
}  // namespace wirefield
