#pragma once
// Lots to receive into the cold store from a file (`bine stock receive --from FILE`): a CSV table of
// certificates (columns found as `bine import` finds them: Lot, Variety, Alpha, Amount, Packaged
// ...), BeerXML hop records, or a stock file in our JSON. Told apart by content. Every lot must
// say what a single `stock receive` asks for: lot code, variety, alpha acid, amount and packaging
// date, and its storage unless the brewer names one for every lot. Nothing is received when any
// lot is bad: every problem is one line naming the file, the line (a CSV row; a JSON pointer or
// BeerXML element otherwise), the column and the value.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "model/hops.hpp"

namespace bine {

/// One lot a receipt file gives, and where in the file it is.
struct ReceivedLot {
  Lot lot;
  std::string where;  // "line 3" (CSV), "/lots/2" (JSON) or a BeerXML element path
};

/// Reads every lot of a receipt file. `storage` is taken by a lot the file gives none (CSV and
/// BeerXML have no storage column). A lot code already in `stock`, or twice in the file, is a
/// problem. Throws InputError with one line per problem (at most kMaxProblemLines).
std::vector<ReceivedLot> read_lot_receipts(std::string_view text, const std::string& file,
                                           const std::optional<Storage>& storage, const Stock& stock);

}  // namespace bine
