#pragma once
// Rebalancing a recipe to the lots on the shelf: new alpha (and oil) in, new grams out, with the
// recipe's total IBU held. See rebalance.cpp for the rules.
#include <optional>
#include <string>
#include <vector>

#include "engine/bitterness.hpp"
#include "engine/cellar.hpp"
#include "engine/ibu_interval.hpp"
#include "engine/recipe_bitterness.hpp"
#include "model/hops.hpp"

namespace bine {

/// The lot a variety will be brewed with, as it is on brew day.
struct ReplacementLot {
  std::string variety;              // matched to recipe additions by folded name
  double alpha_percent = 0.0;       // alpha on brew day (aged when from stock)
  std::optional<double> total_oil;  // mL/100 g
  std::optional<HopForm> form;      // the lot's form, when known
  std::string lot_code;             // empty for --lot
  std::optional<double> on_hand_g;
  // How the alpha was obtained (stock lots only).
  std::optional<double> certificate_alpha;
  std::optional<Date> packaged;
  std::optional<Storage> storage;
  long days = 0;
  double remaining = 1.0;
  std::optional<double> stability_percent;
  std::string stability_source;  // "catalog", "fair class assumed, no catalog value"
  std::string alpha_note;        // how the alpha on brew day was obtained (cellar.hpp)
  std::string hsi_note;          // the lot's HSI state in words, if measured
  bool aged = false;             // alpha aged from packaging to the brew day
  bool stale = false;            // allowed in although stale
  std::string stale_reason;
  std::size_t lots_of_variety = 1;  // usable lots of this variety in stock
  std::string chosen;               // why this lot: "named in the recipe", "oldest packaging of 2 lots" ...
  AlphaOrigin alpha_origin;         // how alpha_percent is known (default: a certificate or a value given)
};

/// What happened to one addition.
enum class RebalanceRule { unchanged, holds_ibu, holds_oil, holds_grams, absorbs_ibu, scaled_for_total };
std::string_view to_string(RebalanceRule rule);

struct RebalancedAddition {
  std::size_t index = 0;
  std::string variety;
  std::string variety_after;  // differs from variety when a substitute took the addition's place
  HopUse use = HopUse::boil;
  double grams_before = 0.0;
  double grams_after = 0.0;
  double alpha_before = 0.0;
  double alpha_after = 0.0;
  double ibu_before = 0.0;
  double ibu_after = 0.0;
  std::optional<double> oil_before;  // mL/100 g the recipe was written for (catalog midpoint)
  std::optional<double> oil_after;
  RebalanceRule rule = RebalanceRule::unchanged;
  std::string lot;       // the lot it is weighed from, if known
  std::size_t part = 1;  // a split addition: this row is part `part` of `parts` of addition `index`
  std::size_t parts = 1;
  std::optional<AlphaOrigin> lot_alpha;  // how the new lot's alpha is known; none: kept as written
};

struct Shortfall {
  std::string variety;
  std::string lot;
  double needed_g = 0.0;
  double on_hand_g = 0.0;
};

struct RebalanceResult {
  Recipe recipe_after;  // the recipe to brew (alpha, form, lot and grams updated)
  RecipeBitterness before;
  RecipeBitterness after;
  std::vector<RebalancedAddition> additions;
  std::optional<std::size_t> absorber;  // index into additions of the addition that took the IBU change
  double ibu_change_absorbed = 0.0;     // IBU the absorber (or the scaled whirlpool) had to make up
  bool whirlpool_scaled = false;        // no boil addition: whirlpool additions scaled to hold total IBU
  std::vector<Shortfall> shortfalls;
  // From stock only: what the shortfalls cannot speak for.
  std::vector<std::size_t> without_lot;          // additions (recipe as written) no stock lot was found for
  std::vector<std::string> lots_without_amount;  // lots drawn on whose stock entry gives no amount on hand
  std::vector<std::string> notes;
};

/// The intervals of an addition a stock rebalance split across lots, its parts together.
struct SplitIntervals {
  std::size_t index = 0;  // the addition of the recipe as written
  IbuRange before;        // the addition as written (one alpha)
  IbuRange after;         // the sum of its parts, from the same draws as each part's
};

/// The 90 % intervals of the recipe as written and as rebalanced (docs/methods.md#ibu-intervals).
struct RebalanceIntervals {
  IbuIntervals before;                // one per row of RebalanceResult::additions, and the total
  IbuIntervals after;                 // the same, as rebalanced
  std::vector<SplitIntervals> split;  // one per split addition, in recipe order
};
/// Each addition as written from its alpha as the recipe gives it (catalog midpoints over their range),
/// as rebalanced from its new lot's alpha (`lot_alpha`), with the profile's factor uncertainty. A
/// split addition's parts are one addition as written (each part's interval its share of the
/// addition's) and one term per lot as rebalanced.
RebalanceIntervals rebalance_intervals(const RebalanceResult& result, const Catalog& catalog, double tolerance_percent);

/// True when some addition of `recipe` is of `variety` (folded comparison).
bool recipe_uses_variety(const Recipe& recipe, std::string_view variety);

/// Exact amounts, or rounded as the brewer weighs them in the recipe's units (0.1 g, 1 g, 0.01 oz ...).
enum class Weighing { exact, as_weighed };

/// Rebalances `recipe` to `lots`. Throws Infeasible when the late additions alone would exceed the
/// recipe's total IBU. As weighed, the changed amounts are rounded before the total is held and the
/// absorber once more after, so every figure is that of the recipe as weighed.
RebalanceResult rebalance(const Recipe& recipe, const std::vector<ReplacementLot>& lots, const Catalog& catalog,
                          const BitternessSettings& settings, Weighing weighing = Weighing::exact);

/// The same with the lot of each addition given (`lot_of[i]` for recipe.hops[i]; nullptr keeps the
/// addition as written). A lot of another variety puts that variety in the addition's place.
RebalanceResult rebalance_additions(const Recipe& recipe, const std::vector<const ReplacementLot*>& lot_of,
                                    const Catalog& catalog, const BitternessSettings& settings, Weighing weighing);

/// The oil (mL/100 g) an addition was written for: the recipe's own record, else the catalog
/// midpoint of its variety's total oil (`from_catalog` set then); nullopt when neither is known.
std::optional<double> oil_written_for(const HopAddition& hop, const Catalog& catalog, bool& from_catalog);

/// Stock shortfalls of `rows` (additions of a recipe weighed from `lot_of`), for `batches` batches.
std::vector<Shortfall> shortfalls(const std::vector<RebalancedAddition>& rows,
                                  const std::vector<const ReplacementLot*>& lot_of, double batches = 1.0);

}  // namespace bine
