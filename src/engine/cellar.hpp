#pragma once
// The brewer's cold store on the brew day: every lot aged to one date by one method, its freshness
// judged once, and the lots an addition draws on chosen once. Every command that reads a stock file
// (swap, blend, rebalance, ibu) goes through here, so the same cold store gives the same answer
// everywhere. Method: docs/methods.md#lots-on-brew-day.
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "engine/storage_loss.hpp"
#include "model/hops.hpp"

namespace bine {

/// Which lot of a variety an addition is weighed from first (engine/lot_allocation.hpp): the oldest
/// packaging (use stock before it ages) or the most on hand.
enum class LotOrder { oldest, most };

/// How lots are judged and taken.
struct CellarSettings {
  double stale_below = 0.75;                  // a lot with less than this share of its certificate alpha is stale
  double oxidised_hsi = 0.45;                 // an HSI above this marks the lot oxidised (stale)
  double ageing_hsi = 0.30;                   // from here up to oxidised_hsi: ageing (a word only)
  double default_stability = kStabilityFair;  // % left after 6 months when the variety gives none
  LotOrder lot_order = LotOrder::oldest;      // which lot of a variety is taken first
  bool allow_stale = false;                   // stale lots may be taken (else left out)
};

/// Where a lot's alpha on the brew day comes from.
enum class AlphaBasis {
  aged,              // certificate alpha aged from packaging to the brew day
  certificate,       // certificate alpha as printed (no packaging date or storage to age it)
  catalog_midpoint,  // no lot alpha: the variety's catalog range midpoint
  unknown,           // neither
};

/// Freshness word from a measured HSI (common practice; docs/methods.md#freshness).
enum class HsiState { fresh, ageing, oxidised };
std::string_view to_string(HsiState state);

/// One lot as it is on the brew day.
struct CellarLot {
  Lot lot;                            // as the stock file gives it (certificate values)
  std::size_t index = 0;              // position in the stock file
  std::string code;                   // the lot code, or "lot N" (1-based) when the file gives none
  std::optional<double> alpha_today;  // % w/w on the brew day
  AlphaBasis basis = AlphaBasis::unknown;
  double remaining = 1.0;  // share of the certificate alpha left on the brew day
  long days = 0;           // days from packaging to the brew day
  double stability_percent = kStabilityFair;
  std::string stability_source;            // "catalog", "fair class assumed (no catalog value)"
  std::optional<double> hsi_loss_percent;  // alpha lost before the analysis, from the HSI
  std::optional<HsiState> hsi_state;
  bool warm_extrapolation = false;  // stored above 20 C: the temperature factor is extrapolated
  bool stale = false;
  std::string stale_reason;  // empty unless stale
  std::string alpha_note;    // how alpha_today was obtained, in words (with hsi_note)
  std::string hsi_note;      // the HSI's state in words, empty without an HSI

  bool on_hand() const { return lot.on_hand_g && *lot.on_hand_g > 0.0; }
};

/// The cold store on one brew day.
struct Cellar {
  std::string name;         // the stock's name, else its file
  std::string source_file;  // for messages
  Date on{};                // the brew day every lot is aged to
  CellarSettings settings;
  std::vector<CellarLot> lots;  // in file order

  /// The lot with this code (folded comparison), or nullptr.
  const CellarLot* find(std::string_view code) const;
  /// Lots of `variety` (folded comparison), in file order.
  std::vector<const CellarLot*> lots_of(std::string_view variety) const;
};

/// One lot aged to `on`: alpha today, freshness and stale flag. `variety` (may be null) gives the
/// stability and, without a lot alpha, the catalog midpoint.
CellarLot lot_on_brew_day(const Lot& lot, std::size_t index, const Variety* variety, Date on,
                          const CellarSettings& settings = {});

/// Throws InputError naming each lot whose variety the catalog does not know (with the closest
/// names): its stability, which ages it, would otherwise be a guess.
void require_known_varieties(const Stock& stock, const Catalog& catalog);

/// Every lot of `stock` aged to `on`; require_known_varieties first. Throws InputError naming each lot packaged after
/// `on`.
Cellar age_cellar(const Stock& stock, const Catalog& catalog, Date on, const CellarSettings& settings = {});

/// A catalog-only candidate's alpha: the midpoint of the variety's range, with the note that says so.
struct CatalogAlpha {
  std::optional<double> alpha_percent;
  std::string note;
};
CatalogAlpha catalog_alpha(const Variety& variety);
/// As above from a variety's name and alpha range alone.
CatalogAlpha catalog_alpha(std::string_view name, const std::optional<Range>& alpha_acid);

}  // namespace bine
