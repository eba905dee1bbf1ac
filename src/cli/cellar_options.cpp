#include "cli/cellar_options.hpp"

#include <fmt/format.h>

#include "io/limits.hpp"
#include "io/loaders.hpp"

namespace bine::cli {

void add_cellar_options(CLI::App* command, CellarOptions& options, bool allow_stale_option) {
  command->add_option("--on", options.on, "brew day, YYYY-MM-DD, every stock lot is aged to (default: today)");
  command->add_option("--stale-below", options.stale_below,
                      "a lot with less than this share of its certificate alpha is stale (default 75%)");
  if (allow_stale_option)
    command->add_flag("--allow-stale", options.allow_stale, "use stale lots too (they are left out by default)");
}

CellarChoice read_cellar_options(OptionReader& reader, const CellarOptions& options) {
  CellarChoice choice;
  if (auto on = reader.brew_day(options.on)) choice.on = *on;
  if (auto share =
          reader.optional_quantity("--stale-below", options.stale_below, Dimension::percent, limits::stale_below))
    choice.settings.stale_below = *share / 100.0;
  choice.allow_stale = options.allow_stale;
  return choice;
}

Cellar load_cellar(const std::string& stock_file, const Catalog& catalog, const CellarChoice& choice) {
  Stock stock = load_stock(stock_file);
  if (stock.name.empty()) stock.name = stock_file;
  return age_cellar(stock, catalog, choice.on.date, choice.settings);
}

std::string brew_day_line(const CellarChoice& choice) {
  return fmt::format("stock lots aged to {}{}", format_date(choice.on.date),
                     choice.on.from_clock ? " (today; pass --on DATE to reproduce)" : "");
}

}  // namespace bine::cli
