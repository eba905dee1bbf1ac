// bine ibu --html: the brew-day sheet of a recipe's bitterness.
#include <fmt/format.h>

#include "report/bitterness_report.hpp"
#include "report/html_cells.hpp"
#include "report/html_reports.hpp"
#include "report/svg_chart.hpp"

namespace bine {
namespace {

std::string addition_pointer(std::size_t i, std::string_view key) { return fmt::format("/additions/{}/{}", i, key); }

// As format_minutes writes it: minutes, or days from one day up (dry-hop contact).
html::Cell time_cell(const AdditionLine& line, std::size_t i) {
  if (line.use == HopUse::first_wort) return html::Cell("whole boil");
  if (!line.minutes) return html::Cell("-");
  return html::Cell(format_minutes(*line.minutes), addition_pointer(i, "minutes"),
                    *line.minutes >= 1440.0 ? 1.0 / 1440.0 : 1.0);
}

std::string schedule_table(const Recipe& recipe, const RecipeBitterness& b, UnitSystem units) {
  using html::Cell;
  html::Table table("Weigh out and add in this order (alpha is the value the IBU is computed with)",
                    {{"#", true},
                     {"variety"},
                     {"lot", false, true},
                     {"use"},
                     {"time", true},
                     {"temperature", true},
                     {"weigh", true},
                     {"form"},
                     {"alpha", true},
                     {"IBU", true}});
  double grams = 0.0;
  std::string all_grams;
  for (std::size_t i = 0; i < b.additions.size(); ++i) {
    const AdditionLine& line = b.additions[i];
    const std::string lot = line.index < recipe.hops.size() ? recipe.hops[line.index].lot : "";
    grams += line.grams;
    all_grams += (all_grams.empty() ? "" : " ") + addition_pointer(i, "grams");
    table.add_row({Cell(std::to_string(line.index + 1), addition_pointer(i, "index")), line.variety,
                   lot.empty() ? "-" : lot, std::string(to_string(line.use)), time_cell(line, i),
                   html::temperature_cell(line.temperature_c, units, addition_pointer(i, "temperature_c")),
                   html::mass_cell(line.grams, units, addition_pointer(i, "grams")),
                   std::string(to_string(line.form)) + (line.form_assumed ? " (assumed)" : ""),
                   line.alpha_source == AlphaSource::none
                       ? Cell("-")
                       : html::number_cell(line.alpha_percent, 1, " %", addition_pointer(i, "alpha_acid")),
                   html::number_cell(line.bitterness.ibu, 1, " IBU", addition_pointer(i, "ibu"))});
  }
  html::Cell total = html::mass_cell(grams, units, all_grams);
  total.sum = true;
  table.set_total(
      {"", "total", "", "", "", "", total, "", "", html::number_cell(b.total_ibu, 1, " IBU", "/total_ibu")});
  return table.str();
}

std::string ibu_chart(const RecipeBitterness& b, UnitSystem units) {
  html::BarChart chart;
  chart.id = "ibu";
  chart.title = "IBU per addition";
  chart.axis_label = "bitterness (IBU)";
  std::string desc = "Bar per hop addition, length in IBU:";
  for (std::size_t i = 0; i < b.additions.size(); ++i) {
    const AdditionLine& line = b.additions[i];
    html::ChartRow row;
    row.label = fmt::format("{}. {}, {}", line.index + 1, line.variety,
                            describe_use(line.use, line.minutes, line.temperature_c, units));
    row.values = {line.bitterness.ibu};
    row.texts = {fmt::format("{:.1f} IBU", line.bitterness.ibu)};
    row.json = {addition_pointer(i, "ibu")};
    desc += fmt::format(" {} {:.1f} IBU;", row.label, line.bitterness.ibu);
    chart.rows.push_back(std::move(row));
  }
  chart.description = desc + fmt::format(" total {:.1f} IBU.", b.total_ibu);
  return html::bar_chart(chart);
}

std::string totals_table(const Recipe& recipe, const RecipeBitterness& b, const IbuIntervals* intervals) {
  using html::Cell;
  html::Table table("", {{"figure"}, {"value", true}});
  table.add_row({"total bitterness",
                 html::ibu_cell(b.total_ibu, intervals != nullptr ? &intervals->total : nullptr, "/total_ibu")});
  table.add_row({"original gravity", html::number_cell(recipe.original_gravity, 3, " SG", "/original_gravity")});
  table.add_row({"BU:GU (IBU per gravity point)", html::number_cell(b.bu_gu, 2, "", "/bu_gu")});
  table.add_row({"reading (common practice)", b.bu_gu_reading});
  return table.str();
}

}  // namespace

std::string ibu_html(const Recipe& recipe, const RecipeBitterness& b, UnitSystem units, const html::PageMeta& meta,
                     const IbuIntervals* intervals) {
  html::PageContent content;
  const std::string name = recipe.name.empty() ? recipe.source_file : recipe.name;
  content.title = "Hop schedule: " + name;
  content.summary = fmt::format(
      "{} at OG {:.3f}, {} boil. {} model, pellet factor {:.2f}, calibration {:.2f}.",
      format_volume(recipe.batch_volume_l, units), recipe.original_gravity, format_minutes(recipe.boil_minutes),
      b.settings.model == IbuModel::rager ? "Rager" : "Tinseth", b.settings.pellet_factor, b.settings.calibration);
  content.sections.push_back({"Hop schedule, as weighed", schedule_table(recipe, b, units)});
  std::string bitterness = ibu_chart(b, units) + totals_table(recipe, b, intervals);
  if (recipe.hop_stand)
    bitterness += html::paragraph(fmt::format(
        "Hop stand: {} at {} after flame-out counts as {:.1f} boil minutes for boil and first-wort additions.",
        format_minutes(recipe.hop_stand->minutes), format_temperature(recipe.hop_stand->temperature_c, units),
        b.wort.stand_equivalent_minutes));
  if (recipe.target_ibu)
    bitterness += html::paragraph(fmt::format("The recipe aims at {:.1f} IBU: this schedule gives {:+.1f} IBU.",
                                              *recipe.target_ibu, b.total_ibu - *recipe.target_ibu));
  content.sections.push_back({"Bitterness", bitterness});
  content.notes = b.notes;
  if (intervals != nullptr)
    content.notes.push_back(interval_legend(b.settings.brewhouse.has_value(), intervals->aged, intervals->monte_carlo));
  content.cautions = html::boxed(cautions_for(recipe));
  return html::page(content, meta);
}

}  // namespace bine
