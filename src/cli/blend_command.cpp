// bine blend: design late hops (whirlpool + dry hop) to a target aroma while holding the recipe's IBU.
#include <fmt/format.h>

#include <charconv>
#include <cmath>
#include <iostream>
#include <memory>

#include "cli/commands.hpp"
#include "engine/aroma_profile.hpp"
#include "engine/blend.hpp"
#include "engine/blend_plan.hpp"
#include "io/file_io.hpp"
#include "io/loaders.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "report/blend_report.hpp"
#include "report/timings.hpp"

namespace bine::cli {
namespace {

struct BlendOptions {
  std::string target;
  std::string like;
  std::string recipe;
  std::string stock;
  std::size_t max_varieties = 3;
  std::string rate;      // g/L, default 4
  std::string oil_dose;  // mL/hL
  std::optional<double> split;
  std::optional<double> ibu;
  std::string bittering;
  bool no_bittering = false;
  double others = 0.25;
  std::string volume;
  std::string gravity;
  bool json = false;
  std::string html;
  std::string write;
};

/// A number with an optional unit suffix ("4", "4 g/L", "4g/l"); nullopt when malformed.
std::optional<double> number_with_unit(std::string text, std::string_view unit) {
  const auto fold = [](std::string s) {
    std::string out;
    for (char c : s)
      if (c != ' ') out += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    return out;
  };
  text = fold(text);
  const std::string suffix = fold(std::string(unit));
  if (text.size() >= suffix.size() && text.compare(text.size() - suffix.size(), suffix.size(), suffix) == 0)
    text.resize(text.size() - suffix.size());
  double value = 0.0;
  const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (error != std::errc() || end != text.data() + text.size() || text.empty()) return std::nullopt;
  if (!std::isfinite(value)) return std::nullopt;  // from_chars reads "nan" and "inf"
  return value;
}

/// Every conflict among the options, one line each.
void validate(const BlendOptions& o) {
  std::vector<std::string> problems;
  if (o.target.empty() == o.like.empty())
    problems.push_back("--target/--like: give exactly one (e.g. --target \"floral=4,citrus=4\" or --like VARIETY)");
  if (o.max_varieties < 1 || o.max_varieties > 6)
    problems.push_back(fmt::format("--max-varieties: {}: out of range (expected 1-6)", o.max_varieties));
  if (!o.rate.empty() && !o.oil_dose.empty()) problems.push_back("--rate/--oil-dose: give one, not both");
  if (!o.rate.empty()) {
    const auto rate = number_with_unit(o.rate, "g/L");
    if (!rate || *rate <= 0.0 || *rate > 40.0)
      problems.push_back(
          fmt::format("--rate: {}: not a rate (expected g/L above 0 and at most 40, e.g. 4g/L)", o.rate));
  }
  if (!o.oil_dose.empty()) {
    const auto dose = number_with_unit(o.oil_dose, "mL/hL");
    if (!dose || *dose <= 0.0 || *dose > 100.0)
      problems.push_back(fmt::format(
          "--oil-dose: {}: not an oil dose (expected mL/hL above 0 and at most 100, e.g. 1.5mL/hL)", o.oil_dose));
  }
  if (o.split && !(*o.split >= 0.0 && *o.split <= 1.0))
    problems.push_back(fmt::format("--split: {:g}: out of range (expected the whirlpool share 0-1)", *o.split));
  if (o.ibu && !(*o.ibu >= 0.0 && *o.ibu <= 200.0))
    problems.push_back(fmt::format("--ibu: {:g}: out of range (expected 0-200 IBU)", *o.ibu));
  if (!(o.others >= 0.0 && o.others <= 1.0))
    problems.push_back(fmt::format("--others: {:g}: out of range (expected 0-1)", o.others));
  if (o.no_bittering && !o.bittering.empty()) problems.push_back("--bittering/--no-bittering: give one, not both");
  if (o.recipe.empty()) {
    if (o.volume.empty()) problems.push_back("--volume: required without --recipe (e.g. --volume 20L)");
    if (!o.ibu) problems.push_back("--ibu: required without --recipe (the IBU to hold)");
    if (o.bittering.empty() && !o.no_bittering)
      problems.push_back("--bittering: required without --recipe (or give --no-bittering)");
  } else if (!o.volume.empty() || !o.gravity.empty()) {
    problems.push_back("--volume/--gravity: only without --recipe (the recipe gives them)");
  }
  if (!o.volume.empty()) {
    const auto v = parse_quantity(o.volume, Dimension::volume);
    if (!v.value || *v.value <= 0.0 || *v.value > 100000.0)
      problems.push_back(fmt::format("--volume: {}: {} (expected a volume above 0, e.g. 20L or 5.5gal)", o.volume,
                                     v.value ? "out of range" : v.error));
  }
  if (!o.gravity.empty()) {
    const auto g = parse_quantity(o.gravity, Dimension::gravity);
    if (!g.value || *g.value < 1.0 || *g.value > 1.2)
      problems.push_back(fmt::format("--gravity: {}: {} (expected 1.000-1.200 or degrees Plato, e.g. 1.050 or 12.4P)",
                                     o.gravity, g.value ? "out of range" : g.error));
  }
  if (!problems.empty()) throw InputError(problems);
}

BlendChoices choices_from(const BlendOptions& o) {
  BlendChoices choices;
  choices.ibu = o.ibu;
  choices.bittering_variety = o.bittering;
  choices.no_bittering = o.no_bittering;
  choices.split = o.split;
  if (!o.volume.empty()) choices.volume_l = parse_quantity(o.volume, Dimension::volume).value;
  if (!o.gravity.empty()) choices.gravity = parse_quantity(o.gravity, Dimension::gravity).value;
  return choices;
}

BlendTarget target_from(const BlendOptions& o, const DataSet& data) {
  if (!o.like.empty()) {
    const Variety& variety = require_variety(data.catalog, o.like, "--like");
    const AromaProfile profile = aroma_profile(variety, data.lexicon);
    if (profile.source == AromaSource::none)
      throw Infeasible(fmt::format("{} has no aroma data to aim at (give --target instead)", variety.name));
    return target_like(profile.intensity);
  }
  std::vector<bool> named;
  const Eigen::VectorXd intensity = parse_aroma_spec(o.target, data.lexicon, "--target", &named);
  return target_from_spec(intensity, named, o.others);
}

void run_blend(const GlobalOptions& globals, const BlendOptions& options) {
  validate(options);
  const UnitSystem units = globals.unit_system();
  // 1. Load the catalogs, the stock and the recipe.
  const DataSet data = [&] {
    PhaseTimer timer(globals.timings, "load data");
    return globals.load();
  }();
  const std::optional<Stock> stock = options.stock.empty() ? std::nullopt : std::optional(load_stock(options.stock));
  const std::optional<Recipe> recipe =
      options.recipe.empty() ? std::nullopt : std::optional(load_recipe(options.recipe));
  // 2. The target, the candidates, and what the recipe keeps.
  BlendRequest request;
  request.target = target_from(options, data);
  CandidateSet candidates = blend_candidates(data.catalog, data.lexicon, stock ? &*stock : nullptr, options.like);
  if (candidates.candidates.empty() && candidates.without_aroma > 0)
    throw Infeasible("every candidate lacks aroma data (add aroma intensities or tags to their catalog entries)");
  const BlendPlan plan = plan_blend(recipe ? &*recipe : nullptr, data.catalog, stock ? &*stock : nullptr,
                                    choices_from(options), request.bitterness);
  request.candidates = std::move(candidates.candidates);
  request.max_varieties = options.max_varieties;
  request.wort = plan.wort;
  request.target_ibu = plan.target_ibu;
  request.kept_ibu = plan.kept_ibu;
  request.bittering = plan.bittering;
  request.whirlpool_share = plan.whirlpool_share;
  request.whirlpool_temperature_c = plan.whirlpool_temperature_c;
  request.whirlpool_minutes = plan.whirlpool_minutes;
  // Amount: --oil-dose mL/hL x hL, else --rate g/L (default 4) x L.
  if (!options.oil_dose.empty()) {
    request.amount_kind = LateAmount::oil_ml;
    request.amount = *number_with_unit(options.oil_dose, "mL/hL") * plan.wort.volume_l / 100.0;
  } else {
    request.amount = (options.rate.empty() ? 4.0 : *number_with_unit(options.rate, "g/L")) * plan.wort.volume_l;
  }
  // 3. Solve: choose the pool, solve every subset, hold IBU.
  const BlendResult result = [&] {
    PhaseTimer timer(globals.timings, "blend search");
    return design_blend(request);
  }();
  // 4. Render and write.
  BlendReportContext context{&data.lexicon, &plan, recipe ? recipe->name : std::string(), stock.has_value(),
                             plan.notes};
  context.notes.insert(context.notes.end(), candidates.notes.begin(), candidates.notes.end());
  context.notes.push_back(fmt::format("searched {} subsets of a pool of {} candidates (of {})", result.subsets_solved,
                                      result.pool_size, request.candidates.size()));
  if (!options.html.empty()) write_file_atomically(options.html, blend_to_html(result, context, units));
  if (!options.write.empty() && recipe)
    write_file_atomically(options.write, recipe_to_json(blended_recipe(*recipe, plan, result)).dump(2) + "\n");
  if (options.json)
    std::cout << blend_to_json(result, context).dump(2) << '\n';
  else
    render_blend_text(std::cout, result, context, units);
}

}  // namespace

void setup_blend_command(CLI::App& app, const GlobalOptions& globals) {
  auto options = std::make_shared<BlendOptions>();
  auto* blend = app.add_subcommand("blend", "design late hops to a target aroma while holding the recipe's IBU");
  blend->add_option("--target", options->target, "aroma to aim at, axis=intensity 0-5 (e.g. \"floral=4,citrus=4\")");
  blend->add_option("--like", options->like, "aim at this variety's aroma (the variety itself is left out)");
  blend->add_option("--recipe", options->recipe, "recipe file: volume, gravity, IBU; its late hops are replaced");
  blend->add_option("--stock", options->stock, "stock file: blend only lots on hand, within their amounts");
  blend->add_option("--max-varieties", options->max_varieties, "at most this many varieties or lots (default 3)");
  blend->add_option("--rate", options->rate, "total late hops in g/L (default 4g/L)");
  blend->add_option("--oil-dose", options->oil_dose, "or fix the oil delivered, in mL of oil per hL of wort");
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
  blend->add_option("--html", options->html, "write a self-contained HTML report with a chart");
  blend->add_option("--write", options->write, "write the recipe with the new late hops and bittering charge");
  blend->footer(
      "Examples:\n"
      "  bine blend --target \"floral=4,citrus=4\" --recipe pale-ale.json --stock stock.json\n"
      "  bine blend --like Tidewell --recipe pale-ale.json --max-varieties 2 --json\n"
      "  bine blend --target \"tropical=4,stone-fruit=3\" --volume 20L --ibu 30 --no-bittering --rate 6g/L\n"
      "The blend's aroma is the oil-weighted mean of its hops' profiles (a linear first approximation).");
  blend->callback([&globals, options] { run_blend(globals, *options); });
}

}  // namespace bine::cli
