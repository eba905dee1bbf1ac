// End-to-end (in-process, run_in_process.hpp): bine rebalance on fixture files; expected values by hand arithmetic and
// the METHODS.md check value (same IBU, 30 g at 7.0 % -> lot at 9.5 %: 22.1 g).
#include <doctest/doctest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

using bine::test::fixture;
using bine::test::run_cli;

namespace {
/// `bine --catalog <fixture catalog> ARGS`, in-process.
bine::test::CliRun with_catalog(std::vector<std::string> args) {
  args.insert(args.begin(), {"--catalog", fixture("h3-catalog.json")});
  return run_cli(args);
}
}  // namespace

TEST_CASE("rebalance --lot: the 60-minute addition goes 30 g -> 22.1 g and holds its IBU") {
  const auto result = with_catalog(
      {"rebalance", "--json", fixture("h3-rebalance.json"), "--lot", "Fixture Bitter=9.5%", "--on", "2026-12-01"});
  INFO(result.err);
  REQUIRE(result.status == 0);
  const auto json = nlohmann::json::parse(result.out);
  const auto& bitter = json["additions"][0];
  CHECK(bitter["variety"] == "Fixture Bitter");
  CHECK(bitter["grams_before"].get<double>() == 30.0);
  // 30 x 7.0 / 9.5 = 22.105 g, weighed to 0.1 g: 22.1 g, which holds the IBU to 22.1 / 22.105 (0.02 %).
  CHECK(bitter["grams_after"].get<double>() == doctest::Approx(22.1));
  CHECK(std::abs(bitter["ibu_after"].get<double>() - bitter["ibu_before"].get<double>()) < 0.01);
  CHECK(std::abs(json["total_ibu_after"].get<double>() - json["total_ibu_before"].get<double>()) < 0.01);
  CHECK(json["absorbed_by"].is_null());  // the weighing alone is nothing to absorb
}

TEST_CASE("rebalance --lot with oil: whirlpool holds oil, the boil addition absorbs the IBU change") {
  const auto result = with_catalog(
      {"rebalance", fixture("h3-rebalance.json"), "--lot", "Fixture Aroma=8%,oil=2.0", "--on", "2026-12-01"});
  INFO(result.err);
  REQUIRE(result.status == 0);
  // Oil held: 40 g x 1.5 / 2.0 = 30.0 g (catalog midpoint 1.5 mL/100 g); dry hop 60 g -> 45.0 g.
  CHECK(result.out.find("30.0 g") != std::string::npos);
  CHECK(result.out.find("45.0 g") != std::string::npos);
  CHECK(result.out.find("Addition 1 (Fixture Bitter, boil 60 min) absorbed the IBU change") != std::string::npos);
  CHECK(result.out.find("Caution: whirlpool") != std::string::npos);
}

TEST_CASE("rebalance --stock: alpha aged to --on and the shortfall reported") {
  const auto result = with_catalog(
      {"rebalance", "--json", fixture("h3-rebalance.json"), "--stock", fixture("h3-stock.json"), "--on", "2026-12-01"});
  INFO(result.err);
  REQUIRE(result.status == 0);
  const auto json = nlohmann::json::parse(result.out);
  // 6.0 %, stability 50, vacuum, -18 C, 365 d -> 5.314 % (METHODS.md); 30 x 7.0 / 5.314 = 39.5 g.
  CHECK(json["additions"][0]["alpha_after"].get<double>() == doctest::Approx(5.314).epsilon(1e-3));
  CHECK(json["additions"][0]["grams_after"].get<double>() == doctest::Approx(39.52).epsilon(1e-3));
  REQUIRE(json["shortfalls"].size() == 1);
  CHECK(json["shortfalls"][0]["lot"] == "FB-1");
  CHECK(json["shortfalls"][0]["on_hand_g"].get<double>() == 10.0);
  CHECK(json["shortfalls"][0]["short_g"].get<double>() == doctest::Approx(29.52).epsilon(1e-3));
}

TEST_CASE("rebalance --write saves a recipe that ibu reads back at the same total") {
  const bine::test::TempDir dir;
  const auto out = dir.path() / "written.json";
  const auto result = with_catalog({"rebalance", "--json", fixture("h3-rebalance.json"), "--lot", "Fixture Bitter=9.5%",
                                    "--on", "2026-12-01", "--write", out.string()});
  REQUIRE(result.status == 0);
  const double held = nlohmann::json::parse(result.out)["total_ibu_after"].get<double>();
  const auto reread = with_catalog({"ibu", "--json", out.string()});
  REQUIRE(reread.status == 0);
  // Amounts are written to 0.1 g, so the IBU may move by 0.05 / 22.1 of the bittering share.
  CHECK(nlohmann::json::parse(reread.out)["total_ibu"].get<double>() == doctest::Approx(held).epsilon(2e-3));
}

TEST_CASE("rebalance rejects a lot the recipe does not use, a lot packaged after --on, and no lots, exit 2") {
  const auto unused = with_catalog({"rebalance", fixture("h3-rebalance.json"), "--lot", "Keelstone=9%"});
  CHECK(unused.status == 2);
  CHECK(unused.err.find("--lot: \"Keelstone=9%\": the recipe does not use Keelstone") != std::string::npos);
  const auto future = with_catalog(
      {"rebalance", fixture("h3-rebalance.json"), "--stock", fixture("h3-stock.json"), "--on", "2025-11-30"});
  CHECK(future.status == 2);
  CHECK(future.err.find("/lots/0/packaged: 2025-12-01 is after the brew day 2025-11-30 (give a later --on)") !=
        std::string::npos);
  const auto neither = with_catalog({"rebalance", fixture("h3-rebalance.json")});
  CHECK(neither.status == 2);
  const auto alpha = with_catalog({"rebalance", fixture("h3-rebalance.json"), "--lot", "Fixture Bitter=0.07"});
  CHECK(alpha.status == 2);
}

TEST_CASE("rebalance --json is byte-identical run to run") {
  const std::vector<std::string> args{
      "rebalance", "--json", fixture("h3-rebalance.json"), "--stock", fixture("h3-stock.json"), "--on", "2026-12-01"};
  const auto first = with_catalog(args);
  const auto second = with_catalog(args);
  REQUIRE(first.status == 0);
  CHECK(first.out == second.out);
}

TEST_CASE("rebalance: late hops that alone exceed the total are infeasible, exit 3 with a way out") {
  // Whirlpool 200 g going from 5 % to 15 % triples its IBU, beyond the recipe's total.
  const auto result =
      with_catalog({"rebalance", fixture("h3-infeasible.json"), "--lot", "Fixture Aroma=15%", "--on", "2026-12-01"});
  CHECK(result.status == 3);
  CHECK(result.err.find("cut the whirlpool amounts") != std::string::npos);
}
