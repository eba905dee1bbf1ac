#pragma once
// Loading the catalogs when a command needs only some varieties by name: from a compiled catalog
// given alone, only those rows; otherwise every catalog, as load_data.
#include <functional>
#include <string>
#include <vector>

#include "cli/commands.hpp"
#include "io/compiled_catalog.hpp"

namespace bine::cli {

/// load_data_for_names (io/compiled_catalog.hpp) timed as "load data", with its notes on stderr.
/// `names` is asked only when a compiled catalog is given alone (reading them may read files).
CatalogSubset load_data_for_names(const GlobalOptions& globals, const Console& console,
                                  const std::function<std::vector<std::string>()>& names);

}  // namespace bine::cli
