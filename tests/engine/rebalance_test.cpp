// Rebalancing recipes to new lots: the rules of rebalance.cpp checked by hand arithmetic and the
// docs/methods.md check value (same IBU, 30 g at 7.0 % -> lot at 9.5 %: 22.1 g).
#include "engine/rebalance.hpp"

#include <doctest/doctest.h>

#include "engine/stock_rebalance.hpp"
#include "model/errors.hpp"

namespace {

using bine::HopAddition;
using bine::HopForm;
using bine::HopUse;

// A small catalog written for these tests (not the demo data).
bine::Catalog test_catalog() {
  bine::Catalog catalog;
  bine::Variety bitter;
  bitter.name = "Bitter";
  bitter.alpha_acid = bine::Range{6.0, 8.0};
  bitter.total_oil = bine::Range{1.2, 2.0};
  bitter.stability = 50.0;
  bine::Variety aroma;
  aroma.name = "Aroma";
  aroma.alpha_acid = bine::Range{4.0, 6.0};
  aroma.total_oil = bine::Range{1.0, 2.0};  // midpoint 1.5 mL/100 g
  catalog.varieties = {bitter, aroma};
  return catalog;
}

HopAddition addition(std::string variety, double grams, double alpha, HopUse use, double minutes,
                     std::optional<double> celsius = std::nullopt) {
  HopAddition hop;
  hop.variety = std::move(variety);
  hop.grams = grams;
  hop.alpha_acid = alpha;
  hop.use = use;
  hop.minutes = minutes;
  hop.temperature_c = celsius;
  hop.form = HopForm::whole;
  return hop;
}

bine::Recipe recipe_of(std::vector<HopAddition> hops) {
  bine::Recipe recipe;
  recipe.source_file = "test.json";
  recipe.batch_volume_l = 20;
  recipe.original_gravity = 1.050;
  recipe.boil_minutes = 60;
  recipe.hops = std::move(hops);
  return recipe;
}

bine::ReplacementLot lot(std::string variety, double alpha, std::optional<double> oil = std::nullopt) {
  bine::ReplacementLot l;
  l.variety = std::move(variety);
  l.alpha_percent = alpha;
  l.total_oil = oil;
  return l;
}

}  // namespace

TEST_CASE("a 60-minute addition rebalanced to a new lot holds its IBU (30 g at 7.0 % -> 22.1 g at 9.5 %)") {
  for (auto model : {bine::IbuModel::tinseth, bine::IbuModel::rager}) {
    bine::BitternessSettings settings;
    settings.model = model;
    const auto recipe = recipe_of({addition("Bitter", 30, 7.0, HopUse::boil, 60)});
    const auto result = bine::rebalance(recipe, {lot("bitter", 9.5)}, test_catalog(), settings);
    REQUIRE(result.additions.size() == 1);
    // docs/methods.md check value: 30 x 7.0 / 9.5 = 22.105 g.
    CHECK(result.additions[0].grams_after == doctest::Approx(22.105).epsilon(1e-4));
    CHECK(std::abs(result.additions[0].ibu_after - result.additions[0].ibu_before) < 0.01);
    CHECK(result.additions[0].rule == bine::RebalanceRule::holds_ibu);
    CHECK_FALSE(result.absorber.has_value());
    CHECK(result.recipe_after.hops[0].alpha_acid == 9.5);
  }
}

TEST_CASE("whirlpool holds its oil and the largest boil addition absorbs the IBU change") {
  const auto recipe =
      recipe_of({addition("Bitter", 10, 7.0, HopUse::boil, 15), addition("Bitter", 30, 7.0, HopUse::boil, 60),
                 addition("Aroma", 40, 5.0, HopUse::whirlpool, 20, 80.0)});
  const auto result = bine::rebalance(recipe, {lot("Aroma", 8.0, 2.0)}, test_catalog(), {});
  // Oil held: 40 g x 1.5 / 2.0 = 30 g (catalog midpoint 1.5 mL/100 g).
  CHECK(result.additions[2].grams_after == doctest::Approx(30.0));
  CHECK(result.additions[2].rule == bine::RebalanceRule::holds_oil);
  // Whirlpool IBU scales with grams x alpha: 30 x 8 / (40 x 5) = 1.2 times.
  CHECK(result.additions[2].ibu_after == doctest::Approx(1.2 * result.additions[2].ibu_before));
  REQUIRE(result.absorber.has_value());
  CHECK(*result.absorber == 1);  // the 60-minute addition carries the most IBU
  CHECK(result.additions[1].rule == bine::RebalanceRule::absorbs_ibu);
  CHECK(result.after.total_ibu == doctest::Approx(result.before.total_ibu).epsilon(1e-12));
  CHECK(result.ibu_change_absorbed == doctest::Approx(-0.2 * result.additions[2].ibu_before));
  CHECK(result.additions[0].grams_after == 10.0);  // untouched lot, untouched addition
}

