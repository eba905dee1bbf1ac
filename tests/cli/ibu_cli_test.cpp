// End-to-end (in-process, run_in_process.hpp): bine ibu and bine age on small fixture files;
// expected values are docs/methods.md check values or hand arithmetic written beside them.
#include <doctest/doctest.h>

#include <nlohmann/json.hpp>

#include "cli/run_in_process.hpp"

using bine::test::fixture;
using bine::test::run_cli;

TEST_CASE("ibu --json: 28 g at 10 %, 60 min, 20 L, 1.050, whole -> 32.3 IBU (Tinseth, docs/methods.md)") {
  const auto result = run_cli({"ibu", "--json", fixture("h3-single-boil.json")});
  INFO(result.err);
  REQUIRE(result.status == 0);
  const auto json = nlohmann::json::parse(result.out);
  CHECK(json["model"] == "tinseth");
  CHECK(json["total_ibu"].get<double>() == doctest::Approx(32.3).epsilon(1e-3));
  // BU:GU = 32.29 / 50 = 0.646 (hand arithmetic).
  CHECK(json["bu_gu"].get<double>() == doctest::Approx(0.646).epsilon(1e-3));
  REQUIRE(json["additions"].size() == 1);
  const auto& a = json["additions"][0];
  CHECK(a["variety"] == "Fixture Bitter");
  CHECK(a["use"] == "boil");
  CHECK(a["grams"].get<double>() == 28.0);
  CHECK(a["alpha_acid"].get<double>() == 10.0);
  CHECK(a["utilization"].get<double>() == doctest::Approx(0.2307).epsilon(2e-4));
  CHECK(a["ibu"].get<double>() == doctest::Approx(32.3).epsilon(1e-3));
}

TEST_CASE("ibu --model rager at 1.070: 0.3082 x 140 / 1.1 = 39.2 IBU (hand arithmetic)") {
  const auto result = run_cli({"ibu", "--model", "rager", "--json", fixture("h3-rager.json")});
  REQUIRE(result.status == 0);
  const auto json = nlohmann::json::parse(result.out);
  CHECK(json["model"] == "rager");
  CHECK(json["total_ibu"].get<double>() == doctest::Approx(39.2).epsilon(2e-3));
}

TEST_CASE("ibu text: table with units, hot-wort caution once, ends with the BU:GU reading") {
  // Whirlpool 100 g at 10 % in 20 L: 500 mg/L x U 0.0314 (docs/methods.md, 20 min at 80 C) = 15.7 IBU.
  const auto result = run_cli({"ibu", fixture("h3-whirlpool.json")});
  REQUIRE(result.status == 0);
  CHECK(result.out.find("15.7 IBU") != std::string::npos);
  const auto first = result.out.find("Caution: whirlpool");
  REQUIRE(first != std::string::npos);
  CHECK(result.out.find("Caution: whirlpool", first + 1) == std::string::npos);
  // 15.7 / 50 = 0.31: between sweet and balanced. The reading is the last figure; only the line naming
  // the catalogs used follows it.
  const auto reading = result.out.find("BU:GU 0.31, between sweet and balanced");
  const auto used = result.out.find("\nCatalogs used: ");
  REQUIRE(reading != std::string::npos);
  REQUIRE(used != std::string::npos);
  CHECK(reading < used);
  CHECK(result.out.find("IBU", reading) > used);
}

TEST_CASE("ibu --units us prints oz, gal and F, and JSON stays canonical") {
  const auto us = run_cli({"--units", "us", "ibu", fixture("h3-whirlpool.json")});
  REQUIRE(us.status == 0);
  // 100 g = 3.53 oz; 20 L = 5.28 gal; 80 C = 176 F (hand conversions).
  CHECK(us.out.find("3.53 oz") != std::string::npos);
  CHECK(us.out.find("5.28 gal") != std::string::npos);
  CHECK(us.out.find("176 F") != std::string::npos);
  const auto metric_json = run_cli({"ibu", "--json", fixture("h3-whirlpool.json")});
  const auto us_json = run_cli({"--units", "us", "ibu", "--json", fixture("h3-whirlpool.json")});
  CHECK(metric_json.out == us_json.out);
}

