// The --csv writer: numbers the C way whatever the locale, booleans as spreadsheets read them, and
// every field back through our libcsv reader as it went in.
#include "report/csv_sheet.hpp"

#include <doctest/doctest.h>

#include <stdexcept>

#include "io/csv_table.hpp"

TEST_CASE("csv_number: shortest round-trip digits, '.' as decimal point, no thousands separator, no -0") {
  // Exact decimal forms (hand arithmetic: each is the shortest text that reads back to the double).
  CHECK(bine::csv_number(9.71) == "9.71");
  CHECK(bine::csv_number(1000.0) == "1000");
  CHECK(bine::csv_number(1234567.5) == "1234567.5");
  CHECK(bine::csv_number(-2.0) == "-2");
  CHECK(bine::csv_number(-0.0) == "0");
  CHECK(bine::csv_number(0.1 + 0.2) == "0.30000000000000004");  // IEEE 754: 0.1 + 0.2 is not 0.3
  CHECK(bine::csv_number(std::nullopt).empty());
  CHECK(bine::csv_bool(true) == "true");
}

TEST_CASE("CsvSheet: one header row, CRLF lines, fields with commas, quotes and semicolons read back whole") {
  bine::CsvSheet sheet({"variety", "alpha today (%)"});
  sheet.add_row({"Test, \"quoted\" hop", bine::csv_number(9.71)});
  sheet.add_row({"semi; colon", ""});
  const std::string text = sheet.str();
  // RFC 4180: a field with a comma or quote in double quotes, quotes doubled; lines end in CRLF.
  CHECK(text == "variety,alpha today (%)\r\n\"Test, \"\"quoted\"\" hop\",9.71\r\n\"semi; colon\",\r\n");
  const auto table = bine::parse_csv(text, "sheet.csv");
  CHECK(table.delimiter == ',');
  REQUIRE(table.rows.size() == 2);
  CHECK(table.rows[0].fields == std::vector<std::string>{"Test, \"quoted\" hop", "9.71"});
  CHECK(table.rows[1].fields == std::vector<std::string>{"semi; colon", ""});
  CHECK_THROWS_AS(sheet.add_row({"one field only"}), std::logic_error);
}
