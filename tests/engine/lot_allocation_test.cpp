// Choosing lots (engine/lot_allocation.hpp) and rebalancing to them (engine/stock_rebalance.hpp),
// each case worked by hand in its comment. IBU checks use Tinseth's formula written out here from
// docs/methods.md [Tinseth G., "Glenn's Hop Utilization Numbers", ca. 1997]:
//   IBU = B(G) x F(t) x AA x W x 1000 / V, B(G) = 1.65 x 0.000125^(G - 1), F(t) = (1 - e^(-0.04 t)) / 4.15.
#include "engine/lot_allocation.hpp"

#include <doctest/doctest.h>

#include <cmath>

#include "engine/stock_rebalance.hpp"
#include "model/errors.hpp"

namespace {

using bine::HopAddition;
using bine::HopForm;
using bine::HopUse;

// A catalog written for these tests (not the demo data).
bine::Catalog test_catalog() {
  bine::Variety bitter;
  bitter.name = "Bitter";
  bitter.alpha_acid = bine::Range{6.0, 8.0};
  bitter.stability = 50.0;  // 50 % of alpha left after 6 months at 20 C
  bine::Variety aroma;
  aroma.name = "Aroma";
  aroma.alpha_acid = bine::Range{4.0, 6.0};
  aroma.total_oil = bine::Range{1.0, 2.0};
  bine::Variety rangeless;  // known, but with no alpha range
  rangeless.name = "Rangeless";
  bine::Catalog catalog;
  catalog.varieties = {bitter, aroma, rangeless};
  return catalog;
}

bine::Lot lot(std::string code, std::string variety, double alpha, double grams, std::string packaged) {
  bine::Lot l;
  l.lot = std::move(code);
  l.variety = std::move(variety);
  l.alpha_acid = alpha;
  l.on_hand_g = grams;
  l.form = HopForm::whole;
  l.packaged = bine::parse_date(packaged);  // no storage given: the certificate alpha is used unaged
  return l;
}

bine::Cellar cellar_of(std::vector<bine::Lot> lots, bine::LotOrder order = bine::LotOrder::oldest,
                       bool allow_stale = false) {
  bine::Stock stock;
  stock.source_file = "stock.json";
  stock.lots = std::move(lots);
  bine::CellarSettings settings;
  settings.lot_order = order;
  settings.allow_stale = allow_stale;
  return bine::age_cellar(stock, test_catalog(), *bine::parse_date("2026-12-01"), settings);
}

HopAddition addition(std::string variety, double grams, double alpha, HopUse use, double minutes) {
  HopAddition hop;
  hop.variety = std::move(variety);
  hop.grams = grams;
  hop.alpha_acid = alpha;
  hop.use = use;
  hop.minutes = minutes;
  hop.form = HopForm::whole;
  if (use == HopUse::whirlpool) hop.temperature_c = 80.0;
  return hop;
}

bine::Recipe recipe_of(std::vector<HopAddition> hops) {
  bine::Recipe recipe;
  recipe.source_file = "recipe.json";
  recipe.batch_volume_l = 20;
  recipe.original_gravity = 1.050;
  recipe.boil_minutes = 60;
  recipe.hops = std::move(hops);
  return recipe;
}

/// Demands in grams: each lot gives one gram per gram.
std::vector<bine::LotDemand> by_grams(const bine::Recipe& recipe) {
  std::vector<bine::LotDemand> demands;
  for (const auto& hop : recipe.hops) demands.push_back({hop.grams, [](const bine::CellarLot&) { return 1.0; }});
  return demands;
}

/// Tinseth IBU of W g at AA % for t minutes in V L of wort at gravity G, whole hops (no pellet factor).
double tinseth_ibu(double grams, double alpha_percent, double minutes, double litres = 20.0, double gravity = 1.050) {
  const double bigness = 1.65 * std::pow(0.000125, gravity - 1.0);
  const double time = (1.0 - std::exp(-0.04 * minutes)) / 4.15;
  return bigness * time * (alpha_percent / 100.0) * grams * 1000.0 / litres;
}

}  // namespace

