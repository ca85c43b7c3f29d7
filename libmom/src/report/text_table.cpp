// Report stage: renders a TextTable (header, a rule of dashes, rows) with aligned columns.
// Input: formatted cells; output: text. Widths count bytes, which is exact for the ASCII the
// reports write.
#include "report/text_table.hpp"

#include <algorithm>

#include "wirefield/model.hpp"

namespace wirefield::report {

void TextTable::AddColumn(std::string header, Align align) {
  headers_.push_back(std::move(header));
  aligns_.push_back(align);
}

void TextTable::AddColumns(std::initializer_list<Column> columns) {
  for (const Column& column : columns) AddColumn(column.header, column.align);
}

void TextTable::AddRow(std::vector<std::string> cells) {
  if (cells.size() != headers_.size()) {
    throw ComputationError("internal error: a report table row has the wrong number of cells");
  }
  rows_.push_back(std::move(cells));
}

std::string TextTable::Render(int indent) const {
  std::vector<std::size_t> widths(headers_.size());
  for (std::size_t c = 0; c < headers_.size(); ++c) {
    widths[c] = headers_[c].size();
    for (const auto& row : rows_) widths[c] = std::max(widths[c], row[c].size());
  }
  const std::string margin(static_cast<std::size_t>(std::max(indent, 0)), ' ');
  auto render_row = [&](const std::vector<std::string>& cells) {
    std::string line = margin;
    for (std::size_t c = 0; c < cells.size(); ++c) {
      if (c > 0) line += "  ";
      const std::string pad(widths[c] - cells[c].size(), ' ');
      const bool last = c + 1 == cells.size();
      if (aligns_[c] == Align::kRight) {
        line += pad + cells[c];
      } else {
        line += cells[c];
        if (!last) line += pad;
      }
    }
    return line + "\n";
  };
  std::string out = render_row(headers_);
  std::vector<std::string> rule;
  rule.reserve(widths.size());
  for (std::size_t w : widths) rule.emplace_back(w, '-');
  out += render_row(rule);
  for (const auto& row : rows_) out += render_row(row);
  return out;
}

}  // namespace wirefield::report
