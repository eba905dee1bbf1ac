// Rebalancing a recipe to new lots.
//
// Rules (docs/methods.md#rebalance):
//  * Boil and first-wort additions scale by the bitterness one gram delivers, so each holds its own
//    IBU: grams_after = grams_before x (IBU per gram before) / (IBU per gram after). With the same
//    form that is the alpha ratio, e.g. 30 g at 7.0 % -> 22.1 g at 9.5 % (docs/methods.md#linearity);
//    a change of form (whole <-> pellet) is included through the pellet factor.
//  * Whirlpool and dry-hop additions hold the oil they deliver when both the oil the recipe was
//    written for (the catalog midpoint of the variety's total oil) and the new lot's oil are known:
//    grams_after = grams_before x oil_before / oil_after (dosing by oil, docs/methods.md#oil-dosing).
//    Otherwise they hold their grams.
//  * Whirlpool additions change IBU when their alpha or grams change. The largest boil (or
//    first-wort) addition absorbs that change so the total holds; IBU is linear in grams
//    (bitterness.cpp), so one scaling is exact. Without a boil addition the whirlpool additions are
//    scaled together to hold the total, and their aroma contribution changes with them.
#include "engine/rebalance.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <map>

#include "io/limits.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"
#include "model/quantity.hpp"

