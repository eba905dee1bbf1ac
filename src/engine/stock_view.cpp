// bine stock list: every lot aged to one day, days until stale and totals per variety
// (docs/methods.md#days-until-stale).
#include "engine/stock_view.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "engine/cellar.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

// Every lot goes through the one cellar (engine/cellar.hpp), so the list shows the alpha, stale flag
// and reason that swap, blend and rebalance show for the same lot and day. The HSI is a state (what
// the sample had lost when analysed, already in its certificate alpha), never a storage rate.
StockLine line_for(const Lot& lot, std::size_t index, const Catalog& catalog, Date on, double stale_below) {
  CellarSettings settings;
  settings.stale_below = stale_below;
  const CellarLot c = lot_on_brew_day(lot, index, find_variety(catalog, lot.variety), on, settings);
  StockLine line;
  line.lot = lot;
  line.index = index;
  line.code = c.code;
  line.alpha_today = c.alpha_today;
  line.aged = c.basis == AlphaBasis::aged;
  line.remaining = c.remaining;
  line.days = c.days;
  line.stability_percent = c.stability_percent;
  line.stability_source = c.stability_source;
  line.hsi_loss_percent = c.hsi_loss_percent;
  line.stale = c.stale;
  line.stale_reason = c.stale_reason;
  if (!line.aged) return line;
  const StorageHistory history{*lot.alpha_acid, c.stability_percent, *lot.storage, static_cast<double>(c.days)};
  line.days_until_stale = std::max(0L, days_to_share(history, stale_below) - line.days);
  return line;
}

}  // namespace

long days_to_share(const StorageHistory& history, double share) {
  // A(D) = A0 x exp(-k x TF x SF x D) (Garetz 1994; engine/storage_loss.hpp) solved for A(D) / A0 = share.
  const AgedAlpha one_day =
      age_alpha(StorageHistory{history.alpha_percent, history.stability_percent, history.storage, 1.0});
  const double rate = one_day.rate_per_day * one_day.temperature_factor * one_day.package_factor;
  if (rate <= 0.0) return 0;
  return static_cast<long>(std::ceil(std::log(1.0 / share) / rate - 1e-9));
}

StockView view_stock(const Stock& stock, const Catalog& catalog, Date on, double stale_below) {
  require_known_varieties(stock, catalog);
  StockView view;
  view.name = stock.name.empty() ? stock.source_file : stock.name;
  view.on = on;
  view.stale_below = stale_below;
  std::vector<std::string> problems;
  for (std::size_t i = 0; i < stock.lots.size(); ++i) {
    const Lot& lot = stock.lots[i];
    if (lot.packaged && *lot.packaged > on)
      problems.push_back(fmt::format("{}: /lots/{}/packaged: {} is after the day {}", stock.source_file, i,
                                     format_date(*lot.packaged), format_date(on)));
    view.lots.push_back(line_for(lot, i, catalog, on, stale_below));
    const StockLine& line = view.lots.back();
    const std::string folded = fold_name(lot.variety);
    auto total = std::find_if(view.totals.begin(), view.totals.end(),
                              [&](const VarietyTotal& t) { return fold_name(t.variety) == folded; });
    if (total == view.totals.end()) total = view.totals.insert(view.totals.end(), VarietyTotal{lot.variety});
    const double grams = lot.on_hand_g.value_or(0.0);
    total->on_hand_g += grams;
    total->lots += 1;
    if (line.stale) total->stale_g += grams;
  }
  if (!problems.empty()) throw InputError(problems, {Remedy::later_brew_day});
  return view;
}

}  // namespace bine
