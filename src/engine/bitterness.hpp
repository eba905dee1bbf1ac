#pragma once
// Bitterness models (API shared by ibu, rebalance and blend). See bitterness.cpp for the essay and
// sources (METHODS.md "Bitterness" and "Hop stand / whirlpool").
#include <optional>
#include <string>
#include <vector>

#include "model/hops.hpp"

namespace bine {

enum class IbuModel { tinseth, rager };
std::string_view to_string(IbuModel model);

struct BitternessSettings {
  IbuModel model = IbuModel::tinseth;
  double pellet_factor = 1.10;      // utilization multiplier for pellets and powder (common practice)
  double calibration = 1.0;         // brewhouse calibration factor on every addition
};

/// The wort the hops go into: volume at the end of the boil, boil gravity (the recipe's OG is used),
/// boil length.
struct WortContext {
  double volume_l = 0.0;
  double gravity = 1.0;
  double boil_minutes = 60.0;
};
WortContext wort_of(const Recipe& recipe);

struct AdditionBitterness {
  double effective_minutes = 0.0;   // boil minutes + boil-equivalent stand minutes
  double utilization = 0.0;         // fraction of alpha acid turned into measured IBU (incl. factors)
  double ibu = 0.0;
};

/// IBU of one addition of `grams` at `alpha_percent` (the alpha actually in the kettle).
AdditionBitterness addition_bitterness(const HopAddition& hop, double alpha_percent, const WortContext& wort,
                                       const BitternessSettings& settings);

}  // namespace bine
