#pragma once
// Rendering a swap: text tables for the terminal, one JSON document and one CSV table (the HTML page is
// swap_html in html_reports.hpp).
#include <nlohmann/json.hpp>
#include <ostream>
#include <string>

#include "engine/substitutes.hpp"
#include "model/quantity.hpp"

namespace bine {

/// The JSON document of `bine swap --json`. Keys: query, for, index, stock (or null), substitutes
/// (variety, lot, on_hand_g, alpha_today_percent, similarity, confidence, amount_factor (null when
/// unknown), amount_basis, differences, aroma_delta, chemistry), pairs (with --pairs), notes.
/// Canonical units; numbers rounded so the same input gives byte-identical output.
nlohmann::json swap_to_json(const SwapResult& result, bool with_pairs);

/// `bine swap --csv`: one table, a row per hop. Column "kind" says what the row is: "substitute"
/// (ranked best first, "rank" 1, 2 ...) or, with --pairs, "blend" (two rows per two-variety blend,
/// one per variety, both with the blend's number as rank, its share by weight and similarity). The
/// column "g per g replaced" is grams of this hop per gram of the missing variety: a substitute's
/// amount factor, a blend member's share x its factor. Figures rounded as in swap_to_json.
std::string swap_to_csv(const SwapResult& result, bool with_pairs);

/// Text for the terminal: ranked substitutes, chemistry side by side, pairs, notes, cautions.
void render_swap(std::ostream& out, const SwapResult& result, UnitSystem units, bool with_pairs);

}  // namespace bine