namespace bine {
namespace {

const ReplacementLot* lot_for(const std::vector<ReplacementLot>& lots, const std::string& variety) {
  if (variety.empty()) return nullptr;
  const std::string wanted = fold_name(variety);
  for (const auto& lot : lots)
    if (fold_name(lot.variety) == wanted) return &lot;
  return nullptr;
}

/// Alpha and oil as a recipe records them (0.01 % and 0.01 mL/100 g): the amounts are worked out
/// for the recorded values, so a recipe rebalanced again with the same lot does not move.
double as_recorded(double value) { return std::round(value * 100.0) / 100.0; }

// The addition (index into recipe.hops) that absorbs the IBU change: the boil or first-wort
// addition with most IBU.
std::optional<std::size_t> choose_absorber(const RecipeBitterness& bitterness) {
  std::optional<std::size_t> best;
  double best_ibu = 0.0;
  for (const auto& line : bitterness.additions) {
    if (line.use != HopUse::boil && line.use != HopUse::first_wort) continue;
    if (line.bitterness.ibu > best_ibu) {
      best_ibu = line.bitterness.ibu;
      best = line.index;
    }
  }
  return best;
}

}  // namespace

std::string_view to_string(RebalanceRule rule) {
  switch (rule) {
    case RebalanceRule::unchanged:
      return "unchanged";
    case RebalanceRule::holds_ibu:
      return "holds its IBU";
    case RebalanceRule::holds_oil:
      return "holds its oil";
    case RebalanceRule::holds_grams:
      return "holds its grams";
    case RebalanceRule::absorbs_ibu:
      return "absorbs the IBU change";
    case RebalanceRule::scaled_for_total:
      return "scaled to hold total IBU";
  }
  return "";
}

std::optional<double> oil_written_for(const HopAddition& hop, const Catalog& catalog, bool& from_catalog) {
  if (hop.total_oil) return hop.total_oil;
  const Variety* variety = find_variety(catalog, hop.variety);
  if (variety == nullptr || !variety->total_oil) return std::nullopt;
  from_catalog = true;
  return variety->total_oil->mid();
}

bool recipe_uses_variety(const Recipe& recipe, std::string_view variety) {
  const std::string wanted = fold_name(variety);
  return std::any_of(recipe.hops.begin(), recipe.hops.end(),
                     [&](const HopAddition& hop) { return !hop.variety.empty() && fold_name(hop.variety) == wanted; });
}

namespace {

/// The recipe being rebalanced and what happened to each addition so far.
struct Working {
  Recipe after;
  std::vector<RebalanceRule> rules;
  std::vector<std::optional<double>> oil_before;
  std::vector<std::optional<double>> oil_after;
};

/// Step 1, each addition on its own: the boil side holds its IBU, late hops their oil (else grams).
/// A boil addition's IBU per gram is proportional to alpha x form factor at any time, so the ratio
/// also moves a 0-minute addition, whose Tinseth IBU is 0.
Working rebalance_each(const Recipe& recipe, const RecipeBitterness& before,
                       const std::vector<const ReplacementLot*>& lot_of, const Catalog& catalog,
                       const BitternessSettings& settings, bool& oil_from_catalog) {
  Working w{recipe, std::vector<RebalanceRule>(recipe.hops.size(), RebalanceRule::unchanged),
            std::vector<std::optional<double>>(recipe.hops.size()),
            std::vector<std::optional<double>>(recipe.hops.size())};
  for (const auto& line : before.additions) {
    const HopAddition& hop = recipe.hops[line.index];
    HopAddition& next = w.after.hops[line.index];
    const ReplacementLot* lot = lot_of[line.index];
    if (lot == nullptr) continue;
    const double alpha = as_recorded(lot->alpha_percent);
    next.alpha_acid = alpha;
    if (lot->form) next.form = lot->form;
    if (!lot->lot_code.empty()) next.lot = lot->lot_code;
    if (fold_name(lot->variety) != fold_name(hop.variety)) {  // a substitute takes its place
      next.variety = lot->variety;
      next.lot = lot->lot_code;
      next.total_oil.reset();
    }
    bool from_catalog = false;
    w.oil_before[line.index] = oil_written_for(hop, catalog, from_catalog);
    if (lot->total_oil) w.oil_after[line.index] = as_recorded(*lot->total_oil);
    if (hop.use == HopUse::boil || hop.use == HopUse::first_wort) {
      const double strength_before = line.alpha_percent * form_factor(hop.form, settings);
      const double strength_after = alpha * form_factor(next.form, settings);
      if (strength_before > 0.0 && strength_after > 0.0) next.grams = hop.grams * strength_before / strength_after;
      w.rules[line.index] = RebalanceRule::holds_ibu;
    } else if (w.oil_before[line.index] && w.oil_after[line.index]) {
      next.grams = hop.grams * *w.oil_before[line.index] / *w.oil_after[line.index];
      next.total_oil = w.oil_after[line.index];
      oil_from_catalog = oil_from_catalog || from_catalog;
      w.rules[line.index] = RebalanceRule::holds_oil;
    } else {
      w.rules[line.index] = RebalanceRule::holds_grams;
    }
  }
  return w;
}

/// Amounts the steps changed, rounded as the brewer weighs them in the unit the recipe uses (all but
/// `skip`, the addition that will absorb the IBU change and is weighed once it has).
void weigh_changed(const Recipe& recipe, Working& w, std::optional<std::size_t> skip = std::nullopt) {
  for (std::size_t i = 0; i < recipe.hops.size(); ++i) {
    if (skip == i) continue;
    HopAddition& hop = w.after.hops[i];
    if (hop.grams != recipe.hops[i].grams) hop.grams = weighed_grams(hop.grams, amount_unit(recipe, hop));
  }
}

/// Without a boil addition: the whirlpool additions are scaled together by the same factor.
void scale_whirlpool(const RecipeBitterness& provisional, double change, Working& w, RebalanceResult& result) {
  double whirlpool_ibu = 0.0;
  for (const auto& l : provisional.additions)
    if (l.use == HopUse::whirlpool) whirlpool_ibu += l.bitterness.ibu;
  if (whirlpool_ibu <= 0.0) return;
  const double factor = (whirlpool_ibu + change) / whirlpool_ibu;
  for (const auto& l : provisional.additions)
    if (l.use == HopUse::whirlpool) {
      w.after.hops[l.index].grams *= factor;
      w.rules[l.index] = RebalanceRule::scaled_for_total;
    }
  result.whirlpool_scaled = true;
  result.ibu_change_absorbed = change;
  result.notes.push_back(
      fmt::format("no boil addition: the whirlpool additions were scaled by {:.3f} to hold the total IBU, so the aroma "
                  "they give changes too",
                  factor));
}

/// Step 2, hold the total: the largest boil addition absorbs the change, else scale the whirlpool.
void hold_total(const RecipeBitterness& before, const Catalog& catalog, const BitternessSettings& settings,
                Weighing weighing, Working& w, RebalanceResult& result) {
  const RecipeBitterness provisional = recipe_bitterness(w.after, catalog, settings);
  const double change = before.total_ibu - provisional.total_ibu;
  if (std::abs(change) <= 1e-9 * std::max(1.0, before.total_ibu)) return;
  const auto absorber = choose_absorber(provisional);
  if (!absorber) return scale_whirlpool(provisional, change, w, result);
  const auto& line = *std::find_if(provisional.additions.begin(), provisional.additions.end(),
                                   [&](const AdditionLine& l) { return l.index == *absorber; });
  const double wanted = line.bitterness.ibu + change;
  if (wanted <= 0.0) {
    const double late = provisional.total_ibu - line.bitterness.ibu;
    throw Infeasible(fmt::format(
        "the late additions alone now give {:.1f} IBU, more than the recipe's total of {:.1f} IBU, so no boil "
        "addition can hold it (cut the whirlpool amounts by more than {:.0f} %, or use a lot with less alpha)",
        late, before.total_ibu, 100.0 * (1.0 - before.total_ibu / late)));
  }
  HopAddition& hop = w.after.hops[*absorber];
  double grams = hop.grams * wanted / line.bitterness.ibu;
  if (weighing == Weighing::as_weighed) grams = weighed_grams(grams, amount_unit(w.after, hop));
  if (grams == hop.grams) return;  // a change finer than the absorber can be weighed to
  hop.grams = grams;
  w.rules[*absorber] = RebalanceRule::absorbs_ibu;
  result.ibu_change_absorbed = change;
  result.absorber = *absorber;
}

/// The total must really hold before anything says so: a lot whose alpha has aged to almost nothing
/// gives (almost) no IBU per gram, and no amount of it holds the total. Within 0.05 IBU + 0.5 %.
void check_total_held(const RebalanceResult& result, const std::vector<const ReplacementLot*>& lots) {
  const double before = result.before.total_ibu;
  const double after = result.after.total_ibu;
  if (!std::isfinite(before))
    throw Infeasible(
        "the recipe's IBU is not a finite number (is the batch volume or an amount far outside brewing sizes?), so "
        "nothing is computed from it");
  if (std::isfinite(after) && std::abs(after - before) <= 0.05 + 0.005 * before) return;
  const ReplacementLot* weakest = nullptr;
  for (const ReplacementLot* lot : lots)
    if (lot != nullptr && (weakest == nullptr || lot->alpha_percent < weakest->alpha_percent)) weakest = lot;
  std::string why;
  if (weakest != nullptr)
    why = fmt::format(" ({}{} has {:.2f} % alpha acid{})", weakest->variety,
                      weakest->lot_code.empty() ? std::string() : " lot " + weakest->lot_code, weakest->alpha_percent,
                      weakest->certificate_alpha
                          ? fmt::format(", {:.0f} % of its certificate's after storage", 100.0 * weakest->remaining)
                          : std::string());
  throw Infeasible(fmt::format("these lots cannot hold the recipe's {:.1f} IBU: the total would be {:.1f} IBU{}",
                               before, after, why),
                   {Remedy::add_stock});
}

}  // namespace

std::vector<Shortfall> shortfalls(const std::vector<RebalancedAddition>& rows,
                                  const std::vector<const ReplacementLot*>& lot_of, double batches) {
  std::vector<std::pair<const ReplacementLot*, double>> needed;  // in the order the lots are first used
  for (const auto& row : rows) {
    const ReplacementLot* lot = lot_of[row.index];
    if (lot == nullptr || !lot->on_hand_g) continue;
    auto it = std::find_if(needed.begin(), needed.end(), [&](const auto& entry) { return entry.first == lot; });
    if (it == needed.end()) it = needed.insert(needed.end(), {lot, 0.0});
    it->second += row.grams_after * batches;
  }
  std::vector<Shortfall> found;
  for (const auto& [lot, grams] : needed)
    if (grams > *lot->on_hand_g + 1e-9) found.push_back(Shortfall{lot->variety, lot->lot_code, grams, *lot->on_hand_g});
  return found;
}

RebalanceResult rebalance(const Recipe& recipe, const std::vector<ReplacementLot>& lots, const Catalog& catalog,
                          const BitternessSettings& settings, Weighing weighing) {
  std::vector<const ReplacementLot*> lot_of;
  for (const auto& hop : recipe.hops) lot_of.push_back(lot_for(lots, hop.variety));
  return rebalance_additions(recipe, lot_of, catalog, settings, weighing);
}

RebalanceResult rebalance_additions(const Recipe& recipe, const std::vector<const ReplacementLot*>& lot_of,
                                    const Catalog& catalog, const BitternessSettings& settings, Weighing weighing) {
  RebalanceResult result;
  result.before = recipe_bitterness(recipe, catalog, settings);
  // 1. Each addition on its own; 2. hold the total.
  // The amounts are weighed (rounded) before the total is held, and the absorber once more after, so
  // every figure below is that of the recipe as it will be weighed and written.
  bool oil_from_catalog = false;
  Working w = rebalance_each(recipe, result.before, lot_of, catalog, settings, oil_from_catalog);
  if (weighing == Weighing::as_weighed) weigh_changed(recipe, w, choose_absorber(result.before));
  hold_total(result.before, catalog, settings, weighing, w, result);
  if (weighing == Weighing::as_weighed) weigh_changed(recipe, w);
  // 3. The result, recomputed from the final recipe so every figure comes from the model.
  result.after = recipe_bitterness(w.after, catalog, settings);
  for (std::size_t k = 0; k < result.before.additions.size(); ++k) {
    const AdditionLine& b = result.before.additions[k];
    const AdditionLine& a = result.after.additions[k];
    const ReplacementLot* lot = lot_of[b.index];
    result.additions.push_back(RebalancedAddition{b.index, b.variety, a.variety, b.use, b.grams, a.grams,
                                                  b.alpha_percent, a.alpha_percent, b.bitterness.ibu, a.bitterness.ibu,
                                                  w.oil_before[b.index], w.oil_after[b.index], w.rules[b.index],
                                                  lot != nullptr ? lot->lot_code : w.after.hops[b.index].lot, 1, 1,
                                                  lot != nullptr ? std::optional(lot->alpha_origin) : std::nullopt});
  }
  check_total_held(result, lot_of);
  result.recipe_after = std::move(w.after);
  // 4. Stock shortfalls.
  result.shortfalls = shortfalls(result.additions, lot_of);
  if (oil_from_catalog)
    result.notes.push_back(
        "late additions hold the oil they deliver; where the recipe records no total_oil it is taken as written "
        "for the catalog midpoint of the variety's total oil");
  return result;
}

}  // namespace bine
