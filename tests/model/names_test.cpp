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

TEST_CASE("edit distance is the Levenshtein distance") {
  // Textbook example (Levenshtein 1966; kitten -> sitting needs 3 edits), common practice.
  CHECK(bine::edit_distance("kitten", "sitting") == 3);
  CHECK(bine::edit_distance("", "abc") == 3);
  CHECK(bine::edit_distance("flaw", "lawn") == 2);
}

TEST_CASE("unknown names get the closest known names") {
  const std::vector<std::string> known{"Tidewell", "Seawick", "Mayfell", "Tallowen"};
  const auto names = bine::closest_names("tidwell", known);
  REQUIRE_FALSE(names.empty());
  CHECK(names.front() == "Tidewell");
  CHECK(bine::did_you_mean("mayfel", known) == "did you mean Mayfell?");
  CHECK(bine::did_you_mean("zzzzzzzzzzzzzz", known).empty());
}

TEST_CASE("dates must exist") {
  CHECK(bine::parse_date("2024-02-29").has_value());  // leap year
  CHECK_FALSE(bine::parse_date("2026-02-29").has_value());
  CHECK_FALSE(bine::parse_date("2026-13-01").has_value());
  CHECK_FALSE(bine::parse_date("26-1-1").has_value());
  CHECK(bine::format_date(*bine::parse_date("2026-03-14")) == "2026-03-14");
}
