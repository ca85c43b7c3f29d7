// CLI tests of `solve --currents FILE`: one row per segment, each wire from its start; the
// current vanishes at free wire ends and meets the feed current at the feed; Kirchhoff's
// current law at a junction of three wires; --power scales the currents as it scales the
// stress report; JSON by the file's extension; and a bad path is exit 2 before any work.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <map>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>
#include <vector>

#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

// A hiking club's 10 m dipole with a 3 m drop wire hanging from its centre-right joint: three
// wires meet at (0, 0, 10); the feed is on the left half.
const char* kTee =
    "units m\n"
    "wire a from (-5, 0, 10) to (0, 0, 10) radius 1mm segments 10\n"
    "wire b from (0, 0, 10) to (5, 0, 10) radius 1mm segments 10\n"
    "wire c from (0, 0, 10) to (0, 0, 7) radius 1mm segments 6\n"
    "feed src at a@50%\n"
    "frequency 14.2MHz\n";

struct Row {
  std::string wire;
  int segment = 0;
  double from_m = 0.0;
  double to_m = 0.0;
  std::complex<double> start, centre, end;
  std::string excitation;
};

std::complex<double> Phasor(double magnitude, double phase_deg) {
  return std::polar(magnitude, phase_deg * std::acos(-1.0) / 180.0);
}

std::vector<Row> ReadCsv(const std::string& text) {
  std::istringstream lines(text);
  std::string line;
  std::getline(lines, line);
  EXPECT_EQ(line,
            "wire,segment,from_m,to_m,x_start_m,y_start_m,z_start_m,x_end_m,y_end_m,z_end_m,"
            "i_start_peak_a,i_start_phase_deg,i_centre_peak_a,i_centre_phase_deg,i_end_peak_a,"
            "i_end_phase_deg,excitation");
  std::vector<Row> rows;
  while (std::getline(lines, line)) {
    std::vector<std::string> f;
    std::istringstream cells(line);
    for (std::string cell; std::getline(cells, cell, ',');) f.push_back(cell);
    if (f.size() != 17) {
      ADD_FAILURE() << "row of " << f.size() << " cells: " << line;
      continue;
    }
    Row r;
    r.wire = f[0];
    r.segment = std::stoi(f[1]);
    r.from_m = std::stod(f[2]);
    r.to_m = std::stod(f[3]);
    r.start = Phasor(std::stod(f[10]), std::stod(f[11]));
    r.centre = Phasor(std::stod(f[12]), std::stod(f[13]));
    r.end = Phasor(std::stod(f[14]), std::stod(f[15]));
    r.excitation = f[16];
    rows.push_back(r);
  }
  return rows;
}

std::vector<Row> SolveCurrents(const std::string& model, const std::string& csv,
                               std::vector<std::string> extra = {}) {
  std::vector<std::string> args{"solve", model, "--no-mesh-estimate", "--currents", csv};
  args.insert(args.end(), extra.begin(), extra.end());
  const ProgramRun run = RunWirefield(args);
  EXPECT_EQ(run.exit_code, 0) << Describe(run) << run.err;
  EXPECT_NE(run.out.find(csv), std::string::npos) << "the report names the file written";
  return ReadCsv(ReadFile(csv));
}

TEST(Currents, OneRowPerSegmentEachWireFromItsStart) {
  const std::string model = WriteScratchFile("tee.wire", kTee);
  const std::vector<Row> rows = SolveCurrents(model, WriteScratchFile("tee.csv", ""));
  ASSERT_EQ(rows.size(), 26u);  // 10 + 10 + 6 segments
  std::map<std::string, int> count;
  for (const Row& r : rows) EXPECT_EQ(r.segment, ++count[r.wire]) << r.wire;
  EXPECT_EQ(count["c"], 6);
  EXPECT_DOUBLE_EQ(rows[9].to_m, 5.0);  // wire a ends 5 m from its start
  EXPECT_EQ(rows[0].excitation, "1 V peak at each feed (or its model voltage)");
}

