// Tests of the model stage's feed-chain statements (libmom/src/model/parser.cpp):
// `transformer` and `line` resolved to SI values, cables from the built-in table, and the
// exact text and FILE:LINE:COLUMN of every input error they give.
#include <gtest/gtest.h>

#include <string>

#include "unit/error_text.hpp"
#include "wirefield/model.hpp"
#include "wirefield/network.hpp"

namespace wirefield {
namespace {

// The hiking club's end-fed field kit: a 20 m wire fed at its start, 8 m up.
const std::string kKit =
    "wire ef from (0, 0, 8) to (20, 0, 8) radius 1mm\n"
    "feed src at ef@start\n";

Model Parse(const std::string& text) { return ParseModelText(kKit + text, "kit.wire"); }

std::string ErrorOf(const std::string& text) {
  return testing::ErrorText([&] { Parse(text); });
}

// Values through one unit factor and at most one product: relative 1e-12.
constexpr double kRelative = 1e-12;

// ---- transformer --------------------------------------------------------------------

TEST(ParseTransformer, TurnsAndEveryElementAreStoredInSI) {
  const Model m = Parse(
      "transformer unun at src turns 2:16 magnetizing=4uH leakage=0.3uH compensation=100pF "
      "coreloss=2kohm\n");
  ASSERT_EQ(m.transformers.size(), 1u);
  const TransformerSpec& t = m.transformers[0];
  EXPECT_EQ(t.name, "unun");
  EXPECT_EQ(t.feed, "src");
  EXPECT_EQ(t.primary_turns, 2.0);
  EXPECT_EQ(t.secondary_turns, 16.0);
  EXPECT_NEAR(*t.magnetizing_inductance_h, 4e-6, 4e-6 * kRelative);
  EXPECT_NEAR(t.leakage_inductance_h, 0.3e-6, 0.3e-6 * kRelative);
  EXPECT_NEAR(*t.compensation_capacitance_f, 100e-12, 100e-12 * kRelative);
  EXPECT_NEAR(*t.core_loss_resistance_ohm, 2000.0, 2000.0 * kRelative);
  EXPECT_FALSE(t.al_nh_per_turn2);
  EXPECT_FALSE(t.core_q);
  EXPECT_EQ(t.location.line, 3);
  EXPECT_EQ(t.location.column, 1);
}

TEST(ParseTransformer, OnlyTurnsAreRequiredAndTheRestStaysAbsent) {
  const TransformerSpec t = Parse("transformer unun at src turns 3:21\n").transformers[0];
  EXPECT_EQ(t.primary_turns, 3.0);
  EXPECT_EQ(t.secondary_turns, 21.0);
  EXPECT_FALSE(t.magnetizing_inductance_h);
  EXPECT_FALSE(t.compensation_capacitance_f);
  EXPECT_EQ(t.leakage_inductance_h, 0.0);
}

TEST(ParseTransformer, AlIsInNanohenryPerTurnSquaredPlainOrWithNh) {
  // A_L is quoted in nH/turn^2 (REFERENCES §5): al=1000 and al=1000nH are the same.
  EXPECT_EQ(*Parse("transformer t at src turns 2:16 al=1000\n").transformers[0].al_nh_per_turn2,
            1000.0);
  EXPECT_NEAR(*Parse("transformer t at src turns 2:16 al=1000nH\n").transformers[0].al_nh_per_turn2,
              1000.0, 1000.0 * kRelative);
}

TEST(ParseTransformer, QGoesWithAlAndTurnsTakeExpressions) {
  const TransformerSpec t =
      Parse("let n = 2\ntransformer t at src turns n:8*n al=1250 q=12\n").transformers[0];
  EXPECT_EQ(t.secondary_turns, 16.0);
  EXPECT_EQ(*t.core_q, 12.0);
}

// ---- line ---------------------------------------------------------------------------

TEST(ParseLine, CableComesFromTheTable) {
  const Model m = Parse("line coax at src length 15m cable=RG-58\n");
  ASSERT_EQ(m.feed_lines.size(), 1u);
  const FeedLineSpec& l = m.feed_lines[0];
  EXPECT_EQ(l.name, "coax");
  EXPECT_EQ(l.feed, "src");
  EXPECT_EQ(l.length_m, 15.0);
  EXPECT_EQ(l.cable, "RG-58");
  const CableInfo& c = CableTable()[0];
  ASSERT_EQ(c.name, "RG-58");
  EXPECT_EQ(l.z0_ohm, c.z0_ohm);
  EXPECT_EQ(l.velocity_factor, c.velocity_factor);
  EXPECT_EQ(l.loss1_db_per_100m, c.loss1_db_per_100m);
  EXPECT_EQ(l.loss2_db_per_100m, c.loss2_db_per_100m);
  EXPECT_EQ(l.loss_points, 2);
  EXPECT_TRUE(m.warnings.empty());
}

TEST(ParseLine, OwnFiguresWithTwoLossPointsInAnyUnits) {
  const FeedLineSpec l =
      Parse(
          "units ft\nline ladder at src length 50 z0=450 velocity=0.91 loss=0.2@3.5MHz,"
          "0.5@28MHz\n")
          .feed_lines[0];
  EXPECT_NEAR(l.length_m, 50 * 0.3048, 50 * 0.3048 * kRelative);  // 1 ft = 0.3048 m (1959)
  EXPECT_EQ(l.z0_ohm, 450.0);
  EXPECT_EQ(l.velocity_factor, 0.91);
  EXPECT_EQ(l.loss1_db_per_100m, 0.2);
  EXPECT_NEAR(l.loss1_frequency_hz, 3.5e6, 3.5e6 * kRelative);
  EXPECT_EQ(l.loss2_db_per_100m, 0.5);
  EXPECT_NEAR(l.loss2_frequency_hz, 28e6, 28e6 * kRelative);
  EXPECT_EQ(l.loss_points, 2);
  EXPECT_TRUE(l.cable.empty());
}

TEST(ParseLine, OneLossPointOrNoneAtAll) {
  EXPECT_EQ(
      Parse("line c at src length 10 z0=50 velocity=0.66 loss=3@14MHz\n").feed_lines[0].loss_points,
      1);
  EXPECT_EQ(Parse("line c at src length 10 z0=50 velocity=0.66\n").feed_lines[0].loss_points, 0);
}

TEST(ParseLine, LossGrowingSlowerThanSqrtFIsAWarning) {
  const Model m = Parse("line c at src length 10m z0=50 velocity=0.66 loss=1.3@10MHz,1.5@30MHz\n");
  ASSERT_EQ(m.warnings.size(), 1u);
  EXPECT_EQ(ToString(m.warnings[0]),
            "kit.wire:3:46: warning: line 'c': the loss grows more slowly than sqrt(f) between 10 "
            "and 30 MHz, which the conductor-plus-dielectric model cannot follow; the fit keeps "
            "only the sqrt(f) term and misses a figure by 23%");
}

TEST(ParseFeedChain, TransformerAndLineSitTogetherAtOneFeed) {
  const Model m = Parse(
      "transformer unun at src turns 2:16 al=1000\n"
      "line coax at src length 15m cable=RG-213\n");
  EXPECT_EQ(m.transformers.size(), 1u);
  EXPECT_EQ(m.feed_lines.size(), 1u);
  // Own namespace per kind: a transformer and a line may share a name, as loads and wires do.
  EXPECT_NO_THROW(Parse("transformer x at src turns 1:2\nline x at src length 1 cable=RG-58\n"));
}

// ---- errors: transformer ------------------------------------------------------------

TEST(TransformerError, UnknownFeed) {
  EXPECT_EQ(ErrorOf("transformer t at nope turns 2:16\n"),
            "kit.wire:3:18: error: transformer 't': unknown feed 'nope'; a feed must be defined "
            "on an earlier line");
  EXPECT_EQ(ErrorOf("transformer t at Src turns 2:16\n"),
            "kit.wire:3:18: error: transformer 't': unknown feed 'Src' (did you mean 'src'?); a "
            "feed must be defined on an earlier line");
  EXPECT_EQ(ErrorOf("transformer t turns 2:16\n"),
            "kit.wire:3:15: error: transformer 't': expected 'at FEED'; got 'turns'");
}

TEST(TransformerError, SecondTransformerAtTheSameFeed) {
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16\ntransformer u at src turns 3:21\n"),
            "kit.wire:4:18: error: transformer 'u': feed 'src' already has transformer 't' (line "
            "3); a feed takes one transformer");
}

TEST(TransformerError, NameDefinedTwice) {
  const std::string kFeed2 = "feed aux at ef@50%\n";
  EXPECT_EQ(ErrorOf(kFeed2 + "transformer t at src turns 2:16\ntransformer t at aux turns 3:21\n"),
            "kit.wire:5:13: error: transformer 't' is already defined at line 4; give each "
            "transformer its own name");
}

TEST(TransformerError, MalformedTurns) {
  EXPECT_EQ(ErrorOf("transformer t at src\n"),
            "kit.wire:3:21: error: transformer 't': missing 'turns P:S' (transmitter side : "
            "antenna side, as in turns 2:16)");
  EXPECT_EQ(ErrorOf("transformer t at src turns 2 16\n"),
            "kit.wire:3:30: error: transformer 't': expected ':' between the primary and the "
            "secondary turns (turns 2:16); got '16'");
  EXPECT_EQ(ErrorOf("transformer t at src turns 2-16\n"),
            "kit.wire:3:32: error: transformer 't': missing ':' between the primary and the "
            "secondary turns (turns 2:16)");
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:\n"),
            "kit.wire:3:30: error: missing a value at the end of the line (a number, a variable, "
            "a function call or a parenthesis)");
  EXPECT_EQ(ErrorOf("transformer t at src turns 0:16\n"),
            "kit.wire:3:28: error: transformer 't': the primary (transmitter side) turns must be "
            "positive; got 0");
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:-16\n"),
            "kit.wire:3:30: error: transformer 't': the secondary (antenna side) turns must be "
            "positive; got -16");
  EXPECT_EQ(ErrorOf("transformer t at src turns 2mm:16\n"),
            "kit.wire:3:28: error: transformer 't': turns needs a plain number (the primary "
            "turns, as in turns 2:16); got a length (m)");
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 turns 3:21\n"),
            "kit.wire:3:33: error: transformer 't': turns is given twice");
}

