// bine rebalance RECIPE: what to weigh out when the lots on the shelf are not the lots the recipe
// was written for.
#include <fmt/format.h>

#include <algorithm>
#include <map>
#include <memory>

#include "cli/bitterness_options.hpp"
#include "cli/cellar_options.hpp"
#include "cli/commands.hpp"
#include "cli/html_output.hpp"
#include "cli/option_values.hpp"
#include "cli/recipe_file_options.hpp"
#include "engine/ibu_interval.hpp"
#include "engine/rebalance.hpp"
#include "engine/stock_rebalance.hpp"
#include "io/file_io.hpp"
#include "io/limits.hpp"
#include "io/loaders.hpp"
#include "io/recipe_file.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"
#include "report/html_reports.hpp"
#include "report/rebalance_report.hpp"

namespace bine::cli {
namespace {

struct RebalanceOptions {
  std::string recipe;
  RecipeFileOptions recipe_file;
  std::vector<std::string> lots;  // "VARIETY=ALPHA%[,oil=ML]"
  std::string stock;
  CellarOptions cellar;
  BitternessOptions bitterness;
  std::string alpha_tolerance;
  bool json = false;
  std::string write;
  std::string html;
};

/// A --lot as typed, with its values read.
struct LotOption {
  std::string text;
  ReplacementLot lot;
};

struct RebalanceArgs {
  std::string recipe;
  BeerXmlReadOptions recipe_file;
  std::vector<LotOption> lots;
  std::string stock;
  CellarChoice cellar;
  BitternessSettings settings;
  double alpha_tolerance = kDefaultCertificateTolerancePercent;
  bool json = false;
  std::string write;
  std::string html;
};

constexpr std::string_view kLotForm = "VARIETY=ALPHA%[,oil=ML], such as \"Tidewell=7.9%,oil=1.4\"";

/// One --lot value: the variety, then its alpha, then optional parts.
std::optional<LotOption> read_lot(OptionReader& reader, const std::string& text) {
  const auto equals = text.find('=');
  const std::string variety(trim_space(std::string_view(text).substr(0, std::min(equals, text.size()))));
  if (equals == std::string::npos || variety.empty()) {
    reader.add(fmt::format("--lot: \"{}\": no variety or no alpha acid (expected {})", text, kLotForm));
    return std::nullopt;
  }
  LotOption option{text, {}};
  option.lot.variety = variety;
  const std::string label = "--lot \"" + text + "\"";
  std::string_view rest = std::string_view(text).substr(equals + 1);
  bool ok = true;
  for (bool first = true;; first = false) {
    const auto comma = rest.find(',');
    const std::string_view part = trim_space(rest.substr(0, comma));
    if (first) {
      const auto alpha = reader.quantity(label, part, Dimension::percent, limits::alpha_acid);
      ok = ok && alpha.has_value();
      option.lot.alpha_percent = alpha.value_or(0.0);
    } else if (part.rfind("oil=", 0) == 0) {
      option.lot.total_oil = reader.quantity(label, part.substr(4), Dimension::oil_content, limits::total_oil);
      ok = ok && option.lot.total_oil.has_value();
    } else {
      reader.add(fmt::format("--lot: \"{}\": unknown part \"{}\" (expected {})", text, part, kLotForm));
      ok = false;
    }
    if (comma == std::string_view::npos) break;
    rest = rest.substr(comma + 1);
  }
  if (!ok) return std::nullopt;
  return option;
}

RebalanceArgs parse_rebalance_args(const RebalanceOptions& options) {
  OptionReader reader;
  RebalanceArgs args;
  args.recipe = options.recipe;
  args.stock = options.stock;
  args.json = options.json;
  args.write = options.write;
  args.html = options.html;
  args.settings = read_bitterness_options(reader, options.bitterness);
  args.alpha_tolerance = read_alpha_tolerance(reader, options.alpha_tolerance);
  args.recipe_file = read_recipe_file_options(reader, options.recipe_file);
  if (options.lots.empty() == options.stock.empty())
    reader.add(options.lots.empty()
                   ? "--lot, --stock: neither given (expected --lot VARIETY=ALPHA% ... or --stock FILE)"
                   : "--lot, --stock: both given (expected one: --lot for lots you name, --stock to take "
                     "them from your cold store)");
  for (const auto& text : options.lots)
    if (auto lot = read_lot(reader, text)) args.lots.push_back(std::move(*lot));
  args.cellar = read_cellar_options(reader, options.cellar);
  reader.throw_if_any();
  return args;
}

/// The --lot values against the recipe: each names a variety it uses, once.
std::vector<ReplacementLot> lots_for_recipe(const std::vector<LotOption>& options, const Recipe& recipe) {
  std::vector<std::string> used;
  for (const auto& hop : recipe.hops)
    if (!hop.variety.empty() && std::find(used.begin(), used.end(), hop.variety) == used.end())
      used.push_back(hop.variety);
  OptionReader reader;
  std::vector<ReplacementLot> lots;
  std::map<std::string, int> times_given;  // folded variety -> --lot options naming it so far
  for (const auto& [text, lot] : options) {
    if (!recipe_uses_variety(recipe, lot.variety)) {
      const std::string hint = did_you_mean(lot.variety, used);
      reader.add(fmt::format("--lot: \"{}\": the recipe does not use \"{}\" ({}the recipe uses {})", text, lot.variety,
                             hint.empty() ? "" : hint + "; ", fmt::join(used, ", ")));
      continue;
    }
    // Said once per variety however often it is repeated.
    if (++times_given[fold_name(lot.variety)] == 2)
      reader.add(fmt::format("--lot: \"{}\": \"{}\" is given more than once (expected one --lot per variety)", text,
                             lot.variety));
    lots.push_back(lot);
  }
  reader.throw_if_any();
  return lots;
}

void run_rebalance(const Console& console, const GlobalOptions& globals, const RebalanceArgs& args) {
  // 1. Load: catalogs, the recipe, and the lots (named, or from the stock file aged to brew day).
  const DataSet data = load_data(globals, console);
  const RecipeFile file = read_recipe_file(args.recipe, args.recipe_file);
  Recipe recipe = file.recipe;
  RebalanceContext context;
  context.on = args.cellar.on.date;
  context.on_from_clock = args.cellar.on.from_clock;
  context.from_stock = !args.stock.empty();
  // 2. Rebalance (from stock: each addition's lots chosen by the cellar's lot order, split where one
  //    lot has too little).
  RebalanceResult result;
  if (context.from_stock) {
    const Cellar cellar = load_cellar(args.stock, data.catalog, args.cellar);
    const auto timer = console.time("rebalance");
    StockRebalance stocked = rebalance_from_stock(recipe, cellar, data.catalog, args.settings, Weighing::as_weighed);
    context.lots = std::move(stocked.lots);
    recipe = std::move(stocked.recipe);
    result = std::move(stocked.result);
  } else {
    require_stock_for_lot_only(recipe);
    context.lots = lots_for_recipe(args.lots, recipe);
    const auto timer = console.time("rebalance");
    result = rebalance(recipe, context.lots, data.catalog, args.settings, Weighing::as_weighed);
  }
  result.notes.insert(result.notes.begin(), file.notes.begin(), file.notes.end());
  const RebalanceIntervals intervals = rebalance_intervals(result, data.catalog, args.alpha_tolerance);
  context.intervals = &intervals;
  // 3. Check the result by the recipe loader's bounds (nothing is shown or written otherwise), save
  //    it if asked, then render.
  checked_recipe_text(result.recipe_after, "the rebalanced recipe");
  if (!args.write.empty()) {
    const std::string written = write_recipe_file(args.write, file, result.recipe_after, &data.catalog);
    result.notes.push_back(fmt::format("rebalanced recipe written to {}", written));
  }
  write_html(args.html, [&] {
    return rebalance_html(recipe, context, result, globals.unit_system(), page_meta(&data, args.recipe, args.stock));
  });
  print_result(
      console, args.json, data, [&] { return rebalance_to_json(recipe, context, result); },
      [&](std::ostream& out) { render_rebalance(out, recipe, context, result, globals.unit_system()); });
}

}  // namespace

void setup_rebalance_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands) {
  auto options = std::make_shared<RebalanceOptions>();
  auto* rebalance = app.add_subcommand("rebalance",
                                       "new grams for a recipe when the lots' alpha (or oil) differ, "
                                       "holding the recipe's IBU");
  rebalance->add_option("RECIPE", options->recipe, "recipe file (bine JSON or BeerXML 1.0)")->required();
  rebalance->add_option("--lot", options->lots, "a lot to brew with: VARIETY=ALPHA%[,oil=ML] (repeatable)");
  rebalance->add_option("--stock", options->stock, "take the lots from this stock file (named lots, else --lot-order)");
  add_cellar_options(rebalance, options->cellar, true);
  add_bitterness_options(rebalance, options->bitterness);
  add_alpha_tolerance_option(rebalance, options->alpha_tolerance);
  add_recipe_file_options(rebalance, options->recipe_file);
  rebalance->add_flag("--json", options->json, "print JSON (canonical units)");
  rebalance
      ->add_option("--write", options->write,
                   "save the rebalanced recipe to this file (written atomically; .xml: BeerXML 1.0)")
      ->check(output_file_name());
  add_html_option(rebalance, options->html);
  rebalance->footer(
      "Examples:\n"
      "  bine rebalance pale-ale.json --lot \"Keelstone=14.9%\" --lot \"Tidewell=7.9%,oil=1.4\"\n"
      "  bine rebalance pale-ale.json --stock stock.json --on 2026-12-01\n"
      "  bine rebalance pale-ale.json --stock stock.json --on 2026-12-01 --write pale-ale-dec.json\n"
      "  bine rebalance their-recipe.xml --stock stock.json --write new.xml\n"
      "  bine rebalance pale-ale.json --stock stock.json --on 2026-12-01 --html brew-day.html\n"
      "  bine rebalance pale-ale.json --stock stock.json --on 2026-12-01 --lot-order most\n"
      "Boil and first-wort additions hold their IBU; whirlpool and dry-hop additions hold their oil (else\n"
      "grams) and the largest boil addition absorbs the IBU change. From stock, an addition is weighed from\n"
      "the lot it names, else oldest packaging first, split across lots where one has too little. Every IBU\n"
      "comes with its 90 % interval (alpha range, certificate tolerance, the stability range of stock lots'\n"
      "ageing, brewhouse factor); a split addition's parts each have theirs.");
  commands.add(rebalance, [&globals, options](const Console& console) {
    run_rebalance(console, globals, parse_rebalance_args(*options));
  });
}

}  // namespace bine::cli