TEST_CASE("without oil data late additions hold their grams") {
  const auto recipe =
      recipe_of({addition("Bitter", 30, 7.0, HopUse::boil, 60), addition("Aroma", 50, 5.0, HopUse::dry_hop, 4 * 1440)});
  const auto result = bine::rebalance(recipe, {lot("Aroma", 6.0)}, test_catalog(), {});
  CHECK(result.additions[1].grams_after == 50.0);
  CHECK(result.additions[1].rule == bine::RebalanceRule::holds_grams);
  CHECK(result.after.total_ibu == doctest::Approx(result.before.total_ibu));
}

TEST_CASE("with no boil addition the whirlpool additions scale to hold total IBU") {
  const auto recipe = recipe_of({addition("Aroma", 40, 5.0, HopUse::whirlpool, 20, 80.0)});
  const auto result = bine::rebalance(recipe, {lot("Aroma", 8.0)}, test_catalog(), {});
  // IBU ~ grams x alpha: 40 x 5 / 8 = 25 g.
  CHECK(result.additions[0].grams_after == doctest::Approx(25.0));
  CHECK(result.whirlpool_scaled);
  CHECK(result.additions[0].rule == bine::RebalanceRule::scaled_for_total);
  CHECK(result.after.total_ibu == doctest::Approx(result.before.total_ibu));
  CHECK_FALSE(result.notes.empty());
}

TEST_CASE("late additions that alone exceed the total are infeasible") {
  const auto recipe = recipe_of(
      {addition("Bitter", 1, 7.0, HopUse::boil, 60), addition("Aroma", 200, 5.0, HopUse::whirlpool, 20, 80.0)});
  CHECK_THROWS_AS(bine::rebalance(recipe, {lot("Aroma", 15.0)}, test_catalog(), {}), bine::Infeasible);
}

TEST_CASE("a change of form is held through the pellet factor") {
  const auto recipe = recipe_of({addition("Bitter", 30, 7.0, HopUse::boil, 60)});  // whole cone
  auto pellets = lot("Bitter", 7.0);
  pellets.form = HopForm::pellet;
  const auto result = bine::rebalance(recipe, {pellets}, test_catalog(), {});
  // Same alpha, 1.10 x the utilization: 30 / 1.10 = 27.27 g.
  CHECK(result.additions[0].grams_after == doctest::Approx(27.2727).epsilon(1e-4));
}

TEST_CASE("stock shortfalls sum every addition drawn from the lot") {
  const auto recipe =
      recipe_of({addition("Bitter", 30, 7.0, HopUse::boil, 60), addition("Bitter", 10, 7.0, HopUse::boil, 10)});
  auto scarce = lot("Bitter", 7.0);
  scarce.lot_code = "B-1";
  scarce.on_hand_g = 35.0;
  const auto result = bine::rebalance(recipe, {scarce}, test_catalog(), {});
  REQUIRE(result.shortfalls.size() == 1);
  CHECK(result.shortfalls[0].needed_g == doctest::Approx(40.0));  // 30 + 10, alpha unchanged
  CHECK(result.shortfalls[0].on_hand_g == 35.0);
  CHECK(result.shortfalls[0].lot == "B-1");
}

TEST_CASE("lots from stock: a dated lot before an undated one, alpha aged to brew day, future packaging rejected") {
  // Oldest packaging first (docs/methods.md#lot-choice): B-big has a packaged date, B-small none, so
  // B-big comes first (dated lots before undated ones); it has 500 g for the 30 g needed.
  bine::Stock stock;
  stock.source_file = "stock.json";
  bine::Lot small;
  small.variety = "Bitter";
  small.lot = "B-small";
  small.alpha_acid = 9.0;
  small.on_hand_g = 100;
  bine::Lot big = small;
  big.lot = "B-big";
  big.alpha_acid = 6.0;
  big.on_hand_g = 500;
  big.packaged = bine::parse_date("2025-12-01");
  big.storage = bine::Storage{-18.0, bine::Package::vacuum};
  stock.lots = {small, big};
  const auto recipe = recipe_of({addition("Bitter", 30, 7.0, HopUse::boil, 60)});
  const auto stocked =
      bine::rebalance_from_stock(recipe, bine::age_cellar(stock, test_catalog(), *bine::parse_date("2026-12-01")),
                                 test_catalog(), {}, bine::Weighing::exact);
  const auto& lots = stocked.lots;
  REQUIRE(lots.size() == 1);
  CHECK(lots[0].lot_code == "B-big");
  CHECK(lots[0].lots_of_variety == 2);
  CHECK(lots[0].chosen == "oldest packaging first of 2 lots");
  CHECK(lots[0].days == 365);
  // docs/methods.md: 6.0 % AA, PL 50 (catalog stability 50), vacuum, -18 C, 365 d -> 5.31 %.
  CHECK(lots[0].alpha_percent == doctest::Approx(5.31).epsilon(1e-3));

  try {
    bine::age_cellar(stock, test_catalog(), *bine::parse_date("2025-11-30"));
    FAIL("expected InputError");
  } catch (const bine::InputError& e) {
    REQUIRE(e.lines().size() == 1);
    CHECK(e.lines()[0].find("stock.json: /lots/1/packaged: 2025-12-01 is after") == 0);
  }
}

