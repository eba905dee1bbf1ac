#pragma once
// Rendering the cold store (bine stock list), its journal (bine stock history) and one change
// (receive, adjust, use, undo) as text or JSON.
#include <nlohmann/json.hpp>
#include <ostream>
#include <string>
#include <vector>

#include "engine/stock_view.hpp"
#include "io/stock_ledger.hpp"
#include "model/quantity.hpp"

namespace bine {

void render_stock_list(std::ostream& out, const StockView& view, UnitSystem units);
nlohmann::json stock_list_to_json(const StockView& view);

void render_history(std::ostream& out, const std::vector<JournalEntry>& entries, UnitSystem units);
nlohmann::json history_to_json(const std::vector<JournalEntry>& entries);

/// One change as recorded: "journal entry 4 (use): TW-26-018 Tidewell 10 kg -> 9.95 kg".
void render_change(std::ostream& out, const JournalEntry& entry, UnitSystem units);

}  // namespace bine
