#include "io/csv_table.hpp"

#include <csv.h>
#include <fmt/format.h>

#include <algorithm>
#include <charconv>
#include <cmath>

#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

/// What libcsv's callbacks fill: the row being read and the rows done.
struct Collector {
  std::size_t line = 0;  // the physical line being fed
  CsvRow row;
  bool row_started = false;
  std::vector<CsvRow> rows;
};

void on_field(void* data, std::size_t size, void* context) {
  auto& collector = *static_cast<Collector*>(context);
  const std::string field(data ? static_cast<const char*>(data) : "", data ? size : 0);
  if (!collector.row_started) {
    // A quoted field may hold line breaks: the row began that many lines earlier.
    const auto breaks = static_cast<std::size_t>(std::count(field.begin(), field.end(), '\n'));
    collector.row.line = collector.line - std::min(breaks, collector.line - 1);
    collector.row_started = true;
  }
  collector.row.fields.push_back(field);
}

void on_row_end(int, void* context) {
  auto& collector = *static_cast<Collector*>(context);
  const bool blank = std::all_of(collector.row.fields.begin(), collector.row.fields.end(),
                                 [](const std::string& field) { return trim_space(field).empty(); });
  if (collector.row_started && !blank) collector.rows.push_back(std::move(collector.row));
  collector.row = CsvRow{};
  collector.row_started = false;
}

/// Semicolon when the header line has more semicolons than commas (outside quotes), else comma.
char guess_delimiter(std::string_view text) {
  std::size_t commas = 0, semicolons = 0;
  bool quoted = false;
  for (char c : text) {
    if (c == '"') quoted = !quoted;
    if (!quoted && (c == '\n' || c == '\r') && commas + semicolons > 0) break;
    if (!quoted) commas += c == ',' ? 1 : 0, semicolons += c == ';' ? 1 : 0;
  }
  return semicolons > commas ? ';' : ',';
}

/// libcsv's parser, freed on every path.
class Parser {
 public:
  explicit Parser(char delimiter) {
    csv_init(&parser_, CSV_STRICT | CSV_STRICT_FINI);
    csv_set_delim(&parser_, static_cast<unsigned char>(delimiter));
  }
  ~Parser() { csv_free(&parser_); }
  Parser(const Parser&) = delete;
  Parser& operator=(const Parser&) = delete;
  bool feed(std::string_view chunk, Collector& collector) {
    return csv_parse(&parser_, chunk.data(), chunk.size(), on_field, on_row_end, &collector) == chunk.size();
  }
  bool finish(Collector& collector) { return csv_fini(&parser_, on_field, on_row_end, &collector) == 0; }

 private:
  csv_parser parser_{};
};

[[noreturn]] void malformed(const std::string& file, std::size_t line, std::string_view what) {
  throw InputError(
      fmt::format("{}: line {}: {} (expected CSV: fields separated by commas or semicolons, a "
                  "field with a separator, quote or line break in double quotes, quotes doubled)",
                  file, line, what));
}

}  // namespace

CsvTable parse_csv(std::string_view text, const std::string& file) {
  if (text.substr(0, 3) == "\xEF\xBB\xBF") text.remove_prefix(3);
  CsvTable table;
  table.delimiter = guess_delimiter(text);
  Parser parser(table.delimiter);
  Collector collector;
  // Fed one physical line at a time, so every callback knows the line it fires on.
  while (!text.empty()) {
    const auto end = text.find('\n');
    const std::string_view chunk = text.substr(0, end == std::string_view::npos ? text.size() : end + 1);
    ++collector.line;
    if (!parser.feed(chunk, collector)) malformed(file, collector.line, "a stray double quote");
    text.remove_prefix(chunk.size());
  }
  if (!parser.finish(collector)) malformed(file, collector.line, "a quoted field is never closed");
  if (collector.rows.empty()) throw InputError(file + ": no header row (the file is empty)");
  table.header = std::move(collector.rows.front());
  table.rows.assign(std::make_move_iterator(collector.rows.begin() + 1), std::make_move_iterator(collector.rows.end()));
  return table;
}

std::optional<double> parse_spreadsheet_number(std::string_view text) {
  std::string number(trim_space(text));
  if (!number.empty() && number.front() == '+') number.erase(0, 1);
  const auto comma = number.find(',');
  if (comma != std::string::npos) {
    // A decimal comma: one comma and no point ("4,5"); "1,234.5" is refused, not guessed.
    if (number.find('.') != std::string::npos || number.find(',', comma + 1) != std::string::npos) return std::nullopt;
    number[comma] = '.';
  }
  if (number.empty()) return std::nullopt;
  double value = 0.0;
  const auto [end, error] = std::from_chars(number.data(), number.data() + number.size(), value);
  if (error != std::errc() || end != number.data() + number.size() || !std::isfinite(value)) return std::nullopt;
  return value;
}

std::string csv_line(const std::vector<std::string>& fields) {
  std::string line;
  for (std::size_t i = 0; i < fields.size(); ++i) {
    if (i > 0) line += ',';
    const std::string& field = fields[i];
    // csv_write quotes every field; a plain one is written as is, so numbers stay numbers. A
    // semicolon is quoted too, so a reader guessing the delimiter cannot take it for one, and so is
    // a field that starts with a byte-order mark, which a reader would drop as the file's own mark
    // at the start of the file (found by fuzz_csv).
    if (field.find_first_of(",;\"\r\n") == std::string::npos && field.rfind("\xEF\xBB\xBF", 0) != 0) {
      line += field;
      continue;
    }
    std::string quoted(field.size() * 2 + 2, '\0');
    quoted.resize(csv_write(quoted.data(), quoted.size(), field.data(), field.size()));
    line += quoted;
  }
  return line + "\r\n";
}

}  // namespace bine
