// Unit tests of the Touchstone stage: one-port files (version 1.1 of the Touchstone File
// Format Specification) written and read back, hand-written files in each format and unit,
// malformed files with their exact error text and place, and a measurement compared with a
// sweep. Values are built by hand from the standard's definitions.
#include "wirefield/touchstone.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <random>
#include <string>
#include <vector>

#include "unit/error_text.hpp"

namespace wirefield {
namespace {

constexpr double kPi = 3.14159265358979323846;
// Parsing decimal text is exact to about 1 ulp; values built by hand here go through one
// polar() or pow(): 1e-12 leaves room for both.
constexpr double kTight = 1e-12;

std::string ErrorOf(const std::string& text) {
  return testing::ErrorText([&] { ParseTouchstone(text, "m.s1p"); });
}

TEST(Touchstone, WrittenFileReadsBackWithinOneInATrillion) {
  const std::vector<double> f_hz = {7.0e6, 7.05e6, 7.1e6, 7.2e6};
  const std::vector<Complex> z_ohm = {{12.5, -340.0}, {48.0, -3.25}, {73.1, 42.5}, {2450.0, 900.0}};
  const std::string text = FormatTouchstone(f_hz, z_ohm, 50.0, {"a test", "second line"});
  EXPECT_EQ(text.rfind("! a test\n! second line\n# MHZ S RI R 50\n", 0), 0u) << text;
  const TouchstoneData data = ParseTouchstone(text, "t.s1p");
  ASSERT_EQ(data.points.size(), f_hz.size());
  EXPECT_EQ(data.reference_ohm, 50.0);
  EXPECT_EQ(data.format, TouchstoneFormat::kRealImaginary);
  for (std::size_t i = 0; i < f_hz.size(); ++i) {
    EXPECT_NEAR(data.points[i].frequency_hz / f_hz[i], 1.0, kTight);
    const Complex z = ImpedanceFromReflection(data.points[i].s11, data.reference_ohm);
    EXPECT_NEAR(std::abs(z - z_ohm[i]) / std::abs(z_ohm[i]), 0.0, kTight) << i;
  }
}

TEST(Touchstone, ReadsRealImaginaryInMegahertzWithCommentsAndBlankLines) {
  // S = (Z - R)/(Z + R): Z = 100 ohm against R = 50 gives S = 1/3 (REFERENCES.md section 5,
  // SWR 2 <-> |Gamma| = 0.333).
  const TouchstoneData data = ParseTouchstone(
      "! measured at the campsite mast\n\n# MHz S RI R 50 ! option line\n"
      "14.0 0.3333333333333333 0 ! first\n\n  14.1\t0 0\n",
      "m.s1p");
  ASSERT_EQ(data.points.size(), 2u);
  EXPECT_EQ(data.points[0].frequency_hz, 14.0e6);
  EXPECT_EQ(data.points[0].line, 4);
  EXPECT_NEAR(ImpedanceFromReflection(data.points[0].s11, 50.0).real(), 100.0, 1e-12 * 100.0);
  EXPECT_EQ(data.points[1].frequency_hz, 14.1e6);
  EXPECT_EQ(data.points[1].s11, Complex(0.0, 0.0));
}

TEST(Touchstone, ReadsMagnitudeAngleInDegreesInKilohertz) {
  const TouchstoneData data =
      ParseTouchstone("# KHZ S MA R 75\n7100 0.5 90\n7200 0.2 -45\n", "m.s1p");
  ASSERT_EQ(data.points.size(), 2u);
  EXPECT_EQ(data.reference_ohm, 75.0);
  EXPECT_EQ(data.points[0].frequency_hz, 7.1e6);
  // MA: magnitude and angle in degrees: 0.5 at 90 deg is 0 + j0.5.
  EXPECT_NEAR(data.points[0].s11.real(), 0.0, kTight);
  EXPECT_NEAR(data.points[0].s11.imag(), 0.5, kTight);
  EXPECT_NEAR(data.points[1].s11.real(), 0.2 * std::cos(kPi / 4.0), kTight);
  EXPECT_NEAR(data.points[1].s11.imag(), -0.2 * std::sin(kPi / 4.0), kTight);
}

TEST(Touchstone, ReadsDecibelAngleInHertz) {
  // DB: 20 log10 |S| and angle in degrees: -6.0206 dB is |S| = 0.5 (20 log10 0.5), and
  // -9.5424 dB is |S| = 1/3 (the return loss of SWR 2, REFERENCES.md section 5).
  const TouchstoneData data = ParseTouchstone(
      "# hz s db r 50\n3500000 -6.020599913279624 180\n3600000 -9.542425094393248 0\n", "m.s1p");
  ASSERT_EQ(data.points.size(), 2u);
  EXPECT_EQ(data.points[0].frequency_hz, 3.5e6);
  EXPECT_NEAR(data.points[0].s11.real(), -0.5, kTight);
  EXPECT_NEAR(data.points[0].s11.imag(), 0.0, kTight);
  EXPECT_NEAR(data.points[1].s11.real(), 1.0 / 3.0, kTight);
}

TEST(Touchstone, ReadsGigahertzMagnitudeAngleAndFiftyOhmWithoutAnOptionLine) {
  // The standard's defaults: GHZ, S, MA, R 50.
  const TouchstoneData data = ParseTouchstone("! no option line\n0.0142 0.25 0\n", "m.s1p");
  ASSERT_EQ(data.points.size(), 1u);
  EXPECT_NEAR(data.points[0].frequency_hz, 14.2e6, 1e-6);
  EXPECT_EQ(data.format, TouchstoneFormat::kMagnitudeAngle);
  EXPECT_EQ(data.reference_ohm, 50.0);
  EXPECT_NEAR(data.points[0].s11.real(), 0.25, kTight);
}

TEST(TouchstoneErrors, ASecondOptionLineIsRefusedAtItsHash) {
  // Touchstone 1.1 (EIA/IBIS, 2002): a file has one option line, before the data (from
  // memory); a second one that changed the unit would change every frequency if it were read.
  EXPECT_EQ(ErrorOf("# MHZ S RI R 50\n  # KHZ S MA R 75\n1 0.1 0\n"),
            "m.s1p:2:3: error: a second option line (the first is line 1); a Touchstone file has "
            "one option line: delete this one or merge the two");
  EXPECT_EQ(ErrorOf("# MHZ S RI R 50\n1 0.1 0\n# KHZ\n"),
            "m.s1p:3:1: error: a second option line (the first is line 1); a Touchstone file has "
            "one option line: delete this one or merge the two");
  EXPECT_EQ(ErrorOf("1 0.1 0\n# MHZ S RI R 50\n"),
            "m.s1p:2:1: error: an option line after the data (which starts at line 1); move it "
            "above the first data line");
}

TEST(TouchstoneErrors, TwoNumbersOnADataLine) {
  EXPECT_EQ(ErrorOf("# MHZ S RI R 50\n14.0 0.1 0\n14.1 0.2\n"),
            "m.s1p:3:9: error: a one-port data line needs 3 numbers (the frequency and the two "
            "parts of S11, here RI); this line has 2");
}

TEST(TouchstoneErrors, FourNumbersOnADataLine) {
  EXPECT_EQ(ErrorOf("# MHZ S RI R 50\n14.0 0.1 0 0.5\n"),
            "m.s1p:2:12: error: a one-port data line has 3 numbers (the frequency and the two "
            "parts of S11); this line has 4: is this a file of more than one port?");
}

TEST(TouchstoneErrors, NonNumericValue) {
  EXPECT_EQ(ErrorOf("# MHZ S MA R 50\n14.0 0.1 east\n"),
            "m.s1p:2:10: error: expected a number, got 'east'; a data line holds a frequency "
            "and the two parts of S11 (here MA), separated by spaces; start comments with '!'");
}

TEST(TouchstoneErrors, NotANumberIsRefused) {
  EXPECT_EQ(ErrorOf("# MHZ S MA R 50\n14.0 nan 0\n"),
            "m.s1p:2:6: error: expected a number, got 'nan'; a data line holds a frequency and "
            "the two parts of S11 (here MA), separated by spaces; start comments with '!'");
}

TEST(TouchstoneErrors, DecreasingFrequency) {
  EXPECT_EQ(ErrorOf("# MHZ S RI R 50\n14.1 0 0\n! a comment\n14.05 0 0\n"),
            "m.s1p:4:1: error: the frequency 14.05 is not above the 14.1 of line 2; the data "
            "lines must be in order of increasing frequency, without repeats");
}

TEST(TouchstoneErrors, RepeatedFrequency) {
  EXPECT_EQ(ErrorOf("# MHZ S RI R 50\n14.1 0 0\n 14.1 0 0\n"),
            "m.s1p:3:2: error: the frequency 14.1 is not above the 14.1 of line 2; the data "
            "lines must be in order of increasing frequency, without repeats");
}

TEST(TouchstoneErrors, EmptyFile) {
  const std::string expected =
      "m.s1p: error: no data lines: a one-port Touchstone file needs lines of a frequency and "
      "the two parts of S11, e.g. `14.2 0.1 -0.05` after the option line `# MHZ S RI R 50`";
  EXPECT_EQ(ErrorOf(""), expected);
  EXPECT_EQ(ErrorOf("! only comments\n# MHZ S RI R 50\n\n"), expected);
}

TEST(TouchstoneErrors, UnknownOptionWord) {
  EXPECT_EQ(ErrorOf("# MHZ S XY R 50\n"),
            "m.s1p:1:9: error: unknown word 'XY' in the option line; it takes a frequency unit "
            "(HZ, KHZ, MHZ, GHZ), the parameter S, a format (RI, MA, DB) and R with the "
            "reference resistance, e.g. `# MHZ S RI R 50`");
}

TEST(TouchstoneErrors, ReferenceResistanceMustBePositive) {
  EXPECT_EQ(ErrorOf("# MHZ S RI R 0\n"),
            "m.s1p:1:14: error: the reference resistance after R must be 0.001 ohm to 1e+06 ohm; "
            "got 0 ohm");
  // A reference of 1e-300 ohm is positive but outside the range (model/ranges.cpp).
  EXPECT_EQ(ErrorOf("# MHZ S RI R 1e-300\n"),
            "m.s1p:1:14: error: the reference resistance after R must be 0.001 ohm to 1e+06 ohm; "
            "got 1e-300 ohm");
  EXPECT_EQ(ErrorOf("# MHZ S RI R\n"),
            "m.s1p:1:12: error: R needs the reference resistance in ohm after it, e.g. `R 50`");
}

TEST(TouchstoneErrors, ImpedanceParametersAreNotRead) {
  EXPECT_EQ(ErrorOf("# MHZ Z RI R 50\n"),
            "m.s1p:1:7: error: this file holds Z parameters; only S parameters are read: save "
            "the measurement as S11 (option line `# MHZ S RI R 50`)");
}

TEST(TouchstoneErrors, VersionTwoKeywordsAreRefused) {
  EXPECT_EQ(ErrorOf("[Version] 2.0\n"),
            "m.s1p:1:1: error: '[Version]' is a keyword of Touchstone version 2.0; this reader "
            "takes version 1.1 one-port files: save the file as a version 1 .s1p file");
}

TEST(TouchstoneErrors, BinaryGarbageGivesAReadableMessage) {
  std::string garbage = "# MHZ S RI R 50\n";
  for (int i = 0; i < 64; ++i) garbage += static_cast<char>((i * 37) & 0xff);
  const std::string message = ErrorOf(garbage);
  EXPECT_EQ(message.rfind("m.s1p:2:", 0), 0u) << message;
  for (char c : message) EXPECT_GE(static_cast<unsigned char>(c), 0x20) << message;
}

TEST(TouchstoneErrors, MissingFileIsNamed) {
  EXPECT_EQ(testing::ErrorText([&] { ReadTouchstone("/nonexistent/folder/m.s1p"); }),
            "/nonexistent/folder/m.s1p: error: cannot read the Touchstone file: No such "
            "file or directory");
}

TEST(TouchstoneErrors, RandomTextEitherParsesOrGivesAnInputError) {
  // Never a crash, another exception, or a non-finite value: 3000 random texts drawn from
  // the characters a .s1p file is made of (fixed seed, so a failure repeats).
  const std::string alphabet = "0123456789.-+eE \t\n\r!#[]RIMADBSHZKGrimadbshzkg,x";
  std::mt19937 random(20261202u);
  std::uniform_int_distribution<std::size_t> pick(0, alphabet.size() - 1);
  std::uniform_int_distribution<int> length(0, 120);
  for (int trial = 0; trial < 3000; ++trial) {
    std::string text = trial % 2 == 0 ? "# MHZ S RI R 50\n" : "";
    const int n = length(random);
    for (int i = 0; i < n; ++i) text += alphabet[pick(random)];
    try {
      const TouchstoneData data = ParseTouchstone(text, "r.s1p");
      for (const TouchstonePoint& p : data.points) {
        ASSERT_TRUE(std::isfinite(p.frequency_hz) && std::isfinite(p.s11.real()) &&
                    std::isfinite(p.s11.imag()))
            << text;
      }
    } catch (const InputError& error) {
      ASSERT_EQ(std::string(error.what()).rfind("r.s1p", 0), 0u) << error.what();
    }
  }
}

TEST(ImpedanceFromReflection, MatchesTheDefinitionAtShortMatchAndSwrTwo) {
  // Z = R (1 + S) / (1 - S): S = -1 short, S = 0 match, S = -1/3 is 25 ohm (SWR 2 below R).
  EXPECT_NEAR(std::abs(ImpedanceFromReflection(-1.0, 50.0)), 0.0, kTight);
  EXPECT_NEAR(ImpedanceFromReflection(0.0, 50.0).real(), 50.0, kTight);
  EXPECT_NEAR(ImpedanceFromReflection(-1.0 / 3.0, 50.0).real(), 25.0, 25.0 * kTight);
  EXPECT_THROW(ImpedanceFromReflection(1.0, 50.0), ComputationError);
}

// A sweep of three points with given SWR (the comparison interpolates SWR only).
SweepResult ThreePointSweep() {
  SweepResult sweep;
  sweep.z0_ohm = 50.0;
  const double f_hz[] = {7.0e6, 7.1e6, 7.2e6};
  const double swr[] = {3.0, 1.2, 2.0};
  for (int i = 0; i < 3; ++i) {
    SweepPoint p;
    p.frequency_hz = f_hz[i];
    p.swr = swr[i];
    sweep.points.push_back(p);
  }
  sweep.min_swr = 1.2;
  sweep.min_swr_frequency_hz = 7.1e6;
  return sweep;
}

TEST(CompareMeasured, MeasuredSwrFollowsFromTheReflectionTable) {
  // REFERENCES.md section 5: |Gamma| 0.200 <-> SWR 1.5; 0.333 <-> SWR 2; 0.5 <-> SWR 3.
  const TouchstoneData data = ParseTouchstone(
      "# MHZ S MA R 50\n6.9 0.5 0\n7.05 0.5 30\n7.15 0.2 -60\n7.2 0.3333333333333333 10\n",
      "m.s1p");
  const MeasuredComparison c = CompareMeasured(ThreePointSweep(), data, {{7.0e6, 7.2e6}});
  ASSERT_EQ(c.points.size(), 3u);
  EXPECT_EQ(c.points_outside, 1);         // 6.9 MHz lies below the sweep
  constexpr double kSwrTolerance = 1e-9;  // arithmetic only
  EXPECT_NEAR(c.points[0].measured_swr, 3.0, kSwrTolerance);
  EXPECT_NEAR(c.points[1].measured_swr, 1.5, kSwrTolerance);
  EXPECT_NEAR(c.points[2].measured_swr, 2.0, kSwrTolerance);
  // Linear interpolation: 7.05 MHz is halfway from SWR 3.0 to 1.2; 7.15 halfway 1.2 to 2.0.
  EXPECT_NEAR(c.points[0].predicted_swr, 2.1, kSwrTolerance);
  EXPECT_NEAR(c.points[1].predicted_swr, 1.6, kSwrTolerance);
  EXPECT_NEAR(c.points[2].predicted_swr, 2.0, kSwrTolerance);
  EXPECT_EQ(c.measured_min_swr_frequency_hz, 7.15e6);
  EXPECT_EQ(c.predicted_min_swr_frequency_hz, 7.1e6);
  EXPECT_NEAR(c.shift_hz, 50e3, 1e-6);
}

TEST(CompareMeasured, FileOfAnotherReferenceIsReReferencedToTheSweepsZ0) {
  // A 50 ohm load measured against R = 75: S = (50 - 75)/(50 + 75) = -0.2; against the
  // sweep's 50 ohm it is a match, SWR 1.
  const TouchstoneData data = ParseTouchstone("# MHZ S RI R 75\n7.1 -0.2 0\n", "m.s1p");
  const MeasuredComparison c = CompareMeasured(ThreePointSweep(), data, {{7.0e6, 7.2e6}});
  ASSERT_EQ(c.points.size(), 1u);
  EXPECT_NEAR(c.points[0].measured_swr, 1.0, 1e-12);
  EXPECT_NEAR(c.points[0].measured_z_ohm.real(), 50.0, 50.0 * kTight);
}

TEST(CompareMeasured, TotalReflectionIsAnInputErrorAtItsLine) {
  const TouchstoneData data = ParseTouchstone("# MHZ S MA R 50\n7.1 0.5 0\n7.15 1.0 0\n", "m.s1p");
  EXPECT_EQ(testing::ErrorText([&] {
              CompareMeasured(ThreePointSweep(), data, {{7.0e6, 7.2e6}});
            }),
            "m.s1p:3:1: error: |S11| is 1 here (against 50 ohm): an antenna reflects less "
            "than all the power, so this gives no SWR; check the format word of the "
            "option line (RI, MA or DB)");
}

TEST(CompareMeasured, NoMeasuredPointInsideTheSweepIsAnInputError) {
  const TouchstoneData data = ParseTouchstone("# MHZ S MA R 50\n14.1 0.5 0\n14.2 0.5 0\n", "m");
  EXPECT_EQ(testing::ErrorText([&] {
              CompareMeasured(ThreePointSweep(), data, {{7.0e6, 7.2e6}});
            }),
            "m: error: none of its 2 measured frequencies lies inside the sweep; sweep "
            "over the measured range (its first point is 14.1 MHz, its last 14.2 MHz)");
}

}  // namespace
}  // namespace wirefield
