#pragma once
// Rendering a rebalance (bine rebalance): the lots used, a before/after table, which addition took
// the IBU change, stock shortfalls; text or JSON.
#include <cstddef>
#include <nlohmann/json.hpp>
#include <ostream>
#include <vector>

#include "engine/rebalance.hpp"
#include "model/quantity.hpp"

namespace bine {

/// What the rebalance was asked: the lots, where they came from, and the brew day.
struct RebalanceContext {
  std::vector<ReplacementLot> lots;
  bool from_stock = false;
  Date on;
  bool on_from_clock = false;                     // --on not given: today's date from the system clock
  const RebalanceIntervals* intervals = nullptr;  // the 90 % intervals, when shown
};

/// An addition a stock rebalance split across lots, its parts together.
struct SplitAddition {
  std::size_t index = 0;  // the addition of the recipe as written
  std::size_t parts = 0;
  double ibu_before = 0.0;           // its parts' IBU summed, as written
  double ibu_after = 0.0;            // and as rebalanced
  const IbuRange* before = nullptr;  // their 90 % intervals, when shown
  const IbuRange* after = nullptr;
};
/// " (38.9 IBU as written: weighing the amounts to 0.1 g moves the total by -0.03 IBU)" when the
/// held total, as printed, differs from the total as written; empty when they print alike.
std::string weighing_note(const RebalanceResult& result);

/// The split additions of `result` in recipe order (none unless a stock rebalance split one).
std::vector<SplitAddition> split_additions(const RebalanceResult& result, const RebalanceIntervals* intervals);

/// The before/after table of the additions, the sentence on who took the IBU change, and the stock
/// shortfalls ("Stock covers every addition." when `from_stock` and none); shared with swap --recipe.
/// With `intervals`, every IBU carries its 90 % interval.
void render_rebalance_changes(std::ostream& out, const Recipe& recipe, const RebalanceResult& result, bool from_stock,
                              UnitSystem units, const RebalanceIntervals* intervals = nullptr);
/// The additions, totals, absorber and shortfalls as JSON (the keys rebalance --json documents), and
/// split_additions (each split addition's parts together); with `intervals`, KEY_low and KEY_high beside
/// each IBU and an "interval" object.
nlohmann::json rebalance_changes_json(const RebalanceResult& result, const RebalanceIntervals* intervals = nullptr);

void render_rebalance(std::ostream& out, const Recipe& recipe, const RebalanceContext& context,
                      const RebalanceResult& result, UnitSystem units);
nlohmann::json rebalance_to_json(const Recipe& recipe, const RebalanceContext& context, const RebalanceResult& result);

}  // namespace bine
