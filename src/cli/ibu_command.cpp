// bine ibu RECIPE: the recipe's bitterness, addition by addition, with BU:GU.
#include <fmt/format.h>

#include <memory>

#include "cli/bitterness_options.hpp"
#include "cli/cellar_options.hpp"
#include "cli/commands.hpp"
#include "cli/html_output.hpp"
#include "cli/option_values.hpp"
#include "cli/recipe_file_options.hpp"
#include "engine/ibu_interval.hpp"
#include "engine/lot_allocation.hpp"
#include "engine/recipe_bitterness.hpp"
#include "io/recipe_file.hpp"
#include "report/bitterness_report.hpp"
#include "report/html_reports.hpp"

namespace bine::cli {
namespace {

struct IbuOptions {
  std::string recipe;
  RecipeFileOptions recipe_file;
  BitternessOptions bitterness;
  std::string alpha_tolerance;
  std::string stock;
  CellarOptions cellar;
  bool json = false;
  std::string html;
};

struct IbuArgs {
  std::string recipe;
  BeerXmlReadOptions recipe_file;
  BitternessSettings settings;
  double alpha_tolerance = kDefaultCertificateTolerancePercent;
  std::string stock;  // the stock file the recipe's named lots are looked up in (may be empty)
  CellarChoice cellar;
  bool json = false;
  std::string html;
};

IbuArgs parse_ibu_args(const IbuOptions& options) {
  OptionReader reader;
  IbuArgs args;
  args.recipe = options.recipe;
  args.json = options.json;
  args.html = options.html;
  args.settings = read_bitterness_options(reader, options.bitterness);
  args.recipe_file = read_recipe_file_options(reader, options.recipe_file);
  args.alpha_tolerance = read_alpha_tolerance(reader, options.alpha_tolerance);
  args.cellar = read_cellar_options(reader, options.cellar);
  reader.throw_if_any();
  args.stock = stock_file_if_given(options.stock);
  return args;
}

void run_ibu(const Console& console, const GlobalOptions& globals, const IbuArgs& args) {
  // 1. Load: the catalogs (alpha midpoints for additions without alpha) and the recipe.
  const DataSet data = load_data(globals, console);
  const RecipeFile file = read_recipe_file(args.recipe, args.recipe_file);
  // The lots the recipe names, looked up in the stock (a lot-only addition takes its variety there).
  // Their alpha, where taken from the lot, is known as the lot's (certificate, ageing) for the intervals.
  std::vector<std::string> lot_notes;
  Recipe recipe = file.recipe;
  std::vector<std::optional<AlphaOrigin>> lot_alpha;
  if (args.stock.empty()) {
    require_stock_for_lot_only(recipe);
  } else {
    const Cellar cellar = load_cellar(args.stock, data.catalog, args.cellar);
    recipe = with_named_lots(recipe, cellar, lot_notes);
    lot_alpha = named_lot_alpha_origins(file.recipe, recipe, cellar, data.catalog);
  }
  // 2. Compute every addition.
  RecipeBitterness bitterness = [&] {
    const auto timer = console.time("bitterness");
    return recipe_bitterness(recipe, data.catalog, args.settings);
  }();
  bitterness.notes.insert(bitterness.notes.begin(), lot_notes.begin(), lot_notes.end());
  bitterness.notes.insert(bitterness.notes.begin(), file.notes.begin(), file.notes.end());
  const IbuIntervals intervals = recipe_intervals(bitterness, data.catalog, args.alpha_tolerance, lot_alpha);
  // 3. Render.
  write_html(args.html, [&] {
    return ibu_html(recipe, bitterness, globals.unit_system(), page_meta(&data, args.recipe), &intervals);
  });
  print_result(
      console, args.json, data, [&] { return bitterness_to_json(recipe, bitterness, &intervals); },
      [&](std::ostream& out) { render_bitterness(out, recipe, bitterness, globals.unit_system(), &intervals); });
}

}  // namespace

void setup_ibu_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands) {
  auto options = std::make_shared<IbuOptions>();
  auto* ibu = app.add_subcommand("ibu", "a recipe's bitterness (IBU) per addition and in total, with BU:GU");
  ibu->add_option("RECIPE", options->recipe, "recipe file (bine JSON or BeerXML 1.0)")->required();
  add_bitterness_options(ibu, options->bitterness);
  add_recipe_file_options(ibu, options->recipe_file);
  add_alpha_tolerance_option(ibu, options->alpha_tolerance);
  ibu->add_option("--stock", options->stock,
                  "look up the lots the recipe names in this stock file (default: $BINE_STOCK, if set)");
  add_cellar_options(ibu, options->cellar, false);
  ibu->add_flag("--json", options->json, "print JSON (canonical units)");
  add_html_option(ibu, options->html);
  ibu->footer(
      "Examples:\n"
      "  bine ibu pale-ale.json\n"
      "  bine ibu pale-ale.json --model rager\n"
      "  bine ibu pale-ale.json --brewhouse brewhouse.json --alpha-tolerance 3%\n"
      "  bine --units us ibu hazy-ipa.json --json\n"
      "  bine ibu their-recipe.xml --recipe-name \"Harbour Pale\" --whirlpool-temp 85C\n"
      "  bine ibu pale-ale.json --html pale-ale.html     # brew-day sheet to print\n"
      "  bine ibu pale-ale.json --stock stock.json --on 2026-12-01   # lots the recipe names looked up there\n"
      "Whirlpool additions count their boil-equivalent minutes (Malowicki & Shellhammer 2005);\n"
      "a recipe \"hop_stand\" adds its boil-equivalent minutes to boil and first-wort additions.\n"
      "Every IBU comes with its 90 % interval (alpha range or certificate tolerance, brewhouse factor).");
  commands.add(ibu,
               [&globals, options](const Console& console) { run_ibu(console, globals, parse_ibu_args(*options)); });
}

}  // namespace bine::cli
