// bine ibu RECIPE: the recipe's bitterness, addition by addition, with BU:GU.
#include <fmt/format.h>

#include <iostream>
#include <memory>

#include "cli/commands.hpp"
#include "engine/recipe_bitterness.hpp"
#include "io/loaders.hpp"
#include "model/errors.hpp"
#include "report/bitterness_report.hpp"
#include "report/timings.hpp"

namespace bine::cli {
namespace {

struct IbuOptions {
  std::string recipe;
  std::string model = "tinseth";
  double pellet_factor = 1.10;
  double calibration = 1.0;
  bool json = false;
};

/// Every problem with the options, one line each.
BitternessSettings validate(const IbuOptions& options) {
  std::vector<std::string> problems;
  BitternessSettings settings;
  if (auto model = ibu_model_from(options.model))
    settings.model = *model;
  else
    problems.push_back(fmt::format("--model: \"{}\": unknown model (expected tinseth or rager)", options.model));
  if (!(options.pellet_factor >= 0.5 && options.pellet_factor <= 2.0))
    problems.push_back(fmt::format("--pellet-factor: {:g}: out of range (expected 0.5-2.0; common practice 1.10)",
                                   options.pellet_factor));
  if (!(options.calibration > 0.0 && options.calibration <= 5.0))
    problems.push_back(fmt::format("--calibration: {:g}: out of range (expected above 0 and at most 5; 1.0 = none)",
                                   options.calibration));
  if (!problems.empty()) throw InputError(problems);
  settings.pellet_factor = options.pellet_factor;
  settings.calibration = options.calibration;
  return settings;
}

void run_ibu(const GlobalOptions& globals, const IbuOptions& options) {
  const BitternessSettings settings = validate(options);
  // 1. Load: the catalogs (alpha midpoints for additions without alpha) and the recipe.
  const DataSet data = [&] {
    PhaseTimer timer(globals.timings, "load data");
    return globals.load();
  }();
  const Recipe recipe = load_recipe(options.recipe);
  // 2. Compute every addition.
  const RecipeBitterness bitterness = [&] {
    PhaseTimer timer(globals.timings, "bitterness");
    return recipe_bitterness(recipe, data.catalog, settings);
  }();
  // 3. Render.
  if (options.json)
    std::cout << bitterness_to_json(recipe, bitterness).dump(2) << '\n';
  else
    render_bitterness(std::cout, recipe, bitterness, globals.unit_system());
}

}  // namespace

void setup_ibu_command(CLI::App& app, const GlobalOptions& globals) {
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
  ibu->callback([&globals, options] { run_ibu(globals, *options); });
}

}  // namespace bine::cli
