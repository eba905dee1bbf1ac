// bine age --html: a lot's alpha acid on the day asked, from its certificate and its storage.
#include <fmt/format.h>

#include "report/bitterness_report.hpp"
#include "report/html_cells.hpp"
#include "report/html_reports.hpp"
#include "report/svg_chart.hpp"

namespace bine {
namespace {

using html::Cell;

std::string figures_table(const AgeQuery& query, const AgedAlpha& aged, UnitSystem units) {
  html::Table table("", {{"figure"}, {"value", true}});
  table.add_row(
      {"alpha on the certificate", html::number_cell(query.history.alpha_percent, 2, " %", "/alpha_acid_packaged")});
  table.add_row({"packaged", Cell(format_date(query.packaged), "/packaged")});
  table.add_row({"days stored", Cell(fmt::format("{:.0f} d", query.history.days), "/days")});
  table.add_row(
      {"stored at", html::temperature_cell(query.history.storage.temperature_c, units, "/storage/temperature_c")});
  table.add_row({"package", Cell(std::string(to_string(query.history.storage.package)), "/storage/package")});
  table.add_row({fmt::format("stability (alpha left after 6 months at {}, open)", format_temperature(20.0, units)),
                 html::number_cell(query.history.stability_percent, 1, " %", "/stability_percent")});
  table.add_row({"stability from", Cell(query.stability_source, "/stability_source")});
  table.add_row({"loss rate at 20 C, open", html::number_cell(aged.rate_per_day, 6, " per day", "/rate_per_day")});
  table.add_row({"temperature factor", html::number_cell(aged.temperature_factor, 3, "", "/temperature_factor")});
  table.add_row({"package factor", html::number_cell(aged.package_factor, 2, "", "/package_factor")});
  table.add_row({"alpha left", html::number_cell(aged.remaining, 1, " %", "/remaining", 100.0)});
  table.set_total({fmt::format("alpha on {}", format_date(query.on)),
                   html::number_cell(aged.alpha_percent, 2, " %", "/alpha_acid")});
  return table.str();
}

std::string alpha_chart(const AgeQuery& query, const AgedAlpha& aged) {
  html::BarChart chart;
  chart.id = "alpha";
  chart.title = "Alpha acid at packaging and on the day asked";
  chart.axis_label = "alpha acid (% w/w)";
  chart.rows.push_back({fmt::format("packaged {}", format_date(query.packaged)),
                        {query.history.alpha_percent},
                        {fmt::format("{:.2f} %", query.history.alpha_percent)},
                        {"/alpha_acid_packaged"}});
  chart.rows.push_back({fmt::format("on {} ({:.0f} days later)", format_date(query.on), query.history.days),
                        {aged.alpha_percent},
                        {fmt::format("{:.2f} %", aged.alpha_percent)},
                        {"/alpha_acid"}});
  chart.description =
      fmt::format("Alpha acid {:.2f} % when packaged on {}, estimated {:.2f} % on {}.", query.history.alpha_percent,
                  format_date(query.packaged), aged.alpha_percent, format_date(query.on));
  return html::bar_chart(chart);
}

}  // namespace

std::string age_html(const AgeQuery& query, const AgedAlpha& aged, UnitSystem units, const html::PageMeta& meta) {
  html::PageContent content;
  content.title = fmt::format("Alpha acid on {}: {:.2f} %", format_date(query.on), aged.alpha_percent);
  content.summary =
      fmt::format("{:.1f} % of the {:.2f} % on the certificate is left after {:.0f} days{}.", 100.0 * aged.remaining,
                  query.history.alpha_percent, query.history.days, query.on_from_clock ? " (to today)" : "");
  content.sections.push_back({"Estimate", alpha_chart(query, aged) + figures_table(query, aged, units)});
  content.notes = query.notes;
  if (aged.warm_extrapolation)
    content.notes.push_back(
        "stored above 20 C: the temperature factor is extrapolated there and the estimate is rough");
  content.notes.emplace_back(
      "First-order loss after Garetz (1994). An estimate: a fresh lab analysis of the lot beats it; use the alpha "
      "on brew day to recompute the bittering grams (bine rebalance).");
  content.cautions = html::boxed({std::string(dogs_caution())});
  return html::page(content, meta);
}

}  // namespace bine
