// Choosing the lots a recipe is weighed from (docs/methods.md#lot-choice).
//
// Additions are served in recipe order, so a lot an earlier addition emptied is not there for a
// later one. A named lot is taken whole (no split: the brewer chose it), even beyond what it has, so
// that the shortfall names it. Otherwise the usable lots of the variety (a certificate alpha, not
// stale unless allowed) are taken in order, oldest packaging first (lots without a date after, in
// file order) or most left first, and an addition takes from each what it has left until its demand
// is met. The demand is the addition's own effect: IBU for a boil addition, oil delivered or grams
// for a late one, each lot giving it at its own rate per gram (computed by the caller through the
// bitterness engine: IBU is linear in grams at a fixed time and wort, docs/methods.md#linearity), so
// the parts of a split addition together give exactly what the addition gives.
#include "engine/lot_allocation.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>

#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

bool usable(const CellarLot& c, const AllocationSettings& settings) {
  return c.lot.alpha_acid.has_value() && c.alpha_today.has_value() && (settings.allow_stale || !c.stale);
}

void note_once(std::vector<std::string>& notes, std::string note) {
  if (std::find(notes.begin(), notes.end(), note) == notes.end()) notes.push_back(std::move(note));
}

/// The named lot takes the whole demand.
void take_named(const Cellar& cellar, const HopAddition& hop, const LotDemand& demand, LotAllocation& allocation,
                AdditionLots& lots) {
  const CellarLot* c = cellar.find(hop.lot);
  if (c == nullptr) return;  // with_named_lots has already refused an unknown code
  lots.named = true;
  const double per_gram = demand.per_gram ? demand.per_gram(*c) : 1.0;
  const double grams = per_gram > 0.0 ? demand.effect / per_gram : 0.0;
  lots.parts.push_back(LotPart{c->index, grams, demand.effect});
  allocation.left_g[c->index] -= grams;
  if (c->stale)
    note_once(allocation.notes, fmt::format("lot {} of {} is stale ({}); used because the recipe names it", c->code,
                                            c->lot.variety, c->stale_reason));
}

/// Takes from the variety's lots in order until the demand is met; what none can give goes on the last.
void take_in_order(const Cellar& cellar, const LotDemand& demand, const AllocationSettings& settings,
                   LotAllocation& allocation, AdditionLots& lots) {
  std::vector<std::size_t> order = lots_in_order(cellar, lots.variety, settings, &allocation.left_g);
  if (order.empty()) {
    note_once(allocation.notes,
              fmt::format("no usable stock lot of {} with a certificate alpha; its additions are kept as written",
                          lots.variety));
    return;
  }
  double remaining = demand.effect;
  for (const std::size_t i : order) {
    const CellarLot& c = cellar.lots[i];
    const double per_gram = demand.per_gram ? demand.per_gram(c) : 1.0;
    const double left = allocation.left_g[i];
    if (per_gram <= 0.0 || left <= 1e-9) continue;
    const double grams = std::min(left, remaining / per_gram);
    lots.parts.push_back(LotPart{i, grams, grams * per_gram});
    allocation.left_g[i] -= grams;
    remaining -= grams * per_gram;
    if (remaining <= 1e-12 * std::max(1.0, demand.effect)) return;
  }
  // Short: the rest goes on the last usable lot in order, beyond what it has.
  const std::size_t last = order.back();
  const double per_gram = demand.per_gram ? demand.per_gram(cellar.lots[last]) : 1.0;
  const double grams = per_gram > 0.0 ? remaining / per_gram : 0.0;
  if (!lots.parts.empty() && lots.parts.back().lot == last) {
    lots.parts.back().grams += grams;
    lots.parts.back().effect += remaining;
  } else {
    lots.parts.push_back(LotPart{last, grams, remaining});
  }
  allocation.left_g[last] -= grams;
}

void note_stale_left_out(const Cellar& cellar, std::string_view variety, const AllocationSettings& settings,
                         std::vector<std::string>& notes) {
  if (settings.allow_stale) return;
  for (const CellarLot* c : cellar.lots_of(variety))
    if (c->stale && c->lot.alpha_acid)
      note_once(notes, fmt::format("lot {} of {} is stale ({}); left out", c->code, variety, c->stale_reason));
}

}  // namespace

std::optional<LotOrder> lot_order_from(std::string_view text) {
  if (text == "oldest") return LotOrder::oldest;
  if (text == "most") return LotOrder::most;
  return std::nullopt;
}

std::string_view to_string(LotOrder order) { return order == LotOrder::oldest ? "oldest" : "most"; }

AllocationSettings allocation_of(const Cellar& cellar, double batches) {
  return AllocationSettings{cellar.settings.lot_order, cellar.settings.allow_stale, batches};
}

double available_per_batch(const CellarLot& lot, double batches) {
  if (!lot.lot.on_hand_g) return std::numeric_limits<double>::infinity();
  return *lot.lot.on_hand_g / std::max(batches, 1e-9);
}

