// Regressions for inputs the fuzzers (tests/fuzz) turned up in the quantity parser and in error
// messages. Each expectation is plain arithmetic or a rule stated in STYLE.md ("one line per
// problem"), not program output.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "model/errors.hpp"
#include "model/quantity.hpp"

TEST_CASE("a quantity that overflows in its unit conversion is refused, not returned as infinity") {
  // (1e308 - 32) * 5 / 9: the intermediate 5e308 exceeds the largest double (about 1.8e308).
  const auto fahrenheit = bine::parse_quantity("1e308 F", bine::Dimension::temperature);
  CHECK(!fahrenheit.value);
  CHECK(fahrenheit.error.find("out of range") != std::string::npos);
  // 1.7e308 kg = 1.7e311 g, beyond double range.
  const auto kilograms = bine::parse_quantity("1.7e308 kg", bine::Dimension::mass);
  CHECK(!kilograms.value);
  // The largest values that still fit convert: 1e300 F -> (1e300 - 32) * 5/9 C, about 5.56e299 C.
  const auto large = bine::parse_quantity("1e300 F", bine::Dimension::temperature);
  REQUIRE(large.value);
  CHECK(*large.value == doctest::Approx(5.0 / 9.0 * 1e300));
}

TEST_CASE("error lines stay one printable line whatever bytes the input held") {
  // A newline typed into an option value (found by fuzz_spec) must not split the message.
  const bine::InputError newline("--target: \"flo\nral=4\" is not an axis");
  REQUIRE(newline.lines().size() == 1);
  CHECK(newline.lines()[0] == "--target: \"flo\\nral=4\" is not an axis");
  // A byte that is not UTF-8 (0xFF) is shown as an escape; valid UTF-8 (e-acute, C3 A9) is kept.
  const bine::InputError bytes(std::string("name \"Caf\xff\" or \"Caf\xc3\xa9\""));
  CHECK(bytes.lines()[0] == "name \"Caf\\xFF\" or \"Caf\xc3\xa9\"");
  // A truncated UTF-8 sequence (lead byte E2 without its two continuation bytes) and a control byte.
  const bine::InputError cut(std::string("x\xe2y\x01"));
  CHECK(cut.lines()[0] == "x\\xE2y\\x01");
  // what() joins the same printable lines.
  CHECK(std::string(newline.what()) == newline.lines()[0]);
}
