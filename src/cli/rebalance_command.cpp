// bine rebalance RECIPE: what to weigh out when the lots on the shelf are not the lots the recipe
// was written for.
#include <fmt/format.h>

#include <filesystem>
#include <iostream>
#include <memory>

#include "cli/brew_day_option.hpp"
#include "cli/commands.hpp"
#include "engine/rebalance.hpp"
#include "io/file_io.hpp"
#include "io/limits.hpp"
#include "io/loaders.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"
#include "report/rebalance_report.hpp"
#include "report/timings.hpp"

namespace bine::cli {
namespace {

struct RebalanceOptions {
  std::string recipe;
  std::vector<std::string> lots;  // "VARIETY=ALPHA%[,oil=ML]"
  std::string stock;
  std::string on;
  std::string model = "tinseth";
  bool json = false;
  std::string write;
};

constexpr std::string_view kLotForm = "VARIETY=ALPHA%[,oil=ML], such as \"Tidewell=7.9%,oil=1.4\"";

std::string trim(std::string text) {
  text.erase(0, text.find_first_not_of(' '));
  text.erase(text.find_last_not_of(' ') + 1);
  return text;
}

// One --lot value; problems go to `problems`.
std::optional<ReplacementLot> parse_lot(const std::string& text, const Recipe& recipe,
                                        std::vector<std::string>& problems) {
  const auto equals = text.find('=');
  if (equals == std::string::npos || trim(text.substr(0, equals)).empty()) {
    problems.push_back(fmt::format("--lot: \"{}\": no variety or no alpha acid (expected {})", text, kLotForm));
    return std::nullopt;
  }
  ReplacementLot lot;
  lot.variety = trim(text.substr(0, equals));
  if (!recipe_uses_variety(recipe, lot.variety)) {
    std::vector<std::string> used;
    for (const auto& hop : recipe.hops)
      if (!hop.variety.empty() && std::find(used.begin(), used.end(), hop.variety) == used.end())
        used.push_back(hop.variety);
    const std::string hint = did_you_mean(lot.variety, used);
    problems.push_back(fmt::format("--lot: \"{}\": the recipe does not use {} ({}the recipe uses {})", text,
                                   lot.variety, hint.empty() ? "" : hint + "; ", fmt::join(used, ", ")));
    return std::nullopt;
  }
  std::string rest = text.substr(equals + 1);
  bool ok = true;
  bool first = true;
  while (true) {
    const auto comma = rest.find(',');
    const std::string part = trim(rest.substr(0, comma));
    if (first) {
      if (auto alpha =
              read_option_quantity("--lot \"" + text + "\"", part, Dimension::percent, limits::alpha_acid, problems))
        lot.alpha_percent = *alpha;
      else
        ok = false;
      first = false;
    } else if (part.rfind("oil=", 0) == 0) {
      if (auto oil = read_option_quantity("--lot \"" + text + "\"", part.substr(4), Dimension::oil_content,
                                          limits::total_oil, problems))
        lot.total_oil = *oil;
      else
        ok = false;
    } else {
      problems.push_back(fmt::format("--lot: \"{}\": unknown part \"{}\" (expected {})", text, part, kLotForm));
      ok = false;
    }
    if (comma == std::string::npos) break;
    rest = rest.substr(comma + 1);
  }
  if (!ok) return std::nullopt;
  return lot;
}

struct Plan {
  BitternessSettings settings;
  BrewDay on;
};

/// Every option conflict, one line each.
Plan validate(const RebalanceOptions& options) {
  std::vector<std::string> problems;
  Plan plan;
  if (auto model = ibu_model_from(options.model))
    plan.settings.model = *model;
  else
    problems.push_back(fmt::format("--model: \"{}\": unknown model (expected tinseth or rager)", options.model));
  if (options.lots.empty() == options.stock.empty())
    problems.emplace_back(options.lots.empty()
                              ? "--lot, --stock: neither given (expected --lot VARIETY=ALPHA% ... or --stock FILE)"
                              : "--lot, --stock: both given (expected one: --lot for lots you name, --stock to take "
                                "them from your cold store)");
  try {
    plan.on = brew_day_from_option(options.on);
  } catch (const InputError& e) {
    problems.insert(problems.end(), e.lines().begin(), e.lines().end());
  }
  if (!problems.empty()) throw InputError(problems);
  return plan;
}

std::vector<ReplacementLot> lots_from_options(const RebalanceOptions& options, const Recipe& recipe) {
  std::vector<std::string> problems;
  std::vector<ReplacementLot> lots;
  for (const auto& text : options.lots) {
    auto lot = parse_lot(text, recipe, problems);
    if (!lot) continue;
    for (const auto& earlier : lots)
      if (fold_name(earlier.variety) == fold_name(lot->variety))
        problems.push_back(
            fmt::format("--lot: \"{}\": {} is given twice (expected one --lot per variety)", text, lot->variety));
    lots.push_back(std::move(*lot));
  }
  if (!problems.empty()) throw InputError(problems);
  return lots;
}

void run_rebalance(const GlobalOptions& globals, const RebalanceOptions& options) {
  const Plan plan = validate(options);
  // 1. Load: catalogs, the recipe, and the lots (named, or from the stock file aged to brew day).
  const DataSet data = [&] {
    PhaseTimer timer(globals.timings, "load data");
    return globals.load();
  }();
  const Recipe recipe = load_recipe(options.recipe);
  RebalanceContext context;
  context.on = plan.on.date;
  context.on_from_clock = plan.on.from_clock;
  context.from_stock = !options.stock.empty();
  std::vector<std::string> stock_notes;
  if (context.from_stock)
    context.lots = lots_from_stock(recipe, load_stock(options.stock), data.catalog, plan.on.date, stock_notes);
  else
    context.lots = lots_from_options(options, recipe);
  // 2. Rebalance.
  RebalanceResult result = [&] {
    PhaseTimer timer(globals.timings, "rebalance");
    return rebalance(recipe, context.lots, data.catalog, plan.settings);
  }();
  result.notes.insert(result.notes.begin(), stock_notes.begin(), stock_notes.end());
  // 3. Save the recipe to brew, if asked, then render.
  if (!options.write.empty()) {
    write_file_atomically(options.write, recipe_to_json(result.recipe_after).dump(2) + "\n");
    result.notes.push_back(fmt::format("rebalanced recipe written to {}", options.write));
  }
  if (options.json)
    std::cout << rebalance_to_json(recipe, context, result).dump(2) << '\n';
  else
    render_rebalance(std::cout, recipe, context, result, globals.unit_system());
}

}  // namespace

void setup_rebalance_command(CLI::App& app, const GlobalOptions& globals) {
  auto options = std::make_shared<RebalanceOptions>();
  auto* rebalance = app.add_subcommand("rebalance",
                                       "new grams for a recipe when the lots' alpha (or oil) differ, "
                                       "holding the recipe's IBU");
  rebalance->add_option("RECIPE", options->recipe, "recipe file (JSON)")->required();
  rebalance->add_option("--lot", options->lots, "a lot to brew with: VARIETY=ALPHA%[,oil=ML] (repeatable)");
  rebalance->add_option("--stock", options->stock, "take each variety's lot from this stock file (most on hand)");
  rebalance->add_option("--on", options->on, "brew day, YYYY-MM-DD, to age stock lots to (default: today)");
  rebalance->add_option("--model", options->model, "tinseth (default) or rager");
  rebalance->add_flag("--json", options->json, "print JSON (canonical units)");
  rebalance->add_option("--write", options->write, "save the rebalanced recipe to this file (written atomically)");
  rebalance->footer(
      "Examples:\n"
      "  bine rebalance pale-ale.json --lot \"Keelstone=14.9%\" --lot \"Tidewell=7.9%,oil=1.4\"\n"
      "  bine rebalance pale-ale.json --stock stock.json --on 2026-12-01\n"
      "  bine rebalance pale-ale.json --stock stock.json --on 2026-12-01 --write pale-ale-dec.json\n"
      "Boil and first-wort additions hold their IBU; whirlpool and dry-hop additions hold their oil (else\n"
      "grams) and the largest boil addition absorbs the IBU change.");
  rebalance->callback([&globals, options] { run_rebalance(globals, *options); });
}

}  // namespace bine::cli
