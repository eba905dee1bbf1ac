// Text tables: column widths, alignment, rules and display width of UTF-8 text. Expected layouts
// are written out by hand from the cells given.
#include "report/table.hpp"

#include <doctest/doctest.h>

#include <sstream>
#include <string>

using bine::Align;
using bine::display_width;
using bine::TextTable;

TEST_CASE("display width counts code points, not bytes, of UTF-8 text") {
  CHECK(display_width("") == 0);
  CHECK(display_width("Saaz") == 4);
  // "Žatec": Ž is two bytes in UTF-8 (U+017D), so 6 bytes and 5 code points.
  const std::string zatec =
      "\xc5\xbd"
      "atec";
  REQUIRE(zatec.size() == 6);
  CHECK(display_width(zatec) == 5);
  // "°C": ° is U+00B0, two bytes.
  CHECK(display_width("\xc2\xb0"
                      "C") == 2);
  // A three-byte code point (U+2013, en dash) counts once.
  CHECK(display_width("4\xe2\x80\x93"
                      "6") == 3);
}

TEST_CASE("a table pads columns to the widest cell, right-aligns numbers and rules the totals") {
  TextTable table({{"variety"}, {"amount", Align::right}, {"IBU", Align::right}});
  table.add_row({"Keel", "17.0 g", "28.4 IBU"});
  table.add_row({"Tidewellers", "5.0 g", "5 IBU"});
  table.add_rule();
  table.add_row({"total", "", "33.4 IBU"});
  std::ostringstream out;
  table.render(out);
  // Widths: variety 11 ("Tidewellers"), amount 6, IBU 8; two spaces between columns; rule 11+2+6+2+8.
  const std::string expected =
      "variety      amount       IBU\n"
      "-----------------------------\n"
      "Keel         17.0 g  28.4 IBU\n"
      "Tidewellers   5.0 g     5 IBU\n"
      "-----------------------------\n"
      "total                33.4 IBU\n";
  CHECK(out.str() == expected);
}

TEST_CASE("a table aligns UTF-8 cells by code points, drops trailing spaces and honours the indent") {
  TextTable table({{"origin"}, {"hop"}});
  table.add_row(
      {"\xc5\xbd"
       "atec",
       "a"});                   // 5 code points
  table.add_row({"Kent", ""});  // a missing last cell: no trailing spaces
  table.add_row({"x"});         // a short row is padded with empty cells
  std::ostringstream out;
  table.render(out, "  ");
  const std::string expected =
      "  origin  hop\n"
      "  -----------\n"
      "  \xc5\xbd"
      "atec   a\n"
      "  Kent\n"
      "  x\n";
  CHECK(out.str() == expected);
}
