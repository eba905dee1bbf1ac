// Tests of the blend engine: amounts and IBU held exactly, stock limits, a single-variety target,
// and infeasible requests. Candidates are hand-made vectors (not demo data); expected values are
// worked by hand in the comments or come from the bitterness engine's own published formulas.
#include "engine/blend.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <random>
#include <string>

#include "engine/bitterness.hpp"
#include "engine/blend_plan.hpp"
#include "model/errors.hpp"

namespace {

using bine::BlendCandidate;
using bine::BlendRequest;

Eigen::VectorXd axes(std::initializer_list<std::pair<int, double>> values) {
  Eigen::VectorXd v = Eigen::VectorXd::Zero(14);
  for (auto [axis, value] : values) v[axis] = value;
  return v;
}

BlendCandidate candidate(std::string name, Eigen::VectorXd aroma, double oil, double alpha) {
  BlendCandidate c;
  c.variety = std::move(name);
  c.aroma = std::move(aroma);
  c.oil_ml_per_100g = oil;
  c.alpha_percent = alpha;
  return c;
}

/// 20 L at 1.050, 4 g/L late (80 g), 30 % whirlpool at 80 C for 20 min, 35 IBU, 12 % bittering hop.
BlendRequest brew() {
  BlendRequest request;
  request.plan.wort = {20.0, 1.050, 60.0, 0.0, std::nullopt};
  request.plan.late = bine::late_amount({bine::LateDose::Kind::grams_per_litre, 4.0}, 20.0);
  request.plan.ibu.whirlpool_share = 0.3;
  request.plan.ibu.target_ibu = 35.0;
  bine::BitteringHop bittering;
  bittering.variety = "bitter";
  bittering.alpha_percent = 12.0;
  request.plan.bittering = bittering;
  return request;
}

std::vector<bool> named(std::initializer_list<int> list) {
  std::vector<bool> n(14, false);
  for (int a : list) n[static_cast<std::size_t>(a)] = true;
  return n;
}

/// IBU of the blend recomputed addition by addition through the bitterness engine.
double recomputed_ibu(const bine::BlendResult& result, const BlendRequest& request) {
  double total = request.plan.ibu.kept_ibu;
  for (const auto& part : result.parts) {
    bine::HopAddition hop;
    hop.grams = part.whirlpool_g;
    hop.use = bine::HopUse::whirlpool;
    hop.minutes = request.plan.whirlpool_minutes;
    hop.temperature_c = request.plan.whirlpool_temperature_c;
    hop.form = part.form;
    total += bine::addition_bitterness(hop, part.alpha_percent, request.plan.wort, request.plan.bitterness).ibu;
  }
  if (const auto& bittering = request.plan.bittering) {
    bine::HopAddition hop;
    hop.grams = result.bittering_grams;
    hop.use = bine::HopUse::boil;
    hop.minutes = bittering->minutes;
    hop.form = bittering->form;
    total += bine::addition_bitterness(hop, bittering->alpha_percent, request.plan.wort, request.plan.bitterness).ibu;
  }
  return total;
}

}  // namespace

TEST_CASE("two complementary hops meet a two-axis target exactly, grams follow the oil (hand arithmetic)") {
  // A: citrus 4 (oil 1.0 mL/100 g); B: floral 4 (oil 2.0). Target citrus 2, floral 2: x = (1/2, 1/2),
  // P = (2, 2), J = 0. Grams: g_i proportional to x_i / O_i = 0.5 and 0.25, so of 80 g
  // A gets 80 x 0.5 / 0.75 = 53.33 g and B 26.67 g; whirlpool 30 %: 16.0 g and 8.0 g.
  BlendRequest request = brew();
  request.candidates = {candidate("A", axes({{0, 4.0}}), 1.0, 6.0), candidate("B", axes({{5, 4.0}}), 2.0, 6.0),
                        candidate("C", axes({{12, 5.0}}), 1.5, 6.0)};
  request.target = bine::target_from_spec(axes({{0, 2.0}, {5, 2.0}}), named({0, 5}), 0.25);
  const auto result = bine::design_blend(request);
  REQUIRE(result.parts.size() == 2);
  CHECK(result.fit == doctest::Approx(0.0).epsilon(1e-6));
  const auto& a = result.parts[0].variety == "A" ? result.parts[0] : result.parts[1];
  const auto& b = result.parts[0].variety == "A" ? result.parts[1] : result.parts[0];
  CHECK(a.oil_share == doctest::Approx(0.5));
  CHECK(a.grams == doctest::Approx(53.333).epsilon(1e-4));
  CHECK(b.grams == doctest::Approx(26.667).epsilon(1e-4));
  CHECK(a.whirlpool_g == doctest::Approx(16.0));
  CHECK(result.late_grams == doctest::Approx(80.0));  // 4 g/L x 20 L
  // Oil delivered: 53.33 g x 1.0/100 + 26.67 g x 2.0/100 = 1.0667 mL.
  CHECK(result.oil_ml == doctest::Approx(1.0667).epsilon(1e-4));
}

