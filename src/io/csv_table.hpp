#pragma once
// Spreadsheet tables (CSV) read with libcsv, an RFC 4180 parser: comma or semicolon delimiters
// (told from the header line), quoted fields with delimiters, quotes and newlines inside, UTF-8
// with or without a byte-order mark, CRLF or LF line ends. Each row keeps the file line it starts
// on, so a bad value is named by line and column. Also the other way: rows written as CSV.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace bine {

struct CsvRow {
  std::size_t line = 0;  // file line the row starts on (1-based)
  std::vector<std::string> fields;
};

struct CsvTable {
  char delimiter = ',';
  CsvRow header;
  std::vector<CsvRow> rows;  // blank rows left out
};

/// Parses a table whose first non-blank row is the header. Throws InputError naming the file and
/// line for a malformed table (an unclosed quote, a stray quote, no header).
CsvTable parse_csv(std::string_view text, const std::string& file);

/// A number as spreadsheets write it: "4.5", "4,5" (decimal comma), "-2", "1e3", with surrounding
/// spaces; nullopt for anything else ("4.5.1", "1,234.5", "n/a").
std::optional<double> parse_spreadsheet_number(std::string_view text);

/// One CSV line (RFC 4180: a field with a comma, semicolon, quote or line break is quoted, quotes doubled),
/// ending in "\r\n" as the RFC says.
std::string csv_line(const std::vector<std::string>& fields);

}  // namespace bine
