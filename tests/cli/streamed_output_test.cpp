// Tests of the program's streamed output (cli/output_files.hpp, StreamedOutput), the CSV of a
// batch grid past 100000 rows: the rows of a batch written through it as they finish are the
// same bytes as the CSV written whole (FormatBatchCsv), the memory it holds stays within its
// buffer however many rows pass, the text waits in PATH.wirefield-XXXXXX until the commit,
// and CommitTo (batch's CSV.partial) leaves the path as it was. The rules themselves are
// those of docs/commands.md, "Output files".
#include <gtest/gtest.h>
#include <sys/stat.h>

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <string>
#include <vector>

#include "cli/program_runner.hpp"
#include "output_files.hpp"
#include "wirefield/batch.hpp"
#include "wirefield/report.hpp"

namespace wirefield::cli_test {
namespace {

using cli::InputPath;
using cli::OutputPath;
using cli::StreamedOutput;

// A small centre-fed dipole near 14 MHz; 11 segments and 3 sweep points keep a row to
// milliseconds.
const char* kDipole =
    "units m\n"
    "let total = 10m\n"
    "let height = 5m\n"
    "wire d from (-total / 2, 0, height) to (total / 2, 0, height) radius 1mm segments 11\n"
    "feed src at d@50%\n"
    "ground free\n";

// 3 x 60 = 180 rows on two threads, so that rows finish out of order and wait for the ones
// before them.
BatchOptions GridOptions() {
  BatchOptions options;
  SweepSpan span;
  span.name = "range";
  span.frequencies_hz = FrequencyPoints(13.5e6, 15.5e6, 3);
  options.spans.push_back(span);
  options.pattern_step_deg = 10.0;
  options.pattern_frequency_hz = 14.2e6;
  options.mesh_estimate = false;
  options.threads = 2;
  options.variables.push_back(BatchVariableFromValues("height", {"3m", "5m", "8m"}));
  options.variables.push_back(BatchVariableFromRange("total", "9.5m", "10.68m", "0.02m"));
  return options;
}

// The size of the only PATH.wirefield-XXXXXX beside `path`; -1 when there is none.
std::intmax_t TemporarySize(const std::string& path) {
  const std::filesystem::path file(path);
  const std::string prefix = file.filename().string() + ".wirefield-";
  std::intmax_t size = -1;
  for (const auto& entry : std::filesystem::directory_iterator(file.parent_path())) {
    if (entry.path().filename().string().rfind(prefix, 0) != 0) continue;
    EXPECT_EQ(size, -1) << "more than one temporary beside " << path;
    size = static_cast<std::intmax_t>(entry.file_size());
  }
  return size;
}

TEST(StreamedOutput, BatchRowsMatchTheCsvWrittenWholeAndTheBufferStaysBounded) {
  const BatchOptions whole_options = GridOptions();
  const BatchResult whole = RunBatch(kDipole, "dipole.wire", whole_options);
  ASSERT_EQ(whole.rows.size(), 180u);
  const std::string expected = FormatBatchCsv(whole);

  const std::string csv = WriteScratchFile("streamed_rows.csv", "old rows\n");
  ::chmod(csv.c_str(), 0640);
  // A small buffer, so that the 180 rows (about 30 kB) flush it many times.
  constexpr std::size_t kBuffer = 2048;
  StreamedOutput out(OutputPath{csv, "CSV"}, {InputPath{"dipole.wire", "model"}}, kBuffer);
  BatchOptions options = GridOptions();
  int rows = 0;
  std::size_t longest_piece = 0;
  std::intmax_t most_on_disk = 0;
  options.row_sink = [&](const BatchResult& run, const BatchRow& row) {
    EXPECT_EQ(row.index, rows) << "rows come in grid order";
    std::string piece = rows++ == 0 ? FormatBatchCsvHeader(run) : "";
    piece += FormatBatchCsvRow(run, row);
    longest_piece = std::max(longest_piece, piece.size());
    out.Append(piece);
    // What is not in the buffer is already in the temporary on disk, not in memory.
    const std::intmax_t on_disk = TemporarySize(csv);
    EXPECT_EQ(static_cast<std::uintmax_t>(on_disk) + out.buffered_bytes(), out.appended_bytes());
    most_on_disk = std::max(most_on_disk, on_disk);
  };
  const BatchResult streamed = RunBatch(kDipole, "dipole.wire", options);
  EXPECT_TRUE(streamed.rows.empty());
  EXPECT_EQ(rows, 180);
  EXPECT_EQ(ReadFile(csv), "old rows\n") << "the CSV is replaced only by the commit";
  out.Commit();

  EXPECT_EQ(ReadFile(csv), expected) << "byte for byte the CSV written whole";
  EXPECT_FALSE(TemporaryLeftBeside(csv));
  struct stat status {};
  ASSERT_EQ(::stat(csv.c_str(), &status), 0);
  EXPECT_EQ(status.st_mode & 07777, 0640u) << "the existing file's permission bits are kept";
  // The memory held: the buffer never passed its size and one row, while the whole text was
  // over ten times that and went to disk as the rows came.
  EXPECT_EQ(out.appended_bytes(), expected.size());
  EXPECT_GT(out.appended_bytes(), 10 * kBuffer);
  EXPECT_LT(out.most_buffered_bytes(), kBuffer + longest_piece);
  EXPECT_GE(most_on_disk, static_cast<std::intmax_t>(expected.size() - kBuffer - longest_piece));
}

TEST(StreamedOutput, CommitToWritesThePartialFileAndLeavesThePathAsItWas) {
  const std::string csv = WriteScratchFile("streamed_partial.csv", "old rows\n");
  const std::string partial = csv + ".partial";
  std::filesystem::remove(partial);
  std::string text;
  {
    StreamedOutput out(OutputPath{csv, "CSV"}, {}, 100);
    for (int i = 0; i < 50; ++i) {
      const std::string line = std::to_string(i) + ",a row of the grid\n";
      out.Append(line);
      text += line;
    }
    out.CommitTo(OutputPath{partial, "partial CSV"});
    EXPECT_LT(out.most_buffered_bytes(), 100u + 30u);
  }
  EXPECT_EQ(ReadFile(partial), text);
  EXPECT_EQ(ReadFile(csv), "old rows\n");
  EXPECT_FALSE(TemporaryLeftBeside(csv));
  EXPECT_FALSE(TemporaryLeftBeside(partial));
}

TEST(StreamedOutput, AnOutputNeverCommittedLeavesNoTemporary) {
  const std::string csv = WriteScratchFile("streamed_dropped.csv", "old rows\n");
  {
    StreamedOutput out(OutputPath{csv, "CSV"}, {}, 16);
    out.Append("0,a row that is never committed\n");
    EXPECT_GT(TemporarySize(csv), 0);
  }
  EXPECT_EQ(ReadFile(csv), "old rows\n");
  EXPECT_FALSE(TemporaryLeftBeside(csv));
}

TEST(StreamedOutput, ADeviceIsWrittenThroughFromASpool) {
  // /dev/null is a character device: written through, never replaced (docs/commands.md).
  StreamedOutput out(OutputPath{"/dev/null", "CSV"}, {}, 16);
  for (int i = 0; i < 100; ++i) out.Append("0,a row for the device\n");
  out.Commit();
  struct stat status {};
  ASSERT_EQ(::stat("/dev/null", &status), 0);
  EXPECT_TRUE(S_ISCHR(status.st_mode));
}

TEST(StreamedOutput, AnOutputOntoAnInputIsRefusedBeforeAnyText) {
  const std::string model = WriteScratchFile("streamed_model.wire", "units m\n");
  try {
    StreamedOutput out(OutputPath{model, "CSV"}, {InputPath{model, "model"}});
    ADD_FAILURE() << "an output onto the model was accepted";
  } catch (const InputError& error) {
    EXPECT_NE(std::string(error.what()).find("the CSV file to write is the model file"),
              std::string::npos)
        << error.what();
  }
  EXPECT_EQ(ReadFile(model), "units m\n");
  EXPECT_FALSE(TemporaryLeftBeside(model));
}

}  // namespace
}  // namespace wirefield::cli_test
