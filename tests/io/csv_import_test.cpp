// CSV tables (src/io/csv_table.cpp, libcsv) and hop records from spec sheets (src/io/hop_import.cpp).
// Fixtures under tests/fixtures/csv are written by hand: a semicolon file with a UTF-8 byte-order
// mark, decimal commas and a quoted field holding a line break; a comma file with CRLF line ends
// and quoted decimal commas; and a file with bad rows. Variety names are invented.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include "io/csv_table.hpp"
#include "io/hop_import.hpp"
#include "io/loaders.hpp"
#include "model/errors.hpp"

namespace {

std::string read_csv_fixture(const std::string& name) {
  std::ifstream in(std::filesystem::path(BINE_TEST_DIR) / "fixtures" / "csv" / name, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

std::vector<std::string> errors_of(const std::string& text, const bine::CsvImportOptions& options = {}) {
  try {
    bine::read_hop_csv(text, "f.csv", options);
  } catch (const bine::InputError& error) {
    return error.lines();
  }
  return {};
}

bine::Lexicon shipped_lexicon() {
  return bine::load_lexicon(std::filesystem::path(BINE_SOURCE_DATA_DIR) / "lexicon.json");
}

}  // namespace

TEST_CASE("csv: semicolons, a BOM, decimal commas and a quoted line break, rows keep their file line") {
  const auto table = bine::parse_csv(read_csv_fixture("spec-sheet-semicolon.csv"), "s.csv");
  CHECK(table.delimiter == ';');
  REQUIRE(table.header.fields.size() == 8);
  CHECK(table.header.fields[0] == "Variety");  // the byte-order mark is not part of the header
  REQUIRE(table.rows.size() == 3);             // the blank line is left out
  CHECK(table.rows[0].line == 2);
  CHECK(table.rows[0].fields[7] == "Lemon and grapefruit;\nsome fresh-cut grass, hints of wet cardboard");
  CHECK(table.rows[1].line == 4);  // the quoted field ran over line 3
  CHECK(table.rows[2].line == 6);
}

TEST_CASE("csv: spreadsheet numbers, decimal comma or point, and what is refused") {
  CHECK(bine::parse_spreadsheet_number("4,5") == 4.5);
  CHECK(bine::parse_spreadsheet_number(" 4.5 ") == 4.5);
  CHECK(bine::parse_spreadsheet_number("-2") == -2.0);
  CHECK(!bine::parse_spreadsheet_number("1,234.5"));
  CHECK(!bine::parse_spreadsheet_number("4.5.1"));
  CHECK(!bine::parse_spreadsheet_number("n/a"));
}

TEST_CASE("csv: an unclosed quote or a stray quote names the line") {
  std::string message;
  try {
    bine::parse_csv("a,b\n1,\"2\n3,4\n", "q.csv");
  } catch (const bine::InputError& error) {
    message = error.what();
  }
  CHECK(message.find("q.csv: line 3: a quoted field is never closed") != std::string::npos);
}

TEST_CASE("csv write: RFC 4180 quoting, quotes doubled, CRLF line end") {
  CHECK(bine::csv_line({"Fixture A", "4.5", "lemon, pine", "say \"hi\""}) ==
        "Fixture A,4.5,\"lemon, pine\",\"say \"\"hi\"\"\"\r\n");
  const auto again = bine::parse_csv(bine::csv_line({"h1", "h2"}) + bine::csv_line({"a\nb", "x,\"y\""}), "w.csv");
  REQUIRE(again.rows.size() == 1);
  CHECK(again.rows[0].fields[0] == "a\nb");
  CHECK(again.rows[0].fields[1] == "x,\"y\"");
}

TEST_CASE("csv write: a field that starts with a byte-order mark is quoted and reads back (fuzz_csv finding)") {
  // Input of two marks (EF BB BF twice, UTF-8 of U+FEFF): the reader drops the first as the file's
  // mark (RFC 3629 section 6) and keeps the second as the header's only field. Written unquoted, that
  // field would itself be taken for the file's mark and the table read back empty; RFC 4180 allows
  // any field in quotes.
  const std::string mark = "\xEF\xBB\xBF";
  const auto table = bine::parse_csv(mark + mark, "two-marks.csv");
  REQUIRE(table.header.fields.size() == 1);
  CHECK(table.header.fields[0] == mark);
  CHECK(bine::csv_line({mark + "name", "x"}) == "\"" + mark + "name\",x\r\n");
  const auto again = bine::parse_csv(bine::csv_line(table.header.fields), "written.csv");
  REQUIRE(again.header.fields.size() == 1);
  CHECK(again.header.fields[0] == mark);
}

TEST_CASE("hop csv: headers by synonym, units from headers, ranges and decimal commas") {
  const auto records = bine::read_hop_csv(read_csv_fixture("spec-sheet-semicolon.csv"), "s.csv", {});
  REQUIRE(records.hops.size() == 3);
  const auto& lemon = records.hops[0];
  CHECK(lemon.name == "Fixture Lemonfield");
  REQUIRE(lemon.alpha_acid);
  CHECK(lemon.alpha_acid->min == 4.5);  // "4,5-6,0"
  CHECK(lemon.alpha_acid->max == 6.0);
  CHECK(lemon.beta_acid->min == 3.5);
  CHECK(lemon.total_oil->min == 1.2);
  CHECK(lemon.oils.at("myrcene").min == 45.0);
  CHECK(lemon.purpose == bine::Purpose::aroma);
  CHECK(records.hops[2].purpose == bine::Purpose::dual);  // "both"
  // Amount (kg) 2.5 -> 2500 g, "1,25" kg -> 1250 g (exact unit definition); DD.MM.YYYY read.
  const auto certs = bine::read_hop_csv(read_csv_fixture("certificates-comma.csv"), "c.csv", {});
  REQUIRE(certs.hops.size() == 2);
  CHECK(certs.hops[0].on_hand_g == doctest::Approx(2500.0));
  CHECK(certs.hops[1].on_hand_g == doctest::Approx(1250.0));
  CHECK(certs.hops[0].alpha_acid->min == 5.1);  // header "a-acid", cell "5,1"
  CHECK(certs.hops[1].form == bine::HopForm::pellet);
  CHECK(bine::format_date(*certs.hops[1].packaged) == "2025-10-02");
  CHECK(certs.hops[0].hsi == 0.28);
}

TEST_CASE("hop csv: every bad row named with line, column, value and expectation") {
  const auto lines = errors_of(read_csv_fixture("bad-rows.csv"));
  REQUIRE(lines.size() == 2);
  CHECK(lines[0] ==
        "f.csv: line 3, column 2 (\"Alpha (%)\"): \"abc\" is not a number (expected alpha acid as a number such as "
        "4.5 or 4,5)");
  CHECK(lines[1].find("f.csv: line 4, column 2 (\"Alpha (%)\"): 30% is outside the range for alpha acid") == 0);
  bine::CsvImportOptions skip;
  skip.skip_bad = true;
  const auto kept = bine::read_hop_csv(read_csv_fixture("bad-rows.csv"), "f.csv", skip);
  CHECK(kept.hops.size() == 2);
  REQUIRE(kept.skipped.size() == 2);
  CHECK(kept.skipped[0].find("line 3, column 2") == 0);
}

TEST_CASE("hop csv: --columns overrides, an unknown field or header is named, no name column is refused") {
  const std::string text = "Sorte,Gehalt\nFixture A,\"4,5\"\n";
  bine::CsvImportOptions options;
  options.columns = {{"name", "Sorte"}, {"alpha", "gehalt"}};
  const auto records = bine::read_hop_csv(text, "g.csv", options);
  REQUIRE(records.hops.size() == 1);
  CHECK(records.hops[0].alpha_acid->min == 4.5);
  CHECK(errors_of(text).at(0).find("no column for the variety name") != std::string::npos);
  options.columns = {{"alfa", "Gehalt"}};
  CHECK(errors_of(text, options).at(0).find("--columns: unknown field \"alfa\"") == 0);
  options.columns = {{"alpha", "Alpha"}};
  CHECK(errors_of(text, options).at(0).find("no column headed \"Alpha\"") != std::string::npos);
  CHECK(errors_of("Variety,Amount (stone)\nA,1\n").at(0).find("unit \"stone\" is not a mass") != std::string::npos);
}

TEST_CASE("notes: lexicon tags and axis names found, the other words listed") {
  const auto placed =
      bine::place_notes("Bright lemon and fresh-cut grass; peaches, a touch of wet cardboard", shipped_lexicon());
  CHECK(placed.tags == std::vector<std::string>{"lemon", "fresh-cut grass", "peach"});
  CHECK(placed.unplaced == std::vector<std::string>{"wet", "cardboard"});
}

TEST_CASE("hop beerxml: HSI (% lost in 6 months) becomes stability 100 - HSI, never a lot's HSI") {
  const std::string hops =
      "<HOPS><HOP><NAME>Fixture A</NAME><VERSION>1</VERSION><ALPHA>5.5</ALPHA><AMOUNT>0.5</AMOUNT><USE>Boil</USE>"
      "<TIME>60</TIME><HSI>35.0</HSI><TYPE>Both</TYPE><FORM>Plug</FORM><MYRCENE>40</MYRCENE></HOP></HOPS>";
  const auto records = bine::read_hop_beerxml(hops, "h.xml");
  REQUIRE(records.hops.size() == 1);
  CHECK(records.hops[0].stability == 65.0);  // 100 - 35, the 1.0 specification's HSI definition
  CHECK(!records.hops[0].hsi);
  CHECK(records.hops[0].purpose == bine::Purpose::dual);
  CHECK(records.hops[0].on_hand_g == doctest::Approx(500.0));
  std::vector<std::string> report;
  const auto stock = bine::hops_to_stock(records, "s", report);
  CHECK(!stock["lots"][0].contains("hsi"));
}
