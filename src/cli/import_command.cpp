// bine import FILE --to catalog|stock|recipe: the brewer's own files (a CSV spec sheet, BeerXML hop
// records or a BeerXML recipe) turned into our JSON, checked by our own loaders before it is written.
#include <fmt/format.h>

#include <memory>

#include "cli/commands.hpp"
#include "cli/option_values.hpp"
#include "cli/recipe_file_options.hpp"
#include "io/beerxml.hpp"
#include "io/file_io.hpp"
#include "io/hop_import.hpp"
#include "io/loaders.hpp"
#include "io/recipe_file.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine::cli {
namespace {

struct ImportOptions {
  std::string file;
  std::string to;
  std::string out;
  std::vector<std::string> columns;  // "field=Header", comma-separated or repeated
  bool skip_bad = false;
  std::string name;
  RecipeFileOptions recipe_file;
};

enum class ImportTarget { catalog, stock, recipe };

struct ImportArgs {
  std::string file;
  ImportTarget to = ImportTarget::catalog;
  std::string out;
  CsvImportOptions csv;
  std::string name;
  BeerXmlReadOptions recipe_file;
};

ImportArgs parse_import_args(const ImportOptions& options) {
  OptionReader reader;
  ImportArgs args;
  args.file = options.file;
  args.out = options.out;
  args.csv.skip_bad = options.skip_bad;
  args.recipe_file = read_recipe_file_options(reader, options.recipe_file);
  if (options.to == "catalog" || options.to == "stock" || options.to == "recipe")
    args.to = options.to == "catalog" ? ImportTarget::catalog
              : options.to == "stock" ? ImportTarget::stock
                                      : ImportTarget::recipe;
  else
    reader.add(fmt::format("--to: \"{}\" is not one of catalog, stock or recipe", options.to));
  for (const auto& list : options.columns) {
    std::string_view rest = list;
    while (!rest.empty()) {
      const auto comma = rest.find(',');
      const std::string_view part = trim_space(rest.substr(0, comma));
      const auto equals = part.find('=');
      if (equals == std::string_view::npos || equals == 0)
        reader.add(fmt::format("--columns: \"{}\" is not FIELD=HEADER (fields: {})", part,
                               fmt::join(csv_field_names(), ", ")));
      else
        args.csv.columns.emplace_back(trim_space(part.substr(0, equals)), trim_space(part.substr(equals + 1)));
      rest = comma == std::string_view::npos ? std::string_view() : rest.substr(comma + 1);
    }
  }
  args.name = options.name.empty() ? std::filesystem::path(options.file).stem().string() : options.name;
  reader.throw_if_any();
  return args;
}

HopRecords read_records(const ImportArgs& args, const std::string& text) {
  if (looks_like_xml(text)) return read_hop_beerxml(text, args.file);
  try {
    return read_hop_csv(text, args.file, args.csv);
  } catch (const InputError& error) {
    // Only bad rows can be skipped; a malformed table or a missing column cannot.
    const bool rows = !error.lines().empty() && (error.lines().front().find(", column ") != std::string::npos ||
                                                 error.lines().front().find("no variety name") != std::string::npos);
    if (args.csv.skip_bad || !rows) throw;
    std::vector<std::string> lines = error.lines();
    lines.push_back(
        fmt::format("{}: nothing written (fix the rows above, or --skip-bad to import the good rows)", args.file));
    throw InputError(lines);
  }
}

/// The document to write and what to tell the brewer about it.
struct Imported {
  nlohmann::json document;
  std::string text;  // the document as written: checked to load again, within the size bine reads
  std::vector<std::string> report;
  std::string summary;
};

Imported import_hops(const ImportArgs& args, const DataSet& data) {
  const std::string text = read_text_file(args.file);
  const HopRecords records = read_records(args, text);
  Imported imported;
  imported.report = records.notes;
  for (const auto& skipped : records.skipped) imported.report.push_back("skipped " + skipped);
  const std::string label = args.out.empty() ? std::string("the imported file") : args.out;
  if (args.to == ImportTarget::catalog) {
    imported.document = hops_to_catalog(records, args.name, data.lexicon, imported.report);
    imported.text = imported.document.dump(2) + "\n";
    check_readable_size(imported.text, label);
    parse_catalog(imported.text, label, data.lexicon);  // what we write must load
    imported.summary = fmt::format("{} varieties from {}", imported.document["varieties"].size(), args.file);
  } else {
    imported.document = hops_to_stock(records, args.name, imported.report);
    imported.text = imported.document.dump(2) + "\n";
    check_readable_size(imported.text, label);
    parse_stock(imported.text, label);
    imported.summary = fmt::format("{} lots from {}", imported.document["lots"].size(), args.file);
  }
  return imported;
}

Imported import_recipe(const ImportArgs& args) {
  const RecipeFile file = read_recipe_file(args.file, args.recipe_file);
  if (file.format != RecipeFormat::beerxml)
    throw InputError(args.file +
                     ": --to recipe reads a BeerXML recipe (a CSV or bine JSON file holds no BeerXML RECIPE)");
  Imported imported;
  imported.document = recipe_to_json(file.recipe);
  imported.text = imported.document.dump(2) + "\n";
  checked_recipe_text(file.recipe, args.out.empty() ? std::string("the imported recipe") : args.out);  // loads again
  imported.report = file.notes;
  imported.summary =
      fmt::format("recipe \"{}\" ({} hop additions) from {}", file.recipe.name, file.recipe.hops.size(), args.file);
  return imported;
}

void run_import(const Console& console, const GlobalOptions& globals, const ImportArgs& args) {
  // 1. Load the lexicon (NOTES -> aroma tags) and read the file.
  const DataSet data = load_data(globals, console);
  const Imported imported = args.to == ImportTarget::recipe ? import_recipe(args) : import_hops(args, data);
  // 2. Write the file, or print it; the report goes beside it.
  if (args.out.empty()) {
    console.out << imported.text;
    for (const auto& line : imported.report) console.err << "bine: note: " << line << '\n';
    return;
  }
  write_loadable_file(args.out, imported.text);
  console.out << fmt::format("imported {} into {}\n", imported.summary, args.out);
  for (const auto& line : imported.report) console.out << "  - " << line << '\n';
}

}  // namespace

