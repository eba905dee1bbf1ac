#pragma once
// --csv: a command's result as one RFC 4180 table for spreadsheets. One header row whose headings
// carry the units ("alpha today (%)", "on hand (g)"), then one row per item; numbers in the
// canonical units, written the C way ('.' decimal point, no thousands separator, whatever the
// locale) with the same rounding as the command's JSON, so the two outputs agree figure for figure.
// Quoting is libcsv's (io/csv_table: csv_line), lines end in CRLF as the RFC says.
#include <optional>
#include <string>
#include <vector>

namespace bine {

/// A table of text fields under one header row, written as CSV.
class CsvSheet {
 public:
  explicit CsvSheet(std::vector<std::string> headers);
  /// One row; it must have as many fields as there are headers.
  void add_row(std::vector<std::string> fields);
  std::size_t columns() const { return headers_.size(); }
  /// The header row and every row, each a CSV line ending in "\r\n".
  std::string str() const;

 private:
  std::vector<std::string> headers_;
  std::vector<std::vector<std::string>> rows_;
};

/// `value` the shortest way that reads back to the same double ("9.6474", "1000", "1e-07"),
/// '.' as decimal point whatever the locale; never "-0".
std::string csv_number(double value);
/// As above; empty for a value that is not there.
std::string csv_number(const std::optional<double>& value);
/// "true" or "false", as spreadsheets read booleans.
std::string csv_bool(bool value);

}  // namespace bine
