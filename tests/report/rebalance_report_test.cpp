// The rebalance renderer on hand-built results: before/after grams, alpha and IBU are the struct's
// at the documented rounding (text: alpha 2 decimals, grams 1, IBU 1; JSON: grams and IBU 3,
// alpha 4), the shortfall is needed minus on hand, the sentence about who took the IBU change
// names the right addition, and the cautions follow the recipe's uses. Mass conversion uses the
// exact 1 oz = 28.349523125 g, 1 lb = 453.59237 g (hand arithmetic).
#include "report/rebalance_report.hpp"

#include <doctest/doctest.h>

#include <sstream>
#include <string>

#include "report/bitterness_report.hpp"

namespace {

using namespace bine;

/// Recipe: 30 g boil 60 min at 7 %, 40 g whirlpool 20 min at 80 C; lots from stock; the boil
/// addition absorbs the whirlpool's IBU change; the boil lot is short.
struct Rebalanced {
  Recipe recipe;
  RebalanceContext context;
  RebalanceResult result;
  Rebalanced() {
    recipe.name = "Hand-built bitter";
    recipe.batch_volume_l = 20.0;
    recipe.original_gravity = 1.048;
    HopAddition boil;
    boil.variety = "Bittering Test";
    boil.grams = 30.0;
    boil.use = HopUse::boil;
    boil.minutes = 60.0;
    HopAddition whirlpool;
    whirlpool.variety = "Aroma Test";
    whirlpool.grams = 40.0;
    whirlpool.use = HopUse::whirlpool;
    whirlpool.minutes = 20.0;
    whirlpool.temperature_c = 80.0;
    recipe.hops = {boil, whirlpool};

    ReplacementLot lot;
    lot.variety = "Bittering Test";
    lot.lot_code = "BT-1";
    lot.alpha_percent = 5.3139;
    lot.certificate_alpha = 6.0;
    lot.packaged = *parse_date("2025-12-01");
    lot.storage = Storage{-18.0, Package::vacuum};
    lot.days = 365;
    lot.remaining = 0.88565;
    lot.stability_percent = 50.0;
    lot.stability_source = "catalog";
    lot.on_hand_g = 10.0;
    context.lots = {lot};
    context.from_stock = true;
    context.on = *parse_date("2026-12-01");

    RebalancedAddition first;
    first.index = 0;
    first.variety = "Bittering Test";
    first.use = HopUse::boil;
    first.grams_before = 30.0;
    first.grams_after = 39.5234;
    first.alpha_before = 7.0;
    first.alpha_after = 5.3139;
    first.ibu_before = 24.4449;
    first.ibu_after = 24.9551;
    first.rule = RebalanceRule::absorbs_ibu;
    RebalancedAddition second;
    second.index = 1;
    second.variety = "Aroma Test";
    second.use = HopUse::whirlpool;
    second.grams_before = 40.0;
    second.grams_after = 30.04;
    second.alpha_before = 5.0;
    second.alpha_after = 5.0;
    second.ibu_before = 2.0;
    second.ibu_after = 1.4898;
    second.oil_before = 1.5;
    second.oil_after = 2.0;
    second.rule = RebalanceRule::holds_oil;
    result.additions = {first, second};
    result.absorber = 0;
    result.ibu_change_absorbed = 0.5102;
    result.before.total_ibu = 26.4449;
    result.after.total_ibu = 26.4449;
    result.shortfalls.push_back({"Bittering Test", "BT-1", 39.5234, 10.0});
  }
};

}  // namespace

