// Lots on the brew day (docs/methods.md#lots-on-brew-day).
//
// Ageing: a lot's certificate alpha is the alpha on its packaging (or analysis) date. From then to the
// brew day it falls first-order at the variety's own rate [Garetz M. 1994, "Hop Storage: How to Get -
// and Keep - Your Hops' Optimum Value", Brewing Techniques 2(1)]: A = A0 x exp(-k x TF x SF x D)
// (storage_loss.cpp). The variety's stability comes from the catalog, else the fair class.
//
// HSI is a state, not a rate (docs/methods.md#hsi): 110 x log10(HSI / 0.25) % is what the sample had
// already lost when it was analysed [Garetz 1994, after Nickerson G.B. & Likens S.T. 1979, J. Am. Soc.
// Brew. Chem. 37:184]. A certificate's alpha measured with its HSI already includes that loss, so it
// is never taken off again, and the HSI never sets the storage rate: a lot with a poor HSI ages
// exactly as a lot of the same variety without one. The HSI gives the freshness word and, above the
// oxidised edge, the stale flag.
//
// Stale: alpha today below `stale_below` of the certificate alpha, or an oxidised HSI. Commands rank
// stale lots last (swap) or leave them out unless the brewer allows them (blend, rebalance).
#include "engine/cellar.hpp"

#include <fmt/format.h>

#include <algorithm>

#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

void take_stability(const Variety* variety, const CellarSettings& settings, CellarLot& c) {
  if (variety != nullptr && variety->stability) {
    c.stability_percent = *variety->stability;
    c.stability_source = "catalog";
  } else {
    c.stability_percent = settings.default_stability;
    c.stability_source = fmt::format("fair class assumed, no catalog value");
  }
}

// The HSI's state (docs/methods.md#freshness; band edges common practice, from memory).
void take_hsi(const Lot& lot, const CellarSettings& settings, CellarLot& c) {
  if (!lot.hsi) return;
  c.hsi_loss_percent = percent_lost_from_hsi(*lot.hsi);
  if (*lot.hsi > settings.oxidised_hsi)
    c.hsi_state = HsiState::oxidised;
  else if (*lot.hsi >= settings.ageing_hsi)
    c.hsi_state = HsiState::ageing;
  else
    c.hsi_state = HsiState::fresh;
}

void age(const Lot& lot, Date on, CellarLot& c) {
  c.days = std::max(0L, days_between(*lot.packaged, on));
  const AgedAlpha aged =
      age_alpha(StorageHistory{*lot.alpha_acid, c.stability_percent, *lot.storage, static_cast<double>(c.days)});
  c.alpha_today = aged.alpha_percent;
  c.remaining = aged.remaining;
  c.warm_extrapolation = aged.warm_extrapolation;
  c.basis = AlphaBasis::aged;
  c.alpha_note = fmt::format("{:.1f} % packaged {}, {} days at {:.0f} C {}, stability {:.0f} % ({}) -> {:.2f} %",
                             *lot.alpha_acid, format_date(*lot.packaged), c.days, lot.storage->temperature_c,
                             to_string(lot.storage->package), c.stability_percent, c.stability_source, *c.alpha_today);
  if (c.warm_extrapolation) c.alpha_note += " (stored above 20 C: the model is extrapolated)";
}

void judge(const CellarSettings& settings, CellarLot& c) {
  std::vector<std::string> reasons;
  if (c.basis == AlphaBasis::aged && c.remaining < settings.stale_below)
    reasons.push_back(fmt::format("{:.0f} % of its certificate alpha left (stale below {:.0f} %)", 100.0 * c.remaining,
                                  100.0 * settings.stale_below));
  if (c.hsi_state == HsiState::oxidised)
    reasons.push_back(fmt::format("HSI {:.2f} marks it oxidised (above {:.2f})", *c.lot.hsi, settings.oxidised_hsi));
  c.stale = !reasons.empty();
  c.stale_reason = fmt::format("{}", fmt::join(reasons, "; "));
}

}  // namespace

std::string_view to_string(HsiState state) {
  switch (state) {
    case HsiState::fresh:
      return "fresh";
    case HsiState::ageing:
      return "ageing";
    case HsiState::oxidised:
      return "oxidised";
  }
  return "";
}

