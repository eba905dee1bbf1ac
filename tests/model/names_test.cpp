// Name matching: case- and accent-insensitive, with did-you-mean by Levenshtein distance.
#include "model/names.hpp"

#include <doctest/doctest.h>

#include "model/hops.hpp"

TEST_CASE("names fold case, accents and separators") {
  CHECK(bine::fold_name("Étoile Pâle") == "etoile pale");
  CHECK(bine::fold_name("ETOILE-pale") == "etoile pale");
  CHECK(bine::fold_name("  Grüner   Zweig ") == "gruner zweig");
  CHECK(bine::fold_name("Łódź") == "lodz");  // Latin Extended-A
}

TEST_CASE("names compare in Unicode normal form C, without invisible characters") {
  // Unicode Standard Annex #15: U+0065 U+0301 (e + combining acute) composes to U+00E9.
  CHECK(bine::fold_name("Cafe\u0301 Vine") == bine::fold_name("Caf\u00e9 Vine"));
  CHECK(bine::fold_name("Cafe\u0301 Vine") == "cafe vine");
  // Default ignorables (Unicode DerivedCoreProperties): zero-width space, zero-width joiner, word
  // joiner, byte order mark, soft hyphen.
  CHECK(bine::fold_name("Tide\u200bwell") == "tidewell");
  CHECK(bine::fold_name("\ufeffTidewell") == "tidewell");
  CHECK(bine::fold_name("Tide\u200dwe\u2060ll\u00ad") == "tidewell");
  // Not UTF-8: left as it is, still folded byte by byte.
  CHECK(bine::fold_name("Caf\xff") == "caf\xff");
}

TEST_CASE("names refuse control characters") {
  // Unicode general category Cc: C0 controls, DEL and the C1 controls.
  CHECK(bine::name_problem(std::string("Nul\0vine", 8)).value_or("").find("U+0000") != std::string::npos);
  CHECK(bine::name_problem("Test\avine").value_or("").find("U+0007") != std::string::npos);
  CHECK(bine::name_problem("\x1b[31mRed").value_or("").find("U+001B") != std::string::npos);
  CHECK(bine::name_problem("Two\nLines").value_or("").find("U+000A") != std::string::npos);
  CHECK(bine::name_problem("C1\u0085next").value_or("").find("U+0085") != std::string::npos);
  CHECK(bine::name_problem("bad \xff byte").value_or("").find("not valid UTF-8") != std::string::npos);
  CHECK_FALSE(bine::name_problem("\u00c9toile P\u00e2le").has_value());
  CHECK_FALSE(bine::name_problem("Tidewell").has_value());
}

TEST_CASE("edit distance is the Levenshtein distance") {
  // Textbook example (Levenshtein 1966; kitten -> sitting needs 3 edits), common practice.
  CHECK(bine::edit_distance("kitten", "sitting") == 3);
  CHECK(bine::edit_distance("", "abc") == 3);
  CHECK(bine::edit_distance("flaw", "lawn") == 2);
}

TEST_CASE("the bounded edit distance equals the Levenshtein distance within its bound") {
  // Ukkonen's band (1985): within the bound the value is exact, beyond it the answer is bound + 1.
  CHECK(bine::edit_distance_within("kitten", "sitting", 3) == 3);
  CHECK(bine::edit_distance_within("kitten", "sitting", 2) == 3);
  CHECK(bine::edit_distance_within("flaw", "lawn", 5) == 2);
  CHECK(bine::edit_distance_within("", "abc", 3) == 3);
  CHECK(bine::edit_distance_within("abc", "", 1) == 2);
  // Every pair of short words over a two-letter alphabet against the unbounded distance above.
  std::vector<std::string> words{""};
  for (std::size_t length = 1; length <= 5; ++length)
    for (unsigned bits = 0; bits < (1u << length); ++bits) {
      std::string word;
      for (std::size_t k = 0; k < length; ++k) word += (bits >> k) & 1u ? 'a' : 'b';
      words.push_back(word);
    }
  for (const auto& a : words)
    for (const auto& b : words)
      for (std::size_t bound = 0; bound <= 5; ++bound) {
        const std::size_t full = bine::edit_distance(a, b);
        CHECK(bine::edit_distance_within(a, b, bound) == std::min(full, bound + 1));
      }
}

TEST_CASE("unknown names get the closest known names") {
  const std::vector<std::string> known{"Tidewell", "Seawick", "Mayfell", "Tallowen"};
  const auto names = bine::closest_names("tidwell", known);
  REQUIRE_FALSE(names.empty());
  CHECK(names.front() == "Tidewell");
  CHECK(bine::did_you_mean("mayfel", known) == "did you mean Mayfell?");
  CHECK(bine::did_you_mean("zzzzzzzzzzzzzz", known).empty());
  // Best first, ties in the order given; a name that starts with what was typed counts as 1 edit.
  const std::vector<std::string> close{"Tallowen", "Tidewel", "Tidewells", "Tidewell"};
  CHECK(bine::closest_names("Tidewell", close) == std::vector<std::string>{"Tidewell", "Tidewel", "Tidewells"});
  CHECK(bine::closest_names("Tide", close, 2) == std::vector<std::string>{"Tidewel", "Tidewells"});
  // A name far longer than any known one is compared by length first and gets no suggestion.
  CHECK(bine::did_you_mean(std::string(10000, 'q'), known).empty());
}

TEST_CASE("dates must exist") {
  CHECK(bine::parse_date("2024-02-29").has_value());  // leap year
  CHECK_FALSE(bine::parse_date("2026-02-29").has_value());
  CHECK_FALSE(bine::parse_date("2026-13-01").has_value());
  CHECK_FALSE(bine::parse_date("26-1-1").has_value());
  CHECK(bine::format_date(*bine::parse_date("2026-03-14")) == "2026-03-14");
}