TEST_CASE("lots are taken oldest packaging first, and what earlier additions took is gone for later ones") {
  // B-OLD packaged 2025-06-01 (20 g), B-NEW 2026-01-01 (100 g). Addition 1, 15 g: all from B-OLD
  // (older), 5 g left. Addition 2, 15 g: 5 g from B-OLD, then 10 g from B-NEW (hand arithmetic).
  const auto cellar =
      cellar_of({lot("B-NEW", "Bitter", 8.0, 100, "2026-01-01"), lot("B-OLD", "Bitter", 10.0, 20, "2025-06-01")});
  const auto recipe =
      recipe_of({addition("Bitter", 15, 10.0, HopUse::boil, 60), addition("Bitter", 15, 10.0, HopUse::boil, 10)});
  const auto allocation = bine::allocate_lots(recipe, cellar, by_grams(recipe), bine::allocation_of(cellar));
  REQUIRE(allocation.additions.size() == 2);
  REQUIRE(allocation.additions[0].parts.size() == 1);
  CHECK(cellar.lots[allocation.additions[0].parts[0].lot].code == "B-OLD");
  CHECK(allocation.additions[0].parts[0].grams == doctest::Approx(15.0));
  REQUIRE(allocation.additions[1].parts.size() == 2);
  CHECK(cellar.lots[allocation.additions[1].parts[0].lot].code == "B-OLD");
  CHECK(allocation.additions[1].parts[0].grams == doctest::Approx(5.0));
  CHECK(cellar.lots[allocation.additions[1].parts[1].lot].code == "B-NEW");
  CHECK(allocation.additions[1].parts[1].grams == doctest::Approx(10.0));
  CHECK(allocation.left_g[0] == doctest::Approx(90.0));  // B-NEW: 100 - 10
  CHECK(allocation.left_g[1] == doctest::Approx(0.0));   // B-OLD: 20 - 15 - 5
}

TEST_CASE("lots are taken most on hand first with --lot-order most") {
  // B-OLD has 20 g, B-NEW 100 g: most on hand is B-NEW, so the 15 g come from it (hand arithmetic).
  const auto cellar =
      cellar_of({lot("B-OLD", "Bitter", 10.0, 20, "2025-06-01"), lot("B-NEW", "Bitter", 8.0, 100, "2026-01-01")},
                bine::LotOrder::most);
  const auto recipe = recipe_of({addition("Bitter", 15, 10.0, HopUse::boil, 60)});
  const auto allocation = bine::allocate_lots(recipe, cellar, by_grams(recipe), bine::allocation_of(cellar));
  REQUIRE(allocation.additions[0].parts.size() == 1);
  CHECK(cellar.lots[allocation.additions[0].parts[0].lot].code == "B-NEW");
  CHECK(allocation.left_g[1] == doctest::Approx(85.0));
}

TEST_CASE("a boil addition split across two lots of different alpha holds its Tinseth IBU") {
  // 40 g at 10 % for 60 min in 20 L at 1.050 (whole hops). The oldest lot B-OLD (10 %) has 20 g: it
  // gives half the alpha (20 x 10 = 200 of 40 x 10 = 400 g.%); the other 200 g.% come from B-NEW at
  // 8 %: 200 / 8 = 25 g. Tinseth is linear in W x AA, so 20 g at 10 % + 25 g at 8 % give the IBU of
  // 40 g at 10 % (hand arithmetic; formula above).
  const auto cellar =
      cellar_of({lot("B-NEW", "Bitter", 8.0, 500, "2026-01-01"), lot("B-OLD", "Bitter", 10.0, 20, "2025-06-01")});
  const auto recipe = recipe_of({addition("Bitter", 40, 10.0, HopUse::boil, 60)});
  const auto stocked = bine::rebalance_from_stock(recipe, cellar, test_catalog(), {}, bine::Weighing::exact);
  const auto& rows = stocked.result.additions;
  REQUIRE(rows.size() == 2);
  CHECK(rows[0].lot == "B-OLD");
  CHECK(rows[0].grams_after == doctest::Approx(20.0));
  CHECK(rows[1].lot == "B-NEW");
  CHECK(rows[1].grams_after == doctest::Approx(25.0));
  for (const auto& row : rows) {
    CHECK(row.index == 0);  // both parts of addition 1
    CHECK(row.parts == 2);
  }
  CHECK(rows[0].part == 1);
  CHECK(rows[1].part == 2);
  const double unsplit = tinseth_ibu(40, 10.0, 60);  // 46.14 IBU
  CHECK(unsplit == doctest::Approx(46.14).epsilon(1e-3));
  CHECK(rows[0].ibu_after + rows[1].ibu_after == doctest::Approx(unsplit).epsilon(1e-9));
  CHECK(tinseth_ibu(20, 10.0, 60) + tinseth_ibu(25, 8.0, 60) == doctest::Approx(unsplit).epsilon(1e-12));
  CHECK(stocked.result.after.total_ibu == doctest::Approx(unsplit).epsilon(1e-9));
  CHECK_FALSE(stocked.result.absorber.has_value());  // nothing changed the total
  CHECK(stocked.result.shortfalls.empty());
  // The written recipe weighs each part from its own lot.
  REQUIRE(stocked.result.recipe_after.hops.size() == 2);
  CHECK(stocked.result.recipe_after.hops[0].lot == "B-OLD");
  CHECK(stocked.result.recipe_after.hops[1].lot == "B-NEW");
}