TEST_CASE("a target equal to one variety's profile returns that variety alone with fit 0") {
  BlendRequest request = brew();
  const Eigen::VectorXd profile = axes({{0, 3.0}, {1, 2.0}, {5, 1.5}});
  request.candidates = {candidate("A", axes({{0, 4.0}}), 1.0, 6.0), candidate("twin", profile, 1.2, 5.0),
                        candidate("B", axes({{1, 4.0}, {5, 1.0}}), 2.0, 6.0)};
  request.target = bine::target_like(profile);
  const auto result = bine::design_blend(request);
  REQUIRE(result.parts.size() == 1);
  CHECK(result.parts[0].variety == "twin");
  CHECK(result.parts[0].oil_share == doctest::Approx(1.0));
  CHECK(result.fit == doctest::Approx(0.0).epsilon(1e-9));
}

TEST_CASE("local search finds a complementary pair that the pool leaves out (hand arithmetic)") {
  // Target citrus 3, floral 3 (axes 0, 1; the other axes weigh 0.25 at target 0). A = (citrus 5,
  // floral 1) and B = (citrus 1, floral 5): x = (1/2, 1/2) gives P = (3, 3), J = 0. No other blend
  // reaches 0: 30 near candidates (3, 3) carry 1.0 on axis 2 (J = 0.25 x 1 = 0.25 each, and any mix
  // keeps axis 2 at 1), 10 strong citrus (5, 4.5) and 10 strong floral (4.5, 5) have citrus + floral
  // = 9.5, above the target's 6. The pool takes the 24 nearest (near candidates, J 0.25 < J of A =
  // 4 + 4 = 8) and the 8 strongest per axis (the strong ones come first in the list and tie A and B
  // at score 5), so neither A nor B is in it.
  BlendRequest request = brew();
  for (int i = 0; i < 30; ++i)
    request.candidates.push_back(candidate("near" + std::to_string(i), axes({{0, 3.0}, {1, 3.0}, {2, 1.0}}), 1.5, 5.0));
  for (int i = 0; i < 10; ++i)
    request.candidates.push_back(candidate("citrus" + std::to_string(i), axes({{0, 5.0}, {1, 4.5}}), 1.5, 5.0));
  for (int i = 0; i < 10; ++i)
    request.candidates.push_back(candidate("floral" + std::to_string(i), axes({{0, 4.5}, {1, 5.0}}), 1.5, 5.0));
  request.candidates.push_back(candidate("A", axes({{0, 5.0}, {1, 1.0}}), 1.5, 5.0));
  request.candidates.push_back(candidate("B", axes({{0, 1.0}, {1, 5.0}}), 1.5, 5.0));
  request.target = bine::target_from_spec(axes({{0, 3.0}, {1, 3.0}}), named({0, 1}), 0.25);
  SUBCASE("the pool alone misses it") {
    request.pool.swap_rounds = 0;
    CHECK(bine::design_blend(request).objective > 0.01);
  }
  SUBCASE("local search finds A and B half and half") {
    const auto result = bine::design_blend(request);
    CHECK(result.objective == doctest::Approx(0.0).epsilon(1e-9));
    REQUIRE(result.parts.size() == 2);
    CHECK(result.parts[0].oil_share == doctest::Approx(0.5));
    CHECK(result.parts[1].oil_share == doctest::Approx(0.5));
    CHECK(((result.parts[0].variety == "A" && result.parts[1].variety == "B") ||
           (result.parts[0].variety == "B" && result.parts[1].variety == "A")));
  }
}

