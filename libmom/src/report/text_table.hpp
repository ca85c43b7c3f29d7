// Report stage: a small plain-text table with aligned columns, used by the text reports.
// Input: a header row and data rows of already formatted cells; output: the table as text,
// one line per row, text columns left-aligned and number columns right-aligned.
#pragma once

#include <initializer_list>
#include <string>
#include <vector>

namespace wirefield::report {

enum class Align { kLeft, kRight };

// A column's header (with its unit, e.g. "R (ohm)") and alignment.
struct Column {
  std::string header;
  Align align = Align::kRight;
};

class TextTable {
 public:
  // Adds a column; its header should carry the unit, e.g. "R (ohm)".
  void AddColumn(std::string header, Align align);
  // Adds the columns in order.
  void AddColumns(std::initializer_list<Column> columns);
  // Adds a row; it must have one cell per column.
  void AddRow(std::vector<std::string> cells);
  // Renders the table, every line indented by `indent` spaces and ending in '\n'.
  std::string Render(int indent) const;

 private:
  std::vector<std::string> headers_;
  std::vector<Align> aligns_;
  std::vector<std::vector<std::string>> rows_;
};

}  // namespace wirefield::report