TEST(Currents, VanishAtFreeEndsAndMeetKirchhoffsLawAtTheJunction) {
  const std::string model = WriteScratchFile("tee2.wire", kTee);
  const std::vector<Row> rows = SolveCurrents(model, WriteScratchFile("tee2.csv", ""));
  ASSERT_EQ(rows.size(), 26u);
  double largest = 0.0;
  for (const Row& r : rows) largest = std::max(largest, std::abs(r.centre));
  ASSERT_GT(largest, 0.0);
  // Thin-wire boundary condition: no current leaves a wire's open end (King, "The Theory of
  // Linear Antennas", 1956, from memory); the free ends are a's start, b's end and c's end.
  EXPECT_LT(std::abs(rows[0].start), 1e-6 * largest);
  EXPECT_LT(std::abs(rows[19].end), 1e-6 * largest);
  EXPECT_LT(std::abs(rows[25].end), 1e-6 * largest);
  // Kirchhoff's current law at the joint (0, 0, 10): what arrives on a equals what leaves on
  // b and c. The file's 6 significant digits bound the residual.
  const std::complex<double> residual = rows[9].end - rows[10].start - rows[20].start;
  EXPECT_LT(std::abs(residual), 1e-5 * largest) << residual;
}

TEST(Currents, MeetTheFeedCurrentAtTheFeedAndScaleWithPower) {
  const std::string model = WriteScratchFile("tee3.wire", kTee);
  const std::string csv = WriteScratchFile("tee3.csv", "");
  const std::vector<Row> solved = SolveCurrents(model, csv);
  const ProgramRun json = RunWirefield({"solve", model, "--no-mesh-estimate", "--json"});
  ASSERT_EQ(json.exit_code, 0) << json.err;
  const nlohmann::json doc = nlohmann::json::parse(json.out);
  const std::complex<double> feed(doc["feeds"][0]["current_a"][0].get<double>(),
                                  doc["feeds"][0]["current_a"][1].get<double>());
  // The feed sits at a@50%, the node between a's segments 5 and 6.
  ASSERT_EQ(solved.size(), 26u);
  EXPECT_LT(std::abs(solved[4].end - feed), 1e-5 * std::abs(feed)) << solved[4].end << feed;
  EXPECT_LT(std::abs(solved[5].start - feed), 1e-5 * std::abs(feed));
  // At a power every current is the solved one times the stress's scale, sqrt(P / P_solved)
  // with no transformer or line here (P = V I* / 2 at the feed).
  const double p_solved_w = doc["feeds"][0]["power_w"].get<double>();
  const std::vector<Row> at_power = SolveCurrents(model, csv, {"--power", "100W"});
  ASSERT_EQ(at_power.size(), solved.size());
  const double scale = std::sqrt(100.0 / p_solved_w);
  for (std::size_t i = 0; i < solved.size(); ++i) {
    EXPECT_NEAR(std::abs(at_power[i].centre), std::abs(solved[i].centre) * scale,
                1e-5 * std::abs(solved[i].centre) * scale + 1e-12)
        << i;
  }
  EXPECT_EQ(at_power[0].excitation, "100 W from the transmitter");
}

TEST(Currents, JsonWhenTheFileEndsInJson) {
  const std::string model = WriteScratchFile("tee4.wire", kTee);
  const std::string path = WriteScratchFile("tee4.json", "");
  const ProgramRun run =
      RunWirefield({"solve", model, "--no-mesh-estimate", "--currents", path, "--json"});
  ASSERT_EQ(run.exit_code, 0) << run.err;
  // stdout stays one JSON document.
  EXPECT_TRUE(nlohmann::json::accept(run.out)) << run.out;
  const nlohmann::json doc = nlohmann::json::parse(ReadFile(path));
  EXPECT_EQ(doc["frequency_hz"].get<double>(), 14.2e6);
  ASSERT_EQ(doc["segments"].size(), 26u);
  EXPECT_EQ(doc["segments"][20]["wire"], "c");
  EXPECT_EQ(doc["segments"][20]["segment"], 1);
  EXPECT_TRUE(doc["segments"][20]["current_centre"]["peak_a"].is_number());
}

TEST(Currents, AnUnwritablePathIsExitTwoBeforeTheSolve) {
  const std::string model = WriteScratchFile("tee5.wire", kTee);
  const std::string err =
      RunBadInput({"solve", model, "--currents", "/nonexistent-folder/currents.csv"});
  EXPECT_NE(err.find("/nonexistent-folder/currents.csv"), std::string::npos) << err;
}

}  // namespace
}  // namespace wirefield::cli_test
