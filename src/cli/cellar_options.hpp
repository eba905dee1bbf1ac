#pragma once
// The options that say how the cold store is read on the brew day (--on, --stale-below, --lot-order,
// --allow-stale), bound and read the same way by every command that takes a stock file, and the one
// place a stock file becomes a Cellar (engine/cellar.hpp).
#include <CLI/CLI.hpp>
#include <string>

#include "cli/option_values.hpp"
#include "engine/cellar.hpp"

namespace bine::cli {

struct CellarOptions {
  std::string on;
  std::string stale_below;
  bool allow_stale = false;
  std::string lot_order = "oldest";
};

/// What the options give.
struct CellarChoice {
  BrewDay on;
  CellarSettings settings;
  bool allow_stale = false;
};

/// Adds --on and --stale-below to `command`, and with `takes_lots` (the command weighs additions from
/// lots it chooses and leaves stale lots out: blend, rebalance) --lot-order and --allow-stale.
void add_cellar_options(CLI::App* command, CellarOptions& options, bool takes_lots);
/// The same without --on, for a command whose dates come from elsewhere (stock plan: each brew's day).
void add_lot_judging_options(CLI::App* command, CellarOptions& options, bool takes_lots);

/// The choice the options give; problems go to `reader`.
CellarChoice read_cellar_options(OptionReader& reader, const CellarOptions& options);

/// The stock file aged to the brew day.
Cellar load_cellar(const std::string& stock_file, const Catalog& catalog, const CellarChoice& choice);

/// The stock file: `option` if given, else $BINE_STOCK when set and not empty; empty when neither.
std::string stock_file_if_given(const std::string& option);

/// The stock file: `option` if given, else $BINE_STOCK (when set and not empty); InputError when neither.
std::string stock_file_or_env(const std::string& option);

/// "lots aged to 2026-12-01 (today; pass --on DATE to reproduce)": the line every stock output prints.
std::string brew_day_line(const CellarChoice& choice);

}  // namespace bine::cli
