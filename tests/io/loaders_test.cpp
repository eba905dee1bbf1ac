// Validation rules of our file formats: one bad input per rule, each must be reported as
// `FILE: /json/pointer: what is wrong (what is expected)`. Hard bounds are those of docs/methods.md
// ("Hop chemistry for data validation", from memory and general literature).
#include "io/loaders.hpp"

#include <doctest/doctest.h>

#include <algorithm>

#include "model/errors.hpp"

namespace {

bine::Lexicon small_lexicon() {
  return bine::Lexicon({{"citrus", "", {"grapefruit", "lime"}}, {"floral", "", {"rose"}}, {"pine", "", {"spruce"}}},
                       {});
}

// Runs `load` and returns every error line; fails the test when nothing was reported.
template <typename Load>
std::vector<std::string> errors_of(Load load) {
  try {
    load();
  } catch (const bine::InputError& error) {
    return error.lines();
  }
  FAIL("expected an InputError");
  return {};
}

bool any_line_has(const std::vector<std::string>& lines, std::string_view fragment) {
  return std::any_of(lines.begin(), lines.end(),
                     [&](const std::string& line) { return line.find(fragment) != std::string::npos; });
}

std::vector<std::string> catalog_errors(const std::string& text) {
  return errors_of([&] { bine::parse_catalog(text, "cat.json", small_lexicon()); });
}
std::vector<std::string> recipe_errors(const std::string& text) {
  return errors_of([&] { bine::parse_recipe(text, "recipe.json"); });
}
std::vector<std::string> stock_errors(const std::string& text) {
  return errors_of([&] { bine::parse_stock(text, "stock.json"); });
}

const std::string kGoodRecipeHead =
    R"({"name": "t", "batch_volume": "20 L", "original_gravity": "1.050", "boil_time": "60 min", "hops": )";

}  // namespace

TEST_CASE("a valid catalog loads with units parsed") {
  const auto catalog = bine::parse_catalog(
      R"({"catalog": {"name": "mine", "demo": false},
          "varieties": [{"name": "A", "purpose": "aroma", "alpha_acid": [5, 7], "total_oil": ["1.0 mL/100 g", 1.5],
                         "oils": {"myrcene": [40, 50], "linalool": [0.5, 1.0]}, "aroma": {"citrus": 4},
                         "tags": ["lime"], "stability": 70}]})",
      "cat.json", small_lexicon());
  REQUIRE(catalog.varieties.size() == 1);
  CHECK(catalog.varieties[0].alpha_acid->mid() == doctest::Approx(6.0));
  CHECK(catalog.varieties[0].total_oil->min == doctest::Approx(1.0));
  CHECK(catalog.varieties[0].aroma->at("citrus") == doctest::Approx(4.0));
}

TEST_CASE("truncated JSON names line and column") {
  const auto lines = catalog_errors("{\n  \"varieties\": [\n    {\"name\": \"A\"");
  CHECK(lines.size() == 1);
  CHECK(lines[0].rfind("cat.json: not valid JSON at line 3", 0) == 0);
  CHECK(any_line_has(lines, "ends too early"));
}

TEST_CASE("an empty file is reported as empty") {
  CHECK(any_line_has(catalog_errors("  \n"), "cat.json: the file is empty"));
}

TEST_CASE("NaN and Infinity are not JSON") {
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "stability": NaN}]})"), "not valid JSON"));
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "stability": Infinity}]})"), "not valid JSON"));
}

TEST_CASE("numbers too large for a double are rejected") {
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "stability": 1e999}]})"), "too large"));
}

TEST_CASE("non-UTF-8 bytes are reported") {
  CHECK(any_line_has(catalog_errors("{\"varieties\": [{\"name\": \"A\xff\"}]}"), "not valid UTF-8"));
}

TEST_CASE("unknown keys are reported with a suggestion") {
  const auto lines = catalog_errors(R"({"varieties": [{"name": "A", "alpha_acd": [5, 6]}]})");
  CHECK(any_line_has(lines, "cat.json: /varieties/0/alpha_acd: unknown key \"alpha_acd\" (did you mean alpha_acid?)"));
}

