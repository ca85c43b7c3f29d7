// CLI tests: `wirefield sweep`: exit codes and the exact text of its bad options, the JSON
// document's keys and types, point counts of --step/--points and of band sweeps, band edges
// per ITU region, resonance and SWR of a thin dipole against textbook values, the CSV, SVG
// and Touchstone files (atomic), and a measured file compared with the prediction.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <complex>
#include <filesystem>
#include <nlohmann/json.hpp>
#include <regex>
#include <sstream>
#include <string>
#include <vector>

#include "cli/json_check.hpp"
#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

// c = 299 792 458 m/s exactly (SI definition of the metre).
constexpr double kSpeedOfLight_m_per_s = 299792458.0;

// A thin centre-fed dipole in free space: total length `fraction` wavelengths at design_hz,
// radius 1e-4 wavelength, as in the induced-EMF table of REFERENCES.md section 1.
std::string DipoleModel(double design_hz, double fraction) {
  const double wavelength_m = kSpeedOfLight_m_per_s / design_hz;
  std::ostringstream text;
  text.precision(17);
  text << "units m\n"
       << "let half = " << fraction * wavelength_m / 2.0 << "\n"
       << "wire dip from (-half, 0, 10) to (half, 0, 10) radius " << 1e-4 * wavelength_m
       << " segments 31\n"
       << "feed src at dip@50%\n"
       << "ground free\n";
  return text.str();
}

std::string DipolePath() {
  // 0.48 wavelength at 28.85 MHz, the middle of the 10 m band.
  static const std::string path = WriteScratchFile("sweep_dipole.wire", DipoleModel(28.85e6, 0.48));
  return path;
}

nlohmann::json SweepJson(const std::vector<std::string>& args) { return RunForJson(args); }

std::string BadInput(const std::vector<std::string>& args) { return RunBadInput(args); }

double SwrOf(std::complex<double> z_ohm, double z0_ohm) {
  // REFERENCES.md section 5: Gamma = (Z - Z0)/(Z + Z0); SWR = (1 + |Gamma|)/(1 - |Gamma|).
  const double g = std::abs((z_ohm - z0_ohm) / (z_ohm + z0_ohm));
  return (1.0 + g) / (1.0 - g);
}

std::complex<double> Z(const nlohmann::json& pair) {
  return {pair.at(0).get<double>(), pair.at(1).get<double>()};
}

// --- JSON contract --------------------------------------------------------------------------

TEST(SweepJson, HasTheContractKeysAndTypes) {
  const nlohmann::json doc = SweepJson(
      {"sweep", DipolePath(), "--from", "28MHz", "--to", "29MHz", "--points", "11", "--json"});
  ASSERT_TRUE(doc.at("points").is_array());
  for (const nlohmann::json& p : doc.at("points")) {
    EXPECT_TRUE(p.at("frequency_hz").is_number());
    ASSERT_TRUE(p.at("z_ohm").is_array());
    EXPECT_EQ(p.at("z_ohm").size(), 2u);
    EXPECT_TRUE(p.at("swr").is_number());
    EXPECT_TRUE(p.at("feed_z_ohm").is_array());
    EXPECT_TRUE(p.at("return_loss_db").is_number());
    EXPECT_TRUE(p.at("transformer_loss_fraction").is_number());
    EXPECT_TRUE(p.at("line_loss_fraction").is_number());
  }
  EXPECT_TRUE(doc.at("resonances_hz").is_array());
  EXPECT_TRUE(doc.at("min_swr").at("frequency_hz").is_number());
  EXPECT_TRUE(doc.at("min_swr").at("swr").is_number());
  EXPECT_TRUE(doc.at("bands").is_array());
  EXPECT_TRUE(doc.at("range").is_object());
  EXPECT_TRUE(doc.at("measured").is_null());
  EXPECT_EQ(doc.at("z0_ohm").get<double>(), 50.0);
  EXPECT_EQ(doc.at("feed").get<std::string>(), "src");
}

TEST(SweepJson, MinSwrIsTheLowestOfThePoints) {
  const nlohmann::json doc = SweepJson(
      {"sweep", DipolePath(), "--from", "27MHz", "--to", "31MHz", "--step", "100kHz", "--json"});
  double lowest = 1e300;
  double where_hz = 0.0;
  for (const nlohmann::json& p : doc.at("points")) {
    if (p.at("swr").get<double>() < lowest) {
      lowest = p.at("swr").get<double>();
      where_hz = p.at("frequency_hz").get<double>();
    }
  }
  EXPECT_EQ(doc.at("min_swr").at("swr").get<double>(), lowest);
  EXPECT_EQ(doc.at("min_swr").at("frequency_hz").get<double>(), where_hz);
}

