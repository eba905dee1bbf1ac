#include "report/recipe_swap_report.hpp"

#include <fmt/format.h>

#include "report/bitterness_report.hpp"
#include "report/output_format.hpp"
#include "report/rebalance_report.hpp"
#include "report/table.hpp"

namespace bine {
namespace {

std::string swapped_in_text(const RecipeSwapReport& report) {
  std::string text;
  for (const auto& in : report.swapped_in) {
    if (!text.empty()) text += " + ";
    text += in.hop.lot_code.empty() ? in.hop.variety : fmt::format("{} (lot {})", in.hop.variety, in.hop.lot_code);
    if (report.swapped_in.size() > 1) text += fmt::format(" {:.0f} %", 100.0 * in.share);
  }
  return text;
}

void render_coverage(std::ostream& out, const RecipeSwapReport& report, UnitSystem units) {
  if (!report.from_stock || report.coverage.empty()) return;
  out << "\nEach listed lot against what the recipe needs of it:\n";
  TextTable table({{"substitute"}, {"needs", Align::right}, {"on hand", Align::right}, {""}});
  for (const auto& c : report.coverage) {
    const double on_hand = c.on_hand_g.value_or(0.0);
    table.add_row(
        {c.name, format_mass(c.needed_g, units), format_mass(on_hand, units),
         c.needed_g <= on_hand + 1e-9 ? "covers" : fmt::format("short {}", format_mass(c.needed_g - on_hand, units))});
  }
  table.render(out);
}

}  // namespace

void render_recipe_swap(std::ostream& out, const RecipeSwapReport& report, UnitSystem units) {
  const Recipe& recipe = report.swap.split;
  out << fmt::format("\nSwapped into {}: {} replaced by {} ({})\n\n",
                     recipe.name.empty() ? recipe.source_file : recipe.name, report.missing, swapped_in_text(report),
                     report.choice);
  if (const BitternessSettings& settings = report.swap.result.before.settings; settings.brewhouse)
    out << brewhouse_line(settings) << ".\n\n";
  // Only the substitute's lots are checked against the stock (the coverage table below), so the
  // table never says that the stock covers every addition.
  render_rebalance_changes(out, recipe, report.swap.result, /*from_stock=*/false, units,
                           report.intervals ? &*report.intervals : nullptr);
  out << "Late additions take the oil factor, boil additions the alpha factor; the bittering charge holds the total.\n";
  render_coverage(out, report, units);
  if (!report.written.empty()) out << fmt::format("\nRecipe with the substitute written to {}\n", report.written);
}

nlohmann::json recipe_swap_to_json(const RecipeSwapReport& report) {
  using nlohmann::json;
  json out = rebalance_changes_json(report.swap.result, report.intervals ? &*report.intervals : nullptr);
  out["recipe"] = report.swap.split.name;
  out["missing"] = report.missing;
  json in = json::array();
  for (const auto& s : report.swapped_in)
    in.push_back({{"variety", s.hop.variety},
                  {"lot", s.hop.lot_code.empty() ? json(nullptr) : json(s.hop.lot_code)},
                  {"share", rounded(s.share, 3)},
                  {"alpha_acid", rounded(s.hop.alpha_percent, 4)},
                  {"total_oil", s.hop.total_oil ? json(rounded(*s.hop.total_oil, 4)) : json(nullptr)}});
  out["swapped_in"] = in;
  out["choice"] = report.choice;
  out["brewhouse"] = brewhouse_json(report.swap.result.before.settings);
  json coverage = json::array();
  for (const auto& c : report.coverage)
    coverage.push_back({{"substitute", c.name},
                        {"needed_g", rounded(c.needed_g, 1)},
                        {"on_hand_g", c.on_hand_g ? json(rounded(*c.on_hand_g, 1)) : json(nullptr)},
                        {"covers", !c.on_hand_g || c.needed_g <= *c.on_hand_g + 1e-9}});
  out["coverage"] = coverage;
  out["written"] = report.written.empty() ? json(nullptr) : json(report.written);
  return out;
}

}  // namespace bine