TEST_CASE("wrong types say what was expected") {
  CHECK(
      any_line_has(catalog_errors(R"({"varieties": {"name": "A"}})"), "/varieties: {\"name\":\"A\"} is not an array"));
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": 5}]})"),
                     "/varieties/0/name: 5 is a number (expected a string)"));
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "alpha_acid": [5, true]}]})"),
                     "/varieties/0/alpha_acid/1: true is true/false"));
}

TEST_CASE("hard bounds of hop chemistry are enforced") {
  // Alpha acid: reject outside 0.5-22 % (docs/methods.md).
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "alpha_acid": [5, 25]}]})"),
                     "/varieties/0/alpha_acid/1: 25% is outside the range for alpha acid (expected 0.5-22%)"));
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "beta_acid": [0.2, 4]}]})"), "beta acid"));
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "cohumulone": [5, 30]}]})"), "cohumulone"));
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "total_oil": [1, 7]}]})"), "total oil"));
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "stability": 120}]})"), "storage stability"));
}

TEST_CASE("an alpha of 0.12 where 12 % was meant is called a fraction") {
  const auto lines = stock_errors(R"({"lots": [{"variety": "A", "alpha_acid": 0.12}]})");
  CHECK(any_line_has(
      lines, "stock.json: /lots/0/alpha_acid: 0.12 looks like a fraction; alpha acid is in % (write 12 for 12 %)"));
}

TEST_CASE("a range needs min <= max") {
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "alpha_acid": [9, 7]}]})"),
                     "/varieties/0/alpha_acid: min 9 is greater than max 7"));
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "alpha_acid": [9, 7, 8]}]})"), "is not a range"));
}

TEST_CASE("oil fractions may not sum past 100 %") {
  CHECK(any_line_has(
      catalog_errors(R"({"varieties": [{"name": "A", "oils": {"myrcene": [70, 75], "humulene": [35, 40]}}]})"),
      "/varieties/0/oils: oil fractions sum to 105.0 %"));
}

TEST_CASE("unknown oil compounds and aroma axes are reported") {
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "oils": {"myrcen": [40, 50]}}]})"),
                     "unknown oil compound \"myrcen\" (did you mean myrcene?)"));
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "aroma": {"citrs": 3}}]})"),
                     "/varieties/0/aroma/citrs: unknown aroma axis \"citrs\" (did you mean citrus?)"));
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "aroma": {"citrus": 6}}]})"),
                     "/varieties/0/aroma/citrus: 6 is outside the range for an aroma intensity (expected 0-5)"));
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "aroma": {"citrus": 6}}]})"), "aroma intensity"));
}

TEST_CASE("unknown enum values list the choices") {
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "A", "purpose": "flavour"}]})"),
                     "\"flavour\" is not one of aroma, bittering or dual"));
  CHECK(any_line_has(recipe_errors(kGoodRecipeHead + R"([{"variety": "A", "amount": "5 g", "use": "mash"}]})"),
                     "/hops/0/use: \"mash\" is not one of first-wort, boil, whirlpool or dry-hop"));
  CHECK(any_line_has(
      stock_errors(R"({"lots": [{"variety": "A", "storage": {"temperature": "-2 C", "package": "jar"}}]})"),
      "/lots/0/storage/package: \"jar\" is not one of vacuum, sealed or open"));
}

TEST_CASE("duplicate names in one catalog and across catalogs") {
  CHECK(any_line_has(catalog_errors(R"({"varieties": [{"name": "Mayfell"}, {"name": "MAYFELL"}]})"),
                     "/varieties/1/name: variety \"MAYFELL\" is already defined at /varieties/0"));
  const auto a = bine::parse_catalog(R"({"varieties": [{"name": "Étoile"}]})", "a.json", small_lexicon());
  const auto b = bine::parse_catalog(R"({"varieties": [{"name": "etoile"}]})", "b.json", small_lexicon());
  const auto lines = errors_of([&] { bine::merge_catalogs({a, b}); });
  CHECK(any_line_has(lines, "b.json: variety \"etoile\" is also defined in a.json"));
  CHECK(any_line_has(stock_errors(R"({"lots": [{"variety": "A", "lot": "X1"}, {"variety": "B", "lot": "x1"}]})"),
                     "lot \"x1\" appears twice"));
}

TEST_CASE("an empty catalog is an error") {
  CHECK(any_line_has(catalog_errors(R"({"varieties": []})"), "/varieties: is empty"));
}

