#pragma once
// Finding varieties and lots by the names brewers type.
#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

#include "model/hops.hpp"

namespace bine {

/// Fills catalog.by_folded_name, so find_variety is one hash look-up instead of a scan that folds
/// every name. Loaders call it; call it again after changing `varieties`.
void index_variety_names(Catalog& catalog);
/// The variety with this name (case- and accent-insensitive), or nullptr.
const Variety* find_variety(const Catalog& catalog, std::string_view name);
/// As find_variety, but throws InputError "`where`: unknown variety "X" (did you mean ...?)".
const Variety& require_variety(const Catalog& catalog, std::string_view name, std::string_view where);
std::vector<std::string> variety_names(const Catalog& catalog);
/// For a name not in the catalog: "did you mean A or B?", else "see 'bine catalog list'".
std::string variety_hint(const Catalog& catalog, std::string_view name);

/// How a lot is named to the brewer: its code, or "lot N" (1-based position in the stock file)
/// when the file gives none.
std::string lot_code(const Lot& lot, std::size_t index);

/// The lot with this code (folded comparison), or nullptr.
const Lot* find_lot(const Stock& stock, std::string_view code);

}  // namespace bine
