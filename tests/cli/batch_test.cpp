// CLI tests: `wirefield batch`: a row equals the same model run through `sweep` and `pattern`
// with the same --set; exit codes and the exact text of bad --vary, --grounds and grid sizes;
// a failing row reported beside good ones with a complete CSV and JSON that parses; the JSON
// keys and types; results that do not depend on --threads.
#include <gtest/gtest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>
#include <vector>

#include "cli/json_check.hpp"
#include "cli/program_runner.hpp"

namespace wirefield::cli_test {
namespace {

std::string Dipole() { return ModelsDir() + "/hiking_club_dipole.wire"; }

// A short sweep around the hiking club dipole's resonance: 9 points 100 kHz apart.
const std::vector<std::string> kRange{"--from", "13.8MHz", "--to", "14.6MHz", "--points", "9"};

std::vector<std::string> Args(std::vector<std::string> head,
                              const std::vector<std::string>& tail = kRange) {
  head.insert(head.end(), tail.begin(), tail.end());
  return head;
}

std::string Hz(double frequency_hz) {
  std::ostringstream text;
  text.precision(17);
  text << frequency_hz;
  return text.str();
}

// Fields of one CSV line, counting commas outside double quotes.
int CsvFields(const std::string& line) {
  int fields = 1;
  bool quoted = false;
  for (char c : line) {
    if (c == '"') quoted = !quoted;
    if (c == ',' && !quoted) ++fields;
  }
  return fields;
}

TEST(BatchCommand, RowEqualsSweepAndPatternWithTheSameSet) {
  const nlohmann::json batch =
      RunForJson(Args({"batch", Dipole(), "--vary", "total=10.3m", "--json"}));
  ASSERT_EQ(batch.at("rows").size(), 1u);
  const nlohmann::json& row = batch.at("rows").at(0);
  ASSERT_TRUE(row.at("error").is_null()) << row.at("error");

  // The same model through the existing commands: `sweep` over the same frequencies ...
  const nlohmann::json sweep =
      RunForJson(Args({"sweep", Dipole(), "--set", "total=10.3m", "--json"}));
  ASSERT_EQ(row.at("resonances_hz").size(), sweep.at("resonances_hz").size());
  for (size_t i = 0; i < row.at("resonances_hz").size(); ++i) {
    EXPECT_DOUBLE_EQ(row.at("resonances_hz").at(i).get<double>(),
                     sweep.at("resonances_hz").at(i).get<double>());
  }
  EXPECT_DOUBLE_EQ(row.at("min_swr").at("swr").get<double>(),
                   sweep.at("min_swr").at("swr").get<double>());
  EXPECT_DOUBLE_EQ(row.at("min_swr").at("frequency_hz").get<double>(),
                   sweep.at("min_swr").at("frequency_hz").get<double>());

  // ... and `pattern` at the row's pattern frequency (its lowest SWR) with the batch's step.
  const double pattern_hz = row.at("pattern_frequency_hz").get<double>();
  EXPECT_EQ(pattern_hz, row.at("min_swr").at("frequency_hz").get<double>());
  const nlohmann::json pattern =
      RunForJson({"pattern", Dipole(), "--set", "total=10.3m", "--freq", Hz(pattern_hz), "--step",
                  "2", "--elevation", "10", "--json"});
  EXPECT_DOUBLE_EQ(row.at("max_gain_dbi").get<double>(), pattern.at("max_gain_dbi").get<double>());
  EXPECT_DOUBLE_EQ(row.at("takeoff_deg").get<double>(),
                   pattern.at("takeoff_elevation_deg").get<double>());
  EXPECT_DOUBLE_EQ(row.at("efficiency").get<double>(), pattern.at("efficiency").get<double>());
  // The low-angle gain is the best of the azimuth cut at 10 deg elevation (2-degree grid),
  // and its azimuth is where that cut peaks.
  const nlohmann::json& cut = pattern.at("azimuth_cut");
  ASSERT_EQ(cut.at("fixed_angle_deg").get<double>(), 10.0);
  size_t best = 0;
  for (size_t i = 1; i < cut.at("gain_dbi").size(); ++i) {
    if (cut.at("gain_dbi").at(i).get<double>() > cut.at("gain_dbi").at(best).get<double>()) {
      best = i;
    }
  }
  EXPECT_DOUBLE_EQ(row.at("gain_at_elevation_dbi").get<double>(),
                   cut.at("gain_dbi").at(best).get<double>());
  EXPECT_DOUBLE_EQ(row.at("gain_at_elevation_azimuth_deg").get<double>(),
                   cut.at("angle_deg").at(best).get<double>());
}

TEST(BatchCommand, TwoBandsGetAPatternEachInTheirOwnBand) {
  // 40 m and 20 m at once: each band's pattern is taken inside that band, at its own lowest
  // SWR, so a 7 MHz gain is never compared with a 14 MHz one.
  const nlohmann::json batch =
      RunForJson({"batch", Dipole(), "--band", "40m", "--band", "20m", "--json"});
  const nlohmann::json& row = batch.at("rows").at(0);
  ASSERT_TRUE(row.at("error").is_null()) << row.at("error");
  const nlohmann::json& bands = row.at("bands");
  ASSERT_EQ(bands.size(), 2u);
  // Band edges in ITU Region 1, the default (Radio Regulations Article 5).
  const double edges[2][2] = {{7.0e6, 7.2e6}, {14.0e6, 14.35e6}};
  for (size_t b = 0; b < 2; ++b) {
    const double f_hz = bands.at(b).at("pattern_frequency_hz").get<double>();
    EXPECT_GE(f_hz, edges[b][0]);
    EXPECT_LE(f_hz, edges[b][1]);
    EXPECT_EQ(f_hz, bands.at(b).at("min_swr").at("frequency_hz").get<double>());
    // The band's pattern is what `pattern` gives at that frequency.
    const nlohmann::json pattern =
        RunForJson({"pattern", Dipole(), "--freq", Hz(f_hz), "--step", "2", "--json"});
    EXPECT_DOUBLE_EQ(bands.at(b).at("max_gain_dbi").get<double>(),
                     pattern.at("max_gain_dbi").get<double>());
  }
  // The row's own figures are those of the band that holds its lowest SWR.
  const size_t own = row.at("min_swr").at("frequency_hz").get<double>() < 1e7 ? 0 : 1;
  EXPECT_EQ(row.at("max_gain_dbi"), bands.at(own).at("max_gain_dbi"));
  ASSERT_TRUE(batch.at("summary").at("bands").is_array());
  EXPECT_EQ(batch.at("summary").at("bands").size(), 2u);
  EXPECT_EQ(batch.at("summary").at("bands").at(1).at("name"), "20m");
}

TEST(BatchCommand, TextTableHasUnitsAndASummary) {
  const ProgramRun run = RunWirefield(Args({"batch", Dipole(), "--vary", "total=9.9m:10.3m:0.2m",
                                            "--at", "14.2MHz", "--grounds", "free,perfect"}));
  ASSERT_TRUE(run.exited && run.exit_code == 0) << Describe(run) << run.err;
  for (const char* text :
       {"6 rows: 2 grounds (free, perfect) x 3 values of total", "total (m)", "resonance (MHz)",
        "SWR @14.2 MHz", "max gain (dBi)", "take-off (deg)", "gain @10 deg (dBi)", "eff (%)",
        "best at 10 deg elevation: row #", "the ground moves the gain at 10 deg elevation by up",
        "safest choice whatever the ground: total=", "licensed practice"}) {
    EXPECT_NE(run.out.find(text), std::string::npos) << text << "\n" << run.out;
  }
}

TEST(BatchCommand, FailingRowIsReportedAndTheOthersRun) {
  const std::string csv = WriteScratchFile("batch_failing.csv", "");
  const ProgramRun run =
      RunWirefield(Args({"batch", Dipole(), "--vary", "total=10m,0m,10.2m", "--csv", csv}));
  ASSERT_TRUE(run.exited && run.exit_code == 0) << Describe(run) << run.err;
  EXPECT_NE(run.out.find("Failed rows (1 of 3; the others ran)"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("#2 (free, total=0m): "), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("wire 'dipole' has zero length"), std::string::npos) << run.out;

  // The CSV is complete: a header and three rows of the same width, the failed one with its
  // reason in the last column.
  std::istringstream lines(ReadFile(csv));
  std::vector<std::string> rows;
  for (std::string line; std::getline(lines, line);) rows.push_back(line);
  ASSERT_EQ(rows.size(), 4u);
  for (const std::string& line : rows) EXPECT_EQ(CsvFields(line), CsvFields(rows[0])) << line;
  EXPECT_NE(rows[2].find("zero length"), std::string::npos);
  EXPECT_EQ(rows[1].back(), ',');  // a row that ran has an empty error column

  const nlohmann::json doc =
      RunForJson(Args({"batch", Dipole(), "--vary", "total=10m,0m,10.2m", "--json"}));
  ASSERT_EQ(doc.at("rows").size(), 3u);
  EXPECT_EQ(doc.at("rows_failed"), 1);
  EXPECT_TRUE(doc.at("rows").at(0).at("error").is_null());
  EXPECT_TRUE(doc.at("rows").at(1).at("error").is_string());
  EXPECT_TRUE(doc.at("rows").at(1).at("min_swr").is_null());
  EXPECT_EQ(doc.at("rows").at(1).at("error_kind"), "input");
  EXPECT_TRUE(doc.at("rows").at(2).at("max_gain_dbi").is_number());
}

TEST(BatchCommand, EveryRowFailingExitsPerTheErrorKind) {
  const std::string err = RunBadInput(Args({"batch", Dipole(), "--vary", "total=0m"}));
  EXPECT_NE(err.find("wire 'dipole' has zero length"), std::string::npos) << err;
}

TEST(BatchCommand, JsonHasTheDocumentedKeysAndTypes) {
  const nlohmann::json doc = RunForJson(Args({"batch", Dipole(), "--vary", "height=1m,3m", "--at",
                                              "14.1MHz", "--grounds", "perfect", "--json"}));
  for (const char* key :
       {"model", "z0_ohm", "grounds", "vary", "spans", "at_hz", "rows", "rows_failed", "summary",
        "elevation_deg", "pattern_step_deg", "threads_used", "elapsed_s", "warnings"}) {
    EXPECT_TRUE(doc.contains(key)) << key;
  }
  EXPECT_TRUE(doc.at("pattern_frequency_hz").is_null());
  ASSERT_EQ(doc.at("rows").size(), 2u);
  for (const nlohmann::json& row : doc.at("rows")) {
    EXPECT_EQ(row.at("ground"), "perfect");
    EXPECT_TRUE(row.at("variables").at("height").is_number());
    EXPECT_TRUE(row.at("resonances_hz").is_array());
    EXPECT_TRUE(row.at("min_swr").at("frequency_hz").is_number());
    EXPECT_TRUE(row.at("min_swr").at("swr").is_number());
    ASSERT_EQ(row.at("swr_at").size(), 1u);
    EXPECT_EQ(row.at("swr_at").at(0).at("frequency_hz"), 14.1e6);
    EXPECT_TRUE(row.at("max_gain_dbi").is_number());
    EXPECT_TRUE(row.at("takeoff_deg").is_number());
    EXPECT_TRUE(row.at("gain_at_elevation_dbi").is_number());
    EXPECT_EQ(row.at("elevation_deg"), 10.0);
    // Over a perfect ground nothing is lost: radiated = input (power balance, within the
    // pattern's 2% energy check).
    EXPECT_NEAR(row.at("efficiency").get<double>(), 1.0, 0.02);
    EXPECT_TRUE(row.at("error").is_null());
  }
  EXPECT_EQ(doc.at("rows").at(0).at("variables").at("height"), 1.0);
  EXPECT_EQ(doc.at("rows").at(1).at("variables").at("height"), 3.0);
  for (nlohmann::json row : doc.at("rows")) {
    row.erase("error");  // null for a row that ran, as documented
    row.erase("error_kind");
    ExpectAllNumbersFinite(row, "row");
  }
}

TEST(BatchCommand, CompareNamesTheModelOnEveryRowOfCsvJsonAndText) {
  // Two models with the same `let`s, two grounds and two heights: 8 rows in the grid order
  // of docs/commands.md (ground slowest, then the model, then the --vary values).
  const std::string mast = ModelsDir() + "/campsite_mast_dipole.wire";
  const std::vector<std::string> base = Args({"batch", Dipole(), "--compare", mast, "--grounds",
                                              "free,perfect", "--vary", "height=6m,8m"});
  const std::vector<std::string> expected{
      "hiking_club_dipole", "hiking_club_dipole", "campsite_mast_dipole", "campsite_mast_dipole",
      "hiking_club_dipole", "hiking_club_dipole", "campsite_mast_dipole", "campsite_mast_dipole"};

  const std::string csv = WriteScratchFile("batch_compare.csv", "");
  std::vector<std::string> with_csv = base;
  with_csv.insert(with_csv.end(), {"--csv", csv});
  const ProgramRun run = RunWirefield(with_csv);
  ASSERT_TRUE(run.exited && run.exit_code == 0) << Describe(run) << run.err;
  std::istringstream lines(ReadFile(csv));
  std::vector<std::string> rows;
  for (std::string line; std::getline(lines, line);) rows.push_back(line);
  ASSERT_EQ(rows.size(), expected.size() + 1);
  EXPECT_EQ(rows[0].rfind("index,ground,model,height_m,", 0), 0u) << rows[0];
  for (size_t i = 0; i < expected.size(); ++i) {
    const std::string& line = rows[i + 1];
    EXPECT_EQ(CsvFields(line), CsvFields(rows[0])) << line;
    const std::string model_field = "\"" + expected[i] + "\"";
    const size_t second_comma = line.find(',', line.find(',') + 1);
    EXPECT_EQ(line.substr(second_comma + 1, model_field.size()), model_field) << line;
  }

  // The text table: one model name on each row, in the same order.
  size_t at = run.out.find("Rows\n");
  ASSERT_NE(at, std::string::npos) << run.out;
  for (const std::string& name : expected) {
    at = run.out.find(name, at + 1);
    EXPECT_NE(at, std::string::npos) << name << "\n" << run.out;
  }

  std::vector<std::string> with_json = base;
  with_json.push_back("--json");
  const nlohmann::json doc = RunForJson(with_json);
  const nlohmann::json& model = doc.at("vary").at(0);
  EXPECT_EQ(model.at("name"), "model");
  EXPECT_EQ(model.at("values"),
            nlohmann::json::array({"hiking_club_dipole", "campsite_mast_dipole"}));
  ASSERT_EQ(doc.at("rows").size(), expected.size());
  for (size_t i = 0; i < expected.size(); ++i) {
    const nlohmann::json& row = doc.at("rows").at(i);
    EXPECT_EQ(row.at("variables").at("model"), expected[i]) << row.dump();
    EXPECT_EQ(row.at("variable_labels").at("model"), expected[i]) << row.dump();
    EXPECT_TRUE(row.at("variables").at("height").is_number());
  }
}

TEST(BatchCommand, ResultsDoNotDependOnThreads) {
  const std::vector<std::string> base =
      Args({"batch", Dipole(), "--vary", "total=9.9m:10.3m:0.1m", "--grounds", "free,perfect"});
  const std::string one_csv = WriteScratchFile("batch_threads_1.csv", "");
  const std::string two_csv = WriteScratchFile("batch_threads_2.csv", "");
  std::vector<std::string> one = base, two = base;
  one.insert(one.end(), {"--threads", "1", "--csv", one_csv});
  two.insert(two.end(), {"--threads", "2", "--csv", two_csv});
  ASSERT_EQ(RunWirefield(one).exit_code, 0);
  ASSERT_EQ(RunWirefield(two).exit_code, 0);
  EXPECT_FALSE(ReadFile(one_csv).empty());
  EXPECT_EQ(ReadFile(one_csv), ReadFile(two_csv));
}

TEST(BatchCommand, UnknownVariableIsExit2BeforeAnyRow) {
  EXPECT_EQ(RunBadInput(Args({"batch", Dipole(), "--vary", "lenght=10m,11m"})),
            "--vary lenght: error: the model has no variable 'lenght' (its variables: f_mhz, "
            "total, height, wire_diameter)\n");
}

TEST(BatchCommand, BadGroundNameListsThePresets) {
  const std::string err = RunBadInput(Args({"batch", Dipole(), "--grounds", "medium_dry,swamp"}));
  EXPECT_EQ(err.rfind("--grounds:1:1: error: unknown ground 'swamp'; use all, or a "
                      "comma-separated list of ",
                      0),
            0u)
      << err;
  for (const char* name : {"sea_water", "medium_dry", "very_dry", "free", "perfect"}) {
    EXPECT_NE(err.find(name), std::string::npos) << name;
  }
}

TEST(BatchCommand, AllInAListSaysThatItStandsAlone) {
  for (const char* list : {"all,free", "perfect, all"}) {
    const std::string err = RunBadInput(Args({"batch", Dipole(), "--grounds", list}));
    EXPECT_EQ(err.rfind("--grounds:1:1: error: 'all' stands alone: --grounds all runs every "
                        "ground preset and nothing else; to add free or perfect, list the presets "
                        "by name: --grounds sea_water,",
                        0),
              0u)
        << err;
    EXPECT_NE(err.find(",free,perfect\n"), std::string::npos) << err;
    EXPECT_EQ(err.find("unknown ground"), std::string::npos) << err;
  }
}

TEST(BatchCommand, LargeGridNeedsYesLarge) {
  const std::string err = RunBadInput(
      Args({"batch", Dipole(), "--vary", "total=5m:15m:0.1m", "--vary", "height=1m:20m:1m"}));
  EXPECT_EQ(err,
            "batch: error: the grid has 2020 rows (1 ground x 101 values of total x 20 values of "
            "height), more than 2000; each row is a sweep and a pattern. Use fewer grounds or "
            "coarser --vary steps, or pass --yes-large to run it anyway\n");
}

// Past 100000 rows the rows stream to the CSV file as they finish; the text and JSON reports,
// which hold every row in memory, are refused before any row runs.
TEST(BatchCommand, VeryLargeGridNeedsCsvAndNoJson) {
  const std::vector<std::string> large = Args({"batch", Dipole(), "--vary", "total=5m:15m:0.1m",
                                               "--vary", "height=1m:1000m:1m", "--yes-large"});
  EXPECT_EQ(RunBadInput(large),
            "batch: error: the grid has 101000 rows, more than 100000, the most the text and "
            "JSON reports hold (they keep every row in memory); give --csv FILE: the rows then "
            "go to FILE as they finish and stdout gets a short account\n");
  std::vector<std::string> with_json = large;
  for (const char* extra : {"--csv", "never_written.csv", "--json"}) with_json.push_back(extra);
  EXPECT_EQ(RunBadInput(with_json),
            "batch: error: the grid has 101000 rows, more than 100000, the most the text and "
            "JSON reports hold (they keep every row in memory); drop --json: the rows go to the "
            "--csv file and stdout gets a short text account\n");
}

TEST(BatchCommand, BadOptionsReadLikeTheOtherCommands) {
  EXPECT_EQ(RunBadInput({"batch", Dipole()}),
            "batch: error: give the frequencies to sweep: --from F1 --to F2 with --step DF or "
            "--points N (e.g. --from 7MHz --to 7.3MHz --step 5kHz), or --band NAME (e.g. --band "
            "40m)\n");
  EXPECT_EQ(RunBadInput(Args({"batch", Dipole(), "--vary", "total=10m:9m:1m"})),
            "--vary total:1:1: error: the last value (9m) must not be below the first (10m)\n");
  EXPECT_EQ(RunBadInput(Args({"batch", Dipole(), "--pattern-step", "20"})),
            "--pattern-step:1:1: error: the pattern step must be greater than 0 and at most 10 "
            "degrees; got 20\n");
  EXPECT_EQ(RunBadInput(Args({"batch", Dipole(), "--at", "fast"})).substr(0, 11), "--at:1:1: e");
}

}  // namespace
}  // namespace wirefield::cli_test
