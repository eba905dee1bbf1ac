#pragma once
// Rendering a recipe's bitterness breakdown (bine ibu) as a text table or JSON, plus the small
// pieces the rebalance renderer shares (times, cautions).
#include <nlohmann/json.hpp>
#include <ostream>
#include <string>

#include "engine/ibu_interval.hpp"
#include "engine/recipe_bitterness.hpp"
#include "model/quantity.hpp"
#include "report/output_format.hpp"

namespace bine {

/// Text report: one row per addition, totals, notes, cautions; the last line is the BU:GU reading.
/// With `intervals`, every IBU carries its 90 % interval ("38.9 IBU (35-43)").
void render_bitterness(std::ostream& out, const Recipe& recipe, const RecipeBitterness& bitterness, UnitSystem units,
                       const IbuIntervals* intervals = nullptr);
/// JSON report in canonical units (g, L, C, min, %); deterministic. With `intervals`, ibu_low and
/// ibu_high beside each IBU (total_ibu_low, total_ibu_high for the total).
nlohmann::json bitterness_to_json(const Recipe& recipe, const RecipeBitterness& bitterness,
                                  const IbuIntervals* intervals = nullptr);
/// "38.9 IBU (35-43)": the figure with its interval, 1 decimal in the interval when it is narrower than 5 IBU.
std::string ibu_with_interval(double ibu, const IbuRange& range);
/// The same, or "38.9 IBU" without a range.
std::string ibu_figure(double ibu, const IbuRange* range);
/// Puts KEY_low and KEY_high (the interval, 3 decimals, low at least 0) beside `key` in `object`.
void put_interval(nlohmann::json& object, const std::string& key, const IbuRange& range);
/// {"coverage": 0.9, "monte_carlo": ...}: how the intervals of a JSON document were computed.
nlohmann::json interval_json(bool monte_carlo);
/// "(IBU (low-high) = 90 % interval from ...; exact, linear)": what the intervals of a text report
/// hold (`brewhouse`: the factor's interval; `aged`: a stability range) and how they were computed.
std::string interval_legend(bool brewhouse, bool aged, bool monte_carlo);

/// "60 min", "1.5 h" stays "90 min"; days for dry-hop contact ("4 d") from 1 day up.
std::string format_minutes(double minutes);
/// "boil 60 min", "whirlpool 20 min at 80 C", "dry-hop 4 d", "first-wort".
std::string describe_use(HopUse use, std::optional<double> minutes, std::optional<double> temperature_c,
                         UnitSystem units);
/// The same for a recipe addition, with its cooling course ("whirlpool 25 min from 98 C to 82 C").
std::string describe_use(const HopAddition& hop, UnitSystem units);

/// "factor 0.912 (95 % 0.884-0.940)" or "boil factor ..., late-hop factor ...": a profile in one phrase.
std::string describe_profile(const BrewhouseProfile& profile);
/// "Brewhouse profile FILE (fitted DATE on N batches): factor ..." or "" without a profile.
std::string brewhouse_line(const BitternessSettings& settings);
/// The profile for JSON output: {"file", "date", "batches", "factor", "boil_factor", "late_factor"}, or null.
nlohmann::json brewhouse_json(const BitternessSettings& settings);

/// Hot-wort caution (whirlpool / hop stand present).
std::string_view hot_wort_caution();
/// Dry-hop refermentation caution (hop creep) for packaging.
std::string_view dry_hop_caution();
/// Hops are toxic to dogs, boiled or not.
std::string_view dogs_caution();
/// The cautions that apply to a recipe, each one line.
std::vector<std::string> cautions_for(const Recipe& recipe);

}  // namespace bine
