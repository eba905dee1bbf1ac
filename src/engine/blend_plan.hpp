#pragma once
// What a blend keeps from a recipe and what it replaces: the wort, the IBU to hold, the boil
// additions kept, the bittering charge re-solved, the whirlpool/dry-hop split; and the recipe
// rewritten with the blend (for --write).
#include <optional>
#include <string>
#include <vector>

#include "engine/bitterness.hpp"
#include "engine/blend.hpp"
#include "model/hops.hpp"

namespace bine {

/// Choices the brewer made on the command line that override or stand in for the recipe.
struct BlendChoices {
  std::optional<double> ibu;       // --ibu
  std::string bittering_variety;   // --bittering
  bool no_bittering = false;       // --no-bittering
  std::optional<double> split;     // --split
  std::optional<double> volume_l;  // --volume (no recipe)
  std::optional<double> gravity;   // --gravity (no recipe)
};

struct BlendPlan {
  WortContext wort;
  double target_ibu = 0.0;
  std::string target_ibu_source;  // "recipe target_ibu", "recipe's current total", "--ibu"
  double kept_ibu = 0.0;
  std::vector<std::size_t> kept;  // recipe additions kept (boil and first-wort, not bittering)
  std::optional<BitteringHop> bittering;
  std::optional<std::size_t> bittering_index;  // the recipe addition the charge replaces
  double whirlpool_share = 0.3;
  double whirlpool_temperature_c = 80.0;
  double whirlpool_minutes = 20.0;
  std::optional<double> dry_hop_minutes;
  std::vector<std::string> notes;
};

/// The alpha acid of a recipe addition: its own value, else its lot's or the first lot of its variety
/// in stock, else the catalog midpoint. nullopt when none is known.
std::optional<double> addition_alpha(const HopAddition& hop, const Catalog& catalog, const Stock* stock);

/// Plans a blend for `recipe` (or, without one, for the wort the choices describe). Throws
/// InputError naming the recipe field or option when something needed is missing.
BlendPlan plan_blend(const Recipe* recipe, const Catalog& catalog, const Stock* stock, const BlendChoices& choices,
                     const BitternessSettings& settings);

/// The recipe with its late additions replaced by the blend and the bittering charge re-solved.
Recipe blended_recipe(const Recipe& recipe, const BlendPlan& plan, const BlendResult& result);

}  // namespace bine
