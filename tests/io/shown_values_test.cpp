// How a value from a file is shown in a message (io/json_fields.hpp brief, io/shown_value.hpp): cut
// after 40 characters, never inside a UTF-8 character. Expected strings are written by hand.
#include <doctest/doctest.h>

#include <nlohmann/json.hpp>
#include <string>

#include "io/json_fields.hpp"
#include "io/shown_value.hpp"

namespace {

std::string repeated(const std::string& piece, std::size_t count) {
  std::string out;
  for (std::size_t i = 0; i < count; ++i) out += piece;
  return out;
}

}  // namespace

TEST_CASE("a value in a message is cut between characters, not inside one") {
  const std::string accents = "a" + repeated("\xc3\xa9", 50);  // "a" and 50 e-acute: 51 characters, 101 bytes
  // brief: the JSON text "a...", 53 characters with its quotes; the first 37 (the quote, a and 35
  // accents) and "...". A cut at 37 bytes would have split the 18th accent.
  CHECK(bine::brief(nlohmann::json(accents)) == "\"a" + repeated("\xc3\xa9", 35) + "...");
  CHECK(bine::brief(nlohmann::json(repeated("\xc3\xa9", 38))) == "\"" + repeated("\xc3\xa9", 38) + "\"");
  // shown_value: the first 40 characters (a and 39 accents) in quotes, "..." before the closing one.
  CHECK(bine::shown_value(accents) == "\"a" + repeated("\xc3\xa9", 39) + "...\"");
  CHECK(bine::shown_value(repeated("\xc3\xa9", 40)) == "\"" + repeated("\xc3\xa9", 40) + "\"");
}
