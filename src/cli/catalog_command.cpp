// bine catalog list|show|check: browse the variety data and validate any of our files.
#include <fmt/format.h>

#include <iostream>
#include <memory>

#include "cli/commands.hpp"
#include "io/loaders.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "report/catalog_report.hpp"

namespace bine::cli {
namespace {

struct CatalogOptions {
  bool json = false;
  std::string name;
  std::vector<std::string> files;
};

int run_check(const GlobalOptions& globals, const CatalogOptions& options) {
  // The lexicon is needed to check aroma axes; the catalogs themselves are not loaded.
  const Lexicon lexicon = load_lexicon(resolve_data_dir(globals.data_dir) / "lexicon.json");
  std::vector<std::string> problems;
  for (const auto& file : options.files) {
    try {
      const FileKind kind = check_file(file, lexicon);
      std::cout << fmt::format("{}: ok ({})\n", file, to_string(kind));
    } catch (const InputError& error) {
      problems.insert(problems.end(), error.lines().begin(), error.lines().end());
    }
  }
  if (!problems.empty()) throw InputError(problems);
  return 0;
}

}  // namespace

void setup_catalog_command(CLI::App& app, const GlobalOptions& globals) {
  auto options = std::make_shared<CatalogOptions>();
  auto* catalog = app.add_subcommand("catalog", "browse the variety catalogs and check files");
  catalog->require_subcommand(1);
  catalog->footer(
      "Examples:\n"
      "  bine catalog list\n"
      "  bine catalog show \"saltmarsh gold\"\n"
      "  bine --catalog my-hops.json catalog check my-hops.json stock.json recipe.json");

  auto* list = catalog->add_subcommand("list", "list every variety (shipped and --catalog files)");
  list->add_flag("--json", options->json, "print JSON: {\"varieties\": [...]}");
  list->callback([&globals, options] {
    const DataSet data = globals.load();
    if (options->json) {
      std::cout << catalog_to_json(data.catalog).dump(2) << '\n';
    } else {
      render_catalog_list(std::cout, data.catalog, data.lexicon);
    }
  });

  auto* show = catalog->add_subcommand("show", "show one variety in full");
  show->add_option("NAME", options->name, "variety name (case and accents do not matter)")->required();
  show->add_flag("--json", options->json, "print JSON");
  show->callback([&globals, options] {
    const DataSet data = globals.load();
    const Variety& variety = require_variety(data.catalog, options->name, "catalog show");
    if (options->json)
      std::cout << variety_to_json(variety).dump(2) << '\n';
    else
      render_variety(std::cout, variety, data.lexicon);
  });

  auto* check = catalog->add_subcommand("check", "validate catalog, stock, recipe or lexicon files");
  check->add_option("FILE", options->files, "files to check")->required();
  check->callback([&globals, options] { run_check(globals, *options); });
}

}  // namespace bine::cli
