#pragma once
// A whole recipe's bitterness: every addition through the chosen model, the alpha each one is
// computed with (and where it came from), totals, BU:GU, and the notes a brewer should read.
#include <optional>
#include <string>
#include <vector>

#include "engine/bitterness.hpp"
#include "model/hops.hpp"

namespace bine {

/// Where an addition's alpha acid came from.
enum class AlphaSource { recipe, catalog_midpoint, none };

/// One addition's line of the bitterness breakdown.
struct AdditionLine {
  std::size_t index = 0;  // position in recipe.hops
  std::string variety;    // variety name, else the lot code
  std::string lot;        // the lot code the recipe names, if any
  HopUse use = HopUse::boil;
  std::optional<double> minutes;
  std::optional<double> temperature_c;
  double grams = 0.0;
  HopForm form = HopForm::pellet;
  bool form_assumed = false;   // no form in the recipe: pellet assumed
  double alpha_percent = 0.0;  // alpha in the kettle (0 for a dry hop without data)
  AlphaSource alpha_source = AlphaSource::recipe;
  AdditionBitterness bitterness;
};

struct RecipeBitterness {
  BitternessSettings settings;
  WortContext wort;
  std::vector<AdditionLine> additions;
  double total_ibu = 0.0;
  double bu_gu = 0.0;
  std::string bu_gu_reading;
  bool has_whirlpool = false;      // hot-wort caution applies
  std::vector<std::string> notes;  // assumptions made, in words
};

/// Computes every addition of `recipe`. Alpha is the recipe's; if missing, the catalog variety's
/// alpha midpoint (noted); if neither, InputError naming `FILE: /hops/N/alpha_acid`. Dry hops need
/// no alpha (they add 0 IBU).
RecipeBitterness recipe_bitterness(const Recipe& recipe, const Catalog& catalog, const BitternessSettings& settings);

}  // namespace bine
