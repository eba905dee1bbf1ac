// One-line messages (model/errors.hpp): a long quoted name is cut to its first 60 characters on a
// character boundary with its length, a long pointer part is cut, and any line is capped. Expected
// strings are written by hand from the rule: 60 characters kept, "..." and the length after the quote.
#include <doctest/doctest.h>

#include <string>

#include "model/errors.hpp"

namespace {

/// `count` copies of `piece`.
std::string repeated(const std::string& piece, std::size_t count) {
  std::string out;
  for (std::size_t i = 0; i < count; ++i) out += piece;
  return out;
}

}  // namespace

TEST_CASE("a name of up to 60 characters is quoted whole, a longer one cut with its length") {
  CHECK(bine::quoted_name("Tidewell") == "\"Tidewell\"");
  CHECK(bine::quoted_name(std::string(60, 'q')) == "\"" + std::string(60, 'q') + "\"");
  CHECK(bine::quoted_name(std::string(61, 'q')) == "\"" + std::string(60, 'q') + "...\" (61 characters)");
  CHECK(bine::quoted_name(std::string(10000, 'q')) == "\"" + std::string(60, 'q') + "...\" (10,000 characters)");
}

TEST_CASE("a multibyte name is cut between characters and counted in characters, not bytes") {
  // "é" is two bytes (C3 A9), "水" three (E6 B0 B4), "🍺" four (F0 9F 8D BA): each is one character.
  const std::string accents = repeated("\xc3\xa9", 10000);  // 10,000 characters, 20,000 bytes
  CHECK(bine::quoted_name(accents) == "\"" + repeated("\xc3\xa9", 60) + "...\" (10,000 characters)");
  // One ASCII letter first, so that a cut by bytes would land inside a three-byte character.
  const std::string mixed = "a" + repeated("\xe6\xb0\xb4", 100);  // 101 characters
  CHECK(bine::quoted_name(mixed) == "\"a" + repeated("\xe6\xb0\xb4", 59) + "...\" (101 characters)");
  const std::string beer = repeated("\xf0\x9f\x8d\xba", 61);  // 61 characters, 244 bytes
  CHECK(bine::quoted_name(beer) == "\"" + repeated("\xf0\x9f\x8d\xba", 60) + "...\" (61 characters)");
  // Sixty multibyte characters are not cut, however many bytes they take.
  CHECK(bine::quoted_name(repeated("\xf0\x9f\x8d\xba", 60)) == "\"" + repeated("\xf0\x9f\x8d\xba", 60) + "\"");
}

TEST_CASE("every message line cuts its long quoted names, whatever command wrote it") {
  const std::string name(10000, 'q');
  const bine::InputError error("swap: unknown variety \"" + name + "\" (see 'bine catalog list')");
  CHECK(error.lines().at(0) ==
        "swap: unknown variety \"" + std::string(60, 'q') + "...\" (10,000 characters) (see 'bine catalog list')");
  CHECK(std::string(error.what()) == error.lines().at(0));
  // Two names in one line, each cut or kept on its own; a short one stays as it is.
  const bine::InputError two("\"" + std::string(70, 'a') + "\" and \"Tidewell\" and \"" + std::string(61, 'b') + "\"");
  CHECK(two.lines().at(0) == "\"" + std::string(60, 'a') + "...\" (70 characters) and \"Tidewell\" and \"" +
                                 std::string(60, 'b') + "...\" (61 characters)");
  // A quote escaped by a backslash (a JSON string in a message) does not end the quoted text: a, the backslash,
  // the quote and 57 letters c are the first 60 of its 1 + 2 + 70 = 73 characters.
  const std::string json_text = "\"a\\\"" + std::string(70, 'c') + "\"";
  CHECK(bine::message_line(json_text) == "\"a\\\"" + std::string(57, 'c') + "...\" (73 characters)");
  // Infeasible lines follow the same rule.
  const bine::Infeasible infeasible("no stock of \"" + name + "\"");
  CHECK(std::string(infeasible.what()) == "no stock of \"" + std::string(60, 'q') + "...\" (10,000 characters)");
}

TEST_CASE("a control character in a cut name is still escaped, and a line is capped at 1,000 characters") {
  // The cut counts the BEL (07) as one character; the escape comes after: "\x07" for it.
  const std::string bell = "\a" + std::string(99, 'q');
  CHECK(bine::message_line("\"" + bell + "\"") == "\"\\x07" + std::string(59, 'q') + "...\" (100 characters)");
  // Unquoted text (a list of 2,000 lot codes): the first 1,000 characters and the length.
  std::string list;
  for (int i = 0; i < 2000; ++i) list += (i ? ", L" : "L") + std::to_string(1000 + i);
  // Hand count: "L1000" is 5 characters and each later code ", L1001" 7, so 5 + 1,999 x 7 = 13,998.
  REQUIRE(list.size() == 13998);
  CHECK(bine::message_line(list) == list.substr(0, 1000) + "... (13,998 characters in all)");
  CHECK(bine::message_line(list.substr(0, 1000)) == list.substr(0, 1000));
}

TEST_CASE("a long key in a JSON pointer is cut in the problem line, and its quoted echo too") {
  bine::Diagnostics diagnostics("r.json");
  const std::string key(10000, 'k');
  diagnostics.add("/hops/0/" + key, "unknown key \"" + key + "\" (expected one of variety, lot, amount)");
  REQUIRE(diagnostics.lines().size() == 1);
  try {
    diagnostics.throw_if_any();
    FAIL("expected an InputError");
  } catch (const bine::InputError& error) {
    CHECK(error.lines().at(0) == "r.json: /hops/0/" + std::string(60, 'k') + "...: unknown key \"" +
                                     std::string(60, 'k') +
                                     "...\" (10,000 characters) (expected one of variety, lot, amount)");
  }
}

TEST_CASE("a line cut once is not cut again when another message quotes it") {
  // checked_recipe_text puts a loader's line inside an Infeasible message: the cut name keeps its
  // length, not the length of the cut text (60 letters and "...", 63 characters).
  const std::string once = bine::message_line("unknown variety \"" + std::string(10000, 'q') + "\"");
  CHECK(bine::message_line(once) == once);
  CHECK(bine::message_line("the result: " + once) == "the result: " + once);
  std::string list;
  for (int i = 0; i < 2000; ++i) list += (i ? ", L" : "L") + std::to_string(1000 + i);
  const std::string capped = bine::message_line(list);
  CHECK(bine::message_line(capped) == capped);
}
