// bine blend: design late hops (whirlpool + dry hop) to a target aroma while holding the recipe's IBU.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <memory>

#include "cli/bitterness_options.hpp"
#include "cli/catalog_choice.hpp"
#include "cli/cellar_options.hpp"
#include "cli/commands.hpp"
#include "cli/html_output.hpp"
#include "cli/option_values.hpp"
#include "cli/recipe_file_options.hpp"
#include "engine/aroma_profile.hpp"
#include "engine/blend.hpp"
#include "engine/blend_plan.hpp"
#include "engine/ibu_interval.hpp"
#include "engine/lot_allocation.hpp"
#include "io/file_io.hpp"
#include "io/limits.hpp"
#include "io/loaders.hpp"
#include "io/recipe_file.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"
#include "report/blend_report.hpp"
#include "report/html_reports.hpp"

namespace bine::cli {
namespace {

struct BlendOptions {
  std::string target;
  std::string like;
  std::string recipe;
  RecipeFileOptions recipe_file;
  BitternessOptions bitterness;
  std::string alpha_tolerance;
  std::string stock;
  CellarOptions cellar;
  std::string max_varieties;
  std::string rate;      // g/L, default 4
  std::string oil_dose;  // mL/hL
  std::string split;
  std::string ibu;
  std::string bittering;
  bool no_bittering = false;
  std::string others;
  std::string volume;
  std::string gravity;
  bool json = false;
  std::string html;
  std::string write;
};

/// Every blend option as a value; the target spec is read against the lexicon once data are loaded.
struct BlendArgs {
  std::string target;
  std::string like;
  std::string recipe;
  BeerXmlReadOptions recipe_file;
  BitternessSettings settings;
  double alpha_tolerance = kDefaultCertificateTolerancePercent;
  std::string stock;
  CellarChoice cellar;
  std::size_t max_varieties = 3;
  double others = 0.25;
  BlendChoices choices;  // IBU, bittering, split, late-hop dose, wort without a recipe
  bool json = false;
  std::string html;
  std::string write;
};

void check_conflicts(OptionReader& reader, const BlendOptions& o) {
  reader.require(o.target.empty() != o.like.empty(),
                 "--target/--like: give exactly one (e.g. --target \"floral=4,citrus=4\" or --like VARIETY)");
  reader.require(o.rate.empty() || o.oil_dose.empty(), "--rate/--oil-dose: give one, not both");
  reader.require(!o.no_bittering || o.bittering.empty(), "--bittering/--no-bittering: give one, not both");
  if (o.recipe.empty()) {
    reader.require(!o.volume.empty(), "--volume: required without --recipe (e.g. --volume 20L)");
    reader.require(!o.ibu.empty(), "--ibu: required without --recipe (the IBU to hold)");
    reader.require(!o.bittering.empty() || o.no_bittering,
                   "--bittering: required without --recipe (or give --no-bittering)");
  } else {
    reader.require(o.volume.empty() && o.gravity.empty(),
                   "--volume/--gravity: only without --recipe (the recipe gives them)");
  }
}

/// --rate (g/L, oz/gal, lb/bbl ...) or --oil-dose (mL/hL, or "recipe": the oil the recipe's late hops
/// deliver); neither: the recipe's own late grams, else the plan's default rate.
void read_dose(OptionReader& reader, const BlendOptions& o, BlendChoices& choices) {
  if (auto rate = reader.optional_quantity("--rate", o.rate, Dimension::hop_rate, limits::late_hop_rate))
    choices.dose = LateDose{LateDose::Kind::grams_per_litre, *rate};
  if (o.oil_dose == "recipe") {
    reader.require(!o.recipe.empty(), "--oil-dose recipe: needs --recipe (the oil its late hops deliver is kept)");
    choices.keep_recipe_oil = true;
  } else if (auto oil = reader.optional_quantity("--oil-dose", o.oil_dose, Dimension::oil_dose, limits::oil_dose)) {
    choices.dose = LateDose{LateDose::Kind::oil_ml_per_hl, *oil};
  }
}

BlendArgs parse_blend_args(const BlendOptions& o) {
  OptionReader reader;
  check_conflicts(reader, o);
  BlendArgs args;
  args.target = o.target;
  args.like = o.like;
  args.recipe = o.recipe;
  args.recipe_file = read_recipe_file_options(reader, o.recipe_file);
  args.settings = read_bitterness_options(reader, o.bitterness);
  args.alpha_tolerance = read_alpha_tolerance(reader, o.alpha_tolerance);
  args.stock = o.stock;
  args.json = o.json;
  args.html = o.html;
  args.write = o.write;
  args.cellar = read_cellar_options(reader, o.cellar);
  reader.require(o.cellar.on.empty() || !o.stock.empty(),
                 fmt::format("--on: {}: only used with --stock (expected --stock FILE to age its lots)", o.cellar.on));
  if (auto k = reader.count("--max-varieties", o.max_varieties, limits::blend_varieties, 3)) args.max_varieties = *k;
  BlendChoices& choices = args.choices;
  read_dose(reader, o, choices);
  if (auto others = reader.optional_quantity("--others", o.others, Dimension::number, limits::axis_weight))
    args.others = *others;
  choices.split = reader.optional_quantity("--split", o.split, Dimension::number, limits::share);
  choices.ibu = reader.optional_quantity("--ibu", o.ibu, Dimension::number, limits::target_ibu);
  choices.volume_l = reader.optional_quantity("--volume", o.volume, Dimension::volume, limits::batch_volume);
  choices.gravity = reader.optional_quantity("--gravity", o.gravity, Dimension::gravity, limits::gravity);
  choices.bittering = {o.bittering, "--bittering"};
  choices.no_bittering = o.no_bittering;
  reader.throw_if_any();
  return args;
}

/// The blend's target; `read_as` receives a line for each lexicon tag read as its axis.
BlendTarget target_from(const BlendArgs& o, const DataSet& data, std::vector<std::string>& read_as) {
  if (!o.like.empty()) {
    const Variety& variety = require_variety(data.catalog, o.like, "--like");
    const AromaProfile profile = aroma_profile(variety, data.lexicon);
    if (profile.source == AromaSource::none)
      throw Infeasible(fmt::format("{} has no aroma data to aim at", variety.name), {Remedy::aim_by_target});
    return target_like(profile.intensity);
  }
  std::vector<bool> named;
  const Eigen::VectorXd intensity = parse_aroma_spec(o.target, data.lexicon, "--target", &named, &read_as);
  return target_from_spec(intensity, named, o.others);
}

/// Where the late-hop amount came from, so the brewer knows what to change.
std::string late_amount_note(const BlendPlan& plan) {
  const double litres = plan.wort.volume_l;
  switch (plan.late_source) {
    case LateSource::given:
      return plan.late.kind == LateAmount::Kind::grams
                 ? fmt::format("late hops: {:.0f} g, from --rate over {:.1f} L", plan.late.total, litres)
                 : fmt::format("late hops deliver {:.1f} mL of oil, from --oil-dose over {:.1f} L", plan.late.total,
                               litres);
    case LateSource::recipe_grams:
      return fmt::format(
          "late hops: {:.0f} g, the recipe's own whirlpool and dry-hop amount (--rate or --oil-dose changes it)",
          plan.late.total);
    case LateSource::recipe_oil:
      return fmt::format("late hops deliver {:.1f} mL of oil, as the recipe's own late hops do (--oil-dose recipe)",
                         plan.late.total);
    case LateSource::default_rate:
      return fmt::format("late hops at the default rate of {:.0f} g/L: {:.0f} g (--rate or --oil-dose changes it)",
                         LateDose{}.value, plan.late.total);
  }
  return {};
}

/// The notes under the blend: what the options changed, what was left out, what was searched.
std::vector<std::string> blend_notes(const BlendArgs& args, const BlendRequest& request,
                                     const std::vector<std::string>& candidate_notes, const BlendResult& result) {
  std::vector<std::string> notes;
  if (args.choices.no_bittering && !request.plan.kept.empty())
    notes.push_back("--no-bittering: every boil addition is kept as written");
  notes.push_back(late_amount_note(request.plan));
  notes.insert(notes.end(), candidate_notes.begin(), candidate_notes.end());
  if (!args.cellar.allow_stale &&
      std::any_of(candidate_notes.begin(), candidate_notes.end(),
                  [](const std::string& note) { return note.find(" stale ") != std::string::npos; }))
    notes.push_back("pass --allow-stale to blend stale lots too");
  notes.push_back(fmt::format("searched {} of a pool of {} (of {})",
                              count_of(result.subsets_solved, "subset", "subsets"),
                              count_of(result.pool_size, "candidate", "candidates"), request.candidates.size()));
  return notes;
}

/// The recipe with the lots it names looked up in the stock (a lot-only addition takes the lot's
/// variety); without a stock, a lot-only addition is refused.
Recipe recipe_with_lots(const Recipe& recipe, const std::optional<Cellar>& cellar) {
  if (!cellar) {
    require_stock_for_lot_only(recipe);
    return recipe;
  }
  return with_lot_varieties(recipe, *cellar);
}

/// The varieties a blend looks up by name: --like, the bittering choice, the recipe's and the stock's.
std::vector<std::string> names_blend_needs(const BlendArgs& args) {
  std::vector<std::string> names{args.like, args.choices.bittering.name};
  if (!args.recipe.empty())
    for (const auto& hop : read_recipe_file(args.recipe, args.recipe_file).recipe.hops) names.push_back(hop.variety);
  if (!args.stock.empty())
    for (const auto& lot : load_stock(args.stock).lots) names.push_back(lot.variety);
  return names;
}

/// The rows of the blend's varieties join `data.catalog` (which from a compiled catalog holds only
/// the rows named), so the written recipe and the pages find them.
void add_rows_of_parts(const CompiledCatalog& compiled, const BlendResult& result, DataSet& data) {
  for (const auto& part : result.parts)
    if (find_variety(data.catalog, part.variety) == nullptr)
      if (const auto position = compiled.position_of(part.variety))
        data.catalog.varieties.push_back(compiled.row(*position, data.lexicon));
  index_variety_names(data.catalog);
}

/// The candidates: from a compiled catalog (catalog mode) its rows stream through once, so a large
/// catalog is never held whole; else from the catalogs or the cellar loaded.
CandidateSet candidates_for(const CatalogSubset& catalogs, const Cellar* cellar, const BlendArgs& args) {
  const Lexicon& lexicon = catalogs.data.lexicon;
  if (catalogs.compiled && cellar == nullptr) {
    const CompiledCatalog& compiled = *catalogs.compiled;
    return blend_candidates_streamed([&](const auto& each) { compiled.for_each_blend_row(each); }, args.like);
  }
  return blend_candidates(catalogs.data.catalog, lexicon, cellar, args.like, args.cellar.allow_stale);
}

void run_blend(const Console& console, const GlobalOptions& globals, const BlendArgs& args) {
  const UnitSystem units = globals.unit_system();
  // 1. Load the catalogs (from a compiled catalog only the rows named), the stock and the recipe.
  CatalogSubset catalogs = load_data_for_names(globals, console, [&] { return names_blend_needs(args); });
  DataSet& data = catalogs.data;
  const std::optional<Cellar> cellar =
      args.stock.empty() ? std::nullopt : std::optional(load_cellar(args.stock, data.catalog, args.cellar));
  const std::optional<RecipeFile> file =
      args.recipe.empty() ? std::nullopt : std::optional(read_recipe_file(args.recipe, args.recipe_file));
  const std::optional<Recipe> recipe = file ? std::optional(recipe_with_lots(file->recipe, cellar)) : std::nullopt;
  // 2. The target, the candidates, and the plan: what the recipe keeps, the IBU, the late amount.
  BlendRequest request;
  std::vector<std::string> target_notes;
  request.target = target_from(args, data, target_notes);
  CandidateSet candidates = candidates_for(catalogs, cellar ? &*cellar : nullptr, args);
  if (candidates.candidates.empty() && candidates.without_aroma > 0)
    throw Infeasible("every candidate lacks aroma data (add aroma intensities or tags to their catalog entries)");
  request.plan =
      plan_blend(recipe ? &*recipe : nullptr, data.catalog, cellar ? &*cellar : nullptr, args.choices, args.settings);
  request.candidates = std::move(candidates.candidates);
  request.max_varieties = args.max_varieties;
  request.weighed = true;
  // 3. Solve: choose the pool, solve every subset, hold IBU.
  const BlendResult result = [&] {
    const auto timer = console.time("blend search");
    return design_blend(request);
  }();
  if (catalogs.compiled) add_rows_of_parts(*catalogs.compiled, result, data);
  // 4. Render and write.
  std::vector<std::string> notes = blend_notes(args, request, candidates.notes, result);
  if (file) notes.insert(notes.begin(), file->notes.begin(), file->notes.end());
  notes.insert(notes.begin(), target_notes.begin(), target_notes.end());
  if (cellar) notes.insert(notes.begin(), brew_day_line(args.cellar));
  BlendReportContext context{&data.lexicon,      &request,     recipe ? recipe->name : std::string(),
                             cellar.has_value(), std::nullopt, std::move(notes)};
  if (cellar) context.on = cellar->on;
  const BlendIntervals intervals = blend_intervals(request, result, args.alpha_tolerance);
  context.intervals = &intervals;
  // The blended recipe is checked by the recipe loader's bounds before anything is shown or written.
  if (recipe) checked_recipe_text(blended_recipe(*recipe, request.plan, result), "the blended recipe");
  write_html(args.html, [&] { return blend_html(result, context, units, page_meta(&data, args.recipe, args.stock)); });
  if (!args.write.empty() && recipe)
    write_recipe_file(args.write, *file, blended_recipe(*recipe, request.plan, result), &data.catalog);
  print_result(
      console, args.json, data, [&] { return blend_to_json(result, context); },
      [&](std::ostream& out) { render_blend_text(out, result, context, units); });
}

}  // namespace

void setup_blend_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands) {
  auto options = std::make_shared<BlendOptions>();
  auto* blend = app.add_subcommand("blend", "design late hops to a target aroma while holding the recipe's IBU");
  blend->add_option("--target", options->target, "aroma to aim at, axis=intensity 0-5 (e.g. \"floral=4,citrus=4\")");
  blend->add_option("--like", options->like, "aim at this variety's aroma (the variety itself is left out)");
  blend->add_option("--recipe", options->recipe,
                    "recipe file (bine JSON or BeerXML): volume, gravity, IBU; its late hops are replaced");
  add_recipe_file_options(blend, options->recipe_file);
  add_bitterness_options(blend, options->bitterness);
  add_alpha_tolerance_option(blend, options->alpha_tolerance);
  blend->add_option("--stock", options->stock,
                    "stock file: blend only lots on hand, within their amounts, aged to the brew day");
  add_cellar_options(blend, options->cellar, true);
  blend->add_option("--max-varieties", options->max_varieties, "at most this many varieties or lots (default 3)");
  blend->add_option("--rate", options->rate,
                    "total late hops per volume: g/L, oz/gal or lb/bbl (default: the recipe's own late grams, "
                    "else 4g/L)");
  blend->add_option("--oil-dose", options->oil_dose,
                    "or fix the oil delivered: mL of oil per hL of wort, or \"recipe\" for the oil the recipe's "
                    "late hops deliver");
  blend->add_option("--split", options->split, "whirlpool share of the late hops 0-1 (default the recipe's, else 0.3)");
  blend->add_option("--ibu", options->ibu, "IBU to hold (default the recipe's target_ibu, else its current total)");
  blend->add_option("--bittering", options->bittering,
                    "bittering variety re-solved to hold IBU (default the recipe's largest boil addition)");
  blend->add_flag("--no-bittering", options->no_bittering, "no bittering charge: the late hops must give the IBU");
  blend->add_option("--others", options->others,
                    "weight of the axes the target does not name, aimed at 0 (default 0.25)");
  blend->add_option("--volume", options->volume, "batch volume without --recipe (e.g. 20L)");
  blend->add_option("--gravity", options->gravity, "boil gravity without --recipe (default 1.050)");
  blend->add_flag("--json", options->json, "print JSON (canonical units: g, C, min)");
  add_html_option(blend, options->html);
  blend->add_option("--write", options->write, "write the recipe with the new late hops and bittering charge")
      ->check(output_file_name());
  blend->footer(
      "Examples:\n"
      "  bine blend --target \"floral=4,citrus=4\" --recipe pale-ale.json --stock stock.json\n"
      "  bine blend --like Tidewell --recipe pale-ale.json --max-varieties 2 --json\n"
      "  bine blend --like Tidewell --recipe pale-ale.json --stock stock.json --on 2026-12-01 --allow-stale\n"
      "  bine blend --target \"tropical=4,stone-fruit=3\" --volume 20L --ibu 30 --bittering Keelstone --rate 6g/L\n"
      "  bine --units us blend --target \"tropical=4\" --volume 5gal --ibu 8 --no-bittering --split 0.5 --rate "
      "1oz/gal\n"
      "With --no-bittering only the whirlpool share of the late hops bitters: a whirlpool at 80 C gives a few\n"
      "IBU per 100 g in 20 L, so ask for an IBU the whirlpool can reach (or raise --split).\n"
      "The blend's aroma is the oil-weighted mean of its hops' profiles (a linear first approximation).\n"
      "Every IBU comes with its 90 % interval (alpha range or certificate, ageing, brewhouse factor).");
  commands.add(
      blend, [&globals, options](const Console& console) { run_blend(console, globals, parse_blend_args(*options)); });
}

}  // namespace bine::cli
