// Reading a recipe for a blend (docs/methods.md#bittering-charge). The late additions (whirlpool and
// dry hop) are replaced by the blend; the boil addition with the most IBU is the bittering charge,
// re-solved to hold total IBU (or a variety the brewer names, at the same time); every other boil or
// first-wort addition is kept as it is. The whirlpool share of the late grams is the brewer's, else
// the recipe's (whirlpool grams over all late grams), else 0.3; the whirlpool temperature and time
// are the recipe's first whirlpool addition's, else 80 C for 20 min (our defaults, a common
// hop-stand practice). The late-hop amount is the dose times the wort volume
// (docs/methods.md#blend-amounts).
#include "engine/blend_plan.hpp"

#include <fmt/format.h>

#include <algorithm>

#include "engine/blend.hpp"
#include "engine/lot_allocation.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

/// The addition's lot: the one it names, else the first its variety's lots are taken in
/// (engine/lot_allocation.hpp: oldest packaging or most on hand first, stale lots left out unless allowed).
const CellarLot* lot_for(const HopAddition& hop, const Cellar* cellar) {
  if (cellar == nullptr) return nullptr;
  return first_lot(hop, *cellar, allocation_of(*cellar));
}

/// The alpha on the brew day of the lot the charge is drawn from, else the addition's own.
std::optional<std::pair<double, AlphaOrigin>> charge_alpha(const HopAddition& hop, const Catalog& catalog,
                                                           const Cellar* cellar) {
  if (const CellarLot* lot = lot_for(hop, cellar); lot != nullptr && lot->alpha_today)
    return std::make_pair(*lot->alpha_today, lot_alpha_origin(*lot, find_variety(catalog, lot->lot.variety)));
  return addition_alpha_known(hop, catalog, cellar);
}

/// The charge from a variety the brewer named: its first lot in order, else the catalog's values.
BitteringHop bittering_from(const NamedVariety& named, const Catalog& catalog, const Cellar* cellar, double minutes) {
  const Variety& known = require_variety(catalog, named.name, named.named_by);
  HopAddition probe;
  probe.variety = known.name;
  BitteringHop hop;
  hop.variety = known.name;
  hop.minutes = minutes;
  if (const CellarLot* lot = lot_for(probe, cellar)) {
    hop.lot = lot->lot.lot;
    hop.form = lot->lot.form;
    hop.on_hand_g = lot->lot.on_hand_g;
  }
  const auto alpha = charge_alpha(probe, catalog, cellar);
  if (!alpha)
    throw InputError(fmt::format("{}: {}: no alpha acid known", named.named_by, known.name), {Remedy::add_alpha_acid});
  hop.alpha_percent = alpha->first;
  hop.alpha_origin = alpha->second;
  return hop;
}

/// The charge from the recipe's own addition, with its lot's amount on hand when it is in stock.
BitteringHop bittering_as_written(const Recipe& recipe, std::size_t index, const Catalog& catalog,
                                  const Cellar* cellar) {
  const HopAddition& hop = recipe.hops[index];
  BitteringHop bittering;
  bittering.variety = hop.variety;
  bittering.lot = hop.lot;
  const auto alpha = charge_alpha(hop, catalog, cellar);
  bittering.alpha_percent = alpha->first;
  bittering.alpha_origin = alpha->second;
  bittering.form = hop.form.value_or(HopForm::pellet);
  bittering.minutes = hop.minutes.value_or(recipe.boil_minutes);
  bittering.use = hop.use;
  if (const CellarLot* lot = lot_for(hop, cellar)) {
    bittering.lot = lot->lot.lot;
    bittering.on_hand_g = lot->lot.on_hand_g;
  }
  return bittering;
}

/// The recipe's additions as written: the IBU of each (0 for dry hops) and their late grams.
struct RecipeAsWritten {
  std::vector<double> ibu;
  std::vector<IbuTerm> terms;  // each addition's IBU and how its alpha is known
  double total_ibu = 0.0;
  double whirlpool_g = 0.0;
  double dry_hop_g = 0.0;
  double late_oil_ml = 0.0;                   // oil the late hops deliver, where known
  std::vector<std::size_t> late_without_oil;  // late additions whose total oil is not known
};

