// bine swap: what to use instead of a sold-out variety, from the catalog or from the lots on hand,
// and how much of it.
#include <fmt/format.h>

#include <algorithm>
#include <memory>
#include <optional>

#include "cli/bitterness_options.hpp"
#include "cli/catalog_choice.hpp"
#include "cli/cellar_options.hpp"
#include "cli/commands.hpp"
#include "cli/html_output.hpp"
#include "cli/option_values.hpp"
#include "engine/hop_index.hpp"
#include "engine/recipe_swap.hpp"
#include "engine/substitutes.hpp"
#include "io/compiled_catalog.hpp"
#include "io/data_dir.hpp"
#include "io/file_io.hpp"
#include "io/limits.hpp"
#include "io/loaders.hpp"
#include "io/recipe_file.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "report/html_reports.hpp"
#include "report/recipe_swap_report.hpp"
#include "report/swap_report.hpp"

namespace bine::cli {
namespace {

struct SwapOptions {
  std::string variety;
  std::string purpose = "aroma";
  std::string stock;
  CellarOptions cellar;
  std::string top;
  bool pairs = false;
  bool json = false;
  bool csv = false;
  std::string html;
  std::string recipe;
  std::string pick;
  std::string pair;
  std::string write;
  BitternessOptions bitterness;  // with --recipe: how the recipe's IBU is computed
  std::string alpha_tolerance;
};

struct SwapArgs {
  SwapRequest request;  // without catalog data; the cellar is attached once loaded
  CellarChoice cellar;
  std::string stock;
  Printed printed = Printed::text;
  std::string html;
  std::size_t shown = 5;  // substitutes listed (the request may rank more, for --pick and --pair)
  std::string recipe;
  std::optional<std::size_t> pick;  // 1-based
  std::optional<std::size_t> pair;  // 1-based
  std::string write;
  BitternessSettings settings;  // with --recipe (and --brewhouse or BINE_BREWHOUSE)
  double alpha_tolerance = kDefaultCertificateTolerancePercent;
};

/// --recipe, --pick, --pair, --write: which substitute goes into which recipe.
void read_recipe_options(OptionReader& reader, const SwapOptions& options, SwapArgs& args) {
  args.recipe = options.recipe;
  args.write = options.write;
  reader.require(options.pick.empty() || options.pair.empty(), "--pick/--pair: give one, not both");
  reader.require(!options.recipe.empty() || (options.pick.empty() && options.pair.empty() && options.write.empty()),
                 "--pick/--pair/--write: only with --recipe FILE (the recipe to put the substitute into)");
  const BitternessOptions& b = options.bitterness;
  if (!options.recipe.empty()) {
    args.settings = read_bitterness_options(reader, b);
    args.alpha_tolerance = read_alpha_tolerance(reader, options.alpha_tolerance);
  } else {
    reader.require(b.model.empty() && b.pellet_factor.empty() && b.calibration.empty() && b.brewhouse.empty() &&
                       options.alpha_tolerance.empty(),
                   "--model/--pellet-factor/--calibration/--brewhouse/--alpha-tolerance: only with --recipe FILE (the "
                   "recipe whose IBU they compute)");
  }
  if (!options.pick.empty()) args.pick = reader.count("--pick", options.pick, limits::substitutes_listed, 1);
  if (!options.pair.empty()) args.pair = reader.count("--pair", options.pair, limits::substitutes_listed, 1);
  if (args.pair) args.request.pairs = true;
  // Rank enough to pick from, and every hop a pair can be made of (the best 12).
  std::size_t needed = std::max<std::size_t>(args.shown, args.pick.value_or(1));
  if (args.request.pairs && !args.recipe.empty())
    needed = std::max<std::size_t>(needed, SubstituteSettings{}.pair_pool);
  args.request.top = needed;
}

SwapArgs parse_swap_args(const SwapOptions& options) {
  OptionReader reader;
  SwapArgs args;
  args.stock = options.stock;
  args.html = options.html;
  const std::string conflict = csv_conflict(options.json, options.csv, options.html);
  reader.require(conflict.empty(), conflict);
  reader.require(!options.csv || options.recipe.empty(),
                 "--csv: not with --recipe (the CSV lists the substitutes only; expected --json for the recipe "
                 "swap as well)");
  args.request.missing = options.variety;
  args.request.pairs = options.pairs;
  if (const auto purpose = swap_purpose_from(options.purpose))
    args.request.purpose = *purpose;
  else
    reader.add(fmt::format("--for: \"{}\": unknown question (expected aroma or bittering)", options.purpose));
  if (auto top = reader.count("--top", options.top, limits::substitutes_listed, 5)) args.shown = *top;
  args.request.top = args.shown;
  read_recipe_options(reader, options, args);
  args.cellar = read_cellar_options(reader, options.cellar);
  reader.require(
      options.cellar.on.empty() || !options.stock.empty(),
      fmt::format("--on: {}: only used with --stock (expected --stock FILE to age its lots)", options.cellar.on));
  reader.throw_if_any();
  args.printed = printed_as(options.json, options.csv, options.html);
  return args;
}

/// A ranked substitute as the hop that goes into the recipe: its lot's alpha today (how it is known
/// from the lot in `cellar`), else the catalog midpoint; its lot's oil, else the catalog midpoint.
SwapIn swap_in_of(const Substitute& s, double share, const Cellar* cellar) {
  SwapIn in;
  in.share = share;
  in.hop.variety = s.variety.name;
  const CellarLot* lot = s.lot && cellar != nullptr ? cellar->find(s.lot->lot) : nullptr;
  if (s.alpha_today) {
    in.hop.alpha_percent = *s.alpha_today;
    if (lot != nullptr) in.hop.alpha_origin = lot_alpha_origin(*lot, &s.variety);
  } else if (s.variety.alpha_acid) {
    in.hop.alpha_percent = s.variety.alpha_acid->mid();
    in.hop.alpha_origin.catalog_range = std::make_pair(s.variety.alpha_acid->min, s.variety.alpha_acid->max);
  } else {
    throw InputError(
        fmt::format("swap: {}: no alpha acid known (add an alpha_acid range to its catalog entry)", s.variety.name));
  }
  if (s.lot && s.lot->total_oil)
    in.hop.total_oil = s.lot->total_oil;
  else if (s.variety.total_oil)
    in.hop.total_oil = s.variety.total_oil->mid();
  if (s.lot) {
    in.hop.form = s.lot->form;
    in.hop.lot_code = s.lot->lot;
    in.hop.on_hand_g = s.lot->on_hand_g;
  }
  return in;
}

/// The grams the swapped recipe takes of the lot `in` names (every addition drawing on it).
double grams_of(const RecipeSwap& swap, const SwapIn& in) {
  double grams = 0.0;
  for (const auto& hop : swap.result.recipe_after.hops)
    if (hop.variety == in.hop.variety && hop.lot == in.hop.lot_code) grams += hop.grams;
  return grams;
}

/// The substitutes of --pair N, found among the ranked ones.
std::vector<SwapIn> pair_members(const SwapResult& result, std::size_t n, const Cellar* cellar) {
  if (n > result.pairs.size())
    throw Infeasible(fmt::format("--pair {}: there are {} two-variety blends that beat the best single substitute", n,
                                 result.pairs.size()));
  const SubstitutePair& pair = result.pairs[n - 1];
  std::vector<SwapIn> members;
  for (std::size_t k = 0; k < 2; ++k)
    for (const auto& s : result.substitutes)
      if (s.variety.name == pair.varieties[k] && (s.lot ? s.lot->lot : std::string()) == pair.lots[k]) {
        members.push_back(swap_in_of(s, pair.shares[k], cellar));
        break;
      }
  return members;
}

/// Swaps the chosen substitute into the recipe: --pair N, --pick N, else the best-ranked one whose
/// lot covers what the recipe needs (else the best, with its shortfall shown).
RecipeSwapReport swap_recipe(const SwapArgs& args, const DataSet& data, const SwapResult& result,
                             const Recipe& recipe) {
  RecipeSwapReport report;
  report.missing = result.missing.name;
  report.from_stock = result.from_stock;
  const auto into = [&](const std::vector<SwapIn>& in) {
    return swap_into_recipe(recipe, result.missing.name, in, data.catalog, args.settings, Weighing::as_weighed);
  };
  if (result.substitutes.empty()) throw Infeasible("no substitute to put into the recipe");
  std::optional<std::size_t> chosen;
  for (std::size_t i = 0; i < result.substitutes.size() && i < args.shown; ++i) {
    const SwapIn in = swap_in_of(result.substitutes[i], 1.0, args.request.cellar);
    const RecipeSwap swap = into({in});
    report.coverage.push_back(
        {in.hop.lot_code.empty() ? in.hop.variety : fmt::format("{} ({})", in.hop.variety, in.hop.lot_code),
         grams_of(swap, in), in.hop.on_hand_g});
    if (!chosen && swap.result.shortfalls.empty()) chosen = i;
  }
  if (args.pair) {
    report.swapped_in = pair_members(result, *args.pair, args.request.cellar);
    report.choice = fmt::format("--pair {}", *args.pair);
  } else if (args.pick) {
    if (*args.pick > result.substitutes.size())
      throw Infeasible(fmt::format("--pick {}: only {} substitutes were found", *args.pick, result.substitutes.size()));
    report.swapped_in = {swap_in_of(result.substitutes[*args.pick - 1], 1.0, args.request.cellar)};
    report.choice = fmt::format("--pick {}", *args.pick);
  } else {
    const std::size_t index = chosen.value_or(0);
    report.swapped_in = {swap_in_of(result.substitutes[index], 1.0, args.request.cellar)};
    report.choice = !result.from_stock ? "the best-ranked substitute"
                    : chosen ? fmt::format("substitute {}, the best-ranked whose lot covers the recipe", index + 1)
                             : "the best-ranked substitute; no listed lot covers the recipe";
  }
  report.swap = into(report.swapped_in);
  report.intervals = rebalance_intervals(report.swap.result, data.catalog, args.alpha_tolerance);
  return report;
}

/// The varieties a swap looks up by name: the missing one, the stock's lots' and the recipe's.
std::vector<std::string> names_swap_needs(const SwapArgs& args) {
  std::vector<std::string> names{args.request.missing};
  if (!args.stock.empty())
    for (const auto& lot : load_stock(args.stock).lots) names.push_back(lot.variety);
  if (!args.recipe.empty())
    for (const auto& hop : read_recipe_file(args.recipe, BeerXmlReadOptions{}).recipe.hops)
      names.push_back(hop.variety);
  return names;
}

/// Vectorise, index, search, re-score, amount factors, pairs. From a compiled catalog the stored
/// index answers and only the rows the search returns are read; they join `data.catalog` (which
/// then holds only the rows named), so the recipe swap and the pages find them.
SwapResult substitutes(const Console& console, CatalogSubset& catalogs, const SwapRequest& request) {
  DataSet& data = catalogs.data;
  if (!catalogs.compiled) {
    const auto timer = console.time("vectorise, index and rank");
    return find_substitutes(data.catalog, data.lexicon, request);
  }
  const auto timer = console.time("read index and rank");
  SwapResult result = find_substitutes(CompiledSubstituteCatalog(*catalogs.compiled, data.lexicon, request.purpose),
                                       data.lexicon, request);
  for (const auto& s : result.substitutes)
    if (find_variety(data.catalog, s.variety.name) == nullptr) data.catalog.varieties.push_back(s.variety);
  index_variety_names(data.catalog);
  return result;
}

void run_swap(const Console& console, const GlobalOptions& globals, SwapArgs args) {
  use_single_thread();  // one query: threads would only add start-up time
  // 1. Load: lexicon and catalogs (from a compiled catalog only the rows named), and the stock file when given.
  CatalogSubset catalogs = load_data_for_names(globals, console, [&] { return names_swap_needs(args); });
  const DataSet& data = catalogs.data;
  Cellar cellar;
  if (!args.stock.empty()) {
    cellar = load_cellar(args.stock, data.catalog, args.cellar);
    args.request.cellar = &cellar;
  }
  // 2. Compute: vectorise, index, search, re-score, amount factors, pairs.
  SwapResult result = substitutes(console, catalogs, args.request);
  if (result.from_stock) result.notes.push_back(brew_day_line(args.cellar));
  // 3. Into the recipe, when asked; then list only the substitutes the brewer asked to see.
  std::optional<RecipeSwapReport> swapped;
  if (!args.recipe.empty()) {
    const RecipeFile file = read_recipe_file(args.recipe, BeerXmlReadOptions{});
    swapped = swap_recipe(args, data, result, file.recipe);
    result.notes.insert(result.notes.end(), file.notes.begin(), file.notes.end());
    if (!args.write.empty())
      swapped->written = write_recipe_file(args.write, file, swapped->swap.result.recipe_after, &data.catalog);
  }
  if (result.substitutes.size() > args.shown) result.substitutes.resize(args.shown);
  // 4. Render.
  const auto timer = console.time("render");
  const bool pairs = args.request.pairs;
  write_html(args.html,
             [&] { return swap_html(result, globals.unit_system(), pairs, page_meta(&data, "", args.stock)); });
  if (args.printed == Printed::csv) print_notes(console, result.notes);
  print_result(
      console, args.printed, data,
      [&] {
        nlohmann::json out = swap_to_json(result, pairs);
        if (swapped) out["recipe_swap"] = recipe_swap_to_json(*swapped);
        return out;
      },
      [&] { return swap_to_csv(result, pairs); },
      [&](std::ostream& out) {
        render_swap(out, result, globals.unit_system(), pairs);
        if (swapped) render_recipe_swap(out, *swapped, globals.unit_system());
      });
}

}  // namespace

void setup_swap_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands) {
  auto options = std::make_shared<SwapOptions>();
  auto* swap = app.add_subcommand("swap", "find substitutes for a variety you cannot get, and how much to use");
  swap->add_option("VARIETY", options->variety, "the variety to replace (case and accents do not matter)")->required();
  swap->add_option("--for", options->purpose, "the job the hop does: aroma (default) or bittering");
  swap->add_option("--stock", options->stock, "only lots on hand in this stock file, with their alpha today");
  add_cellar_options(swap, options->cellar, false);
  swap->add_option("--top", options->top, "how many substitutes to list (1-100, default 5)");
  swap->add_flag("--pairs", options->pairs, "also two-variety blends that match better than any single substitute");
  swap->add_flag("--json", options->json, "print one JSON document instead of tables");
  swap->add_flag("--csv", options->csv,
                 "print one CSV table for spreadsheets: a row per substitute (kind \"substitute\") and, with "
                 "--pairs, two per blend (kind \"blend\"); units in the headers; notes on stderr");
  add_html_option(swap, options->html);
  swap->add_option("--recipe", options->recipe,
                   "put the substitute into this recipe: late additions by the oil factor, boil additions by "
                   "alpha, total IBU held by the bittering charge");
  swap->add_option("--pick", options->pick,
                   "with --recipe: use substitute N of the list (default: the best whose "
                   "lot covers the recipe)");
  swap->add_option("--pair", options->pair, "with --recipe: use two-variety blend N (implies --pairs)");
  swap->add_option("--write", options->write, "with --recipe: save the recipe with the substitute (atomically)");
  add_bitterness_options(swap, options->bitterness);
  add_alpha_tolerance_option(swap, options->alpha_tolerance);
  swap->footer(
      "Similarity 0-100 weighs aroma, oil composition and chemistry (aroma question) or alpha,\n"
      "cohumulone and beta (bittering question). The amount factor is grams of substitute per gram\n"
      "of the missing variety: oil ratio for aroma, alpha ratio for bittering (so IBU holds).\n"
      "With --stock every lot is aged to the brew day; stale lots (below --stale-below of their\n"
      "certificate alpha, or an oxidised HSI) are ranked below every fresh lot.\n\n"
      "Examples:\n"
      "  bine swap Tidewell\n"
      "  bine swap Tidewell --stock stock.json --on 2026-12-01 --pairs\n"
      "  bine swap Tidewell --stock stock.json --on 2026-12-01 --stale-below 80%\n"
      "  bine swap Keelstone --for bittering --top 3 --json\n"
      "  bine swap Tidewell --stock stock.json --on 2026-12-01 --pairs --csv\n"
      "  bine --units us swap Tidewell --html tidewell.html\n"
      "  bine swap Tidewell --recipe pale-ale.json --stock stock.json --on 2026-12-01 --write pale-ale-swap.json\n"
      "  bine swap Tidewell --recipe pale-ale.json --pair 1\n"
      "  bine swap Tidewell --recipe pale-ale.json --brewhouse brewhouse.json\n"
      "With --recipe, --brewhouse (else $BINE_BREWHOUSE) and the other bitterness options compute its IBU,\n"
      "each with its 90 % interval (alpha range or certificate tolerance, ageing, brewhouse factor).");
  commands.add(swap,
               [&globals, options](const Console& console) { run_swap(console, globals, parse_swap_args(*options)); });
}

}  // namespace bine::cli
