#include "report/table.hpp"

#include <algorithm>

namespace bine {

std::size_t display_width(const std::string& text) {
  std::size_t width = 0;
  for (unsigned char c : text)
    if ((c & 0xC0) != 0x80) ++width;
  return width;
}

TextTable::TextTable(std::vector<Column> columns) : columns_(std::move(columns)) {}

void TextTable::add_row(std::vector<std::string> cells) {
  cells.resize(columns_.size());
  rows_.push_back(std::move(cells));
}

void TextTable::add_rule() { rows_.emplace_back(); }

void TextTable::render(std::ostream& out, const std::string& indent) const {
  std::vector<std::size_t> widths(columns_.size());
  for (std::size_t c = 0; c < columns_.size(); ++c) {
    widths[c] = display_width(columns_[c].header);
    for (const auto& row : rows_)
      if (!row.empty()) widths[c] = std::max(widths[c], display_width(row[c]));
  }
  auto emit = [&](const std::vector<std::string>& cells) {
    std::string line = indent;
    for (std::size_t c = 0; c < columns_.size(); ++c) {
      const std::size_t pad = widths[c] - display_width(cells[c]);
      if (c > 0) line += "  ";
      if (columns_[c].align == Align::right)
        line += std::string(pad, ' ') + cells[c];
      else
        line += cells[c] + (c + 1 < columns_.size() ? std::string(pad, ' ') : "");
    }
    while (!line.empty() && line.back() == ' ') line.pop_back();
    out << line << '\n';
  };
  std::vector<std::string> headers;
  for (const auto& column : columns_) headers.push_back(column.header);
  emit(headers);
  std::size_t total = 0;
  for (std::size_t c = 0; c < widths.size(); ++c) total += widths[c] + (c ? 2 : 0);
  const std::string rule = indent + std::string(total, '-');
  out << rule << '\n';
  for (const auto& row : rows_) {
    if (row.empty())
      out << rule << '\n';
    else
      emit(row);
  }
}

}  // namespace bine
