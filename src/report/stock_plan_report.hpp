#pragma once
// Rendering a stock plan (bine stock plan, engine/stock_plan.hpp) as text or JSON: each brew with
// what it takes from which lot and what it lacks, what to buy per variety and by when, and the lots
// that turn stale while they still hold hops.
#include <nlohmann/json.hpp>
#include <ostream>
#include <string>

#include "engine/stock_plan.hpp"
#include "model/quantity.hpp"

namespace bine {

/// Where the plan came from, for its heading.
struct PlanSource {
  std::string schedule_file;
  std::string stock_file;
  double stale_below = 0.75;
};

void render_stock_plan(std::ostream& out, const StockPlan& plan, const PlanSource& source, UnitSystem units);

/// Canonical units (g), grams to 0.01 g; deterministic.
nlohmann::json stock_plan_to_json(const StockPlan& plan, const PlanSource& source);

}  // namespace bine
