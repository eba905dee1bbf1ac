// bine blend --html: the late-hop blend as weighed (whirlpool and dry hop), target versus blend per
// aroma axis, the IBU held part by part and the stock left after brewing.
#include <fmt/format.h>

#include "report/bitterness_report.hpp"
#include "report/html_cells.hpp"
#include "report/html_reports.hpp"
#include "report/svg_chart.hpp"

namespace bine {
namespace {

using html::Cell;

std::string part_name(const BlendPart& part) {
  return part.lot.empty() ? part.variety : fmt::format("{} ({})", part.variety, part.lot);
}

std::string var_pointer(std::size_t i, std::string_view key) { return fmt::format("/varieties/{}/{}", i, key); }

std::string weigh_table(const BlendResult& result, const BlendReportContext& context, UnitSystem units) {
  html::Table table("Late hops: the whirlpool part into the hot wort, the dry-hop part into the fermenter",
                    {{"variety (lot)"},
                     {"whirlpool", true},
                     {"dry hop", true},
                     {"total", true},
                     {"oil share", true},
                     {"alpha", true},
                     {"IBU", true}});
  for (std::size_t i = 0; i < result.parts.size(); ++i) {
    const BlendPart& part = result.parts[i];
    table.add_row({part_name(part), html::mass_cell(part.whirlpool_g, units, var_pointer(i, "whirlpool_g")),
                   html::mass_cell(part.dry_hop_g, units, var_pointer(i, "dry_hop_g")),
                   html::mass_cell(part.grams, units, var_pointer(i, "grams")),
                   html::number_cell(part.oil_share, 0, " %", var_pointer(i, "share"), 100.0),
                   html::number_cell(part.alpha_percent, 1, " %", var_pointer(i, "alpha_acid")),
                   html::ibu_cell(part.whirlpool_ibu, part_range(context, i), var_pointer(i, "whirlpool_ibu"))});
  }
  table.set_total({"late hops", "", "", html::mass_cell(result.late_grams, units, "/late_grams"), "", "",
                   html::ibu_cell(result.late_ibu, blend_range(context, &BlendIntervals::late), "/ibu/late")});
  return table.str();
}

std::string ibu_table(const BlendResult& result, const BlendReportContext& context, UnitSystem units) {
  const BlendPlan& plan = context.request->plan;
  html::Table table("", {{"part"}, {"weigh", true}, {"IBU", true}});
  if (plan.bittering) {
    const BitteringHop& hop = *plan.bittering;
    table.add_row(
        {fmt::format("bittering: {}{}, {:.1f} % alpha, boil {}", hop.variety,
                     hop.lot.empty() ? "" : " (" + hop.lot + ")", hop.alpha_percent, format_minutes(hop.minutes)),
         html::mass_cell(result.bittering_grams, units, "/bittering/grams"),
         html::ibu_cell(result.bittering_ibu, bittering_range(context), "/bittering/ibu")});
  }
  if (!plan.kept.empty() || plan.ibu.kept_ibu > 0.0)
    table.add_row({"other boil additions (kept as they are)", "-",
                   html::ibu_cell(plan.ibu.kept_ibu, blend_range(context, &BlendIntervals::kept), "/ibu/kept")});
  table.add_row({"late hops in the whirlpool", "see above",
                 html::ibu_cell(result.late_ibu, blend_range(context, &BlendIntervals::late), "/ibu/late")});
  table.set_total(
      {"total", "", html::ibu_cell(result.total_ibu, blend_range(context, &BlendIntervals::total), "/total_ibu")});
  return table.str();
}

std::string aroma_section(const BlendResult& result, const BlendReportContext& context) {
  const auto axes = context.lexicon->axis_names();
  const BlendTarget& target = context.request->target;
  html::BarChart chart;
  chart.id = "aroma";
  chart.title = "Aroma: target versus blend";
  chart.axis_label = "aroma intensity (0-5 scale)";
  chart.axis_max = 5.0;
  chart.series = {"target", "blend"};
  chart.description = "Per aroma axis, the target intensity (0-5) then the blend's:";
  html::Table table(fmt::format("Fit {:.2f} on the 0-5 scale (0 is exact)", result.fit),
                    {{"axis"}, {"target", true}, {"blend", true}, {"weight", true}});
  for (Eigen::Index a = 0; a < target.intensity.size(); ++a) {
    if (target.intensity[a] <= 0.0 && result.profile[a] < 0.05) continue;
    const std::string& axis = axes[static_cast<std::size_t>(a)];
    const std::string token = html::pointer_token(axis);
    chart.rows.push_back({axis,
                          {target.intensity[a], result.profile[a]},
                          {fmt::format("{:.1f}", target.intensity[a]), fmt::format("{:.1f}", result.profile[a])},
                          {"/target/" + token, "/profile/" + token}});
    chart.description += fmt::format(" {} {:.1f} and {:.1f};", axis, target.intensity[a], result.profile[a]);
    table.add_row({axis, html::number_cell(target.intensity[a], 1, "", "/target/" + token),
                   html::number_cell(result.profile[a], 1, "", "/profile/" + token),
                   html::number_cell(target.weight[a], 2, "", "/weights/" + token)});
  }
  return html::bar_chart(chart) + table.str();
}

std::string stock_left(const BlendResult& result, const BlendReportContext& context, UnitSystem units) {
  const std::optional<BitteringHop>& bittering = context.request->plan.bittering;
  html::Table table("What the store holds once this batch is weighed out", {{"lot"}, {"left", true}});
  for (std::size_t i = 0; i < result.parts.size(); ++i)
    if (result.parts[i].left_g)
      table.add_row(
          {part_name(result.parts[i]), html::mass_cell(*result.parts[i].left_g, units, var_pointer(i, "left_g"))});
  if (result.bittering_left_g && bittering) {
    bool listed = false;
    for (const auto& part : result.parts) listed = listed || (!part.lot.empty() && part.lot == bittering->lot);
    if (!listed)
      table.add_row({bittering->variety + " (" + bittering->lot + ")",
                     html::mass_cell(*result.bittering_left_g, units, "/bittering/left_g")});
  }
  return table.empty() ? "" : table.str();
}

}  // namespace

std::string blend_html(const BlendResult& result, const BlendReportContext& context, UnitSystem units,
                       const html::PageMeta& meta) {
  const BlendPlan& plan = context.request->plan;
  html::PageContent content;
  content.title = "Late-hop blend" + (context.recipe_name.empty() ? "" : " for " + context.recipe_name);
  content.summary = fmt::format(
      "{} of late hops delivering {:.1f} mL of oil; {:.0f} % of each goes in the whirlpool ({} for {}), the rest "
      "is dry hop. Bitterness held at {:.1f} IBU.",
      format_mass(result.late_grams, units), result.oil_ml, 100.0 * plan.ibu.whirlpool_share,
      format_temperature(plan.whirlpool_temperature_c, units), format_minutes(plan.whirlpool_minutes),
      plan.ibu.target_ibu);
  content.sections.push_back({"Weigh out", weigh_table(result, context, units)});
  content.sections.push_back({"Aroma", aroma_section(result, context)});
  content.sections.push_back({"Bittering charge and IBU", ibu_table(result, context, units)});
  if (std::string left = stock_left(result, context, units); !left.empty())
    content.sections.push_back({"Stock left after brewing", left});
  content.notes = context.notes;
  if (context.intervals != nullptr)
    content.notes.push_back(interval_legend(plan.bitterness.brewhouse.has_value(), context.intervals->aged,
                                            context.intervals->monte_carlo));
  content.notes.emplace_back(
      "The blend's aroma is the oil-weighted mean of its hops' profiles, a linear first approximation: oil "
      "compounds interact, so taste and adjust.");
  content.cautions = blend_cautions(result);
  return html::page(content, meta);
}

}  // namespace bine
