// Bitterness models against the published formulas and the check values of docs/methods.md
// ("Check values", derived with double precision from the cited formulas).
#include "engine/bitterness.hpp"

#include <doctest/doctest.h>

#include "engine/recipe_bitterness.hpp"
#include "model/errors.hpp"

namespace {

using bine::HopAddition;
using bine::HopForm;
using bine::HopUse;

HopAddition boil(double grams, double minutes, HopForm form = HopForm::whole) {
  HopAddition hop;
  hop.variety = "Test";
  hop.grams = grams;
  hop.use = HopUse::boil;
  hop.minutes = minutes;
  hop.form = form;
  return hop;
}

HopAddition whirlpool(double grams, double minutes, double celsius) {
  HopAddition hop = boil(grams, minutes);
  hop.use = HopUse::whirlpool;
  hop.temperature_c = celsius;
  return hop;
}

bine::WortContext wort(double gravity, double volume = 20.0) {
  bine::WortContext w;
  w.volume_l = volume;
  w.gravity = gravity;
  w.boil_minutes = 60.0;
  return w;
}

}  // namespace

TEST_CASE("Tinseth utilization matches the docs/methods.md check values") {
  // Tinseth G., ca. 1997: B = 1.65 x 0.000125^(G-1), F = (1 - e^(-0.04 t)) / 4.15.
  CHECK(bine::tinseth_gravity_factor(1.050) == doctest::Approx(1.0528).epsilon(1e-4));
  CHECK(bine::tinseth_time_factor(60) == doctest::Approx(0.2191).epsilon(1e-3));
  CHECK(bine::tinseth_utilization(1.050, 60) == doctest::Approx(0.2307).epsilon(2e-4));
  CHECK(bine::tinseth_utilization(1.050, 15) == doctest::Approx(0.1145).epsilon(5e-4));
  CHECK(bine::tinseth_utilization(1.050, 5) == doctest::Approx(0.0460).epsilon(1e-3));
  CHECK(bine::tinseth_utilization(1.080, 60) == doctest::Approx(0.1762).epsilon(5e-4));
  CHECK(bine::tinseth_utilization(1.080, 15) == doctest::Approx(0.0874).epsilon(5e-4));
  // t -> infinity: B(1.050) / 4.15 = 0.2537.
  CHECK(bine::tinseth_utilization(1.050, 1e6) == doctest::Approx(0.2537).epsilon(2e-4));
  CHECK(bine::tinseth_utilization(1.050, 0) == 0.0);
}

TEST_CASE("28 g whole cone at 10 % for 60 min in 20 L at 1.050 gives 32.3 IBU (Tinseth, docs/methods.md)") {
  const auto result = bine::addition_bitterness(boil(28, 60), 10.0, wort(1.050), {});
  // mg/L = 0.10 x 28 x 1000 / 20 = 140; 140 x 0.2307 = 32.3.
  CHECK(bine::alpha_mg_per_litre(28, 10, 20) == doctest::Approx(140.0));
  CHECK(result.ibu == doctest::Approx(32.3).epsilon(1e-3));
  CHECK(result.effective_minutes == 60.0);
}

TEST_CASE("1 oz per US gallon is 7489.15 mg/L of alpha at 100 % (derived, docs/methods.md)") {
  // 28.349523125 g x 1000 / 3.785411784 L = 7489.15 mg/L.
  CHECK(bine::alpha_mg_per_litre(28.349523125, 100.0, 3.785411784) == doctest::Approx(7489.15).epsilon(1e-6));
}

TEST_CASE("Rager gravity adjustment and tanh fit match docs/methods.md") {
  // Rager 1990: GA = (G - 1.050) / 0.2 above 1.050.
  CHECK(bine::rager_gravity_adjustment(1.045) == 0.0);
  CHECK(bine::rager_gravity_adjustment(1.070) == doctest::Approx(0.100));
  CHECK(bine::rager_gravity_adjustment(1.096) == doctest::Approx(0.230));
  // Fit of Rager's table (from memory, Hall 1997): U% = 18.11 + 13.86 tanh((t - 31.32) / 18.27).
  CHECK(bine::rager_utilization(0) == doctest::Approx(0.0512).epsilon(1e-3));
  CHECK(bine::rager_utilization(15) == doctest::Approx(0.0823).epsilon(1e-3));
  CHECK(bine::rager_utilization(60) == doctest::Approx(0.3082).epsilon(1e-3));
}

