// The shared formatting pieces: rounding for stable JSON and HTML escaping. Expected values by
// hand (decimal rounding half away from zero, as std::round does; HTML 5 character references).
#include "report/output_format.hpp"

#include <doctest/doctest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <string>

using bine::html_escape;
using bine::rounded;

TEST_CASE("rounded keeps the given decimals and rounds halves away from zero") {
  // 1.25 and 0.125 are exact binary fractions, so these are true halves (hand arithmetic).
  CHECK(rounded(1.25, 1) == 1.3);
  CHECK(rounded(-1.25, 1) == -1.3);
  CHECK(rounded(0.125, 2) == 0.13);
  CHECK(rounded(1234.5, 0) == 1235.0);
  CHECK(rounded(32.3449, 2) == doctest::Approx(32.34).epsilon(1e-12));
  CHECK(rounded(0.230712, 5) == doctest::Approx(0.23071).epsilon(1e-12));
  CHECK(rounded(7.0, 3) == 7.0);
}

TEST_CASE("rounded never gives negative zero, so JSON never prints -0") {
  const double tiny = rounded(-0.004, 2);
  CHECK(tiny == 0.0);
  CHECK_FALSE(std::signbit(tiny));
  CHECK(nlohmann::json(rounded(-0.00001, 3)).dump() == "0.0");
  CHECK(nlohmann::json(rounded(-0.006, 2)).dump() == "-0.01");
}

TEST_CASE("html_escape replaces the characters that open markup or end an attribute") {
  CHECK(html_escape("Fuggle & Son <b>\"best\"</b>") == "Fuggle &amp; Son &lt;b&gt;&quot;best&quot;&lt;/b&gt;");
  // An ampersand is escaped once, so an existing reference is shown as typed, not interpreted.
  CHECK(html_escape("&amp;") == "&amp;amp;");
  CHECK(html_escape("plain text 4-6 %") == "plain text 4-6 %");
  CHECK(html_escape("\xc5\xbd"
                    "atec") ==
        "\xc5\xbd"
        "atec");  // UTF-8 passes through
  CHECK(html_escape("") == "");
}
