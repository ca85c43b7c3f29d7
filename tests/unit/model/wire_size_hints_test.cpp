// Tests of the model stage's help with the sizes a new user gets wrong
// (libmom/src/model/parser.cpp, model/thin_wire.hpp): `diameter D` as the alternative to
// `radius R`, a radius past the thin-wire bound against its wire's length refused at the
// value with the unit it was likely meant in, a transformer's impedance ratio answered with
// its turns, and no unused-variable warning that only a --set override caused.
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

std::string ErrorOf(const std::string& text, const std::vector<Override>& overrides = {}) {
  return testing::ErrorText([&] { Parse(text, overrides); });
}

// The 1-based column of the first `needle` in the first line of `text` that holds it.
int ColumnOf(const std::string& line, const std::string& needle) {
  return static_cast<int>(line.find(needle)) + 1;
}

// ---- --set overrides and the unused-variable warning --------------------------------------

// The hiking club's dipole as the README shows it: `total` is computed from `f_mhz`.
const std::string kReadmeDipole =
    "units m\n"
    "let f_mhz = 14.2\n"
    "let total = 142.6m / f_mhz\n"
    "let height = 1.2m\n"
    "let wire_diameter = 1mm\n"
    "wire dipole from (-total / 2, 0, height) to (total / 2, 0, height) radius wire_diameter / 2\n"
    "feed src at dipole@50%\n"
    "frequency 14.2MHz\n";

TEST(OverrideWarning, AVariableOnlyTheReplacedExpressionUsedIsNotWarnedAbout) {
  const Model m = Parse(kReadmeDipole, {Override{"total", "10.3m", ""}});
  EXPECT_TRUE(m.warnings.empty()) << ToString(m.warnings.at(0));
  ASSERT_EQ(m.wires.size(), 1u);
  EXPECT_DOUBLE_EQ(m.wires[0].to_m[0] - m.wires[0].from_m[0], 10.3);
}

TEST(OverrideWarning, AVariableNothingUsesIsStillWarnedAboutUnderAnOverride) {
  const Model m = Parse("let spare = 3\n" + kReadmeDipole, {Override{"total", "10.3m", ""}});
  ASSERT_EQ(m.warnings.size(), 1u);
  EXPECT_EQ(ToString(m.warnings[0]), "kit.wire:1:5: warning: variable 'spare' is never used");
}

// ---- diameter as the alternative to radius -----------------------------------------------

TEST(WireDiameter, GivesHalfOfItAsTheRadiusAndKeepsWhereItWasWritten) {
  const std::string wire = "wire dip from (-5, 0, 10) to (5, 0, 10) diameter 2mm segments 21";
  const Model m = Parse("units m\n" + wire + "\nfeed src at dip@50%\n");
  ASSERT_EQ(m.wires.size(), 1u);
  EXPECT_DOUBLE_EQ(m.wires[0].radius_m, 1e-3);
  EXPECT_EQ(m.wires[0].segments, 21);
  EXPECT_EQ(m.wires[0].radius_clause, "diameter");
  EXPECT_EQ(m.wires[0].radius_location.line, 2);
  EXPECT_EQ(m.wires[0].radius_location.column, ColumnOf(wire, "2mm"));
  ASSERT_TRUE(m.wires[0].radius_written_number.has_value());
  EXPECT_EQ(*m.wires[0].radius_written_number, 2.0);
}

TEST(WireDiameter, ABareDiameterIsInTheUnitsLengthOnWiresAndShapes) {
  const Model m = Parse(
      "units mm\n"
      "wire dip from (-5000, 0, 10000) to (5000, 0, 10000) diameter 1.6\n"
      "shape kit sloper top=9000 length=20000 diameter 1\n"
      "feed src at dip@50%\n");
  ASSERT_EQ(m.wires.size(), 2u);
  EXPECT_DOUBLE_EQ(m.wires[0].radius_m, 0.8e-3);
  EXPECT_DOUBLE_EQ(m.wires[1].radius_m, 0.5e-3);
}

TEST(WireDiameter, RadiusAndDiameterTogetherAreAnErrorAtTheSecond) {
  const std::string wire = "wire dip from (-5, 0, 10) to (5, 0, 10) radius 1mm diameter 2mm";
  EXPECT_EQ(ErrorOf(wire + "\nfeed src at dip@50%\n"),
            "kit.wire:1:" + std::to_string(ColumnOf(wire, "diameter")) +
                ": error: wire 'dip': give either 'radius R' or 'diameter D' (twice the radius), "
                "not both");
  const std::string twice = "wire dip from (-5, 0, 10) to (5, 0, 10) diameter 2mm diameter 2mm";
  EXPECT_EQ(ErrorOf(twice + "\nfeed src at dip@50%\n"),
            "kit.wire:1:" + std::to_string(static_cast<int>(twice.rfind("diameter")) + 1) +
                ": error: wire 'dip': diameter is given twice");
}