TEST(SweepJson, SwrAndReturnLossFollowTheReflectionFormulas) {
  const nlohmann::json doc = SweepJson({"sweep", DipolePath(), "--from", "28MHz", "--to", "29MHz",
                                        "--points", "5", "--z0", "75", "--json"});
  // Arithmetic on the printed impedance: 1e-9 relative covers the rounding of the JSON
  // numbers (17 digits) many times over.
  constexpr double kRelative = 1e-9;
  for (const nlohmann::json& p : doc.at("points")) {
    const std::complex<double> z = Z(p.at("z_ohm"));
    const double swr = SwrOf(z, 75.0);
    EXPECT_NEAR(p.at("swr").get<double>(), swr, kRelative * swr);
    // REFERENCES.md section 5: RL = -20 log10 |Gamma|.
    const double rl_db = -20.0 * std::log10(std::abs((z - 75.0) / (z + 75.0)));
    EXPECT_NEAR(p.at("return_loss_db").get<double>(), rl_db, kRelative * rl_db);
    // No transformer or line in the model: the transmitter sees the feed terminals.
    EXPECT_EQ(Z(p.at("feed_z_ohm")), z);
  }
}

// --- counts and band edges -------------------------------------------------------------------

TEST(SweepPoints, StepAndPointsGiveTheirCounts) {
  const nlohmann::json stepped = SweepJson(
      {"sweep", DipolePath(), "--from", "28MHz", "--to", "28.35MHz", "--step", "50kHz", "--json"});
  ASSERT_EQ(stepped.at("points").size(), 8u);  // 28.00, 28.05, ..., 28.35
  EXPECT_DOUBLE_EQ(stepped.at("points").back().at("frequency_hz").get<double>(), 28.35e6);
  const nlohmann::json counted = SweepJson(
      {"sweep", DipolePath(), "--from", "28MHz", "--to", "29MHz", "--points", "7", "--json"});
  ASSERT_EQ(counted.at("points").size(), 7u);
  EXPECT_EQ(counted.at("points").front().at("frequency_hz").get<double>(), 28e6);
  EXPECT_DOUBLE_EQ(counted.at("points").back().at("frequency_hz").get<double>(), 29e6);
}

TEST(SweepMatrix, ExactFillsEveryPointAndTheDefaultInterpolatesWithinTheBound) {
  const std::vector<std::string> args{"sweep",   DipolePath(), "--from", "28MHz", "--to",
                                      "28.1MHz", "--step",     "1kHz",   "--json"};
  const nlohmann::json fast = SweepJson(args);
  std::vector<std::string> exact_args = args;
  exact_args.push_back("--exact");
  const nlohmann::json exact = SweepJson(exact_args);
  EXPECT_TRUE(fast.at("interpolated").get<bool>());
  EXPECT_EQ(fast.at("matrix_fills").get<int>(), 3);  // one window: three anchors
  EXPECT_FALSE(exact.at("interpolated").get<bool>());
  // Every point once, and the point each progress chunk of 48 repeats from the one before.
  EXPECT_EQ(exact.at("matrix_fills").get<int>(), 101 + 2);
  ASSERT_EQ(fast.at("points").size(), exact.at("points").size());
  for (size_t i = 0; i < fast.at("points").size(); ++i) {
    const std::complex<double> za = Z(exact.at("points")[i].at("feed_z_ohm"));
    const std::complex<double> zb = Z(fast.at("points")[i].at("feed_z_ohm"));
    // 0.2% of |Z|: well inside the three figures a feed impedance is quoted to (common
    // practice); docs/performance.md has the measured error (about 1e-7).
    EXPECT_LT(std::abs(zb - za), 2e-3 * std::abs(za)) << i;
  }
}