Recipe with_lot_varieties(const Recipe& recipe, const std::vector<Lot>& lots, const std::string& stock_file) {
  Recipe out = recipe;
  std::vector<std::string> codes;
  for (std::size_t i = 0; i < lots.size(); ++i) codes.push_back(lot_code(lots[i], i));
  std::vector<std::string> problems;
  for (std::size_t h = 0; h < out.hops.size(); ++h) {
    HopAddition& hop = out.hops[h];
    if (hop.lot.empty()) continue;
    const auto found = std::find_if(codes.begin(), codes.end(),
                                    [&](const std::string& code) { return fold_name(code) == fold_name(hop.lot); });
    if (found == codes.end()) {
      const std::string hint = did_you_mean(hop.lot, codes);
      problems.push_back(fmt::format("{}: /hops/{}/lot: \"{}\" is not a lot in {} ({}its lots are {})",
                                     recipe.source_file, h, hop.lot, stock_file, hint.empty() ? "" : hint + "; ",
                                     codes.empty() ? "none" : fmt::format("{}", fmt::join(codes, ", "))));
      continue;
    }
    const Lot& lot = lots[static_cast<std::size_t>(found - codes.begin())];
    if (hop.variety.empty())
      hop.variety = lot.variety;
    else if (fold_name(hop.variety) != fold_name(lot.variety))
      problems.push_back(
          fmt::format("{}: /hops/{}/lot: lot {} in {} is {}, not {} (give the lot's variety or no variety)",
                      recipe.source_file, h, *found, stock_file, lot.variety, hop.variety));
  }
  if (!problems.empty()) throw InputError(problems);
  return out;
}

Recipe with_lot_varieties(const Recipe& recipe, const Cellar& cellar) {
  std::vector<Lot> lots;
  for (const auto& c : cellar.lots) lots.push_back(c.lot);
  return with_lot_varieties(recipe, lots, cellar.source_file);
}

Recipe with_named_lots(const Recipe& recipe, const Cellar& cellar, std::vector<std::string>& notes) {
  Recipe out = with_lot_varieties(recipe, cellar);
  for (std::size_t h = 0; h < out.hops.size(); ++h) {
    HopAddition& hop = out.hops[h];
    if (hop.lot.empty() || hop.alpha_acid || hop.use == HopUse::dry_hop) continue;
    const CellarLot* c = cellar.find(hop.lot);
    if (c == nullptr || !c->alpha_today) continue;
    hop.alpha_acid = std::round(*c->alpha_today * 100.0) / 100.0;  // as a recipe records it, 0.01 %
    notes.push_back(fmt::format("addition {} ({}): no alpha acid in the recipe; lot {}'s {:.2f} % on {} used", h + 1,
                                hop.variety, c->code, *hop.alpha_acid, format_date(cellar.on)));
  }
  return out;
}

std::vector<std::optional<AlphaOrigin>> named_lot_alpha_origins(const Recipe& as_read, const Recipe& recipe,
                                                                const Cellar& cellar, const Catalog& catalog) {
  std::vector<std::optional<AlphaOrigin>> origins(recipe.hops.size());
  for (std::size_t h = 0; h < recipe.hops.size() && h < as_read.hops.size(); ++h) {
    const HopAddition& hop = recipe.hops[h];
    if (hop.lot.empty() || as_read.hops[h].alpha_acid || !hop.alpha_acid) continue;
    if (const CellarLot* c = cellar.find(hop.lot); c != nullptr && c->alpha_today)
      origins[h] = lot_alpha_origin(*c, find_variety(catalog, c->lot.variety));
  }
  return origins;
}

void require_stock_for_lot_only(const Recipe& recipe) {
  std::vector<std::string> problems;
  for (std::size_t h = 0; h < recipe.hops.size(); ++h)
    if (recipe.hops[h].variety.empty() && !recipe.hops[h].lot.empty())
      problems.push_back(fmt::format(
          "{}: /hops/{}/lot: \"{}\" names a lot without a variety, and no stock file is given to look it up in",
          recipe.source_file, h, recipe.hops[h].lot));
  if (!problems.empty()) throw InputError(problems, {Remedy::give_stock_file});
}

std::vector<std::size_t> lots_in_order(const Cellar& cellar, std::string_view variety,
                                       const AllocationSettings& settings, const std::vector<double>* left_g) {
  std::vector<std::size_t> order;
  for (const CellarLot* c : cellar.lots_of(variety))
    if (usable(*c, settings)) order.push_back(c->index);
  const auto left = [&](std::size_t i) {
    return left_g != nullptr ? (*left_g)[i] : available_per_batch(cellar.lots[i], settings.batches);
  };
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
    if (settings.order == LotOrder::most) return left(a) > left(b);
    const auto& pa = cellar.lots[a].lot.packaged;
    const auto& pb = cellar.lots[b].lot.packaged;
    if (pa && pb) return *pa < *pb;
    return pa.has_value() && !pb.has_value();  // dated lots before undated ones
  });
  return order;
}

const CellarLot* first_lot(const HopAddition& hop, const Cellar& cellar, const AllocationSettings& settings) {
  if (!hop.lot.empty()) return cellar.find(hop.lot);
  if (hop.variety.empty()) return nullptr;
  for (const std::size_t i : lots_in_order(cellar, hop.variety, settings))
    if (available_per_batch(cellar.lots[i], settings.batches) > 0.0) return &cellar.lots[i];
  return nullptr;
}

LotAllocation allocate_lots(const Recipe& recipe, const Cellar& cellar, const std::vector<LotDemand>& demands,
                            const AllocationSettings& settings) {
  LotAllocation allocation;
  for (const auto& c : cellar.lots) allocation.left_g.push_back(available_per_batch(c, settings.batches));
  for (std::size_t h = 0; h < recipe.hops.size(); ++h) {
    const HopAddition& hop = recipe.hops[h];
    AdditionLots lots;
    lots.index = h;
    lots.variety = hop.variety;
    if (!hop.lot.empty()) {
      take_named(cellar, hop, demands[h], allocation, lots);
    } else if (!hop.variety.empty()) {
      note_stale_left_out(cellar, hop.variety, settings, allocation.notes);
      take_in_order(cellar, demands[h], settings, allocation, lots);
    }
    allocation.additions.push_back(std::move(lots));
  }
  return allocation;
}

}  // namespace bine
