#include "model/catalog_lookup.hpp"

#include <fmt/format.h>

#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {

const Variety* find_variety(const Catalog& catalog, std::string_view name) {
  const std::string wanted = fold_name(name);
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
