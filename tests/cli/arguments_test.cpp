// Tests of the program's flag readers (cli/arguments.hpp): quantities read through the
// library and reported at the flag with its exact text, the power and the emission flags, and
// the library's option checks said about the flags that set their fields.
#include "arguments.hpp"

#include <gtest/gtest.h>

#include <string>
#include <vector>

#include "unit/error_text.hpp"

namespace wirefield::cli {
namespace {

TEST(FrequencyArgument, AcceptsUnitsAndBareHertz) {
  // SI prefixes: M = 1e6, k = 1e3 (SI Brochure, 9th ed., Table 7).
  EXPECT_DOUBLE_EQ(ParseFrequencyArgument("14.2MHz", "--freq"), 14.2e6);
  EXPECT_DOUBLE_EQ(ParseFrequencyArgument("14.2 MHz", "--freq"), 14.2e6);
  EXPECT_DOUBLE_EQ(ParseFrequencyArgument("14200000", "--freq"), 14.2e6);
  EXPECT_DOUBLE_EQ(ParseResistanceArgument("1.2kohm", "--z0"), 1200.0);
  EXPECT_DOUBLE_EQ(ParseResistanceArgument("50", "--z0"), 50.0);
}

TEST(FrequencyArgument, WrongQuantityOrSignIsAnInputErrorNamingTheFlag) {
  EXPECT_EQ(testing::ErrorText([] { ParseFrequencyArgument("10m", "--freq"); }),
            "--freq:1:1: error: --freq needs a frequency (Hz, kHz, MHz, GHz); got a length (m)");
  EXPECT_EQ(testing::ErrorText([] { ParseFrequencyArgument("-7MHz", "--freq"); }),
            "--freq:1:1: error: --freq must be positive; got -7e+06 Hz");
  EXPECT_EQ(testing::ErrorText([] { ParseFrequencyArgument("", "--freq"); }),
            "--freq: error: --freq needs a value such as 14.2MHz");
  EXPECT_EQ(testing::ErrorText([] { ParseResistanceArgument("0", "--z0"); }),
            "--z0:1:1: error: --z0 must be positive; got 0 ohm");
  EXPECT_EQ(testing::ErrorText([] { ParseFrequencyArgument("14 MHz x", "--freq"); }),
            "--freq:1:8: error: unexpected 'x' after the value");
}

TEST(VariableArgument, TakesTheVariablesQuantityAndNamesTheFlagOtherwise) {
  const Model m = ParseModelText(
      "let total = 10.05m\n"
      "wire dip from (-total / 2, 0, 10) to (total / 2, 0, 10) radius 1mm\n"
      "feed src at dip@50%\n",
      "kit.wire");
  ASSERT_EQ(m.variable_specs.size(), 1u);
  // c = 1e-2 (SI Brochure, 9th ed., Table 7).
  EXPECT_DOUBLE_EQ(ParseVariableArgument("950cm", "--min", m.variable_specs[0]), 9.5);
  EXPECT_EQ(testing::ErrorText([&] { ParseVariableArgument("9uH", "--min", m.variable_specs[0]); }),
            "--min:1:1: error: --min needs a length (m) like 'total'; got an inductance (H)");
}

TEST(PowerArgument, UnitsAndErrors) {
  // m = 1e-3, k = 1e3 (SI Brochure, 9th ed., Table 7).
  EXPECT_DOUBLE_EQ(ParsePowerArgument("100W", "--power"), 100.0);
  EXPECT_DOUBLE_EQ(ParsePowerArgument("500 mW", "--power"), 0.5);
  EXPECT_DOUBLE_EQ(ParsePowerArgument("1.5kW", "--power"), 1500.0);
  EXPECT_EQ(testing::ErrorText([] { ParsePowerArgument("100", "--power"); }),
            "--power:1:1: error: --power needs a unit: W, mW or kW (e.g. 100W); got '100'");
  EXPECT_EQ(testing::ErrorText([] { ParsePowerArgument("-5W", "--power"); }),
            "--power:1:1: error: --power must be positive; got '-5W'");
}

TEST(PowerArgument, TheLibrarysRangeIsSaidAboutTheFlag) {
  // The range of a transmitter power is the library's (docs/model-language.md "Allowed
  // ranges": 1 nW to 10 MW); the program says it about --power.
  EXPECT_EQ(testing::ErrorText([] { ParsePowerArgument("20000kW", "--power"); }),
            "--power:1:1: error: --power must be 1e-09 W to 1e+07 W; got 2e+07 W");
}

TEST(TransmitModeArgument, KnowsTheFiveEmissionsAndNamesTheFlagOtherwise) {
  EXPECT_EQ(ParseTransmitMode("ssb", "--mode"), TransmitMode::kSsb);
  EXPECT_EQ(ParseTransmitMode("carrier", "--mode"), TransmitMode::kCarrier);
  EXPECT_EQ(testing::ErrorText([] { ParseTransmitMode("am", "--mode"); }),
            "--mode:1:1: error: --mode must be one of ssb, cw, fm, digital, carrier; got 'am'");
}

TEST(TuneArguments, GoalAndKindReadTheirOwnSpellingsOnly) {
  EXPECT_EQ(ParseTuneGoal("min-swr"), TuneGoal::kMinSwr);
  EXPECT_EQ(ParseTuneGoal("resonance"), TuneGoal::kResonance);
  EXPECT_FALSE(ParseTuneGoal("swr").has_value());
  EXPECT_EQ(ParseResonanceKind("parallel"), ResonanceKind::kParallel);
  EXPECT_FALSE(ParseResonanceKind("Parallel").has_value());
}

TEST(SetFlag, SplitsNameAndValueAtTheFirstEqualsAndNamesTheFlagAsOrigin) {
  const std::vector<Override> o = ParseOverrides({"L=10.2m", " ratio =a=b"});
  ASSERT_EQ(o.size(), 2u);
  EXPECT_EQ(o[0].name, "L");
  EXPECT_EQ(o[0].expression, "10.2m");
  EXPECT_EQ(o[0].origin, "--set L");
  EXPECT_EQ(o[1].name, "ratio");
  EXPECT_EQ(o[1].expression, "a=b");
}

TEST(SetFlag, ErrorsSayWhatToWrite) {
  EXPECT_EQ(testing::ErrorText([] { ParseOverrides({"height"}); }),
            "--set: error: expected NAME=VALUE (such as --set height=10m); got 'height'");
  EXPECT_EQ(testing::ErrorText([] { ParseOverrides({"2h=3"}); }),
            "--set: error: '2h' is not a variable name (letters, digits and _, not "
            "starting with a digit); write --set NAME=VALUE");
  EXPECT_EQ(testing::ErrorText([] { ParseOverrides({"h="}); }),
            "--set h:1:1: error: the value is empty; write --set NAME=VALUE");
  EXPECT_EQ(testing::ErrorText([] {
              ParseOverrides({"h=1", "h=2"});
            }),
            "--set h: error: this variable is set twice on the command line; set it once");
}

TEST(AboutFlag, FieldsInBackquotesBecomeTheirFlags) {
  // The library names the fields it advises on in backquotes; the program says its flags.
  const InputError error({"model.wire", 3, 1}, "widen `min_si`/`max_si`, or use `goal` min-swr");
  EXPECT_EQ(AboutFlag(error, {{"min_si", "--min"}, {"max_si", "--max"}, {"goal", "--goal"}}).what(),
            std::string("model.wire:3:1: error: widen --min/--max, or use --goal min-swr"));
}

TEST(AboutFlag, AFieldsErrorIsSaidAboutItsFlag) {
  PatternOptions options;
  options.step_deg = 12.0;
  EXPECT_EQ(testing::ErrorText([&] {
              NamingFlags({{"step_deg", "--step"}}, [&] { options.Validate(true); });
            }),
            "--step:1:1: error: --step must be greater than 0 and at most 10 degrees; got 12");
}

TEST(AboutFlag, AFieldWithANameBecomesTheFlagWithThatName) {
  const InputError error(SourceLocation{"variables len", 0, 0}, "the variable has no values");
  EXPECT_STREQ(AboutFlag(error, {{"variables", "--vary"}}).what(),
               "--vary len: error: the variable has no values");
}

TEST(AboutFlag, OtherErrorsPassUnchanged) {
  const InputError error(SourceLocation{"kit.wire", 3, 7}, "step_deg is a name here");
  EXPECT_STREQ(AboutFlag(error, {{"step_deg", "--step"}}).what(),
               "kit.wire:3:7: error: step_deg is a name here");
  const InputError prefix(SourceLocation{"variablesx", 0, 0}, "x");
  EXPECT_STREQ(AboutFlag(prefix, {{"variables", "--vary"}}).what(), "variablesx: error: x");
}

TEST(AboutFlag, TheBandTablesErrorsAreSaidAboutBandAndRegion) {
  const std::vector<FieldFlag> flags{{"band", "--band"}, {"region", "--region"}};
  EXPECT_EQ(testing::ErrorText([&] { NamingFlags(flags, [] { FindBand("11m", 1); }); }),
            "--band:1:1: error: unknown band '11m'; use one of 160m, 80m, 60m, 40m, 30m, 20m, "
            "17m, 15m, 12m, 10m (the amateur bands from 160 m to 10 m)");
  // The three ITU Radio Regulations regions (ITU Radio Regulations, Article 5).
  EXPECT_EQ(testing::ErrorText([&] { NamingFlags(flags, [] { FindBand("40m", 4); }); }),
            "--region:1:1: error: --region must be 1, 2 or 3 (the ITU regions: 1 Europe, Africa "
            "and the Middle East; 2 the Americas; 3 Asia and the Pacific); got 4");
}

TEST(OptionChecks, TuneAndBatchOptionsNameTheFieldAndItsBound) {
  TuneOptions tune;
  tune.scan_samples = 2;
  EXPECT_EQ(testing::ErrorText([&] { tune.Validate(); }),
            "scan_samples:1:1: error: scan_samples must be from 3 to 200; got 2");
  tune = TuneOptions{};
  tune.tolerance = 0.5;
  EXPECT_EQ(testing::ErrorText([&] { tune.Validate(); }),
            "tolerance:1:1: error: tolerance must be greater than 0 and less than 0.1; got 0.5");
  EXPECT_EQ(testing::ErrorText([] { TuneOptions{}.Validate(); }), "no error");
  BatchOptions batch;
  batch.elevation_deg = -5.0;
  EXPECT_EQ(testing::ErrorText([&] { batch.Validate(/*over_ground=*/false); }), "no error");
  EXPECT_EQ(testing::ErrorText([&] {
              NamingFlags({{"elevation_deg", "--elevation"}}, [&] { batch.Validate(true); });
            }),
            "--elevation:1:1: error: --elevation must lie between 0 and 90 degrees over a ground "
            "(there is no far field below it); got -5");
}

}  // namespace
}  // namespace wirefield::cli
