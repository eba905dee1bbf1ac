#pragma once
// Rendering a blend: text tables for the terminal and one JSON document (the HTML page is
// blend_html in html_reports.hpp).
#include <nlohmann/json.hpp>
#include <optional>
#include <ostream>
#include <string>
#include <vector>

#include "engine/blend.hpp"
#include "engine/blend_plan.hpp"
#include "model/lexicon.hpp"
#include "model/quantity.hpp"

namespace bine {

/// What the renderers need besides the result: the axis names, the request (its target and its
/// plan: IBU budget, whirlpool stand, bittering hop) and notes for the reader.
struct BlendReportContext {
  const Lexicon* lexicon = nullptr;
  const BlendRequest* request = nullptr;
  std::string recipe_name;  // empty without --recipe
  bool stock_mode = false;
  std::optional<Date> on;  // the brew day the stock lots were aged to (stock mode)
  std::vector<std::string> notes;
  const BlendIntervals* intervals = nullptr;  // the 90 % intervals of its IBU figures, when shown
};

/// The interval of the blend's kept, late or total IBU (a member of BlendIntervals), of part k's, or
/// of the bittering charge's; nullptr when the context has no intervals.
const IbuRange* blend_range(const BlendReportContext& context, const IbuRange BlendIntervals::*which);
const IbuRange* part_range(const BlendReportContext& context, std::size_t k);
const IbuRange* bittering_range(const BlendReportContext& context);

/// Blend, profile versus target, fit, bittering charge, IBU breakdown, stock left, cautions.
void render_blend_text(std::ostream& out, const BlendResult& result, const BlendReportContext& context,
                       UnitSystem units);

/// Canonical units (g, C, min, %); keys: target, varieties, profile, fit, bittering, total_ibu ...
nlohmann::json blend_to_json(const BlendResult& result, const BlendReportContext& context);

/// The cautions a blend carries (hot wort at whirlpool; dry-hop refermentation; dogs).
std::vector<std::string> blend_cautions(const BlendResult& result);

}  // namespace bine
