// bine stock list --html: the cold store on one day, every lot's alpha aged to it, the stale ones
// flagged, and what each variety has on hand.
#include <fmt/format.h>

#include "report/bitterness_report.hpp"
#include "report/html_cells.hpp"
#include "report/html_reports.hpp"
#include "report/svg_chart.hpp"

namespace bine {
namespace {

using html::Cell;

std::string lot_pointer(std::size_t i, std::string_view key) { return fmt::format("/lots/{}/{}", i, key); }

Cell hsi_cell(const StockLine& line, std::size_t i) {
  if (!line.lot.hsi || !line.hsi_loss_percent) return Cell("not measured");
  return Cell(fmt::format("{:.2f} ({:.1f} % lost)", *line.lot.hsi, *line.hsi_loss_percent),
              lot_pointer(i, "hsi") + " " + lot_pointer(i, "hsi_loss_percent"));
}

Cell until_stale_cell(const StockLine& line, std::size_t i) {
  if (!line.days_until_stale) return Cell("not aged");
  if (*line.days_until_stale == 0) return Cell("below now");
  return Cell(fmt::format("{} days", *line.days_until_stale), lot_pointer(i, "days_until_stale"));
}

std::string lots_table(const StockView& view, UnitSystem units) {
  html::Table table("Every lot, alpha aged to the day listed", {{"lot", false, true},
                                                                {"variety"},
                                                                {"alpha today", true},
                                                                {"alpha left", true},
                                                                {"HSI", true},
                                                                {"stale"},
                                                                {"until stale", true},
                                                                {"on hand", true}});
  for (std::size_t i = 0; i < view.lots.size(); ++i) {
    const StockLine& line = view.lots[i];
    table.add_row(
        {line.code, line.lot.variety,
         line.alpha_today ? html::number_cell(*line.alpha_today, 2, " %", lot_pointer(i, "alpha_today"))
                          : Cell("unknown"),
         line.aged ? html::number_cell(line.remaining, 0, " %", lot_pointer(i, "remaining"), 100.0) : Cell("-"),
         hsi_cell(line, i), line.stale ? "STALE" : "no", until_stale_cell(line, i),
         line.lot.on_hand_g ? html::mass_cell(*line.lot.on_hand_g, units, lot_pointer(i, "on_hand_g"))
                            : Cell("not given")});
  }
  return table.str();
}

std::string totals_table(const StockView& view, UnitSystem units) {
  html::Table table("On hand per variety", {{"variety"}, {"lots", true}, {"on hand", true}, {"of it stale", true}});
  double all = 0.0;
  std::string all_pointers, lot_pointers;
  for (std::size_t v = 0; v < view.totals.size(); ++v) {
    const VarietyTotal& total = view.totals[v];
    const std::string base = fmt::format("/varieties/{}/", v);
    table.add_row({total.variety, Cell(fmt::format("{}", total.lots), base + "lots"),
                   html::mass_cell(total.on_hand_g, units, base + "on_hand_g"),
                   total.stale_g == 0.0 ? Cell("-") : html::mass_cell(total.stale_g, units, base + "stale_g")});
    all += total.on_hand_g;
    all_pointers += (all_pointers.empty() ? "" : " ") + base + "on_hand_g";
    lot_pointers += (lot_pointers.empty() ? "" : " ") + base + "lots";
  }
  Cell lots(fmt::format("{}", view.lots.size()), lot_pointers);
  Cell on_hand = html::mass_cell(all, units, all_pointers);
  lots.sum = on_hand.sum = true;
  table.set_total({"all varieties", lots, on_hand, ""});
  return table.str();
}

std::string alpha_chart(const StockView& view) {
  html::BarChart chart;
  chart.id = "alpha";
  chart.title = fmt::format("Alpha acid per lot: on the certificate and on {}", format_date(view.on));
  chart.axis_label = "alpha acid (% w/w)";
  chart.series = {"certificate", format_date(view.on)};
  chart.description = fmt::format("Per lot, alpha acid on the certificate then on {}:", format_date(view.on));
  for (std::size_t i = 0; i < view.lots.size(); ++i) {
    const StockLine& line = view.lots[i];
    if (!line.aged || !line.lot.alpha_acid || !line.alpha_today) continue;
    const std::string label = fmt::format("{} ({}){}", line.code, line.lot.variety, line.stale ? ", stale" : "");
    chart.rows.push_back({label,
                          {*line.lot.alpha_acid, *line.alpha_today},
                          {fmt::format("{:.2f} %", *line.lot.alpha_acid), fmt::format("{:.2f} %", *line.alpha_today)},
                          {"", lot_pointer(i, "alpha_today")}});
    chart.description += fmt::format(" {} {:.2f} % and {:.2f} %;", label, *line.lot.alpha_acid, *line.alpha_today);
  }
  return chart.rows.empty() ? std::string() : html::bar_chart(chart);
}

std::vector<std::string> stock_notes(const StockView& view) {
  std::vector<std::string> notes;
  for (const StockLine& line : view.lots)
    if (line.stale) notes.push_back(fmt::format("{} is stale: {}", line.code, line.stale_reason));
  for (const StockLine& line : view.lots)
    if (!line.aged)
      notes.push_back(fmt::format("{} has no alpha, packaged date or storage; {}", line.code,
                                  line.alpha_today ? "its certificate alpha is shown unaged" : "its alpha is unknown"));
  notes.emplace_back(
      "Alpha aged with the storage model of bine age (Garetz 1994), an estimate: a fresh lab analysis of a lot beats "
      "it. Until stale: days at the lot's storage until its alpha falls below the stale share.");
  return notes;
}

}  // namespace

std::string stock_html(const StockView& view, UnitSystem units, const html::PageMeta& meta) {
  html::PageContent content;
  content.title = fmt::format("Cold store on {}: {}", format_date(view.on), view.name);
  std::size_t stale = 0;
  for (const StockLine& line : view.lots) stale += line.stale ? 1 : 0;
  content.summary =
      fmt::format("{} lots, {} of them stale (below {:.0f} % of the certificate alpha, or an oxidised HSI).",
                  view.lots.size(), stale, 100.0 * view.stale_below);
  content.sections.push_back({"Lots", lots_table(view, units)});
  content.sections.push_back({"Per variety", totals_table(view, units)});
  if (std::string chart = alpha_chart(view); !chart.empty())
    content.sections.push_back({"Alpha acid per lot", std::move(chart)});
  content.notes = stock_notes(view);
  content.cautions = html::boxed({std::string(dogs_caution())});
  return html::page(content, meta);
}

}  // namespace bine
