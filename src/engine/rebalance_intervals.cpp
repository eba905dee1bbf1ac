// The 90 % intervals of a rebalanced recipe's IBU (docs/methods.md#ibu-intervals), through the one
// interval engine (ibu_interval.cpp).
//
// As written, each addition is one term: its alpha as the recipe gives it (a catalog midpoint over
// the variety's range, else within the certificate tolerance). A stock rebalance may split an
// addition across lots (engine/stock_rebalance.cpp); its parts as written are still one addition
// with one alpha, so they are one term, and a part's IBU is a fixed share of the addition's (IBU is
// linear in grams at one alpha, time and wort: docs/methods.md#linearity). Its interval is then that
// share of the addition's, in every draw alike, and the total as written is that of `bine ibu` for the
// same recipe.
//
// As rebalanced, each row is one term: its lot's alpha (certificate tolerance, and its ageing over a
// stability range for a cold-store lot: lot_alpha_origin), else the alpha as written. A split
// addition's parts come from different lots, so they are separate terms, and the addition's total is
// a subtotal of the same draws.
#include <cstddef>
#include <vector>

#include "engine/ibu_interval.hpp"
#include "engine/rebalance.hpp"

namespace bine {
namespace {

/// The rows of each addition as written, in order: one row, or the consecutive parts of a split one.
std::vector<std::vector<std::size_t>> rows_by_addition(const std::vector<RebalancedAddition>& rows) {
  std::vector<std::vector<std::size_t>> groups;
  for (std::size_t k = 0; k < rows.size(); ++k) {
    if (k > 0 && rows[k].parts > 1 && rows[k].part > 1 && rows[k - 1].index == rows[k].index)
      groups.back().push_back(k);
    else
      groups.push_back({k});
  }
  return groups;
}

/// As written: one term per addition; each row's interval its share of its addition's.
IbuIntervals written_intervals(const RebalanceResult& result, const Catalog& catalog, double tolerance_percent,
                               const std::vector<std::vector<std::size_t>>& groups) {
  std::vector<IbuTerm> terms;
  for (const auto& rows : groups) {
    IbuTerm term = recipe_term(result.before.additions[rows.front()], catalog);
    for (std::size_t j = 1; j < rows.size(); ++j) term.ibu += result.before.additions[rows[j]].bitterness.ibu;
    terms.push_back(term);
  }
  IbuIntervals per_addition = term_intervals(terms, result.before.settings, tolerance_percent);
  IbuIntervals per_row = per_addition;
  per_row.additions.assign(result.additions.size(), IbuRange{});
  for (std::size_t g = 0; g < groups.size(); ++g)
    for (const std::size_t k : groups[g]) {
      const double share = terms[g].ibu > 0.0 ? result.before.additions[k].bitterness.ibu / terms[g].ibu : 0.0;
      const IbuRange& whole = per_addition.additions[g];
      per_row.additions[k] = groups[g].size() == 1 ? whole : IbuRange{share * whole.low, share * whole.high};
    }
  // The split additions' wholes, in order, as subtotals (what the report shows beside their parts).
  per_row.subtotals.clear();
  for (std::size_t g = 0; g < groups.size(); ++g)
    if (groups[g].size() > 1) per_row.subtotals.push_back(per_addition.additions[g]);
  return per_row;
}

}  // namespace

RebalanceIntervals rebalance_intervals(const RebalanceResult& result, const Catalog& catalog,
                                       double tolerance_percent) {
  const std::vector<std::vector<std::size_t>> groups = rows_by_addition(result.additions);
  RebalanceIntervals intervals;
  intervals.before = written_intervals(result, catalog, tolerance_percent, groups);
  std::vector<IbuTerm> terms;
  for (std::size_t k = 0; k < result.after.additions.size(); ++k) {
    terms.push_back(recipe_term(result.after.additions[k], catalog));
    if (k < result.additions.size() && result.additions[k].lot_alpha)
      terms.back().origin = *result.additions[k].lot_alpha;
  }
  std::vector<std::vector<std::size_t>> split;
  for (const auto& rows : groups)
    if (rows.size() > 1) split.push_back(rows);
  intervals.after = term_intervals(terms, result.after.settings, tolerance_percent, split);
  for (std::size_t j = 0; j < split.size(); ++j)
    intervals.split.push_back(SplitIntervals{result.additions[split[j].front()].index, intervals.before.subtotals[j],
                                             intervals.after.subtotals[j]});
  return intervals;
}

}  // namespace bine
