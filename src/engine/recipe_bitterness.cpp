#include "engine/recipe_bitterness.hpp"

#include <fmt/format.h>

#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"

namespace bine {
namespace {

std::string list_positions(const std::vector<std::size_t>& positions) {
  std::string text;
  for (std::size_t i = 0; i < positions.size(); ++i) {
    if (i > 0) text += i + 1 == positions.size() ? " and " : ", ";
    text += std::to_string(positions[i] + 1);
  }
  return text;
}

}  // namespace

RecipeBitterness recipe_bitterness(const Recipe& recipe, const Catalog& catalog, const BitternessSettings& settings) {
  RecipeBitterness result;
  result.settings = settings;
  result.wort = wort_of(recipe);
  std::vector<std::string> problems;
  std::vector<std::size_t> form_assumed;
  for (std::size_t i = 0; i < recipe.hops.size(); ++i) {
    const HopAddition& hop = recipe.hops[i];
    AdditionLine line;
    line.index = i;
    line.variety = hop.variety.empty() ? hop.lot : hop.variety;
    line.lot = hop.lot;
    line.use = hop.use;
    line.minutes = hop.minutes;
    line.temperature_c = hop.temperature_c;
    line.grams = hop.grams;
    line.form = hop.form.value_or(HopForm::pellet);
    line.form_assumed = !hop.form.has_value();
    if (line.form_assumed) form_assumed.push_back(i);
    if (hop.use == HopUse::whirlpool) result.has_whirlpool = true;

    const Variety* variety = hop.variety.empty() ? nullptr : find_variety(catalog, hop.variety);
    if (variety == nullptr && !hop.variety.empty() && (hop.alpha_acid || hop.use == HopUse::dry_hop))
      result.notes.push_back(
          fmt::format("addition {}: \"{}\" is not in the loaded catalogs ({}); the recipe's own "
                      "values used",
                      i + 1, hop.variety, variety_hint(catalog, hop.variety)));
    if (hop.alpha_acid) {
      line.alpha_percent = *hop.alpha_acid;
      line.alpha_source = AlphaSource::recipe;
    } else if (variety != nullptr && variety->alpha_acid) {
      line.alpha_percent = variety->alpha_acid->mid();
      line.alpha_source = AlphaSource::catalog_midpoint;
      if (hop.use != HopUse::dry_hop)
        result.notes.push_back(
            fmt::format("addition {} ({}): no alpha acid in the recipe; catalog midpoint {:.1f} % used", i + 1,
                        line.variety, line.alpha_percent));
    } else if (hop.use == HopUse::dry_hop) {
      line.alpha_source = AlphaSource::none;  // 0 IBU whatever the alpha
    } else {
      problems.push_back(
          fmt::format("{}: /hops/{}/alpha_acid: is missing and {}: give the alpha acid % the recipe was written for",
                      recipe.source_file, i,
                      variety == nullptr ? fmt::format("\"{}\" is not in the loaded catalogs ({})", line.variety,
                                                       variety_hint(catalog, line.variety))
                                         : fmt::format("the catalog has no alpha acid for {}", variety->name)));
      continue;
    }
    line.bitterness = addition_bitterness(hop, line.alpha_percent, result.wort, settings);
    result.total_ibu += line.bitterness.ibu;
    result.additions.push_back(std::move(line));
  }
  if (!problems.empty()) throw InputError(problems);

  result.bu_gu = bu_gu_ratio(result.total_ibu, recipe.original_gravity);
  result.bu_gu_reading = bu_gu_reading(result.bu_gu);
  if (!form_assumed.empty())
    result.notes.push_back(fmt::format("addition{} {}: form not given; pellet assumed",
                                       form_assumed.size() > 1 ? "s" : "", list_positions(form_assumed)));
  for (const auto& line : result.additions)
    if (line.use == HopUse::first_wort) {
      result.notes.push_back("first-wort additions count the full boil (common practice)");
      break;
    }
  result.notes.push_back("boil gravity taken as the original gravity");
  return result;
}

}  // namespace bine
