// bine swap: what to use instead of a sold-out variety, from the catalog or from the lots on hand,
// and how much of it.
#include <fmt/format.h>

#include <memory>

#include "cli/commands.hpp"
#include "cli/html_output.hpp"
#include "cli/option_values.hpp"
#include "engine/hop_index.hpp"
#include "engine/substitutes.hpp"
#include "io/file_io.hpp"
#include "io/limits.hpp"
#include "io/loaders.hpp"
#include "report/html_reports.hpp"
#include "report/swap_report.hpp"

namespace bine::cli {
namespace {

struct SwapOptions {
  std::string variety;
  std::string purpose = "aroma";
  std::string stock;
  std::string on;
  std::string top;
  bool pairs = false;
  bool json = false;
  std::string html;
};

struct SwapArgs {
  SwapRequest request;  // without catalog data; the stock is attached once loaded
  BrewDay brew_day;
  std::string stock;
  bool json = false;
  std::string html;
};

SwapArgs parse_swap_args(const SwapOptions& options) {
  OptionReader reader;
  SwapArgs args;
  args.stock = options.stock;
  args.json = options.json;
  args.html = options.html;
  args.request.missing = options.variety;
  args.request.pairs = options.pairs;
  if (const auto purpose = swap_purpose_from(options.purpose))
    args.request.purpose = *purpose;
  else
    reader.add(fmt::format("--for: \"{}\": unknown question (expected aroma or bittering)", options.purpose));
  if (auto top = reader.count("--top", options.top, limits::substitutes_listed, 5)) args.request.top = *top;
  if (auto on = reader.brew_day(options.on)) {
    args.brew_day = *on;
    args.request.on = on->date;
  }
  reader.require(options.on.empty() || !options.stock.empty(),
                 fmt::format("--on: {}: only used with --stock (expected --stock FILE to age its lots)", options.on));
  reader.throw_if_any();
  return args;
}

void run_swap(const Console& console, const GlobalOptions& globals, SwapArgs args) {
  use_single_thread();  // one query: threads would only add start-up time
  // 1. Load: lexicon and catalogs, and the stock file when given.
  const DataSet data = load_data(globals, console);
  Stock stock;
  if (!args.stock.empty()) {
    stock = load_stock(args.stock);
    if (stock.name.empty()) stock.name = args.stock;
    args.request.stock = &stock;
  }
  // 2. Compute: vectorise, index, search, re-score, amount factors, pairs.
  SwapResult result = [&] {
    const auto timer = console.time("vectorise, index and rank");
    return find_substitutes(data.catalog, data.lexicon, args.request);
  }();
  if (result.from_stock && args.brew_day.from_clock)
    result.notes.push_back(
        fmt::format("lot alpha aged to today, {} (set --on DATE for the brew day)", format_date(args.brew_day.date)));
  if (data.catalog.demo)
    result.notes.push_back("the shipped catalog is invented demo data: load your own with --catalog FILE for brewing");
  // 3. Render.
  const auto timer = console.time("render");
  const bool pairs = args.request.pairs;
  write_html(args.html,
             [&] { return swap_html(result, globals.unit_system(), pairs, page_meta(&data, "", args.stock)); });
  print_result(
      console, args.json, [&] { return swap_to_json(result, pairs); },
      [&](std::ostream& out) { render_swap(out, result, globals.unit_system(), pairs); });
}

}  // namespace

void setup_swap_command(CLI::App& app, const GlobalOptions& globals, CommandTable& commands) {
  auto options = std::make_shared<SwapOptions>();
  auto* swap = app.add_subcommand("swap", "find substitutes for a variety you cannot get, and how much to use");
  swap->add_option("VARIETY", options->variety, "the variety to replace (case and accents do not matter)")->required();
  swap->add_option("--for", options->purpose, "the job the hop does: aroma (default) or bittering");
  swap->add_option("--stock", options->stock, "only lots on hand in this stock file, with their alpha today");
  swap->add_option("--on", options->on, "brew day, YYYY-MM-DD, to age stock lots to (default: today)");
  swap->add_option("--top", options->top, "how many substitutes to list (1-100, default 5)");
  swap->add_flag("--pairs", options->pairs, "also two-variety blends that match better than any single substitute");
  swap->add_flag("--json", options->json, "print one JSON document instead of tables");
  add_html_option(swap, options->html);
  swap->footer(
      "Similarity 0-100 weighs aroma, oil composition and chemistry (aroma question) or alpha,\n"
      "cohumulone and beta (bittering question). The amount factor is grams of substitute per gram\n"
      "of the missing variety: oil ratio for aroma, alpha ratio for bittering (so IBU holds).\n\n"
      "Examples:\n"
      "  bine swap Tidewell\n"
      "  bine swap Tidewell --stock stock.json --on 2026-12-01 --pairs\n"
      "  bine swap Keelstone --for bittering --top 3 --json\n"
      "  bine --units us swap Tidewell --html tidewell.html");
  commands.add(swap,
               [&globals, options](const Console& console) { run_swap(console, globals, parse_swap_args(*options)); });
}

}  // namespace bine::cli
