// bine calibrate BATCHES: the brewhouse factor on utilization from lab-measured IBU, written to a
// brewhouse profile that ibu, rebalance, blend and swap read with --brewhouse.
#include <fmt/format.h>

#include <memory>

#include "cli/bitterness_options.hpp"
#include "cli/commands.hpp"
#include "cli/option_values.hpp"
#include "engine/calibration.hpp"
#include "engine/cellar.hpp"
#include "io/batch_log.hpp"
#include "io/brewhouse_profile.hpp"
#include "io/loaders.hpp"
#include "io/recipe_file.hpp"
#include "model/errors.hpp"
#include "report/calibration_report.hpp"

namespace bine::cli {
namespace {

struct CalibrateOptions {
  std::string log;
  BitternessOptions bitterness;
  bool split = false;
  bool without_outliers = false;
  std::string out = "brewhouse.json";
  bool no_write = false;
  std::string date;
  bool json = false;
};

struct CalibrateArgs {
  std::string log;
  BitternessSettings settings;
  bool split = false;
  bool without_outliers = false;
  std::string out;  // empty: do not write
  Date date{};
  bool json = false;
};

CalibrateArgs parse_calibrate_args(const CalibrateOptions& options) {
  OptionReader reader;
  CalibrateArgs args;
  args.log = options.log;
  args.settings = read_model_options(reader, options.bitterness);
  args.split = options.split;
  args.without_outliers = options.without_outliers;
  args.out = options.no_write ? "" : options.out;
  args.json = options.json;
  args.date = options.date.empty() ? today() : reader.date("--date", options.date).value_or(Date{});
  reader.require(!options.out.empty(), "--out: is empty (expected a file name such as brewhouse.json)");
  reader.throw_if_any();
  return args;
}

/// The model's IBU of every logged beer at factor 1, as it was brewed (stock lots aged to its day).
std::vector<CalibrationBatch> model_batches(const BatchLog& log, const Catalog& catalog,
                                            const BitternessSettings& settings, std::vector<std::string>& notes) {
  std::vector<CalibrationBatch> batches;
  for (const auto& logged : log.batches) {
    RecipeFile file = read_recipe_file(logged.recipe, BeerXmlReadOptions{});
    Recipe recipe = std::move(file.recipe);
    for (const auto& note : file.notes) notes.push_back(fmt::format("{}: {}", logged.where, note));
    if (logged.stock) {
      std::vector<std::string> stock_notes;
      // The beer was brewed with what was in the cold store, stale or not.
      const Cellar cellar = age_cellar(load_stock(*logged.stock), catalog, logged.brewed);
      recipe = recipe_as_brewed(recipe, cellar, stock_notes);
      for (const auto& note : stock_notes) notes.push_back(fmt::format("{}: {}", logged.where, note));
    }
    const RecipeBitterness bitterness = recipe_bitterness(recipe, catalog, settings);
    const std::string name = recipe.name.empty() ? logged.recipe.filename().string() : recipe.name;
    batches.push_back(
        calibration_batch(bitterness, fmt::format("{}, {}", name, format_date(logged.brewed)), logged.lab_ibu));
  }
  return batches;
}

void run_calibrate(const Console& console, const GlobalOptions& globals, const CalibrateArgs& args) {
  // 1. Load the log, the catalogs, every recipe (and stock) it names.
  const DataSet data = load_data(globals, console);
  const BatchLog log = load_batch_log(args.log);
  CalibrationContext context;
  context.log_file = args.log;
  context.model = std::string(to_string(args.settings.model));
  context.pellet_factor = args.settings.pellet_factor;
  context.drop_outliers = args.without_outliers;
  for (const auto& batch : log.batches) context.brewed.push_back(format_date(batch.brewed));
  // 2. Fit.
  const Calibration calibration = [&] {
    const auto timer = console.time("calibrate");
    return calibrate(model_batches(log, data.catalog, args.settings, context.notes), args.without_outliers, args.split);
  }();
  const BrewhouseProfile profile = profile_from(calibration, args.settings, args.date);
  // 3. Write the profile, then render.
  if (!args.out.empty()) {
    write_brewhouse_profile(args.out, profile);
    context.profile_file = args.out;
  }
  print_result(
      console, args.json, data, [&] { return calibration_to_json(calibration, context, profile); },
      [&](std::ostream& out) { render_calibration(out, calibration, context, profile); });
}

}  // namespace

void setup_calibrate_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands) {
  auto options = std::make_shared<CalibrateOptions>();
  auto* calibrate = app.add_subcommand(
      "calibrate", "your brewhouse's factor on utilization from lab-measured IBU, written to a brewhouse profile");
  calibrate->add_option("BATCHES", options->log, "batch log (JSON, or CSV with recipe,brewed,lab_ibu,stock)")
      ->required();
  add_model_options(calibrate, options->bitterness);
  calibrate->add_flag("--split", options->split,
                      "also fit separate boil and late-hop (whirlpool, flame-out) factors (needs 6 batches with late "
                      "hops) and say whether they differ");
  calibrate->add_flag("--without-outliers", options->without_outliers,
                      "fit without batches more than 3 robust deviations off");
  calibrate->add_option("--out", options->out, "the brewhouse profile to write (default brewhouse.json)");
  calibrate->add_flag("--no-write", options->no_write, "show the fit without writing a profile");
  calibrate->add_option("--date", options->date, "the profile's date, YYYY-MM-DD (default: today)");
  calibrate->add_flag("--json", options->json, "print JSON");
  calibrate->footer(
      "Examples:\n"
      "  bine calibrate batches.csv\n"
      "  bine calibrate batches.json --split --out brewhouse.json\n"
      "  bine calibrate batches.csv --without-outliers --no-write\n"
      "  bine ibu pale-ale.json --brewhouse brewhouse.json\n"
      "Each batch's recipe is computed as brewed (its stock file's lots aged to the brew date) at factor 1;\n"
      "the factor is the least-squares fit of lab IBU on model IBU through the origin, with its 95 %\n"
      "confidence interval (Student's t).");
  commands.add(calibrate, [&globals, options](const Console& console) {
    run_calibrate(console, globals, parse_calibrate_args(*options));
  });
}

}  // namespace bine::cli
