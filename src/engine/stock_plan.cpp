// The plan walk (docs/methods.md#stock-plan).
//
// Brews are taken in date order (a stable sort: brews on one day keep the schedule's order). For
// each, the stock as the brews before it left it is aged to its day by age_cellar, the one cellar
// every command reads (Garetz first-order loss, docs/methods.md#storage-loss), and its hops are
// drawn by rebalance_from_stock for its batches, exactly as `stock use` would draw them on that day:
// the named lot, else oldest packaging first (or --lot-order), stale lots left out unless allowed,
// an addition split across lots. What a lot has is taken from it (a lot cannot go below 0 g); what
// it lacks is short. An addition no usable lot serves (none of its variety, or all stale) is short
// by its grams as written. Before the draw, every lot still holding hops that the cellar calls
// stale on the brew's day is reported once, with the day its alpha crossed the stale share:
// D = ln(1 / share) / (k x TF x SF) days after packaging (days_to_share, as `stock list` counts).
#include "engine/stock_plan.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>

#include "engine/stock_rebalance.hpp"
#include "engine/stock_view.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

void add_draw(std::vector<PlanDraw>& draws, const std::string& lot, const std::string& variety, double grams) {
  auto it = std::find_if(draws.begin(), draws.end(),
                         [&](const PlanDraw& d) { return d.lot == lot && fold_name(d.variety) == fold_name(variety); });
  if (it == draws.end())
    draws.push_back(PlanDraw{lot, variety, grams});
  else
    it->grams += grams;
}

/// The day a lot's alpha falls below the stale share; nullopt when it is not aged (no alpha, packaging
/// date or storage) or stale for another reason (an oxidised HSI) while its share is still above.
std::optional<Date> stale_from(const CellarLot& c, double stale_below) {
  if (c.basis != AlphaBasis::aged || c.remaining >= stale_below) return std::nullopt;
  const StorageHistory history{*c.lot.alpha_acid, c.stability_percent, *c.lot.storage, 0.0};
  return *c.lot.packaged + std::chrono::days(days_to_share(history, stale_below));
}

bool asks_for(const Recipe& recipe, const std::string& variety) {
  return std::any_of(recipe.hops.begin(), recipe.hops.end(), [&](const HopAddition& hop) {
    return hop.lot.empty() && fold_name(hop.variety) == fold_name(variety);
  });
}

void note_stale(const Cellar& day, const PlannedBrew& brew, std::vector<std::optional<std::size_t>>& reported,
                StockPlan& plan) {
  for (const CellarLot& c : day.lots) {
    if (!c.stale || c.lot.on_hand_g.value_or(0.0) <= 1e-9) continue;
    if (!reported[c.index]) {
      reported[c.index] = plan.stale.size();
      plan.stale.push_back(PlanStaleLot{c.code,
                                        c.lot.variety,
                                        stale_from(c, day.settings.stale_below),
                                        brew.on,
                                        *c.lot.on_hand_g,
                                        {},
                                        std::nullopt,
                                        false,
                                        c.stale_reason});
    }
    PlanStaleLot& found = plan.stale[*reported[c.index]];
    if (found.wanted_by.empty() && asks_for(brew.recipe, c.lot.variety)) {
      found.wanted_by = brew.recipe.name;
      found.wanted_on = brew.on;
      found.taken_stale = day.settings.allow_stale;
    }
  }
}

void add_shortage(StockPlan& plan, const PlannedBrew& brew, const std::string& variety, double grams) {
  auto it = std::find_if(plan.shortages.begin(), plan.shortages.end(),
                         [&](const PlanShortage& s) { return fold_name(s.variety) == fold_name(variety); });
  if (it == plan.shortages.end())
    plan.shortages.push_back(PlanShortage{variety, grams, brew.on, brew.recipe.name});
  else
    it->grams += grams;
}

/// Takes what the brew draws from `left` (never below 0 g) and records what it lacks.
void draw(const StockRebalance& used, Stock& left, PlanStep& step, StockPlan& plan) {
  for (const LotDraw& d : used.draws) {
    std::optional<double>& on_hand = left.lots[d.lot].on_hand_g;
    const double taken = on_hand ? std::min(*on_hand, d.grams) : d.grams;  // no amount: counted as unlimited
    if (taken > 0.0) add_draw(step.taken, d.code, d.variety, taken);
    if (on_hand) *on_hand = std::max(0.0, *on_hand - d.grams);
  }
  const auto batches = static_cast<double>(step.brew.batches);
  for (const Shortfall& s : used.result.shortfalls) add_draw(step.short_of, "", s.variety, s.needed_g - s.on_hand_g);
  for (const std::size_t index : used.result.without_lot) {
    const HopAddition& hop = used.recipe.hops[index];
    add_draw(step.short_of, "", hop.variety, hop.grams * batches);
  }
  for (const PlanDraw& s : step.short_of) add_shortage(plan, step.brew, s.variety, s.grams);
}

}  // namespace

StockPlan plan_stock(const Stock& stock, const Catalog& catalog, std::vector<PlannedBrew> brews,
                     const CellarSettings& cellar, const BitternessSettings& bitterness) {
  std::stable_sort(brews.begin(), brews.end(), [](const PlannedBrew& a, const PlannedBrew& b) { return a.on < b.on; });
  Stock left = stock;
  StockPlan plan;
  std::vector<std::optional<std::size_t>> reported(stock.lots.size());  // index into plan.stale
  for (PlannedBrew& brew : brews) {
    if (brew.recipe.name.empty()) brew.recipe.name = brew.recipe_file;
    const Cellar day = age_cellar(left, catalog, brew.on, cellar);
    note_stale(day, brew, reported, plan);
    const StockRebalance used = rebalance_from_stock(brew.recipe, day, catalog, bitterness, Weighing::as_weighed,
                                                     static_cast<double>(brew.batches));
    PlanStep step{brew, {}, {}, used.result.notes};
    draw(used, left, step, plan);
    plan.steps.push_back(std::move(step));
  }
  for (const Lot& lot : left.lots)
    plan.left_g.push_back(lot.on_hand_g.value_or(std::numeric_limits<double>::quiet_NaN()));
  return plan;
}

}  // namespace bine