void setup_import_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands) {
  auto options = std::make_shared<ImportOptions>();
  auto* command = app.add_subcommand("import",
                                     "turn a CSV spec sheet or BeerXML file into a bine catalog, stock "
                                     "or recipe file");
  command->add_option("FILE", options->file, "CSV (comma or semicolon) or BeerXML 1.0 file")->required();
  command->add_option("--to", options->to, "what to make: catalog, stock or recipe (recipe: from BeerXML)")->required();
  command->add_option("--out", options->out, "write here (atomically) instead of printing the JSON");
  command->add_option("--columns", options->columns,
                      fmt::format("CSV: FIELD=HEADER,... when a header is not recognised (fields: {})",
                                  fmt::join(csv_field_names(), ", ")));
  command->add_flag("--skip-bad", options->skip_bad, "CSV: import the good rows and list the bad ones");
  command->add_option("--name", options->name, "name of the catalog or stock (default: the file name)");
  add_recipe_file_options(command, options->recipe_file);
  command->footer(
      "Examples:\n"
      "  bine import supplier-specs.csv --to catalog --out my-hops.json\n"
      "  bine import certificates.csv --to stock --columns \"alpha=AA (%),lot=Charge\" --skip-bad --out stock.json\n"
      "  bine import hops.xml --to catalog --out my-hops.json\n"
      "  bine import their-recipe.xml --to recipe --out recipe.json\n"
      "Headers are matched by name (\"Alpha %\", \"AA\", \"a-acid\", \"Total oil (mL/100 g)\" ...) and units\n"
      "are read from them (\"Amount (kg)\"); \"4,5\" is read as 4.5. BeerXML HSI (% of alpha lost in 6 months)\n"
      "becomes the variety's stability, 100 - HSI; a CSV \"HSI\" column is a lot's Hop Storage Index.");
  commands.add(command, [&globals, options](const Console& console) {
    run_import(console, globals, parse_import_args(*options));
  });
}

}  // namespace bine::cli