TEST_CASE("Rager IBU divides by 1 + GA") {
  bine::BitternessSettings rager;
  rager.model = bine::IbuModel::rager;
  // Hand arithmetic: 28 g, 10 %, 60 min, 20 L, 1.070, whole: 0.30820 x 140 / 1.1 = 39.225 IBU.
  const auto result = bine::addition_bitterness(boil(28, 60), 10.0, wort(1.070), rager);
  CHECK(result.ibu == doctest::Approx(39.225).epsilon(1e-4));
}

TEST_CASE("isomerisation rate and boil-equivalent minutes (Malowicki & Shellhammer 2005)") {
  // k1 = 7.9e11 exp(-11858 / T): 0.01249 per min at 100 C (docs/methods.md check value).
  CHECK(bine::isomerization_rate(100) == doctest::Approx(0.01249).epsilon(1e-3));
  // Ratios k1(T) / k1(100 C), docs/methods.md (derived): 95 C 0.650 ... 70 C 0.062.
  CHECK(bine::relative_isomerization_rate(95) == doctest::Approx(0.650).epsilon(2e-3));
  CHECK(bine::relative_isomerization_rate(90) == doctest::Approx(0.417).epsilon(2e-3));
  CHECK(bine::relative_isomerization_rate(85) == doctest::Approx(0.264).epsilon(2e-3));
  CHECK(bine::relative_isomerization_rate(80) == doctest::Approx(0.165).epsilon(3e-3));
  CHECK(bine::relative_isomerization_rate(75) == doctest::Approx(0.102).epsilon(5e-3));
  CHECK(bine::relative_isomerization_rate(70) == doctest::Approx(0.062).epsilon(5e-3));
  CHECK(bine::relative_isomerization_rate(100) == doctest::Approx(1.0));
}

TEST_CASE("a 20 min stand at 80 C added at flame-out: t_eq 3.31 min, U 0.0314 (docs/methods.md)") {
  const auto hop = whirlpool(100, 20, 80);
  const auto result = bine::addition_bitterness(hop, 10.0, wort(1.050), {});
  CHECK(result.effective_minutes == doctest::Approx(3.31).epsilon(2e-3));
  CHECK(result.utilization == doctest::Approx(0.0314).epsilon(3e-3));
}

TEST_CASE("a whirlpool at 100 C equals a boil addition of the same minutes") {
  for (double minutes : {5.0, 20.0, 45.0}) {
    const auto w = bine::addition_bitterness(whirlpool(50, minutes, 100), 8.0, wort(1.060), {});
    const auto b = bine::addition_bitterness(boil(50, minutes), 8.0, wort(1.060), {});
    CHECK(w.ibu == doctest::Approx(b.ibu).epsilon(1e-12));
  }
}

TEST_CASE("IBU is linear in amount and in alpha") {
  for (auto model : {bine::IbuModel::tinseth, bine::IbuModel::rager}) {
    bine::BitternessSettings settings;
    settings.model = model;
    const double base = bine::addition_bitterness(boil(20, 45), 6.0, wort(1.065), settings).ibu;
    CHECK(base > 0.0);
    CHECK(bine::addition_bitterness(boil(60, 45), 6.0, wort(1.065), settings).ibu == doctest::Approx(3.0 * base));
    CHECK(bine::addition_bitterness(boil(20, 45), 15.0, wort(1.065), settings).ibu == doctest::Approx(2.5 * base));
    CHECK(bine::addition_bitterness(boil(10, 45), 12.0, wort(1.065), settings).ibu == doctest::Approx(base));
  }
}

