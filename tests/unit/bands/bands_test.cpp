// Unit tests of the bands stage: the amateur band table against the ITU Radio Regulations
// (REFERENCES.md section 6), name lookup and its errors, the points of a band sweep, and the
// per-band summary of a sweep (lowest SWR, resonances, SWR bandwidths clipped to the band).
#include "wirefield/bands.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <string>
#include <vector>

#include "unit/error_text.hpp"

namespace wirefield {
namespace {

// The table holds the edges exactly as published (whole or half kHz): compare exactly.
struct Edges {
  const char* name;
  int region;
  double from_khz;
  double to_khz;
};

// ITU Radio Regulations, Article 5, Edition of 2020, as transcribed in REFERENCES.md section 6
// (confirmation status per row there; 10 m upper edge 29700 kHz is (from memory)).
const Edges kPublished[] = {
    {"160m", 1, 1810, 1850},    {"160m", 2, 1800, 2000},    {"160m", 3, 1800, 2000},
    {"80m", 1, 3500, 3800},     {"80m", 2, 3500, 4000},     {"80m", 3, 3500, 3900},
    {"60m", 1, 5351.5, 5366.5}, {"60m", 2, 5351.5, 5366.5}, {"60m", 3, 5351.5, 5366.5},
    {"40m", 1, 7000, 7200},     {"40m", 2, 7000, 7300},     {"40m", 3, 7000, 7200},
    {"30m", 1, 10100, 10150},   {"30m", 2, 10100, 10150},   {"30m", 3, 10100, 10150},
    {"20m", 1, 14000, 14350},   {"20m", 2, 14000, 14350},   {"20m", 3, 14000, 14350},
    {"17m", 1, 18068, 18168},   {"17m", 2, 18068, 18168},   {"17m", 3, 18068, 18168},
    {"15m", 1, 21000, 21450},   {"15m", 2, 21000, 21450},   {"15m", 3, 21000, 21450},
    {"12m", 1, 24890, 24990},   {"12m", 2, 24890, 24990},   {"12m", 3, 24890, 24990},
    {"10m", 1, 28000, 29700},   {"10m", 2, 28000, 29700},   {"10m", 3, 28000, 29700},
};

TEST(BandTable, EveryEdgeMatchesTheRadioRegulations) {
  for (const Edges& row : kPublished) {
    const Band band = FindBand(row.name, row.region);
    EXPECT_EQ(band.from_hz, row.from_khz * 1e3) << row.name << " region " << row.region;
    EXPECT_EQ(band.to_hz, row.to_khz * 1e3) << row.name << " region " << row.region;
    EXPECT_EQ(band.region, row.region);
  }
}

TEST(BandTable, FortyMetresStopsAt7200KhzInRegionOneAnd7300InRegionTwo) {
  // REFERENCES.md section 6: "A sweep preset '40 m, Region 1' must stop at 7200 kHz"; 7200-7300
  // kHz is Region 2 only (RR footnote 5.142).
  EXPECT_EQ(FindBand("40m", 1).to_hz, 7200e3);
  EXPECT_EQ(FindBand("40m", 2).to_hz, 7300e3);
  EXPECT_EQ(FindBand("40m", 3).to_hz, 7200e3);
}

TEST(BandTable, ListsTenBandsLowestFirstInEveryRegion) {
  for (int region = 1; region <= 3; ++region) {
    const std::vector<Band> table = BandTable(region);
    ASSERT_EQ(table.size(), 10u);
    for (std::size_t i = 1; i < table.size(); ++i) {
      EXPECT_LT(table[i - 1].to_hz, table[i].from_hz) << table[i].name;
    }
  }
  EXPECT_EQ(BandNames().front(), "160m");
  EXPECT_EQ(BandNames().back(), "10m");
}

TEST(BandTable, SixtyAndThirtyMetresAreSecondary) {
  // RR Article 5 (REFERENCES.md section 6): 5351.5-5366.5 kHz and 10100-10150 kHz secondary.
  EXPECT_NE(FindBand("60m", 1).allocation.find("secondary"), std::string::npos);
  EXPECT_NE(FindBand("30m", 2).allocation.find("secondary"), std::string::npos);
}

TEST(FindBand, AcceptsUpperCaseAndASpace) {
  EXPECT_EQ(FindBand("40M", 1).from_hz, 7000e3);
  EXPECT_EQ(FindBand("40 m", 1).from_hz, 7000e3);
}

TEST(FindBand, UnknownNameListsTheNames) {
  EXPECT_EQ(testing::ErrorText([&] { FindBand("41m", 1); }),
            "band:1:1: error: unknown band '41m'; use one of 160m, 80m, 60m, 40m, 30m, "
            "20m, 17m, 15m, 12m, 10m (the amateur bands from 160 m to 10 m)");
}

TEST(FindBand, RegionOutsideOneToThreeIsAnInputError) {
  EXPECT_EQ(testing::ErrorText([&] { FindBand("40m", 4); }),
            "region:1:1: error: region must be 1, 2 or 3 (the ITU regions: 1 Europe, "
            "Africa and the Middle East; 2 the Americas; 3 Asia and the Pacific); got 4");
}

TEST(BandSpan, NarrowBandGetsOneKilohertzStepsEdgeToEdge) {
  const SweepSpan span = BandSpan(FindBand("40m", 1));
  ASSERT_EQ(span.frequencies_hz.size(), 201u);  // 7000..7200 kHz in 1 kHz steps
  EXPECT_EQ(span.frequencies_hz.front(), 7000e3);
  EXPECT_EQ(span.frequencies_hz.back(), 7200e3);
  EXPECT_EQ(span.frequencies_hz[1] - span.frequencies_hz[0], 1e3);
  EXPECT_EQ(span.how, "1 kHz steps, 201 points");
}

TEST(BandSpan, WideBandGets401PointsEdgeToEdge) {
  const SweepSpan span = BandSpan(FindBand("10m", 1));  // 1700 kHz wide
  ASSERT_EQ(span.frequencies_hz.size(), 401u);
  EXPECT_EQ(span.frequencies_hz.front(), 28000e3);
  EXPECT_DOUBLE_EQ(span.frequencies_hz.back(), 29700e3);
  EXPECT_EQ(span.how, "401 points, 4.25 kHz apart");
}

TEST(BandSpan, SixtyMetresHalfKilohertzEdgesAreBothSwept) {
  const SweepSpan span = BandSpan(FindBand("60m", 1));  // 5351.5-5366.5 kHz, 15 kHz wide
  ASSERT_EQ(span.frequencies_hz.size(), 16u);
  EXPECT_EQ(span.frequencies_hz.front(), 5351.5e3);
  EXPECT_DOUBLE_EQ(span.frequencies_hz.back(), 5366.5e3);
}

// A series RLC resonator (R = 50 ohm) sampled at 1 kHz: Z = R + j(wL - 1/(wC)). With R = z0
// the reflection coefficient is Gamma = jX / (2R + jX), so SWR <= s exactly where
// |X| <= 2R |Gamma_s| / sqrt(1 - |Gamma_s|^2), |Gamma_s| = (s - 1)/(s + 1) (REFERENCES.md
// section 5: Gamma, SWR).
constexpr double kPi = 3.14159265358979323846;
constexpr double kR_ohm = 50.0;
constexpr double kL_h = 20e-6;
constexpr double kF0_hz = 7.1e6;
const double kC_f = 1.0 / (std::pow(2.0 * kPi * kF0_hz, 2) * kL_h);

double Reactance(double f_hz) {
  const double w = 2.0 * kPi * f_hz;
  return w * kL_h - 1.0 / (w * kC_f);
}

SweepResult ResonatorSweep(double from_hz, double to_hz) {
  SweepResult sweep;
  sweep.z0_ohm = kR_ohm;
  for (double f_hz = from_hz; f_hz <= to_hz + 0.5; f_hz += 1e3) {
    SweepPoint p;
    p.frequency_hz = f_hz;
    p.feed_impedance_ohm = p.transmitter_impedance_ohm = {kR_ohm, Reactance(f_hz)};
    const double g =
        std::abs((p.transmitter_impedance_ohm - kR_ohm) / (p.transmitter_impedance_ohm + kR_ohm));
    p.swr = (1.0 + g) / (1.0 - g);
    sweep.points.push_back(p);
  }
  sweep.resonances_hz = {kF0_hz};  // 1/(2 pi sqrt(LC)) by construction of kC_f
  sweep.min_swr = 1.0;
  sweep.min_swr_frequency_hz = kF0_hz;
  return sweep;
}

// The frequency above f0 where the resonator's X reaches x_ohm (bisection on the monotone X).
double FrequencyOfReactance(double x_ohm) {
  double low = kF0_hz;
  double high = 2.0 * kF0_hz;
  for (int i = 0; i < 200; ++i) {
    const double mid = 0.5 * (low + high);
    (Reactance(mid) < x_ohm ? low : high) = mid;
  }
  return 0.5 * (low + high);
}

TEST(SummarizeBand, ResonatorBandwidthsMatchTheReflectionFormula) {
  const SweepResult sweep = ResonatorSweep(6.9e6, 7.3e6);
  const BandSummary summary = SummarizeBand(sweep, FindBand("40m", 2));
  // SWR linearly interpolated between 1 kHz points: the curve's bend over 1 kHz moves a
  // crossing by far less than 50 Hz here (the SWR changes by about 0.01 per kHz).
  constexpr double kEdgeTolerance_hz = 50.0;
  auto x_limit = [](double s) {
    const double g = (s - 1.0) / (s + 1.0);
    return 2.0 * kR_ohm * g / std::sqrt(1.0 - g * g);
  };
  for (double s : {2.0, 1.5}) {
    const double high_hz = FrequencyOfReactance(x_limit(s));
    // The resonator's X is not symmetric in f; find the lower edge the same way below f0.
    double low = 0.5 * kF0_hz;
    double high = kF0_hz;
    for (int i = 0; i < 200; ++i) {
      const double mid = 0.5 * (low + high);
      (Reactance(mid) < -x_limit(s) ? low : high) = mid;
    }
    const auto& ranges = s == 2.0 ? summary.swr_2_ranges_hz : summary.swr_1_5_ranges_hz;
    ASSERT_EQ(ranges.size(), 1u) << "SWR " << s;
    EXPECT_NEAR(ranges[0].first, std::max(0.5 * (low + high), 7000e3), kEdgeTolerance_hz);
    EXPECT_NEAR(ranges[0].second, std::min(high_hz, 7300e3), kEdgeTolerance_hz);
  }
  EXPECT_EQ(summary.points, 301);
  EXPECT_DOUBLE_EQ(summary.min_swr_frequency_hz, kF0_hz);
  ASSERT_EQ(summary.resonances_hz.size(), 1u);
  EXPECT_DOUBLE_EQ(summary.resonances_hz[0], kF0_hz);
  EXPECT_FALSE(summary.covered);  // the resonator's 2:1 range is narrower than 300 kHz
}

TEST(SummarizeBand, BandInsideTheTwoToOneRangeIsCovered) {
  // The 60 m band (15 kHz) sits inside the resonator's SWR <= 2 range when f0 is in it.
  SweepResult sweep = ResonatorSweep(5.3005e6, 5.4005e6);  // on the half kHz, as the band
  for (SweepPoint& p : sweep.points) {
    const double x = Reactance(p.frequency_hz - 5.359e6 + kF0_hz);  // f0 moved to 5359 kHz
    p.transmitter_impedance_ohm = {kR_ohm, x};
    const double g = std::abs(Complex(0.0, x) / Complex(2.0 * kR_ohm, x));
    p.swr = (1.0 + g) / (1.0 - g);
  }
  sweep.resonances_hz = {5.359e6};
  const BandSummary summary = SummarizeBand(sweep, FindBand("60m", 1));
  EXPECT_TRUE(summary.covered);
  ASSERT_EQ(summary.swr_2_ranges_hz.size(), 1u);
  EXPECT_EQ(summary.swr_2_ranges_hz[0].first, 5351.5e3);  // clipped to the band's edges
  EXPECT_EQ(summary.swr_2_ranges_hz[0].second, 5366.5e3);
  EXPECT_EQ(summary.bandwidth_2_hz, 15e3);
}

TEST(SummarizeBand, NoPointInsideTheBandIsAnInputError) {
  const SweepResult sweep = ResonatorSweep(6.9e6, 7.3e6);
  EXPECT_EQ(testing::ErrorText([&] { SummarizeBand(sweep, FindBand("20m", 1)); }),
            "band:1:1: error: no sweep point falls inside the 20m band "
            "(14000.0-14350.0 kHz); sweep over the band itself");
}

}  // namespace
}  // namespace wirefield
