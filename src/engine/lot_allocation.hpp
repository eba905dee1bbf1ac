#pragma once
// Which lots a recipe's additions are weighed from: one rule for every command that reads a stock
// file (rebalance, blend, calibrate, stock use, stock plan). Method: docs/methods.md#lot-choice.
//
// An addition that names a lot takes that lot (and, without a variety, the lot's variety). Otherwise
// the lots of its variety are taken oldest packaging first (or most on hand first), stale lots left
// out unless allowed, lots emptied by earlier additions skipped; an addition larger than what is
// left of one lot is split across lots so that its parts together deliver what the addition does.
#include <cstddef>
#include <functional>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "engine/cellar.hpp"
#include "engine/ibu_interval.hpp"
#include "model/hops.hpp"

namespace bine {

/// "oldest" or "most"; nullopt otherwise.
std::optional<LotOrder> lot_order_from(std::string_view text);
std::string_view to_string(LotOrder order);

/// How lots are taken for one brew.
struct AllocationSettings {
  LotOrder order = LotOrder::oldest;
  bool allow_stale = false;
  double batches = 1.0;  // batches brewed: each lot gives on_hand / batches per batch
};

/// What one addition must get from its lots: an amount of some effect (IBU, mL of oil, grams) and
/// what one gram of a lot gives of it.
struct LotDemand {
  double effect = 0.0;
  std::function<double(const CellarLot&)> per_gram;
};

/// One lot an addition draws on.
struct LotPart {
  std::size_t lot = 0;  // index into Cellar::lots
  double grams = 0.0;   // per batch
  double effect = 0.0;  // what these grams give, in the demand's unit
};

/// The lots of one addition.
struct AdditionLots {
  std::size_t index = 0;  // into recipe.hops
  std::string variety;
  bool named = false;          // the recipe names the lot
  std::vector<LotPart> parts;  // in the order taken; empty: no usable lot (kept as written)
};

struct LotAllocation {
  std::vector<AdditionLots> additions;  // one per recipe addition, in recipe order
  std::vector<double> left_g;           // per cellar lot: per batch, what is left after every addition
  std::vector<std::string> notes;       // stale lots left out, varieties without a usable lot
};

/// The recipe with every lot it names looked up among `lots` (codes compared folded; a lot without
/// a code is "lot N"): a lot-only addition takes the lot's variety. Throws InputError naming the
/// recipe field for an unknown code (with did-you-mean over the codes) or a lot of another variety.
Recipe with_lot_varieties(const Recipe& recipe, const std::vector<Lot>& lots, const std::string& stock_file);

/// The same against the cellar's lots.
Recipe with_lot_varieties(const Recipe& recipe, const Cellar& cellar);

/// The same, and an addition without alpha acid is given its lot's alpha on the
/// cellar's brew day (said in `notes`).
Recipe with_named_lots(const Recipe& recipe, const Cellar& cellar, std::vector<std::string>& notes);

/// Per addition of `recipe` (with_named_lots of `as_read`), how its alpha is known where
/// with_named_lots took it from the addition's lot (lot_alpha_origin: a certificate, aged or not, or a
/// catalog range); nullopt where the recipe gives its own alpha or has no lot.
std::vector<std::optional<AlphaOrigin>> named_lot_alpha_origins(const Recipe& as_read, const Recipe& recipe,
                                                                const Cellar& cellar, const Catalog& catalog);

/// Throws InputError (remedy: give a stock file) naming every addition that gives a lot but no
/// variety: without a stock file nothing says what it is.
void require_stock_for_lot_only(const Recipe& recipe);

/// Lots for every addition of `recipe` (lots already looked up: with_named_lots), `demands[i]` for
/// recipe.hops[i]. A demand a variety's lots cannot meet is put on its last usable lot in order, so
/// that lot shows the shortfall.
LotAllocation allocate_lots(const Recipe& recipe, const Cellar& cellar, const std::vector<LotDemand>& demands,
                            const AllocationSettings& settings);

/// The usable lots of `variety` in the order they are taken, with `left_g` per batch (nullptr: the
/// amounts on hand). Stale lots are left out unless `settings.allow_stale`.
std::vector<std::size_t> lots_in_order(const Cellar& cellar, std::string_view variety,
                                       const AllocationSettings& settings, const std::vector<double>* left_g = nullptr);

/// The lot an addition of `hop` draws on first: its named lot, else the first in order. nullptr
/// when none.
const CellarLot* first_lot(const HopAddition& hop, const Cellar& cellar, const AllocationSettings& settings);

/// The allocation settings the cellar was read with, for `batches` batches.
AllocationSettings allocation_of(const Cellar& cellar, double batches = 1.0);

/// A lot's amount on hand, per batch; a lot that gives none counts as unlimited.
double available_per_batch(const CellarLot& lot, double batches);

}  // namespace bine
