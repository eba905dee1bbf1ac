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

namespace bine {
namespace {

const ReplacementLot* lot_for(const std::vector<ReplacementLot>& lots, const std::string& variety) {
  if (variety.empty()) return nullptr;
  const std::string wanted = fold_name(variety);
  for (const auto& lot : lots)
    if (fold_name(lot.variety) == wanted) return &lot;
  return nullptr;
}

double ibu_per_gram(HopAddition hop, double alpha, const WortContext& wort, const BitternessSettings& settings) {
  hop.grams = 1.0;
  return addition_bitterness(hop, alpha, wort, settings).ibu;
}

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
Working rebalance_each(const Recipe& recipe, const RecipeBitterness& before, const std::vector<ReplacementLot>& lots,
                       const Catalog& catalog, const BitternessSettings& settings) {
  Working w{recipe, std::vector<RebalanceRule>(recipe.hops.size(), RebalanceRule::unchanged),
            std::vector<std::optional<double>>(recipe.hops.size()),
            std::vector<std::optional<double>>(recipe.hops.size())};
  for (const auto& line : before.additions) {
    const HopAddition& hop = recipe.hops[line.index];
    HopAddition& next = w.after.hops[line.index];
    const ReplacementLot* lot = lot_for(lots, hop.variety);
    if (lot == nullptr) continue;
    next.alpha_acid = lot->alpha_percent;
    if (lot->form) next.form = lot->form;
    if (!lot->lot_code.empty()) next.lot = lot->lot_code;
    const Variety* variety = find_variety(catalog, hop.variety);
    if (variety != nullptr && variety->total_oil) w.oil_before[line.index] = variety->total_oil->mid();
    w.oil_after[line.index] = lot->total_oil;
    if (hop.use == HopUse::boil || hop.use == HopUse::first_wort) {
      const double per_gram = ibu_per_gram(next, lot->alpha_percent, before.wort, settings);
      if (per_gram > 0.0 && line.bitterness.ibu > 0.0) next.grams = line.bitterness.ibu / per_gram;
      w.rules[line.index] = RebalanceRule::holds_ibu;
    } else if (w.oil_before[line.index] && w.oil_after[line.index]) {
      next.grams = hop.grams * *w.oil_before[line.index] / *w.oil_after[line.index];
      w.rules[line.index] = RebalanceRule::holds_oil;
    } else {
      w.rules[line.index] = RebalanceRule::holds_grams;
    }
  }
  return w;
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
void hold_total(const RecipeBitterness& before, const Catalog& catalog, const BitternessSettings& settings, Working& w,
                RebalanceResult& result) {
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
  w.after.hops[*absorber].grams *= wanted / line.bitterness.ibu;
  w.rules[*absorber] = RebalanceRule::absorbs_ibu;
  result.ibu_change_absorbed = change;
  result.absorber = *absorber;
}

/// Step 4: everything drawn from one lot against what it has on hand.
std::vector<Shortfall> shortfalls(const Recipe& recipe, const std::vector<RebalancedAddition>& rows,
                                  const std::vector<ReplacementLot>& lots) {
  std::map<std::string, double> needed;
  for (const auto& row : rows)
    if (const ReplacementLot* lot = lot_for(lots, recipe.hops[row.index].variety); lot != nullptr && lot->on_hand_g)
      needed[fold_name(lot->variety)] += row.grams_after;
  std::vector<Shortfall> found;
  for (const auto& lot : lots) {
    const auto it = needed.find(fold_name(lot.variety));
    if (it != needed.end() && lot.on_hand_g && it->second > *lot.on_hand_g + 1e-9)
      found.push_back(Shortfall{lot.variety, lot.lot_code, it->second, *lot.on_hand_g});
  }
  return found;
}

/// The total must really hold before anything says so: a lot whose alpha has aged to almost nothing
/// gives (almost) no IBU per gram, and no amount of it holds the total. Within 0.05 IBU + 0.5 %.
void check_total_held(const RebalanceResult& result, const std::vector<ReplacementLot>& lots) {
  const double before = result.before.total_ibu;
  const double after = result.after.total_ibu;
  if (!std::isfinite(before))
    throw Infeasible(
        "the recipe's IBU is not a finite number (is the batch volume or an amount far outside brewing sizes?), so "
        "nothing is computed from it");
  if (std::isfinite(after) && std::abs(after - before) <= 0.05 + 0.005 * before) return;
  const ReplacementLot* weakest = nullptr;
  for (const auto& lot : lots)
    if (weakest == nullptr || lot.alpha_percent < weakest->alpha_percent) weakest = &lot;
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

RebalanceResult rebalance(const Recipe& recipe, const std::vector<ReplacementLot>& lots, const Catalog& catalog,
                          const BitternessSettings& settings) {
  RebalanceResult result;
  result.before = recipe_bitterness(recipe, catalog, settings);
  // 1. Each addition on its own; 2. hold the total.
  Working w = rebalance_each(recipe, result.before, lots, catalog, settings);
  hold_total(result.before, catalog, settings, w, result);
  // 3. The result, recomputed from the final recipe so every figure comes from the model.
  result.after = recipe_bitterness(w.after, catalog, settings);
  for (std::size_t k = 0; k < result.before.additions.size(); ++k) {
    const AdditionLine& b = result.before.additions[k];
    const AdditionLine& a = result.after.additions[k];
    result.additions.push_back(RebalancedAddition{b.index, b.variety, b.use, b.grams, a.grams, b.alpha_percent,
                                                  a.alpha_percent, b.bitterness.ibu, a.bitterness.ibu,
                                                  w.oil_before[b.index], w.oil_after[b.index], w.rules[b.index]});
  }
  check_total_held(result, lots);
  result.recipe_after = std::move(w.after);
  // 4. Stock shortfalls.
  result.shortfalls = shortfalls(recipe, result.additions, lots);
  for (const auto& row : result.additions)
    if (row.rule == RebalanceRule::holds_oil) {
      result.notes.push_back(
          "late additions hold the oil they deliver; the recipe is taken as written for the "
          "catalog midpoint of each variety's total oil");
      break;
    }
  return result;
}

namespace {

/// A stock lot as the lot rebalancing brews with.
ReplacementLot replacement_from(const std::string& variety, const CellarLot& c, std::size_t count) {
  ReplacementLot lot;
  lot.variety = variety;
  lot.lot_code = c.code;
  lot.form = c.lot.form;
  lot.total_oil = c.lot.total_oil;
  lot.on_hand_g = c.lot.on_hand_g;
  lot.certificate_alpha = c.lot.alpha_acid;
  lot.packaged = c.lot.packaged;
  lot.storage = c.lot.storage;
  lot.lots_of_variety = count;
  lot.alpha_percent = *c.alpha_today;
  lot.days = c.days;
  lot.remaining = c.remaining;
  lot.stability_percent = c.stability_percent;
  lot.stability_source = c.stability_source;
  lot.alpha_note = c.alpha_note;
  lot.hsi_note = c.hsi_note;
  lot.aged = c.basis == AlphaBasis::aged;
  lot.stale = c.stale;
  lot.stale_reason = c.stale_reason;
  return lot;
}

}  // namespace

std::vector<ReplacementLot> lots_from_stock(const Recipe& recipe, const Cellar& cellar, bool allow_stale,
                                            std::vector<std::string>& notes) {
  std::vector<ReplacementLot> chosen;
  std::vector<std::string> spent;  // lots aged below any hop's alpha
  std::vector<std::string> seen;
  for (const auto& hop : recipe.hops) {
    if (hop.variety.empty()) continue;
    const std::string folded = fold_name(hop.variety);
    if (std::find(seen.begin(), seen.end(), folded) != seen.end()) continue;
    seen.push_back(folded);
    const CellarLot* best = nullptr;
    std::size_t count = 0;
    for (const CellarLot* c : cellar.lots_of(hop.variety)) {
      if (!c->lot.alpha_acid) continue;
      if (c->stale && !allow_stale) {
        notes.push_back(fmt::format("lot {} of {} is stale ({}); left out", c->code, hop.variety, c->stale_reason));
        continue;
      }
      ++count;
      if (best == nullptr || c->lot.on_hand_g.value_or(0.0) > best->lot.on_hand_g.value_or(0.0)) best = c;
    }
    if (best == nullptr) {
      notes.push_back(fmt::format(
          "no usable stock lot of {} with a certificate alpha; its additions are kept as written", hop.variety));
      continue;
    }
    // Nothing is computed from an alpha below what any hop keeps (the loaders' bound): such a lot
    // would need tonnes to bitter, or round to no IBU at all.
    if (*best->alpha_today < limits::alpha_acid.min)
      spent.push_back(fmt::format(
          "{}: lot {} of {} has aged to {:.2f} % alpha acid by {} ({:.1f} % at packaging, {} days): below the "
          "{} % any hop keeps, too little to brew with",
          cellar.source_file, best->code, hop.variety, *best->alpha_today, format_date(cellar.on),
          *best->lot.alpha_acid, best->days, limits::alpha_acid.min));
    if (best->basis != AlphaBasis::aged)
      notes.push_back(
          fmt::format("lot {} has no packaged date or storage; its certificate alpha is used unaged", best->code));
    chosen.push_back(replacement_from(hop.variety, *best, count));
  }
  if (!spent.empty()) throw Infeasible(spent.front(), {Remedy::add_stock});
  return chosen;
}

}  // namespace bine