TEST_CASE("total IBU equals the target to 0.05 IBU in every blend (100 random requests)") {
  std::mt19937 random(42u);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  int feasible = 0;
  for (int trial = 0; trial < 100; ++trial) {
    CAPTURE(trial);
    BlendRequest request = brew();
    for (int i = 0; i < 30; ++i) {
      Eigen::VectorXd aroma = Eigen::VectorXd::Zero(14);
      for (int k = 0; k < 3; ++k) aroma[static_cast<Eigen::Index>(unit(random) * 14)] = 1.0 + 4.0 * unit(random);
      request.candidates.push_back(
          candidate("v" + std::to_string(i), aroma, 0.5 + 2.5 * unit(random), 3.0 + 12.0 * unit(random)));
    }
    request.plan.ibu.target_ibu = 10.0 + 50.0 * unit(random);
    request.plan.ibu.kept_ibu = unit(random) < 0.5 ? 4.0 * unit(random) : 0.0;
    request.plan.ibu.whirlpool_share = unit(random);
    request.plan.late.total = 20.0 * (1.0 + 9.0 * unit(random));  // 1-10 g/L
    request.target =
        bine::target_from_spec(axes({{static_cast<int>(unit(random) * 14), 4.0}, {0, 2.0}}), named({0}), 0.25);
    request.target.named[0] = true;
    // Least whirlpool IBU any blend can give: every gram in the least bitter candidate.
    double least = 1e300;
    for (const auto& c : request.candidates)
      least = std::min(least, request.plan.late.total * request.plan.ibu.whirlpool_share *
                                  bine::whirlpool_ibu_per_gram(c, request.plan));
    try {
      const auto result = bine::design_blend(request);
      ++feasible;
      CHECK(std::abs(result.total_ibu - request.plan.ibu.target_ibu) <= 0.05);
      CHECK(std::abs(recomputed_ibu(result, request) - request.plan.ibu.target_ibu) <= 0.05);
      CHECK(result.bittering_grams >= 0.0);
      CHECK(result.late_grams == doctest::Approx(request.plan.late.total));
    } catch (const bine::Infeasible&) {
      // Only when even the least bitter candidate alone overshoots the IBU left for late hops.
      CHECK(least > request.plan.ibu.target_ibu - request.plan.ibu.kept_ibu);
    }
  }
  CHECK(feasible >= 80);
}

TEST_CASE("without a bittering charge the late hops give exactly the IBU left") {
  BlendRequest request = brew();
  request.plan.bittering.reset();
  request.plan.ibu.whirlpool_share = 1.0;
  request.candidates = {candidate("A", axes({{0, 4.0}}), 1.0, 6.0), candidate("B", axes({{5, 4.0}}), 2.0, 14.0)};
  request.target = bine::target_from_spec(axes({{0, 4.0}}), named({0}), 0.25);
  // 80 g of A alone at 6 % gives some IBU u_A; ask for a bit more so B must come in.
  const double a_only = 80.0 * bine::whirlpool_ibu_per_gram(request.candidates[0], request.plan);
  request.plan.ibu.target_ibu = a_only * 1.2;
  const auto result = bine::design_blend(request);
  CHECK(result.parts.size() == 2);
  CHECK(std::abs(result.total_ibu - request.plan.ibu.target_ibu) <= 0.05);
  CHECK(std::abs(recomputed_ibu(result, request) - request.plan.ibu.target_ibu) <= 0.05);
}