/// The oil an addition was written for: its own record, else its lot's, else the catalog midpoint.
std::optional<double> addition_oil(const HopAddition& hop, const Catalog& catalog, const Cellar* cellar) {
  if (hop.total_oil) return hop.total_oil;
  if (const CellarLot* lot = lot_for(hop, cellar); lot != nullptr && lot->lot.total_oil) return lot->lot.total_oil;
  if (const Variety* variety = find_variety(catalog, hop.variety); variety != nullptr && variety->total_oil)
    return variety->total_oil->mid();
  return std::nullopt;
}

void add_late_oil(const HopAddition& hop, std::size_t index, const Catalog& catalog, const Cellar* cellar,
                  RecipeAsWritten& written) {
  if (const auto oil = addition_oil(hop, catalog, cellar))
    written.late_oil_ml += hop.grams * *oil / 100.0;
  else
    written.late_without_oil.push_back(index);
}

/// Computes every addition's IBU; takes the whirlpool stand and dry-hop time into `plan`. Throws
/// InputError listing every addition whose alpha acid is not known.
RecipeAsWritten read_additions(const Recipe& recipe, const Catalog& catalog, const Cellar* cellar, BlendPlan& plan) {
  RecipeAsWritten written;
  written.ibu.assign(recipe.hops.size(), 0.0);
  written.terms.assign(recipe.hops.size(), IbuTerm{});
  bool have_whirlpool = false;
  std::vector<std::string> problems;
  for (std::size_t i = 0; i < recipe.hops.size(); ++i) {
    const HopAddition& hop = recipe.hops[i];
    if (hop.use == HopUse::dry_hop || hop.use == HopUse::whirlpool) add_late_oil(hop, i, catalog, cellar, written);
    if (hop.use == HopUse::dry_hop) {
      written.dry_hop_g += hop.grams;
      if (!plan.dry_hop_minutes) plan.dry_hop_minutes = hop.minutes;
      continue;
    }
    const auto alpha = addition_alpha_known(hop, catalog, cellar);
    if (!alpha) {
      problems.push_back(fmt::format("{}: /hops/{}: no alpha acid for {} (add \"alpha_acid\" to the addition)",
                                     recipe.source_file, i, hop.variety));
      continue;
    }
    written.ibu[i] = addition_bitterness(hop, alpha->first, plan.wort, plan.bitterness).ibu;
    written.terms[i] = IbuTerm{written.ibu[i], alpha->first, alpha->second, is_late_addition(hop.use, hop.minutes)};
    written.total_ibu += written.ibu[i];
    if (hop.use == HopUse::whirlpool) {
      written.whirlpool_g += hop.grams;
      if (!have_whirlpool) {
        have_whirlpool = true;
        if (hop.temperature_c) plan.whirlpool_temperature_c = *hop.temperature_c;
        if (hop.minutes) plan.whirlpool_minutes = *hop.minutes;
      }
    }
  }
  if (!problems.empty()) throw InputError(problems);
  return written;
}

/// The IBU to hold (the brewer's, else the recipe's target, else its current total) and the whirlpool
/// share (the brewer's, else the recipe's). Kept IBU is added once the charge is known.
IbuBudget recipe_budget(const Recipe& recipe, const BlendChoices& choices, const RecipeAsWritten& written) {
  IbuBudget budget;
  if (choices.ibu) {
    budget.target_ibu = *choices.ibu;
    budget.target_source = IbuTargetSource::given;
  } else if (recipe.target_ibu) {
    budget.target_ibu = *recipe.target_ibu;
    budget.target_source = IbuTargetSource::recipe_target;
  } else {
    budget.target_ibu = written.total_ibu;
    budget.target_source = IbuTargetSource::recipe_total;
  }
  const double late_g = written.whirlpool_g + written.dry_hop_g;
  if (choices.split)
    budget.whirlpool_share = *choices.split;
  else if (late_g > 0.0)
    budget.whirlpool_share = written.whirlpool_g / late_g;
  return budget;
}

/// The boil or first-wort addition with the most IBU (the first of equals), if any.
std::optional<std::size_t> largest_boil_addition(const Recipe& recipe, const std::vector<double>& ibu) {
  std::optional<std::size_t> largest;
  for (std::size_t i = 0; i < recipe.hops.size(); ++i) {
    const HopUse use = recipe.hops[i].use;
    if (use != HopUse::boil && use != HopUse::first_wort) continue;
    if (!largest || ibu[i] > ibu[*largest]) largest = i;
  }
  return largest;
}

