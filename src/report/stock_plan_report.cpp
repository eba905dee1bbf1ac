#include "report/stock_plan_report.hpp"

#include <fmt/format.h>

#include <cmath>

#include "report/table.hpp"

namespace bine {
namespace {

double grams_2(double grams) { return std::round(grams * 100.0) / 100.0; }

void render_steps(std::ostream& out, const StockPlan& plan, UnitSystem units) {
  TextTable table({{"Brew day"},
                   {"Recipe"},
                   {"Batches", Align::right},
                   {"Lot"},
                   {"Variety"},
                   {"Takes", Align::right},
                   {"Short", Align::right}});
  for (const PlanStep& step : plan.steps) {
    std::vector<std::string> head{format_date(step.brew.on), step.brew.recipe.name,
                                  fmt::format("{}", step.brew.batches)};
    const auto row = [&](std::vector<std::string> rest) {
      std::vector<std::string> cells = head;
      cells.insert(cells.end(), rest.begin(), rest.end());
      table.add_row(std::move(cells));
      head = {"", "", ""};
    };
    for (const PlanDraw& d : step.taken) row({d.lot, d.variety, format_mass(d.grams, units), ""});
    for (const PlanDraw& d : step.short_of) row({"-", d.variety, "", format_mass(d.grams, units)});
    if (step.taken.empty() && step.short_of.empty()) row({"-", "-", "", ""});
  }
  table.render(out, "  ");
}

std::string then_text(const PlanStaleLot& s) {
  if (s.wanted_by.empty()) return fmt::format("no brew of the plan asks for {} from then on", s.variety);
  return fmt::format("{} by {} on {}", s.taken_stale ? "taken stale" : "left out", s.wanted_by,
                     format_date(*s.wanted_on));
}

void render_stale(std::ostream& out, const StockPlan& plan, UnitSystem units) {
  TextTable table({{"Lot"}, {"Variety"}, {"Stale from"}, {"Stale on brew day"}, {"Holds", Align::right}, {"Then"}});
  for (const PlanStaleLot& s : plan.stale)
    table.add_row({s.lot, s.variety, s.stale_from ? format_date(*s.stale_from) : "-", format_date(s.stale_on_brew),
                   format_mass(s.grams_left, units), then_text(s)});
  table.render(out, "  ");
}

}  // namespace

void render_stock_plan(std::ostream& out, const StockPlan& plan, const PlanSource& source, UnitSystem units) {
  out << fmt::format("Plan of {} against {}: {} brews from {} to {} (lots aged to each brew day; nothing written)\n",
                     source.schedule_file, source.stock_file, plan.steps.size(),
                     format_date(plan.steps.front().brew.on), format_date(plan.steps.back().brew.on));
  render_steps(out, plan, units);
  if (plan.shortages.empty()) {
    out << "Short: nothing; the stock serves every brew.\n";
  } else {
    out << "Short (to buy):\n";
    TextTable table({{"Variety"}, {"To buy", Align::right}, {"By"}, {"First brew short"}});
    for (const PlanShortage& s : plan.shortages)
      table.add_row({s.variety, format_mass(s.grams, units), format_date(s.by), s.first_recipe});
    table.render(out, "  ");
  }
  if (plan.stale.empty()) {
    out << fmt::format("Stale before use: none (stale below {:.0f} % of the certificate alpha).\n",
                       100.0 * source.stale_below);
  } else {
    out << fmt::format("Stale before use (below {:.0f} % of the certificate alpha while still holding hops):\n",
                       100.0 * source.stale_below);
    render_stale(out, plan, units);
  }
  for (const PlanStep& step : plan.steps)
    for (const std::string& note : step.notes) out << fmt::format("  note ({}): {}\n", format_date(step.brew.on), note);
}

nlohmann::json stock_plan_to_json(const StockPlan& plan, const PlanSource& source) {
  const auto draws = [](const std::vector<PlanDraw>& list, bool by_lot) {
    nlohmann::json rows = nlohmann::json::array();
    for (const PlanDraw& d : list) {
      nlohmann::json row{{"variety", d.variety}, {"grams", grams_2(d.grams)}};
      if (by_lot) row["lot"] = d.lot;
      rows.push_back(row);
    }
    return rows;
  };
  nlohmann::json brews = nlohmann::json::array();
  for (const PlanStep& step : plan.steps)
    brews.push_back({{"on", format_date(step.brew.on)},
                     {"recipe", step.brew.recipe.name},
                     {"recipe_file", step.brew.recipe_file},
                     {"batches", step.brew.batches},
                     {"takes", draws(step.taken, true)},
                     {"short", draws(step.short_of, false)},
                     {"notes", step.notes}});
  nlohmann::json shortages = nlohmann::json::array();
  for (const PlanShortage& s : plan.shortages)
    shortages.push_back({{"variety", s.variety},
                         {"grams", grams_2(s.grams)},
                         {"by", format_date(s.by)},
                         {"first_recipe", s.first_recipe}});
  nlohmann::json stale = nlohmann::json::array();
  for (const PlanStaleLot& s : plan.stale)
    stale.push_back({{"lot", s.lot},
                     {"variety", s.variety},
                     {"stale_from", s.stale_from ? nlohmann::json(format_date(*s.stale_from)) : nlohmann::json()},
                     {"stale_on_brew", format_date(s.stale_on_brew)},
                     {"grams_left", grams_2(s.grams_left)},
                     {"wanted_by", s.wanted_by.empty() ? nlohmann::json() : nlohmann::json(s.wanted_by)},
                     {"wanted_on", s.wanted_on ? nlohmann::json(format_date(*s.wanted_on)) : nlohmann::json()},
                     {"taken_stale", s.taken_stale},
                     {"reason", s.reason}});
  return {{"schedule", source.schedule_file},
          {"stock_file", source.stock_file},
          {"stale_below_percent", 100.0 * source.stale_below},
          {"brews", brews},
          {"short", shortages},
          {"stale", stale}};
}

}  // namespace bine