TEST_CASE("stock limits hold for the blend and the bittering lot") {
  BlendRequest request = brew();
  auto a = candidate("A", axes({{0, 4.0}}), 1.0, 6.0);
  a.lot = "A-1";
  a.on_hand_g = 30.0;  // less than the 53 g the free optimum would use
  auto b = candidate("B", axes({{5, 4.0}}), 2.0, 6.0);
  b.lot = "B-1";
  b.on_hand_g = 500.0;
  auto a2 = candidate("A", axes({{0, 4.0}}), 1.0, 6.0);
  a2.lot = "A-2";
  a2.on_hand_g = 10.0;
  request.candidates = {a, b, a2};
  request.plan.bittering->lot = "X-1";
  request.plan.bittering->on_hand_g = 1000.0;
  request.target = bine::target_from_spec(axes({{0, 2.0}, {5, 2.0}}), named({0, 5}), 0.25);
  const auto result = bine::design_blend(request);
  for (const auto& part : result.parts) {
    CAPTURE(part.lot);
    const double on_hand = part.lot == "A-1" ? 30.0 : part.lot == "A-2" ? 10.0 : 500.0;
    CHECK(part.grams <= on_hand + 1e-6);
    REQUIRE(part.left_g);
    CHECK(*part.left_g >= -1e-6);
  }
  CHECK(result.late_grams == doctest::Approx(80.0));
  // Bittering limited to 5 g: the late hops cannot lower the needed charge enough -> infeasible.
  request.plan.bittering->on_hand_g = 5.0;
  CHECK_THROWS_AS(bine::design_blend(request), bine::Infeasible);
}

TEST_CASE("oil dose fixes the oil delivered: grams = dose / oil content (docs/methods.md, derived)") {
  // 1.5 mL/hL over 20 L = 0.3 mL of oil. One hop at 1.5 mL/100 g: 0.3 / 0.015 = 20 g.
  BlendRequest request = brew();
  request.plan.late = bine::late_amount({bine::LateDose::Kind::oil_ml_per_hl, 1.5}, 20.0);
  request.candidates = {candidate("A", axes({{0, 4.0}}), 1.5, 6.0)};
  request.target = bine::target_from_spec(axes({{0, 4.0}}), named({0}), 0.25);
  const auto result = bine::design_blend(request);
  REQUIRE(result.parts.size() == 1);
  CHECK(result.parts[0].grams == doctest::Approx(20.0));
  CHECK(result.oil_ml == doctest::Approx(0.3));
}

/// The Infeasible that design_blend throws for `request`; fails the test when it returns.
bine::Infeasible infeasible(const BlendRequest& request) {
  try {
    bine::design_blend(request);
  } catch (const bine::Infeasible& e) {
    return e;
  }
  FAIL("design_blend returned a blend");
  return bine::Infeasible("");
}

bool has(const std::vector<bine::Remedy>& remedies, bine::Remedy remedy) {
  return std::find(remedies.begin(), remedies.end(), remedy) != remedies.end();
}

TEST_CASE("infeasible requests say why in domain words, with what would make them feasible") {
  BlendRequest request = brew();
  request.candidates = {candidate("A", axes({{0, 4.0}}), 1.0, 6.0)};
  request.target = bine::target_from_spec(axes({{0, 4.0}}), named({0}), 0.25);
  SUBCASE("kept boil additions already above the target") {
    request.plan.ibu.kept_ibu = 40.0;
    const auto e = infeasible(request);
    CHECK(std::string(e.what()).find("already give 40.0 IBU") != std::string::npos);
    CHECK(has(e.remedies(), bine::Remedy::raise_target_ibu));
  }
  SUBCASE("no candidates") {
    request.candidates.clear();
    CHECK(has(infeasible(request).remedies(), bine::Remedy::add_aroma_stock));
  }
  SUBCASE("no bittering and the late hops cannot reach the IBU") {
    request.plan.bittering.reset();
    request.plan.ibu.target_ibu = 200.0;
    const auto e = infeasible(request);
    CHECK(std::string(e.what()).find("without a bittering charge") != std::string::npos);
    CHECK(has(e.remedies(), bine::Remedy::allow_bittering));
    CHECK(has(e.remedies(), bine::Remedy::raise_whirlpool_share));
  }
  SUBCASE("the whirlpool alone gives more IBU than the target") {
    // 80 g at 6 % alpha all in an 80 C, 20 min whirlpool gives well over 1 IBU (Tinseth with the
    // below-boiling factor, docs/methods.md#below-boiling), so even a zero charge overshoots.
    request.plan.ibu.whirlpool_share = 1.0;
    request.plan.ibu.target_ibu = 1.0;
    const auto e = infeasible(request);
    CHECK(std::string(e.what()).find("at or below 1.0 IBU") != std::string::npos);
    CHECK(std::string(e.what()).find("stock") == std::string::npos);  // no lot limits this blend
    CHECK(has(e.remedies(), bine::Remedy::lower_whirlpool_share));
    CHECK_FALSE(has(e.remedies(), bine::Remedy::add_stock));
  }
  SUBCASE("not enough stock for the late amount") {
    request.candidates[0].on_hand_g = 50.0;  // 80 g needed
    const auto e = infeasible(request);
    CHECK(std::string(e.what()).find("only 50 g") != std::string::npos);
    CHECK(has(e.remedies(), bine::Remedy::add_stock));
  }
  // Engine messages never name a command-line option: the command line adds those from the remedies.
  CHECK(std::string(infeasible(request).what()).find("--") == std::string::npos);
}

