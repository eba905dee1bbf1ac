// End-to-end (in-process): `bine swap VARIETY --recipe FILE` puts the substitute into the recipe.
// Fixtures (tests/fixtures/r10-swap-*.json, written for these tests): Fixture Lost (oil midpoint
// 1.5 mL/100 g) leaves a 20 L pale ale at 1.050 with 20 g of Fixture Charge at 13 % for 60 min, 30 g of
// Lost at 7 % in an 80 C whirlpool for 20 min and 60 g of Lost as dry hop. Expected values by hand:
// the oil factor, and Tinseth's formula with Malowicki & Shellhammer's boil-equivalent minutes
// written out below (docs/methods.md#tinseth, #boil-equivalent-minutes), not bine's functions.
#include <doctest/doctest.h>

#include <cmath>
#include <cstdlib>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

using bine::test::fixture;
using bine::test::run_cli;
using nlohmann::json;

namespace {

bine::test::CliRun swap(std::vector<std::string> args) {
  args.insert(args.begin(), {"--catalog", fixture("r10-swap-catalog.json"), "swap", "Fixture Lost", "--recipe",
                             fixture("r10-swap-recipe.json")});
  return run_cli(args);
}

/// Tinseth IBU of `grams` at `alpha` % in 20 L at 1.050 after `minutes` of boil, pellets (x 1.10).
double tinseth(double grams, double alpha, double minutes) {
  const double bigness = 1.65 * std::pow(0.000125, 0.050);
  const double time = (1.0 - std::exp(-0.04 * minutes)) / 4.15;
  return bigness * time * 1.10 * alpha / 100.0 * grams * 1000.0 / 20.0;
}

/// 20 min at 80 C in boil minutes: 20 x exp(-11858 (1/353.15 - 1/373.15)).
double stand_minutes() { return 20.0 * std::exp(-11858.0 * (1.0 / 353.15 - 1.0 / 373.15)); }

}  // namespace

TEST_CASE("swap --recipe: late additions by the oil factor, the bittering charge holds the total IBU") {
  const auto run = swap({"--json"});
  INFO(run.err);
  REQUIRE(run.status == 0);
  const json doc = json::parse(run.out)["recipe_swap"];
  CHECK(doc["swapped_in"][0]["variety"] == "Fixture Standin");
  // Oil factor 1.5 / 2.0 = 0.75: whirlpool 30 -> 22.5 g, dry hop 60 -> 45.0 g.
  CHECK(doc["additions"][1]["grams_after"].get<double>() == doctest::Approx(22.5));
  CHECK(doc["additions"][2]["grams_after"].get<double>() == doctest::Approx(45.0));
  CHECK(doc["additions"][1]["variety_after"] == "Fixture Standin");
  // The whirlpool's IBU goes from 30 g at 7 % to 22.5 g at 10 %; the 60-minute charge gives up the
  // difference: 20 g - (after - before) / (IBU per gram of the charge), weighed to 0.1 g.
  const double before = tinseth(30.0, 7.0, stand_minutes());
  const double after = tinseth(22.5, 10.0, stand_minutes());
  const double per_gram = tinseth(1.0, 13.0, 60.0);
  const double charge = 20.0 - (after - before) / per_gram;
  CHECK(std::abs(doc["additions"][0]["grams_after"].get<double>() - charge) <= 0.05 + 1e-9);
  CHECK(doc["absorbed_by"] == 1);
  // Total held within the charge's weighing (0.05 g x IBU per gram).
  CHECK(std::abs(doc["total_ibu_after"].get<double>() - doc["total_ibu_before"].get<double>()) <=
        0.05 * per_gram + 1e-3);
  CHECK(doc["total_ibu_before"].get<double>() == doctest::Approx(tinseth(20.0, 13.0, 60.0) + before).epsilon(1e-4));
}