TEST(TransformerError, MagnetizingAndAlTogether) {
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 magnetizing=4uH al=1000\n"),
            "kit.wire:3:49: error: transformer 't': give either magnetizing=L or al=A_L (which "
            "sets L = A_L * P^2), not both");
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 al=1000 magnetizing=4uH\n"),
            "kit.wire:3:41: error: transformer 't': give either magnetizing=L or al=A_L (which "
            "sets L = A_L * P^2), not both");
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 al=1000 al=1000\n"),
            "kit.wire:3:41: error: transformer 't': al is given twice");
}

TEST(TransformerError, AlOfTheWrongQuantityOrSign) {
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 al=5pF\n"),
            "kit.wire:3:36: error: transformer 't': al needs A_L in nH/turn^2 (a plain number, or "
            "with nH); got a capacitance (F)");
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 al=-3\n"),
            "kit.wire:3:36: error: transformer 't': al must be positive; got -3 nH/turn^2");
}

TEST(TransformerError, CorelossAndQTogether) {
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 coreloss=2kohm q=12 al=1000\n"),
            "kit.wire:3:48: error: transformer 't': give either coreloss=R or q=Q, not both");
}

TEST(TransformerError, QWithoutAnInductance) {
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 q=12\n"),
            "kit.wire:3:33: error: transformer 't': q= is the Q of the magnetizing inductance; "
            "give magnetizing=L or al=A_L too");
}