TEST_CASE("ibu rejects bad recipes with one clear line and exit 2") {
  const auto negative = run_cli({"ibu", fixture("h3-bad-negative.json")});
  CHECK(negative.status == 2);
  CHECK(negative.err.find("/hops/0/amount:") != std::string::npos);
  const auto whirlpool = run_cli({"ibu", fixture("h3-bad-whirlpool.json")});
  CHECK(whirlpool.status == 2);
  CHECK(whirlpool.err.find("/hops/0/temperature: is missing") != std::string::npos);
  const auto gravity = run_cli({"ibu", fixture("h3-bad-gravity.json")});
  CHECK(gravity.status == 2);
  CHECK(gravity.err.find("/original_gravity:") != std::string::npos);
  const auto model = run_cli({"ibu", "--model", "guess", fixture("h3-single-boil.json")});
  CHECK(model.status == 2);
  CHECK(model.err.find("--model: \"guess\"") != std::string::npos);
}

TEST_CASE("age --json: 6.0 %, PL 50, vacuum, -18 C, 365 days -> 5.31 % (docs/methods.md)") {
  const auto result = run_cli({"age", "--alpha", "6.0", "--packaged", "2025-12-01", "--stored", "-18 C,vacuum",
                               "--stability", "50", "--on", "2026-12-01", "--json"});
  INFO(result.err);
  REQUIRE(result.status == 0);
  const auto json = nlohmann::json::parse(result.out);
  CHECK(json["alpha_acid"].get<double>() == doctest::Approx(5.31).epsilon(1e-3));
  CHECK(json["remaining"].get<double>() == doctest::Approx(0.886).epsilon(1e-3));
  CHECK(json["days"].get<long>() == 365);
}

TEST_CASE("age: 180 days at 20 C open leave the catalog stability (fixture catalog: 70 %)") {
  const auto result =
      run_cli({"--catalog", fixture("h3-catalog.json"), "age", "--alpha", "10", "--packaged", "2026-01-01", "--stored",
               "68 F,open", "--variety", "fixture aroma", "--on", "2026-06-30", "--json"});
  INFO(result.err);
  REQUIRE(result.status == 0);
  const auto json = nlohmann::json::parse(result.out);
  // 2026-01-01 + 180 days = 2026-06-30 (31+28+31+30+31+29 = 180, hand count); 68 F = 20 C.
  CHECK(json["days"].get<long>() == 180);
  CHECK(json["remaining"].get<double>() == doctest::Approx(0.70).epsilon(1e-5));
}

TEST_CASE("age --hsi reports a state and never changes the rate (docs/methods.md#hsi check value)") {
  // docs/methods.md#hsi, derived from Garetz 1994: certificate 9.0 % with HSI 0.31 analysed
  // 2026-01-10, sealed at 4 C, stability 80 %, on 2026-12-01 (325 days) -> 7.79 %; the HSI itself
  // says 110 x log10(0.31 / 0.25) = 10.3 % was lost before the analysis.
  const std::vector<std::string> base{"age",        "--alpha",     "9",  "--packaged", "2026-01-10", "--stored",
                                      "4 C,sealed", "--stability", "80", "--on",       "2026-12-01", "--json"};
  std::vector<std::string> with_hsi = base;
  with_hsi.insert(with_hsi.end(), {"--hsi", "0.31"});
  const auto measured = run_cli(with_hsi);
  const auto plain = run_cli(base);
  INFO(measured.err);
  REQUIRE(measured.status == 0);
  REQUIRE(plain.status == 0);
  const auto a = nlohmann::json::parse(measured.out);
  const auto b = nlohmann::json::parse(plain.out);
  CHECK(a["alpha_acid"].get<double>() == doctest::Approx(7.79).epsilon(1e-3));
  CHECK(a["alpha_acid"].get<double>() == b["alpha_acid"].get<double>());
  CHECK(a["notes"].dump().find("10.3 %") != std::string::npos);
}

TEST_CASE("age rejects a packaging date after --on, bad storage and missing stability, exit 2") {
  const auto future = run_cli({"age", "--alpha", "6", "--packaged", "2026-12-02", "--stored", "-2 C,vacuum",
                               "--stability", "50", "--on", "2026-12-01"});
  CHECK(future.status == 2);
  CHECK(future.err.find("--packaged: 2026-12-02: after the date --on 2026-12-01") != std::string::npos);
  const auto storage = run_cli({"age", "--alpha", "6", "--packaged", "2026-01-01", "--stored", "-2 C,jar",
                                "--stability", "50", "--on", "2026-12-01"});
  CHECK(storage.status == 2);
  CHECK(storage.err.find("unknown package \"jar\"") != std::string::npos);
  const auto none =
      run_cli({"age", "--alpha", "6", "--packaged", "2026-01-01", "--stored", "-2 C,vacuum", "--on", "2026-12-01"});
  CHECK(none.status == 2);
  CHECK(none.err.find("expected exactly one") != std::string::npos);
}

