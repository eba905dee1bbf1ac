// Reading a recipe for a blend. The late additions (whirlpool and dry hop) are replaced by the
// blend; the boil addition with the most IBU is the bittering charge, re-solved to hold total IBU
// (or the variety given with --bittering at the same time); every other boil or first-wort addition
// is kept as it is. The whirlpool share of the late grams is the recipe's (whirlpool grams over all
// late grams) unless --split gives it, else 0.3; the whirlpool temperature and time are the recipe's
// first whirlpool addition's, else 80 C for 20 min (our defaults, a common hop-stand practice).
#include "engine/blend_plan.hpp"

#include <fmt/format.h>

#include <algorithm>

#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

const Lot* lot_for(const HopAddition& hop, const Stock* stock) {
  if (stock == nullptr) return nullptr;
  if (!hop.lot.empty()) return find_lot(*stock, hop.lot);
  for (const auto& lot : stock->lots)
    if (fold_name(lot.variety) == fold_name(hop.variety) && lot.on_hand_g && *lot.on_hand_g > 0.0) return &lot;
  return nullptr;
}

BitteringHop bittering_from(const std::string& variety, const Catalog& catalog, const Stock* stock, double minutes,
                            std::string_view where) {
  const Variety& known = require_variety(catalog, variety, where);
  HopAddition probe;
  probe.variety = known.name;
  BitteringHop hop;
  hop.variety = known.name;
  hop.minutes = minutes;
  if (const Lot* lot = lot_for(probe, stock)) {
    hop.lot = lot->lot;
    hop.form = lot->form;
    hop.on_hand_g = lot->on_hand_g;
  }
  const auto alpha = addition_alpha(probe, catalog, stock);
  if (!alpha)
    throw InputError(fmt::format("{}: {}: no alpha acid known (add it to the catalog or stock)", where, known.name));
  hop.alpha_percent = *alpha;
  return hop;
}

}  // namespace

std::optional<double> addition_alpha(const HopAddition& hop, const Catalog& catalog, const Stock* stock) {
  if (hop.alpha_acid) return hop.alpha_acid;
  if (const Lot* lot = lot_for(hop, stock); lot != nullptr && lot->alpha_acid) return lot->alpha_acid;
  if (const Variety* variety = find_variety(catalog, hop.variety); variety != nullptr && variety->alpha_acid)
    return variety->alpha_acid->mid();
  return std::nullopt;
}