TEST_CASE("swap --recipe --stock checks each lot against what the recipe needs and picks one that covers") {
  const bine::test::TempDir dir;
  const auto out = dir.path() / "swapped.json";
  const auto run =
      swap({"--stock", fixture("r10-swap-stock.json"), "--on", "2026-12-01", "--json", "--write", out.string()});
  INFO(run.err);
  REQUIRE(run.status == 0);
  const json doc = json::parse(run.out)["recipe_swap"];
  // Lot SI-1 of Fixture Standin (oil 2.0) would need 22.5 + 45.0 = 67.5 g and has 50 g; lot FA-1 of
  // Fixture Far (oil 1.2) needs 30 x 1.25 + 60 x 1.25 = 37.5 + 75.0 = 112.5 g of its 500 g.
  bool standin = false;
  for (const auto& c : doc["coverage"])
    if (c["substitute"] == "Fixture Standin (SI-1)") {
      standin = true;
      CHECK(c["needed_g"].get<double>() == doctest::Approx(67.5));
      CHECK(c["covers"] == false);
    }
  CHECK(standin);
  CHECK(doc["swapped_in"][0]["lot"] == "FA-1");
  CHECK(doc["additions"][1]["grams_after"].get<double>() == doctest::Approx(37.5));
  CHECK(doc["additions"][2]["grams_after"].get<double>() == doctest::Approx(75.0));
  CHECK(doc["shortfalls"].empty());
  // The written recipe names the lot and reads back at the reported total.
  const json written = json::parse(bine::test::slurp(out));
  CHECK(written["hops"][1]["variety"] == "Fixture Far");
  CHECK(written["hops"][1]["lot"] == "FA-1");
  const auto reread = run_cli({"--catalog", fixture("r10-swap-catalog.json"), "ibu", "--json", out.string()});
  REQUIRE(reread.status == 0);
  CHECK(std::abs(json::parse(reread.out)["total_ibu"].get<double>() - doc["total_ibu_after"].get<double>()) <= 1e-3);
  // --pick 1 takes the short lot and says how short: 67.5 - 50 = 17.5 g.
  const auto picked = swap({"--stock", fixture("r10-swap-stock.json"), "--on", "2026-12-01", "--pick", "1"});
  REQUIRE(picked.status == 0);
  CHECK(picked.out.find("Fixture Standin (lot SI-1): need 67.5 g, have 50.0 g, short 17.5 g") != std::string::npos);
}

TEST_CASE("swap --pick, --pair and --write need --recipe, and --pick and --pair exclude each other") {
  CHECK(run_cli({"swap", "Tidewell", "--pick", "2"}).status == 2);
  CHECK(run_cli({"swap", "Tidewell", "--write", "x.json"}).status == 2);
  CHECK(swap({"--pick", "1", "--pair", "1"}).status == 2);
  // A recipe without the missing variety: bad input naming the recipe.
  const auto other = run_cli({"--catalog", fixture("r10-swap-catalog.json"), "swap", "Fixture Far", "--recipe",
                              fixture("r10-swap-recipe.json")});
  CHECK(other.status == 2);
  CHECK(other.err.find("r10-swap-recipe.json: /hops: the recipe does not use \"Fixture Far\"") != std::string::npos);
}

TEST_CASE("swap --recipe --brewhouse: the profile's factor 0.9 on every IBU, and the output names it") {
  // tests/fixtures/iv-brewhouse.json: one factor, 0.9. The charge (20 g at 13 %, 60 min, pellets) gives
  // tinseth(20, 13, 60) = 32.98 IBU as written; with the profile 0.9 x that (hand arithmetic), and so
  // does every other figure, since the factor multiplies every addition's utilization.
  const std::string profile = fixture("iv-brewhouse.json");
  const auto plain = swap({"--json"});
  const auto with = swap({"--json", "--brewhouse", profile});
  INFO(with.err);
  REQUIRE(plain.status == 0);
  REQUIRE(with.status == 0);
  const json a = json::parse(plain.out)["recipe_swap"];
  const json b = json::parse(with.out)["recipe_swap"];
  CHECK(a["additions"][0]["ibu_before"].get<double>() == doctest::Approx(tinseth(20.0, 13.0, 60.0)).epsilon(1e-4));
  CHECK(b["additions"][0]["ibu_before"].get<double>() ==
        doctest::Approx(0.9 * tinseth(20.0, 13.0, 60.0)).epsilon(1e-4));
  CHECK(b["additions"][1]["ibu_before"].get<double>() ==
        doctest::Approx(0.9 * tinseth(30.0, 7.0, stand_minutes())).epsilon(1e-4));
  CHECK(b["total_ibu_before"].get<double>() ==
        doctest::Approx(0.9 * a["total_ibu_before"].get<double>()).epsilon(1e-4));
  CHECK(b["total_ibu_after"].get<double>() == doctest::Approx(0.9 * a["total_ibu_after"].get<double>()).epsilon(3e-3));
  CHECK(a["brewhouse"].is_null());
  CHECK(b["brewhouse"]["file"] == profile);
  CHECK(b["brewhouse"]["factor"]["value"].get<double>() == 0.9);
  const auto text = swap({"--brewhouse", profile});
  REQUIRE(text.status == 0);
  CHECK(text.out.find("Brewhouse profile " + profile + " (fitted 2026-06-01 on 10 batches): factor 0.900") !=
        std::string::npos);
  // BINE_BREWHOUSE names the same profile when --brewhouse is not given.
  ::setenv("BINE_BREWHOUSE", profile.c_str(), 1);
  const auto from_env = swap({"--json"});
  ::unsetenv("BINE_BREWHOUSE");
  REQUIRE(from_env.status == 0);
  CHECK(json::parse(from_env.out)["recipe_swap"]["brewhouse"]["file"] == profile);
  CHECK(from_env.out == with.out);
}