TEST_CASE("the late-hop amount is the dose times the volume (hand arithmetic)") {
  // 5 g/L x 23 L = 115 g; 2 mL/hL x 23 L = 0.46 mL of oil.
  const auto grams = bine::late_amount({bine::LateDose::Kind::grams_per_litre, 5.0}, 23.0);
  CHECK(grams.kind == bine::LateAmount::Kind::grams);
  CHECK(grams.total == doctest::Approx(115.0));
  const auto oil = bine::late_amount({bine::LateDose::Kind::oil_ml_per_hl, 2.0}, 23.0);
  CHECK(oil.kind == bine::LateAmount::Kind::oil_ml);
  CHECK(oil.total == doctest::Approx(0.46));
  CHECK(bine::LateDose{}.value == 4.0);  // our default, 4 g/L
}

namespace {

/// A recipe of 20 L with 30 g in the whirlpool (85 C, 15 min) and 70 g dry hop, and no boil addition.
bine::Recipe late_only_recipe() {
  bine::Recipe recipe;
  recipe.name = "late only";
  recipe.batch_volume_l = 20.0;
  recipe.original_gravity = 1.050;
  recipe.target_ibu = 30.0;
  recipe.source_file = "late.json";
  bine::HopAddition whirlpool;
  whirlpool.variety = "A";
  whirlpool.grams = 30.0;
  whirlpool.alpha_acid = 6.0;
  whirlpool.use = bine::HopUse::whirlpool;
  whirlpool.minutes = 15.0;
  whirlpool.temperature_c = 85.0;
  bine::HopAddition dry = whirlpool;
  dry.grams = 70.0;
  dry.use = bine::HopUse::dry_hop;
  dry.minutes = 4.0 * 24 * 60;
  dry.temperature_c.reset();
  recipe.hops = {whirlpool, dry};
  return recipe;
}

}  // namespace

TEST_CASE("a plan takes the recipe's whirlpool split, stand and IBU target (hand arithmetic)") {
  const bine::Catalog catalog;
  bine::BlendChoices choices;
  choices.no_bittering = true;
  const bine::Recipe recipe = late_only_recipe();
  const auto plan = bine::plan_blend(&recipe, catalog, nullptr, choices, {});
  // Whirlpool share 30 / (30 + 70) = 0.3; the stand is the recipe's; the late amount is the recipe's
  // own 30 + 70 = 100 g.
  CHECK(plan.ibu.whirlpool_share == doctest::Approx(0.3));
  CHECK(plan.whirlpool_temperature_c == 85.0);
  CHECK(plan.whirlpool_minutes == 15.0);
  CHECK(plan.ibu.target_ibu == 30.0);
  CHECK(plan.ibu.target_source == bine::IbuTargetSource::recipe_target);
  CHECK(plan.ibu.kept_ibu == 0.0);
  CHECK_FALSE(plan.bittering);
  CHECK(plan.late.kind == bine::LateAmount::Kind::grams);
  CHECK(plan.late.total == doctest::Approx(100.0));
  CHECK(plan.late_source == bine::LateSource::recipe_grams);
}

