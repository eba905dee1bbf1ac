#include "report/html_table.hpp"

#include <fmt/format.h>

#include <algorithm>

#include "report/html_text.hpp"
#include "report/output_format.hpp"
#include "report/table.hpp"

namespace bine::html {
namespace {

// Character widths for the phone estimate, in CSS px: DejaVu Sans (the fallback the stylesheet
// names) at the phone's table size, 15 px x 0.92 = 13.8 px: digits are 0.636 em (8.8 px), lower-case
// letters about 0.56 em; 8.6 px a character errs wide. Headings are bold, about 10 % wider.
constexpr double kCellCharPx = 8.6;
constexpr double kHeadingCharPx = 9.4;
constexpr double kCellPaddingPx = 2 * 0.45 * 16.0;  // th, td padding: .45rem each side
// Text longer than this in a column's cells gets the whole width of a card.
constexpr std::size_t kLongText = 18;
// Half a card, less the gap between label and value: (336 px - 0.9 rem between the halves) / 2 - 0.5 rem.
constexpr double kHalfCardPx = (kPhoneColumnPx - 0.9 * 16.0) / 2 - 0.5 * 16.0;

bool has_digit(const std::string& text) {
  return std::any_of(text.begin(), text.end(), [](char c) { return c >= '0' && c <= '9'; });
}

// Characters a cell needs on one line: all of a figure or a code, else its longest piece kept whole.
std::size_t narrowest_chars(const Column& column, const Cell& cell) {
  if (column.keep_whole || (column.numeric && has_digit(cell.text))) return display_width(cell.text);
  std::size_t chars = 0;
  for (const auto& piece : unbroken_pieces(cell.text)) chars = std::max(chars, display_width(piece));
  return chars;
}

}  // namespace

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

// A column whose cells want a card's whole width: long text, or a figure that, with the longest
// word of its heading beside it, is wider than half a card.
bool Table::long_text(std::size_t column) const {
  const Column& col = columns_[column];
  std::size_t label = 0;
  for (const auto& piece : unbroken_pieces(col.heading)) label = std::max(label, display_width(piece));
  return std::any_of(rows_.begin(), rows_.end(), [&](const std::vector<Cell>& row) {
    if (column >= row.size()) return false;
    const double unbroken = kCellCharPx * static_cast<double>(narrowest_chars(col, row[column]));
    if (kHeadingCharPx * static_cast<double>(label) + unbroken > kHalfCardPx) return true;
    return !col.numeric && !col.keep_whole && display_width(row[column].text) > kLongText;
  });
}

// A figure (a number with its unit) and a code never break; a numeric column's words ("see
// above", "between balanced and very bitter") wrap as text does.
std::string Table::cell_class(std::size_t column, const Cell& cell) const {
  if (columns_[column].numeric) {
    if (!has_digit(cell.text)) return " class=\"num words\"";
    return long_text(column) ? " class=\"num long\"" : " class=\"num\"";
  }
  if (columns_[column].keep_whole) return long_text(column) ? " class=\"code long\"" : " class=\"code\"";
  return long_text(column) ? " class=\"long\"" : "";
}

std::string Table::row_html(const std::vector<Cell>& cells, bool total) const {
  std::string out = "<tr>";
  for (std::size_t c = 0; c < columns_.size(); ++c) {
    const Cell empty;
    const Cell& cell = c < cells.size() ? cells[c] : empty;
    const std::string css = cell_class(c, cell);
    const bool whole = columns_[c].keep_whole || (columns_[c].numeric && has_digit(cell.text));
    // The totals row's own label ("total", "all varieties") needs no column heading beside it on a card.
    const bool own_label = total && !columns_[c].numeric && !has_digit(cell.text);
    // Text with pieces kept whole is one span, so that a card (a flex row: label, value) sees one value.
    std::string body = whole ? html_escape(cell.text) : text_html(cell.text);
    if (body.find("<span") != std::string::npos) body = "<span>" + body + "</span>";
    out += fmt::format("<td data-label=\"{}\"{}{}>{}</td>", own_label ? "" : html_escape(columns_[c].heading), css,
                       json_attributes(cell), body);
  }
  return out + "</tr>\n";
}

double Table::phone_width() const {
  double width = 0.0;
  for (std::size_t c = 0; c < columns_.size(); ++c) {
    double column = kHeadingCharPx * static_cast<double>(heading_min_chars(columns_[c].heading));
    const auto widen = [&](const std::vector<Cell>& row) {
      if (c < row.size())
        column = std::max(column, kCellCharPx * static_cast<double>(narrowest_chars(columns_[c], row[c])));
    };
    for (const auto& row : rows_) widen(row);
    widen(total_);
    width += column + kCellPaddingPx;
  }
  return width;
}

std::string Table::str() const {
  std::string out = phone_width() <= kPhoneColumnPx ? "<table class=\"sheet\">\n" : "<table class=\"sheet cards\">\n";
  if (!caption_.empty()) out += "<caption>" + text_html(caption_) + "</caption>\n";
  out += "<thead><tr>";
  for (const auto& column : columns_)
    out += fmt::format("<th scope=\"col\"{}>{}</th>", column.numeric ? " class=\"num\"" : "",
                       heading_html(column.heading));
  out += "</tr></thead>\n<tbody>\n";
  for (const auto& row : rows_) out += row_html(row, false);
  out += "</tbody>\n";
  if (!total_.empty()) out += "<tfoot>\n" + row_html(total_, true) + "</tfoot>\n";
  return out + "</table>\n";
}

}  // namespace bine::html
