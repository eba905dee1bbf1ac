#pragma once
// Putting a substitute into a recipe: every addition of the missing variety is replaced by the
// substitute, or by a pair of substitutes in their shares by weight. Whirlpool and dry-hop additions
// take the oil factor (the oil they deliver holds), boil and first-wort additions the alpha factor
// (their IBU holds), and the recipe's bittering charge absorbs what the late additions change, so
// total IBU holds (docs/methods.md#swap-into-recipe). It is a rebalance in which the new lot is of
// another variety.
#include <string_view>
#include <vector>

#include "engine/rebalance.hpp"

namespace bine {

/// One hop that goes in the missing variety's place: a catalog variety or a lot on hand, with its
/// alpha on brew day, oil and form in a ReplacementLot.
struct SwapIn {
  ReplacementLot hop;
  double share = 1.0;  // share by weight of the missing variety's grams (1 for a single substitute)
};

/// The recipe with `missing` swapped out, split per substitute, and the result of holding its IBU.
struct RecipeSwap {
  Recipe split;  // the recipe with each addition of `missing` split by the shares (still `missing`)
  RebalanceResult result;
};

/// Swaps `swap_in` (one or two hops) into `recipe` in place of `missing`. Throws InputError when the
/// recipe does not use `missing`, Infeasible when the IBU cannot be held.
RecipeSwap swap_into_recipe(const Recipe& recipe, std::string_view missing, const std::vector<SwapIn>& swap_in,
                            const Catalog& catalog, const BitternessSettings& settings, Weighing weighing);

}  // namespace bine
