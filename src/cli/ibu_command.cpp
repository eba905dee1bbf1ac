// bine ibu RECIPE: the recipe's bitterness, addition by addition, with BU:GU.
#include <fmt/format.h>

#include <memory>

#include "cli/commands.hpp"
#include "cli/option_values.hpp"
#include "engine/recipe_bitterness.hpp"
#include "io/limits.hpp"
#include "io/loaders.hpp"
#include "report/bitterness_report.hpp"

namespace bine::cli {
namespace {

struct IbuOptions {
  std::string recipe;
  std::string model = "tinseth";
  std::string pellet_factor;
  std::string calibration;
  bool json = false;
};

struct IbuArgs {
  std::string recipe;
  BitternessSettings settings;
  bool json = false;
};

IbuArgs parse_ibu_args(const IbuOptions& options) {
  OptionReader reader;
  IbuArgs args;
  args.recipe = options.recipe;
  args.json = options.json;
  if (auto model = ibu_model_from(options.model))
    args.settings.model = *model;
  else
    reader.add(fmt::format("--model: \"{}\": unknown model (expected tinseth or rager)", options.model));
  if (auto factor =
          reader.optional_quantity("--pellet-factor", options.pellet_factor, Dimension::number, limits::pellet_factor))
    args.settings.pellet_factor = *factor;
  if (auto factor =
          reader.optional_quantity("--calibration", options.calibration, Dimension::number, limits::calibration))
    args.settings.calibration = *factor;
  reader.throw_if_any();
  return args;
}

void run_ibu(const Console& console, const GlobalOptions& globals, const IbuArgs& args) {
  // 1. Load: the catalogs (alpha midpoints for additions without alpha) and the recipe.
  const DataSet data = load_data(globals, console);
  const Recipe recipe = load_recipe(args.recipe);
  // 2. Compute every addition.
  const RecipeBitterness bitterness = [&] {
    const auto timer = console.time("bitterness");
    return recipe_bitterness(recipe, data.catalog, args.settings);
  }();
  // 3. Render.
  print_result(
      console, args.json, [&] { return bitterness_to_json(recipe, bitterness); },
      [&](std::ostream& out) { render_bitterness(out, recipe, bitterness, globals.unit_system()); });
}

}  // namespace

void setup_ibu_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands) {
  auto options = std::make_shared<IbuOptions>();
  auto* ibu = app.add_subcommand("ibu", "a recipe's bitterness (IBU) per addition and in total, with BU:GU");
  ibu->add_option("RECIPE", options->recipe, "recipe file (JSON)")->required();
  ibu->add_option("--model", options->model, "tinseth (default) or rager");
  ibu->add_option("--pellet-factor", options->pellet_factor,
                  "utilization multiplier for pellets and powder (default 1.10, common practice)");
  ibu->add_option("--calibration", options->calibration,
                  "your brewhouse's measured/predicted IBU ratio, applied to every addition (default 1.0)");
  ibu->add_flag("--json", options->json, "print JSON (canonical units)");
  ibu->footer(
      "Examples:\n"
      "  bine ibu pale-ale.json\n"
      "  bine ibu pale-ale.json --model rager\n"
      "  bine --units us ibu hazy-ipa.json --json\n"
      "Whirlpool additions count their boil-equivalent minutes (Malowicki & Shellhammer 2005);\n"
      "a recipe \"hop_stand\" adds its boil-equivalent minutes to boil and first-wort additions.");
  commands.add(ibu,
               [&globals, options](const Console& console) { run_ibu(console, globals, parse_ibu_args(*options)); });
}

}  // namespace bine::cli