TEST(TransformerError, ValuesOutOfRange) {
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 q=0 al=1000\n"),
            "kit.wire:3:35: error: transformer 't': q must be positive; got 0");
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 leakage=-1nH\n"),
            "kit.wire:3:41: error: transformer 't': leakage must not be negative; got -1e-09 H");
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 compensation=0\n"),
            "kit.wire:3:46: error: transformer 't': compensation must be positive; got 0 F (leave "
            "it out for no capacitor)");
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 magnetizing=0\n"),
            "kit.wire:3:45: error: transformer 't': magnetizing must be positive; got 0 H (leave "
            "it out for an ideal transformer)");
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 coreloss=0\n"),
            "kit.wire:3:42: error: transformer 't': coreloss must be positive; got 0 ohm (leave "
            "it out for a lossless core)");
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 leakage=3pF\n"),
            "kit.wire:3:41: error: transformer 't': leakage needs an inductance (H, mH, uH, nH); "
            "got a capacitance (F)");
}

TEST(TransformerError, UnknownClauseSuggestsTheNearest) {
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 magnetising=4uH\n"),
            "kit.wire:3:33: error: transformer 't': unexpected 'magnetising' (did you mean "
            "'magnetizing'?); the clauses are turns P:S, magnetizing=L, al=A_L, leakage=L, "
            "compensation=C, coreloss=R and q=Q");
  EXPECT_EQ(ErrorOf("transformer t at src turns 2:16 compensation 100pF\n"),
            "kit.wire:3:46: error: transformer 't': expected '=' after compensation; got '100'");
}