BlendPlan plan_blend(const Recipe* recipe, const Catalog& catalog, const Stock* stock, const BlendChoices& choices,
                     const BitternessSettings& settings) {
  BlendPlan plan;
  if (recipe == nullptr) {
    plan.wort.volume_l = choices.volume_l.value_or(0.0);
    plan.wort.gravity = choices.gravity.value_or(1.050);
    plan.wort.boil_minutes = 60.0;
    plan.target_ibu = choices.ibu.value_or(0.0);
    plan.target_ibu_source = "--ibu";
    if (!choices.no_bittering)
      plan.bittering = bittering_from(choices.bittering_variety, catalog, stock, 60.0, "--bittering");
    if (choices.split) plan.whirlpool_share = *choices.split;
    return plan;
  }
  plan.wort = wort_of(*recipe);
  const std::string& file = recipe->source_file;
  // IBU of every addition as written, to find the bittering charge and the current total.
  std::vector<double> ibu(recipe->hops.size(), 0.0);
  double whirlpool_g = 0.0, dry_hop_g = 0.0, total = 0.0;
  bool have_whirlpool = false;
  std::vector<std::string> problems;
  for (std::size_t i = 0; i < recipe->hops.size(); ++i) {
    const HopAddition& hop = recipe->hops[i];
    if (hop.use == HopUse::dry_hop) {
      dry_hop_g += hop.grams;
      if (!plan.dry_hop_minutes) plan.dry_hop_minutes = hop.minutes;
      continue;
    }
    const auto alpha = addition_alpha(hop, catalog, stock);
    if (!alpha) {
      problems.push_back(
          fmt::format("{}: /hops/{}: no alpha acid for {} (add \"alpha_acid\" to the addition)", file, i, hop.variety));
      continue;
    }
    ibu[i] = addition_bitterness(hop, *alpha, plan.wort, settings).ibu;
    total += ibu[i];
    if (hop.use == HopUse::whirlpool) {
      whirlpool_g += hop.grams;
      if (!have_whirlpool) {
        have_whirlpool = true;
        if (hop.temperature_c) plan.whirlpool_temperature_c = *hop.temperature_c;
        if (hop.minutes) plan.whirlpool_minutes = *hop.minutes;
      }
    }
  }
  if (!problems.empty()) throw InputError(problems);

  if (choices.ibu) {
    plan.target_ibu = *choices.ibu;
    plan.target_ibu_source = "--ibu";
  } else if (recipe->target_ibu) {
    plan.target_ibu = *recipe->target_ibu;
    plan.target_ibu_source = "the recipe's target_ibu";
  } else {
    plan.target_ibu = total;
    plan.target_ibu_source = "the recipe's current total";
  }
  if (choices.split)
    plan.whirlpool_share = *choices.split;
  else if (whirlpool_g + dry_hop_g > 0.0)
    plan.whirlpool_share = whirlpool_g / (whirlpool_g + dry_hop_g);

  // The bittering charge: the boil or first-wort addition with the most IBU.
  std::optional<std::size_t> largest;
  for (std::size_t i = 0; i < recipe->hops.size(); ++i) {
    const HopUse use = recipe->hops[i].use;
    if (use != HopUse::boil && use != HopUse::first_wort) continue;
    if (!largest || ibu[i] > ibu[*largest]) largest = i;
  }
  if (!choices.no_bittering) {
    if (!choices.bittering_variety.empty()) {
      const double minutes =
          largest && recipe->hops[*largest].minutes ? *recipe->hops[*largest].minutes : recipe->boil_minutes;
      plan.bittering = bittering_from(choices.bittering_variety, catalog, stock, minutes, "--bittering");
      plan.bittering_index = largest;
    } else if (largest) {
      const HopAddition& hop = recipe->hops[*largest];
      BitteringHop bittering;
      bittering.variety = hop.variety;
      bittering.lot = hop.lot;
      bittering.alpha_percent = *addition_alpha(hop, catalog, stock);
      bittering.form = hop.form.value_or(HopForm::pellet);
      bittering.minutes = hop.minutes.value_or(recipe->boil_minutes);
      bittering.use = hop.use;
      if (const Lot* lot = lot_for(hop, stock)) {
        bittering.lot = lot->lot;
        bittering.on_hand_g = lot->on_hand_g;
      }
      plan.bittering = bittering;
      plan.bittering_index = largest;
    } else {
      throw InputError(
          fmt::format("{}: /hops: no boil addition to use as the bittering charge "
                      "(give --bittering VARIETY, or --no-bittering)",
                      file));
    }
  }
  for (std::size_t i = 0; i < recipe->hops.size(); ++i) {
    const HopUse use = recipe->hops[i].use;
    if ((use == HopUse::boil || use == HopUse::first_wort) && plan.bittering_index != i) {
      plan.kept.push_back(i);
      plan.kept_ibu += ibu[i];
    }
  }
  if (choices.no_bittering && largest) plan.notes.push_back("--no-bittering: every boil addition is kept as written");
  return plan;
}

Recipe blended_recipe(const Recipe& recipe, const BlendPlan& plan, const BlendResult& result) {
  Recipe out = recipe;
  out.hops.clear();
  out.target_ibu = result.target_ibu;
  for (std::size_t i = 0; i < recipe.hops.size(); ++i) {
    if (plan.bittering_index == i && result.bittering) {
      HopAddition hop = recipe.hops[i];
      hop.variety = result.bittering->variety;
      hop.lot = result.bittering->lot;
      hop.grams = result.bittering_grams;
      hop.alpha_acid = result.bittering->alpha_percent;
      hop.form = result.bittering->form;
      if (hop.grams > 0.0) out.hops.push_back(hop);
    } else if (std::find(plan.kept.begin(), plan.kept.end(), i) != plan.kept.end()) {
      out.hops.push_back(recipe.hops[i]);
    }
  }
  if (result.bittering && !plan.bittering_index && result.bittering_grams > 0.0) {
    HopAddition hop;
    hop.variety = result.bittering->variety;
    hop.lot = result.bittering->lot;
    hop.grams = result.bittering_grams;
    hop.alpha_acid = result.bittering->alpha_percent;
    hop.use = HopUse::boil;
    hop.minutes = result.bittering->minutes;
    hop.form = result.bittering->form;
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
      hop.alpha_acid = part.alpha_percent;
      hop.form = part.form;
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
