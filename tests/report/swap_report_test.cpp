// The swap renderers on a hand-built result: similarity, confidence, amount factor, alpha today and
// amounts on hand are the struct's at the documented rounding (text: similarity and confidence to
// whole numbers, factor 2 decimals, alpha 1; JSON: similarity 1, confidence 2, factor 3, alpha 2,
// grams 1), each with its unit; the refermentation caution comes with an aroma swap (those hops go
// into the dry hop) and the dogs caution always; the HTML page escapes names and runs no script.
#include "report/swap_report.hpp"

#include <doctest/doctest.h>

#include <sstream>
#include <string>

#include "report/html_reports.hpp"

namespace {

using namespace bine;

Variety variety(const std::string& name, Range alpha) {
  Variety v;
  v.name = name;
  v.alpha_acid = alpha;
  v.total_oil = Range{1.0, 2.0};
  return v;
}

Eigen::VectorXd aroma(double citrus, double floral) {
  Eigen::VectorXd v(2);
  v << citrus, floral;
  return v;
}

/// A missing variety with markup in its name, two substitutes from stock (one without a factor).
SwapResult hand_built(SwapPurpose purpose) {
  SwapResult r;
  r.missing = variety("Missing <b>&</b> Co", Range{6.0, 8.0});
  r.purpose = purpose;
  r.axes = {"citrus", "floral"};
  r.missing_aroma = aroma(4.0, 2.0);
  r.missing_source = AromaSource::explicit_values;
  r.from_stock = true;
  r.stock_name = "Test store";
  r.on = *parse_date("2026-12-01");

  Substitute first;
  first.variety = variety("First \"Sub\"", Range{8.0, 10.0});
  first.lot = Lot{};
  first.lot->lot = "L<1>";
  first.lot->on_hand_g = 1360.0;
  first.alpha_today = 8.2649;
  first.similarity = 87.64;
  first.confidence = 0.9549;
  first.amount_factor = 0.84371;
  first.differences = {{"floral", -1.2}, {"citrus", 0.9}};
  first.aroma = aroma(4.9, 0.8);
  first.aroma_source = AromaSource::explicit_values;

  Substitute second;
  second.variety = variety("Second Sub", Range{5.0, 7.0});
  second.lot = Lot{};
  second.lot->lot = "S-2";
  second.lot->on_hand_g = 340.0;
  second.similarity = 55.5;
  second.confidence = 0.5;
  second.amount_basis = "no total oil for Second Sub";
  second.aroma = aroma(0.0, 0.0);
  second.aroma_source = AromaSource::none;
  r.substitutes = {first, second};

  SubstitutePair pair;
  pair.varieties = {"First \"Sub\"", "Second Sub"};
  pair.lots = {"L<1>", "S-2"};
  pair.shares = {0.6049, 0.3951};
  pair.similarity = 91.26;
  pair.grams_per_gram = {0.6049 * 0.84371, std::nullopt};  // share x the first's factor; the second has none
  r.pairs = {pair};
  return r;
}

std::string text_of(const SwapResult& r, UnitSystem units, bool pairs) {
  std::ostringstream out;
  render_swap(out, r, units, pairs);
  return out.str();
}

}  // namespace

TEST_CASE("swap text: the struct's numbers at the documented rounding, each with its unit") {
  const std::string text = text_of(hand_built(SwapPurpose::aroma), UnitSystem::metric, true);
  CHECK(text.find("Substitutes for Missing <b>&</b> Co (aroma swap; lots on hand in Test store, alpha aged to "
                  "2026-12-01)") == 0);
  CHECK(text.find("1.36 kg") != std::string::npos);  // 1360 g
  CHECK(text.find("340 g") != std::string::npos);
  CHECK(text.find("8.3 %") != std::string::npos);     // alpha today 8.2649
  CHECK(text.find("88/100") != std::string::npos);    // similarity 87.64
  CHECK(text.find("95 %") != std::string::npos);      // confidence 0.9549
  CHECK(text.find("0.84 g/g") != std::string::npos);  // factor 0.84371
  CHECK(text.find("less floral, more citrus") != std::string::npos);
  // The second has no factor and no aroma data: the reason and "n/a" stand in for numbers.
  CHECK(text.find("no total oil for Second Sub") != std::string::npos);
  CHECK(text.find("n/a (no aroma data)") != std::string::npos);
  CHECK(text.find("n/a") != std::string::npos);  // its alpha today
  // Chemistry ranges with units; the pair's shares 0.6049 / 0.3951 -> 60 % + 40 %, similarity 91.
  CHECK(text.find("8.0-10.0%") != std::string::npos);
  CHECK(text.find("1.0-2.0 mL/100 g") != std::string::npos);
  // Grams per gram of the missing variety: 0.6049 x 0.84371 = 0.5104 -> 0.51 g; the second has no factor.
  CHECK(text.find("First \"Sub\" (L<1>) + Second Sub (S-2)  60 % + 40 %") != std::string::npos);
  CHECK(text.find("0.51 g + n/a") != std::string::npos);
  CHECK(text.find("Per g of Missing <b>&</b> Co") != std::string::npos);
  CHECK(text.find("91/100") != std::string::npos);
}

TEST_CASE("swap text in US units gives lb and oz for the amounts on hand") {
  const std::string text = text_of(hand_built(SwapPurpose::aroma), UnitSystem::us, false);
  CHECK(text.find("3.00 lb") != std::string::npos);   // 1360 / 453.59237 = 2.998
  CHECK(text.find("11.99 oz") != std::string::npos);  // 340 / 28.349523125 = 11.993
  CHECK(text.find(" kg") == std::string::npos);
  CHECK(text.find("Two-variety blends") == std::string::npos);  // pairs only when asked
}

