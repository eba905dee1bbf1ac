// bine swap: what to use instead of a sold-out variety, from the catalog or from the lots on hand,
// and how much of it.
#include <fmt/format.h>

#include <iostream>
#include <memory>

#include "cli/brew_day_option.hpp"
#include "cli/commands.hpp"
#include "engine/hop_index.hpp"
#include "engine/substitutes.hpp"
#include "io/file_io.hpp"
#include "io/loaders.hpp"
#include "model/errors.hpp"
#include "report/swap_report.hpp"
#include "report/timings.hpp"

namespace bine::cli {
namespace {

struct SwapOptions {
  std::string variety;
  std::string purpose = "aroma";
  std::string stock;
  std::string on;
  int top = 5;
  bool pairs = false;
  bool json = false;
  std::string html;
};

/// Checks every option, collects every problem, and returns the request (without catalog data).
SwapRequest validate(const SwapOptions& options, BrewDay& brew_day) {
  std::vector<std::string> problems;
  SwapRequest request;
  request.missing = options.variety;
  if (const auto purpose = swap_purpose_from(options.purpose))
    request.purpose = *purpose;
  else
    problems.push_back(fmt::format("--for: \"{}\": unknown question (expected aroma or bittering)", options.purpose));
  if (options.top < 1 || options.top > 100)
    problems.push_back(fmt::format("--top: {}: out of range (expected a whole number from 1 to 100)", options.top));
  else
    request.top = static_cast<std::size_t>(options.top);
  request.pairs = options.pairs;
  try {
    brew_day = brew_day_from_option(options.on);
    request.on = brew_day.date;
  } catch (const InputError& e) {
    problems.insert(problems.end(), e.lines().begin(), e.lines().end());
  }
  if (!options.on.empty() && options.stock.empty())
    problems.push_back(
        fmt::format("--on: {}: only used with --stock (expected --stock FILE to age its lots)", options.on));
  if (!problems.empty()) throw InputError(problems);
  return request;
}

int run_swap(const GlobalOptions& globals, const SwapOptions& options) {
  BrewDay brew_day;
  SwapRequest request = validate(options, brew_day);
  use_single_thread();  // one query: threads would only add start-up time

  // 1. Load: lexicon and catalogs, and the stock file when given.
  DataSet data;
  Stock stock;
  {
    PhaseTimer timer(globals.timings, "load data");
    data = globals.load();
    if (!options.stock.empty()) {
      stock = load_stock(options.stock);
      if (stock.name.empty()) stock.name = options.stock;
      request.stock = &stock;
    }
  }
  // 2. Compute: vectorise, index, search, re-score, amount factors, pairs.
  SwapResult result;
  {
    PhaseTimer timer(globals.timings, "vectorise, index and rank");
    result = find_substitutes(data.catalog, data.lexicon, request);
  }
  if (result.from_stock && brew_day.from_clock)
    result.notes.push_back(
        fmt::format("lot alpha aged to today, {} (set --on DATE for the brew day)", format_date(brew_day.date)));
  if (data.catalog.demo)
    result.notes.push_back("the shipped catalog is invented demo data: load your own with --catalog FILE for brewing");

  // 3. Render.
  PhaseTimer timer(globals.timings, "render");
  if (!options.html.empty())
    write_file_atomically(options.html, swap_html(result, globals.unit_system(), options.pairs));
  if (options.json)
    std::cout << swap_to_json(result, options.pairs).dump(2) << '\n';
  else
    render_swap(std::cout, result, globals.unit_system(), options.pairs);
  return 0;
}

}  // namespace

void setup_swap_command(CLI::App& app, const GlobalOptions& globals) {
  auto options = std::make_shared<SwapOptions>();
  auto* swap = app.add_subcommand("swap", "find substitutes for a variety you cannot get, and how much to use");
  swap->add_option("VARIETY", options->variety, "the variety to replace (case and accents do not matter)")->required();
  swap->add_option("--for", options->purpose, "the job the hop does: aroma (default) or bittering");
  swap->add_option("--stock", options->stock, "only lots on hand in this stock file, with their alpha today");
  swap->add_option("--on", options->on, "brew day, YYYY-MM-DD, to age stock lots to (default: today)");
  swap->add_option("--top", options->top, "how many substitutes to list (1-100, default 5)");
  swap->add_flag("--pairs", options->pairs, "also two-variety blends that match better than any single substitute");
  swap->add_flag("--json", options->json, "print one JSON document instead of tables");
  swap->add_option("--html", options->html, "also write a self-contained HTML report with aroma charts to FILE");
  swap->footer(
      "Similarity 0-100 weighs aroma, oil composition and chemistry (aroma question) or alpha,\n"
      "cohumulone and beta (bittering question). The amount factor is grams of substitute per gram\n"
      "of the missing variety: oil ratio for aroma, alpha ratio for bittering (so IBU holds).\n\n"
      "Examples:\n"
      "  bine swap Tidewell\n"
      "  bine swap Tidewell --stock stock.json --on 2026-12-01 --pairs\n"
      "  bine swap Keelstone --for bittering --top 3 --json\n"
      "  bine --units us swap Tidewell --html tidewell.html");
  swap->callback([&globals, options] { run_swap(globals, *options); });
}

}  // namespace bine::cli
