// Unit tests of the batch library (wirefield/batch.hpp): varied values read as constants
// (ranges with units, lists, errors at their origin), grounds by name, the grid's size and order,
// checks made before any row, a failing row beside good ones, and results that do not depend
// on the thread count.
#include "wirefield/batch.hpp"

#include <gtest/gtest.h>

#include <optional>
#include <string>
#include <vector>

#include "unit/error_text.hpp"
#include "wirefield/report.hpp"

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

// The grounds of these names (each known).
std::vector<BatchGround> Grounds(const std::vector<std::string>& names) {
  std::vector<BatchGround> grounds;
  for (const std::string& name : names) grounds.push_back(*BatchGroundNamed(name, "grounds"));
  return grounds;
}

BatchOptions SmallOptions() {
  BatchOptions options;
  SweepSpan span;
  span.name = "range";
  span.frequencies_hz = FrequencyPoints(13.5e6, 15.5e6, 5);
  options.spans.push_back(span);
  options.pattern_step_deg = 10.0;
  return options;
}

// --- the varied values and the grounds ----------------------------------------------------

TEST(BatchVariable, RangeAndListReadConstantsOfTheModelLanguage) {
  // 1 cm = 0.01 m (SI Brochure, 9th ed., Table 7); the range's end is included.
  const BatchVariable range = BatchVariableFromRange("h", "150cm", "250cm", "50cm");
  ASSERT_EQ(range.values.size(), 3u);
  EXPECT_DOUBLE_EQ(range.values[0].si, 1.5);
  EXPECT_EQ(range.values[2].si, 2.5);
  EXPECT_EQ(range.values[2].label, "2.5m");
  const BatchVariable list = BatchVariableFromValues("f", {"7.1MHz", "7MHz"});
  EXPECT_EQ(list.shown_unit, "MHz");
  EXPECT_EQ(list.values[0].expression, "7100000Hz");
}

TEST(BatchVariable, ErrorsAreAtTheOriginGivenElseAtTheVariablesField) {
  EXPECT_EQ(testing::ErrorText([] { BatchVariableFromRange("a", "2m", "1m", "0.5m"); }),
            "variables a:1:1: error: the last value (1m) must not be below the first (2m)");
  EXPECT_EQ(testing::ErrorText([] {
              BatchVariableFromValues("a", {"1m", "2MHz"}, "rows a");
            }),
            "rows a:1:1: error: every value must be of one quantity; '2MHz' is a frequency "
            "(Hz), the first is a length (m)");
  EXPECT_EQ(testing::ErrorText([] { BatchVariableFromValues("a", {}); }),
            "variables a:1:1: error: the variable has no values");
}

TEST(BatchGround, NamesArePresetsThenFreeAndPerfect) {
  const std::vector<std::string> names = BatchGroundNames();
  ASSERT_EQ(names.size(), GroundPresets().size() + 2);
  EXPECT_EQ(names.front(), GroundPresets().front().name);
  EXPECT_EQ(names.back(), "perfect");
  const std::optional<BatchGround> perfect = BatchGroundNamed("perfect", "grid");
  ASSERT_TRUE(perfect && perfect->spec);
  EXPECT_EQ(perfect->spec->kind, GroundKind::kPerfect);
  EXPECT_EQ(perfect->spec->location.file, "grid");
  EXPECT_FALSE(BatchGroundNamed("swamp", "grid"));
}

// --- the grid -------------------------------------------------------------------------------

TEST(BatchGrid, IsTheProductWithGroundSlowestAndLastVariableFastest) {
  BatchOptions options = SmallOptions();
  options.grounds = Grounds({"free", "perfect"});
  options.variables.push_back(BatchVariableFromValues("total", {"9.5m", "10.5m"}));
  options.variables.push_back(BatchVariableFromRange("height", "4m", "6m", "1m"));
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
  options.variables.push_back(BatchVariableFromRange("total", "9m", "10m", "0.0002m"));
  options.variables.push_back(BatchVariableFromRange("height", "1m", "2m", "0.0002m"));
  options.variables.push_back(BatchVariableFromRange("spare", "1", "10000", "1"));
  options.allow_large = true;
  const std::string model = std::string(kDipole) + "let spare = 1\n";
  int rows_run = 0;
  const std::string text = testing::ErrorText(
      [&] { RunBatch(model, "dipole.wire", options, [&](int, int) { ++rows_run; }); });
  EXPECT_EQ(rows_run, 0);
  EXPECT_NE(text.find("more than 2147483647, the most one batch runs even with `allow_large`"),
            std::string::npos)
      << text;
}

