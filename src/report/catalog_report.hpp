#pragma once
// Rendering catalog entries: a list table, one variety in full, their JSON forms and the list as CSV.
#include <nlohmann/json.hpp>
#include <ostream>

#include "model/hops.hpp"
#include "model/lexicon.hpp"
#include "model/quantity.hpp"

namespace bine {

nlohmann::json variety_to_json(const Variety& variety);
nlohmann::json catalog_to_json(const Catalog& catalog);

void render_catalog_list(std::ostream& out, const Catalog& catalog, const Lexicon& lexicon);

/// `bine catalog list --csv`: one row per variety in catalog order (as the JSON lists them): name,
/// origin, purpose, each range as a min and a max column (alpha, beta, cohumulone, total oil, each
/// oil compound), stability, one column per lexicon aroma axis (0-5; empty when the variety gives
/// no intensities, 0 for an axis it leaves out), tags and the catalog file.
std::string catalog_to_csv(const Catalog& catalog, const Lexicon& lexicon);
void render_variety(std::ostream& out, const Variety& variety, const Lexicon& lexicon);

/// "4.0-6.0 %" or "n/a".
std::string range_text(const std::optional<Range>& range, std::string_view unit);

}  // namespace bine