TEST_CASE("a late addition split across lots holds the oil it delivers") {
  // Whirlpool 100 g written for 1.5 mL/100 g delivers 1.5 mL. A-OLD (oil 1.0, 60 g) gives 0.60 mL;
  // the other 0.90 mL come from A-NEW (oil 2.0): 0.90 / 0.020 = 45 g (hand arithmetic, dosing by
  // oil, docs/methods.md#oil-dosing).
  auto old_lot = lot("A-OLD", "Aroma", 5.0, 60, "2025-09-01");
  old_lot.total_oil = 1.0;
  auto new_lot = lot("A-NEW", "Aroma", 5.0, 1000, "2026-09-01");
  new_lot.total_oil = 2.0;
  const auto cellar = cellar_of({new_lot, old_lot});
  auto whirlpool = addition("Aroma", 100, 5.0, HopUse::whirlpool, 20);
  whirlpool.total_oil = 1.5;
  const auto recipe = recipe_of({addition("Other", 30, 7.0, HopUse::boil, 60), whirlpool});
  const auto stocked = bine::rebalance_from_stock(recipe, cellar, test_catalog(), {}, bine::Weighing::exact);
  const auto& rows = stocked.result.additions;
  REQUIRE(rows.size() == 3);  // the boil addition (no lot of Other: kept) and two whirlpool parts
  CHECK(rows[1].lot == "A-OLD");
  CHECK(rows[1].grams_after == doctest::Approx(60.0));
  CHECK(rows[2].lot == "A-NEW");
  CHECK(rows[2].grams_after == doctest::Approx(45.0));
  CHECK((rows[1].grams_after * 1.0 + rows[2].grams_after * 2.0) / 100.0 == doctest::Approx(1.5));
}

TEST_CASE("an addition that names a lot takes it, whatever the order") {
  // B-NEW is named though B-OLD is older: 30 g at 10 % -> 30 x 10 / 8 = 37.5 g at 8 %
  // (same IBU: W x AA held, docs/methods.md#linearity).
  const auto cellar =
      cellar_of({lot("B-OLD", "Bitter", 10.0, 500, "2025-06-01"), lot("B-NEW", "Bitter", 8.0, 500, "2026-01-01")});
  auto hop = addition("Bitter", 30, 10.0, HopUse::boil, 60);
  hop.lot = "b-new";  // codes compare folded
  const auto stocked = bine::rebalance_from_stock(recipe_of({hop}), cellar, test_catalog(), {}, bine::Weighing::exact);
  REQUIRE(stocked.result.additions.size() == 1);
  CHECK(stocked.result.additions[0].lot == "B-NEW");
  CHECK(stocked.result.additions[0].grams_after == doctest::Approx(37.5));
  REQUIRE(stocked.lots.size() == 1);
  CHECK(stocked.lots[0].chosen == "named in the recipe");
}

TEST_CASE("a stale lot is skipped unless stale lots are allowed") {
  // B-OLD: 10 % packaged 2025-12-01, kept open at 20 C; Bitter keeps 50 % after 6 months, so
  // k = ln(100 / 50) / 180 = 0.003851 per day, TF = 1, SF = 1 (Garetz 1994, docs/methods.md); after
  // 365 days exp(-0.003851 x 365) = 0.245 of its alpha is left, below 75 %: stale. B-NEW (no
  // storage: unaged) is taken instead; with stale lots allowed B-OLD, the older, comes first.
  auto stale = lot("B-OLD", "Bitter", 10.0, 500, "2025-12-01");
  stale.storage = bine::Storage{20.0, bine::Package::open};
  const auto fresh = lot("B-NEW", "Bitter", 8.0, 500, "2026-01-01");
  const auto recipe = recipe_of({addition("Bitter", 30, 10.0, HopUse::boil, 60)});
  const auto cellar = cellar_of({fresh, stale});
  REQUIRE(cellar.lots[1].stale);
  CHECK(cellar.lots[1].remaining == doctest::Approx(std::exp(-std::log(2.0) / 180.0 * 365.0)).epsilon(1e-9));
  const auto skipped = bine::allocate_lots(recipe, cellar, by_grams(recipe), bine::allocation_of(cellar));
  REQUIRE(skipped.additions[0].parts.size() == 1);
  CHECK(cellar.lots[skipped.additions[0].parts[0].lot].code == "B-NEW");
  REQUIRE(skipped.notes.size() == 1);
  CHECK(skipped.notes[0].find("lot B-OLD of Bitter is stale") == 0);
  const auto allowed_cellar = cellar_of({fresh, stale}, bine::LotOrder::oldest, true);
  const auto allowed =
      bine::allocate_lots(recipe, allowed_cellar, by_grams(recipe), bine::allocation_of(allowed_cellar));
  CHECK(allowed_cellar.lots[allowed.additions[0].parts[0].lot].code == "B-OLD");
}

