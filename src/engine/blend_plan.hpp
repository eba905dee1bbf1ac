#pragma once
// What a blend keeps from a recipe and what it replaces: the wort, the IBU to hold, the boil
// additions kept, the bittering charge re-solved, the whirlpool/dry-hop split and the late-hop
// amount; and the recipe rewritten with the blend. The plan is the one home of these figures: the
// request (blend.hpp) contains it, and the search, the recipe writer and the report read them there.
// Method: docs/methods.md#bittering-charge and #blend-amounts.
#include <cstddef>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "engine/bitterness.hpp"
#include "engine/cellar.hpp"
#include "engine/ibu_interval.hpp"
#include "model/hops.hpp"

namespace bine {

struct BlendResult;

/// The boil addition re-solved to hold total IBU.
struct BitteringHop {
  std::string variety;
  std::string lot;
  double alpha_percent = 0.0;
  HopForm form = HopForm::pellet;
  double minutes = 60.0;
  std::optional<HopUse> use;        // boil (default) or first-wort
  std::optional<double> on_hand_g;  // when the lot is in the stock
  AlphaOrigin alpha_origin;         // how alpha_percent is known (its interval)
};

/// Where the IBU to hold comes from (the report words it).
enum class IbuTargetSource {
  given,          // the brewer gave it
  recipe_target,  // the recipe's target_ibu
  recipe_total,   // the recipe's additions as written
};

/// The IBU a blend holds and the part of the late hops that bitters: only their whirlpool grams
/// add IBU (dry hops add none in this model).
struct IbuBudget {
  double target_ibu = 0.0;
  IbuTargetSource target_source = IbuTargetSource::given;
  double kept_ibu = 0.0;         // boil additions kept as they are
  double whirlpool_share = 0.3;  // of each variety's late grams; the rest is dry hop

  /// IBU left for the whirlpool and the bittering charge.
  double room() const { return target_ibu - kept_ibu; }
};

/// How the brewer doses the late hops, per volume of wort.
struct LateDose {
  enum class Kind { grams_per_litre, oil_ml_per_hl };
  Kind kind = Kind::grams_per_litre;
  double value = 4.0;  // g/L (our default 4 g/L), or mL of oil per hL
};

/// The late-hop amount for the batch, which the blend's shares divide.
struct LateAmount {
  enum class Kind { grams, oil_ml };
  Kind kind = Kind::grams;
  double total = 0.0;  // g of late hops, or mL of oil they deliver
};

/// The dose times the wort volume: g/L x L, or mL/hL x L / 100.
LateAmount late_amount(const LateDose& dose, double volume_l);

/// A variety the brewer named, with where it was named in the caller's words ("--bittering"), so
/// that messages about it point back there.
struct NamedVariety {
  std::string name;
  std::string named_by = "the bittering variety";
};

/// What the brewer chose that overrides or stands in for the recipe.
struct BlendChoices {
  std::optional<double> ibu;       // IBU to hold
  NamedVariety bittering;          // empty name: the recipe's largest boil addition
  bool no_bittering = false;       // no bittering charge: the whirlpool gives the IBU left
  std::optional<double> split;     // whirlpool share of the late hops
  std::optional<LateDose> dose;    // late-hop rate or oil dose; none: the recipe's own amount, else 4 g/L
  bool keep_recipe_oil = false;    // hold the oil the recipe's late hops deliver instead of their grams
  std::optional<double> volume_l;  // wort volume (no recipe)
  std::optional<double> gravity;   // boil gravity (no recipe)
};

/// Where the late-hop amount comes from (the report words it).
enum class LateSource {
  given,         // --rate or --oil-dose
  recipe_grams,  // the recipe's own whirlpool and dry-hop grams
  recipe_oil,    // the oil the recipe's late hops deliver
  default_rate,  // no recipe amount: our default of 4 g/L
};

struct BlendPlan {
  WortContext wort;
  BitternessSettings bitterness;
  IbuBudget ibu;
  LateAmount late;
  LateSource late_source = LateSource::given;
  std::optional<BitteringHop> bittering;       // nullopt: no charge, late IBU must equal the room left
  std::optional<std::size_t> bittering_index;  // the recipe addition the charge replaces
  std::vector<std::size_t> kept;               // recipe additions kept (boil and first-wort, not bittering)
  std::vector<IbuTerm> kept_terms;             // their IBU and how their alpha is known, one per kept
  double whirlpool_temperature_c = 80.0;
  double whirlpool_minutes = 20.0;
  std::optional<double> dry_hop_minutes;
  std::string mass_unit;  // the recipe's hop amounts are written and weighed in it ("" is grams)
};

/// The alpha acid of a recipe addition: its own value, else its lot's (or the first lot of its variety
/// in lot order) on the cellar's brew day, else the catalog midpoint. nullopt when none is known.
std::optional<double> addition_alpha(const HopAddition& hop, const Catalog& catalog, const Cellar* cellar);

/// The same with how the alpha is known: written (a certificate's within its tolerance), its lot's
/// on the brew day, or the catalog midpoint over the variety's range.
std::optional<std::pair<double, AlphaOrigin>> addition_alpha_known(const HopAddition& hop, const Catalog& catalog,
                                                                   const Cellar* cellar);

/// Plans a blend for `recipe` (or, without one, for the wort the choices describe). Throws
/// InputError naming the recipe field, or the variety as the choices name it, when something needed
/// is missing.
BlendPlan plan_blend(const Recipe* recipe, const Catalog& catalog, const Cellar* cellar, const BlendChoices& choices,
                     const BitternessSettings& settings);

/// The recipe with its late additions replaced by the blend and the bittering charge re-solved.
Recipe blended_recipe(const Recipe& recipe, const BlendPlan& plan, const BlendResult& result);

}  // namespace bine
