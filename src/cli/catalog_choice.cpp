#include "cli/catalog_choice.hpp"

namespace bine::cli {

CatalogSubset load_data_for_names(const GlobalOptions& globals, const Console& console,
                                  const std::function<std::vector<std::string>()>& names) {
  const auto timer = console.time("load data");
  const bool compiled_alone = globals.catalogs.size() == 1 && is_compiled_catalog(globals.catalogs.front());
  CatalogSubset subset = compiled_alone ? load_data_for_names(globals.data, globals.catalogs, names())
                                        : CatalogSubset{load_data(globals.data, globals.catalogs), std::nullopt};
  for (const auto& note : subset.data.notes) console.err << "bine: note: " << note << '\n';
  return subset;
}

}  // namespace bine::cli