TEST_CASE("pellet factor 1.10 (common practice) and the calibration factor multiply utilization") {
  const double whole = bine::addition_bitterness(boil(28, 60, HopForm::whole), 10, wort(1.050), {}).ibu;
  CHECK(bine::addition_bitterness(boil(28, 60, HopForm::pellet), 10, wort(1.050), {}).ibu ==
        doctest::Approx(1.10 * whole));
  CHECK(bine::addition_bitterness(boil(28, 60, HopForm::powder), 10, wort(1.050), {}).ibu ==
        doctest::Approx(1.10 * whole));
  HopAddition no_form = boil(28, 60);
  no_form.form.reset();  // pellet assumed
  CHECK(bine::addition_bitterness(no_form, 10, wort(1.050), {}).ibu == doctest::Approx(1.10 * whole));
  bine::BitternessSettings calibrated;
  calibrated.calibration = 0.8;
  CHECK(bine::addition_bitterness(boil(28, 60, HopForm::whole), 10, wort(1.050), calibrated).ibu ==
        doctest::Approx(0.8 * whole));
}

TEST_CASE("first-wort counts the full boil, dry hops add nothing, a hop stand extends boil additions") {
  HopAddition first_wort = boil(28, 0);
  first_wort.use = HopUse::first_wort;
  first_wort.minutes.reset();
  const double full = bine::addition_bitterness(boil(28, 60), 10, wort(1.050), {}).ibu;
  CHECK(bine::addition_bitterness(first_wort, 10, wort(1.050), {}).ibu == doctest::Approx(full));
  HopAddition dry = boil(100, 4 * 1440);
  dry.use = HopUse::dry_hop;
  CHECK(bine::addition_bitterness(dry, 10, wort(1.050), {}).ibu == 0.0);

  // Recipe with a 20 min stand at 80 C: a 10 min boil addition counts 10 + 3.31 min.
  bine::Recipe recipe;
  recipe.batch_volume_l = 20;
  recipe.original_gravity = 1.050;
  recipe.boil_minutes = 60;
  recipe.hop_stand = bine::HopStand{20, 80};
  const auto w = bine::wort_of(recipe);
  CHECK(w.stand_equivalent_minutes == doctest::Approx(3.31).epsilon(2e-3));
  const auto late = bine::addition_bitterness(boil(28, 10), 10, w, {});
  CHECK(late.effective_minutes == doctest::Approx(13.31).epsilon(1e-3));
  CHECK(late.ibu ==
        doctest::Approx(bine::addition_bitterness(boil(28, 13.307), 10, wort(1.050), {}).ibu).epsilon(1e-3));
}

TEST_CASE("BU:GU = IBU / gravity units, with the common-practice reading") {
  // docs/methods.md: 40 IBU at 1.050 -> 0.80.
  CHECK(bine::bu_gu_ratio(40, 1.050) == doctest::Approx(0.80));
  CHECK(bine::bu_gu_reading(0.80) == "very bitter");
  CHECK(bine::bu_gu_reading(0.55) == "balanced");
  CHECK(bine::bu_gu_reading(0.2) == "sweet (malt-forward)");
  CHECK(bine::bu_gu_ratio(40, 1.000) == 0.0);
}

TEST_CASE("recipe_bitterness sums additions, takes catalog midpoints and names missing alpha") {
  bine::Catalog catalog;
  bine::Variety variety;
  variety.name = "Midpoint";
  variety.alpha_acid = bine::Range{8.0, 12.0};
  catalog.varieties.push_back(variety);
  bine::Recipe recipe;
  recipe.source_file = "r.json";
  recipe.batch_volume_l = 20;
  recipe.original_gravity = 1.050;
  recipe.boil_minutes = 60;
  HopAddition a = boil(28, 60);
  a.variety = "midpoint";  // folded match; alpha from the catalog midpoint, 10 %
  recipe.hops.push_back(a);
  HopAddition b = boil(28, 60);
  b.alpha_acid = 10.0;
  recipe.hops.push_back(b);
  const auto result = bine::recipe_bitterness(recipe, catalog, {});
  // Two identical 32.3 IBU additions (docs/methods.md check value) -> 64.6 IBU.
  CHECK(result.total_ibu == doctest::Approx(64.6).epsilon(1e-3));
  CHECK(result.additions[0].alpha_source == bine::AlphaSource::catalog_midpoint);
  CHECK(result.bu_gu == doctest::Approx(result.total_ibu / 50.0));

  recipe.hops[0].variety = "Unknown";
  try {
    bine::recipe_bitterness(recipe, catalog, {});
    FAIL("expected InputError");
  } catch (const bine::InputError& e) {
    CHECK(e.lines().at(0).find("r.json: /hops/0/alpha_acid") == 0);
  }
}