// ---- errors: line -------------------------------------------------------------------

TEST(LineError, UnknownFeed) {
  EXPECT_EQ(ErrorOf("line c at antenna length 10m cable=RG-58\n"),
            "kit.wire:3:11: error: line 'c': unknown feed 'antenna'; a feed must be defined on "
            "an earlier line");
}

TEST(LineError, SecondLineAtTheSameFeed) {
  EXPECT_EQ(ErrorOf("line c at src length 10m cable=RG-58\nline d at src length 5m cable=RG-213\n"),
            "kit.wire:4:11: error: line 'd': feed 'src' already has line 'c' (line 3); a feed "
            "takes one line");
}

TEST(LineError, NameDefinedTwice) {
  EXPECT_EQ(ErrorOf("feed aux at ef@50%\nline c at src length 10m cable=RG-58\n"
                    "line c at aux length 5m cable=RG-213\n"),
            "kit.wire:5:6: error: line 'c' is already defined at line 4; give each line its own "
            "name");
}

TEST(LineError, UnknownCableListsTheTableAndSuggestsTheNearest) {
  EXPECT_EQ(ErrorOf("line c at src length 10m cable=RG-59\n"),
            "kit.wire:3:32: error: line 'c': unknown cable 'RG-59' (did you mean 'RG-58'?); the "
            "cables are RG-58, RG-174, RG-213, RG-316, or give z0=, velocity= and loss=");
  EXPECT_EQ(ErrorOf("line c at src length 10m cable=rg58\n"),
            "kit.wire:3:32: error: line 'c': unknown cable 'rg58' (did you mean 'RG-58'?); the "
            "cables are RG-58, RG-174, RG-213, RG-316, or give z0=, velocity= and loss=");
  EXPECT_EQ(ErrorOf("line c at src length 10m cable=twinlead\n"),
            "kit.wire:3:32: error: line 'c': unknown cable 'twinlead'; the cables are RG-58, "
            "RG-174, RG-213, RG-316, or give z0=, velocity= and loss=");
  EXPECT_EQ(ErrorOf("line c at src length 10m cable=\n"),
            "kit.wire:3:32: error: line 'c': missing a cable name after 'cable=' (the cables are "
            "RG-58, RG-174, RG-213, RG-316)");
}

TEST(LineError, CableAndOwnFiguresTogether) {
  EXPECT_EQ(ErrorOf("line c at src length 10m cable=RG-58 z0=50\n"),
            "kit.wire:3:38: error: line 'c': give either cable=NAME or z0=, velocity= and loss=, "
            "not both");
  EXPECT_EQ(ErrorOf("line c at src length 10m z0=50 velocity=0.66 cable=RG-58\n"),
            "kit.wire:3:46: error: line 'c': give either cable=NAME or z0=, velocity= and loss=, "
            "not both");
}