TEST_CASE("swap --recipe: a missing or bad brewhouse profile is one error line naming the file, exit 2") {
  const auto missing = swap({"--brewhouse", fixture("iv-no-such-profile.json")});
  CHECK(missing.status == 2);
  CHECK(missing.err == "bine: error: " + fixture("iv-no-such-profile.json") +
                           ": file not found (the brewhouse profile, --brewhouse)\n");
  const auto bad = swap({"--brewhouse", fixture("iv-brewhouse-bad.json")});
  CHECK(bad.status == 2);
  CHECK(bad.err == "bine: error: " + fixture("iv-brewhouse-bad.json") +
                       ": /model: \"bitterest\" is not a model (expected tinseth or rager) (the brewhouse profile, "
                       "--brewhouse)\n");
  CHECK(bad.out.empty());
  // Without --recipe no IBU is computed: the profile options are refused, BINE_BREWHOUSE is not read.
  const auto alone = run_cli({"--catalog", fixture("r10-swap-catalog.json"), "swap", "Fixture Lost", "--brewhouse",
                              fixture("iv-brewhouse.json")});
  CHECK(alone.status == 2);
  CHECK(alone.err.find("--brewhouse/--alpha-tolerance: only with --recipe FILE") != std::string::npos);
  ::setenv("BINE_BREWHOUSE", fixture("iv-no-such-profile.json").c_str(), 1);
  const auto listed = run_cli({"--catalog", fixture("r10-swap-catalog.json"), "swap", "Fixture Lost"});
  ::unsetenv("BINE_BREWHOUSE");
  CHECK(listed.status == 0);
}

TEST_CASE("swap --recipe: the IBU it holds with 90 % intervals, a catalog substitute over its alpha range") {
  // Fixture Standin from the catalog: alpha 9.0-11.0 %, midpoint 10 %. Its whirlpool part (22.5 g, see
  // the first case) is linear in alpha, so its interval is that IBU x 9/10 to x 11/10; the recipe's
  // own whirlpool, 30 g at 7 % as written, is +-5 % (the certificate tolerance) around its IBU
  // (docs/methods.md#ibu-intervals; hand arithmetic).
  const auto run = swap({"--json"});
  INFO(run.err);
  REQUIRE(run.status == 0);
  const json doc = json::parse(run.out)["recipe_swap"];
  const json& whirlpool = doc["additions"][1];
  const double after = tinseth(22.5, 10.0, stand_minutes());
  CHECK(whirlpool["ibu_after_low"].get<double>() == doctest::Approx(after * 0.9).epsilon(1e-4));
  CHECK(whirlpool["ibu_after_high"].get<double>() == doctest::Approx(after * 1.1).epsilon(1e-4));
  const double before = tinseth(30.0, 7.0, stand_minutes());
  CHECK(whirlpool["ibu_before_low"].get<double>() == doctest::Approx(before * 0.95).epsilon(1e-4));
  CHECK(whirlpool["ibu_before_high"].get<double>() == doctest::Approx(before * 1.05).epsilon(1e-4));
  CHECK(doc["total_ibu_after_low"].get<double>() < doc["total_ibu_after"].get<double>());
  CHECK(doc["total_ibu_after"].get<double>() < doc["total_ibu_after_high"].get<double>());
  CHECK(doc["interval"]["monte_carlo"] == false);
}