TEST_CASE("unknown units name the field and the accepted units") {
  CHECK(any_line_has(recipe_errors(kGoodRecipeHead + R"([{"variety": "A", "amount": "28 gr", "use": "dry-hop"}]})"),
                     "recipe.json: /hops/0/amount: \"28 gr\" is not a mass (use g, kg, oz or lb)"));
  CHECK(any_line_has(
      recipe_errors(R"({"batch_volume": "20 litters", "original_gravity": 1.05, "boil_time": 60, "hops": []})"),
      "/batch_volume: \"20 litters\" is not a volume"));
}

TEST_CASE("dates must exist") {
  CHECK(any_line_has(stock_errors(R"({"lots": [{"variety": "A", "packaged": "2026-02-30"}]})"),
                     "/lots/0/packaged: \"2026-02-30\" is not a date that exists (expected YYYY-MM-DD)"));
}

TEST_CASE("amounts and volumes must be positive, gravity at least 1.000") {
  CHECK(any_line_has(recipe_errors(kGoodRecipeHead + R"([{"variety": "A", "amount": "-5 g", "use": "dry-hop"}]})"),
                     "/hops/0/amount: -5 g is outside the range for a hop amount"));
  CHECK(any_line_has(recipe_errors(kGoodRecipeHead + R"([{"variety": "A", "amount": 0, "use": "dry-hop"}]})"),
                     "/hops/0/amount: 0 g is outside the range"));
  CHECK(any_line_has(recipe_errors(R"({"batch_volume": 0, "original_gravity": 1.05, "boil_time": 60, "hops": []})"),
                     "/batch_volume: 0 L is outside the range for batch volume"));
  CHECK(any_line_has(recipe_errors(R"({"batch_volume": 20, "original_gravity": 0.998, "boil_time": 60, "hops": []})"),
                     "/original_gravity: 0.998 SG is outside the range for original gravity"));
}

TEST_CASE("missing required fields are named") {
  const auto lines = recipe_errors(R"({"name": "x", "hops": []})");
  CHECK(any_line_has(lines, "recipe.json: /batch_volume: is missing (required)"));
  CHECK(any_line_has(lines, "recipe.json: /original_gravity: is missing (required)"));
  CHECK(any_line_has(lines, "recipe.json: /boil_time: is missing (required)"));
}

TEST_CASE("additions need what their use requires") {
  CHECK(any_line_has(
      recipe_errors(kGoodRecipeHead + R"([{"variety": "A", "amount": "5 g", "use": "whirlpool", "time": 20}]})"),
      "/hops/0/temperature: is missing (a whirlpool addition needs its temperature)"));
  CHECK(any_line_has(recipe_errors(kGoodRecipeHead + R"([{"variety": "A", "amount": "5 g", "use": "boil"}]})"),
                     "/hops/0/time: is missing (a boil addition needs its minutes before flame-out)"));
  CHECK(any_line_has(
      recipe_errors(kGoodRecipeHead + R"([{"variety": "A", "amount": "5 g", "use": "boil", "time": 90}]})"),
      "/hops/0/time: 90 min is longer than the boil time of 60 min"));
  CHECK(any_line_has(
      recipe_errors(kGoodRecipeHead +
                    R"([{"variety": "A", "amount": "5 g", "use": "boil", "time": 60, "temperature": 80}]})"),
      "only a whirlpool addition takes a temperature"));
  CHECK(any_line_has(recipe_errors(kGoodRecipeHead + R"([{"amount": "5 g", "use": "dry-hop"}]})"),
                     "/hops/0/variety: is missing (give a variety or a lot)"));
}

TEST_CASE("every problem in a file is reported, not only the first") {
  const auto lines = recipe_errors(R"({"batch_volume": "20 litters", "original_gravity": 0.9, "boil_time": 60,
                                       "hops": [{"variety": "A", "amount": "28 gr", "use": "mash"}]})");
  CHECK(lines.size() == 4);
}

TEST_CASE("file kinds are detected by their top-level keys") {
  CHECK(bine::detect_file_kind(nlohmann::json::parse(R"({"varieties": []})")) == bine::FileKind::catalog);
  CHECK(bine::detect_file_kind(nlohmann::json::parse(R"({"lots": []})")) == bine::FileKind::stock);
  CHECK(bine::detect_file_kind(nlohmann::json::parse(R"({"hops": []})")) == bine::FileKind::recipe);
  CHECK(bine::detect_file_kind(nlohmann::json::parse(R"([1, 2])")) == bine::FileKind::unknown);
}

