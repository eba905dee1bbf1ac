#pragma once
// Rendering catalog entries: a list table, one variety in full, and their JSON forms.
#include <nlohmann/json.hpp>
#include <ostream>

#include "model/hops.hpp"
#include "model/lexicon.hpp"
#include "model/quantity.hpp"

namespace bine {

nlohmann::json variety_to_json(const Variety& variety);
nlohmann::json catalog_to_json(const Catalog& catalog);

void render_catalog_list(std::ostream& out, const Catalog& catalog, const Lexicon& lexicon);
void render_variety(std::ostream& out, const Variety& variety, const Lexicon& lexicon);

/// "4.0-6.0 %" or "n/a".
std::string range_text(const std::optional<Range>& range, std::string_view unit);

}  // namespace bine
