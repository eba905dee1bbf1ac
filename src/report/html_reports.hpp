#pragma once
// The HTML page of each command, built by the shared writer (html_page, html_table, svg_chart)
// from the same result structs as the command's JSON; numbers on the page name their JSON value.
#include <string>

#include "engine/blend.hpp"
#include "engine/recipe_bitterness.hpp"
#include "engine/stock_view.hpp"
#include "engine/substitutes.hpp"
#include "model/hops.hpp"
#include "model/quantity.hpp"
#include "report/blend_report.hpp"
#include "report/html_page.hpp"
#include "report/rebalance_report.hpp"
#include "report/storage_report.hpp"

namespace bine {

/// bine ibu --html: the hop schedule as weighed, IBU per addition (chart), total with BU:GU; with
/// `intervals`, the total bitterness with its 90 % interval (the ten-column schedule has no room for
/// one per addition at 800 px: the text and JSON give them).
std::string ibu_html(const Recipe& recipe, const RecipeBitterness& bitterness, UnitSystem units,
                     const html::PageMeta& meta, const IbuIntervals* intervals = nullptr);

/// bine swap --html: ranked substitutes (lots, alpha on brew day, grams per gram), the missing
/// variety beside each of the best three (aroma per axis; alpha, beta, cohumulone for bittering).
std::string swap_html(const SwapResult& result, UnitSystem units, bool with_pairs, const html::PageMeta& meta);

/// bine blend --html: what to weigh for whirlpool and dry hop, target versus blend per aroma axis,
/// the IBU held part by part, the stock left after brewing.
std::string blend_html(const BlendResult& result, const BlendReportContext& context, UnitSystem units,
                       const html::PageMeta& meta);

/// bine rebalance --html: the schedule to weigh with the lots on hand (alpha on brew day, grams
/// before and after, IBU per addition before and after as a chart), the lots, stock left, shortfalls.
std::string rebalance_html(const Recipe& recipe, const RebalanceContext& context, const RebalanceResult& result,
                           UnitSystem units, const html::PageMeta& meta);

/// bine age --html: a lot's alpha on the day asked, from its certificate and its storage.
std::string age_html(const AgeQuery& query, const AgedAlpha& aged, UnitSystem units, const html::PageMeta& meta);

/// bine stock list --html: every lot's alpha on the day listed (a chart against the certificate),
/// share left, HSI state, stale flag, days until stale and amount; what each variety has on hand.
std::string stock_html(const StockView& view, UnitSystem units, const html::PageMeta& meta);

}  // namespace bine