TEST_CASE("a recipe written out loads back unchanged") {
  const auto recipe = bine::parse_recipe(
      kGoodRecipeHead + R"([{"variety": "A", "amount": "1 oz", "alpha_acid": 7.5, "use": "whirlpool", "time": "20 min",
                              "temperature": "176 F", "form": "pellet"}]})",
      "recipe.json");
  const auto again = bine::parse_recipe(bine::recipe_to_json(recipe).dump(), "again.json");
  REQUIRE(again.hops.size() == 1);
  CHECK(again.batch_volume_l == doctest::Approx(20.0));
  CHECK(again.hops[0].grams == doctest::Approx(28.349523125).epsilon(1e-3));
  CHECK(*again.hops[0].temperature_c == doctest::Approx(80.0));
  CHECK(again.hops[0].use == bine::HopUse::whirlpool);
}

TEST_CASE("a recipe is written back in the brewer's notation: oz, gal, F, Plato, days and kg stay so") {
  // Exact definitions: 1 oz = 28.349523125 g, 1 US gal = 3.785411784 L, F = C x 9 / 5 + 32; the Plato
  // round trip is the exact inverse of the ASBC cubic (docs/methods.md#plato), so every value the
  // brewer wrote comes back as written.
  const auto recipe = bine::parse_recipe(
      R"({"name": "US IPA", "batch_volume": "5.5 gal", "original_gravity": "15.2 P", "boil_time": "1 h",
          "hop_stand": {"time": "15 min", "temperature": "185 F"},
          "hops": [{"variety": "A", "amount": "0.75 oz", "alpha_acid": 12.5, "use": "boil", "time": "60 min"},
                   {"variety": "B", "amount": "3 oz", "alpha_acid": 7.5, "use": "whirlpool", "time": "20 min",
                    "temperature": "176 F"},
                   {"variety": "C", "amount": "0.25 kg", "use": "dry-hop", "time": "4 d"}]})",
      "us.json");
  const auto json = bine::recipe_to_json(recipe);
  CHECK(json["batch_volume"] == "5.5 gal");
  CHECK(json["original_gravity"] == "15.2 P");
  CHECK(json["boil_time"] == "1 h");
  CHECK(json["hop_stand"]["temperature"] == "185 F");
  CHECK(json["hops"][0]["amount"] == "0.75 oz");
  CHECK(json["hops"][1]["temperature"] == "176 F");
  CHECK(json["hops"][2]["amount"] == "0.25 kg");
  CHECK(json["hops"][2]["time"] == "4 d");
  // Keys in the order a brewer reads them.
  CHECK(json.begin().key() == "name");
  const auto again = bine::parse_recipe(json.dump(), "again.json");
  CHECK(again.original_gravity == recipe.original_gravity);
  CHECK(again.batch_volume_l == doctest::Approx(recipe.batch_volume_l).epsilon(1e-12));
  CHECK(again.hops[0].grams == doctest::Approx(0.75 * 28.349523125).epsilon(1e-12));
  // A new addition without a unit of its own is written in the recipe's hop unit (the first one given).
  bine::Recipe grown = recipe;
  grown.hops.push_back(grown.hops[1]);
  grown.hops.back().amount_unit.clear();
  grown.hops.back().grams = 2.0 * 28.349523125;
  CHECK(bine::recipe_to_json(grown)["hops"][3]["amount"] == "2 oz");
}

TEST_CASE("a recipe in bare canonical numbers is written with canonical units") {
  const auto recipe = bine::parse_recipe(
      R"({"batch_volume": 20, "original_gravity": 1.048, "boil_time": 60,
          "hops": [{"variety": "A", "amount": 22.1, "alpha_acid": 9.5, "use": "boil", "time": 60}]})",
      "bare.json");
  const auto json = bine::recipe_to_json(recipe);
  CHECK(json["batch_volume"] == "20 L");
  CHECK(json["original_gravity"] == "1.048");
  CHECK(json["hops"][0]["amount"] == "22.1 g");
  CHECK(json["hops"][0]["time"] == "60 min");
}