TEST_CASE("the late amount: --rate over the volume, the recipe's oil with --oil-dose recipe, else 4 g/L") {
  bine::Catalog catalog;
  bine::Variety a;
  a.name = "A";
  a.total_oil = bine::Range{1.0, 2.0};  // midpoint 1.5 mL/100 g
  catalog.varieties = {a};
  bine::Recipe recipe = late_only_recipe();
  bine::BlendChoices choices;
  choices.no_bittering = true;
  // --rate 1 oz/gal = 28.349523125 / 3.785411784 = 7.48915 g/L, x 20 L = 149.78 g.
  choices.dose = bine::LateDose{bine::LateDose::Kind::grams_per_litre, 28.349523125 / 3.785411784};
  auto plan = bine::plan_blend(&recipe, catalog, nullptr, choices, {});
  CHECK(plan.late.total == doctest::Approx(149.783).epsilon(1e-5));
  CHECK(plan.late_source == bine::LateSource::given);
  // The oil the recipe's late hops deliver: 100 g x 1.5 mL/100 g = 1.5 mL; a recorded total_oil wins:
  // 30 g x 2.0 / 100 + 70 g x 1.5 / 100 = 0.6 + 1.05 = 1.65 mL.
  choices.dose.reset();
  choices.keep_recipe_oil = true;
  plan = bine::plan_blend(&recipe, catalog, nullptr, choices, {});
  CHECK(plan.late.kind == bine::LateAmount::Kind::oil_ml);
  CHECK(plan.late.total == doctest::Approx(1.5));
  recipe.hops[0].total_oil = 2.0;
  plan = bine::plan_blend(&recipe, catalog, nullptr, choices, {});
  CHECK(plan.late.total == doctest::Approx(1.65));
  CHECK(plan.late_source == bine::LateSource::recipe_oil);
  // No late additions in the recipe: our default 4 g/L x 20 L = 80 g.
  choices.keep_recipe_oil = false;
  bine::Recipe boil_only = recipe;
  boil_only.hops[0].use = bine::HopUse::boil;
  boil_only.hops[0].minutes = 60.0;
  boil_only.hops[0].temperature_c.reset();
  boil_only.hops.pop_back();
  choices.no_bittering = false;
  plan = bine::plan_blend(&boil_only, catalog, nullptr, choices, {});
  CHECK(plan.late.total == doctest::Approx(80.0));
  CHECK(plan.late_source == bine::LateSource::default_rate);
}

TEST_CASE("plan errors name the recipe field or the variety as the caller named it, with remedies") {
  bine::Catalog catalog;
  bine::Variety variety;
  variety.name = "Nalpha";  // no alpha acid range
  catalog.varieties.push_back(variety);
  bine::BlendChoices choices;
  SUBCASE("a recipe with no boil addition and no bittering variety") {
    const bine::Recipe recipe = late_only_recipe();
    try {
      bine::plan_blend(&recipe, catalog, nullptr, choices, {});
      FAIL("plan_blend returned a plan");
    } catch (const bine::InputError& e) {
      CHECK(e.lines().at(0) == "late.json: /hops: no boil addition to use as the bittering charge");
      CHECK(has(e.remedies(), bine::Remedy::name_bittering_variety));
      CHECK(has(e.remedies(), bine::Remedy::no_bittering));
    }
  }
  SUBCASE("a named bittering variety without alpha acid") {
    choices.bittering = {"Nalpha", "the given label"};
    choices.volume_l = 20.0;
    choices.ibu = 30.0;
    try {
      bine::plan_blend(nullptr, catalog, nullptr, choices, {});
      FAIL("plan_blend returned a plan");
    } catch (const bine::InputError& e) {
      CHECK(e.lines().at(0) == "the given label: Nalpha: no alpha acid known");
      CHECK(has(e.remedies(), bine::Remedy::add_alpha_acid));
    }
  }
}
