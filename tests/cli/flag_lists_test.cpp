// Tests of the program's --vary and --grounds readers (cli/arguments.hpp): ranges with units and
// inclusive ends, lists, the grounds by name, and the exact text of each error at its flag.
#include <gtest/gtest.h>

#include <string>
#include <vector>

#include "arguments.hpp"
#include "unit/error_text.hpp"

namespace wirefield::cli {
namespace {

// --- --vary ----------------------------------------------------------------------------------

TEST(VaryFlag, RangeWithUnitsIncludesBothEnds) {
  const BatchVariable v = ParseVary("length=19.5m:20.5m:0.25m");
  EXPECT_EQ(v.name, "length");
  EXPECT_EQ(v.unit, "m");
  ASSERT_EQ(v.values.size(), 5u);
  const std::vector<double> expected_m{19.5, 19.75, 20.0, 20.25, 20.5};
  for (size_t i = 0; i < expected_m.size(); ++i) {
    EXPECT_DOUBLE_EQ(v.values[i].si, expected_m[i]) << i;
  }
  EXPECT_EQ(v.values.back().si, 20.5);  // the inclusive end exactly, not 20.5 - rounding
  EXPECT_EQ(v.values[1].label, "19.75m");
  EXPECT_EQ(v.values[1].expression, "19.75m");
}

TEST(VaryFlag, RangeInOtherUnitsIsStoredInSi) {
  // 1 cm = 0.01 m, 1 ft = 0.3048 m exactly (international foot, 1959).
  const BatchVariable cm = ParseVary("h=150cm:250cm:50cm");
  ASSERT_EQ(cm.values.size(), 3u);
  EXPECT_DOUBLE_EQ(cm.values[0].si, 1.5);
  EXPECT_DOUBLE_EQ(cm.values[2].si, 2.5);
  const BatchVariable ft = ParseVary("h=10ft,20ft");
  EXPECT_DOUBLE_EQ(ft.values[1].si, 20 * 0.3048);
}

TEST(VaryFlag, RangeEndReachedDespiteRounding) {
  // 0.1 is not exact in binary: 1 + 10 * 0.1 must still give the end value 2 (within 1e-9 of
  // a step), so the range has 11 values.
  const BatchVariable v = ParseVary("k=1:2:0.1");
  ASSERT_EQ(v.values.size(), 11u);
  EXPECT_EQ(v.values.back().si, 2.0);
  EXPECT_EQ(v.unit, "");
  EXPECT_EQ(v.values[3].label, "1.3");
}

TEST(VaryFlag, RangeStopsAtTheLastStepBelowTheEnd) {
  const BatchVariable v = ParseVary("k=1:2:0.3");  // 1, 1.3, 1.6, 1.9
  ASSERT_EQ(v.values.size(), 4u);
  EXPECT_NEAR(v.values.back().si, 1.9, 1e-12);
}

TEST(VaryFlag, ListKeepsOrderAndShowsFrequenciesInMegahertz) {
  const BatchVariable v = ParseVary("f=7.1MHz, 7MHz");
  EXPECT_EQ(v.unit, "Hz");
  EXPECT_EQ(v.shown_unit, "MHz");
  ASSERT_EQ(v.values.size(), 2u);
  EXPECT_EQ(v.values[0].si, 7.1e6);
  EXPECT_EQ(v.values[0].label, "7.1MHz");
  EXPECT_EQ(v.values[0].expression, "7100000Hz");
  EXPECT_EQ(v.values[1].si, 7e6);
}

TEST(VaryFlag, ErrorsSayWhatToChange) {
  EXPECT_EQ(testing::ErrorText([] { ParseVary("length"); }),
            "--vary:1:1: error: expected NAME=A:B:STEP or NAME=V1,V2,... (such as --vary "
            "length=19.5m:20.5m:0.25m); got 'length'");
  EXPECT_EQ(testing::ErrorText([] { ParseVary("2x=1,2"); }),
            "--vary:1:1: error: '2x' is not a variable name (letters, digits and _, not starting "
            "with a digit); write --vary NAME=A:B:STEP");
  EXPECT_EQ(testing::ErrorText([] { ParseVary("a=1m:2m"); }),
            "--vary a:1:1: error: a range needs three parts A:B:STEP (first, last, step, such as "
            "19.5m:20.5m:0.25m); got '1m:2m'");
  EXPECT_EQ(testing::ErrorText([] { ParseVary("a=1m:2MHz:1m"); }),
            "--vary a:1:1: error: A, B and STEP must be of one quantity; got a length (m), a "
            "frequency (Hz) and a length (m)");
  EXPECT_EQ(testing::ErrorText([] { ParseVary("a=1m:2m:0m"); }),
            "--vary a:1:1: error: the step must be positive; got 0m");
  EXPECT_EQ(testing::ErrorText([] { ParseVary("a=2m:1m:0.5m"); }),
            "--vary a:1:1: error: the last value (1m) must not be below the first (2m)");
  // The model language's own message, at the column of the unit.
  EXPECT_EQ(testing::ErrorText([] { ParseVary("a=1m:2m:1nm"); }).substr(0, 57),
            "--vary a:1:2: error: unknown unit 'nm'; did you mean 'm'?");
  EXPECT_EQ(testing::ErrorText([] { ParseVary("a=0:1:0.00001"); }),
            "--vary a:1:1: error: the range gives 100001 values (at most 10000); use a larger "
            "step");
  EXPECT_EQ(testing::ErrorText([] { ParseVary("a=1m,2MHz"); }),
            "--vary a:1:1: error: every value must be of one quantity; '2MHz' is a frequency "
            "(Hz), the first is a length (m)");
  EXPECT_EQ(testing::ErrorText([] { ParseVary("a=1m,"); }),
            "--vary a:1:1: error: a value is empty; write --vary NAME=A:B:STEP or --vary "
            "NAME=V1,V2");
}

// --- --grounds ------------------------------------------------------------------------------

TEST(GroundsFlag, AllIsEveryPresetInTheirOrder) {
  const std::vector<BatchGround> all = ParseGroundList("all");
  ASSERT_EQ(all.size(), GroundPresets().size());
  for (size_t i = 0; i < all.size(); ++i) {
    EXPECT_EQ(all[i].name, GroundPresets()[i].name);
    ASSERT_TRUE(all[i].spec);
    EXPECT_EQ(all[i].spec->kind, GroundKind::kReal);
    EXPECT_EQ(all[i].spec->permittivity, GroundPresets()[i].permittivity);
  }
}

TEST(GroundsFlag, ListMixesPresetsFreeAndPerfect) {
  const std::vector<BatchGround> grounds = ParseGroundList("medium_dry, perfect,free");
  ASSERT_EQ(grounds.size(), 3u);
  EXPECT_EQ(grounds[0].name, "medium_dry");
  EXPECT_EQ(grounds[0].spec->kind, GroundKind::kReal);
  EXPECT_EQ(grounds[1].spec->kind, GroundKind::kPerfect);
  EXPECT_EQ(grounds[2].spec->kind, GroundKind::kFree);
}

TEST(GroundsFlag, UnknownNameListsTheChoices) {
  std::string names;
  for (const GroundPreset& p : GroundPresets()) names += p.name + ", ";
  EXPECT_EQ(testing::ErrorText([] { ParseGroundList("swamp"); }),
            "--grounds:1:1: error: unknown ground 'swamp'; use all, or a comma-separated list "
            "of " +
                names + "free, perfect");
  EXPECT_EQ(testing::ErrorText([] { ParseGroundList("free,free"); }),
            "--grounds:1:1: error: ground 'free' is listed twice; list each ground once");
}

}  // namespace
}  // namespace wirefield::cli
