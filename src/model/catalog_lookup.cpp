#include "model/catalog_lookup.hpp"

#include <fmt/format.h>

#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {

void index_variety_names(Catalog& catalog) {
  catalog.by_folded_name.clear();
  catalog.by_folded_name.reserve(catalog.varieties.size());
  for (std::size_t i = 0; i < catalog.varieties.size(); ++i)
    catalog.by_folded_name.emplace(fold_name(catalog.varieties[i].name), i);  // the first of a name wins, as a scan
}

const Variety* find_variety(const Catalog& catalog, std::string_view name) {
  const std::string wanted = fold_name(name);
  // The index answers when it covers every variety and the position it gives still holds that name
  // (a hand-built or edited catalog without a fresh index falls back to the scan).
  if (!catalog.by_folded_name.empty() && catalog.by_folded_name.size() == catalog.varieties.size()) {
    const auto it = catalog.by_folded_name.find(wanted);
    if (it == catalog.by_folded_name.end()) return nullptr;
    if (it->second < catalog.varieties.size()) {
      const Variety& variety = catalog.varieties[it->second];
      if (fold_name(variety.name) == wanted) return &variety;
    }
  }
  for (const auto& variety : catalog.varieties)
    if (fold_name(variety.name) == wanted) return &variety;
  return nullptr;
}

std::vector<std::string> variety_names(const Catalog& catalog) {
  std::vector<std::string> names;
  names.reserve(catalog.varieties.size());
  for (const auto& variety : catalog.varieties) names.push_back(variety.name);
  return names;
}

std::string variety_hint(const Catalog& catalog, std::string_view name) {
  std::string hint = did_you_mean(name, variety_names(catalog));
  return hint.empty() ? "see 'bine catalog list'" : hint;
}

const Variety& require_variety(const Catalog& catalog, std::string_view name, std::string_view where) {
  if (const Variety* variety = find_variety(catalog, name)) return *variety;
  throw InputError(fmt::format("{}: unknown variety \"{}\" ({})", where, name, variety_hint(catalog, name)));
}

std::string lot_code(const Lot& lot, std::size_t index) {
  return lot.lot.empty() ? fmt::format("lot {}", index + 1) : lot.lot;
}

const Lot* find_lot(const Stock& stock, std::string_view code) {
  const std::string wanted = fold_name(code);
  for (const auto& lot : stock.lots)
    if (!lot.lot.empty() && fold_name(lot.lot) == wanted) return &lot;
  return nullptr;
}

}  // namespace bine
