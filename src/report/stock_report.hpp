#pragma once
// Rendering the cold store (bine stock list), its journal (bine stock history) and one change
// (receive, adjust, use, undo) as text or JSON; the list also as CSV (its page is stock_html).
#include <nlohmann/json.hpp>
#include <ostream>
#include <string>
#include <vector>

#include "engine/rebalance.hpp"
#include "engine/stock_view.hpp"
#include "io/stock_ledger.hpp"
#include "model/quantity.hpp"

namespace bine {

void render_stock_list(std::ostream& out, const StockView& view, UnitSystem units);
nlohmann::json stock_list_to_json(const StockView& view);

/// `bine stock list --csv`: one row per lot in file order (as the JSON lists them), with the lot's
/// certificate values (form, alpha, packaged, storage) beside the figures of the JSON, rounded as
/// there; canonical units (g, C, %) whatever --units says. The totals per variety are left to the
/// spreadsheet (a second table would break the one-header-row shape).
std::string stock_list_to_csv(const StockView& view);

void render_history(std::ostream& out, const std::vector<JournalEntry>& entries, UnitSystem units);
nlohmann::json history_to_json(const std::vector<JournalEntry>& entries);

/// One change as recorded: "journal entry 4 (use): TW-26-018 Tidewell 10 kg -> 9.95 kg".
void render_change(std::ostream& out, const JournalEntry& entry, UnitSystem units);

/// `bine stock use --json`: the change as journalled (entry id, recipe, batches, brew day), what each
/// addition (part) was weighed from (grams as written and as weighed, per batch and for every batch)
/// and each lot's grams before and after. Canonical units; grams to 0.01 g as the ledger stores them.
nlohmann::json stock_use_to_json(const JournalEntry& entry, const std::vector<RebalancedAddition>& additions,
                                 const std::string& stock_file, const std::string& journal_file);

}  // namespace bine
