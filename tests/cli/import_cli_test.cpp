// End-to-end (in-process, run_in_process.hpp): bine import on hand-written CSV and BeerXML fixtures
// (tests/fixtures/csv, tests/fixtures/beerxml); the files it writes must load with our own loaders.
#include <doctest/doctest.h>

#include <filesystem>
#include <nlohmann/json.hpp>
#include <string>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

using bine::test::fixture;
using bine::test::run_cli;

TEST_CASE("import CSV --to catalog: the catalog loads, NOTES become tags, unplaced words are listed") {
  bine::test::TempDir dir;
  const auto out = (dir.path() / "my-hops.json").string();
  const auto result = run_cli({"import", fixture("csv/spec-sheet-semicolon.csv"), "--to", "catalog", "--out", out});
  INFO(result.err);
  REQUIRE(result.status == 0);
  CHECK(result.out.find("imported 3 varieties") != std::string::npos);
  CHECK(result.out.find("Fixture Lemonfield (line 2): words the aroma lexicon cannot place: wet, cardboard") !=
        std::string::npos);
  const auto shown = run_cli({"--catalog", out, "catalog", "show", "fixture lemonfield", "--json"});
  INFO(shown.err);
  REQUIRE(shown.status == 0);
  const auto variety = nlohmann::json::parse(shown.out);
  CHECK(variety["alpha_acid"] == nlohmann::json::array({4.5, 6.0}));
}

TEST_CASE("import CSV with bad rows: exit 2, each row named, nothing written unless --skip-bad") {
  bine::test::TempDir dir;
  const auto out = (dir.path() / "c.json").string();
  const auto refused = run_cli({"import", fixture("csv/bad-rows.csv"), "--to", "catalog", "--out", out});
  CHECK(refused.status == 2);
  CHECK(refused.err.find("line 3, column 2 (\"Alpha (%)\"): \"abc\" is not a number") != std::string::npos);
  CHECK(refused.err.find("line 4, column 2") != std::string::npos);
  CHECK(refused.err.find("nothing written") != std::string::npos);
  CHECK(!std::filesystem::exists(out));
  const auto skipped = run_cli({"import", fixture("csv/bad-rows.csv"), "--to", "catalog", "--out", out, "--skip-bad"});
  INFO(skipped.err);
  REQUIRE(skipped.status == 0);
  CHECK(skipped.out.find("imported 2 varieties") != std::string::npos);
  CHECK(skipped.out.find("skipped line 3") != std::string::npos);
  CHECK(skipped.out.find("skipped line 4") != std::string::npos);
  CHECK(run_cli({"--catalog", out, "catalog", "show", "Fixture Saltmere"}).status == 0);
}

TEST_CASE("import CSV --to stock: lots with kg read from the header, the stock file loads") {
  bine::test::TempDir dir;
  const auto out = (dir.path() / "stock.json").string();
  const auto result = run_cli({"import", fixture("csv/certificates-comma.csv"), "--to", "stock", "--out", out});
  INFO(result.err);
  REQUIRE(result.status == 0);
  const auto stock = nlohmann::json::parse(bine::test::slurp(out));
  REQUIRE(stock["lots"].size() == 2);
  CHECK(stock["lots"][0]["on_hand"] == "2500 g");  // 2.5 kg (exact unit definition)
  CHECK(stock["lots"][0]["hsi"] == 0.28);
  CHECK(run_cli({"catalog", "check", out}).status == 0);
}

TEST_CASE("import BeerXML --to recipe gives the same IBU as the BeerXML file itself") {
  bine::test::TempDir dir;
  const auto out = (dir.path() / "recipe.json").string();
  const auto xml = fixture("beerxml/rebalance-pale.xml");
  const auto result = run_cli({"import", xml, "--to", "recipe", "--out", out, "--whirlpool-temp", "80C"});
  INFO(result.err);
  REQUIRE(result.status == 0);
  const auto a = run_cli({"ibu", "--json", out});
  const auto b = run_cli({"ibu", "--json", xml, "--whirlpool-temp", "80C"});
  REQUIRE(a.status == 0);
  REQUIRE(b.status == 0);
  CHECK(std::abs(nlohmann::json::parse(a.out)["total_ibu"].get<double>() -
                 nlohmann::json::parse(b.out)["total_ibu"].get<double>()) < 1e-9);
  CHECK(run_cli({"import", fixture("csv/bad-rows.csv"), "--to", "recipe"}).status == 2);
}

TEST_CASE("import BeerXML hops --to catalog: HSI 35 (% lost in 6 months) is stability 65") {
  bine::test::TempDir dir;
  const auto out = (dir.path() / "hops.json").string();
  const auto result = run_cli({"import", fixture("beerxml/rebalance-pale.xml"), "--to", "catalog", "--out", out});
  INFO(result.err);
  REQUIRE(result.status == 0);
  // The recipe uses Fixture Aroma twice: one variety, the second record left out and said so.
  CHECK(result.out.find("already read at") != std::string::npos);
  const auto catalog = nlohmann::json::parse(bine::test::slurp(out));
  REQUIRE(catalog["varieties"].size() == 2);
  CHECK(catalog["varieties"][0]["stability"] == 65.0);  // 100 - 35, the BeerXML 1.0 HSI definition
  CHECK(catalog["varieties"][0]["purpose"] == "bittering");
}
