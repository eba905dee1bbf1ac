// End-to-end (in-process, run_in_process.hpp): BeerXML 1.0 recipes through bine ibu and bine
// rebalance. tests/fixtures/beerxml/rebalance-pale.xml is written by hand from the BeerXML 1.0
// specification and holds the same recipe as tests/fixtures/h3-rebalance.json.
#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

using bine::test::fixture;
using bine::test::run_cli;

namespace {

const std::string kPaleXml = fixture("beerxml/rebalance-pale.xml");

/// The text with the first <TAG>...</TAG> removed.
std::string without_first(std::string text, const std::string& tag) {
  const auto from = text.find("<" + tag + ">");
  const auto to = text.find("</" + tag + ">", from);
  REQUIRE(from != std::string::npos);
  REQUIRE(to != std::string::npos);
  return text.erase(from, to + tag.size() + 3 - from);
}

}  // namespace

TEST_CASE("ibu: the BeerXML recipe and the same recipe in bine JSON give the same IBU to 1e-9") {
  // The JSON twin's whirlpool stands at 80 C; BeerXML has no temperature, so it is given.
  const auto xml = run_cli({"ibu", "--json", kPaleXml, "--whirlpool-temp", "80C"});
  const auto json = run_cli({"ibu", "--json", fixture("h3-rebalance.json")});
  INFO(xml.err);
  REQUIRE(xml.status == 0);
  REQUIRE(json.status == 0);
  const auto a = nlohmann::json::parse(xml.out);
  const auto b = nlohmann::json::parse(json.out);
  CHECK(std::abs(a["total_ibu"].get<double>() - b["total_ibu"].get<double>()) < 1e-9);
  CHECK(a["total_ibu"].get<double>() > 10.0);  // the boil addition alone: 30 g at 7 % in 20 L is ~20 IBU
  REQUIRE(a["additions"].size() == b["additions"].size());
  for (std::size_t i = 0; i < a["additions"].size(); ++i)
    CHECK(std::abs(a["additions"][i]["ibu"].get<double>() - b["additions"][i]["ibu"].get<double>()) < 1e-9);
}

TEST_CASE("ibu: a BeerXML Aroma addition stands at the stated default and the output says so") {
  const auto result = run_cli({"ibu", kPaleXml});
  INFO(result.err);
  REQUIRE(result.status == 0);
  CHECK(result.out.find("1 Aroma addition read as whirlpool at 90 C (BeerXML gives no temperature; "
                        "--whirlpool-temp sets it)") != std::string::npos);
}

TEST_CASE("ibu: BeerXML is told by content, not by the file name") {
  bine::test::TempDir dir;
  const auto renamed = dir.path() / "recipe.json";
  std::filesystem::copy_file(kPaleXml, renamed);
  const auto result = run_cli({"ibu", renamed.string()});
  INFO(result.err);
  CHECK(result.status == 0);
  CHECK(result.out.find("Fixture Harbour Pale") != std::string::npos);
}

TEST_CASE("rebalance --write new.xml: the new grams in AMOUNT (kg), the rest of the recipe untouched") {
  bine::test::TempDir dir;
  const auto out = dir.path() / "new.xml";
  const auto result = run_cli({"--catalog", fixture("h3-catalog.json"), "rebalance", kPaleXml, "--lot",
                               "Fixture Bitter=9.5%", "--on", "2026-12-01", "--write", out.string()});
  INFO(result.err);
  REQUIRE(result.status == 0);
  CHECK(result.out.find("(BeerXML 1.0)") != std::string::npos);
  const std::string written = bine::test::slurp(out);
  // The check value of docs/methods.md (same IBU, 30 g at 7.0 % -> lot at 9.5 %): 22.1 g = 0.0221 kg.
  CHECK(written.find("<AMOUNT>0.0221") != std::string::npos);
  CHECK(written.find("<ALPHA>9.5</ALPHA>") != std::string::npos);
  // Apart from the first hop's AMOUNT and ALPHA, the bytes are the file's (Latin-1 notes, comment,
  // fermentables, yeast, mash, unknown tags).
  const std::string original = bine::test::slurp(kPaleXml);
  CHECK(without_first(without_first(written, "AMOUNT"), "ALPHA") ==
        without_first(without_first(original, "AMOUNT"), "ALPHA"));
  // And it reads again: the 60-minute addition now weighs 22.1 g (30 x 7.0 / 9.5 = 22.105 g, weighed to 0.1 g).
  const auto again = run_cli({"ibu", "--json", out.string()});
  REQUIRE(again.status == 0);
  CHECK(nlohmann::json::parse(again.out)["additions"][0]["grams"].get<double>() == doctest::Approx(22.1));
}

TEST_CASE("rebalance --write x.xml from a bine JSON recipe is refused, nothing written") {
  bine::test::TempDir dir;
  const auto out = dir.path() / "x.xml";
  const auto result = run_cli({"--catalog", fixture("h3-catalog.json"), "rebalance", fixture("h3-rebalance.json"),
                               "--lot", "Fixture Bitter=9.5%", "--on", "2026-12-01", "--write", out.string()});
  CHECK(result.status == 2);
  CHECK(result.err.find("BeerXML is written only for a recipe read from BeerXML") != std::string::npos);
  CHECK(!std::filesystem::exists(out));
}