TEST_CASE("a lot-only addition takes its variety and alpha from the stock") {
  // Addition: lot B-NEW, 25 g, 60 min, no variety, no alpha -> Bitter at the lot's 8.00 %.
  // Tinseth: 25 g at 8 % in 20 L at 1.050 = 1.0528 x 0.2191 x 0.08 x 25 x 1000 / 20 = 23.07 IBU.
  const auto cellar = cellar_of({lot("B-NEW", "Bitter", 8.0, 500, "2026-01-01")});
  HopAddition hop;
  hop.lot = "B-NEW";
  hop.grams = 25;
  hop.use = HopUse::boil;
  hop.minutes = 60;
  hop.form = HopForm::whole;
  std::vector<std::string> notes;
  const auto recipe = bine::with_named_lots(recipe_of({hop}), cellar, notes);
  CHECK(recipe.hops[0].variety == "Bitter");
  REQUIRE(recipe.hops[0].alpha_acid.has_value());
  CHECK(*recipe.hops[0].alpha_acid == doctest::Approx(8.0));
  REQUIRE(notes.size() == 1);
  const auto bitterness = bine::recipe_bitterness(recipe, test_catalog(), {});
  CHECK(bitterness.total_ibu == doctest::Approx(tinseth_ibu(25, 8.0, 60)).epsilon(1e-12));
  CHECK(bitterness.total_ibu == doctest::Approx(23.07).epsilon(1e-3));

  // Without a stock the addition is refused; an unknown code gets the nearest codes.
  CHECK_THROWS_AS(bine::require_stock_for_lot_only(recipe_of({hop})), bine::InputError);
  hop.lot = "B-NWE";
  try {
    bine::with_named_lots(recipe_of({hop}), cellar, notes);
    FAIL("expected InputError");
  } catch (const bine::InputError& e) {
    REQUIRE(e.lines().size() == 1);
    CHECK(e.lines()[0].find("recipe.json: /hops/0/lot: \"B-NWE\" is not a lot in stock.json") == 0);
    CHECK(e.lines()[0].find("did you mean B-NEW?") != std::string::npos);
  }
}

TEST_CASE("an addition no lot can cover is short on its last lot, for every batch") {
  // Two batches of 40 g from B-OLD (30 g) and B-NEW (20 g): per batch each gives half its amount,
  // 15 g + 10 g = 25 g, so 15 g per batch are short and go on B-NEW, the last in order:
  // B-NEW gives 10 + 15 = 25 g per batch, 50 g for both, 30 g more than its 20 g (hand arithmetic).
  const auto cellar =
      cellar_of({lot("B-NEW", "Bitter", 10.0, 20, "2026-01-01"), lot("B-OLD", "Bitter", 10.0, 30, "2025-06-01")});
  const auto recipe = recipe_of({addition("Bitter", 40, 10.0, HopUse::boil, 60)});
  const auto stocked = bine::rebalance_from_stock(recipe, cellar, test_catalog(), {}, bine::Weighing::exact, 2.0);
  REQUIRE(stocked.result.shortfalls.size() == 1);
  CHECK(stocked.result.shortfalls[0].lot == "B-NEW");
  CHECK(stocked.result.shortfalls[0].needed_g == doctest::Approx(50.0));
  CHECK(stocked.result.shortfalls[0].on_hand_g == doctest::Approx(20.0));
  REQUIRE(stocked.draws.size() == 2);
  CHECK(stocked.draws[0].code == "B-OLD");
  CHECK(stocked.draws[0].grams == doctest::Approx(30.0));
}

TEST_CASE("a named lot without alpha acid, of a variety the catalog has no range for, is an input error") {
  // Nothing gives its alpha on the brew day, so nothing can be weighed from it.
  bine::Lot unknown;
  unknown.lot = "U-1";
  unknown.variety = "Rangeless";
  unknown.on_hand_g = 500;
  const auto cellar = cellar_of({unknown});
  REQUIRE_FALSE(cellar.lots[0].alpha_today.has_value());
  auto hop = addition("Rangeless", 30, 7.0, HopUse::boil, 60);
  hop.lot = "U-1";
  try {
    bine::rebalance_from_stock(recipe_of({hop}), cellar, test_catalog(), {}, bine::Weighing::exact);
    FAIL("expected InputError");
  } catch (const bine::InputError& e) {
    REQUIRE(e.lines().size() == 1);
    CHECK(e.lines()[0].find("stock.json: /lots/0/alpha_acid: lot U-1 of Rangeless is named by the recipe") == 0);
  }
}
