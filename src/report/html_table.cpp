#include "report/html_table.hpp"

#include <fmt/format.h>

#include "report/output_format.hpp"

namespace bine::html {

std::string json_attributes(const Cell& cell) {
  if (cell.json.empty()) return "";
  std::string out = " data-json=\"" + html_escape(cell.json) + "\"";
  if (cell.scale != 1.0) out += fmt::format(" data-scale=\"{:g}\"", cell.scale);
  if (!cell.minus.empty()) out += " data-minus=\"" + html_escape(cell.minus) + "\"";
  if (cell.sum) out += " data-sum=\"yes\"";
  return out;
}

Table::Table(std::string caption, std::vector<Column> columns)
    : caption_(std::move(caption)), columns_(std::move(columns)) {}

void Table::add_row(std::vector<Cell> cells) { rows_.push_back(std::move(cells)); }

void Table::set_total(std::vector<Cell> cells) { total_ = std::move(cells); }

std::string Table::row_html(const std::vector<Cell>& cells) const {
  std::string out = "<tr>";
  for (std::size_t c = 0; c < columns_.size(); ++c) {
    const Cell empty;
    const Cell& cell = c < cells.size() ? cells[c] : empty;
    const char* css = columns_[c].numeric ? " class=\"num\"" : columns_[c].keep_whole ? " class=\"code\"" : "";
    out += fmt::format("<td data-label=\"{}\"{}{}>{}</td>", html_escape(columns_[c].heading), css,
                       json_attributes(cell), html_escape(cell.text));
  }
  return out + "</tr>\n";
}

std::string Table::str() const {
  std::string out = "<table class=\"sheet\">\n";
  if (!caption_.empty()) out += "<caption>" + html_escape(caption_) + "</caption>\n";
  out += "<thead><tr>";
  for (const auto& column : columns_)
    out +=
        fmt::format("<th scope=\"col\"{}>{}</th>", column.numeric ? " class=\"num\"" : "", html_escape(column.heading));
  out += "</tr></thead>\n<tbody>\n";
  for (const auto& row : rows_) out += row_html(row);
  out += "</tbody>\n";
  if (!total_.empty()) out += "<tfoot>\n" + row_html(total_) + "</tfoot>\n";
  return out + "</table>\n";
}

}  // namespace bine::html
