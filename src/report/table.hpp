#pragma once
// Aligned text tables for the terminal. Cells are UTF-8; widths count code points.
#include <ostream>
#include <string>
#include <vector>

namespace bine {

enum class Align { left, right };

class TextTable {
 public:
  struct Column {
    std::string header;
    Align align = Align::left;
  };
  explicit TextTable(std::vector<Column> columns);
  void add_row(std::vector<std::string> cells);
  /// A rule across the table before the next row (for totals).
  void add_rule();
  void render(std::ostream& out, const std::string& indent = "") const;

 private:
  std::vector<Column> columns_;
  std::vector<std::vector<std::string>> rows_;  // an empty row is a rule
};

/// Number of code points in a UTF-8 string (display width for Latin text).
std::size_t display_width(const std::string& text);

}  // namespace bine
