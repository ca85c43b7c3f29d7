// Tests of the insulation clause of `wire` and `shape` (libmom/src/model/parse_wires.cpp with
// the plastics' table of libmom/src/core/materials.cpp): presets and hand-given plastics
// resolved to SI, the jacket's size as a thickness or an outer diameter, the warning for a
// jacket too thick for the thin-coating approximation, and the exact text and
// FILE:LINE:COLUMN of every insulation error.
#include <gtest/gtest.h>

#include <string>

#include "core/materials.hpp"
#include "unit/error_text.hpp"
#include "wirefield/model.hpp"

namespace wirefield {
namespace {

// The hiking club's 1 m test wire (2 mm thick) with its feed; the clause under test goes after
// the radius, from column 43.
const std::string kWire = "wire a from (0,0,0) to (1,0,0) radius 1mm ";
const std::string kFeed = "\nfeed f at a@50%\n";

Model ParseModel(const std::string& clauses) {
  return ParseModelText(kWire + clauses + kFeed, "kit.wire");
}

InsulationSpec ParseInsulation(const std::string& clauses) {
  const WireSpec wire = ParseModel(clauses).wires.at(0);
  EXPECT_TRUE(wire.insulation.has_value()) << clauses;
  return wire.insulation.value_or(InsulationSpec{});
}

std::string ErrorOf(const std::string& clauses) {
  return testing::ErrorText([&] { ParseModel(clauses); });
}

// 1e-15 m: the rounding of a millimetre converted to metres and subtracted.
constexpr double kLengthRounding_m = 1e-15;

TEST(InsulationClause, NoClauseLeavesABareWire) {
  EXPECT_FALSE(ParseModel("").wires.at(0).insulation.has_value());
}

TEST(InsulationClause, PresetTakesThePlasticsFiguresFromTheTable) {
  const InsulationSpec pvc = ParseInsulation("insulation pvc thickness=0.5mm");
  EXPECT_EQ(pvc.preset, "pvc");
  EXPECT_NEAR(pvc.thickness_m, 0.5e-3, kLengthRounding_m);
  // Plasticised PVC about 3 to 5 and 0.02 to 0.1 at HF (from memory): the table's mid values.
  EXPECT_EQ(pvc.relative_permittivity, core::FindDielectric("pvc")->relative_permittivity);
  EXPECT_GE(pvc.relative_permittivity, 3.0);
  EXPECT_LE(pvc.relative_permittivity, 5.0);
  EXPECT_GE(pvc.loss_tangent, 0.02);
  EXPECT_LE(pvc.loss_tangent, 0.1);
  EXPECT_EQ(pvc.location.line, 1);
  EXPECT_EQ(pvc.location.column, 43);
  // Solid polyethylene 2.3 and PTFE 2.1, both nearly lossless at HF (from memory).
  const InsulationSpec pe = ParseInsulation("insulation pe thickness=0.5mm");
  EXPECT_EQ(pe.relative_permittivity, 2.3);
  EXPECT_LT(pe.loss_tangent, 1e-3);
  const InsulationSpec ptfe = ParseInsulation("insulation ptfe thickness=0.5mm");
  EXPECT_EQ(ptfe.relative_permittivity, 2.1);
  EXPECT_LT(ptfe.loss_tangent, 1e-3);
}

TEST(InsulationClause, PlasticByHandTakesItsPermittivityAndLossTangent) {
  const InsulationSpec own =
      ParseInsulation("insulation permittivity=3.2 loss_tangent=0.01 thickness=0.4mm");
  EXPECT_EQ(own.preset, "");
  EXPECT_EQ(own.relative_permittivity, 3.2);
  EXPECT_EQ(own.loss_tangent, 0.01);
  EXPECT_NEAR(own.thickness_m, 0.4e-3, kLengthRounding_m);
  // Without loss_tangent the plastic is lossless.
  EXPECT_EQ(ParseInsulation("insulation thickness=0.4mm permittivity=2.5").loss_tangent, 0.0);
}

TEST(InsulationClause, OuterDiameterGivesTheThicknessOverTheConductor) {
  // 3 mm over a 2 mm conductor: a 0.5 mm jacket.
  EXPECT_NEAR(ParseInsulation("insulation pe outer_diameter=3mm").thickness_m, 0.5e-3,
              kLengthRounding_m);
  // The radius may come after the insulation: the size is completed at the statement's end.
  const Model m = ParseModelText(
      "wire a from (0,0,0) to (1,0,0) insulation pe outer_diameter=3mm diameter 2mm" + kFeed,
      "kit.wire");
  EXPECT_NEAR(m.wires.at(0).insulation->thickness_m, 0.5e-3, kLengthRounding_m);
}

TEST(InsulationClause, BareLengthsAreInTheUnitsLength) {
  const Model m = ParseModelText(
      "units mm\nwire a from (0,0,0) to (1000,0,0) radius 1 insulation ptfe thickness=0.3" + kFeed,
      "kit.wire");
  EXPECT_NEAR(m.wires.at(0).insulation->thickness_m, 0.3e-3, kLengthRounding_m);
}

TEST(InsulationClause, PartsMayFollowOtherClauses) {
  const Model m = ParseModel("insulation pe segments 9 thickness=1mm material copper");
  EXPECT_EQ(m.wires.at(0).segments, 9);
  EXPECT_NEAR(m.wires.at(0).insulation->thickness_m, 1e-3, kLengthRounding_m);
  EXPECT_EQ(m.wires.at(0).material, "copper");
}

TEST(InsulationClause, ShapeTakesInsulationToo) {
  const Model m = ParseModelText(
      "shape s sloper top=10 length=12 radius 1mm insulation pvc thickness=0.6mm\n"
      "feed f at s@start\nground perfect\n",
      "kit.wire");
  ASSERT_TRUE(m.wires.at(0).insulation.has_value());
  EXPECT_EQ(m.wires.at(0).insulation->preset, "pvc");
}

TEST(InsulationClause, ThickJacketWarnsThatTheApproximationIsRough) {
  const Model m = ParseModel("insulation pe thickness=12mm");
  ASSERT_EQ(m.warnings.size(), 1u);
  EXPECT_EQ(ToString(m.warnings[0]),
            "kit.wire:1:43: warning: wire 'a': the insulation's outer radius is 13 times the "
            "conductor's (more than 10): the thin-coating approximation is rough for so thick a "
            "jacket; check the thickness (a bare number is in the `units` length)");
  EXPECT_TRUE(ParseModel("insulation pe thickness=8mm").warnings.empty());
}

TEST(InsulationClause, BadValuesAreErrorsAtTheValue) {
  EXPECT_EQ(ErrorOf("insulation pvc thickness=-0.5mm"),
            "kit.wire:1:68: error: wire 'a': insulation thickness must be positive; got -0.0005 "
            "m (leave out insulation for a bare wire)");
  EXPECT_EQ(ErrorOf("insulation pvc thickness=0"),
            "kit.wire:1:68: error: wire 'a': insulation thickness must be positive; got 0 m "
            "(leave out insulation for a bare wire)");
  EXPECT_EQ(ErrorOf("insulation permittivity=0.8 thickness=0.5mm"),
            "kit.wire:1:67: error: wire 'a': insulation permittivity must be at least 1 "
            "(relative to vacuum; plastics are about 2 to 5); got 0.8");
  EXPECT_EQ(ErrorOf("insulation permittivity=3 loss_tangent=-0.01 thickness=0.5mm"),
            "kit.wire:1:82: error: wire 'a': insulation loss_tangent must not be negative (0 for "
            "a lossless plastic, about 0.0003 for polyethylene); got -0.01");
  EXPECT_EQ(ErrorOf("insulation pe outer_diameter=1.5mm"),
            "kit.wire:1:72: error: wire 'a': insulation outer_diameter 0.0015 m is not more than "
            "the wire's diameter 0.002 m; give the jacket's outside diameter, or its "
            "thickness=T");
  EXPECT_EQ(ErrorOf("insulation pe thickness=2 MHz"),
            "kit.wire:1:67: error: wire 'a': insulation thickness needs a length (m, cm, mm, ft, "
            "in); got a frequency (Hz)");
}

TEST(InsulationClause, ClauseErrorsSayWhatToWrite) {
  EXPECT_EQ(ErrorOf("insulation pvc thickness=0.5mm insulation pe"),
            "kit.wire:1:74: error: wire 'a': insulation is given twice");
  EXPECT_EQ(ErrorOf("insulation pvc thickness=0.5mm thickness=0.6mm"),
            "kit.wire:1:74: error: wire 'a': insulation thickness is given twice");
  EXPECT_EQ(ErrorOf("insulation pvc thickness=0.5mm outer_diameter=3mm"),
            "kit.wire:1:74: error: wire 'a': give the insulation either thickness=T (radial) or "
            "outer_diameter=D, not both");
  EXPECT_EQ(ErrorOf("insulation pvc permittivity=3 thickness=0.5mm"),
            "kit.wire:1:58: error: wire 'a': insulation pvc sets its own permittivity; leave out "
            "'pvc' to give permittivity= and loss_tangent= by hand");
  EXPECT_EQ(ErrorOf("insulation pvc"),
            "kit.wire:1:43: error: wire 'a': insulation needs the jacket's size: thickness=T "
            "(radial) or outer_diameter=D");
  EXPECT_EQ(ErrorOf("insulation thickness=0.5mm"),
            "kit.wire:1:43: error: wire 'a': insulation needs its plastic (pvc, pe, ptfe) or "
            "permittivity=EPS_R [loss_tangent=TAN_D]");
  EXPECT_EQ(ErrorOf("insulation pcv thickness=0.5mm"),
            "kit.wire:1:54: error: wire 'a': unknown insulation 'pcv' (did you mean 'pvc'?); the "
            "plastics are pvc, pe, ptfe, or give your own with permittivity=EPS_R "
            "[loss_tangent=TAN_D]");
  EXPECT_EQ(ErrorOf("thickness=0.5mm insulation pvc"),
            "kit.wire:1:43: error: wire 'a': thickness= is part of the insulation clause; write "
            "'insulation PLASTIC thickness=...' (or 'insulation permittivity=EPS_R ...')");
}

}  // namespace
}  // namespace wirefield
