#pragma once
// Rendering `bine swap VARIETY --recipe FILE`: which substitute went in and why, the additions
// before and after (the rebalance table), and each listed lot against what the recipe needs.
#include <nlohmann/json.hpp>
#include <optional>
#include <ostream>
#include <string>
#include <vector>

#include "engine/recipe_swap.hpp"
#include "model/quantity.hpp"

namespace bine {

/// One listed substitute against the recipe: the grams the swap would take from its lot.
struct LotCoverage {
  std::string name;  // "Sallowmere (SW-1)"
  double needed_g = 0.0;
  std::optional<double> on_hand_g;  // nullopt for a catalog variety (not from stock)
};

struct RecipeSwapReport {
  RecipeSwap swap;
  std::string missing;
  std::vector<SwapIn> swapped_in;
  std::string choice;  // why this substitute: "--pick 2", "the best-ranked substitute whose lot covers ..."
  std::vector<LotCoverage> coverage;
  bool from_stock = false;
  std::string written;                          // the file written with --write, if any
  std::optional<RebalanceIntervals> intervals;  // the 90 % intervals of its IBU, when shown
};

void render_recipe_swap(std::ostream& out, const RecipeSwapReport& report, UnitSystem units);
/// Keys: recipe, missing, swapped_in (variety, lot, share, alpha_acid, total_oil), choice, coverage
/// (substitute, needed_g, on_hand_g, covers), written, brewhouse (the profile used, or null), and the rebalance keys
/// (additions, total_ibu_before, total_ibu_after, absorbed_by, ibu_change_absorbed, whirlpool_scaled, shortfalls).
nlohmann::json recipe_swap_to_json(const RecipeSwapReport& report);

}  // namespace bine
