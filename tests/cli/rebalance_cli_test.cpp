// End-to-end (in-process, run_in_process.hpp): bine rebalance on fixture files; expected values by hand arithmetic and
// the docs/methods.md check value (same IBU, 30 g at 7.0 % -> lot at 9.5 %: 22.1 g).
#include <doctest/doctest.h>

#include <cmath>
#include <cstdio>
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
  // 6.0 %, stability 50, vacuum, -18 C, 365 d -> 5.314 % (docs/methods.md); 30 x 7.0 / 5.314 = 39.5 g.
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
  CHECK(unused.err.find("--lot: \"Keelstone=9%\": the recipe does not use \"Keelstone\"") != std::string::npos);
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

namespace {
/// Tinseth IBU of `grams` whole hops at `alpha` % in 20 L at 1.050 after 60 min:
/// 1.65 x 0.000125^0.050 x (1 - e^-2.4) / 4.15 x alpha / 100 x grams x 1000 / 20 (docs/methods.md#tinseth).
double tinseth_60(double grams, double alpha) {
  return 1.65 * std::pow(0.000125, 0.050) * (1.0 - std::exp(-2.4)) / 4.15 * alpha / 100.0 * grams * 1000.0 / 20.0;
}
}  // namespace

TEST_CASE("rebalance intervals: a catalog midpoint spans its range, a given lot the certificate tolerance") {
  // tests/fixtures/iv-catalog-alpha.json: 30 g of Fixture Bitter (catalog alpha 6.0-8.0 %, midpoint
  // 7.0 %) for 60 min, no alpha in the recipe. IBU is linear in alpha and the range is read as a 90 %
  // range (sd = (8 - 6) / (2 x 1.6449), docs/methods.md#ibu-intervals), so the interval is the IBU at
  // the range ends: 24.218 x 6/7 = 20.758 and 24.218 x 8/7 = 27.678 (hand arithmetic). The lot given
  // as 9.5 % takes 30 x 7 / 9.5 = 22.105 g, weighed 22.1 g: 24.212 IBU, +-5 % (the default certificate
  // tolerance, read as a 90 % range): 23.001-25.422.
  const auto result = with_catalog(
      {"rebalance", "--json", fixture("iv-catalog-alpha.json"), "--lot", "Fixture Bitter=9.5%", "--on", "2026-12-01"});
  INFO(result.err);
  REQUIRE(result.status == 0);
  const auto json = nlohmann::json::parse(result.out);
  const auto& a = json["additions"][0];
  const double before = tinseth_60(30.0, 7.0);
  CHECK(a["ibu_before"].get<double>() == doctest::Approx(before).epsilon(1e-4));
  CHECK(a["ibu_before_low"].get<double>() == doctest::Approx(before * 6.0 / 7.0).epsilon(1e-4));
  CHECK(a["ibu_before_high"].get<double>() == doctest::Approx(before * 8.0 / 7.0).epsilon(1e-4));
  CHECK(json["total_ibu_before_low"].get<double>() == doctest::Approx(20.758).epsilon(1e-4));
  CHECK(json["total_ibu_before_high"].get<double>() == doctest::Approx(27.678).epsilon(1e-4));
  const double after = tinseth_60(22.1, 9.5);
  CHECK(a["ibu_after_low"].get<double>() == doctest::Approx(after * 0.95).epsilon(1e-4));
  CHECK(a["ibu_after_high"].get<double>() == doctest::Approx(after * 1.05).epsilon(1e-4));
  CHECK(json["interval"]["monte_carlo"] == false);
  // Text: the range is 7 IBU wide, so its ends are whole IBU (ibu_with_interval); the lot's 2.4 IBU
  // wide interval keeps one decimal.
  const auto text = with_catalog(
      {"rebalance", fixture("iv-catalog-alpha.json"), "--lot", "Fixture Bitter=9.5%", "--on", "2026-12-01"});
  REQUIRE(text.status == 0);
  CHECK(text.out.find("24.2 IBU (21-28)") != std::string::npos);
  CHECK(text.out.find("24.2 IBU (23.0-25.4)") != std::string::npos);
  CHECK(text.out.find("90 % interval from the alpha's catalog range or certificate tolerance; exact") !=
        std::string::npos);
}