/// The bittering charge for a recipe: the named variety at the largest addition's time, else that
/// addition itself. Throws InputError when there is neither.
BitteringHop recipe_bittering(const Recipe& recipe, std::optional<std::size_t> largest, const Catalog& catalog,
                              const Cellar* cellar, const BlendChoices& choices) {
  if (!choices.bittering.name.empty()) {
    const double minutes =
        largest && recipe.hops[*largest].minutes ? *recipe.hops[*largest].minutes : recipe.boil_minutes;
    return bittering_from(choices.bittering, catalog, cellar, minutes);
  }
  if (largest) return bittering_as_written(recipe, *largest, catalog, cellar);
  throw InputError(fmt::format("{}: /hops: no boil addition to use as the bittering charge", recipe.source_file),
                   {Remedy::name_bittering_variety, Remedy::no_bittering});
}

/// Every boil and first-wort addition but the charge is kept, with its IBU.
void keep_boil_additions(const Recipe& recipe, const RecipeAsWritten& written, BlendPlan& plan) {
  for (std::size_t i = 0; i < recipe.hops.size(); ++i) {
    const HopUse use = recipe.hops[i].use;
    if ((use == HopUse::boil || use == HopUse::first_wort) && plan.bittering_index != i) {
      plan.kept.push_back(i);
      plan.kept_terms.push_back(written.terms[i]);
      plan.ibu.kept_ibu += written.ibu[i];
    }
  }
}

/// The late-hop amount: the brewer's dose, else the recipe's own late grams (or the oil they deliver),
/// else our default rate.
void plan_late_amount(const Recipe& recipe, const BlendChoices& choices, const RecipeAsWritten& written,
                      BlendPlan& plan) {
  const double late_g = written.whirlpool_g + written.dry_hop_g;
  if (choices.dose) {
    plan.late = late_amount(*choices.dose, plan.wort.volume_l);
    plan.late_source = LateSource::given;
  } else if (choices.keep_recipe_oil) {
    if (late_g <= 0.0)
      throw InputError(
          fmt::format("{}: /hops: no whirlpool or dry-hop addition whose oil the blend could keep", recipe.source_file),
          {Remedy::give_late_amount});
    std::vector<std::string> problems;
    for (const std::size_t i : written.late_without_oil)
      problems.push_back(fmt::format("{}: /hops/{}: no total oil known for {} (add \"total_oil\" to the addition)",
                                     recipe.source_file, i, recipe.hops[i].variety));
    if (!problems.empty()) throw InputError(problems);
    plan.late = {LateAmount::Kind::oil_ml, written.late_oil_ml};
    plan.late_source = LateSource::recipe_oil;
  } else if (late_g > 0.0) {
    plan.late = {LateAmount::Kind::grams, late_g};
    plan.late_source = LateSource::recipe_grams;
  } else {
    plan.late = late_amount(LateDose{}, plan.wort.volume_l);
    plan.late_source = LateSource::default_rate;
  }
}

/// Without a recipe: the wort and the IBU as the brewer gave them, a 60-minute boil.
BlendPlan plan_without_recipe(const Catalog& catalog, const Cellar* cellar, const BlendChoices& choices,
                              const BitternessSettings& settings) {
  BlendPlan plan;
  plan.bitterness = settings;
  plan.wort.volume_l = choices.volume_l.value_or(0.0);
  plan.wort.gravity = choices.gravity.value_or(1.050);
  plan.wort.boil_minutes = 60.0;
  plan.ibu.target_ibu = choices.ibu.value_or(0.0);
  plan.ibu.target_source = IbuTargetSource::given;
  if (choices.split) plan.ibu.whirlpool_share = *choices.split;
  plan.late = late_amount(choices.dose.value_or(LateDose{}), plan.wort.volume_l);
  plan.late_source = choices.dose ? LateSource::given : LateSource::default_rate;
  if (!choices.no_bittering) plan.bittering = bittering_from(choices.bittering, catalog, cellar, 60.0);
  return plan;
}

}  // namespace

LateAmount late_amount(const LateDose& dose, double volume_l) {
  if (dose.kind == LateDose::Kind::oil_ml_per_hl) return {LateAmount::Kind::oil_ml, dose.value * volume_l / 100.0};
  return {LateAmount::Kind::grams, dose.value * volume_l};
}

