// Rebalancing to the cold store (docs/methods.md#lot-choice and #rebalance).
//
// The lots come from allocate_lots. An addition drawn from one lot is rebalanced as before. An
// addition split across lots becomes one addition per part, each written for its share of what the
// addition delivers: part k of an addition of W grams that must deliver E (IBU, or mL of oil) takes
// W x E_k / E grams as written, where E_k = g_k x e_k is what its g_k grams of lot k give at e_k per
// gram. Rebalancing that part to lot k holds its E_k, so it comes out at g_k grams, and the parts
// together deliver E exactly: for a boil addition at fixed time and wort, IBU = c x grams x alpha x
// form factor (Tinseth and Rager are linear in grams, docs/methods.md#linearity), so
// W x (g_k c a_k f_k) / (W c a f) x (a f) / (a_k f_k) = g_k.
#include "engine/stock_rebalance.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "engine/ibu_interval.hpp"
#include "io/limits.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"

namespace bine {
namespace {

/// Alpha and oil at the 0.01 a recipe records (as rebalance.cpp takes them).
double recorded(double value) { return std::round(value * 100.0) / 100.0; }

LotDemand boil_demand(const HopAddition& hop, const AdditionLine& line, const WortContext& wort,
                      const BitternessSettings& settings) {
  if (line.bitterness.ibu > 0.0)
    return {line.bitterness.ibu, [hop, wort, settings](const CellarLot& c) {
              HopAddition one = hop;
              one.grams = 1.0;
              one.form = c.lot.form;
              return addition_bitterness(one, recorded(c.alpha_today.value_or(0.0)), wort, settings).ibu;
            }};
  // At 0 minutes Tinseth gives no IBU, yet the addition is held by alpha x form factor (rebalance.cpp).
  return {hop.grams * line.alpha_percent * form_factor(hop.form, settings), [settings](const CellarLot& c) {
            return recorded(c.alpha_today.value_or(0.0)) * form_factor(c.lot.form, settings);
          }};
}

LotDemand late_demand(const HopAddition& hop, const Catalog& catalog) {
  bool from_catalog = false;
  const auto oil = oil_written_for(hop, catalog, from_catalog);
  if (!oil) return {hop.grams, [](const CellarLot&) { return 1.0; }};
  const double written = *oil;
  return {hop.grams * written,
          [written](const CellarLot& c) { return c.lot.total_oil ? recorded(*c.lot.total_oil) : written; }};
}

std::string why_chosen(bool named, std::size_t count, LotOrder order) {
  if (named) return "named in the recipe";
  if (count < 2) return "";
  return fmt::format("{} first of {} lots", order == LotOrder::oldest ? "oldest packaging" : "most on hand", count);
}

/// A stock lot as the lot rebalancing brews with; `variety` (its catalog entry, if any) gives the range
/// of a catalog midpoint's alpha.
ReplacementLot replacement_from(const CellarLot& c, const Variety* variety, std::size_t count, std::string chosen) {
  ReplacementLot lot;
  lot.variety = c.lot.variety;
  lot.lot_code = c.code;
  lot.form = c.lot.form;
  lot.total_oil = c.lot.total_oil;
  lot.on_hand_g = c.lot.on_hand_g;
  lot.certificate_alpha = c.lot.alpha_acid;
  lot.packaged = c.lot.packaged;
  lot.storage = c.lot.storage;
  lot.lots_of_variety = count;
  lot.chosen = std::move(chosen);
  lot.alpha_percent = c.alpha_today.value_or(0.0);
  lot.days = c.days;
  lot.remaining = c.remaining;
  lot.stability_percent = c.stability_percent;
  lot.stability_source = c.stability_source;
  lot.alpha_note = c.alpha_note;
  lot.hsi_note = c.hsi_note;
  lot.aged = c.basis == AlphaBasis::aged;
  lot.alpha_origin = lot_alpha_origin(c, variety);  // its interval: certificate, ageing or catalog range
  lot.stale = c.stale;
  lot.stale_reason = c.stale_reason;
  return lot;
}

/// Nothing is computed from an alpha below what any hop keeps (the loaders' bound): such a lot would
/// need tonnes to bitter, or round to no IBU at all.
void refuse_spent(const CellarLot& c, const Cellar& cellar) {
  // Only a lot the recipe names can get here without a certificate alpha (lots_in_order needs one).
  if (!c.alpha_today)
    throw InputError(
        fmt::format("{}: /lots/{}/alpha_acid: lot {} of {} is named by the recipe but has no alpha acid, "
                    "and the catalog gives none for {} (give the lot's certificate alpha acid %)",
                    cellar.source_file, c.index, c.code, c.lot.variety, c.lot.variety));
  if (*c.alpha_today >= limits::alpha_acid.min) return;
  throw Infeasible(
      fmt::format("{}: lot {} of {} has aged to {:.2f} % alpha acid by {} ({:.1f} % at packaging, {} days): "
                  "below the {} % any hop keeps, too little to brew with",
                  cellar.source_file, c.code, c.lot.variety, *c.alpha_today, format_date(cellar.on),
                  c.lot.alpha_acid.value_or(0.0), c.days, limits::alpha_acid.min),
      {Remedy::add_stock});
}

/// Where each row of the split recipe comes from.
struct Origin {
  std::size_t index = 0;
  std::size_t part = 1;
  std::size_t parts = 1;
};

/// The lots drawn on, as ReplacementLots (stable addresses: reserved), and the notes they need.
void take_lots(const Cellar& cellar, const Catalog& catalog, StockRebalance& out, std::vector<std::size_t>& position,
               std::vector<std::string>& notes) {
  const AllocationSettings settings = allocation_of(cellar, out.batches);
  position.assign(cellar.lots.size(), cellar.lots.size());
  out.lots.reserve(cellar.lots.size());
  for (const auto& a : out.allocation.additions)
    for (const auto& part : a.parts) {
      if (position[part.lot] != cellar.lots.size()) continue;
      const CellarLot& c = cellar.lots[part.lot];
      refuse_spent(c, cellar);
      if (c.basis == AlphaBasis::certificate)
        notes.push_back(fmt::format("lot {} gives no {}; its certificate alpha is used unaged", c.code,
                                    !c.lot.packaged && !c.lot.storage ? "packaged date or storage"
                                    : !c.lot.packaged                 ? "packaged date"
                                                                      : "storage"));
      else if (c.basis == AlphaBasis::catalog_midpoint)
        notes.push_back(fmt::format("lot {} has no alpha acid; the catalog midpoint {:.2f} % of {} is used", c.code,
                                    *c.alpha_today, c.lot.variety));
      position[part.lot] = out.lots.size();
      const std::size_t count = lots_in_order(cellar, c.lot.variety, settings).size();
      out.lots.push_back(
          replacement_from(c, find_variety(catalog, c.lot.variety), count, why_chosen(a.named, count, settings.order)));
    }
}

/// The recipe with each split addition written as one addition per part, and the lot of each.
Recipe split_recipe(const StockRebalance& out, const std::vector<std::size_t>& position,
                    std::vector<const ReplacementLot*>& lot_of, std::vector<Origin>& origin) {
  Recipe split = out.recipe;
  split.hops.clear();
  for (const auto& a : out.allocation.additions) {
    const HopAddition& hop = out.recipe.hops[a.index];
    if (a.parts.empty()) {
      split.hops.push_back(hop);
      lot_of.push_back(nullptr);
      origin.push_back({a.index, 1, 1});
      continue;
    }
    double effect = 0.0;
    for (const auto& part : a.parts) effect += part.effect;
    for (std::size_t k = 0; k < a.parts.size(); ++k) {
      HopAddition piece = hop;
      const ReplacementLot& lot = out.lots[position[a.parts[k].lot]];
      if (a.parts.size() > 1) piece.grams = effect > 0.0 ? hop.grams * a.parts[k].effect / effect : 0.0;
      piece.lot = lot.lot_code;
      split.hops.push_back(piece);
      lot_of.push_back(&lot);
      origin.push_back({a.index, k + 1, a.parts.size()});
    }
  }
  return split;
}

void sum_draws(const Cellar& cellar, StockRebalance& out, const std::vector<const ReplacementLot*>& lot_of) {
  for (const auto& row : out.result.additions) {
    const ReplacementLot* lot = lot_of[row.index];
    if (lot == nullptr) continue;
    const CellarLot* c = cellar.find(lot->lot_code);
    auto it = std::find_if(out.draws.begin(), out.draws.end(), [&](const LotDraw& d) { return d.lot == c->index; });
    if (it == out.draws.end())
      it = out.draws.insert(out.draws.end(),
                            LotDraw{c->index, c->code, c->lot.variety, 0.0, available_per_batch(*c, 1.0)});
    it->grams += row.grams_after * out.batches;
  }
}

}  // namespace

std::vector<LotDemand> rebalance_demands(const Recipe& recipe, const RecipeBitterness& as_written,
                                         const Catalog& catalog, const BitternessSettings& settings) {
  std::vector<LotDemand> demands(recipe.hops.size(), LotDemand{0.0, [](const CellarLot&) { return 1.0; }});
  for (const auto& line : as_written.additions) {
    const HopAddition& hop = recipe.hops[line.index];
    demands[line.index] = hop.use == HopUse::boil || hop.use == HopUse::first_wort
                              ? boil_demand(hop, line, as_written.wort, settings)
                              : late_demand(hop, catalog);
  }
  return demands;
}

StockRebalance rebalance_from_stock(const Recipe& recipe, const Cellar& cellar, const Catalog& catalog,
                                    const BitternessSettings& settings, Weighing weighing, double batches) {
  // 1. Look up the named lots, then choose the lots of every addition by what it must deliver.
  StockRebalance out;
  out.batches = batches;
  std::vector<std::string> notes;
  out.recipe = with_named_lots(recipe, cellar, notes);
  const RecipeBitterness written = recipe_bitterness(out.recipe, catalog, settings);
  out.allocation = allocate_lots(out.recipe, cellar, rebalance_demands(out.recipe, written, catalog, settings),
                                 allocation_of(cellar, batches));
  std::vector<std::size_t> position;
  take_lots(cellar, catalog, out, position, notes);
  // 2. Rebalance the recipe with each split addition written part by part.
  std::vector<const ReplacementLot*> lot_of;
  std::vector<Origin> origin;
  const Recipe split = split_recipe(out, position, lot_of, origin);
  out.result = rebalance_additions(split, lot_of, catalog, settings, weighing);
  out.result.shortfalls = shortfalls(out.result.additions, lot_of, batches);
  sum_draws(cellar, out, lot_of);
  // 3. Rows refer to the recipe as written, each part marked.
  for (auto& row : out.result.additions) {
    const Origin& o = origin[row.index];
    row.index = o.index;
    row.part = o.part;
    row.parts = o.parts;
  }
  // 4. What the shortfalls cannot speak for: additions no lot was found for, lots without an amount.
  for (const auto& a : out.allocation.additions)
    if (a.parts.empty()) out.result.without_lot.push_back(a.index);
  for (const auto& lot : out.lots)
    if (!lot.on_hand_g) out.result.lots_without_amount.push_back(lot.lot_code);
  notes.insert(notes.begin(), out.allocation.notes.begin(), out.allocation.notes.end());
  out.result.notes.insert(out.result.notes.begin(), notes.begin(), notes.end());
  return out;
}

}  // namespace bine
