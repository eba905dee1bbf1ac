#pragma once
// Real HTML tables for the reports. Each cell may name the JSON value it shows (a JSON pointer into
// the same run's --json document, and the factor the page multiplies it by, e.g. 100 for a share
// shown in %; or the pointers subtracted from it, for a figure the JSON holds as parts), so a test
// can check every number on the page against the JSON. Each cell also carries its column heading
// (data-label). On a phone (360 px) a table that fits stays a table; one too wide for it
// (class "cards", from an estimate of its narrowest width) becomes one card per row, each cell
// labelled with its heading, a column of long text across the whole card.
#include <string>
#include <vector>

namespace bine::html {

struct Column {
  std::string heading;
  bool numeric = false;     // right-aligned, tabular figures
  bool keep_whole = false;  // never broken across lines (lot codes)
};

struct Cell {
  std::string text;  // plain text, escaped when rendered
  std::string json;  // JSON pointer(s) of the value(s) shown, in order, space-separated; or empty
  double scale = 1.0;
  std::string minus;  // JSON pointers subtracted from the first value (stock left = on hand - used)
  bool sum = false;   // the one number shown is the sum of the values the pointers name (a total)
  Cell() = default;
  Cell(std::string t) : text(std::move(t)) {}  // NOLINT: plain text converts implicitly
  Cell(const char* t) : text(t) {}             // NOLINT: so does a literal
  Cell(std::string t, std::string pointer, double factor = 1.0)
      : text(std::move(t)), json(std::move(pointer)), scale(factor) {}
};

class Table {
 public:
  Table(std::string caption, std::vector<Column> columns);
  void add_row(std::vector<Cell> cells);
  /// The totals row (in <tfoot>); at most one.
  void set_total(std::vector<Cell> cells);
  bool empty() const { return rows_.empty(); }
  std::string str() const;
  /// The table's narrowest width on a phone, in CSS px (an estimate from its characters: every
  /// figure and piece kept whole on one line, headings in at most two lines, cell padding).
  double phone_width() const;

 private:
  std::string row_html(const std::vector<Cell>& cells, bool total) const;
  std::string cell_class(std::size_t column, const Cell& cell) const;
  bool long_text(std::size_t column) const;
  std::string caption_;
  std::vector<Column> columns_;
  std::vector<std::vector<Cell>> rows_;
  std::vector<Cell> total_;
};

/// The width a table may need on a 360 px phone and still stay a table: 360 px less the page's
/// side padding (2 x 0.75 rem).
inline constexpr double kPhoneColumnPx = 336.0;

/// The attributes that tie a shown number to its JSON value (empty when `pointer` is empty).
std::string json_attributes(const Cell& cell);

}  // namespace bine::html
