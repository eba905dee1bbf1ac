// Swapping a substitute into a recipe (docs/methods.md#swap-into-recipe). Each addition of the
// missing variety is split by the substitutes' shares by weight (one substitute: share 1), then
// rebalanced with each part's substitute as its new lot: the rebalance rules give late additions
// grams x O_missing / O_substitute (oil delivered holds; O_missing is the addition's recorded oil,
// else the catalog midpoint) and boil additions grams x (A f)_missing / (A f)_substitute (IBU holds),
// and the largest boil addition absorbs the late additions' IBU change, so total IBU holds. A pair
// thus gets, per gram of the missing variety, share x factor grams of each hop.
#include "engine/recipe_swap.hpp"

#include <fmt/format.h>

#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {

RecipeSwap swap_into_recipe(const Recipe& recipe, std::string_view missing, const std::vector<SwapIn>& swap_in,
                            const Catalog& catalog, const BitternessSettings& settings, Weighing weighing) {
  if (!recipe_uses_variety(recipe, missing))
    throw InputError(fmt::format("{}: /hops: the recipe does not use \"{}\" (nothing to swap)", recipe.source_file,
                                 std::string(missing)));
  RecipeSwap swap;
  swap.split = recipe;
  swap.split.hops.clear();
  std::vector<const ReplacementLot*> lot_of;
  const std::string wanted = fold_name(missing);
  for (const auto& hop : recipe.hops) {
    if (hop.variety.empty() || fold_name(hop.variety) != wanted) {
      swap.split.hops.push_back(hop);
      lot_of.push_back(nullptr);
      continue;
    }
    for (const auto& part : swap_in) {
      HopAddition share = hop;
      share.grams = hop.grams * part.share;
      swap.split.hops.push_back(share);
      lot_of.push_back(&part.hop);
    }
  }
  swap.result = rebalance_additions(swap.split, lot_of, catalog, settings, weighing);
  return swap;
}

}  // namespace bine
