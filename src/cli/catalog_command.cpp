// bine catalog list|show|check: browse the variety data and validate any of our files.
#include <fmt/format.h>

#include <memory>

#include "cli/commands.hpp"
#include "engine/lot_allocation.hpp"
#include "io/compiled_catalog.hpp"
#include "io/loaders.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "report/catalog_report.hpp"

namespace bine::cli {
namespace {

struct CatalogOptions {
  bool json = false;
  bool csv = false;
  std::string name;
  std::vector<std::string> files;
  std::string stock;  // check: where the lots recipes name are looked up (besides stock files checked)
};

void run_list(const Console& console, const GlobalOptions& globals, const CatalogOptions& options) {
  const Printed printed = printed_as(options.json, options.csv);
  const DataSet data = load_data(globals, console);
  print_result(
      console, printed, data, [&] { return catalog_to_json(data.catalog); },
      [&] { return catalog_to_csv(data.catalog, data.lexicon); },
      [&](std::ostream& out) { render_catalog_list(out, data.catalog, data.lexicon); });
}

void run_show(const Console& console, const GlobalOptions& globals, const CatalogOptions& options) {
  const DataSet data = load_data(globals, console);
  const Variety& variety = require_variety(data.catalog, options.name, "catalog show");
  print_result(
      console, options.json, data, [&] { return variety_to_json(variety); },
      [&](std::ostream& out) { render_variety(out, variety, data.lexicon); });
}

/// The lots the recipes name, looked up in the stock files (a lot-only addition needs one).
void check_named_lots(const std::vector<std::string>& recipes, const std::vector<std::string>& stocks,
                      std::vector<std::string>& problems) {
  std::vector<Lot> lots;
  for (const auto& file : stocks) {
    try {
      const Stock stock = load_stock(file);
      lots.insert(lots.end(), stock.lots.begin(), stock.lots.end());
    } catch (const InputError& error) {
      problems.insert(problems.end(), error.lines().begin(), error.lines().end());
    }
  }
  for (const auto& file : recipes) {
    try {
      const Recipe recipe = load_recipe(file);
      if (stocks.empty())
        require_stock_for_lot_only(recipe);
      else
        with_lot_varieties(recipe, lots, fmt::format("{}", fmt::join(stocks, ", ")));
    } catch (const InputError& error) {
      for (const auto& line : error.lines())
        problems.push_back(stocks.empty() ? line + " (give --stock FILE, or check the stock file with it)" : line);
    }
  }
}

void run_check(const Console& console, const GlobalOptions& globals, const CatalogOptions& options) {
  // The lexicon is needed to check aroma axes; the catalogs themselves are not loaded.
  const std::filesystem::path data_dir = resolve_data_dir(globals.data);
  const Lexicon lexicon = load_lexicon(data_dir / "lexicon.json");
  std::vector<std::string> problems;
  std::vector<std::string> recipes;
  std::vector<std::string> stocks;
  if (!options.stock.empty()) stocks.push_back(options.stock);
  for (const auto& file : options.files) {
    try {
      if (is_compiled_catalog(file)) {
        std::vector<std::string> unchecked;
        const CompiledCatalog compiled(file);
        const std::string why = compiled.staleness(data_dir, unchecked);
        if (why.empty())
          console.out << fmt::format("{}: ok (compiled catalog, {} varieties, {})\n", file, compiled.size(),
                                     unchecked.empty() ? "matches its sources" : "sources not found to check");
        else
          problems.push_back(fmt::format("{}: stale compiled catalog ({}; compile it again)", file, why));
        continue;
      }
      const FileKind kind = check_file(file, lexicon);
      if (kind == FileKind::recipe) recipes.push_back(file);
      if (kind == FileKind::stock && file != options.stock) stocks.push_back(file);
      console.out << fmt::format("{}: ok ({})\n", file, to_string(kind));
    } catch (const InputError& error) {
      problems.insert(problems.end(), error.lines().begin(), error.lines().end());
    }
  }
  check_named_lots(recipes, stocks, problems);
  if (!problems.empty()) throw InputError(problems);
}

}  // namespace

void setup_catalog_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands) {
  auto options = std::make_shared<CatalogOptions>();
  auto* catalog = app.add_subcommand("catalog", "browse the variety catalogs and check files");
  catalog->require_subcommand(1);
  catalog->footer(
      "Examples:\n"
      "  bine catalog list\n"
      "  bine catalog list --csv\n"
      "  bine catalog show \"clairiere douce\"\n"
      "  bine --catalog my-hops.json catalog check my-hops.json stock.json recipe.json\n"
      "  bine catalog compile merchant-1.json merchant-2.json --out merchant.bine");

  auto* list = catalog->add_subcommand("list", "list every variety (shipped and --catalog files)");
  list->add_flag("--json", options->json, "print JSON: {\"varieties\": [...]}");
  list->add_flag("--csv", options->csv,
                 "print one CSV table for spreadsheets: a row per variety, units in the headers, "
                 "ranges as min and max columns (save it: > varieties.csv)");
  list->footer("Examples:\n  bine catalog list\n  bine catalog list --csv");
  commands.add(list, [&globals, options](const Console& console) { run_list(console, globals, *options); });

  auto* show = catalog->add_subcommand("show", "show one variety in full");
  show->add_option("NAME", options->name, "variety name (case and accents do not matter)")->required();
  show->add_flag("--json", options->json, "print JSON");
  commands.add(show, [&globals, options](const Console& console) { run_show(console, globals, *options); });

  auto* check = catalog->add_subcommand("check", "validate catalog, stock, recipe or lexicon files");
  check->add_option("FILE", options->files, "files to check")->required();
  check->add_option("--stock", options->stock,
                    "look up the lots recipes name in this stock file (stock files among FILE count too)");
  commands.add(check, [&globals, options](const Console& console) { run_check(console, globals, *options); });

  setup_catalog_compile_command(*catalog, globals, commands);
}

}  // namespace bine::cli
