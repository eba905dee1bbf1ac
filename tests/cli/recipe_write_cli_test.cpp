// End-to-end (in-process): recipe files written by `rebalance --write` and `blend --write` keep the
// brewer's notation, are weighed as a brewer weighs, read back at the IBU bine reported, and do not
// move when rebalanced again with the same lots. Expected amounts are hand arithmetic on the fixture
// values (tests/fixtures, written for these tests) with the exact unit definitions
// (1 oz = 28.349523125 g, 1 US gal = 3.785411784 L, 1 US bbl = 31 gal).
#include <doctest/doctest.h>
#include <fmt/format.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

using bine::test::example;
using bine::test::fixture;
using bine::test::run_cli;
using nlohmann::json;

namespace {

bine::test::CliRun with_catalog(std::vector<std::string> args) {
  args.insert(args.begin(), {"--catalog", fixture("h3-catalog.json")});
  return run_cli(args);
}

json read_json(const std::filesystem::path& path) { return json::parse(bine::test::slurp(path)); }

/// The amounts of a written recipe, as written.
std::vector<std::string> amounts(const json& recipe) {
  std::vector<std::string> out;
  for (const auto& hop : recipe["hops"]) out.push_back(hop["amount"]);
  return out;
}

}  // namespace

TEST_CASE("rebalance --write three times with the same lot: the late hops stay at 54.5 g and 81.8 g") {
  // Oil held: 40 g x 1.5 / 1.1 = 54.545 g -> 54.5 g; 60 g x 1.5 / 1.1 = 81.818 g -> 81.8 g (catalog
  // midpoint 1.5 mL/100 g). Before the oil was recorded a second run took the midpoint again and the
  // whirlpool grew 40 -> 54.5 -> 74.4 -> 101 g.
  const bine::test::TempDir dir;
  std::string input = fixture("h3-rebalance.json");
  std::vector<std::string> texts;
  for (int run = 1; run <= 3; ++run) {
    const auto out = dir.path() / ("run-" + std::to_string(run) + ".json");
    const auto result = with_catalog(
        {"rebalance", input, "--lot", "Fixture Aroma=5%,oil=1.1", "--on", "2026-12-01", "--write", out.string()});
    INFO(result.err);
    REQUIRE(result.status == 0);
    texts.push_back(bine::test::slurp(out));
    input = out.string();
  }
  const auto first = amounts(json::parse(texts[0]));
  CHECK(first[1] == "54.5 g");
  CHECK(first[2] == "81.8 g");
  CHECK(json::parse(texts[0])["hops"][1]["total_oil"].get<double>() == 1.1);
  CHECK(texts[1] == texts[0]);
  CHECK(texts[2] == texts[0]);
}

TEST_CASE("rebalance --write keeps oz, gal, F and Plato, weighs to 0.01 oz, and ibu reads the reported total") {
  const bine::test::TempDir dir;
  const auto out = dir.path() / "us.json";
  const auto result =
      with_catalog({"rebalance", fixture("r10-us-ipa.json"), "--lot", "Fixture Bitter=9.5%", "--lot",
                    "Fixture Aroma=5%,oil=1.1", "--on", "2026-12-01", "--json", "--write", out.string()});
  INFO(result.err);
  REQUIRE(result.status == 0);
  const json written = read_json(out);
  CHECK(written["batch_volume"] == "5 gal");
  CHECK(written["original_gravity"] == "15 P");
  CHECK(written["hops"][1]["temperature"] == "176 F");
  CHECK(written["hops"][2]["time"] == "4 d");
  // Oil held: 2 oz x 1.5 / 1.1 = 2.727 oz -> 2.73 oz; 3 oz x 1.5 / 1.1 = 4.091 oz -> 4.09 oz.
  CHECK(written["hops"][1]["amount"] == "2.73 oz");
  CHECK(written["hops"][2]["amount"] == "4.09 oz");
  // The boil addition (which absorbs the whirlpool's change) is weighed to 0.01 oz too.
  const std::string boil = written["hops"][0]["amount"];
  REQUIRE(boil.size() > 3);
  CHECK(boil.substr(boil.size() - 3) == " oz");
  const double ounces = std::stod(boil);
  CHECK(std::abs(ounces * 100.0 - std::round(ounces * 100.0)) < 1e-9);
  CHECK(written["target_ibu"].get<double>() == 55.0);
  // Read back: the total is the one rebalance reported.
  const auto reread = with_catalog({"ibu", "--json", out.string()});
  REQUIRE(reread.status == 0);
  CHECK(std::abs(json::parse(reread.out)["total_ibu"].get<double>() -
                 json::parse(result.out)["total_ibu_after"].get<double>()) <= 0.001);
  // Plato is shown back as Plato.
  const auto text = with_catalog({"ibu", out.string()});
  CHECK(text.out.find("at OG 15.0 P,") != std::string::npos);
}