TEST(LineError, MissingLengthOrFigures) {
  EXPECT_EQ(ErrorOf("line c at src cable=RG-58\n"),
            "kit.wire:3:26: error: line 'c': missing 'length LEN' (the length of the line)");
  EXPECT_EQ(ErrorOf("line c at src length 10m\n"),
            "kit.wire:3:25: error: line 'c': missing 'cable=NAME' or 'z0=Z velocity=VF "
            "loss=DB@F,DB@F' (cables: RG-58, RG-174, RG-213, RG-316)");
  EXPECT_EQ(ErrorOf("line c at src length 10m z0=50\n"),
            "kit.wire:3:31: error: line 'c': missing 'velocity=VF' (the velocity factor of the "
            "line)");
  EXPECT_EQ(ErrorOf("line c at src length 0 cable=RG-58\n"),
            "kit.wire:3:22: error: line 'c': length must be positive; got 0 m");
  EXPECT_EQ(ErrorOf("line c at src length 10m cable=RG-58 length 3m\n"),
            "kit.wire:3:38: error: line 'c': length is given twice");
}

TEST(LineError, VelocityOutOfRange) {
  EXPECT_EQ(ErrorOf("line c at src length 10m z0=50 velocity=1.2\n"),
            "kit.wire:3:41: error: line 'c': velocity is the velocity factor, above 0 and at "
            "most 1; got 1.2");
  EXPECT_EQ(ErrorOf("line c at src length 10m z0=50 velocity=0\n"),
            "kit.wire:3:41: error: line 'c': velocity is the velocity factor, above 0 and at "
            "most 1; got 0");
}

TEST(LineError, NegativeOrMalformedLoss) {
  const std::string kLine = "line c at src length 10m z0=50 velocity=0.66 ";
  EXPECT_EQ(ErrorOf(kLine + "loss=-1@10MHz\n"),
            "kit.wire:3:51: error: line 'c': loss must not be negative; got -1 dB/100 m");
  EXPECT_EQ(ErrorOf(kLine + "loss=1@10MHz,-2@30MHz\n"),
            "kit.wire:3:59: error: line 'c': loss must not be negative; got -2 dB/100 m");
  EXPECT_EQ(ErrorOf(kLine + "loss=1@10MHz,2@10MHz\n"),
            "kit.wire:3:51: error: line 'c': the two loss figures are at the same frequency 10 "
            "MHz; give them at two frequencies");
  EXPECT_EQ(ErrorOf(kLine + "loss=0@10MHz,2@30MHz\n"),
            "kit.wire:3:51: error: line 'c': a line with loss at one frequency has loss at every "
            "frequency; give both figures positive, or both 0 for a lossless line");
  EXPECT_EQ(ErrorOf(kLine + "loss=1@10MHz,2@30MHz,3@50MHz\n"),
            "kit.wire:3:67: error: line 'c': loss takes one or two points (loss=1.3@10MHz,"
            "2.5@30MHz); remove the third");
  EXPECT_EQ(ErrorOf(kLine + "loss=1\n"),
            "kit.wire:3:52: error: line 'c': missing '@' and the frequency of the loss figure "
            "(loss=1.3@10MHz)");
  EXPECT_EQ(ErrorOf(kLine + "loss=1@10m\n"),
            "kit.wire:3:53: error: line 'c': loss=DB@F needs a frequency (Hz, kHz, MHz, GHz); got "
            "a length (m)");
  EXPECT_EQ(ErrorOf(kLine + "loss=1@0\n"),
            "kit.wire:3:53: error: line 'c': the frequency of a loss figure must be positive; got "
            "0 Hz");
}

TEST(LineError, UnknownClause) {
  EXPECT_EQ(ErrorOf("line c at src length 10m cable=RG-58 colour=red\n"),
            "kit.wire:3:38: error: line 'c': unexpected 'colour'; the clauses are length LEN and "
            "either cable=NAME or z0=Z velocity=VF [loss=DB@F,DB@F]");
}

}  // namespace
}  // namespace wirefield