TEST_CASE("a 0-minute boil addition scales with alpha like every boil addition (20 g at 5 % -> 10 g at 10 %)") {
  // Tinseth gives 0 IBU at 0 minutes, yet the addition is a boil addition: W x A is held,
  // 20 x 5.0 / 10.0 = 10.0 g (hand arithmetic, docs/methods.md#rebalance).
  const auto recipe =
      recipe_of({addition("Bitter", 30, 7.0, HopUse::boil, 60), addition("Aroma", 20, 5.0, HopUse::boil, 0)});
  const auto result = bine::rebalance(recipe, {lot("Aroma", 10.0)}, test_catalog(), {});
  CHECK(result.additions[1].grams_after == doctest::Approx(10.0));
  CHECK(result.additions[1].rule == bine::RebalanceRule::holds_ibu);
  CHECK(result.additions[0].grams_after == 30.0);  // nothing to absorb: 0 IBU before and after
}

TEST_CASE("as weighed, changed amounts are rounded to 0.1 g below 100 g and 1 g above, in the recipe's unit") {
  // 30 x 7.0 / 9.5 = 22.105 g -> 22.1 g; 150 x 7.0 / 9.5 = 110.53 g -> 111 g (common-practice weighing).
  auto recipe =
      recipe_of({addition("Bitter", 30, 7.0, HopUse::boil, 60), addition("Bitter", 150, 7.0, HopUse::boil, 10)});
  const auto grams = bine::rebalance(recipe, {lot("Bitter", 9.5)}, test_catalog(), {}, bine::Weighing::as_weighed);
  CHECK(grams.recipe_after.hops[0].grams == doctest::Approx(22.1));
  CHECK(grams.recipe_after.hops[1].grams == doctest::Approx(111.0));
  // In ounces to 0.01 oz: 22.105 g = 0.7797 oz -> 0.78 oz = 22.1126 g (1 oz = 28.349523125 g exactly).
  recipe.notation.mass = "oz";
  const auto ounces = bine::rebalance(recipe, {lot("Bitter", 9.5)}, test_catalog(), {}, bine::Weighing::as_weighed);
  CHECK(ounces.recipe_after.hops[0].grams == doctest::Approx(0.78 * 28.349523125));
  // The figures are those of the weighed recipe: 22.1 g at 9.5 % against 30 g at 7.0 % is
  // 22.1 x 9.5 / (30 x 7.0) = 0.99976 of the IBU.
  CHECK(grams.additions[0].ibu_after == doctest::Approx(grams.additions[0].ibu_before * 22.1 * 9.5 / 210.0));
}

TEST_CASE("rebalancing a rebalanced recipe again with the same lots changes nothing") {
  // The lot's oil 1.176 is taken at the 0.01 a recipe keeps, 1.18, and the whirlpool holds its oil:
  // 40 x 1.5 / 1.18 = 50.85 g -> 50.8 g. The result records the oil and alpha (8.23) it was worked out
  // for, so a second and third run
  // find A_old = A_new and O_before = O_lot for every addition (docs/methods.md#rebalance).
  const auto recipe =
      recipe_of({addition("Bitter", 30, 7.0, HopUse::boil, 60), addition("Aroma", 40, 5.0, HopUse::whirlpool, 20, 80.0),
                 addition("Aroma", 50, 5.0, HopUse::dry_hop, 4 * 1440)});
  const std::vector<bine::ReplacementLot> lots{lot("Aroma", 8.234, 1.176), lot("Bitter", 7.71)};
  auto once = bine::rebalance(recipe, lots, test_catalog(), {}, bine::Weighing::as_weighed);
  CHECK(once.recipe_after.hops[1].total_oil == doctest::Approx(1.18));
  CHECK(once.recipe_after.hops[1].grams == doctest::Approx(50.8));  // 40 x 1.5 / 1.18 = 50.85 -> 50.8
  CHECK(once.recipe_after.hops[1].alpha_acid == doctest::Approx(8.23));
  bine::Recipe current = once.recipe_after;
  for (int run = 2; run <= 3; ++run) {
    const auto again = bine::rebalance(current, lots, test_catalog(), {}, bine::Weighing::as_weighed);
    for (std::size_t i = 0; i < current.hops.size(); ++i) {
      INFO("run " << run << ", addition " << i + 1);
      CHECK(again.recipe_after.hops[i].grams == current.hops[i].grams);
      CHECK(again.recipe_after.hops[i].alpha_acid == current.hops[i].alpha_acid);
    }
    CHECK_FALSE(again.absorber.has_value());
    current = again.recipe_after;
  }
}
