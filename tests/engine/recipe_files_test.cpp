// Recipe files bine writes are read back as written: 300 random recipes in random notations (g, kg,
// oz, lb; L, hL, gal, bbl; SG or Plato; C or F) go through rebalance, blend and swap as the commands run
// them (amounts as weighed), are written with recipe_to_json and read again with parse_recipe. Every
// written file must load (one set of bounds for writer and loader), and its total IBU, recomputed by
// the bitterness engine from the file, must be the total bine reported within 0.05 IBU. The recipes
// are random inputs, not check values; the property is that the file and the report agree.
#include <doctest/doctest.h>
#include <fmt/format.h>

#include <cmath>
#include <filesystem>
#include <random>
#include <string>
#include <vector>

#include "engine/aroma_profile.hpp"
#include "engine/blend.hpp"
#include "engine/blend_plan.hpp"
#include "engine/rebalance.hpp"
#include "engine/recipe_bitterness.hpp"
#include "engine/recipe_swap.hpp"
#include "io/loaders.hpp"
#include "model/errors.hpp"

namespace {

using nlohmann::json;

struct Data {
  bine::Lexicon lexicon;
  bine::Catalog catalog;
};

const Data& data() {
  static const Data loaded = [] {
    const std::filesystem::path folder = BINE_SOURCE_DATA_DIR;
    Data d{bine::load_lexicon(folder / "lexicon.json"), {}};
    d.catalog = bine::load_catalog(folder / "catalog" / "demo.json", d.lexicon);
    return d;
  }();
  return loaded;
}

/// A random recipe as a brewer's JSON file: 1-2 boil additions, 0-2 whirlpool, 0-2 dry hop, random units.
std::string random_recipe(std::mt19937& random) {
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  const auto pick = [&](std::initializer_list<const char*> list) {
    return std::string(*(list.begin() + static_cast<long>(unit(random) * static_cast<double>(list.size()) * 0.999)));
  };
  const auto& varieties = data().catalog.varieties;
  const auto variety = [&] {
    return varieties[static_cast<std::size_t>(unit(random) * static_cast<double>(varieties.size()) * 0.999)].name;
  };
  const double litres = 10.0 + 3000.0 * unit(random) * unit(random);
  const std::string volume_unit = pick({"L", "hL", "gal", "bbl"});
  const double volume = volume_unit == "L"     ? litres
                        : volume_unit == "hL"  ? litres / 100.0
                        : volume_unit == "gal" ? litres / 3.785411784
                                               : litres / 117.347765304;
  const std::string mass_unit = pick({"g", "kg", "oz", "lb"});
  const double per_unit = mass_unit == "g"    ? 1.0
                          : mass_unit == "kg" ? 1000.0
                          : mass_unit == "oz" ? 28.349523125
                                              : 453.59237;
  const bool fahrenheit = unit(random) < 0.5;
  const double sg = 1.035 + 0.05 * unit(random);
  json recipe;
  recipe["name"] = "random";
  recipe["batch_volume"] = fmt::format("{:.2f} {}", volume, volume_unit);
  recipe["original_gravity"] =
      unit(random) < 0.5 ? fmt::format("{:.3f}", sg) : fmt::format("{:.1f} P", 260.0 * (sg - 1.0));
  recipe["boil_time"] = "60 min";
  const auto amount = [&](double grams_per_litre) {
    return fmt::format("{:.2f} {}", grams_per_litre * litres / per_unit, mass_unit);
  };
  json hops = json::array();
  const int boil = 1 + static_cast<int>(unit(random) * 1.999);
  for (int i = 0; i < boil; ++i)
    hops.push_back({{"variety", variety()},
                    {"amount", amount(0.2 + 1.2 * unit(random))},
                    {"alpha_acid", std::round(300.0 + 1200.0 * unit(random)) / 100.0},
                    {"use", "boil"},
                    {"time", fmt::format("{:.0f} min", i == 0 ? 60.0 : 60.0 * unit(random))}});
  for (int i = 0; i < static_cast<int>(unit(random) * 2.999); ++i)
    hops.push_back({{"variety", variety()},
                    {"amount", amount(0.5 + 2.5 * unit(random))},
                    {"alpha_acid", std::round(300.0 + 1200.0 * unit(random)) / 100.0},
                    {"use", "whirlpool"},
                    {"time", "20 min"},
                    {"temperature", fahrenheit ? "176 F" : "80 C"}});
  for (int i = 0; i < static_cast<int>(unit(random) * 2.999); ++i)
    hops.push_back(
        {{"variety", variety()}, {"amount", amount(1.0 + 5.0 * unit(random))}, {"use", "dry-hop"}, {"time", "3 d"}});
  recipe["hops"] = hops;
  return recipe.dump(2);
}

/// Writes and reads back; the loader must accept it.
bine::Recipe written_and_read(const bine::Recipe& recipe) {
  const std::string text = bine::recipe_to_json(recipe).dump(2);
  INFO(text);
  bine::Recipe read;
  REQUIRE_NOTHROW(read = bine::parse_recipe(text, "written.json"));
  return read;
}

double total_ibu(const bine::Recipe& recipe) {
  return bine::recipe_bitterness(recipe, data().catalog, bine::BitternessSettings{}).total_ibu;
}

/// New lots for every variety the recipe uses: alpha 3-16 %, oil 0.5-3 mL/100 g.
std::vector<bine::ReplacementLot> random_lots(const bine::Recipe& recipe, std::mt19937& random) {
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  std::vector<bine::ReplacementLot> lots;
  for (const auto& hop : recipe.hops) {
    bool seen = false;
    for (const auto& lot : lots) seen = seen || lot.variety == hop.variety;
    if (seen) continue;
    bine::ReplacementLot lot;
    lot.variety = hop.variety;
    lot.alpha_percent = 3.0 + 13.0 * unit(random);
    lot.total_oil = 0.5 + 2.5 * unit(random);
    lots.push_back(lot);
  }
  return lots;
}

/// The blend the command designs for `recipe` (catalog candidates, the recipe's own late amount).
std::optional<bine::BlendResult> blend_for(const bine::Recipe& recipe, bine::BlendRequest& request,
                                           std::mt19937& random) {
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  const auto& lexicon = data().lexicon;
  Eigen::VectorXd intensity = Eigen::VectorXd::Zero(static_cast<Eigen::Index>(lexicon.axes().size()));
  std::vector<bool> named(lexicon.axes().size(), false);
  const auto axis = static_cast<std::size_t>(unit(random) * static_cast<double>(named.size()) * 0.999);
  intensity[static_cast<Eigen::Index>(axis)] = 4.0;
  named[axis] = true;
  request.target = bine::target_from_spec(intensity, named, 0.25);
  request.candidates = bine::blend_candidates(data().catalog, lexicon, nullptr, "").candidates;
  request.plan = bine::plan_blend(&recipe, data().catalog, nullptr, bine::BlendChoices{}, bine::BitternessSettings{});
  request.weighed = true;
  try {
    return bine::design_blend(request);
  } catch (const bine::Infeasible&) {
    return std::nullopt;  // the random recipe's IBU cannot be held with these late hops
  }
}

/// A random catalog variety with alpha and oil, as the hop swapped in for the recipe's first variety.
bine::SwapIn random_substitute(std::mt19937& random) {
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  const auto& varieties = data().catalog.varieties;
  for (;;) {
    const auto& v = varieties[static_cast<std::size_t>(unit(random) * static_cast<double>(varieties.size()) * 0.999)];
    if (!v.alpha_acid || !v.total_oil) continue;
    bine::SwapIn in;
    in.hop.variety = v.name;
    in.hop.alpha_percent = v.alpha_acid->mid();
    in.hop.total_oil = v.total_oil->mid();
    return in;
  }
}

}  // namespace