TEST(WireDiameter, ANonPositiveDiameterIsAnErrorAtTheValue) {
  EXPECT_EQ(ErrorOf("wire dip from (-5, 0, 10) to (5, 0, 10) diameter 0\nfeed src at dip@50%\n"),
            "kit.wire:1:50: error: wire 'dip': the diameter must be positive; got 0 m");
}

TEST(WireDiameter, AMissingSizeNamesBothClauses) {
  EXPECT_EQ(ErrorOf("wire top from (0, 0, 0) to (1, 0, 0)\n"),
            "kit.wire:1:37: error: wire 'top': missing 'radius R' (or 'diameter D')");
}

// ---- the radius against the wire's length ------------------------------------------------

// The thin-wire bound of model/thin_wire.hpp: a radius over a tenth of the wire's length.
TEST(WireRadius, OverATenthOfTheLengthIsAnErrorThatSuggestsMillimetres) {
  const std::string wire = "wire stub from (0, 0, 5) to (4, 0, 5) radius 1";
  EXPECT_EQ(ErrorOf("units m\n" + wire + "\nfeed src at stub@50%\n"),
            "kit.wire:2:" + std::to_string(ColumnOf(wire, "1")) +
                ": error: wire 'stub': the radius 1 m is not small against the wire length 4 m; "
                "the thin-wire model needs the radius under a tenth of the length (did you mean "
                "radius 1mm?)");
  const std::string by_diameter = "wire stub from (0, 0, 5) to (4, 0, 5) diameter 1m";
  EXPECT_EQ(ErrorOf(by_diameter + "\nfeed src at stub@50%\n"),
            "kit.wire:1:" + std::to_string(ColumnOf(by_diameter, "1m")) +
                ": error: wire 'stub': the radius 0.5 m is not small against the wire length 4 "
                "m; the thin-wire model needs the radius under a tenth of the length (did you "
                "mean diameter 1mm?)");
}

TEST(WireRadius, AtATenthOfTheLengthItIsAccepted) {
  const Model m = Parse("wire stub from (0, 0, 5) to (4, 0, 5) radius 0.4\nfeed src at stub@50%\n");
  EXPECT_DOUBLE_EQ(m.wires[0].radius_m, 0.4);
}

TEST(WireRadius, NoUnitIsSuggestedForAnExpressionOrAValueInMillimetres) {
  // 120 mm of radius on a 1 m wire: in mm already, so no other unit is suggested.
  EXPECT_EQ(ErrorOf("wire stub from (0, 0, 5) to (1, 0, 5) radius 120mm\nfeed src at stub@50%\n"),
            "kit.wire:1:46: error: wire 'stub': the radius 0.12 m is not small against the wire "
            "length 1 m; the thin-wire model needs the radius under a tenth of the length");
  EXPECT_EQ(ErrorOf("let r = 0.5\nwire stub from (0, 0, 5) to (1, 0, 5) radius r\n"
                    "feed src at stub@50%\n"),
            "kit.wire:2:46: error: wire 'stub': the radius 0.5 m is not small against the wire "
            "length 1 m; the thin-wire model needs the radius under a tenth of the length");
}

// ---- a transformer's impedance ratio -----------------------------------------------------

const std::string kFed =
    "wire kit from (0, 0, 2) to (20, 0, 9) radius 0.5mm\n"
    "feed src at kit@start\n";

TEST(TransformerRatio, AnImpedanceRatioIsAnsweredWithItsTurns) {
  // The impedance ratio of an ideal transformer is the square of its turns ratio
  // (Terman, Radio Engineers' Handbook, 1943, sec. 2 on transformers; from memory).
  EXPECT_EQ(ErrorOf(kFed + "transformer unun at src ratio 1:49\n"),
            "kit.wire:3:25: error: transformer 'unun': a transformer takes its turns, not its "
            "impedance ratio; an impedance ratio of 1:49 is a turns ratio of 1:7 (the impedance "
            "goes as the square of the turns): write turns 1:7");
  EXPECT_EQ(ErrorOf(kFed + "transformer balun at src ratio=1:4\n"),
            "kit.wire:3:26: error: transformer 'balun': a transformer takes its turns, not its "
            "impedance ratio; an impedance ratio of 1:4 is a turns ratio of 1:2 (the impedance "
            "goes as the square of the turns): write turns 1:2");
  EXPECT_EQ(ErrorOf(kFed + "transformer unun at src turns 2:14 ratio 49\n"),
            "kit.wire:3:36: error: transformer 'unun': a transformer takes its turns, not its "
            "impedance ratio; write turns P:S (transmitter side : antenna side), the square "
            "roots of the impedance ratio: an impedance ratio of 1:49 is turns 1:7");
}

TEST(TransformerRatio, TheTurnsTheHintGivesAreAccepted) {
  const Model m = Parse(kFed + "transformer unun at src turns 1:7\n");
  ASSERT_EQ(m.transformers.size(), 1u);
  const double impedance_ratio =
      std::pow(m.transformers[0].secondary_turns / m.transformers[0].primary_turns, 2.0);
  EXPECT_DOUBLE_EQ(impedance_ratio, 49.0);
}

}  // namespace
}  // namespace wirefield
