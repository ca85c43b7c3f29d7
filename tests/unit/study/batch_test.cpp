// Unit tests of the batch library (wirefield/batch.hpp): --vary parsing (ranges with units,
// inclusive ends, lists, the exact error text), --grounds parsing, the grid's size and order,
// checks made before any row, a failing row beside good ones, and results that do not depend
// on the thread count.
#include "wirefield/batch.hpp"

#include <gtest/gtest.h>

#include <string>
#include <vector>

#include "unit/error_text.hpp"

namespace wirefield {
namespace {

// A small centre-fed dipole near 14 MHz (total length `total`, height `height`); few segments
// and few points keep each row to milliseconds.
const char* kDipole =
    "units m\n"
    "let total = 10m\n"
    "let height = 5m\n"
    "wire d from (-total / 2, 0, height) to (total / 2, 0, height) radius 1mm segments 11\n"
    "feed src at d@50%\n"
    "ground free\n";

BatchOptions SmallOptions() {
  BatchOptions options;
  SweepSpan span;
  span.name = "range";
  span.frequencies_hz = FrequencyPoints(13.5e6, 15.5e6, 5);
  options.spans.push_back(span);
  options.pattern_step_deg = 10.0;
  return options;
}

// --- --vary ---------------------------------------------------------------------------------

TEST(BatchVary, RangeWithUnitsIncludesBothEnds) {
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

TEST(BatchVary, RangeInOtherUnitsIsStoredInSi) {
  // 1 cm = 0.01 m, 1 ft = 0.3048 m exactly (international foot, 1959).
  const BatchVariable cm = ParseVary("h=150cm:250cm:50cm");
  ASSERT_EQ(cm.values.size(), 3u);
  EXPECT_DOUBLE_EQ(cm.values[0].si, 1.5);
  EXPECT_DOUBLE_EQ(cm.values[2].si, 2.5);
  const BatchVariable ft = ParseVary("h=10ft,20ft");
  EXPECT_DOUBLE_EQ(ft.values[1].si, 20 * 0.3048);
}

TEST(BatchVary, RangeEndReachedDespiteRounding) {
  // 0.1 is not exact in binary: 1 + 10 * 0.1 must still give the end value 2 (within 1e-9 of
  // a step), so the range has 11 values.
  const BatchVariable v = ParseVary("k=1:2:0.1");
  ASSERT_EQ(v.values.size(), 11u);
  EXPECT_EQ(v.values.back().si, 2.0);
  EXPECT_EQ(v.unit, "");
  EXPECT_EQ(v.values[3].label, "1.3");
}

TEST(BatchVary, RangeStopsAtTheLastStepBelowTheEnd) {
  const BatchVariable v = ParseVary("k=1:2:0.3");  // 1, 1.3, 1.6, 1.9
  ASSERT_EQ(v.values.size(), 4u);
  EXPECT_NEAR(v.values.back().si, 1.9, 1e-12);
}

TEST(BatchVary, ListKeepsOrderAndShowsFrequenciesInMegahertz) {
  const BatchVariable v = ParseVary("f=7.1MHz, 7MHz");
  EXPECT_EQ(v.unit, "Hz");
  EXPECT_EQ(v.shown_unit, "MHz");
  ASSERT_EQ(v.values.size(), 2u);
  EXPECT_EQ(v.values[0].si, 7.1e6);
  EXPECT_EQ(v.values[0].label, "7.1MHz");
  EXPECT_EQ(v.values[0].expression, "7100000Hz");
  EXPECT_EQ(v.values[1].si, 7e6);
}

TEST(BatchVary, ErrorsSayWhatToChange) {
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

TEST(BatchGrounds, AllIsEveryPresetInTheirOrder) {
  const std::vector<BatchGround> all = ParseGroundList("all");
  ASSERT_EQ(all.size(), GroundPresets().size());
  for (size_t i = 0; i < all.size(); ++i) {
    EXPECT_EQ(all[i].name, GroundPresets()[i].name);
    ASSERT_TRUE(all[i].spec);
    EXPECT_EQ(all[i].spec->kind, GroundKind::kReal);
    EXPECT_EQ(all[i].spec->permittivity, GroundPresets()[i].permittivity);
  }
}

TEST(BatchGrounds, ListMixesPresetsFreeAndPerfect) {
  const std::vector<BatchGround> grounds = ParseGroundList("medium_dry, perfect,free");
  ASSERT_EQ(grounds.size(), 3u);
  EXPECT_EQ(grounds[0].name, "medium_dry");
  EXPECT_EQ(grounds[0].spec->kind, GroundKind::kReal);
  EXPECT_EQ(grounds[1].spec->kind, GroundKind::kPerfect);
  EXPECT_EQ(grounds[2].spec->kind, GroundKind::kFree);
}

TEST(BatchGrounds, UnknownNameListsTheChoices) {
  std::string names;
  for (const GroundPreset& p : GroundPresets()) names += p.name + ", ";
  EXPECT_EQ(testing::ErrorText([] { ParseGroundList("swamp"); }),
            "--grounds:1:1: error: unknown ground 'swamp'; use all, or a comma-separated list "
            "of " +
                names + "free, perfect");
  EXPECT_EQ(testing::ErrorText([] { ParseGroundList("free,free"); }),
            "--grounds:1:1: error: ground 'free' is listed twice; list each ground once");
}

// --- the grid -------------------------------------------------------------------------------

TEST(BatchGrid, IsTheProductWithGroundSlowestAndLastVariableFastest) {
  BatchOptions options = SmallOptions();
  options.grounds = ParseGroundList("free,perfect");
  options.variables.push_back(ParseVary("total=9.5m,10.5m"));
  options.variables.push_back(ParseVary("height=4m:6m:1m"));
  EXPECT_EQ(BatchRowCount(options), 2.0 * 2.0 * 3.0);
  const BatchResult result = RunBatch(kDipole, "dipole.wire", options);
  ASSERT_EQ(result.rows.size(), 12u);
  EXPECT_EQ(result.rows_failed, 0);
  for (int i = 0; i < 12; ++i) {
    const BatchRow& row = result.rows[i];
    EXPECT_EQ(row.index, i);
    EXPECT_EQ(row.ground, i < 6 ? "free" : "perfect");
    EXPECT_EQ(row.values[0].si, (i % 6) < 3 ? 9.5 : 10.5) << i;
    EXPECT_EQ(row.values[1].si, 4.0 + i % 3) << i;
  }
}

TEST(BatchGrid, RowsComeFromTheirIndexWithoutStoringTheGrid) {
  // 3 grounds x 10000 x 10000 x 10000 values: 3e12 rows, far more than memory could hold at
  // even one byte a row, so any row must be computed from its index alone.
  const BatchGrid grid(3, {10000, 10000, 10000});
  EXPECT_EQ(grid.rows(), 3e12);
  const size_t last = static_cast<size_t>(3e12) - 1;
  const BatchGrid::Point end = grid.At(last);
  EXPECT_EQ(end.ground, 2u);
  EXPECT_EQ(end.values, (std::vector<size_t>{9999, 9999, 9999}));
  // Row 1e8 + 2: ground 0, then 100000002 = 1*1e8 + 0*1e4 + 2 in the mixed radix.
  const BatchGrid::Point middle = grid.At(100000002);
  EXPECT_EQ(middle.ground, 0u);
  EXPECT_EQ(middle.values, (std::vector<size_t>{1, 0, 2}));
  EXPECT_THROW(grid.At(last + 1), ComputationError);
}

TEST(BatchGrid, GridPastTheHardCapIsRefusedEvenWithYesLarge) {
  BatchOptions options = SmallOptions();
  options.variables.push_back(ParseVary("total=9m:10m:0.0002m"));
  options.variables.push_back(ParseVary("height=1m:2m:0.0002m"));
  options.variables.push_back(ParseVary("spare=1:10000:1"));
  options.allow_large = true;
  const std::string model = std::string(kDipole) + "let spare = 1\n";
  int rows_run = 0;
  const std::string text = testing::ErrorText(
      [&] { RunBatch(model, "dipole.wire", options, [&](int, int) { ++rows_run; }); });
  EXPECT_EQ(rows_run, 0);
  EXPECT_NE(text.find("more than 2147483647, the most one batch runs even with --yes-large"),
            std::string::npos)
      << text;
}

TEST(BatchRows, RowSinkTakesEveryRowInGridOrderAndKeepsNone) {
  BatchOptions options = SmallOptions();
  options.grounds = ParseGroundList("free,perfect");
  options.variables.push_back(ParseVary("total=9.5m,10m,10.5m"));
  options.threads = 3;
  options.mesh_estimate = false;
  const BatchResult kept = RunBatch(kDipole, "dipole.wire", options);
  std::vector<int> order;
  std::string csv;
  options.row_sink = [&](const BatchResult& run, const BatchRow& row) {
    if (order.empty()) csv = FormatBatchCsvHeader(run);
    order.push_back(row.index);
    csv += FormatBatchCsvRow(run, row);
  };
  const BatchResult streamed = RunBatch(kDipole, "dipole.wire", options);
  EXPECT_TRUE(streamed.rows.empty());
  EXPECT_EQ(order, (std::vector<int>{0, 1, 2, 3, 4, 5}));
  EXPECT_EQ(streamed.rows_planned, 6);
  EXPECT_FALSE(streamed.interrupted);
  EXPECT_EQ(csv, FormatBatchCsv(kept));
}

TEST(BatchGrid, WithoutGroundsUsesTheModelsOwn) {
  BatchOptions options = SmallOptions();
  const BatchResult result = RunBatch(kDipole, "dipole.wire", options);
  ASSERT_EQ(result.rows.size(), 1u);
  EXPECT_EQ(result.rows[0].ground, "free");
  EXPECT_EQ(result.grounds, std::vector<std::string>{"free"});
}

TEST(BatchGrid, UnknownVariableIsAnInputErrorBeforeAnyRow) {
  BatchOptions options = SmallOptions();
  options.variables.push_back(ParseVary("lenght=9m,10m"));
  int rows_run = 0;
  EXPECT_EQ(testing::ErrorText(
                [&] { RunBatch(kDipole, "dipole.wire", options, [&](int, int) { ++rows_run; }); }),
            "variables lenght: error: the model has no variable 'lenght' (its variables: total, "
            "height)");
  EXPECT_EQ(rows_run, 0);
}

TEST(BatchGrid, SetAndVaryOfOneVariableIsRefused) {
  BatchOptions options = SmallOptions();
  options.variables.push_back(ParseVary("total=9m,10m"));
  options.fixed_overrides.push_back(ParseOverride("total=9m"));
  EXPECT_EQ(testing::ErrorText([&] { RunBatch(kDipole, "dipole.wire", options); }),
            "variables total: error: this variable is also given to --set; drop one of them");
}

TEST(BatchGrid, LargeGridNeedsConfirmation) {
  BatchOptions options = SmallOptions();
  options.variables.push_back(ParseVary("total=1m:3001m:1m"));
  EXPECT_EQ(testing::ErrorText([&] { RunBatch(kDipole, "dipole.wire", options); }),
            "batch: error: the grid has 3001 rows (1 ground x 3001 values of total), more than "
            "2000; each row is a sweep and a pattern. Use fewer grounds or coarser --vary steps, "
            "or pass --yes-large to run it anyway");
}

TEST(BatchGrid, ElevationBelowTheHorizonIsRefusedOverAGround) {
  BatchOptions options = SmallOptions();
  options.grounds = ParseGroundList("perfect");
  options.elevation_deg = -5.0;
  EXPECT_EQ(testing::ErrorText([&] { RunBatch(kDipole, "dipole.wire", options); }),
            "elevation_deg:1:1: error: elevation_deg must lie between 0 and 90 degrees over a "
            "ground (there is no far field below it); got -5");
}

TEST(BatchRows, AFailingRowKeepsItsReasonAndTheOthersRun) {
  BatchOptions options = SmallOptions();
  options.variables.push_back(ParseVary("total=10m,0m,9m"));
  const BatchResult result = RunBatch(kDipole, "dipole.wire", options);
  ASSERT_EQ(result.rows.size(), 3u);
  EXPECT_EQ(result.rows_failed, 1);
  EXPECT_FALSE(result.rows[0].error);
  EXPECT_FALSE(result.rows[2].error);
  ASSERT_TRUE(result.rows[1].error);
  EXPECT_TRUE(result.rows[1].input_error);
  EXPECT_NE(result.rows[1].error->find("wire 'd' has zero length"), std::string::npos)
      << *result.rows[1].error;
  EXPECT_EQ(result.rows[1].values[0].si, 0.0);
  EXPECT_GT(result.rows[0].max_gain_dbi, 0.0);  // a dipole has gain above isotropic
}

TEST(BatchRows, EveryRowFailingThrowsTheFirstRowsError) {
  BatchOptions options = SmallOptions();
  options.variables.push_back(ParseVary("total=0m,0m"));
  EXPECT_NE(testing::ErrorText([&] {
              RunBatch(kDipole, "dipole.wire", options);
            }).find("wire 'd' has zero length"),
            std::string::npos);
}

TEST(BatchRows, ResultsDoNotDependOnTheThreadCount) {
  BatchOptions options = SmallOptions();
  options.grounds = ParseGroundList("free,perfect");
  options.variables.push_back(ParseVary("total=9.5m:10.5m:0.5m"));
  options.at_hz = {14.2e6};
  options.threads = 1;
  const BatchResult one = RunBatch(kDipole, "dipole.wire", options);
  options.threads = 3;
  const BatchResult three = RunBatch(kDipole, "dipole.wire", options);
  ASSERT_EQ(one.rows.size(), three.rows.size());
  for (size_t i = 0; i < one.rows.size(); ++i) {
    // Each row is solved the same way on any thread: bit-for-bit equal numbers.
    EXPECT_EQ(one.rows[i].ground, three.rows[i].ground);
    EXPECT_EQ(one.rows[i].resonances_hz, three.rows[i].resonances_hz);
    EXPECT_EQ(one.rows[i].min_swr, three.rows[i].min_swr);
    EXPECT_EQ(one.rows[i].swr_at, three.rows[i].swr_at);
    EXPECT_EQ(one.rows[i].max_gain_dbi, three.rows[i].max_gain_dbi);
    EXPECT_EQ(one.rows[i].gain_at_elevation_dbi, three.rows[i].gain_at_elevation_dbi);
    EXPECT_EQ(one.rows[i].efficiency, three.rows[i].efficiency);
  }
  EXPECT_EQ(FormatBatchCsv(one), FormatBatchCsv(three));
}

TEST(BatchSummary, BestRowHasTheHighestLowAngleGain) {
  BatchOptions options = SmallOptions();
  options.grounds = ParseGroundList("perfect");
  options.variables.push_back(ParseVary("height=3m,10m"));
  const BatchResult result = RunBatch(kDipole, "dipole.wire", options);
  const BatchSummary summary = SummarizeBatch(result);
  ASSERT_TRUE(summary.best_row);
  // Image theory (REFERENCES.md section 1): over a perfect ground a horizontal dipole's
  // array factor is 2 sin(kh sin(elevation)), so at 10 deg the higher wire radiates more.
  EXPECT_EQ(*summary.best_row, 1);
  EXPECT_GT(result.rows[1].gain_at_elevation_dbi, result.rows[0].gain_at_elevation_dbi);
}

TEST(BatchRows, LossyGroundTakesPowerThatAPerfectGroundReflects) {
  BatchOptions options = SmallOptions();
  options.grounds = ParseGroundList("perfect,medium_dry");
  const BatchResult result = RunBatch(kDipole, "dipole.wire", options);
  ASSERT_EQ(result.rows.size(), 2u);
  ASSERT_FALSE(result.rows[0].error) << *result.rows[0].error;
  ASSERT_FALSE(result.rows[1].error) << *result.rows[1].error;
  EXPECT_EQ(result.rows[1].ground, "medium_dry");
  // A perfect ground reflects everything (image theory): radiated = input, within the
  // pattern's 2% power-balance check. A finite-conductivity ground reflects |Gamma| < 1
  // (Fresnel coefficients, REFERENCES.md section 2.2), so part of the power heats it.
  constexpr double kBalanceTolerance = 0.02;
  EXPECT_NEAR(result.rows[0].efficiency, 1.0, kBalanceTolerance);
  EXPECT_LT(result.rows[1].efficiency, result.rows[0].efficiency - kBalanceTolerance);
  EXPECT_GT(result.rows[1].efficiency, 0.0);
}

TEST(BatchRows, EachWarningOnceHoweverManyBandsAndGrounds) {
  // A vertical fed against the real ground, run on two spans over two grounds: the mesher
  // warns once per wire that it connects to the ground (an ideal stake), from the sweep's
  // mesh, not again for every band's pattern frequency.
  const char* kGroundedVertical =
      "units m\n"
      "let height = 5m\n"
      "wire v from (0, 0, 0) to (0, 0, height) radius 1mm segments 11\n"
      "feed src at v@start\n"
      "ground perfect\n";
  BatchOptions options = SmallOptions();
  SweepSpan low;
  low.name = "low";
  low.frequencies_hz = FrequencyPoints(6.5e6, 7.5e6, 3);
  options.spans.insert(options.spans.begin(), low);
  options.grounds = ParseGroundList("medium_dry,wet_ground");
  options.fixed_overrides.push_back(Override{"height", "3m"});
  const BatchResult result = RunBatch(kGroundedVertical, "low_vertical.wire", options);
  ASSERT_EQ(result.rows.size(), 2u);
  int connected = 0;
  for (const Warning& w : result.warnings) {
    if (w.message.find("connects to the real ground") != std::string::npos) ++connected;
  }
  EXPECT_EQ(connected, 1) << FormatBatchText(result);
  // Two spans and no fixed pattern frequency: a pattern per band, inside that band.
  for (const BatchRow& row : result.rows) {
    ASSERT_EQ(row.bands.size(), 2u);
    EXPECT_TRUE(row.bands[0].has_pattern);
    EXPECT_LE(row.bands[0].pattern_frequency_hz, 7.5e6);
    EXPECT_GE(row.bands[1].pattern_frequency_hz, 13.5e6);
  }
  EXPECT_TRUE(BatchHasBandPatterns(result));
  // Each band's summary picks its best row by that band's own low-angle gain.
  for (int b = 0; b < 2; ++b) {
    const BatchSummary summary = SummarizeBatch(result, b);
    ASSERT_TRUE(summary.best_row);
    const size_t other = *summary.best_row == 0 ? 1 : 0;
    EXPECT_GE(result.rows[static_cast<size_t>(*summary.best_row)].bands[b].gain_at_elevation_dbi,
              result.rows[other].bands[b].gain_at_elevation_dbi);
  }
}

}  // namespace
}  // namespace wirefield
