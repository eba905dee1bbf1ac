#pragma once
// The cold store as `bine stock list` shows it: every lot aged to one day with the storage model
// (engine/storage_loss.hpp), its stale flag, the days left before it falls below the stale share at
// its storage, and totals per variety. Method: docs/methods.md#days-until-stale.
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "engine/storage_loss.hpp"
#include "model/hops.hpp"

namespace bine {

/// One lot on the list day.
struct StockLine {
  Lot lot;                            // as the stock file gives it
  std::size_t index = 0;              // position in the stock file
  std::string code;                   // the lot code, or "lot N" (1-based) when the file gives none
  std::optional<double> alpha_today;  // % w/w; the certificate value when the lot cannot be aged
  bool aged = false;                  // aged from packaging (needs alpha, packaged and storage)
  double remaining = 1.0;             // share of the certificate alpha left (aged lots)
  long days = 0;                      // days from packaging to the list day
  double stability_percent = kStabilityFair;
  std::string stability_source;
  std::optional<double> hsi_loss_percent;  // % lost the measured HSI shows
  bool stale = false;                      // below the stale share, or an oxidised HSI (engine/cellar)
  std::string stale_reason;                // why, in words; empty unless stale
  /// Whole days from the list day until the alpha falls below the stale share at the lot's storage:
  /// 0 when already below; nullopt when the lot is not aged.
  std::optional<long> days_until_stale;
};

/// What one variety has on hand, over all its lots.
struct VarietyTotal {
  std::string variety;
  double on_hand_g = 0.0;
  std::size_t lots = 0;
  double stale_g = 0.0;  // of on_hand_g, in stale lots
};

struct StockView {
  std::string name;
  Date on{};
  double stale_below = 0.75;
  std::vector<StockLine> lots;       // in file order
  std::vector<VarietyTotal> totals;  // in order of first appearance
};

/// Days from packaging until a lot stored as `history` keeps only `share` of its certificate alpha:
/// D = ln(1 / share) / (k x TF x SF), rounded up to whole days.
long days_to_share(const StorageHistory& history, double share);

/// Every lot of `stock` on `on`, stale below `stale_below` of its certificate alpha. The stability
/// is the variety's (catalog, else the fair class), as engine/cellar takes it for every command; a
/// measured HSI is a state on its analysis date, never the storage rate.
/// Throws InputError naming each lot packaged after `on`.
StockView view_stock(const Stock& stock, const Catalog& catalog, Date on, double stale_below);

}  // namespace bine
