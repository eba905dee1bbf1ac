#include "cli/cellar_options.hpp"

#include <fmt/format.h>

#include <cstdlib>

#include "engine/lot_allocation.hpp"
#include "io/limits.hpp"
#include "io/loaders.hpp"
#include "model/errors.hpp"

namespace bine::cli {

void add_cellar_options(CLI::App* command, CellarOptions& options, bool takes_lots) {
  command->add_option("--on", options.on, "brew day, YYYY-MM-DD, every stock lot is aged to (default: today)");
  add_lot_judging_options(command, options, takes_lots);
}

void add_lot_judging_options(CLI::App* command, CellarOptions& options, bool takes_lots) {
  command->add_option("--stale-below", options.stale_below,
                      "a lot with less than this share of its certificate alpha is stale (default 75%)");
  if (!takes_lots) return;
  command->add_option("--lot-order", options.lot_order,
                      "which lot of a variety is weighed first: oldest (packaging date, the default) or most (on "
                      "hand); a lot the recipe names is always used");
  command->add_flag("--allow-stale", options.allow_stale, "use stale lots too (they are left out by default)");
}

CellarChoice read_cellar_options(OptionReader& reader, const CellarOptions& options) {
  CellarChoice choice;
  if (auto on = reader.brew_day(options.on)) choice.on = *on;
  if (auto share =
          reader.optional_quantity("--stale-below", options.stale_below, Dimension::percent, limits::stale_below))
    choice.settings.stale_below = *share / 100.0;
  choice.allow_stale = options.allow_stale;
  choice.settings.allow_stale = options.allow_stale;
  if (auto order = lot_order_from(options.lot_order))
    choice.settings.lot_order = *order;
  else
    reader.add(fmt::format("--lot-order: \"{}\": unknown (expected oldest or most)", options.lot_order));
  return choice;
}

Cellar load_cellar(const std::string& stock_file, const Catalog& catalog, const CellarChoice& choice) {
  Stock stock = load_stock(stock_file);
  if (stock.name.empty()) stock.name = stock_file;
  return age_cellar(stock, catalog, choice.on.date, choice.settings);
}

std::string stock_file_if_given(const std::string& option) {
  if (!option.empty()) return option;
  if (const char* env = std::getenv("BINE_STOCK"); env != nullptr && *env != '\0') return env;
  return {};
}

std::string stock_file_or_env(const std::string& option) {
  std::string file = stock_file_if_given(option);
  if (file.empty()) throw InputError("no stock file (expected --stock FILE, or the BINE_STOCK environment variable)");
  return file;
}

std::string brew_day_line(const CellarChoice& choice) {
  return fmt::format("stock lots aged to {}{}", format_date(choice.on.date),
                     choice.on.from_clock ? " (today; pass --on DATE to reproduce)" : "");
}

}  // namespace bine::cli
