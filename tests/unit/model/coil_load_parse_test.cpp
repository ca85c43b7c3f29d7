// Tests of the coil load of the model language (libmom/src/model/parser.cpp):
// `load NAME at WIRE@POS coil turns=N diameter=D length=L|pitch=P wire=d [insulation=T]
// [material=NAME]` resolved to a CoilSpec in SI, and the exact text and FILE:LINE:COLUMN of
// each coil error.
#include <gtest/gtest.h>

#include <string>

#include "unit/error_text.hpp"
#include "wirefield/model.hpp"

namespace wirefield {
namespace {

// The campsite mast's 10 m wire, fed at its centre; the coil sits at 75% of it.
const std::string kHead =
    "units mm\nwire mast from (0,0,0) to (10000,0,0) radius 1\nfeed f at mast@50%\n";

std::string ErrorOf(const std::string& load) {
  return testing::ErrorText([&] { ParseModelText(kHead + load + "\n", "mast.wire"); });
}

TEST(CoilLoad, ResolvesItsSizesInTheUnitsLengthAndWithSuffixes) {
  const Model m =
      ParseModelText(kHead +
                         "load c at mast@75% coil turns=50 diameter=28.5 pitch=1 wire=0.9mm "
                         "insulation=0.05 material=aluminium\n",
                     "mast.wire");
  ASSERT_EQ(m.loads.size(), 1u);
  ASSERT_TRUE(m.loads[0].coil.has_value());
  const CoilSpec& c = *m.loads[0].coil;
  EXPECT_EQ(c.turns, 50.0);
  EXPECT_DOUBLE_EQ(c.former_diameter_m, 28.5e-3);
  EXPECT_DOUBLE_EQ(*c.pitch_m, 1e-3);
  EXPECT_FALSE(c.length_m.has_value());
  EXPECT_DOUBLE_EQ(c.wire_diameter_m, 0.9e-3);
  EXPECT_DOUBLE_EQ(c.insulation_m, 0.05e-3);
  EXPECT_EQ(c.material, "aluminium");
  EXPECT_EQ(c.conductivity_s_per_m, 3.54e7);  // the table's figure (ASTM B230, from memory)
  EXPECT_FALSE(m.loads[0].resistance_ohm || m.loads[0].inductance_h || m.loads[0].capacitance_f);
}

TEST(CoilLoad, PitchBelowTheWireIsAnErrorAtThePitch) {
  EXPECT_EQ(ErrorOf("load c at mast@75% coil turns=50 diameter=28.5 pitch=0.5 wire=0.9"),
            "mast.wire:4:48: error: load 'c': the pitch 0.5 mm is smaller than the wire's "
            "overall diameter 0.9 mm (wire 0.9 mm plus twice the insulation 0 mm): the turns "
            "would overlap; use a larger pitch or length, fewer turns or a thinner wire");
}

TEST(CoilLoad, MissingAndDoubledClausesAreErrors) {
  EXPECT_EQ(ErrorOf("load c at mast@75% coil turns=50 diameter=28.5 pitch=1"),
            "mast.wire:4:55: error: load 'c': the coil needs wire=; write turns=N|inductance=L "
            "diameter=D length=L|pitch=P|close-wound wire=d [insulation=T] [material=NAME]");
  EXPECT_EQ(ErrorOf("load c at mast@75% coil turns=50 diameter=28.5 wire=1"),
            "mast.wire:4:54: error: load 'c': the coil needs length=L, pitch=P or close-wound; "
            "write turns=N|inductance=L diameter=D length=L|pitch=P|close-wound wire=d "
            "[insulation=T] [material=NAME]");
  EXPECT_EQ(ErrorOf("load c at mast@75% coil turns=50 turns=4"),
            "mast.wire:4:34: error: load 'c': turns is given twice");
  EXPECT_EQ(ErrorOf("load c at mast@75% coil turns=5 diameter=20 length=10 pitch=2 wire=1"),
            "mast.wire:4:55: error: load 'c': give the coil's length or its pitch (length = "
            "turns x pitch), not both");
}

TEST(CoilLoad, BadValuesAreErrorsAtTheValue) {
  EXPECT_EQ(ErrorOf("load c at mast@75% coil turns=0.5 diameter=20 pitch=2 wire=1"),
            "mast.wire:4:31: error: load 'c': the coil needs at least 1 turn; got 0.5");
  EXPECT_EQ(ErrorOf("load c at mast@75% coil turns=5 diameter=-20 pitch=2 wire=1"),
            "mast.wire:4:42: error: load 'c': the coil diameter must be positive; got -0.02 m");
  EXPECT_EQ(ErrorOf("load c at mast@75% coil turns=5 diameter=20MHz pitch=2 wire=1"),
            "mast.wire:4:42: error: load 'c': coil diameter needs a length (m, cm, mm, ft, in); "
            "got a frequency (Hz)");
  EXPECT_EQ(ErrorOf("load c at mast@75% coil turns=5 size=3"),
            "mast.wire:4:33: error: load 'c': unexpected 'size' in the coil; write "
            "turns=N|inductance=L diameter=D length=L|pitch=P|close-wound wire=d [insulation=T] "
            "[material=NAME]");
}

// ---- the clauses the `coil` command has: close-wound and inductance= ----------------------

TEST(CoilLoad, CloseWoundSetsThePitchToTheWiresOverallDiameter) {
  const Model m =
      ParseModelText(kHead +
                         "load c at mast@75% coil turns=30 diameter=25 close-wound wire=1.2 "
                         "insulation=0.05\n",
                     "mast.wire");
  const CoilSpec& c = *m.loads.at(0).coil;
  ASSERT_TRUE(c.pitch_m.has_value());
  EXPECT_DOUBLE_EQ(*c.pitch_m, 1.3e-3);  // 1.2 mm + 2 x 0.05 mm
  EXPECT_FALSE(c.length_m.has_value());
  EXPECT_EQ(c.turns, 30.0);
}

TEST(CoilLoad, CloseWoundIsOneWayToGiveTheWinding) {
  EXPECT_EQ(ErrorOf("load c at mast@75% coil turns=5 diameter=20 close-wound pitch=2 wire=1"),
            "mast.wire:4:57: error: load 'c': give the coil's winding by length=L, pitch=P or "
            "close-wound, exactly one (close-wound sets the pitch to wire + 2 x insulation)");
  EXPECT_EQ(ErrorOf("load c at mast@75% coil turns=5 close-wound diameter=20 close-wound wire=1"),
            "mast.wire:4:57: error: load 'c': close-wound is given twice");
  // "close wound" with a space is not the clause.
  EXPECT_EQ(ErrorOf("load c at mast@75% coil turns=5 diameter=20 close wound wire=1"),
            "mast.wire:4:45: error: load 'c': unexpected 'close' in the coil; write "
            "turns=N|inductance=L diameter=D length=L|pitch=P|close-wound wire=d [insulation=T] "
            "[material=NAME]");
}

TEST(CoilLoad, InductanceFindsTheTurnsAsTheCoilCommandDoes) {
  const Model m = ParseModelText(
      kHead + "load c at mast@75% coil inductance=20uH diameter=40 close-wound wire=1.2\n",
      "mast.wire");
  const CoilSpec& c = *m.loads.at(0).coil;
  // The same design through the library's own entry point, and the coil it finds has the
  // inductance asked for (TOMS 748 to 44 bits of the turns: far below 1e-9 of L).
  CoilSpec asked;
  asked.former_diameter_m = 40e-3;
  asked.wire_diameter_m = 1.2e-3;
  asked.pitch_m = 1.2e-3;
  EXPECT_DOUBLE_EQ(c.turns, DesignCoilTurns(asked, 20e-6).turns);
  EXPECT_NEAR(AnalyzeCoil(c, 7.1e6).inductance_h / 20e-6, 1.0, 1e-9);
}

TEST(CoilLoad, InductanceErrorsNameTheClause) {
  EXPECT_EQ(ErrorOf("load c at mast@75% coil turns=5 inductance=2uH diameter=20 pitch=2 wire=1"),
            "mast.wire:4:33: error: load 'c': give the coil's turns=N or its inductance=L (the "
            "turns are then found), not both");
  EXPECT_EQ(ErrorOf("load c at mast@75% coil inductance=2uH diameter=20 length=20 wire=1"),
            "mast.wire:4:52: error: load 'c': length= fixes the winding, so it cannot go with "
            "inductance=; give pitch=P or close-wound and the turns (and length) are found");
  // The design's own message (DesignCoilTurns), placed at the clause.
  const std::string too_small =
      ErrorOf("load c at mast@75% coil inductance=1nH diameter=20 close-wound wire=1");
  EXPECT_EQ(too_small.rfind("mast.wire:4:25: error: load 'c': 0.001 uH is less than one turn "
                            "gives on this former (",
                            0),
            0u)
      << too_small;
  EXPECT_EQ(ErrorOf("load c at mast@75% coil inductance=2pF diameter=20 close-wound wire=1"),
            "mast.wire:4:36: error: load 'c': the coil inductance needs an inductance (H, mH, "
            "uH, nH); got a capacitance (F)");
}

}  // namespace
}  // namespace wirefield