TEST_CASE("300 random recipes through rebalance, blend and swap are written, read back, and hold the reported IBU") {
  std::mt19937 random(20261202);
  int blended = 0;
  for (int n = 0; n < 300; ++n) {
    const std::string text = random_recipe(random);
    INFO(text);
    const bine::Recipe recipe = bine::parse_recipe(text, "random.json");

    // The brewer's own file, written back unchanged, reads back to the same IBU.
    CHECK(std::abs(total_ibu(written_and_read(recipe)) - total_ibu(recipe)) <= 1e-6);

    try {
      const auto rebalanced =
          bine::rebalance(recipe, random_lots(recipe, random), data().catalog, {}, bine::Weighing::as_weighed);
      CHECK(std::abs(total_ibu(written_and_read(rebalanced.recipe_after)) - rebalanced.after.total_ibu) <= 0.05);
    } catch (const bine::Infeasible&) {
      // new late-hop alpha above the whole recipe's IBU: nothing is written
    }

    const bine::SwapIn in = random_substitute(random);
    if (in.hop.variety != recipe.hops[0].variety) {
      try {
        const auto swapped = bine::swap_into_recipe(recipe, recipe.hops[0].variety, {in}, data().catalog, {},
                                                    bine::Weighing::as_weighed);
        CHECK(std::abs(total_ibu(written_and_read(swapped.result.recipe_after)) - swapped.result.after.total_ibu) <=
              0.05);
      } catch (const bine::Infeasible&) {
        // the substitute's late hops alone exceed the recipe's IBU
      }
    }

    bine::BlendRequest request;
    if (const auto result = blend_for(recipe, request, random)) {
      ++blended;
      const bine::Recipe out = bine::blended_recipe(recipe, request.plan, *result);
      CHECK(std::abs(total_ibu(written_and_read(out)) - result->total_ibu) <= 0.05);
    }
  }
  // Most random recipes can be blended; a generator that never reaches the blend would pass vacuously.
  CHECK(blended >= 150);
}