TEST_CASE("the absorber's sentence gives the late additions' IBU change with its sign") {
  // A lot with more oil holds the whirlpool's oil with fewer grams: 40 g x 1.5 / 2.0 = 30 g at the
  // same 5 % alpha, so the whirlpool loses a quarter of its IBU and the boil addition gains it.
  const auto result = with_catalog(
      {"rebalance", fixture("h3-rebalance.json"), "--lot", "Fixture Aroma=5%,oil=2.0", "--on", "2026-12-01", "--json"});
  REQUIRE(result.status == 0);
  const json doc = json::parse(result.out);
  const double late_change =
      doc["additions"][1]["ibu_after"].get<double>() - doc["additions"][1]["ibu_before"].get<double>();
  CHECK(late_change < 0.0);
  const auto text = with_catalog(
      {"rebalance", fixture("h3-rebalance.json"), "--lot", "Fixture Aroma=5%,oil=2.0", "--on", "2026-12-01"});
  CHECK(
      text.out.find(fmt::format("absorbed the IBU change of {:+.2f} IBU from the other additions (its own IBU changed "
                                "by {:+.2f} IBU)",
                                late_change, -late_change)) != std::string::npos);
}

TEST_CASE("blend --recipe keeps the recipe's own late-hop grams unless --rate is given") {
  const std::string recipe = example("pale-ale.json");
  const auto late_grams = [](const bine::test::CliRun& run) {
    INFO(run.err);
    REQUIRE(run.status == 0);
    return json::parse(run.out)["late_grams"].get<double>();
  };
  // pale-ale.json: 40 g whirlpool + 50 g + 30 g dry hop = 120 g. Each of up to six additions is weighed
  // to 0.1 g, so the sum may move by 6 x 0.05 g.
  CHECK(std::abs(late_grams(run_cli({"blend", "--target", "citrus=4", "--recipe", recipe, "--json"})) - 120.0) <= 0.3);
  // 1 oz/gal = 28.349523125 / 3.785411784 = 7.48915 g/L; x 20 L = 149.78 g.
  CHECK(std::abs(
            late_grams(run_cli({"blend", "--target", "citrus=4", "--recipe", recipe, "--rate", "1oz/gal", "--json"})) -
            149.78) <= 0.3);
  // 1 lb/bbl = 453.59237 / (31 x 3.785411784) = 3.86535 g/L; x 20 L = 77.31 g.
  CHECK(std::abs(
            late_grams(run_cli({"blend", "--target", "citrus=4", "--recipe", recipe, "--rate", "1lb/bbl", "--json"})) -
            77.31) <= 0.3);
  // The text says where the amount came from.
  const auto text = run_cli({"blend", "--target", "citrus=4", "--recipe", recipe});
  CHECK(text.out.find("the recipe's own whirlpool and dry-hop amount") != std::string::npos);
  const auto bare =
      run_cli({"blend", "--target", "citrus=4", "--volume", "20L", "--ibu", "30", "--bittering", "Keelstone"});
  INFO(bare.err);
  REQUIRE(bare.status == 0);
  CHECK(bare.out.find("late hops at the default rate of 4 g/L: 80 g") != std::string::npos);
}

TEST_CASE("blend --write of a recipe computed above 200 IBU writes a file that loads, without a made-up target") {
  const bine::test::TempDir dir;
  const auto out = dir.path() / "bitter.json";
  const auto run = run_cli({"blend", "--target", "citrus=4", "--recipe", fixture("r10-very-bitter.json"), "--write",
                            out.string(), "--json"});
  INFO(run.err);
  REQUIRE(run.status == 0);
  // 150 g at 13.4 % in 20 L at 1.060 is about 233 IBU (Tinseth), above the 200 IBU bound of target_ibu.
  CHECK(json::parse(run.out)["total_ibu"].get<double>() > 200.0);
  CHECK_FALSE(read_json(out).contains("target_ibu"));
  const auto reread = run_cli({"ibu", "--json", out.string()});
  INFO(reread.err);
  REQUIRE(reread.status == 0);
  CHECK(std::abs(json::parse(reread.out)["total_ibu"].get<double>() -
                 json::parse(run.out)["total_ibu"].get<double>()) <= 0.05);
}