TEST(BatchRows, RowSinkTakesEveryRowInGridOrderAndKeepsNone) {
  BatchOptions options = SmallOptions();
  options.grounds = Grounds({"free", "perfect"});
  options.variables.push_back(BatchVariableFromValues("total", {"9.5m", "10m", "10.5m"}));
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
  options.variables.push_back(BatchVariableFromValues("lenght", {"9m", "10m"}));
  int rows_run = 0;
  EXPECT_EQ(testing::ErrorText(
                [&] { RunBatch(kDipole, "dipole.wire", options, [&](int, int) { ++rows_run; }); }),
            "variables lenght: error: the model has no variable 'lenght' (its variables: total, "
            "height)");
  EXPECT_EQ(rows_run, 0);
}

TEST(BatchGrid, SetAndVaryOfOneVariableIsRefused) {
  BatchOptions options = SmallOptions();
  options.variables.push_back(BatchVariableFromValues("total", {"9m", "10m"}));
  options.fixed_overrides.push_back(Override{"total", "9m", ""});
  EXPECT_EQ(testing::ErrorText([&] { RunBatch(kDipole, "dipole.wire", options); }),
            "variables total: error: this variable is also given to `fixed_overrides`; drop one of "
            "them");
}

TEST(BatchGrid, LargeGridNeedsConfirmation) {
  BatchOptions options = SmallOptions();
  options.variables.push_back(BatchVariableFromRange("total", "1m", "3001m", "1m"));
  EXPECT_EQ(testing::ErrorText([&] { RunBatch(kDipole, "dipole.wire", options); }),
            "batch: error: the grid has 3001 rows (1 ground x 3001 values of total), more than "
            "2000; each row is a sweep and a pattern. Use fewer grounds or coarser `variables` "
            "steps, or pass `allow_large` to run it anyway");
}

TEST(BatchGrid, ElevationBelowTheHorizonIsRefusedOverAGround) {
  BatchOptions options = SmallOptions();
  options.grounds = Grounds({"perfect"});
  options.elevation_deg = -5.0;
  EXPECT_EQ(testing::ErrorText([&] { RunBatch(kDipole, "dipole.wire", options); }),
            "elevation_deg:1:1: error: elevation_deg must lie between 0 and 90 degrees over a "
            "ground (there is no far field below it); got -5");
}

TEST(BatchRows, AFailingRowKeepsItsReasonAndTheOthersRun) {
  BatchOptions options = SmallOptions();
  options.variables.push_back(BatchVariableFromValues("total", {"10m", "0m", "9m"}));
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
  options.variables.push_back(BatchVariableFromValues("total", {"0m", "0m"}));
  EXPECT_NE(testing::ErrorText([&] {
              RunBatch(kDipole, "dipole.wire", options);
            }).find("wire 'd' has zero length"),
            std::string::npos);
}

TEST(BatchRows, ResultsDoNotDependOnTheThreadCount) {
  BatchOptions options = SmallOptions();
  options.grounds = Grounds({"free", "perfect"});
  options.variables.push_back(BatchVariableFromRange("total", "9.5m", "10.5m", "0.5m"));
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
  options.grounds = Grounds({"perfect"});
  options.variables.push_back(BatchVariableFromValues("height", {"3m", "10m"}));
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
  options.grounds = Grounds({"perfect", "medium_dry"});
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
  options.grounds = Grounds({"medium_dry", "wet_ground"});
  options.fixed_overrides.push_back(Override{"height", "3m", ""});
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