CatalogAlpha catalog_alpha(const Variety& variety) { return catalog_alpha(variety.name, variety.alpha_acid); }

CatalogAlpha catalog_alpha(std::string_view name, const std::optional<Range>& alpha_acid) {
  if (!alpha_acid) return {std::nullopt, fmt::format("no alpha known for {}", name)};
  return {alpha_acid->mid(), fmt::format("catalog midpoint {:.2f} % ({:g}-{:g} %), not a lot", alpha_acid->mid(),
                                         alpha_acid->min, alpha_acid->max)};
}

CellarLot lot_on_brew_day(const Lot& lot, std::size_t index, const Variety* variety, Date on,
                          const CellarSettings& settings) {
  CellarLot c;
  c.lot = lot;
  c.index = index;
  c.code = lot_code(lot, index);
  take_stability(variety, settings, c);
  take_hsi(lot, settings, c);
  if (!lot.alpha_acid) {
    const CatalogAlpha fallback = variety != nullptr ? catalog_alpha(*variety) : CatalogAlpha{};
    c.alpha_today = fallback.alpha_percent;
    c.basis = fallback.alpha_percent ? AlphaBasis::catalog_midpoint : AlphaBasis::unknown;
    c.alpha_note = fallback.alpha_percent ? "no lot alpha: " + fallback.note : "no alpha known";
  } else if (!lot.packaged || !lot.storage) {
    c.alpha_today = lot.alpha_acid;
    c.basis = AlphaBasis::certificate;
    c.alpha_note = fmt::format("{:.2f} % certificate value, unaged (no packaged date or storage)", *lot.alpha_acid);
  } else {
    age(lot, on, c);
  }
  if (c.hsi_loss_percent) {
    c.hsi_note = fmt::format("HSI {:.2f} ({}): about {:.1f} % lost before analysis, already in the certificate",
                             *lot.hsi, to_string(*c.hsi_state), *c.hsi_loss_percent);
    c.alpha_note += "; " + c.hsi_note;
  }
  judge(settings, c);
  return c;
}

void require_known_varieties(const Stock& stock, const Catalog& catalog) {
  std::vector<std::string> problems;
  for (std::size_t i = 0; i < stock.lots.size(); ++i) {
    const std::string& name = stock.lots[i].variety;
    if (find_variety(catalog, name) == nullptr)
      problems.push_back(
          fmt::format("{}: /lots/{}/variety: \"{}\" is not in the loaded catalogs ({}): its stability "
                      "is needed to age the lot",
                      stock.source_file, i, name, variety_hint(catalog, name)));
  }
  if (!problems.empty()) throw InputError(problems, {Remedy::add_catalog});
}

Cellar age_cellar(const Stock& stock, const Catalog& catalog, Date on, const CellarSettings& settings) {
  require_known_varieties(stock, catalog);
  Cellar cellar;
  cellar.name = stock.name.empty() ? stock.source_file : stock.name;
  cellar.source_file = stock.source_file;
  cellar.on = on;
  cellar.settings = settings;
  std::vector<std::string> problems;
  for (std::size_t i = 0; i < stock.lots.size(); ++i) {
    const Lot& lot = stock.lots[i];
    if (lot.packaged && *lot.packaged > on)
      problems.push_back(fmt::format("{}: /lots/{}/packaged: {} is after the brew day {}", stock.source_file, i,
                                     format_date(*lot.packaged), format_date(on)));
    cellar.lots.push_back(lot_on_brew_day(lot, i, find_variety(catalog, lot.variety), on, settings));
  }
  if (!problems.empty()) throw InputError(problems, {Remedy::later_brew_day});
  return cellar;
}

const CellarLot* Cellar::find(std::string_view code) const {
  const std::string wanted = fold_name(code);
  for (const auto& c : lots)
    if (fold_name(c.lot.lot) == wanted || fold_name(c.code) == wanted) return &c;
  return nullptr;
}

std::vector<const CellarLot*> Cellar::lots_of(std::string_view variety) const {
  const std::string wanted = fold_name(variety);
  std::vector<const CellarLot*> found;
  for (const auto& c : lots)
    if (fold_name(c.lot.variety) == wanted) found.push_back(&c);
  return found;
}

}  // namespace bine
