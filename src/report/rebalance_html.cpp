// bine rebalance --html: the hop schedule to weigh with the lots on the shelf, IBU per addition
// before and after, the lots and their alpha on brew day, the stock left after brewing.
#include <fmt/format.h>

#include "report/bitterness_report.hpp"
#include "report/html_cells.hpp"
#include "report/html_reports.hpp"
#include "report/rebalance_report.hpp"
#include "report/svg_chart.hpp"

namespace bine {
namespace {

using html::Cell;

std::string add_pointer(std::size_t i, std::string_view key) { return fmt::format("/additions/{}/{}", i, key); }
std::string lot_pointer(std::size_t i, std::string_view key) { return fmt::format("/lots/{}/{}", i, key); }

/// The addition as written after rebalancing of row `position` (rows follow recipe_after's additions
/// one to one; a row's `index` is the addition of the recipe as written, which a split spreads over
/// several rows).
const HopAddition& hop_after(const RebalanceResult& result, std::size_t position) {
  return result.recipe_after.hops[position];
}

/// The interval of addition i (or of the total, without i) as rebalanced, or nullptr without intervals.
const IbuRange* after_range(const RebalanceIntervals* intervals, std::optional<std::size_t> i) {
  if (intervals == nullptr) return nullptr;
  return i ? &intervals->after.additions[*i] : &intervals->after.total;
}

std::string schedule_table(const RebalanceResult& result, const RebalanceIntervals* intervals, UnitSystem units) {
  html::Table table("Weigh the new grams; alpha is each lot's on brew day", {{"#", true},
                                                                             {"variety"},
                                                                             {"lot", false, true},
                                                                             {"use"},
                                                                             {"alpha on brew day", true},
                                                                             {"recipe had", true},
                                                                             {"weigh", true},
                                                                             {"IBU", true},
                                                                             {"how"}});
  for (std::size_t i = 0; i < result.additions.size(); ++i) {
    const RebalancedAddition& row = result.additions[i];
    const HopAddition& hop = hop_after(result, i);
    table.add_row({Cell(std::to_string(row.index + 1), add_pointer(i, "index")), row.variety,
                   hop.lot.empty() ? "-"
                   : row.parts > 1 ? fmt::format("{} (part {} of {})", hop.lot, row.part, row.parts)
                                   : hop.lot,
                   describe_use(row.use, hop.minutes, hop.temperature_c, units),
                   html::number_cell(row.alpha_after, 2, " %", add_pointer(i, "alpha_after")),
                   html::mass_cell(row.grams_before, units, add_pointer(i, "grams_before")),
                   html::mass_cell(row.grams_after, units, add_pointer(i, "grams_after")),
                   row.use == HopUse::dry_hop  // no IBU model for dry hops: "-" as in the text
                       ? html::Cell("-")
                       : html::ibu_cell(row.ibu_after, after_range(intervals, i), add_pointer(i, "ibu_after")),
                   std::string(to_string(row.rule))});
  }
  table.set_total({"", "total", "", "", "", "", "",
                   html::ibu_cell(result.after.total_ibu, after_range(intervals, std::nullopt), "/total_ibu_after"),
                   ""});
  return table.str();
}

std::string ibu_chart(const RebalanceResult& result, UnitSystem units) {
  html::BarChart chart;
  chart.id = "ibu";
  chart.title = "IBU per addition, recipe as written versus rebalanced";
  chart.axis_label = "bitterness (IBU)";
  chart.series = {"as written", "rebalanced"};
  chart.description = "Per addition, IBU as written then rebalanced:";
  for (std::size_t i = 0; i < result.additions.size(); ++i) {
    const RebalancedAddition& row = result.additions[i];
    const HopAddition& hop = hop_after(result, i);
    std::string label = fmt::format("{}. {}, {}", row.index + 1, row.variety,
                                    describe_use(row.use, hop.minutes, hop.temperature_c, units));
    chart.description += fmt::format(" {} {:.1f} and {:.1f} IBU;", label, row.ibu_before, row.ibu_after);
    chart.rows.push_back({std::move(label),
                          {row.ibu_before, row.ibu_after},
                          {fmt::format("{:.1f} IBU", row.ibu_before), fmt::format("{:.1f} IBU", row.ibu_after)},
                          {add_pointer(i, "ibu_before"), add_pointer(i, "ibu_after")}});
  }
  chart.description +=
      fmt::format(" total {:.1f} IBU before, {:.1f} IBU after.", result.before.total_ibu, result.after.total_ibu);
  return html::bar_chart(chart);
}

std::string lots_table(const RebalanceContext& context, UnitSystem units) {
  html::Table table("Alpha aged from the certificate to brew day", {{"variety"},
                                                                    {"lot"},
                                                                    {"certificate alpha", true},
                                                                    {"packaged"},
                                                                    {"days", true},
                                                                    {"alpha left", true},
                                                                    {"alpha on brew day", true},
                                                                    {"on hand", true}});
  for (std::size_t i = 0; i < context.lots.size(); ++i) {
    const ReplacementLot& lot = context.lots[i];
    table.add_row(
        {lot.variety, lot.lot_code.empty() ? "-" : lot.lot_code,
         lot.certificate_alpha
             ? html::number_cell(*lot.certificate_alpha, 2, " %", lot_pointer(i, "alpha_acid_certificate"))
             : Cell("-"),
         lot.packaged ? format_date(*lot.packaged) : "-",
         lot.packaged ? Cell(std::to_string(lot.days), lot_pointer(i, "days")) : Cell("-"),
         lot.packaged ? html::number_cell(lot.remaining, 1, " %", lot_pointer(i, "remaining"), 100.0) : Cell("-"),
         html::number_cell(lot.alpha_percent, 2, " %", lot_pointer(i, "alpha_acid")),
         lot.on_hand_g ? html::mass_cell(*lot.on_hand_g, units, lot_pointer(i, "on_hand_g")) : Cell("-")});
  }
  return table.str();
}

// On hand less every addition drawn from the lot.
std::string stock_left(const RebalanceContext& context, const RebalanceResult& result, UnitSystem units) {
  html::Table table("What the store holds once this batch is weighed out", {{"lot"}, {"left", true}});
  for (std::size_t i = 0; i < context.lots.size(); ++i) {
    const ReplacementLot& lot = context.lots[i];
    if (!lot.on_hand_g || lot.lot_code.empty()) continue;
    double left = *lot.on_hand_g;
    std::string minus;
    for (std::size_t a = 0; a < result.additions.size(); ++a)
      if (hop_after(result, a).lot == lot.lot_code) {
        left -= result.additions[a].grams_after;
        minus += (minus.empty() ? "" : " ") + add_pointer(a, "grams_after");
      }
    Cell cell("none: short, see Shortfalls");
    if (left >= 0.0) {
      cell = html::mass_cell(left, units, lot_pointer(i, "on_hand_g"));
      cell.minus = minus;
    }
    table.add_row({fmt::format("{} ({})", lot.variety, lot.lot_code), cell});
  }
  return table.empty() ? "" : table.str();
}

std::string shortfalls_table(const RebalanceResult& result, UnitSystem units) {
  html::Table table("Not enough on hand: buy or swap before brew day",
                    {{"lot"}, {"need", true}, {"have", true}, {"short", true}});
  for (std::size_t i = 0; i < result.shortfalls.size(); ++i) {
    const Shortfall& s = result.shortfalls[i];
    const auto p = [&](std::string_view key) { return fmt::format("/shortfalls/{}/{}", i, key); };
    table.add_row({fmt::format("{} ({})", s.variety, s.lot), html::mass_cell(s.needed_g, units, p("needed_g")),
                   html::mass_cell(s.on_hand_g, units, p("on_hand_g")),
                   html::mass_cell(s.needed_g - s.on_hand_g, units, p("short_g"))});
  }
  return table.str();
}

std::string absorber_text(const RebalanceResult& result, const RebalanceIntervals* intervals, UnitSystem units) {
  const std::string total = ibu_figure(result.after.total_ibu, after_range(intervals, std::nullopt));
  if (result.absorber) {
    const RebalancedAddition& row = result.additions[*result.absorber];
    const HopAddition& hop = hop_after(result, *result.absorber);
    return fmt::format("Addition {} ({}, {}) took the IBU change of {:+.2f} IBU, so the total holds at {}{}.",
                       row.index + 1, row.variety, describe_use(row.use, hop.minutes, hop.temperature_c, units),
                       result.ibu_change_absorbed, total, weighing_note(result));
  }
  if (result.whirlpool_scaled)
    return fmt::format(
        "No boil addition: the whirlpool additions took the IBU change of {:+.2f} IBU (their aroma "
        "changes); the total holds at {}{}.",
        result.ibu_change_absorbed, total, weighing_note(result));
  return fmt::format("Each addition holds its own IBU; the total stays at {}{}.", total, weighing_note(result));
}

/// A sentence per addition split across lots: its parts' IBU together, as written and rebalanced.
std::string splits_text(const Recipe& recipe, const RebalanceResult& result, const RebalanceIntervals* intervals) {
  std::string text;
  for (const SplitAddition& split : split_additions(result, intervals)) {
    const HopUse use = recipe.hops[split.index].use;
    text += html::paragraph(fmt::format(
        "Addition {} is weighed from {} lots (one has too little); {}{}.", split.index + 1, split.parts,
        use == HopUse::boil || use == HopUse::first_wort ? "its parts together hold its IBU"
                                                         : "its parts together hold what it delivers (oil, else grams)",
        use == HopUse::dry_hop
            ? std::string()
            : fmt::format(": {} as written, {} rebalanced", ibu_figure(split.ibu_before, split.before),
                          ibu_figure(split.ibu_after, split.after))));
  }
  return text;
}

}  // namespace

std::string rebalance_html(const Recipe& recipe, const RebalanceContext& context, const RebalanceResult& result,
                           UnitSystem units, const html::PageMeta& meta) {
  html::PageContent content;
  content.title = "Rebalanced hop schedule: " + (recipe.name.empty() ? recipe.source_file : recipe.name);
  const RebalanceIntervals* intervals = context.intervals;
  content.summary = fmt::format(
      "Brew day {}{}; {}. Total {} as written, {} rebalanced{}.", format_date(context.on),
      context.on_from_clock ? " (today)" : "", context.from_stock ? "lots from the stock file" : "lots as given",
      ibu_figure(result.before.total_ibu, intervals != nullptr ? &intervals->before.total : nullptr),
      ibu_figure(result.after.total_ibu, after_range(intervals, std::nullopt)),
      intervals != nullptr ? " (90 % intervals)" : "");
  content.sections.push_back(
      {"Hop schedule, as weighed", schedule_table(result, intervals, units) + splits_text(recipe, result, intervals) +
                                       html::paragraph(absorber_text(result, intervals, units))});
  content.sections.push_back({"Bitterness", ibu_chart(result, units)});
  content.sections.push_back({"Lots", lots_table(context, units)});
  if (std::string left = stock_left(context, result, units); !left.empty())
    content.sections.push_back({"Stock left after brewing", left});
  if (!result.shortfalls.empty()) content.sections.push_back({"Shortfalls", shortfalls_table(result, units)});
  content.notes = result.notes;
  content.notes.insert(content.notes.end(), result.before.notes.begin(), result.before.notes.end());
  if (intervals != nullptr)
    content.notes.push_back(interval_legend(result.after.settings.brewhouse.has_value(),
                                            intervals->before.aged || intervals->after.aged,
                                            intervals->before.monte_carlo || intervals->after.monte_carlo));
  content.cautions = html::boxed(cautions_for(recipe));
  return html::page(content, meta);
}

}  // namespace bine