std::optional<std::pair<double, AlphaOrigin>> addition_alpha_known(const HopAddition& hop, const Catalog& catalog,
                                                                   const Cellar* cellar) {
  const Variety* variety = find_variety(catalog, hop.variety);
  if (hop.alpha_acid) return std::make_pair(*hop.alpha_acid, AlphaOrigin{});
  if (const CellarLot* lot = lot_for(hop, cellar); lot != nullptr && lot->alpha_today)
    return std::make_pair(*lot->alpha_today, lot_alpha_origin(*lot, variety));
  if (variety != nullptr && variety->alpha_acid)
    return std::make_pair(variety->alpha_acid->mid(),
                          AlphaOrigin{std::make_pair(variety->alpha_acid->min, variety->alpha_acid->max), {}});
  return std::nullopt;
}

std::optional<double> addition_alpha(const HopAddition& hop, const Catalog& catalog, const Cellar* cellar) {
  if (const auto known = addition_alpha_known(hop, catalog, cellar)) return known->first;
  return std::nullopt;
}

BlendPlan plan_blend(const Recipe* recipe, const Catalog& catalog, const Cellar* cellar, const BlendChoices& choices,
                     const BitternessSettings& settings) {
  if (recipe == nullptr) return plan_without_recipe(catalog, cellar, choices, settings);
  BlendPlan plan;
  plan.bitterness = settings;
  plan.wort = wort_of(*recipe);
  const RecipeAsWritten written = read_additions(*recipe, catalog, cellar, plan);
  plan.ibu = recipe_budget(*recipe, choices, written);
  plan.mass_unit = recipe->notation.mass;
  plan_late_amount(*recipe, choices, written, plan);
  const std::optional<std::size_t> largest = largest_boil_addition(*recipe, written.ibu);
  if (!choices.no_bittering) {
    plan.bittering = recipe_bittering(*recipe, largest, catalog, cellar, choices);
    plan.bittering_index = largest;
  }
  keep_boil_additions(*recipe, written, plan);
  return plan;
}

Recipe blended_recipe(const Recipe& recipe, const BlendPlan& plan, const BlendResult& result) {
  Recipe out = recipe;
  out.hops.clear();
  // A target the brewer gave or the recipe had; a total the recipe merely computed to stays unwritten.
  if (plan.ibu.target_source != IbuTargetSource::recipe_total) out.target_ibu = plan.ibu.target_ibu;
  for (std::size_t i = 0; i < recipe.hops.size(); ++i) {
    if (plan.bittering_index == i && plan.bittering) {
      HopAddition hop = recipe.hops[i];
      hop.variety = plan.bittering->variety;
      hop.lot = plan.bittering->lot;
      hop.grams = result.bittering_grams;
      hop.alpha_acid = plan.bittering->alpha_percent;
      hop.form = plan.bittering->form;
      if (hop.grams > 0.0) out.hops.push_back(hop);
    } else if (std::find(plan.kept.begin(), plan.kept.end(), i) != plan.kept.end()) {
      out.hops.push_back(recipe.hops[i]);
    }
  }
  if (plan.bittering && !plan.bittering_index && result.bittering_grams > 0.0) {
    HopAddition hop;
    hop.variety = plan.bittering->variety;
    hop.lot = plan.bittering->lot;
    hop.grams = result.bittering_grams;
    hop.alpha_acid = plan.bittering->alpha_percent;
    hop.use = HopUse::boil;
    hop.minutes = plan.bittering->minutes;
    hop.form = plan.bittering->form;
    out.hops.insert(out.hops.begin(), hop);
  }
  for (const HopUse use : {HopUse::whirlpool, HopUse::dry_hop}) {
    for (const auto& part : result.parts) {
      const double grams = use == HopUse::whirlpool ? part.whirlpool_g : part.dry_hop_g;
      if (grams <= 0.0) continue;
      HopAddition hop;
      hop.variety = part.variety;
      hop.lot = part.lot;
      hop.grams = grams;
      hop.use = use;
      // A candidate without a known alpha has 0 here; the recipe then gives none (a file may not
      // say 0 % alpha acid, and bine never writes what it would refuse to read).
      if (part.alpha_percent > 0.0) hop.alpha_acid = part.alpha_percent;
      hop.total_oil = part.oil_ml_per_100g;
      hop.form = part.form;
      hop.amount_unit.clear();  // written in the recipe's unit
      if (use == HopUse::whirlpool) {
        hop.minutes = plan.whirlpool_minutes;
        hop.temperature_c = plan.whirlpool_temperature_c;
      } else {
        hop.minutes = plan.dry_hop_minutes;
      }
      out.hops.push_back(hop);
    }
  }
  return out;
}

}  // namespace bine