TEST(SweepBands, FortyMetresRegionOneStopsAt7200KhzAndRegionTwoAt7300) {
  // ITU RR Article 5 (REFERENCES.md section 6); 1 kHz steps: 201 and 301 points.
  const std::string model = WriteScratchFile("sweep_40m.wire", DipoleModel(7.1e6, 0.48));
  const nlohmann::json r1 = SweepJson({"sweep", model, "--band", "40m", "--json"});
  ASSERT_EQ(r1.at("points").size(), 201u);
  EXPECT_EQ(r1.at("points").back().at("frequency_hz").get<double>(), 7200e3);
  EXPECT_EQ(r1.at("bands").at(0).at("to_hz").get<double>(), 7200e3);
  EXPECT_TRUE(r1.at("region_assumed").get<bool>());
  const nlohmann::json r2 = SweepJson({"sweep", model, "--band", "40m", "--region", "2", "--json"});
  ASSERT_EQ(r2.at("points").size(), 301u);
  EXPECT_EQ(r2.at("points").back().at("frequency_hz").get<double>(), 7300e3);
  EXPECT_FALSE(r2.at("region_assumed").get<bool>());
}

TEST(SweepBands, TwoBandsAreSweptInFrequencyOrderWithTheirOwnSummaries) {
  const nlohmann::json doc =
      SweepJson({"sweep", DipolePath(), "--band", "10m", "--band", "12m", "--json"});
  ASSERT_EQ(doc.at("bands").size(), 2u);
  EXPECT_EQ(doc.at("bands").at(0).at("name").get<std::string>(), "12m");
  EXPECT_EQ(doc.at("bands").at(1).at("name").get<std::string>(), "10m");
  // 12 m: 24890-24990 kHz in 1 kHz steps (101); 10 m: 1700 kHz wide, so 401 points.
  EXPECT_EQ(doc.at("points").size(), 101u + 401u);
  EXPECT_EQ(doc.at("bands").at(0).at("points").get<int>(), 101);
  EXPECT_EQ(doc.at("bands").at(1).at("points").get<int>(), 401);
}

TEST(SweepBands, ThinDipoleResonatesInsideTheBandNearTheTextbookLength) {
  // REFERENCES.md section 1 (from memory): a thin free-space dipole resonates at about
  // 0.47-0.49 wavelength with R about 65-73 ohm (test band 63-75). Cut to 0.48 wavelength at
  // 28.85 MHz, it resonates where its length is 0.47-0.49 wavelength: 28.25-29.45 MHz.
  const nlohmann::json doc = SweepJson({"sweep", DipolePath(), "--band", "10m", "--json"});
  const nlohmann::json& band = doc.at("bands").at(0);
  EXPECT_EQ(band.at("from_hz").get<double>(), 28000e3);
  EXPECT_EQ(band.at("to_hz").get<double>(), 29700e3);
  ASSERT_EQ(doc.at("resonances_hz").size(), 1u) << doc.at("resonances_hz");
  const double f_res_hz = doc.at("resonances_hz").at(0).get<double>();
  EXPECT_GT(f_res_hz, 28.85e6 * 0.47 / 0.48);
  EXPECT_LT(f_res_hz, 28.85e6 * 0.49 / 0.48);
  ASSERT_EQ(band.at("resonances_hz").size(), 1u);
  EXPECT_EQ(band.at("resonances_hz").at(0).get<double>(), f_res_hz);
  // The point nearest resonance: R in the textbook's range, X small beside it.
  const nlohmann::json* nearest = nullptr;
  for (const nlohmann::json& p : doc.at("points")) {
    if (nearest == nullptr || std::abs(p.at("frequency_hz").get<double>() - f_res_hz) <
                                  std::abs(nearest->at("frequency_hz").get<double>() - f_res_hz)) {
      nearest = &p;
    }
  }
  const std::complex<double> z = Z(nearest->at("z_ohm"));
  EXPECT_GT(z.real(), 63.0);
  EXPECT_LT(z.real(), 75.0);
  // With R of 63-75 ohm against 50, the SWR at resonance is R/50 = 1.26-1.5 (REFERENCES.md
  // section 5 with X = 0), so the band has a 2:1 range around the resonance.
  EXPECT_GT(band.at("bandwidth_2_hz").get<double>(), 0.0);
  EXPECT_LE(band.at("min_swr").get<double>(), 1.5 + 0.01);
}

// --- text report -----------------------------------------------------------------------------