TEST_CASE("swap cautions: refermentation for an aroma swap, dogs for every swap") {
  const std::string aroma_swap = text_of(hand_built(SwapPurpose::aroma), UnitSystem::metric, false);
  CHECK(aroma_swap.find("hop creep") != std::string::npos);
  CHECK(aroma_swap.find("toxic to dogs") != std::string::npos);
  const std::string bittering_swap = text_of(hand_built(SwapPurpose::bittering), UnitSystem::metric, false);
  CHECK(bittering_swap.find("hop creep") == std::string::npos);
  CHECK(bittering_swap.find("toxic to dogs") != std::string::npos);
  CHECK(bittering_swap.find("hold the IBU (alpha acid)") != std::string::npos);
}

TEST_CASE("swap JSON: canonical units, documented rounding, null for a missing factor") {
  const auto json = swap_to_json(hand_built(SwapPurpose::aroma), true);
  CHECK(json["for"] == "aroma");
  CHECK(json["stock"]["on"] == "2026-12-01");
  const auto& first = json["substitutes"][0];
  CHECK(first["lot"] == "L<1>");
  CHECK(first["on_hand_g"].get<double>() == 1360.0);
  CHECK(first["alpha_today_percent"].get<double>() == 8.26);
  CHECK(first["similarity"].get<double>() == 87.6);
  CHECK(first["confidence"].get<double>() == 0.95);
  CHECK(first["amount_factor"].get<double>() == 0.844);
  CHECK(first["aroma_delta"]["floral"].get<double>() == -1.2);
  CHECK(first["differences"] == nlohmann::json::array({"less floral", "more citrus"}));
  const auto& second = json["substitutes"][1];
  CHECK(second["amount_factor"].is_null());
  CHECK(second["alpha_today_percent"].is_null());
  CHECK(json["pairs"][0]["shares"] == nlohmann::json::array({0.605, 0.395}));
  CHECK(json["pairs"][0]["similarity"].get<double>() == 91.3);
  CHECK(json["pairs"][0]["grams_per_gram"][0].get<double>() == doctest::Approx(0.510));  // 0.5104 to 3 places
  CHECK(json["pairs"][0]["grams_per_gram"][1].is_null());
}

TEST_CASE("swap HTML escapes every name and holds no script") {
  const std::string page =
      swap_html(hand_built(SwapPurpose::aroma), UnitSystem::metric, true, {"2026-12-01", "0.1.0", {}});
  CHECK(page.find("Missing &lt;b&gt;&amp;&lt;/b&gt; Co") != std::string::npos);
  CHECK(page.find("First &quot;Sub&quot; (L&lt;1&gt;)") != std::string::npos);
  CHECK(page.find("<b>") == std::string::npos);
  CHECK(page.find("L<1>") == std::string::npos);
  CHECK(page.find("\"Sub\"") == std::string::npos);
  CHECK(page.find("<svg") != std::string::npos);
  CHECK(page.find("<script") == std::string::npos);
  // The caution box carries the dogs and dry-hop cautions of an aroma swap.
  const auto box = page.find("<section class=\"caution\">");
  REQUIRE(box != std::string::npos);
  CHECK(page.find("toxic to dogs", box) != std::string::npos);
  CHECK(page.find("hop creep", box) != std::string::npos);
}

TEST_CASE("a bittering swap's HTML charts alpha, beta and cohumulone, not aroma") {
  SwapResult r = hand_built(SwapPurpose::bittering);
  r.missing.beta_acid = Range{4.0, 5.0};
  r.missing.cohumulone = Range{30.0, 34.0};
  r.substitutes[0].variety.cohumulone = Range{20.0, 24.0};
  const html::PageMeta meta{"2026-12-01", "9.9.9", {}};
  const std::string page = swap_html(r, UnitSystem::metric, false, meta);
  // The chart's values are range midpoints (hand arithmetic): missing alpha (6 + 8) / 2 = 7.0 %,
  // beta (4 + 5) / 2 = 4.5 %, cohumulone (30 + 34) / 2 = 32.0 %; the first substitute's
  // cohumulone (20 + 24) / 2 = 22.0 %; the second's alpha (5 + 7) / 2 = 6.0 % (its lot has no
  // alpha on the brew day).
  const auto chart = page.find("Bittering acids: ");
  REQUIRE(chart != std::string::npos);
  for (const char* value :
       {": 7.0 %</title>", ": 4.5 %</title>", ": 32.0 %</title>", ": 22.0 %</title>", ": 6.0 %</title>"}) {
    INFO(value);
    CHECK(page.find(value, chart) != std::string::npos);
  }
  // The first substitute's lot has an alpha on the brew day, 8.2649 %: the chart shows it (8.3 %,
  // tied to the JSON value the table shows), not its catalog midpoint (8 + 10) / 2 = 9.0 %, and says so.
  CHECK(page.find("data-json=\"/substitutes/0/alpha_today_percent\">8.3 %</text>", chart) != std::string::npos);
  CHECK(page.find(": 9.0 %</title>", chart) == std::string::npos);
  CHECK(page.find("alpha of lot L&lt;1&gt; on the brew day", chart) != std::string::npos);
  CHECK(page.find("Every value: the middle of the catalog range.", chart) != std::string::npos);  // the second
  // All charts on one scale: the largest value, 32.0 %, ends the axis at 40 (step 10, hand arithmetic).
  CHECK(page.find(">40</text>", chart) != std::string::npos);
  CHECK(page.find("Per aroma axis") == std::string::npos);  // no aroma chart
  // The aroma swap keeps its aroma chart.
  CHECK(swap_html(hand_built(SwapPurpose::aroma), UnitSystem::metric, false, meta).find("Per aroma axis") !=
        std::string::npos);
}
