#include "cli/remedies.hpp"

namespace bine::cli {

std::string_view remedy_text(Remedy remedy) {
  switch (remedy) {
    case Remedy::lower_whirlpool_share:
      return "lower --split";
    case Remedy::raise_whirlpool_share:
      return "raise --split";
    case Remedy::lower_late_amount:
      return "lower --rate or --oil-dose";
    case Remedy::raise_late_amount:
      return "raise --rate or --oil-dose";
    case Remedy::raise_target_ibu:
      return "raise --ibu";
    case Remedy::add_stock:
      return "add stock";
    case Remedy::more_varieties:
      return "raise --max-varieties";
    case Remedy::allow_bittering:
      return "allow a bittering charge (drop --no-bittering)";
    case Remedy::name_bittering_variety:
      return "give --bittering VARIETY";
    case Remedy::no_bittering:
      return "give --no-bittering";
    case Remedy::later_brew_day:
      return "give a later --on";
    case Remedy::whole_catalog:
      return "drop --stock to search the whole catalog";
    case Remedy::add_catalog:
      return "add one with --catalog FILE";
    case Remedy::aim_by_target:
      return "give --target instead";
    case Remedy::give_late_amount:
      return "give --rate or --oil-dose above 0";
    case Remedy::add_alpha_acid:
      return "add its alpha acid to the catalog or stock";
    case Remedy::add_aroma_stock:
      return "add stock with aroma varieties";
    case Remedy::add_aroma_catalog:
      return "add a catalog with aroma data using --catalog FILE";
    case Remedy::trim_kept_additions:
      return "trim the recipe's other boil additions";
    case Remedy::bittering_with_alpha:
      return "give --bittering with a variety that has alpha acid data";
    case Remedy::give_stock_file:
      return "give --stock FILE or set BINE_STOCK";
  }
  return "";
}

std::string with_remedies(std::string_view message, const std::vector<Remedy>& remedies) {
  std::string text(message);
  if (remedies.empty()) return text;
  text += " (";
  for (std::size_t i = 0; i < remedies.size(); ++i) {
    if (i > 0) text += i + 1 == remedies.size() ? " or " : ", ";
    text += remedy_text(remedies[i]);
  }
  text += ')';
  return text;
}

}  // namespace bine::cli