TEST_CASE("rebalance text: the struct's numbers with units, the absorber named, the shortfall by subtraction") {
  const Rebalanced f;
  std::ostringstream out;
  render_rebalance(out, f.recipe, f.context, f.result, UnitSystem::metric);
  const std::string text = out.str();
  CHECK(text.find("Rebalance of Hand-built bitter for brew day 2026-12-01 (Tinseth model)") == 0);
  CHECK(text.find("Lots from stock") != std::string::npos);
  // The lot line: certificate 6.0 %, 365 days at -18 C, vacuum, stability 50 %, 5.31 % today,
  // 100 x 0.88565 = 88.6 % left, 10 g on hand.
  CHECK(text.find("Bittering Test: lot BT-1; 6.0 % packaged 2025-12-01, 365 days at -18 C, vacuum; stability 50 % "
                  "(catalog) -> 5.31 % alpha on brew day (88.6 % left), 10.0 g on hand") != std::string::npos);
  CHECK(text.find("7.00 %") != std::string::npos);
  CHECK(text.find("5.31 %") != std::string::npos);
  CHECK(text.find("39.5 g") != std::string::npos);  // 39.5234 g
  CHECK(text.find("30.0 g") != std::string::npos);  // 30.04 g after, and 30 g before
  CHECK(text.find("24.4 IBU") != std::string::npos);
  CHECK(text.find("25.0 IBU") != std::string::npos);  // 24.9551
  CHECK(text.find("1.5 IBU") != std::string::npos);   // 1.4898
  // The whirlpool went 2.0 -> 1.4898 IBU, a change of -0.51 IBU, which the boil addition made up (+0.51).
  CHECK(text.find("Addition 1 (Bittering Test, boil 60 min) absorbed the IBU change of -0.51 IBU from the other "
                  "additions (its own IBU changed by +0.51 IBU), so the total holds at 26.4 IBU.") !=
        std::string::npos);
  // Short: 39.5234 - 10 = 29.5234 g -> 29.5 g.
  CHECK(text.find("Bittering Test (lot BT-1): need 39.5 g, have 10.0 g, short 29.5 g") != std::string::npos);
  CHECK(text.find("Stock covers every addition") == std::string::npos);
  // A whirlpool addition, no dry hop: the hot-wort caution only.
  CHECK(text.find(std::string(hot_wort_caution())) != std::string::npos);
  CHECK(text.find(std::string(dry_hop_caution())) == std::string::npos);
}

TEST_CASE("rebalance text in US units shows oz, and today's date is flagged when --on was not given") {
  Rebalanced f;
  f.context.on_from_clock = true;
  f.context.lots[0].storage->temperature_c = -20.0;
  std::ostringstream out;
  render_rebalance(out, f.recipe, f.context, f.result, UnitSystem::us);
  const std::string text = out.str();
  CHECK(text.find("(today; pass --on to reproduce)") != std::string::npos);
  CHECK(text.find("1.39 oz") != std::string::npos);  // 39.5234 / 28.349523125 = 1.394
  CHECK(text.find("1.06 oz") != std::string::npos);  // 30.04 / 28.349523125 = 1.060
  CHECK(text.find("1.41 oz") != std::string::npos);  // 40 / 28.349523125 = 1.411
  CHECK(text.find("whirlpool 20 min at 176 F") != std::string::npos);
  CHECK(text.find("days at -4 F, vacuum") != std::string::npos);  // -20 C x 1.8 + 32 = -4 F
  CHECK(text.find(" g ") == std::string::npos);
}

TEST_CASE("rebalance text without an absorber: each addition holds its IBU, and stock that covers is said so") {
  Rebalanced f;
  f.result.absorber.reset();
  f.result.shortfalls.clear();
  std::ostringstream out;
  render_rebalance(out, f.recipe, f.context, f.result, UnitSystem::metric);
  CHECK(out.str().find("Each addition holds its own IBU; the total stays at 26.4 IBU.") != std::string::npos);
  CHECK(out.str().find("Stock covers every addition.") != std::string::npos);
}

TEST_CASE("rebalance JSON: canonical units, 1-based absorber, shortfall by subtraction, rounding") {
  const Rebalanced f;
  const auto json = rebalance_to_json(f.recipe, f.context, f.result);
  CHECK(json["on"] == "2026-12-01");
  CHECK(json["absorbed_by"] == 1);
  CHECK(json["total_ibu_before"].get<double>() == 26.445);  // 26.4449 to 3 decimals
  CHECK(json["ibu_change_absorbed"].get<double>() == 0.51);
  const auto& first = json["additions"][0];
  CHECK(first["grams_after"].get<double>() == 39.523);
  CHECK(first["alpha_after"].get<double>() == 5.3139);
  CHECK(first["ibu_after"].get<double>() == 24.955);
  CHECK(first["oil_before"].is_null());
  CHECK(json["additions"][1]["oil_after"].get<double>() == 2.0);
  REQUIRE(json["shortfalls"].size() == 1);
  CHECK(json["shortfalls"][0]["short_g"].get<double>() == 29.523);  // 39.5234 - 10
  CHECK(json["lots"][0]["remaining"].get<double>() == 0.88565);
  CHECK(json["lots"][0]["days"] == 365);
  REQUIRE(json["cautions"].size() == 2);  // whirlpool: hot wort; hops: dogs
}
