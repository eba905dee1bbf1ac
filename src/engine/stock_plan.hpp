#pragma once
// Planning ahead from the cold store (`bine stock plan`): the brews of a schedule walked in date
// order, every lot aged to each brew's day (engine/cellar), each brew's hops drawn by the one lot
// allocation `stock use` takes them by (engine/stock_rebalance), and what the stock lacks and which
// lots turn stale before they are used. Nothing is written: the walk draws from a copy of the stock.
// Method: docs/methods.md#stock-plan.
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "engine/bitterness.hpp"
#include "engine/cellar.hpp"
#include "model/hops.hpp"

namespace bine {

/// One brew to plan: a recipe (already read), its day and batches.
struct PlannedBrew {
  Recipe recipe;
  std::string recipe_file;  // for output
  Date on{};
  std::size_t batches = 1;
};

/// What one brew takes from one lot, or lacks of one variety.
struct PlanDraw {
  std::string lot;  // empty for a shortage of a variety no usable lot serves
  std::string variety;
  double grams = 0.0;  // every batch together
};

/// One brew of the walk.
struct PlanStep {
  PlannedBrew brew;
  std::vector<PlanDraw> taken;     // per lot, in the order first used (grams the lot really has)
  std::vector<PlanDraw> short_of;  // per variety: grams the stock lacks for this brew
  std::vector<std::string> notes;  // the allocation's notes on this day (stale lots left out ...)
};

/// What to buy of one variety over the whole schedule.
struct PlanShortage {
  std::string variety;
  double grams = 0.0;  // over every brew that runs short of it
  Date by{};           // the day of the first brew that runs short
  std::string first_recipe;
};

/// A lot that turns stale while it still holds hops.
struct PlanStaleLot {
  std::string lot;
  std::string variety;
  std::optional<Date> stale_from;  // the day its alpha falls below the stale share (aged lots)
  Date stale_on_brew{};            // the day of the first brew on which it is stale
  double grams_left = 0.0;         // what it still holds then
  std::string wanted_by;           // the first brew from then on that asks for its variety, else empty
  std::optional<Date> wanted_on;   // that brew's day
  bool taken_stale = false;        // that brew took it all the same (stale lots allowed)
  std::string reason;              // the cellar's stale reason on that day
};

struct StockPlan {
  std::vector<PlanStep> steps;          // in date order (brews on one day in schedule order)
  std::vector<PlanShortage> shortages;  // in order of first shortage
  std::vector<PlanStaleLot> stale;      // in order of the day found
  std::vector<double> left_g;           // per stock lot, after the last brew (NaN: no amount given)
};

/// Walks `brews` (any order) through a copy of `stock`. Throws what age_cellar and
/// rebalance_from_stock throw (a lot packaged after a brew day, an unknown variety or lot).
StockPlan plan_stock(const Stock& stock, const Catalog& catalog, std::vector<PlannedBrew> brews,
                     const CellarSettings& cellar, const BitternessSettings& bitterness);

}  // namespace bine
