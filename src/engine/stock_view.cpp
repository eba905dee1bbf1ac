// bine stock list: every lot aged to one day, days until stale and totals per variety
// (docs/methods.md#days-until-stale).
#include "engine/stock_view.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

StockLine line_for(const Lot& lot, std::size_t index, const Catalog& catalog, Date on, double stale_below) {
  StockLine line;
  line.lot = lot;
  line.index = index;
  line.code = lot.lot.empty() ? fmt::format("lot {}", index + 1) : lot.lot;
  line.alpha_today = lot.alpha_acid;
  if (lot.hsi) {
    line.hsi_loss_percent = percent_lost_from_hsi(*lot.hsi);
    line.stability_percent = 100.0 - *line.hsi_loss_percent;
    line.stability_source = fmt::format("from its HSI {:.2f}", *lot.hsi);
  } else if (const Variety* variety = find_variety(catalog, lot.variety); variety != nullptr && variety->stability) {
    line.stability_percent = *variety->stability;
    line.stability_source = "catalog";
  } else {
    line.stability_source = "no catalog value; fair class assumed";
  }
  if (!lot.alpha_acid || !lot.packaged || !lot.storage) return line;
  line.aged = true;
  line.days = std::max(0L, days_between(*lot.packaged, on));
  const StorageHistory history{*lot.alpha_acid, line.stability_percent, *lot.storage, static_cast<double>(line.days)};
  const AgedAlpha aged = age_alpha(history);
  line.alpha_today = aged.alpha_percent;
  line.remaining = aged.remaining;
  line.stale = aged.remaining < stale_below;
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