TEST_CASE("ibu: a flame-out addition left in a 20 min stand at 80 C counts the stand (docs/methods.md)") {
  // t_boil 0 + t_eq 3.31 min -> U 0.0314 (docs/methods.md); 140 mg/L x 0.0314 = 4.40 IBU.
  const auto result = run_cli({"ibu", "--json", fixture("h3-hop-stand.json")});
  INFO(result.err);
  REQUIRE(result.status == 0);
  const auto json = nlohmann::json::parse(result.out);
  CHECK(json["hop_stand"]["boil_equivalent_minutes"].get<double>() == doctest::Approx(3.31).epsilon(2e-3));
  CHECK(json["total_ibu"].get<double>() == doctest::Approx(4.40).epsilon(3e-3));
  CHECK(json["cautions"].size() == 2);  // hot wort, dogs
}

TEST_CASE("ibu: a whirlpool that cools 98 C to 82 C over 25 min integrates k1(T(t)) and is marked below 90 C") {
  // SciPy quad of exp(-11858 (1/T - 1/373.15)) over T = 98 -> 82 C straight in 25 min: t_eq 11.2801 min;
  // U = 1.0528 x (1 - e^(-0.04 x 11.2801)) / 4.15 = 0.09212; 500 mg/L -> 46.06 IBU. To 92 C: t_eq
  // 16.4121, U 0.12210, 61.05 IBU (Tinseth; Malowicki & Shellhammer 2005; derived with SciPy).
  const auto result = run_cli({"ibu", "--json", fixture("bh-cooling-whirlpool.json")});
  INFO(result.err);
  REQUIRE(result.status == 0);
  const auto json = nlohmann::json::parse(result.out);
  REQUIRE(json["additions"].size() == 2);
  CHECK(json["additions"][0]["effective_minutes"].get<double>() == doctest::Approx(11.280).epsilon(1e-4));
  CHECK(json["additions"][0]["ibu"].get<double>() == doctest::Approx(46.06).epsilon(1e-4));
  CHECK(json["additions"][0]["rate_extrapolated"] == true);
  CHECK(json["additions"][0]["cooling"]["to_c"].get<double>() == 82.0);
  CHECK(json["additions"][1]["ibu"].get<double>() == doctest::Approx(61.05).epsilon(1e-4));
  CHECK(json["additions"][1]["rate_extrapolated"] == false);
  const auto text = run_cli({"ibu", fixture("bh-cooling-whirlpool.json")});
  REQUIRE(text.status == 0);
  CHECK(text.out.find("whirlpool 25 min from 98 C to 82 C ~") != std::string::npos);
  CHECK(text.out.find("whirlpool 25 min from 98 C to 92 C ~") == std::string::npos);
  CHECK(text.out.find("~ sits in wort below 90 C") != std::string::npos);
}

TEST_CASE("ibu: every IBU with its 90 % interval, a recipe alpha within the certificate tolerance") {
  // 28 g at 10 % (recipe alpha, +-5 % read as a 90 % range): IBU linear in alpha, so the interval is
  // 32.293 x 0.95 to 32.293 x 1.05 = 30.678-33.908 IBU (hand arithmetic; exact, no draws).
  const auto result = run_cli({"ibu", "--json", fixture("h3-single-boil.json")});
  INFO(result.err);
  REQUIRE(result.status == 0);
  const auto json = nlohmann::json::parse(result.out);
  CHECK(json["additions"][0]["ibu_low"].get<double>() == doctest::Approx(30.678).epsilon(1e-4));
  CHECK(json["additions"][0]["ibu_high"].get<double>() == doctest::Approx(33.908).epsilon(1e-4));
  CHECK(json["total_ibu_low"].get<double>() == doctest::Approx(30.678).epsilon(1e-4));
  CHECK(json["interval"]["monte_carlo"] == false);
  // --alpha-tolerance 10%: 29.064-35.522 IBU.
  const auto wide = run_cli({"ibu", "--json", "--alpha-tolerance", "10%", fixture("h3-single-boil.json")});
  REQUIRE(wide.status == 0);
  CHECK(nlohmann::json::parse(wide.out)["total_ibu_high"].get<double>() == doctest::Approx(35.522).epsilon(1e-4));
  const auto text = run_cli({"ibu", fixture("h3-single-boil.json")});
  CHECK(text.out.find("32.3 IBU (30.7-33.9)") != std::string::npos);
}
