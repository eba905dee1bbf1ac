#pragma once
// Rebalancing a recipe to the lots of a cold store: the lots chosen by the one allocation rule
// (engine/lot_allocation.hpp), a split addition rebalanced part by part, and the lots and grams
// every addition is weighed from. `rebalance --stock`, `stock use` and `stock plan` all go through
// here, so they weigh out the same grams from the same lots.
#include <string>
#include <vector>

#include "engine/lot_allocation.hpp"
#include "engine/rebalance.hpp"

namespace bine {

/// One lot's draw by a recipe, over every batch.
struct LotDraw {
  std::size_t lot = 0;  // index into Cellar::lots
  std::string code;
  std::string variety;
  double grams = 0.0;      // drawn for every batch together
  double on_hand_g = 0.0;  // what it has (infinity when the stock gives no amount)
};

struct StockRebalance {
  RebalanceResult result;            // rows per addition part, rows' `index` into the recipe as written
  std::vector<ReplacementLot> lots;  // every lot drawn on, in the order first used
  LotAllocation allocation;
  std::vector<LotDraw> draws;  // per lot, in the order first used
  Recipe recipe;               // the recipe with its named lots looked up (the rows refer to it)
  double batches = 1.0;
};

/// What one gram of `lot` gives of what `hop` must deliver, and how much that is (docs/methods.md#lot-choice):
/// a boil addition its IBU through the bitterness engine (alpha x form factor at 0 minutes, where
/// Tinseth gives none), a late addition the oil it delivers (grams where its oil is not known).
std::vector<LotDemand> rebalance_demands(const Recipe& recipe, const RecipeBitterness& as_written,
                                         const Catalog& catalog, const BitternessSettings& settings);

/// Rebalances `recipe` to the cellar's lots for `batches` batches (lots chosen as the cellar's
/// settings say). Throws Infeasible when a lot drawn on has aged below any hop's alpha.
StockRebalance rebalance_from_stock(const Recipe& recipe, const Cellar& cellar, const Catalog& catalog,
                                    const BitternessSettings& settings, Weighing weighing, double batches = 1.0);

}  // namespace bine