TEST(SweepText, SaysRegionOneWasAssumedAndCautions) {
  const ProgramRun run = RunWirefield({"sweep", DipolePath(), "--band", "12m"});
  ASSERT_EQ(run.exit_code, 0) << run.err;
  EXPECT_NE(run.out.find("region 1 assumed"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("points: 12m 1 kHz steps, 101 points"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("power lines"), std::string::npos);
  EXPECT_NE(run.out.find("licensed practice"), std::string::npos);
  const ProgramRun given = RunWirefield({"sweep", DipolePath(), "--band", "12m", "--region", "3"});
  EXPECT_EQ(given.out.find("region 1 assumed"), std::string::npos);
  EXPECT_NE(given.out.find("ITU Region 3"), std::string::npos) << given.out;
}

// --- files -----------------------------------------------------------------------------------

std::string Scratch(const std::string& name) {
  return (std::filesystem::path(WriteScratchFile("sweep_probe.txt", "")).parent_path() / name)
      .string();
}

// --- resonances at the antenna terminals and at the transmitter -----------------------------

// A half-wave end-fed wire for 40 m fed through a 3:21 transformer (impedance 1:49) and 10 m
// of 50 ohm coax (illustrative figures of a generic line).
std::string EndFedChainPath() {
  return std::string(WIREFIELD_SOURCE_DIR) + "/tests/models/end_fed_transformer_coax.wire";
}

// The zeros of the reactance at points[].KEY, by linear interpolation between neighbouring
// points where its sign changes (points in frequency order).
std::vector<double> ReactanceZeros(const nlohmann::json& points, const std::string& key) {
  std::vector<double> zeros_hz;
  for (size_t i = 1; i < points.size(); ++i) {
    const double x0 = Z(points.at(i - 1).at(key)).imag(), x1 = Z(points.at(i).at(key)).imag();
    if ((x0 < 0.0) != (x1 < 0.0)) {
      const double f0 = points.at(i - 1).at("frequency_hz").get<double>();
      const double f1 = points.at(i).at("frequency_hz").get<double>();
      zeros_hz.push_back(f0 + (f1 - f0) * x0 / (x0 - x1));
    }
  }
  return zeros_hz;
}

void ExpectSameFrequencies(const nlohmann::json& listed, const std::vector<double>& expected_hz,
                           const std::string& what) {
  ASSERT_EQ(listed.size(), expected_hz.size()) << what << ": " << listed;
  for (size_t k = 0; k < expected_hz.size(); ++k) {
    EXPECT_NEAR(listed.at(k).get<double>(), expected_hz[k], 1e-3) << what << " " << k;
  }
}

TEST(SweepResonances, NamedByPlaceAndEachAZeroOfXThere) {
  const nlohmann::json doc = SweepJson({"sweep", EndFedChainPath(), "--from", "6.4MHz", "--to",
                                        "7.6MHz", "--points", "25", "--exact", "--json"});
  const nlohmann::json& points = doc.at("points");
  // feed_z_ohm is at the antenna terminals, z_ohm at the transmitter (docs/commands.md).
  ExpectSameFrequencies(doc.at("antenna_resonances_hz"), ReactanceZeros(points, "feed_z_ohm"),
                        "antenna terminals");
  ExpectSameFrequencies(doc.at("transmitter_resonances_hz"), ReactanceZeros(points, "z_ohm"),
                        "transmitter");
  // The contract's resonances_hz keeps its meaning: zeros of the feed's own reactance.
  EXPECT_EQ(doc.at("resonances_hz"), doc.at("antenna_resonances_hz"));
  ASSERT_FALSE(doc.at("antenna_resonances_hz").empty());
  EXPECT_NE(doc.at("antenna_resonances_hz"), doc.at("transmitter_resonances_hz"));
  const nlohmann::json& range = doc.at("range");
  EXPECT_EQ(range.at("antenna_resonances_hz"), doc.at("antenna_resonances_hz"));
  EXPECT_EQ(range.at("transmitter_resonances_hz"), doc.at("transmitter_resonances_hz"));
}

TEST(SweepResonances, TextAndSvgNameBothPlaces) {
  const std::string svg = Scratch("sweep_chain.svg");
  const ProgramRun run = RunWirefield({"sweep", EndFedChainPath(), "--from", "6.4MHz", "--to",
                                       "7.6MHz", "--points", "25", "--svg", svg});
  ASSERT_EQ(run.exit_code, 0) << run.err;
  EXPECT_NE(run.out.find("resonances at the antenna terminals (X = 0 there):"), std::string::npos)
      << run.out;
  EXPECT_NE(run.out.find("resonances at the transmitter (X = 0 there):"), std::string::npos)
      << run.out;
  EXPECT_NE(run.out.find("X antenna (ohm)"), std::string::npos) << run.out;
  const std::string picture = ReadFile(svg);
  EXPECT_NE(picture.find("X = 0 at the antenna terminals"), std::string::npos);
  EXPECT_NE(picture.find("X = 0 at the transmitter"), std::string::npos);
  EXPECT_NE(picture.find("X = 0 (antenna) at "), std::string::npos);
}

TEST(SweepFiles, CsvHasAHeaderAndOneRowPerPoint) {
  const std::string csv = Scratch("sweep.csv");
  // A file of the user's own beside the target, named as a temporary file often is, must
  // survive the atomic write.
  const std::string own = WriteScratchFile("sweep.csv.tmp", "mine\n");
  const ProgramRun run = RunWirefield(
      {"sweep", DipolePath(), "--from", "28MHz", "--to", "29MHz", "--points", "9", "--csv", csv});
  ASSERT_EQ(run.exit_code, 0) << run.err;
  std::istringstream in(ReadFile(csv));
  std::string line;
  std::getline(in, line);
  EXPECT_EQ(line,
            "frequency_hz,r_ohm,x_ohm,z_abs_ohm,swr,return_loss_db,feed_r_ohm,feed_x_ohm,"
            "transformer_loss_fraction,line_loss_fraction");
  int rows = 0;
  while (std::getline(in, line)) ++rows;
  EXPECT_EQ(rows, 9);
  EXPECT_FALSE(TemporaryLeftBeside(csv));
  EXPECT_EQ(ReadFile(own), "mine\n");
}

TEST(SweepFiles, SvgIsOneDocumentWithBothPlots) {
  const std::string svg = Scratch("sweep.svg");
  const ProgramRun run = RunWirefield({"sweep", DipolePath(), "--band", "12m", "--svg", svg});
  ASSERT_EQ(run.exit_code, 0) << run.err;
  const std::string text = ReadFile(svg);
  EXPECT_EQ(text.rfind("<svg xmlns=\"http://www.w3.org/2000/svg\"", 0), 0u);
  EXPECT_NE(text.find("</svg>\n"), std::string::npos);
  EXPECT_NE(text.find("class=\"swr\""), std::string::npos);
  EXPECT_NE(text.find("class=\"smith\""), std::string::npos);
  EXPECT_NE(text.find("2:1"), std::string::npos);
  // No attribute or text holds a non-finite number.
  EXPECT_FALSE(std::regex_search(text, std::regex("(=\"|>)-?(nan|inf)", std::regex::icase)));
}

TEST(SweepFiles, TouchstoneOutputReadBackAsMeasuredMatchesThePrediction) {
  // Round trip through the Touchstone file: the "measured" SWR is the predicted one at the
  // same frequencies, so the lowest SWR does not move.
  const std::string s1p = Scratch("sweep.s1p");
  const ProgramRun written = RunWirefield({"sweep", DipolePath(), "--from", "28MHz", "--to",
                                           "29.5MHz", "--points", "31", "--s1p", s1p});
  ASSERT_EQ(written.exit_code, 0) << written.err;
  EXPECT_NE(ReadFile(s1p).find("\n# MHZ S RI R 50\n"), std::string::npos);
  const nlohmann::json doc = SweepJson({"sweep", DipolePath(), "--from", "28MHz", "--to", "29.5MHz",
                                        "--points", "31", "--measured", s1p, "--json"});
  const nlohmann::json& m = doc.at("measured");
  ASSERT_EQ(m.at("points").size(), 31u);
  // 17 significant digits written: SWR agrees to 1e-9 relative after the round trip.
  for (const nlohmann::json& p : m.at("points")) {
    EXPECT_NEAR(p.at("swr").get<double>(), p.at("predicted_swr").get<double>(),
                1e-9 * p.at("swr").get<double>());
  }
  EXPECT_EQ(m.at("shift_hz").get<double>(), 0.0);
}

TEST(SweepFiles, UnwritableSvgExitsTwoNamingTheFileAndLeavesNothing) {
  const std::string csv = Scratch("left_alone.csv");
  const std::string err = BadInput(
      {"sweep", DipolePath(), "--band", "12m", "--csv", csv, "--svg", "/nonexistent/folder/s.svg"});
  EXPECT_EQ(err.rfind("/nonexistent/folder/s.svg: error: cannot write the SVG file: ", 0), 0u)
      << err;
  EXPECT_FALSE(std::filesystem::exists(csv));
  EXPECT_FALSE(TemporaryLeftBeside(csv));
}

// --- bad options -----------------------------------------------------------------------------

TEST(SweepOptions, NoFrequenciesIsExitTwo) {
  EXPECT_EQ(BadInput({"sweep", DipolePath()}),
            "sweep: error: give the frequencies to sweep: --from F1 --to F2 with --step DF or "
            "--points N (e.g. --from 7MHz --to 7.3MHz --step 5kHz), or --band NAME (e.g. --band "
            "40m)\n");
}

TEST(SweepOptions, UnknownBandListsTheNames) {
  EXPECT_EQ(BadInput({"sweep", DipolePath(), "--band", "11m"}),
            "--band:1:1: error: unknown band '11m'; use one of 160m, 80m, 60m, 40m, 30m, 20m, "
            "17m, 15m, 12m, 10m (the amateur bands from 160 m to 10 m)\n");
}

TEST(SweepOptions, RegionMustBeOneToThree) {
  EXPECT_EQ(BadInput({"sweep", DipolePath(), "--band", "40m", "--region", "4"}),
            "--region:1:1: error: --region needs an ITU region: 1 (Europe, Africa, Middle East), "
            "2 (the Americas) or 3 (Asia-Pacific); got '4'\n");
}

TEST(SweepOptions, BandAndRangeTogetherIsExitTwo) {
  EXPECT_EQ(BadInput({"sweep", DipolePath(), "--band", "40m", "--from", "7MHz", "--to", "7.2MHz",
                      "--points", "3"}),
            "--band:1:1: error: --band and --from/--to both choose the frequencies; give --band "
            "NAME or --from F1 --to F2, not both\n");
}

TEST(SweepOptions, StepAndPointsTogetherIsExitTwo) {
  EXPECT_EQ(BadInput({"sweep", DipolePath(), "--from", "7MHz", "--to", "7.2MHz", "--points", "3",
                      "--step", "1kHz"}),
            "--step:1:1: error: a range sweep needs one of --step DF (e.g. --step 5kHz) or "
            "--points N (e.g. --points 101), not both and not neither\n");
}

TEST(SweepOptions, ToBelowFromIsExitTwo) {
  EXPECT_EQ(BadInput({"sweep", DipolePath(), "--from", "7.2MHz", "--to", "7MHz", "--points", "3"}),
            "--to:1:1: error: --to (7 MHz) must be above --from (7.2 MHz)\n");
}

TEST(SweepOptions, PointsMustBeAWholeNumber) {
  EXPECT_EQ(
      BadInput({"sweep", DipolePath(), "--from", "7MHz", "--to", "7.2MHz", "--points", "1.5"}),
      "--points:1:1: error: --points needs a whole number of points from 2 to 100000; "
      "got '1.5'\n");
}

TEST(SweepOptions, StepWithABandIsExitTwo) {
  EXPECT_EQ(BadInput({"sweep", DipolePath(), "--band", "40m", "--step", "1kHz"}),
            "--step:1:1: error: --step applies to --from/--to; a band sweep uses 1 kHz steps, "
            "or 401 points on a band wider than 400 kHz\n");
}

TEST(SweepOptions, MeasuredFileErrorsNameItsLine) {
  const std::string bad = WriteScratchFile("bad.s1p", "# MHZ S RI R 50\n28.1 0.1 0\n28.0 0 0\n");
  EXPECT_EQ(BadInput({"sweep", DipolePath(), "--band", "10m", "--measured", bad}),
            bad +
                ":3:1: error: the frequency 28.0 is not above the 28.1 of line 2; the data "
                "lines must be in order of increasing frequency, without repeats\n");
}

TEST(SweepOptions, ModelWithoutAFeedIsExitTwo) {
  // The model reader or the sweep refuses it; either way the message names the model file.
  const std::string model = WriteScratchFile(
      "sweep_nofeed.wire", "wire w from (0, 0, 10) to (5, 0, 10) radius 1mm\nground free\n");
  const std::string err = BadInput({"sweep", model, "--band", "20m"});
  EXPECT_EQ(err.rfind(model + ":", 0), 0u) << err;
  EXPECT_NE(err.find("no feed"), std::string::npos) << err;
}

}  // namespace
}  // namespace wirefield::cli_test
