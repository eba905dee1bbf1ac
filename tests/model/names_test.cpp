// Name matching: case- and accent-insensitive, with did-you-mean by Levenshtein distance.
#include "model/names.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <cstdint>
#include <stdexcept>
#include <string>
#include <vector>

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

namespace {

// Every word over {a, b} up to five letters, and the empty word.
std::vector<std::string> two_letter_words() {
  std::vector<std::string> words{""};
  for (std::size_t length = 1; length <= 5; ++length)
    for (unsigned bits = 0; bits < (1u << length); ++bits) {
      std::string word;
      for (std::size_t k = 0; k < length; ++k) word += (bits >> k) & 1u ? 'a' : 'b';
      words.push_back(word);
    }
  return words;
}

}  // namespace

TEST_CASE("the bit-vector distance equals the Levenshtein distance within its bound") {
  // Against edit_distance, the table of the definition (Levenshtein 1966), for every pair of short
  // words and every bound.
  const auto words = two_letter_words();
  for (const auto& a : words) {
    const bine::NearName near(a);
    for (const auto& b : words)
      for (std::size_t bound = 0; bound <= 6; ++bound)
        CHECK(near.distance_within(b, bound) == std::min(bine::edit_distance(a, b), bound + 1));
  }
  // The 64th bit (a name at the length cap), by hand arithmetic: 64 a's against 63 a's is one
  // deletion; against 64 a's with the last one b, one substitution; against 64 b's, 64
  // substitutions (no byte matches, and the lengths are equal, so fewer edits cannot do); against
  // the empty text, 64 deletions.
  const std::string a64(64, 'a');
  const bine::NearName near(a64);
  CHECK(near.distance_within(std::string(63, 'a'), 64) == 1);
  CHECK(near.distance_within(std::string(63, 'a') + "b", 64) == 1);
  CHECK(near.distance_within(std::string(64, 'b'), 64) == 64);
  CHECK(near.distance_within(std::string(64, 'b'), 10) == 11);  // past the bound: bound + 1
  CHECK(near.distance_within("", 64) == 64);
  CHECK(near.distance_within("", 63) == 64);
  // Texts of 60-68 random bytes of a four-letter alphabet against random names of 1-64 bytes,
  // against the definition's table.
  std::uint32_t state = 12345;
  const auto next = [&state] { return state = state * 1664525u + 1013904223u; };  // Numerical Recipes LCG
  for (int trial = 0; trial < 300; ++trial) {
    std::string name(1 + next() % 64, 'a');
    for (char& c : name) c = static_cast<char>('a' + (next() >> 16) % 4);
    std::string text(60 + next() % 9, 'a');
    for (char& c : text) c = static_cast<char>('a' + (next() >> 16) % 4);
    const std::size_t bound = next() % 70;
    CHECK(bine::NearName(name).distance_within(text, bound) == std::min(bine::edit_distance(name, text), bound + 1));
  }
  CHECK_THROWS_AS(bine::NearName(std::string(65, 'a')), std::length_error);
}

TEST_CASE("suggestions on small cases: Levenshtein distances by hand, best first, ties in order") {
  // "tidwel" (6 letters) may be 3 edits off (the threshold is half its length, at least 3).
  // Tallowen: the longest common subsequence with tidwel is 3 letters (t, w, e), and a distance is at
  //   least the longer length less that (every letter of "tallowen" not matched is an edit): 8 - 3 = 5.
  // Tidewell: insert e after "tid" and l at the end, 2 edits; the lengths differ by 2, so exactly 2.
  // Idwel: delete the t, 1 edit; the lengths differ by 1, so exactly 1.
  // Tidwells: starts with what was typed, counted as 1 (its distance is 2: append l and s).
  // Mayfell: common subsequence "el", at least 7 - 2 = 5.
  const std::vector<std::string> known{"Tallowen", "Tidewell", "Idwel", "Tidwells", "Mayfell"};
  CHECK(bine::closest_names("tidwel", known) == std::vector<std::string>{"Idwel", "Tidwells", "Tidewell"});
  CHECK(bine::did_you_mean("tidwel", known) == "did you mean Idwel, Tidwells or Tidewell?");
  // An exact name (distance 0, compared folded: "TIDWEL" is "tidwel") goes first; Tidewell drops out.
  std::vector<std::string> with_exact = known;
  with_exact.push_back("TIDWEL");
  CHECK(bine::closest_names("tidwel", with_exact) == std::vector<std::string>{"TIDWEL", "Idwel", "Tidwells"});
  // Only within the threshold: "saz" may be 3 off; Hersbruck (9 letters) differs by 6 in length.
  // saz -> zaas by the table of the definition, rows s, a, z against columns z, a, a, s:
  //   row 0: 0 1 2 3 4;  s: 1 1 2 3 3;  a: 2 2 1 2 3;  z: 3 2 2 2 3  -> 3.
  // Saaz: insert an a, 1; Sazz: starts with "saz", 1.
  const std::vector<std::string> saaz{"Hersbruck", "Zaas", "Saaz", "Sazz"};
  CHECK(bine::closest_names("saz", saaz) == std::vector<std::string>{"Saaz", "Sazz", "Zaas"});
  CHECK(bine::closest_names("saz", saaz, 2) == std::vector<std::string>{"Saaz", "Sazz"});
}

TEST_CASE("a name longer than 64 bytes folded gets no suggestion, one of 64 bytes still does") {
  // The known name starts with both wanted names (the "starts with" rule, distance 1).
  const std::vector<std::string> known{std::string(70, 'a')};
  CHECK(bine::closest_names(std::string(64, 'a'), known) == known);
  CHECK(bine::closest_names(std::string(65, 'a'), known).empty());
  // Folded length counts: 70 bytes with six zero-width spaces (3 bytes each, stripped) fold to 52.
  std::string spaced(52, 'a');
  for (int k = 0; k < 6; ++k) spaced += "\u200b";
  CHECK(bine::closest_names(spaced, known) == known);
}

TEST_CASE("closest_names keeps the suggestions of the plain definition on random small catalogs") {
  // Reference: every known name scored by the rules (0 equal, 1 starts with what was typed, else the
  // full Levenshtein table), those within max(3, length / 2) kept, stable by score, first three.
  std::uint32_t state = 777;
  const auto next = [&state] { return state = state * 1664525u + 1013904223u; };  // Numerical Recipes LCG
  const auto word = [&](std::size_t longest) {
    std::string w(1 + next() % longest, 'a');
    for (char& c : w) c = static_cast<char>('a' + (next() >> 16) % 3);
    return w;
  };
  for (int trial = 0; trial < 400; ++trial) {
    std::vector<std::string> known;
    for (int k = 0; k < 12; ++k) known.push_back(word(9));
    const std::string wanted = word(9);
    const std::size_t threshold = std::max<std::size_t>(3, wanted.size() / 2);
    std::vector<std::pair<std::size_t, std::size_t>> scored;
    for (std::size_t k = 0; k < known.size(); ++k) {
      const std::size_t d = known[k] == wanted               ? 0
                            : known[k].rfind(wanted, 0) == 0 ? 1
                                                             : bine::edit_distance(wanted, known[k]);
      if (d <= threshold) scored.emplace_back(d, k);
    }
    std::stable_sort(scored.begin(), scored.end(), [](const auto& x, const auto& y) { return x.first < y.first; });
    std::vector<std::string> expected;
    for (std::size_t k = 0; k < std::min<std::size_t>(3, scored.size()); ++k)
      expected.push_back(known[scored[k].second]);
    INFO("wanted " << wanted);
    CHECK(bine::closest_names(wanted, known) == expected);
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
