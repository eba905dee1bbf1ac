// BeerXML 1.0 reading and writing (src/io/beerxml.cpp). The fixtures are written by hand from the
// BeerXML 1.0 specification: record and field names, units (AMOUNT in kg, BATCH_SIZE in L, TIME in
// minutes, ALPHA in percent) and the USE and FORM words as the specification lists them.
#include "io/beerxml.hpp"

#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include "model/errors.hpp"

namespace {

std::string read_fixture(const std::string& name) {
  std::ifstream in(std::filesystem::path(BINE_TEST_DIR) / "fixtures" / "beerxml" / name, std::ios::binary);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

std::string error_of(const std::string& text, const bine::BeerXmlReadOptions& options = {}) {
  try {
    bine::parse_beerxml_recipe(text, "r.xml", options);
  } catch (const bine::InputError& error) {
    return error.what();
  }
  return "";
}

std::string replace_once(std::string text, const std::string& from, const std::string& to) {
  const auto at = text.find(from);
  REQUIRE(at != std::string::npos);
  return text.replace(at, from.size(), to);
}

const std::string kOneHop =
    "<RECIPES><RECIPE><NAME>One</NAME><VERSION>1</VERSION><BATCH_SIZE>20</BATCH_SIZE><BOIL_TIME>60</BOIL_TIME>"
    "<OG>1.050</OG><HOPS><HOP><NAME>Fixture Bitter</NAME><VERSION>1</VERSION><ALPHA>7.0</ALPHA>"
    "<AMOUNT>0.030</AMOUNT><USE>Boil</USE><TIME>60</TIME></HOP></HOPS></RECIPE></RECIPES>";

}  // namespace

TEST_CASE("beerxml: the specification's units become ours (kg -> g, Aroma -> whirlpool, dry-hop minutes)") {
  bine::BeerXmlReadOptions options;
  options.aroma_temperature_c = 80.0;
  const auto read = bine::parse_beerxml_recipe(read_fixture("rebalance-pale.xml"), "pale.xml", options);
  const auto& recipe = read.recipe;
  CHECK(recipe.name == "Fixture Harbour Pale");
  CHECK(recipe.batch_volume_l == 20.0);
  CHECK(recipe.boil_minutes == 60.0);
  CHECK(recipe.original_gravity == doctest::Approx(1.050));
  CHECK(!recipe.target_ibu);
  REQUIRE(recipe.hops.size() == 3);
  // AMOUNT 0.030 kg = 30 g (exact unit definition).
  CHECK(recipe.hops[0].grams == doctest::Approx(30.0));
  CHECK(recipe.hops[0].alpha_acid == doctest::Approx(7.0));
  CHECK(recipe.hops[0].use == bine::HopUse::boil);
  CHECK(recipe.hops[0].form == bine::HopForm::whole);  // Leaf: whole cones
  CHECK(recipe.hops[1].use == bine::HopUse::whirlpool);
  CHECK(recipe.hops[1].temperature_c == 80.0);
  CHECK(recipe.hops[1].minutes == 20.0);
  CHECK(recipe.hops[2].use == bine::HopUse::dry_hop);
  CHECK(recipe.hops[2].minutes == 4320.0);  // 3 days x 1440 min
  CHECK(recipe.hops[2].form == bine::HopForm::pellet);
  REQUIRE(read.notes.size() == 1);
  CHECK(read.notes[0].find("whirlpool at 80 C") != std::string::npos);
}

TEST_CASE("beerxml: Plug is whole hops, Mash additions are noted and left out, IBU is the target") {
  std::string text = replace_once(kOneHop, "</HOPS>",
                                  "<HOP><NAME>Fixture Aroma</NAME><VERSION>1</VERSION><ALPHA>5</ALPHA>"
                                  "<AMOUNT>0.01</AMOUNT><USE>Mash</USE><TIME>60</TIME></HOP></HOPS><IBU>31.5</IBU>");
  text = replace_once(text, "<USE>Boil</USE>", "<USE>First Wort</USE><FORM>Plug</FORM>");
  const auto read = bine::parse_beerxml_recipe(text, "r.xml", {});
  REQUIRE(read.recipe.hops.size() == 1);
  CHECK(read.recipe.hops[0].use == bine::HopUse::first_wort);
  CHECK(read.recipe.hops[0].form == bine::HopForm::whole);
  CHECK(read.recipe.target_ibu == 31.5);
  REQUIRE(read.notes.size() == 1);
  CHECK(read.notes[0].find("1 Mash addition not counted") != std::string::npos);
}

TEST_CASE("beerxml: bad values are named with their element path and what was expected") {
  std::string text = replace_once(kOneHop, "<ALPHA>7.0</ALPHA>", "<ALPHA>seven</ALPHA>");
  text = replace_once(text, "<USE>Boil</USE>", "<USE>Kettle</USE>");
  text = replace_once(text, "<OG>1.050</OG>", "");
  const std::string message = error_of(text);
  CHECK(message.find("r.xml: /RECIPES/RECIPE/HOPS/HOP/ALPHA: \"seven\" is not a number") != std::string::npos);
  CHECK(message.find("/RECIPES/RECIPE/HOPS/HOP/USE: \"Kettle\" is not one of Boil, First Wort") != std::string::npos);
  CHECK(message.find("/RECIPES/RECIPE/OG: is missing") != std::string::npos);
  // 25 % is above the alpha bound of 22 % (docs/methods.md#hop-chemistry-bounds).
  CHECK(error_of(replace_once(kOneHop, "<ALPHA>7.0</ALPHA>", "<ALPHA>25</ALPHA>")).find("HOP/ALPHA") !=
        std::string::npos);
}

TEST_CASE("beerxml: several RECIPE records need a name, an unknown one lists those present") {
  const std::string two =
      replace_once(kOneHop, "</RECIPES>", kOneHop.substr(9, kOneHop.size() - 9 - 10) + "</RECIPES>");
  const std::string both = replace_once(two, "<NAME>One</NAME>", "<NAME>Harbour Pale</NAME>");
  CHECK(error_of(both).find("holds 2 recipes (expected --recipe-name NAME, one of: \"Harbour Pale\", \"One\")") !=
        std::string::npos);
  bine::BeerXmlReadOptions options;
  options.recipe_name = "harbour pail";
  const std::string unknown = error_of(both, options);
  CHECK(unknown.find("\"harbour pail\": no such recipe") != std::string::npos);
  CHECK(unknown.find("\"Harbour Pale\", \"One\"") != std::string::npos);
  options.recipe_name = "ONE";
  CHECK(bine::parse_beerxml_recipe(both, "r.xml", options).recipe.name == "One");
}

TEST_CASE("beerxml: a DOCTYPE (DTD, entity bomb, external entity) is refused, nothing is expanded") {
  const std::string bomb =
      "<?xml version=\"1.0\"?><!DOCTYPE RECIPES [<!ENTITY a \"aaaaaaaaaa\"><!ENTITY b \"&a;&a;&a;&a;&a;&a;&a;\">"
      "]><RECIPES><RECIPE><NAME>&b;</NAME></RECIPE></RECIPES>";
  CHECK(error_of(bomb).find("r.xml: has a DOCTYPE declaration") != std::string::npos);
  const std::string external =
      "<!DOCTYPE RECIPES SYSTEM \"file:///etc/passwd\"><RECIPES><RECIPE><NAME>x</NAME></RECIPE></RECIPES>";
  CHECK(error_of(external).find("DOCTYPE") != std::string::npos);
}

TEST_CASE("beerxml: 10^6 nested elements are refused as too deep, not a crash") {
  std::string deep;
  deep.reserve(7'000'000);
  for (int i = 0; i < 1'000'000; ++i) deep += "<a>";
  for (int i = 0; i < 1'000'000; ++i) deep += "</a>";
  CHECK(error_of(deep).find("nested deeper than 64 levels") != std::string::npos);
  CHECK(error_of(deep.substr(0, 3'000'000)).find("not valid XML") != std::string::npos);  // never closed
}

TEST_CASE("beerxml: not XML, no RECIPE, or a hop list is each one clear line") {
  CHECK(error_of("<RECIPES><RECIPE>").find("r.xml: not valid XML at line 1") != std::string::npos);
  CHECK(error_of("<HOPS><HOP><NAME>x</NAME></HOP></HOPS>").find("no RECIPE record") != std::string::npos);
  CHECK(bine::looks_like_xml("\xEF\xBB\xBF  <RECIPES/>"));
  CHECK(!bine::looks_like_xml("{\"hops\": []}"));
}

TEST_CASE("beerxml write: unchanged recipe writes the file back byte for byte (Latin-1 kept)") {
  const std::string original = read_fixture("rebalance-pale.xml");
  const auto read = bine::parse_beerxml_recipe(original, "pale.xml", {});
  CHECK(bine::beerxml_with_recipe(read, read.recipe, nullptr) == original);
}

TEST_CASE("beerxml write: new grams and alpha change only AMOUNT and ALPHA, and import again gives them") {
  const std::string original = read_fixture("rebalance-pale.xml");
  const auto read = bine::parse_beerxml_recipe(original, "pale.xml", {});
  bine::Recipe after = read.recipe;
  after.hops[0].grams = 22.1;
  after.hops[0].alpha_acid = 9.5;
  const std::string written = bine::beerxml_with_recipe(read, after, nullptr);
  // 22.1 g = 0.0221 kg; everything else, fermentables, yeast, mash, notes, unknown tags, is as read.
  std::string expected = replace_once(original, "<AMOUNT>0.030</AMOUNT>", "<AMOUNT>0.0221</AMOUNT>");
  expected = replace_once(expected, "<ALPHA>7.0</ALPHA>", "<ALPHA>9.5</ALPHA>");
  CHECK(written == expected);
  const auto again = bine::parse_beerxml_recipe(written, "again.xml", {});
  REQUIRE(again.recipe.hops.size() == 3);
  CHECK(again.recipe.hops[0].grams == doctest::Approx(22.1).epsilon(1e-12));
  CHECK(again.recipe.hops[0].alpha_acid == doctest::Approx(9.5).epsilon(1e-12));
  for (std::size_t i = 1; i < 3; ++i) {
    CHECK(again.recipe.hops[i].grams == doctest::Approx(read.recipe.hops[i].grams).epsilon(1e-12));
    CHECK(again.recipe.hops[i].use == read.recipe.hops[i].use);
    CHECK(again.recipe.hops[i].minutes == read.recipe.hops[i].minutes);
  }
}

TEST_CASE("beerxml write: an addition that is gone loses its HOP, a new one gets a HOP with HSI = 100 - stability") {
  const auto read = bine::parse_beerxml_recipe(kOneHop, "r.xml", {});
  bine::Catalog catalog;
  bine::Variety variety;
  variety.name = "Fixture Aroma";
  variety.stability = 65.0;  // % alpha left after 6 months -> BeerXML HSI 35 (% lost), its definition
  catalog.varieties.push_back(variety);
  bine::Recipe after = read.recipe;
  after.hops[0].variety = "Fixture Aroma";
  after.hops[0].use = bine::HopUse::dry_hop;
  after.hops[0].minutes = 2880.0;
  after.hops[0].form = bine::HopForm::pellet;
  const std::string written = bine::beerxml_with_recipe(read, after, &catalog);
  CHECK(written.find("Fixture Bitter") == std::string::npos);
  CHECK(written.find("<HOP><NAME>Fixture Aroma</NAME><VERSION>1</VERSION><ALPHA>7</ALPHA><AMOUNT>0.03</AMOUNT>"
                     "<USE>Dry Hop</USE><TIME>2880</TIME><FORM>Pellet</FORM><HSI>35</HSI></HOP>") != std::string::npos);
}