TEST_CASE("rebalance --stock --json: every IBU figure lies within its interval, aged lots by seeded draws") {
  const auto result = with_catalog(
      {"rebalance", "--json", fixture("h3-rebalance.json"), "--stock", fixture("h3-stock.json"), "--on", "2026-12-01"});
  INFO(result.err);
  REQUIRE(result.status == 0);
  const auto json = nlohmann::json::parse(result.out);
  // Each figure against its own interval (ibu_low <= ibu <= ibu_high); a dry hop gives 0 IBU, 0-0.
  for (const auto& a : json["additions"])
    for (const char* key : {"ibu_before", "ibu_after"}) {
      const std::string k(key);
      CHECK(a[k + "_low"].get<double>() <= a[k].get<double>());
      CHECK(a[k].get<double>() <= a[k + "_high"].get<double>());
    }
  for (const char* key : {"total_ibu_before", "total_ibu_after"}) {
    const std::string k(key);
    CHECK(json[k + "_low"].get<double>() < json[k].get<double>());
    CHECK(json[k].get<double>() < json[k + "_high"].get<double>());
  }
  // The lots are aged over a stability range: drawn, not exact.
  CHECK(json["interval"]["monte_carlo"] == true);
  // Same inputs, same intervals (fixed seed).
  const auto again = with_catalog(
      {"rebalance", "--json", fixture("h3-rebalance.json"), "--stock", fixture("h3-stock.json"), "--on", "2026-12-01"});
  CHECK(again.out == result.out);
}

TEST_CASE("rebalance with a brewhouse profile: the factor applied, and its t interval around every IBU") {
  // tests/fixtures/iv-brewhouse.json: factor 0.9, standard error 0.02, 9 degrees of freedom. 28 g at 10 %
  // (h3-single-boil.json) gives 32.293 IBU without it (ibu_cli_test), x 0.9 = 29.064 IBU. With the
  // alpha known exactly (--alpha-tolerance 0%), IBU is proportional to f = 0.9 + 0.02 T(9), so the
  // 5 % and 95 % points are 29.064 x (1 -+ 1.8331 x 0.02 / 0.9) = 27.880-30.248 (hand arithmetic,
  // scipy.stats.t.ppf(0.95, 9) = 1.8331129); the draws are within 0.4 % of those.
  const auto result =
      with_catalog({"rebalance", "--json", fixture("h3-single-boil.json"), "--lot", "Fixture Bitter=10%", "--on",
                    "2026-12-01", "--brewhouse", fixture("iv-brewhouse.json"), "--alpha-tolerance", "0%"});
  INFO(result.err);
  REQUIRE(result.status == 0);
  const auto json = nlohmann::json::parse(result.out);
  const double ibu = tinseth_60(28.0, 10.0) * 0.9;
  const double half = ibu * 1.8331129326536335 * 0.02 / 0.9;
  CHECK(json["total_ibu_after"].get<double>() == doctest::Approx(ibu).epsilon(1e-4));
  CHECK(json["total_ibu_after_low"].get<double>() == doctest::Approx(ibu - half).epsilon(4e-3));
  CHECK(json["total_ibu_after_high"].get<double>() == doctest::Approx(ibu + half).epsilon(4e-3));
  CHECK(json["total_ibu_before_low"].get<double>() == doctest::Approx(ibu - half).epsilon(4e-3));
  CHECK(json["brewhouse"]["file"] == fixture("iv-brewhouse.json"));
  const auto text = with_catalog({"rebalance", fixture("h3-single-boil.json"), "--lot", "Fixture Bitter=10%", "--on",
                                  "2026-12-01", "--brewhouse", fixture("iv-brewhouse.json")});
  REQUIRE(text.status == 0);
  CHECK(text.out.find("certificate tolerance and the brewhouse factor; 10^4 seeded draws") != std::string::npos);
}

TEST_CASE("rebalance text: when weighing to 0.1 g moves the printed total, the held-total line says by how much") {
  // The demo pale ale from the demo stock: the absorbing Keelstone charge is solved exactly, then
  // weighed to 0.1 g (19.5 g), which moves the total a few hundredths of an IBU. The line must give
  // the total as written and the shift, equal to the JSON's totals after minus before.
  const std::vector<std::string> args{"rebalance", bine::test::example("pale-ale.json"),
                                      "--stock",   bine::test::example("stock.json"),
                                      "--on",      "2026-12-01"};
  auto json_args = args;
  json_args.push_back("--json");
  const auto text = run_cli(args);
  const auto doc_run = run_cli(json_args);
  REQUIRE(text.status == 0);
  REQUIRE(doc_run.status == 0);
  const auto doc = nlohmann::json::parse(doc_run.out);
  const double before = doc.at("total_ibu_before");
  const double after = doc.at("total_ibu_after");
  char written[16];
  char shift[16];
  std::snprintf(written, sizeof written, "%.1f", before);
  std::snprintf(shift, sizeof shift, "%+.2f", after - before);
  char printed_after[16];
  std::snprintf(printed_after, sizeof printed_after, "%.1f", after);
  const bool differs = std::string(written) != printed_after;
  const std::string note = std::string("(") + written +
                           " IBU as written: weighing the amounts to 0.1 g moves the total by " + shift + " IBU)";
  INFO(text.out);
  CHECK((text.out.find(note) != std::string::npos) == differs);
  CHECK(std::abs(after - before) < 0.1);  // weighing 19.5 g to 0.1 g cannot move 1.5 IBU/g by more
}
